"""Finding the reference list in a draft and parsing its entries.

Entry parsing takes (text, line) pairs so readers of other formats can reuse it once they
have cut their bibliography into entries. Section finding works on plain lines, with the
heading forms of Markdown and plain text (ATX, setext, a bold line, a line alone).
"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass

from sourcecheck.model import Reference
from sourcecheck.text import NAME_WORD, ascii_slug, find_doi

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
_DOI_RE = re.compile(r"\b10\.\d{4,9}/[^\s\"<>]+", re.IGNORECASE)
_URL_RE = re.compile(r"(?:https?://|www\.)\S+", re.IGNORECASE)
_YEAR = r"(?:1[5-9]|20)\d{2}"
_APA_YEAR_RE = re.compile(
    rf"\((?:(?P<year>{_YEAR})(?P<suffix>[a-z])?(?:\s*,[^)]*)?|(?P<none>n\.\s?d\.|in\s+press))\)",
    re.IGNORECASE,
)
_PLAIN_YEAR_RE = re.compile(rf"\b(?P<year>{_YEAR})(?P<suffix>[a-z])?\b")
_QUOTED_RE = re.compile(r"[\"“](?P<title>[^\"“”]{3,})[\"”]")
_INITIAL_WORD_RE = re.compile(r"^(?:[A-Z]\.?[-‐]?){1,3}\.?$")
# "Family, Given" or "Given Family, Given" (accented or capitalised names too: "Hervé", "CMS"),
# "Names (2019)" before any closing quote, "Names. 2019. " (Chicago author-date), "Names. “Title"
# (Chicago notes-bibliography) or a lone "Given Family. Title" (computer-science proceedings).
_ENTRY_START_RE = re.compile(
    r"^(?:[^\W\d_][\w'’.\-]*\s){0,3}[^\W\d_][\w'’\-]*,\s+(?:[A-Z]\.|[A-Z][^\W\d_]+[ ,.])"
    rf"|^[A-Z][^()”\"]{{0,120}}\((?:\d{{4}}[a-z]?|n\.\s?d\.)[,)]|^[A-Z][^()”\"]{{0,120}}?\.\s{_YEAR}[a-z]?\.\s"
    r"|^[A-Z][^()“”\"]{0,120}?\.\s[“\"]|^(?:[A-Z][\w'’\-]+\s){1,2}[A-Z][\w'’\-]+\.\s[A-Z]"
)
_CUT_INITIAL_RE = re.compile(r"^[A-Z]\.(?:,|\s\()")
_NAME_CUT_RE = re.compile(r"(?:^|\s)(?:[A-Z][a-z]+|[A-Z]\.)\s[A-Z]\.$")
_VANCOUVER_RE = re.compile(
    rf"^(?P<names>{NAME_WORD}(?:\s+{NAME_WORD})*\s+[A-Z]{{1,3}}"
    rf"(?:,\s+{NAME_WORD}(?:\s+{NAME_WORD})*\s+[A-Z]{{1,3}})*(?:,?\s+et\s+al)?)\.\s"
)
_IEEE_NAME = rf"(?:[A-Z]\.(?:\s?-?\s?[A-Z]\.)*\s+)(?:[a-z]+\s+)*{NAME_WORD}"
_INITIALS_FIRST_RE = re.compile(
    rf"^(?P<names>{_IEEE_NAME}(?:(?:\s*,\s*(?:and\s+)?|\s+and\s+){_IEEE_NAME})*"
    rf"(?:,?\s+et\s+al\.?)?)\s*[,.:]\s"
)
_ABBREVIATIONS = frozenset(
    [
        "vs",
        "eg",
        "ie",
        "al",
        "ed",
        "eds",
        "vol",
        "no",
        "pp",
        "p",
        "trans",
        "rev",
        "dept",
        "univ",
        "inc",
        "ltd",
        "co",
        "jr",
        "sr",
        "st",
        "dr",
        "mr",
        "ms",
    ]
)


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


@dataclass(frozen=True)
class ParsedEntry:
    """What could be read from one entry's text."""

    authors: tuple[str, ...]
    year: int | None
    suffix: str
    title: str | None
    doi: str | None


