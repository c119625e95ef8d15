"""On-disk cache of extracted passages, their embeddings and the verifier's readings.

Reading and embedding a PDF is the slow part of a run, so each source is read once and
each passage embedded once. Passages are keyed by the file's content hash plus the
extractor version; embeddings, one by one, by the hash of the model fingerprint and the
text (:mod:`.vectors`, one SQLite file); the verifier's readings by the hash of its
model and the pairs (``.npy`` files). Renaming a file costs nothing, changing it or the
extractor or the model rebuilds it. Writes go to a temporary file that is renamed into
place (or into one SQLite transaction), so a run killed half-way never leaves a
half-written entry; an entry that fails to load is treated as missing, rebuilt, and
reported once as a warning.
"""

from __future__ import annotations

import dataclasses
import hashlib
import json
import os
import tempfile
from pathlib import Path

import numpy as np
import platformdirs

from sourcecheck.index.entries import FORMAT, MAX_ENTRY_BYTES, load_npy, no_constant, source_from_entry
from sourcecheck.index.vectors import VectorStore
from sourcecheck.model import Source

#: The embeddings of passages and claims, by hash of model and text (:class:`VectorStore`).
VECTOR_FILE = "vectors.sqlite"


def default_cache_dir() -> Path:
    """The platform's per-user cache folder for sourcecheck."""
    return Path(platformdirs.user_cache_dir("sourcecheck", appauthor=False))


def text_key(*parts: str) -> str:
    """A stable hash of several strings, for cache keys of queries."""
    digest = hashlib.sha256()
    for part in parts:
        digest.update(part.encode("utf-8"))
        digest.update(b"\0")
    return digest.hexdigest()


def _atomic_write(path: Path, data: bytes) -> None:
    path.parent.mkdir(parents=True, exist_ok=True)
    fd, tmp = tempfile.mkstemp(dir=path.parent, prefix=".tmp-", suffix=path.suffix)
    try:
        with os.fdopen(fd, "wb") as handle:
            handle.write(data)
            handle.flush()
            os.fsync(handle.fileno())
        os.replace(tmp, path)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise


class Cache:
    """Passages and vectors under one root folder; ``warnings`` lists rebuilt entries."""

    def __init__(self, root: Path) -> None:
        self.root = root
        self.warnings: list[str] = []
        self.writable = True
        self._rows_written = 0
        self._store: VectorStore | None = None

    # passages ------------------------------------------------------------------------

    def _source_file(self, sha256: str, extractor: str) -> Path:
        return self.root / "sources" / f"{sha256}-{extractor}.json"

    def load_source(self, sha256: str, extractor: str, display: str) -> Source | None:
        """The cached extraction of this content, relabelled with today's display path.

        The entry is checked field by field before it is used: a cache folder can be
        written by anyone who can write the user's files, so an entry is input like any other.
        """
        path = self._source_file(sha256, extractor)
        if not path.is_file():
            return None
        try:
            if path.stat().st_size > MAX_ENTRY_BYTES:
                raise ValueError(f"larger than {MAX_ENTRY_BYTES >> 20} MiB")
            data = json.loads(path.read_text(encoding="utf-8"), parse_constant=no_constant)
            return source_from_entry(data, sha256, display)
        except (OSError, ValueError, KeyError, TypeError, RecursionError, UnicodeDecodeError) as exc:
            self._rebuilt(path.name, exc)
            return None

    def save_source(self, source: Source, extractor: str) -> None:
        """Store a source's extraction (its display path is not part of the entry)."""
        data = dataclasses.asdict(source)
        data["format"] = FORMAT
        for passage in data["passages"]:
            del passage["source"]
        del data["path"]
        payload = json.dumps(data, ensure_ascii=False).encode("utf-8")
        self._write(self._source_file(source.sha256, extractor), payload)

    # vectors -------------------------------------------------------------------------

    def vector_store(self) -> VectorStore:
        """The store of embeddings by text hash in this cache (see :mod:`.vectors`)."""
        if self._store is None:
            self._store = VectorStore(self.root / VECTOR_FILE, self.warnings, on_unwritable=self._unwritable)
            self._store.writable = self.writable
        return self._store

    @property
    def vectors_written(self) -> int:
        """Vectors (and readings) this run added to the cache."""
        return self._rows_written + (self._store.written if self._store is not None else 0)

    def _vector_file(self, kind: str, key: str) -> Path:
        return self.root / kind / f"{key}.npy"

    def load_vectors(self, kind: str, key: str, rows: int) -> np.ndarray | None:
        """Cached vectors for ``key`` if present and of the expected row count.

        The ``.npy`` header is read and checked (2-D float32, the expected rows, a width
        an embedding can have, a data size that matches the file) before any array is
        allocated: a crafted header may ask for terabytes.
        """
        path = self._vector_file(kind, key)
        if not path.is_file():
            return None
        try:
            array = load_npy(path, rows)
            if not np.isfinite(array).all():
                raise ValueError("values that are not finite")
            return array
        except (OSError, ValueError, EOFError) as exc:
            self._rebuilt(f"{kind}/{path.name}", exc)
            return None

    def save_vectors(self, kind: str, key: str, array: np.ndarray) -> None:
        """Store vectors atomically as a NumPy ``.npy`` file."""
        import io

        buffer = io.BytesIO()
        np.save(buffer, np.asarray(array, dtype=np.float32), allow_pickle=False)
        if self._write(self._vector_file(kind, key), buffer.getvalue()):
            self._rows_written += array.shape[0]

    # failures ------------------------------------------------------------------------

    def _rebuilt(self, name: str, error: BaseException) -> None:
        reason = " ".join(str(error).split())[:120] or type(error).__name__
        self.warnings.append(f"cache entry {name} was unreadable ({reason}); rebuilt")

    def _write(self, path: Path, data: bytes) -> bool:
        """Write an entry; a cache that cannot be written is reported once and the run goes on without it."""
        if not self.writable:
            return False
        try:
            _atomic_write(path, data)
            return True
        except OSError as exc:
            self._unwritable(exc.strerror or type(exc).__name__)
            return False

    def _unwritable(self, reason: str) -> None:
        """Note, once, that nothing more is saved to this cache in this run."""
        if self._store is not None:
            self._store.writable = False
        if self.writable:
            self.writable = False
            self.warnings.append(f"cache folder cannot be written ({reason}); this run goes on without saving to it")
