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

from sourcecheck.drafts.latex import commands as cmd
from sourcecheck.drafts.latex.scanner import PARAGRAPH_BREAK, WORD_RE, Scanner, escaped
from sourcecheck.drafts.latex.source import Source
from sourcecheck.drafts.latex.writer import TextBlock, Writer
from sourcecheck.model import Problem

_PLAIN_RUN_RE = re.compile(r"[^\\{}$~\n \t`'\-&%]+")
# Groups nested deeper than this are read flat, so a pathological file cannot exhaust the stack.
MAX_NESTING = 100
# "\citeauthor{k} (\citeyear{k})" or "\citeauthor{k}~\citeyearpar{k}": one citation of k.
_YEAR_PAIR_RE = re.compile(
    r"[ \t~]*\n?[ \t]*(?:\(\s*\\citeyear\*?\s*\{(?P<a>[^{}]*)\}\s*\)|\\citeyearpar\*?\s*\{(?P<b>[^{}]*)\})"
)


class _Converter(Scanner):
    """One pass over a region of the assembled source: commands, environments, math, citations."""

    def content(self, i: int, end: int, w: Writer) -> None:
        if self.depth >= self.max_depth:
            # No real draft nests this deep; the words are kept, the markup not read.
            if not self.too_deep:
                self.too_deep = True
                self.problem(i, f"groups nested over {self.max_depth} deep (nesting_depth); read as plain words")
            w.put(re.sub(r"\\[A-Za-z]+|[{}\\]", " ", self.t[i:end]), self.origin(i))
            return
        self.depth += 1
        try:
            self._content(i, end, w)
        finally:
            self.depth -= 1

    def _content(self, i: int, end: int, w: Writer) -> None:
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
            elif char == "\n" and PARAGRAPH_BREAK.match(t, i, end):
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

    def dashes(self, i: int, end: int, w: Writer) -> int:
        for text, dash in (("---", "—"), ("--", "–"), ("-", "-")):
            if self.t.startswith(text, i) and i + len(text) <= end:
                w.put(dash, self.origin(i))
                return i + len(text)
        return i + 1  # unreachable: "-" always matches

    def command(self, i: int, end: int, w: Writer) -> int:
        t = self.t
        if i + 1 >= end:
            return end
        symbol = t[i + 1]
        if not ("a" <= symbol <= "z" or "A" <= symbol <= "Z"):
            return self.control_symbol(symbol, i, end, w)
        word = WORD_RE.match(t, i + 1, end)
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
            note = Writer()
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
        group = self.braced(self.skip_space(i, end), end)
        return group[2] if group else i

    # --- environments ----------------------------------------------------------------

    def begin(self, i: int, end: int, w: Writer) -> int:
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

    def end_environment(self, i: int, end: int, w: Writer) -> int:
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

    def dollar_math(self, i: int, end: int, w: Writer) -> int:
        display = self.t.startswith("$$", i)
        closing = "$$" if display else "$"
        stop = self.paragraph_end(i, end)
        j = i + len(closing)
        while j < stop:
            found = self.t.find(closing, j, stop)
            if found < 0:
                break
            if not escaped(self.t, found):
                w.put(cmd.MATH_PLACEHOLDER, self.origin(i))
                return found + len(closing)
            j = found + 1
        # Most often a "$" meant as money: read on as text, so the sentence is not lost.
        self.problem(i, f"'{closing}' opens mathematics that is not closed in its paragraph; read as text")
        w.put(closing, self.origin(i))
        return i + len(closing)

    def delimited_math(self, i: int, closing: str, end: int, w: Writer) -> int:
        stop = self.paragraph_end(i, end)
        found = self.t.find(closing, i + 2, stop)
        if found < 0:
            self.problem(i, f"'{self.t[i : i + 2]}' opens mathematics that is not closed in its paragraph; ignored")
            return i + 2
        w.put(cmd.MATH_PLACEHOLDER, self.origin(i))
        return found + 2

    # --- citations -------------------------------------------------------------------

    def cite(self, name: str, j: int, end: int, w: Writer, origin: int) -> int | None:
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


def body_blocks(
    source: Source, start: int, end: int, display: str, max_depth: int = MAX_NESTING
) -> tuple[list[TextBlock], list[Problem]]:
    """Prose blocks of ``source.text[start:end]`` and the problems met reading them.

    Headings are left out; footnotes and captions are blocks of their own; a table row is
    a block. Groups nested deeper than ``max_depth`` are read flat, with one problem.
    """
    converter = _Converter(source, display)
    converter.max_depth = max_depth
    converter.match_braces(start, end)
    writer = Writer()
    converter.content(start, end, writer)
    writer.brk()
    return writer.blocks, converter.problems
