"""Runs the stages in order: the one module that knows all of them.

draft -> claims -> sources -> index -> judgment -> report. Every stage hands the next
only the dataclasses of :mod:`sourcecheck.model`; bad input inside a file becomes a
:class:`~sourcecheck.model.Problem` and the run goes on.
"""

from __future__ import annotations

import re
from collections.abc import Callable
from dataclasses import dataclass, field
from pathlib import Path
from typing import TypedDict, Unpack

import numpy as np

from sourcecheck.drafts import ReadOptions, read_draft
from sourcecheck.errors import SourcesUnreadable
from sourcecheck.index.cache import Cache, default_cache_dir, text_key
from sourcecheck.index.dense import Encoder, resolve_model_path
from sourcecheck.index.ranking import Ranker
from sourcecheck.index.search import EvidenceIndex
from sourcecheck.judge.calibration import Calibration, load_calibration
from sourcecheck.judge.locators import cited_pages, pdf_pages, prefers_located
from sourcecheck.judge.quotes import check_quotes, quotations
from sourcecheck.judge.verdict import (
    better_source_reason,
    judge,
    page_mismatch_reason,
    unverifiable,
    wants_better_source,
    with_printed_pages,
)
from sourcecheck.model import (
    Check,
    Citation,
    Claim,
    ClaimResult,
    Draft,
    Hit,
    MatchRefusal,
    ModelInfo,
    Passage,
    Problem,
    Reason,
    Reference,
    Report,
    Source,
    SourceMatch,
)
from sourcecheck.sources import (
    EXTRACTOR_VERSION,
    discover_pdfs,
    file_sha256,
    load_mapping,
    match_sources,
    read_source,
)

#: Called as ``progress(stage, done, total)`` while sources are read and embedded.
ProgressHook = Callable[[str, int, int], None]

EVIDENCE_SEARCHED = 3


@dataclass
class RunStats:
    """What a run cost: benchmarks and tests read it to prove the cache works."""

    sources_read: int = 0
    sources_from_cache: int = 0
    passages_embedded: int = 0
    claims_embedded: int = 0
    model_loaded: bool = False


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


def claim_query(claim: Claim) -> str:
    """The claim sentence without its citation markers: what is searched and judged."""
    text = claim.text
    for marker in {c.marker for c in claim.citations}:
        text = text.replace(marker, " ")
    return re.sub(r"\s+([.,;:])", r"\1", re.sub(r"\s{2,}", " ", text)).strip()


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


@dataclass
class CitationChecker:
    """Everything one citation's check reads, gathered once per run."""

    references: dict[str, Reference]
    matches: dict[str, SourceMatch]
    index: EvidenceIndex
    calibration: Calibration
    sources: dict[str, Source]

    def check(self, claim: Claim, claim_text: str, vector: np.ndarray, citation: Citation) -> Check:
        """Judge one citation of a claim against its matched source.

        A citation with a page locator is judged on the cited pages when they back the
        claim about as well as the whole source does
        (:func:`~sourcecheck.judge.locators.prefers_located`); otherwise on the whole
        source, with a ``page-mismatch`` reason naming where the backing is.
        """
        if citation.key is None or citation.key not in self.references:
            return unverifiable(
                citation,
                None,
                None,
                Reason("marker-unresolved", f"{citation.label} has no entry in the reference list"),
            )
        reference = self.references[citation.key]
        match = self.matches.get(reference.key)
        if match is None:
            return unverifiable(
                citation,
                reference,
                None,
                Reason("source-missing", f"no readable PDF in the sources folder matches reference {citation.label}"),
            )
        source = self.sources.get(match.source)
        hits = self.evidence_for(claim_text, vector, match.source)
        printed = source.printed_pages if source is not None else ()
        mismatch: tuple[Hit, bool] | None = None  # (where the backing is, whether the cited page exists)
        cited = cited_pages(citation.locator)
        if cited and hits and source is not None:
            wanted = pdf_pages(cited, printed, source.pages)
            located = self.evidence_for(claim_text, vector, match.source, pages=wanted) if wanted else []
            if prefers_located(located, hits):
                hits = located
            else:
                mismatch = (hits[0], bool(wanted))
        quotes = check_quotes(claim_text, page_texts(source)) if source is not None and quotations(claim_text) else []
        check = judge(claim_text, citation, reference, match.source, hits, self.calibration, quotes=quotes)
        check = with_printed_pages(check, printed)
        if mismatch is not None and citation.locator:
            reason = page_mismatch_reason(check, citation.locator, mismatch[0], printed, page_exists=mismatch[1])
            if reason is not None:
                check.reasons.append(reason)
        better = self._better_source(check, claim, claim_text, vector)
        if better is not None:
            check.reasons.append(better)
        return check

    def __post_init__(self) -> None:
        self.ranker = Ranker(self.calibration.ranking, self.calibration.ranking_margin)

    def evidence_for(
        self,
        text: str,
        vector: np.ndarray,
        source: str | None,
        pages: set[int] | None = None,
        k: int = EVIDENCE_SEARCHED,
    ) -> list[Hit]:
        """The best ``k`` passages for a claim, within ``source`` (and ``pages``) or folder-wide."""
        weight = self.calibration.dense_weight
        return self.index.search(text, vector, source=source, k=k, dense_weight=weight, pages=pages, ranker=self.ranker)

    def _better_source(self, check: Check, claim: Claim, claim_text: str, vector: np.ndarray) -> Reason | None:
        if not wants_better_source(check):
            return None  # the folder-wide search is skipped for every backed check
        # Another work this claim already cites is no "better source": the author cited both.
        cited_here = {self.matches[c.key].source for c in claim.citations if c.key in self.matches}
        hits = self.evidence_for(claim_text, vector, None, k=8)
        alternatives = [h for h in hits if h.passage.source not in cited_here]
        return better_source_reason(check, alternatives[0], claim_text, self.calibration) if alternatives else None