def heading_at(lines: Sequence[str], index: int) -> Heading | None:
    """The heading that starts at ``lines[index]``, if any."""
    line = lines[index]
    if not line.strip():
        return None
    if atx := _ATX_RE.match(line):
        return Heading(_plain(atx.group(2)), len(atx.group(1)), 1)
    nxt = lines[index + 1] if index + 1 < len(lines) else ""
    setext = _SETEXT_RE.match(nxt)
    if setext and not _BULLET_RE.match(line) and (index == 0 or not lines[index - 1].strip()):
        return Heading(_plain(line), 1 if setext.group(1)[0] == "=" else 2, 2)
    if bold := _BOLD_RE.match(line):
        return Heading(_plain(bold.group(2)), None, 1)
    alone = index == 0 or not lines[index - 1].strip()
    bare = _plain(line).rstrip(":").strip()
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
    ends_entry = previous.endswith((".", ")")) or bool(_URL_RE.search(previous.split()[-1]))
    if _NAME_CUT_RE.search(previous):
        return False  # "... Luke A." / "Simon Y. W.": the wrap fell inside a given name
    # A line opening on a lone initial ("P. (2015).", "G., Burchmore, R.") ends a name list cut by the wrap.
    return ends_entry and _ENTRY_START_RE.match(line.strip()) is not None and not _CUT_INITIAL_RE.match(line.strip())


def parse_references(entries: Sequence[tuple[str, int]]) -> list[Reference]:
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
        parsed = parse_entry(text)
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


def parse_entry(text: str) -> ParsedEntry:
    """Authors, year, title and DOI of one entry in APA-like, IEEE-like or looser style."""
    doi = find_doi(text)
    plain = _plain(text)
    quoted = _QUOTED_RE.search(plain)
    apa = _APA_YEAR_RE.search(plain)
    if apa and apa.start() < 400 and (quoted is None or apa.start() < quoted.start()):
        year = int(apa.group("year")) if apa.group("year") else None
        suffix = (apa.group("suffix") or "").lower()
        title = _first_sentence(plain[apa.end() :].lstrip(" .,:"))
        return ParsedEntry(parse_authors(plain[: apa.start()]), year, suffix, title, doi)
    if quoted:
        after = _strip_links(plain[quoted.end() :])
        years = list(_PLAIN_YEAR_RE.finditer(after)) or list(_PLAIN_YEAR_RE.finditer(_strip_links(plain)))
        year, suffix = _year_of(years[-1] if years else None)
        title = quoted.group("title").strip().rstrip(",.;:").strip() or None
        return ParsedEntry(parse_authors(plain[: quoted.start()]), year, suffix, title, doi)
    return _parse_loose(plain, doi)


def _parse_loose(plain: str, doi: str | None) -> ParsedEntry:
    """Fallback for entries with neither "(2019)" nor a quoted title.

    Tries, in turn: Vancouver names ("Okafor AB, Lin C."), IEEE-style names with initials
    first ("A. B. Okafor and C. Lin,"), names up to the year ("Okafor, A. 2019."), and last
    the first full stop as the end of the names.
    """
    unlinked = _strip_links(plain)
    for pattern in (_VANCOUVER_RE, _INITIALS_FIRST_RE):
        if (lead := pattern.match(unlinked)) is not None:
            rest = unlinked[lead.end() :].lstrip(" .,:;")
            title = _first_chunk(rest) if pattern is _INITIALS_FIRST_RE else _first_sentence(rest)
            years = list(_PLAIN_YEAR_RE.finditer(rest))
            # IEEE puts the year near the end; Vancouver right after the journal.
            chosen = (years[-1] if pattern is _INITIALS_FIRST_RE else years[0]) if years else None
            year, suffix = _year_of(chosen)
            return ParsedEntry(parse_authors(lead.group("names")), year, suffix, title, doi)
    year_match = _PLAIN_YEAR_RE.search(unlinked)
    head = unlinked[: year_match.start()] if year_match else ""
    if year_match and len(head) < 300 and ("," in head or "." in head):
        year, suffix = _year_of(year_match)
        authors = parse_authors(head.rstrip(" ,.(["))
        rest = unlinked[year_match.end() :].lstrip(" ).,:;]")
        return ParsedEntry(authors, year, suffix, _first_sentence(rest), doi)
    first = _first_sentence(unlinked) or ""
    rest = unlinked[len(first) :].lstrip(" .,:;")
    year, suffix = _year_of(year_match)
    return ParsedEntry(parse_authors(first), year, suffix, _first_sentence(rest), doi)


