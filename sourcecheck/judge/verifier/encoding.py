"""Turn (claim, evidence) pairs into the model's input arrays, the same way in training and at run time.

The verifier is a cross-encoder: claim and evidence go through the model together as one
BERT pair ``[CLS] claim [SEP] evidence [SEP]``. Training (scripts/verifier/train.py) and
scoring both call :func:`encode_pairs`, so the truncation and padding the weights were
trained with are exactly the ones they meet later.
"""

from __future__ import annotations

from collections.abc import Sequence
from pathlib import Path

import numpy as np
from tokenizers import Tokenizer

from sourcecheck.errors import ModelUnavailable

LABELS: tuple[str, str, str] = ("supports", "contradicts", "neither")
"""Output order of the verifier's three probabilities."""

MAX_LENGTH = 128
"""Tokens per pair; claims and single evidence sentences rarely need more (longest first is cut)."""

INPUT_NAMES: tuple[str, str, str] = ("input_ids", "attention_mask", "token_type_ids")


def load_tokenizer(path: Path, max_length: int = MAX_LENGTH) -> Tokenizer:
    """Read a ``tokenizer.json`` and set pair truncation and padding to the longest in a batch.

    Dynamic padding (to the longest pair of each batch, not to ``max_length``) keeps short
    pairs cheap, which matters on a two-core laptop.
    """
    if not path.is_file():
        raise ModelUnavailable(f"{path}: tokenizer file not found")
    try:
        tokenizer = Tokenizer.from_file(str(path))
    except Exception as exc:  # tokenizers raises a bare Exception on a malformed file
        raise ModelUnavailable(f"{path}: not a readable tokenizer ({exc})") from exc
    tokenizer.enable_truncation(max_length=max_length, strategy="longest_first")
    pad_id = tokenizer.token_to_id("[PAD]")
    tokenizer.enable_padding(pad_id=0 if pad_id is None else pad_id, pad_token="[PAD]")
    return tokenizer


def encode_pairs(tokenizer: Tokenizer, pairs: Sequence[tuple[str, str]]) -> dict[str, np.ndarray]:
    """The int64 arrays ``input_ids``, ``attention_mask``, ``token_type_ids`` for a batch of pairs."""
    encodings = tokenizer.encode_batch([(claim, evidence) for claim, evidence in pairs])
    return {
        "input_ids": np.asarray([e.ids for e in encodings], dtype=np.int64),
        "attention_mask": np.asarray([e.attention_mask for e in encodings], dtype=np.int64),
        "token_type_ids": np.asarray([e.type_ids for e in encodings], dtype=np.int64),
    }
