"""The review file: fingerprints, a readable sorted TOML file, and applying it to a report."""

from __future__ import annotations

import hashlib
import tomllib
from dataclasses import replace
from pathlib import Path

import pytest

from sourcecheck.errors import SettingsError
from sourcecheck.workflow import (
    IGNORE_NOTE,
    Acceptance,
    apply_reviews,
    fingerprint,
    load_reviews,
    review_path,
    save_reviews,
)
from tests.reports.sample_report import sample_report


def _entry(key: str, claim: str = "c1", note: str = "checked") -> Acceptance:
    return Acceptance(key, claim, "[1]", "Heron nests rose by 23% [1].", note, "2026-12-02")


def test_fingerprint_is_sha256_of_claim_reference_and_evidence() -> None:
    result = sample_report().claims[0]
    check = result.checks[0]
    assert check.reference is not None
    # Recomputed with hashlib (FIPS 180-4 SHA-256) from the documented parts, joined by U+001F.
    parts = [result.claim.text, "1", check.reference.text, check.evidence[0].text]
    assert fingerprint(result.claim, check) == hashlib.sha256("\x1f".join(parts).encode()).hexdigest()


def test_fingerprint_ignores_rewrapping_but_not_a_changed_word() -> None:
    result = sample_report().claims[0]
    check = result.checks[0]
    base = fingerprint(result.claim, check)
    rewrapped = replace(result.claim, text="Heron nests rose\n  by 23% [1].", id="c7", line=40)
    assert fingerprint(rewrapped, check) == base  # moved and rewrapped: still the same claim
    assert fingerprint(replace(result.claim, text="Heron nests rose by 25% [1]."), check) != base
    changed_evidence = replace(check, evidence=[replace(check.evidence[0], text="Heron nests rose by 19%.")])
    assert fingerprint(result.claim, changed_evidence) != base
    assert check.reference is not None
    changed_ref = replace(check, reference=replace(check.reference, text="[1] Another work, 2020."))
    assert fingerprint(result.claim, changed_ref) != base


def test_review_file_is_sorted_toml_beside_the_draft(tmp_path: Path) -> None:
    path = review_path(tmp_path / "paper.md")
    assert path.name == "paper.md.sourcecheck-review.toml"
    save_reviews(path, {"f" * 64: _entry("f" * 64, "c9"), "0" * 64: _entry("0" * 64, "c2", 'say "why"\nhere')})
    text = path.read_text(encoding="utf-8")
    assert text.index("0" * 64) < text.index("f" * 64)  # sorted, so additions diff locally
    data = tomllib.loads(text)  # the standard library's TOML 1.0 parser reads it back
    assert data["accepted"]["0" * 64]["note"] == 'say "why"\nhere'
    assert load_reviews(path) == {"0" * 64: _entry("0" * 64, "c2", 'say "why"\nhere'), "f" * 64: _entry("f" * 64, "c9")}
    save_reviews(path, {})
    assert not path.exists()  # nothing accepted: no file left behind


def test_a_malformed_review_file_is_one_clear_error(tmp_path: Path) -> None:
    path = tmp_path / "paper.md.sourcecheck-review.toml"
    path.write_text("[accepted\n", encoding="utf-8")
    with pytest.raises(SettingsError, match="review file cannot be read"):
        load_reviews(path)
    path.write_text("[accepted.abc]\nnote = 3\n", encoding="utf-8")
    with pytest.raises(SettingsError, match="entry abc must be a table of strings"):
        load_reviews(path)


def test_apply_marks_accepted_and_ignored_checks_and_returns_stale_entries() -> None:
    report = sample_report()
    first = report.claims[0]
    key = fingerprint(first.claim, first.checks[0])
    report.claims[1].claim = replace(report.claims[1].claim, ignored=True)
    stale = apply_reviews(report, {key: _entry(key, note="seen"), "9" * 64: _entry("9" * 64, "c5")})
    reviewed = first.checks[0].reviewed
    assert reviewed is not None and reviewed.note == "seen" and reviewed.origin == "review-file"
    assert reviewed.fingerprint == key and reviewed.accepted_on == "2026-12-02"
    assert all(c.reviewed is not None and c.reviewed.note == IGNORE_NOTE for c in report.claims[1].checks)
    assert [e.claim for e in stale] == ["c5"]
