"""The bundled model folder, for the tests that export and run it."""

from __future__ import annotations

from pathlib import Path

import pytest


@pytest.fixture(scope="session")
def encoder_path() -> Path:
    from sourcecheck.index.dense import default_model_path

    return default_model_path()
