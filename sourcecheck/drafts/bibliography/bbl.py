"""Compiled bibliographies (.bbl): what BibTeX or biber wrote for a LaTeX draft.

A LaTeX draft sent without its .bib often still has its .bbl. Two shapes exist:
``\\bibitem[label]{key} text`` from BibTeX styles (plain, natbib's author-year ones), where
the entry is already typeset and is read back block by block, and biber's
``\\entry{key}{type}{}`` ... ``\\endentry`` records, whose fields are named. Best effort:
what cannot be read leaves a field empty, never the entry out.
"""

from __future__ import annotations

import re

from sourcecheck.drafts.bibliography.entry_rules import parse_authors
from sourcecheck.drafts.bibliography.latex_markup import latex_to_text
from sourcecheck.drafts.bibliography.record import Person, make_reference, normalise_doi, year_of
from sourcecheck.drafts.bibliography.reflist import parse_entry
from sourcecheck.model import Problem, Reference
from sourcecheck.text import PARTICLES, family_key

_BIBITEM_RE = re.compile(r"\\bibitem\s*")
_END_RE = re.compile(r"\\end\s*\{thebibliography\}")
_ENTRY_RE = re.compile(r"\\entry\s*\{([^{}]*)\}\s*\{([^{}]*)\}")
_ENDENTRY_RE = re.compile(r"\\endentry\b")
_NATEXLAB_RE = re.compile(r"\{?\\natexlab\s*\{([^{}]*)\}\}?")
_NAME_SEP_RE = re.compile(r"\s*,?\s+and\s+|\s*,\s*|\s*&\s*")
_DOI_VERB_RE = re.compile(r"\\verb\s*\{doi\}\s*\\verb\s+(\S+)\s*\\endverb")
_URL_VERB_RE = re.compile(r"\\verb\s*\{url\}\s*\\verb\s+(\S+)\s*\\endverb")
_CONTAINER_FIELDS = ("journaltitle", "journal", "booktitle", "maintitle", "series", "publisher", "institution")


def parse_bbl(text: str, display: str) -> tuple[list[Reference], list[Problem]]:
    """References of a .bbl file, biber's ``\\entry`` form or BibTeX's ``\\bibitem`` form."""
    if _ENTRY_RE.search(text):
        references, problems = _biblatex(text, display)
    else:
        references, problems = _bibitems(text, display)
    if not references and not problems:
        problems.append(Problem(display, "no \\bibitem or \\entry found; not a compiled bibliography"))
    return references, problems


def group_at(text: str, pos: int) -> tuple[str, int] | None:
    """The content of the brace group opening at ``text[pos]`` and the index past it."""
    if pos >= len(text) or text[pos] != "{":
        return None
    depth = 0
    for index in range(pos, len(text)):
        if text[index] == "{":
            depth += 1
        elif text[index] == "}":
            depth -= 1
            if depth == 0:
                return text[pos + 1 : index], index + 1
    return None


def _line(text: str, pos: int) -> int:
    return text.count("\n", 0, pos) + 1


# --- BibTeX styles: \bibitem[label]{key} typeset text ---------------------------------


def _bibitems(text: str, display: str) -> tuple[list[Reference], list[Problem]]:
    references: list[Reference] = []
    problems: list[Problem] = []
    items = list(_BIBITEM_RE.finditer(text))
    if not items:
        return references, problems
    starts = [m.end() for m in items]
    last_end = _END_RE.search(text, starts[-1])
    ends = [m.start() for m in items[1:]] + [last_end.start() if last_end else len(text)]
    for start, end in zip(starts, ends, strict=True):
        line = _line(text, start)
        label = ""
        pos = start
        if text.startswith("[", pos):
            close = _bracket_end(text, pos)
            label, pos = text[pos + 1 : close], close + 1
        pos = len(text) - len(text[pos:].lstrip())
        key_group = group_at(text, pos)
        if key_group is None or not key_group[0].strip():
            problems.append(Problem(display, f"\\bibitem at line {line} has no key; skipped"))
            continue
        key, pos = key_group[0].strip(), key_group[1]
        references.append(_typeset_entry(key, label, text[pos:end], line))
    return references, problems


def _bracket_end(text: str, pos: int) -> int:
    """Index of the "]" closing the optional argument at ``pos`` (braces may hide "]")."""
    depth = 0
    for index in range(pos + 1, len(text)):
        char = text[index]
        if char == "{":
            depth += 1
        elif char == "}":
            depth -= 1
        elif char == "]" and depth <= 0:
            return index
    return len(text) - 1


