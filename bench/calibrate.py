"""Fit the backing score and the band thresholds on a labelled claim-verification corpus.

Usage:
    python bench/scifact_corpus.py /path/to/scifact bench/out/scifact   # build draft + PDFs
    python bench/calibrate.py bench/out/scifact [--write]

The corpus folder holds ``draft.md``, ``sources/``, ``mapping.csv`` and ``gold.jsonl`` (see
bench/scifact_corpus.py). The pipeline runs from those files exactly as a user runs it
(draft reader, PDF extraction, index, features); then, on the ``fit`` split only:

1. the fusion weight of the index's first stage is chosen for the mean reciprocal rank,
   within the top three passages, of the first one holding a rationale sentence;
2. the second stage's ranking weights (sourcecheck/index/ranking.py) are fitted by pairwise
   logistic regression: for each claim, every (passage with a rationale, passage without)
   pair of its cited source is one example of "this one should rank higher";
3. a logistic regression maps the judge's features to P(the source backs the claim),
   SUPPORT against CONTRADICT, not-enough-info and unrelated decoys;
4. ``adrift_below`` is the topical-score threshold that best separates unrelated decoys
   from cited sources (Youden's J), and ``anchored_at`` the score that maximises F1 for
   SUPPORT.

The ``holdout`` split is only measured: hit@1, hit@3, AUROC, a reliability table and
band counts per gold label. ``--write`` stores the parameters, with how they were made,
in sourcecheck/judge/calibration.json. No data is written into the package.
"""

from __future__ import annotations

import argparse
import datetime as dt
import itertools
import json
import sys
from dataclasses import dataclass
from pathlib import Path

import numpy as np
from rapidfuzz import fuzz

from sourcecheck.index import DENSE_WEIGHT, RANK_FEATURES, RERANK_DEPTH, Ranker, rank_features
from sourcecheck.judge import (
    EVIDENCE_SEARCHED,
    FEATURE_NAMES,
    Calibration,
    Features,
    features_of,
    judge,
    load_calibration,
)
from sourcecheck.model import Band, Hit
from sourcecheck.pipeline import Prepared, prepare
from sourcecheck.verdicts import CachedScorer

ROOT = Path(__file__).resolve().parent.parent


# The ranker reorders only candidates within a margin of the first stage's best (and whose
# best sentence covers the claim nearly as well, ranking.COVERAGE_SLACK, which keeps a
# restatement of the claim first); the smallest margin with the best MRR@3 on the fit
# split is kept (MARGIN_SLACK is the tolerance for "best").
MARGIN_SLACK = 0.001
MARGINS_TRIED = (0.0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.5, 1.0)
WEIGHTS_TRIED = (0.0, 0.3, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0)
L2 = 1e-2


@dataclass
class Pair:
    """One gold (claim, cited document) pair, tied to the draft's claim and citation."""

    split: str
    label: str
    rationales: list[str]
    query: str
    vector: np.ndarray
    source: str | None
    ref: str


def _norm(text: str) -> str:
    return " ".join(text.split()).lower()


def holds_rationale(passage: str, rationales: list[str]) -> bool:
    """Whether a passage contains a rationale sentence (allowing for PDF re-flow)."""
    text = _norm(passage)
    return any(fuzz.partial_ratio(_norm(r), text) >= 90 for r in rationales if r.strip())


def load_pairs(corpus: Path, prepared: Prepared) -> list[Pair]:
    """Gold pairs joined with the draft's claims (by order) and the matched sources."""
    pairs = []
    claims = prepared.draft.claims
    for line in (corpus / "gold.jsonl").read_text(encoding="utf-8").splitlines():
        gold = json.loads(line)
        index = gold["claim_index"] - 1
        if index >= len(claims):
            continue
        match = prepared.matches.get(gold["ref"])
        pairs.append(
            Pair(
                split=gold["split"],
                label=gold["label"],
                rationales=gold["rationales"],
                query=prepared.queries[index],
                vector=prepared.claim_vectors[index],
                source=match.source if match else None,
                ref=gold["ref"],
            )
        )
    return pairs


