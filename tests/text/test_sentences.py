"""The sentence splitter: pysbd's own boundaries, read window by window on long text."""

from __future__ import annotations

import pysbd

from sourcecheck.text import sentence_spans, split_sentences, wrapped_sentence_spans
from sourcecheck.text.sentences import WINDOW


def _pysbd(text: str) -> list[str]:
    return [s.strip() for s in pysbd.Segmenter(language="en", clean=False).segment(text) if s.strip()]


PARAGRAPH = " ".join(
    f"Okafor et al. counted {i} nests in Fig. {i % 7 + 1} (p < 0.05). Dr. Brandt saw 3.{i} eggs per nest [{i}]."
    for i in range(1, 120)
)


def test_short_text_is_exactly_pysbd() -> None:
    text = "Okafor et al. counted nests in Fig. 2. The count rose by 18%. It fell again [3]."
    assert (
        split_sentences(text)
        == _pysbd(text)
        == [
            "Okafor et al. counted nests in Fig. 2.",
            "The count rose by 18%.",
            "It fell again [3].",
        ]
    )


def test_long_paragraph_read_in_windows_keeps_pysbd_boundaries() -> None:
    # The paragraph is several windows long; every sentence pysbd finds, window by window,
    # is one of the 238 written ("et al.", "Fig.", "Dr." and "3.5" never cut a sentence).
    assert len(PARAGRAPH) > 3 * WINDOW
    sentences = split_sentences(PARAGRAPH)
    assert len(sentences) == 238
    assert all(s.startswith(("Okafor et al.", "Dr. Brandt")) for s in sentences)
    assert " ".join(sentences) == PARAGRAPH


def test_spans_locate_every_sentence_of_a_long_paragraph() -> None:
    spans = wrapped_sentence_spans(PARAGRAPH)
    assert [PARAGRAPH[a:b] for a, b in spans] == split_sentences(PARAGRAPH)
    assert sentence_spans(PARAGRAPH)[-1][1] == len(PARAGRAPH)


def test_one_unbroken_token_longer_than_a_window_is_cut_into_pieces() -> None:
    token = "x" * (5 * WINDOW + 7)
    pieces = split_sentences(token)
    assert "".join(pieces) == token
    assert max(len(p) for p in pieces) <= WINDOW


def test_a_sentence_longer_than_a_window_is_cut_at_a_space() -> None:
    words = " ".join(["nests"] * (WINDOW // 3)) + "."
    pieces = split_sentences(words)
    assert len(pieces) == 2
    assert all(p.startswith("nests") for p in pieces)
    assert " ".join(pieces) == words
