"""Measure the judge on hand-written claims about real full-text papers.

Usage:
    python bench/real_papers.py [--claims tests/fixtures/real_papers/claims.jsonl]
                                [--papers ../shared/data/papers] [--out bench/out/real_papers]
                                [--cache bench/out/real_papers/cache] [--split all|fit|holdout] [--show]

The claims (tests/fixtures/real_papers/README.md) were written by reading the papers; each
says which paper it cites, what kind of claim it is (faithful, changed number, reversed
direction, ...), the band and reason the README's band table calls for, and the gold page.
The script writes a Markdown draft with one paragraph per claim and a numbered marker
``[n]``, a Vancouver-like reference list built from the papers folder's README table, and a
``key,file`` mapping so that reference matching cannot be what fails here; it runs
``sourcecheck.pipeline.run`` on the draft and the papers folder exactly as ``sourcecheck
check`` does and prints:

- page hit@1: the first evidence shown is on the gold page (and within one page of it),
  over the claims whose gold passage is in the cited paper (not ``absent``, not
  ``wrong-paper``);
- planted errors flagged with the expected reason (every kind but faithful and quote-exact);
- faithful claims (and exact quotations) flagged, i.e. not ``anchored``;
- the confusion table of expected against given band, and figures per kind.

``--split`` keeps the claims of one half of the papers (the fixture's ``split`` field,
fixed per paper); anything tuned on this set is fitted on "fit" and reported on "holdout".
``--show`` lists each miss (wrong band, missing reason, or evidence on another page) with
the claim, what was expected and what came back. Nothing is fitted here: the set measures.
"""

from __future__ import annotations

import argparse
import csv
import json
import re
import sys
import time
from collections import Counter
from dataclasses import dataclass
from pathlib import Path

from sourcecheck.model import Report

ROOT = Path(__file__).resolve().parent.parent
DEFAULT_CLAIMS = ROOT / "tests" / "fixtures" / "real_papers" / "claims.jsonl"
DEFAULT_PAPERS = ROOT.parent / "shared" / "data" / "papers"
DEFAULT_OUT = ROOT / "bench" / "out" / "real_papers"

BANDS = ("anchored", "loose", "conflict", "adrift", "unverifiable")
#: Kinds whose claim the cited paper backs; the rest are planted errors.
BACKED_KINDS = ("faithful", "quote-exact")
#: Kinds whose gold passage is not in the cited paper, so the page cannot be scored.
NO_PAGE_KINDS = ("absent", "wrong-paper")
#: Reason codes that also name a planted error of a kind, beside the fixture's own. A
#: reversed claim ("increased" for "decreased", "differed" for "did not differ") is one the
#: source states the opposite of, which is what ``contradicted`` (the verifier's reading)
#: says; the word-level cue that names the flipped word is the fixture's reason.
ALSO_RIGHT = {"direction": frozenset({"contradicted"})}

_REFERENCE_SHAPE = re.compile(
    r"^(?P<head>.+?\.) (?P<journal>[^.]+?) (?P<volume>\d+(?:\(\d+\))?):(?P<pages>[^\s]+) "
    r"\((?:published online )?(?P<year>\d{4})[^)]*\)\. (?P<rest>.*)$"
)


@dataclass(frozen=True)
class Outcome:
    """What sourcecheck reported for one fixture claim."""

    band: str
    reasons: tuple[tuple[str, str], ...]
    page: int | None
    evidence: str
    section: str = ""


class BadClaims(ValueError):
    """The claims file has a line that is not a JSON object; the message names file and line."""


def read_claims(path: Path) -> list[dict]:
    """The fixture's rows, one JSON object per line."""
    rows = []
    for number, line in enumerate(path.read_text(encoding="utf-8").splitlines(), 1):
        if not line.strip():
            continue
        try:
            row = json.loads(line)
        except json.JSONDecodeError as exc:
            raise BadClaims(f"{path}: line {number} is not JSON ({exc.msg})") from None
        if not isinstance(row, dict) or not {"file", "claim", "kind", "band", "page"} <= row.keys():
            raise BadClaims(f"{path}: line {number} lacks file, claim, kind, band or page")
        rows.append(row)
    return rows


def read_paper_table(readme: Path) -> dict[str, str]:
    """File name -> reference text, from the "Files" table of the papers folder's README."""
    references: dict[str, str] = {}
    header: list[str] | None = None
    for line in readme.read_text(encoding="utf-8").splitlines():
        if not line.startswith("|"):
            header = None if not line.strip() else header
            continue
        cells = [c.strip() for c in line.strip().strip("|").split("|")]
        if header is None:
            header = [c.lower() for c in cells]
            continue
        if set("".join(cells)) <= set("-: ") or "file" not in header or "reference" not in header:
            continue
        references[cells[header.index("file")]] = cells[header.index("reference")]
    return references


