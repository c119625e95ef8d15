"""sourcecheck: does each cited claim in a manuscript stand in the source it cites?

Everything runs on this machine: no network connection is ever opened. The one call::

    import sourcecheck

    report = sourcecheck.check("paper.md", "pdfs/")
    for result in report.claims:
        for check in result.checks:
            print(result.claim.id, check.band, check.reasons[0].message)

The tool advises; it does not prove error or misconduct: each band is a prompt to read
the cited passage, and the author's and the editor's judgment decides.
"""

from __future__ import annotations

from sourcecheck.api import Progress, check, check_many
from sourcecheck.errors import SourcecheckError
from sourcecheck.limits import Limits
from sourcecheck.model import (
    Band,
    Check,
    Citation,
    Claim,
    ClaimResult,
    Evidence,
    Problem,
    ReadOptions,
    Reason,
    Reference,
    Report,
    RunStats,
)

__version__ = "0.1.0"

__all__ = [
    "Band",
    "Check",
    "Citation",
    "Claim",
    "ClaimResult",
    "Evidence",
    "Limits",
    "Problem",
    "Progress",
    "ReadOptions",
    "Reason",
    "Reference",
    "Report",
    "RunStats",
    "SourcecheckError",
    "__version__",
    "check",
    "check_many",
]
