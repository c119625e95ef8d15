"""Write the demo draft in every input format sourcecheck reads, from one description.

``sample_manuscript/draft.md`` (Markdown, numbered markers, a written reference list) is
the reference version of the demo. This script holds a small structured copy of its
content — the paragraphs as text and citations, the reference list as fields — and
renders it as:

* ``draft.docx``: Word; "[n]" markers typed in the text, headings in Heading styles, the
  reference list as paragraphs numbered by Word itself ("[1]", "[2]" ... from a list
  definition), as a writer using Word's numbering would have it;
* ``draft-pandoc.md``: Pandoc Markdown; "[@key]" citations, ``bibliography: refs.bib``
  in the YAML front matter;
* ``draft.tex``: LaTeX; ``\\cite{key}`` and ``\\cite{a,b}``, ``\\bibliography{refs}``;
* ``refs.bib``: BibTeX for the eight entries of the reference list;
* ``draft.pdf``: the review copy a referee receives: A4, DejaVu Sans, a running header
  and "Page n of N" footer on every page, every line numbered in the left margin (one
  count through the document), bold headings, "[n]" markers typed in the text and the
  reference list under "References" as "[n]" entries with a hanging indent.

Why a copy and not a parse of draft.md: the formats test compares what the readers make
of each version, so the versions must not come out of one of those readers. The test
``tests/test_formats.py`` renders the copy back to Markdown and requires it to equal
draft.md byte for byte, so the copy cannot drift from the reference version.

The sentences are the same characters in every version; only the citation markers (and
LaTeX's escaped "%" and the tie before a citation) differ. Marker [9] has no entry in
the reference list, on purpose; in the keyed formats it cites ``dunes2016``, a key that
refs.bib does not hold, so it stays unresolved everywhere.

Output is deterministic: the .docx carries fixed core-property dates and fixed zip entry
times, the .pdf a fixed creation date (fpdf2 derives the file ID from the content), so
rerunning gives identical files.

Run from anywhere: ``python scripts/make_sample_drafts.py [output-folder]``.
"""

from __future__ import annotations

import datetime as dt
import io
import sys
import zipfile
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path

import docx
from docx.oxml import OxmlElement
from docx.oxml.ns import qn
from docx.text.paragraph import Paragraph as DocxParagraph
from fpdf import FPDF

REPO_ROOT = Path(__file__).resolve().parent.parent
OUTPUT_DIR = REPO_ROOT / "sample_manuscript"
REFERENCE_VERSION = OUTPUT_DIR / "draft.md"

#: File names written by :func:`write_all`, relative to the output folder.
OUTPUTS = ("draft.docx", "draft-pandoc.md", "draft.tex", "refs.bib", "draft.pdf")

# A fixed date keeps the .docx identical from run to run (the demo PDFs use the same one).
CREATED = dt.datetime(2024, 3, 1, 12, 0, 0, tzinfo=dt.UTC)
ZIP_TIME = (2024, 3, 1, 12, 0, 0)


# --- the content ---------------------------------------------------------------------


@dataclass(frozen=True)
class Work:
    """One entry of the reference list, in fields; ``number`` is its place in draft.md."""

    number: int
    key: str
    authors: tuple[tuple[str, str], ...]  # (initials, family name), in printed order
    title: str
    year: int
    journal: str | None = None
    volume: str | None = None
    issue: str | None = None
    pages: str | None = None  # with an en dash, as printed
    doi: str | None = None
    publisher: str | None = None  # books only
    address: str | None = None  # books only


@dataclass(frozen=True)
class Cite:
    """A citation marker: how draft.md writes it and the numbers of the works it cites."""

    written: str
    numbers: tuple[int, ...]


Part = str | Cite
Paragraph = tuple[Part, ...]


def cite(written: str, *numbers: int) -> Cite:
    return Cite(written, numbers)


TITLE = "Bare ground, soil and the nesting of ground-nesting bees on restored heath in Corrish Vale"
NOTE = "Demo draft for sourcecheck. The study, its authors, places, journals and sources are all invented."

#: The key a keyed version uses for draft.md's "[9]", which no reference entry answers.
UNRESOLVED_KEY = "dunes2016"