def vancouver(reference: str) -> str:
    """The README's "Authors. Title. Journal 12:34–56 (2014). doi:..." as Vancouver order.

    Vancouver (NLM Citing Medicine) puts the year before volume and pages:
    "Authors. Title. Journal. 2014;12:34–56. doi:...". Entries of another shape
    (proceedings, preprints) are kept as written.
    """
    match = _REFERENCE_SHAPE.match(reference)
    if not match:
        return reference
    parts = match.groupdict()
    return f"{parts['head']} {parts['journal']}. {parts['year']};{parts['volume']}:{parts['pages']}. {parts['rest']}"


def build_draft(rows: list[dict], references: dict[str, str], out: Path) -> tuple[Path, Path, dict[str, int]]:
    """Write draft.md and mapping.csv under ``out``; return them and each file's number.

    Papers are numbered by first citation (Vancouver order); papers of the folder that no
    claim cites follow, so the reference list holds one entry per paper.
    """
    numbers: dict[str, int] = {}
    for name in [r["file"] for r in rows] + sorted(references):
        numbers.setdefault(name, len(numbers) + 1)
    lines = ["# Claims about real papers (sourcecheck bench draft)", ""]
    for row in rows:
        lines += [f"{row['claim'].rstrip('.')} [{numbers[row['file']]}].", ""]
    lines += ["## References", ""]
    for name, number in numbers.items():
        lines.append(f"{number}. {vancouver(references.get(name, name))}")
    out.mkdir(parents=True, exist_ok=True)
    draft, mapping = out / "draft.md", out / "mapping.csv"
    draft.write_text("\n".join(lines) + "\n", encoding="utf-8")
    with mapping.open("w", encoding="utf-8", newline="") as handle:
        writer = csv.writer(handle)
        writer.writerow(["key", "file"])
        writer.writerows([str(n), name] for name, n in numbers.items())
    return draft, mapping, numbers


def outcomes(report: Report, rows: list[dict], numbers: dict[str, int]) -> list[Outcome | None]:
    """Each row's check, found by the draft line of its paragraph (row i is on line 3 + 2i)."""
    by_line = {result.claim.line: result for result in report.claims}
    found: list[Outcome | None] = []
    for index, row in enumerate(rows):
        result = by_line.get(3 + 2 * index)
        key = str(numbers[row["file"]])
        check = next((c for c in result.checks if c.citation.key == key), None) if result else None
        if check is None:
            found.append(None)
            continue
        first = check.evidence[0] if check.evidence else None
        found.append(
            Outcome(
                band=check.band.value,
                reasons=tuple((r.code, r.message) for r in check.reasons),
                page=first.page if first else None,
                evidence=first.text if first else "",
                section=first.section if first else "",
            )
        )
    return found


def _pct(part: int, whole: int) -> str:
    return f"{part}/{whole} ({100 * part / whole:.0f}%)" if whole else "0/0"


def _tally(counts: Counter) -> str:
    return ", ".join(f"{key} {n}" for key, n in counts.most_common()) or "none"


def page_hit(row: dict, got: Outcome | None, slack: int = 0) -> bool | None:
    """Whether the first evidence is on a gold page (within ``slack``); None when not scored.

    The gold page is ``page``; ``also`` lists other pages that state the same thing (a
    table row, the abstract), checked by hand like the first.
    """
    if row["kind"] in NO_PAGE_KINDS or row["page"] is None:
        return None
    gold = [row["page"]] + [other["page"] for other in row.get("also", [])]
    return got is not None and got.page is not None and any(abs(got.page - page) <= slack for page in gold)


def right_reason(row: dict, got: Outcome | None) -> bool:
    """A planted error is caught: not anchored, and the expected reason code (or one of
    ALSO_RIGHT for its kind) is among the reasons."""
    if got is None or got.band == "anchored":
        return False
    given = {code for code, _ in got.reasons}
    return row["reason"] is None or row["reason"] in given or bool(given & ALSO_RIGHT.get(row["kind"], frozenset()))


def is_miss(row: dict, got: Outcome | None) -> bool:
    """Wrong band, a planted error without its reason, or evidence off the gold page."""
    if got is None or got.band != row["band"] or page_hit(row, got) is False:
        return True
    return row["kind"] not in BACKED_KINDS and not right_reason(row, got)


