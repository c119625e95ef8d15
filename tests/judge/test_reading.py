"""The verifier's reading of a claim against a passage: windows, strongest readings, the band.

The scorer here is a stand-in with fixed, inspectable answers, so these tests check the
judge's use of the verifier's probabilities; the shipped model's own accuracy is measured by
bench/verifier.py and checked on invented pairs in tests/judge/verifier/.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import replace

import numpy as np

from sourcecheck.judge import read, windows
from sourcecheck.judge.calibration import Calibration
from sourcecheck.judge.verdict import judge
from sourcecheck.model import Band, Citation, Hit, Passage

CITE = Citation(marker="[1]", label="[1]", key="1")
CAL = Calibration(
    weights=(10.0, 4.0, -1.5, -3.0, -3.0, -1.5, -3.0, 2.0, -6.0),
    bias=-8.0,
    anchored_at=0.6,
    adrift_below=0.2,
    provenance="test",
    contradict_at=0.7,
)


class Keyword:
    """Answers by keyword: a window holding ``against`` contradicts, one holding ``backs`` supports."""

    def __init__(self, against: str, backs: str) -> None:
        self.against, self.backs = against, backs
        self.seen: list[tuple[str, str]] = []

    def score(self, pairs: Sequence[tuple[str, str]]) -> np.ndarray:
        self.seen.extend(pairs)
        rows = []
        for _, window in pairs:
            if self.against in window:
                rows.append([0.05, 0.9, 0.05])
            elif self.backs in window:
                rows.append([0.8, 0.05, 0.15])
            else:
                rows.append([0.1, 0.1, 0.8])
        return np.array(rows)


PASSAGE = (
    "Seedlings were grown in twelve plots. Plots that were watered daily grew slowly. "
    "Dry plots grew faster than watered ones."
)


def _hit(text: str) -> Hit:
    return Hit(passage=Passage("a.pdf", 4, text, 0), fused=0.9, dense=0.9, bm25=1.0, coverage=0.9)


def test_windows_are_each_sentence_then_each_adjacent_pair() -> None:
    found = windows(PASSAGE)
    assert found[:3] == [
        "Seedlings were grown in twelve plots.",
        "Plots that were watered daily grew slowly.",
        "Dry plots grew faster than watered ones.",
    ]
    assert found[3] == "Seedlings were grown in twelve plots. Plots that were watered daily grew slowly."
    assert len(found) == 5


def test_the_strongest_reading_of_each_kind_and_its_window_are_kept() -> None:
    scorer = Keyword(against="Dry plots", backs="twelve")
    reading = read("Watered plots grew faster.", PASSAGE, scorer)
    assert reading.contradict == 0.9 and reading.contradicting.startswith("Dry plots")
    assert reading.entail == 0.8 and "twelve" in reading.supporting
    assert {claim for claim, _ in scorer.seen} == {"Watered plots grew faster."}


def test_a_confident_contradiction_is_a_conflict_that_quotes_the_sentence() -> None:
    check = judge("Watered plots grew faster.", CITE, None, "a.pdf", [_hit(PASSAGE)], CAL, scorer=Keyword("Dry", "zzz"))
    assert check.band is Band.CONFLICT
    reason = next(r for r in check.reasons if r.code == "contradicted")
    assert "Dry plots grew faster than watered ones." in reason.message and "p. 4" in reason.message
    # The sentence that decided the band is inside the evidence shown.
    assert "Dry plots grew faster" in check.evidence[0].text


def test_below_the_fitted_cut_the_verifier_only_moves_the_score() -> None:
    mild = replace(CAL, contradict_at=0.95)
    check = judge(
        "Watered plots grew faster.", CITE, None, "a.pdf", [_hit(PASSAGE)], mild, scorer=Keyword("Dry", "zzz")
    )
    assert "contradicted" not in {r.code for r in check.reasons}
    plain = judge("Watered plots grew faster.", CITE, None, "a.pdf", [_hit(PASSAGE)], mild)
    assert check.score < plain.score  # the contradiction weight (-6) still counts


def test_without_a_verifier_its_features_read_zero() -> None:
    check = judge("Watered plots grew faster.", CITE, None, "a.pdf", [_hit(PASSAGE)], CAL)
    assert "contradicted" not in {r.code for r in check.reasons}
