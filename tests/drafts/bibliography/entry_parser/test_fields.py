"""Decoding labelled spans into fields."""

from __future__ import annotations

from sourcecheck.drafts.bibliography.entry_parser.fields import (
    LabelledSpan,
    clean_field,
    decode_fields,
    spans_from_labels,
)
from sourcecheck.drafts.bibliography.entry_parser.tokens import tokenize


def _decode(text: str, labels: list[str]):
    return decode_fields(text, spans_from_labels(text, tokenize(text), labels))


def test_spans_merge_runs_of_one_label() -> None:
    text = "Okonjo, A. (2019). Soil."
    spans = spans_from_labels(text, tokenize(text), ["author", "author", "date", "title"])
    assert spans == (
        LabelledSpan("author", "Okonjo, A.", 0, 10),
        LabelledSpan("date", "(2019).", 11, 18),
        LabelledSpan("title", "Soil.", 19, 24),
    )


def test_apa_shaped_entry() -> None:
    text = "Okonjo, A. (2019a). Soil nitrate. In Field Methods (pp. 4–9). Harbourside Press."
    labels = ["author"] * 2 + ["date"] + ["title"] * 2 + ["container-title"] * 3 + ["pages"] * 2 + ["publisher"] * 2
    fields = _decode(text, labels)
    assert fields.authors == ("Okonjo",)
    assert (fields.year, fields.year_suffix) == (2019, "a")
    assert fields.title == "Soil nitrate"
    assert fields.container == "Field Methods"  # "In" dropped
    assert fields.pages == "4–9"
    assert fields.publisher == "Harbourside Press"


def test_title_broken_by_one_stray_token_is_joined() -> None:
    text = "Okonjo, A. Soil nitrate: a field guide. Harbourside, 2019."
    labels = ["author"] * 2 + ["title", "title", "note", "title", "title", "publisher", "date"]
    assert _decode(text, labels).title == "Soil nitrate: a field guide"


def test_far_apart_title_spans_are_not_joined() -> None:
    text = "Soil nitrate. Okonjo, A. B. Harbourside Press, Portsmouth. Guide."
    labels = ["title"] * 2 + ["author"] * 3 + ["publisher"] * 2 + ["location", "title"]
    assert _decode(text, labels).title == "Soil nitrate"


def test_vancouver_year_inside_volume() -> None:
    # Citing Medicine (NLM) writes "2019;12(3):45-67" for year, volume, issue and pages (from memory).
    text = "Okonjo AB. Soil nitrate. J Soil. 2019;12(3):45-67."
    fields = _decode(text, ["author"] * 2 + ["title"] * 2 + ["journal"] * 2 + ["volume"])
    assert fields.year == 2019
    assert fields.volume == "12(3)"
    assert fields.pages == "45-67"


def test_editors_stand_in_for_missing_authors() -> None:
    text = "Marwick, T., & Saito, K. (Eds.). (2016). Gravel."
    fields = _decode(text, ["editor"] * 6 + ["date", "title"])
    assert fields.authors == ("Marwick", "Saito")


def test_clean_field_strips_wrapping_but_keeps_own_brackets() -> None:
    assert clean_field("“Soil nitrate,”") == "Soil nitrate"
    assert clean_field("(2019).") == "2019"
    assert clean_field("Imaging of roots (MRI).") == "Imaging of roots (MRI)"
    assert clean_field("Why soil? ") == "Why soil?"
    assert clean_field(".,;") == ""
    assert clean_field("“Gravel” and grain.") == "“Gravel” and grain"


def test_quoted_title_ends_with_its_quotation() -> None:
    # MLA 9th ed. puts the title's full stop inside the quotation marks (from memory).
    text = '"Soil Nitrate." Field Handbook. Harbourside Press, 2016.'
    assert _decode(text, ["title"] * 4 + ["publisher"] * 2 + ["date"]).title == "Soil Nitrate"
    inner = "“Gravel”. A history of upland farming. Harbourside, 2016."
    assert _decode(inner, ["title"] * 6 + ["publisher", "date"]).title == "“Gravel”. A history of upland farming"


def test_title_stops_before_in_marker() -> None:
    # Chapters: "Title. In Editor (Ed.), Book" (APA 7th ed. §10.3, from memory).
    text = "Okonjo, A. (2019). Soil nitrate. In: Field Methods. Harbourside."
    labels = ["author"] * 2 + ["date"] + ["title"] * 5 + ["publisher"]
    assert _decode(text, labels).title == "Soil nitrate"


def test_title_stops_before_comma_in_and_before_a_closing_year() -> None:
    # Chicago notes: "Title, in Book, ed. Editor" (CMOS 17th ed. §14.107, from memory).
    text = "Tobias Marwick, Gravel, in Upland Essays (Portsmouth: Harbourside, 2016)."
    labels = ["author"] * 2 + ["title"] * 4 + ["location", "publisher", "date"]
    assert _decode(text, labels).title == "Gravel"
    late = "Okonjo, A. Soil nitrate in plots, 1997. Soil Letters, to appear."
    assert _decode(late, ["author"] * 2 + ["title"] * 7 + ["note"] * 2).title == "Soil nitrate in plots"
