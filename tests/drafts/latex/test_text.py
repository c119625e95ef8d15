"""Tests for turning a LaTeX body into prose blocks and citation markers.

Outside checks, named beside each test:
- natbib's citation commands and the order of its optional notes (natbib manual, Patrick
  W. Daly; from memory): one optional argument is a postnote ("\\citep[chap.~2]{jon90}"
  prints "(Jones et al., 1990, chap. 2)"), two are prenote then postnote
  ("\\citep[see][chap.~2]{jon90}" prints "(see Jones et al., 1990, chap. 2)"), an empty
  one is no note; ``\\citep{a,b}`` cites both; starred forms print all authors and
  capitalised ones ("\\Citet") capitalise a "von"; ``\\citeauthor``/``\\citeyear`` print
  the parts of one citation.
- biblatex's (biblatex manual, Philipp Lehman et al., section on citation commands; from
  memory): ``\\cite[prenote][postnote]{keys}`` with the same order, ``\\parencite``,
  ``\\textcite``, ``\\autocite``, ``\\footcite``, ``\\smartcite``, ``\\supercite``,
  capitalised ``\\Textcite``, and the multicite form
  ``\\parencites(pre)(post)[pre][post]{key}[pre][post]{key}``.
- LaTeX's special characters (Lamport, "LaTeX: A Document Preparation System"; from
  memory): ``\\# \\$ \\% \\& \\_ \\{ \\}`` print the character, "~" is a tie (a space that
  does not break), `` ``x'' `` is double-quoted x, "-", "--", "---" are hyphen, en dash and
  em dash, the accents ``\\"o \\'e \\c{c} \\v{c}`` give ö é ç č, ``{\\ss}`` is ß, ``\\i`` a
  dotless i to put accents on, and a blank line ends a paragraph.
"""

from __future__ import annotations

from pathlib import Path

from sourcecheck.drafts.latex.reader import read_latex
from sourcecheck.drafts.latex.source import load_source
from sourcecheck.drafts.latex.text import body_blocks
from sourcecheck.drafts.latex.writer import TextBlock
from sourcecheck.model import Claim, Problem, ReadOptions

BIB = """@article{jones1990, author = {Jones, Ann and Lee, Bo and Kim, Cy}, title = {Soil}, year = {1990}}
@article{james1991, author = {James, Dee}, title = {Water}, year = {1991}}
"""


def blocks(tmp_path: Path, body: str) -> tuple[list[str], list[TextBlock], list[Problem]]:
    path = tmp_path / "d.tex"
    path.write_text(body, encoding="utf-8")
    source, _ = load_source(path, "d.tex")
    found, problems = body_blocks(source, 0, len(source.text), "d.tex")
    return [b.text for b in found], found, problems


def claims(tmp_path: Path, body: str) -> tuple[list[Claim], list[Problem]]:
    (tmp_path / "refs.bib").write_text(BIB, encoding="utf-8")
    path = tmp_path / "d.tex"
    path.write_text("\\bibliography{refs}\n\\begin{document}\n" + body + "\n\\end{document}\n", encoding="utf-8")
    draft = read_latex(path, "d.tex", ReadOptions())
    return draft.claims, draft.problems


def cited(claim: Claim) -> list[tuple[str, str, str | None, str | None]]:
    return [(c.marker, c.label, c.key, c.locator) for c in claim.citations]


# --- citation commands -------------------------------------------------------------------


def test_natbib_note_order(tmp_path: Path) -> None:
    # natbib manual (Daly; from memory): one optional argument is the postnote, two are
    # prenote and postnote, an empty one is absent.
    found, problems = claims(
        tmp_path,
        "One \\citep[chap.~2]{jones1990}. Two \\citep[see][chap.~2]{jones1990}. Three \\citep[see][]{jones1990}.",
    )
    assert problems == []
    assert [cited(c) for c in found] == [
        [("[jones1990, chap. 2]", "jones1990", "jones1990", "chap. 2")],
        [("[see jones1990, chap. 2]", "jones1990", "jones1990", "chap. 2")],
        [("[see jones1990]", "jones1990", "jones1990", None)],
    ]
    assert found[1].text == "Two [see jones1990, chap. 2]."


def test_natbib_forms_each_cite_their_keys(tmp_path: Path) -> None:
    # natbib manual (Daly; from memory): \citet, \citep, \citealt, \citealp, \citenum,
    # starred and capitalised forms, and several keys in one command.
    body = (
        "\\citet{jones1990} saw it. \\citet*{jones1990} too. \\Citet{james1991} as well. "
        "It held \\citealt{jones1990}. It held \\citealp{james1991}. Item \\citenum{james1991}. "
        "Both \\citep{jones1990, james1991}."
    )
    found, _ = claims(tmp_path, body)
    assert [[c.label for c in claim.citations] for claim in found] == [
        ["jones1990"],
        ["jones1990"],
        ["james1991"],
        ["jones1990"],
        ["james1991"],
        ["james1991"],
        ["jones1990", "james1991"],
    ]
    last = found[-1]
    assert {c.marker for c in last.citations} == {"[jones1990; james1991]"}
    assert last.text == "Both [jones1990; james1991]."


