"""Checking a .docx's zip members before any XML parser sees them.

A zip member can declare one size and inflate to another; one crafted ``document.xml``
of a few MB inflates to gigabytes. So every member's declared size is checked against
the limits, then every member is inflated as a stream, counting, and abandoned at the
limit: the real size is known before python-docx reads the package whole.

An XML part with a document type declaration (``<!DOCTYPE``, ``<!ENTITY``) is refused:
Word never writes one (ECMA-376 Part 2 forbids DTDs in package parts, from memory), and
with entities left unexpanded, as they must be for a stranger's file, the text after an
entity reference would be lost without a word.
"""

from __future__ import annotations

import zipfile

from sourcecheck.limits import Limits, size_text

_CHUNK = 1 << 16
# The markup that opens a DTD, in the encodings an XML part may use (XML 1.0, 4.3.3).
_DTD_MARKS = tuple(
    mark.encode(codec) for mark in ("<!DOCTYPE", "<!ENTITY") for codec in ("utf-8", "utf-16-le", "utf-16-be")
)
_OVERLAP = max(len(mark) for mark in _DTD_MARKS)


def member_problem(archive: zipfile.ZipFile, limits: Limits) -> str | None:
    """Why the package must not be read (a member over a size limit, a DTD), or None."""
    infos = archive.infolist()
    declared = sum(info.file_size for info in infos)
    for info in infos:
        if info.file_size > limits.zip_member_bytes:
            return _over(info.filename, info.file_size, limits.zip_member_bytes, "zip_member_bytes", "declares")
    if declared > limits.zip_total_bytes:
        limit = f"over the limit of {size_text(limits.zip_total_bytes)} (zip_total_bytes)"
        return f"its parts declare {size_text(declared)} in all, {limit}; not read"
    total = 0
    for info in infos:
        size, dtd = _inflate(archive, info, limits.zip_member_bytes)
        if size > limits.zip_member_bytes:
            return _over(info.filename, size, limits.zip_member_bytes, "zip_member_bytes", "inflates to over")
        total += size
        if total > limits.zip_total_bytes:
            return f"its parts inflate to over {size_text(limits.zip_total_bytes)} in all (zip_total_bytes); not read"
        if dtd:
            return f"{info.filename} declares a DTD or entity (<!DOCTYPE/<!ENTITY), which Word never writes; not read"
    return None


def _inflate(archive: zipfile.ZipFile, info: zipfile.ZipInfo, cap: int) -> tuple[int, bool]:
    """(bytes inflated, up to just past ``cap``; whether a DTD mark was seen in an XML part)."""
    xml = info.filename.lower().endswith((".xml", ".rels"))
    size = 0
    dtd = False
    tail = b""
    with archive.open(info) as stream:
        while chunk := stream.read(_CHUNK):
            size += len(chunk)
            if size > cap:
                break
            if xml and not dtd:
                window = tail + chunk
                dtd = any(mark in window for mark in _DTD_MARKS)
                tail = window[-_OVERLAP:]
    return size, dtd


def _over(name: str, size: int, limit: int, field: str, verb: str) -> str:
    return f"{name} {verb} {size_text(size)}, over the limit of {size_text(limit)} ({field}); not read"
