"""bench/claims.py end to end on the tiny invented dataset of test_scifact_corpus.py.

The script must build the draft and PDFs from the dataset's files, run the real pipeline
on them and print the issue's figures; the checks below are read off the invented data.
"""

from __future__ import annotations

import importlib.util
import re
import sys
from collections import Counter
from pathlib import Path
from types import ModuleType

import pytest

from tests.bench.test_scifact_corpus import CLAIMS, DOCS, EXPECTED_LABEL, write_dataset

SCRIPT = Path(__file__).resolve().parents[2] / "bench" / "claims.py"


def _load() -> ModuleType:
    spec = importlib.util.spec_from_file_location("claims_benchmark", SCRIPT)
    assert spec and spec.loader
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module
    spec.loader.exec_module(module)
    return module


def test_benchmark_prints_hits_auroc_and_bands_per_label(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    data = write_dataset(tmp_path / "data", CLAIMS, DOCS)
    out = tmp_path / "out"
    code = _load().main([str(data), "--out", str(out), "--split", "all", "--cache", str(tmp_path / "cache")])
    printed = capsys.readouterr().out
    assert code == 0
    assert (out / "draft.md").is_file() and (out / "gold.jsonl").is_file()  # built from the files
    # Decoys are on by default (15%), so count the pairs the build wrote, not EXPECTED_LABEL.
    assert re.search(r"\((\d+) judged pairs, 3 with rationale sentences\)", printed)
    # Each abstract has at most three passages, so a rationale is always among the top three.
    assert "evidence hit@3  1.000" in printed
    assert re.search(r"AUROC, SUPPORT against the rest  (0\.\d{3}|1\.000)", printed)
    # The target's own reading (SUPPORT against CONTRADICT and NEI) is printed without decoys.
    assert re.search(r"SUPPORT against CONTRADICT \+ NEI (0\.\d{3}|1\.000)", printed)
    rows = {
        m.group(1): [int(n) for n in m.group(2).split()] for m in re.finditer(r"^  (\w+) +([\d ]+)$", printed, re.M)
    }
    wanted = Counter(EXPECTED_LABEL.values())
    for label, count in wanted.items():
        assert sum(rows[label]) == count, (label, rows)
