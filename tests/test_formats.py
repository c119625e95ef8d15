"""The demo draft in every input format gives the same report as the Markdown original.

``scripts/make_sample_drafts.py`` writes the demo of ``sample_manuscript/draft.md`` as a
Word document, Pandoc Markdown with a .bib, LaTeX with the same .bib, and a reviewer's
PDF (running header, page footer, numbered lines). The readers
differ; what they hand the rest of the pipeline must not: the same claims in the same
order, the same bands, the same source files. The real pipeline runs once per format,
all formats sharing one cache so the PDFs are read and embedded once.

The files are also checked against what their formats' own documents say a writer may
put in them (Pandoc's citation syntax, BibTeX's entry types and fields, WordprocessingML
numbering, the PDF's text and fonts as pypdf and pdfminer.six read them), so a passing
run is not two of our own mistakes agreeing.
"""

from __future__ import annotations

import importlib.util
import io
import re
import sys
import zipfile
from pathlib import Path
from types import ModuleType

import bibtexparser
import docx
import pytest
from pdfminer.high_level import extract_pages
from pdfminer.layout import LTChar, LTComponent
from pypdf import PdfReader

import sourcecheck
from sourcecheck.model import Claim, Report

ROOT = Path(__file__).resolve().parent.parent
MANUSCRIPT = ROOT / "sample_manuscript"
SOURCES = ROOT / "sample_sources"
SCRIPT = ROOT / "scripts" / "make_sample_drafts.py"

#: Format name -> the demo's file in that format.
VERSIONS = {
    "markdown": MANUSCRIPT / "draft.md",
    "pandoc": MANUSCRIPT / "draft-pandoc.md",
    "word": MANUSCRIPT / "draft.docx",
    "latex": MANUSCRIPT / "draft.tex",
    "pdf": MANUSCRIPT / "draft.pdf",
}
BIB = MANUSCRIPT / "refs.bib"
UNRESOLVED_KEY = "dunes2016"

#: Problems every version may report. The demo is clean: none.
EXPECTED_PROBLEMS: set[tuple[str, str]] = set()


def _load_script() -> ModuleType:
    spec = importlib.util.spec_from_file_location("make_sample_drafts", SCRIPT)
    assert spec is not None and spec.loader is not None
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module  # dataclasses look their module up by name
    spec.loader.exec_module(module)
    return module


script = _load_script()


# --- one run per format ---------------------------------------------------------------


@pytest.fixture(scope="module")
def reports(tmp_path_factory: pytest.TempPathFactory) -> dict[str, Report]:
    """Reports by format, each made on first use; one cache for all, so PDFs embed once."""
    cache = tmp_path_factory.mktemp("formats-cache")

    class Lazy(dict[str, Report]):
        def __missing__(self, name: str) -> Report:
            # No --bib: the Pandoc version names refs.bib in its front matter, the LaTeX
            # version in \bibliography{refs}; those are the paths under test.
            report = sourcecheck.check(VERSIONS[name], SOURCES, cache=cache)
            self[name] = report
            return report

    return Lazy()


def _bare(claim: Claim) -> str:
    """The claim sentence without its markers, white space collapsed, no space before stops."""
    text = claim.text
    for marker in {c.marker for c in claim.citations}:
        text = text.replace(marker, " ")
    return re.sub(r"\s+([.,;:])", r"\1", " ".join(text.split()))


def _expected_claims() -> list[tuple[str, int]]:
    """(sentence, works cited) for every marker of the script's copy of the draft.

    A marker closes the sentence it follows; that sentence starts after the last full
    stop followed by a space and a capital (the demo has no abbreviations to trip on).
    """
    expected = []
    for _, paragraphs in script.SECTIONS:
        for paragraph in paragraphs:
            before = ""
            for part in paragraph:
                if isinstance(part, str):
                    before += part
                else:
                    sentence = re.split(r"(?<=\.) (?=[A-Z])", before)[-1].strip()
                    expected.append((f"{sentence}.", len(part.numbers)))
    return expected


def _rows(report: Report) -> list[tuple[str, list[tuple[str, str | None]]]]:
    """Per claim: bare text, and per check (band, matched source file)."""
    return [(_bare(r.claim), [(c.band.value, c.source) for c in r.checks]) for r in report.claims]


