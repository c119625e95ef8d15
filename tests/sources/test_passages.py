"""Passage packing: whole sentences (pysbd), one page, at most max_words words."""

from __future__ import annotations

import pytest

from sourcecheck.sources._passages import is_fragment, make_passages, pack_paragraph


def test_abbreviations_do_not_end_sentences() -> None:
    # pysbd's golden rules (its README, "Golden Rules" list) keep "et al." and "Fig." inside.
    text = "As Hale et al. reported, loss doubled (see Fig. 2). The trend held in 2018."
    assert pack_paragraph(text, 12) == [
        "As Hale et al. reported, loss doubled (see Fig. 2).",
        "The trend held in 2018.",
    ]


def test_sentences_are_packed_up_to_the_limit() -> None:
    text = "One two three. Four five six. Seven eight nine."
    assert pack_paragraph(text, 6) == ["One two three. Four five six.", "Seven eight nine."]


def test_long_sentence_is_split_at_word_boundaries() -> None:
    words = [f"w{i}" for i in range(25)]
    chunks = pack_paragraph(" ".join(words) + ".", 10)
    assert all(len(c.split()) <= 10 for c in chunks)
    assert " ".join(chunks).split() == [*words[:-1], "w24."]


def test_passages_never_cross_pages_and_ordinals_count_up() -> None:
    pages = [["First page sentence one. Sentence two."], ["Second page sentence."]]
    passages = make_passages("s.pdf", pages, max_words=50, start=0)
    assert [(p.page, p.ordinal) for p in passages] == [(1, 0), (2, 1)]
    assert passages[0].text == "First page sentence one. Sentence two."


@pytest.mark.parametrize(
    ("text", "fragment"),
    [("2 Methods", True), ("Table 3", True), ("It rose.", False), ("Rates rose sharply overall", False)],
)
def test_fragments(text: str, fragment: bool) -> None:
    assert is_fragment(text) is fragment


def test_fragment_paragraphs_make_no_passage() -> None:
    passages = make_passages("s.pdf", [["Results", "Loss doubled."]], max_words=50)
    assert [p.text for p in passages] == ["Loss doubled."]


def test_max_words_must_be_positive() -> None:
    with pytest.raises(ValueError):
        make_passages("s.pdf", [["Text."]], max_words=0)
