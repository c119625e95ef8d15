"""Measure what a sourcecheck run costs, cold and warm, on the demo and a synthetic corpus.

The promise to users is that the first run over a folder pays for reading and embedding
the PDFs and every later run is quick because nothing is embedded again. This script
checks both halves with the real command line in a child process: it times a run with an
empty cache (cold), then the same run again (warm), reads each child's peak resident
memory, and verifies from the cache folder that the warm run wrote no embedding file.

Usage::

    python bench/run.py [--corpus demo|synthetic|both] [--out bench/out/speed] [--markdown FILE]

The synthetic corpus is built into ``bench/out/synthetic`` by ``bench/synthetic_corpus.py``
when it is missing. Results go to ``OUT/results.json`` and, as a Markdown table, to standard
output (and to ``--markdown FILE``).
"""

from __future__ import annotations

import argparse
import importlib.util
import json
import os
import platform
import shutil
import sqlite3
import subprocess
import sys
import time
from dataclasses import asdict, dataclass, field
from datetime import datetime
from pathlib import Path
from types import ModuleType

from pypdf import PdfReader

REPO = Path(__file__).resolve().parents[1]
SYNTHETIC_DIR = REPO / "bench" / "out" / "synthetic"
#: PDFs of ten pages in the scaling runs: 100, 200, 400 and 800 pages.
SCALING_PDFS = (10, 20, 40, 80)
DEMO_DRAFT = REPO / "sample_manuscript" / "draft.md"
DEMO_SOURCES = REPO / "sample_sources"


@dataclass
class Measured:
    """One child run: wall time, CPU time and peak RSS (from wait4), exit code, stderr tail.

    The CPU time (user + system, the child and the workers it reaped) moves far less than
    the wall time when other jobs share the machine, so both are reported.
    """

    seconds: float
    peak_rss_mb: float
    exit_code: int
    stderr_tail: str = ""
    cpu_seconds: float = 0.0


@dataclass
class CorpusResult:
    """Everything measured on one corpus; ``error`` is set when it could not be measured."""

    corpus: str
    draft: str
    sources: str
    pdfs: int = 0
    pages: int = 0
    claims: int = 0
    cold: Measured | None = None
    warm: Measured | None = None
    embeddings_written_warm: int | None = None
    embeddings_after_cold: int | None = None
    error: str = ""
    notes: list[str] = field(default_factory=list)


def run_measured(command: list[str], log: Path) -> Measured:
    """Run ``command`` and read the rusage of that one child.

    ``os.wait4`` returns the resource usage of the very process it reaps (and of its own
    reaped descendants), so the peak RSS is this run's alone: ``RUSAGE_CHILDREN`` of the
    benchmark process would be the maximum over every earlier run too. On Linux
    ``ru_maxrss`` is in kilobytes (getrusage(2)).
    """
    env = {**os.environ, "HF_HUB_OFFLINE": "1", "TRANSFORMERS_OFFLINE": "1"}
    log.parent.mkdir(parents=True, exist_ok=True)
    with log.open("wb") as stderr:
        start = time.perf_counter()
        child = subprocess.Popen(command, cwd=REPO, env=env, stdout=stderr, stderr=subprocess.STDOUT)
        _, status, usage = os.wait4(child.pid, 0)
        seconds = time.perf_counter() - start
    child.returncode = os.waitstatus_to_exitcode(status)  # reaped here, so Popen must not wait
    tail = "\n".join(log.read_text(encoding="utf-8", errors="replace").strip().splitlines()[-5:])
    cpu = usage.ru_utime + usage.ru_stime
    return Measured(round(seconds, 2), round(usage.ru_maxrss / 1024, 1), child.returncode, tail, round(cpu, 2))


def stored_vectors(cache: Path) -> int:
    """How many embeddings the cache's vector store holds (0 when there is none yet)."""
    path = cache / "vectors.sqlite"
    if not path.is_file():
        return 0
    with sqlite3.connect(path) as db:
        return int(db.execute("SELECT COUNT(*) FROM vectors").fetchone()[0])


