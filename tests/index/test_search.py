"""Hybrid search: per-source filtering and fusion of dense and lexical evidence."""

import numpy as np

from sourcecheck.index.search import EvidenceIndex
from sourcecheck.model import Passage

PASSAGES = [
    Passage("a.pdf", 1, "Heron nests rose by 18% after dredging stopped.", 0),
    Passage("a.pdf", 2, "Tide gauges were read hourly.", 1),
    Passage("b.pdf", 1, "Heron nests rose along the northern shore.", 0),
    Passage("b.pdf", 3, "Salinity was measured weekly.", 1),
]


def _vectors() -> np.ndarray:
    vectors = np.eye(4, dtype=np.float32)
    return vectors


def test_search_within_one_source_returns_only_its_passages() -> None:
    index = EvidenceIndex(PASSAGES, _vectors())
    hits = index.search("heron nests", np.array([0, 0, 1, 0], dtype=np.float32), source="a.pdf", k=5)
    assert {h.passage.source for h in hits} == {"a.pdf"}
    assert len(hits) == 2


def test_lexical_evidence_breaks_a_dense_tie() -> None:
    index = EvidenceIndex(PASSAGES, _vectors())
    flat = np.full(4, 0.5, dtype=np.float32)  # the same cosine for every passage
    hits = index.search("salinity measured", flat, k=4)
    assert hits[0].passage.text.startswith("Salinity")
    assert hits[0].coverage == 1.0


def test_dense_evidence_ranks_a_paraphrase_without_shared_words() -> None:
    index = EvidenceIndex(PASSAGES, _vectors())
    hits = index.search("gauging of water level", np.array([0, 1, 0, 0], dtype=np.float32), k=1)
    assert hits[0].passage.ordinal == 1 and hits[0].passage.source == "a.pdf"
    assert hits[0].dense == 1.0


def test_unknown_source_gives_no_hits_and_empty_index_is_valid() -> None:
    index = EvidenceIndex(PASSAGES, _vectors())
    assert index.search("heron", np.zeros(4, dtype=np.float32), source="c.pdf") == []
    assert EvidenceIndex([], np.zeros((0, 0))).search("heron", np.zeros(4)) == []


def test_search_restricted_to_pages_keeps_scores_comparable() -> None:
    index = EvidenceIndex(PASSAGES, _vectors())
    query = np.array([0.9, 0.3, 0.0, 0.0], dtype=np.float32)
    whole = index.search("heron nests tide", query, source="a.pdf", k=5)
    located = index.search("heron nests tide", query, source="a.pdf", k=5, pages={2})
    assert [h.passage.page for h in located] == [2]
    # The same passage scores the same whether or not the search was narrowed to its page.
    same = next(h for h in whole if h.passage.page == 2)
    assert located[0].fused == same.fused and located[0].bm25 == same.bm25


def test_pages_across_sources_and_pages_with_no_passage() -> None:
    index = EvidenceIndex(PASSAGES, _vectors())
    hits = index.search("heron", np.ones(4, dtype=np.float32), k=5, pages={1})
    assert {(h.passage.source, h.passage.page) for h in hits} == {("a.pdf", 1), ("b.pdf", 1)}
    assert index.search("heron", np.ones(4, dtype=np.float32), source="a.pdf", pages={9}) == []
    assert index.search("heron", np.ones(4, dtype=np.float32), source="a.pdf", pages=set()) == []
