"""Drafts that cite the 27 real papers of ``../shared/data/papers`` in eight reference styles.

The reference lists are hand-written text fixtures (``tests/fixtures/real_references``,
README there); this module turns one style's list into a draft in Markdown, Word or a PDF
manuscript, with one cited sentence per reference, so that tests and ``bench/matching.py``
run the real draft readers on them. Entry ``i`` of every list cites paper ``i`` of
``papers.tsv``.
"""

from __future__ import annotations

import textwrap
from dataclasses import dataclass
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
FIXTURES = REPO / "tests" / "fixtures" / "real_references"
#: The real papers; CI checks them out beside the repository (read-only, never copied here).
PAPERS_DIR = REPO.parent / "shared" / "data" / "papers"


@dataclass(frozen=True)
class Style:
    """One reference style: its fixture file, whether entries are numbered, and its guide."""

    name: str
    numbered: bool
    label: str  # how a numbered entry is labelled: "{n}." or "[{n}]"
    guide: str
    #: Written after the matcher was frozen and measured once: the honest figure.
    held_out: bool = False


STYLES: tuple[Style, ...] = (
    Style("apa7", False, "", "APA Publication Manual, 7th ed., ch. 9-10 (from memory)"),
    Style("vancouver", True, "{n}.", "ICMJE recommendations / NLM Citing Medicine, 2nd ed. (from memory)"),
    Style("ieee", True, "[{n}]", "IEEE Reference Guide, 2021 (from memory)"),
    Style("chicago_author_date", False, "", "Chicago Manual of Style, 17th ed., ch. 15 (from memory)"),
    Style("chicago_notes_bibliography", False, "", "Chicago Manual of Style, 17th ed., ch. 14 (from memory)"),
    Style("nature", True, "{n}.", "Nature research journals' reference format (from memory)"),
    Style("cs_author_title_venue", False, "", "the dblp / CS-proceedings form 'First Last. Title. Venue, Year.'"),
    Style("title_only", True, "{n}.", "a bare list of titles (no guide: the worst case for a parser)"),
    Style("mla9", False, "", "MLA Handbook, 9th ed. (from memory)", held_out=True),
    Style("ama11", True, "{n}.", "AMA Manual of Style, 11th ed. (from memory)", held_out=True),
    Style("harvard", False, "", "Harvard as in Cite Them Right, 12th ed. (from memory)", held_out=True),
)


@dataclass(frozen=True)
class Paper:
    """A real paper of the set: its file and how an author-year marker names it."""

    file: str
    family: str
    year: int


def papers() -> list[Paper]:
    """The papers, in the order every fixture list follows."""
    rows = (FIXTURES / "papers.tsv").read_text(encoding="utf-8").splitlines()
    return [Paper(f, n, int(y)) for f, n, y in (row.split("\t") for row in rows if row.strip())]


def entries(style: Style) -> list[str]:
    """The style's reference entries as written, without labels."""
    lines = (FIXTURES / f"{style.name}.txt").read_text(encoding="utf-8").splitlines()
    return [line.strip() for line in lines if line.strip()]


def labelled(style: Style) -> list[str]:
    """Entries as they stand in a reference list (numbered styles get their labels)."""
    return [f"{style.label.format(n=i)} {e}" if style.numbered else e for i, e in enumerate(entries(style), 1)]


def sentences(style: Style) -> list[str]:
    """One invented cited sentence per paper, with the marker the style uses."""
    out = []
    for i, paper in enumerate(papers(), 1):
        marker = f"[{i}]" if style.numbered else f"({paper.family}, {paper.year})"
        out.append(f"Finding {i} of the review is reported in this work {marker}.")
    return out


def markdown_draft(style: Style) -> str:
    """The draft as Markdown: a heading, the cited sentences, the reference list."""
    refs = labelled(style)
    return "\n\n".join(["# Review", *sentences(style), "## References", *refs]) + "\n"


def word_draft(style: Style, path: Path) -> Path:
    """The draft as a .docx built with python-docx: one paragraph per sentence and entry."""
    import docx

    document = docx.Document()
    document.add_heading("Review", 1)
    for sentence in sentences(style):
        document.add_paragraph(sentence)
    document.add_heading("References", 1)
    for entry in labelled(style):
        document.add_paragraph(entry)
    document.save(path)
    return path


#: Characters per printed line of the PDF manuscript (DejaVu Sans 11 pt on A4; measured by eye).
PDF_LINE = 80
PDF_LINES_PER_PAGE = 38


def pdf_draft(style: Style, path: Path) -> Path:
    """The draft as a PDF manuscript (tests/pdf_fixtures.py): wrapped lines, numbered margin.

    Each entry is wrapped to :data:`PDF_LINE` characters, continuation lines indented
    (a hanging indent, as manuscripts set them), with a gap between entries.
    """
    from tests.pdf_fixtures import manuscript_pdf

    lines = ["Review", ""]
    for sentence in sentences(style):
        lines.extend(textwrap.wrap(sentence, PDF_LINE))
    lines.extend(["", "References", ""])
    for entry in labelled(style):
        lines.extend(textwrap.wrap(entry, PDF_LINE, subsequent_indent="    "))
        lines.append("")
    pages = [lines[i : i + PDF_LINES_PER_PAGE] for i in range(0, len(lines), PDF_LINES_PER_PAGE)]
    return manuscript_pdf(path, pages, footer="{n}")
