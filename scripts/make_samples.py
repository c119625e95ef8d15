"""Generate the demo source PDFs in ``sample_sources/``.

The demo draft (``sample_manuscript/draft.md``) cites short research articles about
ground-nesting bees on restored heath in the invented district of Corrish Vale. Every
person, institution, journal, place and DOI (prefix 10.55555) here is made up. This script
writes those articles as PDFs so that the demo, and the end-to-end test built on it, can
run without shipping binary files nobody can regenerate.

The PDFs are deliberately awkward in the ways real articles are, because the source stage
must cope with each of these:

* a running header (journal and volume) and a page-number footer on every page;
* a "References" section whose entries must never be taken as evidence;
* one page in two columns in two of the files;
* a word hyphenated across a line end, and an "ﬁ" ligature glyph in one word;
* PDF metadata (title, author) on most files, none on one, so it must be matched by the
  title printed on its first page; a DOI printed on the first page of some;
* two files in subfolders, to show that discovery is recursive;
* one file that no reference of the draft points at;
* five sentences that a claim of the draft restates closely but gets wrong in one way
  (a flipped direction, a dropped negation, a dropped limit to one site, a changed word
  in a quotation, a dropped hedge), each in a paragraph of its own and free of numbers.

``sample_manuscript/PLANTED.md`` lists which sentence of which file backs which claim.
If you change a sentence here, update that table.

Output is deterministic: the creation date is fixed and fpdf2 derives the file ID from
the content, so rerunning gives byte-identical files.

Run from anywhere: ``python scripts/make_samples.py``.
"""

from __future__ import annotations

import datetime as dt
import sys
from dataclasses import dataclass
from pathlib import Path

from fpdf import FPDF
from fpdf.enums import XPos, YPos

REPO_ROOT = Path(__file__).resolve().parent.parent
OUTPUT_DIR = REPO_ROOT / "sample_sources"
FONT_DIR = Path("/usr/share/fonts/truetype/dejavu")
FONT_REGULAR = FONT_DIR / "DejaVuSans.ttf"
FONT_BOLD = FONT_DIR / "DejaVuSans-Bold.ttf"

# A fixed date keeps the files byte-identical from run to run.
CREATED = dt.datetime(2024, 3, 1, 12, 0, 0, tzinfo=dt.UTC)

PAGE_FORMAT = (148.0, 210.0)  # A5 in mm; a tuple avoids fpdf2's A5 deprecation warning
MARGIN_LEFT = 16.0
MARGIN_RIGHT = 16.0
MARGIN_TOP = 20.0
MARGIN_BOTTOM = 18.0
COLUMN_GUTTER = 6.0

BODY_SIZE = 10.5
BODY_LINE = 5.2
COLUMN_SIZE = 9.5
COLUMN_LINE = 4.7
HEADING_SIZE = 11.0
REFERENCE_SIZE = 8.5
REFERENCE_LINE = 4.2

MIN_PAGES = 3
MAX_PAGES = 5


# --- document model ------------------------------------------------------------------------


@dataclass(frozen=True)
class Heading:
    """A numbered section heading, e.g. "3 Results"."""

    text: str


@dataclass(frozen=True)
class Para:
    """A body paragraph.

    ``hyphenate`` names one word and where to split it: the first occurrence that does not
    fit at a line end is broken there with a hyphen, as a typesetter would. The generator
    fails if no such break happens, so an edit of the text cannot silently lose it.
    """

    text: str
    hyphenate: tuple[str, str] | None = None


@dataclass(frozen=True)
class PageBreak:
    """Start a new page (used before a two-column page)."""


@dataclass(frozen=True)
class Columns:
    """One stretch of two-column layout: the left column is written first, then the right."""

    left: tuple[Heading | Para, ...]
    right: tuple[Heading | Para, ...]


Block = Heading | Para | PageBreak | Columns


@dataclass(frozen=True)
class Article:
    """One demo source: what is printed and what goes into the PDF metadata."""

    path: str
    title: str
    authors: tuple[str, ...]
    affiliation: str
    running_header: str
    short_authors: str
    doi: str | None
    write_metadata: bool
    abstract: str
    body: tuple[Block, ...]
    references: tuple[str, ...]
    footer_of_total: bool = True
    """Footer reads "Page 2 of 3" when true, a bare "2" when false."""


# --- layout --------------------------------------------------------------------------------


