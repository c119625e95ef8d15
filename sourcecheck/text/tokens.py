"""Tokenisation shared by the lexical index and the lexical-coverage feature.

One tokenizer for both, so "the claim's content words found in the passage" means the
same thing to BM25 and to the judge. Words are lower-cased, NFKC-folded, stop words
dropped and plurals folded with Harman's S-stemmer (Harman, "How effective is suffixing?",
JASIS 42(1), 1991), which is conservative enough not to merge unrelated words, plus the
sibilant plurals (-ches, -shes, -sses, -xes, -zes) it leaves half-stemmed.
"""

from __future__ import annotations

import re
import unicodedata
from functools import lru_cache

# Numbers keep their decimal point ("0.05", "12.5") so a changed value is a changed token.
_TOKEN = re.compile(r"[^\W_]+(?:[.,]\d+)*", re.UNICODE)

# A small English stop-word list: function words only, so that content words (including
# "no", "not", "increase") are never dropped. Common practice, no source.
STOP_WORDS = frozenset(
    [
        "a",
        "about",
        "above",
        "after",
        "again",
        "against",
        "all",
        "also",
        "am",
        "an",
        "and",
        "any",
        "are",
        "as",
        "at",
        "be",
        "because",
        "been",
        "before",
        "being",
        "below",
        "between",
        "both",
        "but",
        "by",
        "can",
        "could",
        "did",
        "do",
        "does",
        "doing",
        "down",
        "during",
        "each",
        "few",
        "for",
        "from",
        "further",
        "had",
        "has",
        "have",
        "having",
        "he",
        "her",
        "here",
        "hers",
        "herself",
        "him",
        "himself",
        "his",
        "how",
        "i",
        "if",
        "in",
        "into",
        "is",
        "it",
        "its",
        "itself",
        "just",
        "me",
        "more",
        "most",
        "my",
        "myself",
        "of",
        "off",
        "on",
        "once",
        "only",
        "or",
        "other",
        "our",
        "ours",
        "ourselves",
        "out",
        "over",
        "own",
        "same",
        "she",
        "should",
        "so",
        "some",
        "such",
        "than",
        "that",
        "the",
        "their",
        "theirs",
        "them",
        "themselves",
        "then",
        "there",
        "these",
        "they",
        "this",
        "those",
        "through",
        "to",
        "too",
        "under",
        "until",
        "up",
        "very",
        "was",
        "we",
        "were",
        "what",
        "when",
        "where",
        "which",
        "while",
        "who",
        "whom",
        "why",
        "will",
        "with",
        "would",
        "you",
        "your",
        "yours",
        "yourself",
        "yourselves",
        "et",
        "al",
        "fig",
        "figure",
        "table",
    ]
)


@lru_cache(maxsize=65536)
def s_stem(word: str) -> str:
    """Fold an English plural to its singular by Harman's S-stemmer rules (1991)."""
    if len(word) <= 3 or not word.isalpha():
        return word
    if word.endswith("ies") and not word.endswith(("eies", "aies")):
        return word[:-3] + "y"
    if word.endswith(("ches", "shes", "sses", "xes", "zes")):
        return word[:-2]  # "marshes" -> "marsh": an English plural the S-stemmer misses (common practice)
    if word.endswith("es") and not word.endswith(("aes", "ees", "oes")):
        return word[:-1]
    if word.endswith("s") and not word.endswith(("us", "ss")):
        return word[:-1]
    return word


def tokenize(text: str) -> list[str]:
    """Content-word tokens of ``text``, in order, duplicates kept (BM25 needs term counts)."""
    folded = unicodedata.normalize("NFKC", text).lower()
    return [s_stem(t) for t in _TOKEN.findall(folded) if t not in STOP_WORDS]


@lru_cache(maxsize=8192)
def content_words(text: str) -> frozenset[str]:
    """The distinct content-word tokens of ``text``.

    Cached: one claim is compared with every candidate passage of the ranker, and one
    passage with every claim that retrieves it.
    """
    return frozenset(tokenize(text))


def coverage(claim: str, passage: str) -> float:
    """Share of the claim's distinct content words that the passage contains, in [0, 1]."""
    wanted = content_words(claim)
    if not wanted:
        return 0.0
    return len(wanted & content_words(passage)) / len(wanted)
