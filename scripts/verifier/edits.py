"""Minimal edits that turn a sentence into one that says otherwise in nearly the same words.

Each function returns the edited text, or None when the edit does not apply. They are rules
of English usage (common practice, no source), kept small and conservative: an edit that
would need a parser to get right is not attempted, because a wrong "opposite" teaches the
verifier the wrong thing. counterfactuals.py applies them to SciFact pairs and labels the result.
"""

from __future__ import annotations

import re

from antonyms import adjective_antonym

NEGATION = re.compile(r"\b(?:not|no|never|cannot|without|neither|nor)\b|n't\b", re.IGNORECASE)

AUXILIARIES = "is|are|was|were|can|could|may|might|will|would|should|must"
PERFECT = "has|have|had"

# Verbs of effect and relation that claims are made of; a word is only treated as a verb in
# the third person ("reduces") when its base is one of these, so plural nouns ("levels") are
# not. Verbs whose -s form is also a common plural noun (targets, results, controls) are left out.
# fmt: off
EFFECT_VERBS = frozenset([
    "increase", "decrease", "reduce", "improve", "cause", "induce", "inhibit", "promote", "prevent", "enhance",
    "activate", "suppress", "regulate", "lower", "raise", "impair", "protect", "predict", "require", "mediate",
    "affect", "correlate", "associate", "contribute", "lead", "block", "stimulate", "accelerate", "delay", "alter",
    "modulate", "drive", "trigger", "restore", "attenuate", "exacerbate", "worsen", "elevate", "bind", "express",
    "depend", "confer", "reverse", "influence", "interact", "determine", "facilitate", "mimic", "produce", "occur",
    "extend", "shorten",
])
# fmt: on
IRREGULAR_PAST = {"lead": "led", "bind": "bound", "drive": "drove"}

# One-word direction swaps; the first word of the text found in this table is swapped.
_DIRECTION_PAIRS = [
    ("increase", "decrease"), ("increases", "decreases"), ("increased", "decreased"),
    ("increasing", "decreasing"), ("higher", "lower"), ("high", "low"), ("more", "less"),
    ("greater", "smaller"), ("upregulates", "downregulates"), ("upregulated", "downregulated"),
    ("up-regulates", "down-regulates"), ("up-regulated", "down-regulated"), ("promotes", "inhibits"),
    ("promote", "inhibit"), ("promoted", "inhibited"), ("positive", "negative"),
    ("positively", "negatively"), ("improves", "worsens"), ("improved", "worsened"),
    ("activation", "inhibition"), ("gain", "loss"), ("better", "worse"), ("above", "below"),
    ("maximum", "minimum"), ("accelerates", "slows"), ("raises", "lowers"),
]  # fmt: skip
DIRECTION = {a: b for a, b in _DIRECTION_PAIRS} | {b: a for a, b in _DIRECTION_PAIRS}
DIRECTION |= {"reduces": "increases", "reduced": "increased", "reduce": "increase", "reduction": "increase"}
DIRECTION |= {"elevated": "reduced", "larger": "smaller", "activates": "inhibits", "fewer": "more"}

# Adjectives whose first WordNet antonym is not the opposite a claim means ("present" ->
# "future", "common" -> "individual") or that name groups rather than properties.
ANTONYM_SKIP = frozenset(
    [
        "present",
        "common",
        "early",
        "new",
        "old",
        "first",
        "last",
        "human",
        "specific",
        "general",
        "individual",
        "middle",
        "male",
        "female",
        "such",
        "other",
        "same",
        "own",
        "whole",
        "only",
        "single",
        "found",
        "lost",
    ]
)

COMPARATIVE = re.compile(
    r"\b(?:higher|lower|greater|smaller|larger|more|less|fewer|increased|decreased|reduced|elevated|"
    r"better|worse|superior|inferior|risk|than)\b",
    re.IGNORECASE,
)
_WORD = re.compile(r"[A-Za-z][A-Za-z\-]*")


def match_case(original: str, replacement: str) -> str:
    """The replacement written with the original's leading capital."""
    return replacement[:1].upper() + replacement[1:] if original[:1].isupper() else replacement


