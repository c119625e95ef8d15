"""bench/citint.py: the folds by reference article and the pooled fit it cross-validates.

The figures it prints are only honest if no reference article lends claims to both sides of
a fold and if a held-out fold's scores come from a fit that never saw it; both are checked
here on invented claims. The data format is that of ../shared/data/citint/README.md
(Sarol et al., Bioinformatics 2024): the article is the first three digits of ``doc_id``.
"""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest
from sklearn.linear_model import LogisticRegression

from tests.bench.scripts import load_script

cit = load_script("citint")
cal = load_script("calibrate")
RNG = np.random.default_rng(11)


def _judged(count: int = 120, articles: int = 12) -> list:
    claims = []
    for number in range(count):
        accurate = bool(RNG.random() < 0.65)
        features = cit.Features(
            dense=float(RNG.normal(0.6 if accurate else 0.5, 0.1)),
            coverage=float(RNG.random()),
            numbers=(),
        )
        article = f"{100 + number % articles}"
        claim = cit.CitingClaim(
            number, article, f"claim {number}", ("a sentence.",), "ACCURATE" if accurate else "NOT_ACCURATE"
        )
        claims.append(cit.Judged(claim, features))
    return claims


def test_no_reference_article_falls_in_two_folds() -> None:
    judged = _judged()
    fold_of = cit.article_folds(judged, 5)
    assert sorted(set(fold_of)) == [0, 1, 2, 3, 4]
    for article in {j.claim.article for j in judged}:
        assert len({f for j, f in zip(judged, fold_of, strict=True) if j.claim.article == article}) == 1


def test_pooled_rows_weigh_the_citing_sentences_as_the_share_asks() -> None:
    judged = _judged()
    x_sci, y_sci = RNG.normal(size=(40, 9)), (RNG.random(40) < 0.5).astype(float)
    keep = np.arange(len(judged)) % 2 == 0
    x, y, weights = cit.pooled(x_sci, y_sci, judged, keep, 0.5)
    assert x.shape == (40 + keep.sum(), 9) and len(y) == len(weights)
    assert weights[40:].sum() == pytest.approx(0.5 * 40)
    assert list(y[40:]) == [float(j.accurate) for j, k in zip(judged, keep, strict=True) if k]


def test_a_held_out_fold_is_scored_by_a_fit_without_it() -> None:
    judged = _judged()
    fold_of = cit.article_folds(judged, 5)
    x_sci, y_sci = RNG.normal(size=(40, 9)), (RNG.random(40) < 0.5).astype(float)
    logits = cit.cross_validated_logits(x_sci, y_sci, judged, fold_of, 1.0, cal.fit_logistic)
    held = fold_of == 0
    x, y, weights = cit.pooled(x_sci, y_sci, judged, ~held, 1.0)
    # The same fold's fit by scikit-learn's weighted logistic regression gives the same scores.
    reference = LogisticRegression(C=1 / cal.L2, tol=1e-10, max_iter=10_000).fit(x, y, sample_weight=weights)
    features = np.array([j.features.vector() for j in judged])[held]
    assert logits[held] == pytest.approx(reference.decision_function(features), abs=1e-3)
    x_all, y_all, w_all = cit.pooled(x_sci, y_sci, judged, np.ones(len(judged), dtype=bool), 1.0)
    everything = cal.fit_logistic(x_all, y_all, sample_weight=w_all)
    assert not np.allclose(logits[held], features @ everything[0] + everything[1], atol=1e-3)


def test_a_missing_data_folder_is_one_line_and_exit_2(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert cit.main(["--data", str(tmp_path / "nowhere")]) == 2
    err = capsys.readouterr().err.strip()
    assert len(err.splitlines()) == 1 and "claims_train.jsonl: not found" in err