@pytest.mark.parametrize("name", list(VERSIONS))
def test_every_format_gives_the_markdown_report(reports: dict[str, Report], name: str) -> None:
    original, version = reports["markdown"], reports[name]
    # The claims are the cited sentences of the script's copy, each with one check per work.
    assert [(_bare(r.claim), len(r.checks)) for r in version.claims] == _expected_claims()

    assert len(version.claims) == len(original.claims)
    for mine, theirs in zip(_rows(version), _rows(original), strict=True):
        assert mine == theirs
    # The one planted reference without a PDF is said once, naming the closest file and why
    # it was refused (sources/_match.py); nothing else is a problem in any format.
    unmatched = [p for p in version.problems if "matched no source file" in p.message]
    assert len(unmatched) == 1 and "nest-aggregations-corrish-2019.pdf" in unmatched[0].message
    rest = {(p.file, p.message) for p in version.problems if p not in unmatched}
    assert rest <= EXPECTED_PROBLEMS, version.problems
    assert [Path(p).name for p in version.unused_sources] == [Path(p).name for p in original.unused_sources]
    assert [r.title for r in version.uncited_references()] == [r.title for r in original.uncited_references()]
    assert [r.title for r in version.unmatched_references()] == [r.title for r in original.unmatched_references()]
    # The one unresolved citation stays unresolved in every format.
    unresolved = [c for r in version.claims for c in r.checks if c.citation.key is None]
    assert [c.band.value for c in unresolved] == ["unverifiable"]
    assert [r.code for r in unresolved[0].reasons] == ["marker-unresolved"]


# --- the generator ----------------------------------------------------------------------


def test_structured_copy_renders_draft_md_exactly() -> None:
    assert script.render_markdown() == VERSIONS["markdown"].read_text(encoding="utf-8")


def _members(data: bytes) -> dict[str, bytes]:
    with zipfile.ZipFile(io.BytesIO(data)) as package:
        return {info.filename: package.read(info) for info in package.infolist()}


def _pdf_pages(path: Path) -> list[tuple[str, bytes]]:
    """Per page, pypdf's text and the decompressed content stream."""
    reader = PdfReader(path)
    return [(page.extract_text(), page.get_contents().get_data()) for page in reader.pages]


def _pdf_prose(path: Path) -> str:
    """The PDF's text as pypdf reads it, one string: header, footer and margin numbers out.

    Done here with the layout the generator is known to use, not with the reader under
    test: a line is "<number> <text>", the header and "Page n of N" lines stand alone.
    """
    lines = []
    for page in PdfReader(path).pages:
        for line in page.extract_text().splitlines():
            if line == script.RUNNING_HEADER or re.fullmatch(r"Page \d+ of \d+", line):
                continue
            lines.append(re.sub(r"^\d+ ?", "", line, count=1))
    return " ".join(lines)


def test_committed_versions_are_up_to_date(tmp_path: Path) -> None:
    written = script.write_all(tmp_path)
    assert sorted(p.name for p in written) == sorted(script.OUTPUTS)
    for path in written:
        committed = MANUSCRIPT / path.name
        if path.suffix == ".docx":
            # Parts, not raw bytes: another zlib may compress the same part differently.
            assert _members(path.read_bytes()) == _members(committed.read_bytes()), path.name
        elif path.suffix == ".pdf":
            # Decompressed page contents, for the same reason: what is drawn where, in which font.
            assert _pdf_pages(path) == _pdf_pages(committed), f"{path.name}: run scripts/make_sample_drafts.py"
        else:
            assert path.read_bytes() == committed.read_bytes(), f"{path.name}: run scripts/make_sample_drafts.py"


def test_generator_is_deterministic() -> None:
    assert script.rendered() == script.rendered()


