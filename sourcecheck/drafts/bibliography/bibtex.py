"""BibTeX and biblatex .bib files, read with bibtexparser one entry at a time.

bibtexparser 1.x drops an entry it cannot parse without a word (a missing comma, a
missing key) and an unbalanced brace makes it swallow the entries after it. So the file
is first cut into top-level ``@type{...}`` chunks here, by brace counting, and each chunk
is handed to one shared parser: @string macros and crossref parents defined earlier
stay known, and a broken entry costs only itself and one Problem naming its line.
"""

from __future__ import annotations

import logging
import re
from collections.abc import Iterator
from contextlib import contextmanager
from dataclasses import dataclass

from bibtexparser.bibdatabase import UndefinedString
from bibtexparser.bparser import BibTexParser
from bibtexparser.customization import InvalidName, splitname

from sourcecheck.drafts.bibliography.latex_markup import latex_to_text
from sourcecheck.drafts.bibliography.record import Person, make_reference, normalise_doi, year_of
from sourcecheck.model import Problem, Reference

_AT_RE = re.compile(r"@[ \t]*([A-Za-z]+)[ \t\n]*([{(])")
# An entry that starts on its own line: where a broken entry is taken to end.
_LINE_AT_RE = re.compile(r"\n[ \t]*@[ \t]*[A-Za-z]+[ \t]*[{(]")
_KEY_RE = re.compile(r"[{(]\s*([^\s,{}()\"#%'=~\\]+)\s*,")
_AND_RE = re.compile(r"\s+and\s+", re.IGNORECASE)
_SKIPPED_KINDS = frozenset(["comment", "preamble"])
# Where the container of a work is named, most specific first (BibTeX, then biblatex).
_CONTAINER_FIELDS = ("journaltitle", "journal", "booktitle", "series")
_PUBLISHER_FIELDS = ("publisher", "institution", "school", "organization", "howpublished")


@dataclass(frozen=True)
class Chunk:
    """One top-level ``@`` item of a .bib file; ``error`` says why it cannot be parsed."""

    kind: str
    text: str
    line: int
    error: str | None = None


def split_chunks(text: str) -> Iterator[Chunk]:
    """The file's ``@type{...}`` items in order, each with its 1-based starting line.

    An item whose braces never close before the next line-initial ``@`` is cut there and
    marked unbalanced; text between items is a comment to BibTeX, but a "}" in it means
    the item before closed early, which is marked too.
    """
    pos = 0
    while (match := _AT_RE.search(text, pos)) is not None:
        start = match.start()
        line = text.count("\n", 0, start) + 1
        end = _closing(text, match.end(), match.group(2))
        if end is None:
            following = _LINE_AT_RE.search(text, match.end())
            stop = following.start() + 1 if following else len(text)
            yield Chunk(match.group(1).lower(), text[start:stop], line, "unbalanced braces")
            pos = stop
            continue
        following = _AT_RE.search(text, end)
        gap = text[end : following.start() if following else len(text)]
        error = "a closing brace too many, so fields may be lost" if "}" in gap else None
        yield Chunk(match.group(1).lower(), text[start:end], line, error)
        pos = end


def _closing(text: str, pos: int, opener: str) -> int | None:
    """Index just past the delimiter closing the item opened before ``pos``, or None."""
    depth = 0  # BibTeX counts every brace, "\{" too, so this does the same
    for index in range(pos, len(text)):
        char = text[index]
        if char == "{":
            depth += 1
        elif char == "}":
            if depth == 0:
                return index + 1 if opener == "{" else None
            depth -= 1
        elif char == ")" and opener == "(" and depth == 0:
            return index + 1
        elif char == "\n" and depth > 0 and _LINE_AT_RE.match(text, index):
            return None  # a new entry begins while this one is still open
    return None


@contextmanager
def _quiet_bibtexparser() -> Iterator[None]:
    """bibtexparser logs every oddity at ERROR; the Problems below say it once, better."""
    logger = logging.getLogger("bibtexparser")
    level = logger.level
    logger.setLevel(logging.CRITICAL + 1)
    try:
        yield
    finally:
        logger.setLevel(level)


