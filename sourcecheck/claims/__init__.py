"""The claims stage: prose blocks -> claims, each with its citations resolved.

Every draft reader cuts its format into blocks of prose and hands them here: citation
markers (:mod:`.markers`: numeric, ranges, author–year, with page locators), their
resolution to the reference list (:mod:`.resolve`) and the sentences that carry them
(:mod:`.extract`). :func:`claim_query` is the claim as searched and judged.
"""

from __future__ import annotations

from sourcecheck.claims.extract import Block, Sentence, citations_from, claim_query, extract_claims
from sourcecheck.claims.markers import Marker, mask_markup
from sourcecheck.claims.resolve import Resolver

__all__ = [
    "Block",
    "Marker",
    "Resolver",
    "Sentence",
    "citations_from",
    "claim_query",
    "extract_claims",
    "mask_markup",
]
