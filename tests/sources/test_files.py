"""Finding PDFs in a folder and hashing them."""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from sourcecheck.errors import SourcesUnreadable
from sourcecheck.limits import Limits
from sourcecheck.sources import discover_pdfs, file_sha256, find_pdfs


def test_discovers_pdfs_recursively_case_insensitive_sorted_hidden_skipped(tmp_path: Path) -> None:
    for name in [
        "b.pdf",
        "a.PDF",
        "sub/c.Pdf",
        "notes.txt",
        ".hidden.pdf",
        ".git/d.pdf",
        "sub/.cache/e.pdf",
        "sub/._c.pdf",
    ]:
        path = tmp_path / name
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_bytes(b"%PDF-1.4\n")
    found = [p.relative_to(tmp_path).as_posix() for p in discover_pdfs(tmp_path)]
    assert found == ["a.PDF", "b.pdf", "sub/c.Pdf"]


def test_missing_folder_stops_the_run(tmp_path: Path) -> None:
    with pytest.raises(SourcesUnreadable):
        discover_pdfs(tmp_path / "nope")


def test_sha256_of_abc(tmp_path: Path) -> None:
    # FIPS 180-2, appendix B.1 example "abc" (from memory).
    path = tmp_path / "abc.bin"
    path.write_bytes(b"abc")
    assert file_sha256(path) == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"


def _pdf(path: Path) -> Path:
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_bytes(b"%PDF-1.4\n")
    return path


def test_a_link_to_a_file_outside_the_folder_is_refused_in_one_line(tmp_path: Path) -> None:
    secret = _pdf(tmp_path / "elsewhere" / "secret.pdf")
    folder = tmp_path / "sources"
    _pdf(folder / "kept.pdf")
    (folder / "linked.pdf").symlink_to(secret)
    found, problems = find_pdfs(folder)
    assert [p.name for p in found] == ["kept.pdf"]
    assert [(Path(p.file).name, "outside the sources folder" in p.message) for p in problems] == [("linked.pdf", True)]
    assert "--follow-links" in problems[0].message


def test_follow_links_reads_the_linked_file(tmp_path: Path) -> None:
    secret = _pdf(tmp_path / "elsewhere" / "secret.pdf")
    folder = tmp_path / "sources"
    (folder / "sub").mkdir(parents=True)
    (folder / "linked.pdf").symlink_to(secret)
    (folder / "sub" / "loop").symlink_to(folder)  # a link loop is walked once, not forever
    found, problems = find_pdfs(folder, follow_links=True)
    assert [p.name for p in found] == ["linked.pdf"]
    assert problems == []


def test_a_link_inside_the_folder_and_a_linked_folder_outside(tmp_path: Path) -> None:
    folder = tmp_path / "sources"
    _pdf(folder / "real.pdf")
    (folder / "alias.pdf").symlink_to(folder / "real.pdf")
    _pdf(tmp_path / "elsewhere" / "x.pdf")
    (folder / "more").symlink_to(tmp_path / "elsewhere")
    found, problems = find_pdfs(folder)
    assert sorted(p.name for p in found) == ["alias.pdf", "real.pdf"]
    assert [Path(p.file).name for p in problems] == ["more"]
    assert "a link to a folder outside the sources folder" in problems[0].message


def test_a_subfolder_that_cannot_be_listed_is_named(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # chmod cannot stop root, so listing the folder is made to fail as it would for a user.
    folder = tmp_path / "sources"
    _pdf(folder / "a.pdf")
    _pdf(folder / "locked" / "b.pdf")
    real_scandir = os.scandir

    def scandir(path: object) -> object:
        if Path(str(path)).name == "locked":
            raise PermissionError(13, "Permission denied", str(path))
        return real_scandir(path)  # type: ignore[arg-type]

    monkeypatch.setattr(os, "scandir", scandir)
    found, problems = find_pdfs(folder, shown="pdfs")
    assert [p.name for p in found] == ["a.pdf"]
    assert [(p.file, p.message) for p in problems] == [
        ("pdfs/locked", "folder cannot be read (Permission denied); its files are skipped")
    ]


def test_a_file_over_the_size_limit_is_named_with_the_limit(tmp_path: Path) -> None:
    folder = tmp_path / "sources"
    _pdf(folder / "small.pdf")
    (folder / "big.pdf").write_bytes(b"%PDF-1.4\n" + b"0" * 4096)
    found, problems = find_pdfs(folder, limits=Limits(file_bytes=1024))
    assert [p.name for p in found] == ["small.pdf"]
    assert [Path(p.file).name for p in problems] == ["big.pdf"]
    assert "over the limit of 1 KiB (file_bytes)" in problems[0].message
