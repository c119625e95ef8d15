"""Finding source PDFs in a folder and fingerprinting them."""

from __future__ import annotations

import hashlib
import os
from pathlib import Path

from sourcecheck.errors import SourcesUnreadable

_CHUNK = 1 << 20


def discover_pdfs(folder: Path) -> list[Path]:
    """Every ``*.pdf`` (any case) under ``folder``, recursively, sorted by relative path.

    Hidden folders and files (name starting with ".") are skipped: they hold version
    control data, editor back-ups and macOS "._name.pdf" resource forks, never sources.

    Raises:
        SourcesUnreadable: ``folder`` is missing or not a folder.
    """
    folder = Path(folder)
    if not folder.is_dir():
        raise SourcesUnreadable(f"sources folder not found or not a folder: {folder}")
    found: list[Path] = []
    for root, dirs, files in os.walk(folder):
        dirs[:] = [d for d in dirs if not d.startswith(".")]
        for name in files:
            if not name.startswith(".") and name.lower().endswith(".pdf"):
                path = Path(root) / name
                if path.is_file():
                    found.append(path)
    return sorted(found, key=lambda p: p.relative_to(folder).as_posix())


def file_sha256(path: Path) -> str:
    """Hex SHA-256 of the file's bytes: the cache key of its extracted passages."""
    digest = hashlib.sha256()
    with Path(path).open("rb") as handle:
        while chunk := handle.read(_CHUNK):
            digest.update(chunk)
    return digest.hexdigest()
