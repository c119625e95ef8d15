"""Adjective antonyms from WordNet 3.0, read from Debian's ``wordnet-base`` files with nltk's reader.

Counterfactual claims need "the plain opposite" of a word (effective -> ineffective, stable ->
unstable). WordNet's direct antonym links give exactly that without a hand list. Nothing is
downloaded: Debian ships the database in /usr/share/wordnet (``apt-get install wordnet-base``),
but without the small ``lexnames`` file that nltk's reader insists on opening, so the reader is
pointed at a private copy of the Debian files plus that one list (the 45
lexicographer file names of WordNet 3.0, from its ``lexnames(5WN)`` manual page; only their
number and order matter to nltk, not what is done here).
"""

from __future__ import annotations

import shutil
import tempfile
from functools import lru_cache
from pathlib import Path

WORDNET_DIR = Path("/usr/share/wordnet")

LEXNAMES = [
    "adj.all",
    "adj.pert",
    "adv.all",
    "noun.Tops",
    "noun.act",
    "noun.animal",
    "noun.artifact",
    "noun.attribute",
    "noun.body",
    "noun.cognition",
    "noun.communication",
    "noun.event",
    "noun.feeling",
    "noun.food",
    "noun.group",
    "noun.location",
    "noun.motive",
    "noun.object",
    "noun.person",
    "noun.phenomenon",
    "noun.plant",
    "noun.possession",
    "noun.process",
    "noun.quantity",
    "noun.relation",
    "noun.shape",
    "noun.state",
    "noun.substance",
    "noun.time",
    "verb.body",
    "verb.change",
    "verb.cognition",
    "verb.communication",
    "verb.competition",
    "verb.consumption",
    "verb.contact",
    "verb.creation",
    "verb.emotion",
    "verb.motion",
    "verb.perception",
    "verb.possession",
    "verb.social",
    "verb.stative",
    "verb.weather",
    "adj.ppl",
]


class LexiconUnavailable(RuntimeError):
    """The WordNet files are not installed."""


def _reader_folder(source: Path) -> Path:
    """A temporary folder with a copy of the WordNet files (about 30 MB) and a ``lexnames`` list."""
    if not (source / "data.adj").is_file():
        raise LexiconUnavailable(f"{source}: WordNet not found (install Debian's wordnet-base)")
    folder = Path(tempfile.mkdtemp(prefix="wordnet-"))
    for item in source.iterdir():
        if not item.is_file():
            continue
        shutil.copyfile(item, folder / item.name)  # nltk refuses links that resolve outside its root
    if not (folder / "lexnames").exists():
        lines = [f"{i:02d}\t{name}\t0" for i, name in enumerate(LEXNAMES)]
        (folder / "lexnames").write_text("\n".join(lines) + "\n", encoding="ascii")
    return folder


@lru_cache(maxsize=2)
def wordnet(source: Path = WORDNET_DIR):
    """nltk's WordNet reader over the Debian files."""
    import nltk
    from nltk.corpus.reader.wordnet import WordNetCorpusReader

    class PlainReader(WordNetCorpusReader):
        """The reader without its mapping to nltk's own downloaded WordNet (for multilingual data, unused)."""

        def map_wn(self, version: str = "wordnet") -> None:
            return None

    folder = _reader_folder(source)
    nltk.data.path.append(str(folder))  # nltk only opens corpus folders on its data path
    return PlainReader(str(folder), None)


@lru_cache(maxsize=8192)
def adjective_antonym(word: str, source: Path = WORDNET_DIR) -> str | None:
    """The direct antonym of an adjective in its most frequent sense that has one, or None.

    Only the word's own lemma counts (not its synonyms' antonyms), and only one-word
    antonyms, so "effective" gives "ineffective" and never a phrase.
    """
    reader = wordnet(source)
    lower = word.lower()
    return _lemma_antonym(reader.synsets(lower, pos="a") + reader.synsets(lower, pos="s"), lower)


@lru_cache(maxsize=8192)
def verb_antonym(base: str, source: Path = WORDNET_DIR) -> str | None:
    """The direct antonym of a verb's base form ("include" -> "exclude"), by the same rules."""
    lower = base.lower()
    return _lemma_antonym(wordnet(source).synsets(lower, pos="v"), lower)


def _lemma_antonym(synsets: list, lower: str) -> str | None:
    """The first one-word antonym of the lemma ``lower`` itself in ``synsets`` (most frequent sense first)."""
    for synset in synsets:
        for lemma in synset.lemmas():
            if lemma.name().lower() != lower:
                continue
            for antonym in lemma.antonyms():
                name = antonym.name()
                if "_" not in name and name.isalpha():
                    return name
    return None


@lru_cache(maxsize=8192)
def verb_base(word: str, source: Path = WORDNET_DIR) -> str | None:
    """The base form of an inflected verb ("increases" -> "increase"), or None if it is not one."""
    return wordnet(source).morphy(word.lower(), "v")
