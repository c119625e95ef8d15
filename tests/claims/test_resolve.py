"""Tests for tying cited works to reference entries."""

from __future__ import annotations

from sourcecheck.claims.markers import AuthorYearCite, NumberCite
from sourcecheck.claims.resolve import Resolver
from sourcecheck.model import Reference


def ref(key: str, authors: tuple[str, ...], year: int | None, suffix: str = "") -> Reference:
    return Reference(key=key, text=key, authors=authors, year=year, year_suffix=suffix)


def cite(*names: str, year: int | None, suffix: str = "", et_al: bool = False) -> AuthorYearCite:
    return AuthorYearCite(tuple(names), et_al, year, suffix, f"{year}{suffix}")


LIST = [
    ref("okafor2019", ("Okafor", "Lin"), 2019),
    ref("okafor2019_2", ("Okafor", "Lin", "Brandt"), 2019),
    ref("okafor2019_3", ("Okafor", "Ahmed"), 2019),
    ref("brandt2021a", ("Brandt",), 2021, "a"),
    ref("brandt2021b", ("Brandt",), 2021, "b"),
    ref("vanderberg2020", ("van der Berg",), 2020),
    ref("olafsdottir2017", ("Ólafsdóttir",), 2017),
    ref("nguyenhall2018", ("Nguyen-Hall", "Park", "Rossi"), 2018),
]


def test_numbers_resolve_to_their_entry_or_none() -> None:
    resolver = Resolver([ref("1", ("A",), 2000), ref("2", ("B",), 2001)])
    assert resolver.resolve(NumberCite(2)) == "2"
    assert resolver.resolve(NumberCite(3)) is None


def test_second_author_picks_between_entries_of_one_first_author() -> None:
    resolver = Resolver(LIST)
    assert resolver.resolve(cite("Okafor", "Lin", year=2019)) == "okafor2019"
    assert resolver.resolve(cite("Okafor", "Ahmed", year=2019)) == "okafor2019_3"


def test_et_al_means_three_or_more_authors() -> None:
    # APA 7th ed., section 8.17 (from memory): works by three or more authors are cited
    # with the first author's name and "et al." from the first citation on.
    assert Resolver(LIST).resolve(cite("Okafor", year=2019, et_al=True)) == "okafor2019_2"


def test_et_al_falls_back_to_a_single_candidate() -> None:
    resolver = Resolver([ref("okafor2019", ("Okafor", "Lin"), 2019)])
    assert resolver.resolve(cite("Okafor", year=2019, et_al=True)) == "okafor2019"


def test_suffix_must_match() -> None:
    resolver = Resolver(LIST)
    assert resolver.resolve(cite("Brandt", year=2021, suffix="b")) == "brandt2021b"
    assert resolver.resolve(cite("Brandt", year=2021, suffix="c")) is None
    assert resolver.resolve(cite("Brandt", year=2021)) is None  # ambiguous: a or b


def test_names_compare_without_case_accents_or_particles() -> None:
    resolver = Resolver(LIST)
    assert resolver.resolve(cite("Van der Berg", year=2020)) == "vanderberg2020"
    assert resolver.resolve(cite("Olafsdottir", year=2017)) == "olafsdottir2017"
    assert resolver.resolve(cite("Nguyen-Hall", year=2018, et_al=True)) == "nguyenhall2018"


def test_one_slip_in_a_long_name_is_forgiven_but_not_in_a_short_one() -> None:
    resolver = Resolver([*LIST, ref("lin2015", ("Lin",), 2015)])
    assert resolver.resolve(cite("Olafsdottr", year=2017)) == "olafsdottir2017"
    assert resolver.resolve(cite("Liu", year=2015)) is None


def test_wrong_year_or_unknown_author_is_unresolved() -> None:
    resolver = Resolver(LIST)
    assert resolver.resolve(cite("Okafor", "Lin", year=2018)) is None
    assert resolver.resolve(cite("Zhou", year=2019)) is None
