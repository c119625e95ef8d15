"""Shortening text for display, the same way in every report."""

from __future__ import annotations


def trim(text: str, words: int) -> str:
    """The first ``words`` words of ``text``, with an ellipsis when cut."""
    parts = text.split()
    return " ".join(parts[:words]) + (" …" if len(parts) > words else "")