class ArticlePDF(FPDF):
    """An A5 article page with a running header and a page-number footer."""

    def __init__(self, article: Article) -> None:
        super().__init__(format=PAGE_FORMAT, unit="mm")
        self.article = article
        self.add_font("DejaVu", "", str(FONT_REGULAR))
        self.add_font("DejaVu", "B", str(FONT_BOLD))
        self.set_margins(MARGIN_LEFT, MARGIN_TOP, MARGIN_RIGHT)
        self.set_auto_page_break(auto=True, margin=MARGIN_BOTTOM)
        self.set_creation_date(CREATED)
        self.hyphenations = 0

    def header(self) -> None:
        """Running header: journal and volume left, short author line right (every page)."""
        self.set_font("DejaVu", "", 7.5)
        self.set_text_color(90, 90, 90)
        self.set_xy(MARGIN_LEFT, 9)
        width = self.epw / 2
        self.cell(width, 4, self.article.running_header, align="L")
        self.cell(width, 4, self.article.short_authors, align="R")
        self.line(MARGIN_LEFT, 14, self.w - MARGIN_RIGHT, 14)
        self.set_text_color(0, 0, 0)
        self.set_xy(MARGIN_LEFT, MARGIN_TOP)

    def footer(self) -> None:
        """Page number on every page, so the source reader has a footer to strip."""
        self.set_y(-12)
        self.set_font("DejaVu", "", 7.5)
        self.set_text_color(90, 90, 90)
        # "{nb}" is fpdf2's alias for the total page count, filled in at output time.
        page = self.page_no()
        label = f"Page {page} of {{nb}}" if self.article.footer_of_total else str(page)
        self.cell(0, 4, label, align="C")
        self.set_text_color(0, 0, 0)

    # -- text helpers --

    def wrap(self, text: str, width: float, hyphenate: tuple[str, str] | None) -> list[str]:
        """Break ``text`` into lines no wider than ``width``, hyphenating one word if asked.

        Wrapping is done here rather than by fpdf2 so that the one hyphenated line break
        can be placed where a typesetter would put it.
        """
        usable = width - 2 * self.c_margin - 0.05
        lines: list[str] = []
        current = ""
        pending_split = hyphenate
        for word in text.split():
            candidate = f"{current} {word}" if current else word
            if self.get_string_width(candidate) <= usable:
                current = candidate
                continue
            if pending_split and word.startswith(pending_split[0]):
                head = pending_split[1] + "-"
                with_head = f"{current} {head}" if current else head
                if self.get_string_width(with_head) <= usable:
                    lines.append(with_head)
                    current = word[len(pending_split[1]) :]
                    pending_split = None
                    self.hyphenations += 1
                    continue
            if current:
                lines.append(current)
            current = word
        if current:
            lines.append(current)
        if pending_split:
            raise RuntimeError(
                f"{self.article.path}: '{pending_split[0]}' never fell at a line end; "
                "reword the paragraph so the planted hyphenation happens"
            )
        return lines

    def paragraph(self, para: Para, x: float, width: float, size: float, line: float) -> None:
        """Write a left-aligned paragraph at ``x``; left alignment keeps word gaps plain
        spaces, so extracted text has no stretched spacing to undo."""
        self.set_font("DejaVu", "", size)
        self.set_x(x)
        lines = self.wrap(para.text, width, para.hyphenate)
        self.multi_cell(width, line, "\n".join(lines), align="L", new_x=XPos.LEFT)
        self.set_y(self.get_y() + line * 0.6)

    def heading(self, heading: Heading, x: float, width: float) -> None:
        """A bold section heading with a little space above and below."""
        self.set_font("DejaVu", "B", HEADING_SIZE)
        self.set_xy(x, self.get_y() + 1.5)
        self.multi_cell(width, 6, heading.text, align="L", new_x=XPos.LEFT)
        self.set_xy(x, self.get_y() + 0.8)

    def columns(self, block: Columns) -> None:
        """Lay out a two-column stretch; it must fit on the current page."""
        start_page = self.page_no()
        top = self.get_y()
        width = (self.epw - COLUMN_GUTTER) / 2
        bottoms = []
        for x, items in (
            (MARGIN_LEFT, block.left),
            (MARGIN_LEFT + width + COLUMN_GUTTER, block.right),
        ):
            self.set_xy(x, top)
            for item in items:
                if isinstance(item, Heading):
                    self.heading(item, x, width)
                else:
                    self.paragraph(item, x, width, COLUMN_SIZE, COLUMN_LINE)
                self.set_x(x)
            bottoms.append(self.get_y())
            if self.page_no() != start_page:
                raise RuntimeError(f"{self.article.path}: a column ran off its page")
        self.set_xy(MARGIN_LEFT, max(bottoms))

    def title_block(self) -> None:
        """Title, authors, affiliation, optional DOI and abstract: what page 1 leads with,
        and what a reference is matched against when the metadata is empty."""
        art = self.article
        self.set_font("DejaVu", "B", 14.5)
        self.multi_cell(0, 7, art.title, align="L", new_x=XPos.LMARGIN, new_y=YPos.NEXT)
        self.ln(2)
        self.set_font("DejaVu", "", 10)
        self.multi_cell(0, 5, _join_names(art.authors), align="L", new_x=XPos.LMARGIN, new_y=YPos.NEXT)
        self.set_font("DejaVu", "", 8.5)
        self.multi_cell(0, 4.5, art.affiliation, align="L", new_x=XPos.LMARGIN, new_y=YPos.NEXT)
        if art.doi:
            self.multi_cell(0, 4.5, f"doi: {art.doi}", align="L", new_x=XPos.LMARGIN, new_y=YPos.NEXT)
        self.ln(3)
        self.set_font("DejaVu", "B", 9.5)
        self.cell(0, 5, "Abstract", new_x=XPos.LMARGIN, new_y=YPos.NEXT)
        self.paragraph(Para(art.abstract), MARGIN_LEFT, self.epw, 9.5, 4.7)
        self.ln(1)

    def reference_list(self) -> None:
        """The article's own "References" section: text that is never evidence."""
        self.heading(Heading("References"), MARGIN_LEFT, self.epw)
        self.set_font("DejaVu", "", REFERENCE_SIZE)
        for number, entry in enumerate(self.article.references, start=1):
            self.set_x(MARGIN_LEFT)
            self.multi_cell(
                0,
                REFERENCE_LINE,
                f"[{number}] {entry}",
                align="L",
                new_x=XPos.LMARGIN,
                new_y=YPos.NEXT,
            )
            self.ln(0.8)


