"""Every reference of eight hand-written styles finds its own real PDF, and no other.

The lists (tests/fixtures/real_references, README there; each style's guide named in
tests/real_references.py) cite the 27 real papers of ../shared/data/papers. Each becomes a
draft in Markdown, Word (python-docx) and a PDF manuscript (fpdf2), read by the real draft
readers and matched against the real PDFs, read once per session.
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

import pytest

from sourcecheck.drafts import read_draft
from sourcecheck.drafts.markdown import read_markdown
from sourcecheck.model import Source
from sourcecheck.sources import match_sources
from tests.real_references import STYLES, Style, entries, markdown_draft, papers, pdf_draft, word_draft


def _markdown(style: Style, path: Path) -> Path:
    path.write_text(markdown_draft(style), encoding="utf-8")
    return path


FORMATS: dict[str, Callable[[Style, Path], Path]] = {"md": _markdown, "docx": word_draft, "pdf": pdf_draft}


@pytest.mark.parametrize("fmt", sorted(FORMATS))
@pytest.mark.parametrize("style", STYLES, ids=[s.name for s in STYLES])
def test_every_reference_matches_its_own_pdf(
    real_sources: dict[str, Source], tmp_path: Path, style: Style, fmt: str
) -> None:
    draft_path = FORMATS[fmt](style, tmp_path / f"draft.{fmt}")
    draft = read_draft(draft_path, display=draft_path.name)
    wanted = [p.file for p in papers()]
    assert len(draft.references) == len(wanted) == 27
    outcome = match_sources(draft.references, list(real_sources.values()), draft=draft.path)
    got = [outcome.matches[r.key].source if r.key in outcome.matches else None for r in draft.references]
    assert got == wanted
    assert outcome.unmatched == {} and outcome.problems == []
    assert all(0.5 <= m.confidence <= 1.0 and m.detail for m in outcome.matches.values())


def test_a_missing_pdf_leaves_its_reference_unmatched_not_misplaced(real_sources: dict[str, Source]) -> None:
    style = next(s for s in STYLES if s.name == "title_only")
    references = read_markdown(markdown_draft(style), "draft.md").references
    gone = "naacl_2018_elmo_contextualized_embeddings.pdf"
    sources = [s for name, s in real_sources.items() if name != gone]
    outcome = match_sources(references, sources, draft="draft.md")
    files = [p.file for p in papers()]
    missing = references[files.index(gone)].key
    assert missing not in outcome.matches
    assert all(outcome.matches[r.key].source == f for r, f in zip(references, files, strict=True) if f != gone)
    assert list(outcome.unmatched) == [missing]
    assert outcome.unmatched[missing].message.startswith(f"reference '{missing}' matched no source file")


def _drop_subtitle(entry: str, title: str) -> str:
    head, _, tail = title.partition(": ")
    return entry.replace(f"{head}: {tail}", head) if tail else entry


def _typo(entry: str, title: str) -> str:
    return entry.replace(title[:30], title[:9] + title[10:30])  # one letter of the title lost


@pytest.mark.parametrize(
    "damage",
    [
        _drop_subtitle,
        _typo,
        lambda entry, _: entry.upper(),
        lambda entry, _: entry.split(". ", 1)[1],  # the author list cut off
    ],
    ids=["subtitle-dropped", "typo", "upper-case", "no-authors"],
)
def test_damaged_entries_still_find_their_pdf(
    real_sources: dict[str, Source], damage: Callable[[str, str], str]
) -> None:
    # Vancouver entries (no DOI) with one kind of damage a hand-typed list shows.
    vancouver = next(s for s in STYLES if s.name == "vancouver")
    titles = entries(next(s for s in STYLES if s.name == "title_only"))
    damaged = [damage(entry, title) for entry, title in zip(entries(vancouver), titles, strict=True)]
    changed = sum(d != e for d, e in zip(damaged, entries(vancouver), strict=True))
    assert changed >= (6 if damage is _drop_subtitle else 20)  # the damage did reach the entries
    text = "# R\n\nText [1].\n\n## References\n\n" + "\n".join(f"{i}. {e}" for i, e in enumerate(damaged, 1))
    references = read_markdown(text + "\n", "draft.md").references
    outcome = match_sources(references, list(real_sources.values()))
    got = [outcome.matches[r.key].source if r.key in outcome.matches else None for r in references]
    assert got == [p.file for p in papers()]
