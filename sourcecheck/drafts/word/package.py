"""Opening a .docx package and telling apart the ways a file can fail to be one.

A .docx is a zip (Open Packaging Conventions, ECMA-376 Part 2) whose main part, usually
``word/document.xml``, is found through relationships; python-docx does that walk. The
parts it does not model (footnotes, endnotes) and the ones it models only partly (styles,
numbering) are taken as raw XML through the document part's relationships, so a package
whose parts are not at the usual names still reads.

Files that are not Word packages are told apart by their first bytes, because the fix the
user needs differs: a password-protected .docx is an OLE compound file holding an
encrypted package, as is a legacy binary .doc renamed to .docx.
"""

from __future__ import annotations

import io
import lzma
import zipfile
import zlib
from dataclasses import dataclass, field

import docx
from docx.opc.constants import RELATIONSHIP_TYPE as RT
from docx.opc.exceptions import PackageNotFoundError
from lxml import etree

from sourcecheck.drafts.word.members import member_problem
from sourcecheck.limits import Limits
from sourcecheck.model import Problem

# First bytes of an OLE compound file (MS-CFB), the container of encrypted OOXML and .doc.
_OLE_MAGIC = b"\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1"
# OLE directory entries name streams in UTF-16LE: these two tell the two OLE cases apart.
_ENCRYPTED_STREAM = "EncryptedPackage".encode("utf-16-le")
_LEGACY_WORD_STREAM = "WordDocument".encode("utf-16-le")
# How a damaged zip member fails while it is inflated: zipfile's own errors, then the
# decompressors' (a corrupt deflate stream raises zlib.error, an LZMA one LZMAError).
_DAMAGED = (zipfile.BadZipFile, OSError, EOFError, RuntimeError, zlib.error, lzma.LZMAError)
# Entities off and no network: a draft is untrusted input.
_PARSER = etree.XMLParser(resolve_entities=False, no_network=True, huge_tree=False)


@dataclass
class WordPackage:
    """The XML roots the reader needs; a missing optional part is None."""

    body: etree._Element
    styles: etree._Element | None = None
    numbering: etree._Element | None = None
    footnotes: etree._Element | None = None
    endnotes: etree._Element | None = None
    problems: list[Problem] = field(default_factory=list)


def open_package(data: bytes, display: str, limits: Limits | None = None) -> tuple[WordPackage | None, Problem | None]:
    """The package's parts, or None and the one problem that says why there are none.

    Every zip member's size (declared and inflated) is checked against ``limits`` and
    every XML part for a DTD before python-docx opens the package (:mod:`.members`).
    """
    if data.startswith(_OLE_MAGIC):
        return None, Problem(display, _ole_message(data))
    if not zipfile.is_zipfile(io.BytesIO(data)):
        return None, Problem(display, "not a Word document (not a zip file)")
    try:
        with zipfile.ZipFile(io.BytesIO(data)) as archive:
            refused = member_problem(archive, limits or Limits())
    except (*_DAMAGED, NotImplementedError, ValueError) as error:
        return None, Problem(display, f"cannot be read as a Word document ({_short(error)})")
    if refused:
        return None, Problem(display, refused)
    try:
        document = docx.Document(io.BytesIO(data))
    except (KeyError, ValueError, PackageNotFoundError, zipfile.BadZipFile, etree.XMLSyntaxError) as error:
        return None, Problem(display, _not_word_message(data, error))
    except _DAMAGED as error:  # damaged zip members, bad CRC, zip encryption
        return None, Problem(display, f"cannot be read as a Word document ({_short(error)})")
    body = document.element.body
    if body is None:
        return None, Problem(display, "not a Word document (the main part has no body)")
    package = WordPackage(body=body)
    for reltype, name in (
        (RT.STYLES, "styles"),
        (RT.NUMBERING, "numbering"),
        (RT.FOOTNOTES, "footnotes"),
        (RT.ENDNOTES, "endnotes"),
    ):
        root, problem = _related_xml(document, reltype, display, name)
        setattr(package, name, root)
        if problem:
            package.problems.append(problem)
    return package, None


def _related_xml(
    document: docx.document.Document, reltype: str, display: str, name: str
) -> tuple[etree._Element | None, Problem | None]:
    """The root of the part the main document relates to by ``reltype``, if any."""
    for rel in document.part.rels.values():
        if rel.is_external or rel.reltype != reltype:
            continue
        try:
            return etree.fromstring(rel.target_part.blob, _PARSER), None
        except (etree.XMLSyntaxError, ValueError) as error:
            partname = str(rel.target_part.partname).lstrip("/")
            return None, Problem(display, f"{partname} cannot be read ({_short(error)}); its {name} are skipped")
    return None, None


def _ole_message(data: bytes) -> str:
    if _LEGACY_WORD_STREAM in data and _ENCRYPTED_STREAM not in data:
        return "an old binary Word document (.doc), not .docx; save it as .docx"
    return "encrypted Word document; save it without a password"


def _not_word_message(data: bytes, error: Exception) -> str:
    try:
        names = set(zipfile.ZipFile(io.BytesIO(data)).namelist())
    except zipfile.BadZipFile:
        return "not a Word document (not a readable zip file)"
    if "word/document.xml" not in names:
        return "not a Word document (no word/document.xml inside)"
    return f"cannot be read as a Word document ({_short(error)})"


def _short(error: Exception) -> str:
    text = " ".join(str(error).split()) or error.__class__.__name__
    return text if len(text) <= 120 else text[:117] + "..."
