"""Fuzz one draft or bibliography reader: any input must give a result or a problem, never an exception.

With atheris (``pip install -e '.[fuzz]'``) this is coverage-guided fuzzing under libFuzzer,
seeded from the demo manuscript in ``sample_manuscript/``; without it, the same readers
run under the Hypothesis property tests with the ``long`` profile. A crash is an uncaught
exception (libFuzzer writes the input to ``crash-*`` in ``--artifacts``), a single input
that runs past ``--input-timeout`` seconds, or memory past ``--rss-mb``.

    python scripts/fuzz.py markdown --seconds 600
    python scripts/fuzz.py --list

Run one target at a time, at low priority on a shared machine (``nice -n 19``).
"""

from __future__ import annotations

import argparse
import os
import subprocess
import sys
import tempfile
from collections.abc import Callable
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = ROOT / "sample_manuscript"

#: Target -> (seed files from the demo, property tests that cover it without atheris).
TARGETS: dict[str, tuple[list[str], str]] = {
    "markdown": (
        ["draft.md", "draft-pandoc.md"],
        "tests/drafts/test_readers_properties.py::test_markdown_reader_reads_any_text",
    ),
    "latex": (["draft.tex"], "tests/drafts/test_readers_properties.py::test_latex_reader_reads_any_text"),
    "word": (["draft.docx"], "tests/drafts/test_readers_properties.py::test_word_reader_reads_any_bytes"),
    "pdf": (["draft.pdf"], "tests/drafts/test_readers_properties.py::test_pdf_reader_reads_any_bytes"),
    "bibtex": (["refs.bib"], "tests/drafts/bibliography/test_properties.py"),
    "csl_json": ([], "tests/drafts/bibliography/test_properties.py"),
    "ris": ([], "tests/drafts/bibliography/test_properties.py"),
    "bbl": ([], "tests/drafts/bibliography/test_properties.py"),
}
#: Small seeds for the formats the demo has no file in (invented entries).
INLINE_SEEDS = {
    "csl_json": '[{"id": "okafor2019", "type": "article-journal", "title": "Tidal herons", '
    '"author": [{"family": "Okafor", "given": "Ada"}], "issued": {"date-parts": [[2019]]}, "DOI": "10.55555/x1"}]',
    "ris": "TY  - JOUR\nAU  - Okafor, Ada\nTI  - Tidal herons\nPY  - 2019\nDO  - 10.55555/x1\nER  - \n",
    "bbl": "\\begin{thebibliography}{1}\n\\bibitem{okafor2019} A.~Okafor. \\newblock Tidal herons. 2019.\n"
    "\\end{thebibliography}\n",
}


#: Suffix of the file each target's input is written to.
SUFFIX = {"markdown": ".md", "latex": ".tex", "word": ".docx", "pdf": ".pdf", "bibtex": ".bib"}
SUFFIX |= {"csl_json": ".json", "ris": ".ris", "bbl": ".bbl"}


def reader(target: str) -> Callable[[bytes], object]:
    """The function under test, taking the raw input bytes.

    The input is written to a file and read the way a run reads it: a draft through
    ``read_draft``, a bibliography as the ``--bib`` of a one-line Pandoc draft.
    """
    from sourcecheck.drafts import read_draft
    from sourcecheck.model import ReadOptions

    folder = Path(tempfile.mkdtemp(prefix="sourcecheck-fuzz-"))
    path = folder / f"input{SUFFIX[target]}"
    citing = folder / "citing.md"
    citing.write_text("Heron nests rose by 18% [@okafor2019].\n", encoding="utf-8")

    def read(data: bytes) -> object:
        path.write_bytes(data)
        if target in {"markdown", "latex", "word", "pdf"}:
            return read_draft(path, path.name)
        return read_draft(citing, citing.name, ReadOptions(bibliography=path))

    return read


def seed_corpus(target: str, folder: Path) -> Path:
    """A folder of seed inputs for ``target`` (the demo's own files, or a small invented entry)."""
    folder.mkdir(parents=True, exist_ok=True)
    for name in TARGETS[target][0]:
        (folder / name).write_bytes((SAMPLES / name).read_bytes())
    if target in INLINE_SEEDS:
        (folder / "seed").write_text(INLINE_SEEDS[target], encoding="utf-8")
    return folder


def fuzz_with_atheris(target: str, args: argparse.Namespace) -> int:
    import atheris

    with atheris.instrument_imports(include=["sourcecheck"]):
        function = reader(target)

    def one_input(data: bytes) -> None:
        function(data)

    corpus = seed_corpus(target, Path(args.corpus or tempfile.mkdtemp(prefix=f"fuzz-{target}-")))
    args.artifacts.mkdir(parents=True, exist_ok=True)
    flags = [
        sys.argv[0],
        str(corpus),
        f"-max_total_time={args.seconds}",
        f"-timeout={args.input_timeout}",
        f"-rss_limit_mb={args.rss_mb}",
        f"-max_len={args.max_len}",
        f"-artifact_prefix={args.artifacts}/{target}-",
        "-print_final_stats=1",
    ]
    atheris.Setup(flags, one_input)
    atheris.Fuzz()
    return 0


def fuzz_with_hypothesis(target: str, args: argparse.Namespace) -> int:
    env = {**os.environ, "HYPOTHESIS_PROFILE": "long", "PYTHONPATH": str(ROOT)}
    test = TARGETS[target][1]
    command = [sys.executable, "-m", "pytest", "-q", test, "--hypothesis-show-statistics"]
    if "::" not in test:
        command += ["-k", target]
    return subprocess.run(command, cwd=ROOT, env=env, timeout=args.seconds * 4, check=False).returncode


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("target", nargs="?", choices=sorted(TARGETS))
    parser.add_argument("--list", action="store_true", help="list the targets")
    parser.add_argument("--seconds", type=int, default=600, help="total fuzzing time (atheris)")
    parser.add_argument("--input-timeout", type=int, default=30, help="seconds one input may take")
    parser.add_argument("--rss-mb", type=int, default=2048, help="memory one run may use")
    parser.add_argument("--max-len", type=int, default=65536, help="largest input in bytes")
    parser.add_argument("--corpus", help="corpus folder (default: a fresh one seeded from the demo)")
    parser.add_argument("--artifacts", type=Path, default=ROOT / "bench" / "out" / "fuzz", help="where crashes go")
    parser.add_argument("--hypothesis", action="store_true", help="use Hypothesis even if atheris is installed")
    args = parser.parse_args()
    if args.list or not args.target:
        print("\n".join(sorted(TARGETS)))
        return 0
    try:
        import atheris  # noqa: F401
    except ImportError:
        args.hypothesis = True
    return fuzz_with_hypothesis(args.target, args) if args.hypothesis else fuzz_with_atheris(args.target, args)


if __name__ == "__main__":
    sys.exit(main())