def count_pages(sources: Path) -> tuple[int, int]:
    """(PDF files, total pages), read with pypdf independently of sourcecheck."""
    pdfs = sorted(p for p in sources.rglob("*") if p.suffix.lower() == ".pdf" and p.is_file())
    pages = 0
    for pdf in pdfs:
        try:
            pages += len(PdfReader(pdf).pages)
        except Exception:  # a deliberately broken demo file counts as a file, not pages
            continue
    return len(pdfs), pages


def check_command(draft: Path, sources: Path, cache: Path, report: Path) -> list[str]:
    """The exact command a user would type, run with this interpreter."""
    return [
        sys.executable,
        "-m",
        "sourcecheck",
        "check",
        str(draft),
        "--sources",
        str(sources),
        "--cache",
        str(cache),
        "--format",
        "json",
        "--output",
        str(report),
        "--quiet",
    ]


def load_builder() -> ModuleType:
    """The synthetic corpus builder (bench/synthetic_corpus.py), loaded as a module.

    Registered in ``sys.modules`` before it runs: its dataclasses look their module up there,
    and without it ``make bench`` failed on a fresh clone.
    """
    spec = importlib.util.spec_from_file_location("synthetic_corpus", REPO / "bench" / "synthetic_corpus.py")
    assert spec and spec.loader
    module = importlib.util.module_from_spec(spec)
    sys.modules.setdefault("synthetic_corpus", module)
    spec.loader.exec_module(module)
    return module


def ensure_synthetic(folder: Path) -> None:
    """Build the default synthetic corpus (40 PDFs x 10 pages, seed 0) if it is not there."""
    if (folder / "draft.md").is_file() and (folder / "sources").is_dir():
        return
    module = load_builder()
    print(f"building the synthetic corpus in {folder} ...", file=sys.stderr)
    module.build(folder)


def _display(path: Path) -> str:
    return str(path.relative_to(REPO)) if path.is_relative_to(REPO) else str(path)


def measure_corpus(name: str, draft: Path, sources: Path, out: Path) -> CorpusResult:
    """Cold run on an emptied cache, then a warm run on the same cache."""
    result = CorpusResult(name, _display(draft), _display(sources))
    if not draft.is_file() or not sources.is_dir():
        result.error = f"missing {'draft ' + result.draft if not draft.is_file() else 'folder ' + result.sources}"
        return result
    result.pdfs, result.pages = count_pages(sources)
    work = out / name
    cache = work / "cache"
    shutil.rmtree(cache, ignore_errors=True)
    cache.mkdir(parents=True)
    command = check_command(draft, sources, cache, work / "cold.json")
    print(f"[{name}] cold: {' '.join(command)}", file=sys.stderr)
    result.cold = run_measured(command, work / "cold.log")
    if result.cold.exit_code != 0:
        result.error = f"cold run exited {result.cold.exit_code}: {result.cold.stderr_tail}"
        return result
    before = stored_vectors(cache)
    result.embeddings_after_cold = before
    command = check_command(draft, sources, cache, work / "warm.json")
    print(f"[{name}] warm: {' '.join(command)}", file=sys.stderr)
    result.warm = run_measured(command, work / "warm.log")
    result.embeddings_written_warm = stored_vectors(cache) - before
    if result.warm.exit_code != 0:
        result.error = f"warm run exited {result.warm.exit_code}: {result.warm.stderr_tail}"
        return result
    cold_report = json.loads((work / "cold.json").read_text(encoding="utf-8"))
    warm_report = json.loads((work / "warm.json").read_text(encoding="utf-8"))
    result.claims = len(cold_report.get("claims", []))
    if cold_report.get("summary") != warm_report.get("summary"):
        result.notes.append("warm and cold band counts differ")
    result.notes.append(f"bands (cold): {cold_report.get('summary')}")
    return result


def machine_info() -> dict[str, str]:
    """CPU model, cores, RAM, Python and load: what a reader needs to compare numbers."""
    model = platform.processor() or ""
    try:
        for line in Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("model name"):
                model = line.split(":", 1)[1].strip()
                break
    except OSError:
        pass
    ram = ""
    try:
        for line in Path("/proc/meminfo").read_text().splitlines():
            if line.startswith("MemTotal:"):
                ram = f"{int(line.split()[1]) / 1024 / 1024:.1f} GiB"
                break
    except OSError:
        pass
    load = ", ".join(f"{x:.2f}" for x in os.getloadavg()) if hasattr(os, "getloadavg") else ""
    return {
        "cpu": model or "unknown",
        "cores": str(os.cpu_count()),
        "ram": ram or "unknown",
        "python": platform.python_version(),
        "platform": platform.platform(),
        "load average (1, 5, 15 min) at start": load,
        "date": datetime.now().astimezone().isoformat(timespec="seconds"),
    }


