"""Hybrid retrieval: BM25 and embedding similarity fused into one ranking.

The fused score is a weighted sum of the cosine similarity and the BM25 score scaled by
its largest value for the query across the folder. the project's design notes measured that inside one
cited document MiniLM alone finds the rationale first more often than reciprocal rank
fusion with BM25; the weight below was set on SciFact (see DEVELOPERS.md, "Calibration").

Lexical first: of the passages a search may return (one source, some pages of it, or the
whole folder), only the :data:`PREFILTER_DEPTH` best by BM25 are embedded and fused. A
passage that shares almost no words with the claim gets little of the fused score's BM25
share and, on prose, rarely the best cosine either; embedding every passage of a library
for the few that can win was most of a cold run's time.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import Protocol

import numpy as np

from sourcecheck.index.lexical import LexicalIndex
from sourcecheck.index.ranking import RANK_FEATURES, Ranker
from sourcecheck.index.ranking import features as rank_features
from sourcecheck.model import Hit, Passage
from sourcecheck.text import coverage

# Weight of the dense cosine in the fused score; 1 - DENSE_WEIGHT goes to scaled BM25.
DENSE_WEIGHT = 0.7
# How many first-stage candidates the ranker reorders: a cited work's passages are rarely
# more, and the folder-wide search for a better source needs only its head re-sorted.
RERANK_DEPTH = 40
SENTENCE_COVERAGE = RANK_FEATURES.index("sentence_coverage")
#: How many passages, best by BM25, a search embeds and fuses. Measured against fusing
#: every passage (2026-12-02): on the generated 40-PDF corpus (about 63 passages a PDF) 24
#: changed no band of 93 checks and 12 changed 3; on the demo (7 to 12 passages a source)
#: 8 showed another passage for 2 of 23 checks (an ``adrift`` claim shares few words with
#: any passage, so its closest one by meaning may rank low by BM25). SciFact: README.
PREFILTER_DEPTH = 24
#: How many queries' BM25 scores a run keeps (a few MB for a 1,000-PDF library).
SCORED_QUERIES = 512


class VectorRows(Protocol):
    """Passage vectors by position, fetched (or made) on request: :class:`.vectors.LazyVectors`."""

    def __len__(self) -> int: ...

    def rows(self, positions: Sequence[int] | np.ndarray) -> np.ndarray: ...


class ArrayRows:
    """Vectors already in memory, one row per passage."""

    def __init__(self, array: np.ndarray) -> None:
        self._array = array if array.size else np.zeros((0, 1), dtype=np.float32)

    def __len__(self) -> int:
        return int(self._array.shape[0])

    def rows(self, positions: Sequence[int] | np.ndarray) -> np.ndarray:
        return self._array[np.asarray(positions, dtype=int)]


class EvidenceIndex:
    """Every passage of every readable source, searchable by claim, optionally per source.

    ``vectors`` is a matrix with one row per passage or a :class:`VectorRows` that makes
    them on request; ``prefilter`` is how many BM25-best candidates a search embeds
    (``None``: all of them).
    """

    def __init__(
        self,
        passages: Sequence[Passage],
        vectors: np.ndarray | VectorRows,
        prefilter: int | None = PREFILTER_DEPTH,
    ) -> None:
        rows: VectorRows = ArrayRows(vectors) if isinstance(vectors, np.ndarray) else vectors
        if len(passages) != len(rows):
            raise ValueError("one vector per passage is required")
        self.passages = list(passages)
        self.vectors = rows
        self.prefilter = prefilter
        self._lexical = LexicalIndex([p.text for p in self.passages])
        self._scored: dict[str, np.ndarray] = {}
        self._pages = np.asarray([p.page for p in self.passages], dtype=int)
        positions: dict[str, list[int]] = {}
        for position, passage in enumerate(self.passages):
            positions.setdefault(passage.source, []).append(position)
        self._by_source: dict[str, np.ndarray] = {k: np.asarray(v) for k, v in positions.items()}
        self._first_ordinal = {k: min(self.passages[i].ordinal for i in v) for k, v in self._by_source.items()}

    def opens_source(self, passage: Passage) -> bool:
        """Whether ``passage`` is the first of its source in reading order."""
        return self._first_ordinal.get(passage.source) == passage.ordinal

    def _lexical_scores(self, query: str) -> np.ndarray:
        """BM25 scores of the query over all passages, kept for the last :data:`SCORED_QUERIES` queries.

        One claim is searched several times (for the pre-filter before judging, per cited
        work, per cited page, across the folder for a better source); scoring it once saves
        most of a warm run's BM25 time. The pre-filter pass scores every claim before the
        judge reads the first, so one remembered query was not enough.
        """
        scores = self._scored.get(query)
        if scores is None:
            if len(self._scored) >= SCORED_QUERIES:
                self._scored.pop(next(iter(self._scored)))  # the oldest
            scores = self._scored[query] = self._lexical.scores(query)
        return scores

    def lexical_ceiling(self, query: str) -> float:
        """The best BM25 score of ``query`` over the folder: what fused scores scale BM25 by."""
        scores = self._lexical_scores(query)
        return float(scores.max()) if scores.size else 0.0

    def sources(self) -> list[str]:
        """Display paths of the sources that have at least one passage."""
        return list(self._by_source)

    def candidates(self, query: str, source: str | None = None, pages: set[int] | None = None) -> np.ndarray:
        """Positions a search may return, in passage order: the BM25-best ``prefilter`` of the allowed ones."""
        if source is None:
            allowed = np.arange(len(self.passages))
        else:
            allowed = self._by_source.get(source, np.zeros(0, dtype=int))
        if pages is not None and allowed.size:
            allowed = allowed[np.isin(self._pages[allowed], sorted(pages))]
        if self.prefilter is None or allowed.size <= self.prefilter:
            return allowed
        lexical = self._lexical_scores(query)[allowed]
        best = np.argsort(-lexical, kind="stable")[: self.prefilter]
        return allowed[np.sort(best)]

    def search(
        self,
        query: str,
        query_vector: np.ndarray,
        source: str | None = None,
        k: int = 3,
        dense_weight: float = DENSE_WEIGHT,
        pages: set[int] | None = None,
        ranker: Ranker | None = None,
    ) -> list[Hit]:
        """The ``k`` best passages for ``query``, within ``source`` and ``pages`` if given, best first.

        ``pages`` (1-based PDF pages) narrows the candidates only: BM25 is still scaled by
        its best score over the whole folder, so the fused scores of a page-restricted
        search compare directly with those of the unrestricted one.

        With an active ``ranker`` the best RERANK_DEPTH candidates of the fused score are
        put in the ranker's order, and ``Hit.fused`` holds the ranker's score.
        """
        candidates = self.candidates(query, source, pages)
        if candidates.size == 0:
            return []
        lexical_all = self._lexical_scores(query)
        top_lexical = float(lexical_all.max()) if lexical_all.size else 0.0
        lexical = lexical_all[candidates]
        scaled = lexical / top_lexical if top_lexical > 0 else np.zeros_like(lexical)
        dense = self.vectors.rows(candidates) @ np.asarray(query_vector, dtype=np.float32)
        fused = dense_weight * dense + (1.0 - dense_weight) * scaled
        if ranker is not None and ranker.active:
            return self._reranked(query, candidates, fused, dense, lexical, scaled, k, ranker)
        order = np.argsort(-fused, kind="stable")[:k]
        hits = []
        for i in order:
            passage = self.passages[int(candidates[i])]
            hits.append(
                Hit(
                    passage=passage,
                    fused=float(fused[i]),
                    dense=float(dense[i]),
                    bm25=float(lexical[i]),
                    coverage=coverage(query, passage.text),
                )
            )
        return hits

    def _reranked(
        self,
        query: str,
        candidates: np.ndarray,
        fused: np.ndarray,
        dense: np.ndarray,
        lexical: np.ndarray,
        scaled: np.ndarray,
        k: int,
        ranker: Ranker,
    ) -> list[Hit]:
        """The first stage's best candidates, best ``k`` by the ranker.

        The ranker's section and wording features break near-ties (an abstract's
        background and results sentences are equally on topic), so only near-ties may
        overtake the first stage's best passage: candidates within ``ranker.margin`` of its
        fused score whose best sentence holds nearly as many of the claim's words
        (within ranker.coverage_slack). A passage that states the claim almost word for
        word thus stays first wherever it stands: claims of background and of methods are
        cited too, and their backing is in the introduction or the methods.
        """
        order = np.argsort(-fused, kind="stable")[:RERANK_DEPTH]
        ceiling = float(fused[order[0]])
        ranked: list[tuple[bool, Hit]] = []
        floor = 0.0
        for i in order:
            passage = self.passages[int(candidates[i])]
            share = coverage(query, passage.text)
            values = rank_features(
                query, passage, float(dense[i]), float(scaled[i]), share, opens_source=self.opens_source(passage)
            )
            if not ranked:
                floor = values[SENTENCE_COVERAGE] - ranker.coverage_slack
            hit = Hit(
                passage=passage,
                fused=ranker.score(values),
                dense=float(dense[i]),
                bm25=float(lexical[i]),
                coverage=share,
            )
            eligible = float(fused[i]) >= ceiling - ranker.margin and values[SENTENCE_COVERAGE] >= floor
            ranked.append((eligible or not ranked, hit))
        ranked.sort(key=lambda pair: (not pair[0], -pair[1].fused))
        return [hit for _, hit in ranked[:k]]
