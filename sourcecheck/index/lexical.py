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
    """BM25 scores of a query against every passage, by passage position.

    rank-bm25 builds the statistics (document frequencies, lengths, IDF with its floor);
    scoring walks a posting list per query term instead of rank-bm25's loop over every
    passage for every term, which was a third of a warm run on 2,500 passages. The
    arithmetic is rank-bm25's own, term by term in the same order, so the scores are the
    same numbers (tested against ``BM25Okapi.get_scores``).
    """

    def __init__(self, texts: Sequence[str]) -> None:
        self._size = len(texts)
        corpus = [tokenize(t) for t in texts]
        # rank-bm25 divides by the corpus size; an empty folder still needs a valid object.
        self._bm25 = BM25Okapi(corpus, k1=K1, b=B) if any(corpus) else None
        self._postings: dict[str, tuple[np.ndarray, np.ndarray]] = {}
        if self._bm25 is not None:
            docs: dict[str, list[int]] = {}
            counts: dict[str, list[int]] = {}
            for index, frequencies in enumerate(self._bm25.doc_freqs):
                for term, count in frequencies.items():
                    docs.setdefault(term, []).append(index)
                    counts.setdefault(term, []).append(count)
            self._postings = {t: (np.array(docs[t]), np.array(counts[t])) for t in docs}
            self._doc_len = np.array(self._bm25.doc_len)

    def __len__(self) -> int:
        return self._size

    def scores(self, query: str) -> np.ndarray:
        """BM25 score of ``query`` against each passage (zeros when nothing is indexed)."""
        tokens = tokenize(query)
        bm25 = self._bm25
        if bm25 is None or not tokens:
            return np.zeros(self._size)
        score = np.zeros(self._size)
        for term in tokens:  # every occurrence counts, as in rank-bm25
            posting = self._postings.get(term)
            if posting is None:
                continue  # rank-bm25 adds zero for a term no passage holds
            where, tf = posting
            norm = bm25.k1 * (1 - bm25.b + bm25.b * self._doc_len[where] / bm25.avgdl)
            score[where] += (bm25.idf.get(term) or 0) * (tf * (bm25.k1 + 1) / (tf + norm))
        return score
