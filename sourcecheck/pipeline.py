"""Runs the stages in order: the one module that knows all of them.

draft -> claims -> sources -> index -> judgment -> report. Every stage hands the next
only the dataclasses of :mod:`sourcecheck.model`; bad input inside a file becomes a
:class:`~sourcecheck.model.Problem` and the run goes on.
"""

from __future__ import annotations

import hashlib
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import TypedDict, Unpack

import numpy as np

from sourcecheck.claims import claim_query
from sourcecheck.drafts import read_draft
from sourcecheck.errors import ModelUnavailable, SourcesUnreadable
from sourcecheck.index import Cache, Encoder, EvidenceIndex, Ranker, default_cache_dir, resolve_model_path, text_key
from sourcecheck.judge import (
    EVIDENCE_SEARCHED,
    VERIFIER_DIR,
    VERIFIER_FILE,
    Calibration,
    CitationJudge,
    Search,
    Verifier,
    load_calibration,
)
from sourcecheck.model import (
    ClaimResult,
    Draft,
    Hit,
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
    discover_pdfs,
    file_sha256,
    load_mapping,
    match_references,
    read_source,
)

#: Called as ``progress(stage, done, total)`` while sources are read and embedded.
ProgressHook = Callable[[str, int, int], None]


def _noop(stage: str, done: int, total: int) -> None:
    return None


def _display(root_arg: Path, pdf: Path, root: Path) -> str:
    return str(root_arg / pdf.relative_to(root))


def read_sources(
    folder: Path, cache: Cache, progress: ProgressHook, stats: RunStats
) -> tuple[list[Source], list[Problem]]:
    """Every readable PDF under ``folder``, from the cache where its content is known."""
    if not folder.is_dir():
        raise SourcesUnreadable(
            f"{folder}: sources folder not found" if not folder.exists() else f"{folder}: not a folder"
        )
    pdfs = discover_pdfs(folder)
    sources: list[Source] = []
    problems: list[Problem] = []
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
            result = read_source(pdf, display, sha256=sha)
            if isinstance(result, Problem):
                problems.append(result)
            else:
                sources.append(result)
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
    verifier: Verifier
    stats: RunStats


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
    verifier: str | None = None,
) -> Prepared:
    """Read the draft and the sources, build the index, match references, embed claims."""
    stats = stats if stats is not None else RunStats()
    model_path = resolve_model_path(model)
    mapping_table = load_mapping(mapping) if mapping is not None else None
    draft = read_draft(draft_path, display=str(draft_path), options=read_options)
    cache = Cache(cache_dir if cache_dir is not None else default_cache_dir())
    encoder = Encoder(model_path)
    reader = make_verifier(verifier)

    sources, source_problems = read_sources(sources_dir, cache, progress, stats)
    vectors = embed_sources(sources, encoder, cache, progress, stats)
    passages: list[Passage] = [p for s in sources for p in s.passages]
    index = EvidenceIndex(passages, vectors)
    matches, match_problems = match_references(draft.references, sources, mapping_table, sources_root=str(sources_dir))
    queries = [claim_query(c) for c in draft.claims]
    claim_vectors = embed_claims(queries, encoder, cache, stats)
    stats.model_loaded = encoder.loaded
    return Prepared(
        draft=draft,
        sources=sources,
        index=index,
        matches=matches,
        queries=queries,
        claim_vectors=claim_vectors,
        encoder=encoder,
        problems=[*draft.problems, *source_problems, *match_problems],
        cache=cache,
        verifier=reader,
        stats=stats,
    )


class RunOptions(TypedDict, total=False):
    """The keyword options of :func:`prepare`, shared by :func:`run`."""

    mapping: Path | None
    model: str | None
    cache_dir: Path | None
    progress: ProgressHook
    stats: RunStats | None
    read_options: ReadOptions | None
    verifier: str | None


def run(draft_path: Path, sources_dir: Path, **options: Unpack[RunOptions]) -> Report:
    """Check every cited claim of ``draft_path`` against the PDFs under ``sources_dir``."""
    return judge_all(prepare(draft_path, sources_dir, **options), draft_path, sources_dir)


class CachedScorer:
    """The verifier's probabilities, cached per set of pairs, so a warm run loads no model.

    Keyed by the model file's hash and the pairs' text; stored (and handed back, even when
    fresh) as float32, so a cold and a warm run judge on the very same numbers.
    """

    def __init__(self, verifier: Verifier, cache: Cache, stats: RunStats) -> None:
        self.verifier = verifier
        self.cache = cache
        self.stats = stats
        self._fingerprint: str | None = None

    @property
    def fingerprint(self) -> str:
        if self._fingerprint is None:
            self._fingerprint = hashlib.sha256(self.verifier.model_path.read_bytes()).hexdigest()
        return self._fingerprint

    def score(self, pairs: Sequence[tuple[str, str]]) -> np.ndarray:
        key = text_key(self.fingerprint, *(f"{claim}\x1f{evidence}" for claim, evidence in pairs))
        cached = self.cache.load_vectors("verdicts", key, len(pairs))
        if cached is not None:
            return cached.astype(np.float64)
        fresh = np.asarray(self.verifier.score(pairs), dtype=np.float32)
        self.cache.save_vectors("verdicts", key, fresh)
        self.stats.pairs_verified += len(pairs)
        return fresh.astype(np.float64)


def make_verifier(path: str | None) -> Verifier:
    """The shipped verifier, or the local model folder ``path`` (``--verifier``)."""
    if path is None:
        return Verifier(VERIFIER_DIR)
    folder = Path(path).expanduser()
    if not (folder / VERIFIER_FILE).is_file():
        raise ModelUnavailable(f"{folder}: no verifier model ({VERIFIER_FILE}) in folder")
    return Verifier(folder)


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
    """The citation judge for a prepared run, with the shipped calibration and verifier."""
    calibration = load_calibration()
    return CitationJudge(
        references={r.key: r for r in prepared.draft.references},
        matches=prepared.matches,
        sources={s.path: s for s in prepared.sources},
        calibration=calibration,
        search=make_search(prepared.index, calibration),
        scorer=CachedScorer(prepared.verifier, prepared.cache, prepared.stats),
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
        problems=[*prepared.problems, *cache_problems],
    )
