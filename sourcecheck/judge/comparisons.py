"""A claimed comparison between two groups against the values the source gives for them.

"Cells in dense aggregations were attacked more often than those in sparse ones" is a
comparison: two groups and a direction. A source may state it in words (the cue lists
catch "more" against "fewer") or only in numbers ("27% of cells in dense aggregations,
against 11% in sparse ones"). This check reads the second form: it finds the two groups
in the claim, the value the source gives next to each, and whether their order agrees
with the claim's "more", "higher", "lower" or "fewer".

How the claim is read (common practice, no source): the direction word is the one
closest before "than"; the second group is what follows "than" up to the end of the
clause ("than in sparse aggregations"); the first group is the phrase of the same shape
before the direction word: the one opened by the same preposition ("in dense
aggregations"), or else the one opened by the second group's first word ("scrapes
beside footpaths ... than scrapes far from paths"). Only the words that tell the two
groups apart are kept ("dense" against "sparse").

How the source is read: in the sentences of the best passage that name both groups, each
value (a percentage, a count, a measured quantity) belongs to the group whose telling
word is closest to it; a value with both groups' words equally close belongs to neither,
and a value that states a change ("fell by 12%") is not a level and is left out.
The first value of each group, of one kind, are compared; values within the rounding of
the less precise one are equal and say nothing. The finding names both values, so the
reader sees what was compared.
"""

from __future__ import annotations

import re

from sourcecheck.judge.cue_lists import CueFinding
from sourcecheck.judge.cues import effect_direction, sentences
from sourcecheck.judge.number_checks import same_value
from sourcecheck.judge.numbers import Quantity, quantities
from sourcecheck.text import STOP_WORDS, s_stem

_THAN = re.compile(r"\bthan\b", re.IGNORECASE)
_CLAUSE_END = re.compile(r"[.;:!?]|,\s|\b(?:and|but|whereas|while|which|who|because)\b", re.IGNORECASE)
_WORD = re.compile(r"[^\W_]+(?:[-'][^\W_]+)*")
_PREPOSITIONS = frozenset(["in", "among", "on", "for", "after", "with", "at", "from", "during", "under"])
_VERBS = frozenset(["is", "are", "was", "were", "has", "have", "had", "did", "do", "does", "be", "been", "being"])
_PLACEHOLDERS = frozenset(["those", "that", "ones", "one", "the", "a", "an", "in", "of"])
_DIRECTION_WINDOW = 60  # characters before "than" in which the direction word stands
_GROUP_WORDS = 4  # content words that make up a group's phrase
_VALUE_WINDOW = 50  # characters either side of a value in which its group is named
# Kinds a comparison between groups is stated in; p-values, sample sizes and intervals are not.
_NOT_COMPARED = ("p-value", "n", "CI", "year")
# A value that is a change ("fell by 12%", "a reduction of 5%") is not a level of its group:
# "lower in A" and "fell by more in A" are different claims (common practice, no source).
_CHANGE_BEFORE = re.compile(
    r"\bby\s*$|\b(?:reduc|decreas|increas|declin|fell|fall|rose|rise|drop|gain|loss|lost|chang|improv|worsen)\w*"
    r"[^.;\d]{0,25}$",
    re.IGNORECASE,
)


def _words(text: str) -> list[tuple[str, int, int]]:
    return [(m.group().lower(), m.start(), m.end()) for m in _WORD.finditer(text)]


def _content(words: list[tuple[str, int, int]]) -> list[str]:
    return [s_stem(w) for w, _, _ in words if w not in STOP_WORDS and not w.isdigit()]


def _phrase(words: list[tuple[str, int, int]], cue: int) -> list[tuple[str, int, int]]:
    """A group's words from its opening word: up to the direction word or a verb, at most
    _GROUP_WORDS content words ("in sparse nest aggregations" of "... were attacked")."""
    phrase = words[:1]
    for word in words[1:]:
        if 0 < cue <= word[1] or word[0] in _VERBS or len(_content(phrase)) >= _GROUP_WORDS:
            break
        phrase.append(word)
    return phrase


