"""Tying a cited work to an entry of the reference list.

Conservative on purpose: a wrong match would make the tool check a claim against the
wrong source and report it as backed or not, which is worse than reporting an unresolved
marker that a person can fix in a minute.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence

from rapidfuzz.distance import Levenshtein

from sourcecheck.claims.markers import AuthorYearCite, Cite, NumberCite
from sourcecheck.model import Reference
from sourcecheck.text import family_key

# A misspelt family name is accepted only this close, and only when long enough for one
# slip not to turn one real name into another ("Lin" / "Liu").
_MAX_EDITS = 1
_MIN_FUZZY_LENGTH = 6


class Resolver:
    """Looks up reference keys for cites of one draft's reference list."""

    def __init__(self, references: Sequence[Reference]) -> None:
        self._references = list(references)
        self._keys = {r.key for r in self._references}

    def resolve(self, cite: Cite) -> str | None:
        """The key of the entry ``cite`` points at, or None when no entry fits for sure."""
        if isinstance(cite, NumberCite):
            key = str(cite.number)
            return key if key in self._keys else None
        return self._resolve_author_year(cite)

    def _resolve_author_year(self, cite: AuthorYearCite) -> str | None:
        same_year = [r for r in self._references if r.year == cite.year]
        if cite.suffix:
            same_year = [r for r in same_year if r.year_suffix == cite.suffix]
        first = family_key(cite.names[0])
        candidates = [r for r in same_year if r.authors and family_key(r.authors[0]) == first]
        if not candidates and len(first) >= _MIN_FUZZY_LENGTH:
            candidates = [
                r
                for r in same_year
                if r.authors and Levenshtein.distance(family_key(r.authors[0]), first) <= _MAX_EDITS
            ]
        if not cite.suffix and len(candidates) > 1:
            unsuffixed = [r for r in candidates if not r.year_suffix]
            candidates = unsuffixed or candidates
        candidates = _prefer(candidates, lambda r: _fits_author_count(r, cite))
        if len(cite.names) > 1:
            second = family_key(cite.names[1])
            candidates = _prefer(candidates, lambda r: len(r.authors) > 1 and family_key(r.authors[1]) == second)
        return candidates[0].key if len(candidates) == 1 else None


def _fits_author_count(reference: Reference, cite: AuthorYearCite) -> bool:
    """APA 7 (from memory, section 8.17): one or two authors are named, three or more "et al."."""
    if cite.et_al:
        return len(reference.authors) >= 3
    return len(reference.authors) == len(cite.names)


def _prefer(candidates: list[Reference], test: Callable[[Reference], bool]) -> list[Reference]:
    """The candidates passing ``test`` if any do, else all of them (a soft filter)."""
    passing = [r for r in candidates if test(r)]
    return passing or candidates
