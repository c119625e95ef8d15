"""The SARIF report validates against the official SARIF 2.1.0 schema and says what the bands say.

Outside reference: the JSON Schema of SARIF 2.1.0 as OASIS publishes it, read from the
shared data folder (``../shared/data/schemas/sarif-schema-2.1.0.json``, see its README),
checked with jsonschema's Draft 4 validator as the file's ``$schema`` asks, with the
``uri`` format checked (rfc3986-validator) and every artifact URI checked as an RFC 3986
URI-reference.
"""

from __future__ import annotations

import functools
import json
from collections import Counter
from dataclasses import replace
from pathlib import Path
from typing import Any

import jsonschema
import pytest
from rfc3986_validator import validate_rfc3986

from sourcecheck.model import Report
from sourcecheck.reports import CAUTION, sarif, to_sarif
from tests.reports.conftest import ANSI_IN_DRAFT
from tests.reports.sample_report import sample_report
from tests.test_pipeline import planted_rows

SCHEMA_PATH = Path(__file__).resolve().parents[3] / "shared" / "data" / "schemas" / "sarif-schema-2.1.0.json"
LEVEL = {"conflict": "error", "loose": "warning", "adrift": "warning", "unverifiable": "note"}


@functools.cache
def _validator() -> jsonschema.Draft4Validator:
    if not SCHEMA_PATH.is_file():
        pytest.fail(f"the SARIF 2.1.0 schema is not at {SCHEMA_PATH} (the shared data folder beside the repository)")
    schema = json.loads(SCHEMA_PATH.read_text(encoding="utf-8"))
    jsonschema.Draft4Validator.check_schema(schema)
    return jsonschema.Draft4Validator(schema, format_checker=jsonschema.Draft4Validator.FORMAT_CHECKER)


def _valid_log(report: Report) -> dict[str, Any]:
    """The report's SARIF log, parsed from the text the CLI writes, after checking it against the standard."""
    log: dict[str, Any] = json.loads(sarif(report))
    assert "uri" in jsonschema.Draft4Validator.FORMAT_CHECKER.checkers  # else `format: uri` would pass unchecked
    errors = sorted(_validator().iter_errors(log), key=str)
    assert errors == [], errors[0].message if errors else ""
    for result in log["runs"][0]["results"]:
        for location in result["locations"]:
            uri = location["physicalLocation"]["artifactLocation"]["uri"]
            assert validate_rfc3986(uri, rule="URI_reference"), uri
    return log


def test_demo_has_one_result_per_check_that_is_not_anchored(demo_report: Report) -> None:
    log = _valid_log(demo_report)
    results = log["runs"][0]["results"]
    planted = [r for r in planted_rows() if r["band"] != "anchored"]  # sample_manuscript/PLANTED.md
    assert len(results) == len(planted) == 13
    assert Counter(r["properties"]["band"] for r in results) == Counter(r["band"] for r in planted)
    assert Counter(r["level"] for r in results) == Counter(LEVEL[r["band"]] for r in planted)


def test_demo_results_name_the_planted_reason_and_the_draft_line(demo_report: Report) -> None:
    results = _valid_log(demo_report)["runs"][0]["results"]
    found = {(r["ruleId"], r["locations"][0]["physicalLocation"]["region"]["startLine"]) for r in results}
    for row in planted_rows():
        if row["band"] != "anchored" and row["reason"] != "-":
            assert (row["reason"], int(row["line"])) in found, row
    uris = {r["locations"][0]["physicalLocation"]["artifactLocation"]["uri"] for r in results}
    assert len(uris) == 1 and uris.pop().endswith("sample_manuscript/draft.md")


def test_rules_describe_every_rule_id_and_the_run_is_ours(demo_report: Report) -> None:
    run = _valid_log(demo_report)["runs"][0]
    rules = run["tool"]["driver"]["rules"]
    assert run["tool"]["driver"]["name"] == "sourcecheck"
    assert run["properties"]["caution"] == CAUTION
    for result in run["results"]:
        rule = rules[result["ruleIndex"]]
        assert rule["id"] == result["ruleId"]
        assert len(rule["shortDescription"]["text"]) > 20


def test_hand_built_report_levels_follow_the_documented_mapping() -> None:
    results = _valid_log(sample_report())["runs"][0]["results"]
    assert [(r["ruleId"], r["level"]) for r in results] == [
        ("number-mismatch", "error"),
        ("source-missing", "note"),
        ("marker-unresolved", "note"),
    ]
    assert results[0]["locations"][0]["physicalLocation"] == {
        "artifactLocation": {"uri": "draft.md"},
        "region": {"startLine": 4},
    }


def test_included_file_with_odd_characters_is_the_location_and_a_valid_uri() -> None:
    report = sample_report()
    first = report.claims[0]
    report.claims[0] = replace(first, claim=replace(first.claim, file="chapters/part one #2?.tex"))
    log = _valid_log(report)
    uri = log["runs"][0]["results"][0]["locations"][0]["physicalLocation"]["artifactLocation"]["uri"]
    assert uri == "chapters/part%20one%20%232%3F.tex"


def test_hostile_text_stays_data_and_controls_are_visible(hostile_report: Report) -> None:
    log = _valid_log(hostile_report)
    messages = [r["message"]["text"] for r in log["runs"][0]["results"]]
    assert len(messages) == 2
    assert all(m.isprintable() for m in messages)  # no ESC reaches a reviewer's screen
    assert any("\\x1b[31m" in m for m in messages) and not any(ANSI_IN_DRAFT in m for m in messages)
    assert to_sarif(hostile_report)["runs"][0]["results"][0]["properties"]["source"].endswith(
        "onerror=alert(7)> & co.pdf"
    )
