"""Reading many PDFs at once, one worker process per core.

pypdf is pure Python, so threads would share one interpreter lock; processes read PDFs
truly in parallel. Results come back in the order the files were given, whatever order the
workers finish in, so a parallel run reports exactly what a serial one does (tested). Each
file is read within the run's limits, and a worker that dies on a file (killed for its
memory, say) costs that file one problem line, not the run.
"""

from __future__ import annotations

import multiprocessing
import os
from collections.abc import Callable, Sequence
from concurrent.futures import Future, ProcessPoolExecutor, as_completed
from pathlib import Path

from sourcecheck.limits import Limits
from sourcecheck.model import Problem, Source
from sourcecheck.pdftext import one_line
from sourcecheck.sources._reader import read_source

#: (file, display path, content hash) of one PDF to read.
Job = tuple[Path, str, str]
#: What reading one file gave: the source or a problem, and the notes of a partial read.
Outcome = tuple[Source | Problem, list[Problem]]


def default_jobs() -> int:
    """One worker per core this process may run on."""
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except AttributeError:  # pragma: no cover - not Linux
        return max(1, os.cpu_count() or 1)


def _read(job: Job, limits: Limits) -> Outcome:
    pdf, display, sha = job
    notes: list[Problem] = []
    result = read_source(pdf, display, sha256=sha, limits=limits, notes=notes)
    return result, notes


def _collected(future: Future[Outcome], job: Job) -> Outcome:
    """A worker's outcome; a worker that died on its file is one problem line naming the file."""
    try:
        return future.result()
    except Exception as exc:  # BrokenProcessPool, MemoryError in the worker, ...
        return Problem(job[1], f"could not be read (the reading process failed: {one_line(exc)})"), []


def read_sources_in_parallel(
    jobs: Sequence[Job],
    limits: Limits | None = None,
    workers: int | None = None,
    done: Callable[[int], None] | None = None,
) -> list[Outcome]:
    """``read_source`` of every job within ``limits``, in the given order; ``done(n)`` after each file.

    With one worker (or one file) the files are read in this process: no pool to start.
    Workers are forked where the platform allows (no re-import of the program per worker).
    """
    limits = limits or Limits()
    workers = min(workers or default_jobs(), len(jobs))
    results: list[Outcome | None] = [None] * len(jobs)
    if workers <= 1:
        for i, job in enumerate(jobs):
            results[i] = _read(job, limits)
            if done is not None:
                done(i + 1)
    else:
        methods = multiprocessing.get_all_start_methods()
        context = multiprocessing.get_context("fork" if "fork" in methods else None)
        with ProcessPoolExecutor(max_workers=workers, mp_context=context) as pool:
            futures = {pool.submit(_read, job, limits): i for i, job in enumerate(jobs)}
            for finished, future in enumerate(as_completed(futures), start=1):
                results[futures[future]] = _collected(future, jobs[futures[future]])
                if done is not None:
                    done(finished)
    return [r for r in results if r is not None]