def hits_for(prepared: Prepared, pair: Pair, weight: float, ranker: Ranker | None = None) -> list[Hit]:
    if pair.source is None:
        return []
    return prepared.index.search(
        pair.query, pair.vector, source=pair.source, k=EVIDENCE_SEARCHED, dense_weight=weight, ranker=ranker
    )


def hit_rates(
    prepared: Prepared, pairs: list[Pair], weight: float, ranker: Ranker | None = None
) -> tuple[float, float, float, int]:
    """Evidence hit@1, hit@3 and mean reciprocal rank within the top 3, over pairs with rationales."""
    with_rationale = [p for p in pairs if p.rationales]
    at1 = at3 = reciprocal = 0.0
    for pair in with_rationale:
        hits = hits_for(prepared, pair, weight, ranker)
        flags = [holds_rationale(h.passage.text, pair.rationales) for h in hits[:3]]
        at1 += bool(flags and flags[0])
        at3 += any(flags)
        reciprocal += next((1.0 / (i + 1) for i, flag in enumerate(flags) if flag), 0.0)
    n = max(1, len(with_rationale))
    return at1 / n, at3 / n, reciprocal / n, len(with_rationale)


def fit_ranker(prepared: Prepared, pairs: list[Pair], weight: float) -> Ranker:
    """Ranking weights from pairwise preferences within each claim's cited source."""
    differences, all_values = [], []
    for pair in (p for p in pairs if p.rationales):
        hits = prepared.index.search(pair.query, pair.vector, source=pair.source, k=RERANK_DEPTH, dense_weight=weight)
        lexical_top = prepared.index.lexical_ceiling(pair.query)
        rows = []
        for hit in hits:
            scaled = hit.bm25 / lexical_top if lexical_top > 0 else 0.0
            values = rank_features(
                pair.query,
                hit.passage,
                hit.dense,
                scaled,
                hit.coverage,
                opens_source=prepared.index.opens_source(hit.passage),
            )
            rows.append((holds_rationale(hit.passage.text, pair.rationales), np.array(values)))
            all_values.append(np.array(values))
        for good, a in rows:
            for bad, b in rows:
                if good and not bad:
                    differences.append(a - b)
    x = np.array(differences + [-d for d in differences])
    y = np.array([1.0] * len(differences) + [0.0] * len(differences))
    weights, _ = fit_logistic(x, y, fit_bias=False)
    # Only differences between roles are learnt (a source's passages share its structure),
    # so centre the role weights on the labelled passages: a typical labelled passage then
    # scores like an unlabelled one when sources are ranked against each other.
    # A role never seen in the fit keeps weight 0, the same as a labelled passage on average.
    values = np.array(all_values)
    roles = [i for i, name in enumerate(RANK_FEATURES) if name.startswith("section:") and values[:, i].any()]
    labelled = np.array([v for v in all_values if v[roles].any()])
    if len(labelled):
        weights[roles] -= float((labelled[:, roles] @ weights[roles]).mean())
    return Ranker({name: round(float(w), 4) for name, w in zip(RANK_FEATURES, weights, strict=True) if w != 0.0})


def fit_logistic(
    x: np.ndarray, y: np.ndarray, fit_bias: bool = True, sample_weight: np.ndarray | None = None
) -> tuple[np.ndarray, float]:
    """L2-regularised logistic regression by Newton's method (IRLS), each row weighted by ``sample_weight``."""
    design = np.hstack([x, np.ones((len(x), 1))]) if fit_bias else x
    weight = np.ones(len(x)) if sample_weight is None else np.asarray(sample_weight, dtype=float)
    beta = np.zeros(design.shape[1])
    penalty = L2 * np.eye(design.shape[1])
    if fit_bias:
        penalty[-1, -1] = 0.0
    for _ in range(50):
        p = 1.0 / (1.0 + np.exp(-design @ beta))
        gradient = design.T @ (weight * (p - y)) + penalty @ beta
        hessian = design.T @ (design * (weight * p * (1 - p))[:, None]) + penalty
        step = np.linalg.solve(hessian, gradient)
        beta -= step
        if np.abs(step).max() < 1e-8:
            break
    return (beta[:-1], float(beta[-1])) if fit_bias else (beta, 0.0)


