"""The command line for batches, gates and settings: several drafts, --fail-on, sourcecheck.toml."""

from __future__ import annotations

import json
import os
import shutil
from collections import Counter
from pathlib import Path
from typing import Any

import pytest

import sourcecheck
import sourcecheck.pipeline
from sourcecheck import RunStats
from sourcecheck.cli import EXIT_FINDINGS, EXIT_INPUT, EXIT_INTERNAL, EXIT_OK, FORMATS_IN, main
from sourcecheck.drafts import READERS
from tests import cli_run
from tests.cli_run import DRAFT, MANUSCRIPTS, SOURCES, run_cli

cache = cli_run.cache  # the module's warm cache (a fixture)
PDFS = sorted(SOURCES.rglob("*.pdf"))


def _three_manuscripts(folder: Path) -> Path:
    """Markdown, Word and LaTeX versions of the demo (with the LaTeX draft's .bib) in one folder."""
    folder.mkdir()
    for name in ("draft.md", "draft.docx", "draft.tex", "refs.bib"):
        shutil.copy(MANUSCRIPTS / name, folder / name)
    return folder


@pytest.mark.parametrize(
    ("gate", "expected"),
    [(None, EXIT_OK), ("conflict", EXIT_FINDINGS), ("adrift", EXIT_FINDINGS), ("loose", EXIT_FINDINGS)],
)
def test_fail_on_exits_1_when_a_check_reaches_the_gate(
    cache: Path, capsys: pytest.CaptureFixture[str], gate: str | None, expected: int
) -> None:
    gate_args = ["--fail-on", gate] if gate else []
    code, out, err = run_cli(
        capsys, "check", str(DRAFT), "--sources", str(SOURCES), "--cache", str(cache), "--format", "json", *gate_args
    )
    assert code == expected
    bands = Counter(k["band"] for c in json.loads(out)["claims"] for k in c["checks"])
    if gate:
        worse = {"loose": 4, "unverifiable": 3, "adrift": 2, "conflict": 1}
        count = sum(n for band, n in bands.items() if worse.get(band, 0) and worse[band] <= worse[gate])
        noun = "check" if count == 1 else "checks"
        assert f"{count} unreviewed {noun} at {gate} or worse" in err


def test_internal_error_is_exit_70_in_one_line(
    cache: Path, capsys: pytest.CaptureFixture[str], monkeypatch: pytest.MonkeyPatch
) -> None:
    def broken(*args: object, **kwargs: object) -> None:
        raise RuntimeError("something unforeseen")

    monkeypatch.setattr(sourcecheck.pipeline, "run_many", broken)
    monkeypatch.delenv("SOURCECHECK_DEBUG", raising=False)
    code, _, err = run_cli(capsys, "check", str(DRAFT), "--sources", str(SOURCES), "--cache", str(cache))
    assert code == EXIT_INTERNAL == os.EX_SOFTWARE  # EX_SOFTWARE of BSD sysexits.h, as Python's os module has it
    assert "internal error (RuntimeError: something unforeseen)" in err and len(err.strip().splitlines()) == 1


def test_a_folder_of_three_manuscripts_reads_and_embeds_each_source_once(
    tmp_path: Path, capsys: pytest.CaptureFixture[str], monkeypatch: pytest.MonkeyPatch
) -> None:
    folder = _three_manuscripts(tmp_path / "submissions")
    read: list[str] = []
    embedded: list[str] = []
    import sourcecheck.sources._parallel as reading
    from sourcecheck.index import Encoder

    real_read, real_encode = reading.read_source, Encoder.encode

    def counting_read(pdf: Path, *args: Any, **kwargs: Any) -> Any:
        read.append(pdf.name)
        return real_read(pdf, *args, **kwargs)

    def counting_encode(self: Encoder, texts: Any) -> Any:
        embedded.extend(texts)
        return real_encode(self, texts)

    monkeypatch.setattr(reading, "read_source", counting_read)
    monkeypatch.setattr(Encoder, "encode", counting_encode)
    out_dir = tmp_path / "reports"
    code, out, _ = run_cli(
        capsys, "check", str(folder), "--sources", str(SOURCES), "--cache", str(tmp_path / "cache"),
        "--format", "json", "--output-dir", str(out_dir), "--quiet", "--jobs", "1",
    )  # fmt: skip
    assert code == EXIT_OK
    assert sorted(read) == sorted(p.name for p in PDFS)  # a fresh cache: each PDF read exactly once
    # Each passage and claim embedded once for the three manuscripts, not once per manuscript.
    assert embedded and len(embedded) == len(set(embedded))
    assert sorted(p.name for p in out_dir.iterdir()) == ["draft.docx.json", "draft.md.json", "draft.tex.json"]
    reports = {p.name: json.loads(p.read_text(encoding="utf-8")) for p in out_dir.iterdir()}
    assert {c["location"]["unit"] for c in reports["draft.docx.json"]["claims"]} == {"paragraph"}
    assert {c["location"]["unit"] for c in reports["draft.md.json"]["claims"]} == {"line"}
    rows = [line.split() for line in out.splitlines()]
    assert rows[0][:8] == ["manuscript", "claims", "checks", "anchored", "loose", "unverifiable", "adrift", "conflict"]
    for name, report in reports.items():
        row = next(r for r in rows if r[0].endswith(name.removesuffix(".json")))
        assert row[4:8] == [str(report["summary"][b]) for b in ("loose", "unverifiable", "adrift", "conflict")]
    assert "3 manuscripts" in out
    assert [line for line in out.splitlines() if line != line.rstrip()] == []


