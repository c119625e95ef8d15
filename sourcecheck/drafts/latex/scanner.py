"""Reading LaTeX groups and arguments without expanding anything: braces, optionals, places.

The base the body converter stands on; every index is into the assembled source text.
"""

from __future__ import annotations

import re
import unicodedata

from sourcecheck.drafts.latex import commands as cmd
from sourcecheck.drafts.latex.source import Source
from sourcecheck.drafts.latex.writer import SPACE, Writer
from sourcecheck.model import Problem

PARAGRAPH_BREAK = re.compile(r"\n[ \t]*\n")
WORD_RE = re.compile(r"[A-Za-z]+")
_COMMAND_BEFORE_RE = re.compile(r"\\([A-Za-z]+)\*?\s*(?:\[[^\[\]{}]*\]\s*){0,2}\Z")


class Scanner:
    """One pass over a region of the assembled source."""

    def __init__(self, source: Source, display: str) -> None:
        self.source = source
        self.t = source.text
        self.display = display
        self.problems: list[Problem] = []
        self.close: dict[int, tuple[int, int]] = {}  # "{" -> (content end, index after the group)
        self.envs: list[str] = []
        self.depth = 0
        self.max_depth = 100  # groups nested deeper are read flat (the converter's limit)
        self.too_deep = False

    # --- what the converter built on this base provides ------------------------------

    def content(self, i: int, end: int, w: Writer) -> None:
        """Write the prose of ``t[i:end]`` to ``w`` (the converter's)."""
        raise NotImplementedError

    def delimited_math(self, i: int, closing: str, end: int, w: Writer) -> int:
        """Skip mathematics up to ``closing`` (the converter's)."""
        raise NotImplementedError

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
        return short and PARAGRAPH_BREAK.search(self.t, opening, closing) is not None

    def paragraph_end(self, index: int, end: int) -> int:
        found = PARAGRAPH_BREAK.search(self.t, index, end)
        return found.start() if found else end

    # --- the main loop ---------------------------------------------------------------

    def flat(self, start: int, end: int) -> str:
        """Plain text of a short region (a citation note), on one line."""
        w = Writer()
        self.content(start, end, w)
        w.brk()
        return " ".join(b.text for b in w.blocks)

    # --- arguments -------------------------------------------------------------------

    def skip_space(self, i: int, end: int) -> int:
        """Past blanks and one line end, as TeX skips them after a control word; not past a blank line."""
        t = self.t
        while i < end and t[i] in " \t":
            i += 1
        if i < end and t[i] == "\n" and not PARAGRAPH_BREAK.match(t, i, end):
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
            elif char == "\n" and PARAGRAPH_BREAK.match(self.t, j, end):
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
            word = WORD_RE.match(self.t, i + 1, end)
            stop = word.end() if word else min(i + 2, end)
            return i, stop, stop
        if char in "}[]" or char.isspace():
            return None
        return i, i + 1, i + 1

    def drop_arguments(self, i: int, end: int, spec: str, w: Writer | None) -> int:
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

    def control_symbol(self, symbol: str, i: int, end: int, w: Writer) -> int:
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
            if text == SPACE:
                w.space(origin)
            elif text:
                w.put(text, origin)
        return i + 2

    def accent(self, name: str, i: int, end: int, w: Writer) -> int:
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


def escaped(text: str, index: int) -> bool:
    """Whether the character at ``index`` follows an odd run of backslashes."""
    run = 0
    while index - run - 1 >= 0 and text[index - run - 1] == "\\":
        run += 1
    return run % 2 == 1
