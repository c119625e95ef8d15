"""The evidence features the backing score is computed from.

Kept in one place so the calibration script (bench/calibrate.py) and the judge compute
exactly the same numbers from the same hits.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

from sourcecheck.judge.comparisons import compare_groups
from sourcecheck.judge.cue_lists import CueFinding
from sourcecheck.judge.cues import compare
from sourcecheck.judge.effects import compare_effects
from sourcecheck.judge.number_checks import NumberFinding, unsupported_numbers
from sourcecheck.judge.reading import PairScorer, Reading, read
from sourcecheck.model import Hit

FEATURE_NAMES = (
    "dense",
    "coverage",
    "number_absent",
    "number_different",
    "conflict_cue",
    "weak_cue",
    "effect_disagrees",
    "entail",
    "contradict",
)

#: Cue codes that make a passage say the opposite of the claim, and those that make it say less.
CONFLICT_CUES = frozenset({"negation", "direction-flip"})
WEAK_CUES = frozenset({"overstated", "scope-wider"})


@dataclass(frozen=True)
class Features:
    """What the judge knows about a claim and the best passages of one source."""

    dense: float
    coverage: float
    numbers: tuple[NumberFinding, ...]
    cues: tuple[CueFinding, ...] = ()
    effects: tuple[CueFinding, ...] = ()  # a ratio estimate or two groups' values against the claim
    reading: Reading | None = None  # the verifier's reading of the best passage, when one ran

    @property
    def number_absent(self) -> bool:
        return any(f.counterpart is None for f in self.numbers)

    @property
    def number_different(self) -> bool:
        return any(f.counterpart is not None for f in self.numbers)

    @property
    def conflict_cues(self) -> list[CueFinding]:
        """Wording cues and effect estimates that make the passage say the opposite."""
        return [c for c in (*self.cues, *self.effects) if c.code in CONFLICT_CUES]

    @property
    def weak_cues(self) -> list[CueFinding]:
        return [c for c in self.cues if c.code in WEAK_CUES]

    @property
    def entail(self) -> float:
        return self.reading.entail if self.reading is not None else 0.0

    @property
    def contradict(self) -> float:
        return self.reading.contradict if self.reading is not None else 0.0

    def topical(self) -> Features:
        """The same evidence with the number, wording and verifier checks left out: is it about the claim?"""
        return replace(self, numbers=(), cues=(), effects=(), reading=None)

    def vector(self) -> list[float]:
        """The features in FEATURE_NAMES order, as the fitted model expects them."""
        return [
            self.dense,
            self.coverage,
            float(self.number_absent),
            float(self.number_different),
            float(any(c.code in CONFLICT_CUES for c in self.cues)),
            float(bool(self.weak_cues)),
            float(bool(self.effects)),
            self.entail,
            self.contradict,
        ]


def features_of(claim: str, hits: list[Hit], scorer: PairScorer | None = None) -> Features:
    """Features of ``claim`` against ``hits`` (best first, non-empty, one source).

    ``scorer`` is the entailment verifier; without one its two features read 0.
    """
    best = hits[0]
    findings = unsupported_numbers(claim, best.passage.text, [h.passage.text for h in hits[1:]])
    cues = compare(claim, best.passage.text)
    worded = {c.code for c in cues}
    effects = [f for f in compare_effects(claim, best.passage.text) if f.code not in worded]
    if "direction-flip" not in worded | {f.code for f in effects}:
        effects += compare_groups(claim, best.passage.text)
    return Features(
        dense=max(h.dense for h in hits),
        coverage=max(h.coverage for h in hits),
        numbers=tuple(findings),
        cues=tuple(cues),
        effects=tuple(effects),
        reading=read(claim, best.passage.text, scorer) if scorer is not None else None,
    )