def parse_bibtex(text: str, display: str) -> tuple[list[Reference], list[Problem]]:
    """References of a .bib file in file order, and one Problem per entry that was lost."""
    parser = BibTexParser(common_strings=True, ignore_nonstandard_types=False, add_missing_from_crossref=True)
    parser.expect_multiple_parse = True
    problems: list[Problem] = []
    lines: list[int] = []  # line of each entry bibtexparser holds, in its order
    with _quiet_bibtexparser():
        for chunk in split_chunks(text):
            if chunk.kind in _SKIPPED_KINDS:
                continue
            where = f"entry at line {chunk.line}"
            if chunk.error == "unbalanced braces":
                problems.append(Problem(display, f"{where} could not be read (unbalanced braces); skipped"))
                continue
            if chunk.kind != "string" and not _has_key(chunk.text):
                problems.append(Problem(display, f"{where} has no citation key; skipped"))
                continue
            before = len(parser.bib_database.entries)
            try:
                parser.parse(chunk.text)
            except UndefinedString as error:
                problems.append(Problem(display, f"{where} uses @string {error} that is not defined; skipped"))
                continue
            except Exception:  # pyparsing raises several kinds; any of them loses this entry only
                problems.append(Problem(display, f"{where} could not be read (syntax error); skipped"))
                continue
            added = len(parser.bib_database.entries) - before
            if chunk.kind != "string" and added == 0:
                problems.append(Problem(display, f"{where} could not be read (syntax error); skipped"))
                continue
            lines.extend([chunk.line] * added)
            if chunk.error:
                problems.append(Problem(display, f"{where} has {chunk.error}"))
    return _references(parser.bib_database.entries, lines, display, problems)


def _has_key(chunk: str) -> bool:
    opening = _AT_RE.match(chunk)
    return opening is not None and _KEY_RE.match(chunk, opening.end() - 1) is not None


def _references(
    entries: list[dict[str, str]], lines: list[int], display: str, problems: list[Problem]
) -> tuple[list[Reference], list[Problem]]:
    references: list[Reference] = []
    first_line: dict[str, int] = {}
    for entry, line in zip(entries, lines, strict=True):
        key = entry["ID"]
        if key in first_line:
            problems.append(
                Problem(
                    display,
                    f"duplicate key '{key}' in {display} (lines {first_line[key]} and {line}); the first is used",
                )
            )
            continue
        first_line[key] = line
        if "_crossref" in entry:
            problems.append(
                Problem(
                    display,
                    f"entry '{key}' (line {line}) names crossref '{entry['_crossref']}', which is not in the file",
                )
            )
        references.append(entry_to_reference(entry, line))
    return references, problems


def entry_to_reference(entry: dict[str, str], line: int = 0) -> Reference:
    """A Reference from one bibtexparser entry dict (field names lower-case)."""
    people, et_al = parse_names(entry.get("author") or entry.get("editor") or "")
    title = latex_to_text(entry.get("title", ""))
    if subtitle := latex_to_text(entry.get("subtitle", "")):
        title = f"{title}: {subtitle}" if title else subtitle
    container = next((latex_to_text(entry[f]) for f in _CONTAINER_FIELDS if entry.get(f)), None)
    container = container or next((latex_to_text(entry[f]) for f in _PUBLISHER_FIELDS if entry.get(f)), None)
    url = entry.get("url", "")
    eprint = entry.get("eprint", "") if entry.get("eprinttype", "").lower() == "doi" else ""
    doi = normalise_doi(entry.get("doi"), eprint, url if "doi.org" in url.lower() else "")
    return make_reference(
        entry["ID"],
        people,
        et_al=et_al,
        year=year_of(entry.get("year")) or year_of(entry.get("date")),
        title=title,
        container=container,
        doi=doi,
        line=line,
    )


def parse_names(value: str) -> tuple[list[Person], bool]:
    """People of a BibTeX name list and whether it ended in "and others".

    Names are split at "and" outside braces, so "{Barnes and Noble}" stays one corporate
    name; each is then read by bibtexparser's ``splitname``, which knows the "Last, First",
    "First von Last" and "von Last, Jr, First" forms of Patashnik's "BibTeXing".
    """
    people: list[Person] = []
    et_al = False
    for name in _split_and(" ".join(value.split())):
        if name.lower() == "others":
            et_al = True
            continue
        try:
            parts = splitname(name, strict_mode=False)
        except InvalidName:
            parts = {"last": [name]}
        family = latex_to_text(" ".join(parts.get("von", []) + parts.get("last", [])))
        given = latex_to_text(" ".join(parts.get("first", [])))
        if family or given:
            people.append(Person(family or given, given if family else ""))
    return people, et_al


def _split_and(value: str) -> list[str]:
    """``value`` split at " and " where no brace is open."""
    names: list[str] = []
    depth = 0
    start = 0
    pos = 0
    while pos < len(value):
        char = value[pos]
        if char == "{":
            depth += 1
        elif char == "}":
            depth = max(depth - 1, 0)
        elif depth == 0 and char.isspace() and (match := _AND_RE.match(value, pos)):
            names.append(value[start:pos])
            start = pos = match.end()
            continue
        pos += 1
    names.append(value[start:])
    return [n.strip() for n in names if n.strip()]
