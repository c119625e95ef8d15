"""Running lines, page numbers, paragraphs and line-end hyphens on lists of lines."""

from __future__ import annotations

import pytest

from sourcecheck.pdftext.layout import (
    drop_running_lines,
    group_paragraphs,
    is_page_number,
    join_lines,
    vocabulary,
)


@pytest.mark.parametrize(
    "line", ["3", "- 3 -", "– 12 –", "Page 3", "page 3 of 10", "3 of 10", "p. 3", "3/10", "[7]", "iv", "xii"]
)
def test_page_number_forms(line: str) -> None:
    assert is_page_number(line)


@pytest.mark.parametrize("line", ["3 patients", "Table 3", "2019 was wet", "Page three", "p < 0.05"])
def test_not_page_numbers(line: str) -> None:
    assert not is_page_number(line)


def _page(n: int, body: str) -> list[str]:
    return [f"Annals of Invented Hydrology {n} (2020)", body, f"{n}"]


def test_running_header_with_changing_numbers_is_dropped() -> None:
    bodies = ["Rain fell.", "Rivers rose.", "Fields flooded.", "Crops failed."]
    pages = [_page(n, body) for n, body in enumerate(bodies, start=1)]
    assert drop_running_lines(pages) == [[body] for body in bodies]


def test_two_pages_are_not_evidence_of_a_running_line() -> None:
    pages = [_page(n, "Body text here.") for n in (1, 2)]
    cleaned = drop_running_lines(pages)
    assert all(page[0].startswith("Annals") for page in cleaned)
    assert all(page[-1] == "Body text here." for page in cleaned)  # lone numbers still go


def test_recurring_line_in_the_middle_of_pages_is_kept() -> None:
    middle = "Repeated sentence in the middle."
    pages = [["a one", "b two", "c three", "d four", middle, "e five", "f six", "g seven", "h eight"] for _ in range(3)]
    assert all(middle in page for page in drop_running_lines(pages))


def test_heading_stands_alone_and_short_sentence_end_closes_paragraph() -> None:
    lines = [
        "2 Methods",
        "We measured the flow at every gauge along the river during the whole",
        "study period, and we logged each value in the field notebook as well",
        "as on the data logger.",
        "Second paragraph starts with a capital letter and runs to the end of",
        "the line, then goes on to a second full line of text before it stops.",
    ]
    assert group_paragraphs(lines) == [[lines[0]], lines[1:4], lines[4:6]]


def test_hyphen_break_is_joined_and_real_compound_kept() -> None:
    vocab = vocabulary("a long-term view of prevalence")
    assert join_lines(["the preva-", "lence rose"], vocab) == "the prevalence rose"
    assert join_lines(["the long-", "term view"], vocab) == "the long-term view"
    assert join_lines(["state-of-the-", "art tools"], set()) == "state-of-the-art tools"


def test_hyphen_before_capital_or_digit_is_kept_without_space() -> None:
    assert join_lines(["COVID-", "19 cases"], set()) == "COVID-19 cases"


def test_soft_hyphen_joins_and_disappears() -> None:
    assert join_lines(["preva\u00ad", "lence of cases"], set()) == "prevalence of cases"
    assert join_lines(["ab\u00adcd ef"], set()) == "abcd ef"
