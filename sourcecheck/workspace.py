"""Settings for one command line: the file beside the draft merged under the flags.

Kept out of ``cli.py`` so the command line stays parsing and wiring; the reading and
checking of the file is :mod:`sourcecheck.workflow.config`.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path
from typing import Any

from sourcecheck.errors import SettingsError
from sourcecheck.text import visible
from sourcecheck.workflow import find_settings_file, known_keys, load_settings, merge


def apply_settings(args: argparse.Namespace, draft: Path, parser: argparse.ArgumentParser) -> Path | None:
    """Fill unset options of ``args`` from ``--config`` or the settings file beside ``draft``.

    Returns the settings file's folder (what ``ignore`` patterns are relative to), None
    when there is no file. An unknown key is one line on standard error and is passed
    over; a missing ``--sources`` (on the command line and in the file) stops the run.
    """
    folder = draft if draft.is_dir() else draft.parent
    path = args.config if args.config is not None else find_settings_file(folder)
    if args.config is not None and not args.config.is_file():
        raise SettingsError(f"{args.config}: settings file not found")
    base = None
    if path is not None:
        settings = load_settings(path, parser)
        if settings.unknown:
            unknown = ", ".join(visible(k) for k in settings.unknown)
            print(
                f"sourcecheck: {path}: unknown key{'s' if len(settings.unknown) > 1 else ''} {unknown} "
                f"(known: {', '.join(known_keys(parser))}); passed over",
                file=sys.stderr,
            )
        merge(args, settings)
        base = path.parent
    if args.sources is None:
        raise SettingsError("no sources folder: give --sources DIR or set sources in sourcecheck.toml")
    return base


def check_options(args: argparse.Namespace) -> dict[str, Any]:
    """The keyword options of ``sourcecheck.check`` from the parsed (and settings-filled) command line."""
    return {
        "bib": args.bib,
        "format_in": args.format_in,
        "mapping": args.map,
        "model": args.model,
        "verifier": getattr(args, "verifier", None),
        "backend": getattr(args, "backend", None) or "onnx-int8",
        "jobs": getattr(args, "jobs", None),
        "cache": args.cache,
        "follow_links": bool(getattr(args, "follow_links", False)),
    }
