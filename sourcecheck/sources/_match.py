"""Tying reference entries to source files, most trusted evidence first.

Tiers, each only over the references and sources still unmatched:
  1. map          the user's --map file: taken as given.
  2. doi          the entry's DOI equals the source's (similarity 1.0) or is printed on
                  its first two pages (0.95).
  3. title        the entry's title is nearly the source's metadata title or a line
                  near the top of its first page (see :func:`title_similarity`).
  4. author-year  the entry's first author's family name and its year both appear on
                  the source's first page (or the name in its /Author): the weakest,
                  since one author publishes several papers a year.
Within a tier a source goes to one reference only: the best-scoring claim wins, and a
tie (two entries equally good for one file, or one entry equally good for two files) is
left unmatched rather than guessed.
"""

from __future__ import annotations

import itertools
import posixpath
import re
import unicodedata
from collections.abc import Iterable
from dataclasses import dataclass
from functools import lru_cache

from rapidfuzz import fuzz

from sourcecheck.model import MatchMethod, Problem, Reference, Source, SourceMatch
from sourcecheck.text import find_dois, normalize_doi

#: Least character-level similarity (rapidfuzz ``fuzz.ratio``, 0-100, on lower-cased,
#: punctuation-free titles). Measured on invented pairs in the tests: a one-letter typo or
#: British/American spelling scores 98-99, a dropped plural 99; but swapping one word
#: ("adolescents" -> "adults", "winter" -> "summer") still scores 91, so this bound
#: alone cannot tell near misses apart and :data:`WORD_FLOOR` does that part.
TITLE_THRESHOLD = 90
#: Every non-stop word of either title must have a counterpart in the other with at
#: least this ``fuzz.ratio``: spelling variants ("randomized"/"randomised" 90) pass,
#: different words ("adults"/"adolescents" 71, "long"/"short" 44) fail.
WORD_FLOOR = 80
#: Discount for matching only the main title, before a colon (the subtitle missing).
MAIN_TITLE_FACTOR = 0.95
#: How many first-page paragraphs may hold the title.
TITLE_LINES = 12
#: Similarity given to a DOI found in the text rather than in the metadata.
DOI_IN_TEXT = 0.95

_STOP = frozenset(
    {"a", "an", "and", "are", "as", "at", "by", "for", "from", "in", "into", "is", "of"}
    | {"on", "or", "the", "to", "vs", "versus", "with", "within"}
)


@lru_cache(maxsize=8192)
def _fold(text: str) -> str:
    """Lower case, accents removed, punctuation to spaces, spaces collapsed.

    Cached: every reference is compared with every source's title lines, so the same
    texts are folded again and again (it was most of a warm run's time on 40 sources).
    """
    text = unicodedata.normalize("NFKD", text)
    text = "".join(ch for ch in text if not unicodedata.combining(ch))
    return " ".join(re.sub(r"[^\w\s]|_", " ", text.lower()).split())


def _content_words(text: str) -> list[str]:
    return [w for w in text.split() if w not in _STOP]


def _words_align(a: str, b: str) -> bool:
    """Every content word of each title has a close counterpart in the other."""
    wa, wb = _content_words(a), _content_words(b)
    if not wa or not wb:
        return False
    for words, others in ((wa, wb), (wb, wa)):
        for word in words:
            if max(fuzz.ratio(word, other) for other in others) < WORD_FLOOR:
                return False
    return True


def _main_title(title: str) -> str | None:
    """The part before a subtitle separator, if it is long enough to stand alone."""
    for sep in (": ", " - ", " – ", " — ", ". "):
        if sep in title:
            head = title.split(sep, 1)[0]
            return head if len(head.split()) >= 4 else None
    return None


def title_similarity(reference_title: str, candidates: Iterable[str]) -> float:
    """Best similarity in [0, 1] of a title against candidate strings, 0.0 if none passes.

    A candidate passes when its ``fuzz.ratio`` with the title is at least
    :data:`TITLE_THRESHOLD` and the content words align (:data:`WORD_FLOOR`). Either side
    may also be compared by its main title alone, at :data:`MAIN_TITLE_FACTOR`.
    """
    ref_main = _main_title(reference_title)
    refs = [(_fold(reference_title), 1.0)]
    if ref_main:
        refs.append((_fold(ref_main), MAIN_TITLE_FACTOR))
    best = 0.0
    for raw in candidates:
        cand_main = _main_title(raw)
        cands = [(_fold(raw), 1.0)]
        if cand_main:
            cands.append((_fold(cand_main), MAIN_TITLE_FACTOR))
        for ref, ref_factor in refs:
            for cand, cand_factor in cands:
                if not ref or not cand:
                    continue
                ratio = fuzz.ratio(ref, cand)
                if ratio >= TITLE_THRESHOLD and _words_align(ref, cand):
                    best = max(best, ratio / 100 * ref_factor * cand_factor)
    return best


def title_candidates(source: Source, title_words: int) -> list[str]:
    """Strings of a source that may be its title: metadata title and top-of-page-1 lines.

    Paragraphs of the first page, pairs of consecutive ones (a title set on two lines),
    and each paragraph's first words (a title run into the author line).
    """
    lines = [line for line in source.first_page_text.split("\n") if line.strip()][:TITLE_LINES]
    out = [source.title] if source.title else []
    out.extend(lines)
    out.extend(f"{a} {b}" for a, b in itertools.pairwise(lines))
    for line in lines:
        words = line.split()
        for n in (title_words - 1, title_words, title_words + 1):
            if 0 < n < len(words):
                out.append(" ".join(words[:n]))
    return out


def _norm_path(path: str) -> str:
    path = path.replace("\\", "/").strip()
    return posixpath.normpath(path) if path else path


