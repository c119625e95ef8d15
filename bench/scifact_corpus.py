"""Build a benchmark and calibration corpus for sourcecheck from a claim-verification dataset.

sourcecheck's bands and scores must be calibrated on data where the truth is known: claims
whose cited abstracts annotators marked as supporting, contradicting or neither. This script
turns the SciFact training claims into exactly what sourcecheck reads in real use, a
Markdown draft with numeric citation markers plus a folder of source PDFs, and writes the
known answers beside them, so a benchmark can run the unmodified pipeline and score it.

Usage::

    python bench/scifact_corpus.py DATA_DIR [OUT_DIR] [--limit N] [--seed S]
                                   [--decoys FRACTION] [--holdout FRACTION]
                                   [--jobs N]

``DATA_DIR`` holds ``claims_train.jsonl`` and ``corpus_train_cited.jsonl`` (the layout is
described in that folder's README.md). ``OUT_DIR`` defaults to ``bench/out/scifact``, which is
git-ignored: the dataset is never copied into the repository. The script writes

- ``sources/doc-<doc_id>.pdf``: one PDF per abstract needed (title, then the abstract);
- ``draft.md``: one paragraph per claim, ending in its markers (``Claim text [3, 7].``),
  then a ``## References`` list whose entry titles match the PDFs' titles;
- ``mapping.csv`` (``key,file``): reference number to PDF name, for ``sourcecheck --map``,
  so that reference-matching errors do not pollute calibration;
- ``gold.jsonl``: one line per (claim, cited document) pair with the label SUPPORT,
  CONTRADICT, NEI (cited, no evidence) or UNRELATED (a decoy citation, see ``--decoys``),
  the rationale sentences, and a ``split`` ("fit" or "holdout") fixed by the claim id.

Everything is deterministic for a given ``--seed``: the PDFs carry a fixed creation date, the
claim order, the decoys and the split do not depend on the run.

Dataset: David Wadden, Shanchuan Lin, Kyle Lo, Lucy Lu Wang, Madeleine van Zuylen, Arman Cohan,
Hannaneh Hajishirzi, "Fact or Fiction: Verifying Scientific Claims", EMNLP 2020
(arXiv:2004.14974). The claims and annotations are under CC BY 4.0; the corpus abstracts
(from S2ORC) under ODC-By 1.0.
"""

from __future__ import annotations

import argparse
import csv
import hashlib
import json
import os
import random
import re
import sys
import time
import unicodedata
from collections import Counter
from collections.abc import Callable, Iterator
from concurrent.futures import ProcessPoolExecutor
from dataclasses import dataclass, field
from datetime import UTC, datetime
from functools import lru_cache, partial
from pathlib import Path

import pysbd
from fontTools.ttLib import TTFont
from fpdf import FPDF

from sourcecheck.model import Problem

CLAIMS_FILE = "claims_train.jsonl"
CORPUS_FILE = "corpus_train_cited.jsonl"
DEFAULT_OUT = Path(__file__).resolve().parent / "out" / "scifact"
FONT_DIR = Path("/usr/share/fonts/truetype/dejavu")
FONT_REGULAR = FONT_DIR / "DejaVuSans.ttf"
FONT_BOLD = FONT_DIR / "DejaVuSans-Bold.ttf"
# A fixed date makes the PDFs byte-for-byte reproducible, so caches keyed by content hash
# survive a rebuild. The year is the dataset's publication year.
CREATION_DATE = datetime(2020, 1, 1, tzinfo=UTC)
REPLACEMENT = "?"

LABELS = ("SUPPORT", "CONTRADICT", "NEI", "UNRELATED")

# Words that make up the section headings of structured abstracts in this corpus (BACKGROUND,
# MAIN OUTCOME MEASURES, DESIGN, SETTING, AND PARTICIPANTS, ...). A closed list, because a
# leading acronym such as "DNA" or "BMI" must not be taken for a heading.
# fmt: off
HEADING_WORDS = frozenset([
    "ABSTRACT", "ACQUISITION", "AIM", "AIMS", "AND", "APPRAISAL", "BACKGROUND", "CLINICAL",
    "CONCLUSION", "CONCLUSIONS", "CONTEXT", "DATA", "DESIGN", "DISCUSSION", "EVIDENCE",
    "EXPOSURE", "EXPOSURES", "EXTRACTION", "FINDINGS", "FUNDING", "IMPORTANCE",
    "INTERPRETATION", "INTERVENTION", "INTERVENTIONS", "INTRODUCTION", "MAIN", "MEASURE",
    "MEASUREMENTS", "MEASURES", "METHOD", "METHODOLOGY", "METHODS", "OBJECTIVE", "OBJECTIVES",
    "OUTCOME", "OUTCOMES", "PARTICIPANTS", "PATIENTS", "POPULATION", "PURPOSE", "RATIONALE",
    "REGISTRATION", "RELEVANCE", "RESULTS", "REVIEW", "REVIEWED", "SAMPLE", "SELECTION",
    "SETTING", "SETTINGS", "SOURCES", "STUDIES", "STUDY", "SUBJECTS", "SYNTHESIS", "SYSTEMATIC",
    "TRIAL",
])
# fmt: on


