"""Units written after a number, read into a factor to coherent SI units and a dimension.

A claim may give "0.5 g" where its source says "500 mg"; the number check compares the
two only after both are in base units. The units are data (``units.toml``): SI prefixes,
a short table of units met in research writing, and the dimension names used as a
quantity's kind. A unit is read only as a whole token ("5 m", "5m", "5-m quadrat"), so
the "m" of "the 5 most" is never a metre. Compound units are a first unit followed by
"/unit", "·unit", " per unit" or " unit-1" / " unit⁻¹" ("mg/kg", "µg mL⁻¹", "m s-1").
"""

from __future__ import annotations

import re
import tomllib
from dataclasses import dataclass
from functools import lru_cache
from importlib import resources

#: The base dimensions, in the order of :attr:`Unit.dims`.
BASES = ("M", "L", "T", "N", "Θ")
Dims = tuple[int, int, int, int, int]


@dataclass(frozen=True)
class Unit:
    """A unit as written, its factor (and offset) to SI base units and its dimension."""

    text: str
    factor: float
    dims: Dims
    offset: float = 0.0  # only °C: K = °C + 273.15

    @property
    def kind(self) -> str:
        """The dimension's name ("mass", "concentration"), else its powers ("M L-2")."""
        signature = dims_signature(self.dims)
        return _table().dimension_names.get(signature, signature)

    def to_base(self, value: float) -> float:
        """``value`` in this unit, in coherent SI units."""
        return value * self.factor + self.offset


@dataclass(frozen=True)
class _Entry:
    factor: float
    dims: Dims
    offset: float
    prefixed: bool


@dataclass(frozen=True)
class _Table:
    prefixes: dict[str, float]
    units: dict[str, _Entry]  # every symbol and alias
    prefixable: frozenset[str]  # symbols that take a prefix
    not_units: frozenset[str]
    dimension_names: dict[str, str]


def dims_signature(dims: Dims) -> str:
    """ "M L-3" for (1, -3, 0, 0, 0): the form ``units.toml`` writes dimensions in."""
    return " ".join(base + (str(power) if power != 1 else "") for base, power in zip(BASES, dims, strict=True) if power)


def _parse_dims(text: str) -> Dims:
    powers = dict.fromkeys(BASES, 0)
    for part in text.split():
        match = re.fullmatch(r"([MLTNΘ])(-?\d+)?", part)
        if not match:
            raise ValueError(f"units.toml: bad dimension {text!r}")
        powers[match.group(1)] += int(match.group(2) or 1)
    return tuple(powers[b] for b in BASES)  # type: ignore[return-value]


@lru_cache(maxsize=1)
def _table() -> _Table:
    """Parse the packaged unit table once; a malformed file is a packaging bug, so it raises."""
    data = tomllib.loads(resources.files("sourcecheck.judge").joinpath("units.toml").read_text(encoding="utf-8"))
    units: dict[str, _Entry] = {}
    prefixable = set()
    for symbol, spec in data["units"].items():
        entry = _Entry(
            float(spec["factor"]),
            _parse_dims(spec["dims"]),
            float(spec.get("offset", 0.0)),
            spec.get("prefixed", False),
        )
        for name in (symbol, *spec.get("aliases", [])):
            units[name] = entry
            if entry.prefixed and (name == symbol or len(name) < 3):  # "mL" and "ml"; never "mgrams"
                prefixable.add(name)
    return _Table(
        prefixes={k: float(v) for k, v in data["prefixes"].items()},
        units=units,
        prefixable=frozenset(prefixable),
        not_units=frozenset(data["not_units"]["tokens"]),
        dimension_names={dims_signature(_parse_dims(k)): v for k, v in data["dimensions"].items()},
    )


def lookup(symbol: str) -> tuple[float, Dims, float] | None:
    """(factor, dims, offset) of a unit symbol, with or without an SI prefix; None if unknown.

    An unprefixed symbol wins ("min" is a minute, "Pa" a pascal, "mm" is milli-metre).
    """
    table = _table()
    symbol = symbol.replace(" ", "")
    if symbol in table.not_units:
        return None
    if symbol in table.units:
        entry = table.units[symbol]
        return entry.factor, entry.dims, entry.offset
    prefix, rest = symbol[:1], symbol[1:]  # the prefixes kept are one character long
    if prefix in table.prefixes and rest in table.prefixable:
        entry = table.units[rest]
        return table.prefixes[prefix] * entry.factor, entry.dims, 0.0
    return None


_SUPERSCRIPT = str.maketrans("⁰¹²³⁴⁵⁶⁷⁸⁹⁻", "0123456789-")
# A unit token: a symbol, then an optional power; it must end the word ("5 most" is no "m").
_SYMBOL = r"(?P<sym>°\s?C|ºC|℃|[A-Za-zµμ]+)(?P<pow>⁻?[¹²³]|\^-?[123]|(?<=[A-Za-z])[23](?!\d))?(?![\w°]|-[A-Za-z])"
_FIRST = re.compile(r"(?:[ \u00a0\u2009\u202f]|-(?=[A-Za-zµμ]))?" + _SYMBOL)
_NEXT = re.compile(
    r"(?P<op>\s?/\s?|\s?[·⋅]\s?|\s+per\s+|[ \u00a0\u2009\u202f])"
    r"(?P<sym>[A-Za-zµμ]+)(?P<pow>⁻[¹²³]|\^-?[123]|-[123]|[²³])?(?![\w°]|-[A-Za-z])"
)


def _power(written: str | None) -> int:
    if not written:
        return 1
    return int(written.translate(_SUPERSCRIPT).lstrip("^"))


def read_unit(text: str, pos: int) -> tuple[Unit, int] | None:
    """The unit written at ``text[pos:]`` (after an optional space) and where it ends, or None."""
    first = _FIRST.match(text, pos)
    if not first:
        return None
    known = lookup(first.group("sym"))
    if known is None:
        return None
    power = _power(first.group("pow"))
    factor, dims = known[0] ** power, tuple(d * power for d in known[1])
    offset = known[2] if power == 1 else 0.0
    end = first.end()
    while (more := _NEXT.match(text, end)) is not None:
        op = more.group("op").strip()
        power = _power(more.group("pow"))
        if not op and power > 0:  # "5 m high": a space joins a unit only with a negative power
            break
        step = lookup(more.group("sym"))
        if step is None:
            break
        if op in ("/", "per"):
            power = -abs(power)
        factor *= step[0] ** power
        dims = tuple(a + b * power for a, b in zip(dims, step[1], strict=True))
        offset = 0.0  # "°C/min" is a rate: no offset
        end = more.end()
    written = " ".join(text[pos:end].split()).lstrip("-")
    return Unit(written, factor, dims, offset), end  # type: ignore[arg-type]
