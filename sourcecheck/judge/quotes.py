"""Quotations in a claim, checked word for word against the cited source.

A claim that puts words in quotation marks says the source printed exactly those words,
so a quotation is held to a stricter test than paraphrase: it must appear verbatim. Text
extracted from a PDF is rarely byte-identical to what a writer typed, though, so repairs
that cannot change the wording are made on both sides before comparing:

* whitespace runs collapse to one space; a line-end hyphen ("mar-\\nsh") is joined;
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
from bisect import bisect_right
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from difflib import SequenceMatcher
from functools import lru_cache
from itertools import pairwise

from rapidfuzz import fuzz

#: Below this similarity (0..1) the closest span is too unlike the quotation to be the
#: passage the writer meant: the quotation is "not found in the source".
NOT_FOUND_BELOW = 0.60
#: Nor is it found when fewer than this share of its words appear, in order, in the span:
#: in a long source, character similarity alone reaches ~0.55 for unrelated prose of the
#: same vocabulary, so a half-matching span would be reported as a "drift" it is not.
MIN_WORDS_MATCHED = 0.5
#: At least this many words make a quoted span a quotation rather than a scare-quoted term.
MIN_QUOTE_WORDS = 3
#: How much omitted text an ellipsis may stand for, and a bracketed insertion replace.
_ELLIPSIS_MAX = 3000
_INSERTION_MAX = 60

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
_WORD = re.compile(r"[^\W_]+(?:'[^\W_]+)*")
_COUNTED_WORD = re.compile(r"[^\W_]+(?:['-][^\W_]+)*")  # "so-called" is one word when counting

_LIGATURES = {"ﬀ": "ff", "ﬁ": "fi", "ﬂ": "fl", "ﬃ": "ffi", "ﬄ": "ffl", "ﬅ": "st", "ﬆ": "st"}
_QUOTE_MARKS = "'\"‘’‚‛′″“”„‟«»‹›`´"
_DASH_MARKS = "‐‑‒–—―−"
_FOLD = str.maketrans(
    {
        **dict.fromkeys(_QUOTE_MARKS, "'"),
        **dict.fromkeys(_DASH_MARKS, "-"),
        **dict.fromkeys("\t\v\f\u00a0\u2002\u2003\u2009\u202f\u3000", " "),
        "\r": "\n",
    }
)
_LIGATURE = re.compile("[" + "".join(_LIGATURES) + "]")
_INVISIBLE = re.compile("[\u00ad\u200b\u200c\u200d\u2060\ufeff]")
_LINE_END_HYPHEN = re.compile(r"(?<=[^\W\d_])[-‐‑][ \t]*\n\s*(?=[^\W\d_])")
_DASH_RUN = re.compile(r"\s*-+\s*")
_SPACES = re.compile(r"\s+")

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


@dataclass(frozen=True)
class _Segment:
    """A run of quoted words between two omissions, and how it joins the run before it."""

    text: str
    gap: str | None = None  # "ell" or "ins": what separates it from the previous segment
    word_before: bool = False  # the previous segment must end at a word boundary
    word_after: bool = False  # this segment must start at a word boundary
    flex_case: bool = False  # its first letter may differ in case


@dataclass(frozen=True)
class _Document:
    """A source's pages joined and normalised, with the way back to pages and raw text."""

    text: str
    origin: tuple[int, ...]  # index in ``raw`` of each character of ``text``
    raw: str
    page_starts: tuple[int, ...]
    page_numbers: tuple[int, ...]

    def page_at(self, index: int) -> int | None:
        if not self.page_numbers or not self.text:
            return None
        raw_index = self.origin[min(index, len(self.origin) - 1)]
        return self.page_numbers[bisect_right(self.page_starts, raw_index) - 1]

    def shown(self, start: int, end: int) -> str:
        """The raw source text behind ``text[start:end]`` (widened to whole words), repaired but not folded."""
        while start > 0 and self.text[start - 1].isalnum():
            start -= 1
        while end < len(self.text) and self.text[end].isalnum():
            end += 1
        raw = self.raw[self.origin[start] : self.origin[end - 1] + 1]
        return _normalise(raw, fold=False)[0]


# --- normalisation ---------------------------------------------------------------------


def _resub(
    pattern: re.Pattern[str], repl: Callable[[re.Match[str]], str], text: str, origin: list[int]
) -> tuple[str, list[int]]:
    """``pattern.sub`` that keeps, for every output character, the index it came from."""
    pieces: list[str] = []
    mapped: list[int] = []
    pos = 0
    for match in pattern.finditer(text):
        pieces.append(text[pos : match.start()])
        mapped.extend(origin[pos : match.start()])
        new = repl(match)
        pieces.append(new)
        mapped.extend([origin[match.start()]] * len(new))
        pos = match.end()
    if not pieces:
        return text, origin
    pieces.append(text[pos:])
    mapped.extend(origin[pos:])
    return "".join(pieces), mapped


