"""Ratio estimates in a source against the direction a claim states.

Sentences are invented fixtures written in the reporting forms of medical and ecological
papers; the rules for reading a ratio are checked against the handbook sources named
beside each check.
"""

from __future__ import annotations

import pytest

from sourcecheck.judge.calibration import Calibration
from sourcecheck.judge.cues import effect_direction
from sourcecheck.judge.effects import Estimate, compare_effects, estimates
from sourcecheck.judge.features import FEATURE_NAMES, features_of
from sourcecheck.judge.verdict import judge
from sourcecheck.model import Band, Citation, Hit, Passage


def _only(sentence: str) -> Estimate:
    found = estimates(sentence)
    assert len(found) == 1, found
    return found[0]


# --- estimates: the reporting forms ---------------------------------------------------------


# Each form below is how journals print a ratio with its interval: spelled-out names with
# "95% confidence interval ... to ..." (Altman, "Practical Statistics for Medical Research",
# 1991; from memory), the JAMA/AMA style "HR, 0.97; 95% CI, 0.85-1.09; P = .58" (AMA Manual
# of Style; from memory), bracketed intervals "[1.53, 1.71]" and a bare parenthesised
# interval (common practice, no source), and the Lancet's raised decimal point "1·75"
# (The Lancet house style; from memory).
@pytest.mark.parametrize(
    ("sentence", "value", "low", "high", "p_below_05", "text"),
    [
        (
            "Marsh workers had an odds ratio 2.77 (95% confidence interval 1.04 to 7.97) for wheeze.",
            2.77,
            1.04,
            7.97,
            None,
            "odds ratio 2.77 (95% confidence interval 1.04 to 7.97)",
        ),
        (
            "Deaths did not differ between arms (HR, 0.97; 95% CI, 0.85-1.09; P = .58).",
            0.97,
            0.85,
            1.09,
            False,
            "HR, 0.97; 95% CI, 0.85-1.09",
        ),
        (
            "Night shifts carried an adjusted OR = 1.62 [1.53, 1.71] for poor sleep.",
            1.62,
            1.53,
            1.71,
            None,
            "OR = 1.62 [1.53, 1.71]",
        ),
        (
            "Nest loss near the road was lower (RR 0.52 (0.24–1.12), p = 0.09).",
            0.52,
            0.24,
            1.12,
            False,
            "RR 0.52 (0.24–1.12)",
        ),
        (
            "Fenced plots showed a rate ratio (RR) of 0.83 (95% CI, 0.72-0.96) for browsing.",
            0.83,
            0.72,
            0.96,
            None,
            "rate ratio (RR) of 0.83 (95% CI, 0.72-0.96)",
        ),
        (
            "Readmission rose with a hazard ratio 1·75, 95% CI 1·20-2·54, in the late group.",
            1.75,
            1.20,
            2.54,
            None,
            "hazard ratio 1·75, 95% CI 1·20-2·54",
        ),
    ],
)
def test_named_ratios_in_their_reporting_forms(
    sentence: str, value: float, low: float, high: float, p_below_05: bool | None, text: str
) -> None:
    best = _only(sentence)
    assert best.value == pytest.approx(value)
    assert (best.low, best.high) == (pytest.approx(low), pytest.approx(high))
    assert best.p_below_05 is p_below_05
    assert best.text == text


def test_lancet_raised_decimal_point_is_read_as_a_decimal() -> None:
    # The Lancet prints "1·75" for 1.75 (The Lancet house style; from memory).
    found = _only("Readmission rose in the late group (HR 1·75, 95% CI 1·20-2·54).")
    assert (found.value, found.low, found.high) == (1.75, 1.20, 2.54)
    assert found.text == "HR 1·75, 95% CI 1·20-2·54"


