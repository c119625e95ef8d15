"""Band rules: each band and its reason from hand-made evidence."""

from sourcecheck.judge.calibration import Calibration, load_calibration
from sourcecheck.judge.features import FEATURE_NAMES
from sourcecheck.judge.verdict import better_source_reason, judge, page_mismatch_reason, with_printed_pages
from sourcecheck.model import Band, Citation, Hit, Passage

# A transparent calibration for the rules: score rises with similarity and coverage.
CAL = Calibration(
    weights=(10.0, 4.0, -1.5, -3.0, -3.0, -1.5, -3.0, 0.0, 0.0),
    bias=-8.0,
    anchored_at=0.6,
    adrift_below=0.2,
    provenance="test",
)
CITE = Citation(marker="[1]", label="[1]", key="1")


def _hit(text: str, dense: float, coverage: float, page: int = 3, source: str = "a.pdf") -> Hit:
    return Hit(passage=Passage(source, page, text, 0), fused=dense, dense=dense, bm25=1.0, coverage=coverage)


def test_close_paraphrase_is_anchored_with_its_page() -> None:
    check = judge("Heron nests rose by 18%.", CITE, None, "a.pdf", [_hit("Heron nests rose by 18%.", 0.95, 1.0)], CAL)
    assert check.band is Band.ANCHORED
    assert check.reasons[0].code == "close-match" and "p. 3" in check.reasons[0].message
    assert check.evidence[0].page == 3


def test_changed_number_is_a_conflict_naming_both_values() -> None:
    hits = [_hit("Heron nests rose by 18% at the marsh.", 0.93, 0.9)]
    check = judge("Heron nests rose by 23% at the marsh.", CITE, None, "a.pdf", hits, CAL)
    assert check.band is Band.CONFLICT
    assert check.reasons[0].code == "number-mismatch"
    assert "23%" in check.reasons[0].message and "18%" in check.reasons[0].message


def test_number_absent_from_related_passage_is_loose() -> None:
    hits = [_hit("Heron nests rose at the marsh.", 0.9, 0.9)]
    check = judge("Heron nests rose at 31 marsh sites.", CITE, None, "a.pdf", hits, CAL)
    assert check.band is Band.LOOSE
    assert [r.code for r in check.reasons] == ["number-absent"]


def test_unrelated_passage_is_adrift() -> None:
    check = judge("Heron nests rose.", CITE, None, "a.pdf", [_hit("Salinity was measured weekly.", 0.1, 0.0)], CAL)
    assert check.band is Band.ADRIFT and check.reasons[0].code == "no-match"


def test_middling_evidence_is_loose_with_partial_match() -> None:
    check = judge("Heron nests rose.", CITE, None, "a.pdf", [_hit("Herons were seen.", 0.6, 0.4)], CAL)
    assert check.band is Band.LOOSE and check.reasons[0].code == "partial-match"


def test_no_passages_is_unverifiable() -> None:
    check = judge("Heron nests rose.", CITE, None, "a.pdf", [], CAL)
    assert check.band is Band.UNVERIFIABLE


def test_better_source_is_named_when_cited_one_is_adrift() -> None:
    check = judge("Heron nests rose.", CITE, None, "a.pdf", [_hit("Salinity was measured.", 0.1, 0.0)], CAL)
    reason = better_source_reason(check, _hit("Heron nests rose.", 0.95, 1.0, page=2, source="b.pdf"), "x", CAL)
    assert reason is not None and reason.code == "better-source" and "b.pdf" in reason.message


def test_shipped_calibration_matches_the_feature_list() -> None:
    shipped = load_calibration()
    assert len(shipped.weights) == len(FEATURE_NAMES)
    assert 0.0 < shipped.adrift_below < shipped.anchored_at < 1.0


# --- page locators ---------------------------------------------------------------------


def test_page_mismatch_names_the_cited_and_the_printed_page() -> None:
    # The backing passage sits on PDF page 1, which prints "305"; the author cited p. 306.
    backing = _hit("Heron nests rose by 18%.", 0.95, 1.0, page=1)
    check = judge("Heron nests rose by 18%.", CITE, None, "a.pdf", [backing], CAL)
    reason = page_mismatch_reason(check, "p. 306", backing, ("305", "306"))
    assert reason is not None and reason.code == "page-mismatch"
    assert reason.message == "cited p. 306, but the closest passage is on p. 305 (PDF p. 1)"
    plain = page_mismatch_reason(check, "p.~7", _hit("x", 0.9, 1.0, page=4), ())
    assert plain is not None and plain.message == "cited p. 7, but the closest passage is on p. 4"


def test_page_mismatch_says_when_the_cited_page_is_not_in_the_source() -> None:
    backing = _hit("Heron nests rose by 18%.", 0.95, 1.0, page=2)
    check = judge("Heron nests rose by 18%.", CITE, None, "a.pdf", [backing], CAL)
    reason = page_mismatch_reason(check, "p. 999", backing, (), page_exists=False)
    assert reason is not None and "does not have" in reason.message and "p. 2" in reason.message


def test_no_page_mismatch_for_an_adrift_claim() -> None:
    stray = _hit("Salinity was measured weekly.", 0.1, 0.0, page=2)
    check = judge("Heron nests rose.", CITE, None, "a.pdf", [stray], CAL)
    assert check.band is Band.ADRIFT
    assert page_mismatch_reason(check, "p. 7", stray, ()) is None


def test_evidence_gets_the_printed_page_of_its_pdf_page() -> None:
    hits = [_hit("Heron nests rose by 18%.", 0.95, 1.0, page=2), _hit("Herons nest.", 0.5, 0.5, page=3)]
    check = with_printed_pages(judge("Heron nests rose by 18%.", CITE, None, "a.pdf", hits, CAL), ("305", "306", None))
    assert [(e.page, e.printed_page) for e in check.evidence] == [(2, "306"), (3, None)]
    bare = with_printed_pages(judge("Heron nests rose by 18%.", CITE, None, "a.pdf", hits, CAL), ())
    assert [e.printed_page for e in bare.evidence] == [None, None]


def test_negated_finding_is_a_conflict() -> None:
    # Negation cues after the BioScope guidelines (Vincze et al., 2008; from memory): "did not".
    hits = [_hit("Scraping did not increase nest density on the heath plots.", 0.93, 0.9)]
    check = judge("Scraping increased nest density on the heath plots.", CITE, None, "a.pdf", hits, CAL)
    assert check.band is Band.CONFLICT
    assert "negation" in [r.code for r in check.reasons]


def test_hedged_source_makes_an_assertive_claim_loose() -> None:
    # Hedges after Hyland (1998) and BioScope (from memory): "may", "suggests".
    hits = [_hit("Warm soil may advance the emergence of heath bees.", 0.95, 1.0)]
    check = judge("Warm soil proves to advance the emergence of heath bees.", CITE, None, "a.pdf", hits, CAL)
    assert check.band is Band.LOOSE
    assert "overstated" in [r.code for r in check.reasons]
