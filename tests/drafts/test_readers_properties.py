"""Property tests of the draft readers: any text or bytes give a Draft, with problems that name the file.

Markdown and LaTeX are generated as text; Word and PDF as small byte strings: a real
package or PDF with a few bytes changed or cut, or arbitrary bytes.
"""

from __future__ import annotations

import tempfile
from functools import cache
from pathlib import Path

from hypothesis import given

from sourcecheck.drafts.latex.reader import read_latex
from sourcecheck.drafts.markdown.reader import read_markdown
from sourcecheck.drafts.pdf.reader import read_pdf_manuscript_bytes
from sourcecheck.drafts.word.reader import read_word_bytes
from sourcecheck.model import Draft, ReadOptions
from tests import hostile
from tests.pdf_fixtures import manuscript_pdf
from tests.strategies import draft_text, mutated


def _well_formed(draft: Draft, display: str) -> None:
    assert draft.path == display
    assert all(p.file and p.message and "\n" not in p.message for p in draft.problems)
    assert len({c.id for c in draft.claims}) == len(draft.claims)
    assert all(c.citations for c in draft.claims)


@cache
def _pdf_seed() -> bytes:
    folder = Path(tempfile.mkdtemp())
    path = manuscript_pdf(folder / "m.pdf", [["Heron nests rose by 18% [1].", "References", "1. Okafor A. 2019."]])
    return path.read_bytes()


@given(draft_text)
def test_markdown_reader_reads_any_text(text: str) -> None:
    _well_formed(read_markdown(text, "d.md"), "d.md")


@given(draft_text)
def test_latex_reader_reads_any_text(text: str) -> None:
    with tempfile.TemporaryDirectory() as folder:
        path = Path(folder) / "d.tex"
        path.write_text(text, encoding="utf-8", errors="surrogatepass")
        _well_formed(read_latex(path, "d.tex", ReadOptions()), "d.tex")


@given(mutated(hostile.plain_docx()))
def test_word_reader_reads_any_bytes(data: bytes) -> None:
    _well_formed(read_word_bytes(data, "d.docx"), "d.docx")


@given(mutated(_pdf_seed()))
def test_pdf_reader_reads_any_bytes(data: bytes) -> None:
    _well_formed(read_pdf_manuscript_bytes(data, "d.pdf"), "d.pdf")