def _typeset_entry(key: str, label: str, body: str, line: int) -> Reference:
    """Read a typeset entry by its ``\\newblock`` parts: names, title, then the rest."""
    body = _NATEXLAB_RE.sub(r"\1", body)
    blocks = [latex_to_text(b) for b in re.split(r"\\newblock\b", body)]
    blocks = [b for b in blocks if b]
    full = " ".join(blocks)
    doi = normalise_doi(full)
    label_text = latex_to_text(_NATEXLAB_RE.sub(r"\1", label))
    label_families, label_year, et_al = _natbib_label(label_text)
    container: str | None
    title: str | None
    if len(blocks) >= 2:
        people = _names_of_block(blocks[0])
        if label_families and [family_key(p.family) for p in people] != [family_key(f) for f in label_families]:
            people = [Person(f) for f in label_families]  # the label's names are the surer
        title = blocks[1].rstrip(".").strip()
        rest = " ".join(blocks[2:])
        container = re.sub(r"^In\s+", "", rest.split(", ", 1)[0]).rstrip(".") or None
        years = [year_of(m) for m in re.findall(r"(?<!\d)(?:1[5-9]|20)\d{2}(?!\d)", rest or full)]
        year = label_year or (years[-1] if years else None)
    else:
        parsed = parse_entry(full)
        people = [Person(f) for f in (label_families or parsed.authors)]
        title, container, year = parsed.title, None, label_year or parsed.year
    if container and (container == doi or "doi.org" in container):
        container = None
    return make_reference(
        key, people, et_al=et_al and len(people) <= 1, year=year, title=title, container=container, doi=doi, line=line
    )


def _natbib_label(label: str) -> tuple[list[str], int | None, bool]:
    """Family names and year of a natbib label "Okafor et al.(2019)Okafor, Lin, and Brandt"."""
    match = re.match(r"^(?P<short>[^()]*)\((?P<year>[^()]*)\)(?P<long>.*)$", label)
    if match is None:
        return [], None, False
    names = match.group("long").strip() or match.group("short").strip()
    et_al = not match.group("long").strip() and "et al" in names
    names = re.sub(r"\s*et\s+al\.?", "", names)
    families = [n.strip() for n in _NAME_SEP_RE.split(names) if n.strip()]
    return families, year_of(match.group("year")), et_al


def _names_of_block(block: str) -> list[Person]:
    """People of a typeset name block: "A. B. Okafor, C. Lin, and J. van der Berg." or "Okafor, A."."""
    block = block.rstrip(".").strip()
    tokens = [t for t in _NAME_SEP_RE.split(block) if t]
    if len(tokens) > 1 and re.fullmatch(r"(?:[A-Z]\.\s?)+(?:-[A-Z]\.)?", tokens[1].strip()):
        return [Person(f) for f in parse_authors(block)]  # "Family, I." lists
    people = []
    for token in tokens:
        words = re.sub(r"\s*et\s+al\.?", "", token).split()
        if not words:
            continue
        first = len(words) - 1
        while first > 0 and words[first - 1].lower() in PARTICLES:
            first -= 1
        people.append(Person(" ".join(words[first:]), " ".join(words[:first])))
    return people


# --- biber: \entry{key}{type}{} ... \endentry ----------------------------------------


def _biblatex(text: str, display: str) -> tuple[list[Reference], list[Problem]]:
    references: list[Reference] = []
    problems: list[Problem] = []
    for match in _ENTRY_RE.finditer(text):
        line = _line(text, match.start())
        end_match = _ENDENTRY_RE.search(text, match.end())
        following = _ENTRY_RE.search(text, match.end())
        if end_match is None or (following and following.start() < end_match.start()):
            problems.append(Problem(display, f"\\entry at line {line} has no \\endentry; read to the next entry"))
        stops = [e.start() for e in (end_match, following) if e is not None]
        stop = min(stops) if stops else len(text)
        body = text[match.end() : stop]
        key = match.group(1).strip()
        if not key:
            problems.append(Problem(display, f"\\entry at line {line} has no key; skipped"))
            continue
        references.append(_biber_entry(key, body, line))
    return references, problems


