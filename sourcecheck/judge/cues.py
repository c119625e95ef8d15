"""Where a claim says more than its source: certainty, negation, direction and scope cues.

The passage is already known to be about the claim's topic; these checks look at the small
words that change what it says about it. All four are word-list heuristics over a token
stream (lists in ``cue_lists.toml``), pure Python and fast, so they can run on every claim.

- **overstated**: the claim asserts (a booster such as "shows", "clearly", "all", or causal
  wording such as "causes", "leads to", "X increases Y") and carries no hedge, while the
  passage sentences that share the claim's words hedge ("may", "suggests", "in some cases")
  or, for a causal claim, only report an association ("associated with", "correlated").
  A hedge or booster right after a negation ("does not suggest", "did not show") does not
  count: the negation check speaks for it. Effect verbs ("increases", "reduce") are causal
  only in the claim, only as written (the adjective "lower" is not "lowers") and only with
  an object after them ("density increases with depth" is not causal).
- **negation**: one side negates ("did not", "no significant", "absence of") within a small
  window (3 words before, 6 after, inside one clause) that holds at least two of the other
  side's content words (one if the claim has only one), and the other side does not negate
  those words. So an unrelated negation elsewhere in the passage does not count, nor does a
  claim that negates as well. The words before a cue stop at a comma ("CCL19, which lacks
  anchoring residues" does not negate CCL19), a contrastive "but not" / "and not" negates
  only the phrase up to the next comma, and an idiom that starts inside a cue wins over it
  ("is not" + "not restricted to": a widening, not a denial). Double negation is handled
  only in its plainest form: "not"/"no"/"never" directly before "without", "fail to",
  "lack of" cancels both ("did not fail to"). Affixal negation ("unchanged", "not
  unlike") is not read at all.
- **direction-flip**: for each content word the claim and passage share, the nearest
  direction word in the same clause (within 6 words; ties go to the word before, as in
  "increased density") is looked up on each side. The claim flips the passage when more
  shared words disagree (opposite sides of one axis: increase/decrease, improve/worsen,
  positive/negative correlation ...) than agree. Comparing word by word means "decreased
  predation led to increased density" agrees with a claim of "increased density": only the
  object "density" is shared. "Higher in A than in B" agrees with "lower in B than in A"
  (the words either side of "than" are compared swapped). A direction word right after a
  negation is left to the negation check ("did not decrease").
- **scope-wider**: the passage restricts the finding (species, cell studies, a subgroup of
  people, one site, the laboratory, "in <Place>") and the claim neither keeps that
  restriction (same term, a synonym, or a covering term such as "animal models") nor is
  otherwise restricted in the same way; the claim's wider term ("humans", "people",
  "worldwide") is reported when it has one. Species and cell-study terms count anywhere in
  the passage unless it also speaks of humans or in-vivo work; subgroup, setting and place
  terms count only in the sentences that share the claim's words, and a subgroup found
  with its opposite ("women" with "men") restricts nothing.

Each check returns at most one finding, so a report line stays readable.
"""

from __future__ import annotations

import re
import tomllib
import unicodedata
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from functools import lru_cache
from importlib import resources

import pysbd

from sourcecheck.index.tokens import STOP_WORDS, s_stem

# Words (and the sentence punctuation ".;:!?") that start a new clause: a negation or a
# direction word is not read across them. Common practice, no source.
_CLAUSE_WORDS = frozenset(["but", "whereas", "while", "although", "though"])
_WORD = re.compile(r"[^\W_]+(?:['’][^\W_]+)*(?:[.,]\d+)*|[.;:!?]")
_NEGATION_BEFORE = 3  # words before a negation cue inside its scope
_NEGATION_AFTER = 6  # words after it
_CONTRASTIVE = frozenset(["but", "and"])  # "but not X", "and not X": X alone is negated
_NEGATED_GAP = 2  # a cue at most this many words after a negation is negated
_DIRECTION_WINDOW = 6  # words between a direction cue and the word it is about
_WHOLE_PASSAGE_KINDS = frozenset(["species", "in-vitro"])
_DETERMINERS = frozenset(["the", "a", "an", "its", "their", "our", "this", "these", "both"])