def _cell(value: object) -> str:
    return "–" if value is None else str(value)


def markdown(results: list[CorpusResult], machine: dict[str, str]) -> str:
    """The results table, machine facts below it, then any failure or note."""
    head = (
        "| corpus | PDFs | pages | claims | cold s | warm s | warm/cold | cold CPU s | warm CPU s "
        "| peak RSS cold MB | peak RSS warm MB | embeddings after cold | written on warm run |"
    )
    lines = [head, "|" + "---|" * 13]
    for r in results:
        ratio = f"{r.warm.seconds / r.cold.seconds:.2f}" if r.cold and r.warm and r.cold.seconds else None
        cells = [
            r.corpus,
            r.pdfs,
            r.pages,
            r.claims,
            r.cold.seconds if r.cold else None,
            r.warm.seconds if r.warm else None,
            ratio,
            r.cold.cpu_seconds if r.cold else None,
            r.warm.cpu_seconds if r.warm else None,
            r.cold.peak_rss_mb if r.cold else None,
            r.warm.peak_rss_mb if r.warm else None,
            r.embeddings_after_cold,
            r.embeddings_written_warm,
        ]
        lines.append("| " + " | ".join(_cell(c) for c in cells) + " |")
    lines.append("")
    lines += [f"- {key}: {value}" for key, value in machine.items()]
    for r in results:
        if r.error:
            lines.append(f"- {r.corpus}: FAILED: {r.error}")
        lines += [f"- {r.corpus}: {note}" for note in r.notes]
    return "\n".join(lines) + "\n"


def measure_limit(result: CorpusResult, out: Path) -> dict[str, float]:
    """pypdf alone plus the int8 models alone on what the cold run embedded and verified (bench/limits.py)."""
    cache = out / result.corpus / "cache"
    command = [sys.executable, str(REPO / "bench" / "limits.py"), result.draft, result.sources, str(cache)]
    done = subprocess.run(command, cwd=REPO, capture_output=True, text=True, check=False)
    if done.returncode != 0:
        return {"error": 1.0}
    limit: dict[str, float] = json.loads(done.stdout.strip().splitlines()[-1])
    floor = sum(limit[k] for k in ("pypdf_s", "model_load_s", "model_s", "verifier_load_s", "verifier_s"))
    limit["limit_s"] = round(floor, 2)
    if result.cold and floor:
        limit["cold_over_limit"] = round(result.cold.seconds / floor, 2)
    return limit


def scaling(out: Path, pages_per_pdf: int = 10) -> list[CorpusResult]:
    """Cold and warm runs at 100, 200, 400 and 800 pages (10-page PDFs, two claims per PDF)."""
    results = []
    for pdfs in SCALING_PDFS:
        folder = out / "corpora" / f"scale-{pdfs}x{pages_per_pdf}"
        if not (folder / "draft.md").is_file():
            load_builder().build(folder, pdfs=pdfs, pages=pages_per_pdf)
        results.append(measure_corpus(f"scale-{pdfs * pages_per_pdf}p", folder / "draft.md", folder / "sources", out))
    return results


