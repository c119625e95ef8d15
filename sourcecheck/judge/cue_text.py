"""One analysed text for the wording checks: tokens, clauses, sentences and the cues found.

A claim or a passage is read once into tokens (with clause and sentence numbers), the
cue lists are matched as phrases over them, and negation scope is settled here, so the
checks in :mod:`sourcecheck.judge.cues` only compare two analysed texts.
"""

from __future__ import annotations

import re
import unicodedata
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from functools import lru_cache

from sourcecheck.judge.cue_lists import load_cues
from sourcecheck.text import STOP_WORDS, s_stem, sentence_spans

# Words (and the sentence punctuation ".;:!?") that start a new clause: a negation or a
# direction word is not read across them. Common practice, no source.
_CLAUSE_WORDS = frozenset(["but", "whereas", "while", "although", "though"])
_WORD = re.compile(r"[^\W_]+(?:['’][^\W_]+)*(?:[.,]\d+)*|[.;:!?]")
_NEGATION_BEFORE = 3  # words before a negation cue inside its scope
_NEGATION_AFTER = 6  # words after it
_CONTRASTIVE = frozenset(["but", "and"])  # "but not X", "and not X": X alone is negated
_NEGATED_GAP = 2  # a cue at most this many words after a negation is negated


# --- tokens ---------------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class Token:
    text: str  # lower-case, NFKC-folded word
    stem: str  # plural-folded, what cue entries are compared with
    root: str  # also -ed/-ing folded, what claim and passage words are compared with
    start: int  # character span in the original text
    end: int
    clause: int
    sentence: int
    capital: bool


def _root(word: str) -> str:
    """A light stem so "increased", "increases" and "increase" compare equal."""
    w = s_stem(word)
    for suffix in ("ing", "ed"):
        if w.endswith(suffix) and len(w) - len(suffix) >= 4:
            w = w[: -len(suffix)]
            break
    if w.endswith("e") and len(w) > 4:
        w = w[:-1]
    return w


def _make(text: str, start: int, end: int, clause: int, sentence: int, capital: bool) -> Token:
    return Token(text, s_stem(text), _root(text), start, end, clause, sentence, capital)


def tokens_of(text: str, spans: Sequence[tuple[int, int]] | None = None) -> list[Token]:
    """Word tokens of ``text`` (stop words kept) with clause and sentence numbers."""
    out: list[Token] = []
    clause = 0
    for sentence, (lo, hi) in enumerate(spans or [(0, len(text))]):
        clause += 1
        for m in _WORD.finditer(text, lo, hi):
            raw = m.group()
            if raw in ".;:!?":
                clause += 1
                continue
            word = unicodedata.normalize("NFKC", raw).lower().replace("’", "'")
            start, end, capital = m.start(), m.end(), raw[0].isupper()
            if word in _CLAUSE_WORDS:
                clause += 1
            if word.endswith("'s"):
                word, end = word[:-2], end - 2
            if word.endswith("n't") or word == "cannot":
                # "did|n't", "can|not": the last three characters are the negation.
                if len(word) > 3:
                    out.append(_make(word[:-3], start, end - 3, clause, sentence, capital))
                out.append(_make("not", end - 3, end, clause, sentence, False))
                continue
            out.append(_make(word, start, end, clause, sentence, capital))
    return out


# --- phrase matching ------------------------------------------------------------------------

Label = tuple[str, ...]


@dataclass(frozen=True, slots=True)
class CueMatch:
    start: int  # token indices, end exclusive
    end: int
    labels: frozenset[Label]


def _pattern(entry: str) -> tuple[tuple[bool, str], ...]:
    """An entry as (is_prefix, text) word tests, tokenised like the text it is matched in."""
    words: list[tuple[bool, str]] = []
    for part in entry.lower().split():
        if part.endswith("*"):
            words.append((True, part[:-1]))
        else:
            words.extend((False, t.stem) for t in tokens_of(part))
    return tuple(words)