WORKS: tuple[Work, ...] = (
    Work(
        1,
        "marrenby2019",
        (("I.", "Marrenby"), ("K.", "Solvaag"), ("P.", "Trendle")),
        "Nest aggregations of ground-nesting bees on scraped and unscraped heathland plots",
        2019,
        journal="Journal of Heathland Field Ecology",
        volume="12",
        issue="3",
        pages="201–205",
        doi="10.55555/jhfe.2019.0123",
    ),
    Work(
        2,
        "brackwell2020",
        (("O.", "Brackwell"), ("I.", "Marrenby")),
        "Soil penetration resistance and nest-site choice of ground-nesting bees on restored heath",
        2020,
        journal="Soil and Insect Interactions",
        volume="7",
        pages="88–93",
        doi="10.55555/sii.2020.0711",
    ),
    Work(
        3,
        "hallorby2021",
        (("M.", "Hallorby"), ("T.", "Quist"), ("S.", "Akwaro")),
        "Flowering plant transects across a heathland restoration chronosequence",
        2021,
        journal="Restoration Botany Letters",
        volume="4",
        issue="1",
        pages="12–19",
    ),
    Work(
        4,
        "feltham2018",
        (("D.", "Feltham"), ("A.", "Wyncombe")),
        "Parasite load in mining-bee colonies of differing density",
        2018,
        journal="Apoidea Field Notes",
        volume="9",
        pages="44–52",
    ),
    Work(
        5,
        "osterby2020",
        (("L.", "Osterby"), ("K.", "Solvaag")),
        "Spring soil temperature and the emergence timing of solitary bees on heathland",
        2020,
        journal="Journal of Insect Phenology",
        volume="15",
        issue="2",
        pages="77–83",
        doi="10.55555/jip.2020.1502",
    ),
    Work(
        6,
        "gorrington2017",
        (("H.", "Gorrington"), ("P.", "Trendle")),
        "Turf stripping and scraping as heathland management: effects on bare ground",
        2017,
        journal="Heathland Conservation Practice",
        volume="22",
        issue="4",
        pages="310–317",
        doi="10.55555/hcp.2017.2204",
    ),
    Work(
        7,
        "quenbyharl2015",
        (("B.", "Quenby-Harl"),),
        "A Checklist of the Bees of Corrish Vale",
        2015,
        publisher="Corrish Vale Naturalists' Society",
        address="Corrish Vale",
    ),
    Work(
        8,
        "tindersley2019",
        (("R.", "Tindersley"),),
        "Seed bank composition of restored heath",
        2019,
        journal="Restoration Botany Letters",
        volume="2",
        issue="2",
        pages="33–41",
    ),
)

