"""Opening a text draft and decoding it, whatever encoding the writer's editor chose.

Only a file that cannot be read at all stops the run; a wrong encoding is a problem to
report, since the text is still mostly right and the check can go on.
"""

from __future__ import annotations

import codecs
from pathlib import Path

from sourcecheck.errors import DraftUnreadable
from sourcecheck.limits import size_text
from sourcecheck.model import Problem

_BOMS: tuple[tuple[bytes, str], ...] = (
    (codecs.BOM_UTF32_LE, "utf-32"),
    (codecs.BOM_UTF32_BE, "utf-32"),
    (codecs.BOM_UTF16_LE, "utf-16"),
    (codecs.BOM_UTF16_BE, "utf-16"),
)


def read_bytes(path: Path, display: str, max_bytes: int | None = None) -> bytes:
    """The file's bytes, or DraftUnreadable with one line naming the file.

    A file over ``max_bytes`` (the file size limit) is refused before it is read.
    """
    try:
        if not path.exists():
            raise DraftUnreadable(f"{display}: no such file")
        if path.is_dir():
            raise DraftUnreadable(f"{display}: is a folder, not a draft file")
        size = path.stat().st_size
        if max_bytes is not None and size > max_bytes:
            limit = f"over the limit of {size_text(max_bytes)} (file_bytes)"
            raise DraftUnreadable(f"{display}: {size_text(size)}, {limit}; not read")
        return path.read_bytes()
    except OSError as error:
        reason = error.strerror or error.__class__.__name__
        raise DraftUnreadable(f"{display}: cannot be opened ({reason})") from None


def decode(data: bytes, display: str) -> tuple[str, list[Problem]]:
    """Text of ``data`` with Unix line ends, and a problem when it was not UTF-8.

    UTF-8 (with or without BOM) first; UTF-16/32 when a BOM says so; then Windows-1252,
    the usual encoding of older Windows editors; Latin-1 last, which never fails.
    """
    problems: list[Problem] = []
    text: str | None = None
    for bom, encoding in _BOMS:
        if data.startswith(bom):
            try:
                text = data.decode(encoding)
            except UnicodeDecodeError:
                text = None
            break
    if text is None:
        try:
            text = data.decode("utf-8-sig")
        except UnicodeDecodeError:
            try:
                text = data.decode("cp1252")
                problems.append(Problem(display, "not valid UTF-8; read as Windows-1252"))
            except UnicodeDecodeError:
                text = data.decode("latin-1")
                problems.append(Problem(display, "not valid UTF-8; read as Latin-1"))
    text = text.replace("\r\n", "\n").replace("\r", "\n").replace("\x00", "")
    return text, problems
