"""Hypothesis strategies for the property tests: text that looks enough like a draft or a
bibliography to reach deep into the parsers, and small byte strings near real files."""

from __future__ import annotations

from hypothesis import strategies as st

#: Characters the parsers give meaning to, weighted in beside any Unicode character.
SYNTAX = [
    *"[]{}()@\\,;:.-–—&%#$~^_\"'=+*/<>!?`|\n\t 0123456789",
    "et al.",
    "and",
    "pp.",
    "p. ",
    "Okafor",
    "2019",
    "2019a",
    "\\cite",
    "\\citep",
    "{",
    "}",
    "@article{",
    "TY  - ",
    "ER  - ",
    "AU  - ",
    "\\bibitem",
    "\\entry",
    "References\n",
    "## References\n",
    "\n\n",
    "[1]",
    "[2-5]",
    "doi:10.1000/x",
    "\x1b",
    "\u202e",
    "\x00",
]

#: Text made of syntax pieces and arbitrary characters, up to a few hundred characters.
draft_text = st.lists(st.sampled_from(SYNTAX) | st.text(max_size=6), max_size=120).map("".join)


def mutated(seed: bytes) -> st.SearchStrategy[bytes]:
    """``seed`` with a few bytes overwritten, cut short, or arbitrary bytes instead."""

    def flip(data: bytes, edits: list[tuple[int, int]], cut: int) -> bytes:
        out = bytearray(data)
        for at, value in edits:
            out[at % len(out)] = value
        return bytes(out[: max(1, len(out) - cut)])

    edits = st.lists(st.tuples(st.integers(0, len(seed)), st.integers(0, 255)), max_size=8)
    return st.builds(flip, st.just(seed), edits, st.integers(0, 200)) | st.binary(max_size=400)
