"""Property tests of the citation-marker parser: any text gives markers that stand where they say."""

from __future__ import annotations

from hypothesis import given

from sourcecheck.claims.markers import MAX_RANGE, find_markers
from tests.strategies import draft_text


@given(draft_text)
def test_markers_are_in_order_do_not_overlap_and_quote_the_text(text: str) -> None:
    markers = find_markers(text)
    previous_end = 0
    for marker in markers:
        assert previous_end <= marker.start < marker.end <= len(text)
        assert text[marker.start : marker.end] == marker.text
        assert marker.cites  # a marker cites at least one work
        previous_end = marker.end


@given(draft_text)
def test_a_range_never_expands_past_its_bound(text: str) -> None:
    # "[1-5000]" keeps its two ends; no marker is ever a flood of expanded numbers.
    assert all(
        len(m.cites) <= max(MAX_RANGE + 1, m.text.count(",") + m.text.count(";") + 2) for m in find_markers(text)
    )
