"""The one record every training source becomes: a claim, a piece of evidence, a label, and where it came from.

Keeping all sources in one shape lets the builder count them alike, lets training mix them
by name, and lets the validation split be taken by claim (``group``) whatever the source.
"""

from __future__ import annotations

import hashlib
import json
import sys
from collections.abc import Iterable, Iterator
from dataclasses import asdict, dataclass
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))  # the repository root, for bench.scifact_corpus

SUPPORTS, CONTRADICTS, NEITHER = "supports", "contradicts", "neither"
LABELS = (SUPPORTS, CONTRADICTS, NEITHER)  # the same order as sourcecheck.judge.verifier.LABELS

TRAIN, VAL = "train", "val"


@dataclass(frozen=True)
class Pair:
    """One (claim, evidence) example.

    ``source`` names the data set or the counterfactual kind, ``group`` the claim it belongs
    to (pairs of one group always fall on the same side of the validation split), ``split``
    is "train" or "val".
    """

    claim: str
    evidence: str
    label: str
    source: str
    group: str
    split: str = TRAIN


def hashed_fraction(key: str, salt: str) -> float:
    """A stable number in [0, 1) for a key: the basis of every split made here (no RNG state)."""
    digest = hashlib.sha256(f"{salt}:{key}".encode()).digest()
    return int.from_bytes(digest[:8], "big") / 2**64


def validation_side(group: str, fraction: float) -> str:
    """'val' for about ``fraction`` of the groups, chosen by hash so a claim never changes side."""
    return VAL if hashed_fraction(group, "verifier-validation") < fraction else TRAIN


def write_pairs(path: Path, pairs: Iterable[Pair]) -> int:
    """Write pairs as JSON lines; return how many."""
    path.parent.mkdir(parents=True, exist_ok=True)
    count = 0
    with path.open("w", encoding="utf-8") as handle:
        for pair in pairs:
            handle.write(json.dumps(asdict(pair), ensure_ascii=False) + "\n")
            count += 1
    return count


def read_pairs(path: Path) -> Iterator[Pair]:
    """Read pairs written by :func:`write_pairs`."""
    with path.open(encoding="utf-8") as handle:
        for line in handle:
            if line.strip():
                yield Pair(**json.loads(line))


def read_jsonl(path: Path) -> Iterator[dict]:
    """The objects of a JSON-lines data file; a bad line stops with the file and line named.

    The reading itself is the benchmark's (``bench/scifact_corpus.read_jsonl``), which
    collects bad lines as problems; training data must be whole, so the first one stops here.
    """
    from bench.scifact_corpus import read_jsonl as read_lines

    problems: list = []
    for _, obj in read_lines(path, problems):
        if problems:
            break
        yield obj
    if problems:
        raise ValueError(f"{problems[0].file}: {problems[0].message}")
