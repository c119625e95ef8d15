"""Embeddings by text hash: made once, found again by any later run, rebuilt when damaged."""

from __future__ import annotations

from collections.abc import Sequence
from pathlib import Path

import numpy as np

from sourcecheck.index.vectors import LazyVectors, VectorStore, vector_key


class CountingEmbed:
    """A stand-in embedder that records every text it is asked for (a vector per text length)."""

    def __init__(self) -> None:
        self.asked: list[str] = []

    def __call__(self, texts: Sequence[str]) -> np.ndarray:
        self.asked.extend(texts)
        rows = np.array([[len(t), 1.0, 0.0] for t in texts], dtype=np.float32)
        return rows / np.linalg.norm(rows, axis=1, keepdims=True)


def test_store_round_trip_and_missing_keys(tmp_path: Path) -> None:
    store = VectorStore(tmp_path / "v.sqlite")
    assert store.get_many(["a"]) == {} and not (tmp_path / "v.sqlite").exists()  # nothing opened for a read
    store.put_many([("a", np.array([0.6, 0.8]))])
    again = VectorStore(tmp_path / "v.sqlite")
    found = again.get_many(["a", "b"])
    assert list(found) == ["a"] and np.allclose(found["a"], [0.6, 0.8])
    assert again.count() == 1 and store.written == 1


def test_only_the_rows_asked_for_are_embedded_and_each_text_once(tmp_path: Path) -> None:
    embed = CountingEmbed()
    texts = ["heron nests rose", "tide gauges", "heron nests rose", "salinity"]
    lazy = LazyVectors(texts, VectorStore(tmp_path / "v.sqlite"), lambda: "m1", embed)
    rows = lazy.rows([0, 2])
    assert embed.asked == ["heron nests rose"]  # the repeated passage is embedded once
    assert rows.shape == (2, 3) and np.allclose(rows[0], rows[1])
    lazy.rows([0, 1])
    assert embed.asked == ["heron nests rose", "tide gauges"] and lazy.embedded == 2


def test_a_later_run_finds_every_vector_by_text_whatever_file_it_came_from(tmp_path: Path) -> None:
    first = CountingEmbed()
    LazyVectors(["heron nests rose", "tide gauges"], VectorStore(tmp_path / "v.sqlite"), lambda: "m1", first).rows(
        [0, 1]
    )
    later = CountingEmbed()
    other_library = ["tide gauges", "a new passage", "heron nests rose"]
    lazy = LazyVectors(other_library, VectorStore(tmp_path / "v.sqlite"), lambda: "m1", later)
    lazy.rows([0, 1, 2])
    assert later.asked == ["a new passage"] and lazy.embedded == 1
    other_model = CountingEmbed()
    LazyVectors(["tide gauges"], VectorStore(tmp_path / "v.sqlite"), lambda: "m2", other_model).rows([0])
    assert other_model.asked == ["tide gauges"]  # another model's vectors are never reused
    assert vector_key("m1", "tide gauges") != vector_key("m2", "tide gauges")


def test_a_damaged_store_is_rebuilt_with_one_warning(tmp_path: Path) -> None:
    path = tmp_path / "v.sqlite"
    path.write_bytes(b"this is not a database file at all" * 100)
    store = VectorStore(path)
    embed = CountingEmbed()
    LazyVectors(["heron"], store, lambda: "m1", embed).rows([0])
    assert embed.asked == ["heron"]
    assert len(store.warnings) == 1 and "v.sqlite" in store.warnings[0] and "rebuilt" in store.warnings[0]
    assert VectorStore(path).count() == 1


def test_rows_that_are_not_vectors_are_embedded_again_with_one_warning(tmp_path: Path) -> None:
    import sqlite3

    path = tmp_path / "v.sqlite"
    VectorStore(path).put_many([("seed", np.ones(3))])  # makes the table
    planted = {
        vector_key("m1", "ragged"): b"\x00" * 5,  # not a whole number of float32s
        vector_key("m1", "infinite"): np.array([np.inf, 0, 0], dtype=np.float32).tobytes(),
        vector_key("m1", "huge"): b"\x00" * (1 << 20),  # longer than any embedding: never read
    }
    with sqlite3.connect(path) as db:
        db.executemany("INSERT INTO vectors (key, data) VALUES (?, ?)", list(planted.items()))
    db.close()
    store = VectorStore(path)
    embed = CountingEmbed()
    rows = LazyVectors(["ragged", "infinite", "huge"], store, lambda: "m1", embed).rows([0, 1, 2])
    assert embed.asked == ["ragged", "infinite", "huge"] and np.isfinite(rows).all()
    assert store.warnings == ["cache entry v.sqlite held vectors that were unreadable; rebuilt"]
    assert set(VectorStore(path).get_many(planted)) == set(planted)  # the rebuilt rows replaced them


def test_a_table_of_another_shape_is_rebuilt(tmp_path: Path) -> None:
    import sqlite3

    path = tmp_path / "v.sqlite"
    with sqlite3.connect(path) as db:
        db.execute("CREATE TABLE vectors (key TEXT, data TEXT, extra INTEGER)")
    db.close()
    store = VectorStore(path)
    assert store.get_many(["a"]) == {}
    assert "another shape" in store.warnings[0] and "rebuilt" in store.warnings[0]
    store.put_many([("a", np.ones(2))])
    assert list(VectorStore(path).get_many(["a"])) == ["a"]


def test_a_store_that_cannot_be_written_is_reported_once_and_vectors_are_still_made(tmp_path: Path) -> None:
    blocker = tmp_path / "cache"
    blocker.write_text("not a folder", encoding="utf-8")
    refusals: list[str] = []
    store = VectorStore(blocker / "v.sqlite", on_unwritable=refusals.append)
    embed = CountingEmbed()
    lazy = LazyVectors(["heron", "tide"], store, lambda: "m1", embed)
    assert lazy.rows([0]).shape == (1, 3) and lazy.rows([1]).shape == (1, 3)
    assert len(refusals) == 1 and store.written == 0 and not store.writable