def test_sentences_are_the_same_characters_in_every_version() -> None:
    # Each prose stretch between two markers occurs verbatim in every text version
    # (LaTeX with its "%" escaped), in the Word document's paragraphs and in the PDF's
    # lines put back together (the PDF breaks lines at spaces only).
    word = "\n".join(p.text for p in docx.Document(str(VERSIONS["word"])).paragraphs)
    texts = {
        "markdown": VERSIONS["markdown"].read_text(encoding="utf-8"),
        "pandoc": VERSIONS["pandoc"].read_text(encoding="utf-8"),
        "latex": VERSIONS["latex"].read_text(encoding="utf-8").replace(r"\%", "%"),
        "word": word,
        "pdf": _pdf_prose(VERSIONS["pdf"]),
    }
    stretches = [
        part.strip()
        for _, paragraphs in script.SECTIONS
        for paragraph in paragraphs
        for part in paragraph
        if isinstance(part, str) and part.strip(" .")
    ]
    assert len(stretches) >= len(_expected_claims())
    for name, text in texts.items():
        missing = [s for s in stretches if s not in text]
        assert missing == [], name


# --- outside checks: the formats' own rules -----------------------------------------------

# Pandoc User's Guide, "Citations" (from memory): a bracketed citation is "[" then items
# separated by ";", each an optional prefix, optional "-", "@key", optional locator, then
# "]". A key starts with a letter, digit or "_" and may hold alphanumerics, "_" and
# internal punctuation from ":.#$%&-+?<>~/".
_PANDOC_KEY = r"[A-Za-z0-9_](?:[A-Za-z0-9_]|[:.#$%&\-+?<>~/](?=[A-Za-z0-9_]))*"
_PANDOC_BRACKET = re.compile(r"\[-?@" + _PANDOC_KEY + r"(?:; -?@" + _PANDOC_KEY + r")*\]")


def _bib_entries() -> list[dict[str, str]]:
    # bibtexparser (a reference library, not our reader) parses the file.
    return bibtexparser.loads(BIB.read_text(encoding="utf-8")).entries


def test_pandoc_version_uses_pandoc_citation_syntax_only() -> None:
    text = VERSIONS["pandoc"].read_text(encoding="utf-8")
    brackets = re.findall(r"\[[^\]]*\]", text)
    assert brackets, "no citations"
    assert all(_PANDOC_BRACKET.fullmatch(b) for b in brackets), brackets
    # Pandoc User's Guide, "Specifying bibliographic data" (from memory): the YAML
    # metadata block opens the file with "---" and names the file in "bibliography".
    front = text.split("\n---\n", 1)[0].splitlines()
    assert front[0] == "---" and "bibliography: refs.bib" in front
    keys = {k for b in brackets for k in re.findall(r"@(" + _PANDOC_KEY + ")", b)}
    assert keys - {e["ID"] for e in _bib_entries()} == {UNRESOLVED_KEY}


def test_latex_version_cites_by_key_lists() -> None:
    # Lamport, "LaTeX: A Document Preparation System", \cite and \bibliography (from
    # memory): \cite{k1,k2} takes a comma-separated key list; \bibliography names the .bib
    # file without its extension.
    text = VERSIONS["latex"].read_text(encoding="utf-8")
    lists = re.findall(r"\\cite\{([^}]*)\}", text)
    # One \cite per numbered marker of the Markdown draft ("[1]", "[2, 5]", "[3–4]").
    body = VERSIONS["markdown"].read_text(encoding="utf-8").split("## References")[0]
    markers = re.findall(r"\[\d[\d,\s–-]*\]", body)
    assert len(lists) == len(markers) and all(re.fullmatch(r"[a-z0-9]+(?:,[a-z0-9]+)*", k) for k in lists)
    assert re.findall(r"\\bibliography\{([^}]*)\}", text) == ["refs"]
    keys = {k for group in lists for k in group.split(",")}
    assert keys - {e["ID"] for e in _bib_entries()} == {UNRESOLVED_KEY}
    # Outside \cite, no unescaped "%" in the prose: it would comment out the rest of a line.
    prose = [line for line in text.splitlines() if line and not line.startswith(("%", "\\"))]
    assert all(re.search(r"(?<!\\)%", line) is None for line in prose)


