"""The fitted mapping from evidence features to a backing score and a band.

The parameters live in ``calibration.json`` beside this module, written by
``bench/calibrate.py`` from a labelled claim-verification dataset; nothing here is set
by hand. The score is a logistic model's probability that the source backs the claim;
the band thresholds were chosen on the same fit split (the file says how).
"""

from __future__ import annotations

import json
import math
from collections.abc import Mapping
from dataclasses import dataclass, field
from importlib import resources

from sourcecheck.judge.features import FEATURE_NAMES, Features


@dataclass(frozen=True)
class Calibration:
    """Logistic weights over FEATURE_NAMES, the two band thresholds on the score, and the
    retrieval parameters the features were fitted with (the index must use the same): the
    first stage's fusion weight and the second stage's ranking weights, by feature name."""

    weights: tuple[float, ...]
    bias: float
    anchored_at: float
    adrift_below: float
    provenance: str
    dense_weight: float = 0.7
    ranking: Mapping[str, float] = field(default_factory=dict)
    ranking_margin: float = 0.0
    #: The verifier's P(contradicts) from which a passage is read as saying the opposite
    #: (above 1: never, as in a calibration fitted without a verifier).
    contradict_at: float = 1.01

    def score(self, features: Features) -> float:
        """Probability in [0, 1] that the passage backs the claim."""
        z = self.bias + sum(w * x for w, x in zip(self.weights, features.vector(), strict=True))
        return 1.0 / (1.0 + math.exp(-z))


def load_calibration(text: str | None = None) -> Calibration:
    """Read the shipped parameters (or ``text``, a JSON document of the same shape)."""
    if text is None:
        text = resources.files("sourcecheck.judge").joinpath("calibration.json").read_text("utf-8")
    data = json.loads(text)
    if tuple(data["features"]) != FEATURE_NAMES:
        raise ValueError(f"calibration features {data['features']} != {FEATURE_NAMES}")
    return Calibration(
        weights=tuple(float(w) for w in data["weights"]),
        bias=float(data["bias"]),
        anchored_at=float(data["thresholds"]["anchored_at"]),
        adrift_below=float(data["thresholds"]["adrift_below"]),
        provenance=str(data.get("made_by", "")),
        dense_weight=float(data.get("dense_weight", 0.7)),
        ranking={str(k): float(v) for k, v in data.get("ranking", {}).get("weights", {}).items()},
        ranking_margin=float(data.get("ranking", {}).get("margin", 0.0)),
        contradict_at=float(data["thresholds"].get("contradict_at", 1.01)),
    )
