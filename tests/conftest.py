"""Shared fixtures: the real embedding model is loaded once per test session."""

from __future__ import annotations

import os

import pytest

os.environ["HF_HUB_OFFLINE"] = "1"
os.environ["TRANSFORMERS_OFFLINE"] = "1"

from hypothesis import HealthCheck, settings

from tests import report_schema

report_schema.install()

# Property tests run few examples in `make test`; HYPOTHESIS_PROFILE=long (scripts/fuzz.py
# without atheris, or by hand) runs many. No deadline: the suite has no timed tests.
settings.register_profile(
    "default", max_examples=25, deadline=None, database=None, suppress_health_check=[HealthCheck.too_slow]
)
settings.register_profile(
    "long", max_examples=20_000, deadline=None, database=None, suppress_health_check=[HealthCheck.too_slow]
)
settings.load_profile(os.environ.get("HYPOTHESIS_PROFILE", "default"))


@pytest.fixture(scope="session")
def encoder():
    """The bundled MiniLM encoder, loaded once (about ten seconds on two cores)."""
    from sourcecheck.index.dense import Encoder, default_model_path

    return Encoder(default_model_path())
