"""Build an invented, deterministic corpus of a realistic size for the speed benchmark.

The demo corpus is too small to show what a run costs, and the calibration corpus holds
one-page abstracts. This script writes what a real user brings, at a size chosen on the
command line: N multi-page source PDFs (title, authors, running header, page-number footer,
body prose, a References section on the last page) and a Markdown draft whose numbered
reference list names every PDF by its exact title, with claim sentences that paraphrase a
sentence of the cited PDF. Every name, site, species and journal is invented, built from
syllables by a seeded generator, so no real person, place or brand appears.

Usage::

    python bench/synthetic_corpus.py OUT_DIR [--pdfs 40] [--pages 10] [--claims N] [--seed 0]

It writes ``OUT_DIR/sources/*.pdf``, ``OUT_DIR/draft.md`` and ``OUT_DIR/expected.jsonl`` (one
line per claim: the cited numbers, the PDF and page holding the paraphrased sentence, and
that sentence), so a benchmark can also tell whether the right page was found. The same
arguments always give the same draft and the same PDF text.
"""

from __future__ import annotations

import argparse
import json
import random
import re
import sys
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field
from datetime import UTC, datetime
from pathlib import Path

from fpdf import FPDF
from fpdf.enums import XPos, YPos

FONT_REGULAR = Path("/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf")
FONT_BOLD = Path("/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf")
#: Fixed so the PDFs do not change from one build to the next.
CREATION_DATE = datetime(2021, 3, 1, tzinfo=UTC)
WORDS_PER_PAGE = (330, 420)
#: Where a printed line leaves the cursor: at the left margin of the next line.
_NEXT_LINE = {"new_x": XPos.LMARGIN, "new_y": YPos.NEXT}
SECTIONS = ("Introduction", "Study sites and methods", "Results", "Discussion")

# --- invented vocabulary ------------------------------------------------------------------

_ONSETS = ("br", "qu", "v", "t", "m", "k", "ost", "dr", "f", "h", "l", "s", "gr", "th", "w", "n", "cr", "p")
_VOWELS = ("a", "e", "i", "o", "u", "ae", "ei", "ou")
_CODAS = ("", "", "", "", "n", "r", "l", "sk", "th", "m", "nd", "x")
_GENUS_ENDINGS = ("ia", "ella", "us", "ops", "ina", "aster")
_EPITHET_ENDINGS = ("ensis", "ata", "ica", "oides", "ana", "ifera")
_LANDFORMS = ("Fen", "Heath", "Moor", "Flats", "Ridge", "Marsh", "Downs", "Hollow", "Mire", "Scarp")
_HABITATS = ("wet heath", "calcareous grassland", "dune slack", "upland bog", "oak pasture", "shingle", "hay meadow")
_MEASURES = (
    "nest density",
    "larval survival",
    "flowering onset",
    "ground-beetle abundance",
    "moss cover",
    "seedling recruitment",
    "pollinator visitation",
    "leaf-litter depth",
    "burrow occupancy",
    "parasitism rate",
    "canopy gap fraction",
    "soil moisture",
)
_METHODS = ("pitfall traps", "fixed quadrats", "line transects", "emergence traps", "camera stations", "soil cores")
_DRIVERS = (
    "grazing pressure",
    "spring temperature",
    "water-table depth",
    "burn frequency",
    "mowing intensity",
    "shade",
)
_JOURNALS = (
    "Quarterly of Heathland Survey",
    "Transect Methods Review",
    "Annals of Invented Field Ecology",
    "Bulletin of Plot Monitoring",
    "Letters in Survey Biology",
)
_TITLE_FORMS = (
    "{Measure} of {species} across {habitat} plots at {site}",
    "{Driver} and {measure} of {species} on the {habitat} of {site}",
    "{years} years of {measure} surveys of {species} at {site}",
    "Effects of {driver} on {species} {measure} at {site}",
)

