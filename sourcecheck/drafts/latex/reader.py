"""The reader for LaTeX drafts: claims from citation commands, entries from the bibliography.

A LaTeX draft says exactly which work each sentence cites (``\\citep{okafor2019}``), so
unlike a Markdown draft nothing has to be guessed from "(Okafor, 2019)": a key is either
in the bibliography or it is not. The document is read as text and never run; the source
assembly (comments, ``\\input``) and the macro-to-text step live in ``latex_source`` and
``latex_text``; this module ties them to the bibliography and the sentence splitter.
"""

from __future__ import annotations

import re
from collections.abc import Iterable
from dataclasses import dataclass, replace
from pathlib import Path, PurePosixPath
from typing import TYPE_CHECKING

from sourcecheck.claims import bound_citations, reading_lengths
from sourcecheck.drafts.bibliography import OUTSIDE_FOLDER, inside_folder, load_bibliography, parse_bbl
from sourcecheck.drafts.latex.source import Place, Source, load_source
from sourcecheck.drafts.latex.text import body_blocks
from sourcecheck.drafts.latex.writer import CiteSpan, TextBlock
from sourcecheck.limits import Limits
from sourcecheck.model import Citation, Claim, Draft, Problem, Reference
from sourcecheck.text import wrapped_sentence_spans

if TYPE_CHECKING:
    from sourcecheck.model import ReadOptions

__all__ = ["block_claims", "read_latex"]

_BEGIN_DOCUMENT_RE = re.compile(r"\\begin\s*\{document\}")
_END_DOCUMENT_RE = re.compile(r"\\end\s*\{document\}")
_BIBLIOGRAPHY_RE = re.compile(r"\\(bibliography|addbibresource)\s*(?:\[[^\]]*\]\s*)?\{([^{}]*)\}")
_THEBIBLIOGRAPHY_RE = re.compile(r"\\begin\s*\{thebibliography\}.*?(?:\\end\s*\{thebibliography\}|\Z)", re.DOTALL)


def read_latex(path: Path, display: str, options: ReadOptions) -> Draft:
    """Claims, reference entries and problems of the LaTeX draft at ``path``.

    Raises DraftUnreadable only when the draft itself cannot be opened; everything else
    (an included file missing, a .bib missing, unbalanced braces) is a problem.
    """
    source, problems = load_source(path, display)
    if not source.text.strip():
        return Draft(display, [], [], [*problems, Problem(display, "the draft is empty")])
    begin = _BEGIN_DOCUMENT_RE.search(source.text)
    start = begin.end() if begin else 0  # a fragment without \begin{document} is all body
    finish = _END_DOCUMENT_RE.search(source.text, start)
    end = finish.start() if finish else len(source.text)
    references, found = _bibliography(path, display, options, source, start, end)
    problems += found
    blocks, found = body_blocks(source, start, end, display, options.limits.nesting_depth)
    problems += found
    blocks, found = _bounded(blocks, source.places, options.limits, display)
    problems += found
    claims, found = bound_citations(
        block_claims(blocks, source.places, _KeyLookup(references)), options.limits, display
    )
    problems += found
    if not claims:
        problems.append(Problem(display, "no citation commands found in the text"))
    return Draft(display, claims, references, problems)


# --- claims ----------------------------------------------------------------------------


def _bounded(
    blocks: list[TextBlock], places: list[Place], limits: Limits, display: str
) -> tuple[list[TextBlock], list[Problem]]:
    """Blocks cut to the limits on characters and sentences, each cut named in one line."""

    def where(index: int) -> tuple[str, str]:
        block = blocks[index]
        place = places[block.origins[0]] if block.origins else Place(None, 1)
        return place.file or display, f"line {place.line}"

    lengths, problems = reading_lengths([b.text for b in blocks], limits, display, where)
    kept = []
    for block, n in zip(blocks, lengths, strict=True):
        if n == len(block.text):
            kept.append(block)
        elif n:
            cites = tuple(c for c in block.cites if c.end <= n)
            kept.append(TextBlock(block.text[:n], block.origins[:n], cites))
    return kept, problems


class _KeyLookup:
    """Citation key -> reference key: exact first, then ignoring case if that is unambiguous.

    BibTeX matches keys without regard to case (it only warns), biber with; accepting a
    case-only difference when one entry fits loses nothing.
    """

    def __init__(self, references: Iterable[Reference]) -> None:
        self._exact = {r.key for r in references}
        folded: dict[str, list[str]] = {}
        for key in self._exact:
            folded.setdefault(key.casefold(), []).append(key)
        self._folded = {k: v[0] for k, v in folded.items() if len(v) == 1}

    def __call__(self, key: str) -> str | None:
        if key in self._exact:
            return key
        return self._folded.get(key.casefold())


@dataclass
class _Sentence:
    start: int
    end: int
    cites: list[CiteSpan]


def block_claims(blocks: Iterable[TextBlock], places: list[Place], lookup: _KeyLookup) -> list[Claim]:
    """Claims of ``blocks`` in order, numbered "c1", "c2", ...; each names its file and line."""
    claims: list[Claim] = []
    for block in blocks:
        if not block.cites:
            continue
        for sentence in _sentences(block):
            citations = _citations(sentence.cites, lookup)
            if not citations:
                continue
            place = places[block.origins[sentence.start]]
            claims.append(
                Claim(
                    id=f"c{len(claims) + 1}",
                    text=block.text[sentence.start : sentence.end],
                    line=place.line,
                    citations=citations,
                    file=place.file,
                )
            )
    return claims


