"""Tests for assembling a LaTeX draft's source: comments, skipped passages, included files.

The comment rules checked here are LaTeX's own (Lamport, "LaTeX: A Document Preparation
System", section on special characters and comments; from memory): "%" starts a comment
that runs to the end of the line and also swallows the line end and the next line's
leading blanks, while "\\%" prints a percent sign. ``\\input{x}`` reads x.tex ("x" with
".tex" added when the name has no ".tex"), as TeX does (common practice, no source).
"""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.drafts.latex.source import Place, load_source
from sourcecheck.errors import DraftUnreadable


def write(folder: Path, name: str, text: str) -> Path:
    path = folder / name
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(text, encoding="utf-8")
    return path


def test_comments_are_dropped_but_an_escaped_percent_stays(tmp_path: Path) -> None:
    # Lamport (from memory): "%" to the end of the line is ignored, line end included;
    # "\%" is a percent sign, and "\\%" is a line break followed by a comment.
    draft = write(tmp_path, "d.tex", "Rose by 12\\% here % hidden \\cite{x}\nnext\n  line\nA\\\\% gone\nB\n")
    source, problems = load_source(draft, "d.tex")
    assert problems == []
    assert source.text == "Rose by 12\\% here next\n  line\nA\\\\B\n"


def test_a_comment_swallows_the_next_lines_leading_blanks(tmp_path: Path) -> None:
    # Lamport (from memory): "word%" + newline + "   next" joins the two words.
    source, _ = load_source(write(tmp_path, "d.tex", "hyphen%\n    ated word\n"), "d.tex")
    assert source.text == "hyphenated word\n"


def test_a_blank_line_after_a_comment_still_ends_the_paragraph(tmp_path: Path) -> None:
    # Lamport (from memory): a blank line ends a paragraph; the comment before it does not
    # take that away.
    source, _ = load_source(write(tmp_path, "d.tex", "one % note\n\ntwo\n"), "d.tex")
    assert "\n\n" in source.text.replace(" ", "")
    assert source.place(source.text.index("two")) == Place(None, 3)


def test_comment_environment_and_iffalse_are_skipped(tmp_path: Path) -> None:
    text = "a\n\\begin{comment}\n\\cite{gone} 50%\n\\end{comment}\nb \\iffalse \\cite{off} \\ifx\\a\\b x\\fi \\fi c\n"
    source, problems = load_source(write(tmp_path, "d.tex", text), "d.tex")
    assert problems == []
    assert "gone" not in source.text and "off" not in source.text
    assert source.text.startswith("a\n") and source.text.rstrip().endswith("c")
    # Line numbers stay those of the file after a skipped passage.
    assert source.place(source.text.index("b")) == Place(None, 5)


def test_verb_keeps_its_percent_and_braces_as_text(tmp_path: Path) -> None:
    source, _ = load_source(write(tmp_path, "d.tex", "Use \\verb|50%{x| now\n"), "d.tex")
    assert "now" in source.text
    assert "\\texttt{50\\%\\{x}" in source.text


def test_input_is_followed_with_places_in_the_right_file(tmp_path: Path) -> None:
    draft = write(tmp_path, "paper.tex", "one\n\\input{sections/intro}\nthree \\include{end}\n")
    write(tmp_path, "sections/intro.tex", "alpha\nbeta\n")
    write(tmp_path, "end.tex", "omega\n")
    source, problems = load_source(draft, "drafts/paper.tex")
    assert problems == []
    assert source.place(source.text.index("beta")) == Place("drafts/sections/intro.tex", 2)
    assert source.place(source.text.index("three")) == Place(None, 3)
    assert source.place(source.text.index("omega")) == Place("drafts/end.tex", 1)
    # \include starts a new page, hence a paragraph break before the included text.
    assert "\n\nomega" in source.text


def test_subfile_gives_only_its_body(tmp_path: Path) -> None:
    # The subfiles package (common practice, no source): a subfile is a full document
    # whose preamble and \begin{document} are dropped when it is included.
    draft = write(tmp_path, "main.tex", "\\begin{document}\n\\subfile{ch/one}\nlast\n\\end{document}\n")
    write(tmp_path, "ch/one.tex", "\\documentclass[../main]{subfiles}\n\\begin{document}\ninside\n\\end{document}\n")
    source, problems = load_source(draft, "main.tex")
    assert problems == []
    assert source.text.count("\\begin{document}") == 1 and source.text.count("\\end{document}") == 1
    assert "documentclass" not in source.text
    assert source.place(source.text.index("inside")) == Place("ch/one.tex", 3)


def test_bare_input_name_and_endinput(tmp_path: Path) -> None:
    draft = write(tmp_path, "d.tex", "\\input part done\n")
    write(tmp_path, "part.tex", "kept\n\\endinput\nnot read\n")
    source, problems = load_source(draft, "d.tex")
    assert problems == []
    assert "kept" in source.text and "not read" not in source.text and "done" in source.text


def test_input_outside_the_folder_is_refused(tmp_path: Path) -> None:
    folder = tmp_path / "draft"
    write(tmp_path, "secret.tex", "private words\n")
    draft = write(folder, "x.tex", "before\n\\input{../secret}\nafter\n")
    source, problems = load_source(draft, "x.tex")
    assert [(p.file, p.message) for p in problems] == [
        ("x.tex", "line 2: \\input of ../secret.tex refused (outside the draft's folder)")
    ]
    assert "private" not in source.text and "after" in source.text


def test_absolute_input_is_refused(tmp_path: Path) -> None:
    other = write(tmp_path, "elsewhere/notes.tex", "private\n")
    draft = write(tmp_path / "draft", "x.tex", f"\\input{{{other}}}\nafter\n")
    source, problems = load_source(draft, "x.tex")
    assert len(problems) == 1 and "refused (outside the draft's folder)" in problems[0].message
    assert "private" not in source.text


def test_input_loop_is_reported_once_and_reading_goes_on(tmp_path: Path) -> None:
    draft = write(tmp_path, "a.tex", "start\n\\input{b}\nend of a\n")
    write(tmp_path, "b.tex", "in b\n\\input{a}\nend of b\n")
    source, problems = load_source(draft, "a.tex")
    assert len(problems) == 1
    assert problems[0].file == "b.tex"
    assert problems[0].message == "line 2: \\input of a.tex makes a loop (a.tex -> b.tex -> a.tex); not followed again"
    assert source.text.count("start") == 1
    assert "end of b" in source.text and "end of a" in source.text


def test_missing_input_is_reported(tmp_path: Path) -> None:
    draft = write(tmp_path, "a.tex", "x\n\n\\input{chapters/two}\ny\n")
    source, problems = load_source(draft, "a.tex")
    assert [(p.file, p.message) for p in problems] == [("a.tex", "line 3: \\input of chapters/two.tex: no such file")]
    assert "y" in source.text


def test_the_draft_itself_missing_stops_the_run(tmp_path: Path) -> None:
    with pytest.raises(DraftUnreadable):
        load_source(tmp_path / "none.tex", "none.tex")