def _join_names(names: tuple[str, ...]) -> str:
    """Join names as a by-line prints them: "A, B and C"."""
    if len(names) == 1:
        return names[0]
    return ", ".join(names[:-1]) + " and " + names[-1]


def render(article: Article) -> bytes:
    """Typeset one article and return the PDF bytes."""
    pdf = ArticlePDF(article)
    if article.write_metadata:
        pdf.set_title(article.title)
        pdf.set_author("; ".join(article.authors))
    pdf.add_page()
    pdf.title_block()
    for block in article.body:
        if isinstance(block, Heading):
            pdf.heading(block, MARGIN_LEFT, pdf.epw)
        elif isinstance(block, Para):
            pdf.paragraph(block, MARGIN_LEFT, pdf.epw, BODY_SIZE, BODY_LINE)
        elif isinstance(block, PageBreak):
            pdf.add_page()
        else:
            pdf.columns(block)
    pdf.reference_list()
    wanted = sum(1 for b in article.body for p in _paragraphs(b) if isinstance(p, Para) and p.hyphenate)
    if pdf.hyphenations != wanted:
        raise RuntimeError(f"{article.path}: expected {wanted} hyphenations")
    if not MIN_PAGES <= pdf.page_no() <= MAX_PAGES:
        raise RuntimeError(f"{article.path}: {pdf.page_no()} pages, want {MIN_PAGES}-{MAX_PAGES}")
    return bytes(pdf.output())


def _paragraphs(block: Block) -> tuple[Block, ...]:
    """The blocks inside a two-column stretch, or the block itself."""
    if isinstance(block, Columns):
        return block.left + block.right
    return (block,)


# --- the articles --------------------------------------------------------------------------
# Sentences that back a claim of the demo draft are marked with a comment naming the claim;
# PLANTED.md gives the page each lands on.

NEST_SURVEY = Article(
    path="nest-aggregations-corrish-2019.pdf",
    title="Nest aggregations of ground-nesting bees on scraped and unscraped heathland plots",
    authors=("Idris Marrenby", "Katrin Solvaag", "Paulo Trendle"),
    affiliation="Hollin Down Field Station, University of Corrish Vale",
    running_header="Journal of Heathland Field Ecology 12(3), 2019",
    short_authors="Marrenby et al.",
    doi="10.55555/jhfe.2019.0123",
    write_metadata=True,
    abstract=(
        "Bare ground created by scraping is thought to favour ground-nesting bees, but few "
        "studies have counted nests on managed and unmanaged plots side by side. We surveyed "
        "36 plots on three restored heaths in Corrish Vale during the springs of 2017 and "
        "2018. Scraped plots held far more nests than unscraped controls, and most nests "
        "faced south."
    ),
    body=(
        Heading("1 Introduction"),
        Para(
            "Most bee species of lowland heath dig their nests in the ground. Females excavate "
            "a burrow in loose, dry soil and provision a few brood cells with pollen and "
            "nectar. The availability of a suitable soil surface therefore limits where "
            "populations can persist from one year to the next."
        ),
        Para(
            "Heathland managers create bare ground by scraping away the vegetation and the "
            "upper humus layer. Whether such scrapes are actually used for nesting has rarely "
            "been tested with systematic counts. This study compares nest densities on scraped "
            "plots and on unscraped controls at the same sites, and asks whether the direction "
            "a slope faces changes the picture."
        ),
        Heading("2 Methods"),
        Para(
            "The three study heaths lie on acidic sandy soils between 60 and 90 m above sea "
            "level. At each site we marked twelve plots of 10 × 10 m, half of which had been "
            "scraped within the previous two years. "
            # claim: fixed 2 x 2 m quadrats (ligature glyph in "fixed")
            "Nest entrances were counted in ﬁxed 2 × 2 m quadrats placed along a transect "
            "through the centre of each plot. Each quadrat was searched for ten minutes on "
            "warm, dry mornings between 09:00 and 12:00."
        ),
        Para(
            "Slope aspect was recorded with a compass and grouped into four sectors. Vegetation "
            "cover and the share of bare ground were estimated by eye to the nearest 5%. Nest "
            "densities were compared with a generalised linear mixed model that treated site "
            "as a random effect."
        ),
        Heading("3 Results"),
        Para(
            "In total we recorded 412 nest entrances across the 36 plots. "
            # claim: 3.4 +- 1.2 against 0.9 +- 0.5 nests per m2
            "Scraped plots held a mean of 3.4 ± 1.2 nests per m², compared with 0.9 ± 0.5 "
            "nests per m² on unscraped controls (p < 0.001). The difference was consistent at "
            "all three sites and in both years of the survey."
        ),
        Para(
            # claim: 18% north-facing (the draft says 23%)
            "Only 18% of nest entrances lay on north-facing slopes, whereas 64% faced south or "
            "south-west. Nest density rose with the share of bare ground in a quadrat "
            "(r = 0.61, n = 144 quadrats). Quadrats with more than 30% moss cover contained "
            "almost no nests."
        ),
        Para(
            # claim: footpath scrapes (the draft says "more"; direction-flip)
            "Scrapes beside footpaths held fewer nests than scrapes far from paths. Walkers "
            "trample the soil surface there and fill in burrow entrances."
        ),
        Heading("4 Discussion"),
        Para(
            "Scraping clearly created nesting habitat that the bees used within two seasons. "
            "The strong preference for south-facing ground suggests that the warmth of the soil "
            "surface matters as much as the absence of vegetation. Managers who scrape on "
            "north-facing slopes may therefore see little benefit for bees."
        ),
        Para(
            "Our counts cover only two years, and nest entrances may be missed where spoil "
            "heaps are washed away by heavy rain. Longer series of counts on marked plots would "
            "show how quickly scrapes lose their value as they become overgrown."
        ),
    ),
    references=(
        "H. Gorrington, Bare ground on lowland heath: a review, Heathland Conservation Practice 18 (2013) 1–14.",
        "O. Brackwell, Nest architecture of mining bees in sandy soils, Soil and Insect Interactions 3 (2015) 22–30.",
        "T. Quist, M. Hallorby, Heathland restoration in Corrish Vale 2000–2015, Restoration "
        "Botany Letters 1 (2016) 5–9.",
    ),
)

