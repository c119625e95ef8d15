"""The project's own entailment verifier: does a source sentence support, contradict or not address a claim?

A small cross-encoder fine-tuned from the packaged all-MiniLM-L6-v2 weights (see
``model/MODEL_CARD.md``), shipped as int8 ONNX and run with ONNX Runtime on the CPU.
"""

from sourcecheck.judge.verifier.encoding import INPUT_NAMES, LABELS, MAX_LENGTH, encode_pairs, load_tokenizer
from sourcecheck.judge.verifier.scorer import MODEL_DIR, MODEL_FILE, TOKENIZER_FILE, Verifier

__all__ = [
    "INPUT_NAMES",
    "LABELS",
    "MAX_LENGTH",
    "MODEL_DIR",
    "MODEL_FILE",
    "TOKENIZER_FILE",
    "Verifier",
    "encode_pairs",
    "load_tokenizer",
]
