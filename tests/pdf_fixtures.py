"""Small builders of PDF files for tests, made with fpdf2 so no binary fixture is committed.

Every builder writes to a path the test owns (use pytest's ``tmp_path``) and returns it.
The text is always set in DejaVu Sans, a TrueType font with a ToUnicode map, so that
extractors read back exactly what was written, ligature glyphs (U+FB01 "ﬁ") and all.

Builders:
    build_pdf            pages of text blocks, optional running header/footer, metadata
    paper_pdf            a one-call "article": title, authors, DOI line, body, reference list
    typeset_pdf          pages of (font size, text) lines: a title in large type, a cover page
    two_column_pdf       one page whose text is set in two columns
    encrypted_pdf        a text PDF locked with a user password (fpdf2 ``set_encryption``)
    image_only_pdf       pages that carry a raster image and no text layer
    write_not_a_pdf      a text file named .pdf
    write_truncated_pdf  the first part of a valid PDF, cut off mid-file

A page is a sequence of *blocks*. A block is a paragraph string: it is wrapped to the page
width, and a ``"\\n"`` inside it forces a line break (use this to control where a line
ends, e.g. to place a hyphen at a line end). The empty string adds vertical space, and the
sentinel :data:`IMAGE` draws a small raster image instead of text.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from io import BytesIO
from pathlib import Path

from fpdf import FPDF
from fpdf.enums import EncryptionMethod

FONT_PATH = Path("/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf")
FONT = "dejavu"
IMAGE = "<<image>>"

#: A running-line template: a string with ``{n}`` for the page number (and fpdf2's
#: ``{nb}`` alias for the page count), or a function of the page number.
RunningLine = str | Callable[[int], str] | None


class _Pdf(FPDF):
    """FPDF with a DejaVu font and optional running header/footer lines."""

    def __init__(self, header_line: RunningLine = None, footer_line: RunningLine = None) -> None:
        super().__init__(format="A4")
        self.add_font(FONT, fname=str(FONT_PATH))
        self._header_line = header_line
        self._footer_line = footer_line
        self.set_auto_page_break(auto=True, margin=20)

    @staticmethod
    def _render(line: RunningLine, page: int) -> str:
        if line is None:
            return ""
        return line(page) if callable(line) else line.replace("{n}", str(page))

    def header(self) -> None:
        text = self._render(self._header_line, self.page_no())
        if text:
            self.set_font(FONT, size=8)
            self.cell(0, 6, text, align="C", new_x="LMARGIN", new_y="NEXT")
            self.ln(4)

    def footer(self) -> None:
        text = self._render(self._footer_line, self.page_no())
        if text:
            self.set_y(-15)
            self.set_font(FONT, size=8)
            self.cell(0, 6, text, align="C")


def _png_bytes(size: int = 40) -> bytes:
    """A small grey-gradient PNG made with Pillow (an fpdf2 dependency)."""
    from PIL import Image

    image = Image.new("L", (size, size))
    image.putdata([(x * 255) // size for _ in range(size) for x in range(size)])
    buffer = BytesIO()
    image.save(buffer, format="PNG")
    return buffer.getvalue()


def _write_blocks(pdf: FPDF, blocks: Sequence[str], width: float = 0, font_size: int = 11) -> None:
    pdf.set_font(FONT, size=font_size)
    for block in blocks:
        if block == IMAGE:
            pdf.image(BytesIO(_png_bytes()), w=60)
        elif block == "":
            pdf.ln(5)
        else:
            x = pdf.get_x()
            pdf.multi_cell(width, 6, block, align="L", new_x="LEFT", new_y="NEXT")
            pdf.set_x(x)


def _set_metadata(
    pdf: FPDF,
    title: str | None,
    author: str | None,
    subject: str | None,
    keywords: str | None,
) -> None:
    if title is not None:
        pdf.set_title(title)
    if author is not None:
        pdf.set_author(author)
    if subject is not None:
        pdf.set_subject(subject)
    if keywords is not None:
        pdf.set_keywords(keywords)


def build_pdf(
    path: Path,
    pages: Sequence[Sequence[str]],
    *,
    header: RunningLine = None,
    footer: RunningLine = None,
    title: str | None = None,
    author: str | None = None,
    subject: str | None = None,
    keywords: str | None = None,
) -> Path:
    """Write one PDF page per item of ``pages``; each item is a sequence of blocks.

    Text that overflows a page flows onto a new one (fpdf2's automatic page break), so
    keep blocks short when a test depends on which page a sentence lands on.
    """
    pdf = _Pdf(header, footer)
    _set_metadata(pdf, title, author, subject, keywords)
    for blocks in pages:
        pdf.add_page()
        _write_blocks(pdf, blocks)
    pdf.output(str(path))
    return path


def paper_pdf(
    path: Path,
    *,
    title: str,
    authors: str,
    body: Sequence[Sequence[str]],
    doi: str | None = None,
    year: int | None = None,
    references: Sequence[str] = (),
    metadata_title: str | None = None,
    metadata_author: str | None = None,
    header: RunningLine = None,
    footer: RunningLine = None,
) -> Path:
    """An invented article: a title page (title, authors, year/DOI line), then body pages.

    ``body`` is a sequence of pages of blocks; the first is set under the title. The
    reference list, if any, follows the last body page under a "References" heading.
    """
    front = [title, authors]
    stamp = " ".join(part for part in (f"Published {year}." if year else "", f"doi:{doi}" if doi else "") if part)
    if stamp:
        front.append(stamp)
    front.append("")
    pages = [list(p) for p in body] or [[]]
    pages[0] = front + pages[0]
    if references:
        pages[-1] = [*pages[-1], "", "References", *references]
    return build_pdf(
        path,
        pages,
        header=header,
        footer=footer,
        title=metadata_title,
        author=metadata_author,
    )


def typeset_pdf(path: Path, pages: Sequence[Sequence[tuple[int, str]]], *, title: str | None = None) -> Path:
    """One PDF page per item; each line is (font size in points, text), wrapped to the page.

    For tests of what the layout says, such as which line is set in the largest type.
    """
    pdf = _Pdf()
    _set_metadata(pdf, title, None, None, None)
    for lines in pages:
        pdf.add_page()
        for size, text in lines:
            pdf.set_font(FONT, size=size)
            pdf.multi_cell(0, size * 0.5, text, align="L", new_x="LMARGIN", new_y="NEXT")
            pdf.ln(2)
    pdf.output(str(path))
    return path


def two_column_pdf(path: Path, left: Sequence[str], right: Sequence[str]) -> Path:
    """One page with ``left`` blocks in the left column and ``right`` blocks in the right.

    The left column is written first, as a typesetter's content stream usually does.
    """
    pdf = _Pdf()
    pdf.add_page()
    gutter = 8.0
    column = (pdf.w - pdf.l_margin - pdf.r_margin - gutter) / 2
    top = pdf.get_y()
    pdf.set_xy(pdf.l_margin, top)
    _write_blocks(pdf, left, width=column)
    pdf.set_xy(pdf.l_margin + column + gutter, top)
    _write_blocks(pdf, right, width=column)
    pdf.output(str(path))
    return path


def encrypted_pdf(
    path: Path,
    blocks: Sequence[str],
    *,
    user_password: str = "secret",
    owner_password: str = "owner-secret",
) -> Path:
    """A one-page text PDF encrypted with AES-128; an empty ``user_password`` opens freely."""
    pdf = _Pdf()
    pdf.set_encryption(
        owner_password=owner_password,
        user_password=user_password,
        encryption_method=EncryptionMethod.AES_128,
    )
    pdf.add_page()
    _write_blocks(pdf, blocks)
    pdf.output(str(path))
    return path


def image_only_pdf(path: Path, pages: int = 1) -> Path:
    """Pages that hold only a raster image, as a scan without OCR does."""
    return build_pdf(path, [[IMAGE] for _ in range(pages)])


def write_not_a_pdf(path: Path, text: str = "Just some notes, not a PDF at all.\n") -> Path:
    """A plain text file, whatever its name says."""
    path.write_text(text, encoding="utf-8")
    return path


def write_truncated_pdf(path: Path, source: Path, keep: float = 0.4) -> Path:
    """The first ``keep`` share of the bytes of ``source``: header present, body cut off."""
    data = source.read_bytes()
    path.write_bytes(data[: max(16, int(len(data) * keep))])
    return path


# --- manuscripts (drafts submitted as PDF) ---------------------------------------------

#: Where a manuscript line's number is set, and where its text starts (mm from the left).
_NUMBER_X = 8.0
_TEXT_X = 20.0


def _split_superscripts(line: str) -> list[tuple[str, bool]]:
    """ "rose^{2,3} and" -> [("rose", False), ("2,3", True), (" and", False)]."""
    parts: list[tuple[str, bool]] = []
    rest = line
    while "^{" in rest:
        before, _, after = rest.partition("^{")
        raised, _, rest = after.partition("}")
        if before:
            parts.append((before, False))
        parts.append((raised, True))
    if rest:
        parts.append((rest, False))
    return parts


def manuscript_pdf(
    path: Path,
    pages: Sequence[Sequence[str]],
    *,
    header: RunningLine = None,
    footer: RunningLine = None,
    line_numbers: int | None = 1,
    superscript: str = "rise",
) -> Path:
    """A manuscript as submitted for review: one printed line per item, numbered in a margin.

    Each page is a sequence of lines, written exactly as given (no wrapping); "" leaves a
    gap and gets no number. ``"^{2}"`` inside a line sets "2" as a superscript, either
    with fpdf2's ``char_vpos = "SUP"`` (smaller font and a text rise, ``Ts``) when
    ``superscript="rise"``, or with a smaller font drawn at a raised baseline (a new text
    position, ``Td``) when ``superscript="move"``. ``line_numbers`` is the numbering step
    (1 numbers every line, 5 every fifth); numbers run on across pages; None for no margin.
    """
    pdf = _Pdf(header, footer)
    counter = 0
    for lines in pages:
        pdf.add_page()
        pdf.set_font(FONT, size=11)
        for line in lines:
            if not line:
                pdf.ln(4)
                continue
            counter += 1
            top = pdf.get_y()
            if line_numbers and counter % line_numbers == 0:
                pdf.set_x(_NUMBER_X)
                pdf.cell(8, 6, str(counter))
            pdf.set_xy(_TEXT_X, top)
            if superscript == "move":
                _line_by_baseline(pdf, line, top)
            else:
                for text, raised in _split_superscripts(line):
                    pdf.char_vpos = "SUP" if raised else "LINE"
                    pdf.cell(pdf.get_string_width(text), 6, text)
                pdf.char_vpos = "LINE"
            pdf.set_xy(pdf.l_margin, top + 6)
    pdf.output(str(path))
    return path


def _line_by_baseline(pdf: FPDF, line: str, top: float) -> None:
    """Draw a line piece by piece at an explicit baseline, superscripts 2.5 mm higher in 7 pt."""
    x, baseline = _TEXT_X, top + 4.5
    for text, raised in _split_superscripts(line):
        pdf.set_font_size(7 if raised else 11)
        pdf.text(x, baseline - 2.5 if raised else baseline, text)
        x += pdf.get_string_width(text)
    pdf.set_font_size(11)
