"""Tests for the synthetic benchmark corpus: pages, titles and determinism.

The PDFs are read back with pypdf, an extractor the builder never uses, so a check does
not rest on the builder's own idea of what it wrote. The corpus is tiny (2 PDFs x 2 pages)
to keep the test to a second or two.
"""

from __future__ import annotations

import importlib.util
import json
import re
import sys
from pathlib import Path
from types import ModuleType

import pytest
from pypdf import PdfReader

BUILDER = Path(__file__).resolve().parents[2] / "bench" / "synthetic_corpus.py"

# IEEE reference style puts the article title in double quotes, the comma inside the
# closing quote, then the italic journal (IEEE Editorial Style Manual, "References").
IEEE_ENTRY = re.compile(r'^\[(\d+)\] (?P<authors>.+?), "(?P<title>[^"]+)," \*(?P<journal>[^*]+)\*, vol\. \d+')
# IEEE: the author's initials precede the family name, "A. Surname" (same manual).
IEEE_AUTHOR = re.compile(r"^[A-Z]\. [A-Z][a-z]+$")
# Numeric citation markers in square brackets, several numbers separated by commas
# (IEEE Editorial Style Manual, "In-text citations").
MARKER = re.compile(r"\[(\d+(?:, \d+)*)\]\.")


def _load_builder() -> ModuleType:
    """bench/ is not a package, so the script is imported from its path."""
    spec = importlib.util.spec_from_file_location("synthetic_corpus", BUILDER)
    assert spec and spec.loader
    module = importlib.util.module_from_spec(spec)
    sys.modules["synthetic_corpus"] = module  # dataclasses look the module up by name
    spec.loader.exec_module(module)
    return module


@pytest.fixture(scope="module")
def builder() -> ModuleType:
    return _load_builder()


@pytest.fixture(scope="module")
def corpus(builder: ModuleType, tmp_path_factory: pytest.TempPathFactory) -> Path:
    out = tmp_path_factory.mktemp("synthetic")
    builder.build(out, pdfs=2, pages=2, seed=7)
    return out


def _entries(draft: str) -> dict[int, re.Match[str]]:
    return {int(m.group(1)): m for line in draft.splitlines() if (m := IEEE_ENTRY.match(line))}


def _squash(text: str) -> str:
    """Whitespace-insensitive form: a title wraps over lines on the PDF page."""
    return " ".join(text.split())


def test_every_pdf_has_the_requested_pages(corpus: Path) -> None:
    pdfs = sorted((corpus / "sources").glob("*.pdf"))
    assert len(pdfs) == 2
    for pdf in pdfs:
        reader = PdfReader(pdf)
        assert len(reader.pages) == 2
        # The footer prints "Page k of N" on every page (common practice, no source).
        for k, page in enumerate(reader.pages, start=1):
            assert f"Page {k} of 2" in page.extract_text()


def test_reference_titles_are_the_pdf_titles(corpus: Path) -> None:
    draft = (corpus / "draft.md").read_text(encoding="utf-8")
    entries = _entries(draft)
    assert sorted(entries) == [1, 2]
    titles = {_squash(m.group("title")) for m in entries.values()}
    found = set()
    for pdf in (corpus / "sources").glob("*.pdf"):
        reader = PdfReader(pdf)
        metadata_title = reader.metadata.title
        assert metadata_title in titles
        assert metadata_title in _squash(reader.pages[0].extract_text())
        found.add(metadata_title)
    assert found == titles
    for match in entries.values():
        for author in re.split(r", and |, | and ", match.group("authors")):
            assert IEEE_AUTHOR.match(author), author


def test_the_last_page_carries_a_references_section(corpus: Path) -> None:
    for pdf in (corpus / "sources").glob("*.pdf"):
        pages = PdfReader(pdf).pages
        assert "References" in pages[-1].extract_text()
        assert "References" not in pages[0].extract_text()


def test_claims_cite_existing_entries_and_paraphrase_their_source(corpus: Path) -> None:
    draft = (corpus / "draft.md").read_text(encoding="utf-8")
    body = draft.split("## References")[0]
    cited = [int(n) for group in MARKER.findall(body) for n in group.split(", ")]
    assert len(MARKER.findall(body)) == 4  # two claims per PDF by default
    assert set(cited) == {1, 2}
    rows = [json.loads(line) for line in (corpus / "expected.jsonl").read_text(encoding="utf-8").splitlines()]
    for row in rows:
        assert row["claim"] in body
        page_text = _squash(PdfReader(corpus / "sources" / row["file"]).pages[row["page"] - 1].extract_text())
        assert _squash(row["sentence"]) in page_text
        # A light paraphrase keeps the sentence's numbers (common practice, no source).
        assert set(re.findall(r"\d+(?:\.\d+)?", row["claim"])) <= set(re.findall(r"\d+(?:\.\d+)?", row["sentence"]))


def test_same_seed_same_draft_and_other_seed_differs(builder: ModuleType, corpus: Path, tmp_path: Path) -> None:
    builder.build(tmp_path / "again", pdfs=2, pages=2, seed=7)
    builder.build(tmp_path / "other", pdfs=2, pages=2, seed=8)
    first = (corpus / "draft.md").read_text(encoding="utf-8")
    assert (tmp_path / "again" / "draft.md").read_text(encoding="utf-8") == first
    assert (tmp_path / "other" / "draft.md").read_text(encoding="utf-8") != first
    for pdf in (corpus / "sources").glob("*.pdf"):
        assert (tmp_path / "again" / "sources" / pdf.name).read_bytes() == pdf.read_bytes()


def test_cli_rejects_zero_pages(builder: ModuleType, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert builder.main([str(tmp_path), "--pages", "0"]) == 2
    assert capsys.readouterr().err.strip() == "synthetic_corpus: --pdfs and --pages must be at least 1"
