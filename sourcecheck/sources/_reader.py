"""From a PDF file to a :class:`~sourcecheck.model.Source`: text, clean-up, passages.

Order of work, and why:
  1. pypdf text per page, characters normalised (ligatures, odd spaces).
  2. Printed page numbers read (before they go), then running headers/footers and page
     numbers dropped, using all pages as evidence.
  3. The reference list cut out (it needs page furniture gone so its heading is a line).
  4. Lines grouped into paragraphs; line-end hyphens mended with the document's own
     vocabulary as the judge of compounds.
  5. Passages packed from each page's paragraphs.
The DOI is searched before step 2, because journals print it in a running line.

Pages without text (a scanned figure page in an otherwise born-digital PDF) are kept as
empty pages, so page numbers stay true; only a PDF with no text on any page is refused.
"""

from __future__ import annotations

import hashlib
import re
from dataclasses import replace
from pathlib import Path

from rapidfuzz import fuzz

from sourcecheck.limits import Limits
from sourcecheck.model import Passage, Problem, Source
from sourcecheck.pdftext import (
    NO_TEXT,
    PdfUnreadable,
    RawPdf,
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
from sourcecheck.sources._identity import read_identity
from sourcecheck.sources._passages import make_passages
from sourcecheck.sources._printed import printed_page_numbers
from sourcecheck.sources._refsection import before_reference_heading, cut_reference_sections
from sourcecheck.sources._sections import run_in_heading
from sourcecheck.text import ends_sentence, find_dois

#: How much of page 1 is kept for matching a reference to this source.
FIRST_PAGE_CHARS = 2000

# Metadata titles that name the file or the authoring tool rather than the work.
_JUNK_TITLE = re.compile(
    r"^(?:untitled|title|document\d*|microsoft (?:word|powerpoint) - .*|.*\.(?:pdf|docx?|tex|dvi|"
    r"rtf|odt|indd|qxd|ps|eps))$",
    re.IGNORECASE,
)


# A passage head this close to the title is the title (rapidfuzz ratio, 0-100); common practice, no source.
TITLE_SIMILARITY = 90


def clean_title(value: str | None) -> str | None:
    """A metadata title worth trusting, or None for tool/file-name placeholders."""
    if not value:
        return None
    value = " ".join(normalize_chars(value).split())
    if len(value) < 4 or _JUNK_TITLE.match(value):
        return None
    return value


def _doi(raw: RawPdf, pages: list[list[str]]) -> str | None:
    """Metadata DOI first (info dictionary, then XMP), else the first one on pages 1-2."""
    for key in ("/doi", "/DOI", "/Subject", "/Keywords", "/Title"):
        if key in raw.info and (found := find_dois(raw.info[key])):
            return found[0]
    for key, value in raw.info.items():
        if key not in ("/Producer", "/Creator") and (found := find_dois(value)):
            return found[0]
    if found := find_dois(raw.xmp_text):
        return found[0]
    for lines in pages[:2]:
        if found := find_dois("\n".join(before_reference_heading(lines))):
            return found[0]
    return None


def _first_page_text(paragraphs: list[str]) -> str:
    text = "\n".join(paragraphs)
    if len(text) <= FIRST_PAGE_CHARS:
        return text
    cut = text.rfind(" ", 0, FIRST_PAGE_CHARS)
    return text[: cut if cut > 0 else FIRST_PAGE_CHARS]


def _first_line(paragraphs: list[list[str]]) -> str | None:
    """Page 1's first paragraph when it reads like a title (no closing punctuation)."""
    if paragraphs and paragraphs[0] and not ends_sentence(paragraphs[0][0]):
        return paragraphs[0][0]
    return None


def without_front_matter(passages: list[Passage], title: str | None) -> list[Passage]:
    """Cut page 1's title, author and affiliation text: it names the work, it backs nothing.

    Measured on SciFact (bench/calibrate.py): left in, the title passage ranked first for
    29% of claims, so the evidence shown was the title. The title's words are cut from
    the head of the page-1 passage that opens with them (the passage may run on into the
    body, which is kept); then short unpunctuated page-1 passages before the first real
    sentence (author and affiliation lines) are dropped.
    """
    title_words = title.split() if title and len(title.split()) >= 3 else []
    wanted = " ".join(title_words).lower()
    kept: list[Passage] = []
    in_front = True
    carried: str | None = None  # a section announced by a run-in heading the title hid
    for passage in passages:
        if passage.page == 1 and title_words:
            words = passage.text.split()
            head = " ".join(words[: len(title_words)]).lower()
            if fuzz.ratio(head, wanted) >= TITLE_SIMILARITY:
                words = words[len(title_words) :]
            elif in_front:
                words = words[_title_tail(words, title_words) :]
            if not words:
                continue
            if len(words) < len(passage.text.split()):
                rest = " ".join(words)
                heading = run_in_heading(rest)
                carried = heading[0] if heading and not passage.section else carried
                passage = replace(passage, text=rest)
        if passage.page == 1 and in_front and not ends_sentence(passage.text) and len(passage.text.split()) <= 30:
            continue
        if carried is not None:
            if passage.section:
                carried = None
            else:
                passage = replace(passage, section=carried)
        in_front = False
        kept.append(passage)
    return [replace(p, ordinal=i) for i, p in enumerate(kept)]


def _title_tail(words: list[str], title_words: list[str]) -> int:
    """How many leading ``words`` are the end of the title (a title set over two lines,
    whose last line ran into the next paragraph); 0 when fewer than three are."""

    def key(word: str) -> str:
        return word.strip(".,:;").lower()

    title = [key(w) for w in title_words]
    for n in range(min(len(words), len(title)), 2, -1):
        if [key(w) for w in words[:n]] == title[-n:]:
            return n
    return 0


def _with_running_lines(text: str, lines: list[list[str]], body: list[list[str]]) -> str:
    """Page 1's text plus the running lines cut from it.

    A running header often holds the journal, year and authors ("Field Notes 9, 2018
    Feltham & Wyncombe"): no evidence, but exactly what ties a reference to the file.
    """
    if not lines or not body:
        return text
    kept = set(body[0])
    cut = [line for line in lines[0] if line not in kept and line.strip()]
    return "\n".join([text, *cut]) if cut else text


def read_source(
    path: Path,
    display: str,
    sha256: str | None = None,
    max_words: int = 90,
    limits: Limits | None = None,
    notes: list[Problem] | None = None,
) -> Source | Problem:
    """Read one source PDF; any failure is a :class:`Problem` naming ``display``.

    Args:
        path: the file on disk.
        display: how the file is named to the user and in passages (its display path).
        sha256: the file's hash if the caller has it already (it keys the cache).
        max_words: the largest passage, in whitespace-separated words.
        limits: pages and seconds read of one PDF (:mod:`sourcecheck.limits`).
        notes: where a PDF read only in part is reported (the Source is still returned).
    """
    limits = limits or Limits()
    try:
        data = Path(path).read_bytes()
    except OSError as exc:
        return Problem(file=display, message=f"cannot open ({exc.strerror or exc})")
    try:
        raw = read_pdf(data, max_pages=limits.pdf_pages, seconds=limits.source_seconds)
    except PdfUnreadable as exc:
        return Problem(file=display, message=str(exc))
    except Exception as exc:  # pypdf failing where _pdf did not expect it: still one line
        return Problem(file=display, message=f"truncated or corrupt PDF ({one_line(exc)})")
    texts = [normalize_chars(page) for page in raw.pages]
    if not any(ch.isalnum() for page in texts for ch in page):
        return Problem(file=display, message=NO_TEXT)
    if raw.cut and notes is not None:
        notes.append(Problem(display, raw.cut))
    try:
        source = _build(raw, texts, display, sha256 or hashlib.sha256(data).hexdigest(), max_words)
        source.identity = read_identity(data, raw, texts, raw.info.get("/Title") or raw.xmp_title)
        return source
    except Exception as exc:  # a bug of ours on odd text must not stop the run either
        return Problem(file=display, message=f"text could not be processed ({exc!r})"[:160])


def _build(raw: RawPdf, texts: list[str], display: str, sha256: str, max_words: int) -> Source:
    lines = [split_lines(page) for page in texts]
    doi = _doi(raw, lines)
    body = cut_reference_sections(drop_running_lines(lines))
    vocab = vocabulary("\n".join(texts))
    median = typical_length(body)
    paragraphs = [[join_lines(p, vocab) for p in group_paragraphs(page, median)] for page in body]
    title = clean_title(raw.info.get("/Title")) or clean_title(raw.xmp_title)
    author = raw.info.get("/Author") or None
    return Source(
        path=display,
        sha256=sha256,
        pages=len(texts),
        title=title,
        doi=doi,
        first_page_text=_with_running_lines(_first_page_text(paragraphs[0]) if paragraphs else "", lines, body),
        passages=without_front_matter(make_passages(display, paragraphs, max_words), title or _first_line(paragraphs)),
        author=author,
        printed_pages=printed_page_numbers(lines),
    )
