"""Hostile files, generated on demand: what a stranger's manuscript or sources folder may hold.

Nothing here is committed as a binary: each function writes (or returns) one crafted
input, small enough to build in well under a second, and says which hole it probes.
The end-to-end test (tests/test_hostile.py) runs every one of them through the command line.
"""

from __future__ import annotations

import io
import json
import struct
import zipfile
from pathlib import Path

import docx
import numpy as np

from tests.pdf_fixtures import build_pdf

# --- text --------------------------------------------------------------------------

#: Terminal control sequences a claim or a file name may carry (ECMA-48 and xterm's OSC,
#: from memory): colour, window title (OSC 0), hyperlink (OSC 8), C1 CSI, bidi override.
ESCAPES = (
    "\x1b[31m",
    "\x1b]0;owned\x07",
    "\x1b]8;;http://example.invalid\x1b\\link\x1b]8;;\x1b\\",
    "\x9b2J",
    "\u202e",
)


def deep_json(depth: int) -> str:
    """A CSL-JSON-looking array nested ``depth`` deep (Python's parser recurses on it)."""
    return "[" * depth + "]" * depth


def deep_latex(depth: int) -> str:
    """A LaTeX draft with one citing sentence inside ``depth`` nested groups."""
    body = "{" * depth + r"Nests rose by 18\% \cite{a}." + "}" * depth
    return (
        "\\begin{document}\n"
        + body
        + "\n\\begin{thebibliography}{1}\n\\bibitem{a} A. Okafor. 2019.\n"
        + ("\\end{thebibliography}\n\\end{document}\n")
    )


def long_paragraph(sentences: int, cite_every: int = 1) -> str:
    """A Markdown draft whose body is one paragraph of ``sentences`` sentences, every ``cite_every``-th cited."""
    body = " ".join(
        f"Heron nests rose by {i % 90 + 1}% on plot {i}{' [1]' if i % cite_every == 0 else ''}."
        for i in range(sentences)
    )
    return body + "\n\n## References\n\n1. Okafor A. Tidal herons. 2019.\n"


def many_citations(count: int) -> str:
    """A Markdown draft with one sentence citing ``count`` works."""
    markers = "".join(f"[{i % 900 + 1}]" for i in range(count))
    entries = "\n".join(f"{i}. Author{i} A. Work {i}. 2019." for i in range(1, 901))
    return f"Heron nests rose by 18% {markers}.\n\n## References\n\n{entries}\n"


def single_token(size: int) -> str:
    """A Markdown draft of one unbroken token of ``size`` characters, then a cited sentence."""
    return "x" * size + "\n\nHeron nests rose by 18% [1].\n\n## References\n\n1. Okafor A. Tidal herons. 2019.\n"


# --- Word ----------------------------------------------------------------------------


def _docx_with(document_xml: bytes | None = None, inflate: int = 0) -> bytes:
    """A real .docx (python-docx's) whose word/document.xml is replaced or padded to ``inflate`` bytes."""
    base = docx.Document()
    base.add_paragraph("Heron nests rose by 18% [1].")
    base.add_paragraph("References")
    base.add_paragraph("1. Okafor A. Tidal herons. 2019.")
    buffer = io.BytesIO()
    base.save(buffer)
    source = zipfile.ZipFile(io.BytesIO(buffer.getvalue()))
    out = io.BytesIO()
    with zipfile.ZipFile(out, "w", zipfile.ZIP_DEFLATED) as target:
        for info in source.infolist():
            data = source.read(info)
            if info.filename == "word/document.xml":
                data = document_xml if document_xml is not None else data
                if inflate:
                    member = zipfile.ZipInfo(info.filename)
                    member.compress_type = zipfile.ZIP_DEFLATED
                    with target.open(member, "w", force_zip64=True) as stream:
                        stream.write(data)
                        chunk = b" " * (1 << 20)
                        for _ in range(inflate >> 20):
                            stream.write(chunk)
                    continue
            target.writestr(info.filename, data)
    return out.getvalue()


def plain_docx() -> bytes:
    """A well-formed .docx with one cited sentence and its reference list."""
    return _docx_with()


def zip_bomb_docx(inflated: int) -> bytes:
    """A .docx whose document.xml inflates to ``inflated`` bytes (whitespace after the XML)."""
    return _docx_with(inflate=inflated)


def lying_size_docx() -> bytes:
    """A .docx whose central directory declares document.xml far smaller than it inflates to."""
    data = bytearray(_docx_with())
    name = b"word/document.xml"
    at = data.rfind(b"PK\x01\x02")
    while at >= 0:
        if data[at + 46 : at + 46 + len(name)] == name:
            struct.pack_into("<I", data, at + 24, 10)  # uncompressed size: 10 bytes
            break
        at = data.rfind(b"PK\x01\x02", 0, at)
    return bytes(data)


def entity_docx() -> bytes:
    """A .docx whose document.xml declares an external entity and uses it mid-sentence."""
    xml = plain_docx_xml()
    head = b'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n'
    dtd = b'<!DOCTYPE w:document [<!ENTITY xxe SYSTEM "file:///etc/hostname">]>\n'
    body = xml.split(b"?>", 1)[1].replace(b"Heron nests rose", b"Heron &xxe; nests rose", 1)
    return _docx_with(head + dtd + body.lstrip())


def plain_docx_xml() -> bytes:
    """The document.xml of :func:`plain_docx`."""
    return zipfile.ZipFile(io.BytesIO(plain_docx())).read("word/document.xml")


# --- PDF -----------------------------------------------------------------------------


def many_pages_pdf(path: Path, pages: int) -> Path:
    """A PDF of ``pages`` short text pages."""
    return build_pdf(path, [[f"Page {n}: heron nests rose by 18% on the tidal plots."] for n in range(1, pages + 1)])


# --- cache ---------------------------------------------------------------------------


def deep_cache_entry(depth: int = 200_000) -> bytes:
    """A passage cache entry that is JSON nested ``depth`` deep."""
    return deep_json(depth).encode()


def infinity_cache_entry(sha256: str, fmt: int) -> bytes:
    """A passage cache entry whose page count is ``Infinity`` (valid to Python's json, not to JSON)."""
    entry = {
        "format": fmt,
        "sha256": sha256,
        "pages": 1,
        "title": None,
        "doi": None,
        "first_page_text": "",
        "passages": [{"page": 1, "text": "x", "ordinal": 0, "section": "", "place": 0.0}],
        "author": None,
        "printed_pages": [None],
    }
    return json.dumps(entry).replace('"pages": 1', '"pages": Infinity').encode()


def huge_npy_header(rows: int) -> bytes:
    """An ``.npy`` file whose header asks for ``rows`` × 2**22 float32 values (terabytes), with no data."""
    header = {"descr": "<f4", "fortran_order": False, "shape": (rows, 1 << 22)}
    buffer = io.BytesIO()
    np.lib.format.write_array_header_1_0(buffer, header)
    return buffer.getvalue()


def corrupt_deflate_docx() -> bytes:
    """A .docx whose document.xml deflate stream is broken mid-way (zlib raises, not zipfile)."""
    data = bytearray(plain_docx())
    info = zipfile.ZipFile(io.BytesIO(bytes(data))).getinfo("word/document.xml")
    name_length, extra_length = struct.unpack_from("<HH", data, info.header_offset + 26)
    start = info.header_offset + 30 + name_length + extra_length
    data[start + 2 : start + 6] = b"\xff\xff\xff\xff"  # a block header no deflate stream can hold
    return bytes(data)
