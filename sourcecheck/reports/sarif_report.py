"""The SARIF 2.1.0 report: flagged checks as results that code-review pipelines can show inline.

SARIF (Static Analysis Results Interchange Format, OASIS Standard 2.1.0) is what review
and CI systems already read, so a manuscript kept in a repository gets its flagged
citations annotated on the draft's lines. One result per check that is not ``anchored``;
``ruleId`` is the reason code that set the band (the judge lists it first), and
``tool.driver.rules`` describes every code.

Level by band (our mapping; SARIF's levels are error, warning, note and none):

============  =======  ==================================================================
band          level    why
============  =======  ==================================================================
conflict      error    the source says something else: a value, a negation, a direction
loose         warning  the backing is incomplete; the claim may still be right
adrift        warning  the cited source seems off-topic; often a wrong reference
unverifiable  note     nothing could be checked (no entry, no PDF): a to-do, not a finding
============  =======  ==================================================================
"""

from __future__ import annotations

import json
from importlib.metadata import PackageNotFoundError, version
from pathlib import PurePath
from typing import Any
from urllib.parse import quote

from sourcecheck.model import Band, Check, ClaimResult, Report
from sourcecheck.reports.caution import CAUTION
from sourcecheck.reports.wording import BAND_MEANINGS, REASON_CODES, is_flagged, rule_code, where
from sourcecheck.text import visible

SARIF_VERSION = "2.1.0"
#: The schema's address as the OASIS standard publishes it (its ``$id`` in the shared copy).
SARIF_SCHEMA_URI = "https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json"

LEVELS: dict[Band, str] = {
    Band.CONFLICT: "error",
    Band.LOOSE: "warning",
    Band.ADRIFT: "warning",
    Band.UNVERIFIABLE: "note",
}


def _tool_version() -> str:
    try:
        return version("sourcecheck")
    except PackageNotFoundError:  # run from a source tree that was never installed
        return "0+unknown"


def _uri(path: str) -> str:
    """A SARIF artifact URI: a relative path stays a relative reference, an absolute one a file: URI."""
    pure = PurePath(path)
    if pure.is_absolute():
        return "file://" + quote(pure.as_posix())
    return quote(pure.as_posix())


def _rule(code: str) -> dict[str, Any]:
    text = REASON_CODES.get(code, "A reason the judge gave for the band.")
    return {"id": code, "name": code, "shortDescription": {"text": text}, "fullDescription": {"text": text}}


def _message(result: ClaimResult, check: Check) -> str:
    """What a reviewer reads beside the line: the band, the reasons and where the closest passage is.

    Plain text (SARIF's ``message.text``), with control characters made visible."""
    parts = [f"{check.citation.label} is {check.band.value} (score {check.score:.2f}): {BAND_MEANINGS[check.band][0]}."]
    parts += [f"{r.code}: {r.message}." for r in check.reasons]
    if check.evidence:
        best = check.evidence[0]
        parts.append(f"Closest passage: {best.source}, {where(best)}.")
    parts.append(f"Claim: {result.claim.text}")
    return visible(" ".join(parts))


def _result(report: Report, result: ClaimResult, check: Check, rules: list[str]) -> dict[str, Any]:
    code = rule_code(check)
    location: dict[str, Any] = {"artifactLocation": {"uri": _uri(result.claim.file or report.draft)}}
    if result.claim.line >= 1:
        location["region"] = {"startLine": result.claim.line}
    return {
        "ruleId": code,
        "ruleIndex": rules.index(code),
        "level": LEVELS[check.band],
        "message": {"text": _message(result, check)},
        "locations": [{"physicalLocation": location}],
        "properties": {
            "claim": result.claim.id,
            "citation": check.citation.label,
            "band": check.band.value,
            "score": check.score,
            "source": check.source,
            "reasons": [r.code for r in check.reasons],
        },
    }


def to_sarif(report: Report) -> dict[str, Any]:
    """The report as a SARIF 2.1.0 log: one run, one result per flagged check."""
    flagged = [(r, c) for r in report.claims for c in r.checks if is_flagged(c)]
    rules = list(REASON_CODES)
    rules += sorted({rule_code(c) for _, c in flagged} - set(rules))
    return {
        "$schema": SARIF_SCHEMA_URI,
        "version": SARIF_VERSION,
        "runs": [
            {
                "tool": {
                    "driver": {
                        "name": "sourcecheck",
                        "version": _tool_version(),
                        "rules": [_rule(code) for code in rules],
                    }
                },
                "results": [_result(report, r, c, rules) for r, c in flagged],
                "properties": {"caution": CAUTION, "sources": report.sources},
            }
        ],
    }


def sarif(report: Report) -> str:
    """The SARIF log as indented UTF-8 JSON ending in a newline."""
    return json.dumps(to_sarif(report), ensure_ascii=False, indent=2) + "\n"
