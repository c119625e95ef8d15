"""Tests for RIS files."""

from __future__ import annotations

from sourcecheck.drafts.bibliography.ris import parse_ris

# Tags from the RIS format specification (Research Information Systems, from memory):
# "TY  - " opens a record and "ER  - " closes it; a tag is two characters, two spaces, a
# hyphen and a space; AU/A1 authors as "Last, First"; TI/T1 title; PY/Y1 "YYYY/MM/DD/";
# JO/JF/T2 journal; DO DOI; ID reference id.
# "\x20" below is the space that ends "ER  - ", written so editors keep it.
RIS = """TY  - JOUR
AU  - Okafor, Ada B.
AU  - Lin, Chen
TI  - Yields on
  treated plots
PY  - 2019/05/01/
JO  - Journal of Fields
DO  - 10.1234/ABC
ID  - okafor2019
ER  -\x20

TY  - RPRT
A1  - World Health Organization
T1  - Report
Y1  - 2020///
ER  -
"""


def test_records() -> None:
    refs, problems = parse_ris(RIS, "refs.ris")
    assert [r.key for r in refs] == ["okafor2019", "ris2"]
    first = refs[0]
    assert first.authors == ("Okafor", "Lin")
    assert (first.year, first.title, first.doi, first.line) == (2019, "Yields on treated plots", "10.1234/abc", 1)
    assert (
        first.text
        == "Okafor, A. B.; Lin, C. (2019). Yields on treated plots. Journal of Fields. https://doi.org/10.1234/abc"
    )
    assert refs[1].authors == ("World Health Organization",)
    assert refs[1].year == 2020
    assert [p.message for p in problems] == ["1 record(s) have no ID tag; keyed by order as ris2"]


def test_missing_er() -> None:
    refs, problems = parse_ris("TY  - BOOK\nAU  - Doe, J\nTI  - One\nTY  - BOOK\nTI  - Two\nID  - two\n", "refs.ris")
    assert [r.title for r in refs] == ["One", "Two"]
    messages = [p.message for p in problems]
    assert "record at line 1 has no ER before the next TY" in messages
    assert "record at line 4 has no ER; read to the end of the file" in messages


def test_not_ris() -> None:
    refs, problems = parse_ris("hello\n", "refs.ris")
    assert refs == []
    assert problems[0].message == "no RIS records (TY  - ...) found"