@dataclass(frozen=True)
class CueFinding:
    """One way the claim goes beyond its passage, with the words on each side."""

    code: str  # "overstated" | "negation" | "direction-flip" | "scope-wider"
    claim_cue: str  # the words in the claim, "" when the claim has none
    source_cue: str  # the words in the passage, "" when the passage has none
    message: str  # one readable sentence, without the page


@dataclass(frozen=True)
class DirectionAxis:
    """Two opposite sides of one meaning (amount: up/down), each a list of cue entries."""

    name: str
    sides: tuple[str, str]
    terms: tuple[tuple[str, ...], tuple[str, ...]]


@dataclass(frozen=True)
class ScopeGroup:
    """Synonymous terms for one restriction of where a finding holds ("mice", "women")."""

    name: str
    kind: str  # "species" | "in-vitro" | "subgroup" | "setting"
    terms: tuple[str, ...]
    opposite: str = ""  # a group that, present too, makes the pair a whole


@dataclass(frozen=True)
class CueLists:
    """The parsed ``cue_lists.toml``."""

    hedges: tuple[str, ...]
    boosters: tuple[str, ...]
    causal: tuple[str, ...]
    effect_verbs: tuple[str, ...]
    associational: tuple[str, ...]
    not_certainty: tuple[str, ...]
    negations: tuple[str, ...]
    negation_cancels: tuple[str, ...]
    not_negation: tuple[str, ...]
    direction: tuple[DirectionAxis, ...]
    not_direction: tuple[str, ...]
    scope_groups: tuple[ScopeGroup, ...]
    scope_wider: dict[str, tuple[str, ...]]
    scope_covers: dict[str, tuple[str, ...]]
    not_places: frozenset[str]
    ignore: frozenset[str]


def _strings(value: object, where: str) -> tuple[str, ...]:
    if not isinstance(value, list) or not value or not all(isinstance(v, str) and v for v in value):
        raise ValueError(f"cue_lists.toml: {where} must be a non-empty list of strings")
    return tuple(v.strip() for v in value)


@lru_cache(maxsize=1)
def load_cues() -> CueLists:
    """Parse the packaged cue lists once; a malformed file is a packaging bug, so it raises."""
    text = resources.files("sourcecheck.judge").joinpath("cue_lists.toml").read_text(encoding="utf-8")
    data = tomllib.loads(text)
    cert, neg, scope = data["certainty"], data["negation"], data["scope"]
    axes = []
    for name, table in data["direction"].items():
        if not isinstance(table, dict) or len(table) != 2:
            raise ValueError(f"cue_lists.toml: direction.{name} must hold exactly two lists")
        (a, terms_a), (b, terms_b) = table.items()
        axes.append(
            DirectionAxis(
                name, (a, b), (_strings(terms_a, f"direction.{name}.{a}"), _strings(terms_b, f"direction.{name}.{b}"))
            )
        )
    groups = tuple(
        ScopeGroup(g["name"], g["kind"], _strings(g["terms"], f"scope group {g['name']}"), g.get("opposite", ""))
        for g in scope["groups"]
    )
    return CueLists(
        hedges=_strings(cert["hedges_bioscope"], "hedges_bioscope") + _strings(cert["hedges_hyland"], "hedges_hyland"),
        boosters=_strings(cert["boosters_hyland"], "boosters_hyland") + _strings(cert["boosters_extra"], "extra"),
        causal=_strings(cert["causal"], "causal"),
        effect_verbs=_strings(cert["effect_verbs"], "effect_verbs"),
        associational=_strings(cert["associational"], "associational"),
        not_certainty=_strings(cert["not_certainty"], "not_certainty"),
        negations=_strings(neg["cues"], "negation.cues"),
        negation_cancels=_strings(neg["cancels"], "negation.cancels"),
        not_negation=_strings(neg["not_negation"], "negation.not_negation"),
        direction=tuple(axes),
        not_direction=_strings(data["direction_pseudo"]["phrases"], "direction_pseudo.phrases"),
        scope_groups=groups,
        scope_wider={k: _strings(v, f"scope.wider.{k}") for k, v in scope["wider"].items()},
        scope_covers={k: _strings(v, f"scope.covers.{k}") for k, v in scope["covers"].items()},
        not_places=frozenset(_strings(scope["not_places"], "scope.not_places")),
        ignore=frozenset(_strings(data["shared"]["ignore"], "shared.ignore")),
    )


