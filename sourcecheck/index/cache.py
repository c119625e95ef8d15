"""On-disk cache of extracted passages and their embeddings.

Reading and embedding a PDF is the slow part of a run (MiniLM on two CPU cores embeds
about 23 passages a second), so each source is read and embedded once. Entries are keyed
by the file's content hash plus the extractor version (passages) and the model
fingerprint (embeddings): renaming a file costs nothing, changing it or the extractor or
the model rebuilds it. Writes go to a temporary file that is renamed into place, so a run
killed half-way never leaves a half-written entry; an entry that fails to load is
treated as missing, rebuilt, and reported once as a warning.
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

from sourcecheck.model import Passage, Source, SourceIdentity

#: Version of the entry layout; 2 added ``printed_pages``. Older entries are rebuilt.
FORMAT = 2


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
        self.vectors_written = 0

    # passages ------------------------------------------------------------------------

    def _source_file(self, sha256: str, extractor: str) -> Path:
        return self.root / "sources" / f"{sha256}-{extractor}.json"

    def load_source(self, sha256: str, extractor: str, display: str) -> Source | None:
        """The cached extraction of this content, relabelled with today's display path."""
        path = self._source_file(sha256, extractor)
        if not path.is_file():
            return None
        try:
            data = json.loads(path.read_text(encoding="utf-8"))
            if data.get("format") != FORMAT or data["sha256"] != sha256:
                raise ValueError("unexpected format")
            passages = [
                Passage(
                    source=display,
                    page=int(p["page"]),
                    text=str(p["text"]),
                    ordinal=int(p["ordinal"]),
                    section=str(p.get("section", "")),
                    place=float(p.get("place", 0.0)),
                )
                for p in data["passages"]
            ]
            return Source(
                path=display,
                sha256=sha256,
                pages=int(data["pages"]),
                title=data["title"],
                doi=data["doi"],
                first_page_text=str(data["first_page_text"]),
                passages=passages,
                author=data.get("author"),
                printed_pages=tuple(None if label is None else str(label) for label in data["printed_pages"]),
                identity=SourceIdentity(
                    **{k: tuple(v) if isinstance(v, list) else v for k, v in data.get("identity", {}).items()}  # type: ignore[arg-type]
                ),
            )
        except (OSError, ValueError, KeyError, TypeError) as exc:
            self.warnings.append(f"cache entry {path.name} was unreadable ({exc}); rebuilt")
            return None

    def save_source(self, source: Source, extractor: str) -> None:
        """Store a source's extraction (its display path is not part of the entry)."""
        data = dataclasses.asdict(source)
        data["format"] = FORMAT
        for passage in data["passages"]:
            del passage["source"]
        del data["path"]
        payload = json.dumps(data, ensure_ascii=False).encode("utf-8")
        _atomic_write(self._source_file(source.sha256, extractor), payload)

    # vectors -------------------------------------------------------------------------

    def _vector_file(self, kind: str, key: str) -> Path:
        return self.root / kind / f"{key}.npy"

    def load_vectors(self, kind: str, key: str, rows: int) -> np.ndarray | None:
        """Cached vectors for ``key`` if present and of the expected row count."""
        path = self._vector_file(kind, key)
        if not path.is_file():
            return None
        try:
            array = np.load(path, allow_pickle=False)
            if array.ndim != 2 or array.shape[0] != rows or not np.isfinite(array).all():
                raise ValueError(f"shape {array.shape}, expected {rows} rows")
            return array
        except (OSError, ValueError, EOFError) as exc:
            self.warnings.append(f"cache entry {kind}/{path.name} was unreadable ({exc}); rebuilt")
            return None

    def save_vectors(self, kind: str, key: str, array: np.ndarray) -> None:
        """Store vectors atomically as a NumPy ``.npy`` file."""
        import io

        buffer = io.BytesIO()
        np.save(buffer, np.asarray(array, dtype=np.float32), allow_pickle=False)
        _atomic_write(self._vector_file(kind, key), buffer.getvalue())
        self.vectors_written += array.shape[0]