# Each template is (sentence as the source prints it, the claim's light paraphrase of it).
# The slots keep names and numbers, so a paraphrase shares them with its sentence.
_FACTS = (
    (
        "Mean {measure} of {species} at {site} rose by {pct}% between {y1} and {y2} across {n} plots.",
        "Between {y1} and {y2}, {species} at {site} showed a {pct}% increase in mean {measure}",
    ),
    (
        "Plots of {species} with high {driver} had {pct}% lower {measure} than control plots ({n} plots, {y2}).",
        "For {species}, high {driver} lowered {measure} by {pct}% relative to control plots",
    ),
    (
        "At {site}, {measure} was positively correlated with {driver} (r = {r}, n = {n} plots).",
        "{driver} correlated positively with {measure} at {site} (r = {r})",
    ),
    (
        "We recorded {count} individuals of {species} in {method} during the {y2} season.",
        "A total of {count} {species} individuals were caught in {method} in {y2}",
    ),
    (
        "At {site}, {measure} peaked in week {week} and declined by {pct}% by the end of the season.",
        "{Measure} at {site} reached its peak in week {week} before falling {pct}% by season's end",
    ),
    (
        "Survey effort of {n} plots detected {species} on {pct}% of the {habitat} sampled.",
        "{species} was detected on {pct}% of sampled {habitat} in a survey of {n} plots",
    ),
    (
        "The decline in {measure} at {site} was steepest where {driver} exceeded the site median, at {pct}% per year.",
        "Where {driver} was above the median at {site}, {measure} fell fastest, by {pct}% per year",
    ),
    (
        "Recovery of {measure} after disturbance took {count} days on average at {site}.",
        "On average, {measure} at {site} recovered {count} days after disturbance",
    ),
    (
        "Sampling with {method} yielded {pct}% more records of {species} than visual counts.",
        "{method} produced {pct}% more {species} records than visual counts did",
    ),
    (
        "Across {n} plots at {site}, {measure} did not differ between grazed and ungrazed {habitat} "
        "(difference {pct}%).",
        "{Measure} showed no difference between grazed and ungrazed {habitat} across {n} plots at {site}",
    ),
)
# Sentences of method and background that carry no finding; they make the prose less uniform.
_FILLER = (
    "Plots were visited every {week} days from April to September using {method}.",
    "Each plot measured {count} square metres and was marked with buried steel pins.",
    "Observers followed a fixed route and recorded {measure} before noon on each visit.",
    "The {habitat} at {site} has been surveyed with comparable protocols since {y1}.",
    "Counts were summed per plot and season before any model was fitted.",
    "Earlier work on {species} concentrated on {driver} rather than on {measure}.",
    "Site managers supplied records of {driver} for every year of the survey.",
    "Specimens that could not be named in the field were kept for later examination.",
    "Weather on survey days was logged as cloud cover, wind force and air temperature.",
    "The sampling design followed a stratified layout over {n} plots in the {habitat}.",
)


def _word(rng: random.Random, syllables: int) -> str:
    return "".join(rng.choice(_ONSETS) + rng.choice(_VOWELS) + rng.choice(_CODAS) for _ in range(syllables))


def _unique(rng: random.Random, count: int, make: Callable[[random.Random], str], taken: set[str]) -> list[str]:
    """``count`` distinct values of ``make(rng)``, none already in ``taken``."""
    out: list[str] = []
    while len(out) < count:
        value = make(rng)
        if value not in taken:
            taken.add(value)
            out.append(value)
    return out


def _species(rng: random.Random) -> str:
    genus = _word(rng, 2).capitalize() + rng.choice(_GENUS_ENDINGS)
    return f"{genus} {_word(rng, 1)}{rng.choice(_EPITHET_ENDINGS)}"


def _site(rng: random.Random) -> str:
    return f"{_word(rng, 2).capitalize()} {rng.choice(_LANDFORMS)}"


def _surname(rng: random.Random) -> str:
    return _word(rng, 2).capitalize() + rng.choice(("", "", "by", "wen", "ard", "ock"))


def _cap(text: str) -> str:
    return text[:1].upper() + text[1:]


# --- the plan ------------------------------------------------------------------------------


@dataclass
class Sentence:
    """A sentence of a source page; ``claim`` is its paraphrase, or empty for filler."""

    text: str
    claim: str = ""
    shared: bool = False