# --- tokens ---------------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class _Tok:
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


def _make(text: str, start: int, end: int, clause: int, sentence: int, capital: bool) -> _Tok:
    return _Tok(text, s_stem(text), _root(text), start, end, clause, sentence, capital)


def _tokens(text: str, spans: Sequence[tuple[int, int]] | None = None) -> list[_Tok]:
    """Word tokens of ``text`` (stop words kept) with clause and sentence numbers."""
    out: list[_Tok] = []
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


@lru_cache(maxsize=1)
def _segmenter() -> pysbd.Segmenter:
    return pysbd.Segmenter(language="en", clean=False)


@lru_cache(maxsize=2048)
def _sentence_spans(text: str) -> tuple[tuple[int, int], ...]:
    """Sentence spans by pysbd, located in ``text`` so token offsets stay true to it.

    Cached: the wording cues and the effect check both read the best passage's sentences.
    """
    try:
        sentences = _segmenter().segment(text)
    except Exception:  # pysbd fails on odd input now and then; one sentence is a safe reading
        return ((0, len(text)),)
    spans, cursor = [], 0
    for sentence in sentences:
        piece = sentence.strip()
        at = text.find(piece, cursor) if piece else -1
        if at < 0:
            continue
        spans.append((at, at + len(piece)))
        cursor = at + len(piece)
    if not spans:
        return ((0, len(text)),)
    spans[-1] = (spans[-1][0], len(text))
    return tuple(spans)


# --- phrase matching ------------------------------------------------------------------------

Label = tuple[str, ...]


@dataclass(frozen=True, slots=True)
class _Match:
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
            words.extend((False, t.stem) for t in _tokens(part))
    return tuple(words)


class _Matcher:
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
    def _fits(pattern: tuple[tuple[bool, str], ...], toks: Sequence[_Tok], i: int) -> bool:
        if i + len(pattern) > len(toks):
            return False
        clause = toks[i].clause
        for (is_prefix, word), tok in zip(pattern, toks[i : i + len(pattern)], strict=True):
            if tok.clause != clause:
                return False
            if not (tok.text.startswith(word) if is_prefix else tok.stem == word):
                return False
        return True

    def _longest(self, toks: Sequence[_Tok], i: int) -> tuple[int, frozenset[Label]] | None:
        best: tuple[int, frozenset[Label]] | None = None
        for pattern, labels in self._exact.get(toks[i].stem, []) + self._prefix.get(toks[i].text[:3], []):
            if (best is None or len(pattern) > best[0]) and self._fits(pattern, toks, i):
                best = (len(pattern), labels)
        return best

    def find(self, toks: Sequence[_Tok]) -> list[_Match]:
        """Longest matches, left to right; an idiom that starts inside a match and runs past
        it wins ("is not" + "not restricted to": the idiom, so no negation)."""
        found: list[_Match] = []
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
            found.append(_Match(i, i + best[0], best[1]))
            i += best[0]
        return found


@dataclass(frozen=True)
class _Matchers:
    certainty: _Matcher
    negation: _Matcher
    direction: _Matcher
    scope: _Matcher


