"""WordprocessingML to paragraphs of plain text, in reading order.

Element names follow ECMA-376 Part 1 (WordprocessingML): a body holds paragraphs (``w:p``)
and tables (``w:tbl`` > ``w:tr`` > ``w:tc``); a paragraph holds runs (``w:r``), possibly
inside hyperlinks, fields, content controls or tracked insertions; a run holds text
(``w:t``), tabs, breaks and note references. Deleted and moved-away text (``w:del``,
``w:moveFrom``) is not part of the draft and is left out; so are text boxes and drawings,
whose place in the reading order is unknown.

A superscript run holding only reference numbers ("rose¹", "rose²,³", "rose⁴⁻⁷") is the
Word form of a numeric marker and is written as " [1]", " [2,3]", " [4-7]" so the shared
marker finder reads it; the space is the one a typed marker has, so "rose.¹" reads as
"rose. [1]", which the claim splitter gives to the sentence before. It is left alone after
a digit, a one-letter word or a unit ("10⁵", "x²", "m²", "cm³"), where it is an exponent.
"""

from __future__ import annotations

import re
from collections.abc import Iterator
from dataclasses import dataclass, field

from docx.oxml.ns import qn
from lxml import etree

_W_P, _W_TBL, _W_TR, _W_TC, _W_R = qn("w:p"), qn("w:tbl"), qn("w:tr"), qn("w:tc"), qn("w:r")
_W_SDT, _W_SDT_CONTENT, _W_CUSTOM_XML = qn("w:sdt"), qn("w:sdtContent"), qn("w:customXml")
_W_VAL = qn("w:val")
# Never read as text: properties, removed revisions, and drawing or text-box containers.
_SKIPPED = frozenset(
    qn(f"w:{name}") for name in ("pPr", "rPr", "del", "moveFrom", "drawing", "pict", "object", "sdtPr", "sdtEndPr")
) | {"{http://schemas.openxmlformats.org/markup-compatibility/2006}AlternateContent"}
_RUN_TEXT = {qn("w:t"): None, qn("w:tab"): " ", qn("w:ptab"): " ", qn("w:br"): " ", qn("w:cr"): " "}
_RUN_TEXT |= {qn("w:noBreakHyphen"): "-", qn("w:softHyphen"): ""}
_NOTE_REFERENCES = {qn("w:footnoteReference"): "footnote", qn("w:endnoteReference"): "endnote"}
# Notes Word adds itself: the rule above the notes and its continuation forms.
SPECIAL_NOTE_TYPES = frozenset({"separator", "continuationSeparator", "continuationNotice"})
_FALSE = frozenset({"0", "false", "off", "none"})

_SUPERSCRIPT_NUMBERS_RE = re.compile(r"^\d{1,3}(?:\s*[,;\-‐‑‒–—]\s*\d{1,3})*$")
# Units an exponent follows; one-letter words ("m", "x") are excluded anyway, and "in" is
# left out, since "as shown in²" is a citation more often than square inches.
_UNITS = frozenset(
    {
        "cm",
        "mm",
        "km",
        "nm",
        "µm",
        "μm",
        "ft",
        "yd",
        "mi",
        "ms",
        "kg",
        "mg",
        "µg",
        "ml",
        "dl",
        "mol",
        "kj",
        "kw",
        "pa",
        "hz",
    }
)
_HEADING_STYLE_RE = re.compile(r"(?i)^heading\s+(\d)$")
_TITLE_STYLES = frozenset({"title", "subtitle"})


@dataclass(frozen=True)
class Paragraph:
    """One paragraph as plain text, with what the reader needs to place it.

    ``heading`` is the outline level (1 = top) of a heading or title paragraph; ``bold``
    says every character is bold; ``list_number`` is the number Word's list numbering
    would print before it (None for no numbering or bullets); ``row`` groups the cells of
    one table row, so a reference list laid out as a table reads one entry per row.
    """

    text: str
    heading: int | None = None
    bold: bool = False
    list_number: int | None = None
    row: int | None = None


