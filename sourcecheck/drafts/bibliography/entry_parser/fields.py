"""Turning a labelled entry (spans of author, title, date, ...) into bibliographic fields.

The same decoding reads the tagger's spans and, when measuring, the hand-labelled ones, so
the cross-validation scores measure the labelling. Decoding strips the punctuation a style
wraps fields in, joins a title the tagger broke in two around a stray word or two, takes
the year from the date span (or from a Vancouver "2003;39:" volume), and reads family names
from author spans (or from an editor span that stands in for the authors of an edited book).
"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass

from sourcecheck.drafts.bibliography.entry_parser.author_names import family_names
from sourcecheck.drafts.bibliography.entry_parser.tokens import Token
from sourcecheck.text import find_doi

_YEAR_RE = re.compile(r"(?<![\d/.])(?P<year>1[5-9]\d\d|20[0-4]\d)(?P<suffix>[a-z])?(?![\d/])")
_VANCOUVER_YEAR_RE = re.compile(r"^\(?(?P<year>1[5-9]\d\d|20[0-4]\d)(?P<suffix>[a-z])?\)?\s*[;:]")
_OPENERS = "([{“\"‘'«„<"
# ". In Book", "In: Book", ", in Book": the container of a chapter or paper begins.
_IN_MARKER_RE = re.compile(r"(?<=[.?!”\"])\s+(?:In|Dans|Im)\b:?\s+(?=\S)|,\s+in:?\s+(?=[A-Z])")
# "Title, 1997. Journal ...": a year closing a sentence with more after it ends the title.
_YEAR_THEN_MORE_RE = re.compile(r",\s+(?:1[5-9]|20)\d\d[a-z]?\.\s+(?=\S)")
_QUOTE_PAIRS = {"“": "”", '"': '"', "«": "»", "„": "“"}
_CLOSERS = ".,;:)]}”\"’'»>"
_CONTAINER_LEAD_RE = re.compile(r"^(?:in|dans|en|im)\s*:?\s+(?=\S)", re.IGNORECASE)
_VOLUME_WORD_RE = re.compile(r"^(?:vol(?:ume)?s?|bd|t|tome|no|nr|n°|issue)\.?\s*", re.IGNORECASE)
_PAGE_WORD_RE = re.compile(r"^(?:pp?|pages?|pgs?|s)\.?\s*", re.IGNORECASE)
# "12(3):45-67" and Vancouver's "2019;12(3):45-67": volume, then pages after the colon.
_VOLUME_PAGES_RE = re.compile(
    r"^(?:\(?\d{4}[a-z]?\)?\s*;\s*)?(?P<volume>[\w()–-]+?)"
    r"(?:\s*:\s*(?P<pages>[A-Za-z]?\d+(?:\s*[-–—]\s*[A-Za-z]?\d+)?))?$"
)
_MAX_TITLE_GAP = 2  # tokens of another label allowed inside one title


@dataclass(frozen=True)
class LabelledSpan:
    """A run of tokens with one label: its text as written and its character offsets."""

    label: str
    text: str
    start: int
    end: int


@dataclass(frozen=True)
class EntryFields:
    """What a reference entry says, field by field; ``spans`` keeps the labelling it came from."""

    authors: tuple[str, ...]
    title: str | None
    container: str | None
    year: int | None
    year_suffix: str
    doi: str | None
    volume: str | None
    pages: str | None
    publisher: str | None
    spans: tuple[LabelledSpan, ...]


def spans_from_labels(text: str, tokens: Sequence[Token], labels: Sequence[str]) -> tuple[LabelledSpan, ...]:
    """Merge runs of equally labelled tokens into spans of ``text``."""
    spans: list[LabelledSpan] = []
    for token, label in zip(tokens, labels, strict=True):
        if spans and spans[-1].label == label:
            last = spans[-1]
            spans[-1] = LabelledSpan(label, text[last.start : token.end], last.start, token.end)
        else:
            spans.append(LabelledSpan(label, token.text, token.start, token.end))
    return tuple(spans)


def decode_fields(text: str, spans: Sequence[LabelledSpan]) -> EntryFields:
    """Fields of an entry from its labelled spans."""
    title = _joined(text, spans, ("title",))
    container = _joined(text, spans, ("journal", "container-title"))
    if container:
        container = _text_field(_CONTAINER_LEAD_RE.sub("", container))
    year, suffix = _year(spans)
    volume = _first(spans, "volume")
    pages = _first(spans, "pages")
    if volume and (split := _VOLUME_PAGES_RE.match(_VOLUME_WORD_RE.sub("", volume))):
        volume = split["volume"]
        pages = pages or split["pages"]
    return EntryFields(
        authors=_authors(spans),
        title=_text_field(_before_in_marker(_within_quotes(title))),
        container=container,
        year=year,
        year_suffix=suffix,
        doi=find_doi(text) or find_doi(_first(spans, "doi") or ""),
        volume=clean_field(_VOLUME_WORD_RE.sub("", volume)) or None if volume else None,
        pages=clean_field(_PAGE_WORD_RE.sub("", pages)) or None if pages else None,
        publisher=_text_field(_first(spans, "publisher")),
        spans=tuple(spans),
    )


def clean_field(text: str) -> str:
    """A field without the brackets, quotes and punctuation a style puts around it.

    A closing bracket stays when the field opens one of its own: "Imaging (MRI)".
    """
    text = " ".join(text.split())
    while text:
        before = text
        text = text.rstrip(" ,;:.")
        if text and text[-1] in _CLOSERS and not _balanced_closer(text):
            text = text[:-1]
        if text and text[0] in _OPENERS and not _balanced_opener(text):
            text = text[1:]
        if _wrapped(text):
            text = text[1:-1]
        text = text.strip()
        if text == before:
            break
    return text


def _within_quotes(title: str | None) -> str | None:
    """A quoted title ends where its quotation closes; the tagger sometimes runs it on
    into the container that follows."""
    if not title or title[0] not in _QUOTE_PAIRS:
        return title
    close = title.find(_QUOTE_PAIRS[title[0]], 1)
    # Only a quotation closed after the title's own full stop or comma, as in
    # "“Metaphor.” Oxford ...": "“Gli indesiderabili”. L’Italia ..." quotes inside a title.
    if close < 0 or title[close - 1] not in ".,?!" or not title[close + 1 :].strip(" .,;:"):
        return title
    return title[: close + 1]


def _before_in_marker(title: str | None) -> str | None:
    """A title stops before ". In" or ". In:", which opens the container of a chapter or paper."""
    if not title:
        return title
    return _YEAR_THEN_MORE_RE.split(_IN_MARKER_RE.split(title, maxsplit=1)[0], maxsplit=1)[0]


def _text_field(text: str | None) -> str | None:
    """A cleaned field, or None when nothing in it is a letter or digit."""
    cleaned = clean_field(text or "")
    return cleaned if any(ch.isalnum() for ch in cleaned) else None


def _wrapped(text: str) -> bool:
    """Whether one bracket pair encloses the whole text: "(pp. 4-9)" but not "(a) and (b)"."""
    pairs = {"(": ")", "[": "]"}
    if len(text) < 2 or pairs.get(text[0]) != text[-1]:
        return False
    depth = 0
    for ch in text[:-1]:
        depth += (ch == text[0]) - (ch == text[-1])
        if depth == 0:
            return False
    return True


def _balanced_closer(text: str) -> bool:
    pairs = {")": "(", "]": "[", "}": "{"}
    closer = text[-1]
    return closer in pairs and text.count(pairs[closer]) >= text.count(closer)


def _balanced_opener(text: str) -> bool:
    """Whether the opening bracket or quotation mark at the start is closed later on."""
    pairs = {"(": ")", "[": "]", "{": "}", **_QUOTE_PAIRS}
    opener = text[0]
    if opener not in pairs:
        return False
    if opener == pairs[opener]:  # a straight quotation mark closes itself
        return text.count(opener) >= 2
    return text.count(pairs[opener]) >= text.count(opener)


def _first(spans: Sequence[LabelledSpan], label: str) -> str | None:
    for span in spans:
        if span.label == label:
            return clean_field(span.text) or None
    return None


def _joined(text: str, spans: Sequence[LabelledSpan], labels: tuple[str, ...]) -> str | None:
    """The first run of ``labels`` spans, joined across gaps of at most two tokens."""
    start = end = None
    gap = 0
    for span in spans:
        if span.label in labels:
            if start is None:
                start = span.start
            elif gap > _MAX_TITLE_GAP:
                break
            end, gap = span.end, 0
        elif start is not None:
            gap += len(span.text.split())
    return text[start:end] if start is not None else None


def _year(spans: Sequence[LabelledSpan]) -> tuple[int | None, str]:
    for span in spans:
        if span.label == "date" and (match := _YEAR_RE.search(span.text)):
            return int(match["year"]), match["suffix"] or ""
    for span in spans:
        if span.label == "volume" and (match := _VANCOUVER_YEAR_RE.match(span.text)):
            return int(match["year"]), match["suffix"] or ""
    return None, ""


def _authors(spans: Sequence[LabelledSpan]) -> tuple[str, ...]:
    """Names from author spans; failing those, from editors named before the title."""
    for span in spans:
        if span.label == "author" and (names := family_names(span.text)):
            return names
    for span in spans:
        if span.label in {"title", "journal", "container-title"}:
            break
        if span.label == "editor" and (names := family_names(span.text)):
            return names
    return ()
