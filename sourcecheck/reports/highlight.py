"""Which words of a passage are the claim's words, by the same tokens and stems the judge counts.

The HTML report marks them so a reader sees at a glance what the match rests on. A word
is marked when its token (lower-cased, NFKC-folded, plural folded by the S-stemmer of
:func:`sourcecheck.text.tokenize`) is one of the claim's content words: "nests" in the
passage lights up for "nest" in the claim, "the" never does (a stop word).
"""

from __future__ import annotations

import re

from sourcecheck.text import tokenize

# A run of letters or digits, with the decimal point kept inside a number ("0.05"), the
# shape tokenize() reads; everything between two runs is kept as unmarked text.
_WORD = re.compile(r"[^\W_]+(?:[.,]\d+)*")


def claim_words(claim: str) -> frozenset[str]:
    """The claim's content-word tokens, as the lexical coverage feature counts them."""
    return frozenset(tokenize(claim))


def segments(passage: str, wanted: frozenset[str]) -> list[tuple[str, bool]]:
    """``passage`` cut into (text, is a claim word) pieces that join back to the passage exactly."""
    pieces: list[tuple[str, bool]] = []
    last = 0
    for match in _WORD.finditer(passage):
        tokens = tokenize(match.group())
        hit = bool(tokens) and all(t in wanted for t in tokens)
        if match.start() > last:
            pieces.append((passage[last : match.start()], False))
        if hit and pieces and pieces[-1][1] is False and pieces[-1][0].isspace() and len(pieces) > 1 and pieces[-2][1]:
            pieces[-2:] = [(pieces[-2][0] + pieces[-1][0] + match.group(), True)]  # one mark per run of words
        else:
            pieces.append((match.group(), hit))
        last = match.end()
    if last < len(passage):
        pieces.append((passage[last:], False))
    return _merge_plain(pieces)


def _merge_plain(pieces: list[tuple[str, bool]]) -> list[tuple[str, bool]]:
    """Adjacent unmarked pieces as one, so the page holds few text nodes."""
    merged: list[tuple[str, bool]] = []
    for text, hit in pieces:
        if merged and not hit and not merged[-1][1]:
            merged[-1] = (merged[-1][0] + text, False)
        else:
            merged.append((text, hit))
    return merged