def _first_chunk(text: str) -> str | None:
    """IEEE book titles run to the first comma or full stop."""
    chunk = re.split(r",|\.(?=\s|$)", text, maxsplit=1)[0].strip()
    return chunk or None


def parse_authors(segment: str) -> tuple[str, ...]:
    """Family names, in order, from an author segment in "Family, I." or "I. Family" form."""
    text = re.sub(r"\bet\s+al\.?|…|\.\s?\.\s?\.", " ", segment)
    text = re.sub(r"\s*,?\s*(?:&|\band\b)\s*", ", ", text)
    tokens = [t.strip(" ;:") for t in text.split(",")]
    tokens = [t for t in tokens if t.strip(" .")]
    if not tokens:
        return ()
    family: list[str] = []
    first_has_initials = any(_is_initial_word(w) for w in tokens[0].split())
    if len(tokens) > 1 and _looks_given(tokens[1]) and not first_has_initials:
        index = 0
        while index < len(tokens):
            family.append(tokens[index].strip(" ."))
            nxt = tokens[index + 1] if index + 1 < len(tokens) else ""
            index += 2 if nxt and _looks_given(nxt) else 1
    else:
        for token in tokens:
            words = [w for w in token.split() if not _is_initial_word(w) and not _is_suffix(w)]
            if words:
                family.append(" ".join(words).strip(" ."))
    return tuple(name for name in family if name and not _is_suffix(name))


def _year_of(match: re.Match[str] | None) -> tuple[int | None, str]:
    if match is None:
        return None, ""
    return int(match.group("year")), (match.group("suffix") or "").lower()


def _is_initial_word(word: str) -> bool:
    return bool(_INITIAL_WORD_RE.match(word)) and ("." in word or len(word) <= 2)


def _is_initials(token: str) -> bool:
    words = token.split()
    return bool(words) and all(_is_initial_word(w) for w in words)


def _looks_given(token: str) -> bool:
    """A token after a family name that holds given names: "A. B." or "Ada B."."""
    return _is_initials(token) or any(_is_initial_word(w) for w in token.split())


def _is_suffix(word: str) -> bool:
    return word.strip(".").lower() in {"jr", "sr", "ii", "iii", "iv"}


def _first_sentence(text: str) -> str | None:
    """Text up to the first full stop that is not an initial or an abbreviation."""
    text = text.strip()
    for match in re.finditer(r"[.?!](?=\s|$)", text):
        word = re.split(r"[\s(]", text[: match.start()])[-1]
        if match.group(0) == "." and (len(word) == 1 or word.lower() in _ABBREVIATIONS):
            continue
        end = match.end() if match.group(0) in "?!" else match.start()
        return text[:end].strip() or None
    return text.rstrip(".").strip() or None


def _strip_links(text: str) -> str:
    return _DOI_RE.sub(" ", _URL_RE.sub(" ", text))


def _plain(text: str) -> str:
    """Entry or heading text without Markdown emphasis, links or angle brackets."""
    text = re.sub(r"!?\[([^\]]*)\]\(([^)]*)\)", r"\1 \2", text)
    text = re.sub(r"<((?:https?://|doi:)[^>]+)>", r"\1", text)
    text = re.sub(r"(\*{1,3}|(?<!\w)_{1,3}|_{1,3}(?!\w))", "", text)
    return " ".join(text.split())
