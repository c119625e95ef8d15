"""Matching reference entries to sources: map, DOI, title, author-year."""

from __future__ import annotations

from pathlib import Path

import pytest
from rapidfuzz import fuzz

from sourcecheck.model import MatchMethod, Passage, Reference, Source
from sourcecheck.sources import match_references, read_source
from sourcecheck.sources._match import TITLE_THRESHOLD, title_similarity


def _source(
    path: str,
    first_page: str = "",
    title: str | None = None,
    doi: str | None = None,
    author: str | None = None,
    page_two: str = "",
) -> Source:
    passages = [Passage(path, 2, page_two, 0)] if page_two else []
    return Source(path, "0" * 64, 3, title, doi, first_page, passages, author)


def _ref(key: str, **fields: object) -> Reference:
    return Reference(key=key, text=f"entry {key}", **fields)  # type: ignore[arg-type]


def test_mapping_accepts_relative_and_display_paths() -> None:
    sources = [_source("lib/a.pdf"), _source("lib/sub/b.pdf")]
    refs = [_ref("1"), _ref("2")]
    matches, problems = match_references(refs, sources, {"1": "a.pdf", "2": "lib/sub/b.pdf"}, sources_root="lib")
    assert problems == []
    assert {k: (m.source, m.method) for k, m in matches.items()} == {
        "1": ("lib/a.pdf", MatchMethod.MAP),
        "2": ("lib/sub/b.pdf", MatchMethod.MAP),
    }


def test_mapping_to_unknown_key_or_missing_file_is_a_problem() -> None:
    sources = [_source("lib/a.pdf")]
    matches, problems = match_references([_ref("1")], sources, {"1": "gone.pdf", "9": "a.pdf"}, sources_root="lib")
    assert matches == {}
    assert [p.file for p in problems] == ["lib/gone.pdf", "lib/a.pdf"]
    assert "not a readable PDF" in problems[0].message
    assert "'9'" in problems[1].message


def test_mapping_outranks_doi() -> None:
    sources = [_source("a.pdf", doi="10.1000/1"), _source("b.pdf")]
    matches, _ = match_references([_ref("1", doi="10.1000/1")], sources, {"1": "b.pdf"})
    assert matches["1"].source == "b.pdf"


def test_doi_matches_metadata_or_first_pages_case_insensitively() -> None:
    sources = [
        _source("a.pdf", doi="10.1000/abc"),
        _source("b.pdf", page_two="Received 2019. https://doi.org/10.1000/XYZ.9 online."),
    ]
    refs = [_ref("1", doi="https://doi.org/10.1000/ABC"), _ref("2", doi="10.1000/xyz.9")]
    matches, _ = match_references(refs, sources)
    assert (matches["1"].source, matches["1"].method, matches["1"].similarity) == (
        "a.pdf",
        MatchMethod.DOI,
        1.0,
    )
    assert (matches["2"].source, matches["2"].method) == ("b.pdf", MatchMethod.DOI)
    assert matches["2"].similarity < 1.0


TITLE = "Effects of caffeine on sleep in adolescents"


@pytest.mark.parametrize(
    "printed",
    [
        TITLE,
        "EFFECTS OF CAFFEINE ON SLEEP IN ADOLESCENTS",
        "Effects of cafeine on sleep in adolescents",  # typo
        "Effects of caffeine on sleep in adolescents: a randomised trial",  # subtitle
    ],
)
def test_title_variants_match(printed: str) -> None:
    source = _source("s.pdf", first_page=f"{printed}\nA. Okafor, B. Lund\nAbstract text.")
    matches, _ = match_references([_ref("1", title=TITLE)], [source])
    assert matches["1"].method is MatchMethod.TITLE
    assert matches["1"].similarity >= TITLE_THRESHOLD / 100 * 0.9


@pytest.mark.parametrize(
    ("wanted", "printed"),
    [
        (TITLE, "Effects of caffeine on sleep in adults"),
        ("Soil nitrogen loss under winter cover crops", "Soil nitrogen loss under summer cover crops"),
        ("Long-term outcomes of early reading intervention", "Short-term outcomes of early reading intervention"),
        ("Urban heat islands and childhood asthma", "Urban heat islands and adult asthma"),
        ("Sleep and memory", "Sleep and mood"),
    ],
)
def test_near_miss_titles_do_not_match(wanted: str, printed: str) -> None:
    # Invented near misses: one content word changed. fuzz.ratio alone scores some >= 90.
    assert title_similarity(wanted, [printed]) == 0.0


def test_character_ratio_alone_would_accept_near_misses() -> None:
    # rapidfuzz's fuzz.ratio (normalised Indel similarity) on lower-cased titles: why the
    # word-alignment check exists.
    assert fuzz.ratio(TITLE.lower(), "effects of caffeine on sleep in adults") >= TITLE_THRESHOLD
    assert title_similarity(TITLE, ["Effects of caffeine on sleep in adults"]) == 0.0


def test_title_run_into_author_line_matches() -> None:
    source = _source("s.pdf", first_page=f"{TITLE} Ada Okafor, Bo Lund\nAbstract.")
    matches, _ = match_references([_ref("1", title=TITLE)], [source])
    assert matches["1"].source == "s.pdf"


def test_two_references_claiming_one_source_by_title_better_wins() -> None:
    source = _source("s.pdf", title=TITLE)
    refs = [_ref("1", title="Effects of cafeine on sleep in adolescent"), _ref("2", title=TITLE)]
    matches, _ = match_references(refs, [source])
    assert list(matches) == ["2"]


def test_doi_match_takes_the_source_before_title() -> None:
    source = _source("s.pdf", title=TITLE, doi="10.1000/7")
    refs = [_ref("1", title=TITLE), _ref("2", doi="10.1000/7")]
    matches, _ = match_references(refs, [source])
    assert list(matches) == ["2"]


def test_author_year_match() -> None:
    source = _source("s.pdf", first_page="Marsh retreat\nNadia Ferreira and Tomás Lindqvist\n2019")
    ref = _ref("ferreira2019", authors=("Ferreira", "Lindqvist"), year=2019)
    matches, _ = match_references([ref], [source])
    assert matches["ferreira2019"].method is MatchMethod.AUTHOR_YEAR
    assert matches["ferreira2019"].similarity == 1.0
    wrong_year = _ref("ferreira2018", authors=("Ferreira",), year=2018)
    assert match_references([wrong_year], [source])[0] == {}


def test_author_year_tie_is_left_unmatched() -> None:
    sources = [_source(f"{n}.pdf", first_page="Okafor 2019 study") for n in "ab"]
    ref = _ref("okafor2019", authors=("Okafor",), year=2019)
    assert match_references([ref], sources)[0] == {}


def test_read_and_match_end_to_end(article: Path) -> None:
    source = read_source(article, "lib/article.pdf")
    assert isinstance(source, Source)
    refs = [
        _ref("1", doi="10.5555/nest.2019.042"),
        _ref("2", title="Marsh edge retreat in a northern estuary"),
        _ref("3", authors=("Ferreira",), year=2019),
    ]
    matches, _ = match_references(refs[:1], [source])
    assert matches["1"].method is MatchMethod.DOI
    matches, _ = match_references(refs[1:2], [source])
    assert matches["2"].method is MatchMethod.TITLE
    matches, _ = match_references(refs[2:], [source])
    assert matches["3"].method is MatchMethod.AUTHOR_YEAR
