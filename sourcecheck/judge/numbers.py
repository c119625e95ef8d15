"""Numbers in a claim that the cited passage does not bear out.

Each number is read with what it measures: a unit (converted to SI base units, see
:mod:`sourcecheck.judge.units`), a percentage, percentage points, a fold change, a named
ratio (OR, HR, RR), a p-value with its comparator, a sample size (``n = 48``), a year, or
else the word that follows it ("412 nests"), so "23%" is never compared with "23 sites".

Matching rules (a claim quantity is *found* when one evidence quantity satisfies them):

- values are equal after conversion within the rounding of the less precise written value
  ("18%" covers 17.5–18.5; "1.2 × 10³" covers 1150–1250; common practice, no source);
- kinds must agree: percent only with percent (or a plainly stated proportion, "a
  proportion of 0.45"), percentage points, folds, each named ratio, p-values, a unit's
  dimension each only with their own; counts, sample sizes, years and bare numbers are one
  family, whatever word follows ("1,119 adult bees" is "1119 bees");
- a unit written once for a list or range applies to each number ("250 and 500 mg");
- a range matches a range with the same ends, or is found when both ends are; a single
  value matches a range's end, but a value inside a range is not a number the source states;
- "±" gives a spread: a claim's "4.2 mg" matches "4.2 ± 0.3 mg"; when both state a
  spread, the spreads must agree too;
- a bound ("p < 0.05") is found when the source's statement implies it ("p = 0.03",
  "p < 0.01"); a stated value ("p = 0.03") is not found in a bound ("p < 0.05");
- a sign counts only when both numbers carry one ("fell by 0.3" is "−0.3");
- a scale word multiplies ("1.2 million" is 1,200,000 and rounds to the nearest 0.1
  million), and an amount of money is its own kind per currency ("$5 billion" and "5
  billion dollars" are one figure; "€5 billion" is another kind).

A number not found is *different* when the best passage holds a value of the same kind
that contradicts it (no overlap; the one sharing most context words is named), and
*absent* otherwise. A comma is a decimal comma where it can be nothing else ("12,5",
"0,125", "3,14159"); before exactly three digits it is a thousands separator ("12,000").
"""

from __future__ import annotations

import math
import re
from collections.abc import Callable
from dataclasses import dataclass, replace
from functools import lru_cache

from sourcecheck.index.tokens import s_stem, tokenize
from sourcecheck.judge.units import Unit, read_unit

_SUPERSCRIPTS = "⁰¹²³⁴⁵⁶⁷⁸⁹"
_SUP_TO_ASCII = str.maketrans(_SUPERSCRIPTS + "⁻", "0123456789-")
_GROUP_SPACE = "\u00a0\u2009\u202f"  # no-break, thin, narrow no-break space (SI Brochure 5.4.4)
# A comma followed by one, two or four or more digits (or after a lone 0) can only be a
# decimal comma ("12,5 %", "0,125"): the SI Brochure allows the comma on the line as the
# decimal marker (9th ed., 5.4.2; from memory). Three digits after a comma ("12,500") stay
# a thousands group, the English reading.
_DECIMAL_COMMA = r"0,\d+(?![\d,])|\d+,\d{1,2}(?![\d,])|\d{1,3},\d{4,}(?![\d,])"  # not "2001,2003"
_DIGITS = (
    rf"(?:\d{{1,3}}(?:,\d{{3}})+(?![\d,])|{_DECIMAL_COMMA}|\d{{1,3}}(?:[{_GROUP_SPACE}]\d{{3}})+(?!\d)|\d+)"
    rf"(?:\.\d+)?|\.\d+"
)
_DECIMAL_COMMA_WHOLE = re.compile(_DECIMAL_COMMA)
# One number: a power of ten ("10^-4", "10⁻⁴"), or digits with an optional exponent
# ("1.2 × 10^3", "1.2×10³", "1.2 x 10-3", "1.2e-3"). A sign is a sign only before a digit
# and not after a word or number ("12-15" is a range, "COVID-19" a name).
_NUMBER = re.compile(
    rf"(?<![\w.,])(?P<sign>[-−+](?=\.?\d))?"
    rf"(?:10(?:(?:\^|\*\*)(?P<pexp>[-−]?\d+)|(?P<psup>⁻?[{_SUPERSCRIPTS}]+))"
    rf"|(?P<num>{_DIGITS})(?:\s?[×x·]\s?10(?:(?:\^|\*\*)(?P<exp>[-−+]?\d+)|(?P<sup>⁻?[{_SUPERSCRIPTS}]+)"
    rf"|(?P<dexp>[-−]\d+))|[eE](?P<eexp>[-+−]?\d+)(?!\w))?)"
)
_SPELLED_VALUES = (
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
)
_SPELLED = {word: float(value) for value, word in enumerate(_SPELLED_VALUES)} | {"a dozen": 12.0}
_SPELLED_WORD = re.compile(
    r"\b(?P<word>" + "|".join(sorted(_SPELLED, key=len, reverse=True)) + r")(?:(?P<fold>-?fold)\b|\b(?=\s+[A-Za-z]))",
    re.IGNORECASE,
)

