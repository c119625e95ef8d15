"""The --map file in CSV and TOML forms, and its failures."""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.errors import MappingError
from sourcecheck.sources import load_mapping


def _write(tmp_path: Path, name: str, text: str) -> Path:
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def test_csv_with_header(tmp_path: Path) -> None:
    # RFC 4180 quoting: a comma inside a quoted field belongs to the field.
    path = _write(tmp_path, "map.csv", 'key,file\n3,a.pdf\nhale2015,"b, c.pdf"\n\n')
    assert load_mapping(path) == {"3": "a.pdf", "hale2015": "b, c.pdf"}


def test_csv_columns_in_any_order(tmp_path: Path) -> None:
    path = _write(tmp_path, "map.csv", "File , Key\na.pdf,3\n")
    assert load_mapping(path) == {"3": "a.pdf"}


def test_toml_table(tmp_path: Path) -> None:
    path = _write(tmp_path, "map.toml", '3 = "a.pdf"\nhale2015 = "sub/b.pdf"\n')
    assert load_mapping(path) == {"3": "a.pdf", "hale2015": "sub/b.pdf"}


def test_toml_map_table_and_rows(tmp_path: Path) -> None:
    rows = _write(tmp_path, "rows.toml", '[[map]]\nkey = 3\nfile = "a.pdf"\n')
    assert load_mapping(rows) == {"3": "a.pdf"}
    table = _write(tmp_path, "table.toml", '[map]\n"4" = "b.pdf"\n')
    assert load_mapping(table) == {"4": "b.pdf"}


@pytest.mark.parametrize(
    ("name", "text", "fragment"),
    [
        ("bad.toml", "3 = \n", "not valid TOML"),
        ("bad.csv", "ref,path\n3,a.pdf\n", "header 'key,file'"),
        ("short.csv", "key,file\n3\n", "line 2"),
        ("twice.csv", "key,file\n3,a.pdf\n3,b.pdf\n", "mapped twice"),
        ("number.toml", "3 = 4\n", "quoted path"),
        ("rows.toml", "[[map]]\nkey = 3\n", "needs key and file"),
    ],
)
def test_malformed_mapping_is_one_line_error(tmp_path: Path, name: str, text: str, fragment: str) -> None:
    with pytest.raises(MappingError) as info:
        load_mapping(_write(tmp_path, name, text))
    assert fragment in str(info.value)
    assert "\n" not in str(info.value)


def test_missing_mapping_file(tmp_path: Path) -> None:
    with pytest.raises(MappingError, match="not found"):
        load_mapping(tmp_path / "absent.csv")
