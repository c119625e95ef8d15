"""Cross-validate the CRF reference-entry parser against the rule parser it replaces.

Usage:
    python bench/entry_parser.py [DATA] [--folds 5] [--seed 13] [--errors FIELD]

DATA defaults to ../shared/data/refstrings/labelled.jsonl (relative to the repository root).

Folds. Near-duplicate entries would let a model score on a test entry it has all but seen,
so entries are grouped before folding: two entries are linked when their texts, lower-cased
with accents folded and punctuation dropped, reach rapidfuzz ``fuzz.ratio`` >= 90, or when
their hand-labelled titles (four words or more, normalised the same way) are equal; the
groups are the connected components of those links. Whole groups are dealt, largest first,
into the currently smallest of five folds after a seeded shuffle. Each fold is tested by a
model trained on the other four, with word lists derived from those four only.

Scores (see sourcecheck/drafts/bibliography/entry_parser/evaluation.py): title and
container correct at fuzz.ratio >= 90 on normalised text; year exact; first author's family
name exact after folding case, accents and particles; DOI exact, where the hand labels hold
the field. Both lines run ``sourcecheck.drafts.bibliography.parse_references`` (which strips a
leading list number and calls ``parse_entry``) on every entry: "before" with
the rule parser's fields in the model's place (it has no container), "after" with each fold's
model, as the readers use the shipped one (the container is the model's own field).
Rows are given for all entries, per source file (``from``) and per style family guessed
from the hand labels (``style_family``). The parser takes its DOI from a regular expression
over the whole entry; the row "doi from tagged spans only" shows what the tagger's doi and
url spans alone would give, the measurement behind keeping the rule.
"""

from __future__ import annotations

import argparse
import sys
import tempfile
import time
from pathlib import Path

from sourcecheck.drafts.bibliography import parse_entry_by_rules, parse_references
from sourcecheck.drafts.bibliography.entry_parser import (
    FIELDS,
    TRAINING_PARAMS,
    EntryFields,
    EntryTagger,
    Guess,
    LabelledDataError,
    Tally,
    assign_folds,
    gold_fields,
    lexicons_for,
    near_duplicate_groups,
    per_group_table,
    read_labelled,
    score_entry,
    style_family,
    train_model,
)
from sourcecheck.text import find_doi

ROOT = Path(__file__).resolve().parent.parent
DEFAULT_DATA = ROOT.parent / "shared" / "data" / "refstrings" / "labelled.jsonl"
DOI_FROM_SPANS = "doi from tagged spans only"


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("data", nargs="?", type=Path, default=DEFAULT_DATA)
    parser.add_argument("--folds", type=int, default=5)
    parser.add_argument("--seed", type=int, default=13)
    parser.add_argument("--errors", choices=FIELDS, help="print the wrong answers for one field")
    args = parser.parse_args(argv)
    try:
        entries = read_labelled(args.data)
    except LabelledDataError as error:
        print(error, file=sys.stderr)
        return 2
    gold = [gold_fields(entry) for entry in entries]
    groups = near_duplicate_groups([e.text for e in entries], [g.title for g in gold])
    fold_of = assign_folds(groups, args.folds, args.seed)
    rows = [["all", *([f"from:{e.source}", f"style:{style_family(e)}"])] for e in entries]
    print(f"{len(entries)} entries, {len(set(groups))} near-duplicate groups, {args.folds} folds, seed {args.seed}")
    print(f"training parameters: {dict(TRAINING_PARAMS)}")

    before = Tally()
    for entry, truth, keys in zip(entries, gold, rows, strict=True):
        ref = parse_references([(entry.text, 1)], read_fields=_rule_fields)[0]
        scores = score_entry(truth, Guess(ref.authors, ref.title, None, ref.year, ref.doi))
        scores.pop("container", None)
        before.add(keys, scores)

    after = Tally()
    started = time.perf_counter()
    with tempfile.TemporaryDirectory() as tmp:
        for fold in range(args.folds):
            train = [e for e, f in zip(entries, fold_of, strict=True) if f != fold]
            lexicons = lexicons_for(train)
            model_path = Path(tmp) / f"fold{fold}.crfsuite"
            fold_start = time.perf_counter()
            train_model(train, lexicons, model_path)
            reader = _NotingReader(EntryTagger(model_path, lexicons))
            for index in (i for i, f in enumerate(fold_of) if f == fold):
                ref = parse_references([(entries[index].text, 1)], read_fields=reader)[0]
                fields = reader.last
                scores = score_entry(gold[index], Guess(ref.authors, ref.title, fields.container, ref.year, ref.doi))
                after.add(rows[index], scores)
                if gold[index].doi:  # the rule (a DOI regex over the whole entry) against the tagger alone
                    tagged = " ".join(s.text for s in fields.spans if s.label in {"doi", "url"})
                    after.add([DOI_FROM_SPANS], {"doi": find_doi(tagged) == gold[index].doi})
                if args.errors and scores.get(args.errors) is False:
                    _show_error(args.errors, entries[index].text, gold[index], fields)
            print(f"fold {fold}: {len(train)} training entries, {time.perf_counter() - fold_start:.1f} s", flush=True)
    print(f"cross-validation took {time.perf_counter() - started:.1f} s\n")
    _print_tables(before, after)
    return 0


class _NotingReader:
    """A fold's model as ``parse_references`` calls it, keeping the last fields (for the container and spans)."""

    def __init__(self, tagger: EntryTagger) -> None:
        self.tagger = tagger
        self.last = _rule_fields("")

    def __call__(self, text: str) -> EntryFields:
        self.last = self.tagger.parse(text)
        return self.last


def _rule_fields(text: str) -> EntryFields:
    """The rule parser's reading in the model's place: the readers as they were before the model."""
    rules = parse_entry_by_rules(text)
    return EntryFields(rules.authors, rules.title, None, rules.year, rules.suffix, rules.doi, None, None, None, ())


def _show_error(name: str, text: str, gold: object, fields: object) -> None:
    attribute = "authors" if name == "first_author" else name
    print(f"  [{name}] {text}\n      gold: {getattr(gold, attribute)!r}\n      got:  {getattr(fields, attribute)!r}")


def _print_tables(before: Tally, after: Tally) -> None:
    header = ["rows", "n", *FIELDS]
    groups = [g for g in after.groups() if g != DOI_FROM_SPANS]
    named = (("before (rule parser, no training)", before), ("after (CRF as the readers use it, 5-fold CV)", after))
    for name, tally in named:
        print(name)
        shown = [*groups, DOI_FROM_SPANS] if tally is after else groups
        table = [header, *per_group_table(tally, shown)]
        widths = [max(len(row[i]) for row in table) for i in range(len(header))]
        for row in table:
            print("  " + "  ".join(cell.ljust(width) for cell, width in zip(row, widths, strict=True)))
        print()


if __name__ == "__main__":
    raise SystemExit(main())
