"""read_source on PDFs built by tests/pdf_fixtures.py, checked against pdfminer.six.

pdfminer.six is a second, independent PDF text extractor, used here only as a reference:
where our cleaned text and its raw text should agree, the word sequences are compared.
"""

from __future__ import annotations

import re
import unicodedata
from pathlib import Path

import pytest
from pdfminer.high_level import extract_text

from sourcecheck.model import Passage, Problem, Source
from sourcecheck.sources import read_source
from sourcecheck.sources._reader import without_front_matter
from tests.pdf_fixtures import (
    build_pdf,
    encrypted_pdf,
    image_only_pdf,
    paper_pdf,
    two_column_pdf,
    write_not_a_pdf,
    write_truncated_pdf,
)
from tests.sources.conftest import PAGE_TEXTS


def _words(text: str) -> list[str]:
    # NFKC here is the test's own, independent normaliser (it folds "ﬁ" to "fi").
    return re.findall(r"\w+", unicodedata.normalize("NFKC", text).lower())


def _read(path: Path) -> Source:
    result = read_source(path, path.name)
    assert isinstance(result, Source), result
    return result


def _page_text(source: Source, page: int) -> str:
    return " ".join(p.text for p in source.passages if p.page == page)


PLAIN_PAGES = [
    [
        "Rainfall over the upland farms fell by a third between 2001 and 2010. Farmers "
        "responded by planting earlier in the season.",
        "",
        "Yields of winter wheat held steady despite the drier springs.",
    ],
    ["Irrigation was used on fewer than one farm in ten. Most water came from shallow wells."],
]


def test_words_agree_with_pdfminer_on_plain_pages(tmp_path: Path) -> None:
    # Reference: pdfminer.six extract_text per page; same words in the same order.
    path = build_pdf(tmp_path / "plain.pdf", PLAIN_PAGES)
    source = _read(path)
    for page in (1, 2):
        reference = _words(extract_text(str(path), page_numbers=[page - 1]))
        assert _words(_page_text(source, page)) == reference


def test_running_header_footer_and_page_numbers_are_dropped(article: Path) -> None:
    source = _read(article)
    text = " ".join(p.text for p in source.passages)
    assert "Invented Coasts" not in text
    assert not re.search(r"Page \d", text)
    # first_page_text keeps page 1's running lines, after its body, for reference matching only.
    assert source.first_page_text.rstrip().endswith("Page 1 of 4")
    assert source.first_page_text.index("Invented Coasts") > source.first_page_text.index(source.passages[0].text[:20])
    # The body of every page survives: pdfminer's words minus the running lines, in order.
    for page in range(2, 5):
        mined = extract_text(str(article), page_numbers=[page - 1])
        mined = re.split(r"\n\s*References\s*\n", mined)[0]  # the list is cut, see below
        body = "\n".join(
            line
            for line in mined.splitlines()
            if "Invented Coasts" not in line and not re.fullmatch(r"Page \d of \d", line.strip())
        )
        heading = PAGE_TEXTS[page - 1][0]  # one-word headings make no passage
        expected = [w for w in _words(body) if w != heading.lower()]
        assert _words(_page_text(source, page)) == expected


def test_each_passage_keeps_its_page(article: Path) -> None:
    source = _read(article)
    pages = {p.page for p in source.passages if "transects" in p.text}
    assert pages == {2}
    assert any("1.8 metres per year" in p.text and p.page == 3 for p in source.passages)
    assert [p.ordinal for p in source.passages] == list(range(len(source.passages)))


def test_reference_list_is_excluded(article: Path) -> None:
    source = _read(article)
    text = " ".join(p.text for p in source.passages)
    assert "Salt marsh carbon budgets" not in text
    assert "Wave exposure" not in text
    assert "Planting along the western shore" in text


def test_appendix_after_references_resumes_text(tmp_path: Path) -> None:
    pages = [
        ["Body sentence on the first page is long enough to be kept as text here."],
        ["References", "[1] Some cited work. 2001.", "Appendix A", "The appendix says more."],
    ]
    source = _read(build_pdf(tmp_path / "appendix.pdf", pages))
    text = " ".join(p.text for p in source.passages)
    assert "Some cited work" not in text
    assert "The appendix says more." in text


