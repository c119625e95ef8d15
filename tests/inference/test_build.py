"""Int8 models made once per set of weights, and the memoised weights hash."""

from __future__ import annotations

import hashlib
from pathlib import Path

import numpy as np
import pytest

from sourcecheck.errors import ModelUnavailable
from sourcecheck.inference import (
    default_model_cache,
    int8_model,
    load_tokenizer,
    open_session,
    pad_batch,
    weights_digest,
)
from sourcecheck.inference._build import MEMO_FROM_BYTES


def test_digest_is_the_sha256_of_the_named_files_and_follows_their_content(tmp_path: Path) -> None:
    (tmp_path / "model.safetensors").write_bytes(b"one")
    first = weights_digest(tmp_path, ("model.safetensors", "config.json"))
    # Built from the SHA-256 of each file present (Python's hashlib, FIPS 180-4), so it can be recomputed.
    expected = hashlib.sha256(b"model.safetensors" + hashlib.sha256(b"one").hexdigest().encode()).hexdigest()
    assert first == expected[:16]
    (tmp_path / "model.safetensors").write_bytes(b"two")
    assert weights_digest(tmp_path, ("model.safetensors", "config.json")) != first


def test_large_files_are_hashed_once_and_remembered(tmp_path: Path) -> None:
    weights = tmp_path / "model.safetensors"
    weights.write_bytes(b"\1" * MEMO_FROM_BYTES)
    memo = tmp_path / "memo" / "digests.json"
    first = weights_digest(tmp_path, ("model.safetensors",), memo=memo)
    assert memo.is_file() and str(weights.resolve()) in memo.read_text(encoding="utf-8")
    assert weights_digest(tmp_path, ("model.safetensors",), memo=memo) == first
    weights.write_bytes(b"\2" * (MEMO_FROM_BYTES + 1))  # new size: the memo no longer applies
    assert weights_digest(tmp_path, ("model.safetensors",), memo=memo) != first


def test_a_folder_without_weights_is_one_clear_error(tmp_path: Path) -> None:
    with pytest.raises(ModelUnavailable, match="no model weights"):
        int8_model(tmp_path, cache=tmp_path / "cache")


def test_the_int8_model_is_made_once_and_runs_without_torch(encoder_path: Path) -> None:
    # The shared model cache: the export costs tens of seconds, and it is keyed by the weights' hash.
    path = int8_model(encoder_path)
    assert path.is_file() and path.is_relative_to(default_model_cache())
    stamp = path.stat().st_mtime_ns
    assert int8_model(encoder_path) == path and path.stat().st_mtime_ns == stamp  # not made again
    session = open_session(path, threads=1)
    tokenizer = load_tokenizer(encoder_path, 256)
    batch = pad_batch(tokenizer.encode_batch(["Heron nests rose.", "Tide gauges were read hourly at dawn."]))
    hidden = session.run(None, batch.feed([i.name for i in session.get_inputs()]))[0]
    assert hidden.shape == (*batch.input_ids.shape, 384)  # all-MiniLM-L6-v2: 384 dimensions (its model card)
    assert np.isfinite(hidden).all()


def test_padding_is_on_the_right_with_a_zero_mask(encoder_path: Path) -> None:
    tokenizer = load_tokenizer(encoder_path, 256)
    batch = pad_batch(tokenizer.encode_batch(["heron", "heron nests rose sharply"]))
    # BERT's uncased vocabulary: [CLS] is id 101, [SEP] 102, [PAD] 0 (bert-base-uncased vocab.txt, from memory).
    assert batch.input_ids[0, 0] == 101 and 102 in batch.input_ids[0]
    assert batch.attention_mask[0].tolist() == [1, 1, 1] + [0] * (batch.input_ids.shape[1] - 3)
    assert batch.input_ids[0, 3:].tolist() == [0] * (batch.input_ids.shape[1] - 3)
    assert batch.attention_mask[1].all()