# Words after which a number is a label, not a quantity ("Fig. 2", "Table 3", "pp. 201–205").
_LABEL_WORDS = frozenset(
    {
        "fig",
        "figs",
        "figure",
        "figures",
        "table",
        "tables",
        "section",
        "sections",
        "eq",
        "eqs",
        "equation",
        "equations",
        "chapter",
        "chapters",
        "ch",
        "appendix",
        "ref",
        "refs",
        "reference",
        "references",
        "p",
        "pp",
        "page",
        "pages",
        "vol",
        "volume",
        "no",
        "step",
        "model",
        "experiment",
        "study",
        "phase",
        "item",
    }
)
_WORD_BEFORE = re.compile(r"([A-Za-z]+)[\s.~(]*$")
_NEXT_WORD = re.compile(r"\s*([A-Za-zµμ][\w-]*)")
_REFERENCE_BRACKET = re.compile(r"\[\s*\d+(?:\s*[,–-]\s*\d+)*\s*\]")  # "[12]", "[3, 7]", "[3–5]"
_CLOCK = re.compile(r"(?<![\d:.])(?:\d{2}:[0-5]\d|\d:[0-5]\d(?=\s?(?:[ap]\.?m\.?|h)\b))(?![\d:])")

# What stands before a number and gives its kind.
_P_VALUE = re.compile(
    r"(?:\b[pP](?:[\s-]?values?)?\s*(?P<cmp><=|>=|=<|=>|[<>=≤≥⩽⩾])|\b[pP][\s-]?values?\s+(?:of|was|were|is))\s*$"
)
_SAMPLE_SIZE = re.compile(r"\b[nN]\s*=\s*$")
_RATIO_NAME = re.compile(
    r"(?P<name>(?i:\b(?:odds|hazard|risk|rate)\s+ratios?|\brelative\s+risks?|\bratios?)|\b(?:a?OR|a?HR|RR|IRR)\b)"
    r"\s*(?:\([A-Za-z]+\)\s*)?(?:(?i:of|was|were|is)\s+|[=:,]\s*)?$"
)
_RATIO_NAMES = {"odds": "OR", "or": "OR", "aor": "OR", "hazard": "HR", "hr": "HR", "ahr": "HR", "risk": "RR"}
_RATIO_NAMES |= {"relative": "RR", "rr": "RR", "rate": "IRR", "irr": "IRR", "ratio": "ratio", "ratios": "ratio"}
_STATISTIC = re.compile(
    r"(?<![\w])(?P<stat>r|R²|R\^?2|ρ|t|F|z|U|χ²|χ2|β|SD|SE|SEM)\s*(?:\(\s*\d+(?:\.\d+)?(?:\s*,\s*\d+(?:\.\d+)?)?\s*\))?"
    r"\s*[=:]\s*$"
)
_CI = re.compile(r"\bCI\b\s*[:=,]?\s*[\[(]?\s*$")
_PROPORTION = re.compile(
    r"(?i:\b(?:proportion|fraction|share|rate|prevalence|probability)\s+(?:of\s+|was\s+|were\s+|is\s+|=\s*|:\s*)?)$"
)
_COMPARATOR = re.compile(r"(?P<cmp><=|>=|[<>≤≥⩽⩾])\s*$")
_COMPARATORS = {"<=": "≤", "=<": "≤", ">=": "≥", "=>": "≥", "⩽": "≤", "⩾": "≥"}
_BETWEEN = re.compile(r"\bbetween\s+$", re.IGNORECASE)
_LETTER_HYPHEN = re.compile(r"[A-Za-z]-$")