SECTIONS: tuple[tuple[str, tuple[Paragraph, ...]], ...] = (
    (
        "Introduction",
        (
            (
                "Ground-nesting bees make up most of the bee species of lowland heath, yet their nesting needs are "
                "rarely considered when heath is restored. Sun-exposed bare soil is widely seen as the key nesting "
                "resource for ground-nesting bees on heathland ",
                cite("[2, 5]", 2, 5),
                ". Left unmanaged, bare patches on lowland heath become overgrown by heather and grasses within a "
                "few years ",
                cite("[6]", 6),
                ". Restored heath is usually colonised by ground-nesting bees within the first few seasons after "
                "management ",
                cite("[3–4]", 3, 4),
                ". The Corrish Vale district supports at least 58 species of ground-nesting bees ",
                cite("[7]", 7),
                ". Here we combine nest counts, soil measurements and floral surveys from six restored sites to ask "
                "which site features matter most for nesting.",
            ),
        ),
    ),
    (
        "Methods",
        (
            (
                "Fieldwork took place between April and July 2022 on six heathland sites restored between 2008 and "
                "2019. Following an established protocol, nest entrances were counted in fixed 2 × 2 m quadrats laid "
                "along a transect through each plot ",
                cite("[1]", 1),
                ". Soil penetration resistance was measured with a hand-held penetrometer beside every nest and at "
                "random control points. Flowering plants were recorded along fixed transects once a fortnight. All "
                "analyses used mixed models with site as a random effect.",
            ),
        ),
    ),
    (
        "Results",
        (
            (
                "We recorded 1,086 nest entrances across the six sites. This matches earlier surveys, in which "
                "scraped plots held 3.4 ± 1.2 nests per m² against 0.9 ± 0.5 nests per m² on unscraped control "
                "plots ",
                cite("[1]", 1),
                ". Those surveys also found that only 23% of nest entrances lay on north-facing slopes ",
                cite("[1]", 1),
                ". Scrapes beside footpaths held more nests than scrapes far from paths ",
                cite("[1]", 1),
                ". Nest density was lower on scraped plots than on unscraped controls ",
                cite("[1]", 1),
                ". Nesting females avoided soils whose penetration resistance exceeded 2.5 MPa ",
                cite("[2]", 2),
                ". Nesting females also preferred scrapes close to flowering heather over scrapes further away ",
                cite("[2]", 2),
                ".",
            ),
            (
                "Floral species richness along the transects rose steadily with time since restoration, by about "
                "40% per decade ",
                cite("[3]", 3),
                ". Heather flowered later on north-facing transects than on south-facing transects ",
                cite("[3]", 3),
                ". Brood cells in dense nest aggregations were attacked by cleptoparasitic bees more often than "
                "those in sparse aggregations ",
                cite("[4]", 4),
                ". Nests on waterlogged ground faced a lower risk of failure than nests on dry ground ",
                cite("[4]", 4),
                '. Bee flies "hovered over open burrows and flicked their eggs into the entrance" ',
                cite("[4]", 4),
                ". Emergence started earlier on south-facing plots, where the soil warmed faster in March ",
                cite("[5]", 5),
                ". Males emerged on average 6 days earlier than females across all plots ",
                cite("[6]", 6),
                ". Our own counts showed the same preference for south-facing ground.",
            ),
        ),
    ),
    (
        "Discussion",
        (
            (
                "Taken together, these results suggest that restoration should create bare ground on warm, loose "
                "soils rather than on compacted tracks. Warm soil in early spring causes females to start building "
                "nests earlier ",
                cite("[5]", 5),
                ". Grazing by ponies reduced the height of gorse stands by roughly a third within two winters ",
                cite("[5]", 5),
                ". A comparable avoidance of shaded ground by nesting bees has been reported from inland dune systems ",
                cite("[9]", 9),
                ". Managers could therefore repeat scraping every few years to keep nesting ground open. Future work "
                "should follow marked nests over several seasons, so that the effects of soil, aspect and parasites "
                "can be told apart.",
            ),
        ),
    ),
)

REFERENCES_HEADING = "References"


def work_key(number: int) -> str:
    """The citation key of reference ``number``; numbers without an entry get UNRESOLVED_KEY."""
    return next((w.key for w in WORKS if w.number == number), UNRESOLVED_KEY)


# --- numbered reference entries (IEEE reference style, as draft.md prints them) -------


def _names(work: Work) -> str:
    """ "A. One", "A. One and B. Two", "A. One, B. Two, and C. Three" (serial comma)."""
    names = [f"{initials} {family}" for initials, family in work.authors]
    if len(names) <= 2:
        return " and ".join(names)
    return ", ".join(names[:-1]) + ", and " + names[-1]


def entry_runs(work: Work) -> list[tuple[str, bool]]:
    """The printed entry (without its "[n]") as (text, italic) runs."""
    if work.journal is None:  # a book: "Author, *Title*. Address: Publisher, Year."
        return [
            (f"{_names(work)}, ", False),
            (work.title, True),
            (f". {work.address}: {work.publisher}, {work.year}.", False),
        ]
    details = [f"vol. {work.volume}"] if work.volume else []
    if work.issue:
        details.append(f"no. {work.issue}")
    if work.pages:
        details.append(f"pp. {work.pages}")
    details.append(str(work.year))
    if work.doi:
        details.append(f"doi: {work.doi}")
    return [
        (f'{_names(work)}, "{work.title}," ', False),
        (work.journal, True),
        (", " + ", ".join(details) + ".", False),
    ]


def entry_markdown(work: Work) -> str:
    return "".join(f"*{text}*" if italic else text for text, italic in entry_runs(work))


