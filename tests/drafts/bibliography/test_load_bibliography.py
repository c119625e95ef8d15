"""Tests for load_bibliography: choosing the parser and never raising."""

from __future__ import annotations

from pathlib import Path

from sourcecheck.drafts.bibliography import load_bibliography


def test_suffixes_pick_the_parser(tmp_path: Path) -> None:
    (tmp_path / "a.bib").write_text("@misc{bibkey, title = {B}, year = 2001}\n", encoding="utf-8")
    (tmp_path / "a.json").write_text('[{"id": "jsonkey", "type": "book", "title": "J"}]', encoding="utf-8")
    (tmp_path / "a.ris").write_text("TY  - BOOK\nID  - riskey\nTI  - R\nER  - \n", encoding="utf-8")
    (tmp_path / "a.bbl").write_text("\\bibitem{bblkey} A. Doe. \\newblock T. \\newblock J, 2000.\n", encoding="utf-8")
    for name, key in [("a.bib", "bibkey"), ("a.json", "jsonkey"), ("a.ris", "riskey"), ("a.bbl", "bblkey")]:
        refs, problems = load_bibliography(tmp_path / name)
        assert ([r.key for r in refs], problems) == ([key], []), name


def test_unknown_suffix_is_sniffed(tmp_path: Path) -> None:
    (tmp_path / "refs.txt").write_text("% exported\n@book{sniffed, title = {S}}\n", encoding="utf-8")
    (tmp_path / "refs.dat").write_text("TY  - BOOK\nID  - r1\nER  - \n", encoding="utf-8")
    assert [r.key for r in load_bibliography(tmp_path / "refs.txt")[0]] == ["sniffed"]
    assert [r.key for r in load_bibliography(tmp_path / "refs.dat")[0]] == ["r1"]
    (tmp_path / "notes.txt").write_text("nothing bibliographic\n", encoding="utf-8")
    refs, problems = load_bibliography(tmp_path / "notes.txt", "notes.txt")
    assert refs == []
    assert problems[0].message.startswith("bibliography format '.txt' is not known")


def test_missing_file_and_folder(tmp_path: Path) -> None:
    refs, problems = load_bibliography(tmp_path / "missing.bib", "missing.bib")
    assert (refs, [(p.file, p.message) for p in problems]) == ([], [("missing.bib", "bibliography file not found")])
    refs, problems = load_bibliography(tmp_path, "folder")
    assert refs == []
    assert problems[0].message == "is a folder, not a bibliography file"


def test_windows_1252_is_read_and_noted(tmp_path: Path) -> None:
    (tmp_path / "old.bib").write_bytes("@misc{k, title = {Caf\u00e9}}".encode("cp1252"))
    refs, problems = load_bibliography(tmp_path / "old.bib", "old.bib")
    assert refs[0].title == "Café"
    assert [p.message for p in problems] == ["not valid UTF-8; read as Windows-1252"]
