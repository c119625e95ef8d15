"""What a source PDF says it is: its title by layout, identifiers, first authors.

Built PDFs are invented; the last tests read the real papers of ../shared/data/papers and
check the titles against the ones its README gives (our fixture title_only.txt holds them).
"""

from __future__ import annotations

from pathlib import Path

import pytest
from rapidfuzz import fuzz

from sourcecheck.model import Source
from sourcecheck.sources import read_source
from sourcecheck.sources._evidence import squash
from tests.pdf_fixtures import typeset_pdf
from tests.real_references import STYLES, entries, papers

TITLE = "Grazing pressure and seed rain on coastal dune grassland"
BODY = (
    "Dune grasslands are kept open by grazing. We counted seeds caught in traps on grazed and "
    "ungrazed plots over three years and found that grazing halved the seed rain of tall grasses."
)


def _read(path: Path) -> Source:
    source = read_source(path, path.name)
    assert isinstance(source, Source)
    return source


def test_title_is_the_largest_type_and_authors_stand_below(tmp_path: Path) -> None:
    path = typeset_pdf(
        tmp_path / "a.pdf",
        [
            [
                (9, "Journal of Invented Coasts 12 (2021) 40-49"),
                (20, TITLE),
                (12, "Ada Okafor, Bo Lund and Cy Marsh"),
                (10, BODY),
                (10, "doi:10.5555/jic.2021.040 and arXiv:2101.01234v2"),
            ]
        ],
        title="Proceedings Template - WORD",
    )
    identity = _read(path).identity
    assert identity.title == TITLE
    assert identity.metadata_title is None  # a template's name is not on the page
    assert identity.authors == ("Ada Okafor", "Bo Lund", "Cy Marsh")
    assert identity.dois == ("10.5555/jic.2021.040",)
    assert identity.arxiv_ids == ("2101.01234",)
    assert identity.title_page == 1


def test_metadata_title_kept_when_the_page_shows_it(tmp_path: Path) -> None:
    path = typeset_pdf(tmp_path / "a.pdf", [[(18, TITLE), (10, BODY)]], title=TITLE.upper())
    assert _read(path).identity.metadata_title == TITLE.upper()


def test_cover_page_is_skipped_for_the_article_first_page(tmp_path: Path) -> None:
    cover = [
        (16, "Journal of Invented Coasts"),
        (11, "To cite this article: A. Okafor (2021) A study of dunes, Journal of Invented Coasts."),
        (12, "Related content: Wind erosion of sand dunes in winter"),
    ]
    article = [(18, TITLE), (11, "Ada Okafor"), (10, BODY)]
    identity = _read(typeset_pdf(tmp_path / "a.pdf", [cover, article])).identity
    assert (identity.title, identity.title_page) == (TITLE, 2)


def test_without_a_cover_marker_page_one_keeps_the_title(tmp_path: Path) -> None:
    page_one = [(18, TITLE), (10, BODY)]
    page_two = [(16, "A heading set large on page two"), (10, BODY)]
    identity = _read(typeset_pdf(tmp_path / "a.pdf", [page_one, page_two])).identity
    assert (identity.title, identity.title_page) == (TITLE, 1)


def test_journal_name_in_large_type_that_runs_on_later_pages_is_not_the_title(tmp_path: Path) -> None:
    masthead = "Journal of Invented Coastal Studies"
    first = [(22, masthead), (18, TITLE), (11, "Ada Okafor"), (10, BODY)]
    later = [[(8, f"{masthead} 12 (2021)"), (10, BODY)] for _ in range(3)]
    identity = _read(typeset_pdf(tmp_path / "a.pdf", [first, *later])).identity
    assert identity.title == TITLE


def test_page_of_body_text_only_has_no_title(tmp_path: Path) -> None:
    identity = _read(typeset_pdf(tmp_path / "a.pdf", [[(10, BODY), (10, BODY)]])).identity
    assert identity.title is None


# --- the real papers ------------------------------------------------------------------


def test_every_real_paper_shows_the_title_its_readme_gives(real_sources: dict[str, Source]) -> None:
    titles = entries(next(s for s in STYLES if s.name == "title_only"))
    for paper, title in zip(papers(), titles, strict=True):
        identity = real_sources[paper.file].identity
        printed = identity.title or ""
        # Folded, spaces dropped: some extractions lose word spaces (Royal Society Open Science).
        assert fuzz.ratio(squash(printed), squash(title)) >= 90, (paper.file, printed)


@pytest.mark.parametrize(
    ("file", "page"),
    [
        ("healthpsycholbehavmed_2016_implementation_intentions_eating.pdf", 2),  # Taylor & Francis cover
        ("newjphys_2014_neutrino_cosmology_planck.pdf", 2),  # IOP cover with related articles
        ("bmcevolbiol_2014_yellowjacket_paternity_provisional.pdf", 2),  # BMC provisional PDF cover
        ("lancet_2018_homeless_morbidity_mortality.pdf", 1),
    ],
)
def test_real_cover_pages_are_skipped(real_sources: dict[str, Source], file: str, page: int) -> None:
    # The README of ../shared/data/papers names the files that open with a cover page.
    assert real_sources[file].identity.title_page == page


def test_real_identifiers(real_sources: dict[str, Source]) -> None:
    # DOIs and the arXiv id as the data README gives them.
    assert "1503.07589" in real_sources["arxiv_2015_atlas_cms_higgs_mass.pdf"].identity.arxiv_ids
    assert "10.12688/f1000research.4767.2" in real_sources["f1000research_2015_shark_longevity.pdf"].identity.dois
    assert (
        "10.1088/1742-6596/2188/1/012011"
        in real_sources["jphysconfser_2022_semeagat_event_detection.pdf"].identity.dois
    )
