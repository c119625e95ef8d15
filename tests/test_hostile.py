"""Hostile manuscripts and files end to end: one named line each, no traceback, the rest still checked.

Every file comes from the generator in tests/hostile.py (nothing hostile is committed).
The runs go through the command line in-process; the embedding model is the real one,
loaded once for the session (tests/conftest.py) instead of once per run.
"""

from __future__ import annotations

import json
import shutil
from pathlib import Path

import pytest

from sourcecheck.cli import EXIT_OK, main
from sourcecheck.text.display import BIDI_CONTROLS
from tests import hostile

ROOT = Path(__file__).resolve().parent.parent
EVIL_NAME = "evil\x1b]0;owned\x07\nname.pdf"


@pytest.fixture(scope="module")
def folder(tmp_path_factory: pytest.TempPathFactory) -> Path:
    """The demo's sources beside hostile ones, and hostile drafts beside the demo draft."""
    base = tmp_path_factory.mktemp("hostile")
    sources = base / "sources"
    shutil.copytree(ROOT / "sample_sources", sources)
    (sources / EVIL_NAME).write_bytes(b"not a PDF at all\n")
    outside = base / "outside"
    outside.mkdir()
    hostile.many_pages_pdf(outside / "private.pdf", 1)
    (sources / "linked.pdf").symlink_to(outside / "private.pdf")
    (outside / "secret.bib").write_text("@article{k, title = {Private title}, year = {2019}}\n", encoding="utf-8")
    drafts = base / "drafts"
    drafts.mkdir()
    shutil.copy(ROOT / "sample_manuscript" / "draft.md", drafts / "good.md")
    (drafts / "long.md").write_text(hostile.long_paragraph(5000, cite_every=400), encoding="utf-8")
    (drafts / "token.md").write_text(hostile.single_token(10_000_000), encoding="utf-8")
    (drafts / "cites.md").write_text(hostile.many_citations(5000), encoding="utf-8")
    (drafts / "escapes.md").write_text(
        f"Heron nests {''.join(hostile.ESCAPES)} rose by 18% [1].\n\n## References\n\n1. Okafor A. Herons. 2019.\n",
        encoding="utf-8",
    )
    (drafts / "frontmatter.md").write_text("---\nbibliography: ../outside/secret.bib\n---\n\nNests rose [@k].\n")
    (drafts / "outside.tex").write_text(
        "\\bibliography{../outside/secret}\n\\begin{document}\nNests rose \\cite{k}.\n\\end{document}\n"
    )
    (drafts / "deep.tex").write_text(hostile.deep_latex(50_000), encoding="utf-8")
    (drafts / "deep.json").write_text(hostile.deep_json(200_000), encoding="utf-8")
    (drafts / "keys.md").write_text("Nests rose [@k].\n", encoding="utf-8")
    (drafts / "bomb.docx").write_bytes(hostile.zip_bomb_docx(80 << 20))
    (drafts / "entity.docx").write_bytes(hostile.entity_docx())
    (drafts / "lying.docx").write_bytes(hostile.lying_size_docx())
    return base


@pytest.fixture(autouse=True)
def shared_model(encoder, monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setattr("sourcecheck.pipeline.Encoder", lambda path, *args, **kwargs: encoder)


def _run(capsys: pytest.CaptureFixture[str], folder: Path, draft: str, *extra: str) -> tuple[int, dict, list[str]]:
    cache = folder / "cache"
    args = ["check", str(folder / "drafts" / draft), "--sources", str(folder / "sources"), "--cache", str(cache)]
    code = main([*args, "--format", "json", "--quiet", *extra])
    out, err = capsys.readouterr()
    lines = err.splitlines()
    assert "Traceback" not in err and "internal error" not in err
    assert all(line.startswith("sourcecheck: ") for line in lines), lines
    assert not [c for c in err if (ord(c) < 32 and c != "\n") or 0x7F <= ord(c) < 0xA0 or c in BIDI_CONTROLS]
    return code, json.loads(out) if out else {}, lines


def test_good_files_beside_hostile_ones_are_still_checked(folder: Path, capsys) -> None:
    code, report, lines = _run(capsys, folder, "good.md")
    assert code == EXIT_OK
    assert report["summary"]["anchored"] >= 5
    named = {p["file"]: p["message"] for p in report["problems"]}
    assert named[str(folder / "sources" / EVIL_NAME)] == "not a PDF (no %PDF- header)"  # JSON keeps the exact name
    assert "outside the sources folder" in named[str(folder / "sources" / "linked.pdf")]
    assert any("evil\\x1b]0;owned\\x07\\x0aname.pdf: not a PDF" in line for line in lines)


@pytest.mark.parametrize(
    ("draft", "extra", "said"),
    [
        ("long.md", (), "(paragraph_chars)"),
        ("token.md", (), "(draft_chars)"),
        ("cites.md", (), "(sentence_citations)"),
        ("escapes.md", (), None),
        ("frontmatter.md", (), "outside the draft's folder"),
        ("outside.tex", (), "outside the draft's folder"),
        ("deep.tex", (), "(nesting_depth)"),
        ("keys.md", ("--bib", "DRAFTS/deep.json"), "(nesting_depth)"),
        ("bomb.docx", (), "(zip_member_bytes)"),
        ("entity.docx", (), "declares a DTD or entity"),
        ("lying.docx", (), "Bad CRC-32"),
    ],
)
def test_each_hostile_draft_gives_a_named_line_and_exit_0(
    folder: Path, capsys, draft: str, extra: tuple[str, ...], said: str | None
) -> None:
    extra = tuple(e.replace("DRAFTS", str(folder / "drafts")) for e in extra)
    code, report, lines = _run(capsys, folder, draft, *extra)
    assert code == EXIT_OK
    if said is not None:
        assert any(said in line for line in lines), lines
    assert "Private title" not in json.dumps(report)  # nothing read from outside the draft's folder


def test_a_cache_that_cannot_be_written_does_not_stop_the_check(folder: Path, tmp_path: Path, capsys) -> None:
    blocker = tmp_path / "cache-is-a-file"
    blocker.write_text("", encoding="utf-8")
    args = ["check", str(folder / "drafts" / "good.md"), "--sources", str(folder / "sources" / "soil")]
    code = main([*args, "--cache", str(blocker), "--format", "json", "--quiet"])
    out, err = capsys.readouterr()
    assert code == EXIT_OK and json.loads(out)["summary"]["anchored"] >= 1
    assert sum("cache folder cannot be written" in line for line in err.splitlines()) == 1


def test_follow_links_reads_the_linked_pdf(folder: Path, capsys) -> None:
    code, report, _ = _run(capsys, folder, "good.md", "--follow-links")
    assert code == EXIT_OK
    assert not any("linked.pdf" in p["file"] for p in report["problems"])
    assert str(folder / "sources" / "linked.pdf") in report["unused_sources"]