def test_citeauthor_with_citeyear_is_one_citation(tmp_path: Path) -> None:
    # natbib manual (Daly; from memory): "\citeauthor{k} (\citeyear{k})" prints what
    # \citet{k} prints, so it is one citation with one marker.
    found, _ = claims(tmp_path, "\\citeauthor{james1991} (\\citeyear{james1991}) measured the flow.")
    assert len(found) == 1
    assert found[0].text == "[james1991] measured the flow."
    assert cited(found[0]) == [("[james1991]", "james1991", "james1991", None)]


def test_biblatex_commands(tmp_path: Path) -> None:
    # biblatex manual (Lehman et al., citation commands; from memory).
    body = (
        "A \\parencite[12]{jones1990}. B \\textcite{james1991} said. C \\autocite{jones1990}. "
        "D \\footcite[see][ch.~3]{james1991}. E \\smartcite{jones1990}. F \\supercite{james1991}. "
        "\\Textcite{jones1990} agreed. G \\parencite*{james1991}. H \\cite[see][p.~5]{jones1990}."
    )
    found, _ = claims(tmp_path, body)
    assert [cited(c) for c in found] == [
        [("[jones1990, 12]", "jones1990", "jones1990", "12")],
        [("[james1991]", "james1991", "james1991", None)],
        [("[jones1990]", "jones1990", "jones1990", None)],
        [("[see james1991, ch. 3]", "james1991", "james1991", "ch. 3")],
        [("[jones1990]", "jones1990", "jones1990", None)],
        [("[james1991]", "james1991", "james1991", None)],
        [("[jones1990]", "jones1990", "jones1990", None)],
        [("[james1991]", "james1991", "james1991", None)],
        [("[see jones1990, p. 5]", "jones1990", "jones1990", "p. 5")],
    ]


def test_biblatex_multicite(tmp_path: Path) -> None:
    # biblatex manual (Lehman et al., multicite commands; from memory): each key list has
    # its own notes; "(pre)(post)" notes stand for the whole citation.
    found, _ = claims(tmp_path, "Seen twice \\parencites(for example)()[p.~2]{jones1990}[see][]{james1991}.")
    assert len(found) == 1
    assert cited(found[0]) == [
        ("[for example jones1990, p. 2; see james1991]", "jones1990", "jones1990", "p. 2"),
        ("[for example jones1990, p. 2; see james1991]", "james1991", "james1991", None),
    ]


def test_unknown_key_has_no_reference_key(tmp_path: Path) -> None:
    found, _ = claims(tmp_path, "Claimed \\citep{nobody2000} and \\citep{JONES1990}.")
    assert cited(found[0]) == [
        ("[nobody2000]", "nobody2000", None, None),
        # BibTeX matches keys regardless of case (common practice, no source).
        ("[JONES1990]", "JONES1990", "jones1990", None),
    ]


def test_a_work_cited_twice_in_a_sentence_counts_once(tmp_path: Path) -> None:
    found, _ = claims(tmp_path, "\\citet{jones1990} repeat what they said \\citep{jones1990}.")
    assert [c.label for c in found[0].citations] == ["jones1990"]


def test_marker_set_against_a_full_stop_belongs_to_the_sentence_before(tmp_path: Path) -> None:
    found, _ = claims(tmp_path, "Rivers rose.\\footcite{james1991} Then they fell.")
    assert [c.text for c in found] == ["Rivers rose.[james1991]"]


def test_nocite_is_not_a_citation(tmp_path: Path) -> None:
    found, problems = claims(tmp_path, "Plain text \\nocite{*}\\nocite{jones1990} here.")
    assert found == []
    assert [p.message for p in problems] == ["no citation commands found in the text"]


# --- text ----------------------------------------------------------------------------------


def test_special_characters_quotes_dashes_and_accents(tmp_path: Path) -> None:
    # Lamport (from memory): escaped specials, ties, quotes, dashes and accents.
    body = (
        "Costs of 5\\$ \\& 10\\% for a\\_b \\#1 \\{x\\} ~on~time. ``Quoted'' 1--2 a---b x-y. "
        "M\\\"uller, caf\\'e, fa\\c{c}ade, {\\ss}, na\\\"{\\i}ve, \\v{C}apek, Espa\\~na, \\'{E}cole.\n"
    )
    texts, _, problems = blocks(tmp_path, body)
    assert problems == []
    assert texts == [
        "Costs of 5$ & 10% for a_b #1 {x} on time. “Quoted” 1–2 a—b x-y. "
        "Müller, café, façade, ß, naïve, Čapek, España, École."
    ]


def test_text_macros_keep_their_words(tmp_path: Path) -> None:
    body = (
        "An \\emph{emphasised} \\textbf{bold} \\textit{italic} \\mbox{box} word, "
        "\\textcolor{red}{red text}, \\href{http://x.org}{a link}, \\unknownmacro{kept} \\relax done.\n"
    )
    texts, _, _ = blocks(tmp_path, body)
    assert texts == ["An emphasised bold italic box word, red text, a link, kept done."]


