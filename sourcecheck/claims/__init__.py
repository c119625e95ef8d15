"""The claims stage: prose blocks -> claims, each with its citations resolved.

Every draft reader cuts its format into blocks of prose and hands them here: citation
markers (:mod:`.markers`: numeric, ranges, author–year, with page locators), their
resolution to the reference list (:mod:`.resolve`) and the sentences that carry them
(:mod:`.extract`), all within the limits of :mod:`.bounds`. :func:`claim_query` is the claim as searched and judged.
"""

from __future__ import annotations

from sourcecheck.claims.bounds import bound_blocks, bound_citations, cut_draft, reading_lengths
from sourcecheck.claims.extract import Block, Sentence, citations_from, claim_query, extract_claims
from sourcecheck.claims.markers import Marker, mask_markup
from sourcecheck.claims.resolve import Resolver

__all__ = [
    "Block",
    "Marker",
    "Resolver",
    "Sentence",
    "bound_blocks",
    "bound_citations",
    "citations_from",
    "claim_query",
    "cut_draft",
    "extract_claims",
    "mask_markup",
    "reading_lengths",
]