@dataclass(frozen=True)
class Evidence:
    """The annotators' verdict on one cited abstract: its label and rationale sentence indices."""

    label: str
    sentences: tuple[int, ...]


@dataclass(frozen=True)
class ClaimRecord:
    """One dataset claim with the abstracts it cites and the evidence found in them."""

    id: int
    text: str
    cited: tuple[int, ...]
    evidence: dict[int, Evidence] = field(default_factory=dict)


@dataclass(frozen=True)
class Doc:
    """One corpus abstract, already split into sentences by the dataset's authors."""

    doc_id: int
    title: str
    sentences: tuple[str, ...]
    structured: bool


@dataclass
class Summary:
    """What one build produced, printed for the user and returned for tests."""

    claims: int = 0
    pairs: Counter[str] = field(default_factory=Counter)
    splits: Counter[str] = field(default_factory=Counter)
    pdfs: int = 0
    seconds: float = 0.0
    problems: list[Problem] = field(default_factory=list)


# --- reading the dataset ---------------------------------------------------------------


def read_jsonl(path: Path, problems: list[Problem]) -> Iterator[tuple[int, dict]]:
    """Yield (line number, object) for each JSON line; a bad line becomes a Problem."""
    with path.open(encoding="utf-8") as handle:
        for number, line in enumerate(handle, start=1):
            if not line.strip():
                continue
            try:
                obj = json.loads(line)
            except json.JSONDecodeError as exc:
                problems.append(Problem(str(path), f"line {number}: not valid JSON ({exc.msg})"))
                continue
            if not isinstance(obj, dict):
                problems.append(Problem(str(path), f"line {number}: not a JSON object"))
                continue
            yield number, obj


def parse_evidence(raw: dict) -> dict[int, Evidence]:
    """Fold the dataset's per-rationale evidence lists into one Evidence per document."""
    result: dict[int, Evidence] = {}
    for doc_key, rationales in raw.items():
        if not rationales:
            continue  # an empty evidence list is no evidence: the pair counts as NEI
        labels = {r["label"] for r in rationales}
        sentences = sorted({int(i) for r in rationales for i in r["sentences"]})
        # Within one claim all evidence documents share a label (dataset README); should
        # that ever break, the first rationale's label wins rather than the run stopping.
        label = rationales[0]["label"] if len(labels) > 1 else labels.pop()
        result[int(doc_key)] = Evidence(label, tuple(sentences))
    return result


def load_claims(path: Path, problems: list[Problem]) -> list[ClaimRecord]:
    """Read the claims file; claims that cannot be parsed are reported and skipped."""
    claims: list[ClaimRecord] = []
    for number, obj in read_jsonl(path, problems):
        try:
            cited = tuple(dict.fromkeys(int(d) for d in obj["cited_doc_ids"]))
            claim = ClaimRecord(
                id=int(obj["id"]),
                text=str(obj["claim"]),
                cited=cited,
                evidence=parse_evidence(obj.get("evidence") or {}),
            )
        except (KeyError, TypeError, ValueError, IndexError, AttributeError) as exc:
            problems.append(Problem(str(path), f"line {number}: malformed claim ({exc!r})"))
            continue
        claims.append(claim)
    return claims


def load_corpus(path: Path, problems: list[Problem]) -> dict[int, Doc]:
    """Read the corpus file into documents keyed by doc_id."""
    docs: dict[int, Doc] = {}
    for number, obj in read_jsonl(path, problems):
        try:
            doc = Doc(
                doc_id=int(obj["doc_id"]),
                title=str(obj["title"]),
                sentences=tuple(str(s) for s in obj["abstract"]),
                structured=bool(obj.get("structured", False)),
            )
        except (KeyError, TypeError, ValueError) as exc:
            problems.append(Problem(str(path), f"line {number}: malformed abstract ({exc!r})"))
            continue
        docs[doc.doc_id] = doc
    return docs


