"""Markdown and plain-text drafts, Pandoc citation keys included."""

from __future__ import annotations

from sourcecheck.drafts.markdown.reader import read_markdown

__all__ = ["read_markdown"]