# Patashnik, "BibTeXing" (1988), section 4 (from memory): the standard entry types, and
# the required fields of the two the demo uses ("author or editor" for a book).
_STANDARD_TYPES = {
    "article",
    "book",
    "booklet",
    "conference",
    "inbook",
    "incollection",
    "inproceedings",
    "manual",
    "mastersthesis",
    "misc",
    "phdthesis",
    "proceedings",
    "techreport",
    "unpublished",
}
_REQUIRED = {
    "article": ({"author"}, {"title"}, {"journal"}, {"year"}),
    "book": ({"author", "editor"}, {"title"}, {"publisher"}, {"year"}),
}


def test_refs_bib_uses_standard_types_and_required_fields() -> None:
    entries = _bib_entries()
    assert len(entries) == 8 and UNRESOLVED_KEY not in {e["ID"] for e in entries}
    for entry in entries:
        kind = entry["ENTRYTYPE"]
        assert kind in _STANDARD_TYPES, entry["ID"]
        for alternatives in _REQUIRED[kind]:
            assert alternatives & entry.keys(), (entry["ID"], alternatives)
        # BibTeXing, "pages" (from memory): a range is written with a double dash, "42--111".
        if "pages" in entry:
            assert re.fullmatch(r"\d+--\d+", entry["pages"]), entry["ID"]
        # BibTeXing, names (from memory): names are separated by "and", each "Last, First".
        assert all(re.fullmatch(r"[\w-]+, (?:\w\.)+", n) for n in entry["author"].split(" and ")), entry["ID"]


def test_refs_bib_matches_the_reference_list_of_draft_md() -> None:
    text = VERSIONS["markdown"].read_text(encoding="utf-8")
    printed = dict(re.findall(r"^\[(\d+)\] (.+)$", text, re.MULTILINE))
    entries = _bib_entries()
    assert len(printed) == len(entries)
    for number, entry in enumerate(entries, start=1):
        line = printed[str(number)]
        title = entry["title"]
        assert f'"{title},"' in line or f"*{title}*" in line, entry["ID"]
        assert f", {entry['year']}" in line
        families = [n.split(",")[0] for n in entry["author"].split(" and ")]
        initials = [n.split(", ")[1] for n in entry["author"].split(" and ")]
        assert all(f"{i} {f}" in line for i, f in zip(initials, families, strict=True)), entry["ID"]
        doi = re.search(r"doi: (\S+?)\.?$", line)
        assert entry.get("doi") == (doi.group(1) if doi else None), entry["ID"]


def test_word_version_has_heading_styles_and_word_numbered_references() -> None:
    # python-docx (a reference library) reads the package. ECMA-376 Part 1, 17.9
    # "Numbering" (from memory): a paragraph's w:numPr names a w:num, whose abstractNum
    # level prints w:lvlText with "%1" replaced by the counter.
    document = docx.Document(str(VERSIONS["word"]))
    paragraphs = document.paragraphs
    headings = [(p.style.name, p.text) for p in paragraphs if p.style.name.startswith("Heading")]
    assert headings == [
        ("Heading 1", script.TITLE),
        ("Heading 2", "Introduction"),
        ("Heading 2", "Methods"),
        ("Heading 2", "Results"),
        ("Heading 2", "Discussion"),
        ("Heading 2", "References"),
    ]
    w = "{http://schemas.openxmlformats.org/wordprocessingml/2006/main}"
    entries = [p for p in paragraphs if p._p.find(f"{w}pPr/{w}numPr") is not None]
    assert len(entries) == 8
    assert all(not re.match(r"\s*\[\d", p.text) for p in entries)  # the number is Word's, not typed
    num_ids = {p._p.find(f"{w}pPr/{w}numPr/{w}numId").get(f"{w}val") for p in entries}
    assert len(num_ids) == 1
    numbering = document.part.numbering_part.element
    num = next(n for n in numbering.iter(f"{w}num") if n.get(f"{w}numId") in num_ids)
    abstract_id = num.find(f"{w}abstractNumId").get(f"{w}val")
    abstract = next(a for a in numbering.iter(f"{w}abstractNum") if a.get(f"{w}abstractNumId") == abstract_id)
    level = abstract.find(f"{w}lvl")
    assert level.find(f"{w}lvlText").get(f"{w}val") == "[%1]"
    assert level.find(f"{w}numFmt").get(f"{w}val") == "decimal"
    # The typed markers are there as text.
    body = "\n".join(p.text for p in paragraphs)
    assert "heathland [2, 5]." in body and "management [3–4]." in body and "systems [9]." in body


