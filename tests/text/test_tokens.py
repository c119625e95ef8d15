"""Tokenisation shared by BM25 and the coverage feature."""

from sourcecheck.text.tokens import coverage, s_stem, tokenize


def test_s_stemmer_follows_harmans_rules() -> None:
    # Harman (1991), "How effective is suffixing?", JASIS 42(1): the S-stemmer's three rules
    # (-ies -> -y unless -eies/-aies; -es -> -e unless -aes/-ees/-oes; -s removed unless -us/-ss).
    assert s_stem("colonies") == "colony"
    assert s_stem("estuaries") == "estuary"
    assert s_stem("houses") == "house"
    assert s_stem("nests") == "nest"
    assert s_stem("status") == "status"
    assert s_stem("grass") == "grass"
    assert s_stem("toes") == "toe"  # -oes is kept from the -es rule, then the -s rule applies
    # Our addition for sibilant plurals (common practice, no source):
    assert s_stem("marshes") == "marsh"
    assert s_stem("boxes") == "box"


def test_tokens_keep_decimals_and_negations_but_drop_function_words() -> None:
    tokens = tokenize("The density was not 0.05 higher in the Marshes")
    assert "0.05" in tokens
    assert "not" in tokens  # negation carries meaning; it must never be a stop word
    assert "marsh" in tokens
    assert "the" not in tokens and "in" not in tokens


def test_coverage_is_share_of_claim_content_words() -> None:
    assert coverage("heron nests rose", "the heron nest count rose sharply") == 1.0
    assert coverage("heron nests rose", "tide gauges fell") == 0.0
    assert abs(coverage("heron nests fell", "heron nests rose") - 2 / 3) < 1e-9
