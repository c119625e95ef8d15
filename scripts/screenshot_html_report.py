"""Take the README's picture of the HTML report: the demo's report in headless chromium.

Usage: ``python scripts/screenshot_html_report.py [report.html] [docs/html-report.png]``.
Make the report first (``sourcecheck check sample_manuscript/draft.md --sources
sample_sources --format html --output bench/out/demo.html``). The picture is the top of
the page (overview, filters, the first flagged claims), reduced to a 64-colour palette so
the PNG stays small in the repository. Needs chromium (``make browser``) and Playwright.
"""

from __future__ import annotations

import shutil
import sys
from io import BytesIO
from pathlib import Path

from PIL import Image
from playwright.sync_api import sync_playwright

ROOT = Path(__file__).resolve().parent.parent
WIDTH, HEIGHT = 1000, 1300
COLOURS = 64


def screenshot(report: Path, target: Path) -> int:
    """Write the PNG and return its size in bytes."""
    browser_path = shutil.which("chromium")
    if browser_path is None:
        raise SystemExit("screenshot_html_report: no chromium on PATH (make browser)")
    with sync_playwright() as playwright:
        browser = playwright.chromium.launch(executable_path=browser_path, args=["--no-sandbox"])
        page = browser.new_page(viewport={"width": WIDTH, "height": HEIGHT})
        page.goto(report.resolve().as_uri())
        raw = page.screenshot()
        browser.close()
    image = Image.open(BytesIO(raw)).convert("RGB").quantize(colors=COLOURS)
    target.parent.mkdir(parents=True, exist_ok=True)
    image.save(target, optimize=True)
    return target.stat().st_size


if __name__ == "__main__":
    source = Path(sys.argv[1]) if len(sys.argv) > 1 else ROOT / "bench" / "out" / "demo.html"
    out = Path(sys.argv[2]) if len(sys.argv) > 2 else ROOT / "docs" / "html-report.png"
    print(f"{out}: {screenshot(source, out)} bytes")
