"""Tests for CSL-JSON bibliographies."""

from __future__ import annotations

from sourcecheck.drafts.bibliography.csl_json import parse_csl_json

# Item fields as in the CSL data schema, citation-style-language/schema csl-data.json
# (from memory): "id" and "type" required; names {family, given, non-dropping-particle}
# or {literal}; dates {"date-parts": [[year, month, day]]} or {"raw": ...}.
CSL = """[
  {"id": "okafor2019", "type": "article-journal", "title": "Yields on plots",
   "author": [{"family": "Okafor", "given": "Ada B."},
              {"family": "Berg", "given": "Jan", "non-dropping-particle": "van der"},
              {"literal": "World Health Organization"}],
   "issued": {"date-parts": [[2019, 5]]}, "DOI": "10.1234/ABC", "container-title": "Journal of Fields"},
  {"type": "book", "title": "No id at all"},
  {"id": 7, "title": "No type", "issued": {"raw": "2001-03"}},
  {"id": "okafor2019", "type": "book", "title": "Same id again"}
]
"""


def test_items() -> None:
    refs, problems = parse_csl_json(CSL, "refs.json")
    assert [r.key for r in refs] == ["okafor2019", "7"]
    first = refs[0]
    assert first.authors == ("Okafor", "van der Berg", "World Health Organization")
    assert (first.year, first.title, first.doi, first.line) == (2019, "Yields on plots", "10.1234/abc", 2)
    assert "Journal of Fields" in first.text
    assert refs[1].year == 2001
    assert [p.message for p in problems] == [
        "item 2 has no 'id' (required by CSL-JSON); skipped",
        "item '7' has no 'type' (required by CSL-JSON)",
        "duplicate key 'okafor2019' in refs.json (items 1 and 4); the first is used",
    ]


def test_not_json() -> None:
    refs, problems = parse_csl_json('[{"id": "a", oops}]', "refs.json")
    assert refs == []
    assert problems[0].file == "refs.json"
    assert problems[0].message.startswith("not valid JSON (line 1:")


def test_not_an_array() -> None:
    refs, problems = parse_csl_json('"just a string"', "refs.json")
    assert refs == []
    assert problems[0].message == "CSL-JSON must be an array of items; no entries read"


def test_json_nested_past_the_limit_is_one_problem_not_a_crash() -> None:
    from tests.hostile import deep_json

    references, problems = parse_csl_json(deep_json(100_000), "refs.json")
    assert references == []
    assert [p.message for p in problems] == ["JSON nested over 100 deep (nesting_depth); no entries read"]
    # Brackets inside strings are text, not nesting.
    items, found = parse_csl_json('[{"id": "a", "type": "book", "title": "' + "[" * 500 + '"}]', "refs.json")
    assert [r.key for r in items] == ["a"] and found == []


def test_load_bibliography_refuses_a_file_over_the_size_limit(tmp_path) -> None:
    from sourcecheck.drafts.bibliography import load_bibliography
    from sourcecheck.limits import Limits

    path = tmp_path / "refs.json"
    path.write_text('[{"id": "a", "type": "book"}]' + " " * 2000, encoding="utf-8")
    references, problems = load_bibliography(path, "refs.json", Limits(file_bytes=1024))
    assert references == []
    assert [p.message for p in problems] == ["2.0 KiB, over the limit of 1 KiB (file_bytes); not read"]
