"""Numbers in a claim that the cited passage does not bear out.

A claim's number is *found* when the evidence holds the same value (a percentage only as
a percentage), allowing for the rounding its written precision implies ("18%" matches a
source's "18.4%"; common practice, no source). A number that is not found is *different* when the
best passage holds another value of the same kind about the same thing, and *absent*
otherwise. The kind is a percentage, a year, or the word that follows the number
("412 nests"), so "23%" is never compared with "23 sites".
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from sourcecheck.index.tokens import s_stem, tokenize

_NUMBER = re.compile(
    r"(?<![\w.,])(?P<sign>[-−–]?)(?P<value>\d{1,3}(?:,\d{3})+(?:\.\d+)?|\d+(?:\.\d+)?|\.\d+)"
    r"(?P<pct>\s?(?:%|per\s?cent\b|percent\b))?"
)
# Words after which a number is a label, not a quantity ("Fig. 2", "Table 3").
_LABEL_WORDS = frozenset(
    [
        "fig",
        "figs",
        "figure",
        "figures",
        "table",
        "tables",
        "section",
        "sections",
        "eq",
        "equation",
        "chapter",
        "ch",
        "appendix",
    ]
)
_NEXT_WORD = re.compile(r"\s*([A-Za-zµμ][\w-]*)")
_WORD_BEFORE = re.compile(r"([A-Za-z]+)[\s.~(]*$")
# Spelled-out counts are written for small numbers (APA 7th ed. 6.32: words below ten;
# from memory); "twelve sites" and "12 sites" are the same quantity.
_SPELLED = {
    word: value
    for value, word in enumerate(
        [
            "zero",
            "one",
            "two",
            "three",
            "four",
            "five",
            "six",
            "seven",
            "eight",
            "nine",
            "ten",
            "eleven",
            "twelve",
            "thirteen",
            "fourteen",
            "fifteen",
            "sixteen",
            "seventeen",
            "eighteen",
            "nineteen",
            "twenty",
        ]
    )
}
_SPELLED_WORD = re.compile(r"\b(" + "|".join(_SPELLED) + r")\b(?=\s+[A-Za-z])", re.IGNORECASE)


@dataclass(frozen=True)
class Quantity:
    """A number as written, with what it counts and the words around it."""

    text: str
    value: float
    decimals: int
    kind: str
    context: frozenset[str]


def _kind(match: re.Match[str], text: str) -> str:
    if match.group("pct"):
        return "%"
    raw = match.group("value")
    if re.fullmatch(r"(1[6-9]|20)\d\d", raw):
        return "year"
    following = _NEXT_WORD.match(text, match.end())
    if following:
        return s_stem(following.group(1).lower())
    return ""


def quantities(text: str) -> list[Quantity]:
    """Every quantity in ``text`` (figure and table labels left out)."""
    found = []
    for match in _NUMBER.finditer(text):
        label = _WORD_BEFORE.search(text[max(0, match.start() - 16) : match.start()])
        if label and label.group(1).lower() in _LABEL_WORDS:
            continue
        raw = match.group("value").replace(",", "")
        decimals = len(raw.split(".")[1]) if "." in raw else 0
        value = float(raw) * (-1 if match.group("sign") in ("-", "−") and match.start() == 0 else 1)
        window = text[max(0, match.start() - 60) : match.end() + 60]
        found.append(
            Quantity(
                text=match.group(0).strip(),
                value=abs(value),
                decimals=decimals,
                kind=_kind(match, text),
                context=frozenset(t for t in tokenize(window) if not t[0].isdigit()),
            )
        )
    for match in _SPELLED_WORD.finditer(text):
        following = _NEXT_WORD.match(text, match.end())
        kind = s_stem(following.group(1).lower()) if following else ""
        if kind in _SPELLED or kind in ("of", "or", "and", "to"):
            continue  # "one of", "one or two": not a count of something
        window = text[max(0, match.start() - 60) : match.end() + 60]
        found.append(
            Quantity(
                text=match.group(0),
                value=float(_SPELLED[match.group(1).lower()]),
                decimals=0,
                kind=kind,
                context=frozenset(t for t in tokenize(window) if not t[0].isdigit()),
            )
        )
    return found


def same_value(a: Quantity, b: Quantity) -> bool:
    """Equal within the rounding of the less precise of the two written values."""
    tolerance = 0.5 * 10 ** -min(a.decimals, b.decimals)
    return abs(a.value - b.value) <= tolerance + 1e-9


def _same_family(a: Quantity, b: Quantity) -> bool:
    """Whether two values may be the same figure: both percentages, or neither.

    The word after a number is too narrow a test for *finding* it ("1119 adult bees" and
    "1119 bees" are one figure); it is kept for choosing a *counterpart* value.
    """
    return (a.kind == "%") == (b.kind == "%")


@dataclass(frozen=True)
class NumberFinding:
    """What became of one claim quantity in the evidence."""

    claim: Quantity
    counterpart: Quantity | None  # the passage's value for the same thing, when different


def unsupported_numbers(claim: str, best: str, others: list[str]) -> list[NumberFinding]:
    """Claim quantities found in none of the evidence passages, with counterparts if any.

    ``best`` is the top passage; ``others`` further passages of the same source, where a
    number may also be found. A counterpart is looked for in ``best`` only: it is the
    passage that speaks of the same thing as the claim.
    """
    evidence = [q for text in (best, *others) for q in quantities(text)]
    best_quantities = quantities(best)
    findings = []
    for wanted in quantities(claim):
        if any(_same_family(q, wanted) and same_value(q, wanted) for q in evidence):
            continue
        rivals = [q for q in best_quantities if q.kind == wanted.kind and wanted.kind]
        counterpart = max(rivals, key=lambda q: len(q.context & wanted.context), default=None)
        findings.append(NumberFinding(claim=wanted, counterpart=counterpart))
    return findings