# --- text cleaning ---------------------------------------------------------------------


@lru_cache(maxsize=4)
def font_codepoints(*fonts: Path) -> frozenset[int]:
    """Code points every given font can draw, so no glyph renders as an empty box."""
    covered: set[int] | None = None
    for font in fonts:
        cmap = set(TTFont(str(font)).getBestCmap())
        covered = cmap if covered is None else covered & cmap
    return frozenset(covered or ())


def printable_char(char: str, covered: frozenset[int]) -> str:
    """The character itself, its compatibility decomposition, or a visible replacement."""
    if char == "\u200b":
        return " "  # a zero-width space is a break opportunity; extractors give whitespace
    if unicodedata.category(char) in {"Cf", "Cc"}:
        return ""  # other format and control characters carry no text
    if ord(char) in covered:
        return char
    decomposed = "".join(c for c in unicodedata.normalize("NFKD", char) if not unicodedata.combining(c))
    if decomposed and all(ord(c) in covered for c in decomposed):
        return decomposed
    return REPLACEMENT


def clean_text(text: str, covered: frozenset[int]) -> str:
    """Collapse whitespace and make every character drawable by the PDF font."""
    text = "".join(" " if c.isspace() else printable_char(c, covered) for c in text)
    return re.sub(r" {2,}", " ", text).strip()


def split_heading(sentence: str) -> tuple[str, str]:
    """Split a structured abstract's leading section heading ("MAIN OUTCOME MEASURES") off."""
    words = sentence.split(" ")
    taken = 0
    for word in words[:-1]:
        if word.rstrip(",") in HEADING_WORDS:
            taken += 1
        else:
            break
    while taken and words[taken - 1].rstrip(",") == "AND":
        taken -= 1
    if not taken:
        return "", sentence
    return " ".join(words[:taken]), " ".join(words[taken:])


def paragraphs(doc: Doc, covered: frozenset[int]) -> list[tuple[str, str]]:
    """The abstract as (heading, text) paragraphs: one, or one per section if structured."""
    result: list[tuple[str, str]] = []
    for raw in doc.sentences:
        sentence = clean_text(raw, covered)
        if not sentence:
            continue
        heading, rest = split_heading(sentence) if doc.structured else ("", sentence)
        if heading or not result:
            result.append((heading, rest))
        else:
            last_heading, text = result[-1]
            result[-1] = (last_heading, f"{text} {sentence}")
    return result


# --- PDFs ------------------------------------------------------------------------------


def pdf_name(doc_id: int) -> str:
    """The file name of one abstract's PDF; mapping.csv and gold.jsonl use the same."""
    return f"doc-{doc_id}.pdf"


def render_pdf(doc: Doc, covered: frozenset[int]) -> bytes:
    """Lay one abstract out like a paper's first page: bold title, then body paragraphs."""
    pdf = FPDF(format="A4")
    pdf.set_creation_date(CREATION_DATE)
    pdf.set_margins(20, 20, 20)
    pdf.set_auto_page_break(auto=True, margin=20)
    pdf.add_font("DejaVu", "", str(FONT_REGULAR))
    pdf.add_font("DejaVu", "B", str(FONT_BOLD))
    title = clean_text(doc.title, covered)
    pdf.set_title(title)
    pdf.set_subject(f"Dataset abstract {doc.doc_id}")
    pdf.add_page()
    pdf.set_font("DejaVu", "B", 16)
    pdf.multi_cell(0, 8, title, align="L")  # fpdf2 justifies by default, which pads spaces
    pdf.ln(6)
    line_height = 5.5
    for heading, text in paragraphs(doc, covered):
        if heading:
            pdf.set_font("DejaVu", "B", 11)
            pdf.write(line_height, heading + " ")
        pdf.set_font("DejaVu", "", 11)
        pdf.write(line_height, text)
        pdf.ln(line_height)
        pdf.ln(3)
    return bytes(pdf.output())


