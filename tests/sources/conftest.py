"""Shared fixtures for the sources-stage tests: invented article text and built PDFs."""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.model import Source
from sourcecheck.sources import read_source
from tests.pdf_fixtures import paper_pdf

#: Invented body text, distinct on every page so no body line looks like a running line.
PAGE_TEXTS: list[list[str]] = [
    [
        "Introduction",
        "Coastal wetlands store carbon in waterlogged soils for centuries. Their loss "
        "releases that store and weakens the shoreline against storm surges. Managers in "
        "the northern estuary asked how fast the marsh edge was retreating.",
    ],
    [
        "Methods",
        "We surveyed forty transects along the estuary each spring from 2012 to 2018. "
        "Edge position was measured with a differential GPS receiver. Soil cores were "
        "taken at five points on every transect.",
    ],
    [
        "Results",
        "The marsh edge retreated by 1.8 metres per year on average. Retreat was fastest "
        "on the exposed western shore, where waves reach the bank at high tide. Carbon "
        "density did not differ between eroding and stable sites.",
    ],
    [
        "Discussion",
        "Edge retreat at this rate would remove a tenth of the marsh within three decades. "
        "Planting along the western shore could slow the loss where it is worst.",
    ],
]

REFERENCES = [
    "[1] Hale R, Moss T. Salt marsh carbon budgets revisited. Estuar Sci. 2015;4:1-9. doi:10.5555/esci.2015.001",
    "[2] Ibarra L. Wave exposure and bank erosion. Coast Res Lett. 2017;9:33-40.",
]


@pytest.fixture(scope="session")
def article(tmp_path_factory: pytest.TempPathFactory) -> Path:
    """A four-page invented article with running lines, a DOI and a reference list."""
    path = tmp_path_factory.mktemp("sources") / "article.pdf"
    return paper_pdf(
        path,
        title="Marsh edge retreat in a northern estuary",
        authors="Nadia Ferreira, Tomas Lindqvist",
        year=2019,
        doi="10.5555/NEST.2019.042",
        body=PAGE_TEXTS,
        references=REFERENCES,
        header="Journal of Invented Coasts 7 (2019) {n}",
        footer="Page {n} of {nb}",
        metadata_title="Marsh edge retreat in a northern estuary",
        metadata_author="Ferreira, N.; Lindqvist, T.",
    )


@pytest.fixture(scope="session")
def real_sources() -> dict[str, Source]:
    """The 27 real papers of ../shared/data/papers, each read once per test session (~40 s).

    The folder lives beside the repository (CI checks it out there); it is never copied in.
    """
    from tests.real_references import PAPERS_DIR, papers

    if not PAPERS_DIR.is_dir():
        pytest.fail(f"{PAPERS_DIR} is missing: the real-paper tests read the shared data set from there")
    read: dict[str, Source] = {}
    for paper in papers():
        source = read_source(PAPERS_DIR / paper.file, paper.file)
        assert isinstance(source, Source), source
        read[paper.file] = source
    return read