def auroc(scores: np.ndarray, positive: np.ndarray) -> float:
    """Area under the ROC curve as the Mann-Whitney U statistic (ties count one half)."""
    pos, neg = scores[positive], scores[~positive]
    if not len(pos) or not len(neg):
        return float("nan")
    greater = (pos[:, None] > neg[None, :]).sum() + 0.5 * (pos[:, None] == neg[None, :]).sum()
    return float(greater / (len(pos) * len(neg)))


def youden_threshold(scores: np.ndarray, positive: np.ndarray) -> float:
    """The cut that maximises sensitivity + specificity - 1 (Youden, 1950)."""
    best, cut = -1.0, 0.5
    for t in np.unique(scores):
        j = (scores[positive] >= t).mean() + (scores[~positive] < t).mean() - 1
        if j > best:
            best, cut = j, float(t)
    return cut


def f1_threshold(scores: np.ndarray, positive: np.ndarray, beta: float = 1.0) -> float:
    """The cut that maximises F-beta for the positive class (F1 by default; beta < 1 weighs precision)."""
    best, cut = -1.0, 0.5
    for t in np.unique(scores):
        predicted = scores >= t
        tp = (predicted & positive).sum()
        if tp == 0:
            continue
        precision, recall = tp / predicted.sum(), tp / positive.sum()
        f = (1 + beta**2) * precision * recall / (beta**2 * precision + recall)
        if f > best:
            best, cut = f, float(t)
    return cut


