"""Shared fixtures: the real embedding model is loaded once per test session."""

from __future__ import annotations

import os

import pytest

os.environ["HF_HUB_OFFLINE"] = "1"
os.environ["TRANSFORMERS_OFFLINE"] = "1"

from tests import report_schema

report_schema.install()


@pytest.fixture(scope="session")
def encoder():
    """The bundled MiniLM encoder, loaded once (about ten seconds on two cores)."""
    from sourcecheck.index.dense import Encoder, default_model_path

    return Encoder(default_model_path())
