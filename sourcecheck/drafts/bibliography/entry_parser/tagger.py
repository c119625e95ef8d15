"""Tagging entries with the shipped CRF model and reading fields off the labels."""

from __future__ import annotations

from collections.abc import Mapping
from functools import cache
from pathlib import Path

import pycrfsuite

from sourcecheck.drafts.bibliography.entry_parser.features import entry_features
from sourcecheck.drafts.bibliography.entry_parser.fields import EntryFields, decode_fields, spans_from_labels
from sourcecheck.drafts.bibliography.entry_parser.lexicons import Lexicons, packaged_lexicons
from sourcecheck.drafts.bibliography.entry_parser.tokens import tokenize

MODEL_PATH = Path(__file__).resolve().parent / "model" / "entry_parser.crfsuite"
MAX_TOKENS = 400  # longer "entries" are cut: no reference entry runs this long
MIN_TITLE_ODDS = 0.1  # below this, an entry without a title keeps none


class EntryTagger:
    """A CRF model and the word lists its features were trained with."""

    def __init__(self, model_path: Path, lexicons: Lexicons) -> None:
        if not model_path.is_file():
            raise FileNotFoundError(f"{model_path}: entry-parser model missing; run scripts/train_entry_parser.py")
        self._tagger = pycrfsuite.Tagger()
        self._tagger.open(str(model_path))
        self._lexicons: Mapping[str, frozenset[str]] = lexicons
        self._known = frozenset(self._tagger.labels())

    def labels(self, text: str) -> list[str]:
        """One label per whitespace token of ``text`` (at most MAX_TOKENS tokens)."""
        tokens = tokenize(text)[:MAX_TOKENS]
        if not tokens:
            return []
        labels = list(self._tagger.tag(entry_features(tokens, self._lexicons)))
        if "title" not in labels and "title" in self._known:
            labels = _with_title(labels, [self._tagger.marginal("title", i) for i in range(len(labels))])
        return labels

    def parse(self, text: str) -> EntryFields:
        """The fields of one reference entry."""
        tokens = tokenize(text)[:MAX_TOKENS]
        labels = self.labels(text)
        return decode_fields(text, spans_from_labels(text, tokens, labels))


def _with_title(labels: list[str], title_odds: list[float]) -> list[str]:
    """Labels with the likeliest run of tokens relabelled as title.

    Nearly every entry has a title, yet the best label sequence sometimes has none (the
    title taken for a book's container or for more author names). The run is the token the
    model thinks likeliest a title, grown while neighbours reach half its probability
    and carry the same label as it.
    """
    best = max(range(len(labels)), key=title_odds.__getitem__)
    if title_odds[best] < MIN_TITLE_ODDS:
        return labels
    start = end = best
    floor = title_odds[best] / 2
    while start > 0 and title_odds[start - 1] >= floor and labels[start - 1] == labels[best]:
        start -= 1
    while end + 1 < len(labels) and title_odds[end + 1] >= floor and labels[end + 1] == labels[best]:
        end += 1
    return [*labels[:start], *["title"] * (end - start + 1), *labels[end + 1 :]]


@cache
def shipped_tagger() -> EntryTagger:
    """The packaged model with the packaged word lists, loaded once."""
    return EntryTagger(MODEL_PATH, packaged_lexicons())


def parse_fields(text: str) -> EntryFields:
    """Authors, title, container, year, DOI, volume, pages and publisher of one entry.

    ``text`` is one reference-list entry as plain text ("Okafor, A. B., & Lin, C. (2019).
    Yields on treated plots. Journal of Fields, 12, 1–21."). Never raises on odd text; an
    entry with nothing recognisable gives empty fields.
    """
    return shipped_tagger().parse(text)
