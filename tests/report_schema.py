"""Every JSON report the tests produce is validated against the shipped schema.

``install()`` wraps :func:`sourcecheck.reports.json_report.to_dict` (and the face's name
for it) so each report built anywhere in the test session, through the CLI, ``dumps``
or ``to_dict`` itself, is checked against ``sourcecheck/reports/report.schema.json``
with jsonschema (JSON Schema draft 2020-12). A report that breaks the contract fails
the test that made it.
"""

from __future__ import annotations

import functools
import json
from importlib import resources
from typing import Any

import jsonschema

import sourcecheck.reports
from sourcecheck.reports import json_report

VALIDATED = {"count": 0}


@functools.cache
def schema() -> dict[str, Any]:
    text = resources.files("sourcecheck.reports").joinpath("report.schema.json").read_text(encoding="utf-8")
    loaded: dict[str, Any] = json.loads(text)
    jsonschema.Draft202012Validator.check_schema(loaded)
    return loaded


def validate(data: dict[str, Any]) -> None:
    jsonschema.Draft202012Validator(schema()).validate(data)
    VALIDATED["count"] += 1


def install() -> None:
    original = json_report.to_dict
    if getattr(original, "validates_schema", False):
        return

    @functools.wraps(original)
    def to_dict(report: Any) -> dict[str, Any]:
        data = original(report)
        validate(data)
        return data

    to_dict.validates_schema = True  # type: ignore[attr-defined]
    json_report.to_dict = to_dict  # type: ignore[assignment]
    sourcecheck.reports.to_dict = to_dict  # type: ignore[assignment]
