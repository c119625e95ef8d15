"""The closest span of the source to a quotation that is not there verbatim.

What a drifted quotation is reported against: its segments aligned in the normalised
source (rapidfuzz partial-ratio alignment, refined to whole words), and the words that differ.
"""

from __future__ import annotations

import re
from difflib import SequenceMatcher

from rapidfuzz import fuzz

from sourcecheck.judge.quote_text import ELLIPSIS_MAX, INSERTION_MAX, WORD, Document, Segment, quote_words

# --- the closest span when not verbatim ------------------------------------------------


def lower_first(text: str) -> str:
    return text[:1].lower() + text[1:]


def word_spans(doc: str, lo: int, hi: int) -> list[re.Match[str]]:
    while lo > 0 and doc[lo - 1].isalnum():
        lo -= 1
    while hi < len(doc) and doc[hi].isalnum():
        hi += 1
    return list(WORD.finditer(doc, lo, hi))


def align(segment: str, doc: str, lo: int, hi: int) -> tuple[int, int] | None:
    """The whole-word span of ``doc[lo:hi]`` closest to ``segment``, or None."""
    lo, hi = max(0, lo), min(len(doc), hi)
    if lo >= hi:
        return None
    coarse = fuzz.partial_ratio_alignment(segment, doc[lo:hi])
    if coarse is None or coarse.score == 0:
        return None
    start, end = lo + coarse.dest_start, lo + coarse.dest_end
    # Words dropped from (or added to) the quotation make the source span longer (or
    # shorter) than the quotation; look a little either side and let the word match decide.
    pad = max(20, len(segment) // 3)
    source_words = word_spans(doc, max(lo, start - pad), min(hi, end + pad))
    wanted = [w.lower() for w in quote_words(segment)]
    if not source_words or not wanted:
        return None
    matcher = SequenceMatcher(None, wanted, [w.group().lower() for w in source_words], autojunk=False)
    blocks = [b for b in matcher.get_matching_blocks() if b.size]
    if not blocks:
        return None  # letters in common but not one word: nothing here was quoted
    first, last = blocks[0], blocks[-1]
    # A changed first or last word is still part of the span: widen over as many
    # unmatched source words as the quotation has unmatched words at that end.
    begin = first.b - min(first.a, first.b)
    tail = len(wanted) - (last.a + last.size)
    finish = min(len(source_words) - 1, last.b + last.size - 1 + tail)
    return source_words[begin].start(), source_words[finish].end()


def word_differences(quote: str, span: str, flex_case: bool) -> tuple[list[str], int]:
    """Word differences between a quoted segment and its source span, and the words in common."""
    quoted, printed = quote_words(quote), quote_words(span)
    matcher = SequenceMatcher(None, [w.lower() for w in quoted], [w.lower() for w in printed], autojunk=False)
    found: list[str] = []
    common = 0
    for op, a1, a2, b1, b2 in matcher.get_opcodes():
        if op == "equal":
            common += a2 - a1
            for offset in range(a2 - a1):
                mine, theirs = quoted[a1 + offset], printed[b1 + offset]
                first = a1 + offset == 0 and flex_case
                if mine != theirs and not (first and lower_first(mine) == lower_first(theirs)):
                    found.append(f"'{mine}' for '{theirs}'")
        elif op == "replace":
            found.append(f"'{' '.join(quoted[a1:a2])}' for '{' '.join(printed[b1:b2])}'")
        elif op == "delete":
            found.append(f"added '{' '.join(quoted[a1:a2])}'")
        else:
            found.append(f"missing '{' '.join(printed[b1:b2])}'")
    return found, common


def closest_span(segments: list[Segment], doc: Document) -> tuple[int, int, float, float, list[str]] | None:
    """Align every segment near the longest one.

    Returns the span, the similarity, the share of quoted words found and the differences.
    """
    anchor = max(range(len(segments)), key=lambda i: len(segments[i].text))
    spans: dict[int, tuple[int, int] | None] = {anchor: align(segments[anchor].text, doc.text, 0, len(doc.text))}
    if spans[anchor] is None:
        return None
    previous = spans[anchor]
    for i in range(anchor + 1, len(segments)):
        limit = ELLIPSIS_MAX if segments[i].gap == "ell" else INSERTION_MAX
        lo = previous[1] if previous else 0
        spans[i] = align(segments[i].text, doc.text, lo, lo + limit + 2 * len(segments[i].text))
        previous = spans[i] or previous
    following = spans[anchor]
    for i in range(anchor - 1, -1, -1):
        limit = ELLIPSIS_MAX if segments[i + 1].gap == "ell" else INSERTION_MAX
        hi = following[0] if following else len(doc.text)
        spans[i] = align(segments[i].text, doc.text, hi - limit - 2 * len(segments[i].text), hi)
        following = spans[i] or following

    total = sum(len(s.text) for s in segments)
    score = 0.0
    common = 0
    differences: list[str] = []
    for i, segment in enumerate(segments):
        span = spans[i]
        if span is None:
            differences.append(f"added '{' '.join(quote_words(segment.text))}'")
            continue
        printed = doc.text[span[0] : span[1]]
        mine = lower_first(segment.text) if segment.flex_case else segment.text
        theirs = lower_first(printed) if segment.flex_case else printed
        score += len(segment.text) * fuzz.ratio(mine, theirs) / 100
        found, shared = word_differences(segment.text, printed, segment.flex_case)
        differences.extend(found)
        common += shared
    located = [s for s in spans.values() if s is not None]
    words = sum(len(quote_words(s.text)) for s in segments) or 1
    return min(s[0] for s in located), max(s[1] for s in located), score / total, common / words, differences