# --- renderers -------------------------------------------------------------------------


def render_markdown() -> str:
    """The reference version, draft.md, from the structured copy (the drift test's side)."""
    lines = [f"# {TITLE}", "", f"*{NOTE}*", ""]
    for heading, paragraphs in SECTIONS:
        lines += [f"## {heading}", ""]
        for paragraph in paragraphs:
            lines += ["".join(p if isinstance(p, str) else p.written for p in paragraph), ""]
    lines += [f"## {REFERENCES_HEADING}", ""]
    for work in WORKS:
        lines += [f"[{work.number}] {entry_markdown(work)}", ""]
    return "\n".join(lines[:-1]) + "\n"


def pandoc_citation(marker: Cite) -> str:
    """Pandoc's bracketed citation: "[@a; @b]" (Pandoc User's Guide, "Citations")."""
    return "[" + "; ".join(f"@{work_key(n)}" for n in marker.numbers) + "]"


def render_pandoc() -> str:
    """Pandoc Markdown: key citations, bibliography named in the YAML front matter."""
    lines = ["---", f"title: {TITLE}", "bibliography: refs.bib", "---", "", f"*{NOTE}*", ""]
    for heading, paragraphs in SECTIONS:
        lines += [f"## {heading}", ""]
        for paragraph in paragraphs:
            lines += ["".join(p if isinstance(p, str) else pandoc_citation(p) for p in paragraph), ""]
    # Pandoc places the generated list at the end of the document, under this heading.
    lines += [f"## {REFERENCES_HEADING}", ""]
    return "\n".join(lines[:-1]) + "\n"


# The characters LaTeX treats as special that occur in the demo's prose (and the rest,
# so a sentence edit cannot slip one through unescaped).
_LATEX_ESCAPES = {"%": r"\%", "&": r"\&", "#": r"\#", "$": r"\$", "_": r"\_", "{": r"\{", "}": r"\}"}


def latex_escape(text: str) -> str:
    return "".join(_LATEX_ESCAPES.get(char, char) for char in text)


def render_latex() -> str:
    """LaTeX for a Unicode engine: \\cite{...} tied to the word before it, BibTeX bibliography."""
    lines = [
        "% The demo draft of sourcecheck, written by scripts/make_sample_drafts.py; do not edit.",
        "% UTF-8 text (×, ±, ², en dashes): compile with xelatex or lualatex, then bibtex.",
        r"\documentclass{article}",
        r"\usepackage{fontspec}",
        "",
        rf"\title{{{latex_escape(TITLE)}}}",
        r"\date{}",
        "",
        r"\begin{document}",
        r"\maketitle",
        "",
        rf"\emph{{{latex_escape(NOTE)}}}",
        "",
    ]
    for heading, paragraphs in SECTIONS:
        lines += [rf"\section{{{heading}}}", ""]
        for paragraph in paragraphs:
            text = ""
            for part in paragraph:
                if isinstance(part, str):
                    text += latex_escape(part)
                else:
                    # "~" ties the citation to the word before it (common practice, no source).
                    text = text.rstrip(" ") + "~\\cite{" + ",".join(work_key(n) for n in part.numbers) + "}"
            lines += [text, ""]
    lines += [r"\bibliographystyle{IEEEtran}", r"\bibliography{refs}", "", r"\end{document}"]
    return "\n".join(lines) + "\n"


def _bibtex_names(work: Work) -> str:
    """BibTeX's "Last, First and Last, First" name list (Patashnik, "BibTeXing")."""
    return " and ".join(f"{family}, {initials}" for initials, family in work.authors)


def render_bibtex() -> str:
    """refs.bib: @article / @book entries with BibTeX's standard fields, "--" in page ranges."""
    chunks = [
        "% The demo's reference list (sample_manuscript/draft.md) as BibTeX;\n"
        "% written by scripts/make_sample_drafts.py, do not edit. Everything here is invented.\n"
    ]
    for work in WORKS:
        fields: list[tuple[str, str]] = [("author", _bibtex_names(work)), ("title", work.title)]
        if work.journal is None:
            fields += [("publisher", work.publisher or ""), ("address", work.address or "")]
            kind = "book"
        else:
            fields.append(("journal", work.journal))
            fields += [(name, value) for name, value in (("volume", work.volume), ("number", work.issue)) if value]
            if work.pages:
                fields.append(("pages", work.pages.replace("–", "--")))
            kind = "article"
        fields.append(("year", str(work.year)))
        if work.doi:
            fields.append(("doi", work.doi))
        body = ",\n".join(f"  {name} = {{{value}}}" for name, value in fields)
        chunks.append(f"@{kind}{{{work.key},\n{body}\n}}\n")
    return "\n".join(chunks)


