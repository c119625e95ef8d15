"""Tests for the Word (.docx) reader.

Fixtures are built with python-docx. Notes are added by writing the WordprocessingML
parts by hand, after ECMA-376 Part 1 (from memory): ``w:footnotes`` holds ``w:footnote``
elements with a ``w:id``; Word's own separator notes carry ``w:type="separator"`` and
``w:type="continuationSeparator"``; the body cites a note with a run holding
``w:footnoteReference w:id="..."``; the part is tied in by a relationship of type
``.../relationships/footnotes`` and a content-type override (ECMA-376 Part 2, OPC).
"""

from __future__ import annotations

import re
import zipfile
from collections.abc import Callable
from pathlib import Path

import docx
import pytest
from docx.enum.style import WD_STYLE_TYPE
from docx.oxml import parse_xml
from docx.text.paragraph import Paragraph as DocxParagraph

from sourcecheck.drafts.markdown.reader import read_markdown
from sourcecheck.drafts.word.reader import read_word, read_word_bytes
from sourcecheck.model import Draft, ReadOptions

W = "http://schemas.openxmlformats.org/wordprocessingml/2006/main"
REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships"
NOTE_CONTENT_TYPE = "application/vnd.openxmlformats-officedocument.wordprocessingml.{kind}s+xml"


def _read(path: Path) -> Draft:
    return read_word(path, path.name, ReadOptions())


def _superscript(paragraph: DocxParagraph, text: str) -> None:
    # ECMA-376 Part 1: w:rPr/w:vertAlign w:val="superscript" (python-docx writes it).
    paragraph.add_run(text).font.superscript = True


def _cite_note(paragraph: DocxParagraph, note_id: int, kind: str = "footnote") -> None:
    """A note reference run as Word writes it: superscript, with no text of its own."""
    paragraph._p.append(
        parse_xml(
            f'<w:r xmlns:w="{W}"><w:rPr><w:vertAlign w:val="superscript"/></w:rPr>'
            f'<w:{kind}Reference w:id="{note_id}"/></w:r>'
        )
    )


def _add_notes(path: Path, notes: dict[int, str], kind: str = "footnote") -> None:
    """Add word/{kind}s.xml with Word's two separator notes, its relationship and content type.

    python-docx cannot write notes, so the zip is rewritten with the three parts changed.
    """
    paragraphs = "".join(
        f'<w:{kind} w:id="{i}"><w:p><w:r><w:{kind}Ref/></w:r>'
        f'<w:r><w:t xml:space="preserve"> {text}</w:t></w:r></w:p></w:{kind}>'
        for i, text in notes.items()
    )
    part = (
        f'<?xml version="1.0" encoding="UTF-8" standalone="yes"?><w:{kind}s xmlns:w="{W}">'
        f'<w:{kind} w:type="separator" w:id="-1"><w:p><w:r><w:separator/></w:r></w:p></w:{kind}>'
        f'<w:{kind} w:type="continuationSeparator" w:id="0"><w:p><w:r><w:continuationSeparator/></w:r>'
        f"<w:r><w:t>should never be read [9]</w:t></w:r></w:p></w:{kind}>{paragraphs}</w:{kind}s>"
    )
    with zipfile.ZipFile(path) as source:
        members = {name: source.read(name) for name in source.namelist()}
    rels = members["word/_rels/document.xml.rels"].decode()
    rels = rels.replace(
        "</Relationships>",
        f'<Relationship Id="rIdNotes{kind}" Type="{REL}/{kind}s" Target="{kind}s.xml"/></Relationships>',
    )
    types = members["[Content_Types].xml"].decode()
    types = types.replace(
        "</Types>",
        f'<Override PartName="/word/{kind}s.xml" ContentType="{NOTE_CONTENT_TYPE.format(kind=kind)}"/></Types>',
    )
    members |= {
        f"word/{kind}s.xml": part.encode(),
        "word/_rels/document.xml.rels": rels.encode(),
        "[Content_Types].xml": types.encode(),
    }
    with zipfile.ZipFile(path, "w", zipfile.ZIP_DEFLATED) as target:
        for name, data in members.items():
            target.writestr(name, data)


