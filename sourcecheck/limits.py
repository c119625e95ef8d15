"""How much of a stranger's file sourcecheck reads: one table of limits, all in one place.

Editors run the check on manuscripts and PDFs they did not write. A file can be built to
make a reader take hours (one paragraph of a million sentences), gigabytes (a zip member
that inflates to 5 GiB) or recurse until Python gives up (JSON nested 100,000 deep). Each
limit below bounds one such cost; a file over a limit is named in one problem line with
the limit, and the rest of the run goes on. The defaults are far above any real
manuscript or article (the reasons are beside each field) and can be raised through the
Python API: ``sourcecheck.check(draft, sources, limits=Limits(pdf_pages=5000))``.
"""

from __future__ import annotations

from dataclasses import dataclass

MIB = 1 << 20


@dataclass(frozen=True)
class Limits:
    """The limits of one run; every field is a ceiling, checked before the work it bounds."""

    #: Bytes of any one file read: the draft, a bibliography, a source PDF. A 600-page
    #: scanned book is about 100 MB (common practice, no source).
    file_bytes: int = 256 * MIB
    #: Bytes one member of a zip package (a .docx part) may inflate to. Word's document.xml
    #: of a 300-page thesis is a few MB (from memory, not a measured or published figure).
    zip_member_bytes: int = 64 * MIB
    #: Bytes all members of one zip package may inflate to together.
    zip_total_bytes: int = 256 * MIB
    #: Pages read of one PDF (a source or a PDF draft); the rest are not read.
    pdf_pages: int = 2000
    #: Characters of one paragraph; the rest of the paragraph is not read. 100,000
    #: characters is about 40 printed pages with no paragraph break.
    paragraph_chars: int = 100_000
    #: Characters of the whole draft's text; the rest of the draft is not read. A
    #: 400-page book is about a million characters.
    draft_chars: int = 5_000_000
    #: Sentences of one paragraph; the rest of the paragraph is not read.
    paragraph_sentences: int = 1000
    #: Citations of one sentence; the rest are not checked. A sentence citing a hundred
    #: works is already a list, not a claim.
    sentence_citations: int = 100
    #: Nesting depth of CSL-JSON and of LaTeX groups (a CSL item is four levels deep). A
    #: cache entry too deep for Python's parser is rebuilt whatever this says.
    nesting_depth: int = 100
    #: Seconds spent reading one source PDF, checked between pages (not a signal: a page
    #: that is slow on its own is finished first).
    source_seconds: float = 120.0

    def __post_init__(self) -> None:
        for name, value in vars(self).items():
            if not value > 0:
                raise ValueError(f"limit {name} must be positive, not {value!r}")


def size_text(count: int) -> str:
    """A byte count as people read it: "64 MiB", "1.5 KiB", "12 bytes"."""
    for unit, size in (("GiB", 1 << 30), ("MiB", MIB), ("KiB", 1 << 10)):
        if count >= size:
            value = count / size
            return f"{value:.0f} {unit}" if value == int(value) else f"{value:.1f} {unit}"
    return f"{count} bytes"
