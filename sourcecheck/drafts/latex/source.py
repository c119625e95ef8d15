"""Assembling a LaTeX draft's source: comments out, included files in, every character traced.

A draft split over ``\\input{sections/intro}`` files is one text to TeX, but a person
fixing a claim needs the file and line it came from. So the assembled text carries, for
each character, the place (file, line) it was read from. Nothing is executed: inclusion
commands are recognised as text, followed only inside the draft's folder, and a loop or a
missing file becomes a problem instead of an error.
"""

from __future__ import annotations

import re
from array import array
from dataclasses import dataclass, field
from pathlib import Path, PurePosixPath

from sourcecheck.drafts.textfile import decode, read_bytes
from sourcecheck.errors import DraftUnreadable
from sourcecheck.limits import Limits
from sourcecheck.model import Problem

# Deeper nesting than this is a generated loop in disguise, not a real draft.
MAX_DEPTH = 32

_INCLUDE_RE = re.compile(r"\\(input|include|subfile)(?![A-Za-z@])\s*(?:\{([^{}]*)\}|([^\s{}%\\]+))")
_BEGIN_DOCUMENT_RE = re.compile(r"\\begin\s*\{document\}")
_END_DOCUMENT_RE = re.compile(r"\\end\s*\{document\}")
_BEGIN_RE = re.compile(r"\\begin\s*\{([A-Za-z*]+)\}")
_CONTROL_RE = re.compile(r"\\(?:[A-Za-z@]+|.)", re.DOTALL)
_IF_RE = re.compile(r"\\(?:if(?!thenelse)[A-Za-z@]*|fi)(?![A-Za-z@])")
# Environments whose body is not LaTeX prose: dropped before anything else reads them, so
# a stray "%" or "{" inside cannot upset comment or brace handling.
SKIPPED_ENVIRONMENTS = frozenset(
    ["comment", "verbatim", "verbatim*", "Verbatim", "lstlisting", "minted", "filecontents", "filecontents*"]
)
_VERB_SPECIALS = {"\\": "\\textbackslash{}", "~": "\\textasciitilde{}", "^": "\\textasciicircum{}"}


@dataclass(frozen=True)
class Place:
    """Where a character was read: the included file's display name (None for the draft) and line."""

    file: str | None
    line: int


@dataclass
class Source:
    """The assembled text and, per character, an index into ``places``."""

    text: str
    origins: array[int]
    places: list[Place]

    def place(self, index: int) -> Place:
        """The place of the character at ``index`` (the last one for an index past the end)."""
        if not self.origins:
            return Place(None, 1)
        return self.places[self.origins[min(max(index, 0), len(self.origins) - 1)]]


@dataclass
class _Builder:
    """Collects output text with one place per character."""

    parts: list[str] = field(default_factory=list)
    origins: array[int] = field(default_factory=lambda: array("I"))
    places: list[Place] = field(default_factory=list)
    _ids: dict[Place, int] = field(default_factory=dict)

    def emit(self, text: str, place: Place) -> None:
        if not text:
            return
        index = self._ids.get(place)
        if index is None:
            index = self._ids[place] = len(self.places)
            self.places.append(place)
        self.parts.append(text)
        self.origins.extend([index] * len(text))

    def source(self) -> Source:
        return Source("".join(self.parts), self.origins, self.places)


