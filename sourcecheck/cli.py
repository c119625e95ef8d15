"""Command line: argument parsing, exit codes and wiring only.

Exit codes: 0 when the run completed (whatever the bands), 2 for a usage or input error
that stops the run (missing draft, missing sources folder, unreadable model or mapping),
1 for an internal error. The heavy modules are imported only once a command runs, so
``--help`` is instant.
"""

from __future__ import annotations

import argparse
import io
import os
import sys
import tempfile
from collections.abc import Sequence
from pathlib import Path

EXIT_OK = 0
EXIT_INTERNAL = 1
EXIT_INPUT = 2


def build_parser() -> argparse.ArgumentParser:
    """The argument parser (separate so tests and docs can inspect it)."""
    parser = argparse.ArgumentParser(
        prog="sourcecheck",
        description="Check that each cited claim in a draft is backed by the source it cites. Runs offline.",
    )
    commands = parser.add_subparsers(dest="command", required=True, metavar="COMMAND")
    check = commands.add_parser("check", help="check a draft against a folder of source PDFs")
    check.add_argument("draft", type=Path, help="the manuscript (Markdown, plain text or Word .docx)")
    check.add_argument(
        "--sources",
        type=Path,
        required=True,
        metavar="DIR",
        help="folder of source PDFs (searched recursively)",
    )
    check.add_argument("--format", choices=("text", "json"), default="text", help="report format (default: text)")
    check.add_argument(
        "--output",
        type=Path,
        metavar="FILE",
        help="write the report to FILE instead of standard output",
    )
    check.add_argument(
        "--map",
        type=Path,
        metavar="FILE",
        help="CSV (key,file) or TOML mapping of reference keys to PDFs",
    )
    check.add_argument(
        "--model",
        metavar="PATH",
        help="local sentence-transformers model folder (default: bundled MiniLM)",
    )
    check.add_argument(
        "--verifier",
        metavar="PATH",
        help="local entailment verifier folder (default: the one shipped in the package)",
    )
    check.add_argument("--cache", type=Path, metavar="DIR", help="cache folder (default: the user cache directory)")
    check.add_argument("--bib", type=Path, metavar="FILE", help="bibliography file for the draft's citation keys")
    check.add_argument("--format-in", metavar="NAME", help="read the draft as this format, whatever its suffix")
    check.add_argument("--quiet", action="store_true", help="no progress bar")
    return parser


def _write_atomically(path: Path, text: str) -> None:
    """Write the whole report or nothing: a failed run never leaves half a file."""
    path.parent.mkdir(parents=True, exist_ok=True)
    fd, tmp = tempfile.mkstemp(dir=path.parent, prefix=f".{path.name}.", suffix=".tmp")
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as handle:
            handle.write(text)
        os.replace(tmp, path)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise


def _run_check(args: argparse.Namespace) -> int:
    from rich.console import Console

    from sourcecheck.api import check
    from sourcecheck.reports import dumps, progress_bar, render

    errors = Console(stderr=True)
    show_progress = not args.quiet and errors.is_terminal
    with progress_bar(errors, enabled=show_progress) as progress:
        report = check(
            args.draft,
            args.sources,
            bib=args.bib,
            format_in=args.format_in,
            mapping=args.map,
            model=args.model,
            verifier=args.verifier,
            cache=args.cache,
            progress=progress,
        )
    for problem in report.problems:
        print(f"sourcecheck: {problem.file}: {problem.message}", file=sys.stderr)  # one line, never wrapped
    if args.format == "json":
        text = dumps(report)
    else:
        if not args.output:
            render(report, Console())
            return EXIT_OK
        # A plain-text file: no colours, a fixed width, rendered into memory and written whole.
        buffer = io.StringIO()
        render(report, Console(file=buffer, width=100, color_system=None, force_terminal=False))
        text = buffer.getvalue()
    if args.output:
        _write_atomically(args.output, text)
    else:
        sys.stdout.write(text)
    return EXIT_OK


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the ``sourcecheck`` script and ``python -m sourcecheck``."""
    from sourcecheck.errors import SourcecheckError

    args = build_parser().parse_args(argv)
    try:
        return _run_check(args)
    except SourcecheckError as exc:
        print(f"sourcecheck: {exc}", file=sys.stderr)
        return EXIT_INPUT
    except KeyboardInterrupt:
        print("sourcecheck: interrupted; nothing was written", file=sys.stderr)
        return 130
    except OSError as exc:
        where = f"{exc.filename}: " if exc.filename else ""
        print(f"sourcecheck: {where}{exc.strerror or exc}", file=sys.stderr)
        return EXIT_INPUT
    except Exception as exc:  # the user gets one line, not a traceback
        if os.environ.get("SOURCECHECK_DEBUG"):
            raise
        print(
            f"sourcecheck: internal error ({type(exc).__name__}: {exc}); rerun with SOURCECHECK_DEBUG=1 for details",
            file=sys.stderr,
        )
        return EXIT_INTERNAL


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
