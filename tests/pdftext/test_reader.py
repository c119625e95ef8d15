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
