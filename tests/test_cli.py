"""The command line: exit codes, report formats, one-line errors and bad input end to end."""

from __future__ import annotations

import json
import shutil
from collections import Counter
from pathlib import Path

import pytest

from sourcecheck.cli import EXIT_INPUT, EXIT_OK, main
from sourcecheck.reports import CAUTION
from tests import cli_run
from tests.cli_run import run_cli
from tests.pdf_fixtures import encrypted_pdf, image_only_pdf, write_not_a_pdf, write_truncated_pdf
from tests.test_pipeline import planted_rows

ROOT = Path(__file__).resolve().parent.parent
DRAFT = ROOT / "sample_manuscript" / "draft.md"
BANDS = ("anchored", "loose", "conflict", "adrift", "unverifiable")
SOURCES = ROOT / "sample_sources"


cache = cli_run.cache  # a cache warmed once on the demo, so each CLI test below runs without the model
_run = run_cli


def test_json_report_to_stdout_follows_the_contract(cache: Path, capsys: pytest.CaptureFixture[str]) -> None:
    code, out, _ = _run(
        capsys, "check", str(DRAFT), "--sources", str(SOURCES), "--cache", str(cache), "--format", "json"
    )
    assert code == EXIT_OK
    data = json.loads(out)
    assert data["schema"] == "sourcecheck.report/1"
    assert {c["band"] for claim in data["claims"] for c in claim["checks"]} == {
        "anchored",
        "loose",
        "conflict",
        "adrift",
        "unverifiable",
    }


