"""Tokenising, tagging and decoding never raise, whatever the text."""

from __future__ import annotations

import pytest

from sourcecheck.drafts.bibliography.entry_parser import parse_fields
from sourcecheck.drafts.bibliography.entry_parser.fields import LabelledSpan, decode_fields
from sourcecheck.drafts.bibliography.entry_parser.tokens import tokenize

ODD = [
    "",
    "   \n\t ",
    ".,;:!?()[]{}“”‘’\"'",
    "(((((((((",
    "&",
    "10.",
    "et al.",
    "\x00\x01\x02",
    "🙂 🙃",
    "x" * 5000,
    ("Okonjo, A. (2019). " * 300)[:5000],
    " ".join(["1999;"] * 1000),
]


@pytest.mark.parametrize("text", ODD, ids=range(len(ODD)))
def test_parse_never_raises(text: str) -> None:
    fields = parse_fields(text)
    assert all(text[s.start : s.end] == s.text for s in fields.spans)
    assert fields.title is None or fields.title.strip() == fields.title


def test_empty_text_gives_empty_fields() -> None:
    fields = parse_fields("")
    assert (fields.authors, fields.title, fields.year, fields.spans) == ((), None, None, ())


def test_tokens_keep_offsets_and_punctuation() -> None:
    text = "  (2019).  “Title,  &"
    tokens = tokenize(text)
    assert [t.text for t in tokens] == ["(2019).", "“Title,", "&"]
    assert all(text[t.start : t.end] == t.text for t in tokens)
    assert [(t.lead, t.core, t.trail) for t in tokens] == [("(", "2019", ")."), ("“", "Title", ","), ("&", "", "")]


@pytest.mark.parametrize("label", ["author", "title", "date", "journal", "volume", "pages", "editor", "doi"])
@pytest.mark.parametrize("text", [".", "(", "–", "et al.", "()", "vol.", "pp."])
def test_decoding_odd_spans(label: str, text: str) -> None:
    fields = decode_fields(text, [LabelledSpan(label, text, 0, len(text))])
    assert fields.year is None
    assert fields.title in (None, "et al", "vol", "pp")
