"""The gate's severity order and which checks fail it."""

from __future__ import annotations

import pytest

from sourcecheck.cli import GATE_BANDS as CLI_GATE_BANDS
from sourcecheck.model import Band, Review
from sourcecheck.workflow import GATE_BANDS, SEVERITY, at_or_above, gate_failures
from tests.reports.sample_report import sample_report


def test_severity_runs_from_anchored_to_conflict_and_holds_every_band() -> None:
    assert [b.value for b in SEVERITY] == ["anchored", "loose", "unverifiable", "adrift", "conflict"]
    assert set(SEVERITY) == set(Band)
    assert CLI_GATE_BANDS == GATE_BANDS  # the command line's choices are the gate's bands


@pytest.mark.parametrize(
    ("gate", "failing"),
    [
        (Band.LOOSE, {Band.LOOSE, Band.UNVERIFIABLE, Band.ADRIFT, Band.CONFLICT}),
        (Band.UNVERIFIABLE, {Band.UNVERIFIABLE, Band.ADRIFT, Band.CONFLICT}),
        (Band.ADRIFT, {Band.ADRIFT, Band.CONFLICT}),
        (Band.CONFLICT, {Band.CONFLICT}),
    ],
)
def test_a_gate_fails_its_band_and_every_worse_one(gate: Band, failing: set[Band]) -> None:
    assert {band for band in Band if at_or_above(band, gate)} == failing


def test_gate_failures_pass_over_reviewed_checks() -> None:
    report = sample_report()  # one conflict, two unverifiable
    assert [c.band for c in gate_failures([report], Band.CONFLICT)] == [Band.CONFLICT]
    assert len(gate_failures([report], Band.UNVERIFIABLE)) == 3
    report.claims[0].checks[0].reviewed = Review("read it", "review-file")
    assert gate_failures([report], Band.CONFLICT) == []
    assert len(gate_failures([report, sample_report()], Band.CONFLICT)) == 1  # reports are gated together
