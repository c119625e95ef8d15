"""Family names read from author spans in the name orders of common styles."""

from __future__ import annotations

import pytest

from sourcecheck.drafts.bibliography.entry_parser.author_names import family_names

# Name orders as the style guides write them (all from memory; names invented).
CASES = [
    # APA 7th ed.: "Family, I. I., Family, I., & Family, I."
    ("Okonjo, A. B., Lindqvist, C., & Saito, K.", ("Okonjo", "Lindqvist", "Saito")),
    # IEEE Reference Guide: "I. I. Family, I. Family, and I. Family"
    ("A. B. Okonjo, C. Lindqvist, and K. Saito,", ("Okonjo", "Lindqvist", "Saito")),
    # Vancouver (Citing Medicine): "Family II, Family I"
    ("Okonjo AB, Lindqvist C, de la Vega JM.", ("Okonjo", "Lindqvist", "de la Vega")),
    # Chicago and MLA: the first name inverted, the others not.
    ("Okonjo, Ada, and Carl Lindqvist.", ("Okonjo", "Lindqvist")),
    ("Okonjo, Ada B., Carl Lindqvist, and Kenji Saito.", ("Okonjo", "Lindqvist", "Saito")),
    # Computer-science proceedings: "First Last, First Last" (common practice, no source).
    ("Ravi Venkataraman, Petra van Holloway.", ("Venkataraman", "van Holloway")),
    # Semicolon lists with capitalised family names, as in French bibliographies (common practice, no source).
    ("OKONJO, Ada; LINDQVIST, Carl.", ("OKONJO", "LINDQVIST")),
    # "et al." and editor marks are dropped (APA 7th ed., edited book).
    ("Okonjo, A. B., et al.", ("Okonjo",)),
    ("Marwick, T. L., & Saito, K. (Eds.).", ("Marwick", "Saito")),
    # Generational suffixes are not names (APA 7th ed. §9.8, from memory).
    ("Okonjo, A. B., Jr., & Saito, K.", ("Okonjo", "Saito")),
    # French bibliographies: "FAMILY (Given)" (common practice, no source).
    ("OKONJO (Ada), LINDQVIST (Carl).", ("OKONJO", "LINDQVIST")),
    # Vancouver-like initials with full stops and no space.
    ("Okonjo A.B., Lindqvist C.", ("Okonjo", "Lindqvist")),
    # Group authors stay whole (APA 7th ed. §9.11, from memory).
    ("Alliance for Soil Education.", ("Alliance for Soil Education",)),
    # A middle initial between given and family name.
    ("Okonjo, Ada and Kenji T. Saito.", ("Okonjo", "Saito")),
]


@pytest.mark.parametrize(("span", "expected"), CASES, ids=[c[0][:30] for c in CASES])
def test_family_names(span: str, expected: tuple[str, ...]) -> None:
    assert family_names(span) == expected


def test_nothing_in_nothing_out() -> None:
    assert family_names("") == ()
    assert family_names("et al.") == ()