def _normalise(text: str, fold: bool = True) -> tuple[str, list[int]]:
    """Repair ``text`` (see the module docstring) and map each output char to its input index.

    With ``fold`` false only the repairs a reader would not notice are made (ligatures,
    hyphenation, spacing), which is what a displayed span should look like.
    """
    origin = list(range(len(text)))
    if fold:
        text = text.translate(_FOLD)
    text, origin = _resub(_INVISIBLE, lambda m: "", text, origin)
    text, origin = _resub(_LIGATURE, lambda m: _LIGATURES[m.group()], text, origin)
    text, origin = _resub(_LINE_END_HYPHEN, lambda m: "", text, origin)
    if fold:
        text, origin = _resub(_DASH_RUN, lambda m: "-", text, origin)
    text, origin = _resub(_SPACES, lambda m: " ", text, origin)
    lead = len(text) - len(text.lstrip(" "))
    text = text.strip(" ")
    return text, origin[lead : lead + len(text)]


@lru_cache(maxsize=16)
def _document(pages: tuple[tuple[int, str], ...]) -> _Document:
    """Normalise a source once, however many claims quote it."""
    starts: list[int] = []
    pos = 0
    for _, page_text in pages:
        starts.append(pos)
        pos += len(page_text) + 1
    raw = "\n".join(page_text for _, page_text in pages)
    text, origin = _normalise(raw)
    return _Document(text, tuple(origin), raw, tuple(starts), tuple(number for number, _ in pages))


# --- quotations ------------------------------------------------------------------------


def _words(text: str) -> list[str]:
    return _WORD.findall(text)


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


