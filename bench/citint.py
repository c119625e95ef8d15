"""Measure the judge's backing score on real citing sentences (Citation-Integrity), held out by reference article.

Usage::

    python bench/citint.py [--data ../shared/data/citint] [--cache bench/out/citint/cache] [--folds 5]

Each citing sentence (citation markers removed, as ``scripts/verifier/citint_source.py``
cleans them) is judged against its cited article's candidate sentences, joined into one
passage of a small source, through the public faces the pipeline uses: the packaged
embedding model, the evidence index's search, ``features_of`` with the cached verifier,
and the shipped calibration's score. Printed, for ACCURATE against NOT_ACCURATE (IRRELEVANT
left out), AUROC of:

- the backing score with the shipped calibration (fitted on SciFact alone: nothing here was
  fitted on Citation-Integrity, so this is a held-out figure for the judge as it ships);
- cosine similarity alone, the verifier's P(supports) alone, and 1 - P(contradicts) alone.

Each figure is given over all claims and over the reference articles the verifier never
saw in training (``citint_source.is_heldout_article``, a quarter of the 70): the verifier
was trained on the other articles' claims (ACCURATE read as supports), so its two features
are optimistic there. The folds of the grouped cross-validation (by reference article,
scikit-learn's GroupKFold) are printed too; bench/calibrate.py ``--citint`` uses the same
folds to refit the backing score and measure it on the held-out folds. AUROC is
scikit-learn's ``roc_auc_score``. Data: ../shared/data/citint/README.md (MIT; Sarol et al.,
Bioinformatics 2024).
"""

from __future__ import annotations

import argparse
import sys
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path

import numpy as np
from sklearn.metrics import roc_auc_score
from sklearn.model_selection import GroupKFold

ROOT = Path(__file__).resolve().parent.parent
for folder in (ROOT, ROOT / "scripts" / "verifier"):
    if str(folder) not in sys.path:
        sys.path.insert(0, str(folder))

from citint_source import CitingClaim, is_heldout_article, load_citing_claims  # noqa: E402

from sourcecheck.index import Cache, Encoder, EvidenceIndex, resolve_model_path, text_key  # noqa: E402
from sourcecheck.judge import VERIFIER_DIR, Calibration, Features, Verifier, features_of, load_calibration  # noqa: E402
from sourcecheck.model import Passage, RunStats  # noqa: E402
from sourcecheck.verdicts import CachedScorer  # noqa: E402

DEFAULT_DATA = ROOT.parent / "shared" / "data" / "citint"
DEFAULT_CACHE = ROOT / "bench" / "out" / "citint" / "cache"
JUDGED = ("ACCURATE", "NOT_ACCURATE")


@dataclass(frozen=True)
class Judged:
    """One citing sentence with the judge's features against its cited article's sentences."""

    claim: CitingClaim
    features: Features

    @property
    def accurate(self) -> bool:
        return self.claim.label == "ACCURATE"

    @property
    def unseen_by_verifier(self) -> bool:
        return is_heldout_article(self.claim.article)


def _embedded(texts: list[str], encoder: Encoder, cache: Cache, kind: str) -> np.ndarray:
    key = text_key(encoder.fingerprint, *texts)
    vectors = cache.load_vectors(kind, key, len(texts))
    if vectors is None:
        vectors = encoder.encode(texts)
        cache.save_vectors(kind, key, vectors)
    return vectors


def judged_claims(data: Path, cache_dir: Path, dense_weight: float, verifier: str | None = None) -> list[Judged]:
    """Every ACCURATE or NOT_ACCURATE citing sentence with its features (embeddings and readings cached)."""
    claims = [c for c in load_citing_claims(data) if c.label in JUDGED]
    cache = Cache(cache_dir)
    encoder = Encoder(resolve_model_path())
    passages = [Passage(source=f"claim-{c.claim_id}", page=1, text=" ".join(c.sentences), ordinal=0) for c in claims]
    index = EvidenceIndex(passages, _embedded([p.text for p in passages], encoder, cache, "passages"))
    queries = _embedded([c.text for c in claims], encoder, cache, "claims")
    scorer = CachedScorer(Verifier(verifier or VERIFIER_DIR), cache, RunStats())
    judged = []
    for claim, passage, vector in zip(claims, passages, queries, strict=True):
        hits = index.search(claim.text, vector, source=passage.source, k=1, dense_weight=dense_weight)
        judged.append(Judged(claim, features_of(claim.text, hits, scorer)))
    return judged


def article_folds(judged: list[Judged], folds: int) -> np.ndarray:
    """The held-out fold of each claim, grouped by reference article (GroupKFold, deterministic)."""
    groups = [j.claim.article for j in judged]
    fold_of = np.zeros(len(judged), dtype=int)
    for number, (_, test) in enumerate(GroupKFold(n_splits=folds).split(np.zeros(len(judged)), groups=groups)):
        fold_of[test] = number
    return fold_of