def summary(rows: list[dict], got: list[Outcome | None]) -> list[str]:
    """The printed figures, one line each."""
    pairs = list(zip(rows, got, strict=True))
    scored = [(r, g) for r, g in pairs if page_hit(r, g) is not None]
    planted = [(r, g) for r, g in pairs if r["kind"] not in BACKED_KINDS]
    flagged = sum(g is not None and g.band != "anchored" for _, g in planted)
    caught = sum(right_reason(r, g) for r, g in planted)
    figures = [
        ("page hit@1 (first evidence on the gold page)", sum(page_hit(r, g) for r, g in scored), len(scored)),
        ("page hit@1 within one page", sum(page_hit(r, g, 1) for r, g in scored), len(scored)),
        ("planted errors flagged (not anchored)", flagged, len(planted)),
        ("planted errors flagged with the right reason", caught, len(planted)),
    ]
    for kind in BACKED_KINDS:
        backed = [g for r, g in pairs if r["kind"] == kind]
        false_alarms = sum(g is None or g.band != "anchored" for g in backed)
        figures.append((f"{kind} claims flagged (not anchored)", false_alarms, len(backed)))
    lines = [f"{label:<46}{_pct(part, whole)}" for label, part, whole in figures]
    lines += ["", "confusion, expected band (rows) x given band (columns):"]
    lines.append(" " * 12 + "".join(f"{b:>13}" for b in BANDS) + f"{'none':>7}")
    for expected in BANDS[:4]:
        counts = Counter(g.band if g else "none" for r, g in pairs if r["band"] == expected)
        lines.append(f"{expected:<12}" + "".join(f"{counts[b]:>13}" for b in BANDS) + f"{counts['none']:>7}")
    off_page = Counter(g.section or "unknown" for r, g in scored if g is not None and not page_hit(r, g))
    lines.append("")
    lines.append("sections of first evidence off the gold page: " + _tally(off_page))
    alarms = Counter(code for r, g in pairs if r["kind"] in BACKED_KINDS and g for code, _ in g.reasons)
    lines.append("reasons given on faithful claims and exact quotations: " + _tally(alarms))
    lines += ["", "per kind:     n  flagged  band ok  reason ok  page@1  page±1"]
    for kind in dict.fromkeys(r["kind"] for r in rows):
        group = [(r, g) for r, g in pairs if r["kind"] == kind]
        raised = sum(g is None or g.band != "anchored" for _, g in group)
        band_ok = sum(g is not None and g.band == r["band"] for r, g in group)
        reason_ok = "-" if kind in BACKED_KINDS else str(sum(right_reason(r, g) for r, g in group))
        pages = [(page_hit(r, g), page_hit(r, g, 1)) for r, g in group if page_hit(r, g) is not None]
        hit1 = str(sum(p for p, _ in pages)) if pages else "-"
        near = str(sum(n for _, n in pages)) if pages else "-"
        lines.append(f"{kind:<13}{len(group):>3}{raised:>9}{band_ok:>9}{reason_ok:>11}{hit1:>8}{near:>8}")
    return lines


def misses(rows: list[dict], got: list[Outcome | None]) -> list[str]:
    """One block per miss for ``--show``."""
    lines = []
    for row, outcome in zip(rows, got, strict=True):
        if not is_miss(row, outcome):
            continue
        expected = f"{row['band']} {row['reason'] or ''} p{row['page']}".strip()
        lines.append(f"{row['id']} [{row['kind']}] {row['file']}")
        lines.append(f"  claim:    {row['claim']}")
        lines.append(f"  expected: {expected}" + (f" (true source {row['true_file']})" if row.get("true_file") else ""))
        if outcome is None:
            lines.append("  got:      no check for this citation")
        else:
            where = f"p{outcome.page}" + (f" ({outcome.section})" if outcome.section else "")
            lines.append(f"  got:      {outcome.band}, evidence {where}: {outcome.evidence[:160]!r}")
            lines += [f"            {code}: {message}" for code, message in outcome.reasons]
    return lines


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--claims", type=Path, default=DEFAULT_CLAIMS)
    parser.add_argument("--papers", type=Path, default=DEFAULT_PAPERS)
    parser.add_argument("--out", type=Path, default=DEFAULT_OUT)
    parser.add_argument("--cache", type=Path, default=None, help="default: OUT/cache")
    parser.add_argument("--split", choices=("all", "fit", "holdout"), default="all")
    parser.add_argument("--show", action="store_true", help="list each miss")
    args = parser.parse_args(argv)
    readme = args.papers / "README.md"
    for path, what in ((args.claims, "claims file"), (readme, "papers README")):
        if not path.is_file():
            print(f"{path}: {what} not found", file=sys.stderr)
            return 2
    from sourcecheck.pipeline import run  # imported late: loading torch is slow

    try:
        rows = [r for r in read_claims(args.claims) if args.split in ("all", r.get("split"))]
    except BadClaims as exc:
        print(exc, file=sys.stderr)
        return 2
    draft, mapping, numbers = build_draft(rows, read_paper_table(readme), args.out)
    started = time.perf_counter()
    report = run(draft, args.papers, mapping=mapping, cache_dir=args.cache or args.out / "cache")
    got = outcomes(report, rows, numbers)
    elapsed = time.perf_counter() - started
    with (args.out / "results.jsonl").open("w", encoding="utf-8") as handle:
        for row, outcome in zip(rows, got, strict=True):
            given = outcome.__dict__ if outcome else None
            handle.write(json.dumps({"id": row["id"], "expected": row, "got": given}, ensure_ascii=False) + "\n")
    papers = len({r["file"] for r in rows})
    print(f"sourcecheck on real papers: {len(rows)} claims, {papers} papers, split {args.split}")
    print(f"draft {draft}, sources {args.papers}")
    print("\n".join(summary(rows, got)))
    if args.show:
        print("\nmisses:\n" + "\n".join(misses(rows, got)))
    print(f"({elapsed:.0f} s for the pipeline)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
