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
  an object after them ("density increases with depth" is not causal). A claim of proof
  ("proves", "clearly established", "definitively") is overstated even where the source
  does not hedge, unless its sentence claims proof too.
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
  unlike") is not read at all. A claim that negates ("did not change X") agrees with a
  passage sentence that states no effect ("no statistically significant difference in X"),
  however far its "no" stands from X.
- **direction-flip**: for each content word the claim and passage share, the nearest
  direction word in the same clause (within 6 words; ties go to the word before, as in
  "increased density") is looked up on each side. The claim flips the passage when more
  shared words disagree (opposite sides of one axis: increase/decrease, improve/worsen,
  positive/negative correlation ...) than agree, or when the words after the claim's
  direction word (its object: what was increased) only disagree, whatever its subject
  does ("women increased X" against "women increased Y, while reducing X"). Comparing word by word means "decreased
  predation led to increased density" agrees with a claim of "increased density": only the
  object "density" is shared. "Higher in A than in B" agrees with "lower in B than in A"
  (the words either side of "than" are compared swapped), and "higher in B than in A" or
  "B outperformed A" turns it round. A direction word right after a negation is left to the
  negation check ("did not decrease").
- **scope-wider**: the passage restricts the finding (species, cell studies, a subgroup of
  people, one site, the laboratory, "in <Place>") and the claim neither keeps that
  restriction (same term, a synonym, or a covering term such as "animal models") nor is
  otherwise restricted in the same way; the claim's wider term ("humans", "people",
  "worldwide") is reported when it has one. Species and cell-study terms count anywhere in
  the passage unless it also speaks of humans or in-vivo work; subgroup, setting and place
  terms count only in the sentences that share the claim's words, and a subgroup found
  with its opposite ("women" with "men") restricts nothing. A capitalised term after "in"
  is no place when it names an arm or a condition ("in the PCSO group", "in the SRL case")
  or is an acronym of words the claim writes out ("SRL": "semantic role labelling").

