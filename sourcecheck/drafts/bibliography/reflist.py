"""Finding the reference list in a draft and parsing its entries.

Entry parsing takes (text, line) pairs so readers of other formats can reuse it once they
have cut their bibliography into entries. Section finding works on plain lines, with the
heading forms of Markdown and plain text (ATX, setext, a bold line, a line alone).
"""

from __future__ import annotations

import re
from collections.abc import Callable, Sequence
from dataclasses import dataclass

from sourcecheck.drafts.bibliography.entry_parser import EntryFields, parse_fields
from sourcecheck.drafts.bibliography.entry_rules import (
    URL_RE,
    YEAR_PATTERN,
    ParsedEntry,
    parse_entry_by_rules,
    plain_text,
)
from sourcecheck.model import Reference
from sourcecheck.text import ascii_slug, find_doi

# What reads one entry's fields: the shipped CRF model, or (when measuring) a model of one fold.
FieldReader = Callable[[str], EntryFields]

_NAMES = (
    r"references?|bibliography|works\s+cited|literature\s+cited|references\s+cited|"
    r"cited\s+literature|reference\s+list|list\s+of\s+references|sources|cited\s+works"
)
# Optional section numbering ("7.", "7", "VII.") before the heading word.
_NUMBERING = r"(?:(?:\d+(?:\.\d+)*|[IVXLC]+)\.?\s+)?"
_REFERENCE_TITLE_RE = re.compile(rf"(?i)^{_NUMBERING}(?:{_NAMES})\s*:?$")
# Back matter that ends a reference list given by a bold or bare heading.
_WEAK_TITLE_RE = re.compile(rf"(?i)^{_NUMBERING}sources$")
_BACK_MATTER_RE = re.compile(
    rf"(?i)^{_NUMBERING}(?:appendix|appendices|acknowledge?ments?|supplementary\b.*|"
    r"supporting\s+information|notes|endnotes|footnotes|tables|figures|figure\s+legends|"
    r"author\s+contributions|funding|conflicts?\s+of\s+interest|competing\s+interests|"
    r"data\s+availability.*)(?:\s+[A-Z0-9]{1,3})?\s*:?$"
)
_ATX_RE = re.compile(r"^\s{0,3}(#{1,6})\s+(.*?)\s*#*\s*$")
_SETEXT_RE = re.compile(r"^\s{0,3}(=+|-+)\s*$")
_BOLD_RE = re.compile(r"^\s*(\*\*|__)(.+?)\1\s*:?\s*$")
_BULLET_RE = re.compile(r"^\s*[-*+•]\s+")
# Up to three digits: a wrapped line that opens with a year ("2016. “Title.”") is no label.
_NUMBER_LABEL_RE = re.compile(r"^\s*(?:\[(\d{1,3})\]|(\d{1,3})[.)])\s+(?=\S)")
# "Family, Given" or "Given Family, Given" (accented or capitalised names too: "Hervé", "CMS"),
# "Names (2019)" before any closing quote, "Names. 2019. " (Chicago author-date), "Names. “Title"
# (Chicago notes-bibliography) or a lone "Given Family. Title" (computer-science proceedings).
_ENTRY_START_RE = re.compile(
    r"^(?:[^\W\d_][\w'’.\-]*\s){0,3}[^\W\d_][\w'’\-]*,\s+(?:[A-Z]\.|[A-Z][^\W\d_]+[ ,.])"
    rf"|^[A-Z][^()”\"]{{0,120}}\((?:\d{{4}}[a-z]?|n\.\s?d\.)[,)]|^[A-Z][^()”\"]{{0,120}}?\.\s{YEAR_PATTERN}[a-z]?\.\s"
    r"|^[A-Z][^()“”\"]{0,120}?\.\s[“\"]|^(?:[A-Z][\w'’\-]+\s){1,2}[A-Z][\w'’\-]+\.\s[A-Z]"
)
_CUT_INITIAL_RE = re.compile(r"^[A-Z]\.(?:,|\s\()")
_NAME_CUT_RE = re.compile(r"(?:^|\s)(?:[A-Z][a-z]+|[A-Z]\.)\s[A-Z]\.$")


@dataclass(frozen=True)
class Heading:
    """A heading line: its text, its level (None for bold or bare lines) and its size."""

    title: str
    level: int | None
    lines: int


@dataclass(frozen=True)
class ReferenceSection:
    """Where the reference list lies: 0-based line indices, ``end`` exclusive."""

    title: str
    heading_index: int
    start: int
    end: int


def heading_at(lines: Sequence[str], index: int) -> Heading | None:
    """The heading that starts at ``lines[index]``, if any."""
    line = lines[index]
    if not line.strip():
        return None
    if atx := _ATX_RE.match(line):
        return Heading(plain_text(atx.group(2)), len(atx.group(1)), 1)
    nxt = lines[index + 1] if index + 1 < len(lines) else ""
    setext = _SETEXT_RE.match(nxt)
    if setext and not _BULLET_RE.match(line) and (index == 0 or not lines[index - 1].strip()):
        return Heading(plain_text(line), 1 if setext.group(1)[0] == "=" else 2, 2)
    if bold := _BOLD_RE.match(line):
        return Heading(plain_text(bold.group(2)), None, 1)
    alone = index == 0 or not lines[index - 1].strip()
    bare = plain_text(line).rstrip(":").strip()
    if alone and (_REFERENCE_TITLE_RE.match(bare) or _BACK_MATTER_RE.match(bare)):
        return Heading(bare, None, 1)
    return None


