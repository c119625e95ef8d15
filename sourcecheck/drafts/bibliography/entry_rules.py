"""The rule parser for one reference entry: patterns of APA-like, IEEE-like, Vancouver and looser styles.

It was the only parser before the trained one (``entry_parser``) and lost to it on every
field measured (bench/entry_parser.py). It stays for two jobs the measurements leave it:
reading author segments that a typeset ``.bbl`` block has already cut out
(:func:`parse_authors`), and filling a field the trained parser leaves empty.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from sourcecheck.text import NAME_WORD, find_doi

_DOI_RE = re.compile(r"\b10\.\d{4,9}/[^\s\"<>]+", re.IGNORECASE)
URL_RE = re.compile(r"(?:https?://|www\.)\S+", re.IGNORECASE)
YEAR_PATTERN = r"(?:1[5-9]|20)\d{2}"
_APA_YEAR_RE = re.compile(
    rf"\((?:(?P<year>{YEAR_PATTERN})(?P<suffix>[a-z])?(?:\s*,[^)]*)?|(?P<none>n\.\s?d\.|in\s+press))\)",
    re.IGNORECASE,
)
_PLAIN_YEAR_RE = re.compile(rf"\b(?P<year>{YEAR_PATTERN})(?P<suffix>[a-z])?\b")
_QUOTED_RE = re.compile(r"[\"“](?P<title>[^\"“”]{3,})[\"”]")
_INITIAL_WORD_RE = re.compile(r"^(?:[A-Z]\.?[-‐]?){1,3}\.?$")
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
class ParsedEntry:
    """What could be read from one entry's text."""

    authors: tuple[str, ...]
    year: int | None
    suffix: str
    title: str | None
    doi: str | None


def parse_entry_by_rules(text: str) -> ParsedEntry:
    """Authors, year, title and DOI of one entry in APA-like, IEEE-like or looser style."""
    doi = find_doi(text)
    plain = plain_text(text)
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
    return _DOI_RE.sub(" ", URL_RE.sub(" ", text))


def plain_text(text: str) -> str:
    """Entry or heading text without Markdown emphasis, links or angle brackets."""
    text = re.sub(r"!?\[([^\]]*)\]\(([^)]*)\)", r"\1 \2", text)
    text = re.sub(r"<((?:https?://|doi:)[^>]+)>", r"\1", text)
    text = re.sub(r"(\*{1,3}|(?<!\w)_{1,3}|_{1,3}(?!\w))", "", text)
    return " ".join(text.split())