def page_texts(source: Source) -> list[tuple[int, str]]:
    """Each page's evidence text (its passages joined), for checks that read a whole source."""
    pages: dict[int, list[str]] = {}
    for passage in source.passages:
        pages.setdefault(passage.page, []).append(passage.text)
    return [(page, " ".join(texts)) for page, texts in sorted(pages.items())]


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
) -> Prepared:
    """Read the draft and the sources, build the index, match references, embed claims."""
    stats = stats if stats is not None else RunStats()
    model_path = resolve_model_path(model)
    mapping_table = load_mapping(mapping) if mapping is not None else None
    draft = read_draft(draft_path, display=str(draft_path), options=read_options)
    cache = Cache(cache_dir if cache_dir is not None else default_cache_dir())
    encoder = Encoder(model_path)

    sources, source_problems = read_sources(sources_dir, cache, progress, stats)
    vectors = embed_sources(sources, encoder, cache, progress, stats)
    passages: list[Passage] = [p for s in sources for p in s.passages]
    index = EvidenceIndex(passages, vectors)
    matched = match_sources(draft.references, sources, mapping_table, sources_root=str(sources_dir), draft=draft.path)
    cited = {c.key for claim in draft.claims for c in claim.citations if c.key}
    match_problems = [*matched.problems, *(p for key, p in matched.unmatched.items() if key in cited)]
    queries = [claim_query(c) for c in draft.claims]
    claim_vectors = embed_claims(queries, encoder, cache, stats)
    stats.model_loaded = encoder.loaded
    return Prepared(
        draft=draft,
        sources=sources,
        index=index,
        matches=matched.matches,
        refusals=matched.refusals,
        queries=queries,
        claim_vectors=claim_vectors,
        encoder=encoder,
        problems=[*draft.problems, *source_problems, *match_problems],
        cache=cache,
    )


class RunOptions(TypedDict, total=False):
    """The keyword options of :func:`prepare`, shared by :func:`run`."""

    mapping: Path | None
    model: str | None
    cache_dir: Path | None
    progress: ProgressHook
    stats: RunStats | None
    read_options: ReadOptions | None


def run(draft_path: Path, sources_dir: Path, **options: Unpack[RunOptions]) -> Report:
    """Check every cited claim of ``draft_path`` against the PDFs under ``sources_dir``."""
    return judge_all(prepare(draft_path, sources_dir, **options), draft_path, sources_dir)


def make_checker(prepared: Prepared) -> CitationChecker:
    """The citation checker for a prepared run, with the shipped calibration."""
    return CitationChecker(
        references={r.key: r for r in prepared.draft.references},
        matches=prepared.matches,
        index=prepared.index,
        calibration=load_calibration(),
        sources={s.path: s for s in prepared.sources},
    )


def judge_all(prepared: Prepared, draft_path: Path, sources_dir: Path) -> Report:
    """Judge every citation of every claim and assemble the report."""
    draft = prepared.draft
    checker = make_checker(prepared)
    results = []
    for claim, query, vector in zip(draft.claims, prepared.queries, prepared.claim_vectors, strict=False):
        checks = [checker.check(claim, query, vector, citation) for citation in claim.citations]
        results.append(ClaimResult(claim=claim, checks=checks))
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
