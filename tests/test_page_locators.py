"""End to end: a citation's page is checked against the page numbers the source prints.

The invented article is set on journal pages 305-307 (its footer prints them), so PDF
page 1 is printed p. 305. One real pipeline run (it loads the embedding model once).
"""

from __future__ import annotations

import pytest

import sourcecheck
from sourcecheck.model import Band, Check, Report
from sourcecheck.reports.json_report import to_dict
from tests.pdf_fixtures import paper_pdf

TITLE = "Holt occupancy of river otters along the upper Wenning"
DRAFT = f"""# Otters of the Wenning

Otter holts were occupied in 41 of 60 surveyed river reaches [1, p. 306].

In the winter survey, otter holts were occupied in 41 of 60 river reaches [1, p. 305].

Water voles were trapped at twelve stations upstream of the weir over three summers [1, p. 306].

## References

[1] A. Pellow and R. Strand, "{TITLE}," *River Mammals*, vol. 3, pp. 305–307, 2020.
"""


@pytest.fixture(scope="module")
def report(tmp_path_factory: pytest.TempPathFactory) -> Report:
    root = tmp_path_factory.mktemp("pages")
    sources = root / "sources"
    sources.mkdir()
    paper_pdf(
        sources / "otters.pdf",
        title=TITLE,
        authors="A. Pellow and R. Strand",
        body=[
            [
                "Otter holts on the upper Wenning were occupied in 41 of 60 surveyed river reaches "
                "during the winter survey.",
                "Occupancy was highest where bankside alder roots were undercut by the current.",
            ],
            [
                "Water voles were trapped at twelve stations upstream of the weir over three summers.",
                "Trap success fell after the mink control programme ended, though the decline was small.",
            ],
            [
                "Survey effort was the same in every reach and observers were trained together beforehand.",
                "All spraints were collected and stored frozen for later diet analysis in the laboratory.",
            ],
        ],
        footer=lambda n: str(304 + n),
    )
    draft = root / "draft.md"
    draft.write_text(DRAFT, encoding="utf-8")
    return sourcecheck.check(draft, sources, cache=root / "cache")


def _check(report: Report, index: int) -> Check:
    (check,) = report.claims[index].checks
    return check


def test_wrong_page_is_judged_on_the_whole_source_with_a_page_mismatch(report: Report) -> None:
    check = _check(report, 0)
    assert check.citation.locator == "p. 306"
    assert check.band is Band.ANCHORED  # the band comes from the passage that backs the claim
    assert check.evidence[0].page == 1 and check.evidence[0].printed_page == "305"
    mismatch = [r for r in check.reasons if r.code == "page-mismatch"]
    assert [r.message for r in mismatch] == ["cited p. 306, but the closest passage is on p. 305 (PDF p. 1)"]


def test_right_page_gives_no_page_mismatch(report: Report) -> None:
    for index, printed in ((1, "305"), (2, "306")):
        check = _check(report, index)
        assert check.band is Band.ANCHORED
        assert "page-mismatch" not in [r.code for r in check.reasons]
        assert check.evidence[0].printed_page == printed


def test_json_keeps_the_pdf_page_and_adds_the_printed_one(report: Report) -> None:
    # report.schema.json: evidence[].page is the 1-based PDF page.
    evidence = to_dict(report)["claims"][2]["checks"][0]["evidence"][0]
    assert evidence["page"] == 2 and evidence["printed_page"] == "306"
