"""Judging one citation of one claim: the rule a person follows with the PDF open.

Look up the reference and its matched file (else ``unverifiable``); search the cited
pages first when the citation names some, and the whole source; check quotations against
the whole text; judge on the passages found; note ``page-mismatch`` when the backing is
elsewhere and ``better-source`` when another file of the folder says it clearly better.

The search is passed in (:class:`Search`), so this stage knows nothing of how passages
are indexed or ranked: the pipeline hands it the index's search with the fitted weights.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Protocol

import numpy as np

from sourcecheck.judge.calibration import Calibration
from sourcecheck.judge.locators import cited_pages, pdf_pages, prefers_located
from sourcecheck.judge.quotes import check_quotes, quotations
from sourcecheck.judge.reading import PairScorer
from sourcecheck.judge.verdict import (
    better_source_reason,
    judge,
    page_mismatch_reason,
    unverifiable,
    wants_better_source,
    with_printed_pages,
)
from sourcecheck.model import Check, Citation, Claim, Hit, Reason, Reference, Source, SourceMatch

#: How many passages of the cited source are searched and judged.
EVIDENCE_SEARCHED = 3
#: How many passages of the whole folder the better-source search reads.
BETTER_SOURCE_SEARCHED = 8


class Search(Protocol):
    """The best ``k`` passages for a claim, within ``source`` (and ``pages``) or folder-wide."""

    def __call__(
        self, text: str, vector: np.ndarray, source: str | None, pages: set[int] | None = None, k: int = 3
    ) -> list[Hit]: ...


def page_texts(source: Source) -> list[tuple[int, str]]:
    """Each page's evidence text (its passages joined), for checks that read a whole source."""
    pages: dict[int, list[str]] = {}
    for passage in source.passages:
        pages.setdefault(passage.page, []).append(passage.text)
    return [(page, " ".join(texts)) for page, texts in sorted(pages.items())]


@dataclass
class CitationJudge:
    """Everything one citation's check reads, gathered once per run."""

    references: dict[str, Reference]
    matches: dict[str, SourceMatch]
    sources: dict[str, Source]
    calibration: Calibration
    search: Search
    scorer: PairScorer | None = None  # the entailment verifier; None leaves its features at 0

    def evidence_for(
        self, text: str, vector: np.ndarray, source: str | None, pages: set[int] | None = None
    ) -> list[Hit]:
        """The passages a check of ``source`` reads (see :data:`EVIDENCE_SEARCHED`)."""
        return self.search(text, vector, source, pages=pages, k=EVIDENCE_SEARCHED)

    def check(self, claim: Claim, claim_text: str, vector: np.ndarray, citation: Citation) -> Check:
        """Judge one citation of a claim against its matched source.

        A citation with a page locator is judged on the cited pages when they back the
        claim about as well as the whole source does
        (:func:`~sourcecheck.judge.locators.prefers_located`); otherwise on the whole
        source, with a ``page-mismatch`` reason naming where the backing is.
        """
        if citation.key is None or citation.key not in self.references:
            return unverifiable(
                citation,
                None,
                None,
                Reason("marker-unresolved", f"{citation.label} has no entry in the reference list"),
            )
        reference = self.references[citation.key]
        match = self.matches.get(reference.key)
        if match is None:
            return unverifiable(
                citation,
                reference,
                None,
                Reason("source-missing", f"no readable PDF in the sources folder matches reference {citation.label}"),
            )
        source = self.sources.get(match.source)
        hits = self.evidence_for(claim_text, vector, match.source)
        printed = source.printed_pages if source is not None else ()
        mismatch: tuple[Hit, bool] | None = None  # (where the backing is, whether the cited page exists)
        cited = cited_pages(citation.locator)
        if cited and hits and source is not None:
            wanted = pdf_pages(cited, printed, source.pages)
            located = self.evidence_for(claim_text, vector, match.source, pages=wanted) if wanted else []
            if prefers_located(located, hits):
                hits = located
            else:
                mismatch = (hits[0], bool(wanted))
        quotes = check_quotes(claim_text, page_texts(source)) if source is not None and quotations(claim_text) else []
        check = judge(
            claim_text, citation, reference, match.source, hits, self.calibration, quotes=quotes, scorer=self.scorer
        )
        check = with_printed_pages(check, printed)
        if mismatch is not None and citation.locator:
            reason = page_mismatch_reason(check, citation.locator, mismatch[0], printed, page_exists=mismatch[1])
            if reason is not None:
                check.reasons.append(reason)
        better = self._better_source(check, claim, claim_text, vector)
        if better is not None:
            check.reasons.append(better)
        return check

    def check_claim(self, claim: Claim, claim_text: str, vector: np.ndarray) -> list[Check]:
        """One check per cited work of ``claim``."""
        return [self.check(claim, claim_text, vector, citation) for citation in claim.citations]

    def _better_source(self, check: Check, claim: Claim, claim_text: str, vector: np.ndarray) -> Reason | None:
        if not wants_better_source(check):
            return None  # the folder-wide search is skipped for every backed check
        # Another work this claim already cites is no "better source": the author cited both.
        cited_here = {self.matches[c.key].source for c in claim.citations if c.key in self.matches}
        hits = self.search(claim_text, vector, None, k=BETTER_SOURCE_SEARCHED)
        alternatives: Sequence[Hit] = [h for h in hits if h.passage.source not in cited_here]
        if not alternatives:
            return None
        return better_source_reason(check, alternatives[0], claim_text, self.calibration, self.scorer)
