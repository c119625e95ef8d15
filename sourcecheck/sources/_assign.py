"""One assignment of reference entries to source files over all the evidence at once.

Greedy tiers (best DOI first, then titles, ...) can hand a file to the wrong entry early and
leave the right one stranded; an optimal assignment does not. ``points[r][s]`` is the
evidence that entry r cites file s (log-odds, so a sum over pairs is the log-odds of the
whole assignment); each entry gets at most one file and each file at most one entry, and
the total is maximised with ``scipy.optimize.linear_sum_assignment`` (the Hungarian method;
SciPy's documentation, from memory). Pairs below the floor are not allowed at all.

A chosen pair is *ambiguous* when the best assignment without it is nearly as good (within
:data:`TIE_MARGIN`): the evidence cannot tell the two readings apart, so neither is guessed.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

#: Two assignments whose totals differ by less than this many points are a tie. A tenth of
#: a point is a 7% change in odds, below what the evidence can resolve (set by hand).
TIE_MARGIN = 0.1


@dataclass(frozen=True)
class Pair:
    """A chosen (entry, file) pair by row and column."""

    row: int
    col: int


@dataclass(frozen=True)
class Tie:
    """A pair the evidence cannot settle, and its rival: the same entry with another file
    (``rival_col``) or the same file with another entry (``rival_row``)."""

    row: int
    col: int
    rival_row: int | None
    rival_col: int | None


def _solve(weights: np.ndarray) -> tuple[float, list[Pair]]:
    pairs = _each_row_its_best(weights)
    if pairs is None:
        from scipy.optimize import linear_sum_assignment  # 0.2 s to import: only when rows compete

        rows, cols = linear_sum_assignment(weights, maximize=True)
        pairs = [Pair(int(r), int(c)) for r, c in zip(rows, cols, strict=True) if weights[r, c] > 0]
    return float(sum(weights[p.row, p.col] for p in pairs)), pairs


def _each_row_its_best(weights: np.ndarray) -> list[Pair] | None:
    """The optimal assignment when no two entries compete, else None.

    If every entry's best file is strictly better than its others and no two entries share
    a best file, giving each entry its best reaches the sum of the row maxima, which no
    assignment can exceed; being the only assignment to reach it, it is the one the
    Hungarian method returns. That is the usual case (one file per reference), and it
    spares a warm run importing SciPy's optimiser.
    """
    pairs: list[Pair] = []
    taken: set[int] = set()
    for row, values in enumerate(weights):
        best = int(values.argmax())
        if values[best] <= 0:
            continue
        if best in taken or int((values == values[best]).sum()) > 1:
            return None
        taken.add(best)
        pairs.append(Pair(row, best))
    return pairs


def assign(points: np.ndarray, floor: float) -> tuple[list[Pair], list[Tie]]:
    """The best one-to-one pairs with at least ``floor`` points each, and the ties left out."""
    if points.size == 0:
        return [], []
    weights = np.where(points >= floor, points, 0.0)
    total, pairs = _solve(weights)
    chosen: list[Pair] = []
    ties: list[Tie] = []
    for pair in pairs:
        without = weights.copy()
        without[pair.row, pair.col] = 0.0
        other_total, other_pairs = _solve(without)
        if other_total < total - TIE_MARGIN:
            chosen.append(pair)
            continue
        rival_col = next((p.col for p in other_pairs if p.row == pair.row), None)
        rival_row = next((p.row for p in other_pairs if p.col == pair.col), None)
        ties.append(Tie(pair.row, pair.col, rival_row if rival_col is None else None, rival_col))
    return chosen, ties
