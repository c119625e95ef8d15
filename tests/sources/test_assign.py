"""The one global assignment of entries to files, and the ties it leaves out."""

from __future__ import annotations

import itertools

import numpy as np
import pytest

from sourcecheck.sources._assign import TIE_MARGIN, Pair, assign


def _brute_force(points: np.ndarray, floor: float) -> float:
    """The best total by trying every one-to-one assignment (a check outside scipy)."""
    rows, cols = points.shape
    best = 0.0
    for perm in itertools.permutations(range(max(rows, cols)), rows):
        total = sum(points[r, c] for r, c in enumerate(perm) if c < cols and points[r, c] >= floor)
        best = max(best, total)
    return best


@pytest.mark.parametrize("seed", range(12))
def test_total_is_the_best_one_to_one_total(seed: int) -> None:
    rng = np.random.default_rng(seed)
    points = np.round(rng.uniform(-2, 9, size=(4, 5)), 1)
    chosen, ties = assign(points, floor=1.0)
    total = sum(points[p.row, p.col] for p in chosen) + sum(points[t.row, t.col] for t in ties)
    assert total == pytest.approx(_brute_force(points, 1.0))
    assert len({p.row for p in chosen}) == len(chosen) and len({p.col for p in chosen}) == len(chosen)
    assert all(points[p.row, p.col] >= 1.0 for p in chosen)


def test_greedy_choice_is_not_taken() -> None:
    # Greedy would pair row 0 with column 0 (5.0) and leave row 1 alone.
    points = np.array([[5.0, 4.5], [4.8, 0.0]])
    chosen, ties = assign(points, floor=1.0)
    assert chosen == [Pair(0, 1), Pair(1, 0)] and ties == []


def test_equal_files_for_one_entry_are_a_tie_naming_the_rival() -> None:
    chosen, ties = assign(np.array([[3.0, 3.0]]), floor=1.0)
    assert chosen == []
    assert (ties[0].row, {ties[0].col, ties[0].rival_col}) == (0, {0, 1})


def test_two_entries_for_one_file_within_the_margin_are_a_tie() -> None:
    chosen, ties = assign(np.array([[5.0], [5.0 - TIE_MARGIN / 2]]), floor=1.0)
    assert chosen == [] and ties[0].rival_row is not None


def test_a_clear_winner_is_no_tie() -> None:
    chosen, ties = assign(np.array([[5.0], [5.0 - 2 * TIE_MARGIN]]), floor=1.0)
    assert chosen == [Pair(0, 0)] and ties == []


def test_below_the_floor_nothing_is_matched() -> None:
    assert assign(np.array([[0.9, -3.0]]), floor=1.0) == ([], [])
    assert assign(np.zeros((0, 3)), floor=1.0) == ([], [])


def _scipy_pairs(weights: np.ndarray) -> list[Pair]:
    from scipy.optimize import linear_sum_assignment

    rows, cols = linear_sum_assignment(weights, maximize=True)
    return [Pair(int(r), int(c)) for r, c in zip(rows, cols, strict=True) if weights[r, c] > 0]


@pytest.mark.parametrize("seed", range(40))
def test_the_no_competition_shortcut_gives_the_hungarian_answer(seed: int) -> None:
    # SciPy's linear_sum_assignment is the reference; sparse matrices like real evidence
    # (most pairs below the floor, a few rows competing for one file) take both paths.
    from sourcecheck.sources._assign import _each_row_its_best, _solve

    rng = np.random.default_rng(seed)
    weights = np.where(rng.random((6, 7)) < 0.25, np.round(rng.uniform(0.5, 9, size=(6, 7)), 1), 0.0)
    shortcut = _each_row_its_best(weights)
    if shortcut is not None:
        assert shortcut == _scipy_pairs(weights)
    total, pairs = _solve(weights)
    assert pairs == _scipy_pairs(weights) or total == pytest.approx(
        sum(weights[p.row, p.col] for p in _scipy_pairs(weights))
    )


def test_the_shortcut_refuses_rows_that_compete() -> None:
    from sourcecheck.sources._assign import _each_row_its_best

    assert _each_row_its_best(np.array([[5.0, 0.0], [4.0, 0.0]])) is None  # two entries want file 0
    assert _each_row_its_best(np.array([[5.0, 5.0], [0.0, 4.0]])) is None  # entry 0 is torn between two
    assert _each_row_its_best(np.array([[5.0, 1.0], [0.0, 4.0]])) == [Pair(0, 0), Pair(1, 1)]
