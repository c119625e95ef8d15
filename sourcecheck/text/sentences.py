"""The one sentence splitter every stage uses: pysbd with the text kept as given.

pysbd's rules keep "et al." and "Fig. 2" inside a sentence; ``clean=False`` keeps the text
exactly as written, so spans and passages quote the source and the draft verbatim. The
three readings below differ only in what they hand back (strings, spans in the text, spans
in a paragraph wrapped over lines), each for the stage that needs it.
"""

from __future__ import annotations

import re
from functools import lru_cache

import pysbd

_CLOSES = re.compile(r"[.!?:;][\"'”’)\]]*$")


@lru_cache(maxsize=1)
def _segmenter() -> pysbd.Segmenter:
    return pysbd.Segmenter(language="en", clean=False)


def split_sentences(text: str) -> list[str]:
    """Sentences of ``text``, stripped, empties dropped."""
    return [s.strip() for s in _segmenter().segment(text) if s.strip()]


def wrapped_sentence_spans(text: str) -> list[tuple[int, int]]:
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


@lru_cache(maxsize=2048)
def sentence_spans(text: str) -> tuple[tuple[int, int], ...]:
    """Sentence spans located in ``text``, the last one running to its end.

    Never fails: pysbd raises on odd input now and then, and one sentence is a safe
    reading. Cached: the wording cues and the effect check both read the best passage's
    sentences.
    """
    try:
        sentences = _segmenter().segment(text)
    except Exception:
        return ((0, len(text)),)
    spans, cursor = [], 0
    for sentence in sentences:
        piece = sentence.strip()
        at = text.find(piece, cursor) if piece else -1
        if at < 0:
            continue
        spans.append((at, at + len(piece)))
        cursor = at + len(piece)
    if not spans:
        return ((0, len(text)),)
    spans[-1] = (spans[-1][0], len(text))
    return tuple(spans)


def ends_sentence(text: str) -> bool:
    """Whether ``text`` ends as a sentence does (closing punctuation, maybe a quote or bracket)."""
    return bool(_CLOSES.search(text.rstrip()))
