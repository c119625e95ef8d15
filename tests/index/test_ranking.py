"""The second-stage ranker: its feature vector and its linear score."""

from __future__ import annotations

import numpy as np
import pytest

from sourcecheck.index.ranking import RANK_FEATURES, Ranker, features, sentence_coverage
from sourcecheck.model import SECTION_ROLES, Passage


def _passage(text: str, section: str = "", place: float = 0.0) -> Passage:
    return Passage("a.pdf", 1, text, 0, section=section, place=place)


def test_feature_vector_follows_the_declared_order() -> None:
    passage = _passage("We found that heron nests rose by 18%.", section="results", place=0.25)
    values = features("heron nests rose", passage, dense=0.8, bm25_scaled=0.6, passage_coverage=0.9)
    assert len(values) == len(RANK_FEATURES) == 9 + len(SECTION_ROLES)
    named = dict(zip(RANK_FEATURES, values, strict=True))
    assert named["dense"] == 0.8
    assert named["bm25"] == 0.6
    assert named["coverage"] == 0.9
    assert named["sentence_coverage"] == 1.0  # all three content words in the one sentence
    assert named["place"] == 0.25
    assert named["opens_source"] == 0.0  # not said to open its work
    assert features("heron nests rose", passage, 0.8, 0.6, 0.9, opens_source=True)[RANK_FEATURES.index("opens_source")]
    assert named["reports_finding"] == 1.0  # "we found"
    assert named["sets_background"] == 0.0
    assert named["reports_statistics"] == 1.0  # "18%"
    assert named["section:results"] == 1.0


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        # Reporting forms of APA 7 (6.43-6.46) and the ICMJE recommendations (from memory).
        ("Survival differed between groups (p < .05).", 1.0),
        ("The odds ratio was 1.8 (95% CI 1.2 to 2.6).", 1.0),
        ("Of the nests, 18% failed.", 1.0),
        ("We sampled every plot (n = 48).", 1.0),
        ("Herons nest on dredged shores.", 0.0),
    ],
)
def test_reported_statistics_are_flagged(text: str, expected: float) -> None:
    named = dict(zip(RANK_FEATURES, features("heron", _passage(text), 0.0, 0.0, 0.0), strict=True))
    assert named["reports_statistics"] == expected


def test_background_wording_is_flagged_and_finding_wording_is_not() -> None:
    # Scene-setting moves of a research article (Swales, "Genre Analysis", 1990; from memory).
    passage = _passage("Little is known about heron nests on dredged shores.")
    named = dict(zip(RANK_FEATURES, features("heron nests", passage, 0.0, 0.0, 0.0), strict=True))
    assert named["sets_background"] == 1.0
    assert named["reports_finding"] == 0.0


@pytest.mark.parametrize("role", SECTION_ROLES)
def test_section_features_are_one_hot(role: str) -> None:
    values = features("heron", _passage("Heron nests rose.", section=role), 0.0, 0.0, 0.0)
    section = {name: v for name, v in zip(RANK_FEATURES, values, strict=True) if name.startswith("section:")}
    assert section == {f"section:{r}": float(r == role) for r in SECTION_ROLES}


def test_a_passage_with_no_section_sets_no_section_feature() -> None:
    values = features("heron", _passage("Heron nests rose."), 0.0, 0.0, 0.0)
    assert [v for name, v in zip(RANK_FEATURES, values, strict=True) if name.startswith("section:")] == [0.0] * len(
        SECTION_ROLES
    )


def test_sentence_coverage_is_the_best_sentence_not_the_average() -> None:
    # Content words of the query, worked by hand: heron, nest, dredging, stopped.
    query = "heron nests after dredging stopped"
    text = "Heron nests rose after dredging stopped. Tide gauges were read hourly."
    # The first sentence holds all four, the second none: best 1.0, mean 0.5.
    assert sentence_coverage(query, text) == 1.0
    split = "Heron nests rose on the shore. Dredging stopped in 2012."
    # Two words in each sentence: the best sentence holds 2 of 4, though the passage holds all.
    assert sentence_coverage(query, split) == 0.5
    assert sentence_coverage(query, "") == 0.0


def test_ranker_rejects_unknown_feature_names() -> None:
    with pytest.raises(ValueError, match="section:intro"):
        Ranker({"dense": 1.0, "section:intro": 0.5})


def test_score_is_the_dot_product_of_weights_and_features() -> None:
    # A linear scorer, as in RankNet with a one-layer net (Burges et al., ICML 2005; from memory).
    weights = {"dense": 1.5, "coverage": -0.25, "section:results": 0.75, "place": 0.1}
    ranker = Ranker(weights, margin=0.05)
    values = list(np.linspace(0.1, 1.0, len(RANK_FEATURES)))
    expected = float(np.dot([weights.get(n, 0.0) for n in RANK_FEATURES], values))  # reference: numpy
    assert ranker.score(values) == pytest.approx(expected)
    assert ranker.active
    assert len(ranker.vector()) == len(RANK_FEATURES)


def test_an_empty_ranker_is_inactive_and_scores_zero() -> None:
    ranker = Ranker()
    assert not ranker.active
    assert ranker.score([1.0] * len(RANK_FEATURES)) == 0.0
