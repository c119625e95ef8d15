"""Character-level normalisation of extracted PDF text.

Full NFKC would fold the ligatures we want folded, but it also rewrites characters whose
form carries meaning in a paper: the micro sign "µ" becomes Greek mu, "½" becomes "1⁄2",
superscript "²" becomes "2" (so "m²" reads "m2"). So we apply NFC (which only composes
accents: "e" + U+0301 -> "é") and then an explicit table of the compatibility characters
that only hurt matching: typographic ligatures, exotic spaces, zero-width marks and
hyphen look-alikes. Everything else (±, µ, –, —, −, quotes) is kept as printed.
"""

from __future__ import annotations

import re
import unicodedata

SOFT_HYPHEN = "\u00ad"

_TABLE = str.maketrans(
    {
        # Alphabetic presentation forms (Unicode block FB00-FB06): Latin ligatures.
        "\ufb00": "ff",
        "\ufb01": "fi",
        "\ufb02": "fl",
        "\ufb03": "ffi",
        "\ufb04": "ffl",
        "\ufb05": "st",
        "\ufb06": "st",
        # Spaces that are not U+0020.
        "\u00a0": " ",
        "\u2002": " ",
        "\u2003": " ",
        "\u2004": " ",
        "\u2005": " ",
        "\u2006": " ",
        "\u2007": " ",
        "\u2008": " ",
        "\u2009": " ",
        "\u200a": " ",
        "\u202f": " ",
        "\u205f": " ",
        "\u3000": " ",
        "\t": " ",
        # Zero-width characters and the byte-order mark.
        "\u200b": None,
        "\u200c": None,
        "\u200d": None,
        "\u2060": None,
        "\ufeff": None,
        # Hyphen and non-breaking hyphen: the same letter as ASCII "-" for our purposes.
        "\u2010": "-",
        "\u2011": "-",
        "\r": "\n",
        "\f": "\n",
        "\v": "\n",
    }
)
_CONTROL = re.compile(r"[\x00-\x08\x0e-\x1f\x7f]")


def normalize_chars(text: str) -> str:
    """Compose accents, fold ligatures and odd spaces, drop control characters.

    Soft hyphens are left in place: whether they mark a line-end break is decided by
    :func:`sourcecheck.sources._lines.join_lines`.
    """
    text = unicodedata.normalize("NFC", text).translate(_TABLE)
    return _CONTROL.sub("", text)
