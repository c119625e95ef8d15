"""bench/run.py loads the corpus builder the way `make bench` does on a fresh clone."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

RUN = Path(__file__).resolve().parents[2] / "bench" / "run.py"


def test_the_builder_loads_and_builds_in_a_fresh_interpreter(tmp_path: Path) -> None:
    # A fresh interpreter, as `make bench` starts one: nothing registered beforehand.
    script = (
        "import importlib.util, sys\n"
        f"spec = importlib.util.spec_from_file_location('bench_run', {str(RUN)!r})\n"
        "run = importlib.util.module_from_spec(spec); sys.modules['bench_run'] = run; spec.loader.exec_module(run)\n"
        f"papers = run.load_builder().build(__import__('pathlib').Path({str(tmp_path)!r}), pdfs=2, pages=2)\n"
        "print(len(papers))\n"
    )
    done = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, timeout=300)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip() == "2"
    assert len(list((tmp_path / "sources").glob("*.pdf"))) == 2
