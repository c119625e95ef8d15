"""Turning LaTeX-coded field values ("M{\\"u}ller", "{DNA} repair -- a review") into plain text.

Titles and names in .bib and .bbl files are written for TeX, but they are matched against
the text of PDFs and shown in reports, so they must read as what TeX would print.
bibtexparser's ``latex_to_unicode`` knows the accents; it does not know dashes, ties,
quotes or text macros, and it reads ``\\ldots`` as ``\\l`` + "dots". Those are handled
here, around it.
"""

from __future__ import annotations

import re
import unicodedata
from functools import lru_cache

from bibtexparser.latexenc import latex_to_unicode

from sourcecheck.drafts.latex.commands import SYMBOLS

# Control words that bibtexparser turns into letters or accents: left for it.
_ACCENT_WORDS = frozenset("c v u H k r d b t".split())  # noqa: SIM905
_LETTER_WORDS = frozenset("l L o O ss ae AE oe OE aa AA i j".split())  # noqa: SIM905
# Control words that print a symbol or a word: the LaTeX reader's table (one table for
# both readers), plus the math letters and biblatex delimiters that bibliographies hold.
_SYMBOLS = {
    **SYMBOLS,
    "times": "×",
    "pm": "±",
    "alpha": "α",
    "beta": "β",
    "gamma": "γ",
    "delta": "δ",
    "mu": "μ",
    "pi": "π",
    "sigma": "σ",
    "newblock": " ",
    "par": " ",
    "quad": " ",
    "qquad": " ",
    "space": " ",
    "bibinitperiod": ".",
    "bibinitdelim": " ",
    "bibnamedelima": " ",
    "bibnamedelimb": " ",
    "bibnamedelimc": " ",
    "bibnamedelimd": " ",
    "bibnamedelimi": " ",
    "bibrangedash": "–",
    "bibdatedash": "–",
}
# Macros whose argument is not printed at all ("{\\noopsort{a}}Zeta" sorts Zeta first).
_HIDDEN_RE = re.compile(r"\\(?:noopsort|sortname|hspace|vspace|href)\*?\s*\{(?:[^{}]|\{[^{}]*\})*\}|\\penalty\s*-?\d+")

_CONTROL_WORD_RE = re.compile(r"\\([A-Za-z]+)\*?\s*")
_ESCAPES = {"&": "&", "%": "%", "$": "\x01", "#": "#", "_": "_", "{": "\x02", "}": "\x03", " ": " "}
_ESCAPE_RE = re.compile(r"\\([&%$#_{} ])")
# One accent or letter command with its argument: "\\\"{o}", "\\'e", "\\c{c}", "\\v S", "\\ss".
_ACCENT_RE = re.compile(
    r"\\[`'^\"~=.]\s*(?:\{[^{}]*\}|[A-Za-z])"
    r"|\\[cvuHkrdbt](?:\s*\{[^{}]*\}|\s+[A-Za-z])"
    r"|\\(?:ss|ae|AE|oe|OE|aa|AA|[oOlLij])(?![A-Za-z])"
)
_RESTORE = str.maketrans({"\x01": "$", "\x02": "{", "\x03": "}"})


def latex_to_text(value: str) -> str:
    """Plain Unicode text of a LaTeX-coded value, on one line.

    Accents become letters ("{\\"o}" -> "ö"), "--" and "---" dashes, "~" a space,
    quotes curly, text macros such as ``\\emph{x}`` their argument, and protective braces
    ("{DNA}") disappear.
    """
    if not value:
        return ""
    text = value.replace("\\\\", " ")
    text = _ESCAPE_RE.sub(lambda m: _ESCAPES[m.group(1)], text)
    text = _HIDDEN_RE.sub("", text)
    text = re.sub(r"\\(?:url|doi|nolinkurl)\s*\{([^{}]*)\}", lambda m: m.group(1).replace("~", "\x04"), text)
    text = re.sub(r"\\[,;:!/@-]", lambda m: " " if m.group(0) in {"\\,", "\\;", "\\:"} else "", text)
    text = _CONTROL_WORD_RE.sub(_control_word, text)
    text = text.replace("---", "—").replace("--", "–")
    text = text.replace("``", "“").replace("''", "”")
    text = re.sub(r"(?<!\\)~", " ", text).replace("\x04", "~")
    text = text.replace("$", "")
    text = _ACCENT_RE.sub(lambda m: _accent(m.group(0)), text)
    text = text.replace("{", "").replace("}", "").translate(_RESTORE)
    text = unicodedata.normalize("NFC", text)
    return " ".join(text.split())


@lru_cache(maxsize=4096)
def _accent(piece: str) -> str:
    """bibtexparser's reading of one accent command.

    Its ``latex_to_unicode`` walks a table of a thousand forms on every call, so it is given
    only the short command, and the answers for the few dozen accents in use are kept.
    """
    piece = re.sub(r"^(\\(?:[cvuHkrdbt]|[`'^\"~=.]))\s*([A-Za-z])$", r"\1{\2}", piece)  # "\c c" as "\c{c}"
    return latex_to_unicode(piece)


def _control_word(match: re.Match[str]) -> str:
    """A control word with what follows it: kept for accents, mapped, or removed."""
    name = match.group(1)
    if name in _ACCENT_WORDS:
        return match.group(0)
    if name in _LETTER_WORDS:
        # A letter command ends at the space after it ("\o ster" is "øster"); "\i" is a
        # dotless i only to carry an accent, so "\'{\i}" must come out as "í".
        return "i" if name == "i" else f"\\{name}{{}}"
    if name in _SYMBOLS:
        # TeX would swallow the space after "\ldots"; a reader would not, so it is kept.
        space = " " if match.group(0)[-1:].isspace() else ""
        return _SYMBOLS[name] + space
    return ""  # a text macro (\emph, \textit) or an unknown one: its argument is printed