@dataclass
class _Loader:
    """Reads one draft and the files it includes, depth first, into a builder."""

    root: Path
    root_display: str
    builder: _Builder = field(default_factory=_Builder)
    problems: list[Problem] = field(default_factory=list)

    def display_of(self, path: Path) -> str:
        """How reports name an included file: its path beside the draft's display name."""
        relative = PurePosixPath(path.relative_to(self.root).as_posix())
        return str(PurePosixPath(PurePosixPath(self.root_display).parent, relative))

    def load(self, path: Path, display: str, file: str | None, stack: list[Path], body_only: bool = False) -> None:
        if file is None:
            data = read_bytes(path, display)  # the draft itself: unreadable stops the run
        else:
            try:
                data = read_bytes(path, display, Limits().file_bytes)
            except DraftUnreadable as error:
                self.problems.append(Problem(display, str(error).removeprefix(f"{display}: ")))
                return
        text, problems = decode(data, display)
        self.problems.extend(problems)
        scanner = _FileScanner(self, text, display, file, [*stack, path])
        if body_only:
            scanner.body_only()
        scanner.scan()

    def include(self, command: str, name: str, scanner: _FileScanner, line: int) -> None:
        """Follow ``\\input{name}`` met on ``line`` of the scanner's file, if it is allowed."""
        name = name.strip()
        shown = name if name.endswith(".tex") else f"{name}.tex"
        where = f"line {line}: \\{command} of {shown}"
        if not name:
            self.problems.append(Problem(scanner.display, f"line {line}: \\{command} names no file"))
            return
        # TeX looks in its working folder (the draft's); subfiles also beside the including file.
        # "name.tex" is tried before "name", as TeX does.
        resolved = [
            Path(str(base / name) + suffix).resolve()
            for base in dict.fromkeys([self.root, scanner.stack[-1].parent])
            for suffix in ([""] if name.endswith(".tex") else [".tex", ""])
        ]
        if not all(r.is_relative_to(self.root) for r in resolved):
            self.problems.append(Problem(scanner.display, f"{where} refused (outside the draft's folder)"))
            return
        found = next((r for r in resolved if r.is_file()), None)
        if found is None:
            self.problems.append(Problem(scanner.display, f"{where}: no such file"))
            return
        if found in scanner.stack:
            chain = " -> ".join(self._short(p) for p in [*scanner.stack[scanner.stack.index(found) :], found])
            self.problems.append(Problem(scanner.display, f"{where} makes a loop ({chain}); not followed again"))
            return
        if len(scanner.stack) >= MAX_DEPTH:
            self.problems.append(Problem(scanner.display, f"{where} nests deeper than {MAX_DEPTH} files; not followed"))
            return
        # A subfile is a whole document of its own; only its body belongs in the draft.
        self.load(found, self.display_of(found), self.display_of(found), scanner.stack, command == "subfile")

    def _short(self, path: Path) -> str:
        return path.relative_to(self.root).as_posix()