def _find_source(file: str, sources: list[Source], root: str) -> Source | None:
    wanted = {_norm_path(file)}
    if root:
        wanted.add(_norm_path(posixpath.join(root.replace("\\", "/"), file.replace("\\", "/"))))
    for source in sources:
        if _norm_path(source.path) in wanted:
            return source
    return None


def _doi_evidence(source: Source) -> set[str]:
    """DOIs printed on the first two pages (page 1 text and passages of pages 1-2)."""
    text = "\n".join([source.first_page_text, *(p.text for p in source.passages if p.page <= 2)])
    return set(find_dois(text))


def _has_word(haystack: str, word: str) -> bool:
    return bool(word) and re.search(rf"\b{re.escape(word)}\b", haystack) is not None


def author_year_similarity(reference: Reference, source: Source) -> float:
    """Share of the entry's family names and year found on page 1, 0.0 unless the first
    author and the year are both there."""
    if not reference.authors or reference.year is None:
        return 0.0
    page = _fold(source.first_page_text)
    meta = _fold(source.author or "")
    names = [_fold(name) for name in reference.authors]
    found = [_has_word(page, n) or _has_word(meta, n) for n in names]
    year = _has_word(page, str(reference.year))
    if not (found[0] and year):
        return 0.0
    return (sum(found) + 1) / (len(names) + 1)


@dataclass(frozen=True)
class _Claim:
    score: float
    key: str
    source: str


def _assign(claims: list[_Claim]) -> list[_Claim]:
    """Best claims first; each key and each source at most once; exact ties left out."""
    claims = sorted(claims, key=lambda c: (-c.score, c.key, c.source))
    taken_keys: set[str] = set()
    taken_sources: set[str] = set()
    chosen: list[_Claim] = []
    for claim in claims:
        if claim.key in taken_keys or claim.source in taken_sources:
            continue
        rivals = [
            other
            for other in claims
            if other is not claim
            and other.score == claim.score
            and (other.key == claim.key or other.source == claim.source)
            and other.key not in taken_keys
            and other.source not in taken_sources
        ]
        if rivals:
            for other in (claim, *rivals):
                if other.key == claim.key:
                    taken_keys.add(claim.key)
                if other.source == claim.source:
                    taken_sources.add(claim.source)
            continue
        chosen.append(claim)
        taken_keys.add(claim.key)
        taken_sources.add(claim.source)
    return chosen


def _map_tier(
    references: list[Reference], sources: list[Source], mapping: dict[str, str], root: str
) -> tuple[list[SourceMatch], list[Problem]]:
    keys = {r.key for r in references}
    matches: list[SourceMatch] = []
    problems: list[Problem] = []
    for key, file in mapping.items():
        shown = (
            file if not root or _norm_path(file).startswith(_norm_path(root) + "/") else (posixpath.join(root, file))
        )
        if key not in keys:
            problems.append(Problem(shown, f"--map names reference '{key}', which the reference list lacks"))
            continue
        source = _find_source(file, sources, root)
        if source is None:
            problems.append(
                Problem(
                    shown,
                    f"--map gives this file for reference '{key}', but it is not a readable PDF in the sources folder",
                )
            )
            continue
        matches.append(SourceMatch(key, source.path, MatchMethod.MAP, 1.0))
    return matches, problems


def match_references(
    references: list[Reference],
    sources: list[Source],
    mapping: dict[str, str] | None = None,
    sources_root: str = "",
) -> tuple[dict[str, SourceMatch], list[Problem]]:
    """Reference key -> its source file, and problems with the mapping.

    Args:
        references: the draft's reference entries.
        sources: the readable sources (their ``path`` is the display path).
        mapping: key -> file from the --map file, relative to the sources folder or
            including ``sources_root``.
        sources_root: the sources folder as it prefixes each ``Source.path``.
    """
    matched, problems = _map_tier(references, sources, mapping or {}, sources_root)
    found: dict[str, SourceMatch] = {m.key: m for m in matched}
    used = {m.source for m in matched}

    def open_refs() -> list[Reference]:
        return [r for r in references if r.key not in found]

    def open_sources() -> list[Source]:
        return [s for s in sources if s.path not in used]

    def settle(claims: list[_Claim], method: MatchMethod) -> None:
        for claim in _assign(claims):
            found[claim.key] = SourceMatch(claim.key, claim.source, method, round(claim.score, 4))
            used.add(claim.source)

    evidence = {s.path: _doi_evidence(s) for s in sources}
    doi_claims = []
    for ref in open_refs():
        doi = normalize_doi(ref.doi) if ref.doi else None
        for source in open_sources() if doi else ():
            if source.doi and normalize_doi(source.doi) == doi:
                doi_claims.append(_Claim(1.0, ref.key, source.path))
            elif doi in evidence[source.path]:
                doi_claims.append(_Claim(DOI_IN_TEXT, ref.key, source.path))
    settle(doi_claims, MatchMethod.DOI)

    title_claims = []
    for ref in open_refs():
        if not ref.title or not _fold(ref.title):
            continue
        n = len(ref.title.split())
        for source in open_sources():
            score = title_similarity(ref.title, title_candidates(source, n))
            if score > 0:
                title_claims.append(_Claim(score, ref.key, source.path))
    settle(title_claims, MatchMethod.TITLE)

    author_claims = []
    for ref in open_refs():
        for source in open_sources():
            score = author_year_similarity(ref, source)
            if score > 0:
                author_claims.append(_Claim(score, ref.key, source.path))
    settle(author_claims, MatchMethod.AUTHOR_YEAR)

    order = {r.key: i for i, r in enumerate(references)}
    return dict(sorted(found.items(), key=lambda kv: order.get(kv[0], len(order)))), problems
