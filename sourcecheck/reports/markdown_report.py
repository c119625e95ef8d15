"""The Markdown report: for a co-author or a review thread, rendered by the common forges.

A summary table of the bands, then the flagged checks first (band, reasons and the
closest passage quoted with its page), then the anchored ones as one compact table.
Text from drafts and PDFs is untrusted: control characters are made visible
(:func:`sourcecheck.text.visible`) and every ASCII punctuation character that Markdown
or inline HTML could act on inside a line is backslash-escaped, as is a first character that
could open a block (CommonMark 0.31, section 2.4: "any ASCII punctuation character may be
backslash-escaped"), so a source cannot add a heading, a link, an image, a table cell or an
HTML tag to the report.
"""

from __future__ import annotations

import re

from sourcecheck.model import Check, ClaimResult, Report
from sourcecheck.reports.caution import CAUTION
from sourcecheck.reports.wording import BAND_MEANINGS, BAND_ORDER, flagged_first, is_flagged, where
from sourcecheck.text import trim, visible

#: Characters that act anywhere in a line: escapes, code, emphasis, links and images, inline
#: HTML and autolinks, entities, table cells, strikethrough, and the forges' inline maths.
_ACTIVE = re.compile(r"([\\`*_\[\]<>|~&$])")
#: What a line may start with to become a heading, quote, list item or rule (our text always
#: follows a prefix such as "> " or "- ", so its first character is where a block could start).
_BLOCK_START = re.compile(r"^(\d{1,9})?([#>+\-=.)])")
_SPACES = re.compile(r"[ \t\r\n]+")
QUOTED_WORDS = 80


def md(text: str) -> str:
    """Untrusted text as inert Markdown on one line: visible controls, active punctuation escaped."""
    inline = _ACTIVE.sub(r"\\\1", visible(_SPACES.sub(" ", text).strip()))
    return _BLOCK_START.sub(lambda m: (m.group(1) or "") + "\\" + m.group(2), inline, count=1)


def _summary(report: Report) -> list[str]:
    counts = report.band_counts()
    lines = ["| band | checks | what it means |", "| --- | ---: | --- |"]
    lines += [f"| {band.value} | {counts[band]} | {BAND_MEANINGS[band][0]} |" for band in BAND_ORDER]
    lines.append(f"| **all** | **{sum(counts.values())}** | |")
    return lines


def _flagged_check(check: Check) -> list[str]:
    source = f" in {md(check.source)}" if check.source else ""
    lines = [f"- **{check.band.value}** (score {check.score:.2f}) for {md(check.citation.label)}{source}"]
    lines += [f"  - `{r.code}`: {md(r.message)}" for r in check.reasons]
    if check.evidence:
        best = check.evidence[0]
        lines += ["", f"  Closest passage, {md(where(best))}:", "", f"  > {md(trim(best.text, QUOTED_WORDS))}"]
    lines.append("")
    return lines


def _flagged_claim(result: ClaimResult) -> list[str]:
    claim = result.claim
    place = f"{md(claim.file)}, line {claim.line}" if claim.file else f"line {claim.line}"
    lines = [f"### {md(claim.id)} ({place})", "", f"> {md(claim.text)}", ""]
    for check in result.checks:
        lines += _flagged_check(check)
    return lines


def _anchored_rows(claims: list[ClaimResult]) -> list[str]:
    rows = [
        f"| {md(r.claim.id)} | {r.claim.line} | {md(c.citation.label)} | {c.score:.2f} | "
        f"{md(where(c.evidence[0])) if c.evidence else ''} | {md(trim(r.claim.text, 30))} |"
        for r in claims
        for c in r.checks
        if not is_flagged(c)
    ]
    if not rows:
        return []
    head = ["## Anchored checks", "", "| claim | line | citation | score | passage | sentence |"]
    return [*head, "| --- | ---: | --- | ---: | --- | --- |", *rows, ""]


def _reference_line(key: str, text: str) -> str:
    return f"\\[{md(key)}\\] {md(trim(text, 20))}"


def _loose_ends(report: Report) -> list[str]:
    lines: list[str] = []
    sections = [
        (
            "Cited references with no source file",
            [_reference_line(r.key, r.text) for r in report.unmatched_references()],
        ),
        ("References never cited in the text", [_reference_line(r.key, r.text) for r in report.uncited_references()]),
        ("Source files no citation leads to", [md(path) for path in report.unused_sources]),
        ("Problems", [f"{md(p.file)}: {md(p.message)}" for p in report.problems]),
    ]
    for title, items in sections:
        if items:
            lines += [f"## {title}", "", *[f"- {item}" for item in items], ""]
    return lines


def markdown(report: Report) -> str:
    """The whole report as GitHub-flavoured Markdown, ending in a newline."""
    ordered = flagged_first(report)
    flagged = [r for r in ordered if any(is_flagged(c) for c in r.checks)]
    lines = [
        f"# Citation check of {md(report.draft)}",
        "",
        f"Sources: {md(report.sources)}. Model: {md(report.model.name)}.",
        "",
        f"> {CAUTION}",
        "",
        *_summary(report),
        "",
    ]
    if flagged:
        lines += ["## Checks to read first", ""]
        for result in flagged:
            lines += _flagged_claim(result)
    lines += _anchored_rows([r for r in ordered if r not in flagged])
    lines += _loose_ends(report)
    while lines and not lines[-1]:
        lines.pop()
    return "\n".join(lines) + "\n"
