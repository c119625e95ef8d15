"""Tying reference entries to source files: all evidence weighed at once.

  1. map        the user's --map file: taken as given, before anything else.
  2. evidence   for every (entry, file) pair, points from each kind of evidence
                (sources/_evidence.py): the entry's DOI or arXiv id printed by the file;
                its parsed title against the file's title lines (:func:`title_similarity`);
                the file's own title found inside the entry's text, which needs no parse;
                the first author with the year.
  3. assignment one global one-to-one assignment maximising the total (sources/_assign.py);
                a pair the evidence cannot tell from a rival is left out and reported.
Every match carries the method of its strongest evidence, that evidence's similarity, a
confidence from all of it together, and the evidence in words. Every entry left without a
file gets the closest file and why it was refused (:class:`~sourcecheck.model.MatchRefusal`).
"""

from __future__ import annotations

import itertools
import posixpath
from collections.abc import Iterable
from dataclasses import dataclass, field

import numpy as np
from rapidfuzz import fuzz

from sourcecheck.model import MatchMethod, MatchRefusal, Problem, Reference, Source, SourceMatch
from sourcecheck.sources._assign import Tie, assign
from sourcecheck.sources._evidence import (
    ARXIV_POINTS,
    AUTHOR_YEAR_POINTS,
    DOI_CONFLICT_POINTS,
    DOI_POINTS,
    SHORT_TITLE_POINTS,
    TITLE_POINTS,
    Evidence,
    best_title_in_entry,
    entry_arxiv_ids,
    entry_dois,
    fold,
    is_short,
    printed_author_points,
    printed_titles,
    title_forms,
)
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
#: How many first-page paragraphs may hold the title.
TITLE_LINES = 12
#: Similarity given to a DOI found in the text rather than in the metadata.
DOI_IN_TEXT = 0.95

_STOP = frozenset(
    {"a", "an", "and", "are", "as", "at", "by", "for", "from", "in", "into", "is", "of"}
    | {"on", "or", "the", "to", "vs", "versus", "with", "within"}
)


#: Least points for a pair to be matched at all: the first author and the year, or more.
MATCH_FLOOR = 1.0
#: A DOI printed on the file's pages (not its metadata) is a little less sure: a page may
#: print another work's DOI ("see also").
DOI_ON_PAGE_DISCOUNT = 0.5

_fold = fold  # cached: every entry is compared with every source's title lines


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


def title_similarity(reference_title: str, candidates: Iterable[str]) -> float:
    """Best similarity in [0, 1] of a title against candidate strings, 0.0 if none passes.

    A candidate passes when its ``fuzz.ratio`` with the title is at least
    :data:`TITLE_THRESHOLD` and the content words align (:data:`WORD_FLOOR`). Either side
    may also be compared by its main title alone, discounted (``_evidence.MAIN_TITLE_FACTOR``).
    """
    refs = title_forms(reference_title)
    best = 0.0
    for raw in candidates:
        for ref, ref_factor in refs:
            for cand, cand_factor in title_forms(raw):
                if not ref or not cand:
                    continue
                # Below the cutoff rapidfuzz returns 0 without finishing the alignment.
                ratio = fuzz.ratio(ref, cand, score_cutoff=TITLE_THRESHOLD)
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
    out.extend(printed_titles(source))
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
    """Whether folded ``word`` stands as whole words in folded ``haystack`` (single spaces, no
    punctuation after :func:`fold`, so a space is a word boundary; no regex per name)."""
    return bool(word) and f" {word} " in f" {haystack} "


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


#: One kind of evidence for a pair: points, the method it stands for, its similarity, in words.
_Kind = tuple[float, MatchMethod | None, float, str]


def _id_evidence(reference: Reference, source: Source, page_dois: set[str]) -> _Kind:
    """Points from identifiers: the entry's DOI or arXiv id printed by the source."""
    dois = entry_dois(reference)
    if dois:
        if source.doi and normalize_doi(source.doi) in dois:
            return DOI_POINTS, MatchMethod.DOI, 1.0, "DOI in the file's metadata"
        if dois & page_dois:
            return DOI_POINTS - DOI_ON_PAGE_DISCOUNT, MatchMethod.DOI, DOI_IN_TEXT, "DOI printed on its first pages"
    arxiv = entry_arxiv_ids(reference)
    if arxiv & set(source.identity.arxiv_ids):
        return ARXIV_POINTS, MatchMethod.ARXIV, 1.0, "arXiv id printed on its first page"
    if dois and (source.doi or source.identity.dois):
        return DOI_CONFLICT_POINTS, None, 0.0, "the file prints another DOI"
    return 0.0, None, 0.0, ""


