"""Tests for compiled bibliographies (.bbl) from BibTeX styles and from biber."""

from __future__ import annotations

from sourcecheck.drafts.bibliography.bbl import parse_bbl

# The shape natbib's author-year styles write (from memory: \bibitem[short(year)long]{key},
# \newblock between name, title and publication blocks, \natexlab for the year letter).
NATBIB = r"""\begin{thebibliography}{3}
\providecommand{\natexlab}[1]{#1}

\bibitem[Okafor et~al.(2019{\natexlab{a}})Okafor, Lin, and Brandt]{okafor2019}
Ada~B. Okafor, Chen Lin, and Dieter Brandt.
\newblock Three-author work on {DNA}.
\newblock \emph{Journal of Fields}, 3:\penalty0 5--9, 2019{\natexlab{a}}.
\newblock \doi{10.1234/ABCD}.

\bibitem[van~der Berg(2020)]{vdb2020}
Jan van~der Berg.
\newblock Particles.
\newblock In \emph{Proc. of Things}, pages 1--2, 2020.

\bibitem{plain3}
J.~M{\"u}ller and A.~Smith.
\newblock A title: with colon.
\newblock \emph{J. Stuff}, 1(2):3--4, 2001.

\end{thebibliography}
"""

# The shape biber writes for biblatex (from memory: \entry{key}{type}{}, \name lists of
# family=/given=/prefix= parts, \field{name}{value}, \verb{doi} ... \endverb).
BIBER = r"""\refsection{0}
  \datalist[entry]{nty/global//global/global}
    \entry{okafor2019}{article}{}
      \name{author}{2}{}{%
        {{un=0,uniquepart=base,hash=abc}{%
           family={Okafor},
           familyi={O\bibinitperiod},
           given={Ada\bibnamedelima B.},
           giveni={A\bibinitperiod\bibinitdelim B\bibinitperiod}}}%
        {{hash=def}{%
           family={Berg},
           given={Jan},
           prefix={van\bibnamedelima der},
           prefixi={v\bibinitperiod}}}%
      }
      \field{labelyear}{2019}
      \field{journaltitle}{Journal of {F}ields}
      \field{title}{Yields in Stra{\ss}e}
      \verb{doi}
      \verb 10.1234/ABCD
      \endverb
    \endentry
    \entry{who2020}{report}{}
      \name{author}{1}{}{%
        {{hash=x}{family={{World Health Organization}}}}%
      }
      \list{publisher}{1}{%
        {WHO Press}%
      }
      \field{title}{Report}
      \field{year}{2020}
    \endentry
  \enddatalist
\endrefsection
"""


def test_natbib_bibitems() -> None:
    refs, problems = parse_bbl(NATBIB, "paper.bbl")
    assert problems == []
    assert [r.key for r in refs] == ["okafor2019", "vdb2020", "plain3"]
    first = refs[0]
    assert first.authors == ("Okafor", "Lin", "Brandt")
    assert (first.year, first.title, first.doi) == (2019, "Three-author work on DNA", "10.1234/abcd")
    assert first.text.startswith(
        "Okafor, A. B.; Lin, C.; Brandt, D. (2019). Three-author work on DNA. Journal of Fields."
    )
    assert first.line == 4
    assert refs[1].authors == ("van der Berg",)
    assert refs[1].text == "van der Berg, J. (2020). Particles. Proc. of Things."


def test_plain_style_bibitem_without_label() -> None:
    refs, _ = parse_bbl(NATBIB, "paper.bbl")
    plain = refs[2]
    assert plain.authors == ("Müller", "Smith")
    assert (plain.year, plain.title) == (2001, "A title: with colon")


def test_biber_entries() -> None:
    refs, problems = parse_bbl(BIBER, "paper.bbl")
    assert problems == []
    assert [r.key for r in refs] == ["okafor2019", "who2020"]
    first = refs[0]
    assert first.authors == ("Okafor", "van der Berg")
    assert (first.year, first.title, first.doi) == (2019, "Yields in Straße", "10.1234/abcd")
    assert "Journal of Fields" in first.text
    assert refs[1].authors == ("World Health Organization",)
    assert refs[1].text == "World Health Organization (2020). Report. WHO Press."


def test_bad_bbl_input() -> None:
    refs, problems = parse_bbl(
        "\\bibitem{}\nNo key here.\n\\bibitem{ok} A. Person. \\newblock T. \\newblock J, 2000.", "x.bbl"
    )
    assert [r.key for r in refs] == ["ok"]
    assert [p.message for p in problems] == ["\\bibitem at line 1 has no key; skipped"]
    refs, problems = parse_bbl("just some text", "x.bbl")
    assert refs == []
    assert problems[0].message.startswith("no \\bibitem or \\entry found")
    refs, problems = parse_bbl("\\entry{cut}{misc}{}\n \\field{title}{Cut}\n", "x.bbl")
    assert [(r.key, r.title) for r in refs] == [("cut", "Cut")]
    assert "no \\endentry" in problems[0].message
