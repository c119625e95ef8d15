"""Pandoc Markdown citations (``[@key, p. 33]``, ``@key``) and the bibliography they cite.

A Pandoc draft names its works by key and keeps them in a bibliography file, given on
the command line (``--bib``) or in the YAML front matter (``bibliography:``). This module
finds the key citations, reads that file through :mod:`sourcecheck.drafts.bibliography`,
and builds claims from sentences holding key citations, ordinary markers or both. Claim
text, sentence splitting and ordinary markers stay the shared modules' work.
"""

from __future__ import annotations

import re
from collections.abc import Iterable, Sequence
from dataclasses import dataclass, field
from pathlib import Path, PurePath
from typing import Any

from sourcecheck.claims import Block, Marker, Resolver, Sentence, citations_from, extract_claims, mask_markup
from sourcecheck.drafts.bibliography import OUTSIDE_FOLDER, inside_folder, load_bibliography
from sourcecheck.model import Citation, Claim, Problem, Reference

# Pandoc User's Guide, "Citation syntax" (from memory): a key starts with a letter, digit
# or "_" and holds alphanumerics, "_" and single internal punctuation from :.#$%&-+?<>~/;
# punctuation at the end is not part of it. Any other key is written in braces: @{...}.
_KEY = r"\w(?:\w|[:.#$%&\-+?<>~/](?=\w))*"
_CITE = r"@(?:\{(?P<bkey>[^{}\s][^{}]*)\}|(?P<key>" + _KEY + r"))"
_BRACKET_RE = re.compile(r"(?<![\\!^\]])\[(?P<body>[^\[\]]*@[^\[\]]*)\]")
_ITEM_RE = re.compile(r"(?P<prefix>[^@]*?)(?<!\w)(?P<dash>-?)" + _CITE + r"(?P<suffix>.*)", re.DOTALL)
# "name@example.org" is an address, not a citation: no word character before the "@".
_NARRATIVE_RE = re.compile(r"(?<![\w\\@/])" + _CITE + r"(?:[ \t]?\[(?P<loc>[^\[\]@]*)\](?!\())?")
# Pandoc's locator terms (same source, from memory); a bare number is a page.
_LOCATOR_RE = re.compile(
    r"(?i:(?:bk|chaps?|cols?|figs?|fols?|nos?|ll?|nn?|opp?|pp?|paras?|pts?|secs?|s\.vv?|vv?|vols?)\.|"
    r"(?:books?|chapters?|columns?|figures?|folios?|numbers?|lines?|notes?|opus|opera|pages?|"
    r"paragraphs?|parts?|sections?|sub\s+verb(?:o|is)|verses?|volumes?)\b)|§|¶|\d"
)


@dataclass(frozen=True)
class KeyCite:
    """One work cited by key; ``suppress_author`` is Pandoc's ``[-@key]`` (year only)."""

    key: str
    locator: str | None = None
    suppress_author: bool = False

    @property
    def label(self) -> str:
        """The work as written on its own: "@key"."""
        return f"@{self.key}"


@dataclass(frozen=True)
class KeyMarker:
    """A key citation as found: ``[see @a; @b, p. 3]`` or narrative ``@a [p. 3]``."""

    text: str
    start: int
    end: int
    cites: tuple[KeyCite, ...]


@dataclass
class DraftBibliography:
    """The bibliography a draft names: whether it named one, its entries, what went wrong."""

    named: bool = False
    references: list[Reference] = field(default_factory=list)
    problems: list[Problem] = field(default_factory=list)


def find_key_citations(text: str) -> list[KeyMarker]:
    """Pandoc key citations in ``text``, in order; code, link targets and tags are skipped."""
    masked = re.sub(r"\\@", "  ", mask_markup(text))
    found: list[KeyMarker] = []
    links: list[tuple[int, int]] = []  # "[text @x](url)" is a link, whatever its text holds
    for match in _BRACKET_RE.finditer(masked):
        if text.startswith("(", match.end()):  # masking blanked the link target, not its "("
            links.append(match.span())
        elif cites := _bracket_cites(match.group("body")):
            found.append(KeyMarker(text[match.start() : match.end()], match.start(), match.end(), cites))
    taken = links + [(m.start, m.end) for m in found]
    for match in _NARRATIVE_RE.finditer(masked):
        if any(start <= match.start() < end for start, end in taken):
            continue
        cite = KeyCite(match.group("bkey") or match.group("key"), _locator(match.group("loc")))
        found.append(KeyMarker(text[match.start() : match.end()], match.start(), match.end(), (cite,)))
    return sorted(found, key=lambda m: m.start)


def _bracket_cites(body: str) -> tuple[KeyCite, ...]:
    """Cites of a bracketed list "see @a, p. 3; -@b"; () when an item holds no key."""
    cites = []
    for item in body.split(";"):
        match = _ITEM_RE.fullmatch(item)
        if match is None:
            return ()
        key = match.group("bkey") or match.group("key")
        cites.append(KeyCite(key, _locator(match.group("suffix")), bool(match.group("dash"))))
    return tuple(cites)


