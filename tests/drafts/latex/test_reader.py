"""Tests for the LaTeX reader as a whole: bibliography sources, files and lines, bad input.

BibTeX's rule that ``\\bibliography{refs}`` names refs.bib, and biblatex's that
``\\addbibresource{refs.bib}`` names the file with its suffix, are from the BibTeX and
biblatex manuals (Patashnik, "BibTeXing"; Lehman et al., biblatex manual; both from
memory). A thebibliography environment of ``\\bibitem{key} text`` entries is LaTeX's own
reference list (Lamport, "LaTeX: A Document Preparation System"; from memory).
"""

from __future__ import annotations

from pathlib import Path

from sourcecheck.claims import claim_query
from sourcecheck.drafts.latex.reader import read_latex
from sourcecheck.drafts.markdown.reader import read_markdown
from sourcecheck.model import Draft, ReadOptions

BIB = """@article{okafor2019,
  author = {Okafor, Ada B. and Lin, Chen},
  title = {Carbon in untilled fields},
  journal = {Soil Journal}, year = {2019}, volume = {3}, pages = {1--9}
}
@article{lin2020,
  author = {Lin, Chen},
  title = {Dry years},
  journal = {Soil Journal}, year = {2020}, volume = {4}, pages = {2--5}
}
"""


def write(folder: Path, name: str, text: str) -> Path:
    path = folder / name
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(text, encoding="utf-8")
    return path


def read(path: Path, display: str = "paper.tex", bib: Path | None = None) -> Draft:
    return read_latex(path, display, ReadOptions(bibliography=bib))


def keys(draft: Draft) -> list[list[str | None]]:
    return [[c.key for c in claim.citations] for claim in draft.claims]


def test_preamble_is_skipped_and_bibliography_named_there_is_read(tmp_path: Path) -> None:
    write(tmp_path, "refs.bib", BIB)
    draft = read(
        write(
            tmp_path,
            "paper.tex",
            "\\documentclass{article}\n\\title{Preamble \\cite{lin2020}}\n\\bibliography{refs}\n"
            "\\begin{document}\nCarbon rose \\citep{okafor2019}.\n\\end{document}\nAfter \\cite{lin2020}.\n",
        )
    )
    assert draft.problems == []
    assert [r.key for r in draft.references] == ["okafor2019", "lin2020"]
    assert [(c.text, c.line, c.file) for c in draft.claims] == [("Carbon rose [okafor2019].", 5, None)]
    assert keys(draft) == [["okafor2019"]]


def test_addbibresource_and_bib_option_override(tmp_path: Path) -> None:
    write(tmp_path, "refs.bib", BIB)
    write(tmp_path, "other.bib", "@book{lin2020, author = {Lin, C.}, title = {Other}, year = {2020}}\n")
    paper = write(
        tmp_path,
        "paper.tex",
        "\\addbibresource[label=x]{refs.bib}\n\\begin{document}\nA \\parencite{okafor2019}. B \\parencite{lin2020}.\n"
        "\\end{document}\n",
    )
    assert keys(read(paper)) == [["okafor2019"], ["lin2020"]]
    overridden = read(paper, bib=tmp_path / "other.bib")
    assert [r.key for r in overridden.references] == ["lin2020"]
    assert keys(overridden) == [[None], ["lin2020"]]


def test_missing_bib_is_one_problem_and_the_claims_are_still_read(tmp_path: Path) -> None:
    paper = write(
        tmp_path, "paper.tex", "\\begin{document}\nA \\cite{okafor2019}.\n\\bibliography{gone}\n\\end{document}\n"
    )
    draft = read(paper)
    assert [(p.file, p.message) for p in draft.problems] == [
        ("gone.bib", "no such file (named by \\bibliography in paper.tex, line 3)")
    ]
    assert keys(draft) == [[None]]
    assert draft.claims[0].citations[0].label == "okafor2019"


