"""Turning prose blocks into claims: sentences that carry citation markers.

Format-neutral: a reader hands over blocks of prose (a paragraph, a list item) with the
line each starts on, and gets claims with line numbers back. Sentence splitting is left
to pysbd, whose rules keep "et al." and "Fig. 2" inside a sentence.
"""

from __future__ import annotations

import re
from collections.abc import Callable, Iterable
from dataclasses import dataclass
from functools import lru_cache

import pysbd

from sourcecheck.drafts.markers import Marker, NumberCite, find_markers
from sourcecheck.drafts.resolve import Resolver
from sourcecheck.model import Citation, Claim


@dataclass(frozen=True)
class Block:
    """A run of prose: its text (line breaks kept) and the 1-based line of its first char."""

    text: str
    line: int


@dataclass(frozen=True)
class Sentence:
    """A sentence of a block as a character span, with the markers inside it."""

    start: int
    end: int
    markers: tuple[Marker, ...]


@lru_cache(maxsize=1)
def _segmenter() -> pysbd.Segmenter:
    return pysbd.Segmenter(language="en", clean=False)


def split_sentences(text: str) -> list[tuple[int, int]]:
    """Character spans of the sentences of ``text``, whitespace trimmed.

    Line breaks are read as spaces, since a paragraph wrapped over lines is still one run
    of sentences; the spans refer to the original text.
    """
    flat = text.replace("\n", " ")
    spans: list[tuple[int, int]] = []
    cursor = 0
    for segment in _segmenter().segment(flat):
        piece = segment.strip()
        if not piece:
            continue
        start = flat.find(piece, cursor)
        if start < 0:  # pysbd changed the text; fall back to the running position
            start = cursor
        end = start + len(piece)
        spans.append((start, end))
        cursor = end
    return spans


def sentences_with_markers(text: str) -> list[Sentence]:
    """Sentences of ``text`` and the markers each holds.

    A numbered marker that opens a sentence right after a full stop ("... holds. [3] Next")
    is given to the sentence before, where the writer meant it.
    """
    spans = [list(span) for span in split_sentences(text)]
    owned: list[list[Marker]] = [[] for _ in spans]
    for marker in find_markers(text):
        index = next(
            (i for i, (s, e) in enumerate(spans) if s <= marker.start < e),
            None,
        )
        if index is None:
            continue
        leading = not text[spans[index][0] : marker.start].strip()
        if (
            leading
            and index > 0
            and all(isinstance(c, NumberCite) for c in marker.cites)
            and text[: spans[index - 1][1]].rstrip().endswith((".", "!", "?"))
        ):
            spans[index - 1][1] = max(spans[index - 1][1], marker.end)
            rest = text[marker.end : spans[index][1]]
            spans[index][0] = marker.end + (len(rest) - len(rest.lstrip()))
            index -= 1
        owned[index].append(marker)
    return [Sentence(s, e, tuple(markers)) for (s, e), markers in zip(spans, owned, strict=True) if e > s]


#: Citations of one sentence of a block; lets a reader add marker kinds of its own (Pandoc keys).
CitationsOf = Callable[[Block, "Sentence"], tuple[Citation, ...]]


def extract_claims(
    blocks: Iterable[Block], resolver: Resolver, first_id: int = 1, citations_of: CitationsOf | None = None
) -> list[Claim]:
    """Claims of ``blocks`` in order, numbered "c1", "c2", ... from ``first_id``.

    ``citations_of`` gives a sentence's citations; by default its shared markers, resolved
    by ``resolver``.
    """
    if citations_of is None:

        def citations_of(block: Block, sentence: Sentence) -> tuple[Citation, ...]:
            return _citations(sentence.markers, resolver)

    claims: list[Claim] = []
    for block in blocks:
        for sentence in sentences_with_markers(block.text):
            citations = citations_of(block, sentence)
            if not citations:
                continue
            claims.append(
                Claim(
                    id=f"c{first_id + len(claims)}",
                    text=readable(block.text[sentence.start : sentence.end]),
                    line=block.line + block.text.count("\n", 0, sentence.start),
                    citations=citations,
                )
            )
    return claims


def _citations(markers: Iterable[Marker], resolver: Resolver) -> tuple[Citation, ...]:
    """One Citation per cited work; the same work twice in a sentence counts once."""
    seen: set[str] = set()
    citations: list[Citation] = []
    for marker in markers:
        written = " ".join(marker.text.split())
        for cite in marker.cites:
            key = resolver.resolve(cite)
            identity = f"key:{key}" if key else f"label:{cite.label}"
            if identity in seen:
                continue
            seen.add(identity)
            citations.append(Citation(written, cite.label, key, cite.locator))
    return tuple(citations)


def readable(text: str) -> str:
    """Sentence text without Markdown emphasis, link targets or tags; markers are kept."""
    text = re.sub(r"!\[[^\]]*\]\([^)]*\)", "", text)
    text = re.sub(r"\[\^[^\]]+\]", "", text)
    text = re.sub(r"\[([^\]]+)\]\([^)]*\)", r"\1", text)
    text = re.sub(r"<[^<>\n]+>", "", text)
    text = re.sub(r"`+([^`]*)`+", r"\1", text)
    text = re.sub(r"(\*{1,3}|~~)(?=\S)(.+?)(?<=\S)\1", r"\2", text)
    text = re.sub(r"(?<!\w)(_{1,3})(?=\S)(.+?)(?<=\S)\1(?!\w)", r"\2", text)
    return " ".join(text.split())
