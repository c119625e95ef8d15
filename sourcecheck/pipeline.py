"""Runs the stages in order: the one module that knows all of them.

draft -> claims -> sources -> index -> judgment -> report. Every stage hands the next
only the dataclasses of :mod:`sourcecheck.model`; bad input inside a file becomes a
:class:`~sourcecheck.model.Problem` and the run goes on.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field
from pathlib import Path
from typing import TypedDict, Unpack

import numpy as np

from sourcecheck.claims import claim_query
from sourcecheck.drafts import read_draft
from sourcecheck.errors import SourcesUnreadable
from sourcecheck.index import (
    DEFAULT_BACKEND,
    PREFILTER_DEPTH,
    Cache,
    Encoder,
    EvidenceIndex,
    LazyVectors,
    Ranker,
    default_cache_dir,
    resolve_model_path,
)
from sourcecheck.judge import EVIDENCE_SEARCHED, Calibration, CitationJudge, Search, Verifier, load_calibration
from sourcecheck.limits import Limits
from sourcecheck.model import (
    ClaimResult,
    Draft,
    Hit,
    MatchRefusal,
    ModelInfo,
    Passage,
    Problem,
    ReadOptions,
    Report,
    RunStats,
    Source,
    SourceMatch,
)
from sourcecheck.sources import (
    EXTRACTOR_VERSION,
    file_sha256,
    find_pdfs,
    load_mapping,
    match_sources,
    read_sources_in_parallel,
)
from sourcecheck.verdicts import CachedScorer, make_verifier

#: Called as ``progress(stage, done, total)`` while sources are read and embedded.
ProgressHook = Callable[[str, int, int], None]


def _noop(stage: str, done: int, total: int) -> None:
    return None


def _display(root_arg: Path, pdf: Path, root: Path) -> str:
    return str(root_arg / pdf.relative_to(root))


def read_sources(
    folder: Path,
    cache: Cache,
    progress: ProgressHook,
    stats: RunStats,
    limits: Limits | None = None,
    follow_links: bool = False,
    jobs: int | None = None,
) -> tuple[list[Source], list[Problem]]:
    """Every readable PDF under ``folder``: from the cache where its content is known, else read.

    The files to read are read by ``jobs`` worker processes (default: one per core), each
    within ``limits``; sources and problems keep the folder's order, so the result is the
    same as a serial run's. A source read only in part (its notes say why) is not cached:
    it is not what its content hash promises.
    """
    if not folder.is_dir():
        raise SourcesUnreadable(
            f"{folder}: sources folder not found" if not folder.exists() else f"{folder}: not a folder"
        )
    limits = limits or Limits()
    pdfs, problems = find_pdfs(folder, follow_links=follow_links, limits=limits)
    found: list[tuple[Source | None, list[Problem]]] = [(None, [])] * len(pdfs)
    todo: list[tuple[int, tuple[Path, str, str]]] = []
    for i, pdf in enumerate(pdfs):
        display = _display(folder, pdf, folder)
        try:
            sha = file_sha256(pdf)
        except OSError as exc:
            found[i] = (None, [Problem(display, f"cannot be read ({exc.strerror or exc})")])
            continue
        cached = cache.load_source(sha, EXTRACTOR_VERSION, display)
        if cached is not None:
            found[i] = (cached, [])
            stats.sources_from_cache += 1
        else:
            todo.append((i, (pdf, display, sha)))
    ready = len(pdfs) - len(todo)
    progress("read", ready, len(pdfs))
    results = read_sources_in_parallel(
        [job for _, job in todo], limits, jobs, done=lambda n: progress("read", ready + n, len(pdfs))
    )
    for (i, _), (result, notes) in zip(todo, results, strict=True):
        if isinstance(result, Problem):
            found[i] = (None, [*notes, result])
            continue
        found[i] = (result, notes)
        if not notes:
            cache.save_source(result, EXTRACTOR_VERSION)
        stats.sources_read += 1
    problems.extend(p for _, notes in found for p in notes)
    return [s for s, _ in found if s is not None], problems


def embed_cited_candidates(prepared: Prepared, progress: ProgressHook, batch: int = 256) -> None:
    """Embed, before judging, the passages the claims' first searches will read.

    Each claim is searched in each source it cites; the candidates of those searches (the
    BM25 pre-filter's) are fetched or embedded here in large batches, with progress, so
    judging afterwards reads vectors from memory. Searches of cited pages and of the folder
    for a better source embed their few extra candidates when they run.
    """
    index = prepared.index
    wanted: set[int] = set()
    for claim, query in zip(prepared.draft.claims, prepared.queries, strict=True):
        for citation in claim.citations:
            match = prepared.matches.get(citation.key) if citation.key else None
            if match is not None:
                wanted.update(int(p) for p in index.candidates(query, match.source))
    order = sorted(wanted)
    for start in range(0, len(order), batch):
        index.vectors.rows(order[start : start + batch])
        progress("embed", min(start + batch, len(order)), len(order))


def unused_sources(sources: list[Source], draft: Draft, matches: dict[str, SourceMatch]) -> list[str]:
    """Readable source files that no citation in the text leads to."""
    cited = {c.key for claim in draft.claims for c in claim.citations if c.key}
    used = {m.source for key, m in matches.items() if key in cited}
    return [s.path for s in sources if s.path not in used]


@dataclass
class Prepared:
    """Everything the judge needs, before any claim is judged.

    Split from :func:`run` so the calibration script reads the very same features the
    judge reads, from the very same index.
    """

    draft: Draft
    sources: list[Source]
    index: EvidenceIndex
    matches: dict[str, SourceMatch]
    queries: list[str]
    claim_vectors: np.ndarray
    encoder: Encoder
    problems: list[Problem]
    cache: Cache
    #: Why each unmatched reference has no source: its closest file and what kept it out.
    refusals: dict[str, MatchRefusal] = field(default_factory=dict)
    verifier: Verifier | None = None
    stats: RunStats = field(default_factory=RunStats)


@dataclass
class PreparedSources:
    """The sources folder read and indexed once: what every draft of a run shares.

    Split from :func:`prepare` so several manuscripts are checked against one folder with
    one index and one cache, reading each PDF and embedding each passage once (:func:`run_many`).
    """

    folder: Path
    sources: list[Source]
    index: EvidenceIndex
    encoder: Encoder
    cache: Cache
    mapping: dict[str, str] | None
    problems: list[Problem]
    verifier: Verifier


def prepare_sources(
    sources_dir: Path,
    *,
    mapping: Path | None = None,
    model: str | None = None,
    backend: str = DEFAULT_BACKEND,
    cache_dir: Path | None = None,
    progress: ProgressHook = _noop,
    stats: RunStats | None = None,
    limits: Limits | None = None,
    follow_links: bool = False,
    verifier: str | None = None,
    jobs: int | None = None,
    prefilter: int | None = PREFILTER_DEPTH,
) -> PreparedSources:
    """Read every PDF under ``sources_dir`` (from the cache where known) and index the passages.

    Nothing is embedded here: a search embeds its BM25 pre-filter's candidates when it
    first needs them (``prefilter``; None embeds every passage a search may return).
    """
    stats = stats if stats is not None else RunStats()
    model_path = resolve_model_path(model)
    mapping_table = load_mapping(mapping) if mapping is not None else None
    cache = Cache(cache_dir if cache_dir is not None else default_cache_dir())
    encoder = Encoder(model_path, backend, on_load=lambda done: progress("load model", int(done), 1))
    reader = make_verifier(verifier)
    sources, source_problems = read_sources(
        sources_dir, cache, progress, stats, limits=limits, follow_links=follow_links, jobs=jobs
    )
    passages: list[Passage] = [p for s in sources for p in s.passages]
    passage_vectors = LazyVectors(
        [p.text for p in passages], cache.vector_store(), lambda: encoder.fingerprint, encoder.encode
    )
    return PreparedSources(
        folder=sources_dir,
        sources=sources,
        index=EvidenceIndex(passages, passage_vectors, prefilter=prefilter),
        encoder=encoder,
        cache=cache,
        mapping=mapping_table,
        problems=source_problems,
        verifier=reader,
    )


def prepare_draft(
    draft: Draft, shared: PreparedSources, stats: RunStats | None = None, progress: ProgressHook = _noop
) -> Prepared:
    """Match one draft's references to the prepared sources, embed its claims and its cited candidates."""
    stats = stats if stats is not None else RunStats()
    matched = match_sources(
        draft.references, shared.sources, shared.mapping, sources_root=str(shared.folder), draft=draft.path
    )
    cited = {c.key for claim in draft.claims for c in claim.citations if c.key}
    match_problems = [*matched.problems, *(p for key, p in matched.unmatched.items() if key in cited)]
    queries = [claim_query(c) for c in draft.claims]
    encoder = shared.encoder
    claim_vectors = LazyVectors(queries, shared.cache.vector_store(), lambda: encoder.fingerprint, encoder.encode)
    claim_matrix = claim_vectors.rows(range(len(queries))) if queries else np.zeros((0, 1), dtype=np.float32)
    stats.claims_embedded += claim_vectors.embedded
    prepared = Prepared(
        draft=draft,
        sources=shared.sources,
        index=shared.index,
        matches=matched.matches,
        refusals=matched.refusals,
        queries=queries,
        claim_vectors=claim_matrix,
        encoder=encoder,
        problems=[*draft.problems, *shared.problems, *match_problems],
        cache=shared.cache,
        verifier=shared.verifier,
        stats=stats,
    )
    embed_cited_candidates(prepared, progress)
    _count_embedded(prepared)
    return prepared


def _count_embedded(prepared: Prepared) -> None:
    """What the run has embedded so far (the folder's vectors are shared by every draft)."""
    vectors = prepared.index.vectors
    if isinstance(vectors, LazyVectors):
        prepared.stats.passages_embedded = vectors.embedded
    prepared.stats.model_loaded = prepared.encoder.loaded


def prepare(draft_path: Path, sources_dir: Path, **options: Unpack[RunOptions]) -> Prepared:
    """Read the draft and the sources, build the index, match references, embed claims.

    ``read_options.limits`` bounds the draft and the sources alike; ``follow_links`` reads
    PDFs that are links to files outside ``sources_dir``; ``backend``, ``jobs`` and
    ``prefilter`` are those of :func:`prepare_sources`.
    """
    return prepare_many([draft_path], sources_dir, **options)[0]


class RunOptions(TypedDict, total=False):
    """The keyword options of :func:`prepare`, shared by :func:`run`."""

    mapping: Path | None
    model: str | None
    backend: str
    cache_dir: Path | None
    progress: ProgressHook
    stats: RunStats | None
    read_options: ReadOptions | None
    follow_links: bool
    verifier: str | None
    jobs: int | None
    prefilter: int | None


def run(draft_path: Path, sources_dir: Path, **options: Unpack[RunOptions]) -> Report:
    """Check every cited claim of ``draft_path`` against the PDFs under ``sources_dir``."""
    return run_many([draft_path], sources_dir, **options)[0]


def prepare_many(draft_paths: list[Path], sources_dir: Path, **options: Unpack[RunOptions]) -> list[Prepared]:
    """Prepare several drafts against one sources folder, read and indexed once.

    Every draft is read first, so a missing one (or a missing model) stops the run before
    any PDF is read. ``read_options.limits`` bounds the drafts and the sources alike.
    """
    stats = options.get("stats")
    stats = stats if stats is not None else RunStats()
    progress = options.get("progress", _noop)
    read_options = options.get("read_options") or ReadOptions()
    resolve_model_path(options.get("model"))
    drafts = [read_draft(path, display=str(path), options=read_options) for path in draft_paths]
    shared = prepare_sources(
        sources_dir,
        mapping=options.get("mapping"),
        model=options.get("model"),
        backend=options.get("backend", DEFAULT_BACKEND),
        cache_dir=options.get("cache_dir"),
        progress=progress,
        stats=stats,
        limits=read_options.limits,
        follow_links=options.get("follow_links", False),
        verifier=options.get("verifier"),
        jobs=options.get("jobs"),
        prefilter=options.get("prefilter", PREFILTER_DEPTH),
    )
    return [prepare_draft(draft, shared, stats, progress) for draft in drafts]


def run_many(draft_paths: list[Path], sources_dir: Path, **options: Unpack[RunOptions]) -> list[Report]:
    """Check several drafts against one sources folder: the PDFs are read, embedded and indexed once."""
    prepared = prepare_many(draft_paths, sources_dir, **options)
    progress = options.get("progress", _noop)
    return [judge_all(one, path, sources_dir, progress) for one, path in zip(prepared, draft_paths, strict=True)]


def make_search(index: EvidenceIndex, calibration: Calibration) -> Search:
    """The index's search with the fitted fusion weight and second-stage ranker: what the judge reads."""
    ranker = Ranker(calibration.ranking, calibration.ranking_margin)

    def search(
        text: str, vector: np.ndarray, source: str | None, pages: set[int] | None = None, k: int = EVIDENCE_SEARCHED
    ) -> list[Hit]:
        return index.search(
            text, vector, source=source, k=k, dense_weight=calibration.dense_weight, pages=pages, ranker=ranker
        )

    return search


def make_checker(prepared: Prepared) -> CitationJudge:
    """The citation judge for a prepared run, with the shipped calibration."""
    calibration = load_calibration()
    return CitationJudge(
        references={r.key: r for r in prepared.draft.references},
        matches=prepared.matches,
        sources={s.path: s for s in prepared.sources},
        calibration=calibration,
        search=make_search(prepared.index, calibration),
        scorer=CachedScorer(prepared.verifier, prepared.cache, prepared.stats) if prepared.verifier else None,
    )


def judge_all(prepared: Prepared, draft_path: Path, sources_dir: Path, progress: ProgressHook = _noop) -> Report:
    """Judge every citation of every claim and assemble the report."""
    draft = prepared.draft
    checker = make_checker(prepared)
    results = []
    claims = zip(draft.claims, prepared.queries, prepared.claim_vectors, strict=False)
    for done, (claim, query, vector) in enumerate(claims, start=1):
        results.append(ClaimResult(claim=claim, checks=checker.check_claim(claim, query, vector)))
        progress("judge", done, len(draft.claims))
    # Searches of cited pages and for a better source may have embedded a few passages more.
    _count_embedded(prepared)
    cache_problems = [Problem(str(prepared.cache.root), w) for w in prepared.cache.warnings]
    return Report(
        draft=str(draft_path),
        sources=str(sources_dir),
        model=ModelInfo(prepared.encoder.name, str(prepared.encoder.path), prepared.encoder.backend),
        claims=results,
        references=draft.references,
        matches=prepared.matches,
        unused_sources=unused_sources(prepared.sources, draft, prepared.matches),
        refusals=prepared.refusals,
        problems=[*prepared.problems, *cache_problems],
    )
