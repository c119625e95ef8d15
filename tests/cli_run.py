"""Shared by the command-line tests of the workflow: the demo's paths, a warm cache, one in-process run."""

from __future__ import annotations

from pathlib import Path

import pytest

from sourcecheck.cli import EXIT_OK, main

ROOT = Path(__file__).resolve().parent.parent
MANUSCRIPTS = ROOT / "sample_manuscript"
DRAFT = MANUSCRIPTS / "draft.md"
SOURCES = ROOT / "sample_sources"


@pytest.fixture(scope="module")
def cache(tmp_path_factory: pytest.TempPathFactory) -> Path:
    """A cache warmed once on the demo, so the tests of a module run without loading the model again."""
    folder = tmp_path_factory.mktemp("cli-cache")
    assert main(["check", str(DRAFT), "--sources", str(SOURCES), "--cache", str(folder), "--quiet"]) == EXIT_OK
    return folder


def run_cli(capsys: pytest.CaptureFixture[str], *args: str) -> tuple[int, str, str]:
    """Exit code, standard output and standard error of one command line."""
    code = main(list(args))
    out, err = capsys.readouterr()
    return code, out, err
