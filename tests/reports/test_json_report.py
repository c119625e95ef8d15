"""The JSON report keeps its contract: the schema shipped in sourcecheck/reports/report.schema.json."""

import json
from dataclasses import replace

import pytest

from sourcecheck.model import MatchRefusal, Review
from sourcecheck.reports.caution import CAUTION
from sourcecheck.reports.json_report import SCHEMA, dumps
from tests.reports.sample_report import sample_report


def test_top_level_fields_of_the_contract() -> None:
    data = json.loads(dumps(sample_report()))
    assert data["schema"] == SCHEMA == "sourcecheck.report/1"
    for key in ("draft", "sources", "model", "claims", "references", "unused_sources", "problems"):
        assert key in data
    assert data["model"] == {"name": "all-MiniLM-L6-v2", "path": "/models/minilm", "backend": "onnx-int8"}
    assert data["caution"] == CAUTION


def test_claims_and_checks_carry_contract_fields() -> None:
    data = json.loads(dumps(sample_report()))
    claim = data["claims"][0]
    assert claim["id"] == "c1" and claim["location"] == {"line": 4, "unit": "line"}
    check = claim["checks"][0]
    assert check["citation"] == "[1]"
    assert check["reference"]["key"] == "1" and check["reference"]["year"] == 2021
    assert check["band"] == "conflict" and 0.0 <= check["score"] <= 1.0
    assert check["reasons"] == [{"code": "number-mismatch", "message": "claim says 23%, source says 18% (p. 4)"}]
    assert check["evidence"][0]["page"] == 4
    assert len(data["claims"][1]["checks"]) == 2  # one check per cited work
    assert data["claims"][1]["checks"][1]["reference"] is None
    assert check["reviewed"] is None  # nobody accepted it


def test_an_accepted_check_carries_its_note_and_fingerprint() -> None:
    report = sample_report()
    report.claims[0].checks[0].reviewed = Review("18% is the earlier count", "review-file", "ab" * 32, "2026-12-01")
    report.claims[1].checks[0].reviewed = Review("marked in the draft", "ignore-comment")
    data = json.loads(dumps(report))
    assert data["claims"][0]["checks"][0]["reviewed"] == {
        "note": "18% is the earlier count",
        "origin": "review-file",
        "fingerprint": "ab" * 32,
        "accepted_on": "2026-12-01",
    }
    assert data["claims"][1]["checks"][0]["reviewed"] == {"note": "marked in the draft", "origin": "ignore-comment"}


def test_a_word_draft_names_paragraphs() -> None:
    report = sample_report()
    report.claims[0].claim = replace(report.claims[0].claim, unit="paragraph")
    assert json.loads(dumps(report))["claims"][0]["location"] == {"line": 4, "unit": "paragraph"}


def test_references_unused_sources_and_problems() -> None:
    data = json.loads(dumps(sample_report()))
    refs = {r["key"]: r for r in data["references"]}
    assert refs["1"]["source"] == "src/ferrow.pdf" and refs["1"]["matched_by"] == "doi"
    assert refs["2"]["source"] is None and refs["2"]["cited"] is True
    assert refs["3"]["cited"] is False
    assert data["unused_sources"] == ["src/orphan.pdf"]
    assert data["problems"] == [{"file": "src/broken.pdf", "message": "not a PDF (no %PDF- header)"}]
    assert data["summary"]["conflict"] == 1 and data["summary"]["unverifiable"] == 2


def _with_printed_page(printed: str | None) -> dict:
    report = sample_report()
    check = report.claims[0].checks[0]
    check.evidence = [replace(e, page=2, printed_page=printed) for e in check.evidence]
    return json.loads(dumps(report))["claims"][0]["checks"][0]["evidence"][0]


def test_evidence_keeps_the_pdf_page_and_adds_the_printed_one_when_known() -> None:
    # report.schema.json: "page" is the 1-based page of the PDF; "printed_page" is an added field.
    item = _with_printed_page("306")
    assert item["page"] == 2 and item["printed_page"] == "306"
    assert "printed_page" not in _with_printed_page(None)


def test_evidence_names_its_section_only_when_known() -> None:
    # report.schema.json: fields are only ever added; "section" is one, absent when unknown.
    report = sample_report()
    check = report.claims[0].checks[0]
    assert "section" not in json.loads(dumps(report))["claims"][0]["checks"][0]["evidence"][0]
    check.evidence = [replace(e, section="results") for e in check.evidence]
    assert json.loads(dumps(report))["claims"][0]["checks"][0]["evidence"][0]["section"] == "results"


def test_every_report_in_the_tests_is_validated_against_the_schema() -> None:
    # conftest installs the validating wrapper before any test module imports to_dict.
    from sourcecheck.reports import json_report
    from tests import report_schema

    before = report_schema.VALIDATED["count"]
    json.loads(dumps(sample_report()))
    assert getattr(json_report.to_dict, "validates_schema", False)
    assert report_schema.VALIDATED["count"] == before + 1


@pytest.mark.parametrize("field", ["band", "reasons", "score"])
def test_the_schema_rejects_a_check_without_a_contract_field(field: str) -> None:
    import jsonschema

    from tests import report_schema

    data = json.loads(dumps(sample_report()))
    del data["claims"][0]["checks"][0][field]
    with pytest.raises(jsonschema.ValidationError):
        report_schema.validate(data)


def test_the_schema_rejects_an_unknown_band() -> None:
    import jsonschema

    from tests import report_schema

    data = json.loads(dumps(sample_report()))
    data["claims"][0]["checks"][0]["band"] = "fine"
    with pytest.raises(jsonschema.ValidationError):
        report_schema.validate(data)


def test_references_carry_match_confidence_or_the_refusal() -> None:
    report = sample_report()
    report.matches["1"] = replace(report.matches["1"], confidence=0.996, detail="DOI in the file's metadata")
    report.refusals["2"] = MatchRefusal(
        "2", "src/orphan.pdf", "closest is src/orphan.pdf, but the evidence is too weak"
    )
    refs = {r["key"]: r for r in json.loads(dumps(report))["references"]}
    assert (refs["1"]["confidence"], refs["1"]["match_detail"]) == (0.996, "DOI in the file's metadata")
    assert "closest_source" not in refs["1"]
    assert refs["2"]["closest_source"] == "src/orphan.pdf"
    assert refs["2"]["refused_because"].startswith("closest is src/orphan.pdf")
    assert "confidence" not in refs["2"] and "closest_source" not in refs["3"]
