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
from sourcecheck.index import Cache, Encoder, EvidenceIndex, Ranker, default_cache_dir, resolve_model_path, text_key
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
    read_source,
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
) -> tuple[list[Source], list[Problem]]:
    """Every readable PDF under ``folder``, from the cache where its content is known."""
    if not folder.is_dir():
        raise SourcesUnreadable(
            f"{folder}: sources folder not found" if not folder.exists() else f"{folder}: not a folder"
        )
    limits = limits or Limits()
    pdfs, problems = find_pdfs(folder, follow_links=follow_links, limits=limits)
    sources: list[Source] = []
    for done, pdf in enumerate(pdfs, start=1):
        display = _display(folder, pdf, folder)
        try:
            sha = file_sha256(pdf)
        except OSError as exc:
            problems.append(Problem(display, f"cannot be read ({exc.strerror or exc})"))
            continue
        cached = cache.load_source(sha, EXTRACTOR_VERSION, display)
        if cached is not None:
            sources.append(cached)
            stats.sources_from_cache += 1
        else:
            notes: list[Problem] = []
            result = read_source(pdf, display, sha256=sha, limits=limits, notes=notes)
            problems.extend(notes)
            if isinstance(result, Problem):
                problems.append(result)
            else:
                sources.append(result)
                if not notes:  # a source read only in part is not what its content hash promises
                    cache.save_source(result, EXTRACTOR_VERSION)
                stats.sources_read += 1
        progress("read", done, len(pdfs))
    return sources, problems


def embed_sources(
    sources: list[Source], encoder: Encoder, cache: Cache, progress: ProgressHook, stats: RunStats
) -> np.ndarray:
    """One unit vector per passage, in source order; each set of passages embedded once, ever."""
    blocks = []
    total = sum(len(s.passages) for s in sources)
    done = 0
    for source in sources:
        texts = [p.text for p in source.passages]
        # Keyed by the passages' own text and the model, not the extractor version: a new
        # extractor that leaves a file's passages unchanged costs no embedding.
        key = text_key(encoder.fingerprint, *texts)
        vectors = cache.load_vectors("passages", key, len(texts))
        if vectors is None:
            vectors = encoder.encode(texts) if texts else np.zeros((0, 384), dtype=np.float32)
            cache.save_vectors("passages", key, vectors)
            stats.passages_embedded += len(texts)
        blocks.append(vectors)
        done += len(texts)
        progress("embed", done, total)
    nonempty = [b for b in blocks if b.size]
    return np.vstack(nonempty) if nonempty else np.zeros((0, 1), dtype=np.float32)


def embed_claims(queries: list[str], encoder: Encoder, cache: Cache, stats: RunStats) -> np.ndarray:
    """Claim vectors, cached for the draft as a whole so a warm run embeds nothing."""
    if not queries:
        return np.zeros((0, 1), dtype=np.float32)
    key = text_key(encoder.fingerprint, *queries)
    vectors = cache.load_vectors("claims", key, len(queries))
    if vectors is None:
        vectors = encoder.encode(queries)
        cache.save_vectors("claims", key, vectors)
        stats.claims_embedded += len(queries)
    return vectors


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
    """The sources folder read, embedded and indexed once: what every draft of a run shares.

    Split from :func:`prepare` so several manuscripts are checked against one folder with
    one index and one cache, reading and embedding each PDF once (:func:`run_many`).
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
    cache_dir: Path | None = None,
    progress: ProgressHook = _noop,
    stats: RunStats | None = None,
    limits: Limits | None = None,
    follow_links: bool = False,
    verifier: str | None = None,
) -> PreparedSources:
    """Read every PDF under ``sources_dir`` (from the cache where known), embed and index the passages."""
    stats = stats if stats is not None else RunStats()
    model_path = resolve_model_path(model)
    mapping_table = load_mapping(mapping) if mapping is not None else None
    cache = Cache(cache_dir if cache_dir is not None else default_cache_dir())
    encoder = Encoder(model_path)
    reader = make_verifier(verifier)
    sources, source_problems = read_sources(
        sources_dir, cache, progress, stats, limits=limits, follow_links=follow_links
    )
    vectors = embed_sources(sources, encoder, cache, progress, stats)
    passages: list[Passage] = [p for s in sources for p in s.passages]
    return PreparedSources(
        folder=sources_dir,
        sources=sources,
        index=EvidenceIndex(passages, vectors),
        encoder=encoder,
        cache=cache,
        mapping=mapping_table,
        problems=source_problems,
        verifier=reader,
    )


def prepare_draft(draft: Draft, shared: PreparedSources, stats: RunStats | None = None) -> Prepared:
    """Match one draft's references to the prepared sources and embed its claims."""
    stats = stats if stats is not None else RunStats()
    matched = match_sources(
        draft.references, shared.sources, shared.mapping, sources_root=str(shared.folder), draft=draft.path
    )
    cited = {c.key for claim in draft.claims for c in claim.citations if c.key}
    match_problems = [*matched.problems, *(p for key, p in matched.unmatched.items() if key in cited)]
    queries = [claim_query(c) for c in draft.claims]
    claim_vectors = embed_claims(queries, shared.encoder, shared.cache, stats)
    stats.model_loaded = shared.encoder.loaded
    return Prepared(
        draft=draft,
        sources=shared.sources,
        index=shared.index,
        matches=matched.matches,
        refusals=matched.refusals,
        queries=queries,
        claim_vectors=claim_vectors,
        encoder=shared.encoder,
        problems=[*draft.problems, *shared.problems, *match_problems],
        cache=shared.cache,
        verifier=shared.verifier,
        stats=stats,
    )


