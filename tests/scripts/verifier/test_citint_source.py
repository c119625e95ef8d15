"""Citation markers are taken out of Citation-Integrity citing sentences, and articles split stably.

Marker forms are those listed in the data set's README (``<|cit|>``, ``<|multi_cit|>``,
``<|other_cit|>``); the sentences below are invented.
"""

from __future__ import annotations

import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[3] / "scripts" / "verifier"))

import citint_source


def test_bracketed_citation_groups_go_whole() -> None:
    text = "Drug A lowers risk [<|multi_cit|>,7], as others found (Lee et al., <|other_cit|>; Kim 2010)."
    assert citint_source.clean_citing_sentence(text) == "Drug A lowers risk, as others found."


def test_bare_markers_go_and_the_sentence_reads_on() -> None:
    text = "Drug A lowers risk.<|cit|> Lee et al. show that it is safe<|multi_cit|>."
    assert citint_source.clean_citing_sentence(text) == "Drug A lowers risk. Lee et al. show that it is safe."


def test_articles_are_the_first_three_digits_and_split_by_hash() -> None:
    assert citint_source.article_of(66012) == "660"
    sides = {citint_source.is_heldout_article(f"{n:03d}") for n in range(100, 1000, 10)}
    assert sides == {True, False}
    assert citint_source.is_heldout_article("110") and not citint_source.is_heldout_article("660")  # fixed by the hash


def test_claim_labels() -> None:
    assert citint_source.claim_label({"1": [{"sentences": [0], "label": "SUPPORT"}]}) == "ACCURATE"
    assert citint_source.claim_label({"1": [{"sentences": [0], "label": "REFUTE"}]}) == "NOT_ACCURATE"
    assert citint_source.claim_label({}) == "IRRELEVANT"
