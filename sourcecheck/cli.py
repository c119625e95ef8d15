"""Command line: argument parsing, exit codes and wiring only.

Exit codes: 0 when the run completed (whatever the bands, unless ``--fail-on`` says
otherwise); 1 when ``--fail-on BAND`` is given and an unreviewed check is at BAND or more
severe (the convention of linters and test runners: the tool worked and found something);
2 for a usage or input error that stops the run (missing draft, missing sources folder,
unreadable model, mapping, settings or review file); 70 for an internal error
(``EX_SOFTWARE`` of BSD's sysexits.h). The heavy modules are imported only once a
command runs, so ``--help`` is instant.
"""

from __future__ import annotations

import argparse
import io
import os
import sys
import tempfile
from collections.abc import Sequence
from pathlib import Path
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from sourcecheck.model import Report

EXIT_OK = 0
EXIT_FINDINGS = 1
EXIT_INPUT = 2
EXIT_INTERNAL = 70

#: ``--format-in`` names (the draft readers' registry, sourcecheck.drafts.READERS; a test keeps them equal).
FORMATS_IN = ("markdown", "word", "latex", "pdf")
#: The bands ``--fail-on`` takes, least severe first (sourcecheck.workflow.GATE_BANDS; a test keeps them equal).
GATE_BANDS = ("loose", "unverifiable", "adrift", "conflict")
#: ``--backend`` names (sourcecheck.index.BACKENDS; a test keeps them equal), the default first.
BACKENDS = ("onnx-int8", "torch")
#: Report format -> file extension for ``--output-dir``.
EXTENSIONS = {"text": "txt", "json": "json", "html": "html", "markdown": "md", "sarif": "sarif"}

DRAFT_FORMATS = """draft formats (picked by suffix; --format-in forces one):
  Markdown, plain text   .md .markdown .mdown .mkd .txt .text   numeric or author-year markers
  Pandoc Markdown        .md                                    [@key] citations, --bib or front matter
  LaTeX                  .tex .ltx                              \\cite, natbib, biblatex; \\input followed
  Word                   .docx                                  body, tables, footnotes, endnotes
  PDF manuscript         .pdf                                   bracketed, author-year, superscript markers
--format-in choices: markdown (also plain text and Pandoc), latex, word, pdf
"""


def _version() -> str:
    from sourcecheck import __version__

    return f"sourcecheck {__version__}"


def _positive(text: str) -> int:
    """An integer of at least 1, for ``--jobs``."""
    try:
        value = int(text)
    except ValueError:
        value = 0
    if value < 1:
        raise argparse.ArgumentTypeError(f"expected a whole number of at least 1, got {text!r}")
    return value


def _run_options() -> argparse.ArgumentParser:
    """Options every command that runs a check shares; unset ones are None so settings files can fill them."""
    options = argparse.ArgumentParser(add_help=False)
    options.add_argument("--sources", type=Path, metavar="DIR", help="folder of source PDFs (searched recursively)")
    options.add_argument(
        "--map", type=Path, metavar="FILE", help="CSV (key,file) or TOML mapping of references to PDFs"
    )
    options.add_argument("--model", metavar="PATH", help="local sentence-transformers model folder (default: bundled)")
    options.add_argument(
        "--verifier", metavar="PATH", help="local entailment verifier folder (default: the one shipped in the package)"
    )
    options.add_argument(
        "--backend",
        choices=BACKENDS,
        help="how the embedding model runs: onnx-int8 (int8 ONNX Runtime, the default) or torch (fp32)",
    )
    options.add_argument(
        "--jobs", type=_positive, metavar="N", help="worker processes reading PDFs (default: one per core)"
    )
    options.add_argument("--cache", type=Path, metavar="DIR", help="cache folder (default: the user cache directory)")
    options.add_argument("--bib", type=Path, metavar="FILE", help="bibliography file for the draft's citation keys")
    options.add_argument("--format-in", choices=FORMATS_IN, help="read the draft as this format, whatever its suffix")
    options.add_argument("--quiet", action="store_true", default=None, help="no progress bar")
    options.add_argument(
        "--follow-links",
        action="store_true",
        default=None,
        help="read source PDFs that are symbolic links to files outside the sources folder",
    )
    options.add_argument(
        "--config",
        type=Path,
        metavar="FILE",
        help="settings file (default: sourcecheck.toml or pyproject.toml beside the draft)",
    )
    return options