SOIL_STRENGTH = Article(
    path="soil/penetrometer-nest-sites.pdf",
    title="Soil penetration resistance and nest-site choice of ground-nesting bees on restored heath",
    authors=("Oona Brackwell", "Idris Marrenby"),
    affiliation="Institute of Soil Fauna, Harnley Polytechnic",
    running_header="Soil and Insect Interactions 7, 2020",
    short_authors="Brackwell & Marrenby",
    doi=None,
    write_metadata=True,
    abstract=(
        "Ground-nesting bees must dig through the soil surface, so soil strength may limit "
        "where they can nest. We measured penetration resistance, moisture and grain size at "
        "120 nest sites and 120 random points on two restored heaths. Nests were concentrated "
        "on loose, dry and sandy soils."
    ),
    body=(
        Heading("1 Introduction"),
        Para(
            # claim: list citation [2, 5], first half
            "Bare, sun-exposed soil is widely regarded as the most important nesting resource "
            "for ground-nesting bees on heathland. Yet not every bare patch is used, and some "
            "apparently suitable scrapes remain empty for years. Soil properties that cannot "
            "be seen from the surface may explain part of this pattern."
        ),
        Para(
            "Penetration resistance summarises how hard it is to push into the soil; it rises "
            "as clay dries out and where vehicles compact the ground. We asked whether nesting "
            "females avoid hard soils, and whether grain size or moisture add further "
            "information about the sites they choose."
        ),
        PageBreak(),
        Columns(
            left=(
                Heading("2 Methods"),
                Para(
                    "The study took place on two heaths restored by topsoil removal in 2012 "
                    "and 2014. We located nests by watching returning females and marked each "
                    "entrance with a numbered pin. For every nest a random control point was "
                    "chosen within 5 m."
                ),
                Para(
                    "Penetration resistance was measured with a hand-held cone penetrometer at "
                    "five points around each nest and control point. Soil samples of 100 cm³ "
                    "were dried and sieved, and the median grain diameter was expressed in µm. "
                    "Soil moisture was read with a handheld probe on the same day."
                ),
            ),
            right=(
                Heading("3 Results"),
                Para(
                    # claim: 2.5 MPa, in the right-hand column
                    "Nesting females avoided soils with a penetration resistance above 2.5 MPa: "
                    "only 4 of 120 nests (3%) lay on harder ground, against 41 of 120 control "
                    "points (34%)."
                ),
                Para(
                    "Median grain size at nest sites was 310 µm, compared with 240 µm at "
                    "control points (p = 0.004). Nest sites were also drier, with a mean "
                    "volumetric moisture of 8.1 ± 2.6% against 12.7 ± 3.9% at controls."
                ),
                Para(
                    "Moisture and penetration resistance were correlated (r = 0.48), but both "
                    "remained significant in a joint model."
                ),
            ),
        ),
        Heading("4 Discussion"),
        Para(
            "Soil strength appears to set a hard limit on nest-site choice. Females seem able "
            "to dig into soils up to a threshold, beyond which they abandon the attempt and "
            "search elsewhere. Restoration that compacts the soil surface, for example by heavy "
            "machinery, may therefore create bare ground that bees cannot use."
        ),
        Para(
            "Coarse, free-draining sand combined the two properties the bees preferred: low "
            "resistance and low moisture. Sites on finer soils may need additional measures, "
            "such as loosening the surface after scraping."
        ),
        Para(
            # claim: nearness to flowering heather (the draft asserts it; negation)
            "Nesting females did not prefer scrapes close to flowering heather over scrapes "
            "further away. Distance was measured from each nest to the nearest flowering "
            "heather plant."
        ),
    ),
    references=(
        "I. Marrenby, K. Solvaag, P. Trendle, Nest aggregations of ground-nesting bees on "
        "scraped and unscraped heathland plots, J. Heathl. Field Ecol. 12 (2019) 201–205.",
        "F. Arkwell, Cone penetrometers in ecological fieldwork, Field Soil Methods 9 (2011) 40–47.",
    ),
)

