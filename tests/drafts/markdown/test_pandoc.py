"""Tests for Pandoc key citations and the bibliography a Markdown draft names."""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.drafts.markdown.pandoc import bibliography_fields, draft_bibliography, find_key_citations
from sourcecheck.drafts.markdown.reader import read_markdown
from sourcecheck.model import ReadOptions


def cites(text: str) -> list[tuple[str, str | None, bool]]:
    return [(c.key, c.locator, c.suppress_author) for m in find_key_citations(text) for c in m.cites]


# --- citation syntax: examples of the Pandoc User's Guide, "Citation syntax" (from memory) ---


def test_bracketed_list_with_prefix_and_locators() -> None:
    text = "Blah blah [see @doe99, pp. 33-35; also @smith04, chap. 1]."
    markers = find_key_citations(text)
    assert [m.text for m in markers] == ["[see @doe99, pp. 33-35; also @smith04, chap. 1]"]
    assert cites(text) == [("doe99", "pp. 33-35", False), ("smith04", "chap. 1", False)]


def test_locator_with_suffix_and_plain_list() -> None:
    assert cites("Blah blah [@doe99, pp. 33-35, 38-39 and *passim*].") == [
        ("doe99", "pp. 33-35, 38-39 and *passim*", False)
    ]
    assert cites("Blah blah [@smith04; @doe99].") == [("smith04", None, False), ("doe99", None, False)]


def test_braced_locators() -> None:
    assert cites("Blah [@smith{ii, A, D-Z}, with a suffix].") == [("smith", "ii, A, D-Z", False)]
    assert cites("Blah [@smith, {pp. iv, vi-xi, (xv)-(xvii)} with suffix here].") == [
        ("smith", "pp. iv, vi-xi, (xv)-(xvii)", False)
    ]


def test_suppressed_author_is_still_a_citation() -> None:
    assert cites("Smith says blah [-@smith04].") == [("smith04", None, True)]


def test_narrative_citations() -> None:
    assert cites("@smith04 says blah.") == [("smith04", None, False)]
    text = "@smith04 [p. 33] says blah."
    assert [m.text for m in find_key_citations(text)] == ["@smith04 [p. 33]"]
    assert cites(text) == [("smith04", "p. 33", False)]


def test_key_characters_and_trailing_punctuation() -> None:
    # Internal :.#$%&-+?<>~/ belong to the key; punctuation at its end does not.
    assert cites("As @Foo_bar.baz. showed") == [("Foo_bar.baz", None, False)]
    assert cites("See @doe:99/b-2+x, and more.") == [("doe:99/b-2+x", None, False)]
    assert cites("Known since @2019report.") == [("2019report", None, False)]
    assert cites("Odd keys @{https://example.com/bib?name=foobar&date=2000} work.") == [
        ("https://example.com/bib?name=foobar&date=2000", None, False)
    ]


def test_not_citations() -> None:
    assert find_key_citations("Write to name@example.org or <jo@example.org>.") == []
    assert find_key_citations("Escaped \\@key and `code @key` and [a link](mailto:x@y.org).") == []
    assert find_key_citations("A [link to @key](https://example.org) is a link.") == []
    assert find_key_citations("Just [brackets; no keys] here.") == []


def test_braces_around_a_narrative_cite() -> None:
    assert cites("as {@doe99} said") == [("doe99", None, False)]


# --- the bibliography field of the front matter ---------------------------------------


@pytest.mark.parametrize(
    ("front", "paths"),
    [
        ("bibliography: refs.bib", ["refs.bib"]),
        ("bibliography: 'my refs.bib'  # a comment", ["my refs.bib"]),
        ('bibliography: ["a.bib", b.json]', ["a.bib", "b.json"]),
        ("bibliography:\n  - a.bib\n  - 'b.ris'\ntitle: x", ["a.bib", "b.ris"]),
        ("title: no bibliography", []),
    ],
)
def test_bibliography_fields(front: str, paths: list[str]) -> None:
    assert bibliography_fields(f"---\n{front}\n---\nText.\n") == (paths, False)


def test_inline_references_are_noticed() -> None:
    text = "---\nreferences:\n- id: a\n  title: T\n---\nText [@a].\n"
    assert bibliography_fields(text) == ([], True)
    result = draft_bibliography(text, "draft.md")
    assert not result.named
    assert "are not read" in result.problems[0].message


def test_several_files_merge_first_key_wins(tmp_path: Path) -> None:
    (tmp_path / "a.bib").write_text("@misc{k, title = {From A}}\n", encoding="utf-8")
    (tmp_path / "b.json").write_text('[{"id": "k", "type": "book", "title": "From B"}, {"id": "j", "type": "book"}]')
    text = "---\nbibliography: [a.bib, b.json]\n---\n"
    result = draft_bibliography(text, "paper/draft.md", base_dir=tmp_path)
    assert [(r.key, r.title) for r in result.references] == [("k", "From A"), ("j", None)]
    assert [(p.file, p.message) for p in result.problems] == [
        ("paper/b.json", "duplicate key 'k' in paper/a.bib and paper/b.json; the first is used")
    ]


# --- the Markdown reader with a bibliography -------------------------------------------

BIB = """@article{okafor2019, author = {Okafor, Ada B. and Lin, Chen}, title = {Yields},
  journal = {J}, year = 2019}
@book{doe:99, author = {John Doe}, title = {A Book}, year = {1999}}
"""

