"""Cutting a source's own reference list out of its text.

A source's bibliography is full of other works' titles; left in, a claim about work X
would find "support" in the line that merely cites X. We drop every line from a
reference-list heading to the end of the document, or up to an appendix or supplement
heading, after which body text resumes.
"""

from __future__ import annotations

import re

# A line that is only a heading: optional section number ("7", "7.", "VII.") then one of
# the usual names. A whole-line match, so "references" inside a sentence never cuts.
_REFERENCE_HEADING = re.compile(
    r"^(?:(?:\d{1,2}(?:\.\d{1,2})*|[IVXL]{1,5})[.)]?\s+)?"
    r"(?:references?(?:\s+and\s+notes)?|bibliography|works\s+cited|literature\s+cited"
    r"|cited\s+literature|reference\s+list|list\s+of\s+references)\s*:?$",
    re.IGNORECASE,
)
_RESUME_HEADING = re.compile(
    r"^(?:(?:\d{1,2}|[A-Z])[.)]?\s+)?"
    r"(?:appendix|appendices|supplementary|supplemental|supporting\s+information"
    r"|online\s+supplement)\b",
    re.IGNORECASE,
)
#: A reference heading in the first third of a long document is more likely a table of
#: contents line than the list itself (common practice, no source).
EARLIEST_SHARE = 1 / 3


def _capitalised(line: str) -> bool:
    letters = [ch for ch in line if ch.isalpha()]
    return bool(letters) and letters[0].isupper()


def is_reference_heading(line: str) -> bool:
    """A line that is a reference-list heading, not a sentence using the word."""
    line = line.strip()
    return _capitalised(line) and bool(_REFERENCE_HEADING.match(line))


def is_resume_heading(line: str) -> bool:
    """An appendix or supplement heading: body text starts again after it."""
    line = line.strip()
    return _capitalised(line) and len(line.split()) <= 10 and bool(_RESUME_HEADING.match(line))


def cut_reference_sections(pages: list[list[str]]) -> list[list[str]]:
    """The pages' lines without any reference list (heading included)."""
    total = sum(len(lines) for lines in pages) or 1
    seen = 0
    inside = False
    cleaned: list[list[str]] = []
    for lines in pages:
        kept: list[str] = []
        for line in lines:
            seen += 1
            if inside:
                if is_resume_heading(line):
                    inside = False
                    kept.append(line)
                continue
            late_enough = len(pages) <= 2 or seen / total >= EARLIEST_SHARE
            if late_enough and is_reference_heading(line):
                inside = True
                continue
            kept.append(line)
        cleaned.append(kept)
    return cleaned


def before_reference_heading(lines: list[str]) -> list[str]:
    """The lines before the first reference heading (all of them if there is none)."""
    for i, line in enumerate(lines):
        if is_reference_heading(line):
            return lines[:i]
    return lines