@dataclass
class _Style:
    name: str = ""
    based_on: str | None = None
    outline: int | None = None
    num: tuple[str, int] | None = None
    superscript: bool | None = None
    bold: bool | None = None


class Styles:
    """Style lookups that follow ``w:basedOn``, since Word's styles inherit."""

    def __init__(self, root: etree._Element | None) -> None:
        self._styles: dict[str, _Style] = {}
        self._default_paragraph: str | None = None
        if root is None:
            return
        for element in root.iterchildren(qn("w:style")):
            style_id = element.get(qn("w:styleId"))
            if not style_id:
                continue
            style = _Style(
                name=_val(element.find(qn("w:name"))) or style_id,
                based_on=_val(element.find(qn("w:basedOn"))),
                outline=_int(_val(element.find(f"{qn('w:pPr')}/{qn('w:outlineLvl')}"))),
                num=_num_pr(element.find(f"{qn('w:pPr')}/{qn('w:numPr')}")),
                superscript=_vert_align(element.find(qn("w:rPr"))),
                bold=_toggle(element.find(f"{qn('w:rPr')}/{qn('w:b')}")),
            )
            self._styles[style_id] = style
            if element.get(qn("w:type")) == "paragraph" and element.get(qn("w:default")) in {"1", "true", "on"}:
                self._default_paragraph = style_id

    def _chain(self, style_id: str | None) -> Iterator[_Style]:
        seen: set[str] = set()
        style_id = style_id or None
        while style_id and style_id not in seen and style_id in self._styles:
            seen.add(style_id)
            style = self._styles[style_id]
            yield style
            style_id = style.based_on

    def _first(self, style_id: str | None, attribute: str) -> object:
        for style in self._chain(style_id):
            value = getattr(style, attribute)
            if value is not None:
                return value
        return None

    def heading_level(self, style_id: str | None) -> int | None:
        """1-based level for "Heading N", "Title" and styles with an outline level."""
        style_id = style_id or self._default_paragraph
        style = self._styles.get(style_id or "")
        name = style.name.strip() if style else ""
        if match := _HEADING_STYLE_RE.match(name):
            return int(match.group(1))
        if name.lower() in _TITLE_STYLES:
            return 1
        outline = self._first(style_id, "outline")
        # Level 9 is "body text" in the outline (ECMA-376 Part 1, outlineLvl; from memory).
        return int(outline) + 1 if isinstance(outline, int) and outline < 9 else None

    def numbering(self, style_id: str | None) -> tuple[str, int] | None:
        value = self._first(style_id or self._default_paragraph, "num")
        return value if isinstance(value, tuple) else None

    def superscript(self, style_id: str | None) -> bool:
        return self._first(style_id, "superscript") is True

    def bold(self, style_id: str | None) -> bool:
        return self._first(style_id, "bold") is True


class Numbering:
    """What Word prints before a list paragraph: a running number, or nothing for bullets.

    Counters run per list instance (``w:num``) and level through the whole document, from
    the level's ``w:start`` (or a ``w:startOverride``). Restarts of deeper levels after a
    higher one advances are not modelled; reference lists are single-level.
    """

    def __init__(self, root: etree._Element | None) -> None:
        self._levels: dict[tuple[str, int], tuple[bool, int]] = {}
        self._known: set[str] = set()
        self._counters: dict[tuple[str, int], int] = {}
        if root is None:
            return
        abstract: dict[str, dict[int, tuple[bool, int]]] = {}
        for element in root.iterchildren(qn("w:abstractNum")):
            abstract[element.get(qn("w:abstractNumId"), "")] = _levels(element)
        for element in root.iterchildren(qn("w:num")):
            num_id = element.get(qn("w:numId"), "")
            self._known.add(num_id)
            levels = dict(abstract.get(_val(element.find(qn("w:abstractNumId"))) or "", {}))
            for override in element.iterchildren(qn("w:lvlOverride")):
                level = _int(override.get(qn("w:ilvl"))) or 0
                if (lvl := override.find(qn("w:lvl"))) is not None:
                    levels.update({level: _level(lvl)})
                start = _int(_val(override.find(qn("w:startOverride"))))
                if start is not None:
                    levels[level] = (levels.get(level, (True, 1))[0], start)
            for level, value in levels.items():
                self._levels[(num_id, level)] = value

    def next_number(self, num: tuple[str, int] | None) -> int | None:
        """The number of the next paragraph in list ``num``, or None for none or bullets."""
        if num is None or num[0] in {"", "0"} or num[0] not in self._known:
            return None
        counts, start = self._levels.get(num, (True, 1))  # numFmt defaults to decimal
        if not counts:
            return None
        value = self._counters.get(num, start - 1) + 1
        self._counters[num] = value
        return value