def area(scores: np.ndarray, judged: list[Judged], keep: np.ndarray | None = None) -> float:
    """AUROC of ACCURATE against NOT_ACCURATE over ``keep`` (all claims by default)."""
    truth = np.array([j.accurate for j in judged])
    keep = np.ones(len(judged), dtype=bool) if keep is None else keep
    return float(roc_auc_score(truth[keep], np.asarray(scores)[keep]))


def unseen_mask(judged: list[Judged]) -> np.ndarray:
    """Claims of reference articles the verifier was not trained on."""
    return np.array([j.unseen_by_verifier for j in judged])


def score_lines(name: str, scores: np.ndarray, judged: list[Judged], fold_of: np.ndarray) -> str:
    """One row: AUROC over all claims, over verifier-unseen articles, and per article fold."""
    per_fold = " ".join(f"{area(scores, judged, fold_of == f):.3f}" for f in sorted(set(fold_of)))
    return f"  {name:<32} {area(scores, judged):.3f}  {area(scores, judged, unseen_mask(judged)):.3f}   [{per_fold}]"


def baseline_rows(judged: list[Judged], calibration: Calibration, fold_of: np.ndarray) -> list[str]:
    """The shipped backing score and single features, each as a score_lines row."""
    columns = {
        "backing score (shipped fit)": [calibration.score(j.features) for j in judged],
        "cosine alone": [j.features.dense for j in judged],
        "content-word coverage alone": [j.features.coverage for j in judged],
        "verifier P(supports) alone": [j.features.entail for j in judged],
        "verifier 1 - P(contradicts) alone": [1.0 - j.features.contradict for j in judged],
    }
    return [score_lines(name, np.array(values), judged, fold_of) for name, values in columns.items()]


def header(judged: list[Judged], last_column: str = "[per article fold]") -> str:
    unseen = unseen_mask(judged)
    accurate = sum(j.accurate for j in judged)
    return (
        f"claims: {len(judged)} ({accurate} ACCURATE), {len({j.claim.article for j in judged})} reference articles; "
        f"verifier-unseen articles: {len({j.claim.article for j in judged if j.unseen_by_verifier})} "
        f"({int(unseen.sum())} claims)\n"
        f"  {'AUROC ACCURATE vs NOT_ACCURATE':<32} {'all':>5}  {'unseen':>6}   {last_column}"
    )


Fitter = Callable[..., tuple[np.ndarray, float]]


def pooled(
    x_scifact: np.ndarray, y_scifact: np.ndarray, judged: list[Judged], keep: np.ndarray, share: float
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Rows, labels and row weights of SciFact's fit pairs plus the kept citing sentences.

    The citing sentences weigh ``share`` of the SciFact rows in all (ACCURATE is the
    positive class, as SUPPORT is for SciFact), so a larger set does not drown the other.
    """
    x_cit = np.array([j.features.vector() for j, kept in zip(judged, keep, strict=True) if kept])
    y_cit = np.array([j.accurate for j, kept in zip(judged, keep, strict=True) if kept], dtype=float)
    each = share * len(y_scifact) / max(1, len(y_cit))
    weights = np.concatenate([np.ones(len(y_scifact)), np.full(len(y_cit), each)])
    return np.vstack([x_scifact, x_cit]), np.concatenate([y_scifact, y_cit]), weights


def cross_validated_logits(
    x_scifact: np.ndarray, y_scifact: np.ndarray, judged: list[Judged], fold_of: np.ndarray, share: float, fit: Fitter
) -> np.ndarray:
    """Each citing sentence's logit from a fit on SciFact's fit split and the other article folds."""
    features = np.array([j.features.vector() for j in judged])
    logits = np.zeros(len(judged))
    for fold in sorted(set(fold_of)):
        held = fold_of == fold
        x, y, weights = pooled(x_scifact, y_scifact, judged, ~held, share)
        coefficients, bias = fit(x, y, sample_weight=weights)
        logits[held] = features[held] @ coefficients + bias
    return logits


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--data", type=Path, default=DEFAULT_DATA, help="folder with claims_train.jsonl")
    parser.add_argument("--cache", type=Path, default=DEFAULT_CACHE)
    parser.add_argument("--folds", type=int, default=5)
    parser.add_argument("--verifier", help="another verifier model folder (default: the shipped one)")
    args = parser.parse_args(argv)
    for name in ("claims_train.jsonl", "corpus_train.jsonl"):
        if not (args.data / name).is_file():
            print(f"error: {args.data / name}: not found (see ../shared/data/citint/README.md)", file=sys.stderr)
            return 2
    calibration = load_calibration()
    judged = judged_claims(args.data, args.cache, calibration.dense_weight, args.verifier)
    fold_of = article_folds(judged, args.folds)
    print(header(judged))
    for line in baseline_rows(judged, calibration, fold_of):
        print(line)
    return 0


if __name__ == "__main__":
    sys.exit(main())