# What follows a number and gives its kind.
_SPREAD = re.compile(r"\s?(?:±|\+/-|\+/−|\+-)\s?")
_POINTS = re.compile(r"\s?(?:(?:%|percent|per\s?cent)[\s-]?points?|percentage[\s-]points?|pp(?!\w)|p\.p\.)", re.I)
_BARE_POINTS = re.compile(r"\s(?:points?)\b")
_PERCENT_NEAR = re.compile(r"%|percent", re.IGNORECASE)
_PERCENT = re.compile(r"\s?(?:%|‰|per\s?cent\b|percent\b)", re.IGNORECASE)
_FOLD = re.compile(
    r"(?:\s?-?\s?fold\b|\s?[×x](?![\w])(?!\s*[-−]?[\d.])"
    r"|\s+times(?=\s+(?:higher|lower|greater|more|less|larger|smaller|as|faster|slower)\b))",
    re.IGNORECASE,
)
_RATIO = re.compile(r"\s?:\s?(?P<b>\d+(?:\.\d+)?)(?![\d:])")
_RANGE_DASH = re.compile(r"\s*[–—‒]\s*|-(?=[\d.−])|\s+to\s+")
_RANGE_AND = re.compile(r"\s+and\s+|\s*[–—‒]\s*|-(?=[\d.−])")
_RANGE_CI = re.compile(r"\s*[,;–—‒]\s*|-(?=[\d.−])|\s+to\s+")
_LIST_GAP = re.compile(r"\s*(?:,\s*(?:and\s+|or\s+)?|and\s+|or\s+|&\s*)$")
_CONTEXT_CHARS = 60
# "5 billion", "2.5 million dollars": a scale word multiplies the number before it. The
# short scale of current English usage (a billion is 10^9; Chicago Manual of Style, 17th
# ed., 9.24; from memory).
_SCALES = {"thousand": 1e3, "million": 1e6, "billion": 1e9, "trillion": 1e12}
_SCALE_WORDS = "|".join(_SCALES)
_SCALE_WORD = re.compile(rf"\s+(?P<word>{_SCALE_WORDS})\b", re.IGNORECASE)
# A currency written before the amount ("$5", "US$ 750", "€12"), or named after it.
_CURRENCY_BEFORE = re.compile(r"(?P<cur>US\$|\$|€|£|¥)\s?$")
_CURRENCY_SYMBOLS = {"US$": "$", "$": "$", "€": "€", "£": "£", "¥": "¥"}
_CURRENCY_WORDS = {"dollar": "$", "usd": "$", "euro": "€", "eur": "€", "gbp": "£", "yen": "¥", "jpy": "¥"}


@dataclass(frozen=True)
class Quantity:
    """A number as written, with what it measures and the words around it.

    ``value`` (and ``high``, ``spread``) are in the kind's base unit: SI base units for a
    unit ("5 mg" is 5e-6 kg), percent for a percentage or proportion. ``decimals`` is the
    written precision (negative for "1.2 × 10³": the rounding place is hundreds) and
    ``scale`` the base-unit size of one written unit, so the rounding is in base units too.
    """

    text: str
    value: float
    decimals: int
    kind: str
    context: frozenset[str]
    unit: str = ""  # as written: "mg/kg", "%", "fraction", "fold", "pp"; "" for counts
    high: float | None = None  # a range's upper end
    comparator: str = "="  # "<", "≤", ">", "≥" for a bound ("p < 0.05")
    spread: float | None = None  # the "± 0.3" part
    spread_decimals: int = 0
    scale: float = 1.0
    signed: bool = False  # written with "−" or "+"

    @property
    def tolerance(self) -> float:
        """Half a unit of the last written digit, in base units."""
        return 0.5 * 10.0**-self.decimals * self.scale


