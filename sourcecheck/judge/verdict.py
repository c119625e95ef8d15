"""From evidence to one band, a score and the reasons a person reads.

Order of the rules (each stated in the README):
1. no reference entry, no matched file, or an unreadable file -> ``unverifiable``;
2. nothing in the cited source resembles the claim (the topical score, which ignores the
   number checks, is below the adrift threshold) -> ``adrift``;
3. the best passage gives another value for a number of the claim, or negates it, or
   states the opposite direction -> ``conflict``;
4. the backing score reaches the anchored threshold, every number is found, every
   quotation is verbatim, and the claim neither overstates the source's certainty nor
   widens its scope -> ``anchored``;
5. otherwise -> ``loose`` (one of those gaps, or the passage only partly says the claim).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import replace

from sourcecheck.judge.calibration import Calibration
from sourcecheck.judge.features import Features, features_of
from sourcecheck.judge.locators import page_label
from sourcecheck.judge.number_checks import in_claim_unit
from sourcecheck.judge.quotes import QuoteFinding, drift_message
from sourcecheck.judge.reading import PairScorer
from sourcecheck.model import Band, Check, Citation, Evidence, Hit, Reason, Reference
from sourcecheck.text import trim

EVIDENCE_SHOWN = 2


def _page(hit: Hit) -> str:
    return f"p. {hit.passage.page}"


def unverifiable(citation: Citation, reference: Reference | None, source: str | None, reason: Reason) -> Check:
    """A check that cannot be made: the reason says what is missing."""
    return Check(
        citation=citation,
        reference=reference,
        source=source,
        band=Band.UNVERIFIABLE,
        score=0.0,
        reasons=[reason],
    )


def topical_score(calibration: Calibration, features: Features) -> float:
    """The backing score with the number and wording checks left out: is the passage about the claim?"""
    return calibration.score(features.topical())


def judge(
    claim: str,
    citation: Citation,
    reference: Reference | None,
    source: str,
    hits: list[Hit],
    calibration: Calibration,
    quotes: Sequence[QuoteFinding] = (),
    scorer: PairScorer | None = None,
) -> Check:
    """Band, score, reasons and evidence for ``claim`` against the hits of its cited source.

    ``quotes`` are the claim's quotations checked against the whole cited source
    (:func:`sourcecheck.judge.quotes.check_quotes`); one that is not verbatim keeps the
    check from ``anchored``.
    """
    if not hits:
        return unverifiable(
            citation,
            reference,
            source,
            Reason("source-unreadable", f"{source} has no readable text to check against"),
        )
    features = features_of(claim, hits, scorer)
    score = calibration.score(features)
    topical = topical_score(calibration, features)
    best = hits[0]
    evidence = [
        Evidence(
            text=h.passage.text,
            page=h.passage.page,
            score=round(max(0.0, min(1.0, h.dense)), 3),
            source=h.passage.source,
            section=h.passage.section,
        )
        for h in hits[:EVIDENCE_SHOWN]
    ]
    match_words = f"similarity {features.dense:.2f}, {features.coverage:.0%} of the claim's content words"
    conflicts = [
        Reason(
            "number-mismatch",
            f"claim says {f.claim.text}, source says {f.counterpart.text}"
            f"{in_claim_unit(f.claim, f.counterpart)} ({_page(best)})",
        )
        for f in features.numbers
        if f.counterpart is not None
    ] + [Reason(c.code, f"{c.message} ({_page(best)})") for c in features.conflict_cues]
    reading = features.reading
    if reading is not None and reading.contradict >= calibration.contradict_at and reading.contradict > reading.entail:
        conflicts.append(
            Reason(
                "contradicted",
                f'the source reads against the claim: "{trim(reading.contradicting, 45)}" '
                f"({_page(best)}; verifier {reading.contradict:.2f})",
            )
        )
    gaps = [
        Reason(
            "number-absent",
            f"claim says {f.claim.text}; the cited source's closest passages ({_page(best)}) do not",
        )
        for f in features.numbers
        if f.counterpart is None
    ]
    gaps += [Reason(c.code, f"{c.message} ({_page(best)})") for c in features.weak_cues]
    gaps += [Reason("quote-drift", drift_message(q)) for q in quotes if not q.verbatim]
    if topical < calibration.adrift_below:
        band = Band.ADRIFT
        reasons = [
            Reason("no-match", f"nothing in {source} resembles the claim (closest: {_page(best)}, {match_words})"),
            *[r for r in gaps if r.code == "quote-drift"],
        ]
    elif conflicts:
        band, reasons = Band.CONFLICT, [*conflicts, *gaps]
    elif score >= calibration.anchored_at and not gaps:
        band, reasons = Band.ANCHORED, [Reason("close-match", f"{_page(best)} states the claim ({match_words})")]
    else:
        band = Band.LOOSE
        reasons = gaps or [
            Reason("partial-match", f"{_page(best)} is related but does not fully state the claim ({match_words})")
        ]
    return Check(
        citation=citation,
        reference=reference,
        source=source,
        band=band,
        score=round(score, 3),
        reasons=reasons,
        evidence=evidence,
    )


def wants_better_source(check: Check) -> bool:
    """Only a check that its cited source does not back is worth a search elsewhere."""
    return check.band in (Band.ADRIFT, Band.LOOSE)


def better_source_reason(
    check: Check, alternative: Hit, claim: str, calibration: Calibration, scorer: PairScorer | None = None
) -> Reason | None:
    """A ``better-source`` reason when another file backs the claim and the cited one does not."""
    if not wants_better_source(check):
        return None
    other = calibration.score(features_of(claim, [alternative], scorer))
    if other < calibration.anchored_at or other <= check.score:
        return None
    return Reason(
        "better-source",
        f"{alternative.passage.source} backs the claim better (p. {alternative.passage.page}, score {other:.2f}): "
        f'"{trim(alternative.passage.text, 30)}"',
    )


def page_mismatch_reason(
    check: Check, locator: str, hit: Hit, printed: Sequence[str | None], *, page_exists: bool = True
) -> Reason | None:
    """A ``page-mismatch`` reason: the cited page does not hold the backing, ``hit``'s page does.

    Only said when the source backs the claim somewhere (anchored, loose or conflict):
    for an adrift claim there is no "right page" to point to, and the band says enough.
    ``page_exists`` is False when no page of the source carries the cited number.
    """
    if check.band in (Band.ADRIFT, Band.UNVERIFIABLE):
        return None
    cited = " ".join(locator.replace("~", " ").split())
    where = page_label(hit.passage.page, printed)
    if not page_exists:
        return Reason(
            "page-mismatch", f"cited {cited}, a page this source does not have; the closest passage is on {where}"
        )
    return Reason("page-mismatch", f"cited {cited}, but the closest passage is on {where}")


def with_printed_pages(check: Check, printed: Sequence[str | None]) -> Check:
    """The check with each evidence item's printed page number filled in where known."""
    if not printed:
        return check
    check.evidence = [
        replace(e, printed_page=printed[e.page - 1]) if 0 < e.page <= len(printed) else e for e in check.evidence
    ]
    return check
