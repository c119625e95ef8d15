"""Where a source's own reference list starts and ends."""

from __future__ import annotations

import pytest

from sourcecheck.sources._refsection import (
    cut_reference_sections,
    is_reference_heading,
    is_resume_heading,
)


@pytest.mark.parametrize(
    "line",
    [
        "References",
        "REFERENCES",
        "7 References",
        "7. References",
        "VII. References",
        "Bibliography",
        "Works Cited",
        "Literature cited",
        "References:",
        "References and Notes",
    ],
)
def test_reference_headings(line: str) -> None:
    assert is_reference_heading(line)


@pytest.mark.parametrize(
    "line", ["references", "See the references below.", "References to earlier work were sparse.", "References 45"]
)
def test_not_reference_headings(line: str) -> None:
    assert not is_reference_heading(line)


@pytest.mark.parametrize(
    "line", ["Appendix", "Appendix A. Survey items", "Supplementary material", "Supporting Information", "A. Appendix"]
)
def test_resume_headings(line: str) -> None:
    assert is_resume_heading(line)


def test_cut_runs_from_heading_to_appendix_across_pages() -> None:
    pages = [
        ["Body one.", "Body two."],
        ["Body three.", "References", "[1] A."],
        ["[2] B."],
        ["Appendix A", "More body."],
    ]
    assert cut_reference_sections(pages) == [
        ["Body one.", "Body two."],
        ["Body three."],
        [],
        ["Appendix A", "More body."],
    ]


def test_heading_in_first_third_of_long_document_is_not_cut() -> None:
    # A table of contents line early in a long document is not the reference list.
    pages = [["Contents", "References"], *[[f"Body {i}."] * 5 for i in range(4)]]
    assert cut_reference_sections(pages)[0] == ["Contents", "References"]
    assert cut_reference_sections(pages)[1:] == pages[1:]