@pytest.mark.parametrize(
    "sentence",
    [
        "The hazard ratio (95% CI) was 1.30 (1.10-1.50) for falls.",
        "The OR 95% CI 1.1-1.8 was reported for heath plots.",
        "Each HR (95% confidence interval) is shown in Table 2.",
    ],
)
def test_the_confidence_level_is_never_the_estimate(sentence: str) -> None:
    # "95%" names the level of the interval, not the ratio (Altman, 1991; from memory).
    assert all(e.value != 95 for e in estimates(sentence))


@pytest.mark.parametrize(
    "sentence",
    [
        "Herons fed at dawn or 2 hours later on the tidal flats.",  # "or" the conjunction
        "Sampling took one hr 20 minutes at each pond.",  # "hr" the hour
        "The ARR 0.05 (95% CI 0.02 to 0.08) favoured the scraped plots.",  # a risk difference
        "HR-defective cells showed a 2.5-fold rise in sensitivity.",  # homologous recombination
    ],
)
def test_words_that_only_look_like_ratios_are_not_read(sentence: str) -> None:
    # Lower-case "or"/"hr" are English words; ARR is the absolute risk reduction, a
    # difference whose null is 0, not 1 (Altman, 1991; from memory); "HR-" before a hyphen
    # is a gene-pathway prefix, not a hazard ratio (common practice, no source).
    assert estimates(sentence) == []


def test_two_estimates_in_one_sentence_are_both_read() -> None:
    found = estimates("Scraped plots had HR 0.75 (95% CI 0.60 to 0.94) and OR 1.40 (95% CI 1.10 to 1.80).")
    assert [(e.value, e.low, e.high) for e in found] == [(0.75, 0.60, 0.94), (1.40, 1.10, 1.80)]


# --- Estimate.direction ---------------------------------------------------------------------


def _est(value: float, low: float | None = None, high: float | None = None, p: bool | None = None) -> Estimate:
    return Estimate(text=f"HR {value}", value=value, low=low, high=high, p_below_05=p)


# A ratio's 95% confidence interval that lies wholly above 1 shows a higher risk, wholly
# below 1 a lower risk, and one that includes 1 is compatible with no effect (Altman,
# "Practical Statistics for Medical Research", 1991; Altman & Bland, "How to obtain the
# confidence interval from a P value", BMJ 2011; both from memory).
@pytest.mark.parametrize(
    ("estimate", "direction"),
    [
        (_est(2.77, 1.04, 7.97), "up"),
        (_est(0.83, 0.72, 0.96), "down"),
        (_est(1.04, 0.89, 1.22), "none"),
        (_est(1.10, 1.00, 1.21), "none"),  # an end at exactly 1.00 still holds 1
        (_est(0.90, 0.81, 1.00), "none"),
        # The interval decides even when a p-value is also given.
        (_est(1.04, 0.89, 1.22, p=True), "none"),
    ],
)
def test_the_interval_against_1_gives_the_direction(estimate: Estimate, direction: str) -> None:
    assert estimate.direction == direction


def test_without_an_interval_p_at_or_above_005_is_no_effect() -> None:
    # p < 0.05 as the line between a clear and an unclear effect (common practice, no source).
    assert _est(1.40, p=False).direction == "none"
    assert _only("Nest failure rose (OR 1.40, p = 0.05).").direction == "none"  # 0.05 is not below 0.05
    assert _only("Nest failure rose (OR 1.40, p = 0.049).").direction == "up"
    assert _only("Nest failure fell (OR 0.71, P < .001).").direction == "down"


def test_a_bare_point_estimate_near_1_says_nothing() -> None:
    # With no interval and no p-value a ratio of 1.05 cannot be told from no effect.
    assert _est(1.05).direction is None
    assert _only("Wader counts showed an incidence rate ratio of 1.05 overall.").direction is None


# --- effect_direction -----------------------------------------------------------------------


