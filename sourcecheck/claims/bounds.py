"""Bounding what is read of a draft: characters, sentences and citations, each with one line.

A stranger's draft may hold one paragraph of ten megabytes, a million sentences or a
sentence citing five thousand works. Every reader hands its prose blocks through here
before claims are extracted, and its claims after: what is over a limit
(:class:`sourcecheck.limits.Limits`) is cut, and one problem line names the place and the
limit, so the rest of the draft is still checked.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import replace

from sourcecheck.claims.extract import Block
from sourcecheck.limits import Limits
from sourcecheck.model import Claim, Problem
from sourcecheck.text import wrapped_sentence_spans


def cut_draft(text: str, limits: Limits, display: str) -> tuple[str, list[Problem]]:
    """The draft's text up to ``limits.draft_chars``, and the line that says it was cut."""
    if len(text) <= limits.draft_chars:
        return text, []
    line = text.count("\n", 0, limits.draft_chars) + 1
    message = f"{len(text):,} characters, over the limit of {limits.draft_chars:,} (draft_chars)"
    return text[: limits.draft_chars], [Problem(display, f"{message}; from line {line} on it is not read")]


def reading_lengths(
    texts: Sequence[str], limits: Limits, display: str, where: Callable[[int], tuple[str, str]]
) -> tuple[list[int], list[Problem]]:
    """How many characters of each text to read, and the problems: one per cut block.

    ``where(i)`` names block ``i`` as (file, "line N") for the problem line. A block is cut
    at the paragraph limit (at a space), then after its last allowed sentence; once the
    draft's total is reached, the rest of the blocks are not read (one line for them all).
    """
    lengths: list[int] = []
    problems: list[Problem] = []
    total = 0
    for index, text in enumerate(texts):
        keep = len(text)
        file, place = where(index)
        if total + keep > limits.draft_chars:
            keep = max(0, limits.draft_chars - total)
            lengths.append(keep)
            lengths.extend(0 for _ in texts[index + 1 :])
            message = f"{place}: the draft's text is over the limit of {limits.draft_chars:,} characters (draft_chars)"
            problems.append(Problem(file, f"{message}; the rest is not read"))
            break
        if keep > limits.paragraph_chars:
            space = text.rfind(" ", 0, limits.paragraph_chars + 1)
            keep = space if space > limits.paragraph_chars // 2 else limits.paragraph_chars
            problems.append(
                Problem(
                    file,
                    f"{place}: a paragraph of {len(text):,} characters, over the limit of "
                    f"{limits.paragraph_chars:,} (paragraph_chars); the rest of it is not read",
                )
            )
        spans = wrapped_sentence_spans(text[:keep])
        if len(spans) > limits.paragraph_sentences:
            keep = spans[limits.paragraph_sentences - 1][1]
            problems.append(
                Problem(
                    file,
                    f"{place}: a paragraph of {len(spans):,} sentences, over the limit of "
                    f"{limits.paragraph_sentences:,} (paragraph_sentences); the rest of it is not read",
                )
            )
        lengths.append(keep)
        total += keep
    return lengths, problems


def bound_blocks(blocks: Sequence[Block], limits: Limits, display: str) -> tuple[list[Block], list[Problem]]:
    """``blocks`` cut to the limits (see :func:`reading_lengths`); empty blocks left out."""
    lengths, problems = reading_lengths(
        [b.text for b in blocks], limits, display, lambda i: (display, f"line {blocks[i].line}")
    )
    kept = [Block(b.text[:n], b.line) if n < len(b.text) else b for b, n in zip(blocks, lengths, strict=True) if n]
    return kept, problems


def bound_citations(claims: Sequence[Claim], limits: Limits, display: str) -> tuple[list[Claim], list[Problem]]:
    """Claims with at most ``limits.sentence_citations`` citations each, and a line per cut claim."""
    kept: list[Claim] = []
    problems: list[Problem] = []
    cap = limits.sentence_citations
    for claim in claims:
        if len(claim.citations) > cap:
            problems.append(
                Problem(
                    claim.file or display,
                    f"line {claim.line}: a sentence citing {len(claim.citations):,} works, over the limit of "
                    f"{cap:,} (sentence_citations); the first {cap:,} are checked",
                )
            )
            claim = replace(claim, citations=claim.citations[:cap])
        kept.append(claim)
    return kept, problems
