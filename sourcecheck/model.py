"""The dataclasses that cross stage boundaries.

The pipeline is draft -> claims -> sources -> index -> judgment -> report. Each stage
takes and returns only the types defined here, so a stage can be rewritten (a new draft
format, another retriever) without the others noticing. Nothing in this module does work;
it is the vocabulary the stages share.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum
from pathlib import Path

from sourcecheck.limits import Limits


@dataclass(frozen=True)
class Problem:
    """One piece of bad input: the file it concerns and a one-line, human message.

    Problems are collected, never raised past a stage: a broken PDF must not stop the
    check of every other claim.
    """

    file: str
    message: str


# --- draft stage -----------------------------------------------------------------------


@dataclass(frozen=True)
class Reference:
    """One entry of the draft's reference list.

    ``key`` is how markers point at the entry: the number for numbered lists ("3"), or
    a generated author-year key ("okafor2019a") for author-year lists. ``authors`` holds
    family names in the order printed, because author-year markers name the first one.
    """

    key: str
    text: str
    authors: tuple[str, ...] = ()
    year: int | None = None
    year_suffix: str = ""
    title: str | None = None
    doi: str | None = None
    line: int = 0


@dataclass(frozen=True)
class Citation:
    """One cited work inside a marker, as written in the draft.

    A marker such as "[2, 5]" yields two citations that share ``marker``; ``label`` is
    the single work ("[2]"). ``key`` is the matching reference key, or None when the
    draft's reference list has no entry for it.
    """

    marker: str
    label: str
    key: str | None
    locator: str | None = None


@dataclass(frozen=True)
class Claim:
    """A sentence of the draft that carries at least one citation."""

    id: str
    text: str
    line: int
    citations: tuple[Citation, ...]
    file: str | None = None  # the file the sentence is in, when not the draft itself (LaTeX \input)
    #: What ``line`` counts: "line" for text formats, "paragraph" for Word, whose reader
    #: numbers paragraphs because a .docx has no lines a person could find.
    unit: str = "line"
    #: The author marked the sentence with an ignore comment in the draft's own comment
    #: syntax (``<!-- sourcecheck: ignore -->``, ``% sourcecheck: ignore``).
    ignored: bool = False


@dataclass
class Draft:
    """Everything the draft stage learned from one manuscript file."""

    path: str
    claims: list[Claim]
    references: list[Reference]
    problems: list[Problem] = field(default_factory=list)

    def uncited_references(self) -> list[Reference]:
        """Entries of the reference list that no marker points at."""
        cited = {c.key for claim in self.claims for c in claim.citations if c.key}
        return [r for r in self.references if r.key not in cited]


# --- sources stage ---------------------------------------------------------------------


@dataclass(frozen=True)
class Passage:
    """A few consecutive sentences of one source page: the unit that is retrieved and shown.

    ``source`` is the source's display path; ``page`` is the 1-based page of the PDF;
    ``ordinal`` is the passage's position within its source, so neighbours can be found.
    ``section`` is the role of the section it stands in (one of SECTION_ROLES, "" when the
    source names no sections) and ``place`` where in that section it falls, 0.0 first to
    1.0 last: a claim is backed by a work's own findings, which papers put in their
    results and conclusions, rarely in the background or the methods.
    """

    source: str
    page: int
    text: str
    ordinal: int
    section: str = ""
    place: float = 0.0


#: The roles a source's sections are sorted into (see sources/_sections.py for the headings).
SECTION_ROLES = ("abstract", "background", "methods", "results", "discussion", "conclusions", "back-matter")


@dataclass(frozen=True)
class SourceIdentity:
    """What a source PDF shows of its own identity, read from the file (sources/_identity.py).

    ``title`` is the first page's title as typeset (the largest type near the top; page 2
    when page 1 is a publisher's cover, then ``title_page`` is 2); ``metadata_title`` the
    document's own title field, kept only when the title page shows it; ``dois`` and
    ``arxiv_ids`` every identifier printed on the first pages; ``authors`` the first names
    as printed under the title ("Robert W Aldridge").
    """

    title: str | None = None
    metadata_title: str | None = None
    dois: tuple[str, ...] = ()
    arxiv_ids: tuple[str, ...] = ()
    authors: tuple[str, ...] = ()
    title_page: int = 1


@dataclass
class Source:
    """One readable source PDF: its identity, what can match it to a reference, and its passages."""

    path: str
    sha256: str
    pages: int
    title: str | None
    doi: str | None
    first_page_text: str
    passages: list[Passage]
    author: str | None = None
    #: The page number printed on each PDF page ("305"), None where none could be read;
    #: one entry per PDF page, or empty when the document shows no consistent numbering.
    printed_pages: tuple[str | None, ...] = ()
    #: What the file says it is, for matching references to it.
    identity: SourceIdentity = field(default_factory=SourceIdentity)


# --- matching (reference -> source) ----------------------------------------------------


class MatchMethod(StrEnum):
    """How a reference entry was tied to a source file; reported so a person can doubt it."""

    MAP = "map"
    DOI = "doi"
    TITLE = "title"
    AUTHOR_YEAR = "author-year"
    ARXIV = "arxiv"
    TITLE_IN_ENTRY = "title-in-entry"  # the source's title found inside the entry's text


@dataclass(frozen=True)
class SourceMatch:
    """A reference entry matched to a source file, with how and how sure."""

    key: str
    source: str
    method: MatchMethod
    similarity: float = 1.0
    #: How sure the match is, 0..1, from all the evidence together (sources/_match.py).
    confidence: float = 1.0
    #: The evidence in words ("doi on page 1; title found in the entry (97)").
    detail: str = ""


@dataclass(frozen=True)
class MatchRefusal:
    """Why a reference entry got no source: the closest file and what kept it out."""

    key: str
    candidate: str | None
    reason: str
    confidence: float = 0.0


# --- index stage -----------------------------------------------------------------------


@dataclass(frozen=True)
class Hit:
    """A passage retrieved for a query, with the evidence scores the judge reads.

    ``fused`` orders hits; ``dense`` is the cosine similarity of claim and passage; ``bm25``
    is the raw Okapi BM25 score; ``coverage`` the share of the claim's content words found
    in the passage.
    """

    passage: Passage
    fused: float
    dense: float
    bm25: float
    coverage: float


# --- judgment stage --------------------------------------------------------------------


class Band(StrEnum):
    """The one verdict each check gets. Their meaning is in the README."""

    ANCHORED = "anchored"
    LOOSE = "loose"
    CONFLICT = "conflict"
    ADRIFT = "adrift"
    UNVERIFIABLE = "unverifiable"


#: The bands from least to most severe, as ``--fail-on`` and the batch summary order them
#: (a design choice, no source; reasons in sourcecheck/workflow/gate.py).
BAND_SEVERITY: tuple[Band, ...] = (Band.ANCHORED, Band.LOOSE, Band.UNVERIFIABLE, Band.ADRIFT, Band.CONFLICT)


@dataclass(frozen=True)
class Reason:
    """A machine-readable code with the sentence a person reads."""

    code: str
    message: str


@dataclass(frozen=True)
class Evidence:
    """A passage shown to the user as support (or lack of it) for a claim."""

    text: str
    page: int
    score: float
    source: str
    printed_page: str | None = None  # the page number printed on that PDF page, when known
    section: str = ""  # the role of the section it stands in (SECTION_ROLES), "" when unknown


@dataclass(frozen=True)
class Review:
    """A person's word that one check was read and accepted, so gates and reports pass over it.

    ``origin`` is "review-file" (accepted with ``sourcecheck review accept``, kept in the
    file beside the draft while ``fingerprint`` still holds) or "ignore-comment" (marked in
    the draft itself). The tool still shows the check; it only stops counting it.
    """

    note: str
    origin: str
    fingerprint: str = ""
    accepted_on: str = ""


@dataclass
class Check:
    """One claim checked against one cited work."""

    citation: Citation
    reference: Reference | None
    source: str | None
    band: Band
    score: float
    reasons: list[Reason] = field(default_factory=list)
    evidence: list[Evidence] = field(default_factory=list)
    reviewed: Review | None = None


@dataclass
class ClaimResult:
    """A claim and the checks of every work it cites."""

    claim: Claim
    checks: list[Check]


# --- run -------------------------------------------------------------------------------


@dataclass(frozen=True)
class ReadOptions:
    """What the user told us about the draft beyond its path.

    ``bibliography`` is ``--bib`` (a .bib, .bbl, CSL-JSON or RIS file); ``format`` is
    ``--format-in``, which overrides the guess from the file's suffix; ``limits`` bounds
    what is read of a stranger's file (:mod:`sourcecheck.limits`).
    """

    bibliography: Path | None = None
    format: str | None = None
    limits: Limits = field(default_factory=Limits)


@dataclass
class RunStats:
    """What a run cost, counted as it goes: benchmarks and tests read it to prove the cache works.

    The one mutable type here: the pipeline adds to it while it runs.
    """

    sources_read: int = 0
    sources_from_cache: int = 0
    passages_embedded: int = 0
    claims_embedded: int = 0
    pairs_verified: int = 0  # claim-sentence pairs the verifier read (not from the cache)
    model_loaded: bool = False


# --- report ----------------------------------------------------------------------------


@dataclass(frozen=True)
class ModelInfo:
    """Which embedding model ran, and how, so a report can be reproduced.

    ``backend`` is ``onnx-int8`` or ``torch``: the two give slightly different vectors
    (int8 weights), so the same model folder can score a passage a hundredth apart.
    """

    name: str
    path: str
    backend: str = "onnx-int8"


@dataclass
class Report:
    """The whole result of one run: what the reporters render."""

    draft: str
    sources: str
    model: ModelInfo
    claims: list[ClaimResult]
    references: list[Reference]
    matches: dict[str, SourceMatch]
    unused_sources: list[str]
    problems: list[Problem]
    #: For unmatched references: the closest source file and why it was refused.
    refusals: dict[str, MatchRefusal] = field(default_factory=dict)

    def cited_keys(self) -> set[str]:
        """Reference keys that at least one citation in the text resolves to."""
        return {c.citation.key for r in self.claims for c in r.checks if c.citation.key}

    def uncited_references(self) -> list[Reference]:
        """Entries of the reference list that nothing in the text cites."""
        cited = self.cited_keys()
        return [r for r in self.references if r.key not in cited]

    def unmatched_references(self) -> list[Reference]:
        """Cited entries with no source file in the folder."""
        cited = self.cited_keys()
        return [r for r in self.references if r.key in cited and r.key not in self.matches]

    def band_counts(self) -> dict[Band, int]:
        """How many checks fell in each band, every band present (zero where none)."""
        counts = {band: 0 for band in Band}
        for result in self.claims:
            for check in result.checks:
                counts[check.band] += 1
        return counts