def _expected_position(document: docx.document.Document, text: str) -> int:
    """1-based position of the paragraph holding ``text``, counted with python-docx.

    python-docx (a reference library) gives body paragraphs and tables in document order;
    cells are read row by row, as a reader of the page would.
    """
    position = 0
    for item in document.iter_inner_content():
        paragraphs = (
            [p for row in item.rows for cell in row.cells for p in cell.paragraphs] if hasattr(item, "rows") else [item]
        )
        for paragraph in paragraphs:
            position += 1
            if text in paragraph.text:
                return position
    raise AssertionError(text)


def test_body_table_heading_superscript_and_numbered_list(tmp_path: Path) -> None:
    document = docx.Document()
    document.add_heading("Yields on plots [1]", 0)  # style "Title"
    document.add_heading("Results (Okafor, 2019)", 1)
    intro = document.add_paragraph("Yields rose by 12%")
    _superscript(intro, "1")
    intro.add_run(" on wet plots. Soil was dry")
    _superscript(intro, "2,3")
    intro.add_run(". Nothing cited here.")
    table = document.add_table(rows=2, cols=2)
    table.cell(0, 0).text = "Plot A"
    table.cell(0, 1).text = "Roots grew deeper [2]."
    table.cell(1, 0).text = "Plot B"
    table.cell(1, 1).text = "Leaves were wider [3–4]."
    document.add_paragraph("After the table, more text [4].")
    document.add_heading("References", 1)
    for entry in (
        "Okafor, A. B. (2019). Yields on wet plots. Journal of Fields, 1, 1–9.",
        "Lin, C. (2020). Dry soils. Soil Letters, 2, 3–4.",
        "Brandt, D. (2021). Roots. Plant Notes, 5, 6.",
        "Ng, E. (2022). Leaves. Leaf Review, 7, 8.",
    ):
        document.add_paragraph(entry, style="List Number")
    path = tmp_path / "draft.docx"
    document.save(path)

    draft = _read(path)
    assert draft.problems == []
    got = [(c.text, c.line, [x.key for x in c.citations]) for c in draft.claims]
    assert got == [
        ("Yields rose by 12% [1] on wet plots.", _expected_position(document, "Yields rose"), ["1"]),
        ("Soil was dry [2,3].", _expected_position(document, "Yields rose"), ["2", "3"]),
        ("Roots grew deeper [2].", _expected_position(document, "Roots grew"), ["2"]),
        ("Leaves were wider [3–4].", _expected_position(document, "Leaves were"), ["3", "4"]),
        ("After the table, more text [4].", _expected_position(document, "After the table"), ["4"]),
    ]
    # Word's list numbering is not in the text: the entries get 1..n in order.
    assert [(r.key, r.authors, r.year, r.line) for r in draft.references] == [
        ("1", ("Okafor",), 2019, _expected_position(document, "Okafor, A. B.")),
        ("2", ("Lin",), 2020, _expected_position(document, "Lin, C.")),
        ("3", ("Brandt",), 2021, _expected_position(document, "Brandt, D.")),
        ("4", ("Ng",), 2022, _expected_position(document, "Ng, E.")),
    ]


def test_printed_numbers_are_kept_and_not_doubled(tmp_path: Path) -> None:
    document = docx.Document()
    document.add_paragraph("Rain fell early [2]. It rose [10].")
    document.add_heading("Bibliography", 2)
    document.add_paragraph("[2] Okafor, A. (2019). Rain. J, 1, 2.")
    # Printed "10." and list numbering at once: the printed number wins, as on the page.
    document.add_paragraph("10. Lin, C. (2020). Rivers. J, 3, 4.", style="List Number")
    path = tmp_path / "printed.docx"
    document.save(path)
    draft = _read(path)
    assert [r.key for r in draft.references] == ["2", "10"]
    assert [[x.key for x in c.citations] for c in draft.claims] == [["2"], ["10"]]