def reliability(scores: np.ndarray, positive: np.ndarray, bins: int = 5) -> list[tuple[str, int, float, float]]:
    """Rows of (score range, pairs, mean score, share that are SUPPORT)."""
    rows = []
    edges = np.linspace(0, 1, bins + 1)
    for lo, hi in itertools.pairwise(edges):
        inside = (scores >= lo) & ((scores < hi) if hi < 1 else (scores <= hi))
        if inside.any():
            rows.append(
                (f"{lo:.1f}-{hi:.1f}", int(inside.sum()), float(scores[inside].mean()), float(positive[inside].mean()))
            )
    return rows


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("corpus", type=Path)
    parser.add_argument("--cache", type=Path, default=ROOT / "bench" / "out" / "cache")
    parser.add_argument("--write", action="store_true", help="store the fitted parameters in the package")
    parser.add_argument("--verifier", help="another verifier model folder (default: the shipped one)")
    parser.add_argument("--citint", type=Path, help="Citation-Integrity folder: also fit on its citing sentences")
    parser.add_argument("--citint-share", type=float, default=0.25, help="their total weight, per SciFact fit row")
    parser.add_argument("--citint-fit", action="store_true", help="keep (and --write) the pooled backing score")
    args = parser.parse_args()

    prepared = prepare(
        args.corpus / "draft.md",
        args.corpus / "sources",
        mapping=args.corpus / "mapping.csv",
        cache_dir=args.cache,
        verifier=args.verifier,
    )
    scorer = CachedScorer(prepared.verifier, prepared.cache, prepared.stats)
    pairs = [p for p in load_pairs(args.corpus, prepared) if p.source is not None]
    fit = [p for p in pairs if p.split == "fit"]
    holdout = [p for p in pairs if p.split == "holdout"]
    print(f"pairs: {len(pairs)} matched ({len(fit)} fit, {len(holdout)} holdout)")

    print("\nfusion weight of the dense score -> evidence hit@1 / hit@3 / MRR@3 (fit split)")
    best_weight, best_rate = DENSE_WEIGHT, -1.0
    for weight in WEIGHTS_TRIED:
        at1, at3, mrr, n = hit_rates(prepared, fit, weight)
        print(f"  {weight:.1f}: {at1:.3f} / {at3:.3f} / {mrr:.3f}  (n={n})")
        if mrr > best_rate:
            best_weight, best_rate = weight, mrr
    print(f"chosen: {best_weight}")

    fitted = fit_ranker(prepared, fit, best_weight)
    print("\nranking weights:", dict(fitted.weights))
    print("rerank margin below the best fused score -> hit@1 / hit@3 / MRR@3 (fit split)")
    rates = {}
    for margin in MARGINS_TRIED:
        at1, at3, mrr, n = hit_rates(prepared, fit, best_weight, Ranker(fitted.weights, margin))
        print(f"  {margin:.2f}: {at1:.3f} / {at3:.3f} / {mrr:.3f}  (n={n})")
        rates[margin] = mrr
    margin = min(m for m, mrr in rates.items() if mrr >= max(rates.values()) - MARGIN_SLACK)
    ranker = Ranker(fitted.weights, margin)
    print(f"chosen: {ranker.margin}")

    def features(pair: Pair) -> Features:
        return features_of(pair.query, hits_for(prepared, pair, best_weight, ranker), scorer)

    x_fit = np.array([features(p).vector() for p in fit])
    y_fit = np.array([p.label == "SUPPORT" for p in fit], dtype=float)
    weights, bias = fit_logistic(x_fit, y_fit)
    if args.citint is not None:
        x_holdout = np.array([features(p).vector() for p in holdout])
        labels = np.array([p.label for p in holdout])
        pooled_fit = citint_report(args, x_fit, y_fit, (weights, bias), (x_holdout, labels), best_weight)
        if args.citint_fit:
            weights, bias = pooled_fit
            print("the backing score below is the pooled fit (--citint-fit)")
    provisional = Calibration(tuple(weights), bias, 0.5, 0.5, "fit")

    def topical(pair: Pair) -> float:
        return provisional.score(features(pair).topical())

    topical_fit = np.array([topical(p) for p in fit])
    related_fit = np.array([p.label != "UNRELATED" for p in fit])
    adrift_below = youden_threshold(topical_fit, related_fit)
    score_fit = np.array([provisional.score(features(p)) for p in fit])
    anchored_at = max(f1_threshold(score_fit, y_fit.astype(bool)), adrift_below)
    # The verifier's "reads against" cut: best F0.5 for CONTRADICT among the fit split's
    # SUPPORT and CONTRADICT pairs, on P(contradicts) where it beats P(supports). F0.5 weighs
    # precision twice: a false "conflict" on a faithful claim costs a reader more than a
    # missed one, which the fitted score still marks down.
    opposed = [p for p in fit if p.label in ("SUPPORT", "CONTRADICT")]
    readings = [features(p) for p in opposed]
    against = np.array([f.contradict if f.contradict > f.entail else 0.0 for f in readings])
    contradict_at = max(f1_threshold(against, np.array([p.label == "CONTRADICT" for p in opposed]), beta=0.5), 0.5)
    calibration = Calibration(tuple(weights), bias, anchored_at, adrift_below, "fit", contradict_at=contradict_at)
    print("\nweights:", dict(zip(FEATURE_NAMES, np.round(weights, 3), strict=True)), "bias:", round(bias, 3))
    print(
        f"thresholds: anchored_at {anchored_at:.3f}, adrift_below {adrift_below:.3f}, contradict_at {contradict_at:.3f}"
    )

    at1, at3, _, n = hit_rates(prepared, holdout, best_weight, ranker)
    scores = np.array([calibration.score(features(p)) for p in holdout])
    support = np.array([p.label == "SUPPORT" for p in holdout])
    area = auroc(scores, support)
    opposed_holdout = np.array([p.label in ("SUPPORT", "CONTRADICT") for p in holdout])
    print(
        f"\nholdout: evidence hit@1 {at1:.3f}, hit@3 {at3:.3f} (n={n}); AUROC SUPPORT vs rest {area:.3f}, "
        f"SUPPORT vs CONTRADICT {auroc(scores[opposed_holdout], support[opposed_holdout]):.3f}"
    )
    shipped = np.array([load_calibration().score(features(p)) for p in holdout])
    print(
        f"the shipped calibration.json on the same holdout: AUROC SUPPORT vs rest {auroc(shipped, support):.3f}, "
        f"SUPPORT vs CONTRADICT {auroc(shipped[opposed_holdout], support[opposed_holdout]):.3f}"
    )
    print("reliability (holdout): range | pairs | mean score | share SUPPORT")
    table = reliability(scores, support)
    for row in table:
        print(f"  {row[0]} | {row[1]} | {row[2]:.2f} | {row[3]:.2f}")
    counts: dict[str, dict[str, int]] = {}
    for pair in holdout:
        hits = hits_for(prepared, pair, best_weight, ranker)
        band = judge(pair.query, _citation(pair), None, pair.source or "", hits, calibration, scorer=scorer).band
        counts.setdefault(pair.label, {b.value: 0 for b in Band})[band.value] += 1
    print("bands per gold label (holdout):")
    for label, row in sorted(counts.items()):
        print(f"  {label:<10} " + "  ".join(f"{k} {v}" for k, v in row.items() if k != "unverifiable"))

    if args.write:
        payload = {
            "features": list(FEATURE_NAMES),
            "weights": [round(float(w), 6) for w in weights],
            "bias": round(bias, 6),
            "thresholds": {
                "anchored_at": round(anchored_at, 4),
                "adrift_below": round(adrift_below, 4),
                "contradict_at": round(contradict_at, 4),
            },
            "dense_weight": best_weight,
            "ranking": {
                "how": "pairwise logistic regression over passages of each fit claim's cited source",
                "weights": dict(ranker.weights),
                "margin": ranker.margin,
            },
            "made_by": "python bench/calibrate.py <corpus> --write, corpus from bench/scifact_corpus.py "
            "(SciFact train claims, Wadden et al. 2020; fit split = 70% of claims by sha256 of claim id)",
            "date": dt.date.today().isoformat(),
            "holdout": {
                "pairs": len(holdout),
                "evidence_hit_at_1": round(at1, 3),
                "evidence_hit_at_3": round(at3, 3),
                "auroc_support": round(area, 3),
                "reliability": [list(r) for r in table],
                "bands": counts,
            },
        }
        target = ROOT / "sourcecheck" / "judge" / "calibration.json"
        target.write_text(json.dumps(payload, indent=2) + "\n", encoding="utf-8")
        print(f"\nwrote {target.relative_to(ROOT)}")
    return 0


