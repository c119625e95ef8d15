"""Which words of a passage are the claim's words, by the same tokens and stems the judge counts.

The HTML report marks them so a reader sees at a glance what the match rests on. A word
is marked when its token (lower-cased, NFKC-folded, plural folded by the S-stemmer of
:func:`sourcecheck.text.tokenize`) is one of the claim's content words: "nests" in the
passage lights up for "nest" in the claim, "the" never does (a stop word).
"""

from __future__ import annotations

import re
from collections.abc import Iterable

from sourcecheck.text import tokenize

# A run of letters or digits, with the decimal point kept inside a number ("0.05"), the
# shape tokenize() reads; everything between two runs is kept as unmarked text.
_WORD = re.compile(r"[^\W_]+(?:[.,]\d+)*")


def claim_words(claim: str) -> frozenset[str]:
    """The claim's content-word tokens, as the lexical coverage feature counts them."""
    return frozenset(tokenize(claim))


def segments(passage: str, wanted: frozenset[str]) -> list[tuple[str, bool]]:
    """``passage`` cut into (text, is a claim word) pieces that join back to the passage exactly.

    Claim words separated only by spaces form one marked piece ("nest entrances"), so the
    reader sees phrases rather than a dotted line of single words.
    """
    pieces: list[tuple[str, bool]] = []
    last = 0
    for match in _WORD.finditer(passage):
        pieces.append((passage[last : match.start()], False))
        tokens = tokenize(match.group())
        pieces.append((match.group(), bool(tokens) and all(t in wanted for t in tokens)))
        last = match.end()
    pieces.append((passage[last:], False))
    for i in range(1, len(pieces) - 1):  # a space between two marked words joins the mark
        if pieces[i - 1][1] and pieces[i + 1][1] and pieces[i][0].isspace():
            pieces[i] = (pieces[i][0], True)
    return _joined(p for p in pieces if p[0])


def _joined(pieces: Iterable[tuple[str, bool]]) -> list[tuple[str, bool]]:
    """Neighbouring pieces with the same mark as one, so the page holds few elements."""
    merged: list[tuple[str, bool]] = []
    for text, hit in pieces:
        if merged and merged[-1][1] == hit:
            merged[-1] = (merged[-1][0] + text, hit)
        else:
            merged.append((text, hit))
    return merged
