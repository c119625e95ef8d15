"""Section roles of a source: stand-alone and run-in headings, and the passages they label.

The roles follow the IMRaD structure of a research paper (ANSI/NISO Z39.14-1997,
"Guidelines for Abstracts", and the ICMJE recommendations for structured abstracts; from
memory). A structured abstract's headings are BACKGROUND, METHODS, RESULTS, CONCLUSIONS
(ICMJE; CONSORT for abstracts; from memory), set in capitals or followed by a colon or a
full stop and run in with the paragraph's text.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.model import SECTION_ROLES, Source
from sourcecheck.sources import read_source
from sourcecheck.sources._passages import make_passages
from sourcecheck.sources._sections import HEADINGS, heading_role, run_in_heading
from tests.pdf_fixtures import build_pdf


def test_every_heading_announces_a_known_role() -> None:
    assert set(HEADINGS.values()) <= set(SECTION_ROLES)
    # The four IMRaD parts and the abstract are all covered (ANSI/NISO Z39.14-1997; from memory).
    assert {"abstract", "introduction", "methods", "results", "discussion"} <= set(HEADINGS)


@pytest.mark.parametrize(
    ("line", "role"),
    [
        ("2. Materials and methods", "methods"),  # decimal section number, IMRaD "Methods"
        ("IV. Discussion", "discussion"),  # Roman section number
        ("3 Results", "results"),  # number without a full stop
        ("RESULTS", "results"),  # capitals, as journals set headings
        ("2.1 Statistical analysis", "methods"),  # a subsection of the methods
        ("1. Introduction", "background"),  # IMRaD "I" is the paper's background
        ("Conclusions:", "conclusions"),  # trailing colon is not part of the heading
        ("Acknowledgements", "back-matter"),
        ("Abstract", "abstract"),
    ],
)
def test_stand_alone_headings_with_numbering(line: str, role: str) -> None:
    assert heading_role(line) == role


@pytest.mark.parametrize(
    "line",
    [
        "Results of the survey were clear.",
        "Design of the study was simple.",
        "DNA was extracted from leaf tissue.",
        "Tide gauges were read hourly at the pier.",
        "Heron nests",
    ],
)
def test_sentences_are_not_stand_alone_headings(line: str) -> None:
    assert heading_role(line) is None


@pytest.mark.parametrize(
    ("paragraph", "role", "written"),
    [
        # The structured-abstract headings of the ICMJE / CONSORT for abstracts (from memory).
        ("BACKGROUND We asked whether herons return to dredged shores.", "background", "BACKGROUND"),
        ("METHODS Nests were counted from boats each spring.", "methods", "METHODS"),
        ("RESULTS Of the 412 nests, 80 held chicks.", "results", "RESULTS"),
        ("CONCLUSIONS Herons return once dredging stops.", "conclusions", "CONCLUSIONS"),
        # A many-word heading wins over its first word ("MAIN" is no heading, but "MAIN
        # OUTCOME MEASURES" is one of JAMA-style structured abstracts; from memory).
        ("MAIN OUTCOME MEASURES Weight at 12 months.", "methods", "MAIN OUTCOME MEASURES"),
        ("MATERIALS AND METHODS Birds were ringed.", "methods", "MATERIALS AND METHODS"),
        ("Conclusions: herons thrive where the shore is quiet.", "conclusions", "Conclusions"),
        ("Results. Nest counts rose by 18%.", "results", "Results"),
        ("Design, setting, and participants: A cohort of 40 colonies.", "methods", "Design, setting, and participants"),
        ("3 Results The marsh edge retreated.", "results", "Results"),  # numbered heading run into its text
    ],
)
def test_run_in_headings_of_structured_abstracts(paragraph: str, role: str, written: str) -> None:
    assert run_in_heading(paragraph) == (role, written)


@pytest.mark.parametrize(
    "paragraph",
    [
        "Results of the survey were clear and consistent.",  # "Results" opens a sentence
        "Design of the study followed earlier surveys.",
        "DNA was extracted from leaf tissue.",  # capitals, but no heading word
        "In conclusion, herons thrive where the shore is quiet.",
        "Patients were enrolled over two years.",
        "12 patients were enrolled in the trial.",  # a numeral opening a sentence is no numbering
        "40 participants completed the survey.",
    ],
)
def test_ordinary_sentences_are_not_run_in_headings(paragraph: str) -> None:
    assert run_in_heading(paragraph) is None


def test_passages_carry_the_section_and_place_of_their_run() -> None:
    pages = [
        [
            "1. Introduction",
            "Herons nest on quiet shores. Dredging disturbs them.",
            "Earlier counts were made from land.",
        ],
        [
            "2 Methods",
            "Nests were counted from boats each spring.",
            "RESULTS",
            "Counts rose by 18% after dredging stopped.",
            "The rise was largest on the northern shore.",
            "Chicks fledged from most nests.",
        ],
    ]
    passages = make_passages("s.pdf", pages, max_words=50)
    # No heading paragraph makes a passage of its own.
    assert len(passages) == 6
    assert not any(p.text in {"1. Introduction", "2 Methods", "RESULTS"} for p in passages)
    assert [(p.section, p.place) for p in passages] == [
        ("background", 0.0),
        ("background", 1.0),
        ("methods", 0.0),  # a run of one passage stands at its start
        ("results", 0.0),
        ("results", 0.5),
        ("results", 1.0),
    ]
    assert [p.page for p in passages] == [1, 1, 2, 2, 2, 2]
    assert [p.ordinal for p in passages] == list(range(6))


def test_a_run_in_heading_starts_a_section_and_keeps_its_text() -> None:
    pages = [
        [
            "BACKGROUND Herons avoid dredged shores.",
            "RESULTS Of the 412 nests, 80 held chicks.",
            "Nests were densest in the north.",
        ]
    ]
    passages = make_passages("s.pdf", pages, max_words=50)
    assert [(p.section, p.place) for p in passages] == [("background", 0.0), ("results", 0.0), ("results", 1.0)]
    # The run-in heading stays in the passage: it is quoted as the source prints it.
    assert passages[1].text.startswith("RESULTS Of the 412 nests")


def test_a_source_without_headings_has_no_section_and_places_spread_over_it() -> None:
    pages = [
        ["Herons nest on quiet shores.", "Dredging disturbs them."],
        ["Counts rose by 18% after dredging stopped.", "Chicks fledged from most nests.", "The rise held."],
    ]
    passages = make_passages("s.pdf", pages, max_words=50)
    assert [p.section for p in passages] == [""] * 5
    # Evenly spaced from 0 to 1: k / (n - 1) for n = 5.
    assert [p.place for p in passages] == [0.0, 0.25, 0.5, 0.75, 1.0]


def test_pdf_headings_give_the_sections_of_read_passages(tmp_path: Path) -> None:
    path = build_pdf(
        tmp_path / "sections.pdf",
        [
            ["Introduction", "Coastal herons nest on quiet shores. Dredging disturbs their colonies."],
            ["Results", "Nest counts rose by 18% in the two years after dredging stopped."],
        ],
    )
    source = read_source(path, "sections.pdf")
    assert isinstance(source, Source), source
    by_page = {p.page: p.section for p in source.passages}
    assert by_page == {1: "background", 2: "results"}
    assert all(p.text not in {"Introduction", "Results"} for p in source.passages)