@lru_cache(maxsize=1)
def _matchers() -> _Matchers:
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
    direction = [(e, ("pseudo",)) for e in cues.not_direction]
    for axis in cues.direction:
        for side, terms in zip(axis.sides, axis.terms, strict=True):
            direction += [(e, ("dir", axis.name, side)) for e in terms]
    scope = [(t, ("group", g.name)) for g in cues.scope_groups for t in g.terms]
    scope += [(t, ("wider", kind)) for kind, terms in cues.scope_wider.items() for t in terms]
    scope += [(t, ("cover", kind)) for kind, terms in cues.scope_covers.items() for t in terms]
    return _Matchers(_Matcher(certainty), _Matcher(negation), _Matcher(direction), _Matcher(scope))


# --- one analysed text ----------------------------------------------------------------------


class _Text:
    """A claim or passage: its tokens and the cues found in it, computed once."""

    def __init__(self, raw: str, split_sentences: bool) -> None:
        self.raw = raw
        self.toks = _tokens(raw, _sentence_spans(raw) if split_sentences else None)
        m = _matchers()
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
    def _live_negations(found: list[_Match]) -> list[_Match]:
        """Negation cues minus idioms and cancelled pairs ("did not fail to")."""
        cues = [n for n in found if ("pseudo",) not in n.labels]
        dead: set[int] = set()
        for k in range(len(cues) - 1):
            first, second = cues[k], cues[k + 1]
            if ("cancel",) in second.labels and ("cancel",) not in first.labels and second.start - first.end <= 1:
                dead |= {k, k + 1}
        return [n for k, n in enumerate(cues) if k not in dead]

    def _negated(self, cue: _Match) -> bool:
        clause = self.toks[cue.start].clause
        return any(
            0 <= cue.start - n.end <= _NEGATED_GAP and self.toks[n.start].clause == clause for n in self.negations
        )

    def _month(self, cue: _Match) -> bool:
        """ "May" written with a capital inside a sentence is the month, not the hedge."""
        tok = self.toks[cue.start]
        first = cue.start == 0 or self.toks[cue.start - 1].sentence != tok.sentence
        return tok.text == "may" and tok.capital and not first

    def surface(self, start: int, end: int) -> str:
        return self.raw[self.toks[start].start : self.toks[end - 1].end]

    def said(self, cue: _Match) -> str:
        return self.surface(cue.start, cue.end)

    def labelled(self, kind: str, sentences: set[int] | None = None) -> list[_Match]:
        return [
            c
            for c in self.certainty
            if (kind,) in c.labels and (sentences is None or self.toks[c.start].sentence in sentences)
        ]

    def _comma_between(self, i: int, j: int) -> bool:
        """Whether a comma stands between tokens ``i`` and ``j`` (i before j)."""
        return "," in self.raw[self.toks[i].end : self.toks[j].start]

    def negation_scopes(self) -> list[tuple[_Match, set[str]]]:
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


# --- the four checks ------------------------------------------------------------------------


def _effect_with_object(text: _Text, cue: _Match) -> bool:
    """ "Warming increases density" is causal; "density increases with depth" is not."""
    if text.toks[cue.start].text not in load_cues().effect_verbs or cue.end >= len(text.toks):
        return False
    if cue.start > 0 and text.toks[cue.start - 1].text in _DETERMINERS:
        return False  # "an increase", "the decrease": a noun
    after = text.toks[cue.end]
    if after.clause != text.toks[cue.start].clause:
        return False
    if after.text in _DETERMINERS:
        return True
    return after.text not in STOP_WORDS and not after.text.endswith("ly") and any(c.isalpha() for c in after.text)


def _overstated(claim: _Text, passage: _Text) -> CueFinding | None:
    if claim.labelled("hedge"):
        return None
    causal = claim.labelled("causal") + [e for e in claim.labelled("effect") if _effect_with_object(claim, e)]
    assertive = sorted(claim.labelled("booster") + causal, key=lambda c: c.start)
    if not assertive:
        return None
    sentences = passage.relevant_sentences(claim.roots)
    hedges = passage.labelled("hedge", sentences)
    if hedges:
        said, hedge = claim.said(assertive[0]), passage.said(hedges[0])
        return CueFinding("overstated", said, hedge, f'claim says "{said}", source hedges: "{hedge}"')
    links = passage.labelled("assoc", sentences)
    if causal and links and not passage.labelled("causal", sentences):
        said, link = claim.said(min(causal, key=lambda c: c.start)), passage.said(links[0])
        return CueFinding("overstated", said, link, f'claim says "{said}", source reports an association: "{link}"')
    return None


