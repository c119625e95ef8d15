"""Page text of a manuscript PDF: superscript reference numbers and line-number margins.

Two things a submitted manuscript has that a published source rarely needs handled:

**Superscript markers.** Vancouver-style drafts cite with raised numbers ("rose²"). Plain
text extraction prints them as ordinary digits ("rose2"), which no marker finder can tell
from a quantity. pypdf's ``extract_text(visitor_text=...)`` hands us each run of text it
assembles with its text matrix and font size, and ``visitor_operand_before`` shows every
content-stream operator, so the text rise (``Ts``) can be followed too. A run is taken for
a superscript marker when all of these hold (common practice, no source):

- it holds only reference-number characters: digits, commas, hyphens and dashes
  ("2", "2,3", "4–6"), with at most three digits per number;
- it is set noticeably smaller than the body: at most :data:`SMALLER` of the body size,
  the body size being the most used font size of the document, counted per letter;
- it is raised: a positive text rise (``Ts``), or a baseline above the previous run's by
  :data:`RAISED` to :data:`MAX_LIFT` of the body size (a typesetter's ``Td``/``Tm`` move);
- it comes right after a word: the previous run ends in a letter or closing punctuation.

Such a run becomes "[2,3]" glued to the word before ("rose[2,3]"), and any line break
pypdf put around it because of the raised baseline is taken out again. Subscripts (CO₂:
lowered, not raised) and small digits at a line start are left alone.

**Line-number margins.** Review copies number their lines (1, 2, 3 ... or 5, 10, 15 ...),
and the numbers come out at the start of each line ("12 Rates rose ..."). See
:func:`strip_line_numbers`.
"""

from __future__ import annotations

import contextlib
import math
import re
from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Any

from pypdf import PdfReader

# open_pdf is the shared PDF layer's; it refuses encrypted or broken files exactly as read_pdf does.
from sourcecheck.pdftext import open_pdf, quiet_pypdf

#: A superscript is set at most this share of the body font size (TeX sets them at 70 %, from memory).
SMALLER = 0.85
#: A baseline this share of the body size above the previous run's counts as raised.
RAISED = 0.15
#: ... and at most this share: higher up is another line or column, not a superscript.
MAX_LIFT = 1.0
#: A rise (Ts) below this share of the run's own size is jitter, not a superscript.
MIN_RISE = 0.1
#: A run after a raised marker whose baseline is within this share of the body size of
#: the marker's line resumes that line.
SAME_LINE = 0.5

_MARKER_TEXT = re.compile(r"^\d{1,3}(?:\s*[,\-‐‑‒–—]\s*\d{1,3})*$")
_WORD_END = re.compile(r"[^\W\d_][.,;:)\]’”'\"]?$")
_SHOW_OPERATORS = frozenset({b"Tj", b"TJ", b"'", b'"'})


@dataclass(frozen=True)
class Run:
    """One piece of text as pypdf assembled it: baseline y, effective size and rise."""

    text: str
    y: float
    size: float
    rise: float


@dataclass
class _Collector:
    """Receives pypdf's visitor calls for one page and keeps the runs in order."""

    runs: list[Run] = field(default_factory=list)
    _rise: float = 0.0
    _saved: list[float] = field(default_factory=list)
    _shown_rise: float | None = None

    def operator(self, operator: bytes, operands: list[Any], cm: list[float], tm: list[float]) -> None:
        """Follow the text rise: Ts sets it, q/Q save and restore it with the graphics state.

        ISO 32000-1 (from memory) section 9.3.7: Ts sets the text rise, in unscaled text
        space units; 9.3.1: text state parameters are part of the graphics state.
        """
        if operator == b"q":
            self._saved.append(self._rise)
        elif operator == b"Q":
            self._rise = self._saved.pop() if self._saved else 0.0
        elif operator == b"Ts":
            with contextlib.suppress(IndexError, TypeError, ValueError):
                self._rise = float(operands[0])
        elif operator in _SHOW_OPERATORS:
            # The run is reported later (at the next flush), so remember the rise it was shown with.
            rise = self._rise
            self._shown_rise = rise if self._shown_rise is None else max(self._shown_rise, rise)

    def text(self, text: str, cm: list[float], tm: list[float], font: Any, size: float) -> None:
        if not text:
            return
        m = _multiply(tm, cm)
        scale = math.hypot(m[2], m[3]) or 1.0
        rise = (self._shown_rise or 0.0) * scale
        self.runs.append(Run(text, m[5], float(size or 0.0) * scale, rise))
        self._shown_rise = None


