"""The one sentence splitter every stage uses: pysbd with the text kept as given.

pysbd's rules keep "et al." and "Fig. 2" inside a sentence; ``clean=False`` keeps the text
exactly as written, so spans and passages quote the source and the draft verbatim. The
three readings below differ only in what they hand back (strings, spans in the text, spans
in a paragraph wrapped over lines), each for the stage that needs it.

pysbd's time grows faster than the square of a paragraph's length (measured 2026-12-02
on one paragraph of 250, 500 and 1,000 sentences: 0.7, 4.0 and 18.7 s), and a draft or a
PDF from a stranger may hold one paragraph of a megabyte. So a text longer than
:data:`WINDOW` characters is split window by window: pysbd reads a window, every sentence
but the window's last is kept, and the next window starts where that last sentence
starts, so each boundary is still pysbd's own, decided with the text after it in view.
A sentence longer than a window is cut at its last space inside the window. The time is
then linear in the text's length.
"""

from __future__ import annotations

import re
from functools import lru_cache

import pysbd

_CLOSES = re.compile(r"[.!?:;][\"'”’)\]]*$")

#: Characters pysbd reads at once. Long enough for any real sentence (a 2,000-character
#: sentence is about 300 words), short enough that a window takes milliseconds.
WINDOW = 2000


@lru_cache(maxsize=1)
def _segmenter() -> pysbd.Segmenter:
    return pysbd.Segmenter(language="en", clean=False)


def _pieces(text: str) -> list[str]:
    """pysbd's segments of ``text``, read window by window when it is long (see the module)."""
    if len(text) <= WINDOW:
        return list(_segmenter().segment(text))
    pieces: list[str] = []
    start = 0
    while start + WINDOW < len(text):
        window = text[start : start + WINDOW]
        kept = list(_segmenter().segment(window))[:-1]
        consumed = _consumed(window, kept)
        if consumed <= 0:  # one sentence fills the window: cut it at its last space
            space = window.rfind(" ", WINDOW // 2)
            consumed = space + 1 if space > 0 else WINDOW
            kept = [window[:consumed]]
        pieces.extend(kept)
        start += consumed
    pieces.extend(_segmenter().segment(text[start:]))
    return pieces


def _consumed(window: str, kept: list[str]) -> int:
    """How far into ``window`` the ``kept`` segments reach, found in order (0 when none are)."""
    cursor = 0
    for segment in kept:
        piece = segment.strip()
        at = window.find(piece, cursor) if piece else -1
        if at >= 0:
            cursor = at + len(piece)
    return cursor


def split_sentences(text: str) -> list[str]:
    """Sentences of ``text``, stripped, empties dropped."""
    return [s.strip() for s in _pieces(text) if s.strip()]


def wrapped_sentence_spans(text: str) -> list[tuple[int, int]]:
    """Character spans of the sentences of ``text``, whitespace trimmed.

    Line breaks are read as spaces, since a paragraph wrapped over lines is still one run
    of sentences; the spans refer to the original text. Cached: a draft's blocks are
    split once to check the sentence limit and once more for their claims.
    """
    return list(_wrapped_spans(text))


@lru_cache(maxsize=256)
def _wrapped_spans(text: str) -> tuple[tuple[int, int], ...]:
    flat = text.replace("\n", " ")
    spans: list[tuple[int, int]] = []
    cursor = 0
    for segment in _pieces(flat):
        piece = segment.strip()
        if not piece:
            continue
        start = flat.find(piece, cursor)
        if start < 0:  # pysbd changed the text; fall back to the running position
            start = cursor
        end = start + len(piece)
        spans.append((start, end))
        cursor = end
    return tuple(spans)


@lru_cache(maxsize=2048)
def sentence_spans(text: str) -> tuple[tuple[int, int], ...]:
    """Sentence spans located in ``text``, the last one running to its end.

    Never fails: pysbd raises on odd input now and then, and one sentence is a safe
    reading. Cached: the wording cues and the effect check both read the best passage's
    sentences.
    """
    try:
        sentences = _pieces(text)
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
