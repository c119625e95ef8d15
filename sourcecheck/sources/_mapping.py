"""Reading the ``--map`` file: the user's own word on which file is which reference.

Two forms, chosen by extension (``.csv`` or ``.toml``; any other name is tried as TOML,
then as CSV):

CSV, with a header row naming the columns ``key`` and ``file``::

    key,file
    3,okafor-2019.pdf

TOML, either a plain table of key = "file" pairs (optionally under ``[map]``), or rows::

    3 = "okafor-2019.pdf"            # or
    [[map]]
    key = "3"
    file = "okafor-2019.pdf"
"""

from __future__ import annotations

import csv
import io
import tomllib
from pathlib import Path
from typing import Any

from sourcecheck.errors import MappingError


def _add(mapping: dict[str, str], key: Any, file: Any, where: str, origin: Path) -> None:
    if isinstance(key, bool) or not isinstance(key, str | int):
        raise MappingError(f"--map file {origin}: {where}: the key must be text or a number")
    if not isinstance(file, str):
        raise MappingError(f"--map file {origin}: {where}: the file must be a quoted path")
    key, file = str(key).strip(), file.strip()
    if not key or not file:
        raise MappingError(f"--map file {origin}: {where}: empty key or file")
    if key in mapping and mapping[key] != file:
        raise MappingError(f"--map file {origin}: {where}: key '{key}' is mapped twice ('{mapping[key]}' and '{file}')")
    mapping[key] = file


def _from_csv(text: str, origin: Path) -> dict[str, str]:
    rows = csv.reader(io.StringIO(text))
    header = next(rows, None)
    columns = [c.strip().lower() for c in header] if header else []
    if "key" not in columns or "file" not in columns:
        raise MappingError(f"--map file {origin}: the first row must be the header 'key,file'")
    k, f = columns.index("key"), columns.index("file")
    mapping: dict[str, str] = {}
    for number, row in enumerate(rows, start=2):
        if not any(cell.strip() for cell in row):
            continue
        if len(row) <= max(k, f):
            raise MappingError(f"--map file {origin}: line {number}: expected key,file")
        _add(mapping, row[k], row[f], f"line {number}", origin)
    return mapping


def _from_toml(data: dict[str, Any], origin: Path) -> dict[str, str]:
    mapping: dict[str, str] = {}
    rows = data.get("map")
    if isinstance(rows, list):
        for number, row in enumerate(rows, start=1):
            if not isinstance(row, dict) or "key" not in row or "file" not in row:
                raise MappingError(f"--map file {origin}: [[map]] row {number} needs key and file")
            _add(mapping, row["key"], row["file"], f"[[map]] row {number}", origin)
        rest = {k: v for k, v in data.items() if k != "map"}
    else:
        rest = rows if isinstance(rows, dict) else data
    for key, file in rest.items():
        _add(mapping, key, file, f"entry '{key}'", origin)
    return mapping


def load_mapping(path: Path) -> dict[str, str]:
    """Reference key -> file path (relative to the sources folder, or with its prefix).

    Raises:
        MappingError: the file is missing, unreadable, or not of either form.
    """
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8-sig")
    except FileNotFoundError:
        raise MappingError(f"--map file not found: {path}") from None
    except IsADirectoryError:
        raise MappingError(f"--map file is a folder, not a file: {path}") from None
    except UnicodeDecodeError:
        raise MappingError(f"--map file is not UTF-8 text: {path}") from None
    except OSError as exc:
        raise MappingError(f"--map file cannot be read: {path} ({exc.strerror})") from None
    suffix = path.suffix.lower()
    if suffix == ".csv":
        return _from_csv(text, path)
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        if suffix == ".toml":
            raise MappingError(f"--map file {path} is not valid TOML: {exc}") from None
        return _from_csv(text, path)
    return _from_toml(data, path)
