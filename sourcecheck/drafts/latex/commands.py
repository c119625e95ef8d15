"""What the LaTeX reader knows about commands and environments, as plain tables.

Kept apart from the converter so that teaching the reader one more package's macro is a
one-line change here. Anything not listed is treated the generic way: the command is
dropped and the text of its braced arguments kept, which is right for most text macros.
"""

from __future__ import annotations

# natbib (Daly's manual) and biblatex (Lehman et al., section 3.9) citation commands,
# plus apacite's, which take one key list after up to two optional notes. Capitalised
# forms (\Citet, \Textcite) are looked up with the first letter lowered.
CITE_COMMANDS = frozenset(
    [
        "cite",
        "citep",
        "citet",
        "citealp",
        "citealt",
        "citeauthor",
        "citefullauthor",
        "citeyear",
        "citeyearpar",
        "citenum",
        "citetitle",
        "citetalias",
        "citepalias",
        "parencite",
        "textcite",
        "autocite",
        "footcite",
        "footcitetext",
        "smartcite",
        "supercite",
        "fullcite",
        "footfullcite",
        "citeA",
        "citeNP",
        "citeyearNP",
        "shortcite",
        "shortciteA",
        "shortciteNP",
    ]
)
# biblatex's multicite forms: "\parencites(pre)(post)[pre][post]{a}[post]{b}".
MULTI_CITE_COMMANDS = frozenset(
    ["cites", "parencites", "textcites", "autocites", "footcites", "smartcites", "supercites"]
)
# natbib's "\citeauthor{k} (\citeyear{k})" names one work once: read as one citation.
AUTHOR_ONLY = frozenset(["citeauthor", "citefullauthor"])
YEAR_ONLY = frozenset(["citeyear", "citeyearpar"])

# Sectioning commands: their argument is a heading, never a claim.
HEADINGS = frozenset(
    [
        "part",
        "chapter",
        "section",
        "subsection",
        "subsubsection",
        "paragraph",
        "subparagraph",
        "frametitle",
        "title",
        "subtitle",
        "author",
        "date",
        "thanks",
        "addsec",
        "minisec",
    ]
)
# Commands whose argument is a few words: a group of theirs over a blank line is a typo.
SHORT_ARGUMENTS = frozenset(
    [
        *HEADINGS,
        "emph",
        "textbf",
        "textit",
        "texttt",
        "textsc",
        "textsf",
        "textrm",
        "textsl",
        "textup",
        "underline",
        "mbox",
        "enquote",
        "label",
        "url",
        "href",
        "ref",
        "eqref",
        "autoref",
        "cref",
        "Cref",
        "pageref",
        "nameref",
    ]
)
# Cross-references print a number we cannot know; a placeholder keeps the sentence whole.
REFERENCES = frozenset(
    ["ref", "eqref", "autoref", "Autoref", "cref", "Cref", "pageref", "nameref", "vref", "Vref", "cpageref"]
)
REFERENCE_PLACEHOLDER = "[ref]"
MATH_PLACEHOLDER = "[math]"
# Notes that TeX sets apart from the sentence: their text is a block of its own.
NOTES = frozenset(["footnote", "footnotetext", "marginpar", "endnote", "sidenote"])

# Commands whose arguments print nothing, by how many braced arguments they take
# ("d" dropped, "k" kept); optional [..] arguments around them are always dropped.
ARGUMENTS: dict[str, str] = {
    "label": "d",
    "includegraphics": "d",
    "vspace": "d",
    "hspace": "d",
    "setlength": "dd",
    "addtolength": "dd",
    "setcounter": "dd",
    "addtocounter": "dd",
    "stepcounter": "d",
    "refstepcounter": "d",
    "newcounter": "d",
    "usepackage": "d",
    "RequirePackage": "d",
    "documentclass": "d",
    "bibliographystyle": "d",
    "bibliography": "d",
    "addbibresource": "d",
    "nocite": "d",
    "pagestyle": "d",
    "thispagestyle": "d",
    "pagenumbering": "d",
    "index": "d",
    "glossary": "d",
    "hypersetup": "d",
    "graphicspath": "d",
    "definecolor": "ddd",
    "color": "d",
    "textcolor": "dk",
    "colorbox": "dk",
    "fcolorbox": "ddk",
    "fontsize": "dd",
    "linespread": "d",
    "input": "d",
    "include": "d",
    "includeonly": "d",
    "subfile": "d",
    "phantom": "d",
    "hphantom": "d",
    "vphantom": "d",
    "rule": "dd",
    "raisebox": "dk",
    "href": "dk",
    "hyperref": "k",
    "foreignlanguage": "dk",
    "selectlanguage": "d",
    "addcontentsline": "ddd",
    "markboth": "dd",
    "markright": "d",
    "captionsetup": "d",
    "setcitestyle": "d",
    "geometry": "d",
    "newtheorem": "dd",
    "theoremstyle": "d",
    "numberwithin": "dd",
    "DeclareMathOperator": "dd",
    "ExecuteBibliographyOptions": "d",
    "urlstyle": "d",
    "pdfbookmark": "dd",
    "cline": "d",
    "multicolumn": "ddk",
    "multirow": "ddk",
    "newenvironment": "ddd",
    "renewenvironment": "ddd",
    "bibitem": "d",
    "cmidrule": "d",
    "enlargethispage": "d",
    "hyphenation": "d",
    "ensuremath": "d",
}
# Definitions: the new name, its options and its body print nothing here.
DEFINITIONS = frozenset(
    ["newcommand", "renewcommand", "providecommand", "DeclareRobustCommand", "def", "gdef", "edef", "xdef"]
)
# Commands that end the paragraph: vertical space and page breaks.
BREAKS = frozenset(
    ["par", "bigskip", "medskip", "smallskip", "newpage", "clearpage", "cleardoublepage", "pagebreak", "vfill"]
)
SPACES = frozenset(["newline", "linebreak", "quad", "qquad", "hfill", "enspace", "space", "nobreakspace"])

