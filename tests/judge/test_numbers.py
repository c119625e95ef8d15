"""Numbers in claims against numbers in passages."""

from sourcecheck.judge.numbers import quantities, same_value, unsupported_numbers


def _one(text: str):
    found = quantities(text)
    assert len(found) == 1, found
    return found[0]


def test_reads_percent_thousands_decimals_and_years() -> None:
    assert _one("rose by 18.4%").value == 18.4 and _one("rose by 18.4%").kind == "%"
    assert _one("rose by 18 percent").kind == "%"
    assert _one("counted 1,204 nests").value == 1204.0  # thousands separator (common practice, no source)
    assert _one("counted 1,204 nests").kind == "nest"
    assert _one("since 2019 the site").kind == "year"


def test_figure_and_table_labels_are_not_quantities() -> None:
    assert quantities("as shown in Fig. 2 and Table 3") == []


def test_spelled_out_counts_read_as_numbers() -> None:
    # APA Publication Manual, 7th ed., section 6.32: numbers below ten in words (from memory).
    assert _one("across twelve marsh sites").value == 12.0
    assert quantities("one of the sites") == []


def test_rounding_follows_the_written_precision() -> None:
    # A value written as 18% covers 17.5 to 18.5 (rounding to the written digit; common practice, no source).
    assert same_value(_one("18%"), _one("18.4%"))
    assert not same_value(_one("18%"), _one("18.6%"))
    assert not same_value(_one("18.0%"), _one("18.4%"))  # both written to one decimal: they differ
    assert same_value(_one("0.05 mm"), _one("0.050 mm"))


def test_changed_number_has_a_counterpart_and_missing_number_has_none() -> None:
    passage = "Across the marsh sites, nest density rose by 18.4% between 2018 and 2019."
    changed = unsupported_numbers("Nest density rose by 23% across the marsh sites.", passage, [])
    assert [(f.claim.text, f.counterpart.text if f.counterpart else None) for f in changed] == [("23%", "18.4%")]
    missing = unsupported_numbers("Nest density rose at 31 sites.", passage, [])
    assert [(f.claim.text, f.counterpart) for f in missing] == [("31", None)]


def test_a_number_found_in_a_second_passage_is_supported() -> None:
    found = unsupported_numbers("412 nests were counted.", "Nests were counted in May.", ["In all, 412 nests."])
    assert found == []


def test_a_number_is_found_whatever_word_follows_it() -> None:
    # "1,119 adult bees" and "1119 bees" are one figure; a percentage is only ever a percentage.
    assert unsupported_numbers("We marked 1,119 adult bees.", "In all 1119 bees were marked.", []) == []
    assert unsupported_numbers("We marked 23% of bees.", "We marked 23 bees.", []) != []
