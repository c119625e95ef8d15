"""End to end on the bundled demo: every planted case gets its planted band and reason.

The expectations are read from sample_manuscript/PLANTED.md, the table written when the
demo was planted, so the document and the test cannot drift apart.
"""

from __future__ import annotations

import re
import socket
import subprocess
import sys
from pathlib import Path

import pytest

import sourcecheck
from sourcecheck import RunStats
from sourcecheck.model import Band, Report
from sourcecheck.reports import dumps

ROOT = Path(__file__).resolve().parent.parent
DRAFT = ROOT / "sample_manuscript" / "draft.md"
SOURCES = ROOT / "sample_sources"


def planted_rows() -> list[dict[str, str]]:
    """The rows of the checks table in PLANTED.md."""
    rows = []
    for line in (ROOT / "sample_manuscript" / "PLANTED.md").read_text(encoding="utf-8").splitlines():
        cells = [c.strip() for c in line.strip().strip("|").split("|")]
        if len(cells) >= 9 and cells[0].isdigit():
            rows.append(
                {
                    "snippet": cells[1].strip("`"),
                    "line": cells[2],
                    "citation": cells[3],
                    "band": cells[4],
                    "reason": cells[5],
                    "file": cells[6],
                }
            )
    return rows


class _NetworkGuard:
    """Replaces every way of opening a connection with one that records and refuses."""

    def __init__(self, monkeypatch: pytest.MonkeyPatch) -> None:
        self.attempts: list[str] = []

        def refuse(*args: object, **kwargs: object) -> None:
            self.attempts.append(repr(args)[:80])
            raise OSError("network use is forbidden in sourcecheck")

        monkeypatch.setattr(socket.socket, "connect", refuse)
        monkeypatch.setattr(socket.socket, "connect_ex", refuse)
        monkeypatch.setattr(socket, "create_connection", refuse)
        monkeypatch.setattr(socket, "getaddrinfo", refuse)


@pytest.fixture(scope="module")
def demo_cache(tmp_path_factory: pytest.TempPathFactory) -> Path:
    return tmp_path_factory.mktemp("cache")


@pytest.fixture(scope="module")
def cold(demo_cache: Path) -> tuple[Report, RunStats, list[str]]:
    """The demo, cold cache, with all network access refused and recorded."""
    with pytest.MonkeyPatch.context() as patch:
        guard = _NetworkGuard(patch)
        stats = RunStats()
        report = sourcecheck.check(DRAFT, SOURCES, cache=demo_cache, stats=stats)
    return report, stats, guard.attempts


def _check_for(report: Report, snippet: str, citation: str):
    for result in report.claims:
        if snippet in result.claim.text:
            for check in result.checks:
                if check.citation.label == citation:
                    return check
    raise AssertionError(f"no check {citation} for a claim containing {snippet!r}")


def test_the_whole_run_opens_no_network_connection(cold) -> None:
    # README: everything runs offline; sourcecheck opens no network connection, ever.
    report, stats, attempts = cold
    assert attempts == []
    assert stats.model_loaded and stats.passages_embedded > 0  # the model really ran under the guard
    assert report.claims


@pytest.mark.parametrize("row", planted_rows(), ids=lambda r: f"{r['citation']}-{r['snippet'][:30]}")
def test_each_planted_case_gets_its_band_and_reason(cold, row: dict[str, str]) -> None:
    report = cold[0]
    check = _check_for(report, row["snippet"], row["citation"])
    assert check.band is Band(row["band"]), [r.message for r in check.reasons]
    if row["reason"] != "-":
        assert row["reason"] in [r.code for r in check.reasons]
    if row["band"] in ("anchored", "conflict", "loose") and not row["file"].startswith("-"):
        assert check.source is not None and check.source.endswith(row["file"])


def test_planted_table_covers_every_band_and_every_check(cold) -> None:
    report = cold[0]
    assert report.model.backend == "onnx-int8"  # the default: the planted bands hold on int8
    rows = planted_rows()
    assert {r["band"] for r in rows} == {b.value for b in Band}
    assert sum(len(r.checks) for r in report.claims) == len(rows)


def test_changed_number_reason_quotes_both_values(cold) -> None:
    check = _check_for(cold[0], "only 23% of nest entrances", "[1]")
    message = next(r.message for r in check.reasons if r.code == "number-mismatch")
    assert "23%" in message and "18%" in message and "p. 2" in message


def test_wrong_source_names_the_better_one(cold) -> None:
    check = _check_for(cold[0], "Males emerged on average 6 days", "[6]")
    reason = next(r for r in check.reasons if r.code == "better-source")
    assert "emergence_soil_temperature.pdf" in reason.message and "p. 2" in reason.message


def test_loose_ends_are_reported(cold) -> None:
    report = cold[0]
    assert [Path(p).name for p in report.unused_sources] == ["moss-recovery-after-burning.pdf"]
    assert [r.key for r in report.uncited_references()] == ["8"]
    assert [r.key for r in report.unmatched_references()] == ["7"]
    # The one cited reference without a file gets one line, naming its closest file.
    assert [p.message.split(":")[0] for p in report.problems] == ["reference '7' matched no source file"]
    assert report.refusals["7"].candidate is not None and report.refusals["7"].candidate in report.problems[0].message


