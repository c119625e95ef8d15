"""Reading one cache entry as untrusted input: every field checked before it is used.

A cache entry is a file in the user's cache folder, and whatever can write there can
plant one: JSON nested until the parser gives up, ``Infinity`` where a page number
belongs, an ``.npy`` header asking for terabytes. Each check here raises ``ValueError``
(or ``TypeError``), which the cache turns into one line and a rebuilt entry.
"""

from __future__ import annotations

import math
from pathlib import Path
from typing import Any

import numpy as np

from sourcecheck.model import Passage, Source, SourceIdentity

#: Version of the entry layout; 2 added ``printed_pages``. Older entries are rebuilt.
FORMAT = 2
#: Largest cache entry read. A 2,000-page source's passages are a few MB of JSON.
MAX_ENTRY_BYTES = 256 << 20
#: Widest embedding a vector entry may hold (MiniLM's is 384; larger models reach 4,096).
MAX_WIDTH = 8192


def no_constant(name: str) -> float:
    """``json.loads``' hook for ``NaN``, ``Infinity`` and ``-Infinity``: never valid in an entry."""
    raise ValueError(f"{name} is not a number an entry may hold")


def _int(value: Any, name: str) -> int:
    if isinstance(value, bool) or not isinstance(value, int):
        raise TypeError(f"{name} is not an integer")
    return value


def _float(value: Any, name: str) -> float:
    if isinstance(value, bool) or not isinstance(value, int | float) or not math.isfinite(value):
        raise TypeError(f"{name} is not a finite number")
    return float(value)


def _str(value: Any, name: str) -> str:
    if not isinstance(value, str):
        raise TypeError(f"{name} is not a string")
    return value


def _optional_str(value: Any, name: str) -> str | None:
    return None if value is None else _str(value, name)


def _list(value: Any, name: str) -> list[Any]:
    if not isinstance(value, list):
        raise TypeError(f"{name} is not a list")
    return value


def _passage(item: Any, display: str) -> Passage:
    if not isinstance(item, dict):
        raise TypeError("a passage is not an object")
    return Passage(
        source=display,
        page=_int(item["page"], "page"),
        text=_str(item["text"], "text"),
        ordinal=_int(item["ordinal"], "ordinal"),
        section=_str(item.get("section", ""), "section"),
        place=_float(item.get("place", 0.0), "place"),
    )


def source_from_entry(data: Any, sha256: str, display: str) -> Source:
    """The :class:`Source` a parsed JSON entry describes, or ``ValueError``/``TypeError``."""
    if not isinstance(data, dict) or data.get("format") != FORMAT or data.get("sha256") != sha256:
        raise ValueError("unexpected format")
    return Source(
        path=display,
        sha256=sha256,
        pages=_int(data["pages"], "pages"),
        title=_optional_str(data["title"], "title"),
        doi=_optional_str(data["doi"], "doi"),
        first_page_text=_str(data["first_page_text"], "first_page_text"),
        passages=[_passage(p, display) for p in _list(data["passages"], "passages")],
        author=_optional_str(data.get("author"), "author"),
        printed_pages=tuple(_optional_str(p, "printed page") for p in _list(data["printed_pages"], "printed_pages")),
        identity=_identity(data.get("identity", {})),
    )


def _identity(data: Any) -> SourceIdentity:
    """The identity a source PDF shows of itself (sources/_identity.py), each field checked."""
    if not isinstance(data, dict):
        raise ValueError("identity is not an object")

    def strings(name: str) -> tuple[str, ...]:
        return tuple(_str(v, name) for v in _list(data.get(name, []), name))

    return SourceIdentity(
        title=_optional_str(data.get("title"), "identity title"),
        metadata_title=_optional_str(data.get("metadata_title"), "identity metadata title"),
        dois=strings("dois"),
        arxiv_ids=strings("arxiv_ids"),
        authors=strings("authors"),
        title_page=_int(data.get("title_page", 1), "identity title page"),
    )


def load_npy(path: Path, rows: int) -> np.ndarray:
    """A 2-D float32 array of ``rows`` rows from ``path``, its header checked before any allocation."""
    with path.open("rb") as handle:
        version = np.lib.format.read_magic(handle)
        if version == (1, 0):
            shape, fortran, dtype = np.lib.format.read_array_header_1_0(handle)
        elif version == (2, 0):
            shape, fortran, dtype = np.lib.format.read_array_header_2_0(handle)
        else:
            raise ValueError(f".npy version {version} is not one this cache writes")
        if dtype != np.dtype(np.float32) or fortran or len(shape) != 2:
            raise ValueError(f"{dtype} array of shape {shape}, expected 2-D float32")
        if shape[0] != rows or not 0 < shape[1] <= MAX_WIDTH:
            raise ValueError(f"shape {shape}, expected {rows} rows")
        size = shape[0] * shape[1] * 4
        remaining = path.stat().st_size - handle.tell()
        if remaining != size:
            raise ValueError(f"{remaining} bytes of data for a {size}-byte array")
        data = handle.read(size)
    return np.frombuffer(data, dtype=np.float32).reshape(shape).copy()