#: A source's title candidates by (file, title length in words): see :func:`pair_evidence`.
TitleLines = dict[tuple[str, int], list[str]]


def pair_evidence(
    reference: Reference, source: Source, page_dois: set[str], title_lines: TitleLines | None = None
) -> Evidence:
    """All the evidence that ``reference`` cites ``source``, weighed (see sources/_evidence.py).

    ``title_lines`` keeps each source's title candidates for one matching run: every entry
    is weighed against every file, and a library of 1,000 files made the same candidates
    for every entry of a 1,000-entry list.
    """
    kinds: list[_Kind] = [_id_evidence(reference, source, page_dois)]
    closeness = 0.0
    if reference.title and _fold(reference.title):
        n = len(reference.title.split())
        lines = title_lines.get((source.path, n)) if title_lines is not None else None
        if lines is None:
            lines = title_candidates(source, n)
            if title_lines is not None:
                title_lines[(source.path, n)] = lines
        parsed = title_similarity(reference.title, lines)
        closeness = parsed
        kinds.append((TITLE_POINTS * parsed, MatchMethod.TITLE, parsed, f"title alike ({parsed:.2f})"))
    found, close, title = best_title_in_entry(source, reference.text)
    closeness = max(closeness, close)
    if found:
        weight = SHORT_TITLE_POINTS if is_short(title) else TITLE_POINTS
        text = f"its title found in the entry ({found:.2f})"
        kinds.append((weight * found, MatchMethod.TITLE_IN_ENTRY, found, text))
    share = author_year_similarity(reference, source)
    authors = (AUTHOR_YEAR_POINTS + share, MatchMethod.AUTHOR_YEAR, share, "first author and year on page 1")
    printed, said = printed_author_points(reference, source)
    kinds.append(authors if share else (printed, MatchMethod.AUTHOR_YEAR, 0.0, said))
    # Identifiers, titles and authors are separate witnesses; two title readings are one.
    ids = kinds[0]
    titles = max(kinds[1:-1], key=lambda k: k[0], default=(0.0, None, 0.0, ""))
    people = kinds[-1]
    parts = [k for k in (ids, titles, people) if k[0] != 0]
    if not parts:
        return Evidence(0.0, None, 0.0, "", closeness)
    lead = max(parts, key=lambda k: k[0])
    return Evidence(sum(k[0] for k in parts), lead[1], lead[2], "; ".join(k[3] for k in parts if k[3]), closeness)


@dataclass
class MatchOutcome:
    """What matching found: the matches, why the others have none, and problems to show.

    ``problems`` are the --map file's and an empty sources folder's; ``unmatched`` holds,
    by reference key, one line per entry left without a file, naming its closest file and why
    (the caller shows those of cited entries).
    """

    matches: dict[str, SourceMatch] = field(default_factory=dict)
    refusals: dict[str, MatchRefusal] = field(default_factory=dict)
    problems: list[Problem] = field(default_factory=list)
    unmatched: dict[str, Problem] = field(default_factory=dict)


