"""Settings files: where they are found, how keys are checked, and that flags win."""

from __future__ import annotations

import argparse
from pathlib import Path

import pytest

from sourcecheck.cli import build_parser, settings_parser
from sourcecheck.errors import SettingsError
from sourcecheck.workflow import find_settings_file, load_settings, merge


def _args(*argv: str) -> argparse.Namespace:
    return build_parser().parse_args(["check", "paper.md", *argv])


def test_pyproject_counts_only_with_a_tool_sourcecheck_table(tmp_path: Path) -> None:
    (tmp_path / "pyproject.toml").write_text('[project]\nname = "x"\n', encoding="utf-8")
    assert find_settings_file(tmp_path) is None
    (tmp_path / "pyproject.toml").write_text('[tool.sourcecheck]\nformat = "json"\n', encoding="utf-8")
    assert find_settings_file(tmp_path) == tmp_path / "pyproject.toml"
    (tmp_path / "sourcecheck.toml").write_text('format = "text"\n', encoding="utf-8")
    assert find_settings_file(tmp_path) == tmp_path / "sourcecheck.toml"  # the tool's own file wins


def test_settings_are_typed_and_paths_relative_to_the_file(tmp_path: Path) -> None:
    path = tmp_path / "sourcecheck.toml"
    path.write_text(
        'sources = "pdfs"\nfail-on = "adrift"\nquiet = true\nformat-in = "latex"\nignore = ["old-*"]\n',
        encoding="utf-8",
    )
    settings = load_settings(path, settings_parser())
    assert settings.values == {
        "sources": (tmp_path / "pdfs").resolve(),
        "fail_on": "adrift",
        "quiet": True,
        "format_in": "latex",
        "ignore": ["old-*"],
    }
    assert settings.unknown == ()


def test_flags_win_over_the_file(tmp_path: Path) -> None:
    path = tmp_path / "sourcecheck.toml"
    path.write_text('format = "json"\nfail-on = "loose"\nsources = "pdfs"\n', encoding="utf-8")
    args = _args("--fail-on", "conflict")
    merge(args, load_settings(path, settings_parser()))
    assert args.fail_on == "conflict" and args.format == "json" and args.sources == (tmp_path / "pdfs").resolve()


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ('fail-on = "anchored"\n', "is not one of loose, unverifiable, adrift, conflict"),
        ("quiet = 1\n", "must be true or false"),
        ("sources = 3\n", "must be a string"),
        ('ignore = "x"\n', "must be a list of glob patterns"),
        ("format = [\n", "cannot be read as TOML"),
    ],
)
def test_a_bad_value_is_one_clear_error(tmp_path: Path, text: str, message: str) -> None:
    path = tmp_path / "sourcecheck.toml"
    path.write_text(text, encoding="utf-8")
    with pytest.raises(SettingsError, match=message):
        load_settings(path, settings_parser())


def test_unknown_keys_are_collected_not_fatal(tmp_path: Path) -> None:
    path = tmp_path / "sourcecheck.toml"
    path.write_text('formt = "json"\noutput = "x.json"\n', encoding="utf-8")
    assert load_settings(path, settings_parser()).unknown == ("formt", "output")  # one run's output is no setting
