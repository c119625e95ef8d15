"""Accepting checks end to end through the command line: accept, rerun, change the claim, rerun."""

from __future__ import annotations

import json
import tomllib
from pathlib import Path

import pytest

from sourcecheck.cli import EXIT_FINDINGS, EXIT_INPUT, EXIT_OK
from tests import cli_run
from tests.cli_run import DRAFT, SOURCES, run_cli

cache = cli_run.cache  # the module's warm cache (a fixture)


def _json(capsys: pytest.CaptureFixture[str], draft: Path, cache: Path, *more: str) -> tuple[int, dict, str]:
    code, out, err = run_cli(
        capsys, "check", str(draft), "--sources", str(SOURCES), "--cache", str(cache), "--format", "json", *more
    )
    return code, json.loads(out), err


def _conflicts(data: dict) -> list[tuple[str, str, dict]]:
    return [(c["id"], k["citation"], k) for c in data["claims"] for k in c["checks"] if k["band"] == "conflict"]


def test_accept_rerun_change_the_claim_rerun(cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    draft = tmp_path / "draft.md"
    draft.write_text(DRAFT.read_text(encoding="utf-8"), encoding="utf-8")
    code, data, _ = _json(capsys, draft, cache, "--fail-on", "conflict")
    conflicts = _conflicts(data)
    assert code == EXIT_FINDINGS and conflicts  # the demo plants conflicts (sample_manuscript/PLANTED.md)

    for claim, citation, _ in conflicts:
        code, out, _ = run_cli(
            capsys, "review", "accept", str(draft), claim, "--citation", citation,
            "--sources", str(SOURCES), "--cache", str(cache), "--note", f"read {claim} by hand",
        )  # fmt: skip
        assert code == EXIT_OK and f"accepted {claim} {citation} (conflict" in out
    review = tomllib.loads((tmp_path / "draft.md.sourcecheck-review.toml").read_text(encoding="utf-8"))
    assert {t["claim"] for t in review["accepted"].values()} == {c for c, _, _ in conflicts}

    code, data, _ = _json(capsys, draft, cache, "--fail-on", "conflict")
    assert code == EXIT_OK  # every conflict is accepted, so the gate passes
    for _, _, check in _conflicts(data):
        assert check["band"] == "conflict"  # still shown with its band
        assert check["reviewed"]["origin"] == "review-file" and check["reviewed"]["note"].startswith("read c")
    code, out, _ = run_cli(capsys, "check", str(draft), "--sources", str(SOURCES), "--cache", str(cache))
    assert "reviewed conflict" in out and "note: read c" in out

    # The planted number conflict: "only 23% of nest entrances" against the source's 18%.
    changed = draft.read_text(encoding="utf-8").replace("only 23% of nest entrances", "only 25% of nest entrances")
    assert changed != draft.read_text(encoding="utf-8")
    draft.write_text(changed, encoding="utf-8")
    code, data, err = _json(capsys, draft, cache, "--fail-on", "conflict")
    assert code == EXIT_FINDINGS
    reopened = [k for _, _, k in _conflicts(data) if k["reviewed"] is None]
    assert len(reopened) == 1 and "25%" in reopened[0]["reasons"][0]["message"]
    assert "no longer holds" in err and "unreviewed check at conflict or worse" in err


def test_list_and_forget(cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    draft = tmp_path / "draft.md"
    draft.write_text(DRAFT.read_text(encoding="utf-8"), encoding="utf-8")
    code, out, _ = run_cli(capsys, "review", "list", str(draft))
    assert code == EXIT_OK and "no accepted checks" in out
    code, _, _ = run_cli(
        capsys, "review", "accept", str(draft), "c1", "--sources", str(SOURCES), "--cache", str(cache), "--note", "ok"
    )
    assert code == EXIT_OK
    code, out, _ = run_cli(capsys, "review", "list", str(draft))
    assert out.count("note: ok") == 2  # c1 cites [2, 5]: both checks accepted
    code, out, _ = run_cli(capsys, "review", "forget", str(draft), "c1", "--citation", "5")
    assert code == EXIT_OK and "forgot c1 [5]" in out
    code, out, _ = run_cli(capsys, "review", "list", str(draft))
    assert "c1 [2]" in out and "c1 [5]" not in out


@pytest.mark.parametrize(
    ("args", "needle"),
    [
        (["c99"], "no claim c99 (the claims are c1 to c"),
        (["c1", "--citation", "[7]"], "claim c1 cites no [7] (it cites [2], [5])"),
    ],
)
def test_accepting_what_is_not_there_is_one_line(
    cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str], args: list[str], needle: str
) -> None:
    draft = tmp_path / "draft.md"
    draft.write_text(DRAFT.read_text(encoding="utf-8"), encoding="utf-8")
    code, _, err = run_cli(
        capsys, "review", "accept", str(draft), *args, "--sources", str(SOURCES), "--cache", str(cache), "--note", "x"
    )
    assert code == EXIT_INPUT and needle in err and len(err.strip().splitlines()) == 1
    assert not (tmp_path / "draft.md.sourcecheck-review.toml").exists()


def test_ignore_comments_pass_the_gate(cache: Path, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    lines = DRAFT.read_text(encoding="utf-8").splitlines()
    end = lines.index("## References")
    marked = [
        f"{line} <!-- sourcecheck: ignore -->" if i > 4 and i < end and line and not line.startswith("#") else line
        for i, line in enumerate(lines)
    ]
    draft = tmp_path / "draft.md"
    draft.write_text("\n".join(marked) + "\n", encoding="utf-8")
    code, data, _ = _json(capsys, draft, cache, "--fail-on", "loose")
    checks = [k for c in data["claims"] for k in c["checks"]]
    assert code == EXIT_OK and checks
    assert all(k["reviewed"]["origin"] == "ignore-comment" for k in checks)
