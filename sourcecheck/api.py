"""The public Python API: one call runs the whole check and returns the report object.

``sourcecheck.check(draft, sources)`` is what the command line runs; the JSON report is
this object serialised. The pipeline is imported on the first call, so ``import
sourcecheck`` stays cheap (no PDF, Word or model libraries loaded).
"""

from __future__ import annotations

import os
from collections.abc import Callable
from pathlib import Path

from sourcecheck.model import ReadOptions, Report, RunStats

#: Called as ``progress(stage, done, total)`` while sources are read and embedded.
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
    cache: str | os.PathLike[str] | None = None,
    progress: Progress | None = None,
    stats: RunStats | None = None,
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
        cache: where passages and vectors are cached (default: the user cache directory).
        progress: called as ``progress(stage, done, total)`` while sources are read and embedded.
        stats: counters of what the run cost, filled in as it goes.

    Raises:
        SourcecheckError: the draft, the sources folder, the mapping or the model cannot be
            opened. Anything wrong inside a file is a ``Problem`` in ``Report.problems``.
    """
    from sourcecheck.pipeline import run

    return run(
        Path(draft),
        Path(sources),
        mapping=Path(mapping) if mapping is not None else None,
        model=model,
        verifier=str(verifier) if verifier is not None else None,
        cache_dir=Path(cache) if cache is not None else None,
        progress=progress or _quiet,
        stats=stats,
        read_options=ReadOptions(bibliography=Path(bib) if bib is not None else None, format=format_in),
    )
