"""Match rate of references to their real PDFs, per reference style and draft format.

The drafts cite the 27 real papers of ``../shared/data/papers`` in eight hand-written
styles (tests/fixtures/real_references) and are built as Markdown, Word and PDF
manuscripts (tests/real_references.py). Each is read by the draft reader and matched
against the PDFs. "right" counts the papers whose PDF went to an entry that holds the
paper's title; "wrong" counts entries given a PDF whose title they do not hold; "titles"
counts the entries whose parsed title is a paper's title (``fuzz.ratio`` >= 90 on letters and
digits), the entry parser's own share of the work.

"before" runs the whole package of an earlier commit (``--before REV``; by default the
commit this branch forked from main) in a child process: its reader, entry parser and
matcher, unpacked from git into a temporary folder. Nothing here is fitted:
the set is the only real set there is, so these are figures on the development set.

Usage::

    python bench/matching.py [--papers ../shared/data/papers] [--before REV] [--markdown FILE]
"""

from __future__ import annotations

import argparse
import json
import subprocess
import sys
import tempfile
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(REPO))

from tests.real_references import STYLES  # noqa: E402  (the repository root is on the path now)


def _git(*args: str) -> str:
    return subprocess.run(["git", *args], cwd=REPO, check=True, capture_output=True, text=True).stdout.strip()


def _checkout(ref: str, folder: Path) -> Path:
    """The ``sourcecheck`` package as of ``ref``, unpacked under ``folder`` (git archive)."""
    archive = subprocess.run(["git", "archive", ref, "sourcecheck"], cwd=REPO, check=True, capture_output=True)
    subprocess.run(["tar", "-x", "-C", str(folder)], input=archive.stdout, check=True)
    return folder


def _cites(entry: str, title: str) -> bool:
    """Whether an entry's text holds the paper's title (the ground truth of a match).

    Judged on letters and digits only, so wrapped, merged or mis-split entries are still
    judged by what they say, not by their position in the list.
    """
    from rapidfuzz import fuzz

    return fuzz.partial_ratio(_letters(title), _letters(entry)) >= 95


def _letters(text: str) -> str:
    return "".join(ch for ch in text.lower() if ch.isalnum())


def _title_read(parsed: str | None, titles: list[str]) -> bool:
    """Whether a parsed title is one of the papers' titles (letters and digits, ratio >= 90)."""
    from rapidfuzz import fuzz

    return parsed is not None and any(fuzz.ratio(_letters(parsed), _letters(t)) >= 90 for t in titles)


def measure(papers_dir: Path) -> dict[str, dict[str, tuple[int, int, int, int]]]:
    """style -> format -> (papers reached by a right entry, entries given a wrong PDF, papers, titles read)."""
    from sourcecheck.drafts import read_draft
    from sourcecheck.model import Source
    from sourcecheck.sources import match_references, read_source
    from tests.real_references import STYLES, entries, markdown_draft, papers, pdf_draft, word_draft

    wanted = [p.file for p in papers()]
    titles = dict(zip(wanted, entries(next(s for s in STYLES if s.name == "title_only")), strict=True))
    sources = [read_source(papers_dir / f, f) for f in wanted]
    readable = [s for s in sources if isinstance(s, Source)]
    out: dict[str, dict[str, tuple[int, int, int, int]]] = {}
    with tempfile.TemporaryDirectory() as tmp:
        for style in STYLES:
            drafts = {
                "md": Path(tmp, f"{style.name}.md"),
                "docx": word_draft(style, Path(tmp, f"{style.name}.docx")),
                "pdf": pdf_draft(style, Path(tmp, f"{style.name}.pdf")),
            }
            drafts["md"].write_text(markdown_draft(style), encoding="utf-8")
            out[style.name] = {}
            for fmt, path in drafts.items():
                references = read_draft(path, display=path.name).references
                matches, _ = match_references(references, readable)
                right: set[str] = set()
                wrong = 0
                for ref in references:
                    if ref.key in matches:
                        file = matches[ref.key].source
                        if _cites(ref.text, titles[file]):
                            right.add(file)
                        else:
                            wrong += 1
                read = sum(_title_read(ref.title, list(titles.values())) for ref in references)
                out[style.name][fmt] = (len(right), wrong, len(wanted), read)
    return out


def _table(before: dict, after: dict) -> str:
    held_out = {s.name for s in STYLES if s.held_out}
    lines = [
        "| style | format | before: right / wrong / titles | after: right / wrong / titles |",
        "| --- | --- | --- | --- |",
    ]
    totals = {(part, when): [0, 0, 0, 0] for part in ("development", "held out") for when in ("before", "after")}
    for style, formats in after.items():
        part = "held out" if style in held_out else "development"
        for fmt, now in formats.items():
            then = before[style][fmt]
            for when, value in (("before", then), ("after", now)):
                totals[part, when] = [a + b for a, b in zip(totals[part, when], value, strict=True)]
            name = f"{style} (held out)" if part == "held out" else style
            cells = [f"{v[0]}/{v[2]} / {v[1]} / {v[3]}" for v in (then, now)]
            lines.append(f"| {name} | {fmt} | {cells[0]} | {cells[1]} |")
    for part in ("development", "held out"):
        cells = []
        for when in ("before", "after"):
            right, wrong, all_, read = totals[part, when]
            cells.append(f"{right}/{all_} ({right / max(all_, 1):.1%}) / {wrong} / {read} ({read / max(all_, 1):.1%})")
        lines.append(f"| all {part} styles | all | {cells[0]} | {cells[1]} |")
    return "\n".join(lines)


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--papers", type=Path, default=REPO.parent / "shared" / "data" / "papers")
    parser.add_argument("--before", help="the git revision whose matcher and parser are 'before' (default: fork point)")
    parser.add_argument("--markdown", type=Path, help="also write the table to this file")
    parser.add_argument("--child", help=argparse.SUPPRESS)  # internal: measure as of this revision, print JSON
    args = parser.parse_args()
    if not args.papers.is_dir():
        print(f"{args.papers}: no such folder (the real papers live in ../shared/data/papers)", file=sys.stderr)
        return 2
    if args.child:  # run with the earlier package first on sys.path
        sys.path.insert(0, args.child)
        print(json.dumps(measure(args.papers)))
        return 0
    before_rev = args.before or _git("merge-base", "HEAD", "main")
    with tempfile.TemporaryDirectory(prefix="sourcecheck-before-") as old:
        child = [
            sys.executable,
            __file__,
            "--papers",
            str(args.papers),
            "--child",
            str(_checkout(before_rev, Path(old))),
        ]
        before = json.loads(subprocess.run(child, check=True, capture_output=True, text=True).stdout)
    table = _table(before, measure(args.papers))
    print(f"before: {before_rev[:12]}, after: {_git('rev-parse', 'HEAD')[:12]} (plus uncommitted changes, if any)\n")
    print(table)
    if args.markdown:
        args.markdown.write_text(table + "\n", encoding="utf-8")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
