"""Reading a PDF with pypdf: per-page text and document metadata, or one-line failure.

This is the boundary between pypdf and the rest of sourcecheck. pypdf raises many
exception types (and sometimes plain ``ValueError``/``KeyError`` from deep inside) on
broken files, and logs recoverable oddities through the ``pypdf`` logger. A user should
see one line from us per bad file, so every failure here becomes :class:`PdfUnreadable`
with a message fit to show, and pypdf's logging and warnings are silenced while it runs.
"""

from __future__ import annotations

import logging
import time
import warnings
from collections.abc import Iterator
from contextlib import contextmanager
from dataclasses import dataclass, field
from io import BytesIO
from typing import Any

from pypdf import PasswordType, PdfReader

#: Readers accept the "%PDF-" header anywhere in the first 1024 bytes (PDF Reference 1.7,
#: Appendix H implementation notes; from memory), so junk before it is tolerated here too.
HEADER_WINDOW = 1024
NOT_A_PDF = "not a PDF (no %PDF- header)"
EMPTY = "empty file (0 bytes)"
ENCRYPTED = "encrypted; cannot read without a password"


class PdfUnreadable(Exception):
    """The PDF cannot be read; ``str(exc)`` is the one line to show."""


@dataclass
class RawPdf:
    """What pypdf gave us: one text string per page, and metadata strings."""

    pages: list[str]
    info: dict[str, str] = field(default_factory=dict)
    xmp_title: str | None = None
    xmp_text: str = ""
    failed_pages: int = 0
    #: Why the later pages were not read (a page or time limit), or "" when all were.
    cut: str = ""


@contextmanager
def quiet_pypdf() -> Iterator[None]:
    """Silence pypdf's logger and Python warnings for the duration, then restore them."""
    logger = logging.getLogger("pypdf")
    level = logger.level
    logger.setLevel(logging.CRITICAL + 1)
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            yield
    finally:
        logger.setLevel(level)


def without_lone_surrogates(text: str) -> str:
    """``text`` with each unpaired UTF-16 surrogate replaced by U+FFFD.

    pypdf decodes some fonts' ToUnicode maps into lone surrogates (seen on real journal
    PDFs); such a string is not valid Unicode, so it cannot be written as UTF-8 to the
    cache or a JSON report. A surrogate pair still becomes the one character it encodes.
    """
    if not any("\ud800" <= ch <= "\udfff" for ch in text):
        return text
    return text.encode("utf-16", "surrogatepass").decode("utf-16", "replace")


def one_line(exc: BaseException) -> str:
    """An exception as one short line: its text with whitespace collapsed, or its type."""
    text = " ".join(str(exc).split())
    if not text:
        return type(exc).__name__
    return text if len(text) <= 120 else text[:117] + "..."


def _as_str(value: Any) -> str | None:
    try:
        if hasattr(value, "get_object"):
            value = value.get_object()
        if isinstance(value, bytes):
            value = value.decode("utf-8", errors="replace")
        text = " ".join(str(value).split())
    except Exception:
        return None
    return text or None


def _info(reader: PdfReader) -> dict[str, str]:
    """The document information dictionary as plain strings ("/Title" -> "...")."""
    try:
        meta = reader.metadata
        if not meta:
            return {}
        items = list(meta.items())
    except Exception:
        return {}
    out: dict[str, str] = {}
    for key, value in items:
        text = _as_str(value)
        if text:
            out[str(key)] = text
    return out


def _xmp(reader: PdfReader) -> tuple[str | None, str]:
    """The XMP dc:title (if any) and the raw XMP packet as text (for a DOI search)."""
    title: str | None = None
    raw = ""
    try:
        xmp = reader.xmp_metadata
        if xmp is not None:
            titles = xmp.dc_title or {}
            title = next((t for t in titles.values() if t and t.strip()), None)
            raw = xmp.stream.get_data().decode("utf-8", errors="replace")
    except Exception:
        pass
    return title, raw


NO_TEXT = "no text layer (scanned image?); run OCR first"


def _check_header(data: bytes) -> None:
    if not data:
        raise PdfUnreadable(EMPTY)
    if b"%PDF-" not in data[:HEADER_WINDOW]:
        raise PdfUnreadable(NOT_A_PDF)


def open_pdf(data: bytes) -> PdfReader:
    try:
        reader = PdfReader(BytesIO(data), strict=False)
    except Exception as exc:
        raise PdfUnreadable(f"truncated or corrupt PDF ({one_line(exc)})") from None
    if reader.is_encrypted:
        try:
            opened = reader.decrypt("")
        except Exception as exc:
            raise PdfUnreadable(f"encrypted; cannot decrypt ({one_line(exc)})") from None
        if opened == PasswordType.NOT_DECRYPTED:
            raise PdfUnreadable(ENCRYPTED)
    return reader


def read_pdf(data: bytes, max_pages: int | None = None, seconds: float | None = None) -> RawPdf:
    """Text of every page and the metadata of the PDF in ``data``.

    At most ``max_pages`` pages are read, and no page is started once ``seconds`` have
    passed (a budget checked between pages, never a signal); ``RawPdf.cut`` says why the
    rest was left.

    Raises:
        PdfUnreadable: not a PDF, empty, truncated/corrupt, or locked by a password.
    """
    _check_header(data)
    started = time.monotonic()
    with quiet_pypdf():
        reader = open_pdf(data)
        try:
            pages = list(reader.pages)
        except Exception as exc:
            raise PdfUnreadable(f"truncated or corrupt PDF ({one_line(exc)})") from None
        if not pages:
            raise PdfUnreadable("truncated or corrupt PDF (no pages could be read)")
        cut = ""
        if max_pages is not None and len(pages) > max_pages:
            cut = (
                f"{len(pages):,} pages, over the limit of {max_pages:,} (pdf_pages); only the first {max_pages:,} read"
            )
            pages = pages[:max_pages]
        texts: list[str] = []
        failed = 0
        last_error: Exception | None = None
        for number, page in enumerate(pages, start=1):
            if seconds is not None and number > 1 and time.monotonic() - started > seconds:
                cut = f"reading took over the limit of {seconds:g} s (source_seconds); pages {number} on not read"
                break
            try:
                texts.append(without_lone_surrogates(page.extract_text() or ""))
            except Exception as exc:
                failed += 1
                last_error = exc
                texts.append("")
        if failed == len(texts) and last_error is not None:
            raise PdfUnreadable(f"truncated or corrupt PDF ({one_line(last_error)})")
        xmp_title, xmp_text = _xmp(reader)
        return RawPdf(texts, _info(reader), xmp_title, xmp_text, failed, cut)