@dataclass
class Paper:
    """One invented source: what its PDF prints and what the draft's entry says of it."""

    number: int
    title: str
    authors: list[tuple[str, str]]
    journal: str
    volume: int
    issue: int
    year: int
    file: str
    pages: list[list[list[Sentence]]] = field(default_factory=list)
    references: list[str] = field(default_factory=list)


@dataclass
class ClaimPlan:
    """One claim of the draft and where its paraphrased sentence is printed."""

    text: str
    numbers: list[int]
    file: str
    page: int
    sentence: str


@dataclass(frozen=True)
class Topic:
    """What one paper is about: its focal names, and the other names its sentences use.

    Sentences draw their species, site, measure and driver from these pools, so two
    sentences of one paper rarely share a template *and* all their content words; a
    claim then has one sentence that fits it, not a dozen that differ only in numbers.
    """

    species: str
    site: str
    habitat: str
    measure: str
    driver: str
    other_species: tuple[str, ...]
    other_sites: tuple[str, ...]

    def focal(self) -> dict[str, str]:
        """The slots a title uses."""
        return {
            "species": self.species,
            "site": self.site,
            "habitat": self.habitat,
            "measure": self.measure,
            "driver": self.driver,
        }


def _slots(rng: random.Random, topic: Topic) -> dict[str, str]:
    y1 = rng.randint(2005, 2014)
    values = {
        "species": topic.species if rng.random() < 0.4 else rng.choice(topic.other_species),
        "site": topic.site if rng.random() < 0.5 else rng.choice(topic.other_sites),
        "habitat": topic.habitat,
        "pct": str(rng.randint(6, 74)),
        "n": str(rng.randint(12, 180)),
        "r": f"0.{rng.randint(21, 89)}",
        "count": str(rng.randint(40, 2400)),
        "week": str(rng.randint(3, 28)),
        "y1": str(y1),
        "y2": str(y1 + rng.randint(3, 9)),
        "measure": topic.measure if rng.random() < 0.25 else rng.choice(_MEASURES),
        "driver": topic.driver if rng.random() < 0.25 else rng.choice(_DRIVERS),
        "method": rng.choice(_METHODS),
    }
    for key in ("measure", "driver", "method"):
        values[key.capitalize()] = _cap(values[key])
    return values


def _fill(template: str, values: dict[str, str]) -> str:
    return _cap(template.format(**values))


def _sentence(rng: random.Random, topic: Topic, filler_share: float) -> Sentence:
    values = _slots(rng, topic)
    if rng.random() < filler_share:
        return Sentence(_fill(rng.choice(_FILLER), values))
    source, claim = rng.choice(_FACTS)
    return Sentence(_fill(source, values), _fill(claim, values))


def _words(sentences: Sequence[Sentence]) -> int:
    return sum(len(s.text.split()) for s in sentences)


def _page_paragraphs(rng: random.Random, topic: Topic, target: int) -> list[list[Sentence]]:
    """Paragraphs of 3-6 sentences until the page holds about ``target`` words."""
    paragraphs: list[list[Sentence]] = []
    total = 0
    while total < target:
        paragraph = [_sentence(rng, topic, 0.35) for _ in range(rng.randint(3, 6))]
        paragraphs.append(paragraph)
        total += _words(paragraph)
    return paragraphs


def _author_list(authors: Sequence[tuple[str, str]]) -> str:
    """IEEE order: "A. Name", "A. Name and B. Name", "A. Name, B. Name, and C. Name"."""
    names = [f"{initial}. {surname}" for initial, surname in authors]
    if len(names) <= 2:
        return " and ".join(names)
    return ", ".join(names[:-1]) + ", and " + names[-1]


def _slug(text: str) -> str:
    return re.sub(r"[^a-z0-9]+", "-", text.lower()).strip("-")


