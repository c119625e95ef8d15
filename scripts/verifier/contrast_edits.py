"""More ways to say the opposite in the same words: comparatives, verbs and roles.

The first model learnt most reversals from negations and a fixed table of direction words, and
still read "wetter" against "drier", "preferred" against "avoided" or "males earlier than
females" against "females earlier than males" as agreement. These edits make such pairs:

- a graded adjective in the comparative ("wetter", "warmer", "longer") swapped for the
  comparative of its WordNet antonym ("drier", "cooler", "shorter");
- an inflected verb swapped for its WordNet verb antonym ("increased" -> "decreased",
  "included" -> "excluded", "rose" -> "fell"), inflected the same way;
- the two sides of "X ... than Y" swapped when X opens the sentence ("Males emerged earlier
  than females" -> "Females emerged earlier than males").

Antonyms come from WordNet 3.0 (Debian ``wordnet-base``), never a hand list; inflection uses
regular English rules (common practice, no source) and skips what they cannot form.
"""

from __future__ import annotations

import re

from antonyms import WORDNET_DIR, adjective_antonym, verb_antonym, wordnet
from edits import ANTONYM_SKIP, DIRECTION, match_case, past_tense, third_person

_WORD = re.compile(r"[A-Za-z][A-Za-z\-]*")
_VOWELS = "aeiou"
# Comparatives a base-form guess would misread ("other" is not "oth" + "er").
_NOT_COMPARATIVE = frozenset(["other", "under", "over", "after", "never", "either", "neither", "rather", "whether"])


def _comparative(base: str) -> str | None:
    """'dry' -> 'drier', 'wet' -> 'wetter', 'cool' -> 'cooler'; None for long adjectives ('more X')."""
    if len(base) > 7 or not base.isalpha():
        return None
    if base.endswith("e"):
        return base + "r"
    if base.endswith("y") and base[-2:-1] not in _VOWELS:
        return base[:-1] + "ier"
    if len(base) <= 4 and base[-1] not in _VOWELS + "wxy" and base[-2] in _VOWELS and base[-3:-2] not in _VOWELS:
        return base + base[-1] + "er"
    return base + "er"


def _comparative_bases(word: str) -> list[str]:
    """Base forms a comparative may come from: 'wetter' -> 'wet', 'drier' -> 'dry', 'larger' -> 'large'."""
    if not word.endswith("er") or len(word) < 5 or word in _NOT_COMPARATIVE:
        return []
    stem = word[:-2]
    bases = [stem, stem + "e"]
    if word.endswith("ier"):
        bases.insert(0, word[:-3] + "y")
    if len(stem) >= 2 and stem[-1] == stem[-2]:
        bases.insert(0, stem[:-1])
    return bases


def swap_comparative(text: str) -> str | None:
    """The first comparative adjective whose base has a WordNet antonym, swapped for the antonym's comparative."""
    for match in _WORD.finditer(text):
        lower = match.group().lower()
        if lower in DIRECTION:
            continue  # the direction table's words are edited by swap_direction already
        for base in _comparative_bases(lower):
            if base in ANTONYM_SKIP:
                break
            antonym = adjective_antonym(base)
            new = _comparative(antonym) if antonym else None
            if new is not None and new != lower:
                return f"{text[: match.start()]}{match_case(match.group(), new)}{text[match.end() :]}"
    return None


# Irregular past tenses the regular rule cannot make or read (common practice, no source).
_IRREGULAR = {"rose": "rise", "fell": "fall", "lost": "lose", "won": "win", "gave": "give", "took": "take"}
_IRREGULAR_PAST = {base: past for past, base in _IRREGULAR.items()}


def _inflect_like(word: str, base: str, new_base: str) -> str | None:
    """``new_base`` in the form ``word`` has as an inflection of ``base`` (past or third person)."""
    if word == base:
        return new_base
    past = _IRREGULAR_PAST.get(base) or past_tense(base)
    if word == past:
        return _IRREGULAR_PAST.get(new_base) or past_tense(new_base)
    if word == third_person(base):
        return third_person(new_base)
    return None


def swap_verb_antonym(text: str) -> str | None:
    """The first inflected verb (past or third person) with a WordNet antonym, swapped for it."""
    reader = wordnet(WORDNET_DIR)
    for match in _WORD.finditer(text):
        if match.start() == 0:
            continue  # a sentence's first word is its subject far more often than its verb
        lower = match.group().lower()
        if not (lower.endswith(("ed", "s")) or lower in _IRREGULAR) or lower in DIRECTION:
            continue
        base = _IRREGULAR.get(lower) or reader.morphy(lower, "v")
        if base is None or base == lower or base in ANTONYM_SKIP:
            continue
        antonym = verb_antonym(base)
        new = _inflect_like(lower, base, antonym) if antonym else None
        if new is not None:
            return f"{text[: match.start()]}{match_case(match.group(), new)}{text[match.end() :]}"
    return None


# "Males emerged earlier than females": a subject of one to three words, then the comparison.
_THAN_SUBJECT = re.compile(
    r"^(?P<first>(?:[A-Za-z][\w\-]*\s){0,2}?[A-Za-z][\w\-]*)\s"
    r"(?P<middle>(?:[a-z]+ed|was|were|is|are|had|has|have|did|does|do|grew|rose|fell|ran|became|showed|took|held|made|found|kept|spent|lost|won)\b"
    r"[^,;:()]*?\bthan)\s(?P<second>(?:[\w\-]+\s){0,2}[\w\-]+)(?P<end>[.;,]?\s*)$"
)


_DETERMINERS = frozenset(["the", "a", "an", "this", "these", "those", "that", "our", "its", "their", "each", "all"])


def swap_than_roles(text: str) -> str | None:
    """'Males emerged earlier than females.' -> 'Females emerged earlier than males.'"""
    match = _THAN_SUBJECT.match(text.strip())
    if match is None:
        return None
    first, second = match.group("first"), match.group("second")
    if first.split()[-1].lower() in _DETERMINERS or second.split()[0].lower() in _DETERMINERS:
        return None  # the subject was cut inside its noun phrase ("The | treated group had ...")
    if first.lower() == second.lower() or second.lower() in {"expected", "usual", "before", "ever"}:
        return None
    new_first = second[:1].upper() + second[1:]
    new_second = first[:1].lower() + first[1:] if not first[:2].isupper() else first
    return f"{new_first} {match.group('middle')} {new_second}{match.group('end')}"
