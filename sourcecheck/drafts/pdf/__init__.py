"""PDF manuscripts: superscript markers, running heads and line-number margins removed."""

from __future__ import annotations

from sourcecheck.drafts.pdf.reader import read_pdf_manuscript, read_pdf_manuscript_bytes

__all__ = ["read_pdf_manuscript", "read_pdf_manuscript_bytes"]
