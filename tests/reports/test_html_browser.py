"""The HTML report in a real browser: Debian's chromium, headless, driven by Playwright.

What a reader does is what is checked: every claim and check is on the page, the band and
reason filters hide what they should (so the page's script runs under its own
Content-Security-Policy), the folded passages open, and a page built from a PDF and a
draft that carry ``<script>`` and ``onerror=`` runs nothing and shows those characters.
Screenshots of both pages are kept in bench/out/report-html/ (git-ignored; ``pytest -s``
prints the paths).

Playwright drives the system browser (``executable_path``); no browser is downloaded.
Without chromium the tests fail and say how to get it (``make browser``): they are never
skipped.
"""

from __future__ import annotations

import os
import shutil
from collections import Counter
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest

from sourcecheck.model import Report
from sourcecheck.reports import html
from tests.reports.conftest import ONERROR_IN_PDF, SCRIPT_IN_PDF
from tests.test_pipeline import planted_rows

SCREENSHOTS = Path(__file__).resolve().parents[2] / "bench" / "out" / "report-html"


def _chromium() -> str:
    found = os.environ.get("SOURCECHECK_CHROMIUM") or shutil.which("chromium") or shutil.which("chromium-browser")
    if not found:
        pytest.fail("no chromium to test the HTML report in: run `make browser` (Debian's chromium via apt-get)")
    return found


@pytest.fixture(scope="module")
def browser() -> Iterator[Any]:
    try:
        from playwright.sync_api import sync_playwright
    except ImportError:
        pytest.fail("playwright is not installed: `pip install -e '.[dev]'` installs it")
    with sync_playwright() as playwright:
        # --no-sandbox: CI runs as root, where chromium refuses its sandbox.
        launched = playwright.chromium.launch(executable_path=_chromium(), args=["--no-sandbox"])
        yield launched
        launched.close()


class _Opened:
    """A report opened in a fresh page, with what the page said and asked on the way."""

    def __init__(self, browser: Any, report: Report, folder: Path) -> None:
        self.file = folder / "report.html"
        self.file.write_text(html(report), encoding="utf-8")
        self.page = browser.new_page(viewport={"width": 1100, "height": 1400})
        self.console: list[str] = []
        self.errors: list[str] = []
        self.dialogs: list[str] = []
        self.page.on("console", lambda message: self.console.append(f"{message.type}: {message.text}"))
        self.page.on("pageerror", lambda error: self.errors.append(str(error)))
        self.page.on("dialog", self._dialog)
        self.page.goto(self.file.as_uri())
        self.page.wait_for_load_state("load")

    def _dialog(self, dialog: Any) -> None:
        self.dialogs.append(dialog.message)
        dialog.dismiss()

    def count(self, selector: str) -> int:
        return int(self.page.locator(selector).count())

    def shown(self, selector: str) -> int:
        return int(self.page.locator(f"{selector}:visible").count())

    def tick(self, name: str, value: str, on: bool) -> None:
        self.page.locator(f'#filters input[name="{name}"][value="{value}"]').set_checked(on)


@pytest.fixture
def demo_page(browser: Any, demo_report: Report, tmp_path: Path) -> Iterator[_Opened]:
    opened = _Opened(browser, demo_report, tmp_path)
    yield opened
    opened.page.close()


def test_every_claim_and_check_is_on_the_page(demo_page: _Opened) -> None:
    rows = planted_rows()  # sample_manuscript/PLANTED.md
    assert demo_page.shown("article.claim") == len({r["snippet"] for r in rows}) == 21
    assert demo_page.shown("section.check") == len(rows) == 23
    bands = demo_page.page.eval_on_selector_all("section.check", "els => els.map(e => e.dataset.band)")
    assert Counter(bands) == Counter(r["band"] for r in rows)
    bars = demo_page.page.eval_on_selector_all(
        "#tally-chart .bar", "els => els.map(e => [e.dataset.band, e.querySelector('.count').textContent])"
    )
    assert dict(bars) == {band: str(n) for band, n in Counter(r["band"] for r in rows).items()}
    assert demo_page.errors == [] and not [c for c in demo_page.console if c.startswith("error")]
    SCREENSHOTS.mkdir(parents=True, exist_ok=True)
    shot = SCREENSHOTS / "demo.png"
    demo_page.page.screenshot(path=str(shot))
    print(f"screenshot of the demo report: {shot}")
    assert shot.stat().st_size > 10_000


def test_band_filter_hides_the_unticked_band_and_claims_left_empty(demo_page: _Opened) -> None:
    rows = planted_rows()
    flagged_checks = [r for r in rows if r["band"] != "anchored"]
    flagged_claims = {r["snippet"] for r in flagged_checks}
    demo_page.tick("band", "anchored", on=False)
    assert demo_page.shown("section.check") == len(flagged_checks) == 13
    assert demo_page.shown("section.band-anchored") == 0
    assert demo_page.shown("article.claim") == len(flagged_claims)
    assert demo_page.page.text_content("#shown-count") == "13"
    demo_page.tick("band", "anchored", on=True)
    assert demo_page.shown("section.check") == 23


def test_reason_filter_hides_checks_with_only_that_reason(demo_page: _Opened) -> None:
    # PLANTED.md row 9 is the one number-mismatch: its claim has no other check.
    demo_page.tick("reason", "number-mismatch", on=False)
    assert demo_page.shown('section.check[data-reasons="number-mismatch"]') == 0
    assert demo_page.shown("section.check") == 22
    assert demo_page.shown("article.claim") == 20


def test_next_closest_passages_are_folded_until_opened(demo_page: _Opened) -> None:
    folded = demo_page.page.locator("details.more").first
    assert not folded.locator(".passage").first.is_visible()
    folded.locator("summary").click()
    assert folded.locator(".passage").first.is_visible()


def test_hostile_page_runs_nothing_and_shows_the_characters(
    browser: Any, hostile_report: Report, tmp_path: Path
) -> None:
    opened = _Opened(browser, hostile_report, tmp_path)
    page = opened.page
    assert page.evaluate("typeof window.__injected") == "undefined"  # no script of the PDF or the draft ran
    assert opened.dialogs == []  # no alert()
    assert page.evaluate("document.scripts.length") == 1 and opened.count("img") == 0
    handlers = "[...document.querySelectorAll('*')].filter(e => e.getAttributeNames().some(n => n.startsWith('on')))"
    assert page.evaluate(f"{handlers}.length") == 0
    shown = page.inner_text("body")
    assert SCRIPT_IN_PDF in shown and ONERROR_IN_PDF in shown
    assert "\\x1b[31m" in shown
    # Nothing was even blocked by the page's Content-Security-Policy: the escaping held on its own.
    assert not [c for c in opened.console if "Content Security Policy" in c]
    assert opened.errors == []
    opened.tick("band", "conflict", on=False)  # and the page's own script still works
    assert page.text_content("#shown-count") == "1"
    SCREENSHOTS.mkdir(parents=True, exist_ok=True)
    page.screenshot(path=str(SCREENSHOTS / "hostile.png"), full_page=True)
    print(f"screenshot of the hostile report: {SCREENSHOTS / 'hostile.png'}")
    page.close()
