"""BM25 against the Okapi formula worked by hand."""

import math

import numpy as np
from rank_bm25 import BM25Okapi

from sourcecheck.index.lexical import K1, B, LexicalIndex
from sourcecheck.text import tokenize

DOCS = [
    "marsh nest count",
    "marsh tide gauge reading",
    "heron nest survey method",
    "tide chart",
]


def okapi(term_df: int, n_docs: int, tf: int, doc_len: int, avgdl: float) -> float:
    """Robertson and Zaragoza (2009), "The Probabilistic Relevance Framework: BM25 and Beyond",
    eq. (3.15) term weight with the IDF log((N - n + 0.5) / (n + 0.5)) of eq. (3.2)."""
    idf = math.log((n_docs - term_df + 0.5) / (term_df + 0.5))
    return idf * tf * (K1 + 1) / (tf + K1 * (1 - B + B * doc_len / avgdl))


def test_bm25_score_equals_the_okapi_formula_worked_by_hand() -> None:
    index = LexicalIndex(DOCS)
    scores = index.scores("heron")
    avgdl = (3 + 4 + 4 + 2) / 4
    # Worked by hand: IDF = ln(3.5 / 1.5) = 0.8473; tf part = 2.5 / 2.7596 = 0.9059; product 0.7676.
    assert abs(okapi(1, 4, 1, 4, avgdl) - 0.7676) < 1e-3
    assert abs(scores[2] - okapi(1, 4, 1, 4, avgdl)) < 1e-9
    assert scores[0] == scores[1] == scores[3] == 0.0


def test_a_term_in_a_single_passage_ranks_that_passage_first() -> None:
    # DEVELOPERS.md, "Folder-wide BM25": one folder-wide index must not flatten a rare term's score.
    index = LexicalIndex([*DOCS, "marsh heron colony", "marsh reading"])
    scores = index.scores("survey")
    assert int(scores.argmax()) == 2
    assert scores[2] > 0 and sorted(scores)[-2] == 0.0


def test_empty_index_and_empty_query_score_zero() -> None:
    assert LexicalIndex([]).scores("heron").size == 0
    assert not LexicalIndex(DOCS).scores("the of and").any()


def test_posting_lists_give_rank_bm25s_own_scores() -> None:
    # rank-bm25's BM25Okapi.get_scores is the reference: the same statistics and arithmetic,
    # so the scores must be equal to the last bit, repeated and unknown query terms included.
    rng = np.random.default_rng(5)
    words = [f"w{i}" for i in range(60)]
    texts = [" ".join(rng.choice(words, size=int(rng.integers(3, 40)))) for _ in range(200)]
    index = LexicalIndex(texts)
    reference = BM25Okapi([tokenize(t) for t in texts], k1=K1, b=B)
    for _ in range(30):
        query = " ".join(rng.choice([*words, "absent"], size=int(rng.integers(1, 12))))
        assert np.array_equal(index.scores(query), reference.get_scores(tokenize(query)))
