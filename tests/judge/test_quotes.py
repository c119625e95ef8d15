"""Quotations in claims against the text of the cited source (invented texts throughout)."""

import time

from sourcecheck.judge.quotes import QuoteFinding, check_quotes, drift_message, quotations

# Invented source pages. Page 2 carries PDF-extraction damage: a line-end hyphen, the
# "fi" and "fl" ligatures, a soft line break mid-sentence, curly quotes and an em dash.
PAGE_1 = "Methods. Nests were counted along fixed transects at dawn on three mornings each week."
PAGE_2 = (
    "Results. After the ﬂood of 2019 most marsh bees did not re-\n"
    "turn to the ﬁrst site, and the few that did “stayed” near the\n"
    "edge — as the wardens had expected. Nesting resumed in June."
)
PAGE_3 = (
    "Discussion. They nested again only where the reeds had recovered. The survey team "
    "recieve the counts from volunteers each autumn."
)
PAGES = [(1, PAGE_1), (2, PAGE_2), (3, PAGE_3)]


def _one(claim: str, pages=PAGES) -> QuoteFinding:
    found = check_quotes(claim, pages)
    assert len(found) == 1, found
    return found[0]


def test_verbatim_across_a_line_end_hyphen_and_ligatures() -> None:
    # "re-\nturn" is one word broken at a line end and "ﬁ"/"ﬂ" are single ligature glyphs:
    # repairs of extraction, not of wording (Unicode Standard, Alphabetic Presentation
    # Forms block U+FB00–U+FB06 are compatibility ligatures; from memory).
    finding = _one('Okafor notes that "most marsh bees did not return to the first site" [4].')
    assert finding.verbatim
    assert finding.page == 2
    assert finding.similarity == 1.0
    assert finding.closest == "most marsh bees did not return to the first site"
    assert drift_message(finding) == "quoted text found verbatim on p. 2"


def test_a_space_lost_in_the_pdf_text_is_no_drift() -> None:
    # Extraction that joins two words ("F1as") changes no wording; an added or changed
    # word still does.
    pages = [(8, "In the tagging case, the model with 1% of the data has about the same F1as the baseline.")]
    assert _one('They report "about the same F1 as the baseline" [4].', pages).verbatim
    assert not _one('They report "about the same F1 score as the baseline" [4].', pages).verbatim


def test_a_changed_word_is_reported_with_its_original() -> None:
    finding = _one('Okafor notes that "many marsh bees did not return to the first site" [4].')
    assert not finding.verbatim
    assert finding.page == 2
    assert finding.differences == ("'many' for 'most'",)
    assert 0.8 < finding.similarity < 1.0
    assert drift_message(finding) == 'quoted text differs from p. 2: "many" for "most"'


def test_a_dropped_not_is_reported_missing() -> None:
    finding = _one('Okafor notes that "most marsh bees did return to the first site" [4].')
    assert not finding.verbatim
    assert finding.differences == ("missing 'not'",)
    assert finding.closest is not None and "did not return" in finding.closest
    assert drift_message(finding) == 'quoted text differs from p. 2: missing "not"'


def test_an_added_word_is_reported_added() -> None:
    finding = _one('Okafor notes that "most marsh bees did not ever return to the first site" [4].')
    assert finding.differences == ("added 'ever'",)


def test_an_ellipsis_stands_for_omitted_text() -> None:
    # APA Publication Manual 7th ed., 8.31: omitted material within a quotation is marked
    # with an ellipsis (from memory); Chicago Manual of Style 17th ed., 13.48–13.56: the
    # spaced three-dot ellipsis, and four dots where a sentence end is omitted (from memory).
    for quote in (
        "most marsh bees ... near the edge",
        "most marsh bees . . . near the edge",
        "most marsh bees … near the edge",
        "most marsh bees [...] near the edge",
        "the wardens had expected. . . . Nesting resumed in June",
    ):
        finding = _one(f'Okafor writes "{quote}" [4].')
        assert finding.verbatim, quote
        assert finding.page == 2


def test_an_ellipsis_does_not_excuse_a_changed_word() -> None:
    finding = _one('Okafor writes "most marsh bees ... near the shore" [4].')
    assert not finding.verbatim
    assert finding.differences == ("'shore' for 'edge'",)


def test_bracketed_insertions_stand_for_short_text() -> None:
    # APA Publication Manual 7th ed., 8.31: material inserted by the writer goes in square
    # brackets, and [sic] follows an error kept from the original (from memory).
    assert _one('Lee reports "[the bees] nested again only where the reeds had recovered" [5].').verbatim
    assert _one('Lee reports "the survey team recieve [sic] the counts from volunteers" [5].').verbatim
    # A changed initial capital marked with brackets (APA 7th ed. 8.31, from memory).
    assert _one('Lee reports "[T]hey nested again only where the reeds had recovered" [5].').verbatim
    # Brackets stand for a few words, not a passage: a long stretch is not "short".
    long_gap = "the bees, having waited out a long and bitter winter in the dry hives, then left at dawn"
    source = [(1, f"In that year {long_gap}.")]
    assert not _one('Lee reports "in that year the bees [then] left at dawn" [5].', source).verbatim