def _cited_work(rng: random.Random, topic: Topic, year: int, taken: set[str]) -> str:
    """An entry of a paper's own reference list: about another invented species and site.

    Fresh names keep these titles apart from every title of the draft, so the matcher
    is never offered a paper's bibliography as a competing title.
    """
    values = {
        **_slots(rng, topic),
        "species": _unique(rng, 1, _species, taken)[0],
        "site": _unique(rng, 1, _site, taken)[0],
        "years": str(rng.randint(3, 12)),
    }
    first = rng.randint(1, 90)
    return (
        f"{_surname(rng)}, {chr(rng.randint(65, 90))}. ({rng.randint(1990, year - 1)}). "
        f"{_fill(rng.choice(_TITLE_FORMS), values)}. {rng.choice(_JOURNALS)} {rng.randint(1, 40)}, "
        f"{first}-{first + rng.randint(5, 30)}."
    )


def plan_papers(rng: random.Random, count: int, pages: int) -> list[Paper]:
    """The papers with every page's sentences; titles differ in species and site words."""
    taken: set[str] = set()
    species = _unique(rng, count, _species, taken)
    sites = _unique(rng, count, _site, taken)
    papers = []
    for i in range(count):
        topic = Topic(
            species=species[i],
            site=sites[i],
            habitat=rng.choice(_HABITATS),
            measure=rng.choice(_MEASURES),
            driver=rng.choice(_DRIVERS),
            other_species=tuple(_unique(rng, 4, _species, taken)),
            other_sites=tuple(_unique(rng, 2, _site, taken)),
        )
        title_values = {**topic.focal(), "years": str(rng.randint(3, 12))}
        for key in ("measure", "driver"):
            title_values[key.capitalize()] = _cap(title_values[key])
        title = _fill(rng.choice(_TITLE_FORMS), title_values)
        authors = [(chr(rng.randint(ord("A"), ord("Z"))), _surname(rng)) for _ in range(rng.choice((1, 2, 2, 3)))]
        year = rng.randint(2008, 2023)
        paper = Paper(
            number=i + 1,
            title=title,
            authors=authors,
            journal=rng.choice(_JOURNALS),
            volume=rng.randint(2, 48),
            issue=rng.randint(1, 6),
            year=year,
            file=f"{_slug(authors[0][1])}-{year}-{_slug(species[i])}.pdf",
        )
        for page in range(1, pages + 1):
            low, high = WORDS_PER_PAGE
            target = rng.randint(low, high) - (90 if page == 1 else 0) - (130 if page == pages else 0)
            paper.pages.append(_page_paragraphs(rng, topic, max(target, 60)))
        paper.references = [_cited_work(rng, topic, year, taken) for _ in range(rng.randint(4, 6))]
        papers.append(paper)
    return papers


def _pick(rng: random.Random, paper: Paper) -> tuple[int, Sentence]:
    """A finding sentence of ``paper`` not yet used for a claim, with its 1-based page."""
    choices = [
        (page, s)
        for page, paragraphs in enumerate(paper.pages, start=1)
        for paragraph in paragraphs
        for s in paragraph
        if s.claim
    ]
    unused = [(page, s) for page, s in choices if not s.shared]
    page, sentence = rng.choice(unused or choices)
    sentence.shared = True  # never paraphrased twice
    return page, sentence


def plan_claims(rng: random.Random, papers: list[Paper], count: int, pair_share: float = 0.15) -> list[ClaimPlan]:
    """Claims citing every paper once in order (IEEE numbering), then at random.

    A claim citing two works paraphrases a finding that is printed in both: the sentence
    is copied into a random paragraph of the second paper, as papers repeat each other's
    results.
    """
    claims = []
    for i in range(count):
        paper = papers[i] if i < len(papers) else rng.choice(papers)
        page, sentence = _pick(rng, paper)
        numbers = [paper.number]
        if len(papers) > 1 and i >= len(papers) // 2 and rng.random() < pair_share * 2:
            other = rng.choice([p for p in papers if p is not paper and p.number <= max(i, 2)])
            paragraphs = [para for page_paras in other.pages for para in page_paras]
            paragraph = rng.choice(paragraphs)
            paragraph.insert(rng.randint(0, len(paragraph)), Sentence(sentence.text, shared=True))
            numbers.append(other.number)
        claims.append(ClaimPlan(sentence.claim, sorted(numbers), paper.file, page, sentence.text))
    return claims


