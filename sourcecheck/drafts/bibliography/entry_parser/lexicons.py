"""Word lists the tagger's features look words up in.

Two kinds, both plain text files in ``lexicons/`` (one folded word a line, ``#`` header
lines stating the source):

* curated lists written from memory: month names, generic venue and publisher words, and
  the cue words for editors, translators, volumes, pages and kinds of work;
* lists derived from labelled training data by :func:`derive_lexicons`: words seen mostly
  inside author, venue, publisher or place spans, and given names. The training script
  writes them beside the curated ones; cross-validation derives them again inside each
  fold from the training part only, so no test entry leaks into its own features.

Name lists from a census, as in ParsCit (Councill, Giles and Kan 2008), would need a
download; deriving from the labelled data keeps everything offline and in the package.
"""

from __future__ import annotations

import re
from collections import Counter, defaultdict
from collections.abc import Iterable, Mapping
from functools import cache
from pathlib import Path

from sourcecheck.drafts.bibliography.entry_parser.labelled import LabelledEntry, canonical_label
from sourcecheck.drafts.bibliography.entry_parser.tokens import tokenize
from sourcecheck.text import fold

LEXICON_DIR = Path(__file__).resolve().parent / "lexicons"
CURATED: tuple[str, ...] = (
    "months",
    "venue_words",
    "publisher_words",
    "editor_words",
    "translator_words",
    "volume_words",
    "page_words",
    "genre_words",
)
#: Derived list -> the labels whose spans it collects words from.
DERIVED_FROM: dict[str, tuple[str, ...]] = {
    "name_terms": ("author", "editor", "translator"),
    "venue_terms": ("journal", "container-title", "collection-title"),
    "publisher_terms": ("publisher",),
    "place_terms": ("location",),
    "title_terms": ("title",),
}
DERIVED: tuple[str, ...] = (*DERIVED_FROM, "given_names")
# A word joins a derived list when seen this often in the list's labels, and at least
# this share of its occurrences there (chosen by hand, not tuned on the evaluation folds).
MIN_COUNT = 3
MIN_SHARE = 0.6
_CHUNK_SPLIT_RE = re.compile(r"\s*(?:[,;&]|\band\b|\bund\b|\bet\b|\by\b)\s*")
_GIVEN_RE = re.compile(r"^[A-Z][a-z]{2,}$")

Lexicons = Mapping[str, frozenset[str]]


def word_key(word: str) -> str:
    """How a word is looked up: folded, without inner full stops ("U.S." -> "us")."""
    return fold(word).replace(".", "")


def read_lexicon(path: Path) -> frozenset[str]:
    """The words of one list file, header lines skipped."""
    lines = path.read_text(encoding="utf-8").splitlines()
    return frozenset(line.strip() for line in lines if line.strip() and not line.startswith("#"))


def write_lexicon(path: Path, words: Iterable[str], source: str) -> None:
    """Write a list file with a one-line ``# source:`` header."""
    body = "\n".join(sorted(set(words)))
    path.write_text(f"# source: {source}\n{body}\n", encoding="utf-8")


@cache
def packaged_lexicons() -> Lexicons:
    """Every list shipped in the package, curated and derived."""
    return {name: read_lexicon(LEXICON_DIR / f"{name}.txt") for name in (*CURATED, *DERIVED)}


def curated_lexicons() -> dict[str, frozenset[str]]:
    """Only the lists written from memory, for building on with derived ones."""
    return {name: read_lexicon(LEXICON_DIR / f"{name}.txt") for name in CURATED}


def derive_lexicons(entries: Iterable[LabelledEntry]) -> dict[str, frozenset[str]]:
    """Word lists read off labelled entries: words that mostly occur in given labels.

    ``given_names`` holds capitalised first words of "Given Family" name chunks ("Ada
    Okafor, Chen Lin"), seen at least twice.
    """
    per_label: dict[str, Counter[str]] = defaultdict(Counter)
    overall: Counter[str] = Counter()
    given: Counter[str] = Counter()
    for entry in entries:
        for label, text in entry.spans:
            label = canonical_label(label)
            for token in tokenize(text):
                key = word_key(token.core)
                if len(key) >= 2 and key.isalpha():
                    per_label[label][key] += 1
                    overall[key] += 1
            if label == "author":
                given.update(_given_candidates(text))
    derived: dict[str, frozenset[str]] = {}
    for name, labels in DERIVED_FROM.items():
        counts = sum((per_label[label] for label in labels), Counter())
        derived[name] = frozenset(
            word for word, n in counts.items() if n >= MIN_COUNT and n / overall[word] >= MIN_SHARE
        )
    derived["given_names"] = frozenset(word for word, n in given.items() if n >= 2)
    return derived


def _given_candidates(author_span: str) -> list[str]:
    """First words of chunks shaped "Given Family" or "Given Middle Family"."""
    found: list[str] = []
    for chunk in _CHUNK_SPLIT_RE.split(author_span):
        words = chunk.strip(" .").split()
        if 2 <= len(words) <= 3 and _GIVEN_RE.match(words[0]) and words[-1][:1].isupper():
            found.append(word_key(words[0]))
    return found
