"""The draft stage: read a manuscript into claims, reference entries and problems.

``read_draft`` is the one entry point the pipeline calls. Readers are picked by file
suffix; each returns the same :class:`sourcecheck.model.Draft`, and all share the marker,
reference and claim modules, so a new format only has to cut its text into blocks.
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

from sourcecheck.drafts.ignore import mark_ignored
from sourcecheck.drafts.latex import read_latex  # before markdown: bibliography and latex import each other
from sourcecheck.drafts.markdown import read_markdown
from sourcecheck.drafts.textfile import decode, read_bytes
from sourcecheck.errors import DraftUnreadable
from sourcecheck.model import Draft, Problem, ReadOptions

__all__ = ["FORMATS", "READERS", "read_draft"]


#: A reader gets the draft's path, its display name and the options, and returns a Draft.
Reader = Callable[[Path, str, ReadOptions], Draft]


def _read_markdown_file(path: Path, display: str, options: ReadOptions) -> Draft:
    text, problems = decode(read_bytes(path, display), display)
    draft = read_markdown(text, display, options=options, base_dir=path.parent)
    draft.problems[:0] = problems
    return draft


# The Word and PDF readers are imported when a draft of theirs is read: their libraries
# (python-docx, pypdf) would cost a warm run on a Markdown draft about 0.1 s to load.
def _read_word(path: Path, display: str, options: ReadOptions) -> Draft:
    from sourcecheck.drafts.word import read_word

    return read_word(path, display, options)


def _read_pdf(path: Path, display: str, options: ReadOptions) -> Draft:
    from sourcecheck.drafts.pdf import read_pdf_manuscript

    return read_pdf_manuscript(path, display, options)


# Format name -> reader.
READERS: dict[str, Reader] = {
    "markdown": _read_markdown_file,
    "word": _read_word,
    "latex": read_latex,
    "pdf": _read_pdf,
}

# File suffix -> format name.
FORMATS: dict[str, str] = {
    ".md": "markdown",
    ".markdown": "markdown",
    ".mdown": "markdown",
    ".mkd": "markdown",
    ".txt": "markdown",
    ".text": "markdown",
    ".docx": "word",
    ".tex": "latex",
    ".ltx": "latex",
    ".pdf": "pdf",
}


def read_draft(path: Path, display: str | None = None, options: ReadOptions | None = None) -> Draft:
    """Read the draft at ``path``; ``display`` is how reports name the file.

    Raises DraftUnreadable only when the file is missing, a folder or cannot be opened
    (or ``--format-in`` names no known format). Anything wrong inside the file comes
    back in ``Draft.problems``.
    """
    options = options or ReadOptions()
    name = display or str(path)
    path = Path(path)
    read_bytes(path, name, options.limits.file_bytes)  # fail early, the same way for every format
    notes: list[Problem] = []
    if options.format is not None:
        if options.format not in READERS:
            known = ", ".join(sorted(READERS))
            raise DraftUnreadable(f"{name}: --format-in {options.format!r} is not one of {known}")
        format_name = options.format
    else:
        suffix = path.suffix.lower()
        format_name = FORMATS.get(suffix, "markdown")
        if suffix not in FORMATS:
            what = f"'{suffix}'" if suffix else "without a suffix"
            notes.append(Problem(name, f"draft format {what} is not known; read as plain text"))
    draft = READERS[format_name](path, name, options)
    draft.problems.extend(notes)
    return mark_ignored(draft, path, name, format_name)
