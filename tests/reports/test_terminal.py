"""The terminal report, rendered at a fixed width without colour (rich's own test pattern)."""

import io
from dataclasses import replace

from rich.console import Console

from sourcecheck.model import Problem
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


def _hostile_report():
    """The sample report with terminal escapes and rich markup planted wherever a file's text reaches."""
    from tests.hostile import ESCAPES

    report = sample_report()
    planted = "".join(ESCAPES) + "[bold red]markup[/]"
    result = report.claims[0]
    check = replace(
        result.checks[0],
        source=f"src/evil{planted}\n.pdf",
        evidence=[replace(result.checks[0].evidence[0], text=f"Heron nests {planted} rose.", section=planted)],
    )
    claim = replace(result.claim, text=f"Heron nests {planted} rose [1].")
    ref = replace(report.references[2], key=f"k{planted}", text=f"[3] {planted}")
    return replace(
        report,
        claims=[replace(result, claim=claim, checks=[check]), *report.claims[1:]],
        references=[*report.references[:2], ref],
        unused_sources=[f"src/orphan{planted}\n.pdf"],
        problems=[Problem(f"src/x{planted}\n.pdf", f"not a PDF {planted}")],
    )


def test_text_from_files_reaches_the_terminal_escaped_and_never_as_markup() -> None:
    console = Console(width=300, file=io.StringIO(), force_terminal=True, color_system=None)
    render(_hostile_report(), console)
    text = console.file.getvalue()  # type: ignore[attr-defined]
    for raw in ("\x1b", "\x07", "\x9b", "\u202e"):
        assert raw not in text
    assert "\\x1b]0;owned\\x07" in text and "\\x9b2J" in text and "\\u202e" in text
    # rich markup in a file's text is shown as written, not obeyed (with colour on, it would change style).
    assert text.count("[bold red]markup[/]") == 9  # claim, source, passage, section, key, entry, file, problem x2
    # A newline in a file name does not split its line: each planted name stays on one line.
    assert "src/orphan" in text and "\\x0a.pdf" in text
