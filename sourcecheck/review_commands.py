"""``sourcecheck review accept | list | forget``: the review file beside a draft, from the command line.

Accepting runs the check (from the cache when warm) because the fingerprint covers the
evidence passage the tool shows, not only the sentence: a person accepts what they saw.
"""

from __future__ import annotations

import argparse
import datetime
from pathlib import Path

from sourcecheck.errors import SettingsError
from sourcecheck.model import Check, ClaimResult
from sourcecheck.text import trim, visible
from sourcecheck.workflow import Acceptance, fingerprint, load_reviews, review_path, save_reviews
from sourcecheck.workspace import apply_settings, check_options


def _same_label(label: str, wanted: str) -> bool:
    """ "[2]" matches "2" and "[2]"; an author-year label matches without its brackets too."""
    strip = "[]() "
    return label.strip(strip).casefold() == wanted.strip(strip).casefold()


def _chosen(result: ClaimResult, citation: str | None, draft: Path) -> list[Check]:
    if citation is None:
        return result.checks
    chosen = [c for c in result.checks if _same_label(c.citation.label, citation)]
    if not chosen:
        labels = ", ".join(visible(c.citation.label) for c in result.checks)
        raise SettingsError(f"{draft}: claim {result.claim.id} cites no {visible(citation)} (it cites {labels})")
    return chosen


def _accept(args: argparse.Namespace, parser: argparse.ArgumentParser) -> int:
    from sourcecheck.api import check

    apply_settings(args, args.draft, parser)
    report = check(args.draft, args.sources, **check_options(args))
    result = next((r for r in report.claims if r.claim.id == args.claim), None)
    if result is None:
        ids = f"c1 to c{len(report.claims)}" if report.claims else "none"
        raise SettingsError(f"{args.draft}: no claim {visible(args.claim)} (the claims are {ids})")
    path = review_path(args.draft)
    entries = load_reviews(path)
    today = datetime.date.today().isoformat()
    for item in _chosen(result, args.citation, args.draft):
        key = fingerprint(result.claim, item)
        label = item.citation.label
        entries[key] = Acceptance(key, result.claim.id, label, result.claim.text, args.note, today)
        print(f"accepted {result.claim.id} {visible(label)} ({item.band.value} {item.score:.2f}): {visible(args.note)}")
    save_reviews(path, entries)
    print(f"in {path}")
    return 0


def _list(args: argparse.Namespace) -> int:
    path = review_path(args.draft)
    entries = load_reviews(path)
    if not entries:
        print(f"no accepted checks ({path} holds none)")
        return 0
    for key, entry in sorted(entries.items(), key=lambda item: (item[1].claim, item[1].citation, item[0])):
        print(
            f"{visible(entry.claim)} {visible(entry.citation)}  {key[:12]}  {visible(entry.accepted_on)}  "
            f"{visible(trim(entry.text, 12))}  note: {visible(entry.note)}"
        )
    return 0


def _forget(args: argparse.Namespace) -> int:
    path = review_path(args.draft)
    entries = load_reviews(path)
    target = args.claim.casefold()
    gone = [
        key
        for key, entry in entries.items()
        if (entry.claim.casefold() == target and (args.citation is None or _same_label(entry.citation, args.citation)))
        or (len(target) >= 6 and key.startswith(target))
    ]
    if not gone:
        raise SettingsError(f"{path}: no accepted check for {visible(args.claim)}")
    for key in gone:
        print(f"forgot {visible(entries[key].claim)} {visible(entries[key].citation)} ({key[:12]})")
        del entries[key]
    save_reviews(path, entries)
    return 0


def run_review(args: argparse.Namespace, parser: argparse.ArgumentParser) -> int:
    """Run ``review ACTION``; the exit code is 0, or a SettingsError becomes exit 2 in the CLI."""
    if args.action == "accept":
        return _accept(args, parser)
    if args.action == "list":
        return _list(args)
    return _forget(args)