@pytest.mark.parametrize(
    ("text", "way"),
    [
        ("Night shift work increases the risk of fractures in nurses.", "up"),
        ("Early ringing reduces mortality in chicks.", "down"),
        ("Grazing led to slower progression of scrub cover.", "down"),
        ("Reed height is positively associated with warbler density.", "up"),
        ("Night shift work is not associated with an increased risk of fractures.", "none"),
        ("Both marshes had similar rates of nest loss.", "none"),
        ("Fencing does not prevent browsing by deer.", "none"),
    ],
)
def test_effect_direction_of_a_claim(text: str, way: str) -> None:
    # Direction words ("increases", "reduces", "slower") and negated or null statements
    # ("not associated", "similar", "does not"): a negated direction states no effect
    # (common practice, no source).
    said = effect_direction(text)
    assert said is not None, text
    assert said[0] == way
    assert said[1] and said[1].lower() in text.lower()  # the words that say it are quoted from the text


def test_the_words_of_the_direction_are_returned() -> None:
    assert effect_direction("Early ringing reduces mortality in chicks.") == ("down", "reduces")


@pytest.mark.parametrize(
    "text",
    [
        "Nest loss was lower on grazed plots and higher on mown ones.",  # both ways
        "Herons nest in reed beds along the estuary.",  # no direction
    ],
)
def test_effect_direction_is_none_when_it_cannot_say(text: str) -> None:
    assert effect_direction(text) is None


# --- compare_effects ------------------------------------------------------------------------


def test_claim_up_against_a_ratio_below_1_is_a_direction_flip() -> None:
    found = compare_effects(
        "Night shift work increases the risk of fractures.",
        "Among nurses, night shifts and fractures: HR 0.83 (95% CI 0.72-0.96) after adjustment.",
    )
    assert [f.code for f in found] == ["direction-flip"]
    assert "HR 0.83 (95% CI 0.72-0.96)" in found[0].message
    assert found[0].source_cue == "HR 0.83 (95% CI 0.72-0.96)"
    assert found[0].claim_cue == "increases"


def test_claim_down_against_a_ratio_below_1_agrees() -> None:
    found = compare_effects(
        "Hedgerows lower the odds of nest predation.",
        "Hedgerows and nest predation gave OR 0.73 (95% CI 0.54 to 0.98) in the survey.",
    )
    assert found == []


def test_claim_of_no_association_against_a_clear_ratio_is_a_negation() -> None:
    found = compare_effects(
        "Marsh work has no association with wheeze.",
        "For marsh work and wheeze the OR was 2.77 (1.04 to 7.97).",
    )
    assert [f.code for f in found] == ["negation"]
    assert "OR was 2.77 (1.04 to 7.97)" in found[0].message


def test_claim_of_an_increase_against_an_interval_holding_1_is_a_negation() -> None:
    # An interval from 0.89 to 1.22 holds 1: no clear effect (Altman, 1991; from memory).
    found = compare_effects(
        "Night shift work increases the risk of fractures.",
        "Night shifts and fractures: RR 1.04 (0.89 to 1.22) in the pooled cohort.",
    )
    assert [f.code for f in found] == ["negation"]
    assert "RR 1.04 (0.89 to 1.22)" in found[0].message


def test_estimates_pointing_both_ways_say_nothing() -> None:
    found = compare_effects(
        "Night shift work increases the risk of fractures.",
        "Night shifts and fractures: HR 0.75 (95% CI 0.60 to 0.94) and OR 1.40 (95% CI 1.10 to 1.80).",
    )
    assert found == []


def test_a_passage_without_a_ratio_says_nothing() -> None:
    found = compare_effects(
        "Night shift work increases the risk of fractures.",
        "Night shifts and fractures were recorded for 312 nurses over 4 years.",
    )
    assert found == []


# --- end to end: features and band ----------------------------------------------------------

# A transparent calibration, as in test_verdict.py: the score rises with similarity and coverage.
CAL = Calibration(
    weights=(10.0, 4.0, -1.5, -3.0, -3.0, -1.5, -3.0, 0.0, 0.0),
    bias=-8.0,
    anchored_at=0.6,
    adrift_below=0.2,
    provenance="test",
)
CITE = Citation(marker="[1]", label="[1]", key="1")