@dataclass
class _Collector:
    styles: Styles
    numbering: Numbering
    paragraphs: list[Paragraph] = field(default_factory=list)
    note_order: list[tuple[str, str]] = field(default_factory=list)
    rows: int = 0


def body_paragraphs(
    body: etree._Element, styles: Styles, numbering: Numbering
) -> tuple[list[Paragraph], list[tuple[str, str]]]:
    """The body's paragraphs in reading order, and the (kind, id) of notes as referenced.

    Tables are read row by row, cell by cell, nested tables in place.
    """
    collector = _Collector(styles, numbering)
    _walk_blocks(body, collector, row=None)
    return collector.paragraphs, collector.note_order


def note_paragraphs(root: etree._Element | None, kind: str, order: list[str], styles: Styles) -> list[Paragraph]:
    """Paragraphs of the notes part, notes in the order the body cites them, then the rest.

    Word's own separator notes are skipped.
    """
    if root is None:
        return []
    notes = {
        note.get(qn("w:id"), ""): note
        for note in root.iterchildren(qn(f"w:{kind}"))
        if note.get(qn("w:type")) not in SPECIAL_NOTE_TYPES
    }
    ordered = [i for i in dict.fromkeys(order) if i in notes] + [i for i in notes if i not in order]
    collector = _Collector(styles, Numbering(None))
    for note_id in ordered:
        _walk_blocks(notes[note_id], collector, row=None)
    return [Paragraph(p.text, row=p.row) for p in collector.paragraphs]


def _walk_blocks(container: etree._Element, collector: _Collector, row: int | None) -> None:
    for child in container:
        if child.tag == _W_P:
            collector.paragraphs.append(_paragraph(child, collector, row))
        elif child.tag == _W_TBL:
            for tr in child.iterchildren(_W_TR):
                collector.rows += 1
                this_row = collector.rows
                for tc in tr.iterchildren(_W_TC):
                    _walk_blocks(tc, collector, this_row)
        elif child.tag == _W_SDT:
            for content in child.iterchildren(_W_SDT_CONTENT):
                _walk_blocks(content, collector, row)
        elif child.tag == _W_CUSTOM_XML:  # a wrapper around ordinary blocks
            _walk_blocks(child, collector, row)


def _paragraph(p: etree._Element, collector: _Collector, row: int | None) -> Paragraph:
    styles = collector.styles
    ppr = p.find(qn("w:pPr"))
    style_id = _val(ppr.find(qn("w:pStyle"))) if ppr is not None else None
    pieces: list[tuple[str, bool, bool]] = []
    _collect_runs(p, styles, pieces, collector.note_order)
    direct_num = _num_pr(ppr.find(qn("w:numPr"))) if ppr is not None else None
    num = direct_num if direct_num is not None else styles.numbering(style_id)
    outline = _int(_val(ppr.find(qn("w:outlineLvl")))) if ppr is not None else None
    heading = outline + 1 if outline is not None and outline < 9 else styles.heading_level(style_id)
    text = _join(pieces)
    visible = [(t, b) for t, _, b in pieces if t.strip()]
    bold = bool(visible) and all(b for _, b in visible)
    number = collector.numbering.next_number(num)  # Word numbers empty items too
    return Paragraph(text, heading=heading, bold=bold, list_number=number, row=row)


