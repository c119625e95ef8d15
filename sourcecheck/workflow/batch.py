"""Which files a run checks when it is given several drafts or a folder of them.

An editor screening a batch names the folder; every file directly inside it whose suffix
is a draft format is checked, in name order. Sub-folders are not entered: a LaTeX
manuscript's ``\\input`` chapters live there and are read through their main file. The
``ignore`` setting's glob patterns leave files out of a folder (matched against the
file's name and its path relative to the settings file's folder); a file named on the
command line is always checked.
"""

from __future__ import annotations

import contextlib
from collections.abc import Iterable
from fnmatch import fnmatch
from pathlib import Path

from sourcecheck.errors import SettingsError


def _ignored(path: Path, patterns: Iterable[str], base: Path | None) -> bool:
    names = [path.name, path.as_posix()]
    if base is not None:
        with contextlib.suppress(ValueError):
            names.append(path.resolve().relative_to(base.resolve()).as_posix())
    return any(fnmatch(name, pattern) for pattern in patterns for name in names)


def expand_drafts(
    arguments: list[Path], suffixes: Iterable[str], ignore: Iterable[str] = (), base: Path | None = None
) -> list[Path]:
    """The draft files named by ``arguments``: files as given, folders as their draft files.

    Raises:
        SettingsError: a folder holds no draft file.
    """
    known = {s.lower() for s in suffixes}
    patterns = list(ignore)
    drafts: list[Path] = []
    for argument in arguments:
        if not argument.is_dir():
            drafts.append(argument)  # a missing file is reported by the draft stage, with its name
            continue
        found = [
            p
            for p in sorted(argument.iterdir())
            if p.is_file() and p.suffix.lower() in known and not _ignored(p, patterns, base)
        ]
        if not found:
            raise SettingsError(f"{argument}: no draft files in this folder ({', '.join(sorted(known))})")
        drafts.extend(found)
    return list(dict.fromkeys(drafts))


def report_names(drafts: list[Path], extension: str) -> list[str]:
    """One file name per draft for ``--output-dir``: ``paper.md.json``, made unique when two drafts share a name."""
    names: list[str] = []
    for draft in drafts:
        name = f"{draft.name}.{extension}"
        counter = 2
        while name in names:
            name = f"{draft.name}-{counter}.{extension}"
            counter += 1
        names.append(name)
    return names