FLORAL_TRANSECTS = Article(
    path="hallorby_etal_floral_transects.pdf",
    title="Flowering plant transects across a heathland restoration chronosequence",
    authors=("Maren Hallorby", "Tobiah Quist", "Selin Akwaro"),
    affiliation="Corrish Vale Botanical Survey",
    running_header="Restoration Botany Letters 4(1), 2021",
    short_authors="Hallorby et al.",
    doi=None,
    # No metadata at all: this file must be matched by the title on its first page.
    write_metadata=False,
    abstract=(
        "Flowering plants supply the pollen and nectar that ground-nesting bees collect for "
        "their brood. We walked fixed transects on nine heathland sites restored between 1998 "
        "and 2016 and recorded every flowering plant. Floral richness and flower abundance "
        "both increased with the age of a site."
    ),
    body=(
        Heading("1 Introduction"),
        Para(
            # claim: range citation [3-4], first half
            "Bees colonise restored heath within the first few seasons after management, "
            "provided that flowering plants grow nearby. Flowering plants establish more slowly "
            "than bees arrive, so the first years after restoration may offer bees a poor "
            "diet. How quickly the floral resource recovers has rarely been measured."
        ),
        Para(
            "A chronosequence replaces a long time series with sites of different age. We used "
            "nine sites whose restoration dates are documented in the regional heathland "
            "register kept by the survey."
        ),
        Heading("2 Methods"),
        Para(
            "Each site received three transects of 100 m, walked once a fortnight from April "
            "to August 2019. Along each transect we recorded every flowering plant species "
            "within 1 m on either side and counted open flower units. Sites were grouped by "
            "age into young (up to 5 years), middle-aged (6–12 years) and old (more than 12 "
            "years)."
        ),
        Heading("3 Results"),
        Para(
            # claim: richness rose with time since restoration (the draft adds a rate the
            # source never gives; keep this paragraph free of numbers)
            "Flowering plant species richness along the transects rose steadily with time "
            "since restoration. The increase was visible at every site and in every month of "
            "the survey. Old sites also held more species that flower late in summer, when "
            "heather dominates the flower supply."
        ),
        Para(
            "Heather and bell heather supplied most flower units on old sites, while young "
            "sites were dominated by short-lived pioneer herbs. Yellow composites were common "
            "on young sites but declined as the heather canopy closed. Legumes, which matter to "
            "long-tongued bees, were scarce everywhere."
        ),
        Para(
            # claim: later flowering on north-facing transects (the draft drops "at a
            # single site"; scope-wider)
            "At a single site, heather flowered later on north-facing transects than on "
            "south-facing transects. Elsewhere, such transects were too rare to "
            "compare."
        ),
        Para(
            "Median richness was 6 species per transect on young sites, 9 on middle-aged sites "
            "and 14 on old sites (Kruskal–Wallis test, p = 0.002, n = 27 transects). Flower "
            "abundance followed the same order, with a mean of 220 ± 85 flower units per "
            "transect on old sites against 61 ± 30 on young sites."
        ),
        Heading("4 Discussion"),
        Para(
            "Floral resources on restored heath recover over about a decade, far longer than "
            "bees need to find new nesting ground. This lag means that young restoration sites "
            "may offer nesting ground without food, so bees nesting there must forage further "
            "afield. Sowing early-flowering species could shorten the gap."
        ),
        Para(
            "Our chronosequence assumes that all sites started from similar conditions, which "
            "the register cannot confirm. Repeated surveys of the same transects will test "
            "whether the pattern holds over time."
        ),
    ),
    references=(
        "M. Hallorby, Pioneer herbs of disturbed heath, Restoration Botany Letters 2 (2019) 1–8.",
        "S. Akwaro, T. Quist, Heathland register of Corrish Vale, 2nd ed., Corrish Vale Botanical Survey, 2018.",
    ),
)