def _sentences(block: TextBlock) -> list[_Sentence]:
    """Sentences of a block with their citations.

    A sentence break inside a marker ("[see smith.2019]") is undone, and a marker set
    straight after a full stop with no space ("grew.\\footcite{k} Next") is given to the
    sentence before, which is the one it annotates.
    """
    sentences = [_Sentence(s, e, []) for s, e in wrapped_sentence_spans(block.text)]
    for cite in block.cites:
        for index, sentence in enumerate(sentences[:-1]):
            if cite.start < sentence.end < cite.end:
                following = sentences.pop(index + 1)
                sentence.end = following.end
                break
    for cite in block.cites:
        owner = next((i for i, s in enumerate(sentences) if s.start <= cite.start < s.end), None)
        if owner is None:
            continue
        index = owner
        sentence = sentences[index]
        # Only a marker set close against the stop moves: "\citet{k} found" after ". " opens its sentence.
        attached = index > 0 and cite.start == sentence.start == sentences[index - 1].end
        if attached and block.text[: cite.start].endswith((".", "!", "?")):
            previous = sentences[index - 1]
            previous.end = max(previous.end, cite.end)
            rest = block.text[cite.end : sentence.end]
            sentence.start = cite.end + (len(rest) - len(rest.lstrip()))
            sentence = previous
        sentence.cites.append(cite)
    return [s for s in sentences if s.end > s.start]


def _citations(cites: Iterable[CiteSpan], lookup: _KeyLookup) -> tuple[Citation, ...]:
    """One Citation per cited work; the same work twice in a sentence counts once."""
    seen: set[str] = set()
    citations: list[Citation] = []
    for cite in cites:
        for label, locator in cite.works:
            if label in seen:
                continue
            seen.add(label)
            citations.append(Citation(cite.marker, label, lookup(label), locator))
    return tuple(citations)


# --- bibliography ----------------------------------------------------------------------


def _bibliography(
    path: Path, display: str, options: ReadOptions, source: Source, start: int, end: int
) -> tuple[list[Reference], list[Problem]]:
    """The reference entries, from the first of: --bib, the named .bib files, a .bbl beside
    the draft, a thebibliography environment in the text."""
    if options.bibliography is not None:
        return load_bibliography(Path(options.bibliography), str(options.bibliography))
    problems: list[Problem] = []
    named = [(m, source.place(m.start())) for m in _BIBLIOGRAPHY_RE.finditer(source.text)]
    references: list[Reference] = []
    loaded = False
    for match, place in named:
        command = match.group(1)
        for name in (n.strip() for n in match.group(2).split(",")):
            if not name:
                continue
            # BibTeX always adds ".bib"; biblatex wants the suffix written but we forgive its absence.
            suffixed = name.endswith(".bib") if command == "bibliography" else bool(PurePosixPath(name).suffix)
            name = name if suffixed else f"{name}.bib"
            bib = path.parent / name
            shown = str(PurePosixPath(PurePosixPath(display).parent, name))
            if not inside_folder(bib, path.parent):
                where = place.file or display
                problems.append(Problem(shown, f"named by \\{command} in {where}, line {place.line}: {OUTSIDE_FOLDER}"))
                continue
            if not bib.is_file():
                where = place.file or display
                problems.append(Problem(shown, f"no such file (named by \\{command} in {where}, line {place.line})"))
                continue
            entries, found = load_bibliography(bib, shown)
            problems += found
            references += _new_keys(references, entries, shown, problems)
            loaded = True
    if loaded:
        return references, problems
    bbl = path.with_suffix(".bbl")
    if bbl.is_file():
        shown = str(PurePosixPath(display).with_suffix(".bbl"))
        entries, found = load_bibliography(bbl, shown)
        if named:
            found = [Problem(shown, "read instead of the missing .bib"), *found]
        return entries, problems + found
    inline = _THEBIBLIOGRAPHY_RE.search(source.text, start, end)
    if inline is not None:
        entries, found = parse_bbl(inline.group(0), display)
        place = source.place(inline.start())
        shift = place.line - 1
        return [replace(r, line=r.line + shift) if r.line else r for r in entries], problems + found
    if not named:
        problems.append(
            Problem(
                display,
                "no bibliography found (no --bib, \\bibliography, \\addbibresource, "
                f"{PurePosixPath(display).with_suffix('.bbl').name} or thebibliography environment)",
            )
        )
    return [], problems


def _new_keys(have: list[Reference], entries: list[Reference], shown: str, problems: list[Problem]) -> list[Reference]:
    """Entries of a further .bib whose keys are not taken yet; BibTeX too keeps the first."""
    taken = {r.key for r in have}
    fresh = []
    for entry in entries:
        if entry.key in taken:
            problems.append(Problem(shown, f"entry '{entry.key}' is already in an earlier bibliography; skipped"))
        else:
            fresh.append(entry)
            taken.add(entry.key)
    return fresh
