"""The source text a quotation is looked for in: pages joined, normalised, offsets kept.

Normalising (ligatures, quotation marks, dashes, invisible characters, line-end hyphens,
spaces) is done once per source, with a map back to the original characters, so a
finding quotes the source as printed.
"""

from __future__ import annotations

import re
from bisect import bisect_right
from collections.abc import Callable
from dataclasses import dataclass
from functools import lru_cache

#: How much omitted text an ellipsis may stand for, and a bracketed insertion replace.
ELLIPSIS_MAX = 3000
INSERTION_MAX = 60
WORD = re.compile(r"[^\W_]+(?:'[^\W_]+)*")

_LIGATURES = {"ﬀ": "ff", "ﬁ": "fi", "ﬂ": "fl", "ﬃ": "ffi", "ﬄ": "ffl", "ﬅ": "st", "ﬆ": "st"}
_QUOTE_MARKS = "'\"‘’‚‛′″“”„‟«»‹›`´"
_DASH_MARKS = "‐‑‒–—―−"
_FOLD = str.maketrans(
    {
        **dict.fromkeys(_QUOTE_MARKS, "'"),
        **dict.fromkeys(_DASH_MARKS, "-"),
        **dict.fromkeys("\t\v\f\u00a0\u2002\u2003\u2009\u202f\u3000", " "),
        "\r": "\n",
    }
)
_LIGATURE = re.compile("[" + "".join(_LIGATURES) + "]")
_INVISIBLE = re.compile("[\u00ad\u200b\u200c\u200d\u2060\ufeff]")
_LINE_END_HYPHEN = re.compile(r"(?<=[^\W\d_])[-‐‑][ \t]*\n\s*(?=[^\W\d_])")
_DASH_RUN = re.compile(r"\s*-+\s*")
_SPACES = re.compile(r"\s+")


@dataclass(frozen=True)
class Segment:
    """A run of quoted words between two omissions, and how it joins the run before it."""

    text: str
    gap: str | None = None  # "ell" or "ins": what separates it from the previous segment
    word_before: bool = False  # the previous segment must end at a word boundary
    word_after: bool = False  # this segment must start at a word boundary
    flex_case: bool = False  # its first letter may differ in case


@dataclass(frozen=True)
class Document:
    """A source's pages joined and normalised, with the way back to pages and raw text."""

    text: str
    origin: tuple[int, ...]  # index in ``raw`` of each character of ``text``
    raw: str
    page_starts: tuple[int, ...]
    page_numbers: tuple[int, ...]

    def page_at(self, index: int) -> int | None:
        if not self.page_numbers or not self.text:
            return None
        raw_index = self.origin[min(index, len(self.origin) - 1)]
        return self.page_numbers[bisect_right(self.page_starts, raw_index) - 1]

    def shown(self, start: int, end: int) -> str:
        """The raw source text behind ``text[start:end]`` (widened to whole words), repaired but not folded."""
        while start > 0 and self.text[start - 1].isalnum():
            start -= 1
        while end < len(self.text) and self.text[end].isalnum():
            end += 1
        raw = self.raw[self.origin[start] : self.origin[end - 1] + 1]
        return normalise(raw, fold=False)[0]


# --- normalisation ---------------------------------------------------------------------


def resub(
    pattern: re.Pattern[str], repl: Callable[[re.Match[str]], str], text: str, origin: list[int]
) -> tuple[str, list[int]]:
    """``pattern.sub`` that keeps, for every output character, the index it came from."""
    pieces: list[str] = []
    mapped: list[int] = []
    pos = 0
    for match in pattern.finditer(text):
        pieces.append(text[pos : match.start()])
        mapped.extend(origin[pos : match.start()])
        new = repl(match)
        pieces.append(new)
        mapped.extend([origin[match.start()]] * len(new))
        pos = match.end()
    if not pieces:
        return text, origin
    pieces.append(text[pos:])
    mapped.extend(origin[pos:])
    return "".join(pieces), mapped


def normalise(text: str, fold: bool = True) -> tuple[str, list[int]]:
    """Repair ``text`` (see the module docstring) and map each output char to its input index.

    With ``fold`` false only the repairs a reader would not notice are made (ligatures,
    hyphenation, spacing), which is what a displayed span should look like.
    """
    origin = list(range(len(text)))
    if fold:
        text = text.translate(_FOLD)
    text, origin = resub(_INVISIBLE, lambda m: "", text, origin)
    text, origin = resub(_LIGATURE, lambda m: _LIGATURES[m.group()], text, origin)
    text, origin = resub(_LINE_END_HYPHEN, lambda m: "", text, origin)
    if fold:
        text, origin = resub(_DASH_RUN, lambda m: "-", text, origin)
    text, origin = resub(_SPACES, lambda m: " ", text, origin)
    lead = len(text) - len(text.lstrip(" "))
    text = text.strip(" ")
    return text, origin[lead : lead + len(text)]


@lru_cache(maxsize=16)
def document(pages: tuple[tuple[int, str], ...]) -> Document:
    """Normalise a source once, however many claims quote it."""
    starts: list[int] = []
    pos = 0
    for _, page_text in pages:
        starts.append(pos)
        pos += len(page_text) + 1
    raw = "\n".join(page_text for _, page_text in pages)
    text, origin = normalise(raw)
    return Document(text, tuple(origin), raw, tuple(starts), tuple(number for number, _ in pages))


def quote_words(text: str) -> list[str]:
    """The words of ``text``, apostrophes kept inside them."""
    return WORD.findall(text)
