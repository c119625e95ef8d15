"""Training a tiny model end to end: entries in, model file out, the pattern learnt."""

from __future__ import annotations

from pathlib import Path

from sourcecheck.drafts.bibliography.entry_parser.labelled import LabelledEntry
from sourcecheck.drafts.bibliography.entry_parser.tagger import EntryTagger
from sourcecheck.drafts.bibliography.entry_parser.training import lexicons_for, train_model

FAMILIES = ["Okonjo", "Saito", "Lindqvist", "Marwick", "Haddad", "Novak", "Quispe", "Tanaka"]
TOPICS = ["soil nitrate", "river sediment", "leaf litter", "root growth", "seed banks", "dune grass"]


def _entry(i: int) -> LabelledEntry:
    author = f"{FAMILIES[i % 8]}, {chr(65 + i % 26)}."
    date = f"({1990 + i})."
    title = f"Notes on {TOPICS[i % 6]} in plot {i}."
    journal = f"{['Soil', 'Field', 'Plant'][i % 3]} Letters,"
    pages = f"{i}-{i + 9}."
    text = " ".join([author, date, title, journal, pages])
    return LabelledEntry(
        text, (("author", author), ("date", date), ("title", title), ("journal", journal), ("pages", pages))
    )


def test_tiny_model_learns_one_style(tmp_path: Path) -> None:
    entries = [_entry(i) for i in range(24)]
    lexicons = lexicons_for(entries)
    model = tmp_path / "tiny.crfsuite"
    train_model(entries, lexicons, model, {"c1": 0.0, "c2": 0.01, "max_iterations": 50})
    assert model.stat().st_size > 0
    fields = EntryTagger(model, lexicons).parse(
        "Haddad, Q. (2011). Notes on dune grass in plot 99. Plant Letters, 5-14."
    )
    assert fields.authors == ("Haddad",)
    assert fields.year == 2011
    assert fields.title == "Notes on dune grass in plot 99"
    assert fields.container == "Plant Letters"
