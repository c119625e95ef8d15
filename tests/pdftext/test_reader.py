"""The pypdf boundary: any pypdf failure is one line, and its logging is restored."""

from __future__ import annotations

import logging
from pathlib import Path

import pytest

from sourcecheck.model import Problem
from sourcecheck.pdftext import reader as _pdf
from sourcecheck.pdftext.reader import quiet_pypdf
from sourcecheck.sources import read_source
from tests.pdf_fixtures import build_pdf


def test_unexpected_pypdf_error_becomes_a_problem(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    path = build_pdf(tmp_path / "ok.pdf", [["Fine text."]])

    def explode(*_args: object, **_kwargs: object) -> None:
        raise KeyError("/Kids")

    monkeypatch.setattr(_pdf, "PdfReader", explode)
    result = read_source(path, "ok.pdf")
    assert isinstance(result, Problem)
    assert result.message == "truncated or corrupt PDF ('/Kids')"


def test_quiet_restores_the_pypdf_logger_level() -> None:
    logger = logging.getLogger("pypdf")
    logger.setLevel(logging.INFO)
    try:
        with quiet_pypdf():
            assert not logger.isEnabledFor(logging.CRITICAL)
        assert logger.level == logging.INFO
    finally:
        logger.setLevel(logging.NOTSET)


def test_lone_surrogates_become_replacement_characters_and_pairs_join() -> None:
    # UTF-16 surrogates (Unicode 15.0, section 3.8): a high one must be followed by a low one.
    text = "a\udc8fb \ud835\udc9c c\ud835"
    cleaned = _pdf.without_lone_surrogates(text)
    assert cleaned == "a\ufffdb \U0001d49c c\ufffd"
    cleaned.encode("utf-8")  # no longer raises
    assert _pdf.without_lone_surrogates("plain ﬁ text") == "plain ﬁ text"


def test_pages_over_the_page_limit_are_not_read_and_the_cut_is_said(tmp_path: Path) -> None:
    from sourcecheck.pdftext import read_pdf
    from tests.hostile import many_pages_pdf

    data = many_pages_pdf(tmp_path / "long.pdf", 12).read_bytes()
    raw = read_pdf(data, max_pages=5)
    assert len(raw.pages) == 5 and "Page 5:" in raw.pages[4]
    assert raw.cut == "12 pages, over the limit of 5 (pdf_pages); only the first 5 read"
    assert read_pdf(data).cut == ""


def test_the_time_budget_is_checked_between_pages(tmp_path: Path) -> None:
    from sourcecheck.pdftext import read_pdf
    from tests.hostile import many_pages_pdf

    # A budget already spent after the first page: page 1 is always read, page 2 is not started.
    raw = read_pdf(many_pages_pdf(tmp_path / "slow.pdf", 3).read_bytes(), seconds=1e-9)
    assert len(raw.pages) == 1
    assert raw.cut == "reading took over the limit of 1e-09 s (source_seconds); pages 2 on not read"
