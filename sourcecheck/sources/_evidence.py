"""How strongly one reference entry points at one source file, from every kind of evidence.

Each kind of evidence adds points, read as log-odds in base 2 (a point doubles the odds that
the pair is right), so kinds that are independent add up and one global assignment can
weigh them against each other (sources/_assign.py). The weights are set by hand, not
fitted: a DOI or arXiv id is near proof; a long title is strong; a short title, or the
first author with the year, only supports. They were checked, not tuned, on the
hand-written real-paper lists of tests/fixtures/real_references.

The title is looked for twice: as the parser read it from the entry, and as the source
prints it, found anywhere inside the entry's text (``fuzz.partial_ratio``), which needs no
parse at all; a bad parse of the entry then costs nothing when the title is in it.
"""

from __future__ import annotations

import re
import unicodedata
from dataclasses import dataclass
from functools import lru_cache
from itertools import pairwise

from rapidfuzz import fuzz
from rapidfuzz.fuzz import partial_ratio_alignment

from sourcecheck.model import MatchMethod, Reference, Source
from sourcecheck.sources._identity import ARXIV
from sourcecheck.text import find_dois, normalize_doi

#: Points per kind of evidence (log-odds, base 2; set by hand, see the module docstring).
DOI_POINTS = 8.0
ARXIV_POINTS = 7.0
TITLE_POINTS = 5.0  # times the title similarity (0.85-1.0)
SHORT_TITLE_POINTS = 3.0  # a title of fewer than SHORT_TITLE_WORDS words found in the entry
AUTHOR_YEAR_POINTS = 1.0  # plus the share of the entry's names found (author-year tier)
PRINTED_AUTHOR_POINTS = 1.0  # the source's first printed author opens the entry
YEAR_POINTS = 0.5  # ... and a year of the entry is printed on the source's first page
#: A source whose printed DOI differs from the entry's DOI is probably another work.
DOI_CONFLICT_POINTS = -3.0
#: Fewer content words than this make a title "short": common words can meet by chance.
SHORT_TITLE_WORDS = 5
#: Least ``partial_ratio`` (0-100) of a title of SHORT_TITLE_WORDS or more words inside the
#: entry, by the title's folded length: the shorter, the fewer slips it may have (set by hand;
#: common practice, no source). Shorter titles must stand exactly (:func:`_bounded_phrase`).
IN_ENTRY_FLOORS = ((60, 90.0), (30, 94.0), (0, 97.0))
#: A word of a title found in the entry needs a counterpart this close (``fuzz.ratio``).
WORD_FLOOR = 80
#: How much of the entry's start may hold the first author (characters).
HEAD = 80
#: Characters of a title before a subtitle that can stand alone (four words or so).
MAIN_TITLE_FACTOR = 0.95


@lru_cache(maxsize=1 << 18)
def fold(text: str) -> str:
    """Lower case, accents removed, punctuation to spaces, spaces collapsed.

    Cached large enough for a library: every entry is compared with every file's title
    lines, 1,000 files hold about 20,000 candidate strings, and a cache smaller than those
    evicted each one before the next entry reached it.
    """
    text = unicodedata.normalize("NFKD", text)
    text = "".join(ch for ch in text if not unicodedata.combining(ch))
    return " ".join(re.sub(r"[^\w\s]|_", " ", text.lower()).split())


def squash(text: str) -> str:
    """:func:`fold` without spaces: survives extractors that drop or add word spaces."""
    return fold(text).replace(" ", "")


@dataclass(frozen=True)
class Evidence:
    """What ties one entry to one source: total points, the leading kind, and in words."""

    points: float
    method: MatchMethod | None
    similarity: float
    detail: str
    closeness: float  # 0..1, how alike the titles look even when below every floor

    @property
    def confidence(self) -> float:
        """Points as a probability-like 0..1 (1 - 2^-points), for people to read."""
        return 0.0 if self.points <= 0 else round(1 - 0.5**self.points, 4)


def _floor(length: int) -> float:
    return next(floor for least, floor in IN_ENTRY_FLOORS if length >= least)


def _content(words: list[str]) -> list[str]:
    # Single letters are glyph debris more often than words ("A d" for "Aδ", "s" of "√s").
    return [w for w in words if len(w) > 1 and w not in _STOP]


_STOP = frozenset(
    {"a", "an", "and", "are", "as", "at", "by", "for", "from", "in", "into", "is", "of"}
    | {"on", "or", "the", "to", "vs", "versus", "with", "within"}
)


def _words_found(title: str, span: str) -> bool:
    """Every content word of the title has a close word in the span (one slip in ten allowed)."""
    words, others = _content(title.split()), span.split()
    if not words or not others:
        return False
    # Hyphens mended differently split or join words ("grass-land", "grassland").
    others += [a + b for a, b in pairwise(others)]

    def found(word: str) -> bool:
        return any(fuzz.ratio(word, o) >= WORD_FLOOR or (len(word) >= 4 and word in o) for o in others)

    misses = sum(1 for w in words if not found(w))
    return misses <= len(words) // 10


def _spaced_well(title: str) -> bool:
    words = title.split()
    return bool(words) and sum(len(w) for w in words) / len(words) <= 12


