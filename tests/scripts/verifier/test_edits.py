"""The counterfactual edits of scripts/verifier/edits.py on invented sentences.

The expected outputs are plain English usage (common practice, no source); the antonym cases
depend on WordNet 3.0's direct antonym links (Debian ``wordnet-base``), e.g. effective /
ineffective and important / unimportant, which are WordNet's own pairs.
"""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

sys.path.insert(0, str(Path(__file__).resolve().parents[3] / "scripts" / "verifier"))

import edits

HAS_WORDNET = (Path("/usr/share/wordnet") / "data.adj").is_file()


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("Drug A is associated with lower mortality.", "Drug A is not associated with lower mortality."),
        ("Drug A reduces mortality in adults.", "Drug A does not reduce mortality in adults."),
        ("The effect has been shown in mice.", "The effect has not been shown in mice."),
        ("Drug A is not associated with mortality.", None),  # already negated: left alone
        ("Results of the trial were mixed.", "Results of the trial were not mixed."),
    ],
)
def test_insert_negation(text: str, expected: str | None) -> None:
    assert edits.insert_negation(text) == expected


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("Drug A is not associated with mortality.", "Drug A is associated with mortality."),
        ("Drug A does not reduce mortality.", "Drug A reduces mortality."),
        ("Lamins do not have an effect.", "Lamins have an effect."),
        ("The drug did not improve survival.", "The drug improved survival."),
        ("Exercise has no effect on sleep.", "Exercise has an effect on sleep."),
        ("Not only A but also B is needed.", None),
        ("Drug A is associated with mortality.", None),
    ],
)
def test_remove_negation(text: str, expected: str | None) -> None:
    assert edits.remove_negation(text) == expected


def test_direction_swap_changes_the_first_direction_word_and_keeps_its_capital() -> None:
    assert edits.swap_direction("Higher doses increase risk.") == "Lower doses increase risk."
    assert edits.swap_direction("Exercise reduces blood pressure.") == "Exercise increases blood pressure."
    assert edits.swap_direction("Cells divide.") is None


def test_number_change_needs_the_number_in_both_texts() -> None:
    claim = "Mortality fell by 25% in 300 adults."
    assert edits.change_number(claim, "a 25 % fall") == "Mortality fell by 50% in 300 adults."
    assert edits.change_number(claim, "a fall among 300 adults") == "Mortality fell by 25% in 600 adults."
    assert edits.change_number("IL-6 rose in 2010.", "IL-6 rose in 2010") is None  # a name and a year


def test_groups_of_a_comparison_are_swapped() -> None:
    text = "Risk was higher in women than in men."
    assert edits.swap_groups(text) == "Risk was higher in men than in women."
    assert (
        edits.swap_groups("Patients with diabetes have a higher risk.")
        == "Patients without diabetes have a higher risk."
    )
    assert edits.swap_groups("Patients with diabetes were enrolled.") is None  # no comparison, no swap


@pytest.mark.skipif(not HAS_WORDNET, reason="Debian wordnet-base is not installed")
def test_antonym_swap_uses_wordnet_only_for_predicated_adjectives() -> None:
    assert edits.swap_antonym("The vaccine is effective in adults.") == "The vaccine is ineffective in adults."
    assert edits.swap_antonym("Klf4 is important for growth.") == "Klf4 is unimportant for growth."
    assert edits.swap_antonym("Sympathetic nerve activity falls.") is None  # classifying adjective


def test_inflection_helpers() -> None:
    assert [edits.third_person(v) for v in ("reduce", "have", "modify", "block")] == [
        "reduces",
        "has",
        "modifies",
        "blocks",
    ]
    assert [edits.past_tense(v) for v in ("reduce", "lead", "block")] == ["reduced", "led", "blocked"]