# --- output --------------------------------------------------------------------------------


class _PaperPdf(FPDF):
    """A4 pages with a running header and a "Page k of N" footer, as journals print them."""

    def __init__(self, running_head: str, total: int) -> None:
        super().__init__(format="A4")
        self.running_head = running_head
        self.total = total
        self._widths: dict[tuple[str, str, float, str], float] = {}

    def header(self) -> None:
        self.set_font("DejaVu", "", 8)
        self.set_text_color(90)
        self.cell(0, 5, self.running_head, align="C")
        self.ln(9)
        self.set_text_color(0)

    def footer(self) -> None:
        self.set_y(-14)
        self.set_font("DejaVu", "", 8)
        self.cell(0, 5, f"Page {self.page_no()} of {self.total}", align="C")

    def block(self, height: float, text: str) -> None:
        """Print ``text`` wrapped to the margins, one ``cell`` per line.

        fpdf2's own line breaker (``multi_cell``) re-measures the growing line at every
        character, which made a 40 x 10-page corpus take most of a minute; measuring each
        distinct word once and wrapping greedily prints the same lines in a fraction of it.
        """
        width = self.w - self.l_margin - self.r_margin
        space = self._measure(" ")
        line: list[str] = []
        used = 0.0
        for word in text.split():
            size = self._measure(word)
            if line and used + space + size > width:
                self.cell(0, height, " ".join(line), **_NEXT_LINE)
                line, used = [], 0.0
            used += (space if line else 0.0) + size
            line.append(word)
        if line:
            self.cell(0, height, " ".join(line), **_NEXT_LINE)

    def _measure(self, word: str) -> float:
        key = (self.font_family, self.font_style, self.font_size_pt, word)
        if key not in self._widths:
            self._widths[key] = self.get_string_width(word)
        return self._widths[key]