# Control words that print a letter or symbol.
SYMBOLS: dict[str, str] = {
    "ss": "ß",
    "ae": "æ",
    "AE": "Æ",
    "oe": "œ",
    "OE": "Œ",
    "aa": "å",
    "AA": "Å",
    "o": "ø",
    "O": "Ø",
    "l": "ł",
    "L": "Ł",
    "i": "ı",
    "j": "ȷ",
    "ldots": "…",
    "dots": "…",
    "textellipsis": "…",
    "textendash": "–",
    "textemdash": "—",
    "textquoteleft": "‘",
    "textquoteright": "’",
    "textquotedblleft": "“",
    "textquotedblright": "”",
    "guillemotleft": "«",
    "guillemotright": "»",
    "S": "§",
    "P": "¶",
    "dag": "†",
    "ddag": "‡",
    "copyright": "©",
    "textcopyright": "©",
    "textregistered": "®",
    "texttrademark": "™",
    "textdegree": "°",
    "pounds": "£",
    "euro": "€",
    "textbackslash": "\\",
    "textasciitilde": "~",
    "textasciicircum": "^",
    "textbar": "|",
    "textless": "<",
    "textgreater": ">",
    "textunderscore": "_",
    "textpercent": "%",
    "LaTeX": "LaTeX",
    "LaTeXe": "LaTeX2e",
    "TeX": "TeX",
    "BibTeX": "BibTeX",
    "etal": "et al.",
}
# Accent commands and the Unicode combining mark each puts on its letter (Lamport, "LaTeX:
# A Document Preparation System", table of accents; from memory).
ACCENTS: dict[str, str] = {
    "'": "\u0301",
    "`": "\u0300",
    "^": "\u0302",
    '"': "\u0308",
    "~": "\u0303",
    "=": "\u0304",
    ".": "\u0307",
    "u": "\u0306",
    "v": "\u030c",
    "H": "\u030b",
    "c": "\u0327",
    "k": "\u0328",
    "r": "\u030a",
    "d": "\u0323",
    "b": "\u0331",
    "t": "\u0361",
}
# Control symbols: "\%" prints "%" and so on; None means "prints nothing".
CONTROL_SYMBOLS: dict[str, str | None] = {
    "%": "%",
    "&": "&",
    "$": "$",
    "#": "#",
    "_": "_",
    "{": "{",
    "}": "}",
    " ": " ",
    "\n": " ",
    "\t": " ",
    ",": " ",
    ";": " ",
    ":": " ",
    ">": " ",
    "!": None,
    "/": None,
    "@": None,
    "-": None,
    "|": "‖",
}

# Environments set as mathematics: one placeholder stands for the whole display.
MATH_ENVIRONMENTS = frozenset(
    name + star
    for name in [
        "equation",
        "align",
        "alignat",
        "flalign",
        "gather",
        "multline",
        "eqnarray",
        "displaymath",
        "math",
        "dmath",
        "subequations",
    ]
    for star in ("", "*")
)
# Environments with no prose (pictures, code, the reference list read elsewhere).
DROPPED_ENVIRONMENTS = frozenset(
    ["tikzpicture", "pgfpicture", "picture", "algorithmic", "thebibliography", "tabbing*", "lstlisting", "minted"]
)
# Braced arguments that follow "\begin{name}" and print nothing (the column spec of a
# tabular, the width of a minipage).
ENVIRONMENT_ARGUMENTS: dict[str, int] = {
    "tabular": 1,
    "tabular*": 2,
    "tabularx": 2,
    "tabulary": 2,
    "longtable": 1,
    "array": 1,
    "minipage": 1,
    "multicols": 1,
    "wrapfigure": 2,
    "wraptable": 2,
    "subfigure": 1,
    "subtable": 1,
    "otherlanguage": 1,
    "otherlanguage*": 1,
}
# Environments whose rows ("\\") are separate lines of text, not one sentence.
TABULAR_ENVIRONMENTS = frozenset(["tabular", "tabular*", "tabularx", "tabulary", "longtable", "array", "tabbing"])
