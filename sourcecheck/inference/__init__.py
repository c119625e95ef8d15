"""Shared layer: running transformer models with ONNX Runtime on the CPU, int8 by default.

Every model the program runs (the passage embedder of the index, a verifier of the judge)
goes the same way: the weights shipped as a local Hugging Face folder are exported to ONNX
once, quantised to int8 by ONNX Runtime's dynamic quantisation, and kept in the user's
model cache under the hash of the source weights (:func:`int8_model`); a run then needs
only ``onnxruntime`` and ``tokenizers`` (:func:`open_session`, :func:`load_tokenizer`,
:func:`pad_batch`), never torch. Nothing here reaches the network.
"""

from __future__ import annotations

from sourcecheck.inference._build import Head, default_model_cache, int8_model, weights_digest
from sourcecheck.inference._session import Batch, load_tokenizer, open_session, pad_batch

__all__ = [
    "Batch",
    "Head",
    "default_model_cache",
    "int8_model",
    "load_tokenizer",
    "open_session",
    "pad_batch",
    "weights_digest",
]
