"""Settings from a file beside the draft, so a project states its sources and gate once.

Read from the draft's folder: ``sourcecheck.toml`` (keys at the top level or under
``[tool.sourcecheck]``), else a ``pyproject.toml`` with a ``[tool.sourcecheck]`` table
(the packaging standard's place for a tool's settings, PEP 518). Keys are the long
options of ``sourcecheck check`` without the dashes (``sources``, ``fail-on``,
``format-in``, ...), plus ``ignore``: glob patterns of files to leave out when a folder
of drafts is checked. Paths are relative to the file's folder. A flag on the command line
always wins over the file.

No threshold of the judge is a setting: the band thresholds and weights are fitted on
data (README, "How scores were calibrated"), and a hand-set one would make the bands mean
something else. The gate (``fail-on``) is the threshold a project chooses.
"""

from __future__ import annotations

import argparse
import tomllib
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from sourcecheck.errors import SettingsError

CONFIG_NAMES = ("sourcecheck.toml", "pyproject.toml")
#: Keys that are not command-line options.
EXTRA_KEYS = ("ignore",)
#: Options that make no sense in a shared file: one run's output, one machine's cores.
NOT_SETTINGS = ("output", "help", "version", "config", "jobs")


@dataclass(frozen=True)
class Settings:
    """What a configuration file said, by option destination (``fail_on``), paths made absolute."""

    file: Path | None = None
    values: dict[str, Any] = field(default_factory=dict)
    unknown: tuple[str, ...] = ()


def _table(path: Path) -> dict[str, Any] | None:
    """The sourcecheck table of ``path``; None for a pyproject.toml without one."""
    try:
        data = tomllib.loads(path.read_text(encoding="utf-8"))
    except (OSError, UnicodeDecodeError, tomllib.TOMLDecodeError) as exc:
        raise SettingsError(f"{path}: cannot be read as TOML ({exc})") from exc
    tool = data.get("tool", {})
    table = tool.get("sourcecheck") if isinstance(tool, dict) else None
    if path.name == "pyproject.toml":
        return table if isinstance(table, dict) else None
    if table is not None:
        return table if isinstance(table, dict) else {}
    return {k: v for k, v in data.items() if k != "tool"}


def find_settings_file(folder: Path) -> Path | None:
    """The first file of CONFIG_NAMES in ``folder`` that holds sourcecheck settings."""
    for name in CONFIG_NAMES:
        candidate = folder / name
        if candidate.is_file() and _table(candidate) is not None:
            return candidate
    return None


def _option_actions(parser: argparse.ArgumentParser) -> dict[str, argparse.Action]:
    """Setting key ("fail-on") -> the parser's action for that long option."""
    actions = {}
    for action in parser._actions:  # argparse offers no public list of a parser's actions
        longs = [s for s in action.option_strings if s.startswith("--")]
        if longs and action.dest not in NOT_SETTINGS:
            actions[longs[0][2:]] = action
    return actions


def _converted(path: Path, key: str, value: Any, action: argparse.Action | None) -> Any:
    """A setting's value checked and typed as its command-line option would be."""
    where = f"{path}: {key} = {value!r}"
    if action is None:  # ignore
        if not (isinstance(value, list) and all(isinstance(v, str) for v in value)):
            raise SettingsError(f"{where} must be a list of glob patterns")
        return list(value)
    if action.nargs == 0:  # a switch such as --quiet
        if not isinstance(value, bool):
            raise SettingsError(f"{where} must be true or false")
        return value
    if not isinstance(value, str):
        raise SettingsError(f"{where} must be a string")
    if action.choices is not None and value not in action.choices:
        raise SettingsError(f"{where} is not one of {', '.join(map(str, action.choices))}")
    if action.type is Path:
        return (path.parent / value).resolve() if not Path(value).is_absolute() else Path(value)
    return value


def load_settings(path: Path, parser: argparse.ArgumentParser) -> Settings:
    """The settings in ``path``, checked against the options of ``parser`` (the check command's)."""
    table = _table(path) or {}
    actions = _option_actions(parser)
    values: dict[str, Any] = {}
    unknown = []
    for key, value in table.items():
        if key in EXTRA_KEYS:
            values[key] = _converted(path, key, value, None)
        elif key in actions:
            values[actions[key].dest] = _converted(path, key, value, actions[key])
        else:
            unknown.append(key)
    return Settings(path, values, tuple(unknown))


def known_keys(parser: argparse.ArgumentParser) -> list[str]:
    """Every key a settings file may hold, for the message about an unknown one."""
    return sorted([*_option_actions(parser), *EXTRA_KEYS])


def merge(args: argparse.Namespace, settings: Settings) -> None:
    """Fill every option the command line left unset (None) from ``settings``: flags win."""
    for dest, value in settings.values.items():
        if getattr(args, dest, None) is None:
            setattr(args, dest, value)
