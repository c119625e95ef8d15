"""Reading labelled reference entries (JSON lines of ``text`` and ``spans``) for training.

Each line holds ``text``, the raw entry, and ``spans``, [label, text] pairs whose texts
joined by single spaces give ``text`` (see the data folder's README). Rare labels are folded
into the ones the decoder reads, so the model does not spend its weights on labels seen a
handful of times.
"""

from __future__ import annotations

import json
from dataclasses import dataclass
from pathlib import Path

from sourcecheck.drafts.bibliography.entry_parser.tokens import tokenize

#: Labels the tagger emits. Anything else in the data is mapped by ``_LABEL_MAP`` or to "note".
LABELS: tuple[str, ...] = (
    "author",
    "citation-number",
    "collection-title",
    "container-title",
    "date",
    "doi",
    "edition",
    "editor",
    "genre",
    "journal",
    "location",
    "note",
    "pages",
    "publisher",
    "title",
    "translator",
    "url",
    "volume",
)
_LABEL_MAP = {"booktitle": "container-title", "director": "author", "producer": "author", "isbn": "note"}


class LabelledDataError(ValueError):
    """A labelled-data file that cannot be read; the message names the file and line."""


@dataclass(frozen=True)
class LabelledEntry:
    """One labelled entry: its text, its (label, text) spans in order, and where it came from."""

    text: str
    spans: tuple[tuple[str, str], ...]
    source: str = ""


def canonical_label(label: str) -> str:
    """The tagger's label for a label found in the data."""
    label = _LABEL_MAP.get(label, label)
    return label if label in LABELS else "note"


def read_labelled(path: Path) -> list[LabelledEntry]:
    """Entries of a JSON-lines file; a bad line raises LabelledDataError naming file and line."""
    entries: list[LabelledEntry] = []
    try:
        lines = path.read_text(encoding="utf-8").splitlines()
    except (OSError, UnicodeDecodeError) as error:
        raise LabelledDataError(f"{path}: cannot read ({error})") from error
    for number, line in enumerate(lines, start=1):
        if not line.strip():
            continue
        try:
            row = json.loads(line)
            spans = tuple((str(label), str(text)) for label, text in row["spans"])
            entry = LabelledEntry(str(row["text"]), spans, str(row.get("from", "")))
        except (ValueError, KeyError, TypeError) as error:
            raise LabelledDataError(f"{path}:{number}: not an object with 'text' and 'spans' ({error})") from error
        if " ".join(text for _, text in spans).split() != entry.text.split():
            raise LabelledDataError(f"{path}:{number}: the spans do not add up to the text")
        entries.append(entry)
    return entries


def token_labels(entry: LabelledEntry) -> list[str]:
    """One tagger label per whitespace token of the entry's text."""
    labels: list[str] = []
    for label, text in entry.spans:
        labels.extend([canonical_label(label)] * len(tokenize(text)))
    return labels
