"""Load a script of bench/ as a module, so its functions can be tested without a subprocess."""

from __future__ import annotations

import importlib.util
import sys
from pathlib import Path
from types import ModuleType

BENCH = Path(__file__).resolve().parents[2] / "bench"


def load_script(name: str) -> ModuleType:
    """``bench/<name>.py`` imported under the module name ``bench_<name>`` (bench/ is not a package)."""
    spec = importlib.util.spec_from_file_location(f"bench_{name}", BENCH / f"{name}.py")
    assert spec and spec.loader
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module
    spec.loader.exec_module(module)
    return module
