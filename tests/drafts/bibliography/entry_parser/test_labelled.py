"""Reading labelled entries and their per-token labels."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from sourcecheck.drafts.bibliography.entry_parser.labelled import (
    LabelledDataError,
    canonical_label,
    read_labelled,
    token_labels,
)


def test_read_and_label_tokens(tmp_path: Path) -> None:
    row = {
        "text": "Okonjo, A. (2019). Soil.",
        "spans": [["author", "Okonjo, A."], ["date", "(2019)."], ["booktitle", "Soil."]],
    }
    path = tmp_path / "refs.jsonl"
    path.write_text(json.dumps(row) + "\n\n", encoding="utf-8")
    [entry] = read_labelled(path)
    assert token_labels(entry) == ["author", "author", "date", "container-title"]


def test_rare_labels_fold_into_note() -> None:
    assert canonical_label("medium") == "note"
    assert canonical_label("title") == "title"


@pytest.mark.parametrize(
    ("line", "problem"),
    [
        ("not json", "not an object"),
        ('{"text": "a b"}', "not an object"),
        ('{"text": "a b", "spans": [["title", "a c"]]}', "do not add up"),
    ],
)
def test_bad_lines_name_file_and_line(tmp_path: Path, line: str, problem: str) -> None:
    path = tmp_path / "bad.jsonl"
    path.write_text('{"text": "a", "spans": [["title", "a"]]}\n' + line + "\n", encoding="utf-8")
    with pytest.raises(LabelledDataError, match=rf"bad\.jsonl:2: .*{problem}"):
        read_labelled(path)


def test_missing_file_is_one_clear_error(tmp_path: Path) -> None:
    with pytest.raises(LabelledDataError, match=r"missing\.jsonl: cannot read"):
        read_labelled(tmp_path / "missing.jsonl")
