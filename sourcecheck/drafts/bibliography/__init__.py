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
from sourcecheck.drafts.bibliography.entry_rules import parse_entry_by_rules
from sourcecheck.drafts.bibliography.reflist import parse_references
from sourcecheck.drafts.bibliography.ris import parse_ris
from sourcecheck.drafts.textfile import decode
from sourcecheck.limits import Limits, size_text
from sourcecheck.model import Problem, Reference

__all__ = [
    "OUTSIDE_FOLDER",
    "PARSERS",
    "inside_folder",
    "load_bibliography",
    "parse_bbl",
    "parse_bibtex",
    "parse_csl_json",
    "parse_entry_by_rules",  # the rule parser, kept for a year the model misses; bench/entry_parser.py compares
    "parse_references",
    "parse_ris",
]

#: Why a bibliography a draft names outside its own folder is not read.
OUTSIDE_FOLDER = "refused (outside the draft's folder; give it with --bib to read it)"


def inside_folder(path: Path, folder: Path) -> bool:
    """Whether ``path``, links and ".." resolved, lies inside ``folder``.

    A draft from a stranger may name "../../home/user/.ssh/id_rsa" as its bibliography;
    what the draft names is read only inside the draft's folder, as ``\\input`` is.
    A file the user names (``--bib``) is the user's choice and is not confined. A name
    no file can have (a NUL byte, too long) is refused too.
    """
    try:
        return Path(path).resolve().is_relative_to(Path(folder).resolve())
    except (OSError, ValueError):
        return False


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


def load_bibliography(
    path: Path, display: str | None = None, limits: Limits | None = None
) -> tuple[list[Reference], list[Problem]]:
    """The references of the bibliography file at ``path``; ``display`` names it in Problems.

    The parser is chosen by suffix, else by a look at the content. Never raises: a
    missing or unreadable file comes back as ``([], [Problem(...)])``.
    """
    path = Path(path)
    name = display or str(path)
    limits = limits or Limits()
    try:
        if not path.is_file():
            reason = "is a folder, not a bibliography file" if path.is_dir() else "bibliography file not found"
            return [], [Problem(name, reason)]
        size = path.stat().st_size
        if size > limits.file_bytes:
            limit = f"over the limit of {size_text(limits.file_bytes)} (file_bytes)"
            return [], [Problem(name, f"{size_text(size)}, {limit}; not read")]
        data = path.read_bytes()
    except OSError as error:
        return [], [Problem(name, f"bibliography file cannot be opened ({error.strerror or type(error).__name__})")]
    text, problems = decode(data, name)
    parser = PARSERS.get(path.suffix.lower()) or sniff(text)
    if parser is None:
        what = f"'{path.suffix}'" if path.suffix else "without a suffix"
        known = "use .bib, .bbl, .json or .ris"
        return [], [*problems, Problem(name, f"bibliography format {what} is not known ({known})")]
    if parser is parse_csl_json:
        references, found = parse_csl_json(text, name, limits.nesting_depth)
    else:
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
