"""Bounds on what is read of a draft: each cut block named once, with its limit; the rest read."""

from __future__ import annotations

from sourcecheck.claims import Block, bound_blocks, bound_citations, cut_draft
from sourcecheck.drafts.markdown.reader import read_markdown
from sourcecheck.limits import Limits
from sourcecheck.model import Citation, Claim, ReadOptions
from tests import hostile


def test_a_paragraph_over_the_character_limit_is_cut_at_a_space() -> None:
    blocks = [Block("Nests rose. " * 20, 3), Block("Tides fell [2].", 9)]
    kept, problems = bound_blocks(blocks, Limits(paragraph_chars=50), "d.md")
    assert kept[0].text == ("Nests rose. " * 4).rstrip() and kept[0].line == 3
    assert kept[1] == blocks[1]
    assert [p.message for p in problems] == [
        "line 3: a paragraph of 240 characters, over the limit of 50 (paragraph_chars); the rest of it is not read"
    ]


def test_a_paragraph_over_the_sentence_limit_keeps_its_first_sentences() -> None:
    kept, problems = bound_blocks(
        [Block("One [1]. Two [2]. Three [3]. Four [4].", 1)], Limits(paragraph_sentences=2), "d"
    )
    assert kept[0].text == "One [1]. Two [2]."
    assert "a paragraph of 4 sentences, over the limit of 2 (paragraph_sentences)" in problems[0].message


def test_the_draft_limit_stops_reading_with_one_line() -> None:
    blocks = [Block("a" * 40, 1), Block("b" * 40, 3), Block("c" * 40, 5)]
    kept, problems = bound_blocks(blocks, Limits(draft_chars=60), "d.md")
    assert [b.text for b in kept] == ["a" * 40, "b" * 20]
    assert [p.message for p in problems] == [
        "line 3: the draft's text is over the limit of 60 characters (draft_chars); the rest is not read"
    ]


def test_cut_draft_names_the_line_it_stops_at() -> None:
    text, problems = cut_draft("one\ntwo\nthree\n", Limits(draft_chars=6), "d.md")
    assert text == "one\ntw"
    assert problems[0].message == "14 characters, over the limit of 6 (draft_chars); from line 2 on it is not read"


def test_citations_over_the_limit_keep_the_first() -> None:
    citations = tuple(Citation(f"[{i}]", f"[{i}]", str(i)) for i in range(1, 6))
    claims = [Claim("c1", "Nests rose [1]...[5].", 4, citations, file="sec/intro.tex")]
    kept, problems = bound_citations(claims, Limits(sentence_citations=2), "d.tex")
    assert [c.label for c in kept[0].citations] == ["[1]", "[2]"]
    assert problems[0].file == "sec/intro.tex"
    assert "a sentence citing 5 works, over the limit of 2 (sentence_citations)" in problems[0].message


def test_a_markdown_draft_over_the_limits_is_still_checked_up_to_them() -> None:
    draft = read_markdown(
        hostile.long_paragraph(50), "d.md", options=ReadOptions(limits=Limits(paragraph_sentences=10))
    )
    assert len(draft.claims) == 10 and len(draft.references) == 1
    assert sum("paragraph_sentences" in p.message for p in draft.problems) == 1

    draft = read_markdown(
        hostile.many_citations(300), "d.md", options=ReadOptions(limits=Limits(sentence_citations=40))
    )
    assert len(draft.claims) == 1 and len(draft.claims[0].citations) == 40
    assert any("a sentence citing 300 works" in p.message for p in draft.problems)