def _multiply(a: Sequence[float], b: Sequence[float]) -> list[float]:
    """The product of two PDF matrices [a b c d e f] (ISO 32000-1, 8.3.4; from memory)."""
    try:
        return [
            a[0] * b[0] + a[1] * b[2],
            a[0] * b[1] + a[1] * b[3],
            a[2] * b[0] + a[3] * b[2],
            a[2] * b[1] + a[3] * b[3],
            a[4] * b[0] + a[5] * b[2] + b[4],
            a[4] * b[1] + a[5] * b[3] + b[5],
        ]
    except (IndexError, TypeError):
        return [1.0, 0.0, 0.0, 1.0, 0.0, 0.0]


def page_runs(data: bytes, max_pages: int | None = None) -> list[list[Run] | None]:
    """The runs of every page (the first ``max_pages``), None for a page pypdf could not walk.

    Call only on data :func:`sourcecheck.pdftext.reader.read_pdf` has accepted; any failure
    here is left to the caller, which then keeps read_pdf's plain text.
    """
    pages: list[list[Run] | None] = []
    with quiet_pypdf():
        reader: PdfReader = open_pdf(data)
        for number, page in enumerate(reader.pages, start=1):
            if max_pages is not None and number > max_pages:
                break
            collector = _Collector()
            try:
                page.extract_text(visitor_text=collector.text, visitor_operand_before=collector.operator)
            except Exception:
                pages.append(None)
                continue
            pages.append(collector.runs)
    return pages


def body_size(pages: Sequence[Sequence[Run] | None]) -> float:
    """The document's body font size: the size that sets the most letters (0.0 if none)."""
    counts: Counter[float] = Counter()
    for runs in pages:
        for run in runs or ():
            letters = sum(ch.isalpha() for ch in run.text)
            if letters and run.size > 0:
                counts[round(run.size, 1)] += letters
    return counts.most_common(1)[0][0] if counts else 0.0


def is_superscript(run: Run, previous: Run | None, body: float) -> bool:
    """Whether ``run`` is a raised reference number right after the word in ``previous``."""
    if previous is None or body <= 0 or not _MARKER_TEXT.match(run.text.strip()):
        return False
    if run.size <= 0 or run.size > SMALLER * body:
        return False
    lift = run.y - previous.y
    raised = run.rise >= MIN_RISE * run.size or RAISED * body <= lift <= MAX_LIFT * body
    return raised and _WORD_END.search(previous.text.rstrip()) is not None


def assemble(runs: Sequence[Run], body: float) -> str:
    """The page text with superscript markers written as "[n]"; otherwise pypdf's text."""
    out = ""
    previous: Run | None = None  # the last run with visible text
    resume: float | None = None  # baseline of the line a marker was set on
    for run in runs:
        if not run.text.strip():
            out += run.text
            continue
        if is_superscript(run, previous, body) and previous is not None:
            numbers = re.sub(r"\s+", "", run.text.strip())
            out = out.rstrip() + f"[{numbers}]" + run.text[len(run.text.rstrip()) :]
            resume = previous.y
            continue
        if resume is not None:
            stripped = out.rstrip()
            if abs(run.y - resume) <= SAME_LINE * body and "\n" in out[len(stripped) :]:
                # pypdf broke the line at the raised baseline; in print it is one line.
                out = stripped + (" " if run.text[:1].isalnum() else "")
            resume = None
        out += run.text
        previous = run
    return out


def marked_pages(data: bytes, plain: Sequence[str]) -> list[str]:
    """Each page's text with superscript markers bracketed, or ``plain``'s where unsure.

    A page is rebuilt from its runs only when the runs put together give exactly pypdf's
    own text for it, so nothing but the markers can differ from the sources stage's text.
    """
    try:
        pages = page_runs(data, len(plain))
    except Exception:
        return list(plain)
    if len(pages) != len(plain):
        return list(plain)
    body = body_size(pages)
    texts: list[str] = []
    for runs, text in zip(pages, plain, strict=True):
        if runs is None or "".join(run.text for run in runs) != text:
            texts.append(text)
        else:
            texts.append(assemble(runs, body))
    return texts