def test_bulleted_author_year_list_is_not_numbered(tmp_path: Path) -> None:
    document = docx.Document()
    document.add_paragraph("Yields rose (Okafor, 2019). Soils dried (Lin & Ng, 2020).")
    references = document.add_paragraph()
    references.add_run("Works cited").bold = True  # a bold paragraph, not a heading style
    document.add_paragraph("Okafor, A. (2019). Yields. J, 1, 2.", style="List Bullet")
    document.add_paragraph("Lin, C., & Ng, E. (2020). Soils. J, 3, 4.", style="List Bullet")
    path = tmp_path / "bullets.docx"
    document.save(path)
    draft = _read(path)
    assert draft.problems == []
    assert [r.key for r in draft.references] == ["okafor2019", "lin2020"]
    assert [[x.key for x in c.citations] for c in draft.claims] == [["okafor2019"], ["lin2020"]]


def test_bare_heading_paragraph_and_list_start_value(tmp_path: Path) -> None:
    document = docx.Document()
    document.add_paragraph("Cited as five [5] and six [6].")
    document.add_paragraph("References")  # plain paragraph alone: still the list's title
    numbering = document.part.numbering_part.element
    # A list instance starting at 5 (ECMA-376 Part 1: w:lvlOverride/w:startOverride, from memory).
    numbering.append(
        parse_xml(
            f'<w:num xmlns:w="{W}" w:numId="99"><w:abstractNumId w:val="7"/>'
            '<w:lvlOverride w:ilvl="0"><w:startOverride w:val="5"/></w:lvlOverride></w:num>'
        )
    )
    for entry in ("Okafor, A. (2019). Five. J, 1, 2.", "Lin, C. (2020). Six. J, 3, 4."):
        paragraph = document.add_paragraph(entry)
        paragraph._p.get_or_add_pPr().append(
            parse_xml(f'<w:numPr xmlns:w="{W}"><w:ilvl w:val="0"/><w:numId w:val="99"/></w:numPr>')
        )
    path = tmp_path / "start.docx"
    document.save(path)
    draft = _read(path)
    assert [r.key for r in draft.references] == ["5", "6"]
    assert [x.key for x in draft.claims[0].citations] == ["5", "6"]


def test_footnotes_and_endnotes_are_claims_after_the_body(tmp_path: Path) -> None:
    document = docx.Document()
    first = document.add_paragraph("Rain fell early")
    _cite_note(first, 2)
    first.add_run(". Rivers rose")
    _cite_note(first, 1)
    first.add_run(" in spring.")
    _cite_note(document.add_paragraph("A remark."), 1, "endnote")
    document.add_heading("References", 1)
    document.add_paragraph("[1] Okafor, A. (2019). Rain. J, 1, 2.")
    document.add_paragraph("[2] Lin, C. (2020). Rivers. J, 3, 4.")
    path = tmp_path / "notes.docx"
    document.save(path)
    _add_notes(path, {1: "Rivers are said to rise [2].", 2: "See also Okafor [1] on rain."})
    _add_notes(path, {1: "An endnote (Okafor, 2019) citing [1]."}, kind="endnote")

    draft = _read(path)
    assert draft.problems == []
    body = len(document.paragraphs)  # no tables here
    got = [(c.text, c.line, [x.key for x in c.citations]) for c in draft.claims]
    # Notes in the order the body cites them (2 before 1); the separators never appear.
    assert got == [
        ("See also Okafor [1] on rain.", body + 1, ["1"]),
        ("Rivers are said to rise [2].", body + 2, ["2"]),
        ("An endnote (Okafor, 2019) citing [1].", body + 3, ["1"]),
    ]
    # The note reference runs are superscript but hold no text: no marker in the body.
    assert all(c.line > body for c in draft.claims)


