"""Tests for the shared Reference builder."""

from __future__ import annotations

from sourcecheck.drafts.bibliography.record import Person, initials, make_reference, normalise_doi, year_of


def test_year_of_reads_common_date_forms() -> None:
    # ISO 8601 dates (biblatex "date", CSL "raw") and RIS "PY  - 2019/05/01/" (from memory).
    assert year_of("2019-05-01") == 2019
    assert year_of("2019///") == 2019
    assert year_of("{2021}") == 2021
    assert year_of("in press") is None
    assert year_of(None) is None


def test_doi_is_bare_and_lower_case() -> None:
    # DOI Handbook (from memory): DOIs are case-insensitive, "10." prefix, resolver https://doi.org/.
    assert normalise_doi("https://doi.org/10.1234/ABC.def") == "10.1234/abc.def"
    assert normalise_doi("", None, "doi:10.5555/X1") == "10.5555/x1"
    assert normalise_doi("not a doi") is None


def test_initials() -> None:
    assert initials("Ada Beatrix") == "A. B."
    assert initials("Jean-Paul") == "J.-P."
    assert initials("A.B.") == "A. B."


def test_make_reference_renders_one_line() -> None:
    ref = make_reference(
        "k1",
        [Person("Okafor", "Ada"), Person("World Health Organization")],
        et_al=True,
        year=2019,
        title="Yields.",
        container="J",
        doi="10.1234/x",
        line=4,
    )
    assert ref.key == "k1"
    assert ref.authors == ("Okafor", "World Health Organization")
    assert ref.text == "Okafor, A.; World Health Organization; et al. (2019). Yields. J. https://doi.org/10.1234/x"
    assert ref.line == 4
    assert make_reference("k2", []).text == "(n.d.)."
