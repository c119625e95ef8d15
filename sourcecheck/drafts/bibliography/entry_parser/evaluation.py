"""Cross-validation helpers: near-duplicate groups, folds, and per-field scoring.

Kept in the package (not in bench/) so the tests can check them on tiny input and the
bench script and any later measurement share one definition of "correct".

Scoring rules, per entry and only where the hand labels hold the field:
title and container are correct at rapidfuzz ``fuzz.ratio`` >= 90 on normalised text
(folded case and accents, punctuation dropped); the year must match exactly; the first
author's family name must match after :func:`sourcecheck.text.family_key` (case,
accents and particles folded); a DOI must match exactly (both lower-cased).
"""

from __future__ import annotations

import random
import re
from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np
from rapidfuzz import fuzz, process

from sourcecheck.drafts.bibliography.entry_parser.fields import EntryFields, decode_fields, spans_from_labels
from sourcecheck.drafts.bibliography.entry_parser.labelled import LabelledEntry, token_labels
from sourcecheck.drafts.bibliography.entry_parser.tokens import tokenize
from sourcecheck.text import family_key, fold

FIELDS: tuple[str, ...] = ("title", "year", "first_author", "container", "doi")
FUZZY_MIN = 90
# Titles this short ("Introduction") are shared by unrelated works, so they do not group.
MIN_GROUPING_TITLE_WORDS = 4


@dataclass(frozen=True)
class Guess:
    """The fields a parser under test offers for one entry (None: it offers none)."""

    authors: tuple[str, ...]
    title: str | None
    container: str | None
    year: int | None
    doi: str | None


def guess_of(fields: EntryFields) -> Guess:
    return Guess(fields.authors, fields.title, fields.container, fields.year, fields.doi)


def gold_fields(entry: LabelledEntry) -> EntryFields:
    """Fields decoded from the hand labels, exactly as from the tagger's labels."""
    return decode_fields(entry.text, spans_from_labels(entry.text, tokenize(entry.text), token_labels(entry)))


def normalise(text: str) -> str:
    """Folded case and accents, punctuation turned to spaces, spaces collapsed."""
    return " ".join(re.sub(r"[\W_]+", " ", fold(text)).split())


def near_duplicate_groups(texts: Sequence[str], titles: Sequence[str | None], threshold: int = FUZZY_MIN) -> list[int]:
    """A group number per entry; near-identical entries share one.

    Two entries are linked when their normalised texts reach ``fuzz.ratio`` >= threshold,
    or when their normalised titles (of at least four words) are equal; groups are the
    connected components of those links (union-find), so a chain of near-copies of one
    work lands in one group.
    """
    n = len(texts)
    parent = list(range(n))

    def root(i: int) -> int:
        while parent[i] != i:
            parent[i] = parent[parent[i]]
            i = parent[i]
        return i

    def link(i: int, j: int) -> None:
        parent[root(i)] = root(j)

    normalised = [normalise(t) for t in texts]
    if n > 1:
        scores = process.cdist(normalised, normalised, scorer=fuzz.ratio, score_cutoff=threshold, dtype=np.uint8)
        for i, j in zip(*np.nonzero(np.triu(scores, k=1)), strict=True):
            link(int(i), int(j))
    by_title: dict[str, int] = {}
    for i, title in enumerate(titles):
        key = normalise(title or "")
        if len(key.split()) >= MIN_GROUPING_TITLE_WORDS:
            if key in by_title:
                link(i, by_title[key])
            else:
                by_title[key] = i
    roots: dict[int, int] = {}
    return [roots.setdefault(root(i), len(roots)) for i in range(n)]


