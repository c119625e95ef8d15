"""The sources stage: read source PDFs into passages, and match references to them.

Public surface (everything else in this package is private and may change):

    EXTRACTOR_VERSION   changes whenever passages for the same bytes would differ;
                        part of the cache key
    discover_pdfs       the PDFs in a sources folder
    find_pdfs           the same, with the problems met (links out, unreadable folders, size)
    file_sha256         a file's content hash
    read_source         one PDF -> Source, or a Problem (never raises)
    read_sources_in_parallel  many PDFs within the limits -> Source or Problem and notes each, in order
    default_jobs        how many workers: one per core
    load_mapping        the --map file -> {reference key: file}
    match_references    reference entries -> SourceMatch per key, plus mapping problems
    match_sources       the same as a MatchOutcome: also why each unmatched entry has no file
    MatchOutcome        matches, refusals, problems and one line per unmatched entry
"""

from __future__ import annotations

from sourcecheck.sources._files import discover_pdfs, file_sha256, find_pdfs
from sourcecheck.sources._mapping import load_mapping
from sourcecheck.sources._match import MatchOutcome, match_references, match_sources
from sourcecheck.sources._parallel import default_jobs, read_sources_in_parallel
from sourcecheck.sources._reader import read_source

#: Bump on any change to extraction, cleaning or passage cutting.
EXTRACTOR_VERSION = "sources-8"

__all__ = [
    "EXTRACTOR_VERSION",
    "MatchOutcome",
    "default_jobs",
    "discover_pdfs",
    "file_sha256",
    "find_pdfs",
    "load_mapping",
    "match_references",
    "match_sources",
    "read_source",
    "read_sources_in_parallel",
]
