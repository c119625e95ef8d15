"""Cutting one reference entry into whitespace tokens with character offsets.

Labelled reference data split entries only at spaces (a label never starts inside a word),
so a token is a run of non-space characters. The punctuation glued to a token ("(2019).",
"Okafor,", "“Title") carries much of the structure of an entry; rather than splitting it
off into tokens of its own, it is kept beside the bare word as ``lead`` and ``trail`` and
turned into features (the ParsCit design: Councill, Giles and Kan 2008).
"""

from __future__ import annotations

import re
from dataclasses import dataclass

_TOKEN_RE = re.compile(r"\S+")
# Leading and trailing characters that are neither letters nor digits.
_EDGES_RE = re.compile(r"^(?P<lead>[\W_]*)(?P<core>.*?)(?P<trail>[\W_]*)$", re.DOTALL)


@dataclass(frozen=True)
class Token:
    """One token: its text, its place in the entry and the punctuation around its word."""

    text: str
    start: int
    end: int
    lead: str
    core: str
    trail: str


def tokenize(text: str) -> list[Token]:
    """Whitespace tokens of ``text``, each with offsets and its punctuation split off.

    A token of punctuation alone ("&", "–") has an empty ``core`` and its characters in
    ``lead``.
    """
    tokens: list[Token] = []
    for match in _TOKEN_RE.finditer(text):
        edges = _EDGES_RE.match(match.group(0))
        assert edges is not None  # the pattern matches every string
        tokens.append(Token(match.group(0), match.start(), match.end(), edges["lead"], edges["core"], edges["trail"]))
    return tokens
