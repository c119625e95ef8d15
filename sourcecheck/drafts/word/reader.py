"""The reader for Word drafts (.docx, WordprocessingML).

Word has no lines, so a claim's ``line`` and a reference's ``line`` are **paragraph
numbers**: 1-based, counting the body's paragraphs in reading order (a table's cell
paragraphs in place, row by row), then the footnotes' paragraphs (notes in the order the
body cites them), then the endnotes'. Empty paragraphs count, as they do in Word.

What is read as what:

- headings (style "Heading N", "Title", "Subtitle", or an outline level) are headings,
  never claims; every other paragraph, table cell and note paragraph is prose;
- the reference list is found under a heading, a paragraph in bold or a paragraph alone
  titled References, Bibliography, Works cited ...; each paragraph is one entry (a table
  row is one entry, its cells joined);
- Word list numbering lives in the numbering definitions, not the text: an entry with
  list numbering (``w:numPr``, directly or from its style) and no printed number gets the
  number Word prints before it (counted 1..n, or from the list's start value), written
  as "[n]", so "[n]" markers in the text resolve;
- superscript reference numbers ("rose¹") become bracketed markers ("rose[1]"), see
  :mod:`sourcecheck.drafts.word.text`.

The marker, entry and sentence work is the shared modules'; this module only maps the
document's paragraphs onto them.
"""

from __future__ import annotations

import re
from collections.abc import Iterator, Sequence
from dataclasses import replace
from pathlib import Path
from typing import TYPE_CHECKING

from sourcecheck.claims import Block, Resolver, bound_blocks, bound_citations, extract_claims
from sourcecheck.drafts.bibliography.reflist import find_reference_section, parse_references
from sourcecheck.drafts.word.package import WordPackage, open_package
from sourcecheck.drafts.word.text import Numbering, Paragraph, Styles, body_paragraphs, note_paragraphs
from sourcecheck.limits import Limits
from sourcecheck.model import Draft, Problem

if TYPE_CHECKING:
    from sourcecheck.model import ReadOptions

__all__ = ["read_word", "read_word_bytes"]

# A number printed at the start of an entry, in the forms the entry parser keys on.
_PRINTED_NUMBER_RE = re.compile(r"^\s*(?:\[\d{1,4}\]|\d{1,4}[.)])\s")
# A bold paragraph this short may be a heading; a longer one is a bold sentence.
_BOLD_HEADING_CHARS = 80


def read_word(path: Path, display: str, options: ReadOptions) -> Draft:
    """Claims, reference entries and problems of the .docx at ``path``; never raises."""
    try:
        data = Path(path).read_bytes()
    except OSError as error:
        reason = error.strerror or error.__class__.__name__
        return Draft(display, [], [], [Problem(display, f"cannot be opened ({reason})")])
    return read_word_bytes(data, display, options.limits)


def read_word_bytes(data: bytes, display: str, limits: Limits | None = None) -> Draft:
    """The same from the file's bytes."""
    package, problem = open_package(data, display, limits)
    if package is None:
        return Draft(display, [], [], [problem] if problem else [])
    draft = _read_package(package, display, limits or Limits())
    draft.problems[:0] = package.problems
    return draft


def _read_package(package: WordPackage, display: str, limits: Limits) -> Draft:
    styles = Styles(package.styles)
    body, cited_notes = body_paragraphs(package.body, styles, Numbering(package.numbering))
    notes = note_paragraphs(
        package.footnotes, "footnote", [i for kind, i in cited_notes if kind == "footnote"], styles
    ) + note_paragraphs(package.endnotes, "endnote", [i for kind, i in cited_notes if kind == "endnote"], styles)
    if not any(p.text.strip() for p in [*body, *notes]):
        return Draft(display, [], [], [Problem(display, "the draft is empty")])
    problems: list[Problem] = []
    references = []
    skip = range(0)
    section = find_reference_section(_heading_lines(body))
    if section is None:
        problems.append(
            Problem(
                display,
                "no reference list found (no heading such as References, Bibliography or Works cited)",
            )
        )
    else:
        # _heading_lines puts paragraph i at line 2 * i, with blank lines between.
        heading, first, last = section.heading_index // 2, (section.start + 1) // 2, (section.end + 1) // 2
        references = parse_references(list(_entries(body[first:last], first)))
        if not references:
            problems.append(
                Problem(
                    display,
                    f"the reference list under '{section.title}' (paragraph {heading + 1}) has no entries",
                )
            )
        skip = range(heading, last)
    blocks = [
        Block(p.text, position + 1)
        for position, p in enumerate([*body, *notes])
        if p.text.strip() and p.heading is None and position not in skip
    ]
    blocks, cut = bound_blocks(blocks, limits, display)
    problems.extend(cut)
    claims, cut = bound_citations(extract_claims(blocks, Resolver(references)), limits, display)
    problems.extend(cut)
    # Word has no lines: the numbers are paragraphs, and the reports must say so.
    claims = [replace(c, unit="paragraph") for c in claims]
    if not claims:
        problems.append(Problem(display, "no citation markers found in the text"))
    return Draft(display, claims, references, problems)


def _heading_lines(paragraphs: Sequence[Paragraph]) -> list[str]:
    """Paragraphs as lines in the heading forms the shared section finder knows.

    A styled heading becomes an ATX heading of its level, a short all-bold paragraph a
    bold line; a blank line between paragraphs lets a bare "References" paragraph read as
    a line alone, as it looks on the page.
    """
    lines: list[str] = []
    for paragraph in paragraphs:
        text = paragraph.text.strip()
        if text and paragraph.heading is not None:
            text = f"{'#' * min(paragraph.heading, 6)} {text}"
        elif text and paragraph.bold and len(text) <= _BOLD_HEADING_CHARS:
            text = f"**{text}**"
        lines.extend([text, ""])
    return lines


def _entries(paragraphs: Sequence[Paragraph], first: int) -> Iterator[tuple[str, int]]:
    """(entry text, paragraph number) pairs: one per paragraph, or per table row."""
    position = 0
    while position < len(paragraphs):
        paragraph = paragraphs[position]
        start = position
        parts = [paragraph.text.strip()]
        position += 1
        while paragraph.row is not None and position < len(paragraphs) and paragraphs[position].row == paragraph.row:
            parts.append(paragraphs[position].text.strip())
            position += 1
        text = " ".join(part for part in parts if part)
        if not text or paragraph.heading is not None:
            continue
        if paragraph.list_number is not None and not _PRINTED_NUMBER_RE.match(text):
            text = f"[{paragraph.list_number}] {text}"
        yield text, first + start + 1
