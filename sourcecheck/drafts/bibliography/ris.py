"""RIS files: tagged lines "XX  - value", one record from ``TY`` to ``ER``.

Reference managers export RIS without citation keys as often as with them, so a record
without ``ID`` is keyed "ris1", "ris2", ... by order and the file gets one note saying so.
A record cut off by the end of the file (no ``ER``) is still read.
"""

from __future__ import annotations

import re
from collections import defaultdict
from dataclasses import dataclass, field

from sourcecheck.drafts.bibliography.record import Person, make_reference, normalise_doi, year_of
from sourcecheck.model import Problem, Reference

_TAG_RE = re.compile(r"^([A-Z][A-Z0-9])  -(?: (.*))?$")
_AUTHOR_TAGS = ("AU", "A1")
_EDITOR_TAGS = ("A2", "ED", "A3")
_TITLE_TAGS = ("TI", "T1", "CT", "BT")
_YEAR_TAGS = ("PY", "Y1", "DA")
_CONTAINER_TAGS = ("T2", "JF", "JO", "JA", "J2", "BT", "PB")


@dataclass
class _Record:
    line: int
    fields: dict[str, list[str]] = field(default_factory=lambda: defaultdict(list))

    def first(self, *tags: str) -> str | None:
        return next((self.fields[t][0] for t in tags if self.fields.get(t)), None)


def parse_ris(text: str, display: str) -> tuple[list[Reference], list[Problem]]:
    """References of an RIS file, keyed by ``ID`` or by order."""
    records, problems = _records(text, display)
    references: list[Reference] = []
    unkeyed: list[str] = []
    seen: dict[str, int] = {}
    for number, record in enumerate(records, start=1):
        key = record.first("ID")
        if not key:
            key = f"ris{number}"
            unkeyed.append(key)
        if key in seen:
            problems.append(
                Problem(
                    display,
                    f"duplicate key '{key}' in {display} (lines {seen[key]} and {record.line}); the first is used",
                )
            )
            continue
        seen[key] = record.line
        references.append(_reference(key, record))
    if unkeyed:
        shown = ", ".join(unkeyed[:5]) + (", ..." if len(unkeyed) > 5 else "")
        problems.append(Problem(display, f"{len(unkeyed)} record(s) have no ID tag; keyed by order as {shown}"))
    return references, problems


def _records(text: str, display: str) -> tuple[list[_Record], list[Problem]]:
    records: list[_Record] = []
    problems: list[Problem] = []
    current: _Record | None = None
    last_tag: str | None = None
    for number, raw in enumerate(text.split("\n"), start=1):
        line = raw.rstrip()
        match = _TAG_RE.match(line)
        if match is None:
            if current is not None and last_tag and line.strip():
                current.fields[last_tag][-1] += " " + line.strip()  # a value wrapped onto the next line
            continue
        tag, value = match.group(1), (match.group(2) or "").strip()
        if tag == "TY":
            if current is not None:
                problems.append(Problem(display, f"record at line {current.line} has no ER before the next TY"))
                records.append(current)
            current, last_tag = _Record(number), None
            continue
        if current is None:
            continue  # tags outside a record belong to no entry
        if tag == "ER":
            records.append(current)
            current, last_tag = None, None
            continue
        current.fields[tag].append(value)
        last_tag = tag
    if current is not None:
        problems.append(Problem(display, f"record at line {current.line} has no ER; read to the end of the file"))
        records.append(current)
    if not records:
        problems.append(Problem(display, "no RIS records (TY  - ...) found"))
    return records, problems


def _reference(key: str, record: _Record) -> Reference:
    names = next((record.fields[t] for t in _AUTHOR_TAGS if record.fields.get(t)), None)
    names = names or next((record.fields[t] for t in _EDITOR_TAGS if record.fields.get(t)), [])
    people = [_person(n) for n in names if n.strip()]
    url = record.first("UR") or ""
    return make_reference(
        key,
        people,
        year=next((y for t in _YEAR_TAGS for v in record.fields.get(t, []) if (y := year_of(v))), None),
        title=record.first(*_TITLE_TAGS),
        container=record.first(*_CONTAINER_TAGS),
        doi=normalise_doi(record.first("DO"), url if "doi.org" in url.lower() else ""),
        line=record.line,
    )


def _person(name: str) -> Person:
    """RIS names are "Last, First, Suffix"; a name with no comma is taken whole (often a body)."""
    parts = [p.strip() for p in name.split(",")]
    return Person(parts[0], parts[1] if len(parts) > 1 else "")
