"""Hybrid search: per-source filtering and fusion of dense and lexical evidence."""

import numpy as np
import pytest
from rank_bm25 import BM25Okapi

from sourcecheck.index.lexical import K1, B
from sourcecheck.index.ranking import Ranker
from sourcecheck.index.search import DENSE_WEIGHT, EvidenceIndex
from sourcecheck.model import Passage
from sourcecheck.text.tokens import tokenize

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


# --- reranking -------------------------------------------------------------------------


def _unit(cosine: float) -> np.ndarray:
    """A unit vector whose cosine with the query [1, 0] is ``cosine``."""
    return np.array([cosine, np.sqrt(1.0 - cosine**2)], dtype=np.float32)


QUERY = np.array([1.0, 0.0], dtype=np.float32)
# The query shares no word with the passages, so BM25 is zero and fused = DENSE_WEIGHT * cosine.
SILENT_QUERY = "cormorant roost"


def _sectioned(background: float, results: float) -> EvidenceIndex:
    passages = [
        Passage("a.pdf", 1, "Herons were long thought to avoid dredged shores.", 0, section="background"),
        Passage("a.pdf", 3, "Nest counts rose once dredging stopped.", 1, section="results"),
    ]
    return EvidenceIndex(passages, np.stack([_unit(background), _unit(results)]))


RESULTS_FIRST = Ranker({"dense": 1.0, "section:results": 1.0}, margin=0.05)


def test_ranker_moves_a_near_tie_results_passage_first() -> None:
    index = _sectioned(background=0.80, results=0.78)  # fused gap 0.7 * 0.02 = 0.014 < 0.05
    plain = index.search(SILENT_QUERY, QUERY, k=2)
    assert [h.passage.section for h in plain] == ["background", "results"]
    ranked = index.search(SILENT_QUERY, QUERY, k=2, ranker=RESULTS_FIRST)
    assert [h.passage.section for h in ranked] == ["results", "background"]
    # Hit.fused is now the ranker's score: dense + section:results.
    assert ranked[0].fused == pytest.approx(0.78 + 1.0, abs=1e-6)
    assert ranked[1].fused == pytest.approx(0.80, abs=1e-6)


def test_ranker_keeps_a_passage_far_ahead_of_the_margin_first() -> None:
    index = _sectioned(background=0.90, results=0.50)  # fused gap 0.28 > 0.05
    ranked = index.search(SILENT_QUERY, QUERY, k=2, ranker=RESULTS_FIRST)
    assert [h.passage.section for h in ranked] == ["background", "results"]
    # The ranker scores the results passage higher (1.5 > 0.9), yet it is outside the margin.
    assert ranked[1].fused > ranked[0].fused


def test_ranker_keeps_a_restatement_of_the_claim_first() -> None:
    # The background sentence holds every content word of the query, the results one
    # none: even a near-tie in fused score may not overtake a restatement.
    passages = [
        Passage("a.pdf", 1, "Cormorant roost sites shift each winter.", 0, section="background"),
        Passage("a.pdf", 3, "Nest counts rose once dredging stopped.", 1, section="results"),
    ]
    index = EvidenceIndex(passages, np.stack([_unit(0.80), _unit(0.80)]))
    query = "cormorant roost sites shift each winter"
    ranked = index.search(query, QUERY, k=2, ranker=RESULTS_FIRST)
    assert [h.passage.section for h in ranked] == ["background", "results"]
    assert ranked[1].fused > ranked[0].fused  # the ranker alone would have swapped them
    lenient = Ranker(RESULTS_FIRST.weights, margin=1.0, coverage_slack=1.0)
    assert index.search(query, QUERY, k=2, ranker=lenient)[0].passage.section == "results"


def test_without_a_ranker_hits_follow_the_fused_score() -> None:
    index = _sectioned(background=0.60, results=0.95)
    for ranker in (None, Ranker()):  # an empty ranker keeps the first-stage order too
        hits = index.search(SILENT_QUERY, QUERY, k=2, ranker=ranker)
        assert [h.passage.section for h in hits] == ["results", "background"]
        assert [h.fused for h in hits] == pytest.approx([DENSE_WEIGHT * 0.95, DENSE_WEIGHT * 0.60], abs=1e-6)


