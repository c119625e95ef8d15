"""The reader for drafts that are themselves PDFs: the reviewer's copy of a manuscript.

The text comes through the same extraction as the source PDFs (pypdf via
:func:`sourcecheck.pdftext.reader.read_pdf`, :func:`~sourcecheck.pdftext.chars.normalize_chars`,
the running-line, paragraph and hyphen rules of :mod:`sourcecheck.pdftext.layout`), so a
sentence reads the same whichever side of the check it is on. On top of that, a
manuscript's own furniture is taken out or read (:mod:`sourcecheck.drafts.pdf.text`):
a line-number margin is removed and superscript reference numbers become "[n]" markers.

**Locations.** A claim's ``line`` and a reference's ``line`` are **line numbers of the
extracted text**: 1-based, counted over the whole document, page after page, once page
furniture (running headers and footers, page numbers) is removed. They are not the
manuscript's printed line numbers, which restart on some pages; :func:`manuscript_text`
keeps the page of every line (``ManuscriptText.pages``) for anyone who wants to show it.

What is read as what:

- lines are grouped into paragraphs as for sources; a paragraph cut by a page break
  (its last line on the page ends no sentence) is joined to the next page's first;
- the reference list is found under a line that is a title alone (References,
  Bibliography, Works cited ...) and runs to the next back-matter title (Appendix,
  Tables, Figure legends ...) or the end; it is cut into entries by the shared splitter:
  numbered ("[1] ...", "1. ...") at each number, author-year at each line that opens like
  an entry ("Okafor, A. B., ...") after a line that closed one, other lines continuing;
- ``--bib`` replaces the written list, as for Markdown drafts.
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING

from sourcecheck.claims import Block, Resolver, bound_blocks, bound_citations, extract_claims
from sourcecheck.drafts.bibliography.reflist import (
    ReferenceSection,
    find_reference_section,
    heading_at,
    parse_references,
    split_entries,
)
from sourcecheck.drafts.markdown.pandoc import draft_bibliography
from sourcecheck.drafts.pdf.text import marked_pages, strip_line_numbers
from sourcecheck.limits import Limits
from sourcecheck.model import Draft, Problem, Reference
from sourcecheck.pdftext import (
    NO_TEXT,
    SOFT_HYPHEN,
    PdfUnreadable,
    drop_running_lines,
    group_paragraphs,
    join_lines,
    normalize_chars,
    one_line,
    read_pdf,
    split_lines,
    typical_length,
    vocabulary,
)
from sourcecheck.text import ends_sentence

if TYPE_CHECKING:
    from sourcecheck.model import ReadOptions

__all__ = ["ManuscriptText", "manuscript_text", "read_pdf_manuscript", "read_pdf_manuscript_bytes"]

#: A page's last line shorter than this share of the typical line ends its paragraph
#: (or is a heading): it is not carried over to the next page.
_HEADING_SHARE = 0.6


@dataclass(frozen=True)
class ManuscriptText:
    """The extracted text of a manuscript PDF, as the reader sees it.

    ``lines`` is the text one line per item (line n of a claim is ``lines[n - 1]``);
    ``pages`` the 1-based page of each line; ``paragraphs`` the 0-based indices of each
    paragraph's lines, in reading order.
    """

    lines: list[str]
    pages: list[int]
    paragraphs: list[list[int]]
    cut: str = ""  # why the later pages were not read (the page limit), or ""


def read_pdf_manuscript(path: Path, display: str, options: ReadOptions) -> Draft:
    """Claims, reference entries and problems of the PDF draft at ``path``; never raises."""
    try:
        data = Path(path).read_bytes()
    except OSError as error:
        reason = error.strerror or error.__class__.__name__
        return Draft(display, [], [], [Problem(display, f"cannot be opened ({reason})")])
    return read_pdf_manuscript_bytes(data, display, options)


def read_pdf_manuscript_bytes(data: bytes, display: str, options: ReadOptions | None = None) -> Draft:
    """The same from the file's bytes."""
    limits = options.limits if options else Limits()
    try:
        text = manuscript_text(data, limits.pdf_pages)
    except PdfUnreadable as error:
        return Draft(display, [], [], [Problem(display, str(error))])
    except Exception as error:  # pypdf failing where _pdf did not expect it: still one line
        return Draft(display, [], [], [Problem(display, f"truncated or corrupt PDF ({one_line(error)})")])
    if not any(ch.isalnum() for line in text.lines for ch in line):
        return Draft(display, [], [], [Problem(display, NO_TEXT)])
    try:
        return _draft(text, display, options.bibliography if options else None, limits)
    except Exception as error:  # a bug of ours on odd text must not stop the run either
        return Draft(display, [], [], [Problem(display, f"text could not be processed ({error!r})"[:160])])