def _segments(quote: str) -> list[_Segment]:
    """Split a normalised quotation at its ellipses and bracketed insertions."""
    parts: list[tuple[str, str | None]] = []  # (literal, gap kind that follows it)
    pos = 0
    for match in _GAP.finditer(quote):
        parts.append((quote[pos : match.start()], "ell" if match.group("ell") else "ins"))
        pos = match.end()
    parts.append((quote[pos:], None))

    segments: list[_Segment] = []
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
            segments.append(_Segment(text, flex_case=True))
        else:
            boundary = gap == "ell"
            segments.append(
                _Segment(
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
        segments[-1] = _Segment(
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
        else:
            out.append(re.escape(char))
    return "".join(out)


def _all_present(segments: list[_Segment], text: str) -> bool:
    """Whether every segment occurs somewhere: a cheap test that spares the gapped search.

    The gapped regex scans up to an ellipsis' reach after every occurrence of the first
    segment, which is slow on a long source when a later segment is absent altogether.
    """
    return all(re.search(_literal_pattern(s.text, s.flex_case), text) for s in segments[1:])


def _verbatim_pattern(segments: list[_Segment]) -> re.Pattern[str]:
    """One regex for the whole quotation; each gap is atomic so the search stays linear."""
    pattern = _literal_pattern(segments[0].text, segments[0].flex_case)
    for previous, segment in pairwise(segments):
        limit = _ELLIPSIS_MAX if segment.gap == "ell" else _INSERTION_MAX
        if segment.word_before and previous.text[-1].isalnum():
            pattern += r"(?!\w)"
        start = r"(?<!\w)" if segment.word_after and segment.text[0].isalnum() else ""
        pattern += f"(?>.{{0,{limit}}}?{start}{_literal_pattern(segment.text, segment.flex_case)})"
    return re.compile(pattern, re.DOTALL)


# --- the closest span when not verbatim ------------------------------------------------


def _lower_first(text: str) -> str:
    return text[:1].lower() + text[1:]


def _word_spans(doc: str, lo: int, hi: int) -> list[re.Match[str]]:
    while lo > 0 and doc[lo - 1].isalnum():
        lo -= 1
    while hi < len(doc) and doc[hi].isalnum():
        hi += 1
    return list(_WORD.finditer(doc, lo, hi))


def _align(segment: str, doc: str, lo: int, hi: int) -> tuple[int, int] | None:
    """The whole-word span of ``doc[lo:hi]`` closest to ``segment``, or None."""
    lo, hi = max(0, lo), min(len(doc), hi)
    if lo >= hi:
        return None
    coarse = fuzz.partial_ratio_alignment(segment, doc[lo:hi])
    if coarse is None or coarse.score == 0:
        return None
    start, end = lo + coarse.dest_start, lo + coarse.dest_end
    # Words dropped from (or added to) the quotation make the source span longer (or
    # shorter) than the quotation; look a little either side and let the word match decide.
    pad = max(20, len(segment) // 3)
    source_words = _word_spans(doc, max(lo, start - pad), min(hi, end + pad))
    quote_words = [w.lower() for w in _words(segment)]
    if not source_words or not quote_words:
        return None
    matcher = SequenceMatcher(None, quote_words, [w.group().lower() for w in source_words], autojunk=False)
    blocks = [b for b in matcher.get_matching_blocks() if b.size]
    if not blocks:
        return None  # letters in common but not one word: nothing here was quoted
    first, last = blocks[0], blocks[-1]
    # A changed first or last word is still part of the span: widen over as many
    # unmatched source words as the quotation has unmatched words at that end.
    begin = first.b - min(first.a, first.b)
    tail = len(quote_words) - (last.a + last.size)
    finish = min(len(source_words) - 1, last.b + last.size - 1 + tail)
    return source_words[begin].start(), source_words[finish].end()


def _differences(quote: str, span: str, flex_case: bool) -> tuple[list[str], int]:
    """Word differences between a quoted segment and its source span, and the words in common."""
    quoted, printed = _words(quote), _words(span)
    matcher = SequenceMatcher(None, [w.lower() for w in quoted], [w.lower() for w in printed], autojunk=False)
    found: list[str] = []
    common = 0
    for op, a1, a2, b1, b2 in matcher.get_opcodes():
        if op == "equal":
            common += a2 - a1
            for offset in range(a2 - a1):
                mine, theirs = quoted[a1 + offset], printed[b1 + offset]
                first = a1 + offset == 0 and flex_case
                if mine != theirs and not (first and _lower_first(mine) == _lower_first(theirs)):
                    found.append(f"'{mine}' for '{theirs}'")
        elif op == "replace":
            found.append(f"'{' '.join(quoted[a1:a2])}' for '{' '.join(printed[b1:b2])}'")
        elif op == "delete":
            found.append(f"added '{' '.join(quoted[a1:a2])}'")
        else:
            found.append(f"missing '{' '.join(printed[b1:b2])}'")
    return found, common


def _closest(segments: list[_Segment], doc: _Document) -> tuple[int, int, float, float, list[str]] | None:
    """Align every segment near the longest one.

    Returns the span, the similarity, the share of quoted words found and the differences.
    """
    anchor = max(range(len(segments)), key=lambda i: len(segments[i].text))
    spans: dict[int, tuple[int, int] | None] = {anchor: _align(segments[anchor].text, doc.text, 0, len(doc.text))}
    if spans[anchor] is None:
        return None
    previous = spans[anchor]
    for i in range(anchor + 1, len(segments)):
        limit = _ELLIPSIS_MAX if segments[i].gap == "ell" else _INSERTION_MAX
        lo = previous[1] if previous else 0
        spans[i] = _align(segments[i].text, doc.text, lo, lo + limit + 2 * len(segments[i].text))
        previous = spans[i] or previous
    following = spans[anchor]
    for i in range(anchor - 1, -1, -1):
        limit = _ELLIPSIS_MAX if segments[i + 1].gap == "ell" else _INSERTION_MAX
        hi = following[0] if following else len(doc.text)
        spans[i] = _align(segments[i].text, doc.text, hi - limit - 2 * len(segments[i].text), hi)
        following = spans[i] or following

    total = sum(len(s.text) for s in segments)
    score = 0.0
    common = 0
    differences: list[str] = []
    for i, segment in enumerate(segments):
        span = spans[i]
        if span is None:
            differences.append(f"added '{' '.join(_words(segment.text))}'")
            continue
        printed = doc.text[span[0] : span[1]]
        mine = _lower_first(segment.text) if segment.flex_case else segment.text
        theirs = _lower_first(printed) if segment.flex_case else printed
        score += len(segment.text) * fuzz.ratio(mine, theirs) / 100
        found, shared = _differences(segment.text, printed, segment.flex_case)
        differences.extend(found)
        common += shared
    located = [s for s in spans.values() if s is not None]
    words = sum(len(_words(s.text)) for s in segments) or 1
    return min(s[0] for s in located), max(s[1] for s in located), score / total, common / words, differences


# --- public ----------------------------------------------------------------------------


def _check(quote: str, doc: _Document) -> QuoteFinding:
    segments = _segments(_normalise(quote)[0])
    if not segments or not doc.text:
        return QuoteFinding(quote, False, None, 0.0, None)
    match = _verbatim_pattern(segments).search(doc.text) if _all_present(segments, doc.text) else None
    if match:
        return QuoteFinding(quote, True, doc.shown(match.start(), match.end()), 1.0, doc.page_at(match.start()))
    closest = _closest(segments, doc)
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
    doc = _document(tuple((int(number), text or "") for number, text in pages))
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