# --- line-number margins ---------------------------------------------------------------

_LEADING_NUMBER = re.compile(r"^(\d{1,5})(?:\s+(?=\S)|$)")
#: Fewest numbered lines on a page before the numbers are taken for a margin.
MIN_NUMBERED = 3
#: Share of a page's lines the numbering must account for (numbered lines x step).
NUMBERED_SHARE = 0.5
#: Widest step between printed numbers (every 5th or every 10th line is usual).
MAX_STEP = 10


def _longest_chain(candidates: Sequence[tuple[int, int]]) -> list[int]:
    """Indices into ``candidates`` of the longest run of numbers that can be line numbers.

    Each (position, value) pair is a non-empty line's position on the page and its leading
    integer. Consecutive members must rise, and by no more than the lines between them
    (an unnumbered heading or equation may sit between two numbered lines, but numbers
    cannot run ahead of the lines).
    """
    best_length = [1] * len(candidates)
    back = [-1] * len(candidates)
    for j, (pj, vj) in enumerate(candidates):
        for i in range(j):
            pi, vi = candidates[i]
            if 0 < vj - vi <= pj - pi and best_length[i] + 1 > best_length[j]:
                best_length[j] = best_length[i] + 1
                back[j] = i
    if not candidates:
        return []
    end = max(range(len(candidates)), key=lambda k: best_length[k])
    chain: list[int] = []
    while end >= 0:
        chain.append(end)
        end = back[end]
    return chain[::-1]


def _margin(lines: list[str], step_hint: int | None = None) -> tuple[list[int], int] | None:
    """Line indices whose leading integer is a margin number, and the numbering step.

    With ``step_hint`` (the step found on the document's other pages) a page too short to
    show the pattern on its own is accepted when its numbers rise and are multiples of it.
    """
    filled = [i for i, line in enumerate(lines) if line.strip()]
    candidates: list[tuple[int, int]] = []
    where: list[int] = []
    for position, index in enumerate(filled):
        match = _LEADING_NUMBER.match(lines[index].strip())
        if match:
            candidates.append((position, int(match.group(1))))
            where.append(index)
    chain = _longest_chain(candidates)
    step = 0
    for k in chain:
        step = math.gcd(step, candidates[k][1])
    if step_hint is not None:
        fits = bool(chain) and step % step_hint == 0
        step = step_hint
    else:
        fits = len(chain) >= MIN_NUMBERED and step <= MAX_STEP
    if not fits or len(chain) * step < NUMBERED_SHARE * len(filled):
        return None
    return [where[k] for k in chain], step


def strip_line_numbers(pages: list[list[str]]) -> list[list[str]]:
    """The pages' lines without a line-number margin; pages without one are unchanged.

    A page has the margin when the leading integers of its lines form a rising sequence
    that keeps pace with the lines (see :func:`_longest_chain`), of at least
    :data:`MIN_NUMBERED` lines, that accounts for at least :data:`NUMBERED_SHARE` of the
    page's non-empty lines once the step is counted: 1, 2, 3 numbers every line, 5, 10, 15
    every fifth (step = the numbers' greatest common divisor, at most :data:`MAX_STEP`).
    Once some page has it, a short page (a last page of a few lines) is judged with that
    page's step. Only the integers of the sequence are removed; a line that merely opens
    with a number ("12 participants ...") keeps it, and a line that was only a number
    becomes empty.
    """
    found = [_margin(lines) for lines in pages]
    steps = Counter(margin[1] for margin in found if margin)
    hint = steps.most_common(1)[0][0] if steps else None
    out: list[list[str]] = []
    for lines, margin in zip(pages, found, strict=True):
        if margin is None and hint is not None:
            margin = _margin(lines, hint)
        stripped = list(lines)
        for index in margin[0] if margin else ():
            stripped[index] = _LEADING_NUMBER.sub("", stripped[index].strip(), count=1)
        out.append(stripped)
    return out
