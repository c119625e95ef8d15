"""SciFact claims against sentences of the abstracts they cite, split by claim as the benchmark splits them.

Only claims on the "fit" side of ``bench/scifact_corpus.split_of`` (a hash of the claim id,
30% held out) are trained on; the held-out claims' rationale sentences are written for
bench/verifier.py. Rationale sentences carry the claim's label (SUPPORT -> supports,
CONTRADICT -> contradicts); "neither" comes from other sentences of a cited abstract and from
the cited abstracts of claims without evidence. Data: ../shared/data/scifact/README.md
(claims CC BY 4.0, abstracts ODC-By 1.0; Wadden et al., EMNLP 2020).
"""

from __future__ import annotations

import random
from dataclasses import dataclass
from pathlib import Path

from pair_records import CONTRADICTS, NEITHER, SUPPORTS, Pair, validation_side
from rapidfuzz import fuzz

from bench.scifact_corpus import (
    CLAIMS_FILE,
    CORPUS_FILE,
    ClaimRecord,
    Doc,
    load_claims,
    load_corpus,
    split_of,
)

LABEL_OF = {"SUPPORT": SUPPORTS, "CONTRADICT": CONTRADICTS}


@dataclass
class SciFactPairs:
    """What the SciFact source yields: training pairs, the held-out rationale pairs, and problems."""

    training: list[Pair]
    heldout: list[Pair]
    problems: list[str]


def group_key(claim: ClaimRecord) -> str:
    """The validation-split key of a claim."""
    return f"scifact:{claim.id}"


def rationale_pairs(claim: ClaimRecord, docs: dict[int, Doc], source: str, split: str) -> list[Pair]:
    """One pair per rationale sentence, labelled with the claim's label for that abstract."""
    pairs = []
    for doc_id, evidence in claim.evidence.items():
        doc = docs.get(doc_id)
        if doc is None:
            continue
        for index in evidence.sentences:
            if 0 <= index < len(doc.sentences):
                pairs.append(
                    Pair(claim.text, doc.sentences[index], LABEL_OF[evidence.label], source, group_key(claim), split)
                )
    return pairs


def neither_pairs(claim: ClaimRecord, docs: dict[int, Doc], split: str, rng: random.Random) -> list[Pair]:
    """Sentences of the cited abstracts that are not the claim's evidence.

    For an abstract with evidence, one other sentence at random (annotators marked the
    rationale, so the rest is taken not to decide the claim). For a cited abstract without
    evidence, the sentence sharing most words with the claim (an on-topic sentence that still
    does not decide it) and one at random.
    """
    pairs = []
    for doc_id in claim.cited:
        doc = docs.get(doc_id)
        if doc is None or not doc.sentences:
            continue
        evidence = claim.evidence.get(doc_id)
        if evidence is not None:
            others = [s for i, s in enumerate(doc.sentences) if i not in evidence.sentences]
            chosen = rng.sample(others, min(1, len(others)))
        else:
            closest = max(doc.sentences, key=lambda s: fuzz.token_set_ratio(claim.text, s))
            rest = [s for s in doc.sentences if s != closest]
            chosen = [closest, *rng.sample(rest, min(1, len(rest)))]
        pairs += [Pair(claim.text, s, NEITHER, "scifact", group_key(claim), split) for s in chosen]
    return pairs


def scifact_pairs(data_dir: Path, validation: float) -> SciFactPairs:
    """Training pairs from fit-split claims, rationale pairs of held-out claims for measuring."""
    problems: list = []
    claims = load_claims(data_dir / CLAIMS_FILE, problems)
    docs = load_corpus(data_dir / CORPUS_FILE, problems)
    training: list[Pair] = []
    heldout: list[Pair] = []
    for claim in sorted(claims, key=lambda c: c.id):
        if split_of(claim.id) == "holdout":
            heldout += rationale_pairs(claim, docs, "scifact-heldout", "test")
            continue
        side = validation_side(group_key(claim), validation)
        rng = random.Random(f"scifact-neither:{claim.id}")
        training += rationale_pairs(claim, docs, "scifact", side)
        training += neither_pairs(claim, docs, side, rng)
    return SciFactPairs(training, heldout, [f"{p.file}: {p.message}" for p in problems])