def match_sources(
    references: list[Reference],
    sources: list[Source],
    mapping: dict[str, str] | None = None,
    sources_root: str = "",
    draft: str = "",
) -> MatchOutcome:
    """Match every entry to at most one source file, each file to at most one entry.

    Args:
        references: the draft's reference entries.
        sources: the readable sources (their ``path`` is the display path).
        mapping: key -> file from the --map file, relative to the sources folder or
            including ``sources_root``.
        sources_root: the sources folder as it prefixes each ``Source.path``.
        draft: the draft's display name, which problem lines about its entries name.
    """
    mapped, problems = _map_tier(references, sources, mapping or {}, sources_root)
    outcome = MatchOutcome({m.key: m for m in mapped}, {}, problems)
    if not sources:
        folder = sources_root or "."
        outcome.problems.append(Problem(folder, "the sources folder holds no readable PDF; no reference can match"))
        why = "the sources folder holds no readable PDF"
        outcome.refusals = {r.key: MatchRefusal(r.key, None, why) for r in references if r.key not in outcome.matches}
        return outcome
    used = {m.source for m in mapped}
    refs = [r for r in references if r.key not in outcome.matches]
    free = [s for s in sources if s.path not in used]
    page_dois = {s.path: set(s.identity.dois) | _doi_evidence(s) for s in free}
    title_lines: TitleLines = {}
    evidence = [[pair_evidence(r, s, page_dois[s.path], title_lines) for s in free] for r in refs]
    points = np.array([[e.points for e in row] for row in evidence], dtype=float).reshape(len(refs), len(free))
    chosen, ties = assign(points, MATCH_FLOOR)
    for pair in chosen:
        ref, source, ev = refs[pair.row], free[pair.col], evidence[pair.row][pair.col]
        method = ev.method or MatchMethod.AUTHOR_YEAR  # over the floor, some kind always leads
        match = SourceMatch(ref.key, source.path, method, round(ev.similarity, 4), ev.confidence, ev.detail)
        outcome.matches[ref.key] = match
    taken = {pair.col: refs[pair.row].key for pair in chosen}
    tied = {t.row: t for t in ties}
    tied_files = {t.col: t for t in ties}
    for row, ref in enumerate(refs):
        if ref.key in outcome.matches:
            continue
        refusal = _refusal(ref, evidence[row], free, refs, taken, tied.get(row), tied_files)
        outcome.refusals[ref.key] = refusal
        where = draft or sources_root or "."
        outcome.unmatched[ref.key] = Problem(where, f"reference '{ref.key}' matched no source file: {refusal.reason}")
    order = {r.key: i for i, r in enumerate(references)}
    outcome.matches = dict(sorted(outcome.matches.items(), key=lambda kv: order.get(kv[0], len(order))))
    return outcome


def _refusal(
    ref: Reference,
    evidence: list[Evidence],
    sources: list[Source],
    refs: list[Reference],
    taken: dict[int, str],
    tie: Tie | None,
    tied_files: dict[int, Tie],
) -> MatchRefusal:
    """The closest file for an unmatched entry and why it was not given."""
    if tie is not None:
        first = sources[tie.col].path
        if tie.rival_col is not None:
            other = sources[tie.rival_col].path
            why = f"it fits {first} and {other} about equally ({evidence[tie.col].detail}); say which in --map"
        else:
            rival = refs[tie.rival_row].key if tie.rival_row is not None else "another reference"
            detail = evidence[tie.col].detail
            why = f"{first} fits it and reference '{rival}' about equally ({detail}); say which in --map"
        return MatchRefusal(ref.key, first, why, evidence[tie.col].confidence)
    if not evidence:
        return MatchRefusal(ref.key, None, "no source file is left unmatched")
    col = max(range(len(evidence)), key=lambda c: (evidence[c].points, evidence[c].closeness))
    best = evidence[col]
    if best.points <= 0:
        col = max(range(len(evidence)), key=lambda c: evidence[c].closeness)
        best = evidence[col]
        if best.closeness <= 0:
            return MatchRefusal(ref.key, None, "no source file shares its DOI, title, or first author and year")
        why = (
            "no file shares its DOI, its title, or its first author with the year; "
            f"the closest title is that of {sources[col].path}, only {best.closeness:.0%} alike"
        )
        return MatchRefusal(ref.key, sources[col].path, why)
    path = sources[col].path
    if col in tied_files and refs[tied_files[col].row].key != ref.key:
        rival = refs[tied_files[col].row].key
        why = f"{path} fits it and reference '{rival}' about equally ({best.detail}); say which in --map"
    elif col in taken:
        why = f"closest is {path}, but it went to reference '{taken[col]}', which fits it better ({best.detail} here)"
    else:
        why = f"closest is {path}, but the evidence is too weak ({best.detail})"
    return MatchRefusal(ref.key, path, why, best.confidence)


def match_references(
    references: list[Reference],
    sources: list[Source],
    mapping: dict[str, str] | None = None,
    sources_root: str = "",
) -> tuple[dict[str, SourceMatch], list[Problem]]:
    """Reference key -> its source file, and the mapping's problems (see :func:`match_sources`)."""
    outcome = match_sources(references, sources, mapping, sources_root)
    return outcome.matches, outcome.problems
