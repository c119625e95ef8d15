"""What every bibliography parser builds: a Reference with a one-line readable rendering.

The four file formats name their fields differently but carry the same few facts
(people, year, title, container, DOI). Each parser maps its fields onto
:func:`make_reference`, so the rendering a report shows, the DOI normalisation and
the year reading are the same whatever file the entries came from.
"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass

from sourcecheck.model import Reference
from sourcecheck.text import find_doi

_YEAR_RE = re.compile(r"(?<!\d)(1[5-9]\d{2}|20\d{2})(?!\d)")


@dataclass(frozen=True)
class Person:
    """One author or editor: the family name as printed (particles kept) and given names."""

    family: str
    given: str = ""


def year_of(value: object) -> int | None:
    """The first plausible year (1500-2099) in a field value such as "2019", "2019-05-01" or "2019///"."""
    if value is None:
        return None
    match = _YEAR_RE.search(str(value))
    return int(match.group(1)) if match else None


def normalise_doi(*values: object) -> str | None:
    """The first DOI found in ``values`` (a doi field, a doi.org URL), lower-case and bare."""
    for value in values:
        if value and (doi := find_doi(str(value))):
            return doi
    return None


def initials(given: str) -> str:
    """ "Ada Beatrix" -> "A. B.", "Jean-Paul" -> "J.-P.": the short form reference lists print."""
    parts = []
    for word in given.replace(".", ". ").split():
        pieces = [p for p in word.split("-") if p]
        parts.append("-".join(f"{p[0]}." for p in pieces if p[0].isalpha()))
    return " ".join(p for p in parts if p)


def render(
    people: Sequence[Person], et_al: bool, year: int | None, title: str | None, container: str | None, doi: str | None
) -> str:
    """ "Okafor, A. B.; Lin, C. (2019). Title. Container. https://doi.org/10.x/y" with the parts known."""
    names = [f"{p.family}, {initials(p.given)}" if initials(p.given) else p.family for p in people]
    if et_al:
        names.append("et al.")
    pieces = []
    if names:
        pieces.append("; ".join(names))
    pieces.append(f"({year})" if year else "(n.d.)")
    text = " ".join(pieces) + "."
    for part in (title, container):
        if part:
            text += " " + part.rstrip(".") + "."
    if doi:
        text += f" https://doi.org/{doi}"
    return text


def make_reference(
    key: str,
    people: Sequence[Person],
    *,
    et_al: bool = False,
    year: int | None = None,
    title: str | None = None,
    container: str | None = None,
    doi: str | None = None,
    line: int = 0,
) -> Reference:
    """A Reference keyed as in the file, with family names in the printed order."""
    title = title.strip() or None if title else None
    container = container.strip() or None if container else None
    return Reference(
        key=key,
        text=render(people, et_al, year, title, container, doi),
        authors=tuple(p.family for p in people if p.family),
        year=year,
        year_suffix="",
        title=title,
        doi=doi,
        line=line,
    )
