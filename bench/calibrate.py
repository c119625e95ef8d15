"""Fit the backing score and the band thresholds on a labelled claim-verification corpus.

Usage:
    python bench/scifact_corpus.py /path/to/scifact bench/out/scifact   # build draft + PDFs
    python bench/calibrate.py bench/out/scifact [--write]

The corpus folder holds ``draft.md``, ``sources/``, ``mapping.csv`` and ``gold.jsonl`` (see
bench/scifact_corpus.py). The pipeline runs from those files exactly as a user runs it
(draft reader, PDF extraction, index, features); then, on the ``fit`` split only:

1. the fusion weight of the index is chosen for the mean reciprocal rank, within the top
   three passages, of the first one holding a rationale sentence;
2. a logistic regression maps the judge's features to P(the source backs the claim),
   SUPPORT against CONTRADICT, not-enough-info and unrelated decoys;
3. ``adrift_below`` is the topical-score threshold that best separates unrelated decoys
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

from sourcecheck.index import search as search_module
from sourcecheck.judge.calibration import Calibration
from sourcecheck.judge.features import FEATURE_NAMES, Features, features_of
from sourcecheck.judge.verdict import judge
from sourcecheck.model import Band, Hit
from sourcecheck.pipeline import EVIDENCE_SEARCHED, Prepared, prepare

ROOT = Path(__file__).resolve().parent.parent


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


def hits_for(prepared: Prepared, pair: Pair, weight: float) -> list[Hit]:
    if pair.source is None:
        return []
    return prepared.index.search(pair.query, pair.vector, source=pair.source, k=EVIDENCE_SEARCHED, dense_weight=weight)


def hit_rates(prepared: Prepared, pairs: list[Pair], weight: float) -> tuple[float, float, float, int]:
    """Evidence hit@1, hit@3 and mean reciprocal rank within the top 3, over pairs with rationales."""
    with_rationale = [p for p in pairs if p.rationales]
    at1 = at3 = reciprocal = 0.0
    for pair in with_rationale:
        hits = hits_for(prepared, pair, weight)
        flags = [holds_rationale(h.passage.text, pair.rationales) for h in hits[:3]]
        at1 += bool(flags and flags[0])
        at3 += any(flags)
        reciprocal += next((1.0 / (i + 1) for i, flag in enumerate(flags) if flag), 0.0)
    n = max(1, len(with_rationale))
    return at1 / n, at3 / n, reciprocal / n, len(with_rationale)


def fit_logistic(x: np.ndarray, y: np.ndarray) -> tuple[np.ndarray, float]:
    """L2-regularised logistic regression by Newton's method (IRLS)."""
    design = np.hstack([x, np.ones((len(x), 1))])
    beta = np.zeros(design.shape[1])
    penalty = L2 * np.eye(design.shape[1])
    penalty[-1, -1] = 0.0
    for _ in range(50):
        p = 1.0 / (1.0 + np.exp(-design @ beta))
        gradient = design.T @ (p - y) + penalty @ beta
        hessian = design.T @ (design * (p * (1 - p))[:, None]) + penalty
        step = np.linalg.solve(hessian, gradient)
        beta -= step
        if np.abs(step).max() < 1e-8:
            break
    return beta[:-1], float(beta[-1])


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


