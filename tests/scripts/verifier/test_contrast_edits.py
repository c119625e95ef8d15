"""The second-stage contrast edits of scripts/verifier/contrast_edits.py on invented sentences.

The expected outputs are plain English usage (common practice, no source). The antonyms are
WordNet 3.0's direct antonym links (Debian ``wordnet-base``): wet / dry, warm / cool,
include / exclude, rise / fall are WordNet's own pairs. The Makefile installs WordNet, so
these tests run (and fail, never skip) in ``make test``.
"""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

sys.path.insert(0, str(Path(__file__).resolve().parents[3] / "scripts" / "verifier"))

import contrast_edits
from build_contrast import balance_pairs, contrast_pairs
from pair_records import CONTRADICTS, SUPPORTS, Pair


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("Sites with more nests were wetter in spring.", "Sites with more nests were drier in spring."),
        ("Soil on south slopes was warmer in March.", "Soil on south slopes was cooler in March."),
        ("Other plots were sampled.", None),  # "other" is no comparative
    ],
)
def test_swap_comparative(text: str, expected: str | None) -> None:
    assert contrast_edits.swap_comparative(text) == expected


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("The trial included older patients.", "The trial excluded older patients."),
        ("Prices rose after the ban.", "Prices fell after the ban."),
        ("Increases were small.", None),  # a first word is left alone: it is nearly always the subject
    ],
)
def test_swap_verb_antonym(text: str, expected: str | None) -> None:
    assert contrast_edits.swap_verb_antonym(text) == expected


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("Males emerged earlier than females.", "Females emerged earlier than males."),
        (
            "Scraped plots held more nests than unscraped controls.",
            "Unscraped controls held more nests than scraped plots.",
        ),
        ("The treated group had higher scores than controls.", None),  # subject cut after "The": refused
        ("Yields were higher than expected.", None),
    ],
)
def test_swap_than_roles(text: str, expected: str | None) -> None:
    assert contrast_edits.swap_than_roles(text) == expected


def test_contrast_pairs_edit_supported_claims_only_and_keep_the_claims_split() -> None:
    supported = Pair(
        "Males emerged earlier than females.", "Males emerged a week before females.", SUPPORTS, "scifact", "c1", "val"
    )
    neutral = Pair("Males emerged earlier than females.", "Nests were counted weekly.", "neither", "scifact", "c2")
    made, counts = contrast_pairs([supported, neutral], per_kind=10)
    assert made, "a supported claim with a 'than' comparison gives at least one edit"
    assert all(p.label == CONTRADICTS for p in made)
    claims_edited = [p for p in made if p.evidence == supported.evidence]
    assert {p.claim for p in claims_edited} >= {"Females emerged earlier than males."}
    assert all(p.group == "c1" and p.split == "val" for p in claims_edited)
    assert sum(counts.values()) == len(made)


def test_contrast_pairs_cap_each_kind() -> None:
    pairs = [
        Pair(f"Plot {i} was wetter in May.", f"Plot {i} was wetter in May.", SUPPORTS, "scifact", f"c{i}")
        for i in range(20)
    ]
    made, counts = contrast_pairs(pairs, per_kind=5)
    assert sum(n for kind, n in counts.items() if kind.startswith("comparative-swapped")) == 5
    assert len({(p.claim, p.evidence) for p in made}) == len(made)


def test_balance_pairs_keep_an_edit_made_to_both_sides_supported() -> None:
    pair = Pair("Warm soil delayed emergence.", "Warm soil delayed emergence by a week.", SUPPORTS, "scifact", "c1")
    made, counts = balance_pairs([pair])
    both = [p for p in made if p.source.startswith("balance:both-")]
    assert [(p.claim, p.evidence) for p in both] == [
        ("Warm soil rushed emergence.", "Warm soil rushed emergence by a week.")
    ]
    assert all(p.label == SUPPORTS and p.group == "c1" for p in made)
    assert not any("negation" in kind for kind in counts)  # "not" before another verb would break the entailment


def test_balance_pairs_quote_scientific_sentences_with_an_attribution() -> None:
    sentence = "Scraped plots held a mean of 3.4 nests per square metre."
    made, _ = balance_pairs([Pair("Plots held nests.", sentence, "neither", "scifact", "c2", "val")])
    quoted = [p for p in made if p.source.startswith("balance:attributed")]
    assert len(quoted) == 1
    assert quoted[0].evidence == sentence and quoted[0].label == SUPPORTS and quoted[0].split == "val"
    assert "scraped plots held a mean of 3.4 nests per square metre" in quoted[0].claim.lower()