def test_headings_are_not_prose_and_paragraphs_split(tmp_path: Path) -> None:
    # Lamport (from memory): a blank line ends a paragraph.
    body = "\\section{Results \\cite{x}}\nFirst para\ncontinues.\n\n\\subsection*[short]{Long}\nSecond.\n"
    texts, _, _ = blocks(tmp_path, body)
    assert texts == ["First para continues.", "Second."]


def test_footnote_caption_refs_labels_and_math(tmp_path: Path) -> None:
    body = (
        "See Table~\\ref{t} and Eq.~\\eqref{e}\\label{here}.\\footnote{A note \\emph{here}.} "
        "Values $p < .05$ and \\(x\\) held.\n"
        "\\begin{equation} y = mx + b. \\end{equation}\nafter it.\n\n"
        "\\begin{figure}[t]\\centering\\includegraphics[width=3cm]{plot.pdf}"
        "\\caption[Short]{Long caption.}\\label{f}\\end{figure}\n"
    )
    texts, _, _ = blocks(tmp_path, body)
    assert texts == [
        "See Table [ref] and Eq. [ref]. Values [math] and [math] held. [math] after it.",
        "A note here.",
        "Long caption.",
    ]


def test_items_and_table_rows_are_blocks(tmp_path: Path) -> None:
    body = (
        "\\begin{itemize}\n\\item First.\n\\item[(b)] Second.\n\\end{itemize}\n"
        "\\begin{tabular}{l|c}\\hline A & 1 \\\\ B & 2 \\\\\\hline\\end{tabular}\n"
    )
    texts, _, _ = blocks(tmp_path, body)
    assert texts == ["First.", "(b) Second.", "A 1", "B 2"]


def test_definitions_and_dropped_environments_print_nothing(tmp_path: Path) -> None:
    body = (
        "\\newcommand{\\kw}[1]{\\textbf{#1}}\\def\\x#1{y}\\renewcommand*\\z{q}"
        "\\begin{tikzpicture}\\node {drawn};\\end{tikzpicture}Only this.\n"
    )
    texts, _, _ = blocks(tmp_path, body)
    assert texts == ["Only this."]


def test_each_character_keeps_its_line(tmp_path: Path) -> None:
    path = tmp_path / "d.tex"
    path.write_text("one\ntwo \\emph{three\nfour}\n\nfive\n", encoding="utf-8")
    source, _ = load_source(path, "d.tex")
    found, _ = body_blocks(source, 0, len(source.text), "d.tex")
    first = found[0]
    assert source.places[first.origins[first.text.index("four")]].line == 3
    assert source.places[found[1].origins[0]].line == 5


# --- bad input ----------------------------------------------------------------------------


def test_unclosed_brace_is_reported_and_the_rest_read(tmp_path: Path) -> None:
    texts, _, problems = blocks(tmp_path, "Start \\emph{never closed.\n\nNext paragraph \\textbf{x} ends.\n")
    assert [(p.file, p.message) for p in problems] == [
        ("d.tex", "line 1: '{' is never closed; read as closed at the end of its paragraph")
    ]
    assert texts == ["Start never closed.", "Next paragraph x ends."]


def test_stray_closing_brace_is_reported_and_the_rest_read(tmp_path: Path) -> None:
    texts, _, problems = blocks(tmp_path, "One.\nTwo } three.\n\nFour.\n")
    assert [(p.file, p.message) for p in problems] == [("d.tex", "line 2: '}' closes no group; ignored")]
    assert texts == ["One. Two three.", "Four."]


def test_missing_and_stray_brace_in_different_paragraphs_are_both_reported(tmp_path: Path) -> None:
    texts, _, problems = blocks(tmp_path, "A \\emph{open.\n\nB text \\cite{k}.\n\nC } shut.\n")
    assert [p.message for p in problems] == [
        "line 1: '{' is not closed in its paragraph; read as closed there",
        "line 5: '}' closes no group in its paragraph; ignored",
    ]
    assert texts == ["A open.", "B text [k].", "C shut."]


def test_unbalanced_brace_in_an_included_file_names_that_file(tmp_path: Path) -> None:
    (tmp_path / "part.tex").write_text("x\ny {z\n", encoding="utf-8")
    texts, _, problems = blocks(tmp_path, "Main.\n\\input{part}\n")
    assert [(p.file, p.message) for p in problems] == [
        ("part.tex", "line 2: '{' is never closed; read as closed at the end of its paragraph")
    ]
    assert texts == ["Main. x y z"]


def test_lone_dollar_is_reported_and_read_as_text(tmp_path: Path) -> None:
    texts, _, problems = blocks(tmp_path, "It cost $5 in all.\n")
    assert texts == ["It cost $5 in all."]
    assert [p.message for p in problems] == [
        "line 1: '$' opens mathematics that is not closed in its paragraph; read as text"
    ]
