"""Turning prose blocks into claims: sentences that carry citation markers.

Format-neutral: a reader hands over blocks of prose (a paragraph, a list item) with the
line each starts on, and gets claims with line numbers back. Sentence splitting is left
to pysbd, whose rules keep "et al." and "Fig. 2" inside a sentence.
"""

from __future__ import annotations

import re
from collections.abc import Callable, Iterable
from dataclasses import dataclass
from typing import Any

from sourcecheck.claims.markers import Marker, NumberCite, find_markers
from sourcecheck.claims.resolve import Resolver
from sourcecheck.model import Citation, Claim
from sourcecheck.text import wrapped_sentence_spans


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


def sentences_with_markers(text: str) -> list[Sentence]:
    """Sentences of ``text`` and the markers each holds.

    A numbered marker that opens a sentence right after a full stop ("... holds. [3] Next")
    is given to the sentence before, where the writer meant it.
    """
    spans = [list(span) for span in wrapped_sentence_spans(text)]
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
    return citations_from(markers, resolver.resolve)


def citations_from(markers: Iterable[Any], key_of: Callable[[Any], str | None]) -> tuple[Citation, ...]:
    """One Citation per cited work of ``markers``; the same work twice in a sentence counts once.

    ``key_of`` ties a cite to its reference key (None when unresolved); a reader with cites
    of its own kind (Pandoc keys) passes its own.
    """
    seen: set[str] = set()
    citations: list[Citation] = []
    for marker in markers:
        written = " ".join(marker.text.split())
        for cite in marker.cites:
            key = key_of(cite)
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


def claim_query(claim: Claim) -> str:
    """The claim sentence without its citation markers: what is searched and judged."""
    text = claim.text
    for marker in {c.marker for c in claim.citations}:
        text = text.replace(marker, " ")
    return re.sub(r"\s+([.,;:])", r"\1", re.sub(r"\s{2,}", " ", text)).strip()
