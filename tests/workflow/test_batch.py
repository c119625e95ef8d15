"""Expanding folders into drafts, and naming one report file per draft."""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.drafts import FORMATS
from sourcecheck.errors import SettingsError
from sourcecheck.workflow import expand_drafts, report_names


def test_a_folder_gives_its_draft_files_in_name_order(tmp_path: Path) -> None:
    for name in ("b.tex", "a.md", "refs.bib", "c.docx", "a.md.sourcecheck-review.toml", "old-draft.md"):
        (tmp_path / name).write_text("x", encoding="utf-8")
    (tmp_path / "chapters").mkdir()
    (tmp_path / "chapters" / "intro.tex").write_text("x", encoding="utf-8")
    found = expand_drafts([tmp_path], FORMATS, ["old-*"], tmp_path)
    assert [p.name for p in found] == ["a.md", "b.tex", "c.docx"]


def test_files_named_on_the_command_line_are_kept_as_given(tmp_path: Path) -> None:
    named = tmp_path / "old-draft.md"
    assert expand_drafts([named, named], FORMATS, ["old-*"]) == [named]  # named: checked once, not ignored


def test_a_folder_without_drafts_is_an_error(tmp_path: Path) -> None:
    (tmp_path / "notes.bib").write_text("x", encoding="utf-8")
    with pytest.raises(SettingsError, match="no draft files in this folder"):
        expand_drafts([tmp_path], FORMATS)


def test_report_names_are_unique() -> None:
    drafts = [Path("a/paper.md"), Path("b/paper.md"), Path("paper.tex")]
    assert report_names(drafts, "json") == ["paper.md.json", "paper.md-2.json", "paper.tex.json"]
