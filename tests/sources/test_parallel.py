"""Reading PDFs in worker processes gives what reading them one by one gives, in order."""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from sourcecheck.limits import Limits
from sourcecheck.model import Problem
from sourcecheck.sources import discover_pdfs, file_sha256, read_source, read_sources_in_parallel
from tests.pdf_fixtures import write_not_a_pdf

SAMPLES = Path(__file__).resolve().parents[2] / "sample_sources"


def _serial(jobs: list[tuple[Path, str, str]], limits: Limits | None = None) -> list[object]:
    outcomes = []
    for pdf, display, sha in jobs:
        notes: list[Problem] = []
        outcomes.append((read_source(pdf, display, sha256=sha, limits=limits, notes=notes), notes))
    return outcomes


def _jobs() -> list[tuple[Path, str, str]]:
    return [(pdf, pdf.name, file_sha256(pdf)) for pdf in discover_pdfs(SAMPLES)]


def test_workers_return_the_serial_results_in_the_given_order(tmp_path: Path) -> None:
    broken = write_not_a_pdf(tmp_path / "notes.pdf")
    jobs = [*_jobs(), (broken, broken.name, file_sha256(broken))]
    finished: list[int] = []
    parallel = read_sources_in_parallel(jobs, workers=2, done=finished.append)
    assert parallel == _serial(jobs)  # dataclass equality: every passage, page and problem alike
    assert sorted(finished) == list(range(1, len(jobs) + 1))
    assert len(parallel) == len(jobs) > 2
    # A file that is not a PDF: its one-line problem comes back from the worker too, in its place.
    assert isinstance(parallel[-1][0], Problem) and parallel[-1][0].file == "notes.pdf"


def test_workers_read_within_the_limits_and_say_what_they_left_out() -> None:
    jobs = _jobs()
    one_page = Limits(pdf_pages=1)
    parallel = read_sources_in_parallel(jobs, one_page, workers=2)
    assert parallel == _serial(jobs, one_page)
    notes = [note.message for _, found in parallel for note in found]
    assert notes and all("pdf_pages" in message for message in notes)  # a note per file read in part


def test_one_worker_reads_in_this_process() -> None:
    jobs = _jobs()[:1]
    assert read_sources_in_parallel(jobs, workers=4) == _serial(jobs)


def _die_on_doomed(job: tuple[Path, str, str], limits: Limits) -> object:
    """Stands in for a worker killed while reading one file (by the kernel, for its memory)."""
    if job[1] == "doomed.pdf":
        os._exit(1)
    return read_source(job[0], job[1], sha256=job[2], limits=limits, notes=[]), []


def test_a_worker_that_dies_costs_its_file_one_line_not_the_run(monkeypatch: pytest.MonkeyPatch) -> None:
    import sourcecheck.sources._parallel as parallel_module

    pdf, _, sha = _jobs()[0]
    monkeypatch.setattr(parallel_module, "_read", _die_on_doomed)
    outcomes = read_sources_in_parallel([(pdf, "doomed.pdf", sha), (pdf, "fine.pdf", sha)], workers=2)
    (doomed, notes), (fine, _) = outcomes
    assert isinstance(doomed, Problem) and doomed.file == "doomed.pdf" and notes == []
    assert "\n" not in doomed.message and "reading process failed" in doomed.message
    # The pool is broken for every file still in it: each is its own one-line problem, or was read.
    assert fine.file == "fine.pdf" if isinstance(fine, Problem) else fine.path == "fine.pdf"
