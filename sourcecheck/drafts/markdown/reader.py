"""The reader for Markdown and plain-text drafts.

Plain text is read as Markdown: the Markdown a plain-text draft might hold by chance
(a "#" heading, "*emphasis*") means the same thing in both, and one reader is less to
keep in step. This module only knows the layout; markers, reference entries and
sentences are the shared modules' work.
"""

from __future__ import annotations

import re
from collections.abc import Iterator
from pathlib import Path
from typing import TYPE_CHECKING

from sourcecheck.claims import Block, Resolver, bound_blocks, bound_citations, cut_draft, extract_claims
from sourcecheck.drafts.bibliography.reflist import (
    find_reference_section,
    heading_at,
    parse_references,
    split_entries,
)
from sourcecheck.drafts.markdown.pandoc import draft_bibliography, extract_keyed_claims, find_key_citations
from sourcecheck.limits import Limits
from sourcecheck.model import Draft, Problem

if TYPE_CHECKING:  # the registry imports this module, so only the type comes from there
    from sourcecheck.model import ReadOptions

_COMMENT_RE = re.compile(r"<!--.*?(?:-->|\Z)", re.DOTALL)
_FENCE_RE = re.compile(r"^\s{0,3}(`{3,}|~{3,})")
_LINK_DEFINITION_RE = re.compile(r"^\s{0,3}\[[^\]^]+\]:\s+\S")
_THEMATIC_BREAK_RE = re.compile(r"^\s{0,3}([-*_])(?:\s*\1){2,}\s*$")
_ITEM_RE = re.compile(r"^\s*(?:[-*+•]|\d{1,3}[.)])\s+(?:\[[ xX]\]\s+)?")
_QUOTE_RE = re.compile(r"^\s*(?:>\s?)+")
_TABLE_RE = re.compile(r"^\s*\|")
_TABLE_RULE_RE = re.compile(r"^\s*\|?\s*:?-{2,}:?\s*(?:\|\s*:?-{2,}:?\s*)*\|?\s*$")


def read_markdown(
    text: str, display: str, *, options: ReadOptions | None = None, base_dir: Path | None = None
) -> Draft:
    """Claims, reference entries and problems of a Markdown or plain-text draft.

    A bibliography file, from ``options.bibliography`` (``--bib``) or the front matter's
    ``bibliography:`` field (relative to ``base_dir``, the draft's folder), takes the place
    of a written reference list; Pandoc key citations ("[@key]") are read against it.
    """
    if not text.strip():
        return Draft(display, [], [], [Problem(display, "the draft is empty")])
    limits = options.limits if options else Limits()
    text, problems = cut_draft(text, limits, display)
    lines = visible_lines(text)
    section = find_reference_section(lines)
    bibliography = draft_bibliography(text, display, options.bibliography if options else None, base_dir)
    problems.extend(bibliography.problems)
    references = []
    body = list(lines)
    if section is not None:
        entries = split_entries(lines[section.start : section.end], section.start + 1)
        references = parse_references(entries)
        where = f"'{section.title}' (line {section.heading_index + 1})"
        if references and bibliography.references:
            problems.append(Problem(display, f"the reference list under {where} is not used; the bibliography file is"))
        elif not references and not bibliography.named:
            problems.append(Problem(display, f"the reference list under {where} has no entries"))
        body[section.heading_index : section.end] = [""] * (section.end - section.heading_index)
    if bibliography.references:
        references = bibliography.references
    blocks = list(prose_blocks(body))
    keyed = any(find_key_citations(block.text) for block in blocks)
    if keyed and not bibliography.named:
        problems.append(
            Problem(
                display,
                "the draft cites by key (@key) but names no bibliography file; "
                "give --bib or a 'bibliography:' field in the front matter",
            )
        )
    elif section is None and not bibliography.named:
        problems.append(
            Problem(
                display,
                "no reference list found (no heading such as References, Bibliography or Works cited)",
            )
        )
    blocks, cut = bound_blocks(blocks, limits, display)
    problems.extend(cut)
    if keyed:
        claims = extract_keyed_claims(blocks, Resolver(references), {r.key for r in bibliography.references})
    else:
        claims = extract_claims(blocks, Resolver(references))
    claims, cut = bound_citations(claims, limits, display)
    problems.extend(cut)
    if not claims:
        problems.append(Problem(display, "no citation markers found in the text"))
    return Draft(display, claims, references, problems)


def visible_lines(text: str) -> list[str]:
    """The draft's lines with everything that is not text blanked out.

    YAML front matter, fenced code, HTML comments and link definitions become empty
    lines, so line numbers stay those of the file.
    """
    text = _COMMENT_RE.sub(lambda m: re.sub(r"[^\n]", " ", m.group(0)), text)
    lines = text.split("\n")
    if lines and lines[0].strip() == "---":
        for index in range(1, min(len(lines), 200)):
            if lines[index].strip() in {"---", "..."}:
                lines[: index + 1] = [""] * (index + 1)
                break
    fence: str | None = None
    for index, line in enumerate(lines):
        opening = _FENCE_RE.match(line)
        if fence is None and opening:
            fence = opening.group(1)
            lines[index] = ""
        elif fence is not None:
            if line.strip().startswith(fence[0] * len(fence)) and not line.strip(fence[0] + " "):
                fence = None
            lines[index] = ""
        elif _LINK_DEFINITION_RE.match(line):
            lines[index] = ""
    return [line.rstrip() if line.strip() else "" for line in lines]


def prose_blocks(lines: list[str]) -> Iterator[Block]:
    """Paragraphs, list items, quote paragraphs and table rows, headings left out."""
    current: list[str] = []
    first = 0
    index = 0

    def flush() -> Iterator[Block]:
        if current:
            yield Block("\n".join(current), first + 1)
            current.clear()

    while index < len(lines):
        line = lines[index]
        heading = heading_at(lines, index) if line else None
        if not line or heading or _THEMATIC_BREAK_RE.match(line):
            yield from flush()
            index += heading.lines if heading else 1
            continue
        if _TABLE_RE.match(line):
            yield from flush()
            if not _TABLE_RULE_RE.match(line):
                yield Block(line.replace("|", " "), index + 1)
            index += 1
            continue
        content = _QUOTE_RE.sub("", line, count=1)
        if _ITEM_RE.match(content):
            yield from flush()
            content = _ITEM_RE.sub("", content, count=1)
        if not current:
            first = index
        current.append(content)
        index += 1
    yield from flush()
