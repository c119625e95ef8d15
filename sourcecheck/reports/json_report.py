"""The JSON report: the contract downstream tools read, described by ``report.schema.json``.

Fields may be added; the ones in the contract keep their names until ``SCHEMA`` changes.
"""

from __future__ import annotations

import json
from typing import Any

from sourcecheck.model import Check, Evidence, Reference, Report, Review
from sourcecheck.reports.caution import CAUTION

SCHEMA = "sourcecheck.report/1"


def _reference(reference: Reference) -> dict[str, Any]:
    return {
        "key": reference.key,
        "text": reference.text,
        "title": reference.title,
        "authors": list(reference.authors),
        "year": reference.year,
        "doi": reference.doi,
    }


def _check(check: Check) -> dict[str, Any]:
    return {
        "citation": check.citation.label,
        "marker": check.citation.marker,
        "locator": check.citation.locator,
        "reference": _reference(check.reference) if check.reference else None,
        "source": check.source,
        "band": check.band.value,
        "score": check.score,
        "reasons": [{"code": r.code, "message": r.message} for r in check.reasons],
        "evidence": [_evidence(e) for e in check.evidence],
        "reviewed": _review(check.reviewed) if check.reviewed else None,
    }


def _review(review: Review) -> dict[str, Any]:
    """A person's acceptance: the note, where it came from, and (review file) fingerprint and date."""
    item: dict[str, Any] = {"note": review.note, "origin": review.origin}
    if review.fingerprint:
        item["fingerprint"] = review.fingerprint
    if review.accepted_on:
        item["accepted_on"] = review.accepted_on
    return item


def _evidence(evidence: Evidence) -> dict[str, Any]:
    """One evidence item; ``page`` is the PDF page, ``printed_page`` (only when known) the
    number printed on it, which is what a citation's "p. 306" refers to, and ``section``
    (only when known) the role of the section the passage stands in ("results")."""
    item: dict[str, Any] = {
        "text": evidence.text,
        "page": evidence.page,
        "score": evidence.score,
        "source": evidence.source,
    }
    if evidence.printed_page is not None:
        item["printed_page"] = evidence.printed_page
    if evidence.section:
        item["section"] = evidence.section
    return item


def _reference_entry(report: Report, reference: Reference, cited: bool) -> dict[str, Any]:
    """One reference list entry and its source file: ``matched_by`` is the method of the
    strongest evidence, ``confidence`` (0..1) weighs all of it, ``match_detail`` says what it
    was; an unmatched entry gets ``closest_source`` and ``refused_because`` instead."""
    match = report.matches.get(reference.key)
    item: dict[str, Any] = {
        "key": reference.key,
        "text": reference.text,
        "source": match.source if match else None,
        "matched_by": match.method.value if match else None,
        "cited": cited,
    }
    if match is not None:
        item["confidence"] = match.confidence
        item["match_detail"] = match.detail
    elif (refusal := report.refusals.get(reference.key)) is not None:
        item["closest_source"] = refusal.candidate
        item["refused_because"] = refusal.reason
    return item


def to_dict(report: Report) -> dict[str, Any]:
    """The report as plain JSON-ready data, in the contract's shape."""
    cited = report.cited_keys()
    return {
        "schema": SCHEMA,
        "caution": CAUTION,
        "draft": report.draft,
        "sources": report.sources,
        "model": {"name": report.model.name, "path": report.model.path, "backend": report.model.backend},
        "summary": {band.value: count for band, count in report.band_counts().items()},
        "claims": [
            {
                "id": result.claim.id,
                "text": result.claim.text,
                "location": {
                    "line": result.claim.line,
                    "unit": result.claim.unit,
                    **({"file": result.claim.file} if result.claim.file else {}),
                },
                "checks": [_check(c) for c in result.checks],
            }
            for result in report.claims
        ],
        "references": [_reference_entry(report, r, r.key in cited) for r in report.references],
        "unused_sources": list(report.unused_sources),
        "problems": [{"file": p.file, "message": p.message} for p in report.problems],
    }


def dumps(report: Report) -> str:
    """The report as an indented UTF-8 JSON document ending in a newline."""
    return json.dumps(to_dict(report), ensure_ascii=False, indent=2) + "\n"
