"""The report's own line layout: widths, hanging indents, kept spans."""

from __future__ import annotations

import textwrap

from rich.text import Text

from sourcecheck.reports.layout import keep_spans, wrap

WORDS = "Nest density rose with the share of bare ground in a quadrat [2, 5] and fell with moss cover [3]."


def test_lines_fit_the_width_and_hang_under_the_second_indent() -> None:
    lines = [t.plain for t in wrap(Text(WORDS), 30, indent=0, hang=4)]
    assert all(len(line) <= 30 for line in lines)
    assert all(line.startswith("    ") and not line.startswith("     ") for line in lines[1:])
    assert " ".join(" ".join(lines).split()) == WORDS  # nothing lost or doubled


def test_without_kept_spans_the_breaks_match_the_standard_library() -> None:
    # textwrap (CPython's reference greedy wrapper) with the same width and indents.
    ours = [t.plain for t in wrap(Text(WORDS), 30, indent=2, hang=4)]
    reference = textwrap.wrap(WORDS, 30, initial_indent="  ", subsequent_indent="    ", break_long_words=False)
    assert ours == reference


def test_a_kept_span_moves_whole_to_the_next_line() -> None:
    text = Text(WORDS)
    for width in range(20, 70):
        lines = [t.plain for t in wrap(text, width, keep=keep_spans(WORDS, ["[2, 5]"]))]
        assert any("[2, 5]" in line for line in lines), width


def test_a_word_longer_than_the_line_runs_over_instead_of_being_cut() -> None:
    path = "sample_sources/management/turf-stripping-bare-ground-2017.pdf"
    lines = [t.plain for t in wrap(Text(f"source: {path}"), 20, hang=2)]
    assert lines == ["source:", f"  {path}"]


def test_keep_spans_finds_every_occurrence_and_skips_single_words() -> None:
    assert keep_spans("[1] then [2, 3] and [2, 3]", ["[2, 3]", "[1]"]) == [(9, 15), (20, 26)]
