"""Cutting a page's paragraphs into passages: a few whole sentences, at most N words.

A passage is what retrieval ranks and what a person reads as evidence, so it should be
whole sentences (pysbd, which knows "et al." and "Fig. 2" are not sentence ends), short
enough for the embedding model (all-MiniLM-L6-v2 reads 256 word pieces) and never spread
over two pages, so its page number is exact. Passages do not cross paragraph boundaries
either: one paragraph usually makes one point, and the boundary is free to respect.
"""

from __future__ import annotations

import math
import re
from dataclasses import replace

from sourcecheck.model import Passage
from sourcecheck.sources._sections import heading_role, run_in_heading
from sourcecheck.text import split_sentences

#: A paragraph of at most this many words with no closing punctuation is a heading, a
#: figure label or a title fragment ("2 Methods", "Table 3"): it states nothing a claim
#: could rest on, so it makes no passage.
FRAGMENT_WORDS = 3
_CLOSES = re.compile(r"[.!?:;][\"'”’)\]]*$")


def _split_long(sentence: str, max_words: int) -> list[str]:
    """A sentence longer than ``max_words`` cut at word boundaries into equal-ish pieces."""
    words = sentence.split()
    if len(words) <= max_words:
        return [sentence]
    pieces = math.ceil(len(words) / max_words)
    size = math.ceil(len(words) / pieces)
    return [" ".join(words[i : i + size]) for i in range(0, len(words), size)]


def is_fragment(paragraph: str) -> bool:
    """A heading-like scrap: very few words and no closing punctuation."""
    return len(paragraph.split()) <= FRAGMENT_WORDS and not _CLOSES.search(paragraph)


def pack_paragraph(paragraph: str, max_words: int) -> list[str]:
    """Consecutive sentences of one paragraph, greedily packed up to ``max_words`` words."""
    chunks: list[str] = []
    current: list[str] = []
    count = 0
    for sentence in split_sentences(paragraph):
        for piece in _split_long(sentence, max_words):
            words = len(piece.split())
            if current and count + words > max_words:
                chunks.append(" ".join(current))
                current, count = [], 0
            current.append(piece)
            count += words
    if current:
        chunks.append(" ".join(current))
    return chunks


def make_passages(source: str, pages: list[list[str]], max_words: int, start: int = 0) -> list[Passage]:
    """Passages of every page; ``pages`` holds each page's paragraphs as strings.

    ``ordinal`` counts up from ``start`` across the whole source, in reading order.
    """
    if max_words < 1:
        raise ValueError("max_words must be at least 1")
    passages: list[Passage] = []
    runs: list[int] = []  # which section run each passage belongs to, for its place in it
    ordinal, role, run = start, "", 0
    for number, paragraphs in enumerate(pages, start=1):
        for paragraph in paragraphs:
            announced = heading_role(paragraph)
            if announced is not None:
                role, run = announced, run + 1
                continue
            if is_fragment(paragraph):
                continue
            run_in = run_in_heading(paragraph)
            if run_in is not None:
                role, run = run_in[0], run + 1
            for text in pack_paragraph(paragraph, max_words):
                passages.append(Passage(source=source, page=number, text=text, ordinal=ordinal, section=role))
                runs.append(run)
                ordinal += 1
    return _with_places(passages, runs)


def _with_places(passages: list[Passage], runs: list[int]) -> list[Passage]:
    """Each passage's place within its section run: 0.0 for the first, 1.0 for the last."""
    sizes: dict[int, int] = {}
    for run in runs:
        sizes[run] = sizes.get(run, 0) + 1
    seen: dict[int, int] = {}
    placed = []
    for passage, run in zip(passages, runs, strict=True):
        k = seen.get(run, 0)
        seen[run] = k + 1
        place = k / (sizes[run] - 1) if sizes[run] > 1 else 0.0
        placed.append(replace(passage, place=round(place, 4)))
    return placed