def test_word_references_inside_a_sentence_does_not_cut(tmp_path: Path) -> None:
    pages = [["The survey asked about\nreferences\nto earlier studies.", "It continued after."]]
    source = _read(build_pdf(tmp_path / "word.pdf", pages))
    assert "It continued after." in " ".join(p.text for p in source.passages)


def test_line_end_hyphens_are_joined(tmp_path: Path) -> None:
    pages = [
        [
            "The preva-\nlence of asthma rose in every district we studied over the\n"
            "decade, and the long-\nterm trend was steady. A long-term view is needed."
        ]
    ]
    path = build_pdf(tmp_path / "hyphen.pdf", pages)
    text = _page_text(_read(path), 1)
    assert "prevalence of asthma" in text
    assert "long-term trend" in text  # the document itself writes "long-term"
    # Reference: pdfminer's text with the line-end hyphen of "preva-" removed by hand.
    mined = re.sub(r"(preva|long-)\s+", r"\1", extract_text(str(path)).replace("preva-", "preva"))
    assert _words(text) == _words(mined)


def test_ligature_glyphs_become_letters(tmp_path: Path) -> None:
    pages = [["The ﬁrst eﬀect was signiﬁcant and the ﬂow was ﬃne, within ±0.5 µm – as planned."]]
    text = _page_text(_read(build_pdf(tmp_path / "lig.pdf", pages)), 1)
    assert "first effect was significant and the flow was ffine" in text
    assert "±0.5 µm –" in text  # compatibility characters that carry meaning are kept


def test_two_column_page_keeps_each_column_sentence_whole(tmp_path: Path) -> None:
    left = [
        "Soil moisture in dry summers fell sharply across the eastern plains.",
        "Yields dropped by a fifth whenever spring rain was scarce.",
    ]
    right = [
        "Irrigation schedules on the partner farms were set every week.",
        "Drip systems saved water in every season we measured.",
    ]
    path = two_column_pdf(tmp_path / "columns.pdf", left, right)
    text = _page_text(_read(path), 1)
    for sentence in left + right:
        assert sentence in text
    assert text.index(left[1]) < text.index(right[0])
    # Reference: pdfminer reads the same words (its line order across columns differs).
    assert sorted(_words(text)) == sorted(_words(extract_text(str(path))))


def test_passages_stay_under_max_words(tmp_path: Path) -> None:
    long_sentence = " ".join(f"word{i}" for i in range(130)) + "."
    pages = [[long_sentence, "Short one. Another short one follows here."]]
    source = read_source(build_pdf(tmp_path / "long.pdf", pages), "long.pdf", max_words=40)
    assert isinstance(source, Source)
    assert all(len(p.text.split()) <= 40 for p in source.passages)
    joined = " ".join(p.text for p in source.passages)
    assert joined.split()[:130] == long_sentence.split()  # nothing lost at the cuts


def test_metadata_and_doi(article: Path) -> None:
    source = _read(article)
    assert source.title == "Marsh edge retreat in a northern estuary"
    assert source.author == "Ferreira, N.; Lindqvist, T."
    assert source.doi == "10.5555/nest.2019.042"  # DOIs are case-insensitive, kept lower
    assert source.pages == 4
    assert source.first_page_text.startswith("Marsh edge retreat")
    assert len(source.sha256) == 64


def test_doi_in_metadata_subject_wins(tmp_path: Path) -> None:
    path = build_pdf(
        tmp_path / "meta.pdf",
        [["A sentence that mentions doi:10.1111/other.1 in passing."]],
        subject="Journal of Tests, https://doi.org/10.4242/Meta.77.",
    )
    assert _read(path).doi == "10.4242/meta.77"


def test_junk_metadata_title_is_ignored(tmp_path: Path) -> None:
    path = build_pdf(tmp_path / "junk.pdf", [["Some text here."]], title="Microsoft Word - d.docx")
    assert _read(path).title is None


def test_image_only_page_among_text_pages_is_kept(tmp_path: Path) -> None:
    pages = [["Text on page one is here."], ["<<image>>"], ["Text on page three is here."]]
    source = _read(build_pdf(tmp_path / "mixed.pdf", pages))
    assert source.pages == 3
    assert {p.page for p in source.passages} == {1, 3}


