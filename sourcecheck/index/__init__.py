"""The index stage: passages -> vectors and a searchable, ranked evidence index.

The embedding model (:mod:`.dense`), Okapi BM25 over every passage of the folder
(:mod:`.lexical`), the fused first stage and the learnt second-stage ranker
(:mod:`.search`, :mod:`.ranking`), and the on-disk cache of sources and vectors
(:mod:`.cache`).
"""

from __future__ import annotations

from sourcecheck.index.cache import Cache, default_cache_dir, text_key
from sourcecheck.index.dense import Encoder, resolve_model_path
from sourcecheck.index.ranking import RANK_FEATURES, Ranker
from sourcecheck.index.ranking import features as rank_features
from sourcecheck.index.search import DENSE_WEIGHT, RERANK_DEPTH, EvidenceIndex

__all__ = [
    "DENSE_WEIGHT",
    "RANK_FEATURES",
    "RERANK_DEPTH",
    "Cache",
    "Encoder",
    "EvidenceIndex",
    "Ranker",
    "default_cache_dir",
    "rank_features",
    "resolve_model_path",
    "text_key",
]
