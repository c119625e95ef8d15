"""Showing untrusted text to a person: control characters made visible, never obeyed.

Claim text, file names and PDF text come from strangers. Printed raw, an ESC sequence can
recolour a terminal, retitle its window (OSC 0) or plant a link (OSC 8); a C1 control
(U+009B is a one-character CSI) does the same on some terminals; a bidirectional override
(U+202E) makes text read backwards; a newline in a file name splits a one-line problem in
two. Everything printed for a person goes through :func:`visible`; the JSON report keeps
the exact text.

Which characters: Unicode general category Cc (C0 and C1 controls, DEL) and the
bidirectional formatting characters of Unicode Standard Annex #9 (LRM, RLM, ALM, the
embeddings and overrides U+202A-U+202E, the isolates U+2066-U+2069). From memory of the
Unicode Standard; the category test is `unicodedata.category`.
"""

from __future__ import annotations

import unicodedata

#: Bidirectional formatting characters (UAX #9, "Explicit Directional ..." and marks).
BIDI_CONTROLS = frozenset("\u061c\u200e\u200f\u202a\u202b\u202c\u202d\u202e\u2066\u2067\u2068\u2069")


def _shown(char: str) -> str:
    code = ord(char)
    return f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}"


def visible(text: str, keep_newlines: bool = False) -> str:
    """``text`` with every control and bidi character written as an escape (``\\x1b``, ``\\u202e``).

    Tabs become a space; newlines are kept only when ``keep_newlines`` (a multi-line
    block), else escaped, so a line stays one line.
    """
    if text.isprintable() and not (BIDI_CONTROLS & set(text)):
        return text
    out = []
    for char in text:
        if char == "\n" and keep_newlines:
            out.append(char)
        elif char == "\t":
            out.append(" ")
        elif char in BIDI_CONTROLS or unicodedata.category(char) == "Cc":
            out.append(_shown(char))
        else:
            out.append(char)
    return "".join(out)
