"""Build the second training stage's pairs: every first-stage pair plus contrast edits of supported pairs.

Usage::

    python scripts/verifier/build_contrast.py [--pairs bench/out/verifier/pairs.jsonl]
                                              [--out bench/out/verifier/contrast] [--per-kind 1500]

The first stage (build_data.py, train.py) taught the verifier from NLI, SciFact and
Citation-Integrity pairs and about a thousand counterfactual edits; it still reads many
reversals in the same words as agreement. This stage takes every *supported* training or
validation pair of the first stage's file and edits its claim so that the evidence now
contradicts it, with the first stage's edit kinds (negation, direction words, WordNet
adjective antonyms, groups of a comparison) and three more (contrast_edits.py: comparatives,
verb antonyms, the two sides of "than"); the rare ones are also made from the scientific
evidence sentences read against themselves. Only the claim is edited for NLI and
Citation-Integrity pairs: their evidence holds more than the claim, so an edit there may touch
nothing the claim says. Each kind is capped at ``--per-kind`` pairs (a seeded sample), so that
negations, the easiest edit to make, do not crowd out the rest. An edited pair keeps its
original's claim group and split, so validation stays split by claim. Writes
``OUT/pairs.jsonl`` (first-stage pairs plus the edits, sources "contrast:KIND/FAMILY") and
``OUT/stats.json``. A first try with contrast pairs alone taught the model that an opposite
word anywhere means contradiction (faithful paraphrases and exact quotations of real papers
read as reversals), so supported "balance" pairs come with them (``balance_pairs``).
Nothing is written into the repository.
"""

from __future__ import annotations

import argparse
import json
import random
import sys
from collections import Counter, defaultdict
from pathlib import Path

from contrast_edits import swap_comparative, swap_than_roles, swap_verb_antonym
from edits import insert_negation, remove_negation, swap_antonym, swap_direction, swap_groups
from pair_records import CONTRADICTS, ROOT, SUPPORTS, Pair, read_pairs, write_pairs

DEFAULT_DIR = ROOT / "bench" / "out" / "verifier"
EDITS = {
    "negation-inserted": insert_negation,
    "negation-removed": remove_negation,
    "direction-swapped": swap_direction,
    "antonym-swapped": swap_antonym,
    "groups-swapped": swap_groups,
    "comparative-swapped": swap_comparative,
    "verb-antonym-swapped": swap_verb_antonym,
    "than-roles-swapped": swap_than_roles,
}
SELF_EDITS = {
    "comparative-swapped": swap_comparative,
    "than-roles-swapped": swap_than_roles,
    "verb-antonym-swapped": swap_verb_antonym,
    "direction-swapped": swap_direction,
}
SELF_FAMILIES = ("scifact", "citint")
SEED = 13


def family(pair: Pair) -> str:
    return pair.source.split(":")[0]


def contrast_pairs(
    pairs: list[Pair], per_kind: int, seed: int = SEED, skip: frozenset[str] = frozenset()
) -> tuple[list[Pair], Counter[str]]:
    """Edited claims of supported pairs (-> contradicts), at most ``per_kind`` of each kind, none of ``skip``."""
    by_kind: dict[str, list[Pair]] = defaultdict(list)
    seen = {(p.claim, p.evidence) for p in pairs}

    def add(kind: str, edited: str | None, original: str, pair: Pair, source: str) -> None:
        if edited is None or edited == original or (edited, pair.evidence) in seen:
            return
        seen.add((edited, pair.evidence))
        by_kind[kind].append(
            Pair(edited, pair.evidence, CONTRADICTS, f"contrast:{kind}/{source}", pair.group, pair.split)
        )

    for pair in pairs:
        if pair.label != SUPPORTS or family(pair) == "counterfactual":
            continue
        for kind, edit in EDITS.items():
            if kind in skip:
                continue
            if kind == "negation-removed" and family(pair) in ("snli", "cad"):
                continue  # an NLI hypothesis's negation is often its own point ("nobody is sad")
            add(kind, edit(pair.claim), pair.claim, pair, family(pair))
    # Reversals that claims rarely hold (comparatives, "than" roles) are also made from the
    # evidence sentences of the scientific pairs, read against themselves: the edited sentence
    # as the claim, the sentence as it stands as the evidence.
    for pair in pairs:
        if family(pair) in SELF_FAMILIES:
            for kind, edit in SELF_EDITS.items():
                if kind in skip:
                    continue
                add(kind, edit(pair.evidence), pair.evidence, pair, f"self-{family(pair)}")
    rng = random.Random(seed)
    made: list[Pair] = []
    counts: Counter[str] = Counter()
    for kind in sorted(by_kind):
        chosen = by_kind[kind] if len(by_kind[kind]) <= per_kind else rng.sample(by_kind[kind], per_kind)
        made += chosen
        counts.update(p.source.split(":", 1)[1] for p in chosen)
    return made, counts