DRAFT = """---
title: "A draft"
bibliography: refs.bib
---

# Intro

Yields rose by 12% [@okafor2019, p. 33]. As @doe:99 [chap. 2] argued, it holds.
Mail jo@example.org for data. Others agree [see @doe:99; -@okafor2019; @missing].
The same was seen before (Okafor & Lin, 2019).

# References
"""


def test_pandoc_draft_end_to_end(tmp_path: Path) -> None:
    (tmp_path / "refs.bib").write_text(BIB, encoding="utf-8")
    draft = read_markdown(DRAFT, "paper/draft.md", base_dir=tmp_path)
    assert draft.problems == []
    assert [r.key for r in draft.references] == ["okafor2019", "doe:99"]
    got = [(c.id, c.line, [(x.label, x.key, x.locator) for x in c.citations]) for c in draft.claims]
    assert got == [
        ("c1", 8, [("@okafor2019", "okafor2019", "p. 33")]),
        ("c2", 8, [("@doe:99", "doe:99", "chap. 2")]),
        ("c3", 9, [("@doe:99", "doe:99", None), ("@okafor2019", "okafor2019", None), ("@missing", None, None)]),
        # An ordinary author-year marker resolves against the bibliography's entries too.
        ("c4", 10, [("Okafor & Lin, 2019", "okafor2019", None)]),
    ]
    assert draft.claims[2].citations[0].marker == "[see @doe:99; -@okafor2019; @missing]"


def test_bib_option_wins_over_front_matter(tmp_path: Path) -> None:
    (tmp_path / "other.bib").write_text("@misc{okafor2019, title = {Other}}\n", encoding="utf-8")
    options = ReadOptions(bibliography=tmp_path / "other.bib")
    draft = read_markdown(DRAFT, "draft.md", options=options, base_dir=tmp_path)
    assert [(r.key, r.title) for r in draft.references] == [("okafor2019", "Other")]
    assert draft.claims[0].citations[0].key == "okafor2019"
    assert draft.claims[1].citations[0].key is None  # doe:99 is not in other.bib


def test_missing_bibliography_file(tmp_path: Path) -> None:
    draft = read_markdown(DRAFT, "paper/draft.md", base_dir=tmp_path)
    assert [(p.file, p.message) for p in draft.problems] == [("paper/refs.bib", "bibliography file not found")]
    assert all(c.key is None for claim in draft.claims for c in claim.citations if c.label.startswith("@"))


def test_key_citations_without_bibliography() -> None:
    draft = read_markdown("# T\n\nA claim [@okafor2019].\n", "draft.md")
    assert [p.message for p in draft.problems] == [
        "the draft cites by key (@key) but names no bibliography file; "
        "give --bib or a 'bibliography:' field in the front matter"
    ]
    assert [(c.label, c.key) for c in draft.claims[0].citations] == [("@okafor2019", None)]


def test_bibliography_preferred_to_written_list(tmp_path: Path) -> None:
    (tmp_path / "refs.bib").write_text(BIB, encoding="utf-8")
    text = "A claim [@doe:99].\n\n# References\n\nDoe, J. (1999). A book. Pub.\n"
    draft = read_markdown(text, "draft.md", options=ReadOptions(bibliography=tmp_path / "refs.bib"))
    assert [r.key for r in draft.references] == ["okafor2019", "doe:99"]
    assert [p.message for p in draft.problems] == [
        "the reference list under 'References' (line 3) is not used; the bibliography file is"
    ]
    assert draft.claims[0].citations[0].key == "doe:99"


def test_draft_without_keys_is_read_as_before() -> None:
    text = "Yields rose (Okafor, 2019).\n\n# References\n\nOkafor, A. (2019). Yields. J.\n"
    draft = read_markdown(text, "draft.md")
    assert draft.problems == []
    assert [(c.label, c.key) for c in draft.claims[0].citations] == [("Okafor, 2019", "okafor2019")]


@pytest.mark.parametrize("named", ["../elsewhere/refs.bib", "ABSOLUTE"])
def test_front_matter_bibliography_outside_the_drafts_folder_is_refused(tmp_path: Path, named: str) -> None:
    outside = tmp_path / "elsewhere" / "refs.bib"
    outside.parent.mkdir()
    outside.write_text("@article{okafor2019, title = {Secret title}, year = {2019}}\n", encoding="utf-8")
    folder = tmp_path / "paper"
    folder.mkdir()
    name = str(outside) if named == "ABSOLUTE" else named
    text = f"---\nbibliography: {name}\n---\n\nCarbon rose [@okafor2019].\n"
    bibliography = draft_bibliography(text, "paper/draft.md", base_dir=folder)
    assert bibliography.references == []
    assert [p.message for p in bibliography.problems] == [
        "named by the front matter's 'bibliography:': "
        "refused (outside the draft's folder; give it with --bib to read it)"
    ]
    # The same file given by the user (--bib) is read.
    assert [r.key for r in draft_bibliography(text, "paper/draft.md", outside, folder).references] == ["okafor2019"]


def test_a_front_matter_name_no_file_can_have_is_refused_not_a_crash(tmp_path: Path) -> None:
    # Found by scripts/fuzz.py: a NUL byte in the name made path resolution raise.
    text = "---\nbibliography: a\x00b.bib\n---\n\nCarbon rose [@okafor2019].\n"
    bibliography = draft_bibliography(text, "draft.md", base_dir=tmp_path)
    assert bibliography.references == []
    assert ["outside the draft's folder" in p.message for p in bibliography.problems] == [True]
