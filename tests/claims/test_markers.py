"""Tests for finding citation markers in running text."""

from __future__ import annotations

import pytest

from sourcecheck.claims.markers import MAX_RANGE, AuthorYearCite, NumberCite, find_markers


def numbers(text: str) -> list[list[int]]:
    return [[c.number for c in m.cites if isinstance(c, NumberCite)] for m in find_markers(text)]


def labels(text: str) -> list[str]:
    return [c.label for m in find_markers(text) for c in m.cites]


# --- numbered markers ------------------------------------------------------------------


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        # IEEE Reference Guide (from memory): a reference is cited by its number in brackets.
        ("as shown in [3].", [[3]]),
        # IEEE Reference Guide (from memory): several references, "[2], [5]" or "[2, 5]".
        ("as shown in [2, 5].", [[2, 5]]),
        ("as shown in [2,5].", [[2, 5]]),
        # IEEE Reference Guide (from memory): a range of references, "[4]–[7]".
        ("as shown in [4]–[7].", [[4, 5, 6, 7]]),
        ("as shown in [4-7].", [[4, 5, 6, 7]]),
        ("as shown in [4–7].", [[4, 5, 6, 7]]),
        ("as shown in [2, 4–6].", [[2, 4, 5, 6]]),
        ("first [1][2] then", [[1], [2]]),
    ],
)
def test_numbered_forms(text: str, expected: list[list[int]]) -> None:
    assert numbers(text) == expected


def test_locator_is_kept_apart_from_the_number() -> None:
    # IEEE Reference Guide (from memory): a page is given inside the brackets, "[3, p. 7]".
    (marker,) = find_markers("The rate fell [3, p. 7].")
    assert marker.text == "[3, p. 7]"
    assert marker.cites == (NumberCite(3, "p. 7"),)


def test_each_number_has_its_own_label() -> None:
    assert labels("see [2, 5]") == ["[2]", "[5]"]


def test_range_expansion_is_capped() -> None:
    wide = f"[1-{MAX_RANGE + 10}]"
    assert numbers(wide) == [[1, MAX_RANGE + 10]]
    assert numbers(f"[1-{MAX_RANGE}]") == [list(range(1, MAX_RANGE + 1))]


@pytest.mark.parametrize(
    "text",
    [
        # CommonMark spec 0.31 (from memory): inline links, images, reference-style links
        # and link reference definitions all use square brackets.
        "a [link](https://example.org) here",
        "a [3](https://example.org) numbered link",
        "an image ![figure](fig.png)",
        "a reference-style [link][2] here",
        "[1]: https://example.org",
        # GitHub Flavored Markdown spec (from memory): footnote references and task boxes.
        "a footnote[^1] here",
        "- [ ] open task",
        "- [x] done task",
        "quoted [sic] text",
        "in code `[4]` only",
        "the year [2019] in brackets",
    ],
)
def test_markdown_brackets_are_not_markers(text: str) -> None:
    assert find_markers(text) == []


def test_bracketed_marker_inside_link_text_is_found() -> None:
    assert numbers("see [[4]](#ref-4)") == [[4]]


