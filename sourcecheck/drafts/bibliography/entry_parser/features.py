"""Token features for the linear-chain CRF, after the reference-parsing literature.

The feature families follow Peng and McCallum (2004, "Accurate information extraction from
research papers using conditional random fields") and ParsCit (Councill, Giles and Kan
2008): the word and its shape and case, the punctuation glued before and after it, its
relative position in the entry, digit shapes (years, page ranges, volume(issue)),
initials, quotes and brackets, DOI and URL shapes, lexicon membership, and the same for
the neighbours within two tokens. A few entry-level cues (quotes anywhere, a leading
number) and counts of the full stops and years seen so far let one model serve styles
that put the year first, last or in the middle.
"""

from __future__ import annotations

import re
from collections.abc import Sequence

from sourcecheck.drafts.bibliography.entry_parser.lexicons import Lexicons, word_key
from sourcecheck.drafts.bibliography.entry_parser.tokens import Token

_YEAR_RE = re.compile(r"^(?:1[5-9]\d\d|20[0-4]\d)[a-z]?$")
_YEAR_INSIDE_RE = re.compile(r"(?<!\d)(?:1[5-9]\d\d|20[0-4]\d)(?!\d)")
_PAGE_RANGE_RE = re.compile(r"^[A-Za-z]?\d+\s*[-–—‐]+\s*[A-Za-z]?\d+$")
_VOLUME_ISSUE_RE = re.compile(r"^\d+\s*\(\s*[\w–-]+\s*\)")
_COLON_NUMBERS_RE = re.compile(r"^\d+[:;]\d+")
_INITIALS_RE = re.compile(r"^(?:[A-Z][a-z]?\.?[-‐]?){1,3}$")
_DOI_RE = re.compile(r"10\.\d{4,9}/", re.IGNORECASE)
_URL_RE = re.compile(r"^(?:<?https?://|<?www\.|<?doi:|<?urn:)", re.IGNORECASE)
_ROMAN_RE = re.compile(r"^(?=[ivxlcdm]+$)m*(?:cm|cd|d?c{0,3})(?:xc|xl|l?x{0,3})(?:ix|iv|v?i{0,3})$", re.IGNORECASE)
_ORDINAL_RE = re.compile(r"^\d+(?:st|nd|rd|th|e|er|ème|\.)$", re.IGNORECASE)
_OPEN_QUOTES = "\"“‘'«„"
_CLOSE_QUOTES = "\"”’'»“"


def _shape(text: str) -> str:
    """Word shape with runs collapsed: "Okafor," -> "Xx,", "(2019)." -> "(d).", "J.-P." -> "X.-X."."""
    out: list[str] = []
    for ch in text[:24]:
        if ch.isupper():
            code = "X"
        elif ch.isalpha():
            code = "x"
        elif ch.isdigit():
            code = "d"
        else:
            code = ch
        if not out or out[-1] != code:
            out.append(code)
    return "".join(out)


def _case(core: str) -> str:
    letters = [ch for ch in core if ch.isalpha()]
    if not letters:
        return "none"
    if all(ch.isupper() for ch in letters):
        return "upper" if len(letters) > 1 else "title"
    if all(ch.islower() for ch in letters):
        return "lower"
    return "title" if letters[0].isupper() and all(ch.islower() for ch in letters[1:]) else "mixed"


def _is_initials(token: Token) -> bool:
    """Initials: "A.", "A.B.", "J.-P.", "Th." or, in Vancouver style, a bare "AB" after a name."""
    core = token.core
    if _INITIALS_RE.match(core) and ("." in token.text[len(token.lead) :] or len(core) == 1):
        return True
    return core.isalpha() and core.isupper() and len(core) <= 3


