"""The batch table: one row per manuscript, bands from least to most severe, no trailing spaces."""

from __future__ import annotations

import io

from rich.console import Console

from sourcecheck.model import Review
from sourcecheck.reports import render_summary, summary_rows
from tests.reports.sample_report import sample_report


def test_rows_count_bands_reviewed_checks_and_problems() -> None:
    report = sample_report()
    report.claims[0].checks[0].reviewed = Review("seen", "review-file")
    header, row = summary_rows([report])
    assert header == [
        "manuscript", "claims", "checks", "anchored", "loose", "unverifiable", "adrift", "conflict", "reviewed",
        "problems",
    ]  # fmt: skip
    assert row == ["draft.md", "2", "3", "0", "0", "2", "0", "1", "1", "1"]


def test_table_is_aligned_without_trailing_spaces() -> None:
    console = Console(width=60, file=io.StringIO(), color_system=None)
    render_summary([sample_report(), sample_report()], console)
    lines = console.file.getvalue().splitlines()  # type: ignore[attr-defined]
    assert len(lines) == 4 and lines[-1] == "2 manuscripts, 4 claims"
    assert len({len(line) for line in lines[:3]}) == 1  # right-aligned counts end in one column
    assert all(line == line.rstrip() for line in lines)
