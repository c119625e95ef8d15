"""Embeddings made only when a search needs them, each kept once by the hash of its text.

A folder's passages are many and a claim is read against few of them: the BM25
pre-filter (:mod:`.search`) names the candidates, and only those are embedded, in one
batch per search. Every vector is stored under the hash of the model fingerprint and the
text alone (not the file it came from), in one SQLite file in the cache folder, so a
second manuscript against the same library embeds only passages no earlier search
needed, a renamed or re-extracted file whose passages did not change costs nothing, and a
warm run reads vectors from disk without loading the model.
"""

from __future__ import annotations

import hashlib
import sqlite3
from collections.abc import Callable, Iterable, Sequence
from pathlib import Path

import numpy as np

from sourcecheck.index.entries import MAX_WIDTH

#: Embeds a list of texts into unit float32 rows (``Encoder.encode``).
Embed = Callable[[Sequence[str]], np.ndarray]


def vector_key(fingerprint: str, text: str) -> str:
    """The store key of ``text`` embedded by the model with ``fingerprint``."""
    return hashlib.sha256(f"{fingerprint}\0{text}".encode()).hexdigest()[:32]


class VectorStore:
    """Vectors by key in one SQLite table; ``written`` counts rows added by this process.

    SQLite gives atomic, concurrent-safe writes of many small rows in one file (a file per
    vector would mean tens of thousands of files for a library). The connection is opened
    on first use, so a run that needs no vector never touches the file. The file is input
    like any other cache entry: a file that is not a database, a table of another shape or
    a row that is not a vector is rebuilt with one warning; a folder that cannot be written
    is reported through ``on_unwritable`` and the run goes on embedding in memory.
    """

    def __init__(
        self, path: Path, warnings: list[str] | None = None, on_unwritable: Callable[[str], None] | None = None
    ) -> None:
        self.path = path
        self.written = 0
        self.writable = True
        self.warnings = warnings if warnings is not None else []
        self._on_unwritable = on_unwritable
        self._db: sqlite3.Connection | None = None
        self._damaged_rows = False

    def _connect(self, create: bool) -> sqlite3.Connection | None:
        """The open database; None when there is none to read (or, with ``create``, none can be made)."""
        if self._db is None and (create or self.path.is_file()):
            try:
                self._db = self._open(create)
            except sqlite3.OperationalError as exc:  # cannot open or create: a folder we may not write
                self._refused(str(exc))
            except (sqlite3.DatabaseError, ValueError) as exc:  # not a database, or not ours: start a new one
                self._rebuild(exc)
                if create:
                    return self._connect(create)
            except OSError as exc:
                self._refused(exc.strerror or type(exc).__name__)
        return self._db

    def _open(self, create: bool) -> sqlite3.Connection:
        if create:
            self.path.parent.mkdir(parents=True, exist_ok=True)
        db = sqlite3.connect(self.path, timeout=30)
        try:
            # The file may have been written by anyone who can write the cache folder: run no
            # function its schema names, and check every page read.
            db.execute("PRAGMA trusted_schema=OFF")
            db.execute("PRAGMA cell_size_check=ON")
            columns = [row[1:3] for row in db.execute("PRAGMA table_info(vectors)")]
            if not columns and create:
                with db:
                    db.execute("CREATE TABLE vectors (key TEXT PRIMARY KEY, data BLOB NOT NULL)")
            elif columns != [("key", "TEXT"), ("data", "BLOB")]:
                raise ValueError("a vectors table of another shape" if columns else "no vectors table")
        except BaseException:
            db.close()
            raise
        return db

    def _rebuild(self, error: BaseException) -> None:
        self.warnings.append(f"cache entry {self.path.name} was unreadable ({error}); rebuilt")
        self.close()
        for suffix in ("", "-journal", "-wal", "-shm"):
            Path(f"{self.path}{suffix}").unlink(missing_ok=True)

    def _refused(self, reason: str) -> None:
        if self.writable:
            self.writable = False
            if self._on_unwritable is not None:
                self._on_unwritable(reason)

    def get_many(self, keys: Iterable[str]) -> dict[str, np.ndarray]:
        """The stored vectors among ``keys``; a key not stored (or a damaged row) is absent."""
        wanted = list(dict.fromkeys(keys))
        found: dict[str, np.ndarray] = {}
        db = self._connect(create=False) if wanted else None
        if db is None:
            return found
        try:
            for start in range(0, len(wanted), 500):  # under SQLite's bound-parameter limit
                chunk = wanted[start : start + 500]
                marks = ",".join("?" * len(chunk))
                # A row longer than any embedding is never read into memory.
                query = f"SELECT key, CASE WHEN length(data) <= ? THEN data END FROM vectors WHERE key IN ({marks})"
                for key, data in db.execute(query, [MAX_WIDTH * 4, *chunk]):
                    vector = _vector(data)
                    if vector is None:
                        self._damaged(key)
                    else:
                        found[key] = vector
        except sqlite3.DatabaseError as exc:  # damaged pages: what was read stands, the rest is rebuilt
            self._rebuild(exc)
        return found

    def _damaged(self, key: str) -> None:
        if not self._damaged_rows:
            self._damaged_rows = True
            self.warnings.append(f"cache entry {self.path.name} held vectors that were unreadable; rebuilt")

    def put_many(self, items: Sequence[tuple[str, np.ndarray]]) -> None:
        """Store vectors (float32) in one transaction; a cache that cannot be written is passed over."""
        if not items or not self.writable:
            return
        db = self._connect(create=True)
        if db is None:
            return
        try:
            with db:
                db.executemany(
                    "INSERT OR REPLACE INTO vectors (key, data) VALUES (?, ?)",
                    [(key, np.asarray(v, dtype=np.float32).tobytes()) for key, v in items],
                )
        except sqlite3.OperationalError as exc:  # read-only file or folder, disk full
            self._refused(str(exc))
            return
        self.written += len(items)

    def count(self) -> int:
        """How many vectors the store holds."""
        db = self._connect(create=False)
        return int(db.execute("SELECT COUNT(*) FROM vectors").fetchone()[0]) if db is not None else 0

    def close(self) -> None:
        """Close the connection (it reopens on the next use)."""
        if self._db is not None:
            self._db.close()
            self._db = None


