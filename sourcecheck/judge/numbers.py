"""Numbers in a claim that the cited passage does not bear out.

Each number is read with what it measures: a unit (converted to SI base units, see
:mod:`sourcecheck.judge.units`), a percentage, percentage points, a fold change, a named
ratio (OR, HR, RR), a p-value with its comparator, a sample size (``n = 48``), a year, or
else the word that follows it ("412 nests"), so "23%" is never compared with "23 sites".

How they are compared is :mod:`sourcecheck.judge.number_checks`.
"""

from __future__ import annotations

import re
from collections.abc import Callable
from dataclasses import dataclass
from functools import lru_cache

from sourcecheck.judge.number_patterns import (
    BARE_POINTS,
    BETWEEN,
    CI,
    CLOCK,
    COMPARATOR,
    COMPARATORS,
    CONTEXT_CHARS,
    CURRENCY_BEFORE,
    CURRENCY_SYMBOLS,
    CURRENCY_WORDS,
    DECIMAL_COMMA_WHOLE,
    FOLD,
    GROUP_SPACE,
    LABEL_WORDS,
    LETTER_HYPHEN,
    LIST_GAP,
    NEXT_WORD,
    NUMBER,
    P_VALUE,
    PERCENT,
    PERCENT_NEAR,
    POINTS,
    PROPORTION,
    RANGE_AND,
    RANGE_CI,
    RANGE_DASH,
    RATIO,
    RATIO_NAME,
    RATIO_NAMES,
    REFERENCE_BRACKET,
    SAMPLE_SIZE,
    SCALE_WORD,
    SCALE_WORDS,
    SCALES,
    SPELLED,
    SPELLED_VALUES,
    SPELLED_WORD,
    SPREAD,
    STATISTIC,
    SUP_TO_ASCII,
    WORD_BEFORE,
)
from sourcecheck.judge.units import Unit, read_unit
from sourcecheck.text import s_stem, tokenize


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
        exponent = int((match.group("pexp") or match.group("psup")).translate(SUP_TO_ASCII).replace("−", "-"))
        return _Number(match.start(), match.end(), sign * 10.0**exponent, -exponent, bool(match.group("sign")), False)
    raw = match.group("num")
    decimal_comma = DECIMAL_COMMA_WHOLE.fullmatch(raw) is not None
    digits = raw.replace(",", ".") if decimal_comma else re.sub(rf"[,{GROUP_SPACE}]", "", raw)
    decimals = len(digits.split(".")[1]) if "." in digits else 0
    exponent_text = next((match.group(g) for g in ("exp", "sup", "dexp", "eexp") if match.group(g)), None)
    exponent = int(exponent_text.translate(SUP_TO_ASCII).replace("−", "-")) if exponent_text else 0
    plain_year = exponent_text is None and re.fullmatch(r"(1[6-9]|20)\d\d", raw) is not None
    value = sign * float(digits) * 10.0**exponent
    return _Number(match.start(), match.end(), value, decimals - exponent, bool(match.group("sign")), plain_year)


def _role(text: str, start: int, value: float) -> tuple[str, str, int]:
    """(role, comparator, where the words that give them start) from the text before a number."""
    offset = max(0, start - 40)
    before = text[offset:start]
    if m := P_VALUE.search(before):
        return "p-value", COMPARATORS.get(m.group("cmp") or "=", m.group("cmp") or "="), offset + m.start()
    if m := SAMPLE_SIZE.search(before):
        return "n", "=", offset + m.start()
    cmp_match = COMPARATOR.search(before)
    comparator = COMPARATORS.get(cmp_match.group("cmp"), cmp_match.group("cmp")) if cmp_match else "="
    if m := RATIO_NAME.search(before):
        name = RATIO_NAMES[m.group("name").split()[0].lower()]
        return ("ratio:" + name if name != "ratio" else "ratio"), comparator, offset + m.start()
    if m := STATISTIC.search(before):
        name = m.group("stat").replace("^", "").replace("R2", "R²").replace("χ2", "χ²")
        return "stat:" + name, comparator, offset + m.start()
    if CI.search(before):
        return "CI", comparator, start
    if PROPORTION.search(before) and 0 <= value <= 1:
        return "fraction", comparator, start
    return "", comparator, offset + cmp_match.start() if cmp_match else start


def _read_suffix(text: str, reading: _Reading, pos: int) -> int:
    """Read what follows a number at ``pos`` into ``reading``; return where it ends."""
    if m := SCALE_WORD.match(text, pos):
        reading.multiplier = SCALES[m.group("word").lower()]
        pos = m.end()
    if m := POINTS.match(text, pos):
        reading.tag = "pp"
        return m.end()
    if (m := BARE_POINTS.match(text, pos)) and PERCENT_NEAR.search(text, max(0, pos - 80), pos + 80):
        reading.tag = "pp"  # "3 points" reads as percentage points only beside a percentage
        return m.end()
    if m := PERCENT.match(text, pos):
        reading.tag = "%"
        reading.unit = Unit("‰" if "‰" in m.group(0) else "%", 0.1 if "‰" in m.group(0) else 1.0, (0, 0, 0, 0, 0))
        return m.end()
    if m := FOLD.match(text, pos):
        reading.tag = "fold"
        return m.end()
    if (m := RATIO.match(text, pos)) and float(m.group("b")) > 0:
        reading.tag, reading.divisor = "ratio", float(m.group("b"))
        return m.end()
    if found := read_unit(text, pos):
        reading.unit = found[0]
        return found[1]
    if m := NEXT_WORD.match(text, pos):
        reading.word = m.group(1)
    return pos


