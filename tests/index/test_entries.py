"""Crafted cache entries: each is discarded and rebuilt with one line, never a crash or a huge allocation."""

from __future__ import annotations

from pathlib import Path

import numpy as np

from sourcecheck.index.cache import Cache
from sourcecheck.index.entries import FORMAT
from tests import hostile

SHA = "cd" * 32


def _planted(cache: Cache, data: bytes) -> Path:
    path = cache.root / "sources" / f"{SHA}-x1.json"
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_bytes(data)
    return path


def test_deeply_nested_json_entry_is_rebuilt(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    _planted(cache, hostile.deep_cache_entry())
    assert cache.load_source(SHA, "x1", "a.pdf") is None
    assert len(cache.warnings) == 1 and "was unreadable" in cache.warnings[0] and "rebuilt" in cache.warnings[0]


def test_infinity_where_an_integer_belongs_is_rebuilt(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    _planted(cache, hostile.infinity_cache_entry(SHA, FORMAT))
    assert cache.load_source(SHA, "x1", "a.pdf") is None
    assert "Infinity" in cache.warnings[0]


def test_a_valid_entry_with_a_wrong_type_is_rebuilt(tmp_path: Path) -> None:
    # The same entry with "Infinity" replaced by a string: valid JSON, wrong type.
    cache = Cache(tmp_path)
    _planted(cache, hostile.infinity_cache_entry(SHA, FORMAT).replace(b"Infinity", b'"12"'))
    assert cache.load_source(SHA, "x1", "a.pdf") is None
    assert "pages is not an integer" in cache.warnings[0]


def test_the_untouched_entry_loads(tmp_path: Path) -> None:
    # Guards the two tests above: the planted entry is valid once its one fault is removed.
    cache = Cache(tmp_path)
    _planted(cache, hostile.infinity_cache_entry(SHA, FORMAT).replace(b"Infinity", b"1"))
    source = cache.load_source(SHA, "x1", "a.pdf")
    assert source is not None and source.pages == 1 and cache.warnings == []


def test_npy_header_asking_for_terabytes_is_refused_before_allocation(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    path = tmp_path / "passages" / "k.npy"
    path.parent.mkdir(parents=True)
    path.write_bytes(hostile.huge_npy_header(rows=1 << 20))  # 2**20 x 2**22 float32: 16 TiB
    assert cache.load_vectors("passages", "k", 1 << 20) is None
    assert "passages/k.npy was unreadable" in cache.warnings[0]


def test_npy_with_less_data_than_its_header_says_is_rebuilt(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    cache.save_vectors("claims", "k", np.ones((3, 4), dtype=np.float32))
    path = tmp_path / "claims" / "k.npy"
    path.write_bytes(path.read_bytes()[:-8])
    assert cache.load_vectors("claims", "k", 3) is None
    assert "bytes of data" in cache.warnings[0]
