"""What a source PDF says it is: title, identifiers and first authors, read from the file itself.

A reference is tied to its PDF by what both show. The metadata title is often a file or
template name ("Proceedings Template - WORD", "pone.0115884 1..14"), so the title is read
from the first page's layout instead: the largest type near the top, which is how a person
finds it. Sizes come from pypdf's ``extract_text(visitor_text=...)``: the font size times
the text and page matrices' vertical scale (PDF 1.7 reference, section 5.3.3, from memory).

Publishers sometimes put a cover page first (Taylor & Francis, IOP, BMC's "Provisional
PDF"): when page 1 reads like one and page 2 opens with large type, page 2 gives the title.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from io import BytesIO
from itertools import pairwise

from pypdf import PdfReader
from rapidfuzz import fuzz

from sourcecheck.model import SourceIdentity
from sourcecheck.pdftext import RawPdf, normalize_chars, quiet_pypdf
from sourcecheck.sources._refsection import before_reference_heading
from sourcecheck.text import find_dois

#: Phrases of a publisher's cover page (seen on the Taylor & Francis, IOP and BMC covers of
#: the development set in ../shared/data/papers).
COVER_MARKERS = re.compile(
    r"to cite this article|full terms & conditions|this content was downloaded|view the article online|"
    r"provisional pdf|download by:|related content|article citing this",
    re.IGNORECASE,
)
#: Large-type runs that name the journal or a label rather than the work.
_FURNITURE = re.compile(r"\bdoi\b|https?:|www\.|arxiv:|issn|©|\bopen access\b|^(?:\S ){4,}", re.IGNORECASE)
#: A bracketed note set with the title (a version or review status).
_NOTE = re.compile(r"\[[^\]]*\]")
#: Degrees printed after names ("Lucy Yardley, PhD").
_DEGREE = re.compile(r"^(?:PhD|MSc|MD|MA|BA|BSc|MPH|MPP|FRCGP|FRCP|DPhil|Dr|Prof)$")
#: arXiv identifiers, new style (1503.07589, since 2007) and old style (hep-ph/0101001)
#: (arXiv help pages on identifiers, from memory).
ARXIV = re.compile(
    r"arxiv(?:\.org/(?:abs|pdf)/|\s*:\s*)((?:\d{4}\.\d{4,5})|(?:[a-z\-]+(?:\.[A-Z]{2})?/\d{7}))(?:v\d+)?", re.IGNORECASE
)
#: The title needs this many words; "future internet" or "Perspective" in big type is not a title.
MIN_TITLE_WORDS = 3
#: A title's type is at least this much larger than the page's body text.
TITLE_SIZE_RATIO = 1.15
#: Lines of one block lie at most this many font sizes apart (baseline to baseline).
LINE_GAP = 2.0
#: A metadata title is trusted when it is found on the title page at least this well
#: (rapidfuzz ``partial_ratio`` on folded text, 0-100; common practice, no source).
PLAUSIBLE_METADATA = 85
#: How many printed authors to keep: matching looks at the first few only.
MAX_AUTHORS = 6
#: Characters at the head and at the foot of a page where running lines stand.
RUNNING_ZONE = 250
#: Pages searched for identifiers.
ID_PAGES = 2


@dataclass(frozen=True)
class Run:
    """A piece of text drawn at one size and position on a page."""

    text: str
    size: float
    x: float
    y: float


def _runs(reader: PdfReader, index: int) -> list[Run]:
    """The upright text runs of one page with their effective font sizes."""
    runs: list[Run] = []

    def visit(text: str, cm: list[float], tm: list[float], _font: object, size: float) -> None:
        if not text.strip():
            return
        a, b, c, d, e, f = tm
        ca, cb, cc, cd, ce, cf = cm
        m = (a * ca + b * cc, a * cb + b * cd, c * ca + d * cc, c * cb + d * cd)
        x, y = e * ca + f * cc + ce, e * cb + f * cd + cf
        if abs(m[1]) > abs(m[0]) * 0.1:  # rotated text: a margin stamp, not the title
            return
        runs.append(Run(normalize_chars(text), round(size * math.hypot(m[2], m[3]), 1), x, y))

    reader.pages[index].extract_text(visitor_text=visit)
    return runs


def _join(runs: list[Run]) -> str:
    """Runs of one block read in order: top to bottom, then left to right."""
    ordered = sorted(runs, key=lambda r: (-round(r.y), r.x))
    out = ""
    for run in ordered:
        piece = run.text.replace("\n", " ")
        if out and not out.endswith(" ") and not piece.startswith((" ", ",", ".", ":", ";", ")")):
            out += " "
        out += piece
    return " ".join(out.split())


def _blocks(runs: list[Run]) -> list[tuple[float, float, str]]:
    """(size, top y, text) of each run of same-size lines, largest type first."""
    by_size: dict[float, list[Run]] = {}
    for run in runs:
        by_size.setdefault(run.size, []).append(run)
    blocks: list[tuple[float, float, str]] = []
    for size, group in by_size.items():
        group.sort(key=lambda r: -r.y)
        current = [group[0]]
        for prev, run in pairwise(group):
            if prev.y - run.y > LINE_GAP * size:
                blocks.append((size, current[0].y, _join(current)))
                current = []
            current.append(run)
        blocks.append((size, current[0].y, _join(current)))
    return sorted(blocks, key=lambda b: (-b[0], -b[1]))


def _body_size(runs: list[Run]) -> float:
    """The size most of the page's characters are set in."""
    weight: dict[float, int] = {}
    for run in runs:
        weight[run.size] = weight.get(run.size, 0) + len(run.text)
    return max(weight, key=lambda s: weight[s]) if weight else 0.0