def _readings(text: str) -> list[_Reading]:
    skip = [m.span() for m in REFERENCE_BRACKET.finditer(text)] + [m.span() for m in CLOCK.finditer(text)]
    numbers = [m for m in NUMBER.finditer(text) if not any(a <= m.start() < b for a, b in skip)]
    readings: list[_Reading] = []
    index = 0
    while index < len(numbers):
        match = numbers[index]
        index += 1
        first = _read_number(match)
        label = WORD_BEFORE.search(text[max(0, first.start - 16) : first.start])
        is_label = bool(label and label.group(1).lower() in LABEL_WORDS)
        if is_label or (LETTER_HYPHEN.search(text, max(0, first.start - 2), first.start) and not first.plain_year):
            if index < len(numbers) and RANGE_DASH.fullmatch(text, first.end, numbers[index].start()):
                index += 1  # "pp. 201–205": the whole range is the label
            continue
        role, comparator, opening = _role(text, first.start, first.value)
        reading = _Reading(opening, first.end, first, comparator=comparator, role=role)
        if not role and (money := CURRENCY_BEFORE.search(text, max(0, first.start - 4), first.start)):
            reading.currency, reading.start = CURRENCY_SYMBOLS[money.group("cur")], money.start()
        end = first.end
        if (spread := SPREAD.match(text, end)) and index < len(numbers) and numbers[index].start() == spread.end():
            reading.spread = _read_number(numbers[index])
            index += 1
            end = reading.spread.end
        end = _read_suffix(text, reading, end)
        joiner = (
            RANGE_CI
            if role == "CI"
            else RANGE_AND
            if BETWEEN.search(text, max(0, first.start - 12), first.start)
            else RANGE_DASH
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
        if bare and after.unit is not None and LIST_GAP.fullmatch(text, here.end, after.start):
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
        currency = reading.currency or CURRENCY_WORDS.get(kind, "")
        if currency:  # "$5 billion" and "5 billion dollars" are one kind; "5 billion" alone a count
            kind, unit_text = "currency:" + currency, currency
    if reading.tag == "ratio":
        scale /= reading.divisor
    scale *= reading.multiplier
    decimals = min(low.decimals, high.decimals) if high else low.decimals
    window = text[max(0, reading.start - CONTEXT_CHARS) : reading.end + CONTEXT_CHARS]
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
    for match in SPELLED_WORD.finditer(text):
        if not free(match.start(), match.end()):
            continue
        value = SPELLED[match.group("word").lower()]
        number = _Number(match.start(), match.end(), value, 0, False, False)
        reading = _Reading(match.start(), match.end(), number)
        if match.group("fold"):
            reading.tag = "fold"
        else:
            reading.end = _read_suffix(text, reading, match.end())
            stem = s_stem(reading.word.lower()) if reading.word else ""
            if not (reading.unit or reading.tag) and (stem in SPELLED or stem in ("of", "or", "and", "to", "")):
                continue  # "one of", "one or two": not a count of something
        found.append(_quantity(text, reading))
    return found


# The raised decimal point of some journals ("3·4%", "OR 1·62"), read as a full stop
# (The Lancet's house style prints decimals with a middle dot; from memory). Same length,
# so every offset into the text stays true.
_MIDDLE_DOT_DECIMAL = re.compile(r"(?<=\d)[·•∙](?=\d)")


def quantities(text: str) -> list[Quantity]:
    """Every quantity in ``text`` (figure, table, page and reference labels left out)."""
    return list(_cached_quantities(_MIDDLE_DOT_DECIMAL.sub(".", text)))


_COUNT_WORD = r"(?:\d[\d,]*|" + "|".join(SPELLED_VALUES[1:]) + r")"
# "one in five", "1 in 5 million", "three out of four": a proportion written as a ratio.
_ONE_IN = re.compile(
    rf"\b(?P<a>{_COUNT_WORD})\s+(?:in|out\s+of)\s+(?P<b>{_COUNT_WORD})(?:\s+(?P<mult>{SCALE_WORDS}))?\b",
    re.IGNORECASE,
)


def _count(written: str) -> float:
    word = written.lower()
    return SPELLED[word] if word in SPELLED else float(written.replace(",", ""))


def _proportions(text: str) -> tuple[list[Quantity], list[tuple[int, int]]]:
    """Proportions written "one in five" (as a percentage), and the spans they take.

    The written ratio is a round figure for a rate ("one in five" for 19% to 21%), so it
    matches within 5% of its value (common practice, no source).
    """
    found, spans = [], []
    for match in _ONE_IN.finditer(text):
        a, b = _count(match.group("a")), _count(match.group("b"))
        b *= SCALES.get((match.group("mult") or "").lower(), 1.0)
        if not b or a > b:
            continue  # "12 in 10 sites" is no proportion
        percent = 100.0 * a / b
        window = text[max(0, match.start() - CONTEXT_CHARS) : match.end() + CONTEXT_CHARS]
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
