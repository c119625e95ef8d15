"""Tests for opening and decoding draft files."""

from __future__ import annotations

import codecs
from pathlib import Path

import pytest

from sourcecheck.drafts.textfile import decode, read_bytes
from sourcecheck.errors import DraftUnreadable


def test_utf8_with_and_without_bom() -> None:
    text = "Müller (2019) “quoted”\r\nnext"
    for data in (text.encode("utf-8"), codecs.BOM_UTF8 + text.encode("utf-8")):
        decoded, problems = decode(data, "d.md")
        assert decoded == "Müller (2019) “quoted”\nnext"
        assert problems == []


def test_cp1252_bytes_are_read_with_a_problem() -> None:
    # Windows-1252 code page (Unicode mapping table CP1252.TXT, from memory): 0xFC is "ü",
    # 0x93 and 0x94 are the curly double quotes.
    data = b"M\xfcller (2019) said \x93yes\x94."
    decoded, problems = decode(data, "d.md")
    assert decoded == "Müller (2019) said “yes”."
    assert [(p.file, p.message) for p in problems] == [("d.md", "not valid UTF-8; read as Windows-1252")]


def test_bytes_undefined_in_cp1252_fall_back_to_latin1() -> None:
    # CP1252.TXT (from memory): 0x81 is unassigned, so Windows-1252 decoding fails.
    decoded, problems = decode(b"caf\xe9 \x81", "d.md")
    assert decoded == "café \x81"
    assert problems[0].message == "not valid UTF-8; read as Latin-1"


def test_utf16_with_bom() -> None:
    decoded, problems = decode("Lin (2020)".encode("utf-16"), "d.txt")
    assert decoded == "Lin (2020)"
    assert problems == []


def test_missing_and_folder_raise(tmp_path: Path) -> None:
    with pytest.raises(DraftUnreadable, match=r"^nope\.md: no such file$"):
        read_bytes(tmp_path / "nope.md", "nope.md")
    with pytest.raises(DraftUnreadable, match="is a folder"):
        read_bytes(tmp_path, "drafts")
