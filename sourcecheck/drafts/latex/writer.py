"""What the LaTeX reader writes: plain prose with each character's origin, and its citations."""

from __future__ import annotations

from dataclasses import dataclass, field

SPACE = " "


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
class Writer:
    """Builds blocks, folding all white space into single spaces."""

    blocks: list[TextBlock] = field(default_factory=list)
    deferred: list[TextBlock] = field(default_factory=list)
    chars: list[str] = field(default_factory=list)
    origins: list[int] = field(default_factory=list)
    cites: list[CiteSpan] = field(default_factory=list)

    def space(self, origin: int) -> None:
        if self.chars and self.chars[-1] != SPACE:
            self.chars.append(SPACE)
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
        while self.chars and self.chars[-1] == SPACE:
            self.chars.pop()
            self.origins.pop()
        lead = 0
        while lead < len(self.chars) and self.chars[lead] == SPACE:
            lead += 1
        if lead < len(self.chars):
            cites = tuple(CiteSpan(c.start - lead, c.end - lead, c.marker, c.works) for c in self.cites)
            self.blocks.append(TextBlock("".join(self.chars[lead:]), tuple(self.origins[lead:]), cites))
        self.blocks.extend(self.deferred)
        self.deferred.clear()
        self.chars.clear()
        self.origins.clear()
        self.cites.clear()
