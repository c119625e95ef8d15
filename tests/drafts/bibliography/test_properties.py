"""Property tests of the reference-entry and bibliography parsers: any text gives entries or problems.

Each parser must return (never raise) on any input, name the file in every problem it
reports, and key every entry it returns; the reference-list parser keeps one entry per
input entry with unique keys.
"""

from __future__ import annotations

import json
from collections.abc import Callable

import pytest
from hypothesis import given
from hypothesis import strategies as st

from sourcecheck.drafts.bibliography import parse_bbl, parse_bibtex, parse_csl_json, parse_ris
from sourcecheck.drafts.bibliography.reflist import parse_entry, parse_references
from sourcecheck.model import Problem, Reference
from tests.strategies import draft_text

PARSERS: dict[str, Callable[[str, str], tuple[list[Reference], list[Problem]]]] = {
    "bibtex": parse_bibtex,
    "csl_json": parse_csl_json,
    "ris": parse_ris,
    "bbl": parse_bbl,
}

#: JSON-shaped text, so the CSL-JSON parser gets past json.loads now and then.
json_text = st.recursive(
    st.none() | st.booleans() | st.integers() | st.floats(allow_nan=False) | st.text(max_size=8),
    lambda inner: (
        st.lists(inner, max_size=4)
        | st.dictionaries(st.sampled_from(["id", "type", "author", "issued", "title", "DOI", "x"]), inner, max_size=5)
    ),
    max_leaves=20,
).map(json.dumps)


@given(draft_text)
def test_parse_entry_reads_any_text(text: str) -> None:
    parsed = parse_entry(text)
    assert parsed.year is None or isinstance(parsed.year, int)
    assert parsed.doi is None or parsed.doi.startswith("10.")  # a DOI name starts "10." (ISO 26324)
    assert all(isinstance(a, str) and a for a in parsed.authors)


@given(st.lists(st.tuples(draft_text, st.integers(1, 10_000)), max_size=8))
def test_parse_references_keeps_one_entry_each_with_unique_keys(entries: list[tuple[str, int]]) -> None:
    references = parse_references(entries)
    assert len(references) == len(entries)
    assert len({r.key for r in references}) == len(references)
    assert [r.line for r in references] == [line for _, line in entries]


@pytest.mark.parametrize("name", sorted(PARSERS))
@given(text=draft_text | json_text)
def test_each_bibliography_parser_returns_entries_or_named_problems(name: str, text: str) -> None:
    references, problems = PARSERS[name](text, "refs.x")
    assert all(p.file == "refs.x" and p.message and "\n" not in p.message for p in problems)
    assert all(r.key for r in references)