def test_bbl_beside_the_draft_is_used_when_no_bib_is_named(tmp_path: Path) -> None:
    write(
        tmp_path,
        "paper.bbl",
        "\\begin{thebibliography}{1}\n\\bibitem[Lin(2020)]{lin2020} Lin, C. (2020). Dry years. Soil Journal, 4.\n"
        "\\end{thebibliography}\n",
    )
    draft = read(write(tmp_path, "paper.tex", "\\begin{document}\nDry \\citet{lin2020}.\n\\end{document}\n"))
    assert draft.problems == []
    assert [r.key for r in draft.references] == ["lin2020"]
    assert draft.references[0].year == 2020
    assert keys(draft) == [["lin2020"]]


def test_thebibliography_in_the_document(tmp_path: Path) -> None:
    draft = read(
        write(
            tmp_path,
            "paper.tex",
            "\\begin{document}\nCarbon rose \\cite{okafor2019}, and not \\cite{nobody}.\n\n"
            "\\begin{thebibliography}{9}\n"
            "\\bibitem{okafor2019} Okafor, A. B., and Lin, C. (2019). Carbon in untilled fields. Soil Journal, 3.\n"
            "\\end{thebibliography}\n\\end{document}\n",
        )
    )
    assert [r.key for r in draft.references] == ["okafor2019"]
    assert draft.references[0].line == 5  # the \bibitem's line in the draft
    assert keys(draft) == [["okafor2019", None]]
    assert all("Carbon in untilled" not in c.text for c in draft.claims)  # the list is not prose


def test_no_bibliography_at_all_is_reported(tmp_path: Path) -> None:
    draft = read(write(tmp_path, "paper.tex", "\\begin{document}\nA \\cite{k}.\n\\end{document}\n"))
    assert [p.message for p in draft.problems] == [
        "no bibliography found (no --bib, \\bibliography, \\addbibresource, paper.bbl or thebibliography environment)"
    ]
    assert keys(draft) == [[None]]


def test_claims_in_included_files_name_file_and_line(tmp_path: Path) -> None:
    write(tmp_path, "refs.bib", BIB)
    write(tmp_path, "sections/intro.tex", "% intro\n\nIntro text.\n\nDry years differ \\citep{lin2020}.\n")
    paper = write(
        tmp_path,
        "paper.tex",
        "\\bibliography{refs}\n\\begin{document}\n\\input{sections/intro}\n\\input{../outside}\n"
        "Back home \\citep{okafor2019}.\n\\end{document}\n",
    )
    draft = read(paper, display="drafts/paper.tex")
    assert [(c.file, c.line, c.text) for c in draft.claims] == [
        ("drafts/sections/intro.tex", 5, "Dry years differ [lin2020]."),
        (None, 5, "Back home [okafor2019]."),
    ]
    assert [(p.file, p.message) for p in draft.problems] == [
        ("drafts/paper.tex", "line 4: \\input of ../outside.tex refused (outside the draft's folder)")
    ]


def test_input_loop_and_unbalanced_brace_each_one_problem(tmp_path: Path) -> None:
    write(tmp_path, "refs.bib", BIB)
    write(tmp_path, "loop.tex", "Looped \\citep{lin2020}.\n\\input{paper}\n")
    paper = write(
        tmp_path,
        "paper.tex",
        "\\bibliography{refs}\n\\begin{document}\nOpen \\emph{brace.\n\n\\input{loop}\n\nLast \\citep{okafor2019}.\n"
        "\\end{document}\n",
    )
    draft = read(paper)
    assert [(p.file, p.message) for p in draft.problems] == [
        (
            "loop.tex",
            "line 2: \\input of paper.tex makes a loop (paper.tex -> loop.tex -> paper.tex); not followed again",
        ),
        ("paper.tex", "line 3: '{' is never closed; read as closed at the end of its paragraph"),
    ]
    assert [(c.file, c.line) for c in draft.claims] == [("loop.tex", 1), (None, 7)]


def test_every_marker_stands_in_its_claim_text(tmp_path: Path) -> None:
    # The pipeline strips Citation.marker from the claim text; each must be found there.
    write(tmp_path, "refs.bib", BIB)
    paper = write(
        tmp_path,
        "paper.tex",
        "\\bibliography{refs}\n\\begin{document}\n\\citeauthor{lin2020}~(\\citeyear{lin2020}) says so "
        "\\citep[see][p.~3]{okafor2019,lin2020}.\\footnote{Also \\citealp[ch.~2]{okafor2019}.}\n\\end{document}\n",
    )
    draft = read(paper)
    assert len(draft.claims) == 2
    for claim in draft.claims:
        for citation in claim.citations:
            assert citation.marker in claim.text
        assert "[" not in claim_query(claim)


