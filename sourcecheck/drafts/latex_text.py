"""Turning a LaTeX document body into blocks of plain prose with their citation commands.

The claim stage needs sentences as a reader sees them: "p.~12" as "p. 12", accents as
letters, mathematics as one placeholder so that "$p < .05$" does not end a sentence, and
each citation command as a short marker whose keys are known exactly. Every character of
output keeps the place it came from, so a claim can name its file and line. The body is
only read: no macro is expanded and no command run; what is not known is dropped and the
text of its braced arguments kept.
"""

from __future__ import annotations

import re
import unicodedata
from dataclasses import dataclass, field

from sourcecheck.drafts import latex_commands as cmd
from sourcecheck.drafts.latex_source import Source
from sourcecheck.model import Problem

_PAR_RE = re.compile(r"\n[ \t]*\n")
_PLAIN_RUN_RE = re.compile(r"[^\\{}$~\n \t`'\-&%]+")
_WORD_RE = re.compile(r"[A-Za-z]+")
_SPACE = " "
# Groups nested deeper than this are read flat, so a pathological file cannot exhaust the stack.
MAX_NESTING = 100
_COMMAND_BEFORE_RE = re.compile(r"\\([A-Za-z]+)\*?\s*(?:\[[^\[\]{}]*\]\s*){0,2}\Z")
# "\citeauthor{k} (\citeyear{k})" or "\citeauthor{k}~\citeyearpar{k}": one citation of k.
_YEAR_PAIR_RE = re.compile(
    r"[ \t~]*\n?[ \t]*(?:\(\s*\\citeyear\*?\s*\{(?P<a>[^{}]*)\}\s*\)|\\citeyearpar\*?\s*\{(?P<b>[^{}]*)\})"
)


@dataclass(frozen=True)
class CiteSpan:
    """A citation command as it stands in a block: its marker's span and the works it cites.

    ``works`` holds (key, locator) pairs in the order written.
    """

    start: int
    end: int
    marker: str
    works: tuple[tuple[str, str | None], ...]


@dataclass(frozen=True)
class TextBlock:
    """A run of prose (paragraph, list item, caption, footnote) with a place per character."""

    text: str
    origins: tuple[int, ...]
    cites: tuple[CiteSpan, ...]


@dataclass
class _Writer:
    """Builds blocks, folding all white space into single spaces."""

    blocks: list[TextBlock] = field(default_factory=list)
    deferred: list[TextBlock] = field(default_factory=list)
    chars: list[str] = field(default_factory=list)
    origins: list[int] = field(default_factory=list)
    cites: list[CiteSpan] = field(default_factory=list)

    def space(self, origin: int) -> None:
        if self.chars and self.chars[-1] != _SPACE:
            self.chars.append(_SPACE)
            self.origins.append(origin)

    def put(self, text: str, origin: int) -> None:
        for char in text:
            if char.isspace():
                self.space(origin)
            else:
                self.chars.append(char)
                self.origins.append(origin)

    def run(self, text: str, origins: list[int]) -> None:
        self.chars.extend(text)
        self.origins.extend(origins)

    def cite(self, marker: str, works: tuple[tuple[str, str | None], ...], origin: int) -> None:
        if self.chars and self.chars[-1].isalnum():
            self.space(origin)
        start = len(self.chars)
        self.put(marker, origin)
        self.cites.append(CiteSpan(start, len(self.chars), marker, works))

    def text(self) -> str:
        return "".join(self.chars).strip()

    def brk(self) -> None:
        """End the current block; notes met inside it follow it."""
        while self.chars and self.chars[-1] == _SPACE:
            self.chars.pop()
            self.origins.pop()
        lead = 0
        while lead < len(self.chars) and self.chars[lead] == _SPACE:
            lead += 1
        if lead < len(self.chars):
            cites = tuple(CiteSpan(c.start - lead, c.end - lead, c.marker, c.works) for c in self.cites)
            self.blocks.append(TextBlock("".join(self.chars[lead:]), tuple(self.origins[lead:]), cites))
        self.blocks.extend(self.deferred)
        self.deferred.clear()
        self.chars.clear()
        self.origins.clear()
        self.cites.clear()


