"""Tests for the PDF manuscript reader.

Fixtures are written with fpdf2 (tests/pdf_fixtures.py) in DejaVu Sans. The superscript
fixtures are checked against the PDF operators they rely on, after ISO 32000-1:2008 (PDF
1.7), from memory: section 9.3 (Table 105, text state operators) - ``Tf`` sets font and
size, ``Ts`` sets the text rise, a shift of the baseline in unscaled text space units
that is positive upwards; section 9.4.2 (Table 108, text positioning operators) - ``Td
tx ty`` moves to the start of the next line, offset from the current line start by (tx,
ty), and ``Tm`` sets the text matrix outright, its last operand being the baseline y.
"""

from __future__ import annotations

import re
from pathlib import Path

import pytest
from pypdf import PdfReader

from sourcecheck.drafts.markdown.reader import read_markdown
from sourcecheck.drafts.pdf.reader import manuscript_text, read_pdf_manuscript
from sourcecheck.drafts.pdf.text import Run, assemble, is_superscript, strip_line_numbers
from sourcecheck.model import Claim, Draft, ReadOptions
from sourcecheck.pdftext.reader import read_pdf
from tests.pdf_fixtures import encrypted_pdf, image_only_pdf, manuscript_pdf, write_not_a_pdf

HEADER = "Manuscript under review - do not cite"

# An invented three-page draft; "^{4}" is set as a superscript, "land-" / "ward" is broken
# by a line-end hyphen, and the "Results" paragraph runs on over a page break.
PAGES = [
    [
        "Coastal wetland loss and flood damage",
        "",
        "Introduction",
        "Salt marshes along temperate coasts have shrunk by a third since",
        "1950 [1]. The loss is steepest where sea walls block the land-",
        "ward retreat of the marsh [2, 3]. Restored marshes cut wave heights",
        "during storms by up to half^{4}, although the effect fades with depth.",
        "",
        "Methods",
        "We compared tide gauge records from twelve estuaries with marsh",
        "extent mapped from aerial survey between 1985 and 2015.",
    ],
    [
        "Results",
        "Estuaries that lost more marsh saw higher flood damage per event,",
        "as earlier regional studies had found [3]. Sediment supply, not sea",
        "level alone, set the pace of loss in the northern estuaries [5].",
        "Where dredging had deepened the channel, the marsh edge retreated",
        "faster than in untouched estuaries, a pattern also seen on other",
    ],
    [
        "coasts with heavy shipping [1, 5].",
        "",
        "References",
        "[1] Okafor, A. B. (2019). Marsh decline on temperate coasts. Journal of",
        "Coastal Studies, 12, 1-20.",
        "[2] Lin, C., & Haddad, R. (2020). Sea walls and the squeeze of salt",
        "marshes. Estuarine Letters, 4, 33-41.",
        "[3] Mensah, K. (2018). Flood damage and wetland extent. Hazards, 7, 5-9.",
        "[4] Varga, E. (2021). Wave damping by restored marsh. Coastal Works, 2, 10-18.",
        "[5] Ito, S. (2017). Sediment and marsh persistence. Earth Surface, 9, 1-8.",
    ],
]

MARKDOWN_TWIN = """# Coastal wetland loss and flood damage

## Introduction

Salt marshes along temperate coasts have shrunk by a third since 1950 [1]. The loss is
steepest where sea walls block the landward retreat of the marsh [2, 3]. Restored marshes
cut wave heights during storms by up to half [4], although the effect fades with depth.

## Methods

We compared tide gauge records from twelve estuaries with marsh extent mapped from aerial
survey between 1985 and 2015.

## Results

Estuaries that lost more marsh saw higher flood damage per event, as earlier regional
studies had found [3]. Sediment supply, not sea level alone, set the pace of loss in the
northern estuaries [5]. Where dredging had deepened the channel, the marsh edge retreated
faster than in untouched estuaries, a pattern also seen on other coasts with heavy shipping [1, 5].

## References

[1] Okafor, A. B. (2019). Marsh decline on temperate coasts. Journal of Coastal Studies, 12, 1-20.
[2] Lin, C., & Haddad, R. (2020). Sea walls and the squeeze of salt marshes. Estuarine Letters, 4, 33-41.
[3] Mensah, K. (2018). Flood damage and wetland extent. Hazards, 7, 5-9.
[4] Varga, E. (2021). Wave damping by restored marsh. Coastal Works, 2, 10-18.
[5] Ito, S. (2017). Sediment and marsh persistence. Earth Surface, 9, 1-8.
"""


def _read(path: Path) -> Draft:
    return read_pdf_manuscript(path, "draft.pdf", ReadOptions())


def _bare(text: str) -> str:
    """Claim text modulo markers and whitespace."""
    return re.sub(r"\s+", "", re.sub(r"\[[^\]]*\]", "", text))


