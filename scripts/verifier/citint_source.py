"""Citation-Integrity citing sentences against sentences of the article they cite, split by reference article.

Each claim is a real citing sentence judged by experts against up to five sentences of the
cited article; the label (ACCURATE / NOT_ACCURATE / IRRELEVANT) belongs to the claim as a
whole, not to one sentence. For training, a claim is paired with the one candidate sentence
closest to it in the packaged MiniLM embedding space:

- ACCURATE (``SUPPORT``) -> supports;
- NOT_ACCURATE (``REFUTE``) -> neither: most such citations overstate or are not backed by
  the article rather than being contradicted by it, and the verifier must not call a source
  "contradicting" on that ground (SciFact and the NLI pairs teach contradiction);
- IRRELEVANT (no evidence) -> neither.

Reference articles (first three digits of ``doc_id``) are split by a hash: held-out articles'
claims are written whole (all candidate sentences, label) for bench/verifier.py only.
Data: ../shared/data/citint/README.md (MIT; Sarol et al., Bioinformatics 2024).
"""

from __future__ import annotations

import re
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path

import numpy as np
from pair_records import NEITHER, SUPPORTS, Pair, hashed_fraction, read_jsonl, validation_side

CLAIMS_FILE = "claims_train.jsonl"
CORPUS_FILE = "corpus_train.jsonl"
HELDOUT_ARTICLES = 0.25  # share of the 70 reference articles kept for measuring

# A bracketed or parenthesised group that holds a citation token: "[<|cit|>, 7]",
# "(Liu et al., <|multi_cit|>; Chen 2010)". The whole group is a citation, so it goes.
_CITATION_GROUP = re.compile(r"\s*[\[(][^\[\]()]*<\|(?:multi_|other_)?cit\|>[^\[\]()]*[\])]")
_CITATION_TOKEN = re.compile(r"\s*<\|(?:multi_|other_)?cit\|>")
_SPACE_BEFORE_PUNCT = re.compile(r"\s+([.,;:])")

LABEL_OF = {"SUPPORT": "ACCURATE", "REFUTE": "NOT_ACCURATE"}


@dataclass(frozen=True)
class CitingClaim:
    """One citing sentence with its candidate sentences and the experts' label."""

    claim_id: int
    article: str
    text: str
    sentences: tuple[str, ...]
    label: str  # ACCURATE, NOT_ACCURATE or IRRELEVANT


def clean_citing_sentence(text: str) -> str:
    """The citing sentence as a reader sees the claim: citation groups and markers removed."""
    text = _CITATION_GROUP.sub("", text)
    text = _CITATION_TOKEN.sub(" ", text)
    text = _SPACE_BEFORE_PUNCT.sub(r"\1", text)
    return re.sub(r"\s{2,}", " ", text).strip()


def article_of(doc_id: int) -> str:
    """The reference article a claim is about: the first three digits of its doc_id (README)."""
    return str(doc_id)[:3]


def is_heldout_article(article: str) -> bool:
    """Whether a reference article is kept out of training, by a hash of its number."""
    return hashed_fraction(article, "citint-articles") < HELDOUT_ARTICLES


def claim_label(evidence: dict) -> str:
    """ACCURATE, NOT_ACCURATE, or IRRELEVANT when the evidence is empty."""
    for rationales in evidence.values():
        for rationale in rationales or ():
            return LABEL_OF.get(str(rationale.get("label")), "IRRELEVANT")
    return "IRRELEVANT"


def load_citing_claims(data_dir: Path) -> list[CitingClaim]:
    """Every claim with its cited document's candidate sentences."""
    corpus = {int(o["doc_id"]): tuple(str(s) for s in o["abstract"]) for o in read_jsonl(data_dir / CORPUS_FILE)}
    claims = []
    for obj in read_jsonl(data_dir / CLAIMS_FILE):
        doc_id = int(obj["cited_doc_ids"][0])
        sentences = corpus.get(doc_id, ())
        text = clean_citing_sentence(str(obj["claim"]))
        if not sentences or not text:
            continue
        label = claim_label(obj.get("evidence") or {})
        claims.append(CitingClaim(int(obj["id"]), article_of(doc_id), text, sentences, label))
    return claims


Embedder = Callable[[list[str]], np.ndarray]


def closest_sentences(claims: list[CitingClaim], embed: Embedder) -> list[str]:
    """For each claim, its candidate sentence of highest cosine similarity (unit embeddings)."""
    texts = sorted({c.text for c in claims} | {s for c in claims for s in c.sentences})
    vectors = dict(zip(texts, embed(texts), strict=True))
    chosen = []
    for claim in claims:
        scores = [float(vectors[claim.text] @ vectors[s]) for s in claim.sentences]
        chosen.append(claim.sentences[int(np.argmax(scores))])
    return chosen


def training_pairs(claims: list[CitingClaim], embed: Embedder, validation: float) -> list[Pair]:
    """One pair per claim of a training article (see the module docstring for the labels)."""
    kept = [c for c in claims if not is_heldout_article(c.article)]
    pairs = []
    for claim, sentence in zip(kept, closest_sentences(kept, embed), strict=True):
        label = SUPPORTS if claim.label == "ACCURATE" else NEITHER
        group = f"citint:{claim.claim_id}"
        pairs.append(Pair(claim.text, sentence, label, "citint", group, validation_side(group, validation)))
    return pairs


def heldout_claims(claims: list[CitingClaim]) -> list[CitingClaim]:
    """Claims of held-out articles, for measuring only."""
    return [c for c in claims if is_heldout_article(c.article)]
