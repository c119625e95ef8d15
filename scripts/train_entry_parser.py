"""Train the shipped reference-entry parser on all labelled entries.

Usage:
    python scripts/train_entry_parser.py [DATA]

DATA defaults to ../shared/data/refstrings/labelled.jsonl (relative to the repository root).
Writes, inside sourcecheck/drafts/bibliography/entry_parser/:

* ``lexicons/<name>.txt`` for the word lists derived from the data (the curated lists are
  left as they are);
* ``model/entry_parser.crfsuite``, the CRFsuite model;
* ``model/model.json``: the model's sha256 and size, the data file's sha256, the entry
  count and the training parameters, so a test can tell the model from another.

Training is deterministic: CRFsuite's L-BFGS makes no random draws, so the same data and
code give the same model file (there is no seed to fix). Cross-validated figures for these
settings come from bench/entry_parser.py; this script trains on everything and measures
nothing.
"""

from __future__ import annotations

import argparse
import hashlib
import json
import sys
import time
from pathlib import Path

from sourcecheck.drafts.bibliography.entry_parser import (
    DERIVED,
    LEXICON_DIR,
    MODEL_PATH,
    TRAINING_PARAMS,
    LabelledDataError,
    lexicons_for,
    read_labelled,
    train_model,
    write_lexicon,
)

ROOT = Path(__file__).resolve().parent.parent
DEFAULT_DATA = ROOT.parent / "shared" / "data" / "refstrings" / "labelled.jsonl"
METADATA_PATH = MODEL_PATH.with_name("model.json")


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("data", nargs="?", type=Path, default=DEFAULT_DATA)
    args = parser.parse_args(argv)
    started = time.perf_counter()
    try:
        entries = read_labelled(args.data)
    except LabelledDataError as error:
        print(error, file=sys.stderr)
        return 2
    data_sha = hashlib.sha256(args.data.read_bytes()).hexdigest()
    lexicons = lexicons_for(entries)
    source = (
        f"derived by scripts/train_entry_parser.py from {args.data.name} (sha256 {data_sha[:16]}, "
        f"{len(entries)} entries; anystyle training data, BSD 2-Clause, Copyright 2011-2023 Sylvester Keil)"
    )
    for name in DERIVED:
        write_lexicon(LEXICON_DIR / f"{name}.txt", lexicons[name], source)
    train_model(entries, lexicons, MODEL_PATH)
    model_bytes = MODEL_PATH.read_bytes()
    metadata = {
        "model": MODEL_PATH.name,
        "sha256": hashlib.sha256(model_bytes).hexdigest(),
        "bytes": len(model_bytes),
        "data": {"file": args.data.name, "sha256": data_sha, "entries": len(entries)},
        "training_params": dict(TRAINING_PARAMS),
    }
    METADATA_PATH.write_text(json.dumps(metadata, indent=2) + "\n", encoding="utf-8")
    elapsed = time.perf_counter() - started
    print(f"trained on {len(entries)} entries in {elapsed:.1f} s; {MODEL_PATH} ({len(model_bytes):,} bytes)")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