class Matcher:
    """Finds cue entries in a token list, longest match first, without overlaps."""

    def __init__(self, entries: Iterable[tuple[str, Label]]) -> None:
        merged: dict[tuple[tuple[bool, str], ...], set[Label]] = {}
        for entry, label in entries:
            pattern = _pattern(entry)
            if pattern:
                merged.setdefault(pattern, set()).add(label)
        self._exact: dict[str, list[tuple[tuple[tuple[bool, str], ...], frozenset[Label]]]] = {}
        self._prefix: dict[str, list[tuple[tuple[tuple[bool, str], ...], frozenset[Label]]]] = {}
        for pattern, labels in merged.items():
            is_prefix, first = pattern[0]
            table, key = (self._prefix, first[:3]) if is_prefix else (self._exact, first)
            table.setdefault(key, []).append((pattern, frozenset(labels)))
        for table in (self._exact, self._prefix):
            for candidates in table.values():
                candidates.sort(key=lambda c: -len(c[0]))

    @staticmethod
    def _fits(pattern: tuple[tuple[bool, str], ...], toks: Sequence[Token], i: int) -> bool:
        if i + len(pattern) > len(toks):
            return False
        clause = toks[i].clause
        for (is_prefix, word), tok in zip(pattern, toks[i : i + len(pattern)], strict=True):
            if tok.clause != clause:
                return False
            if not (tok.text.startswith(word) if is_prefix else tok.stem == word):
                return False
        return True

    def _longest(self, toks: Sequence[Token], i: int) -> tuple[int, frozenset[Label]] | None:
        best: tuple[int, frozenset[Label]] | None = None
        for pattern, labels in self._exact.get(toks[i].stem, []) + self._prefix.get(toks[i].text[:3], []):
            if (best is None or len(pattern) > best[0]) and self._fits(pattern, toks, i):
                best = (len(pattern), labels)
        return best

    def find(self, toks: Sequence[Token]) -> list[CueMatch]:
        """Longest matches, left to right; an idiom that starts inside a match and runs past
        it wins ("is not" + "not restricted to": the idiom, so no negation)."""
        found: list[CueMatch] = []
        i = 0
        while i < len(toks):
            best = self._longest(toks, i)
            if best is None:
                i += 1
                continue
            for j in range(i + 1, i + best[0]):
                inner = self._longest(toks, j)
                if inner is not None and ("pseudo",) in inner[1] and j + inner[0] > i + best[0]:
                    i, best = j, inner
                    break
            found.append(CueMatch(i, i + best[0], best[1]))
            i += best[0]
        return found


@dataclass(frozen=True)
class Matchers:
    certainty: Matcher
    negation: Matcher
    direction: Matcher
    scope: Matcher


@lru_cache(maxsize=1)
def matchers() -> Matchers:
    cues = load_cues()
    certainty = (
        [(e, ("hedge",)) for e in cues.hedges]
        + [(e, ("booster",)) for e in cues.boosters]
        + [(e, ("causal",)) for e in cues.causal]
        + [(e, ("effect",)) for e in cues.effect_verbs]
        + [(e, ("assoc",)) for e in cues.associational]
        + [(e, ("pseudo",)) for e in cues.not_certainty]
    )
    negation = (
        [(e, ("neg",)) for e in cues.negations]
        + [(e, ("cancel",)) for e in cues.negation_cancels]
        + [(e, ("pseudo",)) for e in cues.not_negation]
    )
    direction: list[tuple[str, tuple[str, ...]]] = [(e, ("pseudo",)) for e in cues.not_direction]
    for axis in cues.direction:
        for side, terms in zip(axis.sides, axis.terms, strict=True):
            direction += [(e, ("dir", axis.name, side)) for e in terms]
    scope = [(t, ("group", g.name)) for g in cues.scope_groups for t in g.terms]
    scope += [(t, ("wider", kind)) for kind, terms in cues.scope_wider.items() for t in terms]
    scope += [(t, ("cover", kind)) for kind, terms in cues.scope_covers.items() for t in terms]
    return Matchers(Matcher(certainty), Matcher(negation), Matcher(direction), Matcher(scope))


# --- one analysed text ----------------------------------------------------------------------


