"""Finding PDFs in a folder and hashing them."""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.errors import SourcesUnreadable
from sourcecheck.sources import discover_pdfs, file_sha256


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