def citint_report(
    args: argparse.Namespace,
    x_fit: np.ndarray,
    y_fit: np.ndarray,
    scifact_only: tuple[np.ndarray, float],
    holdout: tuple[np.ndarray, np.ndarray],
    dense_weight: float,
) -> tuple[np.ndarray, float]:
    """Compare the SciFact-only backing score with one also fitted on real citing sentences.

    Citation-Integrity is cross-validated by reference article (bench/citint.py's folds:
    each citing sentence scored by a fit that never saw its article); SciFact by claim (its
    holdout split, scored by the pooled fit on every article). Returns the pooled fit.
    """
    import citint  # bench/citint.py, beside this script

    judged = citint.judged_claims(args.citint, args.cache, dense_weight, args.verifier)
    fold_of = citint.article_folds(judged, 5)
    unseen = citint.unseen_mask(judged)
    features = np.array([j.features.vector() for j in judged])
    truth = np.array([j.accurate for j in judged])
    cross = citint.cross_validated_logits(x_fit, y_fit, judged, fold_of, args.citint_share, fit_logistic)
    x, y, weights = citint.pooled(x_fit, y_fit, judged, np.ones(len(judged), dtype=bool), args.citint_share)
    pooled_fit = fit_logistic(x, y, sample_weight=weights)
    x_holdout, labels = holdout
    support, opposed = labels == "SUPPORT", np.isin(labels, ("SUPPORT", "CONTRADICT"))
    print("\n" + citint.header(judged, "| SciFact holdout: SUPPORT vs rest, vs CONTRADICT"))
    for name, (coefficients, bias), citing in (
        ("SciFact fit only", scifact_only, features @ scifact_only[0] + scifact_only[1]),
        (f"+ citint folds (share {args.citint_share:g})", pooled_fit, cross),
    ):
        held = x_holdout @ coefficients + bias
        print(
            f"  {name:<32} {auroc(citing, truth):.3f}  {auroc(citing[unseen], truth[unseen]):.3f}   "
            f"| {auroc(held, support):.3f}, {auroc(held[opposed], support[opposed]):.3f}"
        )
    print("  pooled weights:", {n: round(float(w), 3) for n, w in zip(FEATURE_NAMES, pooled_fit[0], strict=True)})
    return pooled_fit


def _citation(pair: Pair):
    from sourcecheck.model import Citation

    return Citation(marker=f"[{pair.ref}]", label=f"[{pair.ref}]", key=pair.ref)


if __name__ == "__main__":
    sys.exit(main())