# --- Word ------------------------------------------------------------------------------

_REFERENCE_NUM_ID = 90  # ids of our own list definition, clear of the template's
_REFERENCE_ABSTRACT_ID = 90
_HANGING_TWIPS = "567"  # 1 cm


def _element(tag: str, **attributes: str) -> OxmlElement:
    element = OxmlElement(tag)
    for name, value in attributes.items():
        element.set(qn(f"w:{name}"), value)
    return element


def _add_reference_numbering(document: docx.document.Document) -> None:
    """A single-level list that Word prints as "[1]", "[2]", ...: IEEE's reference numbers."""
    numbering = document.part.numbering_part.element
    abstract = _element("w:abstractNum", abstractNumId=str(_REFERENCE_ABSTRACT_ID))
    abstract.append(_element("w:multiLevelType", val="singleLevel"))
    level = _element("w:lvl", ilvl="0")
    level.append(_element("w:start", val="1"))
    level.append(_element("w:numFmt", val="decimal"))
    level.append(_element("w:lvlText", val="[%1]"))
    level.append(_element("w:lvlJc", val="left"))
    paragraph_properties = _element("w:pPr")
    paragraph_properties.append(_element("w:ind", left=_HANGING_TWIPS, hanging=_HANGING_TWIPS))
    level.append(paragraph_properties)
    abstract.append(level)
    # The schema wants every abstractNum before the first num.
    first_num = numbering.find(qn("w:num"))
    if first_num is not None:
        first_num.addprevious(abstract)
    else:
        numbering.append(abstract)
    num = _element("w:num", numId=str(_REFERENCE_NUM_ID))
    num.append(_element("w:abstractNumId", val=str(_REFERENCE_ABSTRACT_ID)))
    numbering.append(num)


def _number(paragraph: DocxParagraph) -> None:
    properties = paragraph._p.get_or_add_pPr()
    numbered = _element("w:numPr")
    numbered.append(_element("w:ilvl", val="0"))
    numbered.append(_element("w:numId", val=str(_REFERENCE_NUM_ID)))
    properties.append(numbered)


def render_docx() -> bytes:
    """draft.docx: typed "[n]" markers, Heading styles, a Word-numbered reference list."""
    document = docx.Document()
    properties = document.core_properties
    properties.created = properties.modified = properties.last_printed = CREATED.replace(tzinfo=None)
    properties.author = properties.last_modified_by = "sourcecheck demo"
    properties.title = TITLE
    properties.comments = "The sourcecheck demo draft, written by scripts/make_sample_drafts.py."
    properties.revision = 1
    _add_reference_numbering(document)
    document.add_heading(TITLE, level=1)
    document.add_paragraph().add_run(NOTE).italic = True
    for heading, paragraphs in SECTIONS:
        document.add_heading(heading, level=2)
        for paragraph in paragraphs:
            document.add_paragraph("".join(p if isinstance(p, str) else p.written for p in paragraph))
    document.add_heading(REFERENCES_HEADING, level=2)
    for work in WORKS:
        entry = document.add_paragraph()
        _number(entry)
        for text, italic in entry_runs(work):
            entry.add_run(text).italic = italic or None
    buffer = io.BytesIO()
    document.save(buffer)
    return _fixed_zip_times(buffer.getvalue())


def _fixed_zip_times(data: bytes) -> bytes:
    """The same package with every member dated ZIP_TIME (python-docx stamps the clock)."""
    out = io.BytesIO()
    with zipfile.ZipFile(io.BytesIO(data)) as source, zipfile.ZipFile(out, "w") as target:
        for member in source.infolist():
            info = zipfile.ZipInfo(member.filename, date_time=ZIP_TIME)
            info.compress_type = zipfile.ZIP_DEFLATED
            target.writestr(info, source.read(member.filename))
    return out.getvalue()