def _negation(claim: _Text, passage: _Text) -> CueFinding | None:
    claim_scopes, passage_scopes = claim.negation_scopes(), passage.negation_scopes()
    need = min(2, len(claim.roots))
    if need:
        for cue, roots in passage_scopes:
            shared = roots & claim.roots
            if len(shared) >= need and not any(r & shared for _, r in claim_scopes):
                said = passage.said(cue)
                return CueFinding("negation", "", said, f'source negates it: "{said}"; the claim does not')
    for cue, roots in claim_scopes:
        own = roots & claim.roots
        shared = own & passage.roots
        if own and len(shared) >= min(2, len(own)) and not any(r & shared for _, r in passage_scopes):
            said = claim.said(cue)
            return CueFinding("negation", said, "", f'claim negates: "{said}"; the source does not')
    return None


def _nearest(text: _Text, i: int) -> _Match | None:
    """The direction cue nearest token ``i`` in its clause, within the window."""
    clause, best, best_key = text.toks[i].clause, None, None
    for cue in text.direction:
        if text.toks[cue.start].clause != clause or cue.start <= i < cue.end:
            continue
        before = cue.end <= i
        gap = i - cue.end if before else cue.start - i - 1
        key = (gap, not before)
        if gap < _DIRECTION_WINDOW and (best_key is None or key < best_key):
            best, best_key = cue, key
    return best


def _axis(cue: _Match) -> tuple[str, str]:
    label = min(lab for lab in cue.labels if lab[0] == "dir")
    return label[1], label[2]


def _comparison(text: _Text, cue: _Match) -> tuple[set[str], set[str]] | None:
    """For "A is higher than B": the content words of A and of B, else None."""
    clause = text.toks[cue.start].clause
    than = next(
        (k for k in range(cue.end, min(len(text.toks), cue.end + 8)) if text.toks[k].text == "than"),
        None,
    )
    if than is None or text.toks[than].clause != clause:
        return None
    in_clause = [i for i in text.content if text.toks[i].clause == clause and not cue.start <= i < cue.end]
    return {text.toks[i].root for i in in_clause if i < than}, {text.toks[i].root for i in in_clause if i > than}


def _swapped(claim: _Text, mine: _Match, passage: _Text, theirs: _Match) -> bool:
    """ "higher in A than in B" and "lower in B than in A" say the same thing."""
    ours, other = _comparison(claim, mine), _comparison(passage, theirs)
    if ours is None or other is None:
        return False
    (a, b), (c, d) = ours, other
    return bool((a - b) & (d - c)) and bool((b - a) & (c - d))


def _phrase_at(text: _Text, i: int) -> str:
    """The content word at ``i`` with up to two content words after it ("nest density")."""
    content, end = set(text.content), i + 1
    while end in content and end - i < 3 and text.toks[end].clause == text.toks[i].clause:
        end += 1
    return text.surface(i, end)


def _direction(claim: _Text, passage: _Text) -> CueFinding | None:
    in_cue = {i for d in claim.direction for i in range(d.start, d.end)}
    passage_at: dict[str, list[int]] = {}
    for j in passage.content:
        passage_at.setdefault(passage.toks[j].root, []).append(j)
    agree, disagree = 0, 0
    first: tuple[str, str, str, bool] | None = None
    seen: set[str] = set()
    for i in claim.content:
        root = claim.toks[i].root
        if i in in_cue or root in seen or root not in passage_at:
            continue
        cue = _nearest(claim, i)
        if cue is None:
            continue
        seen.add(root)
        axis, side = _axis(cue)
        theirs = [(c, _axis(c)) for c in (_nearest(passage, j) for j in passage_at[root]) if c is not None]
        sides = {s for c, (a, s) in theirs if a == axis}
        opposite = [c for c, (a, s) in theirs if a == axis and s != side]
        if side in sides or (opposite and _swapped(claim, cue, passage, opposite[0])):
            agree += 1
        elif opposite:
            disagree += 1
            # Report the cue's object ("increased density") over its subject ("warming increased").
            if first is None or (not first[3] and cue.end <= i):
                other = opposite[0]
                first = (claim.said(cue), passage.said(other), _phrase_at(claim, i), cue.end <= i)
    if first is None or disagree <= agree:
        return None
    said, other, about, _ = first
    return CueFinding("direction-flip", said, other, f'claim says "{said}", source says "{other}" about "{about}"')


