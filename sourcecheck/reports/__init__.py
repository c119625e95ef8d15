"""The report stage: pure functions from a :class:`~sourcecheck.model.Report` to output.

The terminal report (:mod:`.terminal`, rich), the JSON contract (:mod:`.json_report`,
described by ``report.schema.json`` beside it), the reports people share and pipelines
read (:mod:`.html_report`, one self-contained page; :mod:`.markdown_report`, for a review
thread; :mod:`.sarif_report`, SARIF 2.1.0 for code-review tools), the progress bar the CLI
shows while sources are read, and the caution every report carries.
"""

from __future__ import annotations

from sourcecheck.reports.caution import CAUTION
from sourcecheck.reports.html_report import html
from sourcecheck.reports.json_report import SCHEMA, dumps, to_dict
from sourcecheck.reports.markdown_report import markdown
from sourcecheck.reports.progress import progress_bar
from sourcecheck.reports.sarif_report import sarif, to_sarif
from sourcecheck.reports.summary import render_summary, summary_rows
from sourcecheck.reports.terminal import LEGEND, plural, render, summary_line

__all__ = [
    "CAUTION",
    "LEGEND",
    "SCHEMA",
    "dumps",
    "html",
    "markdown",
    "plural",
    "progress_bar",
    "render",
    "render_summary",
    "sarif",
    "summary_line",
    "summary_rows",
    "to_dict",
    "to_sarif",
]
