"""Word (.docx) drafts: body, tables, footnotes and endnotes."""

from __future__ import annotations

from sourcecheck.drafts.word.reader import read_word, read_word_bytes

__all__ = ["read_word", "read_word_bytes"]