# --- PDF (the review copy) -----------------------------------------------------------------

FONT_DIR = Path("/usr/share/fonts/truetype/dejavu")
FONT_REGULAR = FONT_DIR / "DejaVuSans.ttf"
FONT_BOLD = FONT_DIR / "DejaVuSans-Bold.ttf"
RUNNING_HEADER = "Manuscript under review — do not distribute"

PDF_MARGIN_LEFT = 30.0  # mm; the line numbers sit in the 12 mm to their left
PDF_MARGIN_RIGHT = 22.0
PDF_MARGIN_TOP = 24.0
PDF_MARGIN_BOTTOM = 22.0
NUMBER_GAP = 4.0  # between a line number's right edge and the text
HANGING_INDENT = 8.0  # reference entries' continuation lines

PDF_TITLE_SIZE = 13.0
PDF_TITLE_LINE = 7.0
PDF_HEADING_SIZE = 11.0
PDF_BODY_SIZE = 11.0
PDF_BODY_LINE = 8.5  # "double spacing", as journals ask of review copies (common practice, no source)
PDF_REFERENCE_SIZE = 9.5
PDF_REFERENCE_LINE = 6.5
PDF_NUMBER_SIZE = 7.5


def _tied_words(text: str) -> list[str]:
    """The words of ``text`` split at its spaces, a "[n]" marker kept with the word before.

    Typesetters tie a citation to the word it follows (common practice, no source), so
    no line of the PDF starts with a marker. Joining the words with single spaces gives
    ``text`` back exactly: draft.md has no double spaces.
    """
    words: list[str] = []
    for word in text.split(" "):
        if words and word.startswith("["):
            words[-1] += " " + word
        else:
            words.append(word)
    return words


class ManuscriptPDF(FPDF):
    """A4 review copy: running header, page footer, and a margin that numbers every line."""

    def __init__(self) -> None:
        super().__init__(format="A4", unit="mm")
        self.add_font("DejaVu", "", str(FONT_REGULAR))
        self.add_font("DejaVu", "B", str(FONT_BOLD))
        self.set_margins(PDF_MARGIN_LEFT, PDF_MARGIN_TOP, PDF_MARGIN_RIGHT)
        # Page breaks are placed by write_line, so every line gets its number first.
        self.set_auto_page_break(auto=False)
        self.set_creation_date(CREATED)
        self.set_title(TITLE)
        self.set_author("sourcecheck demo")
        self.line_count = 0

    def header(self) -> None:
        self.set_font("DejaVu", "", 8)
        self.set_text_color(90, 90, 90)
        self.set_xy(PDF_MARGIN_LEFT, 11)
        self.cell(self.epw, 4, RUNNING_HEADER, align="C")
        self.set_text_color(0, 0, 0)
        self.set_xy(PDF_MARGIN_LEFT, PDF_MARGIN_TOP)

    def footer(self) -> None:
        self.set_y(-14)
        self.set_font("DejaVu", "", 8)
        self.set_text_color(90, 90, 90)
        # "{nb}" is fpdf2's alias for the page count, filled in at output time.
        self.cell(0, 4, f"Page {self.page_no()} of {{nb}}", align="C")
        self.set_text_color(0, 0, 0)

    def write_line(self, text: str, style: str, size: float, height: float, indent: float = 0.0) -> None:
        """One printed line with its number in the margin; a new page when it would not fit."""
        if self.get_y() + height > self.h - PDF_MARGIN_BOTTOM:
            self.add_page()
        y = self.get_y()
        self.line_count += 1
        self.set_font("DejaVu", "", PDF_NUMBER_SIZE)
        self.set_text_color(120, 120, 120)
        # fpdf2 sets a cell's baseline 0.3 x the font size below the cell's middle; the
        # smaller number goes down by the difference so both share the line's baseline.
        self.set_xy(PDF_MARGIN_LEFT - NUMBER_GAP - 10, y + 0.3 * (size - PDF_NUMBER_SIZE) / self.k)
        self.cell(10, height, str(self.line_count), align="R")
        self.set_text_color(0, 0, 0)
        self.set_font("DejaVu", style, size)
        self.set_xy(PDF_MARGIN_LEFT + indent, y)
        self.cell(self.epw - indent, height, text, align="L")
        self.set_xy(PDF_MARGIN_LEFT, y + height)

    def wrap(self, text: str, width: float) -> list[str]:
        """``text`` broken at spaces into lines no wider than ``width`` in the current font."""
        usable = width - 2 * self.c_margin - 0.05
        lines: list[str] = []
        current = ""
        for word in _tied_words(text):
            candidate = f"{current} {word}" if current else word
            if current and self.get_string_width(candidate) > usable:
                lines.append(current)
                current = word
            else:
                current = candidate
        if current:
            lines.append(current)
        return lines

    def block(self, text: str, style: str, size: float, height: float, space_after: float) -> None:
        """A title, heading or paragraph, left-aligned so word gaps stay plain spaces."""
        self.set_font("DejaVu", style, size)
        for line in self.wrap(text, self.epw):
            self.write_line(line, style, size, height)
        self.set_y(self.get_y() + space_after)

    def entry(self, number: int, text: str) -> None:
        """A reference entry: "[n] ..." with its continuation lines indented."""
        self.set_font("DejaVu", "", PDF_REFERENCE_SIZE)
        words = _tied_words(f"[{number}] {text}")
        first = self.wrap(" ".join(words), self.epw)[0]
        rest = " ".join(words)[len(first) + 1 :]
        self.write_line(first, "", PDF_REFERENCE_SIZE, PDF_REFERENCE_LINE)
        for line in self.wrap(rest, self.epw - HANGING_INDENT) if rest else []:
            self.write_line(line, "", PDF_REFERENCE_SIZE, PDF_REFERENCE_LINE, HANGING_INDENT)
        self.set_y(self.get_y() + 1.0)