def f1_threshold(scores: np.ndarray, positive: np.ndarray) -> float:
    """The cut that maximises F1 for the positive class."""
    best, cut = -1.0, 0.5
    for t in np.unique(scores):
        predicted = scores >= t
        tp = (predicted & positive).sum()
        if tp == 0:
            continue
        precision, recall = tp / predicted.sum(), tp / positive.sum()
        f1 = 2 * precision * recall / (precision + recall)
        if f1 > best:
            best, cut = f1, float(t)
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
    args = parser.parse_args()

    prepared = prepare(
        args.corpus / "draft.md", args.corpus / "sources", mapping=args.corpus / "mapping.csv", cache_dir=args.cache
    )
    pairs = [p for p in load_pairs(args.corpus, prepared) if p.source is not None]
    fit = [p for p in pairs if p.split == "fit"]
    holdout = [p for p in pairs if p.split == "holdout"]
    print(f"pairs: {len(pairs)} matched ({len(fit)} fit, {len(holdout)} holdout)")

    print("\nfusion weight of the dense score -> evidence hit@1 / hit@3 / MRR@3 (fit split)")
    best_weight, best_rate = search_module.DENSE_WEIGHT, -1.0
    for weight in WEIGHTS_TRIED:
        at1, at3, mrr, n = hit_rates(prepared, fit, weight)
        print(f"  {weight:.1f}: {at1:.3f} / {at3:.3f} / {mrr:.3f}  (n={n})")
        if mrr > best_rate:
            best_weight, best_rate = weight, mrr
    print(f"chosen: {best_weight}")

    def features(pair: Pair) -> Features:
        return features_of(pair.query, hits_for(prepared, pair, best_weight))

    x_fit = np.array([features(p).vector() for p in fit])
    y_fit = np.array([p.label == "SUPPORT" for p in fit], dtype=float)
    weights, bias = fit_logistic(x_fit, y_fit)
    provisional = Calibration(tuple(weights), bias, 0.5, 0.5, "fit")

    def topical(pair: Pair) -> float:
        return provisional.score(features(pair).topical())

    topical_fit = np.array([topical(p) for p in fit])
    related_fit = np.array([p.label != "UNRELATED" for p in fit])
    adrift_below = youden_threshold(topical_fit, related_fit)
    score_fit = np.array([provisional.score(features(p)) for p in fit])
    anchored_at = max(f1_threshold(score_fit, y_fit.astype(bool)), adrift_below)
    calibration = Calibration(tuple(weights), bias, anchored_at, adrift_below, "fit")
    print("\nweights:", dict(zip(FEATURE_NAMES, np.round(weights, 3), strict=True)), "bias:", round(bias, 3))
    print(f"thresholds: anchored_at {anchored_at:.3f}, adrift_below {adrift_below:.3f}")

    at1, at3, _, n = hit_rates(prepared, holdout, best_weight)
    scores = np.array([calibration.score(features(p)) for p in holdout])
    support = np.array([p.label == "SUPPORT" for p in holdout])
    area = auroc(scores, support)
    print(f"\nholdout: evidence hit@1 {at1:.3f}, hit@3 {at3:.3f} (n={n}); AUROC SUPPORT vs rest {area:.3f}")
    print("reliability (holdout): range | pairs | mean score | share SUPPORT")
    table = reliability(scores, support)
    for row in table:
        print(f"  {row[0]} | {row[1]} | {row[2]:.2f} | {row[3]:.2f}")
    counts: dict[str, dict[str, int]] = {}
    for pair in holdout:
        hits = hits_for(prepared, pair, best_weight)
        band = judge(pair.query, _citation(pair), None, pair.source or "", hits, calibration).band
        counts.setdefault(pair.label, {b.value: 0 for b in Band})[band.value] += 1
    print("bands per gold label (holdout):")
    for label, row in sorted(counts.items()):
        print(f"  {label:<10} " + "  ".join(f"{k} {v}" for k, v in row.items() if k != "unverifiable"))

    if args.write:
        payload = {
            "features": list(FEATURE_NAMES),
            "weights": [round(float(w), 6) for w in weights],
            "bias": round(bias, 6),
            "thresholds": {"anchored_at": round(anchored_at, 4), "adrift_below": round(adrift_below, 4)},
            "dense_weight": best_weight,
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


def _citation(pair: Pair):
    from sourcecheck.model import Citation

    return Citation(marker=f"[{pair.ref}]", label=f"[{pair.ref}]", key=pair.ref)


if __name__ == "__main__":
    sys.exit(main())
