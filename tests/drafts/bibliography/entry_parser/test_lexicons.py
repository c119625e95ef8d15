"""Word lists: the packaged files and derivation from labelled entries."""

from __future__ import annotations

import pytest

from sourcecheck.drafts.bibliography.entry_parser.labelled import LabelledEntry
from sourcecheck.drafts.bibliography.entry_parser.lexicons import (
    CURATED,
    DERIVED,
    LEXICON_DIR,
    derive_lexicons,
    packaged_lexicons,
    word_key,
)


@pytest.mark.parametrize("name", [*CURATED, *DERIVED])
def test_every_list_states_its_source(name: str) -> None:
    first = (LEXICON_DIR / f"{name}.txt").read_text(encoding="utf-8").splitlines()[0]
    assert first.startswith("# source: ")


def test_curated_lists_hold_what_they_say() -> None:
    lexicons = packaged_lexicons()
    assert {"september", "sept", "juin", "dezember"} <= lexicons["months"]
    assert {"journal", "proceedings", "conference", "review"} <= lexicons["venue_words"]
    assert {"press", "university", "verlag"} <= lexicons["publisher_words"]
    assert {"eds", "ed"} <= lexicons["editor_words"]
    assert "trans" in lexicons["translator_words"]


def test_word_key_folds() -> None:
    assert word_key("Ólafsdóttir") == "olafsdottir"
    assert word_key("U.S") == "us"


def _entry(author: str, title: str, journal: str) -> LabelledEntry:
    return LabelledEntry(f"{author} {title} {journal}", (("author", author), ("title", title), ("journal", journal)))


def test_derived_lists_follow_the_labels() -> None:
    entries = [
        _entry("Ada Okonjo, Carl Lindqvist.", "Nitrate in soil.", "Soil Letters."),
        _entry("Ada Okonjo and Kenji Saito.", "Soil water.", "Soil Letters."),
        _entry("Okonjo, A. B.", "Roots.", "Soil Letters."),
        _entry("Carl Lindqvist.", "Okonjo's soil method.", "Field Letters."),
    ]
    derived = derive_lexicons(entries)
    assert "okonjo" in derived["name_terms"]  # 3 of 4 occurrences in author spans
    assert "letters" in derived["venue_terms"]
    assert "soil" not in derived["venue_terms"]  # half in titles, half in venues
    assert derived["given_names"] == {"ada", "carl"}  # first words of "Given Family" chunks, twice or more