def test_output_file_holds_the_report_and_nothing_goes_to_stdout(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    target = tmp_path / "out" / "report.json"
    code, out, _ = _run(
        capsys,
        "check",
        str(DRAFT),
        "--sources",
        str(SOURCES),
        "--cache",
        str(cache),
        "--format",
        "json",
        "--output",
        str(target),
    )
    assert code == EXIT_OK and out == ""
    assert json.loads(target.read_text(encoding="utf-8"))["draft"] == str(DRAFT)
    assert [p.name for p in target.parent.iterdir()] == ["report.json"]  # no temporary file left


def test_text_output_file_holds_the_whole_text_report(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    target = tmp_path / "report.txt"
    code, out, _ = _run(
        capsys, "check", str(DRAFT), "--sources", str(SOURCES), "--cache", str(cache), "--output", str(target)
    )
    text = target.read_text(encoding="utf-8")
    flat = " ".join(text.split())
    assert code == EXIT_OK and out == ""
    assert f"{len(planted_rows())} checks:" in flat
    assert " ".join(CAUTION.split()) in flat
    assert "\x1b[" not in text  # a file for a person to read or mail: no terminal colour codes


def test_text_report_shows_summary_and_caution(cache: Path, capsys: pytest.CaptureFixture[str]) -> None:
    code, out, _ = _run(capsys, "check", str(DRAFT), "--sources", str(SOURCES), "--cache", str(cache))
    flat = " ".join(out.split())
    assert code == EXIT_OK
    rows = planted_rows()
    counts = Counter(r["band"] for r in rows)
    expected = f"{len(rows)} checks: " + ", ".join(f"{counts[b]} {b}" for b in BANDS)
    assert expected in flat  # the counts planted in sample_manuscript/PLANTED.md
    assert "does not prove error or misconduct" in flat


@pytest.mark.parametrize(
    ("args", "needle"),
    [
        (["check", "missing.md", "--sources", str(SOURCES)], "missing.md: no such file"),
        (["check", str(DRAFT), "--sources", "no-such-folder"], "no-such-folder: sources folder not found"),
        (["check", str(DRAFT), "--sources", str(SOURCES), "--model", "no-model-here"], "model folder not found"),
        (["check", str(DRAFT), "--sources", str(SOURCES), "--map", "nomap.csv"], "nomap.csv"),
        (["check", str(DRAFT), "--sources", str(SOURCES), "--bib", "norefs.bib"], "norefs.bib: bibliography file"),
    ],
)
def test_input_errors_exit_2_with_one_line(
    cache: Path, capsys: pytest.CaptureFixture[str], args: list[str], needle: str
) -> None:
    code, out, err = _run(capsys, *args, "--cache", str(cache))
    assert code == EXIT_INPUT
    assert out == ""
    assert needle in err and len(err.strip().splitlines()) == 1
    assert "Traceback" not in err


def test_usage_error_exits_2(capsys: pytest.CaptureFixture[str]) -> None:
    with pytest.raises(SystemExit) as exit_info:
        main(["check"])
    assert exit_info.value.code == 2  # argparse's usage-error code, as for every command-line tool


def test_bad_source_files_are_one_line_each_and_the_run_goes_on(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    folder = tmp_path / "sources"
    shutil.copytree(SOURCES, folder)
    write_not_a_pdf(folder / "notes.pdf")
    (folder / "empty.pdf").write_bytes(b"")
    write_truncated_pdf(folder / "cut.pdf", SOURCES / "moss-recovery-after-burning.pdf")
    encrypted_pdf(folder / "locked.pdf", ["Locked text about heath."])
    image_only_pdf(folder / "scan.pdf")
    code, out, err = _run(
        capsys, "check", str(DRAFT), "--sources", str(folder), "--cache", str(cache), "--format", "json"
    )
    assert code == EXIT_OK
    data = json.loads(out)
    problems = {Path(p["file"]).name: p["message"] for p in data["problems"]}
    assert problems["notes.pdf"].startswith("not a PDF")
    assert "empty" in problems["empty.pdf"]
    assert "truncated" in problems["cut.pdf"] or "corrupt" in problems["cut.pdf"]
    assert "encrypted" in problems["locked.pdf"]
    assert "no text layer" in problems["scan.pdf"]
    for name in problems:
        assert name in err  # also one line each on standard error
    assert "Traceback" not in err
    assert sum(len(c["checks"]) for c in data["claims"]) == len(planted_rows())  # every other check still made


def test_draft_in_windows_1252_is_read_with_a_problem(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    draft = tmp_path / "draft-cp1252.md"
    draft.write_bytes(DRAFT.read_text(encoding="utf-8").encode("cp1252", errors="replace"))
    code, out, err = _run(
        capsys, "check", str(draft), "--sources", str(SOURCES), "--cache", str(cache), "--format", "json"
    )
    data = json.loads(out)
    assert code == EXIT_OK
    assert any("not valid UTF-8" in p["message"] for p in data["problems"])
    assert "draft-cp1252.md: not valid UTF-8" in err
    assert len(data["claims"]) == len({r["snippet"] for r in planted_rows()})


@pytest.mark.parametrize(
    ("text", "needle"),
    [
        (
            '# Notes\n\nNothing is cited here.\n\n## References\n\n[1] A. Writer, "A title," 2020.\n',
            "no citation markers",
        ),
        ("# Notes\n\nHeron nests rose [1].\n", "no reference list"),
    ],
)
def test_draft_without_citations_or_references_is_reported(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str], text: str, needle: str
) -> None:
    draft = tmp_path / "draft.md"
    draft.write_text(text, encoding="utf-8")
    code, out, err = _run(
        capsys, "check", str(draft), "--sources", str(SOURCES), "--cache", str(cache), "--format", "json"
    )
    assert code == EXIT_OK
    assert needle in err and "Traceback" not in err
    assert any(needle in p["message"] for p in json.loads(out)["problems"])


def test_references_show_how_sure_each_match_is(cache: Path, capsys: pytest.CaptureFixture[str]) -> None:
    code, out, err = _run(
        capsys, "check", str(DRAFT), "--sources", str(SOURCES), "--cache", str(cache), "--format", "json"
    )
    refs = {r["key"]: r for r in json.loads(out)["references"]}
    assert code == EXIT_OK
    assert refs["1"]["matched_by"] == "doi" and refs["1"]["confidence"] > 0.99 and "DOI" in refs["1"]["match_detail"]
    # Reference 7 of the demo has no PDF: the closest file is named, with the reason, once.
    assert refs["7"]["source"] is None and refs["7"]["closest_source"].endswith(".pdf")
    assert refs["7"]["refused_because"] and err.count("reference '7' matched no source file") == 1


def test_sources_folder_without_a_readable_pdf_is_one_line(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    folder = tmp_path / "sources"
    folder.mkdir()
    write_not_a_pdf(folder / "notes.pdf")
    code, out, err = _run(
        capsys, "check", str(DRAFT), "--sources", str(folder), "--cache", str(cache), "--format", "json"
    )
    data = json.loads(out)
    assert code == EXIT_OK
    lines = [p for p in data["problems"] if "no readable PDF" in p["message"]]
    assert lines == [
        {"file": str(folder), "message": "the sources folder holds no readable PDF; no reference can match"}
    ]
    assert all(r["source"] is None and r["closest_source"] is None for r in data["references"])
    assert "Traceback" not in err


@pytest.mark.parametrize("jobs", ["0", "-2", "many"])
def test_jobs_must_be_a_positive_whole_number(capsys: pytest.CaptureFixture[str], jobs: str) -> None:
    with pytest.raises(SystemExit) as exit_info:
        main(["check", "draft.md", "--sources", "pdfs", "--jobs", jobs])
    assert exit_info.value.code == 2
    assert "--jobs" in capsys.readouterr().err


def test_backend_choices_are_the_index_backends_default_first() -> None:
    from sourcecheck.cli import BACKENDS
    from sourcecheck.index import BACKENDS as INDEX_BACKENDS
    from sourcecheck.index import DEFAULT_BACKEND

    assert BACKENDS == INDEX_BACKENDS and BACKENDS[0] == DEFAULT_BACKEND


def test_jobs_is_not_a_setting_of_a_shared_file(tmp_path: Path) -> None:
    # How many cores to use belongs to the machine, not to the project's settings file.
    from sourcecheck.cli import settings_parser
    from sourcecheck.workflow import load_settings

    file = tmp_path / "sourcecheck.toml"
    file.write_text('jobs = "2"\nbackend = "torch"\n', encoding="utf-8")
    settings = load_settings(file, settings_parser())
    assert settings.unknown == ("jobs",) and settings.values == {"backend": "torch"}