MARKDOWN_TWIN = """# Carbon in fields

Soil carbon rose by 12% once *tillage* stopped (Okafor & Lin, 2019). A plain sentence.
Lin (2020) found a smaller effect in dry years – about a third – on Müller’s farm.
<!-- (Lin, 2020) hidden -->

## Results

The “dry-year” gap held for clay (Okafor & Lin, 2019, p. 4). Both hold (Okafor & Lin, 2019; Lin, 2020).

- Listed once more (Lin, 2020).

## References

Lin, C. (2020). Dry years. *Soil Journal*, 4, 2–5.

Okafor, A. B., & Lin, C. (2019). Carbon in untilled fields. *Soil Journal*, 3, 1–9.
"""

LATEX_TWIN = r"""\documentclass{article}
\usepackage{natbib}
\bibliography{refs}
\begin{document}
\section{Carbon in fields}
Soil carbon rose by 12\% once \emph{tillage} stopped \citep{okafor2019}. A plain sentence.
\citet{lin2020} found a smaller effect in dry years -- about a third -- on M\"uller's farm.
% \citep{lin2020} hidden

\section{Results}
The ``dry-year'' gap held for clay \citep[p.~4]{okafor2019}. Both hold \citep{okafor2019, lin2020}.
\begin{itemize}
\item Listed once more \citep{lin2020}.
\end{itemize}
\end{document}
"""


def test_latex_draft_and_its_markdown_twin_give_the_same_claims(tmp_path: Path) -> None:
    write(tmp_path, "refs.bib", BIB)
    latex = read(write(tmp_path, "paper.tex", LATEX_TWIN))
    markdown = read_markdown(MARKDOWN_TWIN, "paper.md")
    assert latex.problems == [] and markdown.problems == []

    def shape(draft: Draft) -> list[tuple[str, list[tuple[str | None, str | None]]]]:
        # Markers differ by design ("[okafor2019]" against "(Okafor & Lin, 2019)"), and the
        # apostrophe is typed "'" in LaTeX: compared modulo both.
        return [(claim_query(c).replace("’", "'"), [(x.key, x.locator) for x in c.citations]) for c in draft.claims]

    assert shape(latex) == shape(markdown)
    assert len(latex.claims) == 5


def test_a_bibliography_named_outside_the_drafts_folder_is_refused(tmp_path: Path) -> None:
    # Like \input, a file the draft names is read only inside the draft's folder; --bib is the user's own choice.
    secret = write(tmp_path, "elsewhere/secret.bib", BIB)
    draft = read(
        write(
            tmp_path,
            "paper/paper.tex",
            "\\bibliography{../elsewhere/secret}\n\\addbibresource{" + str(secret) + "}\n"
            "\\begin{document}\nCarbon rose \\citep{okafor2019}.\n\\end{document}\n",
        )
    )
    assert draft.references == []
    refused = [p for p in draft.problems if "outside the draft's folder" in p.message]
    assert len(refused) == 2 and all("give it with --bib" in p.message for p in refused)
    assert "named by \\bibliography in paper.tex, line 1" in refused[0].message
    assert "Soil Journal" not in " ".join(p.message for p in draft.problems)
    given = read(tmp_path / "paper" / "paper.tex", bib=secret)
    assert [r.key for r in given.references] == ["okafor2019", "lin2020"]


def test_groups_nested_past_the_limit_are_read_flat_with_one_line(tmp_path: Path) -> None:
    from tests.hostile import deep_latex

    draft = read(write(tmp_path, "paper.tex", deep_latex(5000)))
    deep = [p for p in draft.problems if "nesting_depth" in p.message]
    assert len(deep) == 1 and "groups nested over 100 deep" in deep[0].message
    assert draft.claims == []  # read flat, the \cite is words: nothing to check, and no crash
    shallow = read(write(tmp_path, "shallow.tex", deep_latex(50)))
    assert [c.text for c in shallow.claims] == ["Nests rose by 18% [a]."] and shallow.problems == []