def _with_preposition(text: _Text, cue: _Match) -> str:
    """The restricting term with the "in"/"among" before it, as the source wrote it."""
    start = cue.start
    if start >= 1 and text.toks[start - 1].text == "the" and start >= 2:
        if text.toks[start - 2].text in ("in", "among"):
            start -= 2
    elif start >= 1 and text.toks[start - 1].text in ("in", "among"):
        start -= 1
    return text.surface(start, cue.end)


def _group_scope(claim: _Text, passage: _Text, sentences: set[int]) -> CueFinding | None:
    cues = load_cues()
    groups = {g.name: g for g in cues.scope_groups}

    def labels(text: _Text, kind: str) -> set[Label]:
        return {lab for m in text.scope for lab in m.labels if lab[0] == kind}

    passage_groups = {lab[1] for lab in labels(passage, "group")}
    passage_wider = {lab[1] for lab in labels(passage, "wider")}
    claim_groups = {lab[1] for lab in labels(claim, "group")}
    claim_covers = {lab[1] for lab in labels(claim, "cover")}
    for kind in ("species", "in-vitro", "subgroup", "setting"):
        if kind in _WHOLE_PASSAGE_KINDS and kind in passage_wider:
            continue  # the passage speaks of humans or in-vivo work too: not clearly restricted
        for m in passage.scope:
            names = [lab[1] for lab in m.labels if lab[0] == "group" and groups[lab[1]].kind == kind]
            if not names or (kind not in _WHOLE_PASSAGE_KINDS and passage.toks[m.start].sentence not in sentences):
                continue
            group = groups[names[0]]
            if group.opposite and group.opposite in passage_groups:
                continue
            kept = group.name in claim_groups or kind in claim_covers
            if kind in _WHOLE_PASSAGE_KINDS:
                kept = kept or any(groups[n].kind == kind for n in claim_groups)
            if kept:
                continue
            return _scope_finding(claim, kind, _with_preposition(passage, m))
    return None


def _scope_finding(claim: _Text, kind: str, limit: str) -> CueFinding:
    wider = [m for m in claim.scope if ("wider", kind) in m.labels]
    if wider:
        said = claim.said(wider[0])
        return CueFinding("scope-wider", said, limit, f'claim says "{said}", source is limited to "{limit}"')
    return CueFinding("scope-wider", "", limit, f'claim drops the source\'s limit "{limit}"')


def _place_scope(claim: _Text, passage: _Text, sentences: set[int]) -> CueFinding | None:
    """ "in Norway" in the passage's finding, with no mention of Norway in the claim."""
    not_places = load_cues().not_places
    in_scope_term = {i for m in passage.scope for i in range(m.start, m.end)}
    toks = passage.toks
    claim_words = {t.root for t in claim.toks}
    for i, tok in enumerate(toks[:-1]):
        if tok.text != "in" or tok.sentence not in sentences:
            continue
        j = i + 2 if toks[i + 1].text == "the" and i + 2 < len(toks) else i + 1
        k = j
        while k < len(toks) and k - j < 4 and toks[k].capital and toks[k].sentence == tok.sentence:
            k += 1
        if k == j or toks[j].text in not_places or len(toks[j].text) < 2 or j in in_scope_term:
            continue
        if k < len(toks) and toks[k].text == "et":  # "in Smith et al.": a citation
            continue
        if any(toks[n].root in claim_words for n in range(j, k)):
            continue
        return _scope_finding(claim, "setting", passage.surface(i, k))
    return None