def _groups(claim: str) -> tuple[str, str, set[str], set[str], str, str] | None:
    """(way, direction words, first group's telling words, second group's, both as written)."""
    than = _THAN.search(claim)
    if than is None:
        return None
    window_start = max(0, than.start() - _DIRECTION_WINDOW)
    for word, start, _ in reversed(_words(claim[window_start : than.start()])):
        # Word by word, so "more often" and "more likely" count as "more" here.
        found = effect_direction(word)
        if found is not None and found[0] in ("up", "down"):
            way, said, cue_at = found[0], claim[window_start + start :].split()[0], window_start + start
            break
    else:
        return None
    after = claim[than.end() :]
    end = _CLAUSE_END.search(after)
    second_text = after[: end.start()] if end else after
    second_words = _words(second_text)
    while second_words and second_words[0][0] in _PLACEHOLDERS - _PREPOSITIONS:
        second_words = second_words[1:]
    if not second_words:
        return None
    head = second_words[0][0]
    if any(c.isdigit() for c in head):
        return None  # "more than 50%": a bound, not two groups
    region = claim[: than.start()]
    if head in _PREPOSITIONS:
        found_at = [m.start() for m in re.finditer(rf"\b{head}\b", region, re.IGNORECASE)]
        opener = found_at[-1] if found_at else -1
    else:
        match = re.search(rf"\b{re.escape(head)}", region, re.IGNORECASE)
        opener = match.start() if match else -1
    if opener < 0:
        return None  # "A has more X than B": which words name A is not read
    first_words = _phrase(_words(region[opener:]), cue_at - opener)
    first, second = set(_content(first_words)), set(_content(second_words)[:_GROUP_WORDS])
    first_only, second_only = first - second, second - first
    if not first_only or not second_only:
        return None
    first_text = region[opener : opener + first_words[-1][2]]
    second_text = second_text[second_text.lower().find(head) :]
    return way, said, first_only, second_only, first_text, second_text.strip()


def _nearest(text: str, start: int, end: int, telling: set[str]) -> int | None:
    """Characters from the value at [start, end) to the closest telling word, within the window."""
    lo, hi = max(0, start - _VALUE_WINDOW), min(len(text), end + _VALUE_WINDOW)
    best = None
    for word, ws, we in _words(text[lo:hi]):
        if s_stem(word) in telling:
            a, b = lo + ws, lo + we
            gap = start - b if b <= start else a - end if a >= end else 0
            best = gap if best is None else min(best, gap)
    return best


def _values(sentence: str, first: set[str], second: set[str]) -> tuple[Quantity, Quantity] | None:
    """The first value given for each group, of one kind, in ``sentence``."""
    by_group: dict[int, list[Quantity]] = {0: [], 1: []}
    for quantity in quantities(sentence):
        if quantity.kind in _NOT_COMPARED or quantity.high is not None or quantity.comparator != "=":
            continue
        at = sentence.find(quantity.text)
        if at < 0 or _CHANGE_BEFORE.search(sentence[max(0, at - 40) : at]):
            continue
        near = [_nearest(sentence, at, at + len(quantity.text), words) for words in (first, second)]
        if near[0] is not None and (near[1] is None or near[0] < near[1]):
            by_group[0].append(quantity)
        elif near[1] is not None and (near[0] is None or near[1] < near[0]):
            by_group[1].append(quantity)
    for a in by_group[0]:
        for b in by_group[1]:
            if a.kind == b.kind and a.unit == b.unit:
                return a, b
    return None


def _group_text(phrase: str) -> str:
    """ "in dense aggregations" as it is; "scrapes far from paths" as "for scrapes far from paths"."""
    first = phrase.split()[0].lower() if phrase.split() else ""
    return phrase if first in _PREPOSITIONS else f"for {phrase}"


def compare_groups(claim: str, passage: str) -> list[CueFinding]:
    """A ``direction-flip`` when the values ``passage`` gives for the claim's two groups
    run the other way."""
    parsed = _groups(claim)
    if parsed is None:
        return []
    way, said, first, second, first_text, second_text = parsed
    for sentence in sentences(passage):
        pair = _values(sentence, first, second)
        if pair is None:
            continue
        a, b = pair
        if same_value(a, b):
            return []
        if (a.value > b.value) == (way == "up"):
            return []  # the order the claim states
        message = (
            f'claim says "{said}" {_group_text(first_text)} than {_group_text(second_text)}, '
            f"but the source gives {a.text} against {b.text}"
        )
        return [CueFinding("direction-flip", said, f"{a.text} against {b.text}", message)]
    return []
