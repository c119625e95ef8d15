"""Quotations in a claim, checked word for word against the cited source.

A claim that puts words in quotation marks says the source printed exactly those words,
so a quotation is held to a stricter test than paraphrase: it must appear verbatim. Text
extracted from a PDF is rarely byte-identical to what a writer typed, though, so repairs
that cannot change the wording are made on both sides before comparing:

* whitespace runs collapse to one space, and a space the PDF text lost between two words
  ("F1as") is allowed; a line-end hyphen ("mar-\\nsh") is joined;
* ligatures (ﬁ ﬂ ﬀ ﬃ ﬄ) are unfolded; soft hyphens and zero-width characters dropped;
* curly, straight, low and angle quotation marks and apostrophes count as one mark,
  single or double alike (a quotation inside a quotation swaps double for single marks;
  APA 7th ed. 8.31, from memory);
* dash variants (‐ ‑ ‒ – — ― − and -, spaced or not, single or doubled) count as one;
* case is kept, except the first letter of the quotation and the first letter after an
  ellipsis, which a writer may change to fit the sentence (APA 7th ed. 8.31 and the
  Chicago Manual of Style 17th ed. 13.48–13.56 on ellipses; both from memory);
* the punctuation that ends the quotation may differ (APA 7th ed. 8.31, from memory);
* an ellipsis ("...", ". . .", "…", "[...]", "....") stands for any omitted text (up to
  a few thousand characters, so across a page break too), and a bracketed insertion
  ("[sic]", "[the bees]", "[T]he") stands for any short text, possibly none (APA 7th ed.
  8.31 on omissions and insertions; from memory).

Double quotation marks delimit a quotation: "…", “…”, „…“ or „…”, «…», »…«, and the
``…'' of TeX. Single marks are also apostrophes
("the bees' nests", "’tis"), so pairing them would cut quotations out of ordinary
prose; a writer who quotes with single marks is not checked (a known limit). Quoted
spans shorter than three words (a hyphenated word counts once) are scare quotes or
terms (the "so-called" sites, a "natural marsh"), not quotations of a source, and are
left alone. A quoted title of three words or more is checked like any quotation.

A quotation that is not verbatim is located fuzzily (rapidfuzz partial-ratio alignment
over the whole source, refined to whole words) and its word differences are listed, so
the report can say *what* drifted ("'most' for 'many'", "missing 'not'").
"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass
from itertools import pairwise

from sourcecheck.judge.quote_align import closest_span
from sourcecheck.judge.quote_text import (
    ELLIPSIS_MAX,
    INSERTION_MAX,
    Document,
    Segment,
    document,
    normalise,
)

#: Below this similarity (0..1) the closest span is too unlike the quotation to be the
#: passage the writer meant: the quotation is "not found in the source".
NOT_FOUND_BELOW = 0.60
#: Nor is it found when fewer than this share of its words appear, in order, in the span:
#: in a long source, character similarity alone reaches ~0.55 for unrelated prose of the
#: same vocabulary, so a half-matching span would be reported as a "drift" it is not.
MIN_WORDS_MATCHED = 0.5
#: At least this many words make a quoted span a quotation rather than a scare-quoted term.
MIN_QUOTE_WORDS = 3

# Quotation delimiters: straight and curly English marks, German low-high marks (closing
# with either curly mark, as typesetters differ), guillemets either way round, and the
# ``TeX'' convention a LaTeX draft may still carry.
_QUOTED = re.compile(
    r'"(?P<a>[^"\n]+)"'
    r"|“(?P<b>[^“”\n]+)[”“]"
    r"|„(?P<c>[^„“”\n]+)[“”]"
    r"|«(?P<d>[^«»\n]+)»"
    r"|»(?P<e>[^«»\n]+)«"
    r"|``(?P<f>[^`'\n]+(?:'(?!')[^`'\n]*)*)''"
)
_COUNTED_WORD = re.compile(r"[^\W_]+(?:['-][^\W_]+)*")  # "so-called" is one word when counting

_ELLIPSIS = r"\[\s*(?:…|\.(?:\s?\.){2,3})\s*\]|…|\.(?:\s?\.){2,3}"
_GAP = re.compile(rf"(?P<ell>{_ELLIPSIS})|(?P<ins>\[[^\[\]]{{0,80}}\])")
_EDGE_PUNCT = " ,;:."
_END_PUNCT = " ,;:.!?"


@dataclass(frozen=True)
class QuoteFinding:
    """What became of one quotation of a claim in its cited source.

    ``closest`` is the source text that matched (when ``verbatim``) or came closest
    (when not), tidied for display; for a quotation with an ellipsis it runs from the
    first quoted word to the last, omitted text included. It is None when the quotation
    was not found at all, and so is ``page`` (the page the span starts on).
    ``similarity`` is 1.0 for a verbatim quotation; for one not found it is the score of
    the rejected span, which may pass NOT_FOUND_BELOW when too few words matched.
    """

    quote: str
    verbatim: bool
    closest: str | None
    similarity: float
    page: int | None
    differences: tuple[str, ...] = ()


# --- quotations ------------------------------------------------------------------------


def quotations(claim: str) -> list[str]:
    """The quoted spans of ``claim`` that are quotations: in double marks, three words or more.

    Bracketed insertions do not count towards the three words: they are the writer's.
    """
    found: list[str] = []
    for match in _QUOTED.finditer(claim):
        quote = next(group for group in match.groups() if group is not None).strip()
        if len(_COUNTED_WORD.findall(_GAP.sub(" ", quote))) >= MIN_QUOTE_WORDS:
            found.append(quote)
    return found


def _segments(quote: str) -> list[Segment]:
    """Split a normalised quotation at its ellipses and bracketed insertions."""
    parts: list[tuple[str, str | None]] = []  # (literal, gap kind that follows it)
    pos = 0
    for match in _GAP.finditer(quote):
        parts.append((quote[pos : match.start()], "ell" if match.group("ell") else "ins"))
        pos = match.end()
    parts.append((quote[pos:], None))

    segments: list[Segment] = []
    gap: str | None = None  # the gap before the literal being read
    space_before = False
    for literal, gap_after in parts:
        text = literal
        if gap == "ell":
            text = text.lstrip(_EDGE_PUNCT)
        if gap_after == "ell":
            text = text.rstrip(_EDGE_PUNCT)
        text = text.strip(" ")
        if not text:
            # Two omissions in a row ("[T]" then nothing): one gap, the wider kind.
            if gap_after is not None:
                gap = "ell" if "ell" in (gap, gap_after) else gap_after
                space_before = space_before or literal.startswith(" ") or not segments
            continue
        if not segments:
            segments.append(Segment(text, flex_case=True))
        else:
            boundary = gap == "ell"
            segments.append(
                Segment(
                    text,
                    gap=gap,
                    word_before=boundary or space_before,
                    word_after=boundary or literal.startswith(" "),
                    flex_case=gap == "ell",
                )
            )
        gap = gap_after
        space_before = literal.endswith(" ")
    if segments:
        last = segments[-1]
        segments[-1] = Segment(
            last.text.rstrip(_END_PUNCT) or last.text, last.gap, last.word_before, last.word_after, last.flex_case
        )
    return segments


def _literal_pattern(text: str, flex_case: bool) -> str:
    """A regex for ``text`` as printed, allowing what the source repairs may have lost."""
    out: list[str] = []
    for i, char in enumerate(text):
        if i == 0 and flex_case and char.lower() != char.upper():
            out.append(f"[{re.escape(char.upper())}{re.escape(char.lower())}]")
        elif char == "-" and 0 < i < len(text) - 1 and text[i - 1].isalnum() and text[i + 1].isalnum():
            out.append("-?")  # a real hyphen at a line end was joined like a break hyphen
        elif char == " ":
            out.append(" ?")  # PDF text can lose the space between two words ("F1as the baseline")
        else:
            out.append(re.escape(char))
    return "".join(out)


def _all_present(segments: list[Segment], text: str) -> bool:
    """Whether every segment occurs somewhere: a cheap test that spares the gapped search.

    The gapped regex scans up to an ellipsis' reach after every occurrence of the first
    segment, which is slow on a long source when a later segment is absent altogether.
    """
    return all(re.search(_literal_pattern(s.text, s.flex_case), text) for s in segments[1:])


def _verbatim_pattern(segments: list[Segment]) -> re.Pattern[str]:
    """One regex for the whole quotation; each gap is atomic so the search stays linear."""
    pattern = _literal_pattern(segments[0].text, segments[0].flex_case)
    for previous, segment in pairwise(segments):
        limit = ELLIPSIS_MAX if segment.gap == "ell" else INSERTION_MAX
        if segment.word_before and previous.text[-1].isalnum():
            pattern += r"(?!\w)"
        start = r"(?<!\w)" if segment.word_after and segment.text[0].isalnum() else ""
        pattern += f"(?>.{{0,{limit}}}?{start}{_literal_pattern(segment.text, segment.flex_case)})"
    return re.compile(pattern, re.DOTALL)


# --- public ----------------------------------------------------------------------------


def _check(quote: str, doc: Document) -> QuoteFinding:
    segments = _segments(normalise(quote)[0])
    if not segments or not doc.text:
        return QuoteFinding(quote, False, None, 0.0, None)
    match = _verbatim_pattern(segments).search(doc.text) if _all_present(segments, doc.text) else None
    if match:
        return QuoteFinding(quote, True, doc.shown(match.start(), match.end()), 1.0, doc.page_at(match.start()))
    closest = closest_span(segments, doc)
    if closest is None or closest[2] < NOT_FOUND_BELOW or closest[3] < MIN_WORDS_MATCHED:
        return QuoteFinding(quote, False, None, round(closest[2], 3) if closest else 0.0, None)
    start, end, similarity, _, differences = closest
    return QuoteFinding(
        quote, False, doc.shown(start, end), round(similarity, 3), doc.page_at(start), tuple(differences)
    )


def check_quotes(claim: str, pages: Sequence[tuple[int, str]]) -> list[QuoteFinding]:
    """Check each quotation of ``claim`` against the cited source's ``pages``.

    ``pages`` holds (page number, full page text) in reading order. The pages are
    searched as one text, so a quotation that runs across a page break is found; its
    page is the page it starts on.
    """
    quotes = quotations(claim)
    if not quotes:
        return []
    doc = document(tuple((int(number), text or "") for number, text in pages))
    return [_check(quote, doc) for quote in quotes]


_DIFFERENCE = re.compile(r"^'(?P<mine>.*)' for '(?P<theirs>.*)'$|^(?P<kind>missing|added) '(?P<words>.*)'$")


def drift_message(finding: QuoteFinding) -> str:
    """One line for the report: where the quotation was found and how it drifted."""
    where = f"p. {finding.page}" if finding.page is not None else "the source"
    if finding.verbatim:
        return f"quoted text found verbatim on {where}"
    if finding.closest is None:
        return "quoted text not found in the source"
    said: list[str] = []
    for difference in finding.differences:
        match = _DIFFERENCE.match(difference)
        if match is None:
            said.append(difference)
        elif match.group("kind"):
            said.append(f'{match.group("kind")} "{match.group("words")}"')
        else:
            said.append(f'"{match.group("mine")}" for "{match.group("theirs")}"')
    if not said:
        return f"quoted text differs from {where} in punctuation or spacing only"
    return f"quoted text differs from {where}: " + "; ".join(said)
