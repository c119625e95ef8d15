"""Shared plain-text layer: what every stage reads text with, owned by none.

Tokens and stems (:mod:`.tokens`), the one sentence splitter (:mod:`.sentences`), author
names (:mod:`.names`), DOI names (:mod:`.identifiers`), display trimming
(:mod:`.snippets`) and control characters made visible for a person (:mod:`.display`).
It imports nothing of the stages above it.
"""

from __future__ import annotations

from sourcecheck.text.display import visible
from sourcecheck.text.identifiers import find_doi, find_dois, normalize_doi
from sourcecheck.text.names import FAMILY, NAME_WORD, PARTICLE_RE, PARTICLES, ascii_slug, family_key, fold
from sourcecheck.text.sentences import ends_sentence, sentence_spans, split_sentences, wrapped_sentence_spans
from sourcecheck.text.snippets import trim
from sourcecheck.text.tokens import STOP_WORDS, coverage, s_stem, tokenize

__all__ = [
    "FAMILY",
    "NAME_WORD",
    "PARTICLES",
    "PARTICLE_RE",
    "STOP_WORDS",
    "ascii_slug",
    "coverage",
    "ends_sentence",
    "family_key",
    "find_doi",
    "find_dois",
    "fold",
    "normalize_doi",
    "s_stem",
    "sentence_spans",
    "split_sentences",
    "tokenize",
    "trim",
    "visible",
    "wrapped_sentence_spans",
]
