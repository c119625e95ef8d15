"""The fitting and scoring helpers of bench/calibrate.py, against scikit-learn.

The calibration's figures (AUROC, the logistic weights, the pairwise ranker) are only as
good as these few functions, so each is checked against the reference implementation of
the same formula in scikit-learn (installed with sentence-transformers), on invented data.
"""

from __future__ import annotations

import importlib.util
import sys
from pathlib import Path
from types import ModuleType

import numpy as np
import pytest
from sklearn.linear_model import LogisticRegression
from sklearn.metrics import roc_auc_score, roc_curve

SCRIPT = Path(__file__).resolve().parents[2] / "bench" / "calibrate.py"


def _load() -> ModuleType:
    """bench/ is not a package, so the script is imported from its path."""
    spec = importlib.util.spec_from_file_location("calibrate", SCRIPT)
    assert spec and spec.loader
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module
    spec.loader.exec_module(module)
    return module


cal = _load()
RNG = np.random.default_rng(7)


def _scores(n: int = 200) -> tuple[np.ndarray, np.ndarray]:
    positive = RNG.random(n) < 0.4
    scores = RNG.normal(loc=np.where(positive, 1.0, 0.0), scale=1.0).round(1)  # rounding makes ties
    return scores, positive


def test_auroc_equals_scikit_learns_with_ties() -> None:
    # Mann-Whitney U / (n_pos * n_neg), ties counted one half (Hanley & McNeil, 1982; from
    # memory) is what sklearn.metrics.roc_auc_score computes.
    scores, positive = _scores()
    assert cal.auroc(scores, positive) == pytest.approx(roc_auc_score(positive, scores), abs=1e-12)


def test_auroc_is_undefined_without_both_classes() -> None:
    assert np.isnan(cal.auroc(np.array([0.2, 0.4]), np.array([True, True])))


def test_youden_threshold_maximises_tpr_minus_fpr() -> None:
    # Youden (1950): J = sensitivity + specificity - 1 = TPR - FPR, read off sklearn's ROC curve.
    scores, positive = _scores()
    fpr, tpr, _ = roc_curve(positive, scores)
    best = float(np.max(tpr - fpr))
    cut = cal.youden_threshold(scores, positive)
    j = (scores[positive] >= cut).mean() + (scores[~positive] < cut).mean() - 1
    assert j == pytest.approx(best, abs=1e-12)


def test_logistic_fit_matches_scikit_learn_with_the_same_penalty() -> None:
    # Minimising sum log-loss + (L2 / 2) * |w|^2 with an unpenalised intercept is
    # sklearn's LogisticRegression(C = 1 / L2), solved here by Newton's method (IRLS).
    x = RNG.normal(size=(300, 3))
    logits = x @ np.array([1.5, -2.0, 0.5]) + 0.3
    y = (RNG.random(300) < 1 / (1 + np.exp(-logits))).astype(float)
    weights, bias = cal.fit_logistic(x, y)
    reference = LogisticRegression(C=1 / cal.L2, tol=1e-10, max_iter=10_000).fit(x, y)
    assert weights == pytest.approx(reference.coef_[0], abs=1e-4)
    assert bias == pytest.approx(reference.intercept_[0], abs=1e-4)


def test_weighted_logistic_fit_matches_scikit_learns_sample_weight() -> None:
    # Two data sets pooled with unequal row weights (bench/calibrate.py --citint): the
    # weighted log-loss is sklearn's LogisticRegression.fit(..., sample_weight=...).
    x = RNG.normal(size=(300, 3))
    y = (x @ np.array([1.0, -1.0, 0.5]) + RNG.normal(size=300) > 0).astype(float)
    weight = np.where(np.arange(300) < 100, 1.0, 0.25)
    weights, bias = cal.fit_logistic(x, y, sample_weight=weight)
    reference = LogisticRegression(C=1 / cal.L2, tol=1e-10, max_iter=10_000).fit(x, y, sample_weight=weight)
    assert weights == pytest.approx(reference.coef_[0], abs=1e-4)
    assert bias == pytest.approx(reference.intercept_[0], abs=1e-4)
    assert not np.allclose(weights, cal.fit_logistic(x, y)[0], atol=1e-3)


def test_logistic_fit_without_bias_matches_scikit_learn_without_intercept() -> None:
    # The pairwise ranker's fit: differences of feature vectors, no intercept (RankNet with
    # a linear scorer, Burges et al. 2005; from memory).
    x = RNG.normal(size=(300, 2))
    y = (x @ np.array([2.0, -1.0]) + RNG.normal(scale=0.5, size=300) > 0).astype(float)
    weights, bias = cal.fit_logistic(x, y, fit_bias=False)
    reference = LogisticRegression(C=1 / cal.L2, fit_intercept=False, tol=1e-10, max_iter=10_000).fit(x, y)
    assert bias == 0.0
    assert weights == pytest.approx(reference.coef_[0], abs=1e-4)


def test_reliability_bins_cover_every_score_once() -> None:
    scores = np.array([0.05, 0.15, 0.35, 0.55, 0.95, 1.0])
    positive = np.array([False, False, True, True, True, False])
    rows = cal.reliability(scores, positive)
    assert sum(r[1] for r in rows) == len(scores)
    assert rows[0] == ("0.0-0.2", 2, pytest.approx(0.10), 0.0)
    assert rows[-1][0] == "0.8-1.0" and rows[-1][1] == 2  # 1.0 falls in the last bin