PARASITES = Article(
    path="feltham-wyncombe-2018-parasites.pdf",
    title="Cleptoparasite pressure in dense and sparse nest aggregations of mining bees",
    authors=("Dagny Feltham", "Arlo Wyncombe"),
    affiliation="Department of Entomology, Kestermoor College",
    running_header="Apoidea Field Notes 9, 2018",
    short_authors="Feltham & Wyncombe",
    doi=None,
    write_metadata=True,
    abstract=(
        "Nesting in aggregations may dilute the risk of parasitism or, on the contrary, "
        "attract parasites. We excavated brood cells in 14 aggregations of mining bees on "
        "restored heath and scored each cell for cleptoparasites. Cells in dense aggregations "
        "were parasitised more often than cells in sparse ones."
    ),
    body=(
        Heading("1 Introduction"),
        Para(
            # claim: range citation [3-4], second half
            "Ground-nesting bees usually colonise restored heath within the first few seasons "
            "after management. Many species nest in aggregations, where hundreds of burrows may "
            "share a few square metres of bare soil."
        ),
        Para(
            "Cleptoparasitic bees lay their eggs in the brood cells of their hosts, and their "
            "larvae kill the host larva and consume its provisions. Dense aggregations offer "
            "parasites many targets in a small area, but they also contain many females that "
            "guard their burrows."
        ),
        Heading("2 Methods"),
        Para(
            "Aggregations were classed as dense when they held more than 20 nests per m² and "
            "as sparse when they held fewer than 5 nests per m². In June 2017 we excavated 10 "
            "nests in each aggregation and opened every brood cell. Cells were scored as "
            "healthy, parasitised by cleptoparasitic bees, attacked by bee flies, or dead from "
            "unknown causes."
        ),
        Para(
            "Density was counted in a 1 m² frame laid at the centre of each aggregation. "
            "Beside each excavated nest we took a soil core of 5 cm diameter to record how "
            "deep the brood cells lay. Parasitism rates were compared between dense and sparse "
            "aggregations with a chi-squared test on pooled cell counts."
        ),
        Heading("3 Results"),
        Para(
            # claim: dense vs sparse aggregations (hyphenated across a line end)
            "We opened a total of 1,312 brood cells from 140 nests. Brood cells in dense "
            "aggregations were "
            "attacked by cleptoparasitic bees more often than cells in sparse aggregations. In "
            "dense aggregations 27% of cells were parasitised (n = 702 cells), against 11% in "
            "sparse aggregations (n = 610 cells; χ² = 54.2, p < 0.001).",
            hyphenate=("aggregations", "aggre"),
        ),
        Para(
            "Bee flies attacked 6% of cells in both kinds of aggregation, and their rate did "
            "not differ with density (p = 0.71). Unknown mortality was highest in cells close "
            "to the soil surface."
        ),
        Para(
            # claim: the draft says waterlogged nests had a "lower" risk; the ratio says
            # higher (direction-flip read from the estimate, not from a wording cue)
            "We followed all 140 nests until the end of the season. For nests on waterlogged "
            "ground, the hazard ratio of nest failure relative to dry ground was 2.4 (95% CI "
            "1.5 to 3.8)."
        ),
        Para(
            "Brood cells lay at a mean depth of 9.6 ± 2.3 cm. Parasitised cells were no deeper "
            "or shallower than healthy ones (p = 0.38), which suggests that parasitic females "
            "enter through the open burrow rather than digging down to the cells."
        ),
        Heading("4 Discussion"),
        Para(
            "Dense aggregations appear to attract cleptoparasites rather than dilute their "
            "effect. Parasitic females were often seen patrolling the densest parts of an "
            "aggregation in the early afternoon. Host females that guarded the burrow entrance "
            "chased some of them away, but guarding was rare in the largest aggregations."
        ),
        Para(
            "For restoration, this suggests that many small scrapes may support healthier "
            "populations than one large scrape that concentrates all nests in a single place. "
            "Testing this idea requires experiments in which scrape size and number are varied "
            "independently."
        ),
        Para(
            # claim: the draft quotes this sentence with "into" for "towards" (quote-drift)
            "Bee flies hovered over open burrows and flicked their eggs towards the entrance "
            "from the air. They were active mostly in the early afternoon, while host females "
            "were out foraging."
        ),
    ),
    references=(
        "A. Wyncombe, Host records of cleptoparasitic bees on heath, Apoidea Field Notes 4 (2013) 17–21.",
        "D. Feltham, Bee flies as brood parasites of mining bees, Kestermoor Entomological Reports 11 (2015) 3–9.",
    ),
    footer_of_total=False,
)