def manuscript_text(data: bytes, max_pages: int | None = None) -> ManuscriptText:
    """The cleaned lines, their pages and paragraphs of the PDF in ``data``.

    Raises:
        PdfUnreadable: not a PDF, empty, truncated/corrupt, or locked by a password.
    """
    raw = read_pdf(data, max_pages=max_pages)
    texts = [normalize_chars(page) for page in marked_pages(data, raw.pages)]
    pages = drop_running_lines(strip_line_numbers([split_lines(page) for page in texts]))
    median = typical_length(pages)
    lines: list[str] = []
    page_of: list[int] = []
    paragraphs: list[list[int]] = []
    for number, page in enumerate(pages, start=1):
        first = len(lines)
        lines.extend(page)
        page_of.extend([number] * len(page))
        page_paragraphs = _indexed(page, group_paragraphs(page, median), first)
        if page_paragraphs and paragraphs and _runs_on(lines, paragraphs[-1], median):
            paragraphs[-1].extend(page_paragraphs.pop(0))
        paragraphs.extend(page_paragraphs)
    _mend_hyphens(lines, paragraphs, vocabulary("\n".join(texts)))
    return ManuscriptText([line.replace(SOFT_HYPHEN, "") for line in lines], page_of, paragraphs, raw.cut)


def _indexed(page: list[str], groups: list[list[str]], first: int) -> list[list[int]]:
    """The paragraphs of ``group_paragraphs`` as line indices (it keeps lines in order, minus blanks)."""
    out: list[list[int]] = []
    cursor = 0
    for group in groups:
        indices = []
        for line in group:
            while page[cursor] != line:
                cursor += 1
            indices.append(first + cursor)
            cursor += 1
        out.append(indices)
    return out


def _runs_on(lines: list[str], paragraph: list[int], median: float) -> bool:
    """Whether a page's last paragraph goes on overleaf: its last line ends no sentence and
    is not short (a short last line is a heading, or the end of a paragraph set ragged)."""
    last = lines[paragraph[-1]]
    return bool(last) and len(last) >= _HEADING_SHARE * median and not ends_sentence(last)


def _mend_hyphens(lines: list[str], paragraphs: list[list[int]], vocab: set[str]) -> None:
    """Join line-end hyphens the sources' way, keeping every other word on its own line.

    :func:`join_lines` decides; the word it joins moves up to the line it starts on, so
    the lines (and a claim's line number) stay where they were printed.
    """
    for paragraph in paragraphs:
        for upper, lower in itertools.pairwise(paragraph):
            above, below = lines[upper], lines[lower]
            if not above or not below or not above.endswith(("-", "–", SOFT_HYPHEN)):
                continue
            word, _, rest = below.partition(" ")
            joined = join_lines([above, word], vocab)
            if joined != f"{above} {word}":
                lines[upper], lines[lower] = joined, rest


def _title_view(lines: list[str]) -> list[str]:
    """Lines for the shared section finder: a line that is a reference or back-matter title
    alone is written as a bold line, which the finder reads as a heading wherever it stands.

    Other headings are left as text: in a PDF they cannot be told from a short last line
    of a reference entry, which must not end the list.
    """
    return [f"**{line}**" if line and heading_at(["", line], 1) else line for line in lines]


def _draft(text: ManuscriptText, display: str, bibliography_path: Path | None, limits: Limits) -> Draft:
    lines = text.lines
    problems: list[Problem] = [Problem(display, text.cut)] if text.cut else []
    references: list[Reference] = []
    skip = range(0)
    section: ReferenceSection | None = find_reference_section(_title_view(lines))
    if section is not None:
        references = parse_references(split_entries(lines[section.start : section.end], section.start + 1))
        skip = range(section.heading_index, section.end)
    bibliography = draft_bibliography("", display, bibliography_path) if bibliography_path else None
    if bibliography is not None:
        problems.extend(bibliography.problems)
    if bibliography is not None and bibliography.references:
        if references and section is not None:
            where = f"'{section.title}' (line {section.heading_index + 1})"
            problems.append(Problem(display, f"the reference list under {where} is not used; the bibliography file is"))
        references = bibliography.references
    elif section is None:
        problems.append(
            Problem(display, "no reference list found (no heading such as References, Bibliography or Works cited)")
        )
    elif not references:
        where = f"'{section.title}' (line {section.heading_index + 1})"
        problems.append(Problem(display, f"the reference list under {where} has no entries"))
    blocks = [_block(lines, paragraph) for paragraph in text.paragraphs if not any(i in skip for i in paragraph)]
    blocks, cut = bound_blocks([block for block in blocks if block.text.strip()], limits, display)
    problems.extend(cut)
    claims, cut = bound_citations(extract_claims(blocks, Resolver(references)), limits, display)
    problems.extend(cut)
    if not claims:
        problems.append(Problem(display, "no citation markers found in the text"))
    return Draft(display, claims, references, problems)


def _block(lines: list[str], paragraph: list[int]) -> Block:
    """A paragraph as a Block whose line breaks match the document's line numbers."""
    text = lines[paragraph[0]]
    for previous, index in itertools.pairwise(paragraph):
        text += "\n" * (index - previous) + lines[index]
    return Block(text, paragraph[0] + 1)
