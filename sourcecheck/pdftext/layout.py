"""Page layout clean-up: running headers/footers, page numbers, paragraphs, line-end hyphens.

pypdf gives one string per page with one line of print per text line. Typeset pages
repeat a journal line, a short title or a page number at the top or bottom of every page;
left in, these lines split sentences and pollute retrieval. We work on lists of lines,
one list per page, and only ever look at the first and last few lines of a page for
such furniture, so body text is never touched by these rules.
"""

from __future__ import annotations

import math
import re
import statistics
from collections import Counter

from sourcecheck.pdftext.chars import SOFT_HYPHEN

#: How many non-empty lines at each end of a page may be a running header or footer.
RUNNING_ZONE = 3
#: How many non-empty lines at each end of a page may be a lone page number.
NUMBER_ZONE = 2
#: Fewest pages with text before any line is called "running": two pages sharing a first
#: line may be chance, three pages that share it make a pattern.
MIN_PAGES_FOR_RUNNING = 3
#: Share of text pages a line must top or tail to count as running. Half, so that
#: alternating headers (journal name on even pages, short title on odd) are caught.
RUNNING_SHARE = 0.5

# "3", "- 3 -", "[3]", "Page 3", "p. 3", "3 of 10", "3/10", "Page 3 of 10", "iv".
_PAGE_NUMBER = re.compile(
    r"^(?:(?:page|pg\.?|p\.)\s*)?[-–—(\[]?\s*(?:\d{1,4}|[ivxlc]{1,7})\s*[-–—)\]]?"
    r"(?:\s*(?:of|/)\s*\d{1,4})?$",
    re.IGNORECASE,
)
_SPACES = re.compile(r"[ ]{2,}")
_WORD = re.compile(r"[^\W\d_]+(?:-[^\W\d_]+)*")
_ENDS_SENTENCE = re.compile(r"[.!?][\"'”’)\]]*$")
_NO_HEADING_END = ".,;:!?-–—"


def split_lines(page_text: str) -> list[str]:
    """Lines of a page, each stripped with inner runs of spaces collapsed; blanks kept."""
    return [_SPACES.sub(" ", line).strip() for line in page_text.split("\n")]


def is_page_number(line: str) -> bool:
    """A line that holds nothing but a page number in one of the usual forms."""
    return bool(_PAGE_NUMBER.match(line.strip()))


def _running_key(line: str) -> str:
    """A line with its numbers blanked, so "Page 3" and "Page 4" are the same line."""
    return re.sub(r"\d+", "#", line.lower()).strip()


def _zone(lines: list[str], size: int) -> set[int]:
    filled = [i for i, line in enumerate(lines) if line]
    return set(filled[:size] + filled[-size:])


def drop_running_lines(pages: list[list[str]]) -> list[list[str]]:
    """Remove running headers/footers and lone page numbers from every page.

    A running line is one that, after its digits are blanked, sits among the first or last
    :data:`RUNNING_ZONE` lines of at least :data:`RUNNING_SHARE` of the pages with text
    (and on two pages at least), in documents of :data:`MIN_PAGES_FOR_RUNNING` text pages or
    more. Lone page numbers are dropped from the first and last :data:`NUMBER_ZONE`
    lines of any page, since their form alone gives them away.
    """
    zones = [_zone(lines, RUNNING_ZONE) for lines in pages]
    text_pages = sum(1 for lines in pages if any(lines))
    running: set[str] = set()
    if text_pages >= MIN_PAGES_FOR_RUNNING:
        counts: Counter[str] = Counter()
        for lines, zone in zip(pages, zones, strict=True):
            counts.update({_running_key(lines[i]) for i in zone})
        threshold = max(2, math.ceil(text_pages * RUNNING_SHARE))
        running = {key for key, count in counts.items() if count >= threshold and key}
    cleaned: list[list[str]] = []
    for lines, zone in zip(pages, zones, strict=True):
        numbers = _zone(lines, NUMBER_ZONE)
        cleaned.append(
            [
                line
                for i, line in enumerate(lines)
                if not (i in zone and _running_key(line) in running) and not (i in numbers and is_page_number(line))
            ]
        )
    return cleaned


