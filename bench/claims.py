"""Benchmark the judge on a labelled claim-verification dataset, from the files a user has.

Usage:
    python bench/claims.py DATA_DIR [--out bench/out/scifact] [--split holdout|fit|all]
                                    [--rebuild] [--cache DIR]

``DATA_DIR`` is a dataset in the layout bench/scifact_corpus.py reads (SciFact's
``claims_train.jsonl`` and ``corpus_train_cited.jsonl``). The script builds the draft, the
source PDFs, the reference map and the answers from it (once; ``--rebuild`` to redo), then
runs sourcecheck's pipeline on the draft and the PDFs exactly as ``sourcecheck check`` does
(the shipped calibration, nothing refitted) and scores what it reports:

- evidence hit@1 and hit@3: the first (first three) passages found for a cited work hold
  one of the annotators' rationale sentences, over the pairs that have rationales;
- AUROC of the backing score, SUPPORT against everything else (CONTRADICT, cited without
  evidence, and decoy citations), as the Mann-Whitney U statistic; then against the
  dataset's own labels only (CONTRADICT and NEI, no decoys), and against each label;
- the bands given to each gold label.

The split is the one fixed by claim id in the corpus (the calibration was fitted on
"fit"; report "holdout" for figures that mean something).
"""

from __future__ import annotations

import argparse
import datetime as dt
import json
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent))

import scifact_corpus
from calibrate import auroc, holds_rationale

from sourcecheck.model import Band
from sourcecheck.pipeline import make_checker, prepare

ROOT = Path(__file__).resolve().parent.parent


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("data_dir", type=Path)
    parser.add_argument("--out", type=Path, default=ROOT / "bench" / "out" / "scifact")
    parser.add_argument("--split", choices=("holdout", "fit", "all"), default="holdout")
    parser.add_argument("--rebuild", action="store_true", help="rebuild the draft and PDFs")
    parser.add_argument("--cache", type=Path, default=ROOT / "bench" / "out" / "cache")
    parser.add_argument("--verifier", help="another verifier model folder (default: the shipped one)")
    args = parser.parse_args(argv)

    if args.rebuild or not (args.out / "gold.jsonl").is_file():
        code = scifact_corpus.main([str(args.data_dir), str(args.out)])
        if code:
            return code
    started = time.perf_counter()
    prepared = prepare(
        args.out / "draft.md",
        args.out / "sources",
        mapping=args.out / "mapping.csv",
        cache_dir=args.cache,
        verifier=args.verifier,
    )
    checker = make_checker(prepared)
    claims = prepared.draft.claims

    scores, support, labels, hit1, hit3 = [], [], [], [], []
    bands: dict[str, dict[str, int]] = {}
    for line in (args.out / "gold.jsonl").read_text(encoding="utf-8").splitlines():
        gold = json.loads(line)
        if args.split != "all" and gold["split"] != args.split:
            continue
        index = gold["claim_index"] - 1
        if index >= len(claims):
            continue
        claim = claims[index]
        citation = next((c for c in claim.citations if c.key == gold["ref"]), None)
        if citation is None:
            continue
        vector, query = prepared.claim_vectors[index], prepared.queries[index]
        check = checker.check(claim, query, vector, citation)
        if check.band is Band.UNVERIFIABLE:
            continue  # no source to judge: not a judgment of the evidence
        scores.append(check.score)
        support.append(gold["label"] == "SUPPORT")
        labels.append(gold["label"])
        bands.setdefault(gold["label"], {b.value: 0 for b in Band if b is not Band.UNVERIFIABLE})[check.band.value] += 1
        if gold["rationales"] and check.source:
            hits = checker.evidence_for(query, vector, check.source)
            flags = [holds_rationale(h.passage.text, gold["rationales"]) for h in hits[:3]]
            shown = check.evidence[0].text if check.evidence else ""
            hit1.append(holds_rationale(shown, gold["rationales"]))
            hit3.append(any(flags))
    elapsed = time.perf_counter() - started

    print(f"sourcecheck claim benchmark, {dt.date.today().isoformat()}, split {args.split}")
    print(f"corpus: {args.out} ({len(scores)} judged pairs, {len(hit1)} with rationale sentences)")
    print(f"evidence hit@1  {np.mean(hit1):.3f}")
    print(f"evidence hit@3  {np.mean(hit3):.3f}")
    score_array, label_array = np.array(scores), np.array(labels)
    print(f"AUROC, SUPPORT against the rest  {auroc(score_array, np.array(support)):.3f}")
    cited = label_array != "UNRELATED"  # the dataset's own labels, without the decoy citations
    if cited.any():
        print(f"  SUPPORT against CONTRADICT + NEI {auroc(score_array[cited], label_array[cited] == 'SUPPORT'):.3f}")
    for other in scifact_corpus.LABELS[1:]:
        pair = (label_array == "SUPPORT") | (label_array == other)
        if pair.any():
            print(f"  SUPPORT against {other:<11}{auroc(score_array[pair], label_array[pair] == 'SUPPORT'):.3f}")
    print("bands per gold label:")
    names = [b.value for b in Band if b is not Band.UNVERIFIABLE]
    print("  " + " " * 11 + "".join(f"{n:>10}" for n in names))
    for label in scifact_corpus.LABELS:
        if label in bands:
            print(f"  {label:<11}" + "".join(f"{bands[label][n]:>10}" for n in names))
    print(f"({elapsed:.0f} s for the pipeline and the scoring)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
