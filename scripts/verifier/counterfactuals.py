"""Counterfactual pairs from SciFact rationale sentences: same words, other verdict.

From a claim that a sentence supports, one small edit of the claim (or of the sentence) makes
a pair the sentence contradicts: a negation inserted or removed, a direction word or an
adjective swapped for its opposite, a number changed, the two groups of a comparison swapped.
From a claim that a sentence contradicts (SciFact's contradicted claims are mostly negations
of a finding), inserting or removing the negation makes a pair the sentence supports. Only
fit-split claims are used, and each pair keeps its claim's validation side.
"""

from __future__ import annotations

from collections import Counter
from collections.abc import Callable

from edits import change_number, insert_negation, remove_negation, swap_antonym, swap_direction, swap_groups
from pair_records import CONTRADICTS, SUPPORTS, Pair

Edit = Callable[[str], str | None]

# kind -> edit; applied to the claim of a supported pair (-> contradicts)
CLAIM_EDITS: dict[str, Edit] = {
    "negation-inserted": insert_negation,
    "negation-removed": remove_negation,
    "direction-swapped": swap_direction,
    "antonym-swapped": swap_antonym,
    "groups-swapped": swap_groups,
}
# kind -> edit; applied to the evidence sentence of a supported pair (-> contradicts)
EVIDENCE_EDITS: dict[str, Edit] = {
    "negation-inserted": insert_negation,
    "direction-swapped": swap_direction,
    "antonym-swapped": swap_antonym,
}
# kind -> edit; applied to the claim of a contradicted pair (-> supports)
UNDO_EDITS: dict[str, Edit] = {
    "negation-inserted": insert_negation,
    "negation-removed": remove_negation,
}


def counterfactual_pairs(pairs: list[Pair]) -> tuple[list[Pair], Counter[str]]:
    """Edited pairs from SciFact supports/contradicts pairs, and how many of each kind."""
    made: list[Pair] = []
    seen: set[tuple[str, str]] = set()
    counts: Counter[str] = Counter()

    def add(claim: str, evidence: str, label: str, kind: str, origin: Pair) -> None:
        if (claim, evidence) in seen:
            return
        seen.add((claim, evidence))
        made.append(Pair(claim, evidence, label, f"counterfactual:{kind}", origin.group, origin.split))
        counts[kind] += 1

    for pair in pairs:
        if pair.label == SUPPORTS:
            for kind, edit in CLAIM_EDITS.items():
                if (edited := edit(pair.claim)) is not None:
                    add(edited, pair.evidence, CONTRADICTS, f"{kind}/claim", pair)
            for kind, edit in EVIDENCE_EDITS.items():
                if (edited := edit(pair.evidence)) is not None:
                    add(pair.claim, edited, CONTRADICTS, f"{kind}/evidence", pair)
            if (edited := change_number(pair.claim, pair.evidence)) is not None:
                add(edited, pair.evidence, CONTRADICTS, "number-changed/claim", pair)
            if (edited := change_number(pair.evidence, pair.claim)) is not None:
                add(pair.claim, edited, CONTRADICTS, "number-changed/evidence", pair)
        elif pair.label == CONTRADICTS:
            for kind, edit in UNDO_EDITS.items():
                if (edited := edit(pair.claim)) is not None:
                    add(edited, pair.evidence, SUPPORTS, f"{kind}/claim-of-contradicted", pair)
    return made, counts
