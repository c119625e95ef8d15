"""CSL-JSON bibliographies: the array of items Zotero, Pandoc and citeproc exchange.

The CSL data schema requires ``id`` and ``type`` on every item. An item without ``id``
cannot be cited, so it is left out; one without ``type`` is kept, since nothing here
depends on the type. Both are reported, so the writer can fix the export.
"""

from __future__ import annotations

import json
import re
from typing import Any

from sourcecheck.drafts.bibliography.record import Person, make_reference, normalise_doi, year_of
from sourcecheck.model import Problem, Reference

# A JSON string (escapes included) or one bracket: strings are skipped, brackets counted.
_JSON_TOKEN_RE = re.compile(r'"(?:[^"\\]|\\.)*"|[\[\]{}]')


def json_depth(text: str, stop: int) -> int:
    """How deeply ``text``'s arrays and objects nest, counted up to just past ``stop``."""
    depth = deepest = 0
    for token in _JSON_TOKEN_RE.finditer(text):
        mark = token.group(0)
        if mark in "[{":
            depth += 1
            deepest = max(deepest, depth)
            if deepest > stop:
                break
        elif mark in "]}":
            depth -= 1
    return deepest


def parse_csl_json(text: str, display: str, max_depth: int = 100) -> tuple[list[Reference], list[Problem]]:
    """References of a CSL-JSON file, keyed by each item's ``id``.

    JSON nested deeper than ``max_depth`` (a CSL item is four levels deep) is refused
    before it is parsed: Python's parser recurses and would give up with an error.
    """
    depth = json_depth(text, max_depth)
    if depth > max_depth:
        return [], [Problem(display, f"JSON nested over {max_depth} deep (nesting_depth); no entries read")]
    try:
        data = json.loads(text)
    except json.JSONDecodeError as error:
        return [], [Problem(display, f"not valid JSON (line {error.lineno}: {error.msg}); no entries read")]
    except RecursionError:
        return [], [Problem(display, "JSON nested too deep to read; no entries read")]
    if isinstance(data, dict) and "id" in data:
        data = [data]  # a single item, as some tools write it
    if isinstance(data, dict) and isinstance(data.get("items"), list):
        data = data["items"]
    if not isinstance(data, list):
        return [], [Problem(display, "CSL-JSON must be an array of items; no entries read")]
    references: list[Reference] = []
    problems: list[Problem] = []
    seen: dict[str, int] = {}
    for number, item in enumerate(data, start=1):
        if not isinstance(item, dict):
            problems.append(Problem(display, f"item {number} is not an object; skipped"))
            continue
        if item.get("id") in (None, ""):
            problems.append(Problem(display, f"item {number} has no 'id' (required by CSL-JSON); skipped"))
            continue
        key = str(item["id"])
        line = _line_of(text, key)
        if not item.get("type"):
            problems.append(Problem(display, f"item '{key}' has no 'type' (required by CSL-JSON)"))
        if key in seen:
            problems.append(
                Problem(
                    display, f"duplicate key '{key}' in {display} (items {seen[key]} and {number}); the first is used"
                )
            )
            continue
        seen[key] = number
        references.append(_item_reference(key, item, line))
    return references, problems


def _item_reference(key: str, item: dict[str, Any], line: int) -> Reference:
    people = _people(item.get("author")) or _people(item.get("editor"))
    title = _text(item.get("title"))
    container = _text(item.get("container-title")) or _text(item.get("publisher"))
    url = _text(item.get("URL")) or ""
    doi = normalise_doi(_text(item.get("DOI")), url if "doi.org" in url.lower() else "")
    return make_reference(
        key, people, year=_year(item.get("issued")), title=title, container=container, doi=doi, line=line
    )


def _people(value: object) -> list[Person]:
    """CSL name objects: {family, given, non-dropping-particle} or {literal}."""
    if not isinstance(value, list):
        return []
    people = []
    for name in value:
        if not isinstance(name, dict):
            continue
        if family := _text(name.get("family")):
            particle = _text(name.get("non-dropping-particle"))
            family = f"{particle} {family}" if particle else family
            people.append(Person(family, _text(name.get("given")) or ""))
        elif literal := _text(name.get("literal")):
            people.append(Person(literal))
    return people


def _year(issued: object) -> int | None:
    """Year of a CSL date: {"date-parts": [[2019, 5]]}, or its "raw"/"literal" string."""
    if isinstance(issued, dict):
        parts = issued.get("date-parts")
        if isinstance(parts, list) and parts and isinstance(parts[0], list) and parts[0]:
            return year_of(parts[0][0])
        return year_of(issued.get("raw")) or year_of(issued.get("literal"))
    return year_of(issued) if isinstance(issued, str | int) else None


def _text(value: object) -> str | None:
    if isinstance(value, str | int | float) and str(value).strip():
        return " ".join(str(value).split())
    return None


def _line_of(text: str, key: str) -> int:
    """Line of the item's ``"id": "key"`` (json gives no positions; this finds it back)."""
    match = re.search(r'"id"\s*:\s*"?' + re.escape(json.dumps(key)[1:-1]) + r'"?\s*[,}\n]', text)
    return text.count("\n", 0, match.start()) + 1 if match else 0
