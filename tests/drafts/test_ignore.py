"""Ignore comments in the draft's own comment syntax mark claims as accepted."""

from __future__ import annotations

from pathlib import Path

from sourcecheck.drafts import read_draft
from sourcecheck.drafts.ignore import ignored_lines

MARKDOWN = """# Notes

<!-- sourcecheck: ignore -->
Heron nests rose by 23% [1].
Salt meadows spread [2]. <!-- sourcecheck: ignore -->
Reed beds shrank [1].

## References

[1] A. Ferrow, "Heron nests," 2021.
[2] B. Quill, "Salt meadows," 2020.
"""


def test_markdown_rule_own_line_covers_the_next_and_inline_its_own() -> None:
    assert ignored_lines(MARKDOWN, "markdown") == {4, 5}


def test_latex_comment_and_an_escaped_percent() -> None:
    text = (
        "% sourcecheck: ignore\n\nA rose \\citep{a}.\n"
        "B fell by 5\\% sourcecheck: ignore \\citep{b}.\n"
        "C \\citep{c}. % sourcecheck: ignore\n"
    )
    assert ignored_lines(text, "latex") == {3, 5}  # "\%" is a per cent sign, not a comment


def test_word_and_pdf_have_no_ignore_comment() -> None:
    assert ignored_lines("<!-- sourcecheck: ignore -->\nx [1].", "word") == set()


def test_read_draft_marks_the_covered_claims(tmp_path: Path) -> None:
    path = tmp_path / "draft.md"
    path.write_text(MARKDOWN, encoding="utf-8")
    draft = read_draft(path)
    assert [(c.text, c.ignored) for c in draft.claims] == [
        ("Heron nests rose by 23% [1].", True),
        ("Salt meadows spread [2].", True),
        ("Reed beds shrank [1].", False),
    ]
    assert all("sourcecheck" not in c.text for c in draft.claims)  # the comment never reaches a claim
