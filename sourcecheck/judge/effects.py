"""Which way an effect goes: the claim's words against the source's ratio estimate.

Medical and ecological results are often reported as a ratio with its confidence
interval ("HR 0.83, 95% CI 0.72-0.96") and cited in words ("increases the risk"). The
two must agree on the direction: a ratio above 1 with its interval above 1 is a higher
risk, odds or rate; below 1 with its interval below 1 a lower one; an interval holding 1
shows no clear effect (the usual reading of a ratio measure, e.g. Altman, "Practical
Statistics for Medical Research", 1991, ch. 10; from memory). A claim that says
"decreases" against a ratio of 1.57 (1.38 to 1.81) is a ``direction-flip``; a claim
that states an effect against an interval holding 1, or states no effect against one
that excludes it, is a ``negation``.

Only the best passage's sentence closest to the claim is read, only estimates that are
named as ratios (odds ratio, hazard ratio, relative risk, OR, HR, RR, ...) count, and a
sentence whose estimates point both ways says nothing here. The reason always names the
estimate, because which group a ratio compares against is for the reader to check.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from sourcecheck.judge.cue_lists import CueFinding
from sourcecheck.judge.cues import closest_sentence, effect_direction

# The Lancet writes the decimal point as a raised dot ("1·75").
_NUMBER = r"(\d+(?:[.·]\d+)?|[.·]\d+)"
# Up to N characters of the same sentence: no full stop except inside a number.
_SAME_SENTENCE = r"(?:[^.]|(?<=\d)\.(?=\d))"
_RATIO = re.compile(
    r"(?P<name>\b(?:(?:odds|hazards?|risk|rate|incidence rate|prevalence|subdistribution hazard)\s+ratios?"
    r"|relative\s+risks?|\b(?:a|s)?(?:OR|HR|RR|IRR|PR)s?\b(?!-\w)))"
    # "odds ratio (95% CI) was 1.40 (...)": the level in brackets may come first
    r"(?P<between>(?:[^.;\d]|\(\s*\d{2}\s*%\s*(?:CI|confidence intervals?)\s*\)){0,80}?)"
    rf"(?<![\w.]){_NUMBER}(?![\w.]|\.\d|\s*%)",
    re.IGNORECASE,
)
_SHORT = re.compile(r"[as]?(?:or|hr|rr|irr|pr)s?", re.IGNORECASE)
_SHORT_AS_WRITTEN = re.compile(r"[aAsS]?(?:OR|HR|RR|IRR|PR)s?")
# "(95% CI 1.04 to 1.90)", "[95% confidence interval, 0.6-0.9]", "(1.52 to 12.09)".
_INTERVAL = re.compile(
    rf"^{_SAME_SENTENCE}{{0,40}}?(?:\b(?:CI|confidence interval|credible interval)\b[^\d]{{0,12}}|[(\[]\s*)"
    rf"{_NUMBER}\s*(?:to|-|–|—|,)\s*{_NUMBER}",
    re.IGNORECASE,
)
_P_VALUE = re.compile(rf"^{_SAME_SENTENCE}{{0,90}}?\b[Pp]\s*(?P<cmp>[<>=≤≥])\s*{_NUMBER}")
_CONFIDENCE = re.compile(r"^\s*(?:\d{2}(?:\.\d)?\s*%)")  # "95% CI": the 95 is not the estimate


@dataclass(frozen=True)
class Estimate:
    """One named ratio estimate, with its interval when given, as written in the source."""

    text: str
    value: float
    low: float | None
    high: float | None
    p_below_05: bool | None  # None: no p-value given

    @property
    def direction(self) -> str | None:
        """ "up", "down", "none" (no clear effect), or None when the estimate cannot say."""
        if self.low is not None and self.high is not None:
            if self.low > 1:
                return "up"
            if self.high < 1:
                return "down"
            return "none"
        if self.p_below_05 is False:
            return "none"
        if self.p_below_05 is True or self.value >= 1.1 or self.value <= 0.9:
            return "up" if self.value > 1 else "down" if self.value < 1 else "none"
        return None


def _float(written: str) -> float:
    return float(written.replace("·", "."))


def estimates(sentence: str) -> list[Estimate]:
    """Every named ratio estimate in ``sentence``."""
    found = []
    for match in _RATIO.finditer(sentence):
        name = match.group("name")
        if _SHORT.fullmatch(name) and (not _SHORT_AS_WRITTEN.fullmatch(name) or name == "ARR"):
            continue  # "or", "hr" in running text are not the abbreviations; ARR is a risk difference
        if _CONFIDENCE.match(sentence[match.end() :]) or "%" in sentence[match.end() : match.end() + 2]:
            continue
        value = _float(match.group(3))
        rest = sentence[match.end() :]
        interval = _INTERVAL.match(rest)
        low = high = None
        if interval:
            low, high = sorted((_float(interval.group(1)), _float(interval.group(2))))
            if not low <= value <= high:
                low = high = None  # not this estimate's interval
        p = _P_VALUE.match(rest)
        p_below = None
        if p:
            bound, comparator = _float(p.group(2)), p.group("cmp")
            p_below = bound < 0.05 if comparator in "<≤=" else False
        end = interval.end() if interval and low is not None else 0
        written = " ".join((sentence[match.start() : match.end() + end]).split()).rstrip(" ,;")
        for opening, closing in ("()", "[]"):
            written += closing * max(0, written.count(opening) - written.count(closing))
        found.append(
            Estimate(
                text=written,
                value=value,
                low=low,
                high=high,
                p_below_05=p_below,
            )
        )
    return found


_SAYS = {
    "up": "a ratio above 1: higher in the group compared",
    "down": "a ratio below 1: lower in the group compared",
}


# A sentence that reports an association (common practice in reporting results, no
# source); kept narrow: "was associated with", not a bare "associated".
_REPORTS_ASSOCIATION = re.compile(
    r"(?<!\bnot )(?<!\bno )\b(?:was|were|is|are|being)\s+(?:(?:positively|negatively|significantly|strongly|"
    r"independently|inversely)\s+)*(?:associated|correlated|linked)\s+(?:with|to)\b",
    re.IGNORECASE,
)


def _association_disagrees(way: str, words: str, sentence: str) -> list[CueFinding]:
    """A claimed absence of effect against an association the closest passage sentence
    reports ("unrelated to" against "was associated with").

    The converse (a claimed effect against "no difference" in the passage) is left to the
    negation cue: read here as well, it fired on SciFact's supported claims about as
    often as on contradicted ones (holdout AUROC 0.790 without it, 0.780 with it).
    """
    if way != "none":
        return []
    found = _REPORTS_ASSOCIATION.search(sentence)
    if found:
        said = " ".join(found.group(0).split())
    else:
        reported = effect_direction(sentence)  # "promotes", "increased": an effect, unnegated
        if reported is None or reported[0] == "none":
            return []
        said = reported[1]
    message = f'claim says "{words}" (no effect); the source says "{said}"'
    return [CueFinding("negation", words, said, message)]


def compare_effects(claim: str, passage: str) -> list[CueFinding]:
    """A ``direction-flip`` or ``negation`` when the claim's words and the passage's ratio
    estimate (or its words of association) disagree on which way the effect goes."""
    said = effect_direction(claim)
    if said is None:
        return []
    way, words = said
    sentence = closest_sentence(claim, passage)
    found = estimates(sentence)
    directions = {e.direction for e in found if e.direction is not None}
    if not directions:
        return _association_disagrees(way, words, sentence)
    if len(directions) != 1:
        return []
    (reported,) = directions
    if reported == way:
        return []
    estimate = next(e for e in found if e.direction == reported)
    if way == "none":
        message = f'claim says "{words}" (no effect); the source reports {estimate.text}, {_SAYS[reported]}'
        return [CueFinding("negation", words, estimate.text, message)]
    if reported == "none":
        why = "its interval holds 1" if estimate.low is not None else "p ≥ 0.05"
        message = f'claim says "{words}"; the source reports {estimate.text}: no clear effect ({why})'
        return [CueFinding("negation", words, estimate.text, message)]
    message = (
        f'claim says "{words}"; the source reports {estimate.text}, {_SAYS[reported]}'
        " (check which group is the reference)"
    )
    return [CueFinding("direction-flip", words, estimate.text, message)]
