"""Claim words are marked in a passage by the judge's own tokens and stems."""

from __future__ import annotations

from sourcecheck.reports.highlight import claim_words, segments


def _marked(claim: str, passage: str) -> list[str]:
    return [text for text, hit in segments(passage, claim_words(claim)) if hit]


def test_pieces_join_back_to_the_passage() -> None:
    passage = "Only 18% of nest entrances lay on north-facing slopes, whereas 64% faced south."
    assert "".join(t for t, _ in segments(passage, claim_words("23% of nest entrances"))) == passage


def test_plurals_fold_and_stop_words_stay_unmarked() -> None:
    # Harman's S-stemmer (1991): "nests" -> "nest", "entrances" -> "entrance"; "of", "the" are stop words.
    assert _marked("the nest entrance", "Most of the nests had two entrances.") == ["nests", "entrances"]


def test_neighbouring_claim_words_form_one_mark_and_numbers_match_exactly() -> None:
    assert _marked("bare ground rose by 18.5 units", "Bare ground rose by 18.5 or 18 units.") == [
        "Bare ground rose",
        "18.5",
        "units",
    ]