@dataclass
class _Number:
    """One number as read, before its kind is settled."""

    start: int
    end: int
    value: float
    decimals: int
    signed: bool
    plain_year: bool


@dataclass
class _Reading:
    """A quantity being assembled: number(s), prefix role and suffix unit."""

    start: int
    end: int
    low: _Number
    high: _Number | None = None
    spread: _Number | None = None
    comparator: str = "="
    role: str = ""  # "p-value", "n", "ratio:OR", "stat:r", "CI", "fraction" from the words before
    unit: Unit | None = None
    tag: str = ""  # "%", "pp", "fold", "ratio" from what follows
    divisor: float = 1.0  # "3:1"
    word: str = ""  # the word after, for counts
    multiplier: float = 1.0  # "million" after the number
    currency: str = ""  # "$", "€", "£", "¥"


def _read_number(match: re.Match[str]) -> _Number:
    sign = -1.0 if match.group("sign") in ("-", "−") else 1.0
    if match.group("num") is None:  # a bare power of ten
        exponent = int((match.group("pexp") or match.group("psup")).translate(_SUP_TO_ASCII).replace("−", "-"))
        return _Number(match.start(), match.end(), sign * 10.0**exponent, -exponent, bool(match.group("sign")), False)
    raw = match.group("num")
    decimal_comma = _DECIMAL_COMMA_WHOLE.fullmatch(raw) is not None
    digits = raw.replace(",", ".") if decimal_comma else re.sub(rf"[,{_GROUP_SPACE}]", "", raw)
    decimals = len(digits.split(".")[1]) if "." in digits else 0
    exponent_text = next((match.group(g) for g in ("exp", "sup", "dexp", "eexp") if match.group(g)), None)
    exponent = int(exponent_text.translate(_SUP_TO_ASCII).replace("−", "-")) if exponent_text else 0
    plain_year = exponent_text is None and re.fullmatch(r"(1[6-9]|20)\d\d", raw) is not None
    value = sign * float(digits) * 10.0**exponent
    return _Number(match.start(), match.end(), value, decimals - exponent, bool(match.group("sign")), plain_year)


def _role(text: str, start: int, value: float) -> tuple[str, str, int]:
    """(role, comparator, where the words that give them start) from the text before a number."""
    offset = max(0, start - 40)
    before = text[offset:start]
    if m := _P_VALUE.search(before):
        return "p-value", _COMPARATORS.get(m.group("cmp") or "=", m.group("cmp") or "="), offset + m.start()
    if m := _SAMPLE_SIZE.search(before):
        return "n", "=", offset + m.start()
    cmp_match = _COMPARATOR.search(before)
    comparator = _COMPARATORS.get(cmp_match.group("cmp"), cmp_match.group("cmp")) if cmp_match else "="
    if m := _RATIO_NAME.search(before):
        name = _RATIO_NAMES[m.group("name").split()[0].lower()]
        return ("ratio:" + name if name != "ratio" else "ratio"), comparator, offset + m.start()
    if m := _STATISTIC.search(before):
        name = m.group("stat").replace("^", "").replace("R2", "R²").replace("χ2", "χ²")
        return "stat:" + name, comparator, offset + m.start()
    if _CI.search(before):
        return "CI", comparator, start
    if _PROPORTION.search(before) and 0 <= value <= 1:
        return "fraction", comparator, start
    return "", comparator, offset + cmp_match.start() if cmp_match else start