IRREGULAR_THIRD = {"have": "has", "do": "does", "be": "is", "go": "goes"}


def third_person(base: str) -> str:
    """'increase' -> 'increases', 'have' -> 'has' (regular English inflection plus a few irregular verbs)."""
    if base in IRREGULAR_THIRD:
        return IRREGULAR_THIRD[base]
    if base.endswith(("s", "sh", "ch", "x", "z")):
        return base + "es"
    if base.endswith("y") and base[-2:-1] not in "aeiou":
        return base[:-1] + "ies"
    return base + "s"


def past_tense(base: str) -> str:
    """'reduce' -> 'reduced', 'lead' -> 'led' (regular rule plus a few irregular verbs)."""
    if base in IRREGULAR_PAST:
        return IRREGULAR_PAST[base]
    if base.endswith("e"):
        return base + "d"
    if base.endswith("y") and base[-2:-1] not in "aeiou":
        return base[:-1] + "ied"
    return base + "ed"


def third_person_base(word: str) -> str | None:
    """The base of a third-person effect verb ('reduces' -> 'reduce'), else None."""
    lower = word.lower()
    for base in EFFECT_VERBS:
        if lower == third_person(base):
            return base
    return None


def insert_negation(text: str) -> str | None:
    """'X is associated with Y' -> 'X is not associated with Y'; 'X reduces Y' -> 'X does not reduce Y'.

    Only for text without any negation, so that the edit is the only one.
    """
    if NEGATION.search(text):
        return None
    aux = re.search(rf"\b({AUXILIARIES})\b", text, re.IGNORECASE)
    perfect = re.search(rf"\b({PERFECT})\s+(been|\w+ed|\w+en)\b", text, re.IGNORECASE)
    candidates = [m for m in (aux, perfect) if m is not None]
    verb = None
    for match in _WORD.finditer(text):
        if match.start() > 0 and third_person_base(match.group()) is not None:
            verb = match
            break
    if candidates:
        first = min(candidates, key=lambda m: m.start())
        if verb is None or first.start() < verb.start():
            return f"{text[: first.end(1)]} not{text[first.end(1) :]}"
    if verb is not None:
        base = third_person_base(verb.group())
        return f"{text[: verb.start()]}does not {base}{text[verb.end() :]}"
    return None


def remove_negation(text: str) -> str | None:
    """'X is not associated with Y' -> 'X is associated with Y'; 'X does not reduce Y' -> 'X reduces Y'.

    Only for text with exactly one negation, of a form handled here.
    """
    if len(NEGATION.findall(text)) != 1 or re.search(r"\bnot only\b", text, re.IGNORECASE):
        return None
    rules = [
        (rf"\b({AUXILIARIES}|{PERFECT}) not\b", lambda m: m.group(1)),
        (r"\bcannot\b", lambda m: match_case(m.group(), "can")),
        (r"\bdoes not (\w+)", lambda m: third_person(m.group(1))),
        (r"\bdo not (\w+)", lambda m: m.group(1)),
        (r"\bdid not (\w+)", lambda m: past_tense(m.group(1)) if m.group(1).lower() in EFFECT_VERBS else None),
        (
            r"\b(is|are|was|were|has|have|had|show|shows|showed) no (\w)",
            lambda m: f"{m.group(1)} {'an' if m.group(2).lower() in 'aeiou' else 'a'} {m.group(2)}",
        ),
    ]
    for pattern, replace in rules:
        match = re.search(pattern, text, re.IGNORECASE)
        if match is not None:
            new = replace(match)
            return None if new is None else f"{text[: match.start()]}{new}{text[match.end() :]}"
    return None


def swap_direction(text: str) -> str | None:
    """The first direction word swapped: increases <-> decreases, higher <-> lower, ..."""
    for match in _WORD.finditer(text):
        replacement = DIRECTION.get(match.group().lower())
        if replacement is not None:
            return f"{text[: match.start()]}{match_case(match.group(), replacement)}{text[match.end() :]}"
    return None