def test_curly_quotes_dashes_and_quote_marks_are_treated_alike() -> None:
    # The claim uses curly marks around the quotation, straight inner marks and a spaced
    # hyphen where the source has curly inner quotes and an em dash (APA 7th ed. 8.31:
    # double marks inside a quotation become single; from memory).
    claim = "Okafor notes that “the few that did 'stayed' near the edge - as the wardens had expected” [4]."
    finding = _one(claim)
    assert finding.verbatim
    assert finding.page == 2
    # Dropping the source's own inner quotation marks is a change of punctuation, reported as such.
    dropped = _one("Okafor notes that “the few that did stayed near the edge” [4].")
    assert not dropped.verbatim and dropped.differences == () and dropped.similarity > 0.9
    assert drift_message(dropped) == "quoted text differs from p. 2 in punctuation or spacing only"
    assert quotations("As „most marsh bees did not“ show.") == ["most marsh bees did not"]
    assert quotations("As «most marsh bees did not» show.") == ["most marsh bees did not"]
    assert quotations("As »most marsh bees did not« show.") == ["most marsh bees did not"]
    assert quotations("As ``most marsh bees did not'' show.") == ["most marsh bees did not"]  # TeX marks


def test_initial_capital_and_final_punctuation_may_change() -> None:
    # APA 7th ed. 8.31: the first letter may change case and the final punctuation may
    # change to fit the sentence (from memory).
    assert _one('"Most marsh bees did not return to the first site." [4]').verbatim
    # A capital anywhere else is part of the wording and is reported.
    finding = _one('Okafor: "most Marsh bees did not return to the first site" [4].')
    assert not finding.verbatim
    assert finding.differences == ("'Marsh' for 'marsh'",)


def test_short_scare_quotes_are_not_quotations() -> None:
    # Scare quotes around a term or two are not a claim about the source's wording
    # (common practice, no source).
    claim = 'The "so-called" sites and the "natural marsh" were "most marsh bees did not" at 4 [4].'
    assert quotations(claim) == ["most marsh bees did not"]
    assert check_quotes('The "natural marsh" sites [4].', PAGES) == []
    # Single marks are apostrophes too, so they never delimit a quotation (documented limit).
    assert quotations("The bees' nests and the 'most marsh bees did not' phrase [4].") == []


def test_a_quote_on_the_last_page_reports_that_page() -> None:
    finding = _one('Lee: "nested again only where the reeds had recovered" [5].')
    assert finding.verbatim and finding.page == 3
    drifted = _one('Lee: "nested again only where the grasses had recovered" [5].')
    assert not drifted.verbatim and drifted.page == 3
    assert drift_message(drifted).startswith("quoted text differs from p. 3:")


def test_a_quote_across_a_page_break_reports_the_page_it_starts_on() -> None:
    pages = [(7, "The wardens noted that the colonies were small-"), (8, "er than before and fewer in number.")]
    finding = _one('"the colonies were smaller than before" [2]', pages)
    assert finding.verbatim and finding.page == 7


def test_a_quote_absent_from_the_source_is_not_found() -> None:
    finding = _one('Okafor found that "wild goats graze the upland pastures in winter" [4].')
    assert not finding.verbatim
    assert finding.closest is None and finding.page is None and finding.differences == ()
    assert finding.similarity < 0.6
    assert drift_message(finding) == "quoted text not found in the source"
    assert _one('"most marsh bees did not return"', []).closest is None  # a source with no text


def test_similar_letters_without_the_words_are_not_found() -> None:
    # Character similarity alone is fooled by look-alike words (the spans score ~0.69
    # here): too few of the quoted words are in the span, so it is not the passage quoted.
    pages = [(1, "Sampling notes. These beet diets, noted then, returned to the manor fields.")]
    finding = _one('"the bees did not return to the marsh" [2]', pages)
    assert finding.closest is None and finding.page is None


def test_many_pages_stay_fast() -> None:
    # Twelve invented pages of about 3,000 characters each; the quotation is on page 11.
    filler = "Transect counts were logged by hand and checked against the drone survey at noon. "
    pages = [(n, filler * 36) for n in range(1, 13)]
    pages[10] = (11, filler * 18 + "Only seven of the forty ponds still held water by August. " + filler * 17)
    started = time.perf_counter()
    found = check_quotes(
        '"only seven of the fifty ponds still held water" and "rain fell on the hills every day" [3]', pages
    )
    elapsed = time.perf_counter() - started
    assert [f.page for f in found] == [11, None]
    assert found[0].differences == ("'fifty' for 'forty'",)
    assert elapsed < 2.0  # generous on a slow runner; typically a few tens of milliseconds