def test_evidence_is_short_and_paged(cold) -> None:
    for result in cold[0].claims:
        for check in result.checks:
            for evidence in check.evidence:
                # sources/_passages.py: a passage is a few whole sentences, short enough for
                # the embedding model (common practice, no source).
                assert len(evidence.text.split()) <= 100
                assert evidence.page >= 1
            assert check.reasons, "every check says why"


def test_warm_run_embeds_nothing_and_loads_no_model(cold, demo_cache: Path) -> None:
    stats = RunStats()
    warm = sourcecheck.check(DRAFT, SOURCES, cache=demo_cache, stats=stats)
    assert stats.passages_embedded == 0 and stats.claims_embedded == 0
    assert stats.sources_read == 0 and stats.sources_from_cache == 7
    assert not stats.model_loaded
    bands = [(c.citation.label, c.band) for r in warm.claims for c in r.checks]
    assert bands == [(c.citation.label, c.band) for r in cold[0].claims for c in r.checks]


def test_warm_run_imports_no_model_library(cold, demo_cache: Path) -> None:
    # In a fresh interpreter, as a user's second run: no model runtime may even be imported.
    # (tokenizers, 20 ms to import, comes with the verifier's encoding module and is not one.)
    probe = (
        "import sys, sourcecheck\n"
        f"sourcecheck.check({str(DRAFT)!r}, {str(SOURCES)!r}, cache={str(demo_cache)!r})\n"
        "heavy = ('torch', 'onnxruntime', 'sentence_transformers', 'transformers')\n"
        "print(sorted(m for m in sys.modules if m.split('.')[0] in heavy))\n"
    )
    done = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, check=True, cwd=ROOT)
    assert done.stdout.strip() == "[]", done.stdout[-500:]


def test_parallel_reading_reports_what_a_serial_run_does(cold, tmp_path: Path) -> None:
    serial = sourcecheck.check(DRAFT, SOURCES, cache=tmp_path / "serial", jobs=1)
    parallel = sourcecheck.check(DRAFT, SOURCES, cache=tmp_path / "parallel", jobs=2)
    assert dumps(parallel) == dumps(serial)
    assert dumps(serial) == dumps(cold[0])


def test_corrupt_vector_store_is_rebuilt_with_a_warning(cold, demo_cache: Path, tmp_path: Path) -> None:
    import shutil

    cache = tmp_path / "cache"
    shutil.copytree(demo_cache, cache)
    victim = cache / "vectors.sqlite"
    for extra in cache.glob("vectors.sqlite-*"):
        extra.unlink()
    victim.write_bytes(b"not a database" * 100)
    stats = RunStats()
    report = sourcecheck.check(DRAFT, SOURCES, cache=cache, stats=stats)
    assert stats.passages_embedded > 0
    assert any("rebuilt" in p.message for p in report.problems)
    assert re.search(r"vectors\.sqlite", " ".join(p.message for p in report.problems))
    assert [(c.citation.label, c.band) for r in report.claims for c in r.checks] == [
        (c.citation.label, c.band) for r in cold[0].claims for c in r.checks
    ]


def test_corrupt_verifier_reading_is_rebuilt_with_a_warning(cold, demo_cache: Path, tmp_path: Path) -> None:
    import shutil

    cache = tmp_path / "cache"
    shutil.copytree(demo_cache, cache)
    victim = sorted((cache / "verdicts").glob("*.npy"))[0]
    victim.write_bytes(b"not an array")
    stats = RunStats()
    report = sourcecheck.check(DRAFT, SOURCES, cache=cache, stats=stats)
    assert stats.pairs_verified > 0 and stats.passages_embedded == 0
    assert any("rebuilt" in p.message for p in report.problems)
    assert re.search(r"\.npy", " ".join(p.message for p in report.problems))


class _CountingVerifier:
    """Stands in for the verifier: fixed probabilities, and a count of the pairs it was asked."""

    def __init__(self, path: Path) -> None:
        self.model_path = path
        self.asked = 0

    def score(self, pairs):
        import numpy as np

        self.asked += len(pairs)
        return np.tile(np.array([0.7, 0.2, 0.1]), (len(pairs), 1))


def test_verifier_readings_are_cached_so_a_warm_run_asks_nothing(tmp_path: Path) -> None:
    from sourcecheck.index import Cache
    from sourcecheck.verdicts import CachedScorer

    weights = tmp_path / "model.onnx"
    weights.write_bytes(b"weights")
    pairs = [("Dry plots grew faster.", "Dry plots grew faster than watered ones."), ("a", "b")]
    first = _CountingVerifier(weights)
    cold = CachedScorer(first, Cache(tmp_path / "cache"), RunStats()).score(pairs)  # type: ignore[arg-type]
    second = _CountingVerifier(weights)
    stats = RunStats()
    warm = CachedScorer(second, Cache(tmp_path / "cache"), stats).score(pairs)  # type: ignore[arg-type]
    assert first.asked == 2 and second.asked == 0 and stats.pairs_verified == 0
    assert (cold == warm).all()  # the very same numbers, cold or warm
    weights.write_bytes(b"retrained")  # another model: nothing reused
    third = _CountingVerifier(weights)
    CachedScorer(third, Cache(tmp_path / "cache"), RunStats()).score(pairs)  # type: ignore[arg-type]
    assert third.asked == 2