class CueText:
    """A claim or passage: its tokens and the cues found in it, computed once."""

    def __init__(self, raw: str, split_sentences: bool) -> None:
        self.raw = raw
        self.toks = tokens_of(raw, sentence_spans(raw) if split_sentences else None)
        m = matchers()
        self.negations = self._live_negations(m.negation.find(self.toks))
        self.certainty = [
            c
            for c in m.certainty.find(self.toks)
            if ("pseudo",) not in c.labels and not self._negated(c) and not self._month(c)
        ]
        self.direction = [
            d for d in m.direction.find(self.toks) if ("pseudo",) not in d.labels and not self._negated(d)
        ]
        self.scope = m.scope.find(self.toks)
        ignore = load_cues().ignore
        in_negation = {i for n in self.negations for i in range(n.start, n.end)}
        self.content = [
            i
            for i, t in enumerate(self.toks)
            if i not in in_negation
            and t.text not in STOP_WORDS
            and len(t.text) > 1
            and any(c.isalpha() for c in t.text)
            and t.text not in ignore
            and t.root not in ignore
        ]
        self.roots = {self.toks[i].root for i in self.content}

    @staticmethod
    def _live_negations(found: list[CueMatch]) -> list[CueMatch]:
        """Negation cues minus idioms and cancelled pairs ("did not fail to")."""
        cues = [n for n in found if ("pseudo",) not in n.labels]
        dead: set[int] = set()
        for k in range(len(cues) - 1):
            first, second = cues[k], cues[k + 1]
            if ("cancel",) in second.labels and ("cancel",) not in first.labels and second.start - first.end <= 1:
                dead |= {k, k + 1}
        return [n for k, n in enumerate(cues) if k not in dead]

    def _negated(self, cue: CueMatch) -> bool:
        clause = self.toks[cue.start].clause
        return any(
            0 <= cue.start - n.end <= _NEGATED_GAP and self.toks[n.start].clause == clause for n in self.negations
        )

    def _month(self, cue: CueMatch) -> bool:
        """ "May" written with a capital inside a sentence is the month, not the hedge."""
        tok = self.toks[cue.start]
        first = cue.start == 0 or self.toks[cue.start - 1].sentence != tok.sentence
        return tok.text == "may" and tok.capital and not first

    def surface(self, start: int, end: int) -> str:
        return self.raw[self.toks[start].start : self.toks[end - 1].end]

    def said(self, cue: CueMatch) -> str:
        return self.surface(cue.start, cue.end)

    def labelled(self, kind: str, sentences: set[int] | None = None) -> list[CueMatch]:
        return [
            c
            for c in self.certainty
            if (kind,) in c.labels and (sentences is None or self.toks[c.start].sentence in sentences)
        ]

    def _comma_between(self, i: int, j: int) -> bool:
        """Whether a comma stands between tokens ``i`` and ``j`` (i before j)."""
        return "," in self.raw[self.toks[i].end : self.toks[j].start]

    def negation_scopes(self) -> list[tuple[CueMatch, set[str]]]:
        """Each negation cue with the content roots in its window, inside its clause.

        The words before a cue are its subject only up to a comma ("CCL19, which lacks
        anchoring residues": the residues are negated, not CCL19's being a ligand). A
        contrastive "but not" / "and not" negates only the phrase up to the next comma
        ("memory, but not naive, T cells enhance ...").
        """
        content = set(self.content)
        scopes = []
        for n in self.negations:
            clause = self.toks[n.start].clause
            contrastive = n.start > 0 and self.toks[n.start - 1].text in _CONTRASTIVE
            before = 0 if contrastive else _NEGATION_BEFORE
            lo, hi = max(0, n.start - before), min(len(self.toks), n.end + _NEGATION_AFTER)
            roots = set()
            for i in range(lo, hi):
                if i not in content or self.toks[i].clause != clause or n.start <= i < n.end:
                    continue
                if i < n.start and self._comma_between(i, n.start):
                    continue
                if i >= n.end and contrastive and self._comma_between(n.end - 1, i):
                    continue
                roots.add(self.toks[i].root)
            scopes.append((n, roots))
        return scopes

    def relevant_sentences(self, claim_roots: set[str]) -> set[int]:
        """Sentences sharing the claim's content words (two, or all if it has fewer); all if none do."""
        need = min(2, len(claim_roots))
        per: dict[int, set[str]] = {}
        for i in self.content:
            per.setdefault(self.toks[i].sentence, set()).add(self.toks[i].root)
        everything = {t.sentence for t in self.toks}
        if need == 0:
            return everything
        return {s for s, roots in per.items() if len(roots & claim_roots) >= need} or everything


# --- scope helpers ----------------------------------------------------------------------------


def names_a_condition(toks: list[Token], k: int) -> bool:
    """ "in the SRL case", "in the PCSO-524 group": the capitals name an arm or a condition of
    the study (the word after them, past a code number, is one of ``not_place_heads``), not a place."""
    while k < len(toks) and toks[k].text.isdigit():
        k += 1
    return k < len(toks) and toks[k].text in load_cues().not_place_heads


def spelled_out(term: str, claim: CueText) -> bool:
    """Whether ``term`` is an acronym of words the claim writes out ("SRL": "semantic role labelling")."""
    letters = "".join(c for c in term.lower() if c.isalpha())
    if len(letters) < 2 or " " in term.strip():
        return False
    initials = "".join(t.text[0] for t in claim.toks if t.text[:1].isalpha())
    return letters in initials