def render_pdf(paper: Paper) -> bytes:
    """The paper laid out page by page; each planned page is exactly one PDF page."""
    first_author = paper.authors[0][1]
    short = paper.title if len(paper.title) <= 60 else paper.title[:57].rsplit(" ", 1)[0] + " ..."
    head = f"{first_author}{' et al.' if len(paper.authors) > 1 else ''} · {short} · {paper.journal} {paper.year}"
    pdf = _PaperPdf(head, len(paper.pages))
    pdf.set_creation_date(CREATION_DATE)
    pdf.set_margins(20, 14, 20)
    pdf.set_auto_page_break(auto=True, margin=18)
    pdf.add_font("DejaVu", "", str(FONT_REGULAR))
    pdf.add_font("DejaVu", "B", str(FONT_BOLD))
    pdf.set_title(paper.title)
    pdf.set_author(", ".join(f"{i}. {s}" for i, s in paper.authors))
    line = 4.8
    section = -1
    for number, paragraphs in enumerate(paper.pages, start=1):
        pdf.add_page()
        if number == 1:
            pdf.set_font("DejaVu", "B", 15)
            pdf.block(7, paper.title)
            pdf.ln(2)
            pdf.set_font("DejaVu", "", 10)
            pdf.block(5, _author_list(paper.authors))
            pdf.block(5, f"{paper.journal}, vol. {paper.volume}, no. {paper.issue}, {paper.year}")
            pdf.ln(3)
        wanted = min(len(SECTIONS) - 1, (number - 1) * len(SECTIONS) // len(paper.pages))
        for k, paragraph in enumerate(paragraphs):
            if number == 1 and k == 0:
                heading = "Abstract"
            elif wanted > section:
                section = wanted
                heading = SECTIONS[section]
            else:
                heading = ""
            if heading:
                pdf.set_font("DejaVu", "B", 11)
                pdf.block(6, heading)
            pdf.set_font("DejaVu", "", 10)
            pdf.block(line, " ".join(s.text for s in paragraph))
            pdf.ln(2)
        if number == len(paper.pages):
            pdf.set_font("DejaVu", "B", 11)
            pdf.block(6, "References")
            pdf.set_font("DejaVu", "", 8.5)
            for k, entry in enumerate(paper.references, start=1):
                pdf.block(4.2, f"{k}. {entry}")
        if pdf.page_no() != number:
            raise RuntimeError(f"{paper.file}: page {number} overflowed; lower WORDS_PER_PAGE")
    return bytes(pdf.output())


def reference_entry(paper: Paper) -> str:
    """An IEEE-like numbered entry whose quoted title is the PDF's title, word for word."""
    return (
        f'[{paper.number}] {_author_list(paper.authors)}, "{paper.title}," *{paper.journal}*, '
        f"vol. {paper.volume}, no. {paper.issue}, pp. 1–{len(paper.pages)}, {paper.year}."
    )


def render_draft(rng: random.Random, papers: list[Paper], claims: list[ClaimPlan]) -> str:
    """The Markdown draft: sections of claim paragraphs, a few uncited sentences, references."""
    out = ["# Field survey trends on invented heathland sites", ""]
    per_section = max(1, -(-len(claims) // 3))
    for s, heading in enumerate(("Background", "Evidence from plot surveys", "Synthesis")):
        chunk = claims[s * per_section : (s + 1) * per_section]
        if not chunk:
            continue
        out += [f"## {heading}", ""]
        for start in range(0, len(chunk), 4):
            sentences = [f"{c.text} [{', '.join(str(n) for n in c.numbers)}]." for c in chunk[start : start + 4]]
            if rng.random() < 0.3:
                sentences.append("These observations frame the comparison that follows.")
            out += [" ".join(sentences), ""]
    out += ["## References", ""]
    for paper in papers:
        out += [reference_entry(paper), ""]
    return "\n".join(out).rstrip("\n") + "\n"


def build(out_dir: Path, pdfs: int = 40, pages: int = 10, claims: int | None = None, seed: int = 0) -> list[Paper]:
    """Write the whole corpus under ``out_dir`` and return the papers it describes."""
    if pdfs < 1 or pages < 1:
        raise ValueError("--pdfs and --pages must be at least 1")
    rng = random.Random(seed)
    papers = plan_papers(rng, pdfs, pages)
    plans = plan_claims(rng, papers, claims if claims is not None else 2 * pdfs)
    draft = render_draft(rng, papers, plans)
    sources = out_dir / "sources"
    sources.mkdir(parents=True, exist_ok=True)
    wanted = {p.file for p in papers}
    for stale in sources.glob("*.pdf"):
        if stale.name not in wanted:
            stale.unlink()
    for paper in papers:
        (sources / paper.file).write_bytes(render_pdf(paper))
    (out_dir / "draft.md").write_text(draft, encoding="utf-8")
    with (out_dir / "expected.jsonl").open("w", encoding="utf-8") as handle:
        for plan in plans:
            row = {"claim": plan.text, "cites": plan.numbers, "file": plan.file, "page": plan.page}
            handle.write(json.dumps({**row, "sentence": plan.sentence}, ensure_ascii=False) + "\n")
    return papers


def parse_args(argv: Sequence[str] | None) -> argparse.Namespace:
    parser = argparse.ArgumentParser(description="Write an invented corpus (PDFs + Markdown draft) for benchmarks.")
    parser.add_argument("out_dir", type=Path, metavar="OUT_DIR")
    parser.add_argument("--pdfs", type=int, default=40, help="number of source PDFs (default 40)")
    parser.add_argument("--pages", type=int, default=10, help="pages per PDF (default 10)")
    parser.add_argument("--claims", type=int, default=None, help="claim sentences (default 2 per PDF)")
    parser.add_argument("--seed", type=int, default=0, help="random seed (default 0)")
    return parser.parse_args(argv)


def main(argv: Sequence[str] | None = None) -> int:
    args = parse_args(argv)
    try:
        papers = build(args.out_dir, args.pdfs, args.pages, args.claims, args.seed)
    except (ValueError, OSError, RuntimeError) as exc:
        print(f"synthetic_corpus: {exc}", file=sys.stderr)
        return 2
    print(f"wrote {len(papers)} PDFs of {args.pages} pages and draft.md to {args.out_dir}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