@pytest.mark.parametrize(
    ("make", "message"),
    [
        (lambda d: write_not_a_pdf(d / "notes.pdf"), "not a PDF (no %PDF- header)"),
        (lambda d: (d / "empty.pdf").write_bytes(b"") and d / "empty.pdf", "empty file"),
        (
            lambda d: write_truncated_pdf(d / "cut.pdf", build_pdf(d / "whole.pdf", PLAIN_PAGES), keep=0.5),
            "truncated or corrupt PDF",
        ),
        (
            lambda d: encrypted_pdf(d / "locked.pdf", ["Secret text."], user_password="pw"),
            "encrypted; cannot read without a password",
        ),
        (lambda d: image_only_pdf(d / "scan.pdf", pages=2), "no text layer"),
    ],
)
def test_bad_input_gives_one_line_problem(tmp_path: Path, make, message: str, caplog: pytest.LogCaptureFixture) -> None:
    path = make(tmp_path)
    if not isinstance(path, Path):
        path = tmp_path / "empty.pdf"
    result = read_source(path, f"sources/{path.name}")
    assert isinstance(result, Problem)
    assert result.file == f"sources/{path.name}"
    assert result.message.startswith(message)
    assert "\n" not in result.message
    assert not [r for r in caplog.records if r.name.startswith("pypdf")]  # pypdf kept quiet


def test_encrypted_with_empty_user_password_is_read(tmp_path: Path) -> None:
    path = encrypted_pdf(tmp_path / "open.pdf", ["Readable despite encryption."], user_password="")
    assert "Readable despite encryption." in _page_text(_read(path), 1)


def test_missing_file_is_a_problem(tmp_path: Path) -> None:
    result = read_source(tmp_path / "gone.pdf", "gone.pdf")
    assert isinstance(result, Problem)
    assert result.message.startswith("cannot open")


@pytest.mark.parametrize("metadata_title", [None, "Heron colonies of the outer saltmarsh"])
def test_title_and_author_lines_are_not_evidence(tmp_path: Path, metadata_title: str | None) -> None:
    # A title names the topic and would outrank the body for most claims (29% of SciFact
    # claims before this rule; bench/calibrate.py), yet it backs nothing.
    path = paper_pdf(
        tmp_path / "front.pdf",
        title="Heron colonies of the outer saltmarsh",
        authors="Wenna Trask and Olek Parrin",
        body=[["Heron colonies grew by a third after grazing stopped. Nests were counted each May."]],
        metadata_title=metadata_title,
    )
    source = _read(path)
    text = " ".join(p.text for p in source.passages)
    assert "Heron colonies grew by a third after grazing stopped. Nests were counted each May." in text
    if metadata_title:  # with a known title its words are cut; without one the body is never lost
        assert "outer saltmarsh" not in text
    assert [p.ordinal for p in source.passages] == list(range(len(source.passages)))


def test_a_title_set_over_two_lines_is_cut_from_both_passages() -> None:
    # A long title wraps; its last line may stand alone or run into the first paragraph,
    # where a structured abstract's run-in heading then opens the body (ICMJE headings;
    # from memory). Neither the title's end nor its loss of the heading may stay.
    title = "Salt crusts slow the walking of coastal dunes in winter storms"
    alone = [
        Passage("a.pdf", 1, "Salt crusts slow the walking", 0),
        Passage("a.pdf", 1, "of coastal dunes in winter storms.", 1),
        Passage("a.pdf", 1, "Dunes moved 12 m a year where crusts were broken.", 2, section="results"),
    ]
    assert [p.text for p in without_front_matter(alone, title)] == ["Dunes moved 12 m a year where crusts were broken."]
    run_on = [
        Passage("a.pdf", 1, "Salt crusts slow the walking", 0),
        Passage("a.pdf", 1, "coastal dunes in winter storms BACKGROUND Dunes walk inland each winter.", 1),
        Passage("a.pdf", 1, "Storms move the crest by metres.", 2),
        Passage("a.pdf", 1, "RESULTS Crusted dunes moved half as far.", 3, section="results"),
    ]
    kept = without_front_matter(run_on, title)
    assert [p.text for p in kept] == [
        "BACKGROUND Dunes walk inland each winter.",
        "Storms move the crest by metres.",
        "RESULTS Crusted dunes moved half as far.",
    ]
    assert [p.section for p in kept] == ["background", "background", "results"]
    assert [p.ordinal for p in kept] == [0, 1, 2]