def write_pdfs(docs: list[Doc], folder: Path, covered: frozenset[int], jobs: int = 1) -> int:
    """Write one PDF per document and remove stale ``doc-*.pdf`` files of earlier builds.

    Stale files would show up as unused sources in a run and skew the benchmark. Rendering
    is dominated by fpdf2 parsing the font for every document, so ``jobs`` > 1 spreads the
    documents over processes; each PDF is independent, so the output does not change.
    """
    folder.mkdir(parents=True, exist_ok=True)
    wanted = {pdf_name(d.doc_id) for d in docs}
    for old in folder.glob("doc-*.pdf"):
        if old.name not in wanted:
            old.unlink()
    render = partial(render_pdf, covered=covered)
    if jobs > 1 and len(docs) > 1:
        with ProcessPoolExecutor(max_workers=jobs) as pool:
            rendered = list(pool.map(render, docs, chunksize=8))
    else:
        rendered = [render(doc) for doc in docs]
    for doc, data in zip(docs, rendered, strict=True):
        (folder / pdf_name(doc.doc_id)).write_bytes(data)
    return len(docs)


# --- choosing claims, decoys and splits ------------------------------------------------


def select_claims(claims: list[ClaimRecord], limit: int | None, seed: int) -> list[ClaimRecord]:
    """Claims in a seeded shuffled order, cut to ``limit``, so quick runs see a fair sample."""
    ordered = sorted(claims, key=lambda c: c.id)
    random.Random(seed).shuffle(ordered)
    return ordered if limit is None else ordered[:limit]


# Decoys from the same field: drawn from these 0-based ranks of the claim's BM25 ranking
# of abstracts it does not cite. Near the top would risk an abstract that does back the
# claim (unlabelled); a random abstract is trivially far from it.
NEAR_RANKS = range(4, 20)


def choose_decoys(claims: list[ClaimRecord], docs: dict[int, Doc], fraction: float, seed: int) -> dict[int, int]:
    """Pick round(fraction * claims) claims and, for each, one abstract it does not cite.

    Calibration needs claim-source pairs where the source does not speak to the claim,
    which the dataset lacks: every cited abstract there is on the claim's topic. Half the
    decoys are random abstracts; half come from the same field (BM25 ranks 5-20), which
    is what a citation to the wrong paper of a literature looks like.
    """
    from rank_bm25 import BM25Okapi

    from sourcecheck.text import tokenize

    rng = random.Random(f"decoys:{seed}")
    pool = sorted(docs)
    count = min(len(claims), round(fraction * len(claims)))
    decoys: dict[int, int] = {}
    index = BM25Okapi([tokenize(docs[d].title + " " + " ".join(docs[d].sentences)) or ["_"] for d in pool])
    for number, claim in enumerate(rng.sample(claims, count)):
        candidates = [d for d in pool if d not in claim.cited]
        if not candidates:
            continue
        if number % 2:
            scores = index.get_scores(tokenize(claim.text))
            ranked = [pool[i] for i in sorted(range(len(pool)), key=lambda i: -scores[i]) if pool[i] not in claim.cited]
            near = [ranked[r] for r in NEAR_RANKS if r < len(ranked)]
            decoys[claim.id] = rng.choice(near or candidates)
        else:
            decoys[claim.id] = rng.choice(candidates)
    return decoys


def split_of(claim_id: int, holdout: float = 0.3) -> str:
    """'fit' or 'holdout', fixed by a hash of the claim id so a claim never changes side."""
    digest = hashlib.sha256(str(claim_id).encode("ascii")).digest()
    position = int.from_bytes(digest[:8], "big") / 2**64
    return "holdout" if position < holdout else "fit"


# --- the draft -------------------------------------------------------------------------


@lru_cache(maxsize=1)
def _segmenter() -> pysbd.Segmenter:
    return pysbd.Segmenter(language="en", clean=False)


def claim_sentence(text: str) -> str:
    """The claim as one draft sentence without its final period.

    Square brackets become parentheses so nothing in the claim reads as a marker; a claim
    of two sentences is joined with a semicolon so the draft reader sees one claim.
    """
    text = re.sub(r"\s+", " ", text).strip().replace("[", "(").replace("]", ")")
    parts = [p.strip() for p in _segmenter().segment(text) if p.strip()]
    if len(parts) > 1:
        text = "; ".join(p.rstrip(".;") for p in parts)
    text = re.sub(r"\.([\"”’'])$", r"\1", text)  # 'using "x."' -> 'using "x"' + marker + '.'
    return text.rstrip(" .")


def marker(numbers: list[int]) -> str:
    """An IEEE-style numeric marker: "[3]" or "[3, 7]", numbers ascending."""
    return "[" + ", ".join(str(n) for n in sorted(numbers)) + "]"


_INNER_QUOTES = str.maketrans({'"': "'", "“": "‘", "”": "’"})


