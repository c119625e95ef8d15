"""The command line's shareable formats: --format html, markdown and sarif, to a file or to stdout."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from sourcecheck.cli import EXIT_OK, main
from sourcecheck.reports import CAUTION
from tests.test_pipeline import planted_rows

ROOT = Path(__file__).resolve().parent.parent
DRAFT = ROOT / "sample_manuscript" / "draft.md"
SOURCES = ROOT / "sample_sources"


def _check(cache: Path, *extra: str) -> int:
    return main(["check", str(DRAFT), "--sources", str(SOURCES), "--cache", str(cache), "--quiet", *extra])


@pytest.fixture(scope="module")
def cache(tmp_path_factory: pytest.TempPathFactory) -> Path:
    folder = tmp_path_factory.mktemp("cli-formats-cache")
    assert _check(folder) == EXIT_OK  # the model runs once here; the runs below read the cache
    return folder


def test_html_goes_whole_into_the_output_file(cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    target = tmp_path / "report.html"
    assert _check(cache, "--format", "html", "--output", str(target)) == EXIT_OK
    page = target.read_text(encoding="utf-8")
    assert capsys.readouterr().out == ""
    assert page.startswith("<!DOCTYPE html>") and page.rstrip().endswith("</html>")
    assert page.count('class="check ') == len(planted_rows())


def test_markdown_to_stdout(cache: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert _check(cache, "--format", "markdown") == EXIT_OK
    out = capsys.readouterr().out
    assert out.startswith("# Citation check of ") and f"> {CAUTION}" in out


def test_sarif_to_stdout(cache: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert _check(cache, "--format", "sarif") == EXIT_OK
    log = json.loads(capsys.readouterr().out)
    assert log["version"] == "2.1.0"
    assert len(log["runs"][0]["results"]) == sum(r["band"] != "anchored" for r in planted_rows())