def assign_folds(groups: Sequence[int], folds: int, seed: int) -> list[int]:
    """A fold number per entry; every group in one fold, folds of near-equal size.

    Groups are shuffled with ``seed``, then placed largest first into the smallest fold.
    """
    sizes = Counter(groups)
    order = sorted(sizes)
    random.Random(seed).shuffle(order)
    order.sort(key=lambda g: -sizes[g])  # stable: ties keep the shuffled order
    load = [0] * folds
    fold_of: dict[int, int] = {}
    for group in order:
        target = min(range(folds), key=lambda f: (load[f], f))
        fold_of[group] = target
        load[target] += sizes[group]
    return [fold_of[g] for g in groups]


def score_entry(gold: EntryFields, guess: Guess) -> dict[str, bool]:
    """Correct or not, per field the gold entry holds."""
    result: dict[str, bool] = {}
    if gold.title:
        result["title"] = _fuzzy_equal(gold.title, guess.title)
    if gold.year is not None:
        result["year"] = guess.year == gold.year
    if gold.authors and family_key(gold.authors[0]):
        result["first_author"] = bool(guess.authors) and family_key(guess.authors[0]) == family_key(gold.authors[0])
    if gold.container:
        result["container"] = _fuzzy_equal(gold.container, guess.container)
    if gold.doi:
        result["doi"] = (guess.doi or "").lower() == gold.doi.lower()
    return result


def _fuzzy_equal(gold: str, guess: str | None) -> bool:
    return guess is not None and fuzz.ratio(normalise(gold), normalise(guess)) >= FUZZY_MIN


@dataclass
class Tally:
    """Correct and scored counts per (group, field)."""

    correct: Counter[tuple[str, str]] = field(default_factory=Counter)
    scored: Counter[tuple[str, str]] = field(default_factory=Counter)

    def add(self, groups: Sequence[str], scores: dict[str, bool]) -> None:
        for group in groups:
            for name, ok in scores.items():
                self.scored[group, name] += 1
                self.correct[group, name] += int(ok)

    def rate(self, group: str, name: str) -> float | None:
        n = self.scored[group, name]
        return self.correct[group, name] / n if n else None

    def groups(self) -> list[str]:
        seen: dict[str, None] = {}
        for group, _ in self.scored:
            seen.setdefault(group, None)
        return list(seen)


_VANCOUVER_AUTHORS_RE = re.compile(r"^[^\W\d_][\w'’-]+(?: [\w'’-]+)* [A-Z]{1,3}(?:,|\.?$)")


def style_family(entry: LabelledEntry) -> str:
    """A coarse style family read cheaply off the hand labels and punctuation.

    no-author (title or venue first), vancouver ("Okafor AB, Lin C"), year-after-authors
    in brackets (APA, Harvard), bare year after authors (Chicago author-date), quoted title
    (IEEE, MLA, Chicago notes), place-publisher-year in brackets (Chicago notes), and the
    rest: year late (computer science, Nature-like).
    """
    labels = [label for label, _ in entry.spans if label != "citation-number"]
    texts = dict(reversed([(label, text) for label, text in entry.spans]))
    if not labels or labels[0] not in {"author", "editor"}:
        return "no-author"
    if _VANCOUVER_AUTHORS_RE.match(texts.get("author", "").strip()):
        return "vancouver"
    second = labels[1] if len(labels) > 1 else ""
    if second == "date":
        return "year-after-authors-bracketed" if texts["date"].lstrip().startswith("(") else "year-after-authors"
    if texts.get("title", "").lstrip()[:1] in {"“", '"', "‘", "«"}:
        return "quoted-title"
    if texts.get("location", "").lstrip().startswith("("):
        return "bracketed-publication"
    return "year-late"


def per_group_table(tally: Tally, groups: Sequence[str]) -> list[list[str]]:
    """Rows of "group, n, rate per field" for printing."""
    rows = []
    for group in groups:
        cells = [group, str(max((tally.scored[group, f] for f in FIELDS), default=0))]
        for name in FIELDS:
            rate = tally.rate(group, name)
            cells.append("-" if rate is None else f"{100 * rate:5.1f} ({tally.scored[group, name]})")
        rows.append(cells)
    return rows
