"""The review file: checks a person has read and accepted, kept beside the draft.

``paper.md`` gets ``paper.md.sourcecheck-review.toml``: TOML, one table per accepted
check, sorted by fingerprint, so it reads well, diffs line by line and merges like any
text file under version control. An entry counts only while its fingerprint holds: the
SHA-256 of the claim's sentence, the cited reference (key and entry text) and the text of
the passage shown as evidence, each with its white space collapsed and Unicode in NFC.
Change any of them and the check is shown and counted again, because what the person
accepted is no longer what the tool sees.
"""

from __future__ import annotations

import hashlib
import tomllib
import unicodedata
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import tomli_w

from sourcecheck.errors import SettingsError
from sourcecheck.model import Check, Claim, Report, Review

REVIEW_SUFFIX = ".sourcecheck-review.toml"
_HEADER = (
    "# Checks a person has read and accepted (sourcecheck review accept / list / forget).\n"
    "# One table per check, keyed by the fingerprint of its claim, reference and evidence;\n"
    "# an entry stops counting when any of them changes. Notes may be edited by hand.\n\n"
)
_FIELDS = ("claim", "citation", "text", "note", "accepted_on")


@dataclass(frozen=True)
class Acceptance:
    """One accepted check: the fingerprint it holds for, and what a person wrote about it.

    ``claim``, ``citation`` and ``text`` are what the check was when accepted, kept for
    the person reading the file; only ``fingerprint`` decides whether it still applies.
    """

    fingerprint: str
    claim: str
    citation: str
    text: str
    note: str
    accepted_on: str


def review_path(draft: Path) -> Path:
    """The review file of ``draft``: beside it, named after it."""
    return draft.with_name(draft.name + REVIEW_SUFFIX)


def _normal(text: str) -> str:
    return " ".join(unicodedata.normalize("NFC", text).split())


def fingerprint(claim: Claim, check: Check) -> str:
    """SHA-256 (hex) of the claim's text, the reference's key and entry, and the evidence shown."""
    reference = check.reference
    parts = [
        _normal(claim.text),
        reference.key if reference else check.citation.label,
        _normal(reference.text) if reference else "",
        _normal(check.evidence[0].text) if check.evidence else "",
    ]
    return hashlib.sha256("\x1f".join(parts).encode("utf-8")).hexdigest()


def load_reviews(path: Path) -> dict[str, Acceptance]:
    """The accepted checks in ``path`` by fingerprint; none when the file does not exist."""
    if not path.exists():
        return {}
    try:
        data = tomllib.loads(path.read_text(encoding="utf-8"))
    except (OSError, UnicodeDecodeError, tomllib.TOMLDecodeError) as exc:
        raise SettingsError(f"{path}: review file cannot be read ({exc})") from exc
    tables = data.get("accepted", {})
    if not isinstance(tables, dict):
        raise SettingsError(f"{path}: 'accepted' must be a table of tables")
    found: dict[str, Acceptance] = {}
    for key, table in tables.items():
        if not isinstance(table, dict) or not all(isinstance(table.get(f, ""), str) for f in _FIELDS):
            raise SettingsError(f"{path}: entry {key} must be a table of strings ({', '.join(_FIELDS)})")
        found[key] = Acceptance(key, *(str(table.get(f, "")) for f in _FIELDS))
    return found


def save_reviews(path: Path, entries: dict[str, Acceptance]) -> None:
    """Write ``entries`` sorted by fingerprint; remove the file when none are left."""
    if not entries:
        path.unlink(missing_ok=True)
        return
    tables: dict[str, Any] = {key: {f: getattr(entries[key], f) for f in _FIELDS} for key in sorted(entries)}
    path.write_text(_HEADER + tomli_w.dumps({"accepted": tables}), encoding="utf-8")


#: The note an ignore comment gives its checks.
IGNORE_NOTE = "marked with an ignore comment in the draft"


def apply_reviews(report: Report, entries: dict[str, Acceptance]) -> list[Acceptance]:
    """Mark the checks of ``report`` that a person accepted; return the entries that no longer hold.

    A check is reviewed when its claim carries an ignore comment or its fingerprint is in
    ``entries``. An entry that matches no check (the claim, reference or evidence changed,
    or the sentence is gone) is returned so the person can be told it no longer applies.
    """
    used: set[str] = set()
    for result in report.claims:
        for check in result.checks:
            if result.claim.ignored:
                check.reviewed = Review(note=IGNORE_NOTE, origin="ignore-comment")
                continue
            key = fingerprint(result.claim, check)
            entry = entries.get(key)
            if entry is not None:
                used.add(key)
                check.reviewed = Review(
                    note=entry.note, origin="review-file", fingerprint=key, accepted_on=entry.accepted_on
                )
    return [entry for key, entry in sorted(entries.items()) if key not in used]
