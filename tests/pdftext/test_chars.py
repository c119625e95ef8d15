"""Character normalisation, checked against Python's Unicode database (unicodedata)."""

from __future__ import annotations

import unicodedata

import pytest

from sourcecheck.pdftext.chars import normalize_chars


@pytest.mark.parametrize("ligature", ["\ufb00", "\ufb01", "\ufb02", "\ufb03", "\ufb04", "\ufb06"])
def test_ligatures_fold_as_nfkc_does(ligature: str) -> None:
    # Reference: the Unicode compatibility decomposition of each ligature.
    assert normalize_chars(ligature) == unicodedata.normalize("NFKC", ligature)


def test_long_s_t_ligature_folds_to_st() -> None:
    # U+FB05 decomposes to "ſt" (long s) under NFKC's first step; for search it is "st".
    assert normalize_chars("\ufb05") == "st"


@pytest.mark.parametrize("keep", ["±", "µ", "–", "—", "−", "²", "½", "“quoted”"])
def test_meaningful_compatibility_characters_are_kept(keep: str) -> None:
    assert normalize_chars(keep) == keep


@pytest.mark.parametrize("changed", ["µ", "²", "½"])
def test_full_nfkc_would_have_changed_these(changed: str) -> None:
    # Why not plain NFKC: the Unicode database folds these to other characters.
    assert unicodedata.normalize("NFKC", changed) != changed
    assert normalize_chars(changed) == changed


def test_spaces_zero_width_and_hyphen_lookalikes() -> None:
    assert normalize_chars("a\u00a0b\u2009c\u200bd\u2010e\ufeff") == "a b cd-e"


def test_combining_accents_are_composed() -> None:
    assert normalize_chars("Me\u0301ndez") == "Méndez"
    assert normalize_chars("Me\u0301ndez") == unicodedata.normalize("NFC", "Méndez")