def is_short(title: str) -> bool:
    """Fewer than :data:`SHORT_TITLE_WORDS` words: such a title can stand inside another.

    A title whose word spaces were lost in extraction is not short, however few its "words".
    """
    folded = fold(title)
    return _spaced_well(folded) and len(folded.split()) < SHORT_TITLE_WORDS


def _unaccented(text: str) -> str:
    text = unicodedata.normalize("NFKD", text)
    return "".join(ch for ch in text if not unicodedata.combining(ch)).lower()


def _bounded_phrase(title: str, entry: str) -> bool:
    """The title's words, in order and exactly, set off by punctuation or the entry's ends.

    "Sleep and memory" stands alone in "Lin B. Sleep and memory. J Sleep." but not in
    "Lin B. Sleep and memory consolidation in adults.": a short title is only trusted
    where the entry's punctuation closes it, which needs no parse of the entry.
    """
    words = fold(title).split()
    if len(words) < 2:
        return False
    body = r"[\W_]+".join(re.escape(w) for w in words)
    return re.search(rf"(?:^|[^\w\s])\s*{body}\s*(?:$|[^\w\s])", _unaccented(entry)) is not None


def title_in_entry(title: str, entry: str) -> tuple[float, float]:
    """(score 0..1 when the title stands in the entry, else 0; raw closeness 0..1)."""
    folded_title, folded_entry = fold(title), fold(entry)
    if not folded_title or not folded_entry:
        return 0.0, 0.0
    if is_short(title):
        if _bounded_phrase(title, entry):
            return 1.0, 1.0
        return 0.0, fuzz.partial_ratio(folded_title, folded_entry) / 100
    if _spaced_well(folded_title):
        found = partial_ratio_alignment(folded_title, folded_entry)
        if found is None:
            return 0.0, 0.0
        start = folded_entry.rfind(" ", 0, found.dest_start) + 1
        end = folded_entry.find(" ", found.dest_end)
        span = folded_entry[start : end if end >= 0 else len(folded_entry)]
        ok = found.score >= _floor(len(folded_title)) and _words_found(folded_title, span)
        return (found.score / 100 if ok else 0.0), found.score / 100
    squashed = squash(title)  # spaces lost in extraction: only the characters can be compared
    found = partial_ratio_alignment(squashed, squash(entry))
    if found is None:
        return 0.0, 0.0
    ok = found.score >= max(_floor(len(squashed)), 95.0)
    return (found.score / 100 if ok else 0.0), found.score / 100


def main_title(title: str) -> str | None:
    """The part before a subtitle separator, if it is long enough to stand alone."""
    for sep in (": ", " - ", " – ", " — ", ". "):
        if sep in title:
            head = title.split(sep, 1)[0]
            return head if len(head.split()) >= 4 else None
    return None


@lru_cache(maxsize=1 << 16)
def title_forms(title: str) -> tuple[tuple[str, float], ...]:
    """A title folded, and its main title folded at :data:`MAIN_TITLE_FACTOR` when it has one.

    Cached: over a library every entry's title meets every file's title lines, so the same
    strings were split and folded once per (entry, file) pair.
    """
    main = main_title(title)
    forms = [(fold(title), 1.0)]
    if main:
        forms.append((fold(main), MAIN_TITLE_FACTOR))
    return tuple(forms)


def printed_titles(source: Source) -> list[str]:
    """The titles the source shows of itself: as typeset, and its metadata title if plausible."""
    identity = source.identity
    return [t for t in dict.fromkeys([identity.title, identity.metadata_title]) if t]


def best_title_in_entry(source: Source, entry: str) -> tuple[float, float, str]:
    """(score, closeness, the title) of the source's best title found in the entry."""
    best = (0.0, 0.0, "")
    for title in printed_titles(source):
        variants = [(title, 1.0)]
        if main := main_title(title):
            variants.append((main, MAIN_TITLE_FACTOR))
        for text, factor in variants:
            score, close = title_in_entry(text, entry)
            best = max(best, (score * factor, close * factor, text))
    return best


def family_name(printed: str) -> str:
    """The family name of a name as printed ("Esther M F van Sluijs" -> "Sluijs")."""
    words = [w for w in printed.split() if w.strip(".").lower() not in {"jr", "sr", "ii", "iii", "iv"}]
    return words[-1] if words else ""


def entry_dois(reference: Reference) -> set[str]:
    """The entry's DOI as parsed, and any DOI in its text."""
    found = set(find_dois(reference.text))
    if reference.doi and (doi := normalize_doi(reference.doi)):
        found.add(doi)
    return found


def entry_arxiv_ids(reference: Reference) -> set[str]:
    return {a.lower() for a in ARXIV.findall(reference.text)}


def printed_author_points(reference: Reference, source: Source) -> tuple[float, str]:
    """The source's first printed author at the head of the entry, and a shared year."""
    if not source.identity.authors:
        return 0.0, ""
    family = squash(family_name(source.identity.authors[0]))
    if len(family) < 2 or family not in squash(reference.text[:HEAD]):
        return 0.0, ""
    years = set(re.findall(r"\b(?:19|20)\d{2}\b", reference.text))
    shared = any(re.search(rf"\b{y}\b", source.first_page_text) for y in years)
    points = PRINTED_AUTHOR_POINTS + (YEAR_POINTS if shared else 0.0)
    return points, f"first author {family_name(source.identity.authors[0])}" + (" and year" if shared else "")
