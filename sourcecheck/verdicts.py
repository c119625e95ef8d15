"""The trained verifier as the pipeline runs it: the shipped model or a user's, its readings cached.

Kept beside the pipeline because it joins two stages: the judge's verifier and the index's
cache. A warm run finds every reading in the cache and never loads the model.
"""

from __future__ import annotations

import hashlib
from collections.abc import Sequence
from functools import lru_cache
from pathlib import Path

import numpy as np

from sourcecheck.errors import ModelUnavailable
from sourcecheck.index import Cache, text_key
from sourcecheck.judge import VERIFIER_DIR, VERIFIER_FILE, Verifier
from sourcecheck.model import RunStats


class CachedScorer:
    """The verifier's probabilities, cached per set of pairs, so a warm run loads no model.

    Keyed by the model file's hash and the pairs' text; stored (and handed back, even when
    fresh) as float32, so a cold and a warm run judge on the very same numbers.
    """

    def __init__(self, verifier: Verifier, cache: Cache, stats: RunStats) -> None:
        self.verifier = verifier
        self.cache = cache
        self.stats = stats
        self._fingerprint: str | None = None

    @property
    def fingerprint(self) -> str:
        if self._fingerprint is None:
            stat = self.verifier.model_path.stat()
            self._fingerprint = _file_digest(str(self.verifier.model_path), stat.st_size, stat.st_mtime_ns)
        return self._fingerprint

    def score(self, pairs: Sequence[tuple[str, str]]) -> np.ndarray:
        key = text_key(self.fingerprint, *(f"{claim}\x1f{evidence}" for claim, evidence in pairs))
        cached = self.cache.load_vectors("verdicts", key, len(pairs))
        if cached is not None:
            return cached.astype(np.float64)
        fresh = np.asarray(self.verifier.score(pairs), dtype=np.float32)
        self.cache.save_vectors("verdicts", key, fresh)
        self.stats.pairs_verified += len(pairs)
        return fresh.astype(np.float64)


@lru_cache(maxsize=8)
def _file_digest(path: str, size: int, mtime_ns: int) -> str:
    """sha256 of a model file, hashed once per process while its size and time stay (34 MB for the shipped one)."""
    return hashlib.sha256(Path(path).read_bytes()).hexdigest()


def make_verifier(path: str | None) -> Verifier:
    """The shipped verifier, or the local model folder ``path`` (``--verifier``)."""
    if path is None:
        return Verifier(VERIFIER_DIR)
    folder = Path(path).expanduser()
    if not (folder / VERIFIER_FILE).is_file():
        raise ModelUnavailable(f"{folder}: no verifier model ({VERIFIER_FILE}) in folder")
    return Verifier(folder)
