"""The terminal report, rendered at a fixed width without colour (rich's own test pattern)."""

import io
from dataclasses import replace

from rich.console import Console

from sourcecheck.model import Band, Check, Problem, Reason, Report, Review
from sourcecheck.reports.terminal import plural, render, summary_line
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


def _render(report: Report, width: int = 60, show_all: bool = False) -> str:
    """The report as piped output: not a terminal, no colour."""
    console = Console(width=width, file=io.StringIO(), force_terminal=False, color_system=None)
    render(report, console, show_all=show_all)
    return console.file.getvalue()  # type: ignore[attr-defined]


def _anchored(check: Check) -> Check:
    return replace(check, band=Band.ANCHORED, score=0.88, reasons=[Reason("close-match", "p. 4 says it")])


def test_piped_output_has_no_trailing_spaces_at_any_width() -> None:
    for width in (40, 60, 80, 120):
        text = _render(sample_report(), width)
        assert [line for line in text.splitlines() if line != line.rstrip()] == []


def test_a_marker_is_never_split_across_lines() -> None:
    # "[2, 9]" lands at a line end at several narrow widths; it must always stay whole.
    for width in range(24, 60):
        lines = _render(sample_report(), width).splitlines()
        claim_lines = [line for line in lines if "Salt meadows" in line or "spread" in line or "9]" in line]
        assert any("[2, 9]" in line for line in claim_lines), (width, claim_lines)
        assert not any(line.rstrip().endswith("[2,") for line in lines), width


def test_wrapped_claim_text_hangs_under_a_deeper_indent() -> None:
    lines = _render(sample_report(), 30).splitlines()
    first = next(i for i, line in enumerate(lines) if line.startswith("c1"))
    assert lines[first + 1].startswith("    ") and lines[first + 1].strip()  # the claim's second line hangs


def test_plurals_follow_the_count() -> None:
    report = sample_report()
    report.claims = report.claims[:1]
    assert summary_line(report).startswith("1 check: ")
    assert summary_line(sample_report()).startswith("3 checks: ")
    assert plural(0, "check") == "0 checks" and plural(1, "manuscript") == "1 manuscript"


def test_legend_names_every_band_and_the_score() -> None:
    text = _render(sample_report(), 100)
    assert "score: the fitted probability that the passage backs the claim" in text
    legend = next(line for line in text.splitlines() if line.startswith("bands"))
    assert all(band.value in legend for band in Band)


def test_anchored_checks_take_one_line_and_all_shows_them_in_full() -> None:
    report = sample_report()
    report.claims[0].checks[0] = _anchored(report.claims[0].checks[0])
    compact = _render(report, 100)
    assert "anchored 0.88  [1]  p. 4  ferrow.pdf" in compact
    assert "Heron nests rose by 18%" not in compact  # the passage is not repeated for an anchored check
    full = _render(report, 100, show_all=True)
    assert "p. 4: \u201cHeron nests rose by 18%" in full and "close-match: p. 4 says it" in full


def test_a_reviewed_check_is_marked_with_its_note() -> None:
    report = sample_report()
    report.claims[0].checks[0].reviewed = Review("the 23% is from the 2022 resurvey", "review-file")
    text = _render(report, 120)
    assert "reviewed conflict 0.31  [1]  p. 4  ferrow.pdf  note: the 23% is from the 2022 resurvey" in text
    assert "; 1 reviewed" in text


def test_a_word_draft_names_paragraphs_not_lines() -> None:
    report = sample_report()
    report.claims[0].claim = replace(report.claims[0].claim, unit="paragraph")
    text = _render(report, 100)
    assert "c1  paragraph 4  Heron nests" in text and "c2  line 7" in text


def test_control_characters_in_a_claim_are_shown_not_obeyed() -> None:
    report = sample_report()
    report.claims[0].claim = replace(report.claims[0].claim, text="Heron \x1b[31mnests rose [1].")
    text = _render(report, 100)
    assert "\x1b" not in text and "\\x1b[31mnests" in text


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
