"""Family names, in order, from the text of an author (or editor) span.

Reference styles write names in a handful of orders, often mixed in one list:
"Okafor, A. B., & Lin, C." (APA), "A. B. Okafor and C. Lin" (IEEE), "Okafor AB, Lin C"
(Vancouver), "Okafor, Ada, and Chen Lin" (Chicago and MLA invert the first name only),
"Ada Okafor, Chen Lin" (computer science), "OKAFOR, Ada; LIN, Chen". The span is cut into
pieces at commas, semicolons and conjunctions; a piece of initials (or a lone given name
after a lone family name) is the given part of the piece before it, and within a piece the
family name is what stands apart from the initials, or the last word (with its particles)
when there are none.
"""

from __future__ import annotations

import re

from sourcecheck.text import PARTICLES

_ROLE_RE = re.compile(
    r"(?i)\(\s*(?:eds?|hrsg|hg|dirs?|comps?|coords?|trans|tr)\.?\s*\)|"
    r"\b(?:et\s+al|and\s+others|u\.\s*a|eds?|edited\s+by|hrsg|hg|dirs?|trans|transl|translated\s+by|"
    r"ed\.\s+by|editors?|comps?)\b\.?|…|\.\s?\.\s?\.|^\s*in:?\s+"
)
# "y", "e" and "en" only in lower case: upper-case, they are initials.
_CONJUNCTION_RE = re.compile(r"\s+(?:(?i:and|und|et|och|og)|y|e|en)\s+|\s*&\s*")
_INITIAL_RE = re.compile(r"^(?:[A-Z][a-z]?\.\s?[-‐]?){0,3}[A-Z][a-z]?\.?$|^[A-Z][-‐]?[A-Z]?$")
# "FERRIÈRES (Madeleine)", "Codou (Y.)": given names in brackets after the family name.
_BRACKETED_GIVEN_RE = re.compile(r"\([^()]*\)")
# Lower-case words that make a name an organisation's ("Alliance for Excellent Education").
_FUNCTION_WORDS = frozenset({"of", "for", "on", "and", "the", "in", "to"})
_SUFFIXES = frozenset({"jr", "sr", "ii", "iii", "iv", "jnr", "snr"})
# Words that make a name an organisation's ("Board of Soil Science"), kept whole.
_ORGANISATION_WORDS = frozenset(
    {
        "organization",
        "organisation",
        "institute",
        "association",
        "society",
        "council",
        "department",
        "ministry",
        "agency",
        "office",
        "commission",
        "committee",
        "university",
        "group",
        "foundation",
        "board",
        "bureau",
        "service",
        "centre",
        "center",
    }
)


def family_names(span: str) -> tuple[str, ...]:
    """Family names in order; "et al." and editor or translator marks are dropped."""
    text = " ".join(_ROLE_RE.sub(" ", span).split())
    if _BRACKETED_GIVEN_RE.search(text):  # every piece outside the brackets is a family name
        pieces = re.split(r",", _CONJUNCTION_RE.sub(", ", _BRACKETED_GIVEN_RE.sub(" ", text)))
        return tuple(name for piece in pieces if (name := _clean(piece.split())))
    if ";" in text:
        persons = [p for p in text.split(";") if p.strip(" .,")]
        return tuple(name for person in persons if (name := _one_person(person)))
    pieces = [p.strip(" .,:") for p in re.split(r",", _CONJUNCTION_RE.sub(", ", text))]
    pieces = [p for p in pieces if p and not _is_suffix_piece(p)]
    names: list[str] = []
    index = 0
    while index < len(pieces):
        words = pieces[index].split()
        nxt = pieces[index + 1].split() if index + 1 < len(pieces) else []
        if _all_initials(words):
            index += 1  # a stray given part, already used or unattached
            continue
        if not any(_is_initial(w, words) for w in words) and nxt and _is_given_part(words, nxt):
            names.append(_clean(words))
            index += 2
            continue
        name = _family_in_piece(words)
        if name:
            names.append(name)
        index += 1
    return tuple(names)


def _one_person(person: str) -> str:
    """One "Family, Given" or "Given Family" name, as in semicolon-separated lists."""
    family, _, given = person.partition(",")
    if given.strip(" ."):
        return _clean(family.split())
    return _family_in_piece(family.split())


def _is_given_part(words: list[str], nxt: list[str]) -> bool:
    """Whether the next piece is the given part of an inverted "Family, Given" name."""
    if _all_initials(nxt):
        return True
    if len(words) > 3 or len(nxt) > 3:
        return False
    # "Okafor, Ada" or "Okafor, Ada B." -- a lone family name and a short given part.
    lone_family = len([w for w in words if w.lower() not in PARTICLES]) == 1
    return lone_family or (len(nxt) == 1 and nxt[0][:1].isupper())


def _family_in_piece(words: list[str]) -> str:
    words = [w for w in words if w.strip(".").lower() not in _SUFFIXES]
    if not words:
        return ""
    initials = [i for i, w in enumerate(words) if _is_initial(w, words)]
    if initials:
        if initials[-1] == len(words) - 1 and initials[0] > 0:
            return _clean(words[: initials[0]])  # "Okafor AB", "de la Rosa JC"
        rest = words[initials[-1] + 1 :]  # "A. B. Okafor", "Ada B. Okafor"
        return _clean(rest) if rest else ""
    if _is_organisation(words):
        return _clean(words)
    # "Ada van der Berg": from the first particle after the given name, else the last word.
    for i in range(1, len(words) - 1):
        if words[i].lower() in PARTICLES:
            return _clean(words[i:])
    return _clean(words[-1:])


def _is_organisation(words: list[str]) -> bool:
    """Group names: "Alliance for Excellent Education", "The Herald", "Board of Soil Science"."""
    if len(words) < 2:
        return False
    if words[0].lower() == "the" or any(w in _FUNCTION_WORDS for w in words[1:-1]):
        return True
    return len(words) >= 3 and any(w.lower().strip(".") in _ORGANISATION_WORDS for w in words)


def _is_initial(word: str, piece: list[str]) -> bool:
    """Initials such as "A.", "A.B.", "J.-P.", "Th."; a bare "AB" counts only beside a longer name word."""
    if _INITIAL_RE.match(word):
        return "." in word or len(word.strip("-‐")) <= 1 or _beside_name(word, piece)
    return False


def _beside_name(word: str, piece: list[str]) -> bool:
    return word.isupper() and any(len(w) > 3 and not w.isupper() for w in piece if w is not word)


def _all_initials(words: list[str]) -> bool:
    return bool(words) and all(_is_initial(w, words) for w in words)


def _is_suffix_piece(piece: str) -> bool:
    return piece.strip(" .").lower() in _SUFFIXES


def _clean(words: list[str]) -> str:
    return " ".join(words).strip(" .,;:()[]").strip()