def test_superscript_exponents_and_character_styles(tmp_path: Path) -> None:
    document = docx.Document()
    cite_style = document.styles.add_style("Cite Number", WD_STYLE_TYPE.CHARACTER)
    cite_style.font.superscript = True
    paragraph = document.add_paragraph("Counts reached 10")
    _superscript(paragraph, "5")
    paragraph.add_run(" per m")
    _superscript(paragraph, "2")
    paragraph.add_run(" and x")
    _superscript(paragraph, "2")
    paragraph.add_run(" grew. Growth was fast")
    paragraph.add_run("4–6", style="Cite Number")  # superscript from the character style
    paragraph.add_run(". Roots rose.")
    _superscript(paragraph, "1")
    document.add_heading("References", 1)
    for n in range(1, 7):
        document.add_paragraph(f"[{n}] Author{n}, A. (2019). Title {n}. J, 1, 2.")
    path = tmp_path / "sup.docx"
    document.save(path)
    draft = _read(path)
    assert [(c.text, [x.key for x in c.citations]) for c in draft.claims] == [
        ("Growth was fast [4–6].", ["4", "5", "6"]),
        ("Roots rose. [1]", ["1"]),
    ]


def test_tracked_deletions_are_skipped_and_hyperlinks_read(tmp_path: Path) -> None:
    document = docx.Document()
    paragraph = document.add_paragraph()
    # ECMA-376 Part 1 (from memory): w:hyperlink and w:ins hold runs; w:del holds w:delText.
    for xml in (
        '<w:hyperlink><w:r><w:t xml:space="preserve">Rain fell </w:t></w:r></w:hyperlink>',
        '<w:ins w:id="1" w:author="A"><w:r><w:t xml:space="preserve">early [1]</w:t></w:r></w:ins>',
        '<w:del w:id="2" w:author="A"><w:r><w:delText> and late [2]</w:delText></w:r></w:del>',
        "<w:r><w:t>.</w:t></w:r>",
    ):
        paragraph._p.append(parse_xml(re.sub(r"^<([\w:]+)", rf'<\1 xmlns:w="{W}"', xml, count=1)))
    document.add_heading("References", 1)
    document.add_paragraph("[1] Okafor, A. (2019). Rain. J, 1, 2.")
    document.add_paragraph("[2] Lin, C. (2020). Late rain. J, 3, 4.")
    path = tmp_path / "tracked.docx"
    document.save(path)
    draft = _read(path)
    assert [(c.text, [x.key for x in c.citations]) for c in draft.claims] == [("Rain fell early [1].", ["1"])]


def _zip(path: Path, members: dict[str, str]) -> Path:
    with zipfile.ZipFile(path, "w") as archive:
        for name, data in members.items():
            archive.writestr(name, data)
    return path


# The first 8 bytes of an OLE compound file (MS-CFB, from memory); stream names are UTF-16LE.
OLE = bytes.fromhex("D0CF11E0A1B11AE1")


@pytest.mark.parametrize(
    ("make", "message"),
    [
        (lambda p: p.write_bytes(b"plain text, not a zip"), "not a Word document (not a zip file)"),
        (lambda p: _zip(p, {"xl/workbook.xml": "<x/>"}), "not a Word document (no word/document.xml inside)"),
        (
            lambda p: p.write_bytes(OLE + bytes(64) + "EncryptedPackage".encode("utf-16-le")),
            "encrypted Word document; save it without a password",
        ),
        (
            lambda p: p.write_bytes(OLE + bytes(64) + "WordDocument".encode("utf-16-le")),
            "an old binary Word document (.doc), not .docx; save it as .docx",
        ),
    ],
)
def test_bad_files_give_one_problem(tmp_path: Path, make: Callable[[Path], object], message: str) -> None:
    path = tmp_path / "draft.docx"
    make(path)
    draft = _read(path)
    assert (draft.claims, draft.references) == ([], [])
    assert [(p.file, p.message) for p in draft.problems] == [("draft.docx", message)]