def _title_block(runs: list[Run], later: list[str]) -> tuple[str, float, float] | None:
    """The page's title, its type size and its top y: the largest type that reads like a title.

    ``later`` are the texts of the pages after it: a large line that comes back at the head
    or foot of most of them is the journal's name in a running line, not the title.
    """
    body = _body_size(runs)
    for size, top, text in _blocks(runs):
        if size < body * TITLE_SIZE_RATIO:
            return None
        text = _NOTE.sub(" ", text).strip()  # "[v2; ref status: indexed, http://...]"
        if len(text.split()) >= MIN_TITLE_WORDS and not _FURNITURE.search(text) and not _runs_on(text, later):
            return text.rstrip(" .*"), size, top
    return None


def _runs_on(text: str, later: list[str]) -> bool:
    """Whether ``text`` stands in the running lines (first or last characters) of most of ``later``."""
    wanted = _fold(text)
    zones = [_fold(page[:RUNNING_ZONE] + " " + page[-RUNNING_ZONE:]) for page in later if page.strip()]
    return len(zones) >= 2 and sum(wanted in zone for zone in zones) * 2 > len(zones)


def _authors_below(runs: list[Run], title_top: float, title_size: float) -> tuple[str, ...]:
    """Names from the first block below the title: split at commas, '&' and 'and'."""
    below = [r for r in runs if r.y < title_top and r.size < title_size]
    blocks = sorted(_blocks(below), key=lambda b: -b[1])
    for _, _, text in blocks[:2]:
        names = []
        for part in re.split(r",|&|\band\b|;", text):
            name = re.sub(r"[\d*†‡§⇑⇤∗,]+|\b[a-z]$", " ", part).strip()
            if re.fullmatch(r"[^\W\d_][\w.'’\- ]{1,60}", name) and not name.islower() and not _DEGREE.match(name):
                names.append(" ".join(name.split()))
        if len(names) >= 1 and all(len(n.split()) <= 5 for n in names):
            return tuple(names[:MAX_AUTHORS])
    return ()


def _fold(text: str) -> str:
    return re.sub(r"[\W_]+", "", text.lower())


def _plausible(meta: str | None, page_text: str) -> str | None:
    """The metadata title when the title page shows it (not a file or template name)."""
    if not meta or len(meta.split()) < 2:
        return None
    folded = _fold(meta)
    if folded and fuzz.partial_ratio(folded, _fold(page_text)) >= PLAUSIBLE_METADATA:
        return meta
    return None


def _identifiers(raw: RawPdf, texts: list[str]) -> tuple[tuple[str, ...], tuple[str, ...]]:
    """DOIs and arXiv ids on the first pages (before any reference list) and in the metadata."""
    dois: list[str] = []
    arxiv: list[str] = []
    meta = " ".join([*raw.info.values(), raw.xmp_text])
    for page in [*texts[:ID_PAGES], meta]:
        text = "\n".join(before_reference_heading(page.split("\n")))
        dois.extend(d for d in find_dois(text) if d not in dois)
        arxiv.extend(a.lower() for a in ARXIV.findall(text) if a.lower() not in arxiv)
    return tuple(dois), tuple(arxiv)


def read_identity(data: bytes, raw: RawPdf, texts: list[str], metadata_title: str | None) -> SourceIdentity:
    """The source's identity; parts that cannot be read stay empty (never raises)."""
    dois, arxiv = _identifiers(raw, texts)
    title: str | None = None
    authors: tuple[str, ...] = ()
    page = 1
    try:
        with quiet_pypdf():
            reader = PdfReader(BytesIO(data), strict=False)
            if reader.is_encrypted:
                reader.decrypt("")
            # Page 2 is walked only behind a cover page: the layout pass costs about a page's extraction.
            cover = bool(texts) and COVER_MARKERS.search(texts[0]) is not None
            pages = [_runs(reader, i) for i in range(min(2 if cover else 1, len(reader.pages)))]
        found = [_title_block(runs, texts[i + 1 : i + 4]) for i, runs in enumerate(pages)]
        page = 2 if len(found) > 1 and found[1] else 1
        block = found[page - 1] if found else None
        if block:
            title, size, top = block
            authors = _authors_below(pages[page - 1], top, size)
    except Exception:  # a layout pypdf cannot walk: the identity falls back to metadata and ids
        pass
    title_page = texts[page - 1] if len(texts) >= page else ""
    return SourceIdentity(
        title=title,
        metadata_title=_plausible(metadata_title, title_page),
        dois=dois,
        arxiv_ids=arxiv,
        authors=authors,
        title_page=page,
    )
