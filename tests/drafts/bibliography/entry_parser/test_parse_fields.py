"""Parsing invented entries written in published reference styles with the shipped model.

Every entry below is invented (people, titles and journals); each follows the pattern of the
style guide named beside it, as remembered (no copy of the guide was at hand).
"""

from __future__ import annotations

import pytest

from sourcecheck.drafts.bibliography.entry_parser import EntryFields, parse_fields

# (style and source, entry, first family name, title, container or None, year)
CASES = [
    (
        # APA 7th ed. (Publication Manual of the APA, 2020, ch. 10, journal article), from memory.
        "apa7",
        "Okonjo, A. B., Lindqvist, C., & Saito, K. (2019). Nitrate uptake in irrigated field plots. "
        "Journal of Soil Methods, 12(3), 45–67. https://doi.org/10.5555/jsm.2019.0123",
        "Okonjo",
        "Nitrate uptake in irrigated field plots",
        "Journal of Soil Methods",
        2019,
    ),
    (
        # APA 7th ed., book with an edition, from memory.
        "apa7-book",
        "Marwick, T. L. (2016). Gravel and grain: A history of upland farming (2nd ed.). Harbourside Press.",
        "Marwick",
        "Gravel and grain: A history of upland farming",
        None,
        2016,
    ),
    (
        # Vancouver / ICMJE (Citing Medicine, NLM, 2nd ed., journal article), from memory.
        "vancouver",
        "Okonjo AB, Lindqvist C, Saito K. Nitrate uptake in irrigated field plots. J Soil Methods. 2019;12(3):45-67.",
        "Okonjo",
        "Nitrate uptake in irrigated field plots",
        "J Soil Methods",
        2019,
    ),
    (
        # IEEE Reference Guide (journal article, numbered), from memory.
        "ieee",
        '[4] A. B. Okonjo, C. Lindqvist, and K. Saito, "Nitrate uptake in irrigated field plots," '
        "J. Soil Methods, vol. 12, no. 3, pp. 45–67, Mar. 2019.",
        "Okonjo",
        "Nitrate uptake in irrigated field plots",
        "J. Soil Methods",
        2019,
    ),
    (
        # IEEE Reference Guide (conference paper), from memory.
        "ieee-conference",
        '[7] R. Venkataraman and P. Holloway, "Sparse joins for tiered storage," in Proc. Workshop on '
        "Data Placement, 2021, pp. 11–19.",
        "Venkataraman",
        "Sparse joins for tiered storage",
        "Proc. Workshop on Data Placement",
        2021,
    ),
    (
        # Chicago Manual of Style 17th ed., author-date reference list (ch. 15), from memory.
        "chicago-author-date",
        "Okonjo, Ada B., and Carl Lindqvist. 2019. “Nitrate Uptake in Irrigated Field Plots.” "
        "Journal of Soil Methods 12 (3): 45–67.",
        "Okonjo",
        "Nitrate Uptake in Irrigated Field Plots",
        "Journal of Soil Methods",
        2019,
    ),
    (
        # Chicago Manual of Style 17th ed., notes and bibliography: bibliography entry for a book (ch. 14).
        "chicago-bibliography",
        "Marwick, Tobias L. Gravel and Grain: A History of Upland Farming. Portsmouth: Harbourside Press, 2016.",
        "Marwick",
        "Gravel and Grain: A History of Upland Farming",
        None,
        2016,
    ),
    (
        # Chicago Manual of Style 17th ed., notes and bibliography: a full note for a book (ch. 14).
        "chicago-note",
        "3. Tobias L. Marwick, Gravel and Grain: A History of Upland Farming "
        "(Portsmouth: Harbourside Press, 2016), 88.",
        "Marwick",
        "Gravel and Grain: A History of Upland Farming",
        None,
        2016,
    ),
    (
        # Nature (formatting guide for authors: "Author, A. B. Title. Journal vol, pages (year)."), from memory.
        "nature",
        "Okonjo, A. B., Lindqvist, C. & Saito, K. Nitrate uptake in irrigated field plots. "
        "J. Soil Methods 12, 45–67 (2019).",
        "Okonjo",
        "Nitrate uptake in irrigated field plots",
        "J. Soil Methods",
        2019,
    ),
    (
        # MLA Handbook 9th ed. (journal article in works cited), from memory.
        "mla9",
        'Okonjo, Ada, and Carl Lindqvist. "Nitrate Uptake in Irrigated Field Plots." Journal of Soil Methods, '
        "vol. 12, no. 3, 2019, pp. 45-67.",
        "Okonjo",
        "Nitrate Uptake in Irrigated Field Plots",
        "Journal of Soil Methods",
        2019,
    ),
    (
        # Computer-science proceedings style "First Last, First Last. Title. Venue, Year." (common practice, no source).
        "cs",
        "Ravi Venkataraman, Petra Holloway. Sparse joins for tiered storage. "
        "In Proceedings of the Workshop on Data Placement, 2021.",
        "Venkataraman",
        "Sparse joins for tiered storage",
        "Proceedings of the Workshop on Data Placement",
        2021,
    ),
]


@pytest.mark.parametrize(("style", "entry", "family", "title", "container", "year"), CASES, ids=[c[0] for c in CASES])
def test_styles(style: str, entry: str, family: str, title: str, container: str | None, year: int) -> None:
    fields = parse_fields(entry)
    assert fields.authors[:1] == (family,)
    assert fields.title == title
    assert fields.year == year
    if container is not None:
        assert fields.container == container


def test_apa_fields_beyond_title() -> None:
    fields = parse_fields(CASES[0][1])
    assert fields.authors == ("Okonjo", "Lindqvist", "Saito")
    assert fields.doi == "10.5555/jsm.2019.0123"  # DOI syntax: ANSI/NISO Z39.84, "10." prefix "/" suffix
    assert fields.volume == "12(3)"
    assert fields.pages == "45–67"


def test_year_suffix() -> None:
    # APA 7th ed. §8.19: same author and year get "a", "b" after the year (from memory).
    fields = parse_fields(
        "Okonjo, A. B. (2019b). Nitrate uptake in irrigated field plots. Journal of Soil Methods, 12, 45–67."
    )
    assert (fields.year, fields.year_suffix) == (2019, "b")


def test_title_only_entry() -> None:
    # An entry holding only a title, as anonymous web pages are listed (common practice, no source).
    fields = parse_fields("Guidelines for sampling river sediment.")
    assert fields.title == "Guidelines for sampling river sediment"
    assert fields.authors == ()
    assert fields.year is None


def test_spans_point_into_the_text() -> None:
    entry = CASES[0][1]
    fields = parse_fields(entry)
    assert isinstance(fields, EntryFields)
    assert [s.label for s in fields.spans][:3] == ["author", "date", "title"]
    assert all(entry[s.start : s.end] == s.text for s in fields.spans)
