"""The gate: which checks should stop a manuscript, for ``--fail-on`` and continuous integration.

Bands ordered from least to most severe (a design choice, no source):

``anchored`` < ``loose`` < ``unverifiable`` < ``adrift`` < ``conflict``

- ``loose``: the source says something close; a detail needs a look.
- ``unverifiable``: nothing could be checked (no entry, no PDF); a gap in the
  evidence, not a finding against the claim.
- ``adrift``: the cited source does not talk about the claim at all; likely the wrong work.
- ``conflict``: the source states another number, the negation or the opposite direction.

``--fail-on BAND`` fails a run when any check is at BAND or more severe. Checks a person
has accepted (a review-file entry or an ignore comment) never fail the gate.
"""

from __future__ import annotations

from sourcecheck.model import BAND_SEVERITY, Band, Check, Report

#: Least severe first (kept in the vocabulary, so the reports order their columns the same way).
SEVERITY: tuple[Band, ...] = BAND_SEVERITY

#: The bands ``--fail-on`` accepts: failing on ``anchored`` would fail every run.
GATE_BANDS: tuple[str, ...] = tuple(b.value for b in SEVERITY[1:])


def at_or_above(band: Band, gate: Band) -> bool:
    """Whether ``band`` is as severe as ``gate`` or more."""
    return SEVERITY.index(band) >= SEVERITY.index(gate)


def gate_failures(reports: list[Report], gate: Band) -> list[Check]:
    """Unreviewed checks of ``reports`` at or above ``gate``, in report order."""
    return [
        check
        for report in reports
        for result in report.claims
        for check in result.checks
        if check.reviewed is None and at_or_above(check.band, gate)
    ]
