"""Measure the shipped verifier on data it was not trained on, and its speed.

Usage::

    python bench/verifier.py [--data bench/out/verifier] [--model-dir DIR] [--threads 2] [--json FILE]

Needs the held-out files written by ``scripts/verifier/build_data.py`` (under ``--data/heldout``).
Prints:

- CAD test: 3-way accuracy (Kaushik et al. 2020 test split; never trained on);
- SciFact held-out claims (the 30% holdout side of ``bench/scifact_corpus.split_of``): AUROC of
  P(supports) for SUPPORT against CONTRADICT rationale sentences;
- Citation-Integrity held-out reference articles: AUROC of ACCURATE against NOT_ACCURATE claims,
  scoring each claim by its highest P(supports) over its candidate sentences (IRRELEVANT left out);
- speed: seconds to score 100 SciFact pairs with ``--threads`` threads, after the model is loaded.

AUROC is scikit-learn's ``roc_auc_score``; no number here is fitted, so nothing is tuned on
the data it is measured on.
"""

from __future__ import annotations

import argparse
import json
import sys
import time
from pathlib import Path

import numpy as np
from sklearn.metrics import roc_auc_score

ROOT = Path(__file__).resolve().parents[1]
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))

from sourcecheck.errors import ModelUnavailable  # noqa: E402 (after the path set-up above)
from sourcecheck.judge import VERIFIER_LABELS as LABELS  # noqa: E402
from sourcecheck.judge import Verifier  # noqa: E402

DEFAULT_DATA = ROOT / "bench" / "out" / "verifier"
HELDOUT_FILES = ("cad_test.jsonl", "scifact_rationales.jsonl", "citint_claims.jsonl")
SUPPORTS = LABELS.index("supports")


def read_jsonl(path: Path) -> list[dict]:
    """All objects of a JSON-lines file."""
    with path.open(encoding="utf-8") as handle:
        return [json.loads(line) for line in handle if line.strip()]


def cad_accuracy(verifier: Verifier, rows: list[dict]) -> dict:
    """3-way accuracy on CAD test, overall and per gold label."""
    probs = verifier.score([(r["claim"], r["evidence"]) for r in rows])
    guesses = [LABELS[i] for i in probs.argmax(axis=1)]
    result = {
        "pairs": len(rows),
        "accuracy": round(float(np.mean([g == r["label"] for g, r in zip(guesses, rows, strict=True)])), 4),
    }
    for label in LABELS:
        picked = [g == r["label"] for g, r in zip(guesses, rows, strict=True) if r["label"] == label]
        result[f"recall_{label}"] = round(float(np.mean(picked)), 4) if picked else None
    return result


def scifact_auroc(verifier: Verifier, rows: list[dict]) -> dict:
    """AUROC of P(supports), supporting against contradicting rationale sentences."""
    rows = [r for r in rows if r["label"] in ("supports", "contradicts")]
    probs = verifier.score([(r["claim"], r["evidence"]) for r in rows])
    truth = [r["label"] == "supports" for r in rows]
    guesses = [LABELS[i] for i in probs.argmax(axis=1)]
    return {
        "pairs": len(rows),
        "supports": sum(truth),
        "auroc": round(float(roc_auc_score(truth, probs[:, SUPPORTS])), 4),
        "accuracy_3way": round(float(np.mean([g == r["label"] for g, r in zip(guesses, rows, strict=True)])), 4),
    }


def citint_auroc(verifier: Verifier, rows: list[dict]) -> dict:
    """AUROC of the claim's best P(supports) over its sentences, ACCURATE against NOT_ACCURATE."""
    rows = [r for r in rows if r["label"] in ("ACCURATE", "NOT_ACCURATE")]
    pairs = [(r["text"], s) for r in rows for s in r["sentences"]]
    probs = verifier.score(pairs)[:, SUPPORTS]
    best, start = [], 0
    for row in rows:
        best.append(float(probs[start : start + len(row["sentences"])].max()))
        start += len(row["sentences"])
    truth = [r["label"] == "ACCURATE" for r in rows]
    return {
        "claims": len(rows),
        "accurate": sum(truth),
        "articles": len({r["article"] for r in rows}),
        "auroc": round(float(roc_auc_score(truth, best)), 4),
    }


def speed(verifier: Verifier, rows: list[dict], count: int = 100) -> dict:
    """Seconds for ``count`` pairs (after one warm-up call that also loads the model)."""
    pairs = [(r["claim"], r["evidence"]) for r in rows][:count]
    started = time.perf_counter()
    verifier.score(pairs[:2])
    loaded = time.perf_counter() - started
    started = time.perf_counter()
    verifier.score(pairs)
    seconds = time.perf_counter() - started
    return {
        "pairs": len(pairs),
        "seconds": round(seconds, 3),
        "pairs_per_second": round(len(pairs) / seconds, 1),
        "load_seconds": round(loaded, 2),
        "threads": verifier.threads,
    }


def main(argv: list[str] | None = None) -> int:
    """Run every measurement and print it; missing inputs are one line and exit status 2."""
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--data", type=Path, default=DEFAULT_DATA, help="folder with heldout/")
    parser.add_argument("--model-dir", type=Path, default=None, help="another verifier folder (ONNX + tokenizer)")
    parser.add_argument("--threads", type=int, default=2)
    parser.add_argument("--json", type=Path, default=None, help="also write the figures here")
    args = parser.parse_args(argv)
    for name in HELDOUT_FILES:
        if not (args.data / "heldout" / name).is_file():
            print(
                f"error: {args.data / 'heldout' / name}: not found (run scripts/verifier/build_data.py)",
                file=sys.stderr,
            )
            return 2
    verifier = Verifier(args.model_dir, threads=args.threads)
    heldout = {name: read_jsonl(args.data / "heldout" / name) for name in HELDOUT_FILES}
    try:
        figures = {"speed": speed(verifier, heldout["scifact_rationales.jsonl"])}
        figures["cad_test"] = cad_accuracy(verifier, heldout["cad_test.jsonl"])
        figures["scifact_heldout"] = scifact_auroc(verifier, heldout["scifact_rationales.jsonl"])
        figures["citint_heldout"] = citint_auroc(verifier, heldout["citint_claims.jsonl"])
    except ModelUnavailable as exc:
        print(f"error: {exc}", file=sys.stderr)
        return 2
    speed_line = figures["speed"]
    print(f"model: {verifier.model_path}")
    print(f"CAD test 3-way accuracy: {figures['cad_test']['accuracy']:.3f} ({figures['cad_test']['pairs']} pairs)")
    sci = figures["scifact_heldout"]
    print(
        f"SciFact held-out claims, AUROC P(supports) SUPPORT vs CONTRADICT: {sci['auroc']:.3f} "
        f"({sci['pairs']} sentences)"
    )
    cit = figures["citint_heldout"]
    print(
        f"Citation-Integrity held-out articles, AUROC ACCURATE vs NOT_ACCURATE (max over sentences): "
        f"{cit['auroc']:.3f} ({cit['claims']} claims, {cit['articles']} articles)"
    )
    print(
        f"speed: {speed_line['pairs']} pairs in {speed_line['seconds']:.2f} s "
        f"({speed_line['pairs_per_second']} pairs/s, {speed_line['threads']} threads)"
    )
    if args.json is not None:
        args.json.write_text(json.dumps(figures, indent=2) + "\n", encoding="utf-8")
    return 0


if __name__ == "__main__":
    sys.exit(main())
