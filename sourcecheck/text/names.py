"""Personal-name helpers shared by marker parsing, entry parsing and resolution.

Markers and reference entries spell the same author differently ("van der Berg" and
"Van der Berg", "Ólafsdóttir" and "Olafsdottir"), so every comparison goes through one
folding step here instead of each module inventing its own.
"""

from __future__ import annotations

import re
import unicodedata

# Lower-case particles that belong to a family name but are dropped when comparing
# names ("van der Berg" is filed under "Berg" in some lists and under "van" in others).
PARTICLES: frozenset[str] = frozenset(
    "van von der den de del della des di da dos das du la le ter ten bin ibn al el zu vom zum".split()  # noqa: SIM905
)

# A regex character class of upper-case letters (Latin, Greek, Cyrillic). The standard
# ``re`` module has no \p{Lu}; building the class from str.isupper keeps accents such as
# "Ó" or "Ž" without a hand-typed list.
UPPER_CLASS: str = "[" + "".join(re.escape(chr(c)) for c in range(0x41, 0x530) if chr(c).isupper()) + "]"

# One word of a family name: starts upper-case (optionally after "O'", "d'", "al-"),
# may hold hyphens and apostrophes between letters ("Nguyen-Hall", "O'Neil").
NAME_WORD: str = r"(?:(?:[a-z]{1,2}['’\-]))?" + UPPER_CLASS + r"[^\W\d_]*(?:['’\-][^\W\d_]+)*"
PARTICLE_RE: str = r"(?:(?i:" + "|".join(sorted(PARTICLES, key=len, reverse=True)) + r")\s+)"
# A family name as written in running text: particles, then one capitalised word.
FAMILY: str = PARTICLE_RE + "*" + NAME_WORD


# Letters NFKD does not decompose but readers treat as plain ones.
_UNDECOMPOSED = str.maketrans(
    {"ø": "o", "Ø": "O", "ł": "l", "Ł": "L", "đ": "d", "Đ": "D", "ß": "ss", "æ": "ae"}
    | {"Æ": "AE", "œ": "oe", "Œ": "OE", "þ": "th", "ð": "d", "ı": "i"}
)


def fold(text: str) -> str:
    """Lower-case, accent-free form of ``text`` so "Ólafsdóttir" equals "olafsdottir"."""
    decomposed = unicodedata.normalize("NFKD", text)
    stripped = "".join(ch for ch in decomposed if not unicodedata.combining(ch))
    stripped = stripped.translate(_UNDECOMPOSED)
    return stripped.casefold()


def family_key(name: str) -> str:
    """Comparison key of a family name: folded, particles dropped, no spaces or hyphens.

    "van der Berg", "Van der Berg" and "Berg" give the same key; "Nguyen-Hall" and
    "Nguyen Hall" do too.
    """
    words = [w for w in re.split(r"\s+", fold(name).strip()) if w]
    while len(words) > 1 and words[0] in PARTICLES:
        words = words[1:]
    joined = "".join(words)
    # Attached particles such as "al-" or "d'" before a capitalised word.
    joined = re.sub(r"^(?:al|el|d|l)['’\-](?=\w)", "", joined)
    return re.sub(r"[^a-z0-9]", "", joined)


def ascii_slug(name: str) -> str:
    """Lower-case ASCII letters of the whole name, particles kept: "van der Berg" -> "vanderberg".

    Used for generated reference keys, where readability beats comparison tolerance.
    """
    return re.sub(r"[^a-z]", "", fold(name))