def _read_suffix(text: str, reading: _Reading, pos: int) -> int:
    """Read what follows a number at ``pos`` into ``reading``; return where it ends."""
    if m := _SCALE_WORD.match(text, pos):
        reading.multiplier = _SCALES[m.group("word").lower()]
        pos = m.end()
    if m := _POINTS.match(text, pos):
        reading.tag = "pp"
        return m.end()
    if (m := _BARE_POINTS.match(text, pos)) and _PERCENT_NEAR.search(text, max(0, pos - 80), pos + 80):
        reading.tag = "pp"  # "3 points" reads as percentage points only beside a percentage
        return m.end()
    if m := _PERCENT.match(text, pos):
        reading.tag = "%"
        reading.unit = Unit("‰" if "‰" in m.group(0) else "%", 0.1 if "‰" in m.group(0) else 1.0, (0, 0, 0, 0, 0))
        return m.end()
    if m := _FOLD.match(text, pos):
        reading.tag = "fold"
        return m.end()
    if (m := _RATIO.match(text, pos)) and float(m.group("b")) > 0:
        reading.tag, reading.divisor = "ratio", float(m.group("b"))
        return m.end()
    if found := read_unit(text, pos):
        reading.unit = found[0]
        return found[1]
    if m := _NEXT_WORD.match(text, pos):
        reading.word = m.group(1)
    return pos


def _readings(text: str) -> list[_Reading]:
    skip = [m.span() for m in _REFERENCE_BRACKET.finditer(text)] + [m.span() for m in _CLOCK.finditer(text)]
    numbers = [m for m in _NUMBER.finditer(text) if not any(a <= m.start() < b for a, b in skip)]
    readings: list[_Reading] = []
    index = 0
    while index < len(numbers):
        match = numbers[index]
        index += 1
        first = _read_number(match)
        label = _WORD_BEFORE.search(text[max(0, first.start - 16) : first.start])
        is_label = bool(label and label.group(1).lower() in _LABEL_WORDS)
        if is_label or (_LETTER_HYPHEN.search(text, max(0, first.start - 2), first.start) and not first.plain_year):
            if index < len(numbers) and _RANGE_DASH.fullmatch(text, first.end, numbers[index].start()):
                index += 1  # "pp. 201–205": the whole range is the label
            continue
        role, comparator, opening = _role(text, first.start, first.value)
        reading = _Reading(opening, first.end, first, comparator=comparator, role=role)
        if not role and (money := _CURRENCY_BEFORE.search(text, max(0, first.start - 4), first.start)):
            reading.currency, reading.start = _CURRENCY_SYMBOLS[money.group("cur")], money.start()
        end = first.end
        if (spread := _SPREAD.match(text, end)) and index < len(numbers) and numbers[index].start() == spread.end():
            reading.spread = _read_number(numbers[index])
            index += 1
            end = reading.spread.end
        end = _read_suffix(text, reading, end)
        joiner = (
            _RANGE_CI
            if role == "CI"
            else _RANGE_AND
            if _BETWEEN.search(text, max(0, first.start - 12), first.start)
            else _RANGE_DASH
        )
        if (
            index < len(numbers)
            and reading.spread is None
            and reading.tag in ("", "%", "pp")
            and (gap := joiner.match(text, end))
            and gap.end() == numbers[index].start()
        ):
            second = _Reading(0, 0, _read_number(numbers[index]))
            index += 1
            end = _read_suffix(text, second, second.low.end)
            reading.high = second.low
            if reading.unit is None and reading.tag == "":
                reading.unit, reading.tag = second.unit, second.tag
            if reading.multiplier == 1.0:
                reading.multiplier = second.multiplier  # "2-3 million"
            reading.word = second.word  # "12 to 15 plots": the word after the range, never "to"
        reading.end = end
        readings.append(reading)
        while index < len(numbers) and numbers[index].start() < end:
            index += 1  # read as part of this quantity ("3:1")
    _share_list_units(text, readings)
    return readings


