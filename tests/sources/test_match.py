"""Matching reference entries to sources: map, DOI, arXiv id, titles, author-year, one assignment."""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest
from rapidfuzz import fuzz

from sourcecheck.model import MatchMethod, Passage, Problem, Reference, Source, SourceIdentity
from sourcecheck.sources import match_references, match_sources, read_source
from sourcecheck.sources._match import DOI_IN_TEXT, TITLE_THRESHOLD, title_similarity


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


# --- evidence weighed at once (invented entries and pages) ------------------------------

LONG_TITLE = "Grazing pressure and seed rain on coastal dune grassland"


def _titled(path: str, title: str, first_page: str = "", **identity: object) -> Source:
    source = _source(path, first_page=first_page or f"{title}\nAbstract.")
    return replace(source, identity=SourceIdentity(title=title, **identity))  # type: ignore[arg-type]


def test_title_found_in_the_entry_needs_no_parsed_title() -> None:
    # The parser read no title (a bad parse); the source's own title stands in the entry.
    entry = f"okafor a lin b {LONG_TITLE.lower()} j invented coasts 12 40 49 2021"
    ref = Reference(key="1", text=entry)
    matches, _ = match_references([ref], [_titled("a.pdf", LONG_TITLE)])
    assert matches["1"].method is MatchMethod.TITLE_IN_ENTRY
    assert matches["1"].confidence > 0.9 and "title found in the entry" in matches["1"].detail


def test_title_in_the_entry_refuses_one_changed_word() -> None:
    entry = "Okafor A. Grazing pressure and seed rain on inland dune grassland. J Coasts. 2021."
    assert match_references([Reference(key="1", text=entry)], [_titled("a.pdf", LONG_TITLE)])[0] == {}


def test_short_title_inside_a_longer_title_is_not_a_match() -> None:
    entry = "Lin B. Sleep and memory consolidation in older adults. Sleep Res. 2020;3:1-9."
    ref = Reference(key="1", text=entry, title="Sleep and memory consolidation in older adults")
    outcome = match_sources([ref], [_titled("a.pdf", "Sleep and memory in students")])
    assert outcome.matches == {}
    assert outcome.refusals["1"].candidate == "a.pdf"


def test_doi_adds_to_the_title_and_leads_the_method() -> None:
    source = _titled("a.pdf", LONG_TITLE, dois=("10.5555/dune.7",))
    ref = Reference(key="1", text=f"Okafor A. {LONG_TITLE}. J Coasts. 2021. doi:10.5555/dune.7", title=LONG_TITLE)
    match = match_references([ref], [source])[0]["1"]
    assert (match.method, match.similarity) == (MatchMethod.DOI, DOI_IN_TEXT)
    title_only = match_references([replace(ref, text=LONG_TITLE)], [source])[0]["1"]
    assert match.confidence > title_only.confidence


def test_arxiv_id_matches_a_preprint() -> None:
    source = _titled("p.pdf", "A completely different heading", arxiv_ids=("2101.01234",))
    ref = Reference(key="1", text="Okafor A. Preprint. arXiv:2101.01234v3, 2021.")
    assert match_references([ref], [source])[0]["1"].method is MatchMethod.ARXIV


def test_one_assignment_gives_each_entry_the_file_only_it_explains() -> None:
    # Entry A fits both files by author and year, entry B only the first: tier by tier,
    # A would take the first file; the joint assignment gives B the first and A the second.
    both = _source("both.pdf", first_page="Ek, Okafor and Lin 2019 report")
    only_a = _source("a.pdf", first_page="Okafor and Lin 2019 report")
    a = _ref("okafor2019", authors=("Okafor", "Lin", "Ek"), year=2019)
    b = _ref("ek2019", authors=("Ek", "Okafor"), year=2019)
    matches, _ = match_references([a, b], [both, only_a])
    assert {k: m.source for k, m in matches.items()} == {"okafor2019": "a.pdf", "ek2019": "both.pdf"}


def test_two_files_with_one_title_are_reported_not_guessed() -> None:
    sources = [_titled("v1.pdf", LONG_TITLE), _titled("v2.pdf", LONG_TITLE)]
    outcome = match_sources([Reference(key="1", text=LONG_TITLE, title=LONG_TITLE)], sources, draft="d.md")
    assert outcome.matches == {}
    line = outcome.unmatched["1"]
    assert line.file == "d.md" and "v1.pdf" in line.message and "v2.pdf" in line.message
    assert "about equally" in outcome.refusals["1"].reason


def test_two_entries_for_one_file_both_say_so() -> None:
    # The same work entered twice in the list: neither copy is guessed, each names the other.
    entries = [Reference(key=k, text=f"Okafor A. {LONG_TITLE}. J Coasts. 2021.") for k in ("1", "2")]
    outcome = match_sources(entries, [_titled("a.pdf", LONG_TITLE)])
    assert outcome.matches == {}
    reasons = {k: r.reason for k, r in outcome.refusals.items()}
    assert "reference '2' about equally" in reasons["1"] and "reference '1' about equally" in reasons["2"]


def test_refusal_names_the_entry_that_took_the_closest_file() -> None:
    source = _titled("a.pdf", LONG_TITLE, dois=("10.5555/dune.7",))
    winner = Reference(key="1", text=f"{LONG_TITLE}. doi:10.5555/dune.7", title=LONG_TITLE)
    loser = Reference(key="2", text=f"Okafor A. {LONG_TITLE}. J Coasts. 2021.")
    outcome = match_sources([winner, loser], [source])
    assert list(outcome.matches) == ["1"]
    refusal = outcome.refusals["2"]
    assert refusal.candidate == "a.pdf" and "reference '1'" in refusal.reason


def test_unrelated_entry_names_the_closest_title_and_says_nothing_ties_it() -> None:
    outcome = match_sources([Reference(key="1", text="Berg C. Ice cores. Polar J. 2001.")], [_titled("a.pdf", TITLE)])
    assert outcome.refusals["1"].candidate == "a.pdf"
    assert outcome.refusals["1"].reason.startswith("no file shares its DOI")


def test_empty_sources_folder_is_one_problem_line() -> None:
    outcome = match_sources([_ref("1", title=TITLE), _ref("2", title=LONG_TITLE)], [], sources_root="lib")
    assert outcome.problems == [Problem("lib", "the sources folder holds no readable PDF; no reference can match")]
    assert outcome.matches == {} and outcome.unmatched == {}  # no line per reference on top
    assert {k: (r.candidate, r.reason) for k, r in outcome.refusals.items()} == {
        k: (None, "the sources folder holds no readable PDF") for k in ("1", "2")
    }
