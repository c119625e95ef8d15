"""Tests for sentence splitting and pairing sentences with markers."""

from __future__ import annotations

from sourcecheck.claims.extract import Block, extract_claims, readable
from sourcecheck.claims.resolve import Resolver
from sourcecheck.model import Reference
from sourcecheck.text import wrapped_sentence_spans as split_sentences


def sentences(text: str) -> list[str]:
    return [text[s:e] for s, e in split_sentences(text)]


def test_pysbd_golden_rule_one() -> None:
    # pySBD Golden Rules, English rule 1 (Sadvilkar & Neumann, EMNLP 2020 NLP-OSS).
    assert sentences("Hello World. My name is Jonas.") == ["Hello World.", "My name is Jonas."]


def test_et_al_and_fig_do_not_end_a_sentence() -> None:
    # pySBD Golden Rules (from memory) treat "et al." and "Fig." as abbreviations that do
    # not end a sentence when a number or lower-case word follows.
    text = "Okafor et al. (2019) saw it in Fig. 2 of the report [3]. Then it ended."
    assert sentences(text) == ["Okafor et al. (2019) saw it in Fig. 2 of the report [3].", "Then it ended."]


def test_line_breaks_inside_a_paragraph_do_not_split() -> None:
    assert sentences("The rate fell\nsharply [2]. Then\nit rose.") == ["The rate fell\nsharply [2].", "Then\nit rose."]


def refs() -> Resolver:
    return Resolver(
        [
            Reference("okafor2019", "x", ("Okafor", "Lin", "Brandt"), 2019),
            Reference("brandt2021a", "x", ("Brandt",), 2021, "a"),
            Reference("2", "x"),
            Reference("3", "x"),
        ]
    )


def test_claims_ids_lines_and_citations() -> None:
    blocks = [
        Block("No marker here. Yields rose (Okafor et al., 2019;\nBrandt 2021a).", 5),
        Block("Untouched text.\nIt fell [2, 3] and [9].", 9),
    ]
    claims = extract_claims(blocks, refs())
    assert [c.id for c in claims] == ["c1", "c2"]
    assert [c.line for c in claims] == [5, 10]
    assert claims[0].text == "Yields rose (Okafor et al., 2019; Brandt 2021a)."
    assert [(c.label, c.key) for c in claims[0].citations] == [
        ("Okafor et al., 2019", "okafor2019"),
        ("Brandt, 2021a", "brandt2021a"),
    ]
    assert [(c.marker, c.label, c.key) for c in claims[1].citations] == [
        ("[2, 3]", "[2]", "2"),
        ("[2, 3]", "[3]", "3"),
        ("[9]", "[9]", None),
    ]


def test_same_work_twice_in_a_sentence_counts_once() -> None:
    (claim,) = extract_claims([Block("It rose [2] and fell [2, 3] (Brandt, 2021a; Brandt 2021a).", 1)], refs())
    assert [c.label for c in claim.citations] == ["[2]", "[3]", "Brandt, 2021a"]


def test_marker_after_the_full_stop_belongs_to_the_sentence_before() -> None:
    claims = extract_claims([Block("Yields rose. [2] Then they fell.", 1)], refs())
    assert [(c.text, c.citations[0].label) for c in claims] == [("Yields rose. [2]", "[2]")]


def test_first_id_continues_numbering() -> None:
    claims = extract_claims([Block("It rose [2].", 1)], refs(), first_id=7)
    assert claims[0].id == "c7"


def test_readable_strips_markdown_but_keeps_markers() -> None:
    assert readable("**Yields** rose *sharply* in `plot_a` [2] (see [the site](https://x.org)).") == (
        "Yields rose sharply in plot_a [2] (see the site)."
    )
    assert readable("snake_case_name stays, _emphasis_ goes[^1].") == "snake_case_name stays, emphasis goes."