def find_reference_section(lines: Sequence[str]) -> ReferenceSection | None:
    """The heading that names the reference list, and the lines it governs.

    The last such heading wins, since the list proper comes late; a plain "Sources"
    heading gives way to any "References"-like one, since "Sources" may title a section
    on data sources. The list stops at the next heading of the same or a higher level, at
    back matter such as an appendix, or at the end of the text.
    """
    found: list[ReferenceSection] = []
    index = 0
    while index < len(lines):
        heading = heading_at(lines, index)
        if heading and _REFERENCE_TITLE_RE.match(heading.title.rstrip(":").strip()):
            start = index + heading.lines
            end = _section_end(lines, start, heading.level)
            found.append(ReferenceSection(heading.title, index, start, end))
            index = end
            continue
        index += heading.lines if heading else 1
    strong = [s for s in found if not _WEAK_TITLE_RE.match(s.title.rstrip(":").strip())]
    kept = strong or found
    return kept[-1] if kept else None


def _section_end(lines: Sequence[str], start: int, level: int | None) -> int:
    for index in range(start, len(lines)):
        heading = heading_at(lines, index)
        if heading is None:
            continue
        if _BACK_MATTER_RE.match(heading.title.rstrip(":").strip()):
            return index
        if level is None or (heading.level is not None and heading.level <= level):
            return index
    return len(lines)


def split_entries(lines: Sequence[str], first_line: int) -> list[tuple[str, int]]:
    """Cut reference-list lines into entries: (joined text, 1-based line) pairs.

    ``first_line`` is the 1-based number of ``lines[0]``. Numbered lists start an entry at
    each number (unnumbered text continues one only if not cut off by a blank line or if
    indented); other lists start one at each bullet, after each blank line, and at an
    unindented line that opens like an author-year entry after a line that closed one.
    """
    numbered = any(_NUMBER_LABEL_RE.match(_BULLET_RE.sub("", line, count=1)) for line in lines)
    entries: list[tuple[list[str], int]] = []
    current: list[str] | None = None
    after_blank = True
    for offset, line in enumerate(lines):
        if not line.strip() or heading_at(lines, offset) or _SETEXT_RE.match(line):
            after_blank = True
            if not numbered or heading_at(lines, offset):
                current = None
            continue
        bare = _BULLET_RE.sub("", line, count=1)
        if numbered:
            starts = _NUMBER_LABEL_RE.match(bare) is not None
            if not starts and after_blank and not line[:1].isspace():
                current = None  # a note under the list, not part of an entry
        else:
            starts = bare != line or current is None or after_blank or _opens_entry(line, current)
        after_blank = False
        if starts:
            current = [bare.strip()]
            entries.append((current, first_line + offset))
        elif current is not None:
            current.append(line.strip())
    return [(" ".join(" ".join(parts).split()), line) for parts, line in entries]


def _opens_entry(line: str, current: list[str]) -> bool:
    """Whether an unindented line inside a paragraph begins a new author-year entry."""
    if line[:1].isspace():
        return False  # hanging indent: a wrapped line
    previous = current[-1].rstrip()
    ends_entry = previous.endswith((".", ")")) or bool(URL_RE.search(previous.split()[-1]))
    if _NAME_CUT_RE.search(previous):
        return False  # "... Luke A." / "Simon Y. W.": the wrap fell inside a given name
    # A line opening on a lone initial ("P. (2015).", "G., Burchmore, R.") ends a name list cut by the wrap.
    return ends_entry and _ENTRY_START_RE.match(line.strip()) is not None and not _CUT_INITIAL_RE.match(line.strip())


def parse_references(entries: Sequence[tuple[str, int]], read_fields: FieldReader = parse_fields) -> list[Reference]:
    """Reference objects for (entry text, line) pairs, with unique keys.

    Numbered entries are keyed by their number ("3"); others by lower-case ASCII first
    family name, year and suffix ("okafor2019a"), "anon" and "nd" standing in for a
    missing name or year. A clash gets "_2", "_3", ...
    """
    references: list[Reference] = []
    used: set[str] = set()
    for raw, line in entries:
        label = _NUMBER_LABEL_RE.match(raw)
        text = raw[label.end() :] if label else raw
        parsed = parse_entry(text, read_fields)
        if label:
            base = label.group(1) or label.group(2)
            base = str(int(base))
        else:
            family = ascii_slug(parsed.authors[0]) if parsed.authors else ""
            year = str(parsed.year) if parsed.year else "nd"
            base = f"{family or 'anon'}{year}{parsed.suffix}"
        key, n = base, 1
        while key in used:
            n += 1
            key = f"{base}_{n}"
        used.add(key)
        references.append(
            Reference(
                key=key,
                text=text,
                authors=parsed.authors,
                year=parsed.year,
                year_suffix=parsed.suffix,
                title=parsed.title,
                doi=parsed.doi,
                line=line,
            )
        )
    return references


def parse_entry(text: str, read_fields: FieldReader = parse_fields) -> ParsedEntry:
    """Authors, year, title and DOI of one entry, in any style.

    The trained parser reads the fields; the DOI comes from the DOI pattern over the whole
    entry (exact on every DOI of the labelled data, where the tagger's spans alone miss some).
    A year the model leaves empty is taken from the rule parser when it finds one: on the
    shared labelled entries (5-fold cross-validation, bench/entry_parser.py) that raises
    year from 99.3% to 99.6%. Authors and titles are the model's alone: filling them from
    the rules gained nothing there and turned a title-only entry's title into author names.
    """
    fields = read_fields(plain_text(text))
    year, suffix = fields.year, fields.year_suffix
    if year is None:
        rules = parse_entry_by_rules(text)
        year, suffix = rules.year, rules.suffix
    return ParsedEntry(fields.authors, year, suffix, fields.title, find_doi(text))