def test_a_ratio_against_the_claim_makes_the_check_a_conflict() -> None:
    claim = "Night shift work increases the risk of fractures in nurses."
    passage = "For night shifts and fractures in nurses the HR was 0.83 (95% CI 0.72-0.96)."
    hit = Hit(passage=Passage("a.pdf", 4, passage, 0), fused=0.9, dense=0.9, bm25=1.0, coverage=0.9)

    features = features_of(claim, [hit])
    assert FEATURE_NAMES.index("effect_disagrees") == 6
    assert [f.code for f in features.effects] == ["direction-flip"]
    assert features.vector()[FEATURE_NAMES.index("effect_disagrees")] == 1.0

    check = judge(claim, CITE, None, "a.pdf", [hit], CAL)
    assert check.band is Band.CONFLICT
    flips = [r for r in check.reasons if r.code == "direction-flip"]
    assert len(flips) == 1
    assert "0.83 (95% CI 0.72-0.96)" in flips[0].message and "p. 4" in flips[0].message


@pytest.mark.parametrize(
    ("text", "way"),
    [
        ("Statins increase the risk of falls.", "up"),
        ("Screening reduces the incidence of falls.", "down"),
        ("Exercise led to a rise in falls.", "up"),
    ],
)
def test_a_direction_word_naming_the_outcome_is_not_a_direction(text: str, way: str) -> None:
    # "falls" after "of" or "in" names the outcome; only the verb or the noun after an
    # article says which way it goes (common practice, no source).
    found = effect_direction(text)
    assert found is not None and found[0] == way


def test_a_confidence_level_named_before_the_estimate_is_skipped() -> None:
    # The "(95% CI)" column-head form of results tables and text (ICMJE/CONSORT reporting
    # of estimates with intervals; from memory).
    [estimate] = estimates("The odds ratio (95% CI) was 1.40 (1.10 to 1.80).")
    assert (estimate.value, estimate.low, estimate.high) == (1.40, 1.10, 1.80)
    assert estimate.direction == "up"


def test_a_claimed_absence_against_a_reported_association_is_a_negation() -> None:
    # "X is unrelated to Y" against "X was associated with Y": the source reports the very
    # association the claim denies (common practice in reading results, no source).
    [finding] = compare_effects(
        "Road noise is unrelated to nest desertion.",
        "Road noise was significantly associated with nest desertion in all three years.",
    )
    assert finding.code == "negation" and finding.source_cue == "was significantly associated with"


def test_a_denied_association_in_the_source_agrees_with_a_claimed_absence() -> None:
    claim = "Road noise is unrelated to nest desertion."
    assert compare_effects(claim, "Road noise was not associated with nest desertion.") == []
    assert compare_effects("Road noise increases nest desertion.", "Road noise was associated with desertion.") == []


def test_a_claimed_absence_against_a_reported_effect_is_a_negation() -> None:
    # "no known association" against "promote": the source reports an effect the claim
    # denies (common practice in reading results, no source).
    [finding] = compare_effects(
        "Tide height has no known association with the growth of barnacle larvae.",
        "We show that tide height signals promote the growth of barnacle larvae.",
    )
    assert finding.code == "negation" and finding.source_cue == "promote"
    # A negated effect in the source agrees with the claimed absence.
    assert (
        compare_effects(
            "Tide height has no known association with the growth of barnacle larvae.",
            "Tide height did not promote the growth of barnacle larvae.",
        )
        == []
    )


def test_ineffective_is_a_claimed_absence_of_effect() -> None:
    # "ineffective" is the direct antonym of "effective" (WordNet, Fellbaum 1998; from
    # memory): a claim that a treatment is ineffective denies the effect a source reports.
    [finding] = compare_effects(
        "Mowing is ineffective at reducing gorse cover.",
        "Mowing twice a year can reduce gorse cover on lowland heath.",
    )
    assert finding.code == "negation" and finding.claim_cue == "ineffective" and finding.source_cue == "reduce"
    assert compare_effects("Mowing is ineffective at reducing gorse cover.", "Mowing did not reduce gorse cover.") == []