class _FileScanner:
    """One pass over one file's text: strips comments and skipped environments, follows inputs."""

    def __init__(self, loader: _Loader, text: str, display: str, file: str | None, stack: list[Path]) -> None:
        self.loader = loader
        self.text = text
        self.display = display
        self.file = file
        self.stack = stack
        self.line = 1
        self.start = 0
        self.stop = len(text)
        self.pending: list[str] = []  # text not yet emitted, all on self.line

    def body_only(self) -> None:
        """Read only what lies between the file's \\begin{document} and \\end{document}."""
        begin = _BEGIN_DOCUMENT_RE.search(self.text)
        if begin is None:
            return
        self.start = begin.end()
        self.line = 1 + self.text.count("\n", 0, self.start)
        end = _END_DOCUMENT_RE.search(self.text, self.start)
        self.stop = end.start() if end else len(self.text)

    def _flush(self) -> None:
        if self.pending:
            self.loader.builder.emit("".join(self.pending), Place(self.file, self.line))
            self.pending.clear()

    def _advance(self, start: int, end: int) -> None:
        """Pass over text[start:end] without emitting it, keeping the line count right."""
        newlines = self.text.count("\n", start, end)
        if newlines:
            self._flush()
            self.line += newlines

    def scan(self) -> None:
        text, i, n = self.text, self.start, self.stop
        while i < n:
            char = text[i]
            if char == "\n":
                self.pending.append("\n")
                self._flush()
                self.line += 1
                i += 1
            elif char == "%":
                i = self._comment(i)
            elif char == "\\":
                i = self._control(i)
            else:
                end = i + 1
                while end < n and text[end] not in "\n%\\":
                    end += 1
                self.pending.append(text[i:end])
                i = end
        self._flush()

    def _comment(self, i: int) -> int:
        """Skip a comment, its line end and the next line's leading blanks, as TeX does."""
        end = self.text.find("\n", i)
        if end < 0:
            return len(self.text)
        self._flush()
        self.line += 1
        end += 1
        while end < len(self.text) and self.text[end] in " \t":
            end += 1
        if end < len(self.text) and self.text[end] == "\n":
            # TeX's blank line after a comment line still ends the paragraph.
            self.pending.append("\n")
        return end

    def _control(self, i: int) -> int:
        match = _CONTROL_RE.match(self.text, i)
        if match is None:  # a backslash as the file's last character
            self.pending.append("\\")
            return i + 1
        word = match.group(0)[1:]
        if word in {"input", "include", "subfile"}:
            inclusion = _INCLUDE_RE.match(self.text, i)
            if inclusion:
                self._flush()
                if inclusion.group(1) == "include":
                    self.pending.append("\n\n")  # \include starts a new page, so a new paragraph
                    self._flush()
                self.loader.include(word, inclusion.group(2) or inclusion.group(3) or "", self, self.line)
                self._advance(i, inclusion.end())
                return inclusion.end()
        if word == "endinput":
            self._flush()
            return len(self.text)
        if word == "begin":
            begin = _BEGIN_RE.match(self.text, i)
            if begin and begin.group(1) in SKIPPED_ENVIRONMENTS:
                return self._skip_environment(begin.group(1), begin.end())
        if word == "iffalse":
            return self._skip_iffalse(match.end())
        if word == "verb":
            return self._verb(match.end())
        self.pending.append(match.group(0))
        return match.end()

    def _skip_environment(self, name: str, start: int) -> int:
        end_tag = re.compile(r"\\end\s*\{" + re.escape(name) + r"\}")
        found = end_tag.search(self.text, start)
        stop = found.end() if found else len(self.text)
        if found is None:
            self.loader.problems.append(
                Problem(
                    self.display,
                    f"line {self.line}: \\begin{{{name}}} is never closed; the rest of the file is skipped",
                )
            )
        self.pending.append("\n" if name == "comment" else "\n\n")
        self._advance(start, stop)
        return stop

    def _skip_iffalse(self, start: int) -> int:
        """``\\iffalse ... \\fi`` is the other way writers comment out a passage."""
        depth = 1
        for found in _IF_RE.finditer(self.text, start):
            depth += -1 if found.group(0) == "\\fi" else 1
            if depth == 0:
                self._advance(start, found.end())
                return found.end()
        self.loader.problems.append(
            Problem(
                self.display, f"line {self.line}: \\iffalse is never ended by \\fi; the rest of the file is skipped"
            )
        )
        return len(self.text)

    def _verb(self, start: int) -> int:
        """``\\verb|x|`` prints x as is: passed on as escaped text, so "%" or "{" in it are harmless."""
        if start < len(self.text) and self.text[start] == "*":
            start += 1
        if start >= len(self.text) or self.text[start].isspace():
            self.pending.append("\\verb")
            return start
        delimiter = self.text[start]
        end = self.text.find(delimiter, start + 1)
        line_end = self.text.find("\n", start)
        if end < 0 or (0 <= line_end < end):
            self.pending.append("\\verb")
            return start
        escaped = "".join(_VERB_SPECIALS.get(c, "\\" + c if c in "{}%$&#_" else c) for c in self.text[start + 1 : end])
        self.pending.append("\\texttt{" + escaped + "}")
        return end + 1


def load_source(path: Path, display: str) -> tuple[Source, list[Problem]]:
    """The draft's assembled text with places, and the problems met while assembling it.

    Raises DraftUnreadable only for the draft itself; an included file that cannot be read
    is a problem.
    """
    loader = _Loader(path.resolve().parent, display)
    loader.load(path.resolve(), display, None, [])
    return loader.builder.source(), loader.problems
