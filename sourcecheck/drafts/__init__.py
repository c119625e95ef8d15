"""The draft stage: read a manuscript into claims, reference entries and problems.

``read_draft`` is the one entry point the pipeline calls. Readers are picked by file
suffix; each returns the same :class:`sourcecheck.model.Draft`, and all share the marker,
reference and claim modules, so a new format only has to cut its text into blocks.
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

from sourcecheck.drafts.markdown import read_markdown
from sourcecheck.drafts.textfile import decode, read_bytes
from sourcecheck.model import Draft, Problem

__all__ = ["READERS", "read_draft"]

# Suffix -> reader of decoded text. Later formats (LaTeX, Word, PDF) register here.
READERS: dict[str, Callable[[str, str], Draft]] = {
    ".md": read_markdown,
    ".markdown": read_markdown,
    ".mdown": read_markdown,
    ".mkd": read_markdown,
    ".txt": read_markdown,
    ".text": read_markdown,
}


def read_draft(path: Path, display: str | None = None) -> Draft:
    """Read the draft at ``path``; ``display`` is how reports name the file.

    Raises DraftUnreadable only when the file is missing, a folder or cannot be opened.
    Anything wrong inside the file comes back in ``Draft.problems``.
    """
    name = display or str(path)
    data = read_bytes(Path(path), name)
    text, problems = decode(data, name)
    suffix = Path(path).suffix.lower()
    reader = READERS.get(suffix)
    if reader is None:
        reader = read_markdown
        what = f"'{suffix}'" if suffix else "without a suffix"
        problems.append(Problem(name, f"draft format {what} is not known; read as plain text"))
    draft = reader(text, name)
    draft.problems[:0] = problems
    return draft
