"""The HTML report as a document: self-contained, complete, and with untrusted text escaped.

Read with the standard library's HTML parser (html.parser), so the markup is judged by a
parser we did not write; tests/reports/test_html_browser.py opens the same pages in a
browser.
"""

from __future__ import annotations

import base64
import hashlib
import re
from collections import Counter
from html.parser import HTMLParser

from sourcecheck.model import Report
from sourcecheck.reports import CAUTION, html
from tests.reports.conftest import ONERROR_IN_PDF, SCRIPT_IN_PDF
from tests.test_pipeline import planted_rows


class _Page(HTMLParser):
    """Start tags with their attributes, each script's text, and all other text of a page."""

    def __init__(self, document: str) -> None:
        super().__init__(convert_charrefs=True)
        self.tags: list[tuple[str, dict[str, str]]] = []
        self.scripts: list[str] = []
        self.text: list[str] = []
        self._in_script = False
        self.feed(document)

    def handle_starttag(self, tag: str, attrs: list[tuple[str, str | None]]) -> None:
        self.tags.append((tag, {k: v or "" for k, v in attrs}))
        self._in_script = tag == "script"

    def handle_endtag(self, tag: str) -> None:
        self._in_script = False

    def handle_data(self, data: str) -> None:
        (self.scripts if self._in_script else self.text).append(data)

    def with_class(self, tag: str, name: str) -> list[dict[str, str]]:
        return [a for t, a in self.tags if t == tag and name in a.get("class", "").split()]


def test_demo_page_has_every_claim_and_check_flagged_first(demo_report: Report) -> None:
    page = _Page(html(demo_report))
    rows = planted_rows()  # sample_manuscript/PLANTED.md
    checks = page.with_class("section", "check")
    assert len(checks) == len(rows) == 23
    assert len(page.with_class("article", "claim")) == len({r["snippet"] for r in rows})
    assert Counter(c["data-band"] for c in checks) == Counter(r["band"] for r in rows)
    flagged = ["flagged" in a["class"].split() for a in page.with_class("article", "claim")]
    assert flagged == sorted(flagged, reverse=True)  # every flagged claim before the first calm one


def test_demo_page_shows_the_legend_caution_chart_and_filters(demo_report: Report) -> None:
    page = _Page(html(demo_report))
    text = " ".join(" ".join(page.text).split())
    assert text.count(CAUTION) == 2  # at the top and at the foot
    assert "What the bands mean" in text
    bars = [a for t, a in page.tags if t == "rect"]
    assert len(bars) == 5 and max(int(b["width"]) for b in bars) > 0
    boxes = [a["value"] for t, a in page.tags if t == "input" and a.get("name") == "band"]
    assert boxes == ["conflict", "adrift", "loose", "unverifiable", "anchored"]
    reasons = {a["value"] for t, a in page.tags if t == "input" and a.get("name") == "reason"}
    assert {r["reason"] for r in planted_rows() if r["reason"] != "-"} <= reasons


def test_demo_page_marks_the_claim_words_in_the_passage(demo_report: Report) -> None:
    document = html(demo_report)
    # PLANTED.md row 9: the claim's "north-facing slopes" and "nest entrances" in the cited passage.
    assert "<mark>nest entrances lay</mark> on <mark>north</mark>-<mark>facing slopes</mark>" in document
    assert "<details" in document and "next-closest passage" in document


def test_page_is_self_contained(demo_report: Report) -> None:
    page = _Page(html(demo_report))
    linked = [(t, a) for t, a in page.tags if {"src", "href", "srcset", "action"} & set(a) and t != "svg"]
    assert linked == []
    assert not [t for t, _ in page.tags if t in {"link", "iframe", "object", "embed", "img"}]
    assert not re.search(r"url\(|@import|https?://(?!www\.w3\.org/2000/svg)", html(demo_report))


def test_content_security_policy_allows_only_the_page_script(demo_report: Report) -> None:
    page = _Page(html(demo_report))
    (policy,) = [a["content"] for t, a in page.tags if t == "meta" and a.get("http-equiv") == "Content-Security-Policy"]
    (script,) = page.scripts
    digest = base64.b64encode(hashlib.sha256(script.encode("utf-8")).digest()).decode("ascii")
    assert f"script-src 'sha256-{digest}'" in policy and "default-src 'none'" in policy


def test_hostile_text_is_shown_escaped_and_adds_no_element(hostile_report: Report) -> None:
    document = html(hostile_report)
    page = _Page(document)
    assert [t for t, _ in page.tags].count("script") == 1  # ours
    assert not [t for t, _ in page.tags if t == "img"]
    assert not [a for _, a in page.tags if any(k.startswith("on") for k in a)]
    text = "".join(page.text)
    assert SCRIPT_IN_PDF in text and ONERROR_IN_PDF in text  # shown as characters
    assert "onerror=alert(7)> & co.pdf" in text  # the source file's name too
    assert "\x1b" not in document and "\\x1b[31m" in text  # the draft's terminal escape made visible