def _biber_entry(key: str, body: str, line: int) -> Reference:
    fields = _fields(body)
    people, et_al = _biber_names(body, "author")
    if not people:
        people, et_al = _biber_names(body, "editor")
    title = latex_to_text(fields.get("title", ""))
    if subtitle := latex_to_text(fields.get("subtitle", "")):
        title = f"{title}: {subtitle}" if title else subtitle
    container = next((latex_to_text(fields[f]) for f in _CONTAINER_FIELDS if fields.get(f)), None)
    if container is None and (publisher := _first_list_item(body, "publisher")):
        container = publisher
    doi_verb = _DOI_VERB_RE.search(body)
    url_verb = _URL_VERB_RE.search(body)
    url = url_verb.group(1) if url_verb and "doi.org" in url_verb.group(1).lower() else ""
    doi = normalise_doi(doi_verb.group(1) if doi_verb else "", fields.get("doi"), url)
    year = year_of(fields.get("year")) or year_of(fields.get("labelyear")) or year_of(fields.get("date"))
    return make_reference(
        key, people, et_al=et_al, year=year, title=title or None, container=container, doi=doi, line=line
    )


def _fields(body: str) -> dict[str, str]:
    """``\\field{name}{value}`` pairs of one entry; the first of a repeated name wins."""
    fields: dict[str, str] = {}
    for match in re.finditer(r"\\field\s*\{([^{}]+)\}\s*", body):
        value = group_at(body, match.end())
        if value is not None:
            fields.setdefault(match.group(1).strip().lower(), value[0])
    return fields


def _first_list_item(body: str, name: str) -> str | None:
    """The first item of ``\\list{name}{n}{{item}...}``, as text."""
    match = re.search(r"\\list\s*\{" + name + r"\}\s*\{\d+\}\s*", body)
    outer = group_at(body, match.end()) if match else None
    if outer is None:
        return None
    item = group_at(outer[0], _skip_blank(outer[0], 0))
    return latex_to_text(item[0]) if item else None


def _biber_names(body: str, role: str) -> tuple[list[Person], bool]:
    """People of ``\\name{role}{n}{options}{...}``, in "family={X}, given={Y}" or positional form.

    biber marks a list cut short with ``\\true{morenames}``, which is "et al.".
    """
    match = re.search(r"\\name\s*\{" + role + r"\}\s*\{\d+\}\s*", body)
    if match is None:
        return [], False
    pos = match.end()
    options = group_at(body, pos)  # the per-list options group, often empty
    if options is None:
        return [], False
    names = group_at(body, _skip_blank(body, options[1]))
    if names is None:
        return [], False
    people = []
    for group in _top_groups(names[0]):
        person = _biber_person(group)
        if person is not None:
            people.append(person)
    more = re.search(r"\\true\s*\{more" + role + r"\}|\\true\s*\{morenames\}", body) is not None
    return people, more


def _biber_person(group: str) -> Person | None:
    """One name: ``{{hash=..}{family={X}, given={Y}, prefix={van}}}`` or ``{{}{X}{X.}{Y}{Y.}{van}...}``."""
    parts = list(_top_groups(group))
    named: dict[str, str] = {}
    for part in parts:
        for match in re.finditer(r"(?<![a-z])(family|given|prefix|suffix)\s*=\s*", part):
            value = group_at(part, match.end())
            if value is not None:
                named.setdefault(match.group(1), latex_to_text(value[0]))
    if named.get("family"):
        family = " ".join(p for p in (named.get("prefix", ""), named["family"]) if p)
        return Person(family, named.get("given", ""))
    # Older biblatex with the bibtex backend: {hash}{family}{familyi}{given}{giveni}{prefix}{prefixi}...
    if len(parts) >= 2 and parts[1].strip():
        prefix = latex_to_text(parts[5]) if len(parts) > 5 else ""
        given = latex_to_text(parts[3]) if len(parts) > 3 else ""
        return Person(" ".join(p for p in (prefix, latex_to_text(parts[1])) if p), given)
    return None


def _skip_blank(text: str, pos: int) -> int:
    """Index of the first character at or after ``pos`` that is not blank or a %-comment."""
    while pos < len(text):
        if text[pos].isspace():
            pos += 1
        elif text[pos] == "%":
            newline = text.find("\n", pos)
            pos = len(text) if newline < 0 else newline + 1
        else:
            break
    return pos


def _top_groups(text: str) -> list[str]:
    """The contents of the top-level brace groups in ``text``, in order."""
    groups = []
    pos = 0
    while (start := text.find("{", pos)) >= 0:
        found = group_at(text, start)
        if found is None:
            break
        groups.append(found[0])
        pos = found[1]
    return groups
