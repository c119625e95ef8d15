"""The terminal report, rendered with rich.

Compact by default, because a person reads it top to bottom: a check that needs a look
(any band but ``anchored``) is shown in full with its passage and reasons; an anchored or
accepted check takes one line. ``show_all`` shows every check in full with every passage
retrieved. Lines are wrapped by :mod:`.layout` (hanging indents, markers kept whole, no
trailing spaces); everything from a file goes through ``visible`` first.

Rendering is a pure function of the report and a console, so tests render to a fixed
width, colourless console and compare text (the pattern rich's own tests use).
"""

from __future__ import annotations

from rich.console import Console
from rich.text import Text

from sourcecheck.model import Band, Check, ClaimResult, Report
from sourcecheck.reports.caution import CAUTION
from sourcecheck.reports.layout import emit, keep_spans
from sourcecheck.reports.wording import where as place_of
from sourcecheck.text import trim, visible

BAND_STYLE = {
    Band.ANCHORED: "bold green",
    Band.LOOSE: "bold yellow",
    Band.CONFLICT: "bold red",
    Band.ADRIFT: "bold magenta",
    Band.UNVERIFIABLE: "bold blue",
}
PASSAGE_WORDS = 45
#: The legend under the title: the bands in order of severity, and what the score is.
#: Two short lines, so each fits an 80-column terminal; the README explains each band.
LEGEND = (
    "bands, least to most severe: anchored, loose, unverifiable, adrift, conflict",
    "score: the fitted probability that the passage backs the claim",
)


def plural(count: int, noun: str) -> str:
    """ "1 check", "3 checks": the count with its noun in the right number."""
    return f"{count} {noun}" if count == 1 else f"{count} {noun}s"


def _where(result: ClaimResult) -> str:
    """ "line 4" or, for a Word draft, "paragraph 4"; with the included file when there is one."""
    claim = result.claim
    place = f"{claim.unit} {claim.line}"
    return f"{visible(claim.file)}, {place}" if claim.file else place


def _head(check: Check, short: bool) -> tuple[Text, list[str]]:
    """Band, score, citation and source of a check, and the spans that must stay on one line.

    ``short`` (the one-line form) names the source file without its folders and the page
    of the passage, which the full form shows on the passage's own line.
    """
    marker = f"{check.band.value} {check.score:.2f}"
    label = visible(check.citation.label)
    page = f"p. {check.evidence[0].page}" if check.evidence else ""
    parts: list[tuple[str, str]] = []
    if check.reviewed is not None:
        parts.append(("reviewed ", "bold"))
    parts += [(marker, BAND_STYLE[check.band]), ("  ", ""), (label, "bold")]
    if short and page:
        parts.append((f"  {page}", "dim"))
    if check.source:
        parts.append((f"  {visible(check.source.rsplit('/', 1)[-1] if short else check.source)}", "cyan"))
    return Text.assemble(*parts), [marker, label, page]


def _check_full(console: Console, check: Check, show_all: bool) -> None:
    head, keep = _head(check, short=False)
    emit(console, head, indent=2, hang=6, keep=keep_spans(head.plain, keep))
    for evidence in check.evidence if show_all else check.evidence[:1]:
        where = visible(place_of(evidence))
        passage = Text(f"{where}: \u201c{visible(trim(evidence.text, PASSAGE_WORDS))}\u201d", style="italic")
        emit(console, passage, indent=4, hang=6, keep=keep_spans(passage.plain, [where]))
    for reason in check.reasons:
        line = Text.assemble((f"{reason.code}: ", "bold"), visible(reason.message))
        emit(console, line, indent=4, hang=6)
    if check.reviewed is not None:
        emit(console, Text(f"reviewed: {visible(check.reviewed.note)}", style="bold"), indent=4, hang=6)


def _check_line(console: Console, check: Check) -> None:
    """An anchored or accepted check in one line (wrapped only when the console is very narrow)."""
    head, keep = _head(check, short=True)
    if check.reviewed is not None:
        head.append(f"  note: {visible(check.reviewed.note)}", style="dim")
    emit(console, head, indent=2, hang=6, keep=keep_spans(head.plain, keep))


def _needs_a_look(check: Check) -> bool:
    return check.band is not Band.ANCHORED and check.reviewed is None


def _claim_block(console: Console, result: ClaimResult, show_all: bool) -> None:
    claim = result.claim
    text = visible(claim.text)
    title = Text.assemble((claim.id, "bold"), (f"  {_where(result)}  ", "dim"), text)
    markers = [visible(c.marker) for c in claim.citations]
    emit(console, title, indent=0, hang=4, keep=keep_spans(title.plain, [_where(result), *markers]))
    for check in result.checks:
        if show_all or _needs_a_look(check):
            _check_full(console, check, show_all)
        else:
            _check_line(console, check)
    console.print()


def summary_line(report: Report) -> str:
    """Counts per band, every band named: '12 checks: 5 anchored, 2 loose, ...'; reviewed ones when any."""
    counts = report.band_counts()
    total = sum(counts.values())
    line = f"{plural(total, 'check')}: " + ", ".join(f"{n} {band.value}" for band, n in counts.items())
    reviewed = sum(1 for r in report.claims for c in r.checks if c.reviewed is not None)
    return line + (f"; {reviewed} reviewed" if reviewed else "")


def _listing(console: Console, title: str, items: list[str]) -> None:
    if items:
        console.print(Text(title, style="bold"))
        for item in items:
            emit(console, Text(item), indent=2, hang=4)


def render(report: Report, console: Console, show_all: bool = False) -> None:
    """Print the whole report: claims, loose ends, problems, summary, legend and caution."""
    emit(console, Text(f"sourcecheck: {visible(report.draft)} against {visible(report.sources)}", style="bold"))
    for line in LEGEND:
        emit(console, Text(line, style="dim"), hang=2)
    console.print()
    for result in report.claims:
        _claim_block(console, result, show_all)
    _listing(
        console,
        "Cited references with no source file:",
        [f"[{visible(r.key)}] {visible(trim(r.text, 20))}" for r in report.unmatched_references()],
    )
    _listing(
        console,
        "References never cited in the text:",
        [f"[{visible(r.key)}] {visible(trim(r.text, 20))}" for r in report.uncited_references()],
    )
    _listing(console, "Source files no citation leads to:", [visible(p) for p in report.unused_sources])
    if report.problems:
        console.print(Text("Problems:", style="bold red"))
        for problem in report.problems:
            emit(console, Text(f"{visible(problem.file)}: {visible(problem.message)}"), indent=2, hang=4)
    console.print()
    emit(console, Text(summary_line(report), style="bold"), hang=0)
    emit(console, Text(CAUTION, style="dim"), hang=0)
