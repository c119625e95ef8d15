"""DOI finding and normalisation, against the DOI Handbook's syntax.

DOI Handbook, section 2.2 (from memory): a DOI name is prefix "/" suffix; the prefix is
"10." followed by a registrant code that may have "."-separated subdivisions; the suffix
may hold any printable character; names are case-insensitive (ASCII).
"""

from __future__ import annotations

import pytest

from sourcecheck.text.identifiers import find_dois, normalize_doi


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        # 10.1000/182 is the DOI of the DOI Handbook itself (from memory).
        ("See https://doi.org/10.1000/182.", "10.1000/182"),
        ("doi:10.1000/182,", "10.1000/182"),
        ("https://dx.doi.org/10.1000/182", "10.1000/182"),
        # Registrant code with a subdivision (Handbook 2.2.2, from memory).
        ("DOI 10.1000.10/123456;", "10.1000.10/123456"),
        # Parentheses inside the suffix stay; the unbalanced closing one goes.
        ("(doi:10.1016/S0140-6736(20)30183-5).", "10.1016/s0140-6736(20)30183-5"),
        # Case-insensitive: normalised to lower case.
        ("10.5555/NEST.2019.042", "10.5555/nest.2019.042"),
    ],
)
def test_doi_is_found_and_normalised(text: str, expected: str) -> None:
    assert find_dois(text) == [expected]
    assert normalize_doi(text) == expected


@pytest.mark.parametrize(
    "text",
    [
        "11.1000/182",  # the directory indicator must be 10
        "10.1000",  # no suffix
        "10.12/abc",  # registrant codes under four digits are not used (common practice)
        "version 10.1 of the tool",
    ],
)
def test_non_dois_are_not_found(text: str) -> None:
    assert find_dois(text) == []


def test_doi_broken_after_hyphen_at_line_end_is_rejoined() -> None:
    assert find_dois("doi:10.1016/S0140-\n6736(20)30183-5") == ["10.1016/s0140-6736(20)30183-5"]


def test_repeated_doi_listed_once_in_order() -> None:
    text = "10.1000/b and 10.1000/a and again 10.1000/B"
    assert find_dois(text) == ["10.1000/b", "10.1000/a"]