def _share_list_units(text: str, readings: list[_Reading]) -> None:
    """A unit written once for a list applies to each number: "250 and 500 mg", "5, 10 or 20%"."""
    for here, after in zip(reversed(readings[:-1]), reversed(readings[1:]), strict=True):
        bare = here.unit is None and not here.tag and not here.role and here.high is None
        if bare and after.unit is not None and _LIST_GAP.fullmatch(text, here.end, after.start):
            here.unit, here.tag = after.unit, after.tag


def _quantity(text: str, reading: _Reading) -> Quantity:
    low, high, unit = reading.low, reading.high, reading.unit
    scale, offset, unit_text = 1.0, 0.0, ""
    kind = reading.role
    if reading.role in ("p-value", "n", "ratio") or reading.role.startswith(("ratio:", "stat:")):
        pass
    elif reading.tag == "pp":
        kind, unit_text = "percentage point", "pp"
    elif reading.tag == "fold":
        kind, unit_text = "fold", "fold"
    elif reading.tag == "ratio":
        kind = "ratio"
    elif unit is not None:
        scale, offset, unit_text = unit.factor, unit.offset, unit.text
        kind = "%" if reading.tag == "%" else unit.kind
    elif reading.role == "fraction":
        kind, scale, unit_text = "%", 100.0, "fraction"
    elif reading.role == "CI":
        pass
    elif low.plain_year and (high is None or high.plain_year) and reading.multiplier == 1.0 and not reading.currency:
        kind = "year"
    else:
        kind = s_stem(reading.word.lower()) if reading.word else ""
        currency = reading.currency or _CURRENCY_WORDS.get(kind, "")
        if currency:  # "$5 billion" and "5 billion dollars" are one kind; "5 billion" alone a count
            kind, unit_text = "currency:" + currency, currency
    if reading.tag == "ratio":
        scale /= reading.divisor
    scale *= reading.multiplier
    decimals = min(low.decimals, high.decimals) if high else low.decimals
    window = text[max(0, reading.start - _CONTEXT_CHARS) : reading.end + _CONTEXT_CHARS]
    return Quantity(
        text=" ".join(text[reading.start : reading.end].split()),
        value=low.value * scale + offset,
        decimals=decimals,
        kind=kind,
        context=frozenset(t for t in tokenize(window) if not t[0].isdigit()),
        unit=unit_text,
        high=high.value * scale + offset if high else None,
        comparator=reading.comparator,
        spread=reading.spread.value * scale if reading.spread else None,
        spread_decimals=reading.spread.decimals if reading.spread else 0,
        scale=scale,
        signed=low.signed,
    )


def _spelled(text: str, free: Callable[[int, int], bool] = lambda a, b: True) -> list[Quantity]:
    """Spelled-out numbers up to twenty ("twelve sites", "five percent", "twofold")."""
    found = []
    for match in _SPELLED_WORD.finditer(text):
        if not free(match.start(), match.end()):
            continue
        value = _SPELLED[match.group("word").lower()]
        number = _Number(match.start(), match.end(), value, 0, False, False)
        reading = _Reading(match.start(), match.end(), number)
        if match.group("fold"):
            reading.tag = "fold"
        else:
            reading.end = _read_suffix(text, reading, match.end())
            stem = s_stem(reading.word.lower()) if reading.word else ""
            if not (reading.unit or reading.tag) and (stem in _SPELLED or stem in ("of", "or", "and", "to", "")):
                continue  # "one of", "one or two": not a count of something
        found.append(_quantity(text, reading))
    return found


def quantities(text: str) -> list[Quantity]:
    """Every quantity in ``text`` (figure, table, page and reference labels left out)."""
    return list(_cached_quantities(text))


_COUNT_WORD = r"(?:\d[\d,]*|" + "|".join(_SPELLED_VALUES[1:]) + r")"
# "one in five", "1 in 5 million", "three out of four": a proportion written as a ratio.
_ONE_IN = re.compile(
    rf"\b(?P<a>{_COUNT_WORD})\s+(?:in|out\s+of)\s+(?P<b>{_COUNT_WORD})(?:\s+(?P<mult>{_SCALE_WORDS}))?\b",
    re.IGNORECASE,
)


