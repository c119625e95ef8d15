"""Reports of real runs for the writer tests: the demo, and a draft and source built to attack a report.

Both run the whole pipeline once per test session on one cache, so each writer test reads
a ``Report`` as the command line would hand it over.
"""

from __future__ import annotations

from pathlib import Path

import pytest

import sourcecheck
from sourcecheck.model import Report
from tests.pdf_fixtures import paper_pdf

ROOT = Path(__file__).resolve().parents[2]
DRAFT = ROOT / "sample_manuscript" / "draft.md"
SOURCES = ROOT / "sample_sources"

#: Strings a hostile draft or PDF may carry. The page and the Markdown must show them as text.
SCRIPT_IN_PDF = "<script>window.__injected = 3</script>"
ONERROR_IN_PDF = '<img src=x onerror="window.__injected = 4">'
MARKDOWN_IN_PDF = "# Taken over | cell | [click](javascript:alert(1)) **loud**"
ONERROR_IN_DRAFT = '<img src=x onerror="window.__injected = 1">'
SCRIPT_IN_DRAFT = "<script>window.__injected = 2</script>"
ANSI_IN_DRAFT = "\x1b[31m"
HOSTILE_SOURCE_NAME = "heron <img src=x onerror=alert(7)> & co.pdf"

HOSTILE_DRAFT = f"""# Heron notes

Heron nests on the tidal mudflats rose by 23% after dredging stopped {ONERROR_IN_DRAFT} [1].
Wading {ANSI_IN_DRAFT}birds\x1b[0m fed mostly by day on the flats {SCRIPT_IN_DRAFT} | cell | [2].

## References

[1] A. Ferrow, "Heron nests on tidal flats {SCRIPT_IN_DRAFT}," J. Tidal Stud., 2021.

[2] B. Quill, "Wader feeding times," 2020.
"""


@pytest.fixture(scope="session")
def report_cache(tmp_path_factory: pytest.TempPathFactory) -> Path:
    return tmp_path_factory.mktemp("report-cache")


@pytest.fixture(scope="session")
def demo_report(report_cache: Path) -> Report:
    """The bundled demo, checked as ``sourcecheck check sample_manuscript/draft.md`` would."""
    return sourcecheck.check(DRAFT, SOURCES, cache=report_cache)


@pytest.fixture(scope="session")
def hostile_report(report_cache: Path, tmp_path_factory: pytest.TempPathFactory) -> Report:
    """A draft and a source PDF whose text holds HTML, Markdown and terminal escapes."""
    folder = tmp_path_factory.mktemp("hostile")
    sources = folder / "sources"
    sources.mkdir()
    paper_pdf(
        sources / HOSTILE_SOURCE_NAME,
        title="Heron nests on tidal flats",
        authors="A. Ferrow",
        year=2021,
        body=[
            [
                "Results",
                f"Heron nests on the tidal mudflats rose by 18% after dredging stopped. {SCRIPT_IN_PDF}",
                f"Wading birds fed mostly by day on the flats. {ONERROR_IN_PDF}",
                MARKDOWN_IN_PDF,
            ]
        ],
    )
    draft = folder / "draft.md"
    draft.write_text(HOSTILE_DRAFT, encoding="utf-8")
    mapping = folder / "map.csv"
    mapping.write_text(f"key,file\n1,{HOSTILE_SOURCE_NAME}\n2,{HOSTILE_SOURCE_NAME}\n", encoding="utf-8")
    return sourcecheck.check(draft, sources, mapping=mapping, cache=report_cache)
