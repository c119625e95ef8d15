"""Finding and normalising DOI names.

Syntax (DOI Handbook, section 2.2, from memory): a DOI name is a prefix and a suffix
separated by "/"; the prefix is the directory indicator "10" followed by "." and a
registrant code, which may itself hold further "."-separated parts ("10.1000.10"); the
suffix is any printable characters, and the whole name is ASCII case-insensitive. In the
wild almost all registrant codes are 4 to 9 digits, which is what the pattern asks for
(the same bound as the widely used Crossref pattern; common practice, no source).

Text around a DOI is noisy: "doi:" labels, resolver URLs, and trailing sentence
punctuation. We strip the first two and trim the last, keeping a closing bracket only
when the DOI itself opened it (suffixes such as "S0140-6736(20)30183-5" contain them).
"""

from __future__ import annotations

import re
import urllib.parse

_DOI = re.compile(r"\b10\.\d{4,9}(?:\.\d+)*/[^\s\"'<>{}|\\^`]+", re.IGNORECASE)
_TRAILING = ".,;:!?*_'’\""
_PAIRS = {")": "(", "]": "[", "}": "{"}


def _trim(candidate: str) -> str:
    """Drop trailing punctuation and unbalanced closing brackets."""
    while candidate:
        last = candidate[-1]
        if last in _TRAILING or (last in _PAIRS and candidate.count(last) > candidate.count(_PAIRS[last])):
            candidate = candidate[:-1]
        else:
            break
    return candidate


def normalize_doi(value: str) -> str | None:
    """The bare, lower-cased DOI name in ``value`` (a DOI, "doi:..." or a resolver URL)."""
    found = find_dois(value)
    return found[0] if found else None


def find_dois(text: str) -> list[str]:
    """Every DOI name in ``text``, normalised, in order of appearance, without repeats.

    A DOI broken across a line end right after a hyphen ("10.1000/abc-\\ndef") is
    rejoined with its hyphen, because typesetters break long DOIs there.
    """
    text = re.sub(r"(?<=\S-)\n\s*", "", text)
    seen: list[str] = []
    for match in _DOI.finditer(text):
        doi = _trim(match.group(0)).lower()
        if "/" in doi and not doi.endswith("/") and doi not in seen:
            seen.append(doi)
    return seen


def find_doi(text: str) -> str | None:
    """The first DOI name in ``text`` (a reference entry, a field), URL-escapes undone first.

    Reference managers export DOIs inside resolver URLs with "%2F" for "/" and the like.
    """
    found = find_dois(urllib.parse.unquote(text))
    return found[0] if found else None
