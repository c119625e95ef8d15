"""The shipped model: present, the file its metadata describes, and small."""

from __future__ import annotations

import hashlib
import json

from sourcecheck.drafts.bibliography.entry_parser.labelled import LABELS
from sourcecheck.drafts.bibliography.entry_parser.tagger import MODEL_PATH, shipped_tagger

METADATA = MODEL_PATH.with_name("model.json")


def test_model_matches_its_recorded_sha256() -> None:
    metadata = json.loads(METADATA.read_text(encoding="utf-8"))
    data = MODEL_PATH.read_bytes()
    assert metadata["model"] == MODEL_PATH.name
    assert hashlib.sha256(data).hexdigest() == metadata["sha256"]
    assert len(data) == metadata["bytes"]
    assert len(data) < 3_000_000  # a small file in the wheel


def test_model_labels_are_the_taggers_labels() -> None:
    text = "Okonjo, A. (2019). Soil nitrate. Journal of Soil Methods, 12, 45–67."
    labels = shipped_tagger().labels(text)
    assert len(labels) == len(text.split())
    assert set(labels) <= set(LABELS)
