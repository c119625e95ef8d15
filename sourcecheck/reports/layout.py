"""Line layout for the terminal report: hanging indents, markers kept whole, no trailing spaces.

rich wraps at any white space, a no-break space included (its word pattern is ``\\s``),
so a marker such as "[2, 5]" or "(Okafor et al., 2019)" could end one line and start the
next, and its padding leaves trailing spaces in piped output. Here the report wraps its
own lines: breaks fall only between words outside the kept spans, every line after the
first hangs under a deeper indent, and each line is printed as is (``soft_wrap``), right-
stripped.
"""

from __future__ import annotations

import itertools
import re

from rich.cells import cell_len
from rich.console import Console
from rich.text import Text

_WORD_START = re.compile(r"(?<= )(?=[^ ])")


def keep_spans(plain: str, needles: list[str]) -> list[tuple[int, int]]:
    """Where each of ``needles`` (markers, page labels) occurs in ``plain``: spans not to break."""
    spans = []
    for needle in {n for n in needles if " " in n}:
        start = plain.find(needle)
        while start != -1:
            spans.append((start, start + len(needle)))
            start = plain.find(needle, start + 1)
    return spans


def wrap(
    text: Text, width: int, indent: int = 0, hang: int = 2, keep: list[tuple[int, int]] | None = None
) -> list[Text]:
    """``text`` cut into lines of at most ``width`` cells, the first at ``indent``, the rest at ``hang``.

    A word (or kept span) longer than a line gets a line of its own and runs over rather
    than being cut.
    """
    plain = text.plain
    kept = keep or []
    starts = [m.start() for m in _WORD_START.finditer(plain) if not any(s < m.start() < e for s, e in kept)]
    bounds = [0, *starts, len(plain)]
    lines: list[tuple[int, int]] = []
    line_start, room = 0, max(width - indent, 1)
    for word_start, word_end in itertools.pairwise(bounds):
        if word_start == line_start or cell_len(plain[line_start:word_end].rstrip()) <= room:
            continue
        lines.append((line_start, word_start))
        line_start, room = word_start, max(width - hang, 1)
    lines.append((line_start, len(plain)))
    out = []
    for number, (start, end) in enumerate(lines):
        line = text[start:end]
        line.rstrip()
        out.append(Text(" " * (indent if number == 0 else hang)) + line)
    return out


def emit(
    console: Console, text: Text, indent: int = 0, hang: int = 2, keep: list[tuple[int, int]] | None = None
) -> None:
    """Print ``text`` wrapped by :func:`wrap` at the console's width, one exact line at a time."""
    for line in wrap(text, console.width, indent, hang, keep):
        console.print(line, soft_wrap=True)