def _locator(suffix: str | None) -> str | None:
    """The locator of a citation's suffix ("p. 33", "chap. 2"), None for a mere comment."""
    text = " ".join((suffix or "").split()).lstrip(", ").strip()
    if text.startswith("{") and "}" in text:
        text = text[1 : text.index("}")].strip()  # a locator in braces is taken as written
        return text or None
    return text if text and _LOCATOR_RE.match(text) else None


# --- the bibliography ---------------------------------------------------------------


def bibliography_fields(text: str) -> tuple[list[str], bool]:
    """Paths in the front matter's ``bibliography:`` field and whether ``references:`` is there.

    Only the forms a writer types are read: a scalar, a flow list ``[a.bib, b.json]`` and a
    block list of ``- a.bib`` lines, quoted or not.
    """
    lines = text.split("\n")
    if not lines or lines[0].strip() != "---":
        return [], False
    end = next((i for i in range(1, len(lines)) if lines[i].strip() in {"---", "..."}), None)
    if end is None:
        return [], False
    paths: list[str] = []
    inline = False
    for index in range(1, end):
        line = lines[index]
        if re.match(r"references\s*:", line):
            inline = True
        match = re.match(r"bibliography\s*:\s*(.*?)\s*$", line)
        if match is None:
            continue
        value = match.group(1)
        if value.startswith("["):
            paths.extend(_unquote(v) for v in value.strip("[]").split(","))
        elif value and not value.startswith("#"):
            paths.append(_unquote(value))
        else:
            for item in lines[index + 1 : end]:
                entry = re.match(r"\s+-\s+(.*?)\s*$", item)
                if entry is None:
                    break
                paths.append(_unquote(entry.group(1)))
    return [p for p in paths if p], inline


def _unquote(value: str) -> str:
    value = re.sub(r"\s+#.*$", "", value.strip())
    if len(value) >= 2 and value[0] == value[-1] and value[0] in "'\"":
        value = value[1:-1]
    return value.strip()


def draft_bibliography(
    text: str, display: str, bibliography: Path | None = None, base_dir: Path | None = None
) -> DraftBibliography:
    """Load the bibliography the draft cites: ``bibliography`` (``--bib``) or the front matter's.

    ``--bib`` wins over the front matter, as Pandoc's own command line does. Front-matter
    paths are relative to ``base_dir``, the draft's folder; in Problems they are shown
    beside the draft's ``display`` name. Several files are merged, the first of a key winning.
    """
    fields, inline = bibliography_fields(text)
    result = DraftBibliography()
    if bibliography is not None:
        files = [(Path(bibliography), str(bibliography))]
    else:
        files = [(_resolve(p, base_dir), _shown(p, display)) for p in fields]
    if inline and not files:
        result.problems.append(
            Problem(
                display,
                "references written in the front matter ('references:') are not read; put them in a bibliography file",
            )
        )
    seen: dict[str, str] = {}
    for path, shown in files:
        result.named = True
        if bibliography is None and not inside_folder(path, base_dir if base_dir is not None else Path.cwd()):
            result.problems.append(Problem(shown, f"named by the front matter's 'bibliography:': {OUTSIDE_FOLDER}"))
            continue
        references, problems = load_bibliography(path, shown)
        result.problems.extend(problems)
        for reference in references:
            if reference.key in seen:
                result.problems.append(
                    Problem(
                        shown,
                        f"duplicate key '{reference.key}' in {seen[reference.key]} and {shown}; the first is used",
                    )
                )
                continue
            seen[reference.key] = shown
            result.references.append(reference)
    return result


def _resolve(value: str, base_dir: Path | None) -> Path:
    path = Path(value).expanduser()
    return path if path.is_absolute() or base_dir is None else base_dir / path


def _shown(value: str, display: str) -> str:
    if PurePath(value).is_absolute():
        return value
    return str(PurePath(display).parent / value)


# --- claims ----------------------------------------------------------------------------


def extract_keyed_claims(blocks: Iterable[Block], resolver: Resolver, keys: set[str], first_id: int = 1) -> list[Claim]:
    """Claims of ``blocks`` with key citations and ordinary markers, numbered from ``first_id``.

    Like :func:`sourcecheck.claims.extract.extract_claims`, whose sentence and marker work
    it reuses; a key citation resolves when its key is in ``keys``. An ordinary marker
    that overlaps a key citation ("[@a, 33]" holds "[33]"-like text) is part of it.
    """
    keyed_by_block: dict[int, list[KeyMarker]] = {}

    def citations_of(block: Block, sentence: Sentence) -> tuple[Citation, ...]:
        keyed = keyed_by_block.setdefault(id(block), find_key_citations(block.text))
        mine = [k for k in keyed if sentence.start <= k.start < sentence.end]
        others = [m for m in sentence.markers if not any(m.start < k.end and k.start < m.end for k in keyed)]
        return _citations(sorted([*mine, *others], key=lambda m: m.start), resolver, keys)

    return extract_claims(list(blocks), resolver, first_id, citations_of)


def _citations(markers: Sequence[Marker | KeyMarker], resolver: Resolver, keys: set[str]) -> tuple[Citation, ...]:
    """One Citation per cited work: a Pandoc key stands for itself when the bibliography has it."""

    def key_of(cite: Any) -> str | None:
        return (cite.key if cite.key in keys else None) if isinstance(cite, KeyCite) else resolver.resolve(cite)

    return citations_from(markers, key_of)