Each check returns at most one finding, so a report line stays readable.
"""

from __future__ import annotations

import re

from sourcecheck.judge.cue_lists import CueFinding, load_cues
from sourcecheck.judge.cue_text import CueMatch, CueText, Label, names_a_condition, spelled_out, tokens_of
from sourcecheck.text import STOP_WORDS, sentence_spans

_DIRECTION_WINDOW = 6  # words between a direction cue and the word it is about
_WHOLE_PASSAGE_KINDS = frozenset(["species", "in-vitro"])
_DETERMINERS = frozenset(["the", "a", "an", "its", "their", "our", "this", "these", "both"])
# Words that claim proof: overstated unless the source claims it too, hedged or not (a
# subset of Hyland's boosters, 1998, from memory; the fixture's "overstated" kind names them).
_PROOF = re.compile(
    r"\b(?:prove[sdn]?|proving|clearly establish\w*|definitive(?:ly)?|conclusive(?:ly)?|unequivocal(?:ly)?|undoubtedly"
    r"|beyond (?:any )?doubt)\b",
    re.IGNORECASE,
)
_COMPARING_VERBS = ("outperform", "underperform", "exceed", "surpass")  # "A exceeded B" compares A with B

# --- the four checks ------------------------------------------------------------------------


def _effect_with_object(text: CueText, cue: CueMatch) -> bool:
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


def _overstated(claim: CueText, passage: CueText) -> CueFinding | None:
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
    proof = _PROOF.search(claim.raw)
    negated = proof is not None and claim.raw[: proof.start()].rstrip().lower().endswith(("not", "never", "n't"))
    if proof and not negated and not _PROOF.search(passage.raw):
        said = proof.group(0)
        return CueFinding("overstated", said, "", f'claim says "{said}"; the source claims no such certainty')
    return None


def _negation(claim: CueText, passage: CueText) -> CueFinding | None:
    claim_scopes, passage_scopes = claim.negation_scopes(), passage.negation_scopes()
    need = min(2, len(claim.roots))
    if need:
        for cue, roots in passage_scopes:
            shared = roots & claim.roots
            if len(shared) >= need and not any(r & shared for _, r in claim_scopes):
                said = passage.said(cue)
                return CueFinding("negation", "", said, f'source negates it: "{said}"; the claim does not')
    if _NO_EFFECT.search(passage.raw):
        return None  # "did not change X" and "no significant difference in X" agree
    for cue, roots in claim_scopes:
        own = roots & claim.roots
        shared = own & passage.roots
        if own and len(shared) >= min(2, len(own)) and not any(r & shared for _, r in passage_scopes):
            said = claim.said(cue)
            return CueFinding("negation", said, "", f'claim negates: "{said}"; the source does not')
    return None


def _nearest(text: CueText, i: int) -> CueMatch | None:
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


def _axis(cue: CueMatch) -> tuple[str, str]:
    label = min(lab for lab in cue.labels if lab[0] == "dir")
    return label[1], label[2]


def _comparison(text: CueText, cue: CueMatch) -> tuple[set[str], set[str]] | None:
    """For "A is higher than B" or "A outperformed B": the content words of A and of B, else None."""
    clause = text.toks[cue.start].clause
    than = next(
        (k for k in range(cue.end, min(len(text.toks), cue.end + 8)) if text.toks[k].text == "than"),
        None,
    )
    if text.toks[cue.start].text.startswith(_COMPARING_VERBS):
        than = cue.start
    elif than is None or text.toks[than].clause != clause:
        return None
    in_clause = [i for i in text.content if text.toks[i].clause == clause and not cue.start <= i < cue.end]
    return {text.toks[i].root for i in in_clause if i < than}, {text.toks[i].root for i in in_clause if i > than}


def _swapped(claim: CueText, mine: CueMatch, passage: CueText, theirs: CueMatch) -> bool:
    """ "higher in A than in B" and "lower in B than in A" say the same thing."""
    ours, other = _comparison(claim, mine), _comparison(passage, theirs)
    if ours is None or other is None:
        return False
    (a, b), (c, d) = ours, other
    return bool((a - b) & (d - c)) and bool((b - a) & (c - d))


def _phrase_at(text: CueText, i: int) -> str:
    """The content word at ``i`` with up to two content words after it ("nest density")."""
    content, end = set(text.content), i + 1
    while end in content and end - i < 3 and text.toks[end].clause == text.toks[i].clause:
        end += 1
    return text.surface(i, end)


def _direction(claim: CueText, passage: CueText) -> CueFinding | None:
    in_cue = {i for d in claim.direction for i in range(d.start, d.end)}
    passage_at: dict[str, list[int]] = {}
    for j in passage.content:
        passage_at.setdefault(passage.toks[j].root, []).append(j)
    agree, disagree = 0, 0
    object_votes = [0, 0]  # agreeing, disagreeing words that follow their cue (its object)
    swaps = 0  # words whose comparison the claim turns round; one decides
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
        same = [c for c, (a, s) in theirs if a == axis and s == side]
        if same and not opposite and _swapped(claim, cue, passage, same[0]):
            opposite, swaps = same, swaps + 1  # "A outperformed B" against "B outperformed A"
        elif side in sides or (opposite and _swapped(claim, cue, passage, opposite[0])):
            agree += 1
            object_votes[0] += cue.end <= i
            continue
        if opposite:
            disagree += 1
            object_votes[1] += cue.end <= i
            # Report the cue's object ("increased density") over its subject ("warming increased").
            if first is None or (not first[3] and cue.end <= i):
                first = (claim.said(cue), passage.said(opposite[0]), _phrase_at(claim, i), cue.end <= i)
    if first is None or (disagree <= agree and not object_votes[1] > object_votes[0] == 0 and not swaps):
        return None
    claimed, reported, about, _ = first
    swapped = " with the sides of the comparison swapped" if claimed.lower() == reported.lower() else ""
    message = f'claim says "{claimed}", source says "{reported}" about "{about}"{swapped}'
    return CueFinding("direction-flip", claimed, reported, message)


def _with_preposition(text: CueText, cue: CueMatch) -> str:
    """The restricting term with the "in"/"among" before it, as the source wrote it."""
    start = cue.start
    if start >= 1 and text.toks[start - 1].text == "the" and start >= 2:
        if text.toks[start - 2].text in ("in", "among"):
            start -= 2
    elif start >= 1 and text.toks[start - 1].text in ("in", "among"):
        start -= 1
    return text.surface(start, cue.end)


def _group_scope(claim: CueText, passage: CueText, sentences: set[int]) -> CueFinding | None:
    cues = load_cues()
    groups = {g.name: g for g in cues.scope_groups}

    def labels(text: CueText, kind: str) -> set[Label]:
        return {lab for m in text.scope for lab in m.labels if lab[0] == kind}

    passage_groups = {lab[1] for lab in labels(passage, "group")}
    passage_wider = {lab[1] for lab in labels(passage, "wider")}
    claim_groups = {lab[1] for lab in labels(claim, "group")}
    claim_covers = {lab[1] for lab in labels(claim, "cover")}
    claim_roots = {tok.root for tok in claim.toks}
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
            # The claim writes the very words ("pregnant women" keeps the passage's "women").
            kept = kept or all(passage.toks[n].root in claim_roots for n in range(m.start, m.end))
            if kind in _WHOLE_PASSAGE_KINDS:
                kept = kept or any(groups[n].kind == kind for n in claim_groups)
            if kept:
                continue
            return _scope_finding(claim, kind, _with_preposition(passage, m))
    return None


def _scope_finding(claim: CueText, kind: str, limit: str) -> CueFinding:
    wider = [m for m in claim.scope if ("wider", kind) in m.labels]
    if wider:
        said = claim.said(wider[0])
        return CueFinding("scope-wider", said, limit, f'claim says "{said}", source is limited to "{limit}"')
    return CueFinding("scope-wider", "", limit, f'claim drops the source\'s limit "{limit}"')


def _place_scope(claim: CueText, passage: CueText, sentences: set[int]) -> CueFinding | None:
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
        if names_a_condition(toks, k) or spelled_out(passage.surface(j, k), claim):
            continue
        if any(toks[n].root in claim_words for n in range(j, k)):
            continue
        return _scope_finding(claim, "setting", passage.surface(i, k))
    return None


def sentences(text: str) -> list[str]:
    """The sentences of ``text`` (pysbd), as written."""
    return [text[a:b] for a, b in sentence_spans(text)]


def best_sentence(passage: str, claim_roots: set[str]) -> str:
    """The passage's sentence that shares most content words with the claim.

    Cues are read in that sentence only: a negation or a hedge in a neighbouring sentence
    is about something else far more often than not (measured on SciFact SUPPORT pairs and
    the demo: "Soil properties that cannot be seen" beside the sentence that backs the claim).
    """
    spans = sentence_spans(passage)
    if len(spans) <= 1:
        return passage

    def shared(span: tuple[int, int]) -> int:
        return len({t.root for t in tokens_of(passage[span[0] : span[1]], None)} & claim_roots)

    start, end = max(spans, key=shared)
    return passage[start:end]


def closest_sentence(claim: str, passage: str) -> str:
    """The passage's sentence sharing most content words with ``claim`` (see best_sentence)."""
    return best_sentence(passage, CueText(claim, split_sentences=False).roots)


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
    r"|no (?:(?:statistically|known|significant|clear|detectable|apparent) ){0,2}"
    r"(?:difference|effect|association|change|impact|relationship|link|increase|decrease|reduction)"
    r"|not (?:associated|related|linked|affect\w*|change\w*|differ\w*)"
    r"|does not|did not|do not|has no|have no|had no)\b",
    re.IGNORECASE,
)


def effect_direction(text: str) -> tuple[str, str] | None:
    """Which way ``text`` says an effect goes, with the words that say it.

    "up" (increases, higher, more likely, faster), "down", or "none" ("is not associated
    with", "similar", "does not increase": a negated direction is no effect), or None when
    the text names no direction or names both.
    """
    t = CueText(text, split_sentences=False)
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
    c = CueText(claim, split_sentences=False)
    passage = best_sentence(passage, c.roots)
    p = CueText(passage, split_sentences=True)
    sentences = p.relevant_sentences(c.roots)
    checks = (
        _overstated(c, p),
        _negation(c, p),
        _direction(c, p),
        _group_scope(c, p, sentences) or _place_scope(c, p, sentences),
    )
    return [f for f in checks if f is not None]