def _local(token: Token, lexicons: Lexicons) -> list[str]:
    """Features of one token on its own (also used, prefixed, for its neighbours)."""
    core = token.core
    key = word_key(core)
    feats = [
        f"w={key[:30] if key else '<punct>'}",
        f"shape={_shape(token.text)}",
        f"case={_case(core)}",
        f"lead={token.lead[-2:]}",
        f"trail={token.trail[:2]}",
    ]
    if _YEAR_RE.match(core):
        feats.append("year")
    elif _YEAR_INSIDE_RE.search(token.text):
        feats.append("has_year")
    if core.isdigit():
        feats.append(f"digits={min(len(core), 5)}")
    elif any(ch.isdigit() for ch in core):
        feats.append("some_digits")
    if _PAGE_RANGE_RE.match(core):
        feats.append("page_range")
    if _VOLUME_ISSUE_RE.match(core):
        feats.append("volume_issue")
    if _COLON_NUMBERS_RE.match(core):
        feats.append("colon_numbers")
    if _is_initials(token):
        feats.append("initials")
    if _ROMAN_RE.match(core) and len(core) <= 5:
        feats.append("roman")
    if _ORDINAL_RE.match(core):
        feats.append("ordinal")
    if _DOI_RE.search(token.text):
        feats.append("doi")
    if _URL_RE.match(token.text):
        feats.append("url")
    if any(ch in _OPEN_QUOTES for ch in token.lead):
        feats.append("quote_open")
    if any(ch in _CLOSE_QUOTES for ch in token.trail):
        feats.append("quote_close")
    if "(" in token.lead or "[" in token.lead:
        feats.append("bracket_open")
    if ")" in token.trail or "]" in token.trail:
        feats.append("bracket_close")
    if "-" in core or "–" in core:
        feats.append("hyphen")
    feats.extend(f"lex={name}" for name, words in lexicons.items() if key in words)
    return feats


class _State:
    """What the entry has opened or passed so far: a quotation, brackets, an "In" marker.

    Quoted titles, bracketed publication details ("(London: Harbourside, 2016)") and the
    container after "In" span many tokens; the window of two neighbours cannot see their
    start, these flags can.
    """

    def __init__(self) -> None:
        self.quote_depth = 0
        self.bracket_depth = 0
        self.quote_closed = False
        self.after_in = False

    def before(self, token: Token) -> list[str]:
        opens_quote = any(ch in _OPEN_QUOTES for ch in token.lead)
        feats = []
        if self.quote_depth > 0 or opens_quote:
            feats.append("in_quotes")
        if self.bracket_depth > 0 or "(" in token.lead:
            feats.append("in_brackets")
        if self.quote_closed:
            feats.append("after_quote")
        if self.after_in:
            feats.append("after_in")
        return feats

    def after(self, token: Token) -> None:
        if any(ch in _OPEN_QUOTES for ch in token.lead) and not self.quote_depth:
            self.quote_depth = 1
        if self.quote_depth and any(ch in _CLOSE_QUOTES for ch in token.trail):
            self.quote_depth = 0
            self.quote_closed = True
        self.bracket_depth = max(0, self.bracket_depth + token.text.count("(") - token.text.count(")"))
        if token.core.lower() in {"in", "dans", "im"} and (token.trail[:1] in {"", ":"}) and token.core[:1].isupper():
            self.after_in = True


def entry_features(tokens: Sequence[Token], lexicons: Lexicons) -> list[list[str]]:
    """One list of string features per token, window ±2 included."""
    n = len(tokens)
    if n == 0:
        return []
    local = [_local(token, lexicons) for token in tokens]
    quoted = any(any(ch in _OPEN_QUOTES for ch in t.lead) for t in tokens)
    numbered = bool(re.match(r"^[\[(]?\d{1,4}[\].):]?$", tokens[0].text))
    result: list[list[str]] = []
    stops = 0
    years = 0
    state = _State()
    for index, token in enumerate(tokens):
        feats = ["bias", *local[index], *state.before(token)]
        feats.append(f"pos={min(9, 10 * index // n)}")
        feats.append(f"index={min(index, 6)}")
        feats.append(f"stops={min(stops, 4)}")
        feats.append(f"years_before={min(years, 2)}")
        if index == 0:
            feats.append("first")
        if index == n - 1:
            feats.append("last")
        if quoted:
            feats.append("entry_quoted")
        if numbered:
            feats.append("entry_numbered")
        if token.core.lower() == "al" and index > 0 and tokens[index - 1].core.lower() == "et":
            feats.append("et_al")
        for offset in (-2, -1, 1, 2):
            other = index + offset
            if 0 <= other < n:
                feats.extend(f"{offset}:{f}" for f in local[other] if not f.startswith("lex=") or abs(offset) == 1)
            else:
                feats.append(f"{offset}:<edge>")
        result.append(feats)
        if token.trail.startswith(".") and not _is_initials(token):
            stops += 1
        state.after(token)
        if _YEAR_INSIDE_RE.search(token.text):
            years += 1
    return result
