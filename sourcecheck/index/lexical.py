"""Okapi BM25 over the passages of every source in the folder.

One index over all sources, not one per cited PDF: rank-bm25's ``BM25Okapi`` floors
negative IDF at ``epsilon`` times the mean IDF, which on the few passages of a single PDF
gives zero or tied scores for common terms. A folder-wide index gives stable IDF, and the
same index serves the search for a better source elsewhere in the folder.
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np
from rank_bm25 import BM25Okapi

from sourcecheck.text import tokenize

# Robertson and Zaragoza (2009), "The Probabilistic Relevance Framework: BM25 and Beyond",
# recommend k1 in [1.2, 2.0] and b = 0.75; rank-bm25's defaults are k1 = 1.5, b = 0.75.
K1 = 1.5
B = 0.75


class LexicalIndex:
    """BM25 scores of a query against every passage, by passage position."""

    def __init__(self, texts: Sequence[str]) -> None:
        self._size = len(texts)
        corpus = [tokenize(t) for t in texts]
        # rank-bm25 divides by the corpus size; an empty folder still needs a valid object.
        self._bm25 = BM25Okapi(corpus, k1=K1, b=B) if any(corpus) else None

    def __len__(self) -> int:
        return self._size

    def scores(self, query: str) -> np.ndarray:
        """BM25 score of ``query`` against each passage (zeros when nothing is indexed)."""
        tokens = tokenize(query)
        if self._bm25 is None or not tokens:
            return np.zeros(self._size)
        return np.asarray(self._bm25.get_scores(tokens), dtype=float)
