"""bench/limits.py: the limit counts exactly the verifier pairs a cold run read.

The cold run's own count (``RunStats.pairs_verified``, pairs not found in the cache) is the
reference: the pairs noted on a warm rerun must be as many, so the limit neither leaves the
verifier out nor charges it for readings the tool never made.
"""

from __future__ import annotations

from pathlib import Path

from sourcecheck.model import RunStats
from sourcecheck.pipeline import run
from tests.bench.scripts import load_script

limits = load_script("limits")
ROOT = Path(__file__).resolve().parents[2]


def test_verified_pairs_are_the_cold_runs_readings(tmp_path: Path) -> None:
    draft, sources = ROOT / "sample_manuscript" / "draft.md", ROOT / "sample_sources"
    stats = RunStats()
    run(draft, sources, cache_dir=tmp_path, stats=stats)
    assert stats.pairs_verified > 0
    pairs = limits.verified_pairs(draft, sources, tmp_path)
    assert len(pairs) == stats.pairs_verified
    assert all(isinstance(claim, str) and isinstance(sentence, str) for claim, sentence in pairs)