class _Converter:
    """One pass over a region of the assembled source."""

    def __init__(self, source: Source, display: str) -> None:
        self.source = source
        self.t = source.text
        self.display = display
        self.problems: list[Problem] = []
        self.close: dict[int, tuple[int, int]] = {}  # "{" -> (content end, index after the group)
        self.envs: list[str] = []
        self.depth = 0

    # --- problems and places ---------------------------------------------------------

    def origin(self, index: int) -> int:
        origins = self.source.origins
        return origins[min(index, len(origins) - 1)] if origins else 0

    def problem(self, index: int, message: str) -> None:
        place = self.source.place(index)
        self.problems.append(Problem(place.file or self.display, f"line {place.line}: {message}"))

    # --- braces ----------------------------------------------------------------------

    def match_braces(self, start: int, end: int) -> None:
        """Pair every "{" with its "}"; report and mend the ones that do not pair.

        An unclosed "{" is read as closed at the end of its paragraph, which is where TeX
        would complain too (a runaway argument), so the rest of the document is read as usual.
        """
        t, stack, i = self.t, [], start
        while i < end:
            char = t[i]
            if char == "\\":
                i += 2
                continue
            if char == "{":
                stack.append(i)
            elif char == "}":
                if stack and self._runs_over(stack[-1], i):
                    opening = stack.pop()
                    stop = self.paragraph_end(opening, end)
                    self.close[opening] = (stop, stop)
                    self.problem(opening, "'{' is not closed in its paragraph; read as closed there")
                    self.problem(i, "'}' closes no group in its paragraph; ignored")
                elif stack:
                    opening = stack.pop()
                    self.close[opening] = (i, i + 1)
                else:
                    self.problem(i, "'}' closes no group; ignored")
            i += 1
        for opening in stack:
            stop = self.paragraph_end(opening, end)
            self.close[opening] = (stop, stop)
            self.problem(opening, "'{' is never closed; read as closed at the end of its paragraph")

    def _runs_over(self, opening: int, closing: int) -> bool:
        """Whether the group is a short argument ("\\emph{", "\\cite{") that spans a blank line.

        TeX would pair the braces anyway, but such a group is one missing "}" and one
        stray "}" cancelling out, and pairing them would swallow whole paragraphs.
        """
        before = _COMMAND_BEFORE_RE.search(self.t, max(0, opening - 200), opening)
        if before is None:
            return False
        name = before.group(1)
        short = name[:1].lower() + name[1:] in cmd.CITE_COMMANDS or name in cmd.SHORT_ARGUMENTS
        return short and _PAR_RE.search(self.t, opening, closing) is not None

    def paragraph_end(self, index: int, end: int) -> int:
        found = _PAR_RE.search(self.t, index, end)
        return found.start() if found else end

    # --- the main loop ---------------------------------------------------------------

    def content(self, i: int, end: int, w: _Writer) -> None:
        if self.depth >= MAX_NESTING:
            # No real draft nests this deep; the words are kept, the markup not read.
            w.put(re.sub(r"\\[A-Za-z]+|[{}\\]", " ", self.t[i:end]), self.origin(i))
            return
        self.depth += 1
        try:
            self._content(i, end, w)
        finally:
            self.depth -= 1

    def _content(self, i: int, end: int, w: _Writer) -> None:
        t = self.t
        while i < end:
            char = t[i]
            if char == "\\":
                i = self.command(i, end, w)
            elif char == "{":
                inner, after = self.close.get(i, (end, end))
                self.content(i + 1, min(inner, end), w)
                i = min(after, end) if after > i else i + 1
            elif char == "}":
                i += 1
            elif char == "$":
                i = self.dollar_math(i, end, w)
            elif char == "\n" and _PAR_RE.match(t, i, end):
                w.brk()
                i += 1
                while i < end and t[i].isspace():
                    i += 1
            elif char in " \t\n~":
                w.space(self.origin(i))
                i += 1
            elif char == "-":
                i = self.dashes(i, end, w)
            elif char in "`'":
                if t.startswith(char * 2, i):
                    w.put("“" if char == "`" else "”", self.origin(i))
                    i += 2
                else:
                    w.put("‘" if char == "`" else "'", self.origin(i))
                    i += 1
            elif char == "&":
                w.space(self.origin(i))
                i += 1
            else:
                run = _PLAIN_RUN_RE.match(t, i, end)
                stop = run.end() if run else i + 1
                w.run(t[i:stop], list(self.source.origins[i:stop]))
                i = stop

    def dashes(self, i: int, end: int, w: _Writer) -> int:
        for text, dash in (("---", "—"), ("--", "–"), ("-", "-")):
            if self.t.startswith(text, i) and i + len(text) <= end:
                w.put(dash, self.origin(i))
                return i + len(text)
        return i + 1  # unreachable: "-" always matches

    def flat(self, start: int, end: int) -> str:
        """Plain text of a short region (a citation note), on one line."""
        w = _Writer()
        self.content(start, end, w)
        w.brk()
        return " ".join(b.text for b in w.blocks)

    # --- arguments -------------------------------------------------------------------

    def skip_space(self, i: int, end: int) -> int:
        """Past blanks and one line end, as TeX skips them after a control word; not past a blank line."""
        t = self.t
        while i < end and t[i] in " \t":
            i += 1
        if i < end and t[i] == "\n" and not _PAR_RE.match(t, i, end):
            i += 1
            while i < end and t[i] in " \t":
                i += 1
        return i

    def optional(self, i: int, end: int) -> tuple[int, int, int] | None:
        """An optional "[...]" at ``i``: (content start, content end, index after), or None."""
        if i >= end or self.t[i] != "[":
            return None
        depth, j = 0, i
        while j < end:
            char = self.t[j]
            if char == "\\":
                j += 2
                continue
            if char == "{":
                j = self.close.get(j, (end, end))[1]
                continue
            if char == "[":
                depth += 1
            elif char == "]":
                depth -= 1
                if depth == 0:
                    return i + 1, j, j + 1
            elif char == "\n" and _PAR_RE.match(self.t, j, end):
                break
            j += 1
        return None

    def braced(self, i: int, end: int) -> tuple[int, int, int] | None:
        """A mandatory argument at ``i``: a group, a control sequence or one character."""
        if i >= end:
            return None
        char = self.t[i]
        if char == "{":
            inner, after = self.close.get(i, (end, end))
            return i + 1, min(inner, end), min(max(after, i + 1), end)
        if char == "\\":
            word = _WORD_RE.match(self.t, i + 1, end)
            stop = word.end() if word else min(i + 2, end)
            return i, stop, stop
        if char in "}[]" or char.isspace():
            return None
        return i, i + 1, i + 1

    def drop_arguments(self, i: int, end: int, spec: str, w: _Writer | None) -> int:
        """Pass over arguments by ``spec`` ("d" drop, "k" keep into ``w``), optional ones dropped."""
        for kind in spec:
            i = self.drop_optionals(i, end)
            arg = self.braced(self.skip_space(i, end), end)
            if arg is None:
                return i
            if kind == "k" and w is not None:
                self.content(arg[0], arg[1], w)
            i = arg[2]
        return i

    def drop_optionals(self, i: int, end: int) -> int:
        while (opt := self.optional(self.skip_space(i, end), end)) is not None:
            i = opt[2]
        return i

    # --- commands --------------------------------------------------------------------

    def command(self, i: int, end: int, w: _Writer) -> int:
        t = self.t
        if i + 1 >= end:
            return end
        symbol = t[i + 1]
        if not ("a" <= symbol <= "z" or "A" <= symbol <= "Z"):
            return self.control_symbol(symbol, i, end, w)
        word = _WORD_RE.match(t, i + 1, end)
        assert word is not None
        name, j = word.group(0), word.end()
        k = self.skip_space(j, end)
        origin = self.origin(i)
        lowered = name[:1].lower() + name[1:]
        if name == "begin":
            return self.begin(k, end, w)
        if name == "end":
            return self.end_environment(k, end, w)
        if lowered in cmd.CITE_COMMANDS or lowered in cmd.MULTI_CITE_COMMANDS:
            after = self.cite(lowered, j, end, w, origin)
            if after is not None:
                return after
            return k
        if name in cmd.ACCENTS:
            return self.accent(name, k, end, w)
        if name in cmd.SYMBOLS:
            text = cmd.SYMBOLS[name]
            w.put(text, origin)
            if len(text) > 1 and k > j:
                w.space(origin)  # a word-like symbol ("\LaTeX") keeps the space a reader expects
            return k
        if j < end and t[j] == "*":
            j += 1
            k = self.skip_space(j, end)
        if name in cmd.REFERENCES:
            w.put(cmd.REFERENCE_PLACEHOLDER, origin)
            return self.drop_arguments(j, end, "d", None)
        if name in cmd.HEADINGS:
            w.brk()
            after = self.drop_arguments(j, end, "d", None)
            w.brk()
            return after
        if name in cmd.NOTES:
            note = _Writer()
            arg = self.braced(self.skip_space(self.drop_optionals(j, end), end), end)
            if arg is None:
                return k
            self.content(arg[0], arg[1], note)
            note.brk()
            w.deferred.extend(note.blocks)
            return arg[2]
        if name in {"caption", "captionof", "subcaption"}:
            w.brk()
            after = self.drop_arguments(j, end, "dk" if name == "captionof" else "k", w)
            w.brk()
            return after
        if name == "item":
            w.brk()
            label = self.optional(k, end)
            if label is None:
                return k
            self.content(label[0], label[1], w)
            w.space(origin)
            return label[2]
        if name in cmd.DEFINITIONS:
            return self.definition(name, j, end)
        if name == "let":
            first = self.braced(k, end)
            if first is None:
                return k
            rest = self.skip_space(first[2], end)
            if rest < end and t[rest] == "=":
                rest = self.skip_space(rest + 1, end)
            second = self.braced(rest, end)
            return second[2] if second else rest
        if name in cmd.BREAKS:
            w.brk()
            return k
        if name in cmd.SPACES:
            w.space(origin)
            return k
        if name in {"url", "nolinkurl", "path"}:
            arg = self.braced(k, end)
            if arg is None:
                return k
            w.run(t[arg[0] : arg[1]], list(self.source.origins[arg[0] : arg[1]]))
            return arg[2]
        if name == "enquote":
            arg = self.braced(k, end)
            if arg is None:
                return k
            w.put("“", origin)
            self.content(arg[0], arg[1], w)
            w.put("”", origin)
            return arg[2]
        if name in cmd.ARGUMENTS:
            return self.drop_arguments(j, end, cmd.ARGUMENTS[name], w)
        # Unknown: drop the command and an optional argument right after it; braced
        # arguments are read as ordinary groups, so their text is kept.
        opt = self.optional(j, end)
        return opt[2] if opt else k

    def control_symbol(self, symbol: str, i: int, end: int, w: _Writer) -> int:
        origin = self.origin(i)
        if symbol == "\\":
            j = i + 2
            if j < end and self.t[j] == "*":
                j += 1
            opt = self.optional(j, end)
            j = opt[2] if opt else j
            if any(env in cmd.TABULAR_ENVIRONMENTS for env in self.envs[-1:]):
                w.brk()  # a table row is a line of its own
            else:
                w.space(origin)
            return j
        if symbol in "'`^\"~=.":
            return self.accent(symbol, i + 2, end, w)
        if symbol == "(":
            return self.delimited_math(i, "\\)", end, w)
        if symbol == "[":
            return self.delimited_math(i, "\\]", end, w)
        if symbol in cmd.CONTROL_SYMBOLS:
            text = cmd.CONTROL_SYMBOLS[symbol]
            if text == _SPACE:
                w.space(origin)
            elif text:
                w.put(text, origin)
        return i + 2

    def accent(self, name: str, i: int, end: int, w: _Writer) -> int:
        """An accent on the next letter or group: "\\"o", "\\'{e}", "\\c{c}", "\\'{\\i}"."""
        i = self.skip_space(i, end)
        arg = self.braced(i, end)
        if arg is None:
            return i
        raw = self.t[arg[0] : arg[1]].strip().strip("{}").strip()
        raw = re.sub(r"^\\[ij](?![A-Za-z])\s*", lambda m: m.group(0)[1], raw)
        if raw:
            letter = unicodedata.normalize("NFC", raw[0] + cmd.ACCENTS[name])
            w.put(letter + raw[1:], self.origin(i))
        return arg[2]

    def definition(self, name: str, j: int, end: int) -> int:
        """Pass over "\\newcommand{\\x}[1]{...}" or "\\def\\x#1{...}": nothing of it prints."""
        t = self.t
        if j < end and t[j] == "*":
            j += 1
        target = self.braced(self.skip_space(j, end), end)
        if target is None:
            return j
        i = target[2]
        if name in {"def", "gdef", "edef", "xdef"}:
            body = t.find("{", i, end)
            if body < 0:
                return i
            return self.close.get(body, (end, end))[1]
        i = self.drop_optionals(i, end)
        body = self.braced(self.skip_space(i, end), end)
        return body[2] if body else i

    # --- environments ----------------------------------------------------------------

    def begin(self, i: int, end: int, w: _Writer) -> int:
        arg = self.braced(i, end)
        if arg is None:
            return i
        name = self.t[arg[0] : arg[1]].strip()
        after = arg[2]
        if name == "document":
            return after
        if name in cmd.MATH_ENVIRONMENTS:
            stop = self.environment_end(name, after, end, arg[0])
            w.space(self.origin(i))
            w.put(cmd.MATH_PLACEHOLDER, self.origin(i))
            w.space(self.origin(i))
            return stop
        if name in cmd.DROPPED_ENVIRONMENTS:
            w.brk()
            return self.environment_end(name, after, end, arg[0])
        w.brk()
        self.envs.append(name)
        after = self.drop_optionals(after, end)
        for _ in range(cmd.ENVIRONMENT_ARGUMENTS.get(name, 0)):
            after = self.drop_arguments(after, end, "d", None)
        return after

    def environment_end(self, name: str, start: int, end: int, opened: int) -> int:
        """Index after the "\\end{name}" that closes the environment opened before ``start``."""
        tag = re.compile(r"\\(begin|end)\s*\{" + re.escape(name) + r"\}")
        depth = 1
        for found in tag.finditer(self.t, start, end):
            depth += 1 if found.group(1) == "begin" else -1
            if depth == 0:
                return found.end()
        stop = self.paragraph_end(start, end)
        self.problem(opened, f"\\begin{{{name}}} is never ended; read as ended at the end of its paragraph")
        return stop

    def end_environment(self, i: int, end: int, w: _Writer) -> int:
        arg = self.braced(i, end)
        if arg is None:
            return i
        name = self.t[arg[0] : arg[1]].strip()
        w.brk()
        if name in self.envs:
            while self.envs.pop() != name:
                pass
        return arg[2]

    # --- mathematics -----------------------------------------------------------------

    def dollar_math(self, i: int, end: int, w: _Writer) -> int:
        display = self.t.startswith("$$", i)
        closing = "$$" if display else "$"
        stop = self.paragraph_end(i, end)
        j = i + len(closing)
        while j < stop:
            found = self.t.find(closing, j, stop)
            if found < 0:
                break
            if not _escaped(self.t, found):
                w.put(cmd.MATH_PLACEHOLDER, self.origin(i))
                return found + len(closing)
            j = found + 1
        # Most often a "$" meant as money: read on as text, so the sentence is not lost.
        self.problem(i, f"'{closing}' opens mathematics that is not closed in its paragraph; read as text")
        w.put(closing, self.origin(i))
        return i + len(closing)

    def delimited_math(self, i: int, closing: str, end: int, w: _Writer) -> int:
        stop = self.paragraph_end(i, end)
        found = self.t.find(closing, i + 2, stop)
        if found < 0:
            self.problem(i, f"'{self.t[i : i + 2]}' opens mathematics that is not closed in its paragraph; ignored")
            return i + 2
        w.put(cmd.MATH_PLACEHOLDER, self.origin(i))
        return found + 2

    # --- citations -------------------------------------------------------------------

    def cite(self, name: str, j: int, end: int, w: _Writer, origin: int) -> int | None:
        """Read a citation command from just after its name; None when it has no key list."""
        t = self.t
        if j < end and t[j] == "*":
            j += 1
        groups: list[tuple[str | None, str | None, list[str]]] = []
        outer: list[str | None] = []
        if name in cmd.MULTI_CITE_COMMANDS:
            for _ in range(2):
                q = self.skip_space(j, end)
                if q < end and t[q] == "(" and (close := t.find(")", q, self.paragraph_end(q, end))) > 0:
                    outer.append(self.flat(q + 1, close) or None)
                    j = close + 1
            while (group := self.cite_group(j, end)) is not None:
                groups.append(group[0])
                j = group[1]
        else:
            group = self.cite_group(j, end)
            if group is not None:
                groups.append(group[0])
                j = group[1]
                if name in cmd.AUTHOR_ONLY and (pair := _YEAR_PAIR_RE.match(t, j, end)):
                    year_keys = _keys(pair.group("a") if pair.group("a") is not None else pair.group("b"))
                    if year_keys == groups[0][2]:
                        j = pair.end()
        if not groups:
            return None
        # One "(note)" is a postnote, as one "[note]" is.
        outer = [None, *outer] if len(outer) == 1 else outer or [None, None]
        works: list[tuple[str, str | None]] = []
        shown: list[str] = []
        for pre, post, keys in groups:
            locator = post or outer[1]
            works += [(key, locator) for key in keys]
            shown.append((f"{pre} " if pre else "") + "; ".join(keys) + (f", {post}" if post else ""))
        marker = "; ".join(part for part in shown if part)
        if outer[0]:
            marker = f"{outer[0]} {marker}"
        if outer[1]:
            marker = f"{marker}, {outer[1]}"
        if works:
            w.cite(f"[{marker}]", tuple(works), origin)
        return j

    def cite_group(self, j: int, end: int) -> tuple[tuple[str | None, str | None, list[str]], int] | None:
        """ "[pre][post]{keys}" from ``j``: (pre, post, keys) and the index after, or None."""
        notes: list[str] = []
        p = j
        for _ in range(2):
            opt = self.optional(self.skip_space(p, end), end)
            if opt is None:
                break
            notes.append(self.flat(opt[0], opt[1]))
            p = opt[2]
        q = self.skip_space(p, end)
        if q >= end or self.t[q] != "{":
            return None
        inner, after = self.close.get(q, (end, end))
        keys = _keys(self.t[q + 1 : inner])
        pre, post = (None, notes[0]) if len(notes) == 1 else (notes[0], notes[1]) if notes else (None, None)
        return (pre or None, post or None, keys), after


def _keys(raw: str) -> list[str]:
    """Citation keys of a "{a, b}" list; "*" (every entry, from \\nocite) is not a key."""
    return list(dict.fromkeys(k.strip() for k in raw.split(",") if k.strip() and k.strip() != "*"))


def _escaped(text: str, index: int) -> bool:
    """Whether the character at ``index`` follows an odd run of backslashes."""
    run = 0
    while index - run - 1 >= 0 and text[index - run - 1] == "\\":
        run += 1
    return run % 2 == 1


def body_blocks(source: Source, start: int, end: int, display: str) -> tuple[list[TextBlock], list[Problem]]:
    """Prose blocks of ``source.text[start:end]`` and the problems met reading them.

    Headings are left out; footnotes and captions are blocks of their own; a table row is
    a block.
    """
    converter = _Converter(source, display)
    converter.match_braces(start, end)
    writer = _Writer()
    converter.content(start, end, writer)
    writer.brk()
    return writer.blocks, converter.problems
