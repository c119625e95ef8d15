"""Score claim-evidence pairs with the project's own int8 entailment model (ONNX Runtime, CPU).

Word overlap and embeddings cannot tell "the source says the claim" from "the source says the
opposite in the same words"; a cross-encoder trained on pairs that differ only in such a word
can. The model ships inside the package (``model/``), so nothing is downloaded; onnxruntime is
imported only when the first pairs are scored, so importing the judge stays fast.
"""

from __future__ import annotations

from collections.abc import Sequence
from pathlib import Path
from typing import TYPE_CHECKING

import numpy as np

from sourcecheck.errors import ModelUnavailable
from sourcecheck.judge.verifier.encoding import INPUT_NAMES, LABELS, encode_pairs, load_tokenizer

if TYPE_CHECKING:
    import onnxruntime
    from tokenizers import Tokenizer

MODEL_DIR = Path(__file__).resolve().parent / "model"
"""The shipped model folder: ``verifier.int8.onnx``, ``tokenizer.json``, ``MODEL_CARD.md``, ``weights.sha256``."""

MODEL_FILE = "verifier.int8.onnx"
TOKENIZER_FILE = "tokenizer.json"


def softmax(logits: np.ndarray) -> np.ndarray:
    """Row-wise softmax, shifted by the row maximum so large logits do not overflow."""
    shifted = logits - logits.max(axis=1, keepdims=True)
    exp = np.exp(shifted)
    return exp / exp.sum(axis=1, keepdims=True)


class Verifier:
    """Probabilities (supports, contradicts, neither) for (claim, evidence) pairs.

    ``model_dir`` is a folder holding an ONNX file and ``tokenizer.json``: the shipped one by
    default, or another local folder (a retrained model, a test model). ``model_file`` names
    the ONNX file inside it. ``threads`` caps ONNX Runtime's intra-op threads (the laptop has two).
    """

    def __init__(
        self,
        model_dir: Path | None = None,
        *,
        model_file: str = MODEL_FILE,
        threads: int = 2,
        batch_size: int = 32,
    ) -> None:
        self.model_dir = Path(model_dir) if model_dir is not None else MODEL_DIR
        self.model_path = self.model_dir / model_file
        self.threads = max(1, threads)
        self.batch_size = max(1, batch_size)
        self._session: onnxruntime.InferenceSession | None = None
        self._tokenizer: Tokenizer | None = None

    @property
    def labels(self) -> tuple[str, str, str]:
        """Column order of :meth:`score`."""
        return LABELS

    def _load(self) -> tuple[onnxruntime.InferenceSession, Tokenizer]:
        """Open the ONNX session and tokenizer once; a missing or broken file is one clear error."""
        if self._session is None or self._tokenizer is None:
            if not self.model_path.is_file():
                raise ModelUnavailable(f"{self.model_path}: verifier model not found")
            tokenizer = load_tokenizer(self.model_dir / TOKENIZER_FILE)
            import onnxruntime

            options = onnxruntime.SessionOptions()
            options.intra_op_num_threads = self.threads
            options.inter_op_num_threads = 1
            try:
                session = onnxruntime.InferenceSession(
                    str(self.model_path), options, providers=["CPUExecutionProvider"]
                )
            except Exception as exc:  # onnxruntime raises its own untyped errors on a bad file
                raise ModelUnavailable(f"{self.model_path}: not a loadable ONNX model ({exc})") from exc
            self._session, self._tokenizer = session, tokenizer
        return self._session, self._tokenizer

    def logits(self, pairs: Sequence[tuple[str, str]]) -> np.ndarray:
        """Raw model outputs, shape (len(pairs), 3), in the input order.

        Pairs are scored in batches of similar length so that padding (to the longest pair
        of a batch) wastes little time; the rows are put back in the caller's order.
        """
        if not pairs:
            return np.zeros((0, len(LABELS)), dtype=np.float32)
        session, tokenizer = self._load()
        wanted = {i.name for i in session.get_inputs()}
        order = sorted(range(len(pairs)), key=lambda i: len(pairs[i][0]) + len(pairs[i][1]))
        out = np.zeros((len(pairs), len(LABELS)), dtype=np.float32)
        for start in range(0, len(order), self.batch_size):
            chunk = order[start : start + self.batch_size]
            arrays = encode_pairs(tokenizer, [pairs[i] for i in chunk])
            feeds = {name: arrays[name] for name in INPUT_NAMES if name in wanted}
            out[chunk] = session.run(None, feeds)[0]
        return out

    def score(self, pairs: Sequence[tuple[str, str]]) -> np.ndarray:
        """Probabilities, shape (len(pairs), 3), columns supports / contradicts / neither; rows sum to 1."""
        return softmax(self.logits(pairs).astype(np.float64))