def _collect_runs(
    element: etree._Element, styles: Styles, pieces: list[tuple[str, bool, bool]], notes: list[tuple[str, str]]
) -> None:
    """(text, superscript, bold) of each run under ``element``, in order."""
    for child in element:
        if child.tag in _SKIPPED or not isinstance(child.tag, str):
            continue
        if child.tag == _W_R:
            rpr = child.find(qn("w:rPr"))
            char_style = _val(rpr.find(qn("w:rStyle"))) if rpr is not None else None
            direct = _vert_align(rpr)
            superscript = direct if direct is not None else styles.superscript(char_style)
            bold_toggle = _toggle(rpr.find(qn("w:b"))) if rpr is not None else None
            bold = bold_toggle if bold_toggle is not None else styles.bold(char_style)
            text = []
            for item in child:
                if item.tag in _RUN_TEXT:
                    fixed = _RUN_TEXT[item.tag]
                    text.append((item.text or "") if fixed is None else fixed)
                elif item.tag in _NOTE_REFERENCES:
                    notes.append((_NOTE_REFERENCES[item.tag], item.get(qn("w:id"), "")))
            pieces.append(("".join(text), superscript, bold))
        else:  # hyperlink, field, smart tag, inline content control, tracked insertion ...
            _collect_runs(child, styles, pieces, notes)


def _join(pieces: list[tuple[str, bool, bool]]) -> str:
    """Run texts joined, superscript reference numbers turned into bracketed markers."""
    out = ""
    index = 0
    while index < len(pieces):
        text, superscript, _ = pieces[index]
        if not superscript:
            out += text
            index += 1
            continue
        group = ""
        while index < len(pieces) and pieces[index][1]:
            group += pieces[index][0]
            index += 1
        numbers = group.strip()
        if _SUPERSCRIPT_NUMBERS_RE.match(numbers) and _after_word(out):
            lead = group[: len(group) - len(group.lstrip())]
            trail = group[len(group.rstrip()) :]
            out += f"{lead} [{numbers}]{trail}"  # spaced as typed markers are
        else:
            out += group
    return " ".join(out.split())


def _after_word(text: str) -> bool:
    """Whether a superscript right after ``text`` sits where a reference number would."""
    if not text or text[-1].isspace() or text[-1].isdigit() or text[-1] in "+-−=×*/^(":
        return False
    word = re.split(r"\s", text)[-1].strip(".,;:)]’'\"")
    return len(word) != 1 and word.lower() not in _UNITS


def _levels(abstract: etree._Element) -> dict[int, tuple[bool, int]]:
    return {_int(lvl.get(qn("w:ilvl"))) or 0: _level(lvl) for lvl in abstract.iterchildren(qn("w:lvl"))}


def _level(lvl: etree._Element) -> tuple[bool, int]:
    """(prints a number, start value) of one list level."""
    fmt = _val(lvl.find(qn("w:numFmt"))) or "decimal"
    start = _int(_val(lvl.find(qn("w:start"))))
    return fmt not in {"bullet", "none"}, 1 if start is None else start


def _num_pr(element: etree._Element | None) -> tuple[str, int] | None:
    if element is None:
        return None
    num_id = _val(element.find(qn("w:numId")))
    if num_id is None:
        return None
    return num_id, _int(_val(element.find(qn("w:ilvl")))) or 0


def _vert_align(rpr: etree._Element | None) -> bool | None:
    if rpr is None:
        return None
    align = rpr.find(qn("w:vertAlign"))
    return None if align is None else align.get(_W_VAL) == "superscript"


def _toggle(element: etree._Element | None) -> bool | None:
    """An on/off property such as ``w:b``: present means on unless its value says off."""
    if element is None:
        return None
    return (element.get(_W_VAL) or "true").lower() not in _FALSE


def _val(element: etree._Element | None) -> str | None:
    return None if element is None else element.get(_W_VAL)


def _int(value: str | None) -> int | None:
    try:
        return int(value) if value is not None else None
    except ValueError:
        return None
