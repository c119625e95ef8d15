"""Tests for .bib files (BibTeX and biblatex)."""

from __future__ import annotations

from sourcecheck.drafts.bibliography.bibtex import parse_bibtex, parse_names, split_chunks

BIB = r"""% A comment line outside entries is ignored by BibTeX.
@string{jof = "Journal of Fields"}
@comment{an @comment is skipped}

@article{mueller2019,
  author  = {M{\"u}ller, J{\"o}rg and van der Berg, Jan and {World Health Organization} and others},
  title   = {{DNA} yields in Stra{\ss}e -- a {\'e}tude},
  journal = jof # " Letters",
  year    = 2019,
  doi     = {10.1234/ABC}
}
@inproceedings{lovelace2001, crossref = {proc2001}, title = "A talk", author = "Ada Lovelace"}
@online{beethoven2019, author = {Ludwig van Beethoven}, title = {Nine},
  date = {2019-05-01}, url = {https://doi.org/10.5555/NINE}}
@proceedings{proc2001, booktitle = {Proceedings of Things}, year = {2001}, editor = {Eve Editor}}
"""


def test_entries_fields_and_order() -> None:
    refs, problems = parse_bibtex(BIB, "refs.bib")
    assert problems == []
    assert [r.key for r in refs] == ["mueller2019", "lovelace2001", "beethoven2019", "proc2001"]
    first = refs[0]
    # BibTeXing (Patashnik 1988, from memory): @string macros and "#" concatenation.
    assert first.text.startswith("Müller, J.; van der Berg, J.; World Health Organization; et al. (2019).")
    assert "Journal of Fields Letters" in first.text
    assert first.authors == ("Müller", "van der Berg", "World Health Organization")
    assert first.title == "DNA yields in Straße – a étude"
    assert first.year == 2019
    assert first.doi == "10.1234/abc"
    assert first.line == 5


def test_crossref_inherits_missing_fields() -> None:
    # BibTeXing (from memory): an entry with crossref takes the fields it lacks from the parent.
    refs, _ = parse_bibtex(BIB, "refs.bib")
    talk = next(r for r in refs if r.key == "lovelace2001")
    assert talk.year == 2001
    assert "Proceedings of Things" in talk.text
    assert talk.authors == ("Lovelace",)


def test_biblatex_date_and_doi_url() -> None:
    refs, _ = parse_bibtex(BIB, "refs.bib")
    nine = next(r for r in refs if r.key == "beethoven2019")
    assert nine.year == 2019
    assert nine.doi == "10.5555/nine"
    # BibTeXing (from memory): "First von Last": the von part belongs to the family name.
    assert nine.authors == ("van Beethoven",)


def test_editor_stands_in_for_missing_author() -> None:
    refs, _ = parse_bibtex(BIB, "refs.bib")
    assert next(r for r in refs if r.key == "proc2001").authors == ("Editor",)


def test_name_forms_from_bibtexing() -> None:
    # BibTeXing (Patashnik 1988, section 4, from memory): "First von Last", "von Last, First",
    # "von Last, Jr, First"; names split at "and" outside braces; "and others" is et al.
    people, et_al = parse_names(
        "Jan van der Berg and de la Fontaine, Jean and Smith, Jr., John and {Barnes and Noble} and others"
    )
    assert [p.family for p in people] == ["van der Berg", "de la Fontaine", "Smith", "Barnes and Noble"]
    assert [p.given for p in people] == ["Jan", "Jean", "John", ""]
    assert et_al


def test_syntax_error_in_one_entry_keeps_the_others() -> None:
    text = (
        "@article{good1, title = {One}, year = 2001}\n"
        "@article{nocomma, title = {Two} year = {2002}}\n"
        "@article{unclosed, title = {Three, year = 2003,\n"
        "\n"
        "@article{good2, title = {Four}, year = 2004}\n"
        "@article{title = {Five}}\n"
        "@misc{undefined, title = {Six}, journal = nomacro}\n"
    )
    refs, problems = parse_bibtex(text, "refs.bib")
    assert [r.key for r in refs] == ["good1", "good2"]
    assert [p.message for p in problems] == [
        "entry at line 2 could not be read (syntax error); skipped",
        "entry at line 3 could not be read (unbalanced braces); skipped",
        "entry at line 6 has no citation key; skipped",
        "entry at line 7 uses @string 'nomacro' that is not defined; skipped",
    ]
    assert all(p.file == "refs.bib" for p in problems)


def test_extra_closing_brace_is_reported() -> None:
    refs, problems = parse_bibtex("@article{cut, title = {A}}, year = 2000}\n", "refs.bib")
    assert [r.key for r in refs] == ["cut"]
    assert problems[0].message == "entry at line 1 has a closing brace too many, so fields may be lost"


def test_duplicate_key_first_wins() -> None:
    text = "@misc{x, title = {First}}\n\n@misc{y, title = {Other}}\n@misc{x, title = {Second}}\n"
    refs, problems = parse_bibtex(text, "refs.bib")
    assert [(r.key, r.title) for r in refs] == [("x", "First"), ("y", "Other")]
    assert [p.message for p in problems] == ["duplicate key 'x' in refs.bib (lines 1 and 4); the first is used"]


def test_missing_crossref_parent_is_reported() -> None:
    refs, problems = parse_bibtex("@misc{child, crossref = {nowhere}, title = {T}}", "refs.bib")
    assert [r.key for r in refs] == ["child"]
    assert "crossref 'nowhere'" in problems[0].message


def test_parenthesis_delimited_entry() -> None:
    # BibTeXing (from memory): an entry may be delimited by parentheses instead of braces.
    refs, problems = parse_bibtex("@book(paren, title = {P}, year = 1990)", "refs.bib")
    assert problems == []
    assert (refs[0].key, refs[0].year) == ("paren", 1990)


def test_split_chunks_lines() -> None:
    chunks = list(split_chunks("x\n@a{k1, t={v}}\n\n  @b{k2,\n t={w}}"))
    assert [(c.kind, c.line, c.error) for c in chunks] == [("a", 2, None), ("b", 4, None)]
