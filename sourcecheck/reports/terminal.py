"""The terminal report, rendered with rich.

Rendering is a pure function of the report and a console, so tests render to a fixed
width, colourless console and compare text (the pattern rich's own tests use).
"""

from __future__ import annotations

from rich.console import Console, Group
from rich.padding import Padding
from rich.text import Text

from sourcecheck.model import Band, Check, ClaimResult, Evidence, Report
from sourcecheck.reports.caution import CAUTION
from sourcecheck.text import trim, visible

BAND_STYLE = {
    Band.ANCHORED: "bold green",
    Band.LOOSE: "bold yellow",
    Band.CONFLICT: "bold red",
    Band.ADRIFT: "bold magenta",
    Band.UNVERIFIABLE: "bold blue",
}
PASSAGE_WORDS = 45


def _page(evidence: Evidence) -> str:
    """ "p. 2", "p. 2 (printed 306)" when the page prints another number, and ", results"
    when the section is known, so the reader knows where on the page to look."""
    printed = evidence.printed_page
    where = f"p. {evidence.page}"
    if printed is not None and printed != str(evidence.page):
        where += f" (printed {printed})"
    return f"{where}, {evidence.section}" if evidence.section else where


def _check_block(check: Check) -> Group:
    head = Text.assemble(
        (f"{check.band.value:<12}", BAND_STYLE[check.band]),
        (f" {check.score:.2f}  ", "dim"),
        (visible(check.citation.label), "bold"),
        (f"  {visible(check.source)}" if check.source else "", "cyan"),
    )
    lines: list[Text | Padding] = [head]
    if check.evidence:
        best = check.evidence[0]
        lines.append(
            Padding(
                Text(visible(f"{_page(best)}: \u201c{trim(best.text, PASSAGE_WORDS)}\u201d"), style="italic"),
                (0, 0, 0, 2),
            )
        )
    for reason in check.reasons:
        lines.append(Padding(Text.assemble((f"{reason.code}: ", "bold"), visible(reason.message)), (0, 0, 0, 2)))
    return Group(*lines)


def _claim_block(result: ClaimResult) -> Group:
    claim = result.claim
    title = Text.assemble((f"{claim.id}", "bold"), (f"  line {claim.line}  ", "dim"), visible(claim.text))
    return Group(title, *(Padding(_check_block(c), (0, 0, 0, 2)) for c in result.checks), Text(""))


def summary_line(report: Report) -> str:
    """Counts per band, every band named: '12 checks: 5 anchored, 2 loose, ...'."""
    counts = report.band_counts()
    total = sum(counts.values())
    return f"{total} checks: " + ", ".join(f"{n} {band.value}" for band, n in counts.items())


def render(report: Report, console: Console) -> None:
    """Print the whole report: claims, loose ends, problems, summary and caution."""
    console.print(Text(visible(f"sourcecheck: {report.draft} against {report.sources}"), style="bold"))
    console.print()
    for result in report.claims:
        console.print(_claim_block(result))
    unmatched = report.unmatched_references()
    if unmatched:
        console.print(Text("Cited references with no source file:", style="bold"))
        for ref in unmatched:
            console.print(Text(visible(f"  [{ref.key}] {trim(ref.text, 20)}")))
    uncited = report.uncited_references()
    if uncited:
        console.print(Text("References never cited in the text:", style="bold"))
        for ref in uncited:
            console.print(Text(visible(f"  [{ref.key}] {trim(ref.text, 20)}")))
    if report.unused_sources:
        console.print(Text("Source files no citation leads to:", style="bold"))
        for path in report.unused_sources:
            console.print(Text(visible(f"  {path}")))
    if report.problems:
        console.print(Text("Problems:", style="bold red"))
        for problem in report.problems:
            console.print(Text(visible(f"  {problem.file}: {problem.message}")))
    console.print()
    console.print(Text(summary_line(report), style="bold"))
    console.print(Text(CAUTION, style="dim"))