# An adjective is only swapped where it is predicated or graded ("is effective", "more
# stable", "significantly associated"): there it is a property the claim asserts. Classifying
# adjectives before a noun ("sympathetic nerve", "cellular secretome") have WordNet antonyms
# too, but swapping them names another thing instead of saying the opposite.
_PREDICATED = re.compile(
    r"\b(?:is|are|was|were|be|been|being|become|becomes|remain|remains|more|less|most|least|highly|very|"
    r"significantly|equally|not)\s+([A-Za-z]+)\b",
    re.IGNORECASE,
)


def swap_antonym(text: str) -> str | None:
    """The first predicated adjective that has a WordNet antonym replaced by it (is effective -> is ineffective)."""
    for match in _PREDICATED.finditer(text):
        word = match.group(1)
        lower = word.lower()
        # Participles ("involved", "suppressed") have antonyms of odd senses ("publicized").
        if len(lower) < 4 or lower.endswith("ed") or lower in ANTONYM_SKIP or lower in DIRECTION:
            continue
        antonym = adjective_antonym(lower)
        if antonym is not None:
            return f"{text[: match.start(1)]}{match_case(word, antonym)}{text[match.end(1) :]}"
    return None


_NUMBER = re.compile(r"(?<![\w\-./,])(\d+(?:\.\d+)?)(?![\w\-/]|\.\d|,\d)(\s?%)?")


def changed_number(value: str, percent: bool) -> str | None:
    """A clearly different value of the same kind (years and zero are left alone)."""
    number = float(value)
    decimals = len(value.split(".")[1]) if "." in value else 0
    if number == 0 or (not percent and decimals == 0 and 1900 <= number <= 2100):
        return None
    if percent and number <= 100:
        new = number * 2 if number <= 50 else number / 2
    else:
        new = number * 3 if number < 10 else number * 2
    return f"{new:.{decimals}f}"


def change_number(text: str, must_also_appear_in: str) -> str | None:
    """The first stand-alone number that also appears in the other text, changed.

    The number must be in both texts so that the evidence fixes it; "IL-6" or "p53" are
    names, not numbers, and are left alone.
    """
    other = {m.group(1) for m in _NUMBER.finditer(must_also_appear_in)}
    for match in _NUMBER.finditer(text):
        if match.group(1) not in other:
            continue
        new = changed_number(match.group(1), bool(match.group(2)))
        if new is not None:
            return f"{text[: match.start(1)]}{new}{text[match.end(1) :]}"
    return None


GROUP_NOUNS = "patients|individuals|people|persons|women|men|children|subjects|participants|adults|mice|rats|those"
_THAN = re.compile(r"\b(in|among|for) ((?:[\w\-]+ ){0,5}?[\w\-]+) than (in|among|for) ([^,;.()]+)")
_VERSUS = re.compile(r"\b(in|among|for) ([^,;.()]+?) (compared (?:with|to)|relative to|versus|vs\.?) ([^,;.()]+)")


def swap_groups(text: str) -> str | None:
    """The two groups of a comparison swapped.

    'higher in women than in men' -> 'higher in men than in women'; 'in A compared with B'
    likewise; and, in a comparative claim, 'patients with X' <-> 'patients without X'.
    """
    match = _THAN.search(text) or (_VERSUS.search(text) if COMPARATIVE.search(text) else None)
    if match is not None:
        first, second = match.group(2), match.group(4).rstrip()
        if first.strip().lower() == second.strip().lower():
            return None
        if match.re is _THAN:
            swapped = f"{match.group(1)} {second} than {match.group(3)} {first}"
        else:
            swapped = f"{match.group(1)} {second} {match.group(3)} {first}"
        end = match.start(4) + len(second)
        return f"{text[: match.start()]}{swapped}{text[end:]}"
    if not COMPARATIVE.search(text):
        return None
    without = re.search(r"\bwithout\b", text)
    if without is not None:
        return f"{text[: without.start()]}with{text[without.end() :]}"
    grouped = re.search(rf"\b({GROUP_NOUNS}) with\b", text, re.IGNORECASE)
    if grouped is not None and len(NEGATION.findall(text)) == 0:
        return f"{text[: grouped.end(1)]} without{text[grouped.end() :]}"
    return None
