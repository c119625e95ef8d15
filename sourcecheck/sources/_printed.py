"""Printed page numbers: the number each PDF page shows, read from its own text.

A journal article that starts on p. 305 prints 305, 306, ... on its PDF pages 1, 2, ...,
and a citation's "p. 306" means PDF page 2. The number sits where page furniture sits:
a lone line ("306", "Page 306", "306 of 317") or inside a running header or footer
("Field Notes 9 (2018) 306"). :mod:`._layout` drops those lines; here they are read
first.

Any one number near a page edge may be a year, a volume or a figure of the text, so a
number is only trusted as a page number through agreement: the candidates of every page
vote for an offset (printed number minus PDF page), and the offset is kept only when it
is the single most voted one, by at least two pages and at least half of the pages with
text: numbers increasing by one per page. Otherwise no page gets a printed number and
citations are read as PDF pages. Roman numerals (front matter) are not read.
"""

from __future__ import annotations

import math
import re
from collections import Counter

from sourcecheck.pdftext import NUMBER_ZONE, RUNNING_ZONE, is_page_number

#: Share of text pages that must agree on one offset (see the module docstring).
AGREEING_SHARE = 0.5
#: Fewest pages that must agree: one page proves no sequence.
MIN_AGREEING = 2

# A whole number of at most four digits, not part of a decimal, a longer number or a DOI.
_ARABIC = re.compile(r"(?<![\d.,])\d{1,4}(?!\d|[.,]\d)")


def _edge_lines(lines: list[str], size: int) -> list[tuple[int, str]]:
    filled = [(i, line) for i, line in enumerate(lines) if line]
    chosen = filled[:size] + filled[-size:]
    return sorted(set(chosen))


def page_candidates(lines: list[str]) -> set[int]:
    """Numbers that could be the page's printed number: every arabic number in the first
    and last :data:`RUNNING_ZONE` lines (headers and footers hold it among other words),
    and the number of a lone page-number line ("Page 7 of 9" gives 7) near either end."""
    found: set[int] = set()
    for _, line in _edge_lines(lines, RUNNING_ZONE):
        found.update(int(n) for n in _ARABIC.findall(line))
    for _, line in _edge_lines(lines, NUMBER_ZONE):
        if is_page_number(line):
            first = _ARABIC.search(line)
            if first:
                found.add(int(first.group(0)))
    found.discard(0)
    return found


def printed_page_numbers(pages: list[list[str]]) -> tuple[str | None, ...]:
    """The printed number of each page (as text), or ``()`` when no consistent one is found.

    ``pages`` are the lines of each PDF page before page furniture is dropped. Pages that
    carry the agreed number get it; a page between two such pages that shows none (a
    full-page figure) gets the number its place implies, since the sequence runs through
    it; pages before the first and after the last numbered one get None (a cover sheet
    added in front of an article carries no number of the article).
    """
    candidates = [page_candidates(lines) for lines in pages]
    votes: Counter[int] = Counter()
    for number, found in enumerate(candidates, start=1):
        votes.update({value - number for value in found})
    text_pages = sum(1 for lines in pages if any(lines))
    needed = max(MIN_AGREEING, math.ceil(text_pages * AGREEING_SHARE))
    ranked = votes.most_common(2)
    if not ranked or ranked[0][1] < needed or (len(ranked) > 1 and ranked[1][1] == ranked[0][1]):
        return ()
    offset = ranked[0][0]
    agreeing = [number for number, found in enumerate(candidates, start=1) if number + offset in found]
    first, last = agreeing[0], agreeing[-1]
    return tuple(
        str(number + offset) if first <= number <= last and number + offset > 0 else None
        for number in range(1, len(pages) + 1)
    )
