"""Page locators of citations ("p. 7", "pp. 321–28"): which pages of the source are cited.

A citation that names a page tells us where the author read the claim, so the judge
looks there first (see :func:`prefers_located`). Only page locators are read; a chapter,
section, figure or note locator ("ch. 3", "sec. 2", "fig. 1") names no page and gives
None, so the whole source is searched as before.

Printed page numbers and PDF pages differ for most journal articles (an article that
starts on p. 305 prints 305 on PDF page 1). :func:`pdf_pages` maps the cited numbers
through the source's printed page labels first, and only when none of them is printed
in the source takes them for PDF page numbers, since some writers cite the PDF's own
page numbers.
"""

from __future__ import annotations

import re
from collections.abc import Sequence

from sourcecheck.model import Hit

#: Widest page range read as written; a wider one ("pp. 1–5000") is read as its two ends,
#: so a typo does not turn a page check into a whole-document search.
MAX_SPAN = 200

#: How far (in cosine similarity) the located pages' best passage may trail the best
#: passage of the whole source and still be the one judged. The cosine, not the ranked
#: score: the second retrieval stage scores in its own units and favours results
#: sections, while the question here is only whether the cited page says the claim as
#: closely as the best page does. Why 0.05: within it, two passages
#: rank by noise (the fused score is 0.7 x cosine + 0.3 x scaled BM25, and two passages
#: stating one finding differ by a few hundredths), so the author's page is as good as
#: the best and it is the page a reader turns to. Past it the cited page does not hold
#: the backing. Measured on the bundled demo (sample_manuscript/draft.md against
#: sample_sources/, all 12 citations whose best passage has fused score >= 0.7): the page
#: holding the backing led every other page of its source by 0.10 to 0.56, so a wrong
#: page is never within 0.05 there; for the two adrift claims the page leads were 0.04
#: and 0.06, noise, which is why no page-mismatch is said for an adrift claim. (Those
#: leads were measured on the fused score, 0.7 x cosine + 0.3 x scaled BM25, before the
#: ranker; the demo's page tests, tests/test_page_locators.py, hold on the cosine alone.)
PAGE_MARGIN = 0.05

_DASH = r"(?:--|[-‐‑‒–—])"
_NUMBER = r"\d{1,5}"
# One item: "7", "7–9", "321–28", "7f", "7ff", "45n12" (page 45, note 12).
_ITEM = re.compile(
    r"(?P<first>" + _NUMBER + r")(?:\s*" + _DASH + r"\s*(?P<last>" + _NUMBER + r"))?"
    r"(?P<following>\s*ff?\.?(?![a-z]))?(?:\s*n\.?\s*\d+)?",
    re.IGNORECASE,
)
_PAGE_WORD = re.compile(r"(?:pp?|pg|pages?)(?:\.|(?=[\s~\d]))[\s~]*", re.IGNORECASE)
_SEPARATOR = re.compile(r"\s*(?:,|;|&|\band\b)\s*", re.IGNORECASE)


def _expand_last(first: str, last: str) -> int:
    """The end of a range written short, "321–28" -> 328 (Chicago Manual of Style 9.61).

    A shorter second number replaces the last digits of the first; one that is not
    shorter is taken as written.
    """
    if len(last) < len(first):
        return int(first[: len(first) - len(last)] + last)
    return int(last)


def _item_pages(match: re.Match[str]) -> set[int]:
    first = int(match.group("first"))
    following = (match.group("following") or "").strip().rstrip(".").lower()
    if match.group("last"):
        last = _expand_last(match.group("first"), match.group("last"))
        if last < first:
            return set()
        if last - first > MAX_SPAN:
            return {first, last}
        return set(range(first, last + 1))
    if following == "f":  # "7f." is page 7 and the one after it
        return {first, first + 1}
    if following == "ff":  # "7ff." has no stated end: the page and the next two (common practice, no source)
        return {first, first + 1, first + 2}
    return {first}


def cited_pages(locator: str | None) -> frozenset[int] | None:
    """The page numbers a locator cites, as printed in the work; None if it cites no page.

    Read: "p. 7", "pp. 4–6", "pp. 4--6" and "pp.~4--6" (LaTeX), "page 7", "pages 7-9",
    "pp. 33-35, 38-39 and passim", "pp. 321–28", "p. 7f.", "p. 45n12", and a bare
    "33" (Pandoc reads a bare number as a page). Anything after the page list ("p. 7,
    fig. 2") is ignored; a locator of another kind ("ch. 3", "fig. 1") gives None.
    """
    if not locator:
        return None
    text = locator.strip()
    word = _PAGE_WORD.match(text)
    if word:
        text = text[word.end() :]
    elif not text[:1].isdigit():
        return None
    pages: set[int] = set()
    position = 0
    while True:
        item = _ITEM.match(text, position)
        if item is None:
            break
        pages |= _item_pages(item)
        position = item.end()
        separator = _SEPARATOR.match(text, position)
        if separator is None:
            break
        position = separator.end()
    pages.discard(0)
    return frozenset(pages) or None


def pdf_pages(cited: frozenset[int], printed: Sequence[str | None], page_count: int) -> set[int]:
    """The 1-based PDF pages that ``cited`` points at, printed labels first.

    ``printed`` holds each PDF page's printed number (or None). When any cited number is
    printed in the source, the pages that print one are the answer; otherwise the numbers
    are taken as PDF pages, those within the document kept. May be empty: the cited page
    is not in this source at all.
    """
    labels = {str(number) for number in cited}
    located = {i for i, label in enumerate(printed, start=1) if label in labels}
    if located:
        return located
    return {n for n in cited if 1 <= n <= page_count}


def page_label(page: int, printed: Sequence[str | None]) -> str:
    """How a PDF page is named to a person: "p. 305 (PDF p. 1)" when its printed number
    is known and differs, else "p. 1"."""
    label = printed[page - 1] if 0 < page <= len(printed) else None
    if label is None or label == str(page):
        return f"p. {page}"
    return f"p. {label} (PDF p. {page})"


def prefers_located(located: list[Hit], whole: list[Hit], margin: float = PAGE_MARGIN) -> bool:
    """Whether the cited pages back the claim about as well as the whole source does.

    True when the located pages' best cosine similarity is within ``margin`` of the
    whole source's best (see :data:`PAGE_MARGIN` for why), so they are the hits to judge.
    Both lists come from one index and one query, so their scores are comparable.
    """
    if not located:
        return False
    if not whole:
        return True
    return max(h.dense for h in located) >= max(h.dense for h in whole) - margin