def _check_options() -> argparse.ArgumentParser:
    """The options of ``check`` alone: output, gate and layout."""
    options = argparse.ArgumentParser(add_help=False)
    options.add_argument("--format", choices=tuple(EXTENSIONS), help="report format (default: text)")
    options.add_argument("--output", type=Path, metavar="FILE", help="write the report to FILE (one draft only)")
    options.add_argument("--output-dir", type=Path, metavar="DIR", help="write one report per draft into DIR")
    options.add_argument(
        "--fail-on",
        choices=GATE_BANDS,
        metavar="BAND",
        help="exit 1 when an unreviewed check is at BAND or worse; order: " + " < ".join(GATE_BANDS),
    )
    options.add_argument(
        "--all", action="store_true", default=None, help="show every check in full, with every passage"
    )
    return options


def settings_parser() -> argparse.ArgumentParser:
    """The options a settings file may set: those of ``check``."""
    return argparse.ArgumentParser(add_help=False, parents=[_run_options(), _check_options()])


def build_parser() -> argparse.ArgumentParser:
    """The argument parser (separate so tests and docs can inspect it)."""
    parser = argparse.ArgumentParser(
        prog="sourcecheck",
        description="Check that each cited claim in a draft is backed by the source it cites. Runs offline.",
    )
    parser.add_argument("--version", action="version", version=_version())
    commands = parser.add_subparsers(dest="command", required=True, metavar="COMMAND")
    check = commands.add_parser(
        "check",
        help="check drafts against a folder of source PDFs",
        parents=[_run_options(), _check_options()],
        epilog=DRAFT_FORMATS,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    check.add_argument(
        "drafts", type=Path, nargs="+", metavar="DRAFT", help="manuscripts, or folders of them (formats below)"
    )
    review = commands.add_parser("review", help="accept checks a person has read, list or forget them")
    actions = review.add_subparsers(dest="action", required=True, metavar="ACTION")
    accept = actions.add_parser("accept", help="accept a claim's checks with a note", parents=[_run_options()])
    accept.add_argument("draft", type=Path, metavar="DRAFT")
    accept.add_argument("claim", metavar="CLAIM_ID", help="the claim's id in the report (c3)")
    accept.add_argument("--citation", metavar="LABEL", help="only the check of this citation ([2], Okafor 2019)")
    accept.add_argument("--note", required=True, help="why the check is accepted (kept in the review file)")
    listing = actions.add_parser("list", help="list the accepted checks of a draft")
    listing.add_argument("draft", type=Path, metavar="DRAFT")
    forget = actions.add_parser("forget", help="remove accepted checks")
    forget.add_argument("draft", type=Path, metavar="DRAFT")
    forget.add_argument("claim", metavar="CLAIM_ID|FINGERPRINT", help="a claim id (c3) or a fingerprint's first digits")
    forget.add_argument("--citation", metavar="LABEL", help="only the check of this citation")
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


def _report_text(report: Report, report_format: str, show_all: bool) -> str:
    """The report as the text of a file: JSON, HTML, Markdown, SARIF, or the terminal report without colours."""
    from rich.console import Console

    from sourcecheck.reports import dumps, html, markdown, render, sarif

    writers = {"json": dumps, "html": html, "markdown": markdown, "sarif": sarif}
    if report_format in writers:
        return writers[report_format](report)
    buffer = io.StringIO()
    render(report, Console(file=buffer, width=100, color_system=None, force_terminal=False), show_all=show_all)
    return buffer.getvalue()


def _run_check(args: argparse.Namespace) -> int:
    from rich.console import Console

    from sourcecheck.api import check_many
    from sourcecheck.drafts import FORMATS
    from sourcecheck.errors import SettingsError
    from sourcecheck.model import Band
    from sourcecheck.reports import progress_bar, render, render_summary
    from sourcecheck.text import visible
    from sourcecheck.workflow import expand_drafts, gate_failures, report_names
    from sourcecheck.workspace import apply_settings, check_options

    base = apply_settings(args, args.drafts[0], settings_parser())
    report_format = args.format or "text"
    drafts = expand_drafts(args.drafts, FORMATS, getattr(args, "ignore", None) or (), base)
    if args.output and len(drafts) > 1:
        raise SettingsError(f"--output takes one draft; {len(drafts)} were given (use --output-dir DIR)")
    if len(drafts) > 1 and report_format != "text" and not args.output_dir:
        raise SettingsError(f"{len(drafts)} drafts in --format {report_format} need --output-dir DIR")
    errors = Console(stderr=True)
    with progress_bar(errors, enabled=not args.quiet and errors.is_terminal) as progress:
        reports = check_many(drafts, args.sources, progress=progress, **check_options(args))
    for report in reports:
        for problem in report.problems:
            # One line each, never wrapped; control characters shown, not obeyed.
            print(visible(f"sourcecheck: {problem.file}: {problem.message}"), file=sys.stderr)
    if args.output_dir:
        for report, name in zip(reports, report_names(drafts, EXTENSIONS[report_format]), strict=True):
            _write_atomically(args.output_dir / name, _report_text(report, report_format, bool(args.all)))
        render_summary(reports, Console())
    elif args.output:
        _write_atomically(args.output, _report_text(reports[0], report_format, bool(args.all)))
    elif report_format == "text":
        for report in reports:
            render(report, Console(), show_all=bool(args.all))
        if len(reports) > 1:
            render_summary(reports, Console())
    else:
        sys.stdout.write(_report_text(reports[0], report_format, bool(args.all)))
    if args.fail_on:
        failing = gate_failures(reports, Band(args.fail_on))
        if failing:
            count = f"{len(failing)} unreviewed check{'s' if len(failing) != 1 else ''}"
            print(f"sourcecheck: {count} at {args.fail_on} or worse (--fail-on {args.fail_on})", file=sys.stderr)
            return EXIT_FINDINGS
    return EXIT_OK


def _dispatch(args: argparse.Namespace) -> int:
    if args.command == "review":
        from sourcecheck.review_commands import run_review

        return run_review(args, settings_parser())
    return _run_check(args)


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the ``sourcecheck`` script and ``python -m sourcecheck``."""
    args = build_parser().parse_args(argv)
    from sourcecheck.errors import SourcecheckError
    from sourcecheck.text import visible

    try:
        return _dispatch(args)
    except SourcecheckError as exc:
        print(visible(f"sourcecheck: {exc}"), file=sys.stderr)
        return EXIT_INPUT
    except KeyboardInterrupt:
        print("sourcecheck: interrupted; nothing was written", file=sys.stderr)
        return 130
    except OSError as exc:
        where = f"{exc.filename}: " if exc.filename else ""
        print(visible(f"sourcecheck: {where}{exc.strerror or exc}"), file=sys.stderr)
        return EXIT_INPUT
    except Exception as exc:  # the user gets one line, not a traceback
        if os.environ.get("SOURCECHECK_DEBUG"):
            raise
        print(
            visible(
                f"sourcecheck: internal error ({type(exc).__name__}: {exc}); rerun with SOURCECHECK_DEBUG=1 for details"
            ),
            file=sys.stderr,
        )
        return EXIT_INTERNAL


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
