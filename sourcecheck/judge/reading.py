"""Reading a claim against the sentences of its best passage with the trained verifier.

Word lists and embeddings cannot tell "the source says the claim" from "the source says
the opposite in the same words"; the verifier (:mod:`sourcecheck.judge.verifier`) reads
each pair and says supports / contradicts / neither. It reads the claim against every
sentence of the best passage and every two adjacent sentences (a finding and its
qualifier often share two), and the strongest reading of each kind becomes a feature of
the fitted score; the window that decided is kept, so the reason can quote it.
"""

from __future__ import annotations

import itertools
from collections.abc import Sequence
from dataclasses import dataclass
from typing import Protocol

import numpy as np

from sourcecheck.text import sentence_spans

#: Windows read per passage at most: a passage holds a few sentences (sources/_passages.py),
#: and this bounds the cost of an odd long one.
MAX_WINDOWS = 12


class PairScorer(Protocol):
    """Probabilities (supports, contradicts, neither) for (claim, evidence) pairs, one row each."""

    def score(self, pairs: Sequence[tuple[str, str]]) -> np.ndarray: ...


@dataclass(frozen=True)
class Reading:
    """The verifier's strongest readings of a claim against one passage."""

    entail: float  # the highest P(supports) over the windows
    contradict: float  # the highest P(contradicts) over the windows
    supporting: str  # the window with the highest P(supports)
    contradicting: str  # the window with the highest P(contradicts)


def windows(passage: str) -> list[str]:
    """Each sentence of ``passage`` and each two adjacent ones, in order, without repeats."""
    sentences = [passage[a:b].strip() for a, b in sentence_spans(passage)]
    sentences = [s for s in sentences if s]
    found = list(dict.fromkeys([*sentences, *(f"{a} {b}" for a, b in itertools.pairwise(sentences))]))
    return found[:MAX_WINDOWS] or [passage.strip()]


def read(claim: str, passage: str, scorer: PairScorer) -> Reading:
    """The verifier's reading of ``claim`` against ``passage`` (see :class:`Reading`)."""
    shown = windows(passage)
    probabilities = np.asarray(scorer.score([(claim, w) for w in shown]), dtype=float)
    best_support = int(np.argmax(probabilities[:, 0]))
    best_contra = int(np.argmax(probabilities[:, 1]))
    return Reading(
        entail=float(probabilities[best_support, 0]),
        contradict=float(probabilities[best_contra, 1]),
        supporting=shown[best_support],
        contradicting=shown[best_contra],
    )
