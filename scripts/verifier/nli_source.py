"""Natural-language-inference pairs (SNLI dev/test, counterfactually augmented NLI) as verifier pairs.

NLI's premise plays the source's sentence and its hypothesis the claim: "entailment" is
supports, "contradiction" contradicts, "neutral" neither. The counterfactual (CAD) pairs are
the ones that differ by a minimal edit that flips the label, which is what the verifier must
learn; SNLI adds breadth. Data: ../shared/data/nli/README.md (SNLI CC BY-SA 4.0, CAD Apache-2.0).
"""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path

from pair_records import CONTRADICTS, NEITHER, SUPPORTS, VAL, Pair, read_jsonl

NLI_LABELS = {"entailment": SUPPORTS, "contradiction": CONTRADICTS, "neutral": NEITHER}

TRAIN_FILES = {"snli": ("snli_dev.jsonl", "snli_test.jsonl"), "cad": ("cad_train.jsonl",)}
VALIDATION_FILE = "cad_dev.jsonl"  # CAD's own development split is the NLI validation set
TEST_FILE = "cad_test.jsonl"  # measured by bench/verifier.py only, never trained on


def nli_pairs(path: Path, source: str, split: str) -> Iterator[Pair]:
    """Pairs of one NLI file; lines with another label (SNLI's "-" no-consensus) are skipped."""
    for obj in read_jsonl(path):
        label = NLI_LABELS.get(str(obj.get("label", "")))
        premise, hypothesis = str(obj.get("premise", "")).strip(), str(obj.get("hypothesis", "")).strip()
        if label is None or not premise or not hypothesis:
            continue
        yield Pair(claim=hypothesis, evidence=premise, label=label, source=source, group=premise, split=split)


def training_pairs(nli_dir: Path) -> Iterator[Pair]:
    """SNLI dev+test and CAD train for training, CAD dev for validation."""
    for source, files in TRAIN_FILES.items():
        for name in files:
            yield from nli_pairs(nli_dir / name, source, "train")
    yield from nli_pairs(nli_dir / VALIDATION_FILE, "cad", VAL)


def heldout_pairs(nli_dir: Path) -> Iterator[Pair]:
    """CAD test pairs, for measuring only."""
    yield from nli_pairs(nli_dir / TEST_FILE, "cad-test", "test")
