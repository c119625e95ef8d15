"""The table printed after a run over several manuscripts: one row per manuscript, a column per band.

An editor screening a batch reads down the ``conflict`` and ``adrift`` columns first.
Laid out by hand in plain columns (no box drawing, no padding after the last column), so
the table pastes cleanly into an e-mail or a ticket and has no trailing spaces.
"""

from __future__ import annotations

from rich.console import Console
from rich.text import Text

from sourcecheck.model import BAND_SEVERITY, Report
from sourcecheck.reports.terminal import plural
from sourcecheck.text import visible


def summary_rows(reports: list[Report]) -> list[list[str]]:
    """Header and one row per report: manuscript, claims, checks, each band, reviewed, problems."""
    header = ["manuscript", "claims", "checks", *(band.value for band in BAND_SEVERITY), "reviewed", "problems"]
    rows = [header]
    for report in reports:
        counts = {band.value: n for band, n in report.band_counts().items()}
        checks = [c for r in report.claims for c in r.checks]
        rows.append(
            [
                visible(report.draft),
                str(len(report.claims)),
                str(len(checks)),
                *(str(counts[band.value]) for band in BAND_SEVERITY),
                str(sum(1 for c in checks if c.reviewed is not None)),
                str(len(report.problems)),
            ]
        )
    return rows


def render_summary(reports: list[Report], console: Console) -> None:
    """Print the table, the first column left-aligned and the counts right-aligned."""
    rows = summary_rows(reports)
    widths = [max(len(row[i]) for row in rows) for i in range(len(rows[0]))]
    for number, row in enumerate(rows):
        cells = [row[0].ljust(widths[0]), *(cell.rjust(width) for cell, width in zip(row[1:], widths[1:], strict=True))]
        console.print(Text("  ".join(cells).rstrip(), style="bold" if number == 0 else ""), soft_wrap=True)
    total = sum(len(r.claims) for r in reports)
    console.print(Text(f"{plural(len(reports), 'manuscript')}, {plural(total, 'claim')}"), soft_wrap=True)
