"""Tests for turning LaTeX-coded field values into plain text."""

from __future__ import annotations

import unicodedata

import pytest

from sourcecheck.drafts.bibliography.latex_markup import latex_to_text


@pytest.mark.parametrize(
    ("coded", "unicode_name"),
    [
        # The TeXbook, Knuth (1984), ch. 9, accents (from memory): \" umlaut, \' acute, \` grave,
        # \^ circumflex, \~ tilde, \c cedilla, \v háček, \H long Hungarian umlaut; \ss, \o, \L letters.
        # The expected letters are named by their Unicode character names (the Unicode Standard).
        ('{\\"o}', "LATIN SMALL LETTER O WITH DIAERESIS"),
        ("\\'e", "LATIN SMALL LETTER E WITH ACUTE"),
        ("\\`a", "LATIN SMALL LETTER A WITH GRAVE"),
        ("\\^{o}", "LATIN SMALL LETTER O WITH CIRCUMFLEX"),
        ("\\~n", "LATIN SMALL LETTER N WITH TILDE"),
        ("\\c{c}", "LATIN SMALL LETTER C WITH CEDILLA"),
        ("\\v{S}", "LATIN CAPITAL LETTER S WITH CARON"),
        ("\\H{o}", "LATIN SMALL LETTER O WITH DOUBLE ACUTE"),
        ("{\\ss}", "LATIN SMALL LETTER SHARP S"),
        ("{\\o}", "LATIN SMALL LETTER O WITH STROKE"),
        ("{\\L}", "LATIN CAPITAL LETTER L WITH STROKE"),
        ("\\'{\\i}", "LATIN SMALL LETTER I WITH ACUTE"),
        # The TeXbook, ch. 2 (from memory): "--" is an en dash, "---" an em dash.
        ("--", "EN DASH"),
        ("---", "EM DASH"),
        ("``", "LEFT DOUBLE QUOTATION MARK"),
        ("''", "RIGHT DOUBLE QUOTATION MARK"),
    ],
)
def test_accents_dashes_and_quotes(coded: str, unicode_name: str) -> None:
    assert latex_to_text(coded) == unicodedata.lookup(unicode_name)


def test_words_keep_their_letters() -> None:
    assert latex_to_text('M{\\"u}ller') == "Müller"
    assert latex_to_text("Stra{\\ss}e") == "Straße"
    assert latex_to_text("{\\L}{\\'o}d{\\'z}") == "Łódź"
    # The TeXbook (from memory): a control word ends at the space after it, and an accent
    # may take its letter after a space: "\o ster" is "øster", "\c c" is "ç".
    assert latex_to_text("\\o ster \\c c") == "øster ç"


def test_protective_braces_ties_and_macros() -> None:
    # BibTeXing (Patashnik 1988, from memory): braces protect capitals from case changes
    # and print nothing; "~" is TeX's tie, an unbreakable space (The TeXbook, from memory).
    assert latex_to_text("{DNA} repair in {E}scherichia~coli") == "DNA repair in Escherichia coli"
    assert latex_to_text("\\emph{Big} and \\textbf{bold}") == "Big and bold"
    assert latex_to_text("50\\% \\& more \\{x\\}") == "50% & more {x}"
    assert latex_to_text("\\ldots and \\LaTeX{} too") == "… and LaTeX too"
    assert latex_to_text("{\\noopsort{a}}Zeta") == "Zeta"
    assert latex_to_text("$\\alpha$-helix") == "α-helix"


def test_whitespace_is_one_line() -> None:
    assert latex_to_text("A\n   wrapped\ttitle ") == "A wrapped title"
    assert latex_to_text("") == ""
