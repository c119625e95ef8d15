"""The index stage: passages -> vectors and a searchable, ranked evidence index.

The embedding model (:mod:`.dense`, ONNX int8 or torch), embeddings made on request and
stored by text hash (:mod:`.vectors`), Okapi BM25 over every passage of the folder
(:mod:`.lexical`), the lexical pre-filter, fused first stage and learnt second-stage
ranker (:mod:`.search`, :mod:`.ranking`), and the on-disk cache of sources (:mod:`.cache`).
"""

from __future__ import annotations

from sourcecheck.index.cache import Cache, default_cache_dir, text_key
from sourcecheck.index.dense import BACKENDS, DEFAULT_BACKEND, Encoder, resolve_model_path
from sourcecheck.index.ranking import RANK_FEATURES, Ranker
from sourcecheck.index.ranking import features as rank_features
from sourcecheck.index.search import DENSE_WEIGHT, PREFILTER_DEPTH, RERANK_DEPTH, EvidenceIndex
from sourcecheck.index.vectors import LazyVectors, VectorStore, vector_key

__all__ = [
    "BACKENDS",
    "DEFAULT_BACKEND",
    "DENSE_WEIGHT",
    "PREFILTER_DEPTH",
    "RANK_FEATURES",
    "RERANK_DEPTH",
    "Cache",
    "Encoder",
    "EvidenceIndex",
    "LazyVectors",
    "Ranker",
    "VectorStore",
    "default_cache_dir",
    "rank_features",
    "resolve_model_path",
    "text_key",
    "vector_key",
]