def _keys(claim: Claim) -> list[str | None]:
    return [c.key for c in claim.citations]


@pytest.fixture(scope="module")
def draft_pdf(tmp_path_factory: pytest.TempPathFactory) -> Path:
    path = tmp_path_factory.mktemp("manuscript") / "draft.pdf"
    return manuscript_pdf(path, PAGES, header=HEADER, footer="{n}")


def test_pdf_and_markdown_twin_give_the_same_claims_and_keys(draft_pdf: Path) -> None:
    pdf = _read(draft_pdf)
    twin = read_markdown(MARKDOWN_TWIN, "draft.md")
    assert pdf.problems == [] and twin.problems == []
    assert [_bare(c.text) for c in pdf.claims] == [_bare(c.text) for c in twin.claims]
    assert [_keys(c) for c in pdf.claims] == [_keys(c) for c in twin.claims]
    assert len(pdf.claims) == 6
    assert [(r.key, r.authors, r.year, r.title) for r in pdf.references] == [
        (r.key, r.authors, r.year, r.title) for r in twin.references
    ]


def test_superscript_becomes_a_bracketed_marker(draft_pdf: Path) -> None:
    plain = read_pdf(draft_pdf.read_bytes()).pages[0]
    assert "half4," in plain  # what plain extraction makes of "half⁴"
    claim = next(c for c in _read(draft_pdf).claims if "wave heights" in c.text)
    assert "half[4]," in claim.text
    assert _keys(claim) == ["4"]


def test_furniture_line_numbers_and_hyphens_are_gone(draft_pdf: Path) -> None:
    lines = manuscript_text(draft_pdf.read_bytes()).lines
    assert HEADER not in lines
    assert not any(re.fullmatch(r"\d+", line) for line in lines)  # page numbers
    assert lines[2] == "Salt marshes along temperate coasts have shrunk by a third since"
    assert not any(re.match(r"\d+ [A-Z]", line) for line in lines)  # margin numbers
    assert any(line.endswith("block the landward") for line in lines)


def test_claim_lines_index_the_extracted_text_and_pages_are_kept(draft_pdf: Path) -> None:
    text = manuscript_text(draft_pdf.read_bytes())
    draft = _read(draft_pdf)
    for claim in draft.claims:
        first_words = " ".join(claim.text.split()[:3])
        assert first_words in text.lines[claim.line - 1]
    dredging = next(c for c in draft.claims if c.text.startswith("Where dredging"))
    assert text.pages[dredging.line - 1] == 2
    assert dredging.text.endswith("heavy shipping [1, 5].")  # joined over the page break
    for reference in draft.references:
        assert text.lines[reference.line - 1].startswith(f"[{reference.key}] ")
        assert text.pages[reference.line - 1] == 3


def _operations(path: Path) -> list[tuple[bytes, list[object]]]:
    page = PdfReader(path).pages[0]
    return [(op, list(args)) for args, op in page.get_contents().operations]


def test_superscript_by_text_rise(tmp_path: Path) -> None:
    path = manuscript_pdf(tmp_path / "rise.pdf", [["Waves fell by half^{4}, the survey found."]], line_numbers=None)
    ops = _operations(path)
    # ISO 32000-1, 9.3 (from memory): a positive Ts raises the baseline; Tf sets a smaller size.
    rises = [float(args[0]) for op, args in ops if op == b"Ts"]
    sizes = [float(args[1]) for op, args in ops if op == b"Tf"]
    assert max(rises) > 0 and min(sizes) < max(sizes)
    assert "half[4], the survey found." in manuscript_text(path.read_bytes()).lines[0]


def test_superscript_by_raised_baseline(tmp_path: Path) -> None:
    path = manuscript_pdf(
        tmp_path / "move.pdf", [["Waves fell by half^{4}, the survey found."]], line_numbers=None, superscript="move"
    )
    ops = _operations(path)
    # ISO 32000-1, 9.4.2 (from memory): after BT the text matrix is the identity, so a
    # "Td tx ty" sets the baseline at ty; the digit's ty is above the words' ty.
    baselines = [float(args[1]) for op, args in ops if op == b"Td"]
    assert len(set(baselines)) == 2 and not any(op == b"Ts" for op, _ in ops)
    lines = [line for line in manuscript_text(path.read_bytes()).lines if line]
    assert lines == ["Waves fell by half[4], the survey found."]


BODY = 11.0


