"""Page locators: which pages a citation names, how they map to PDF pages, which hits win."""

import pytest

from sourcecheck.judge.locators import (
    PAGE_MARGIN,
    cited_pages,
    page_label,
    pdf_pages,
    prefers_located,
)
from sourcecheck.model import Hit, Passage


def _pages(locator: str) -> list[int] | None:
    found = cited_pages(locator)
    return sorted(found) if found is not None else None


# --- APA 7th ed. (Publication Manual, section 8.13 on quotations; from memory): "p." for one
# page, "pp." for a range joined by an en dash, as in "(Okafor, 2019, p. 12)". -------------


@pytest.mark.parametrize(
    ("locator", "expected"),
    [
        ("p. 12", [12]),  # APA 7th ed. 8.13, from memory
        ("pp. 12–13", [12, 13]),  # APA 7th ed. 8.13, en dash, from memory
        ("pp. 4–6", [4, 5, 6]),
        ("P. 7", [7]),  # capital at a sentence start
        ("p.7", [7]),
    ],
)
def test_apa_page_forms(locator: str, expected: list[int]) -> None:
    assert _pages(locator) == expected


# --- Chicago Manual of Style, 17th ed., 9.61 "inclusive numbers" (from memory): a range may
# give only the changed digits of its end; Turabian's Manual for Writers (9th ed.) follows
# Chicago here (from memory). Ranges take an en dash (CMOS 6.78, from memory). -------------


@pytest.mark.parametrize(
    ("locator", "first", "last"),
    [
        ("pp. 3–10", 3, 10),  # CMOS 9.61 example, from memory
        ("pp. 71–72", 71, 72),  # CMOS 9.61 example, from memory
        ("pp. 101–8", 101, 108),  # CMOS 9.61 example, from memory
        ("pp. 1103–4", 1103, 1104),  # CMOS 9.61 example, from memory
        ("pp. 321–28", 321, 328),  # CMOS 9.61 example, from memory
        ("pp. 498–532", 498, 532),  # CMOS 9.61 example, from memory
        ("pp. 1087–89", 1087, 1089),  # CMOS 9.61 example, from memory
        ("pp. 1496–1500", 1496, 1500),  # CMOS 9.61 example, from memory
        ("pp. 11564–615", 11564, 11615),  # CMOS 9.61 example, from memory
    ],
)
def test_chicago_inclusive_numbers(locator: str, first: int, last: int) -> None:
    assert _pages(locator) == list(range(first, last + 1))


def test_latex_and_pandoc_spellings() -> None:
    # LaTeX writes the en dash "--" and a tie "~" (Lamport, LaTeX manual, from memory).
    assert _pages("pp.~4--6") == [4, 5, 6]
    assert _pages("pp. 4--6") == [4, 5, 6]
    # Pandoc User's Guide, "Citation syntax" (from memory): a bare number is a page, and a
    # locator may list ranges and end in free text.
    assert _pages("33") == [33]
    assert _pages("pp. 33-35, 38-39 and *passim*") == [33, 34, 35, 38, 39]
    assert _pages("page 7") == [7] and _pages("pages 7-9") == [7, 8, 9]


def test_following_pages_and_notes() -> None:
    # Chicago Manual of Style, 17th ed. (from memory): "f." adds the page after, and a note
    # is cited by page and note number run together, "45n12" (note 12 on page 45).
    assert _pages("p. 7f.") == [7, 8]
    assert _pages("p. 45n12") == [45]
    # "ff." states no end; reading it as the next two pages is common practice, no source.
    assert _pages("p. 7ff.") == [7, 8, 9]


@pytest.mark.parametrize(
    "locator", ["ch. 3", "chap. 1", "sec. 2", "fig. 1", "para. 4", "§ 3", "table 2", "n. 14", "pp. iv", ""]
)
def test_non_page_locators_name_no_page(locator: str) -> None:
    assert cited_pages(locator) is None


def test_backwards_range_and_trailing_other_locator() -> None:
    assert cited_pages("pp. 9–4") is None
    assert _pages("p. 7, fig. 2") == [7]
    assert cited_pages(None) is None


# --- mapping to PDF pages ------------------------------------------------------------


def test_printed_numbers_are_looked_up_first() -> None:
    printed = ("305", "306", "307")
    assert pdf_pages(frozenset({306}), printed, 3) == {2}
    assert pdf_pages(frozenset({305, 306}), printed, 3) == {1, 2}


def test_pdf_pages_when_the_number_is_not_printed() -> None:
    assert pdf_pages(frozenset({2}), ("305", "306", "307"), 3) == {2}
    assert pdf_pages(frozenset({2}), (), 3) == {2}
    assert pdf_pages(frozenset({99}), ("305", "306", "307"), 3) == set()


def test_page_label_names_both_numbers_when_they_differ() -> None:
    assert page_label(1, ("305", "306")) == "p. 305 (PDF p. 1)"
    assert page_label(2, ("1", "2")) == "p. 2"
    assert page_label(2, ()) == "p. 2"
    assert page_label(2, ("305", None)) == "p. 2"


# --- the located-pages rule on hand-made hits -------------------------------------------


def _hit(fused: float, page: int) -> Hit:
    return Hit(Passage("a.pdf", page, f"text on page {page}", page), fused=fused, dense=fused, bm25=0.0, coverage=0.0)


def test_located_pages_win_within_the_margin() -> None:
    whole = [_hit(0.90, 4)]
    assert prefers_located([_hit(0.90, 4)], whole)  # the cited page holds the best passage
    assert prefers_located([_hit(0.90 - PAGE_MARGIN + 0.001, 7)], whole)
    assert not prefers_located([_hit(0.90 - PAGE_MARGIN - 0.01, 7)], whole)
    assert not prefers_located([_hit(0.45, 7)], whole)


def test_no_located_passage_means_the_backing_is_elsewhere() -> None:
    assert not prefers_located([], [_hit(0.9, 4)])