def _vector(data: object) -> np.ndarray | None:
    """A stored row as a float32 vector; None for anything that is not one (empty, ragged, not finite)."""
    if not isinstance(data, bytes) or not data or len(data) % 4:
        return None
    vector = np.frombuffer(data, dtype=np.float32)
    return vector if np.isfinite(vector).all() else None


class LazyVectors:
    """Unit vectors of a fixed list of texts, looked up or embedded on first request.

    ``rows(positions)`` returns the vectors of those texts in that order; texts already
    seen in this run come from memory, the rest from the store, and only what the store
    lacks is embedded (``embedded`` counts those).
    """

    def __init__(self, texts: Sequence[str], store: VectorStore, fingerprint: Callable[[], str], embed: Embed) -> None:
        self._texts = list(texts)
        self._store = store
        self._fingerprint = fingerprint
        self._embed = embed
        self._memory: dict[int, np.ndarray] = {}
        self.embedded = 0
        self.dimension = 0

    def __len__(self) -> int:
        return len(self._texts)

    def rows(self, positions: Sequence[int] | np.ndarray) -> np.ndarray:
        """The vectors of the texts at ``positions``, one row each."""
        wanted = [int(p) for p in positions]
        missing = [p for p in dict.fromkeys(wanted) if p not in self._memory]
        if missing:
            self._fill(missing)
        if not wanted:
            return np.zeros((0, self.dimension or 1), dtype=np.float32)
        return np.stack([self._memory[p] for p in wanted])

    def _fill(self, positions: list[int]) -> None:
        fingerprint = self._fingerprint()
        keys = {p: vector_key(fingerprint, self._texts[p]) for p in positions}
        stored = self._store.get_many(keys.values())
        todo = []
        for p in positions:
            vector = stored.get(keys[p])
            if vector is None or (self.dimension and vector.size != self.dimension):
                todo.append(p)
            else:
                self._memory[p] = vector
                self.dimension = vector.size
        if todo:
            # One text may stand at several positions (a repeated passage): embed it once.
            unique = list(dict.fromkeys(self._texts[p] for p in todo))
            made = self._embed(unique)
            by_text = dict(zip(unique, made, strict=True))
            self._store.put_many([(vector_key(fingerprint, t), v) for t, v in by_text.items()])
            self.embedded += len(unique)
            for p in todo:
                self._memory[p] = by_text[self._texts[p]]
                self.dimension = by_text[self._texts[p]].size
