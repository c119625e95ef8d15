"""The Markdown report: flagged checks first, and text from drafts and PDFs inert when rendered.

Outside reference: the rendered HTML comes from markdown-it-py (a CommonMark
implementation that passes the CommonMark spec tests; installed with rich) with the
GitHub-flavoured table and strikethrough rules switched on, so "renders as intended"
and "injects nothing" are judged by a parser we did not write.
"""

from __future__ import annotations

import re
from collections import Counter
from html.parser import HTMLParser

from markdown_it import MarkdownIt

from sourcecheck.model import Report
from sourcecheck.reports import CAUTION, markdown
from sourcecheck.reports.markdown_report import md
from tests.reports.conftest import MARKDOWN_IN_PDF, ONERROR_IN_PDF, SCRIPT_IN_PDF
from tests.test_pipeline import planted_rows


class _Elements(HTMLParser):
    """Every start tag with its attributes, and the text, of an HTML fragment."""

    def __init__(self, html: str) -> None:
        super().__init__(convert_charrefs=True)
        self.tags: list[tuple[str, dict[str, str | None]]] = []
        self.text: list[str] = []
        self.feed(html)

    def handle_starttag(self, tag: str, attrs: list[tuple[str, str | None]]) -> None:
        self.tags.append((tag, dict(attrs)))

    def handle_data(self, data: str) -> None:
        self.text.append(data)

    def names(self) -> Counter[str]:
        return Counter(tag for tag, _ in self.tags)


def _rendered(text: str) -> _Elements:
    return _Elements(MarkdownIt("commonmark").enable(["table", "strikethrough"]).render(text))


def test_demo_summary_table_counts_the_planted_bands(demo_report: Report) -> None:
    text = markdown(demo_report)
    counts = Counter(r["band"] for r in planted_rows())  # sample_manuscript/PLANTED.md
    for band, n in counts.items():
        assert re.search(rf"^\| {band} \| {n} \|", text, re.MULTILINE), band
    assert f"| **all** | **{sum(counts.values())}** |" in text
    assert CAUTION in text


def test_demo_flagged_checks_come_first_with_reason_and_quoted_passage(demo_report: Report) -> None:
    text = markdown(demo_report)
    flagged_at, anchored_at = text.index("## Checks to read first"), text.index("## Anchored checks")
    assert flagged_at < anchored_at
    flagged_part = text[flagged_at:anchored_at]
    for row in planted_rows():
        if row["band"] != "anchored" and row["reason"] != "-":
            assert f"`{row['reason']}`" in flagged_part, row
    # The changed number of PLANTED.md row 9: the passage quoted, with its page and section.
    assert "Closest passage, p. 2, results:" in flagged_part
    assert "> Only 18% of nest entrances lay on north-facing slopes" in flagged_part


def test_demo_anchored_checks_are_one_table_row_each(demo_report: Report) -> None:
    rows_planted = planted_rows()  # sample_manuscript/PLANTED.md
    mixed = {r["snippet"] for r in rows_planted if r["band"] != "anchored"}
    expected = [r for r in rows_planted if r["band"] == "anchored" and r["snippet"] not in mixed]
    table = markdown(demo_report).split("## Anchored checks", 1)[1].split("\n## ", 1)[0]
    rows = [line for line in table.splitlines() if re.match(r"\| c\d+ \|", line)]
    assert len(rows) == len(expected) == 10
    assert all(line.count(" | ") == 5 for line in rows)  # six cells, no stray pipe


def test_hostile_pdf_and_draft_text_render_as_text(hostile_report: Report) -> None:
    text = markdown(hostile_report)
    rendered = _rendered(text)
    names = rendered.names()
    assert not {"script", "img", "a"} & set(names)  # the PDF's tag, image and link stay text
    checks = sum(len(r.checks) for r in hostile_report.claims)
    assert names["strong"] == checks + 2  # our own: each check's band and the total row; not the PDF's **loud**
    assert not [attrs for _, attrs in rendered.tags if any(k.startswith("on") for k in attrs)]
    assert names["h1"] == 1  # the PDF's "# Taken over" made no heading
    shown = "".join(rendered.text)
    for literal in (SCRIPT_IN_PDF, ONERROR_IN_PDF, "[click](javascript:alert(1)) **loud**"):
        assert literal in shown
    assert MARKDOWN_IN_PDF.split(" | ")[0] in shown
    assert "\x1b" not in text and "\\x1b[31m" in shown  # the draft's terminal escape, shown as characters


def test_table_cells_are_not_split_by_a_pipe_in_the_text(hostile_report: Report) -> None:
    rendered = _rendered(markdown(hostile_report))
    header_cells = sum(1 for tag, _ in rendered.tags if tag == "th")
    body_cells = sum(1 for tag, _ in rendered.tags if tag == "td")
    assert header_cells == 3 and body_cells == 3 * 6  # the summary table: five bands and the total


def test_md_escapes_what_opens_a_block_or_acts_inline() -> None:
    for source, tag in [("# heading", "h1"), ("1. item", "ol"), ("- item", "ul"), ("> quote", "blockquote")]:
        assert tag not in _rendered(f"- {md(source)}").names() - Counter({"ul": 1})
    plain = "a *b* _c_ `d` ~~e~~ <b>f</b> &amp; $x$ [g](h)"
    rendered = _rendered(md(plain))
    assert "".join(rendered.text).strip() == plain and rendered.names() == Counter({"p": 1})