def title_for_reference(title: str) -> str:
    """The title as quoted in a reference entry: comma inside the quotes, IEEE fashion."""
    # Double quotes delimit the title, so quotes inside it become single ones (IEEE nesting).
    title = title.translate(_INNER_QUOTES).rstrip(" .")
    return f'"{title}"' if title.endswith(("?", "!")) else f'"{title},"'


def reference_entry(number: int, doc: Doc, covered: frozenset[int]) -> str:
    """One numbered entry; without authors, the title alone ties it to the PDF."""
    title = clean_text(doc.title, covered)
    return f"[{number}] {title_for_reference(title)} Dataset abstract {doc.doc_id}."


def render_draft(lines: list[tuple[str, list[int]]], references: list[tuple[int, Doc]], covered: frozenset[int]) -> str:
    """The whole Markdown draft: heading, one paragraph per claim, then the references."""
    out = ["# Claims from the SciFact training set", ""]
    for text, numbers in lines:
        out += [f"{text} {marker(numbers)}.", ""]
    out += ["## References", ""]
    for number, doc in references:
        out += [reference_entry(number, doc, covered), ""]
    return "\n".join(out).rstrip("\n") + "\n"


# --- gold ------------------------------------------------------------------------------


def pair_label(claim: ClaimRecord, doc_id: int, decoy: int | None) -> str:
    """The known answer for one claim-document pair."""
    if doc_id == decoy:
        return "UNRELATED"
    evidence = claim.evidence.get(doc_id)
    return evidence.label if evidence else "NEI"


def rationale_texts(claim: ClaimRecord, doc: Doc, covered: frozenset[int], problems: list[Problem]) -> list[str]:
    """The rationale sentences as written into the PDF (cleaned), in abstract order."""
    evidence = claim.evidence.get(doc.doc_id)
    if evidence is None:
        return []
    texts = []
    for index in evidence.sentences:
        if 0 <= index < len(doc.sentences):
            texts.append(clean_text(doc.sentences[index], covered))
        else:
            problems.append(Problem(CLAIMS_FILE, f"claim {claim.id}: sentence {index} not in doc {doc.doc_id}"))
    return texts


# --- the build -------------------------------------------------------------------------


@dataclass
class Plan:
    """The draft's claims, their reference numbers and the gold lines, before writing."""

    lines: list[tuple[str, list[int]]] = field(default_factory=list)
    numbers: dict[int, int] = field(default_factory=dict)
    gold: list[dict] = field(default_factory=list)


def plan_claim(
    plan: Plan,
    claim: ClaimRecord,
    docs: dict[int, Doc],
    decoy: int | None,
    holdout: float,
    covered: frozenset[int],
    problems: list[Problem],
) -> None:
    """Add one claim to the plan: number its works by first appearance, record its gold."""
    wanted = [*claim.cited, *([decoy] if decoy is not None else [])]
    present = [d for d in wanted if d in docs]
    for missing in sorted(set(wanted) - set(present)):
        problems.append(Problem(CORPUS_FILE, f"claim {claim.id}: cited doc {missing} not found"))
    text = claim_sentence(claim.text)
    if not present or not text:
        problems.append(Problem(CLAIMS_FILE, f"claim {claim.id}: nothing to cite, skipped"))
        return
    for doc_id in present:
        plan.numbers.setdefault(doc_id, len(plan.numbers) + 1)
    plan.lines.append((text, [plan.numbers[d] for d in present]))
    for doc_id in sorted(present, key=plan.numbers.__getitem__):
        plan.gold.append(
            {
                "claim_id": claim.id,
                "claim_index": len(plan.lines),
                "claim": text,
                "ref": str(plan.numbers[doc_id]),
                "doc_id": doc_id,
                "label": pair_label(claim, doc_id, decoy),
                "rationales": rationale_texts(claim, docs[doc_id], covered, problems),
                "split": split_of(claim.id, holdout),
            }
        )


def write_outputs(plan: Plan, docs: dict[int, Doc], out_dir: Path, covered: frozenset[int], jobs: int = 1) -> int:
    """Write draft, mapping, gold and PDFs; return the number of PDFs."""
    by_number = sorted((n, docs[d]) for d, n in plan.numbers.items())
    out_dir.mkdir(parents=True, exist_ok=True)
    (out_dir / "draft.md").write_text(render_draft(plan.lines, by_number, covered), "utf-8")
    with (out_dir / "mapping.csv").open("w", encoding="utf-8", newline="") as handle:
        writer = csv.writer(handle, lineterminator="\n")
        writer.writerow(["key", "file"])
        writer.writerows((str(n), pdf_name(doc.doc_id)) for n, doc in by_number)
    with (out_dir / "gold.jsonl").open("w", encoding="utf-8") as handle:
        for row in plan.gold:
            handle.write(json.dumps(row, ensure_ascii=False) + "\n")
    return write_pdfs([doc for _, doc in by_number], out_dir / "sources", covered, jobs)