def test_truncated_and_broken_packages_never_raise(tmp_path: Path) -> None:
    path = tmp_path / "whole.docx"
    docx.Document().save(path)
    data = path.read_bytes()
    for cut in (len(data) // 3, len(data) // 2, len(data) - 30):
        draft = read_word_bytes(data[:cut], "cut.docx")
        assert len(draft.problems) == 1 and draft.problems[0].file == "cut.docx"
    broken = _zip(tmp_path / "broken.docx", {"[Content_Types].xml": "<nope", "word/document.xml": "<w:document/>"})
    draft = _read(broken)
    assert len(draft.problems) == 1 and draft.problems[0].message.startswith("cannot be read as a Word document")


def test_empty_and_unreferenced_documents(tmp_path: Path) -> None:
    empty = tmp_path / "empty.docx"
    docx.Document().save(empty)
    assert [p.message for p in _read(empty).problems] == ["the draft is empty"]
    bare = tmp_path / "bare.docx"
    document = docx.Document()
    document.add_paragraph("Text with a marker [1].")
    document.save(bare)
    messages = [p.message for p in _read(bare).problems]
    assert messages[0].startswith("no reference list found")
    assert [x.key for x in _read(bare).claims[0].citations] == [None]


# --- Word and Markdown twins -----------------------------------------------------------

# Each twin: paragraphs (None = a level-1 heading follows), references, as plain strings;
# "^n^" marks a superscript run in Word and "[n]" in Markdown.
TWINS = {
    "numeric": (
        ["Plots", "Yields rose by 12% on wet plots [1]. Dry plots lagged [2, 3].", "No marker here."],
        [
            "[1] Okafor, A. B. (2019). Wet plots. J, 1, 2.",
            "[2] Lin, C. (2020). Dry plots. J, 3, 4.",
            "[3] Ng, E. (2021). Lag. J, 5, 6.",
        ],
    ),
    "author-year": (
        ["Field work", "Yields rose (Okafor et al., 2019). Lin and Ng (2020) disagree.", "Roots grew (Brandt, 2021a)."],
        [
            "Brandt, D. (2021a). Roots. J, 1, 2.",
            "Lin, C., & Ng, E. (2020). Disagreement. J, 3, 4.",
            "Okafor, A., Lin, C., & Ng, E. (2019). Yields. J, 5, 6.",
        ],
    ),
    "superscript": (
        ["Notes", "Yields rose^1^ on wet plots. Dry plots lagged^2,3^.", "Leaves were wide^1–3^."],
        [
            "1. Okafor AB. Wet plots. J. 2019;1:2.",
            "2. Lin C. Dry plots. J. 2020;3:4.",
            "3. Ng E. Lag. J. 2021;5:6.",
        ],
    ),
}
_SUP_RE = re.compile(r"\^([^^]+)\^")
_MARKER_RE = re.compile(r"\s*\[[^\]]*\]|\s*\([^)]*\d{4}[a-z]?\)")


def _as_word(paragraphs: list[str], references: list[str], path: Path) -> None:
    document = docx.Document()
    document.add_heading(paragraphs[0], 1)
    for text in paragraphs[1:]:
        paragraph = document.add_paragraph()
        for index, piece in enumerate(_SUP_RE.split(text)):
            if index % 2:
                _superscript(paragraph, piece)
            else:
                paragraph.add_run(piece)
    document.add_heading("References", 1)
    for entry in references:
        document.add_paragraph(entry)
    document.save(path)


def _as_markdown(paragraphs: list[str], references: list[str]) -> str:
    body = [f"# {paragraphs[0]}", *[_SUP_RE.sub(r" [\1]", p) for p in paragraphs[1:]]]
    return "\n\n".join([*body, "## References", *references]) + "\n"


@pytest.mark.parametrize("name", sorted(TWINS))
def test_word_and_markdown_twins_agree(tmp_path: Path, name: str) -> None:
    paragraphs, references = TWINS[name]
    path = tmp_path / f"{name}.docx"
    _as_word(paragraphs, references, path)
    word = _read(path)
    markdown = read_markdown(_as_markdown(paragraphs, references), f"{name}.md")

    def shape(draft: Draft) -> list[tuple[str, list[str | None]]]:
        return [(" ".join(_MARKER_RE.sub("", c.text).split()), [x.key for x in c.citations]) for c in draft.claims]

    assert word.problems == markdown.problems == []
    assert shape(word) == shape(markdown)
    assert len(word.claims) >= 2
    assert all(key is not None for _, keys in shape(word) for key in keys)
    assert [r.key for r in word.references] == [r.key for r in markdown.references]
