"""Comparing the numbers of a claim with those of its evidence.

Matching rules (a claim quantity is *found* when one evidence quantity satisfies them):

- values are equal after conversion within the rounding of the less precise written value
  ("18%" covers 17.5–18.5; "1.2 × 10³" covers 1150–1250; common practice, no source);
- kinds must agree: percent only with percent (or a plainly stated proportion, "a
  proportion of 0.45"), percentage points, folds, each named ratio, p-values, a unit's
  dimension each only with their own; counts, sample sizes, years and bare numbers are one
  family, whatever word follows ("1,119 adult bees" is "1119 bees");
- a unit written once for a list or range applies to each number ("250 and 500 mg");
- a range matches a range with the same ends, or is found when both ends are; a single
  value matches a range's end, but a value inside a range is not a number the source states;
- "±" gives a spread: a claim's "4.2 mg" matches "4.2 ± 0.3 mg"; when both state a
  spread, the spreads must agree too;
- a bound ("p < 0.05") is found when the source's statement implies it ("p = 0.03",
  "p < 0.01"); a stated value ("p = 0.03") is not found in a bound ("p < 0.05");
- a sign counts only when both numbers carry one ("fell by 0.3" is "−0.3");
- a scale word multiplies ("1.2 million" is 1,200,000 and rounds to the nearest 0.1
  million), and an amount of money is its own kind per currency ("$5 billion" and "5
  billion dollars" are one figure; "€5 billion" is another kind).

A number not found is *different* when the best passage holds a value of the same kind
that contradicts it (no overlap; the one sharing most context words is named), and
*absent* otherwise. A comma is a decimal comma where it can be nothing else ("12,5",
"0,125", "3,14159"); before exactly three digits it is a thousands separator ("12,000").
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from sourcecheck.judge.numbers import Quantity, quantities


def _family(q: Quantity) -> str:
    """What a quantity may be compared with: its kind, or "count" for counts and bare numbers."""
    special = q.unit or q.kind in ("p-value", "CI", "ratio") or q.kind.startswith(("ratio:", "stat:"))
    return q.kind if special else "count"


def _close(a: float, b: float, tolerance: float) -> bool:
    return abs(a - b) <= tolerance + 1e-9 * max(abs(a), abs(b), tolerance)


def same_value(a: Quantity, b: Quantity) -> bool:
    """Equal within the rounding of the less precise of the two written values.

    A sign counts only when both carry one: "fell by 0.3" and "−0.3" are the same figure.
    """
    tolerance = max(a.tolerance, b.tolerance)
    if _close(a.value, b.value, tolerance):
        return True
    lenient = not (a.signed and b.signed) and a.kind != "temperature"
    return lenient and _close(abs(a.value), abs(b.value), tolerance)


def _at(q: Quantity, value: float) -> Quantity:
    return replace(q, value=value, high=None, spread=None)


def _implies(source: Quantity, claim: Quantity) -> bool:
    """Whether the source's statement implies the claim's bound ("p = 0.03" implies "p < 0.05")."""
    if claim.comparator in ("<", "≤"):
        if source.comparator in (">", "≥"):
            return False
        edge, bound, open_edge = (source.high if source.high is not None else source.value), claim.value, "<"
    else:  # the mirror image: a lower bound
        if source.comparator in ("<", "≤"):
            return False
        edge, bound, open_edge = -source.value, -claim.value, ">"
    if _close(edge, bound, 0.0):  # "p < 0.05" implies "p < 0.05" and "p ≤ 0.05"; "p = 0.05" only "≤"
        return claim.comparator in ("≤", "≥") or source.comparator == open_edge
    return edge < bound


def _found_in(claim: Quantity, source: Quantity) -> bool:
    if _family(claim) != _family(source):
        return False
    if claim.comparator != "=":
        return _implies(source, claim)
    if source.comparator != "=":
        return False  # a bound does not state a value
    if not _same_spread(claim, source):
        return False
    if claim.high is None:
        return same_value(claim, source) or (source.high is not None and same_value(claim, _at(source, source.high)))
    return (
        source.high is not None
        and same_value(claim, source)
        and same_value(_at(claim, claim.high), _at(source, source.high))
    )


def _is_found(claim: Quantity, evidence: list[Quantity]) -> bool:
    if any(_found_in(claim, q) for q in evidence):
        return True
    if claim.high is not None and claim.comparator == "=":  # a range whose ends are both stated
        ends = (_at(claim, claim.value), _at(claim, claim.high))
        return all(any(_found_in(end, q) for q in evidence) for end in ends)
    return False


def _interval(q: Quantity) -> tuple[float, float]:
    """The values a statement allows, before rounding: a bound is open on one side."""
    if q.comparator in ("<", "≤"):
        return -math.inf, q.value
    if q.comparator in (">", "≥"):
        return q.value, math.inf
    return q.value, q.high if q.high is not None else q.value


def _same_spread(a: Quantity, b: Quantity) -> bool:
    """Whether two "±" parts agree, within the rounding of the coarser one (True if either lacks one)."""
    if a.spread is None or b.spread is None:
        return True
    tolerance = 0.5 * 10.0 ** -min(a.spread_decimals, b.spread_decimals) * max(a.scale, b.scale)
    return _close(a.spread, b.spread, tolerance)


def _contradicts(claim: Quantity, source: Quantity) -> bool:
    """Whether two values of one kind cannot both be true: their intervals (or spreads) differ.

    Two ranges contradict unless their ends agree: "12–16 mg" is not "12–15 mg".
    """
    if claim.high is not None and source.high is not None and claim.comparator == source.comparator == "=":
        return not _found_in(claim, source)  # two ranges: the same ends or a different range
    (a_low, a_high), (b_low, b_high) = _interval(claim), _interval(source)
    gap = max(a_low, b_low) - min(a_high, b_high)
    rounding = max((q.tolerance for q in (claim, source) if q.comparator == "="), default=0.0)
    return not _close(max(gap, 0.0), 0.0, rounding) or not _same_spread(claim, source)


@dataclass(frozen=True)
class NumberFinding:
    """What became of one claim quantity in the evidence."""

    claim: Quantity
    counterpart: Quantity | None  # the passage's value for the same thing, when different


def unsupported_numbers(claim: str, best: str, others: list[str]) -> list[NumberFinding]:
    """Claim quantities found in none of the evidence passages, with counterparts if any.

    ``best`` is the top passage; ``others`` further passages of the same source, where a
    number may also be found. A counterpart is looked for in ``best`` only: it is the
    passage that speaks of the same thing as the claim. A counterpart has the claim's kind
    and contradicts it; a value the passage leaves possible ("13 mg" within "12–15 mg",
    "p = 0.03" under "p < 0.05") is no counterpart, so the number is reported absent.
    """
    best_quantities = quantities(best)
    evidence = best_quantities + [q for text in others for q in quantities(text)]
    findings = []
    for wanted in quantities(claim):
        if _is_found(wanted, evidence):
            continue
        rivals = [q for q in best_quantities if wanted.kind and q.kind == wanted.kind and _contradicts(wanted, q)]
        counterpart = max(rivals, key=lambda q: len(q.context & wanted.context), default=None)
        findings.append(NumberFinding(claim=wanted, counterpart=counterpart))
    return findings


def in_claim_unit(claim: Quantity, counterpart: Quantity) -> str:
    """The counterpart restated in the claim's unit ("= 0.45 g") when the two units differ.

    A reader comparing "0.5 g" with "450 mg" should not have to convert; temperatures are
    left as written (their scales have offsets, and the difference is plain).
    """
    units = {claim.unit, counterpart.unit}
    if not claim.unit or not counterpart.unit or len(units) == 1 or units & {"°C", "K", "fraction", "%"}:
        return ""
    if claim.kind != counterpart.kind or not claim.scale:
        return ""
    return f" (= {counterpart.value / claim.scale:.4g} {claim.unit})"