# The PDF as two reference libraries read it. pdfminer.six gives every glyph with its font
# and text matrix; pypdf the text and the document information dictionary.
_MM = 72 / 25.4  # PostScript points per millimetre (ISO 32000-1, 8.3.2.3, from memory: 1/72 in)
_SAME_BASELINE = 0.2  # points; fpdf2 writes positions to 1/100 of a point


def _glyphs(item: LTComponent) -> list[LTChar]:
    if isinstance(item, LTChar):
        return [item]
    return [glyph for child in item for glyph in _glyphs(child)] if hasattr(item, "__iter__") else []


def _baseline_lines(glyphs: list[LTChar]) -> list[tuple[float, list[LTChar]]]:
    """Glyphs by baseline (the text matrix's y, ISO 32000-1, 9.4.4), top of the page first."""
    lines: dict[float, list[LTChar]] = {}
    for glyph in glyphs:
        lines.setdefault(round(glyph.matrix[5], 1), []).append(glyph)
    # PDF y grows upwards (ISO 32000-1, 8.3.2.3, from memory).
    return [(y, sorted(lines[y], key=lambda g: g.x0)) for y in sorted(lines, reverse=True)]


def _text(glyphs: list[LTChar]) -> str:
    return "".join(glyph.get_text() for glyph in glyphs)


def test_pdf_version_is_a_numbered_review_copy() -> None:
    path = VERSIONS["pdf"]
    pages = list(extract_pages(str(path)))
    assert 2 <= len(pages) <= 3  # the brief's length for the review copy
    headings = [heading for heading, _ in script.SECTIONS] + [script.REFERENCES_HEADING]
    numbers: list[int] = []
    bold_lines: list[str] = []
    for number, page in enumerate(pages, start=1):
        glyphs = _glyphs(page)
        margin = _baseline_lines([g for g in glyphs if g.x1 < script.PDF_MARGIN_LEFT * _MM])
        text = _baseline_lines([g for g in glyphs if g.x0 >= script.PDF_MARGIN_LEFT * _MM])
        # Furniture: the running header on top, "Page n of N" at the foot, neither numbered.
        assert _text(text[0][1]) == script.RUNNING_HEADER
        assert _text(text[-1][1]) == f"Page {number} of {len(pages)}"
        body = text[1:-1]
        # Every printed line has its number at the left on its own baseline, and no number
        # stands beside nothing.
        assert len(margin) == len(body)
        for (y_number, digits), (y_line, line) in zip(margin, body, strict=True):
            assert abs(y_number - y_line) <= _SAME_BASELINE, _text(line)
            numbers.append(int(_text(digits)))
            fonts = {"Bold" in glyph.fontname for glyph in line if glyph.get_text().strip()}
            assert len(fonts) == 1, _text(line)  # a line is bold or not, never mixed
            if fonts == {True}:
                bold_lines.append(_text(line))
    assert numbers == list(range(1, len(numbers) + 1))  # one count through the document
    # Bold: the title (its lines put back together) and the headings, and nothing else.
    title_lines = len(bold_lines) - len(headings)
    assert " ".join(bold_lines[:title_lines]) == script.TITLE
    assert bold_lines[title_lines:] == headings

    reader = PdfReader(path)
    # ISO 32000-1, 14.3.3 and 7.9.4 (from memory): CreationDate in the Info dictionary,
    # written "D:YYYYMMDDHHmmSS" with a time-zone offset; pypdf parses it.
    assert reader.metadata is not None and reader.metadata.creation_date == script.CREATED
    # The reference list: the eight "[n]" entries under the heading, in order, in full.
    listed = _pdf_prose(path).split(f" {script.REFERENCES_HEADING} ", 1)[1]
    assert re.findall(r"\[(\d+)\] ", listed) == [str(work.number) for work in script.WORKS]
    for work in script.WORKS:
        assert f"[{work.number}] {''.join(text for text, _ in script.entry_runs(work))}" in listed