def _count(written: str) -> float:
    word = written.lower()
    return _SPELLED[word] if word in _SPELLED else float(written.replace(",", ""))


def _proportions(text: str) -> tuple[list[Quantity], list[tuple[int, int]]]:
    """Proportions written "one in five" (as a percentage), and the spans they take.

    The written ratio is a round figure for a rate ("one in five" for 19% to 21%), so it
    matches within 5% of its value (common practice, no source).
    """
    found, spans = [], []
    for match in _ONE_IN.finditer(text):
        a, b = _count(match.group("a")), _count(match.group("b"))
        b *= _SCALES.get((match.group("mult") or "").lower(), 1.0)
        if not b or a > b:
            continue  # "12 in 10 sites" is no proportion
        percent = 100.0 * a / b
        window = text[max(0, match.start() - _CONTEXT_CHARS) : match.end() + _CONTEXT_CHARS]
        found.append(
            Quantity(
                text=match.group(0),
                value=percent,
                decimals=0,
                kind="%",
                context=frozenset(t for t in tokenize(window) if not t[0].isdigit()),
                unit="%",
                scale=percent / 10.0,
            )
        )
        spans.append((match.start(), match.end()))
    return found, spans


@lru_cache(maxsize=2048)
def _cached_quantities(text: str) -> tuple[Quantity, ...]:
    """Passages come back for several claims (and the better-source search): read each once."""
    proportions, spans = _proportions(text)

    def free(start: int, end: int) -> bool:
        return not any(start < b and a < end for a, b in spans)

    readings = [_quantity(text, r) for r in _readings(text) if free(r.start, r.end)]
    return (*readings, *_spelled(text, free), *proportions)


def _family(q: Quantity) -> str:
    """What a quantity may be compared with: its kind, or "count" for counts and bare numbers."""
    special = q.unit or q.kind in ("p-value", "CI", "ratio") or q.kind.startswith(("ratio:", "stat:"))
    return q.kind if special else "count"


def _close(a: float, b: float, tolerance: float) -> bool:
    return abs(a - b) <= tolerance + 1e-9 * max(abs(a), abs(b), tolerance)


def same_value(a: Quantity, b: Quantity) -> bool:
    """Equal within the rounding of the less precise of the two written values.

    A sign counts only when both carry one: "fell by 0.3" and "−0.3" are the same figure.
    """
    tolerance = max(a.tolerance, b.tolerance)
    if _close(a.value, b.value, tolerance):
        return True
    lenient = not (a.signed and b.signed) and a.kind != "temperature"
    return lenient and _close(abs(a.value), abs(b.value), tolerance)


def _at(q: Quantity, value: float) -> Quantity:
    return replace(q, value=value, high=None, spread=None)


def _implies(source: Quantity, claim: Quantity) -> bool:
    """Whether the source's statement implies the claim's bound ("p = 0.03" implies "p < 0.05")."""
    if claim.comparator in ("<", "≤"):
        if source.comparator in (">", "≥"):
            return False
        edge, bound, open_edge = (source.high if source.high is not None else source.value), claim.value, "<"
    else:  # the mirror image: a lower bound
        if source.comparator in ("<", "≤"):
            return False
        edge, bound, open_edge = -source.value, -claim.value, ">"
    if _close(edge, bound, 0.0):  # "p < 0.05" implies "p < 0.05" and "p ≤ 0.05"; "p = 0.05" only "≤"
        return claim.comparator in ("≤", "≥") or source.comparator == open_edge
    return edge < bound


def _found_in(claim: Quantity, source: Quantity) -> bool:
    if _family(claim) != _family(source):
        return False
    if claim.comparator != "=":
        return _implies(source, claim)
    if source.comparator != "=":
        return False  # a bound does not state a value
    if not _same_spread(claim, source):
        return False
    if claim.high is None:
        return same_value(claim, source) or (source.high is not None and same_value(claim, _at(source, source.high)))
    return (
        source.high is not None
        and same_value(claim, source)
        and same_value(_at(claim, claim.high), _at(source, source.high))
    )


