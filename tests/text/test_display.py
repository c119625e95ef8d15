"""Untrusted text is shown with its controls escaped, never obeyed."""

from __future__ import annotations

import pytest

from sourcecheck.text import visible


@pytest.mark.parametrize(
    ("raw", "shown"),
    [
        # ECMA-48: ESC [ ... m selects colours; OSC 0 ; title BEL sets a window title.
        ("\x1b[31mred\x1b[0m", "\\x1b[31mred\\x1b[0m"),
        ("\x1b]0;owned\x07", "\\x1b]0;owned\\x07"),
        # OSC 8 hyperlink (a terminal convention, common practice, no source).
        ("\x1b]8;;http://x\x1b\\link", "\\x1b]8;;http://x\\x1b\\link"),
        # U+009B is the 8-bit CSI of ECMA-48 (category Cc).
        ("a\x9b31mb", "a\\x9b31mb"),
        # Unicode UAX #9: RIGHT-TO-LEFT OVERRIDE and the isolates.
        ("abc\u202edcba", "abc\\u202edcba"),
        ("x\u2066y\u2069", "x\\u2066y\\u2069"),
        ("one\ntwo", "one\\x0atwo"),
        ("tab\there", "tab here"),
    ],
)
def test_controls_are_escaped(raw: str, shown: str) -> None:
    assert visible(raw) == shown


def test_plain_text_and_letters_of_every_script_pass_unchanged() -> None:
    text = "Ökologie, 生态, إيكولوجيا, p < 0.05 — “quoted” ﬁne"
    assert visible(text) is text


def test_a_block_keeps_its_newlines_but_not_its_escapes() -> None:
    assert visible("line one\n\x1b[2Jline two", keep_newlines=True) == "line one\n\\x1b[2Jline two"
