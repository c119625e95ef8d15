"""A claimed comparison between two groups against the values the source gives for them.

The reading rules are common practice, no source: a comparison names a direction word
before "than" and two groups; a value belongs to the group named next to it. The
comparison of the two values is arithmetic, with the rounding rule of the number check
(half a unit of the last written digit; common practice, no source).
"""

from __future__ import annotations

import pytest

from sourcecheck.judge.comparisons import compare_groups

PASSAGE = (
    "We opened 1,312 brood cells from 140 nests. In dense aggregations 27% of cells were "
    "parasitised (n = 702 cells), against 11% in sparse aggregations (n = 610 cells)."
)


def test_a_reversed_comparison_is_a_direction_flip_naming_both_values() -> None:
    claim = "Brood cells in sparse aggregations were parasitised more often than those in dense aggregations."
    [finding] = compare_groups(claim, PASSAGE)
    assert finding.code == "direction-flip"
    assert finding.claim_cue == "more"
    assert finding.source_cue == "11% against 27%"
    assert finding.message == (
        'claim says "more" in sparse aggregations than in dense aggregations, but the source gives 11% against 27%'
    )


def test_the_comparison_in_the_sources_order_gives_nothing() -> None:
    claim = "Brood cells in dense aggregations were parasitised more often than those in sparse aggregations."
    assert compare_groups(claim, PASSAGE) == []
    lower = "Brood cells in sparse aggregations were parasitised less often than those in dense aggregations."
    assert compare_groups(lower, PASSAGE) == []


def test_values_written_before_their_group_and_a_lower_claim() -> None:
    claim = "Mortality from pneumonia was lower in women than in men."
    passage = "Mortality was higher in women for lung infection (men, 18% vs women, 34%; P = .002)."
    [finding] = compare_groups(claim, passage)
    assert finding.source_cue == "34% against 18%"  # women first, as in the claim


@pytest.mark.parametrize(
    "claim",
    [
        "Scrapes held more than 50 nests.",  # a bound, not two groups
        "Warming raised nest density.",  # no comparison
        "Bees nest more often in sand than in clay.",  # the passage names neither group
    ],
)
def test_no_comparison_to_check(claim: str) -> None:
    assert compare_groups(claim, PASSAGE) == []


def test_equal_values_within_rounding_say_nothing() -> None:
    # 27% and 27.4% agree within the rounding of "27%".
    passage = "In dense aggregations 27% of cells were parasitised, against 27.4% in sparse aggregations."
    claim = "Cells in sparse aggregations were parasitised less often than those in dense aggregations."
    assert compare_groups(claim, passage) == []


def test_values_of_different_kinds_are_not_compared() -> None:
    passage = "In dense aggregations 27% of cells were parasitised, against 11 cells in sparse aggregations."
    claim = "Cells in sparse aggregations were parasitised more often than those in dense aggregations."
    assert compare_groups(claim, passage) == []


def test_changes_are_not_levels() -> None:
    # "Fell by 12% in A against 5% in B" says how much each group changed, not which is
    # lower (common practice, no source).
    passage = "Nest density fell by 12% on scraped plots, against 5% on unscraped controls."
    assert compare_groups("Nest density was lower on scraped plots than on unscraped controls.", passage) == []