def _is_found(claim: Quantity, evidence: list[Quantity]) -> bool:
    if any(_found_in(claim, q) for q in evidence):
        return True
    if claim.high is not None and claim.comparator == "=":  # a range whose ends are both stated
        ends = (_at(claim, claim.value), _at(claim, claim.high))
        return all(any(_found_in(end, q) for q in evidence) for end in ends)
    return False


def _interval(q: Quantity) -> tuple[float, float]:
    """The values a statement allows, before rounding: a bound is open on one side."""
    if q.comparator in ("<", "≤"):
        return -math.inf, q.value
    if q.comparator in (">", "≥"):
        return q.value, math.inf
    return q.value, q.high if q.high is not None else q.value


def _same_spread(a: Quantity, b: Quantity) -> bool:
    """Whether two "±" parts agree, within the rounding of the coarser one (True if either lacks one)."""
    if a.spread is None or b.spread is None:
        return True
    tolerance = 0.5 * 10.0 ** -min(a.spread_decimals, b.spread_decimals) * max(a.scale, b.scale)
    return _close(a.spread, b.spread, tolerance)


def _contradicts(claim: Quantity, source: Quantity) -> bool:
    """Whether two values of one kind cannot both be true: their intervals (or spreads) differ.

    Two ranges contradict unless their ends agree: "12–16 mg" is not "12–15 mg".
    """
    if claim.high is not None and source.high is not None and claim.comparator == source.comparator == "=":
        return not _found_in(claim, source)  # two ranges: the same ends or a different range
    (a_low, a_high), (b_low, b_high) = _interval(claim), _interval(source)
    gap = max(a_low, b_low) - min(a_high, b_high)
    rounding = max((q.tolerance for q in (claim, source) if q.comparator == "="), default=0.0)
    return not _close(max(gap, 0.0), 0.0, rounding) or not _same_spread(claim, source)


@dataclass(frozen=True)
class NumberFinding:
    """What became of one claim quantity in the evidence."""

    claim: Quantity
    counterpart: Quantity | None  # the passage's value for the same thing, when different


def unsupported_numbers(claim: str, best: str, others: list[str]) -> list[NumberFinding]:
    """Claim quantities found in none of the evidence passages, with counterparts if any.

    ``best`` is the top passage; ``others`` further passages of the same source, where a
    number may also be found. A counterpart is looked for in ``best`` only: it is the
    passage that speaks of the same thing as the claim. A counterpart has the claim's kind
    and contradicts it; a value the passage leaves possible ("13 mg" within "12–15 mg",
    "p = 0.03" under "p < 0.05") is no counterpart, so the number is reported absent.
    """
    best_quantities = quantities(best)
    evidence = best_quantities + [q for text in others for q in quantities(text)]
    findings = []
    for wanted in quantities(claim):
        if _is_found(wanted, evidence):
            continue
        rivals = [q for q in best_quantities if wanted.kind and q.kind == wanted.kind and _contradicts(wanted, q)]
        counterpart = max(rivals, key=lambda q: len(q.context & wanted.context), default=None)
        findings.append(NumberFinding(claim=wanted, counterpart=counterpart))
    return findings


def in_claim_unit(claim: Quantity, counterpart: Quantity) -> str:
    """The counterpart restated in the claim's unit ("= 0.45 g") when the two units differ.

    A reader comparing "0.5 g" with "450 mg" should not have to convert; temperatures are
    left as written (their scales have offsets, and the difference is plain).
    """
    units = {claim.unit, counterpart.unit}
    if not claim.unit or not counterpart.unit or len(units) == 1 or units & {"°C", "K", "fraction", "%"}:
        return ""
    if claim.kind != counterpart.kind or not claim.scale:
        return ""
    return f" (= {counterpart.value / claim.scale:.4g} {claim.unit})"
