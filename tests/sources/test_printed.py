"""Printed page numbers read from page text, trusted only when they run one per page."""

from pathlib import Path

from sourcecheck.model import Source
from sourcecheck.sources import read_source
from sourcecheck.sources._printed import page_candidates, printed_page_numbers
from tests.pdf_fixtures import build_pdf

BODY = "Otter holts were occupied in most surveyed reaches of the river."


def _pages(*edges: tuple[str, str]) -> list[list[str]]:
    """Invented pages: a header line, two body lines, a footer line ("" for none)."""
    return [[head, BODY, "Spraints were collected in every reach.", foot] for head, foot in edges]


def test_lone_footer_numbers_give_the_printed_pages() -> None:
    pages = _pages(("", "305"), ("", "306"), ("", "307"))
    assert printed_page_numbers(pages) == ("305", "306", "307")


def test_page_number_forms_and_running_headers() -> None:
    # "Page n of m" and a number inside a running header (journal, volume, year, page).
    assert printed_page_numbers(_pages(("", "Page 12 of 30"), ("", "Page 13 of 30"))) == ("12", "13")
    headers = _pages(("Field Notes 9 (2018) 44", ""), ("Field Notes 9 (2018) 45", ""), ("Field Notes 9 (2018) 46", ""))
    assert printed_page_numbers(headers) == ("44", "45", "46")


def test_numbers_that_do_not_run_one_per_page_are_not_trusted() -> None:
    assert printed_page_numbers(_pages(("", "12"), ("", "40"), ("", "7"))) == ()
    assert printed_page_numbers(_pages(("Vol. 9 (2018)", ""), ("Vol. 9 (2018)", ""))) == ()  # constant
    assert printed_page_numbers(_pages(("", "305"))) == ()  # one page proves no sequence
    assert printed_page_numbers(_pages(("", ""), ("", ""))) == ()


def test_a_gap_inside_the_run_is_filled_and_a_cover_page_is_not() -> None:
    pages = _pages(("", ""), ("", "305"), ("", ""), ("", "307"), ("", "308"))
    assert printed_page_numbers(pages) == (None, "305", "306", "307", "308")


def test_decimals_and_long_numbers_are_no_candidates() -> None:
    assert page_candidates(["Mean 3.5 and doi:10.55555/x.2019", "body", "body", "body", "12345"]) == set()


def test_printed_pages_are_read_from_a_built_pdf(tmp_path: Path) -> None:
    # An article set on journal pages 305-307 prints its page number in the footer.
    pages = [
        [f"This page tells of otters on the {reach} reach of the river."] for reach in ("upper", "middle", "lower")
    ]
    pdf = build_pdf(tmp_path / "a.pdf", pages, footer=lambda n: str(304 + n))
    source = read_source(pdf, "a.pdf")
    assert isinstance(source, Source)
    assert source.printed_pages == ("305", "306", "307")
    assert all("305" not in p.text and "306" not in p.text for p in source.passages)  # still dropped


def test_pdf_without_page_numbers_keeps_pdf_pages(tmp_path: Path) -> None:
    pages = [
        [f"This page tells of otters on the {reach} reach of the river."] for reach in ("upper", "middle", "lower")
    ]
    source = read_source(build_pdf(tmp_path / "b.pdf", pages), "b.pdf")
    assert isinstance(source, Source) and source.printed_pages == ()