def library(out: Path) -> list[CorpusResult]:
    """A 1,000-PDF library indexed once, then a new 40-reference manuscript checked against it.

    The library is two generated corpora in one folder: 960 one-page PDFs with their draft
    (the run that indexes the library) and 40 two-page PDFs whose draft is the new manuscript,
    checked second on the same cache: only its own claims' candidates are new.
    """
    root = out / "corpora" / "library"
    first, second, shelf = root / "first", root / "second", root / "sources"
    if not (shelf / "done").is_file():
        builder = load_builder()
        builder.build(first, pdfs=960, pages=1, claims=120, seed=1)
        builder.build(second, pdfs=40, pages=2, seed=2)
        shelf.mkdir(parents=True, exist_ok=True)
        for part in (first, second):
            for pdf in (part / "sources").glob("*.pdf"):
                shutil.copy2(pdf, shelf / f"{part.name}-{pdf.name}")
        (shelf / "done").write_text("built\n", encoding="utf-8")
    work = out / "library"
    cache = work / "cache"
    shutil.rmtree(cache, ignore_errors=True)
    results = []
    for name, draft in (
        ("library: index 1,000 PDFs", first / "draft.md"),
        ("library: new manuscript", second / "draft.md"),
    ):
        result = CorpusResult(name, _display(draft), _display(shelf))
        result.pdfs, result.pages = count_pages(shelf)
        result.embeddings_after_cold = stored_vectors(cache)
        command = check_command(draft, shelf, cache, work / f"{draft.parent.name}.json")
        print(f"[{name}] {' '.join(command)}", file=sys.stderr)
        result.cold = run_measured(command, work / f"{draft.parent.name}.log")
        if result.cold.exit_code != 0:
            result.error = f"exited {result.cold.exit_code}: {result.cold.stderr_tail}"
        else:
            report = json.loads((work / f"{draft.parent.name}.json").read_text(encoding="utf-8"))
            result.claims = len(report.get("claims", []))
            result.notes.append(f"vectors written: {stored_vectors(cache) - (result.embeddings_after_cold or 0)}")
        results.append(result)
    return results


def load_line() -> str:
    """The 1, 5 and 15 minute load averages, as ``uptime`` prints them."""
    return ", ".join(f"{x:.2f}" for x in os.getloadavg()) if hasattr(os, "getloadavg") else ""


def parse_args(argv: list[str] | None) -> argparse.Namespace:
    parser = argparse.ArgumentParser(description="Time sourcecheck cold and warm, with peak memory.")
    parser.add_argument("--corpus", choices=("demo", "synthetic", "both"), default="both")
    parser.add_argument(
        "--parts",
        default="corpora,limit,scaling,library",
        help="comma-separated: corpora (demo and/or synthetic), limit, scaling, library (default: all)",
    )
    parser.add_argument("--out", type=Path, default=REPO / "bench" / "out" / "speed")
    parser.add_argument("--markdown", type=Path, metavar="FILE", help="also write the table to FILE")
    parser.add_argument("--synthetic-dir", type=Path, default=SYNTHETIC_DIR, help=argparse.SUPPRESS)
    return parser.parse_args(argv)


def main(argv: list[str] | None = None) -> int:
    args = parse_args(argv)
    out = args.out.resolve()
    machine = machine_info()
    parts = set(args.parts.split(","))
    results: list[CorpusResult] = []
    extra: list[str] = []
    if "corpora" in parts and args.corpus in ("demo", "both"):
        results.append(measure_corpus("demo", DEMO_DRAFT, DEMO_SOURCES, out))
    if "corpora" in parts and args.corpus in ("synthetic", "both"):
        folder = args.synthetic_dir.resolve()
        try:
            ensure_synthetic(folder)
        except (OSError, ValueError, RuntimeError) as exc:
            results.append(CorpusResult("synthetic", _display(folder), "", error=f"could not build: {exc}"))
        else:
            synthetic = measure_corpus("synthetic", folder / "draft.md", folder / "sources", out)
            results.append(synthetic)
            if "limit" in parts and not synthetic.error:
                limit = measure_limit(synthetic, out)
                extra.append(f"- limit on the synthetic corpus (load {load_line()}): {json.dumps(limit)}")
    if "scaling" in parts:
        results += scaling(out)
        extra.append(f"- load after the scaling runs: {load_line()}")
    if "library" in parts:
        results += library(out)
        extra.append(f"- load after the library runs: {load_line()}")
    table = markdown(results, machine) + "\n".join(extra) + ("\n" if extra else "")
    out.mkdir(parents=True, exist_ok=True)
    payload = {"machine": machine, "results": [asdict(r) for r in results]}
    (out / "results.json").write_text(json.dumps(payload, indent=2) + "\n", encoding="utf-8")
    if args.markdown:
        args.markdown.parent.mkdir(parents=True, exist_ok=True)
        args.markdown.write_text(table, encoding="utf-8")
    sys.stdout.write(table)
    return 1 if any(r.error for r in results) else 0


if __name__ == "__main__":
    sys.exit(main())