def sentences(text: str) -> list[str]:
    """The sentences of ``text`` (pysbd), as written."""
    return [text[a:b] for a, b in _sentence_spans(text)]


def best_sentence(passage: str, claim_roots: set[str]) -> str:
    """The passage's sentence that shares most content words with the claim.

    Cues are read in that sentence only: a negation or a hedge in a neighbouring sentence
    is about something else far more often than not (measured on SciFact SUPPORT pairs and
    the demo: "Soil properties that cannot be seen" beside the sentence that backs the claim).
    """
    spans = _sentence_spans(passage)
    if len(spans) <= 1:
        return passage

    def shared(span: tuple[int, int]) -> int:
        return len({t.root for t in _tokens(passage[span[0] : span[1]], None)} & claim_roots)

    start, end = max(spans, key=shared)
    return passage[start:end]


def closest_sentence(claim: str, passage: str) -> str:
    """The passage's sentence sharing most content words with ``claim`` (see best_sentence)."""
    return best_sentence(passage, _Text(claim, split_sentences=False).roots)


# Axes whose poles say which way an effect goes, and the way each pole means: more, faster
# or positively associated is "up" (a ratio above 1), their opposites "down".
_EFFECT_POLES = {
    ("amount", "up"): "up",
    ("amount", "down"): "down",
    ("pace", "faster"): "up",
    ("pace", "slower"): "down",
    ("correlation", "positive"): "up",
    ("correlation", "negative"): "down",
}
# A direction word right after these is a noun naming the outcome, not the way it goes.
_NOUN_BEFORE = frozenset(["of", "in", "from"])
# Words that state there is no effect (common practice, no source).
_NO_EFFECT = re.compile(
    r"\b(?:similar|same|unrelated|independent of|unchanged|incapable of|ineffective|inactive against"
    r"|no (?:(?:known|significant|clear|detectable|apparent) )?(?:difference|effect|association|change|impact|"
    r"relationship|link|increase|decrease|reduction)|not (?:associated|related|linked|affect\w*|change\w*|differ\w*)"
    r"|does not|did not|do not|has no|have no|had no)\b",
    re.IGNORECASE,
)


def effect_direction(text: str) -> tuple[str, str] | None:
    """Which way ``text`` says an effect goes, with the words that say it.

    "up" (increases, higher, more likely, faster), "down", or "none" ("is not associated
    with", "similar", "does not increase": a negated direction is no effect), or None when
    the text names no direction or names both.
    """
    t = _Text(text, split_sentences=False)
    ways: dict[str, str] = {}
    for cue in t.direction:
        if cue.start > 0 and t.toks[cue.start - 1].text in _NOUN_BEFORE:
            continue  # "the risk of falls", "an increase": a noun naming the outcome
        way = _EFFECT_POLES.get(_axis(cue))
        if way is not None:
            ways.setdefault(way, t.said(cue))
    null = _NO_EFFECT.search(text)
    first_direction = min((text.find(words) for words in ways.values()), default=len(text))
    if null and (not ways or null.start() < first_direction):
        return "none", null.group(0)  # "is not associated with an increased risk": no effect
    if len(ways) == 1 and not null:
        ((way, words),) = ways.items()
        return way, words
    return None


def compare(claim: str, passage: str) -> list[CueFinding]:
    """The ways ``claim`` says more than ``passage`` (its cited source's best passage), in
    the order overstated, negation, direction-flip, scope-wider; at most one of each."""
    if not claim.strip() or not passage.strip():
        return []
    c = _Text(claim, split_sentences=False)
    passage = best_sentence(passage, c.roots)
    p = _Text(passage, split_sentences=True)
    sentences = p.relevant_sentences(c.roots)
    checks = (
        _overstated(c, p),
        _negation(c, p),
        _direction(c, p),
        _group_scope(c, p, sentences) or _place_scope(c, p, sentences),
    )
    return [f for f in checks if f is not None]
