"""Tests for the draft stage's entry point, with files on disk."""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.drafts import read_draft
from sourcecheck.errors import DraftUnreadable

SMALL = "Yields rose [1].\n\n# References\n\n[1] A. Okafor, “A title,” J, 2019.\n"


def test_reads_markdown_file(tmp_path: Path) -> None:
    path = tmp_path / "draft.md"
    path.write_text(SMALL, encoding="utf-8")
    draft = read_draft(path, "shown.md")
    assert draft.path == "shown.md"
    assert [c.citations[0].key for c in draft.claims] == ["1"]
    assert draft.problems == []
    assert read_draft(path).path == str(path)


def test_cp1252_draft_is_read_with_a_problem(tmp_path: Path) -> None:
    path = tmp_path / "draft.txt"
    path.write_bytes(
        "Yields rose (M\u00fcller, 2019).\n\nReferences\n\nM\u00fcller, K. (2019). \u201cA title\u201d. J.\n".encode(
            "cp1252"
        )
    )
    draft = read_draft(path, "draft.txt")
    assert [p.message for p in draft.problems] == ["not valid UTF-8; read as Windows-1252"]
    assert draft.references[0].authors == ("Müller",)
    assert draft.references[0].key == "muller2019"
    assert draft.claims[0].citations[0].key == "muller2019"


def test_no_citations_and_no_reference_list(tmp_path: Path) -> None:
    path = tmp_path / "plain.md"
    path.write_text("Just prose (in 2019 the site closed).\n", encoding="utf-8")
    messages = [p.message for p in read_draft(path).problems]
    assert messages == [
        "no reference list found (no heading such as References, Bibliography or Works cited)",
        "no citation markers found in the text",
    ]


def test_empty_file(tmp_path: Path) -> None:
    path = tmp_path / "empty.md"
    path.write_bytes(b"")
    draft = read_draft(path, "empty.md")
    assert (draft.claims, draft.references) == ([], [])
    assert [(p.file, p.message) for p in draft.problems] == [("empty.md", "the draft is empty")]


def test_unknown_suffix_is_read_as_plain_text(tmp_path: Path) -> None:
    path = tmp_path / "draft.rst"
    path.write_text(SMALL, encoding="utf-8")
    draft = read_draft(path, "draft.rst")
    assert [p.message for p in draft.problems] == ["draft format '.rst' is not known; read as plain text"]
    assert len(draft.claims) == 1


def test_missing_path(tmp_path: Path) -> None:
    with pytest.raises(DraftUnreadable) as caught:
        read_draft(tmp_path / "gone.md", "gone.md")
    assert str(caught.value) == "gone.md: no such file"


def test_directory(tmp_path: Path) -> None:
    with pytest.raises(DraftUnreadable) as caught:
        read_draft(tmp_path, "drafts")
    assert str(caught.value) == "drafts: is a folder, not a draft file"


def test_unreadable_file(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    path = tmp_path / "locked.md"
    path.write_text(SMALL, encoding="utf-8")

    def refuse(self: Path) -> bytes:
        raise PermissionError(13, "Permission denied")

    # chmod cannot lock a file against root, so the refusal is simulated.
    monkeypatch.setattr(Path, "read_bytes", refuse)
    with pytest.raises(DraftUnreadable) as caught:
        read_draft(path, "locked.md")
    assert str(caught.value) == "locked.md: cannot be opened (Permission denied)"


def test_a_draft_over_the_file_size_limit_stops_the_run_in_one_line(tmp_path: Path) -> None:
    from sourcecheck.limits import Limits
    from sourcecheck.model import ReadOptions

    path = tmp_path / "big.md"
    path.write_text("Nests rose [1].\n" * 200, encoding="utf-8")
    with pytest.raises(DraftUnreadable) as caught:
        read_draft(path, "big.md", ReadOptions(limits=Limits(file_bytes=1024)))
    assert str(caught.value) == "big.md: 3.1 KiB, over the limit of 1 KiB (file_bytes); not read"
