"""Cross-validation helpers on tiny input: grouping, folds, scoring, style families."""

from __future__ import annotations

from collections import Counter

from sourcecheck.drafts.bibliography.entry_parser.evaluation import (
    Guess,
    Tally,
    assign_folds,
    gold_fields,
    near_duplicate_groups,
    normalise,
    score_entry,
    style_family,
)
from sourcecheck.drafts.bibliography.entry_parser.fields import EntryFields
from sourcecheck.drafts.bibliography.entry_parser.labelled import LabelledEntry


def _gold(**values: object) -> EntryFields:
    base: dict[str, object] = {
        "authors": (),
        "title": None,
        "container": None,
        "year": None,
        "year_suffix": "",
        "doi": None,
        "volume": None,
        "pages": None,
        "publisher": None,
        "spans": (),
    }
    return EntryFields(**(base | values))  # type: ignore[arg-type]


def test_normalise_folds_case_accents_and_punctuation() -> None:
    assert normalise("Ólafsdóttir, J. — “Soil” (2019)!") == "olafsdottir j soil 2019"


def test_near_copies_share_a_group() -> None:
    texts = [
        "Okonjo, A. (2019). Nitrate uptake in irrigated field plots. J Soil, 12, 45-67.",
        "Okonjo A. 2019. Nitrate uptake in irrigated field plots. J Soil 12: 45-67",  # punctuation only differs
        "Saito, K. (2004). Sediment transport in braided rivers. River Studies, 3, 1-9.",
    ]
    assert near_duplicate_groups(texts, [None, None, None]) == [0, 0, 1]


def test_equal_long_titles_share_a_group_short_ones_do_not() -> None:
    texts = ["Aaa bbb ccc ddd eee", "Zzz yyy xxx www", "Qqq ppp ooo", "Kkk jjj iii"]
    titles = [
        "Sediment transport in braided rivers",
        "sediment transport in braided rivers.",
        "Introduction",
        "Introduction",
    ]
    groups = near_duplicate_groups(texts, titles)
    assert groups[0] == groups[1]
    assert len({groups[0], groups[2], groups[3]}) == 3


def test_grouping_of_nothing_and_of_one() -> None:
    assert near_duplicate_groups([], []) == []
    assert near_duplicate_groups(["Only one"], [None]) == [0]


def test_folds_keep_groups_whole_and_even() -> None:
    groups = [0, 0, 0, 1, 2, 3, 4, 5, 6, 6]
    folds = assign_folds(groups, 3, seed=1)
    for group in set(groups):
        assert len({f for g, f in zip(groups, folds, strict=True) if g == group}) == 1
    sizes = Counter(folds)
    assert sorted(sizes) == [0, 1, 2]
    assert max(sizes.values()) - min(sizes.values()) <= 1
    assert assign_folds(groups, 3, seed=1) == folds  # same seed, same folds


def test_scoring_rules() -> None:
    gold = _gold(authors=("Ólafsdóttir",), title="Nitrate uptake in field plots", container="J Soil", year=2019)
    right = Guess(("Olafsdottir",), "Nitrate uptake in field plots.", "J. Soil", 2019, None)
    assert score_entry(gold, right) == {"title": True, "year": True, "first_author": True, "container": True}
    wrong = Guess(("Saito",), "Nitrate uptake", None, 2018, "10.1/x")
    assert score_entry(gold, wrong) == {"title": False, "year": False, "first_author": False, "container": False}


def test_doi_is_scored_only_where_the_gold_has_one() -> None:
    gold = _gold(doi="10.5555/abc")
    assert score_entry(gold, Guess((), None, None, None, "10.5555/ABC")) == {"doi": True}
    assert score_entry(_gold(), Guess((), None, None, None, "10.5555/abc")) == {}


def test_tally_rates() -> None:
    tally = Tally()
    tally.add(["all", "style:x"], {"title": True, "year": False})
    tally.add(["all"], {"title": False})
    assert tally.rate("all", "title") == 0.5
    assert tally.rate("style:x", "year") == 0.0
    assert tally.rate("all", "doi") is None
    assert tally.groups() == ["all", "style:x"]


def test_style_families_and_gold_fields() -> None:
    apa = LabelledEntry(
        "Okonjo, A. (2019). Soil. J Soil.",
        (("author", "Okonjo, A."), ("date", "(2019)."), ("title", "Soil."), ("journal", "J Soil.")),
    )
    vancouver = LabelledEntry(
        "Okonjo AB. Soil. J Soil.", (("author", "Okonjo AB."), ("title", "Soil."), ("journal", "J Soil."))
    )
    untitled = LabelledEntry("Soil. 2019.", (("title", "Soil."), ("date", "2019.")))
    assert [style_family(e) for e in (apa, vancouver, untitled)] == [
        "year-after-authors-bracketed",
        "vancouver",
        "no-author",
    ]
    fields = gold_fields(apa)
    assert (fields.authors, fields.year, fields.title, fields.container) == (("Okonjo",), 2019, "Soil", "J Soil")
