"""The public Python API: one call runs the whole check and returns the report object.

``sourcecheck.check(draft, sources)`` is what the command line runs; the JSON report is
this object serialised. The pipeline is imported on the first call, so ``import
sourcecheck`` stays cheap (no PDF, Word or model libraries loaded).
"""

from __future__ import annotations

import os
from collections.abc import Callable, Sequence
from pathlib import Path

from sourcecheck.errors import BibliographyUnreadable
from sourcecheck.limits import Limits
from sourcecheck.model import Problem, ReadOptions, Report, RunStats

#: Called as ``progress(stage, done, total)`` as the run goes (stages: read, load model, embed, judge).
Progress = Callable[[str, int, int], None]


def _quiet(stage: str, done: int, total: int) -> None:
    return None


def check(
    draft: str | os.PathLike[str],
    sources: str | os.PathLike[str],
    *,
    bib: str | os.PathLike[str] | None = None,
    format_in: str | None = None,
    mapping: str | os.PathLike[str] | None = None,
    model: str | None = None,
    verifier: str | os.PathLike[str] | None = None,
    backend: str = "onnx-int8",
    jobs: int | None = None,
    cache: str | os.PathLike[str] | None = None,
    progress: Progress | None = None,
    stats: RunStats | None = None,
    limits: Limits | None = None,
    follow_links: bool = False,
) -> Report:
    """Check every cited claim of ``draft`` against the PDFs under ``sources``.

    Args:
        draft: the manuscript (Markdown or plain text, Pandoc Markdown, LaTeX, Word .docx, PDF).
        sources: folder of source PDFs, searched recursively.
        bib: the bibliography for a Pandoc or LaTeX draft's keys (.bib, .bbl, CSL-JSON, RIS).
        format_in: read the draft as ``markdown``, ``word``, ``latex`` or ``pdf``, whatever its suffix.
        mapping: CSV (``key,file``) or TOML file pinning references to files.
        model: another local sentence-transformers model folder.
        verifier: another local entailment verifier folder (an ONNX model and its tokenizer.json).
        backend: how the embedding model runs: ``onnx-int8`` (quantised to int8 once, run by
            ONNX Runtime) or ``torch`` (sentence-transformers in fp32).
        jobs: worker processes that read PDFs (default: one per core).
        cache: where passages and vectors are cached (default: the user cache directory).
        progress: called as ``progress(stage, done, total)`` as the run goes: stages ``read``,
            ``load model``, ``embed`` and ``judge``.
        stats: counters of what the run cost, filled in as it goes.
        limits: how much of each file is read (``sourcecheck.Limits``; the defaults when None).
        follow_links: read source PDFs that are symbolic links to files outside ``sources``.

    Checks a person accepted (the review file beside the draft, or an ignore comment in
    it) come back with ``Check.reviewed`` set; an accepted check whose fingerprint no
    longer holds is a ``Problem`` naming the review file.

    Raises:
        SourcecheckError: the draft, the sources folder, the mapping, the review file or the
            model cannot be opened. Anything wrong inside a file is a ``Problem`` in ``Report.problems``.
    """
    return check_many(
        [draft],
        sources,
        bib=bib,
        format_in=format_in,
        mapping=mapping,
        model=model,
        verifier=verifier,
        backend=backend,
        jobs=jobs,
        cache=cache,
        progress=progress,
        stats=stats,
        limits=limits,
        follow_links=follow_links,
    )[0]


def check_many(
    drafts: Sequence[str | os.PathLike[str]],
    sources: str | os.PathLike[str],
    *,
    bib: str | os.PathLike[str] | None = None,
    format_in: str | None = None,
    mapping: str | os.PathLike[str] | None = None,
    model: str | None = None,
    verifier: str | os.PathLike[str] | None = None,
    backend: str = "onnx-int8",
    jobs: int | None = None,
    cache: str | os.PathLike[str] | None = None,
    progress: Progress | None = None,
    stats: RunStats | None = None,
    limits: Limits | None = None,
    follow_links: bool = False,
) -> list[Report]:
    """Check several drafts against one folder of sources, in order; one report per draft.

    The sources are read, embedded and indexed once for all of them, which is what an
    editor screening a batch of submissions against one library needs. The options are
    those of :func:`check`; ``bib`` and ``format_in`` apply to every draft.

    Raises:
        SourcecheckError: a draft, the sources folder, the mapping or the model cannot be opened.
    """
    from sourcecheck.pipeline import run_many

    paths = [Path(d) for d in drafts]
    if bib is not None and not Path(bib).is_file():
        # A bibliography the user typed is part of the command, like --map: a wrong path stops the
        # run (exit 2) rather than leaving every key unresolved. One named by the draft stays a problem.
        why = "not found" if not Path(bib).exists() else "not a file"
        raise BibliographyUnreadable(f"{bib}: bibliography file {why} (--bib)")
    reports = run_many(
        paths,
        Path(sources),
        mapping=Path(mapping) if mapping is not None else None,
        model=model,
        verifier=str(verifier) if verifier is not None else None,
        backend=backend,
        jobs=jobs,
        cache_dir=Path(cache) if cache is not None else None,
        progress=progress or _quiet,
        stats=stats,
        read_options=ReadOptions(
            bibliography=Path(bib) if bib is not None else None, format=format_in, limits=limits or Limits()
        ),
        follow_links=follow_links,
    )
    for path, report in zip(paths, reports, strict=True):
        _apply_review_state(path, report)
    return reports


def _apply_review_state(draft: Path, report: Report) -> None:
    """Mark the checks a person accepted (review file, ignore comments); an entry that no longer holds is a problem."""
    from sourcecheck.workflow import apply_reviews, load_reviews, review_path

    file = review_path(draft)
    for stale in apply_reviews(report, load_reviews(file)):
        report.problems.append(
            Problem(
                str(file),
                f"the accepted check {stale.claim} {stale.citation} no longer holds "
                "(its claim, reference or evidence changed); it is shown and counted again",
            )
        )
