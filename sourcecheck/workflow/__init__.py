"""The workflow around a check: gates, review state, settings files and batches of drafts.

What authors, reviewers and editors do with the reports, rather than how a claim is
judged: fail a build on a band (:mod:`.gate`), remember checks a person accepted
(:mod:`.review_file`), read ``[tool.sourcecheck]`` settings (:mod:`.config`), and expand
a folder into drafts (:mod:`.batch`). It reads the vocabulary only, never a stage.
"""

from __future__ import annotations

from sourcecheck.workflow.batch import expand_drafts, report_names
from sourcecheck.workflow.config import Settings, find_settings_file, known_keys, load_settings, merge
from sourcecheck.workflow.gate import GATE_BANDS, SEVERITY, at_or_above, gate_failures
from sourcecheck.workflow.review_file import (
    IGNORE_NOTE,
    REVIEW_SUFFIX,
    Acceptance,
    apply_reviews,
    fingerprint,
    load_reviews,
    review_path,
    save_reviews,
)

__all__ = [
    "GATE_BANDS",
    "IGNORE_NOTE",
    "REVIEW_SUFFIX",
    "SEVERITY",
    "Acceptance",
    "Settings",
    "apply_reviews",
    "at_or_above",
    "expand_drafts",
    "find_settings_file",
    "fingerprint",
    "gate_failures",
    "known_keys",
    "load_reviews",
    "load_settings",
    "merge",
    "report_names",
    "review_path",
    "save_reviews",
]