def _starts_block(line: str) -> bool:
    first = line[:1]
    return first.isupper() or first.isdigit() or first in "\"'“‘([•"


def typical_length(pages: list[list[str]]) -> float:
    """Median length of the non-empty lines of a document (0.0 for fewer than four)."""
    lengths = [len(line) for lines in pages for line in lines if line]
    return statistics.median(lengths) if len(lengths) >= 4 else 0.0


def group_paragraphs(lines: list[str], median: float | None = None) -> list[list[str]]:
    """Group a page's lines into paragraphs.

    pypdf does not mark paragraph ends, so we infer them (common practice, no source):
    a blank line ends one; so does a line clearly shorter than the page's typical line
    (under 80 % of the median) that ends a sentence when the next line starts like a new
    one. A short line (under 60 %) with no closing punctuation, followed by a line that
    starts like a new one, is taken for a heading and stands alone. ``median`` is the
    typical line length, best taken over the whole document (:func:`typical_length`) so
    that a page of three lines is judged like the rest; by default it is the page's own.
    With no typical length (0.0) only blank lines count.
    """
    if median is None:
        median = typical_length([lines])
    paragraphs: list[list[str]] = []
    current: list[str] = []

    def flush() -> None:
        nonlocal current
        if current:
            paragraphs.append(current)
        current = []

    for i, line in enumerate(lines):
        following = lines[i + 1] if i + 1 < len(lines) else ""
        if not line:
            flush()
            continue
        new_block_next = bool(following) and bool(median) and _starts_block(following)
        if new_block_next and len(line) < 0.6 * median and line[-1] not in _NO_HEADING_END and _starts_block(line):
            flush()
            paragraphs.append([line])
            continue
        current.append(line)
        if new_block_next and len(line) < 0.8 * median and _ENDS_SENTENCE.search(line):
            flush()
    flush()
    return paragraphs


def vocabulary(text: str) -> set[str]:
    """Lower-cased words (hyphenated compounds whole) found anywhere in ``text``."""
    return {word.lower() for word in _WORD.findall(text)}


_LINE_END_HYPHEN = re.compile(r"([^\W\d_][\w-]*)-$")
_LEADING_WORD = re.compile(r"[^\W\d_]+")


def join_lines(lines: list[str], vocab: set[str]) -> str:
    """Join the lines of one paragraph into a single string, mending line-end hyphens.

    Rules (common practice, no source), for a line ending in letter + "-":
      * next line starts lower-case: the hyphen is a break, joined away ("preva-" +
        "lence" -> "prevalence"), unless the document itself uses the hyphenated form and
        never the closed one ("long-term" elsewhere, "longterm" nowhere), or the word is
        already a hyphenated chain ("state-of-the-" + "art"): then the hyphen stays;
      * next line starts otherwise (capital, digit: "COVID-" + "19"): hyphen kept, no space.
    A soft hyphen (U+00AD) at a line end always joins with no space; soft hyphens
    elsewhere are removed. Other line ends become one space.
    """
    out = ""
    for line in lines:
        if not out:
            out = line
            continue
        hyphen = _LINE_END_HYPHEN.search(out)
        if out.endswith(SOFT_HYPHEN):
            out = out[:-1] + line
        elif hyphen and line[:1].islower():
            left = hyphen.group(1)
            lead = _LEADING_WORD.match(line)
            right = lead.group(0) if lead else ""
            closed, open_ = (left + right).lower(), f"{left}-{right}".lower()
            keep = "-" in left or (open_ in vocab and closed not in vocab)
            out = out + line if keep else out[:-1] + line
        elif hyphen or (out.endswith("–") and line[:1].isdigit()):
            out = out + line
        else:
            out = f"{out} {line}"
    return out.replace(SOFT_HYPHEN, "")
