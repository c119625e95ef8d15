"""The HTML report: one self-contained page a person can open, file or mail.

Everything is inside the file (CSS, a few lines of JavaScript for the filters, an SVG bar
chart): it opens offline and fetches nothing. The page is built with Jinja2 with
autoescaping on, and every string from a draft or a PDF passes through
:func:`sourcecheck.text.visible` before it is escaped, so a source whose text holds
``<script>`` or an ``onerror=`` attribute shows those characters and runs nothing. A
Content-Security-Policy in the page allows only its own script (by hash) as a second
wall, should a future template ever print a string unescaped.
"""

from __future__ import annotations

import base64
import hashlib
from dataclasses import dataclass, field

from jinja2 import Environment, PackageLoader, StrictUndefined
from markupsafe import Markup

from sourcecheck.model import Band, Check, ClaimResult, Evidence, Report
from sourcecheck.reports.caution import CAUTION
from sourcecheck.reports.highlight import claim_words, segments
from sourcecheck.reports.wording import (
    BAND_MEANINGS,
    BAND_ORDER,
    REASON_CODES,
    flagged_first,
    is_flagged,
    where,
    worst_band,
)
from sourcecheck.text import visible

#: Our palette, one colour per band, chosen to stay apart for the common colour-vision deficiencies.
BAND_COLOURS: dict[Band, str] = {
    Band.CONFLICT: "#b8323a",
    Band.ADRIFT: "#7a5aa6",
    Band.LOOSE: "#b9790f",
    Band.UNVERIFIABLE: "#5b6b7a",
    Band.ANCHORED: "#2e7d5b",
}
CHART_WIDTH = 260  # pixels the longest bar of the summary chart spans


@dataclass(frozen=True)
class PassageView:
    """A passage as shown: its pieces (marked where they are claim words) and where it stands."""

    pieces: list[tuple[str, bool]]
    where: str
    source: str
    score: float


@dataclass(frozen=True)
class CheckView:
    """One citation's check as the template shows it: every string already made visible."""

    band: str
    score: float
    citation: str
    source: str
    reasons: list[tuple[str, str]]
    best: PassageView | None
    more: list[PassageView] = field(default_factory=list)


@dataclass(frozen=True)
class ClaimView:
    """A claim with its checks; ``worst`` is the band that colours its edge."""

    id: str
    place: str
    text: str
    flagged: bool
    worst: str
    checks: list[CheckView]


def _passage(evidence: Evidence, wanted: frozenset[str]) -> PassageView:
    return PassageView(
        pieces=segments(visible(evidence.text), wanted),
        where=visible(where(evidence)),
        source=visible(evidence.source),
        score=evidence.score,
    )


def _check(check: Check, wanted: frozenset[str]) -> CheckView:
    passages = [_passage(e, wanted) for e in check.evidence]
    return CheckView(
        band=check.band.value,
        score=check.score,
        citation=visible(check.citation.label),
        source=visible(check.source or ""),
        reasons=[(r.code, visible(r.message)) for r in check.reasons],
        best=passages[0] if passages else None,
        more=passages[1:],
    )


def _claim(result: ClaimResult) -> ClaimView:
    claim = result.claim
    wanted = claim_words(claim.text)
    place = f"{claim.file}, line {claim.line}" if claim.file else f"line {claim.line}"
    return ClaimView(
        id=visible(claim.id),
        place=visible(place),
        text=visible(claim.text),
        flagged=any(is_flagged(c) for c in result.checks),
        worst=worst_band(result).value,
        checks=[_check(c, wanted) for c in result.checks],
    )


def _chart(report: Report) -> list[dict[str, object]]:
    """One bar per band: its count, its length in pixels and its colour."""
    counts = report.band_counts()
    top = max(counts.values(), default=0) or 1
    return [
        {"band": b.value, "count": counts[b], "width": round(CHART_WIDTH * counts[b] / top), "colour": BAND_COLOURS[b]}
        for b in BAND_ORDER
    ]


def _environment(loader: PackageLoader) -> Environment:
    return Environment(
        loader=loader,
        autoescape=True,
        undefined=StrictUndefined,
        trim_blocks=True,
        lstrip_blocks=True,
        keep_trailing_newline=True,
    )


def html(report: Report) -> str:
    """The whole report as one HTML document with its styles, script and chart inline."""
    loader = PackageLoader("sourcecheck.reports", "templates")
    env = _environment(loader)
    script, _, _ = loader.get_source(env, "report.js")
    style, _, _ = loader.get_source(env, "report.css")
    digest = base64.b64encode(hashlib.sha256(script.encode("utf-8")).digest()).decode("ascii")
    claims = [_claim(r) for r in flagged_first(report)]
    reason_codes = sorted({code for c in claims for check in c.checks for code, _ in check.reasons})
    return env.get_template("report.html.j2").render(
        draft=visible(report.draft),
        sources=visible(report.sources),
        model=visible(report.model.name),
        caution=CAUTION,
        claims=claims,
        chart=_chart(report),
        chart_width=CHART_WIDTH,
        total=sum(report.band_counts().values()),
        bands=[(b.value, *BAND_MEANINGS[b], BAND_COLOURS[b]) for b in BAND_ORDER],
        reasons=[(code, REASON_CODES.get(code, "")) for code in reason_codes],
        unmatched=[(visible(r.key), visible(r.text)) for r in report.unmatched_references()],
        uncited=[(visible(r.key), visible(r.text)) for r in report.uncited_references()],
        unused=[visible(p) for p in report.unused_sources],
        problems=[(visible(p.file), visible(p.message)) for p in report.problems],
        script=Markup(script),  # our own file from the package, never user text
        style=Markup(style),
        script_hash=f"sha256-{digest}",
    )