def render_pdf() -> bytes:
    """draft.pdf: the draft as a reviewer's PDF; same sentences, typed "[n]" markers."""
    pdf = ManuscriptPDF()
    pdf.add_page()
    pdf.block(TITLE, "B", PDF_TITLE_SIZE, PDF_TITLE_LINE, 2.0)
    pdf.block(NOTE, "", PDF_BODY_SIZE, PDF_BODY_LINE, 3.0)
    for heading, paragraphs in SECTIONS:
        pdf.block(heading, "B", PDF_HEADING_SIZE, PDF_BODY_LINE, 0.0)
        for paragraph in paragraphs:
            text = "".join(p if isinstance(p, str) else p.written for p in paragraph)
            pdf.block(text, "", PDF_BODY_SIZE, PDF_BODY_LINE, 2.5)
    pdf.block(REFERENCES_HEADING, "B", PDF_HEADING_SIZE, PDF_BODY_LINE, 0.0)
    for work in WORKS:
        pdf.entry(work.number, "".join(text for text, _ in entry_runs(work)))
    return bytes(pdf.output())


# --- writing ---------------------------------------------------------------------------


def rendered() -> dict[str, bytes]:
    """Every output file's name and content."""
    return {
        "draft.docx": render_docx(),
        "draft-pandoc.md": render_pandoc().encode("utf-8"),
        "draft.tex": render_latex().encode("utf-8"),
        "refs.bib": render_bibtex().encode("utf-8"),
        "draft.pdf": render_pdf(),
    }


def write_all(folder: Path) -> list[Path]:
    """Write every version into ``folder``; the paths written, in OUTPUTS order."""
    folder.mkdir(parents=True, exist_ok=True)
    written = []
    for name, data in rendered().items():
        path = folder / name
        path.write_bytes(data)
        written.append(path)
    return written


def main(argv: Sequence[str]) -> int:
    folder = Path(argv[0]) if argv else OUTPUT_DIR
    if REFERENCE_VERSION.read_text(encoding="utf-8") != render_markdown():
        print(f"{REFERENCE_VERSION}: differs from the copy in this script; update one of them", file=sys.stderr)
        return 1
    for path in write_all(folder):
        print(path)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