def prepare(
    draft_path: Path,
    sources_dir: Path,
    *,
    mapping: Path | None = None,
    model: str | None = None,
    cache_dir: Path | None = None,
    progress: ProgressHook = _noop,
    stats: RunStats | None = None,
    read_options: ReadOptions | None = None,
    follow_links: bool = False,
    verifier: str | None = None,
) -> Prepared:
    """Read the draft and the sources, build the index, match references, embed claims.

    ``read_options.limits`` bounds the draft and the sources alike; ``follow_links`` reads
    PDFs that are links to files outside ``sources_dir``.
    """
    return prepare_many(
        [draft_path],
        sources_dir,
        mapping=mapping,
        model=model,
        cache_dir=cache_dir,
        progress=progress,
        stats=stats,
        read_options=read_options,
        follow_links=follow_links,
        verifier=verifier,
    )[0]


class RunOptions(TypedDict, total=False):
    """The keyword options of :func:`prepare`, shared by :func:`run`."""

    mapping: Path | None
    model: str | None
    cache_dir: Path | None
    progress: ProgressHook
    stats: RunStats | None
    read_options: ReadOptions | None
    follow_links: bool
    verifier: str | None


def run(draft_path: Path, sources_dir: Path, **options: Unpack[RunOptions]) -> Report:
    """Check every cited claim of ``draft_path`` against the PDFs under ``sources_dir``."""
    return judge_all(prepare(draft_path, sources_dir, **options), draft_path, sources_dir)


def prepare_many(draft_paths: list[Path], sources_dir: Path, **options: Unpack[RunOptions]) -> list[Prepared]:
    """Prepare several drafts against one sources folder, read, embedded and indexed once.

    Every draft is read first, so a missing one (or a missing model) stops the run before
    any PDF is read. ``read_options.limits`` bounds the drafts and the sources alike.
    """
    stats = options.get("stats")
    stats = stats if stats is not None else RunStats()
    read_options = options.get("read_options") or ReadOptions()
    resolve_model_path(options.get("model"))
    drafts = [read_draft(path, display=str(path), options=read_options) for path in draft_paths]
    shared = prepare_sources(
        sources_dir,
        mapping=options.get("mapping"),
        model=options.get("model"),
        cache_dir=options.get("cache_dir"),
        progress=options.get("progress", _noop),
        stats=stats,
        limits=read_options.limits,
        follow_links=options.get("follow_links", False),
        verifier=options.get("verifier"),
    )
    return [prepare_draft(draft, shared, stats) for draft in drafts]


def run_many(draft_paths: list[Path], sources_dir: Path, **options: Unpack[RunOptions]) -> list[Report]:
    """Check several drafts against one sources folder: the PDFs are read, embedded and indexed once."""
    prepared = prepare_many(draft_paths, sources_dir, **options)
    return [judge_all(one, path, sources_dir) for one, path in zip(prepared, draft_paths, strict=True)]


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


def judge_all(prepared: Prepared, draft_path: Path, sources_dir: Path) -> Report:
    """Judge every citation of every claim and assemble the report."""
    draft = prepared.draft
    checker = make_checker(prepared)
    results = []
    for claim, query, vector in zip(draft.claims, prepared.queries, prepared.claim_vectors, strict=False):
        results.append(ClaimResult(claim=claim, checks=checker.check_claim(claim, query, vector)))
    cache_problems = [Problem(str(prepared.cache.root), w) for w in prepared.cache.warnings]
    return Report(
        draft=str(draft_path),
        sources=str(sources_dir),
        model=ModelInfo(name=prepared.encoder.name, path=str(prepared.encoder.path)),
        claims=results,
        references=draft.references,
        matches=prepared.matches,
        unused_sources=unused_sources(prepared.sources, draft, prepared.matches),
        refusals=prepared.refusals,
        problems=[*prepared.problems, *cache_problems],
    )
