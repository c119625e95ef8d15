"""Finding citation markers in running text: numbered brackets and author-year forms.

The finder works on plain strings and knows nothing of files or reference lists, so every
draft reader (Markdown now, LaTeX or Word later) can hand it sentences. It returns what
was written; tying a cited work to a reference entry is :mod:`sourcecheck.claims.resolve`'s
job, so a marker with no entry is still found and can be reported.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from sourcecheck.text import FAMILY, NAME_WORD, PARTICLE_RE

# Expanding "[1-5000]" would flood the report; a range wider than this keeps its two ends.
MAX_RANGE = 50
# Bracketed numbers above this are years or quantities, not reference numbers.
MAX_REFERENCE_NUMBER = 999

_DASH = r"[-‐‑‒–—]"
# Page, chapter, figure ... locators as in "[3, p. 7]" or "(Okafor, 2019, pp. 4–5)".
_LOCATOR_WORD = (
    r"(?i:pp|p|pages?|ch|chaps?|chapter|sec|sects?|section|§|paras?|¶|figs?|figure|"
    r"tables?|tab|eqs?|n|nn|notes?|vol|ll|l|lines?|cols?|slides?|min|art|fol|ff)"
)
_LOCATOR = (
    _LOCATOR_WORD
    + r"\.?\s*[\dA-Za-z]+(?:\s*"
    + _DASH
    + r"\s*[\dA-Za-z]+)?(?:\s*,\s*\d+(?:\s*"
    + _DASH
    + r"\s*\d+)?)*\.?"
)

# --- numbered markers ----------------------------------------------------------------

_NUM_ITEM = r"\d{1,4}(?:\s*" + _DASH + r"\s*\d{1,4})?"
_NUMERIC_RE = re.compile(
    r"\[\s*(?P<items>" + _NUM_ITEM + r"(?:\s*[,;]\s*" + _NUM_ITEM + r")*)(?:\s*,\s*(?P<loc>" + _LOCATOR + r"))?\s*\]"
)

# IEEE writes a range of references with two brackets: "[3]–[5]".
_BRACKET_RANGE_RE = re.compile(r"(?<![!^\]])\[(\d{1,3})\]\s*" + _DASH + r"\s*\[(\d{1,3})\](?![(:])")

# --- author-year markers -------------------------------------------------------------

_YEAR = r"(?:(?:1[5-9]|20)\d{2}[a-z]?|n\.\s?d\.|(?i:in\s+press|forthcoming))"
_YEARS = _YEAR + r"(?:\s*,\s*" + _YEAR + r")*"
# Inside parentheses a name may be a group of words ("World Health Organization").
_GROUP_NAME = FAMILY + r"(?:\s+(?:(?:of|for|the|on|and\s+the)\s+)?" + NAME_WORD + r"){0,5}(?:\s+\[[A-Z]{2,10}\])?"
_ET_AL = r"\s+et\s+al\.?"


def _authors(name: str) -> str:
    """Author-list pattern over one name form: single, "et al.", two, or a serial list."""
    return (
        rf"(?P<names>{name}(?:{_ET_AL}"
        rf"|\s*,?\s+(?:&|and)\s+{name}"
        rf"|(?:\s*,\s+{name})+\s*,?\s+(?:&|and)\s+{name})?)"
    )


_PREFIX = (
    r"(?:(?i:see\s+also|see|but\s+see|e\.\s?g\.|i\.\s?e\.|cf\.|for\s+example|for\s+instance|"
    r"compare|also|reviewed\s+in|as\s+cited\s+in|cited\s+in|after|following)\s*,?\s+)"
    r"|(?:(?:[a-z][\w.]*,?\s+){1,4}?)"
)
_PAREN_SEGMENT_RE = re.compile(
    rf"\s*(?:{_PREFIX})??{_authors(_GROUP_NAME)}\s*,?\s+(?P<years>{_YEARS})"
    rf"(?:\s*[,:]\s*(?P<loc>{_LOCATOR}|\d+(?:\s*{_DASH}\s*\d+)?))?\s*"
)
_PAREN_RE = re.compile(r"\(([^()]{4,400})\)")
_NARRATIVE_RE = re.compile(
    rf"(?<![\w.'’-]){_authors(FAMILY)}(?:['’]s?)?\s+\((?P<years>{_YEARS})"
    rf"(?:\s*,\s*(?P<loc>{_LOCATOR}))?\)"
)
_YEAR_PART_RE = re.compile(r"(?P<y>\d{4})(?P<s>[a-z]?)|(?P<nd>n\.\s?d\.)|(?P<other>.+)")
_NAME_SPLIT_RE = re.compile(r"\s*,?\s+(?:&|and)\s+|\s*,\s+")

# Capitalised words that sit before a year in parentheses without being an author:
# "(May 2019)", "(Summer 2020)", "(Table 2, 2019)".
_NOT_NAMES = frozenset(
    [
        "january",
        "february",
        "march",
        "april",
        "may",
        "june",
        "july",
        "august",
        "september",
        "october",
        "november",
        "december",
        "jan",
        "feb",
        "mar",
        "apr",
        "jun",
        "jul",
        "aug",
        "sep",
        "sept",
        "oct",
        "nov",
        "dec",
        "spring",
        "summer",
        "autumn",
        "fall",
        "winter",
        "in",
        "on",
        "at",
        "since",
        "until",
        "from",
        "before",
        "after",
        "during",
        "circa",
        "ca",
        "about",
        "around",
        "early",
        "late",
        "mid",
        "est",
        "founded",
        "updated",
        "accessed",
        "retrieved",
        "published",
        "revised",
        "copyright",
        "figure",
        "fig",
        "table",
        "section",
        "chapter",
        "page",
        "vol",
        "volume",
        "issue",
        "year",
        "years",
        "census",
        "version",
        "see",
        "also",
        "the",
        "a",
        "an",
        "this",
        "that",
        "these",
        "those",
        "our",
        "we",
        "it",
        "its",
        "by",
        "ad",
        "bc",
        "ce",
        "bce",
        "fy",
        "q1",
        "q2",
        "q3",
        "q4",
        "up",
        "to",
        "through",
        "between",
        "and",
        "or",
        "of",
        "for",
    ]
)


@dataclass(frozen=True)
class NumberCite:
    """One reference number inside a numbered marker."""

    number: int
    locator: str | None = None

    @property
    def label(self) -> str:
        """The single work as a person would write it alone: "[2]"."""
        return f"[{self.number}]"


@dataclass(frozen=True)
class AuthorYearCite:
    """One work inside an author-year marker: the names written, the year and suffix."""

    names: tuple[str, ...]
    et_al: bool
    year: int | None
    suffix: str = ""
    year_text: str = ""
    locator: str | None = None

    @property
    def label(self) -> str:
        """APA-like parenthetical form of the single work, e.g. "Okafor et al., 2019"."""
        if self.et_al:
            who = f"{self.names[0]} et al."
        elif len(self.names) == 2:
            who = f"{self.names[0]} & {self.names[1]}"
        elif len(self.names) > 2:
            who = ", ".join(self.names[:-1]) + f", & {self.names[-1]}"
        else:
            who = self.names[0]
        return f"{who}, {self.year_text}"


Cite = NumberCite | AuthorYearCite


@dataclass(frozen=True)
class Marker:
    """A citation marker as found: its text, where it sits, and the works it cites."""

    text: str
    start: int
    end: int
    cites: tuple[Cite, ...]


def find_markers(text: str) -> list[Marker]:
    """All citation markers in ``text``, in order of position.

    Markdown constructs that use brackets (links, images, footnote references, task
    boxes, reference-style links) and parentheses holding a year but no author are
    left alone.
    """
    masked = mask_markup(text)
    found = _numeric_markers(text, masked)
    taken = [(m.start, m.end) for m in found]
    for marker in _parenthetical_markers(text, masked) + _narrative_markers(text, masked):
        if not any(marker.start < end and start < marker.end for start, end in taken):
            found.append(marker)
            taken.append((marker.start, marker.end))
    return sorted(found, key=lambda m: m.start)


def mask_markup(text: str) -> str:
    """``text`` with inline code, link targets and HTML tags blanked to spaces.

    Same length as the input, so match offsets stay valid for the original text.
    """

    def blank(match: re.Match[str]) -> str:
        return " " * len(match.group(0))

    masked = re.sub(r"`+[^`\n]*`+", blank, text)
    masked = re.sub(r"(?<=\])\([^()\s]*(?:\s+\"[^\"]*\")?\)", blank, masked)
    masked = re.sub(r"<(?:https?://|mailto:|/?[A-Za-z][^<>]*)[^<>]*>", blank, masked)
    return masked


def _numeric_markers(text: str, masked: str) -> list[Marker]:
    markers: list[Marker] = []
    for match in _BRACKET_RANGE_RE.finditer(masked):
        first, last = int(match.group(1)), int(match.group(2))
        cites = _expand_numbers(f"{first}-{last}", None)
        if cites:
            markers.append(Marker(text[match.start() : match.end()], *match.span(), tuple(cites)))
    for match in _NUMERIC_RE.finditer(masked):
        start, end = match.span()
        if any(m.start <= start < m.end for m in markers):
            continue  # one end of an IEEE range "[3]–[5]", already taken
        before = text[start - 1] if start else " "
        after = text[end] if end < len(text) else " "
        if before in "!^" or after in "(:":
            continue  # image, footnote, link "[3](url)", or link definition "[3]: url"
        if before == "]" and not _follows_numeric_marker(masked, start):
            continue  # reference-style link "[text][3]"
        cites = _expand_numbers(match.group("items"), _clean_locator(match.group("loc")))
        if cites:
            markers.append(Marker(text[start:end], start, end, tuple(cites)))
    return sorted(markers, key=lambda m: m.start)


def _follows_numeric_marker(masked: str, start: int) -> bool:
    """True for "[1][2]" (two markers) as against "[text][2]" (a reference-style link)."""
    opening = masked.rfind("[", 0, start - 1)
    return opening >= 0 and _NUMERIC_RE.fullmatch(masked[opening:start]) is not None


def _expand_numbers(items: str, locator: str | None) -> list[NumberCite]:
    numbers: list[int] = []
    for part in re.split(r"\s*[,;]\s*", items.strip()):
        ends = [int(n) for n in re.split(r"\s*" + _DASH + r"\s*", part)]
        if len(ends) == 2 and 0 <= ends[1] - ends[0] <= MAX_RANGE:
            numbers.extend(range(ends[0], ends[1] + 1))
        else:
            numbers.extend(ends)
    if not numbers or any(n < 1 or n > MAX_REFERENCE_NUMBER for n in numbers):
        return []
    unique = list(dict.fromkeys(numbers))
    return [NumberCite(n, locator) for n in unique]


def _parenthetical_markers(text: str, masked: str) -> list[Marker]:
    markers: list[Marker] = []
    for match in _PAREN_RE.finditer(masked):
        cites: list[AuthorYearCite] = []
        for segment in match.group(1).split(";"):
            parsed = _PAREN_SEGMENT_RE.fullmatch(segment)
            if parsed is None:
                cites = []
                break  # one segment that is not a citation: ordinary parentheses
            new = _author_year_cites(parsed)
            if not new:
                cites = []
                break
            cites.extend(new)
        if cites:
            start, end = match.span()
            markers.append(Marker(text[start:end], start, end, tuple(cites)))
    return markers


def _narrative_markers(text: str, masked: str) -> list[Marker]:
    markers: list[Marker] = []
    pos = 0
    while (match := _NARRATIVE_RE.search(masked, pos)) is not None:
        cites = _author_year_cites(match)
        if cites:
            start, end = match.span()
            markers.append(Marker(text[start:end], start, end, tuple(cites)))
            pos = end
        else:
            pos = match.start() + 1
    return markers


def _author_year_cites(match: re.Match[str]) -> list[AuthorYearCite]:
    """Cites of one "names, years[, locator]" match, or [] when the names are no names."""
    raw = re.sub(r"\s+", " ", match.group("names")).strip()
    raw = re.sub(r"\s*\[[A-Z]{2,10}\]", "", raw)  # "Institute [NIMH]": the name is the long form
    et_al = re.search(_ET_AL + "$", raw) is not None
    raw = re.sub(_ET_AL + "$", "", raw)
    names = tuple(re.sub(r"['’]s$", "", n.strip()) for n in _NAME_SPLIT_RE.split(raw) if n.strip())
    if not names or any(_is_not_name(n) for n in names):
        return []
    locator = _clean_locator(match.group("loc"))
    cites = []
    for part in re.split(r"\s*,\s*", match.group("years").strip()):
        year_match = _YEAR_PART_RE.fullmatch(part)
        assert year_match is not None  # the alternation above matches any non-empty string
        if year_match.group("y"):
            year, suffix = int(year_match.group("y")), year_match.group("s")
            year_text = f"{year}{suffix}"
        else:
            year, suffix = None, ""
            year_text = "n.d." if year_match.group("nd") else re.sub(r"\s+", " ", part).lower()
        cites.append(AuthorYearCite(names, et_al, year, suffix, year_text, locator))
    return cites


def _is_not_name(name: str) -> bool:
    words = [w for w in re.sub(r"^" + PARTICLE_RE + "+", "", name).split() if w[:1].isupper()]
    return not words or any(w.lower().strip(".") in _NOT_NAMES for w in words)


def _clean_locator(locator: str | None) -> str | None:
    if not locator:
        return None
    return re.sub(r"\s+", " ", locator).strip().rstrip(",;") or None