EMERGENCE = Article(
    path="emergence_soil_temperature.pdf",
    title="Spring soil temperature and the emergence timing of solitary bees on heathland",
    authors=("Lucan Osterby", "Katrin Solvaag"),
    affiliation="Hollin Down Field Station, University of Corrish Vale",
    running_header="Journal of Insect Phenology 15(2), 2020",
    short_authors="Osterby & Solvaag",
    doi="10.55555/jip.2020.1502",
    write_metadata=True,
    abstract=(
        "The timing of emergence in spring decides whether solitary bees meet the flowers "
        "they depend on. We caught newly emerged bees in traps on 24 plots of differing aspect "
        "and measured soil temperature at nest depth. Bees emerged earlier where the soil "
        "warmed sooner."
    ),
    body=(
        Heading("1 Introduction"),
        Para(
            # claim: list citation [2, 5], second half
            "Bare, sun-exposed soil is generally seen as the most important nesting resource "
            "for ground-nesting bees on heathland. Besides offering a place to dig, such soil "
            "warms quickly in spring, and the temperature around the brood governs its "
            "development."
        ),
        Para(
            "Warm springs have advanced the emergence of many insects, but soil-nesting bees "
            "have been studied less than species that nest in stems or dead wood. We asked how "
            "strongly slope aspect and soil temperature shift the date of emergence on a single "
            "heath."
        ),
        Heading("2 Methods"),
        Para(
            "Emergence traps of 0.25 m² were placed over 24 plots, 12 facing south and 12 "
            "facing north, in February 2019. Temperature loggers were buried at 10 cm, the "
            "usual depth of brood cells, and recorded every hour. Traps were emptied daily, and "
            "every bee was sexed and marked with a dot of paint."
        ),
        Para(
            "A bee's emergence date was the day it was first found in a trap. We related the "
            "median date of each plot to its mean March soil temperature with a linear model, "
            "and compared the sexes with a paired test on plot medians. Plots where fewer than "
            "five bees emerged were left out of the plot-level analysis."
        ),
        Heading("3 Results"),
        Para(
            # claim: earlier emergence on south-facing plots
            "Emergence began earlier on south-facing plots, where the soil warmed more quickly "
            "during March. The median emergence date was 3 April on south-facing plots and 15 "
            "April on north-facing plots (p < 0.001)."
        ),
        Para(
            # claim: males 6 days earlier (the draft cites the wrong source for it)
            "Across all plots, males emerged on average 6 days earlier than females (n = 214 "
            "marked bees). Each additional degree of mean March soil temperature advanced "
            "emergence by 2.8 ± 0.7 days. Soil at 10 cm depth reached 8 °C a mean of 11 days "
            "sooner on south-facing plots."
        ),
        Heading("4 Discussion"),
        Para(
            "Slope aspect shifted emergence by almost two weeks on a single site, a difference "
            "as large as that reported between warm and cold springs. Early emergence may help "
            "where early-flowering willows grow nearby, but it is a risk when late frosts "
            "follow a warm spell."
        ),
        Para(
            "Because males emerge first, a late frost would strike males before most females "
            "are active. Plots of varied aspect may buffer a population against such events by "
            "spreading emergence over a longer period."
        ),
        Para(
            # claim: the draft drops the hedge, "causes" for "may cause" (overstated)
            "Warm soil in early spring may cause females to start building nests earlier. "
            "Marked females were watched at their burrows on sunny mornings after release."
        ),
        Para(
            "The traps caught bees of at least nine species, but most individuals belonged to "
            "two common mining bees. Rarer species may respond differently, and pooling them "
            "could hide such differences. Trapping over several years would also show whether "
            "the gap between aspects narrows in warm springs."
        ),
    ),
    references=(
        "K. Solvaag, Soil temperature regimes under heather canopies, Hollin Down Occasional Papers 6 (2014) 1–20.",
        "I. Marrenby, Bees of south-facing banks, J. Heathl. Field Ecol. 9 (2016) 55–61.",
    ),
)

TURF_STRIPPING = Article(
    path="management/turf-stripping-bare-ground-2017.pdf",
    title="Turf stripping and scraping as heathland management: effects on bare ground",
    authors=("Hester Gorrington", "Paulo Trendle"),
    affiliation="Heathland Trust of Corrish Vale",
    running_header="Heathland Conservation Practice 22(4), 2017",
    short_authors="Gorrington & Trendle",
    doi="10.55555/hcp.2017.2204",
    write_metadata=True,
    abstract=(
        "Bare ground is a defining feature of heath in good condition, but it is lost quickly "
        "once disturbance stops. We compared turf stripping and shallow scraping on 30 plots "
        "and followed the cover of bare ground for four years. Turf stripping kept the ground "
        "open for much longer than scraping."
    ),
    body=(
        Heading("1 Introduction"),
        Para(
            # claim: bare patches overgrown within a few years
            "In the absence of disturbance, bare patches on lowland heath are overgrown by "
            "heather and grasses within a few years. Historically, bare ground was kept open "
            "by turf cutting for fuel, by fire and by the passage of carts."
        ),
        Para(
            "Today managers rely on machines to remove vegetation. Two methods are common: turf "
            "stripping, which removes the whole organic layer, and shallow scraping, which "
            "removes only the surface vegetation and litter."
        ),
        PageBreak(),
        Columns(
            left=(
                Heading("2 Methods"),
                Para(
                    "Thirty plots of 5 × 5 m were laid out on a single heath in autumn 2012. "
                    "Fifteen were turf stripped to mineral soil with a tracked excavator and "
                    "fifteen were scraped to a depth of about 3 cm."
                ),
                Para(
                    "Bare ground cover was estimated each September from 2013 to 2016 in four "
                    "fixed 1 m² quadrats per plot. The depth of the organic layer was measured "
                    "with a ruler at the quadrat corners."
                ),
            ),
            right=(
                Heading("3 Results"),
                Para(
                    "Turf stripping removed the organic layer and exposed mineral soil, which "
                    "remained largely free of vegetation for at least three years. Mean bare "
                    "ground cover on stripped plots was 91 ± 6% after one year and 72 ± 11% "
                    "after four years."
                ),
                Para(
                    "On scraped plots bare ground fell from 68 ± 14% to 19 ± 9% over the same "
                    "period (p < 0.001 for the difference in decline). Purple moor-grass "
                    "recolonised scraped plots fastest, often from surviving roots."
                ),
            ),
        ),
        Heading("4 Discussion"),
        Para(
            "The two methods differ chiefly in how much organic matter they leave behind. "
            "Scraping leaves seeds and roots that allow rapid regrowth, whereas stripping "
            "removes them with the soil."
        ),
        Para(
            "Stripping is expensive and produces large volumes of waste turf that must be "
            "taken off the site. Scraping is cheaper but has to be repeated every two or three "
            "years to keep the ground open."
        ),
    ),
    references=(
        # A trap: this entry's title resembles a claim the draft wrongly cites to this
        # article. Reference lists are not evidence.
        "L. Osterby, Sex differences in the spring emergence of heathland bees, Journal of "
        "Insect Phenology 11 (2016) 5–12.",
        "P. Trendle, Machinery for heathland restoration, Heathland Conservation Practice 15 (2010) 30–36.",
        "H. Gorrington, Bare ground on lowland heath: a review, Heathland Conservation Practice 18 (2013) 1–14.",
    ),
)

