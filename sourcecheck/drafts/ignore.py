"""Ignore comments: an author marks a sentence in the draft's own comment syntax so it is not counted.

``<!-- sourcecheck: ignore -->`` in Markdown and plain text (an HTML comment, which
Markdown renderers drop), ``% sourcecheck: ignore`` in LaTeX (a TeX comment). The rule,
the same for both:

- a comment that shares its line with text covers every claim that starts on that line;
- a comment on a line of its own covers every claim that starts on the next line that
  holds text.

With one sentence per line (the "semantic line breaks" habit) that is exactly one claim.
Word and PDF drafts have no comment a reader could place, so they have no ignore comment;
``sourcecheck review accept`` works for every format. The readers drop comments before
claims are cut, so the comment never reaches a claim's text; this pass reads the raw
lines again.
"""

from __future__ import annotations

import re
from dataclasses import replace
from pathlib import Path, PurePosixPath

from sourcecheck.drafts.textfile import decode
from sourcecheck.model import Claim, Draft

_MARKDOWN_RE = re.compile(r"<!--\s*sourcecheck\s*:\s*ignore\s*-->", re.IGNORECASE)
# A "%" not escaped as "\%" starts a TeX comment.
_LATEX_RE = re.compile(r"(?<!\\)%\s*sourcecheck\s*:\s*ignore\b", re.IGNORECASE)
_COMMENT_RES = {"markdown": _MARKDOWN_RE, "latex": _LATEX_RE}
_LEADING_COMMENT_RES = {"markdown": re.compile(r"^\s*<!--.*?-->\s*$"), "latex": re.compile(r"^\s*(?<!\\)%")}


def ignored_lines(text: str, format_name: str) -> set[int]:
    """The 1-based lines whose claims an ignore comment covers, by the rule in the module docstring."""
    pattern = _COMMENT_RES.get(format_name)
    if pattern is None:
        return set()
    lines = text.splitlines()
    covered: set[int] = set()
    for number, line in enumerate(lines, start=1):
        match = pattern.search(line)
        if match is None:
            continue
        # After a TeX "%" the rest of the line is comment; an HTML comment may have text after it.
        rest = line[: match.start()] if format_name == "latex" else line[: match.start()] + line[match.end() :]
        if rest.strip():
            covered.add(number)
            continue
        for later in range(number + 1, len(lines) + 1):
            if lines[later - 1].strip() and not _LEADING_COMMENT_RES[format_name].match(lines[later - 1]):
                covered.add(later)
                break
    return covered


def _file_of(claim: Claim, path: Path, display: str) -> Path | None:
    """The file a claim was read from: the draft, or a LaTeX ``\\input`` file beside it."""
    if claim.file is None:
        return path
    try:
        relative = PurePosixPath(claim.file).relative_to(PurePosixPath(display).parent)
    except ValueError:
        return None
    return path.parent / relative


def mark_ignored(draft: Draft, path: Path, display: str, format_name: str) -> Draft:
    """``draft`` with ``ignored`` set on the claims an ignore comment covers."""
    if format_name not in _COMMENT_RES or not draft.claims:
        return draft
    covered_by_file: dict[Path, set[int]] = {}
    claims: list[Claim] = []
    for claim in draft.claims:
        file = _file_of(claim, path, display)
        if file is not None and file not in covered_by_file:
            try:
                text, _ = decode(file.read_bytes(), display)
            except OSError:
                text = ""
            covered_by_file[file] = ignored_lines(text, format_name)
        covered = covered_by_file.get(file, set()) if file is not None else set()
        claims.append(replace(claim, ignored=True) if claim.line in covered else claim)
    draft.claims = claims
    return draft
