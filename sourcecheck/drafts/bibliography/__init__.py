"""Bibliography files a draft's citation keys point into: .bib, .bbl, CSL-JSON and RIS.

LaTeX and Pandoc drafts keep their reference list outside the text and cite it by key
("\\cite{okafor2019}", "[@okafor2019]"). Whatever the format, the result is a list of
:class:`sourcecheck.model.Reference` keyed exactly as in the file, plus Problems for
what could not be read. Nothing here raises on bad input: a missing file is a Problem.
"""

from __future__ import annotations

import re
from collections.abc import Callable
from pathlib import Path

from sourcecheck.drafts.bibliography.bbl import parse_bbl
from sourcecheck.drafts.bibliography.bibtex import parse_bibtex
from sourcecheck.drafts.bibliography.csl_json import parse_csl_json
from sourcecheck.drafts.bibliography.ris import parse_ris
from sourcecheck.drafts.textfile import decode
from sourcecheck.model import Problem, Reference

__all__ = ["PARSERS", "load_bibliography", "parse_bbl", "parse_bibtex", "parse_csl_json", "parse_ris"]

Parser = Callable[[str, str], tuple[list[Reference], list[Problem]]]

#: File suffix -> parser. Other suffixes are sniffed from the content.
PARSERS: dict[str, Parser] = {
    ".bib": parse_bibtex,
    ".bibtex": parse_bibtex,
    ".biblatex": parse_bibtex,
    ".bbl": parse_bbl,
    ".json": parse_csl_json,
    ".ris": parse_ris,
}


def load_bibliography(path: Path, display: str | None = None) -> tuple[list[Reference], list[Problem]]:
    """The references of the bibliography file at ``path``; ``display`` names it in Problems.

    The parser is chosen by suffix, else by a look at the content. Never raises: a
    missing or unreadable file comes back as ``([], [Problem(...)])``.
    """
    path = Path(path)
    name = display or str(path)
    try:
        if not path.is_file():
            reason = "is a folder, not a bibliography file" if path.is_dir() else "bibliography file not found"
            return [], [Problem(name, reason)]
        data = path.read_bytes()
    except OSError as error:
        return [], [Problem(name, f"bibliography file cannot be opened ({error.strerror or type(error).__name__})")]
    text, problems = decode(data, name)
    parser = PARSERS.get(path.suffix.lower()) or sniff(text)
    if parser is None:
        what = f"'{path.suffix}'" if path.suffix else "without a suffix"
        known = "use .bib, .bbl, .json or .ris"
        return [], [*problems, Problem(name, f"bibliography format {what} is not known ({known})")]
    references, found = parser(text, name)
    return references, problems + found


def sniff(text: str) -> Parser | None:
    """The parser whose format ``text`` looks like, or None."""
    head = text.lstrip()[:4000]
    if head.startswith(("[", "{")):
        return parse_csl_json
    if re.search(r"^TY  -", head, re.MULTILINE):
        return parse_ris
    if re.search(r"\\bibitem|\\entry\s*\{|\\begin\s*\{thebibliography\}|\\refsection", head):
        return parse_bbl
    if re.search(r"@\s*[A-Za-z]+\s*[{(]", head):
        return parse_bibtex
    return None