# --- author-year markers ---------------------------------------------------------------


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        # APA 7th ed., section 8.17 and Table 8.1 (from memory): one author "(Luna, 2020)",
        # two authors "(Salas & D'Agostino, 2020)", three or more "(Martin et al., 2020)".
        ("(Luna, 2020)", ["Luna, 2020"]),
        ("(Salas & D'Agostino, 2020)", ["Salas & D'Agostino, 2020"]),
        ("(Martin et al., 2020)", ["Martin et al., 2020"]),
        # APA 7th ed., section 8.12 (from memory): several works in one parenthesis,
        # separated by semicolons.
        (
            "(Adams et al., 2019; Shumway & Shulman, 2015; Westinghouse, 2017)",
            ["Adams et al., 2019", "Shumway & Shulman, 2015", "Westinghouse, 2017"],
        ),
        # APA 7th ed., section 8.19 (from memory): works of one author in one year take
        # suffixes, cited together with the name once.
        ("(e.g., Brandt, 2021a, 2021b)", ["Brandt, 2021a", "Brandt, 2021b"]),
        # APA 7th ed., section 8.21 (from memory): a group author with its abbreviation.
        ("(National Institute of Mental Health [NIMH], 2020)", ["National Institute of Mental Health, 2020"]),
        ("(Okafor et al., 2019; Brandt 2021a)", ["Okafor et al., 2019", "Brandt, 2021a"]),
        ("(Okafor and Lin 2019)", ["Okafor & Lin, 2019"]),
        (
            "(van der Berg, 2020; Nguyen-Hall, 2018; Ólafsdóttir 2017)",
            ["van der Berg, 2020", "Nguyen-Hall, 2018", "Ólafsdóttir, 2017"],
        ),
        ("(Okafor, n.d.)", ["Okafor, n.d."]),
    ],
)
def test_parenthetical_forms(text: str, expected: list[str]) -> None:
    assert labels(f"Yields rose {text}.") == expected


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        # APA 7th ed., Table 8.1 (from memory): narrative forms "Luna (2020)",
        # "Salas and D'Agostino (2020)", "Martin et al. (2020)".
        ("Luna (2020) found", ["Luna, 2020"]),
        ("Salas and D'Agostino (2020) found", ["Salas & D'Agostino, 2020"]),
        ("Martin et al. (2020) found", ["Martin et al., 2020"]),
        ("Okafor and Lin (2019) found", ["Okafor & Lin, 2019"]),
        ("Brandt (2021a) found", ["Brandt, 2021a"]),
        ("as van der Berg (2020) found", ["van der Berg, 2020"]),
        ("Okafor's (2019) study", ["Okafor, 2019"]),
    ],
)
def test_narrative_forms(text: str, expected: list[str]) -> None:
    assert labels(text) == expected


def test_locators_and_prefixes() -> None:
    # APA 7th ed., section 8.13 (from memory): a quotation cites its page, "(Author, 2019, p. 12)".
    (paren,) = find_markers("It was so (see Okafor et al., 2019, p. 12).")
    assert paren.text == "(see Okafor et al., 2019, p. 12)"
    assert paren.cites == (AuthorYearCite(("Okafor",), True, 2019, "", "2019", "p. 12"),)
    (narrative,) = find_markers("Okafor et al. (2019, p. 4) disagree.")
    assert narrative.cites[0].locator == "p. 4"
    assert narrative.text == "Okafor et al. (2019, p. 4)"


def test_cite_fields() -> None:
    (marker,) = find_markers("(Okafor & Lin, 2019; Brandt 2021a)")
    first, second = marker.cites
    assert isinstance(first, AuthorYearCite) and isinstance(second, AuthorYearCite)
    assert (first.names, first.et_al, first.year, first.suffix) == (("Okafor", "Lin"), False, 2019, "")
    assert (second.names, second.year, second.suffix) == (("Brandt",), 2021, "a")


@pytest.mark.parametrize(
    "text",
    [
        "(in 2019 the site closed)",
        "(May 2019)",
        "(Summer 2020)",
        "(Table 2, 2019)",
        "(n = 20, 2019)",
        "(2019)",
        "(COVID-19, 2020)",
        "results (2019–2020) show",
        "the law (2019) says",
    ],
)
def test_ordinary_parentheses_with_a_year_are_not_markers(text: str) -> None:
    assert find_markers(text) == []


def test_a_lower_case_word_before_and_does_not_swallow_the_name() -> None:
    assert labels("The data and Lin (2019) agree.") == ["Lin, 2019"]


def test_markers_come_in_text_order_with_offsets() -> None:
    text = "Brandt (2021a) and [3] agree (Lin, 2020)."
    found = find_markers(text)
    assert [m.text for m in found] == ["Brandt (2021a)", "[3]", "(Lin, 2020)"]
    assert all(text[m.start : m.end] == m.text for m in found)