# Edits that mean the same when made to both sides: "X avoided Y" against "X avoided Y and Z".
CONSISTENT_EDITS = (
    "negation-inserted",
    "direction-swapped",
    "antonym-swapped",
    "comparative-swapped",
    "verb-antonym-swapped",
)
# Ways a manuscript attributes a source's sentence to it (common practice, no source); invented names.
ATTRIBUTIONS = (
    'Okafor and colleagues write that "{quote}"',
    'As Lindqvist et al. put it, "{quote}"',
    "The authors report that {lower}",
    "Brandt and Sato found that {lower}",
    'According to the study, "{quote}"',
)


def _swap(before: str, after: str) -> tuple[str, str] | None:
    """The one word an edit replaced, as (old, new) in lower case; None if it changed more or nothing."""
    old, new = before.lower().split(), after.lower().split()
    if len(old) != len(new):
        return None
    changed = [(a, b) for a, b in zip(old, new, strict=True) if a != b]
    return changed[0] if len(changed) == 1 else None


def balance_pairs(pairs: list[Pair], seed: int = SEED) -> tuple[list[Pair], Counter[str]]:
    """Supported pairs that keep the contrast edits from teaching "an opposite word means contradiction".

    - the same edit made to the claim and to the evidence of a supported pair: still supported;
    - a scientific evidence sentence quoted or reported with an attribution, against itself:
      supported (an exact quotation must not read as a reversal).
    """
    rng = random.Random(f"{seed}:balance")
    made: list[Pair] = []
    seen = {(p.claim, p.evidence) for p in pairs}
    counts: Counter[str] = Counter()

    def add(claim: str, evidence: str, kind: str, pair: Pair) -> None:
        if (claim, evidence) in seen:
            return
        seen.add((claim, evidence))
        made.append(Pair(claim, evidence, SUPPORTS, f"balance:{kind}/{family(pair)}", pair.group, pair.split))
        counts[f"{kind}/{family(pair)}"] += 1

    for pair in pairs:
        if pair.label != SUPPORTS or family(pair) == "counterfactual":
            continue
        for kind in CONSISTENT_EDITS:
            claim, evidence = EDITS[kind](pair.claim), EDITS[kind](pair.evidence)
            if (
                claim
                and evidence
                and _swap(pair.claim, claim)
                and _swap(pair.claim, claim) == _swap(pair.evidence, evidence)
            ):
                add(claim, evidence, f"both-{kind}", pair)
    quoted: set[str] = set()
    for pair in pairs:
        sentence = pair.evidence.strip()
        if family(pair) not in SELF_FAMILIES or sentence in quoted or not 40 <= len(sentence) <= 300:
            continue
        quoted.add(sentence)
        template = rng.choice(ATTRIBUTIONS)
        body = sentence.rstrip(".")
        add(template.format(quote=body, lower=body[:1].lower() + body[1:]), sentence, "attributed", pair)
    return made, counts


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--pairs", type=Path, default=DEFAULT_DIR / "pairs.jsonl", help="the first stage's pairs")
    parser.add_argument("--out", type=Path, default=DEFAULT_DIR / "contrast")
    parser.add_argument("--per-kind", type=int, default=1500)
    parser.add_argument("--skip", nargs="*", default=[], choices=sorted(EDITS), help="edit kinds to leave out")
    args = parser.parse_args(argv)
    if not args.pairs.is_file():
        print(f"error: {args.pairs}: not found (run scripts/verifier/build_data.py)", file=sys.stderr)
        return 2
    first = list(read_pairs(args.pairs))
    edited, counts = contrast_pairs(first, args.per_kind, skip=frozenset(args.skip))
    balanced, balance_counts = balance_pairs(first)
    written = write_pairs(args.out / "pairs.jsonl", first + edited + balanced)
    stats = {
        "first_stage_pairs": len(first),
        "contrast_pairs": len(edited),
        "kinds": dict(sorted(counts.items())),
        "balance_pairs": len(balanced),
        "balance_kinds": dict(sorted(balance_counts.items())),
    }
    (args.out / "stats.json").write_text(json.dumps(stats, indent=2) + "\n", encoding="utf-8")
    print("\n".join(f"contrast {kind}: {n}" for kind, n in sorted(counts.items())))
    print("\n".join(f"balance {kind}: {n}" for kind, n in sorted(balance_counts.items())))
    print(f"wrote {written} pairs to {args.out / 'pairs.jsonl'}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
