"""What the bands and reason codes mean, and the order flagged checks are shown in.

One place for the words every shareable report (HTML, Markdown, SARIF) prints about a band
or a reason code, so the three never tell a reader different things. The band meanings
follow the README's "What the bands mean"; the reason descriptions are the README's list
of codes, spelled out.
"""

from __future__ import annotations

from sourcecheck.model import Band, Check, ClaimResult, Evidence, Report

#: Band -> (what it means, what to do), in the README's words.
BAND_MEANINGS: dict[Band, tuple[str, str]] = {
    Band.ANCHORED: (
        "a passage of the cited source states what the claim says",
        "glance at the passage and page shown",
    ),
    Band.LOOSE: (
        "a related passage exists, but a key detail of the claim is not in it (a number, the certainty, "
        "the scope, the exact wording of a quotation), or the passage only partly says it",
        "read the source around the page shown",
    ),
    Band.CONFLICT: (
        "the best passage gives another value for a number in the claim, negates the claim, "
        "or states the opposite direction",
        "compare the values or words named in the reason",
    ),
    Band.ADRIFT: (
        "nothing in the cited source resembles the claim",
        "check the citation; a better-source reason may name the file that does say it",
    ),
    Band.UNVERIFIABLE: (
        "no reference entry for the marker, or no readable PDF for the reference",
        "add the PDF, fix the marker, or map the reference to its file",
    ),
}

#: Flagged bands from the one most in need of a person's eyes to the least; anchored last.
BAND_ORDER: tuple[Band, ...] = (Band.CONFLICT, Band.ADRIFT, Band.LOOSE, Band.UNVERIFIABLE, Band.ANCHORED)

#: Every reason code the judge gives, with a sentence saying what it flags.
REASON_CODES: dict[str, str] = {
    "close-match": "A passage of the cited source states the claim.",
    "partial-match": "A passage of the cited source is related to the claim but does not fully state it.",
    "number-absent": "A number in the claim appears nowhere in the closest passages of the cited source.",
    "number-mismatch": "The closest passage gives another value for a number the claim states.",
    "quote-drift": "A quotation in the claim is not found word for word in the cited source.",
    "overstated": "The claim is worded more firmly than the source, which hedges the finding.",
    "scope-wider": "The claim generalises beyond the limits the source puts on its finding.",
    "negation": "The closest passage negates what the claim asserts, or asserts what the claim denies.",
    "direction-flip": "The closest passage reports the opposite direction (higher against lower, more against fewer).",
    "no-match": "Nothing in the cited source resembles the claim.",
    "better-source": "Another file in the sources folder backs the claim clearly better than the cited one.",
    "page-mismatch": "The citation names a page, but the closest passage is on another page.",
    "source-missing": "No readable PDF in the sources folder matches the cited reference.",
    "marker-unresolved": "The citation marker has no entry in the draft's reference list.",
    "source-unreadable": "The matched PDF holds no text that could be checked.",
}


def is_flagged(check: Check) -> bool:
    """A check a person should look at: every band but ``anchored``."""
    return check.band is not Band.ANCHORED


def worst_band(result: ClaimResult) -> Band:
    """The band of the claim's check that most needs a look (``BAND_ORDER``)."""
    return min((c.band for c in result.checks), key=BAND_ORDER.index, default=Band.ANCHORED)


def flagged_first(report: Report) -> list[ClaimResult]:
    """Claims with a flagged check first, the worst band first (``BAND_ORDER``), draft order
    within a band; then the claims whose checks are all anchored, in draft order."""
    return sorted(report.claims, key=lambda r: BAND_ORDER.index(worst_band(r)))


def rule_code(check: Check) -> str:
    """The reason that set the check's band: the judge lists it first (verdict.py), extras after."""
    return check.reasons[0].code if check.reasons else "no-reason"


def where(evidence: Evidence) -> str:
    """ "p. 2", "p. 2 (printed 306)" when the page prints another number, and ", results"
    when the section is known, so the reader knows where on the page to look."""
    printed = evidence.printed_page
    place = f"p. {evidence.page}"
    if printed is not None and printed != str(evidence.page):
        place += f" (printed {printed})"
    return f"{place}, {evidence.section}" if evidence.section else place