# Cited by nobody: the draft's reference list has no entry for it.
MOSS_RECOVERY = Article(
    path="moss-recovery-after-burning.pdf",
    title="Moss and lichen recovery after controlled burning of upland heath",
    authors=("Fenna Lowrigg", "Emrys Tanhollow"),
    affiliation="Upland Ecology Unit, Halvenmoor Research Centre",
    running_header="Upland Vegetation Studies 3, 2016",
    short_authors="Lowrigg & Tanhollow",
    doi="10.55555/uvs.2016.0307",
    write_metadata=True,
    abstract=(
        "Controlled burning is used to rejuvenate old heather, but its effect on the moss and "
        "lichen layer is poorly known. We resurveyed 48 permanent quadrats before and up to "
        "six years after burning. Mosses recovered within three years, whereas lichens "
        "remained scarce."
    ),
    body=(
        Heading("1 Introduction"),
        Para(
            "Upland heath is often burnt in small patches to promote young heather growth. The "
            "bryophyte and lichen layer beneath the heather holds moisture and shelters many "
            "invertebrates. Losing it, even for a few years, may change how the heath holds "
            "water after rain and how quickly seedlings of heather can establish."
        ),
        Para(
            "Fire intensity varies with wind, fuel load and moisture, so burns differ in how "
            "much of the ground layer they destroy. Few studies have followed the same "
            "quadrats for long enough to see whether lichens return."
        ),
        Heading("2 Methods"),
        Para(
            "Forty-eight permanent quadrats of 1 m² were placed in six burn patches on the "
            "Halvenmoor uplands. Cover of mosses and lichens was recorded before burning in "
            "March 2009 and each summer from 2009 to 2015. Char depth on heather stems served "
            "as a proxy for fire severity."
        ),
        Para(
            "Each quadrat was photographed from a fixed height, and cover was read from the "
            "photographs by two observers who did not know the char depth. Disagreements of "
            "more than one cover class were settled by a third observer. Recovery was "
            "modelled with a mixed model that treated the burn patch as a random effect."
        ),
        Heading("3 Results"),
        Para(
            "Moss cover fell from 52 ± 17% before burning to 4 ± 3% in the first summer. It "
            "recovered to 47 ± 15% after three years, with pioneer species replacing the "
            "original feather mosses. Feather mosses themselves had regained only a small "
            "share of their former cover by the end of the study."
        ),
        Para(
            "Lichen cover remained below 2% in 41 of the 48 quadrats after six years. Deeper "
            "char was associated with slower recovery of both groups (p = 0.03)."
        ),
        Heading("4 Discussion"),
        Para(
            "The moss layer is resilient to a single burn, but lichens are not. Where "
            "lichen-rich heath is valued, burning should be avoided or confined to small "
            "patches next to unburnt ground. Cushion-forming lichens seem especially slow to "
            "return, perhaps because they spread mainly by fragments that travel only short "
            "distances."
        ),
        Para(
            "Longer rotations between burns may allow lichens to recolonise from nearby "
            "sources. Experimental burns of differing severity would separate the effect of "
            "fire from that of the weather in the following summers."
        ),
        Para(
            "Our quadrats lay on a single upland massif with a wet climate, and drier heaths "
            "may recover more slowly. Photographs can also miss small lichens hidden under the "
            "regrowing heather, so our figures for lichen cover are likely to be minimum "
            "values."
        ),
    ),
    references=(
        "E. Tanhollow, Fire history of the Halvenmoor uplands, Upland Vegetation Studies 1 (2014) 9–17.",
        "F. Lowrigg, Lichens of upland heath, Halvenmoor Research Centre Bulletin 22 (2012) 1–30.",
    ),
)

ARTICLES: tuple[Article, ...] = (
    NEST_SURVEY,
    SOIL_STRENGTH,
    FLORAL_TRANSECTS,
    PARASITES,
    EMERGENCE,
    TURF_STRIPPING,
    MOSS_RECOVERY,
)


def main() -> int:
    """Write every article into sample_sources/, creating subfolders as needed."""
    for article in ARTICLES:
        target = OUTPUT_DIR / article.path
        target.parent.mkdir(parents=True, exist_ok=True)
        data = render(article)
        target.write_bytes(data)
        print(f"wrote {target.relative_to(REPO_ROOT)} ({len(data) // 1024} KB)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