def test_api_check_many_counts_one_reading_of_the_sources(tmp_path: Path) -> None:
    folder = _three_manuscripts(tmp_path / "submissions")
    drafts = [folder / "draft.md", folder / "draft.docx", folder / "draft.tex"]
    many, one = RunStats(), RunStats()
    reports = sourcecheck.check_many(drafts, SOURCES, cache=tmp_path / "a", stats=many)
    sourcecheck.check(DRAFT, SOURCES, cache=tmp_path / "b", stats=one)
    assert [r.draft for r in reports] == [str(d) for d in drafts]
    assert many.sources_read == one.sources_read == len(PDFS) and many.sources_from_cache == 0
    assert many.passages_embedded == one.passages_embedded > 0  # three drafts embed what one does


def test_several_drafts_print_each_report_then_the_table(cache: Path, capsys: pytest.CaptureFixture[str]) -> None:
    code, out, _ = run_cli(
        capsys, "check", str(DRAFT), str(MANUSCRIPTS / "draft.tex"), "--sources", str(SOURCES), "--cache", str(cache)
    )
    assert code == EXIT_OK
    assert out.count("sourcecheck advises") == 2 and "2 manuscripts, " in out


@pytest.mark.parametrize(
    ("extra", "needle"),
    [
        (["--format", "json"], "2 drafts in --format json need --output-dir DIR"),
        (["--output", "x.txt"], "--output takes one draft"),
    ],
)
def test_several_drafts_need_an_output_folder_for_files(
    cache: Path, capsys: pytest.CaptureFixture[str], extra: list[str], needle: str
) -> None:
    code, out, err = run_cli(
        capsys, "check", str(DRAFT), str(DRAFT.with_suffix(".tex")), "--sources", str(SOURCES), *extra
    )
    assert code == EXIT_INPUT and needle in err and out == ""


def test_settings_beside_the_draft_and_flags_winning(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    draft = tmp_path / "draft.md"
    shutil.copy(DRAFT, draft)
    (tmp_path / "sourcecheck.toml").write_text(
        f'sources = "{SOURCES.as_posix()}"\ncache = "{cache.as_posix()}"\nformat = "json"\n'
        'fail-on = "conflict"\nthreshold = 0.5\n',
        encoding="utf-8",
    )
    code, out, err = run_cli(capsys, "check", str(draft))
    assert code == EXIT_FINDINGS and json.loads(out)["schema"] == "sourcecheck.report/1"  # format, gate from file
    unknown = [line for line in err.splitlines() if "unknown key" in line]
    assert len(unknown) == 1 and "threshold" in unknown[0] and "sourcecheck.toml" in unknown[0]
    code, out, _ = run_cli(capsys, "check", str(draft), "--format", "text", "--sources", str(tmp_path / "nowhere"))
    assert code == EXIT_INPUT  # the flag's sources folder wins over the file's, and it does not exist
    code, out, _ = run_cli(capsys, "check", str(draft), "--format", "text")
    assert code == EXIT_FINDINGS and out.startswith("sourcecheck:")  # --format text wins over format = "json"


def test_pyproject_table_is_read_and_missing_sources_is_one_line(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    draft = tmp_path / "draft.md"
    shutil.copy(DRAFT, draft)
    code, _, err = run_cli(capsys, "check", str(draft))
    assert code == EXIT_INPUT and "no sources folder" in err
    (tmp_path / "pyproject.toml").write_text(
        f'[project]\nname = "paper"\n\n[tool.sourcecheck]\nsources = "{SOURCES.as_posix()}"\n'
        f'cache = "{cache.as_posix()}"\nfail-on = "adrift"\n',
        encoding="utf-8",
    )
    code, _, err = run_cli(capsys, "check", str(draft))
    assert code == EXIT_FINDINGS and "at adrift or worse (--fail-on adrift)" in err


def test_version_and_help_name_every_format(capsys: pytest.CaptureFixture[str]) -> None:
    with pytest.raises(SystemExit):
        main(["--version"])
    assert capsys.readouterr().out.strip() == f"sourcecheck {sourcecheck.__version__}"
    with pytest.raises(SystemExit):
        main(["check", "--help"])
    text = " ".join(capsys.readouterr().out.split())
    for name in ("Markdown", "plain text", "Pandoc", "LaTeX", "Word", "PDF", ".docx", ".tex"):
        assert name in text
    assert set(FORMATS_IN) == set(READERS)  # every reader is a --format-in choice
    for choice in FORMATS_IN:
        assert choice in text