def build(
    data_dir: Path,
    out_dir: Path,
    *,
    limit: int | None = None,
    seed: int = 13,
    decoys: float = 0.15,
    holdout: float = 0.3,
    jobs: int = 1,
    fonts: tuple[Path, ...] = (FONT_REGULAR, FONT_BOLD),
) -> Summary:
    """Build the whole corpus into ``out_dir``; bad input lines end up in ``problems``."""
    started = time.perf_counter()
    summary = Summary()
    covered = font_codepoints(*fonts)
    claims = load_claims(data_dir / CLAIMS_FILE, summary.problems)
    docs = load_corpus(data_dir / CORPUS_FILE, summary.problems)
    chosen = select_claims(claims, limit, seed)
    decoy_of = choose_decoys(chosen, docs, decoys, seed)
    plan = Plan()
    for claim in chosen:
        decoy = decoy_of.get(claim.id)
        plan_claim(plan, claim, docs, decoy, holdout, covered, summary.problems)
    summary.pdfs = write_outputs(plan, docs, out_dir, covered, jobs)
    summary.claims = len(plan.lines)
    summary.pairs = Counter(row["label"] for row in plan.gold)
    summary.splits = Counter(row["split"] for row in plan.gold)
    summary.seconds = time.perf_counter() - started
    return summary


# --- command line ----------------------------------------------------------------------


def fraction(value: str) -> float:
    """argparse type for a number in [0, 1]."""
    number = float(value)
    if not 0.0 <= number <= 1.0:
        raise argparse.ArgumentTypeError(f"{value} is not between 0 and 1")
    return number


def parse_args(argv: list[str] | None) -> argparse.Namespace:
    """The command line described in the module docstring."""
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("data_dir", type=Path, help="folder with the dataset's JSONL files")
    parser.add_argument("out_dir", type=Path, nargs="?", default=DEFAULT_OUT)
    parser.add_argument("--limit", type=int, default=None, help="only the first N claims")
    parser.add_argument("--seed", type=int, default=13, help="seed for order and decoys")
    parser.add_argument("--decoys", type=fraction, default=0.15, help="share of decoy claims")
    parser.add_argument("--holdout", type=fraction, default=0.3, help="share of holdout claims")
    parser.add_argument("--jobs", type=int, default=min(2, os.cpu_count() or 1), help="processes")
    return parser.parse_args(argv)


def print_summary(summary: Summary, out_dir: Path, emit: Callable[[str], None] = print) -> None:
    """One short block: what was built, and any problems, one line each."""
    for problem in summary.problems:
        emit(f"problem: {problem.file}: {problem.message}")
    labels = ", ".join(f"{label} {summary.pairs.get(label, 0)}" for label in LABELS)
    splits = ", ".join(f"{name} {summary.splits.get(name, 0)}" for name in ("fit", "holdout"))
    emit(f"wrote {out_dir}")
    emit(f"claims {summary.claims}; pairs {sum(summary.pairs.values())} ({labels})")
    emit(f"pairs by split: {splits}; PDFs {summary.pdfs}; {summary.seconds:.1f} s")


def main(argv: list[str] | None = None) -> int:
    """Run the build; missing input files give one clear line and exit status 2."""
    args = parse_args(argv)
    for name in (CLAIMS_FILE, CORPUS_FILE):
        if not (args.data_dir / name).is_file():
            print(f"error: {args.data_dir / name}: file not found", file=sys.stderr)
            return 2
    for font in (FONT_REGULAR, FONT_BOLD):
        if not font.is_file():
            print(f"error: {font}: font not found", file=sys.stderr)
            return 2
    if args.out_dir.resolve() == args.data_dir.resolve():
        print(f"error: {args.out_dir}: output must not be the data folder", file=sys.stderr)
        return 2
    summary = build(
        args.data_dir,
        args.out_dir,
        limit=args.limit,
        seed=args.seed,
        decoys=args.decoys,
        holdout=args.holdout,
        jobs=max(1, args.jobs),
    )
    print_summary(summary, args.out_dir)
    return 0


if __name__ == "__main__":
    sys.exit(main())
