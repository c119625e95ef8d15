"""Shared PDF-text layer: open a PDF within limits and read its text with its layout.

Used alike by the sources stage (cited PDFs) and by the PDF manuscript reader (drafts):
opening and refusing files (:mod:`.reader`: empty, not a PDF, truncated, encrypted), the
characters pypdf hands back (:mod:`.chars`: ligatures, soft hyphens, controls) and the
page's lines (:mod:`.layout`: running heads, page numbers, paragraphs).
"""

from __future__ import annotations

from sourcecheck.pdftext.chars import SOFT_HYPHEN, normalize_chars
from sourcecheck.pdftext.layout import (
    NUMBER_ZONE,
    RUNNING_ZONE,
    drop_running_lines,
    group_paragraphs,
    is_page_number,
    join_lines,
    split_lines,
    typical_length,
    vocabulary,
)
from sourcecheck.pdftext.reader import NO_TEXT, PdfUnreadable, RawPdf, one_line, open_pdf, quiet_pypdf, read_pdf

__all__ = [
    "NO_TEXT",
    "NUMBER_ZONE",
    "RUNNING_ZONE",
    "SOFT_HYPHEN",
    "PdfUnreadable",
    "RawPdf",
    "drop_running_lines",
    "group_paragraphs",
    "is_page_number",
    "join_lines",
    "normalize_chars",
    "one_line",
    "open_pdf",
    "quiet_pypdf",
    "read_pdf",
    "split_lines",
    "typical_length",
    "vocabulary",
]
