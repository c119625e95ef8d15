"""Opening an ONNX Runtime session and feeding it tokenised text.

The tokenizer is the model folder's own ``tokenizer.json`` read by ``tokenizers`` (the Rust
library transformers itself uses), so the token ids match the model's training exactly.
"""

from __future__ import annotations

import os
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import numpy as np

from sourcecheck.errors import ModelUnavailable


@dataclass(frozen=True)
class Batch:
    """Padded model inputs for one batch of texts (right padding with id 0, mask 0)."""

    input_ids: np.ndarray
    attention_mask: np.ndarray
    token_type_ids: np.ndarray

    def feed(self, names: Sequence[str]) -> dict[str, np.ndarray]:
        """The inputs a session asks for, by name (some exports take no token types)."""
        arrays = {
            "input_ids": self.input_ids,
            "attention_mask": self.attention_mask,
            "token_type_ids": self.token_type_ids,
        }
        return {name: arrays[name] for name in names}


def load_tokenizer(folder: Path, max_length: int) -> Any:
    """The folder's fast tokenizer, truncating at ``max_length`` tokens and never padding."""
    from tokenizers import Tokenizer

    path = folder / "tokenizer.json"
    if not path.is_file():
        raise ModelUnavailable(f"{folder}: no tokenizer.json in the model folder")
    tokenizer = Tokenizer.from_file(str(path))
    tokenizer.enable_truncation(max_length)
    tokenizer.no_padding()
    return tokenizer


def pad_batch(encodings: Sequence[Any]) -> Batch:
    """Stack ``tokenizers`` encodings into right-padded int64 arrays of the longest one's length."""
    length = max((len(e.ids) for e in encodings), default=0)
    ids = np.zeros((len(encodings), length), dtype=np.int64)
    mask = np.zeros_like(ids)
    types = np.zeros_like(ids)
    for row, encoding in enumerate(encodings):
        n = len(encoding.ids)
        ids[row, :n] = encoding.ids
        mask[row, :n] = encoding.attention_mask
        types[row, :n] = encoding.type_ids
    return Batch(ids, mask, types)


def open_session(path: Path, threads: int | None = None) -> Any:
    """A CPU inference session on ``path``, with one intra-op thread per core unless told otherwise."""
    import onnxruntime

    options = onnxruntime.SessionOptions()
    options.intra_op_num_threads = threads or os.cpu_count() or 1
    options.inter_op_num_threads = 1
    options.log_severity_level = 3  # errors only: its notices would break the one-line contract
    try:
        return onnxruntime.InferenceSession(str(path), options, providers=["CPUExecutionProvider"])
    except Exception as exc:  # a corrupt file is one line for the user
        raise ModelUnavailable(f"{path}: ONNX model will not load ({exc})") from exc