def test_superscript_heuristic_needs_small_raised_numbers_after_a_word() -> None:
    word = Run("rose", 700.0, BODY, 0.0)
    assert is_superscript(Run("2,3", 700.0, 7.7, 3.3), word, BODY)  # text rise
    assert is_superscript(Run("4–6", 703.0, 7.0, 0.0), word, BODY)  # raised baseline
    assert not is_superscript(Run("2", 697.0, 7.0, 0.0), word, BODY)  # lowered: a subscript (CO2)
    assert not is_superscript(Run("2", 703.0, BODY, 0.0), word, BODY)  # not smaller
    assert not is_superscript(Run("a", 703.0, 7.0, 0.0), word, BODY)  # not a number
    assert not is_superscript(Run("2", 703.0, 7.0, 0.0), Run("(", 700.0, BODY, 0.0), BODY)  # no word before
    assert not is_superscript(Run("2", 740.0, 7.0, 0.0), word, BODY)  # far above: another line
    assert not is_superscript(Run("2", 703.0, 7.0, 0.0), None, BODY)  # nothing before it


def test_assemble_rejoins_a_line_broken_at_the_raised_marker() -> None:
    runs = [
        Run("as found", 700.0, BODY, 0.0),
        Run("\n", 700.0, BODY, 0.0),
        Run("4", 703.0, 7.0, 0.0),
        Run("\n", 703.0, 7.0, 0.0),
        Run(", then", 700.0, BODY, 0.0),
        Run("\n", 700.0, BODY, 0.0),
        Run("next line", 686.0, BODY, 0.0),
    ]
    assert assemble(runs, BODY) == "as found[4], then\nnext line"


def test_line_numbers_every_line_and_every_fifth() -> None:
    body = [f"line of running text number {i} of the page" for i in range(1, 21)]
    every = [f"{i + 30} {text}" for i, text in enumerate(body)]
    assert strip_line_numbers([every]) == [body]
    fifth = [f"{i + 1} {text}" if (i + 1) % 5 == 0 else text for i, text in enumerate(body)]
    fifth.insert(7, "Methods")  # an unnumbered heading between numbered lines
    expected = list(body)
    expected.insert(7, "Methods")
    assert strip_line_numbers([fifth]) == [expected]


def test_numbers_that_open_lines_are_not_a_margin() -> None:
    page = ["1 Introduction", *["Plain running text without any numbers."] * 12, "2 Methods", "3 Results"]
    page += ["12 participants took part in the survey."]
    assert strip_line_numbers([page]) == [page]


def test_short_last_page_uses_the_documents_step() -> None:
    long_page = [f"{i} Running text of the first page." if i % 5 == 0 else "Running text." for i in range(1, 31)]
    short_page = ["Running text.", "Running text.", "Running text.", "Running text.", "35 The last line."]
    out = strip_line_numbers([long_page, short_page])
    assert out[1][-1] == "The last line."
    assert strip_line_numbers([short_page]) == [short_page]  # alone, one number proves nothing


def test_hanging_author_year_list(tmp_path: Path) -> None:
    pages = [
        [
            "Marsh loss has been linked to sea walls (Okafor et al., 2019), and restored",
            "marshes damp waves (Lin & Haddad, 2020).",
            "",
            "Works cited",
            "Lin, C., & Haddad, R. (2020). Sea walls and the squeeze of salt marshes.",
            "Estuarine Letters, 4, 33-41.",
            "Okafor, A. B., Mensah, K., & Ito, S. (2019). Marsh decline on temperate",
            "coasts. Journal of Coastal Studies, 12, 1-20.",
        ]
    ]
    draft = _read(manuscript_pdf(tmp_path / "ay.pdf", pages, line_numbers=None))
    assert [(r.key, r.authors, r.line) for r in draft.references] == [
        ("lin2020", ("Lin", "Haddad"), 4),
        ("okafor2019", ("Okafor", "Mensah", "Ito"), 6),
    ]
    assert draft.references[1].text.endswith("Journal of Coastal Studies, 12, 1-20.")
    assert [_keys(c) for c in draft.claims] == [["okafor2019", "lin2020"]]


def test_encrypted_manuscript_is_one_problem(tmp_path: Path) -> None:
    draft = _read(encrypted_pdf(tmp_path / "draft.pdf", ["Rates rose [1]."]))
    assert (draft.claims, draft.references) == ([], [])
    assert [(p.file, p.message) for p in draft.problems] == [("draft.pdf", "encrypted; cannot read without a password")]


def test_not_a_pdf_is_one_problem(tmp_path: Path) -> None:
    draft = _read(write_not_a_pdf(tmp_path / "draft.pdf"))
    assert (draft.claims, draft.references) == ([], [])
    assert [(p.file, p.message) for p in draft.problems] == [("draft.pdf", "not a PDF (no %PDF- header)")]


def test_no_text_layer_is_one_problem(tmp_path: Path) -> None:
    draft = _read(image_only_pdf(tmp_path / "draft.pdf"))
    assert (draft.claims, draft.references) == ([], [])
    assert len(draft.problems) == 1 and "no text layer" in draft.problems[0].message
