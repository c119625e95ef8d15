"""Tests for name folding used when comparing authors."""

from __future__ import annotations

import unicodedata

from sourcecheck.text.names import ascii_slug, family_key, fold


def test_fold_removes_accents_both_composed_and_decomposed() -> None:
    # Unicode Standard Annex #15 (normalization forms): "Ó" may be one code point (NFC) or
    # "O" plus a combining acute accent (NFD); both must compare equal.
    composed = unicodedata.normalize("NFC", "Ólafsdóttir")
    decomposed = unicodedata.normalize("NFD", "Ólafsdóttir")
    assert composed != decomposed
    assert fold(composed) == fold(decomposed) == "olafsdottir"


def test_family_key_ignores_particles_case_and_hyphens() -> None:
    assert family_key("van der Berg") == family_key("Van der Berg") == family_key("Berg") == "berg"
    assert family_key("Nguyen-Hall") == family_key("Nguyen Hall") == "nguyenhall"
    assert family_key("Müller") == "muller"
    assert family_key("Okafor") != family_key("Okafur")


def test_ascii_slug_keeps_particles() -> None:
    assert ascii_slug("van der Berg") == "vanderberg"
    assert ascii_slug("Ólafsdóttir") == "olafsdottir"
