"""The terminal report, rendered at a fixed width without colour (rich's own test pattern)."""

import io
from dataclasses import replace

from rich.console import Console

from sourcecheck.reports.terminal import render, summary_line
from tests.reports.sample_report import sample_report


def _text() -> str:
    console = Console(width=60, file=io.StringIO(), force_terminal=True, color_system=None)
    render(sample_report(), console)
    return console.file.getvalue()  # type: ignore[attr-defined]


def test_each_check_shows_band_citation_passage_page_and_reason() -> None:
    text = _text()
    assert "conflict" in text and "[1]" in text
    assert "p. 4:" in text and "Heron nests rose by 18%" in text
    assert "number-mismatch: claim says 23%" in text
    assert "marker-unresolved" in text and "source-missing" in text


def test_loose_ends_problems_summary_and_caution_are_listed() -> None:
    text = " ".join(_text().split())
    assert "References never cited in the text: [3]" in text
    assert "Cited references with no source file: [2]" in text
    assert "Source files no citation leads to: src/orphan.pdf" in text
    assert "src/broken.pdf: not a PDF" in text
    assert "sourcecheck advises; it does not prove error or misconduct" in text


def test_summary_counts_every_band() -> None:
    assert summary_line(sample_report()) == "3 checks: 0 anchored, 0 loose, 1 conflict, 0 adrift, 2 unverifiable"


def test_printed_page_is_shown_beside_the_pdf_page() -> None:
    report = sample_report()
    check = report.claims[0].checks[0]
    check.evidence = [replace(e, page=2, printed_page="306") for e in check.evidence]
    console = Console(width=60, file=io.StringIO(), force_terminal=True, color_system=None)
    render(report, console)
    assert "p. 2 (printed 306):" in console.file.getvalue()  # type: ignore[attr-defined]


def test_the_section_of_the_passage_is_named_after_its_page() -> None:
    report = sample_report()
    check = report.claims[0].checks[0]
    check.evidence = [replace(e, page=2, printed_page="306", section="results") for e in check.evidence]
    console = Console(width=60, file=io.StringIO(), force_terminal=True, color_system=None)
    render(report, console)
    assert "p. 2 (printed 306), results:" in console.file.getvalue()  # type: ignore[attr-defined]