def test_lexical_ceiling_is_the_best_bm25_score_over_the_folder() -> None:
    index = EvidenceIndex(PASSAGES, _vectors())
    query = "heron nests dredging"
    # Reference: rank-bm25's BM25Okapi over the same tokens, with the index's k1 and b.
    reference = BM25Okapi([tokenize(p.text) for p in PASSAGES], k1=K1, b=B).get_scores(tokenize(query))
    assert index.lexical_ceiling(query) == pytest.approx(float(max(reference)))
    # A search inside b.pdf scales BM25 by that folder-wide best, which stands in a.pdf.
    hit = index.search(query, np.zeros(4, dtype=np.float32), source="b.pdf", k=1)[0]
    assert hit.fused == pytest.approx((1 - DENSE_WEIGHT) * hit.bm25 / index.lexical_ceiling(query))
    assert hit.bm25 < index.lexical_ceiling(query)
    assert EvidenceIndex([], np.zeros((0, 0))).lexical_ceiling(query) == 0.0


def test_the_first_passage_of_each_source_is_known_and_a_ranker_can_weigh_it() -> None:
    # Ordinals count up in reading order from wherever the front matter ended, per source.
    passages = [
        Passage("a.pdf", 1, "Herons were long thought to avoid dredged shores.", 2),
        Passage("a.pdf", 1, "Nest counts rose once dredging stopped.", 3),
        Passage("b.pdf", 1, "Gulls nest on roofs.", 0),
    ]
    index = EvidenceIndex(passages, np.stack([_unit(0.80), _unit(0.79), _unit(0.1)]))
    assert [index.opens_source(p) for p in passages] == [True, False, True]
    plain = index.search(SILENT_QUERY, QUERY, source="a.pdf", k=2)
    assert plain[0].passage.ordinal == 2
    later = Ranker({"dense": 1.0, "opens_source": -1.0}, margin=0.05)
    assert index.search(SILENT_QUERY, QUERY, source="a.pdf", k=2, ranker=later)[0].passage.ordinal == 3


def test_prefilter_embeds_only_the_lexically_best_candidates() -> None:
    class Recording:
        """Vectors by position, remembering which positions a search asked for."""

        def __init__(self, array: np.ndarray) -> None:
            self.array, self.asked = array, set()

        def __len__(self) -> int:
            return len(self.array)

        def rows(self, positions: object) -> np.ndarray:
            chosen = np.asarray(positions, dtype=int)
            self.asked.update(int(p) for p in chosen)
            return self.array[chosen]

    vectors = Recording(_vectors())
    index = EvidenceIndex(PASSAGES, vectors, prefilter=2)
    hits = index.search("salinity after dredging", np.array([0, 1, 0, 0], dtype=np.float32), k=4)
    # Only the two passages sharing the query's words are embedded and can be returned,
    # even though the query vector points at another passage.
    assert vectors.asked == {0, 3}
    assert {h.passage.ordinal for h in hits} == {0, 1} and {h.passage.source for h in hits} == {"a.pdf", "b.pdf"}
    assert list(index.candidates("salinity after dredging")) == [0, 3]  # in passage order
    unfiltered = EvidenceIndex(PASSAGES, _vectors(), prefilter=None)
    assert list(unfiltered.candidates("salinity after dredging")) == [0, 1, 2, 3]


def test_prefilter_keeps_results_when_the_winner_is_among_the_lexical_best() -> None:
    query, vector = "salinity after dredging", np.array([1, 0, 0, 0.2], dtype=np.float32)
    full = EvidenceIndex(PASSAGES, _vectors(), prefilter=None).search(query, vector, k=2)
    cut = EvidenceIndex(PASSAGES, _vectors(), prefilter=2).search(query, vector, k=2)
    assert [h.passage.ordinal for h in full] == [0, 1]
    assert [(h.passage, h.fused) for h in cut] == [(h.passage, h.fused) for h in full]
