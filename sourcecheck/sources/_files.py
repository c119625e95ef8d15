"""Finding source PDFs in a folder and fingerprinting them.

A sources folder may come from a stranger (a shared drive, an unpacked archive), so the
walk reads only what lies inside it: a symbolic link that leads out of the folder is
refused unless the user asks for links to be followed, and a subfolder that cannot be
listed, or a file over the size limit, is named in one line rather than passed over.
"""

from __future__ import annotations

import hashlib
import os
from pathlib import Path

from sourcecheck.errors import SourcesUnreadable
from sourcecheck.limits import Limits, size_text
from sourcecheck.model import Problem

_CHUNK = 1 << 20
_OUTSIDE = "outside the sources folder; not read (--follow-links reads it)"


def discover_pdfs(folder: Path) -> list[Path]:
    """Every ``*.pdf`` under ``folder`` that :func:`find_pdfs` accepts, problems left aside."""
    return find_pdfs(folder)[0]


def find_pdfs(
    folder: Path, follow_links: bool = False, limits: Limits | None = None, shown: str | None = None
) -> tuple[list[Path], list[Problem]]:
    """Every ``*.pdf`` (any case) under ``folder``, recursively, sorted by relative path, and
    the problems met: links out of the folder, unreadable subfolders, files over the size limit.

    Hidden folders and files (name starting with ".") are skipped: they hold version
    control data, editor back-ups and macOS "._name.pdf" resource forks, never sources.
    ``shown`` is how the folder is named in problems (default: as given).

    Raises:
        SourcesUnreadable: ``folder`` is missing or not a folder.
    """
    folder = Path(folder)
    limits = limits or Limits()
    if not folder.is_dir():
        raise SourcesUnreadable(f"sources folder not found or not a folder: {folder}")
    root = folder.resolve()
    base = Path(shown) if shown is not None else folder
    found: list[Path] = []
    problems: list[Problem] = []

    def unreadable(error: OSError) -> None:
        where = Path(error.filename) if error.filename else folder
        name = base / where.relative_to(folder) if where.is_relative_to(folder) else where
        problems.append(Problem(str(name), f"folder cannot be read ({error.strerror or error}); its files are skipped"))

    seen: set[Path] = set()  # real folders walked: a link loop is walked once
    for top, dirs, files in os.walk(folder, onerror=unreadable, followlinks=follow_links):
        here = Path(top)
        seen.add(here.resolve())
        kept = []
        for name in sorted(d for d in dirs if not d.startswith(".")):
            sub = here / name
            if sub.is_symlink() and not follow_links and not sub.resolve().is_relative_to(root):
                shown_sub = str(base / sub.relative_to(folder))
                problems.append(Problem(shown_sub, f"a link to a folder {_OUTSIDE}"))
            elif sub.resolve() not in seen:
                kept.append(name)
        dirs[:] = kept
        for name in files:
            if name.startswith(".") or not name.lower().endswith(".pdf"):
                continue
            path = here / name
            display = str(base / path.relative_to(folder))
            if path.is_symlink() and not follow_links:
                target = path.resolve()
                if not target.is_relative_to(root):
                    problems.append(Problem(display, f"a link to a file {_OUTSIDE}"))
                    continue
            if not path.is_file():
                if path.is_symlink():
                    problems.append(Problem(display, "a link to a file that does not exist; not read"))
                continue
            size = path.stat().st_size
            if size > limits.file_bytes:
                problems.append(
                    Problem(
                        display,
                        f"{size_text(size)}, over the limit of {size_text(limits.file_bytes)} (file_bytes); not read",
                    )
                )
                continue
            found.append(path)
    return sorted(found, key=lambda p: p.relative_to(folder).as_posix()), problems


def file_sha256(path: Path) -> str:
    """Hex SHA-256 of the file's bytes: the cache key of its extracted passages."""
    digest = hashlib.sha256()
    with Path(path).open("rb") as handle:
        while chunk := handle.read(_CHUNK):
            digest.update(chunk)
    return digest.hexdigest()
