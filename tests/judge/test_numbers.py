"""Numbers in claims against numbers in passages."""

import math

import pytest

from sourcecheck.judge.number_checks import in_claim_unit, same_value, unsupported_numbers
from sourcecheck.judge.numbers import quantities


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


# --- helpers for the new forms -----------------------------------------------------------


def _findings(claim: str, passage: str) -> list[tuple[str, str | None]]:
    """(claim text, counterpart text or None) for each claim number the passage lacks."""
    found = unsupported_numbers(claim, passage, [])
    return [(f.claim.text, f.counterpart.text if f.counterpart else None) for f in found]


def _close(a: float, b: float) -> bool:
    return math.isclose(a, b, rel_tol=1e-9, abs_tol=1e-15)


# --- reading: each form with its value, kind and unit ------------------------------------


@pytest.mark.parametrize(
    ("text", "value", "kind", "unit"),
    [
        # SI Brochure (BIPM, 9th ed., 2019), section 5.4.3: value = number × unit, a space
        # between them (from memory); the value is kept in SI base units (kg, m, s, mol, K).
        ("a dose of 5 mg", 5e-6, "mass", "mg"),
        ("a dose of 5mg", 5e-6, "mass", "mg"),
        ("dosed at 5 mg/kg", 5e-6, "unit ratio", "mg/kg"),
        ("dosed at 5 mg kg-1", 5e-6, "unit ratio", "mg kg-1"),
        ("held 20 µg/mL", 0.02, "mass concentration", "µg/mL"),
        ("glucose of 5.5 mmol/L", 5.5, "concentration", "mmol/L"),
        ("in 0.5 M NaCl", 500.0, "concentration", "M"),
        ("above 2.5 MPa", 2.5e6, "pressure", "MPa"),
        ("kept at 37 °C", 310.15, "temperature", "°C"),
        ("every 10 min", 600.0, "time", "min"),
        ("over 6 days", 6 * 86400.0, "time", "days"),
        ("in 2 m quadrats", 2.0, "length", "m"),
        ("plots of 0.25 m²", 0.25, "area", "m²"),
        # Percent and percentage points are their own kinds (common practice, no source).
        ("rose by 18.4%", 18.4, "%", "%"),
        ("rose by 3 percentage points", 3.0, "percentage point", "pp"),
        ("rose by 3 pp", 3.0, "percentage point", "pp"),
        ("a proportion of 0.45", 45.0, "%", "fraction"),
        ("rose 2.5-fold", 2.5, "fold", "fold"),
        ("rose 2.5 fold", 2.5, "fold", "fold"),
        ("rose 2.5×", 2.5, "fold", "fold"),
        ("rose 2.5x over", 2.5, "fold", "fold"),
        ("rose twofold", 2.0, "fold", "fold"),
    ],
)
def test_numbers_with_units_and_kinds(text: str, value: float, kind: str, unit: str) -> None:
    found = _one(text)
    assert _close(found.value, value) and found.kind == kind and found.unit == unit


def test_statistics_are_named_by_what_precedes_them() -> None:
    # APA Publication Manual, 7th ed., 6.43-6.46 statistical forms "OR = 1.8", "HR 0.7",
    # "95% CI [1.2, 2.7]" (from memory); odds, hazard and risk ratios are different measures.
    assert [(q.kind, q.value) for q in quantities("odds ratio 1.8; OR = 1.8; aOR 1.8")] == [("ratio:OR", 1.8)] * 3
    assert _one("HR 0.7").kind == "ratio:HR" and _one("hazard ratio of 0.7").kind == "ratio:HR"
    assert _one("RR 0.85").kind == _one("relative risk 0.85").kind == _one("risk ratio 0.85").kind == "ratio:RR"
    three_to_one = _one("a sex ratio of 3:1")
    assert (three_to_one.kind, three_to_one.value) == ("ratio", 3.0) and _one("3:1").kind == "ratio"
    assert [(q.kind, q.value, q.high) for q in quantities("95% CI [1.2, 2.7]")] == [("%", 95.0, None), ("CI", 1.2, 2.7)]
    assert _one("r = 0.61").kind == "stat:r"


@pytest.mark.parametrize(
    ("text", "value", "comparator", "decimals"),
    [
        ("p < 0.05", 0.05, "<", 2),
        # APA 7th ed., 6.36: no zero before the decimal point of a p-value, "p = .003" (from memory).
        ("P = .003", 0.003, "=", 3),
        ("p<.001", 0.001, "<", 3),
        ("p ≤ 0.01", 0.01, "≤", 2),
        ("p <= 0.01", 0.01, "≤", 2),
        ("a p-value of 0.03", 0.03, "=", 2),
    ],
)
def test_p_values_keep_their_comparator(text: str, value: float, comparator: str, decimals: int) -> None:
    found = _one(text)
    assert (found.kind, found.value, found.comparator, found.decimals) == ("p-value", value, comparator, decimals)


def test_sample_sizes() -> None:
    assert [(q.kind, q.value) for q in quantities("(n = 48), N=48")] == [("n", 48.0), ("n", 48.0)]
    assert _one("48 participants").kind == "participant"


@pytest.mark.parametrize(
    ("text", "value", "decimals"),
    [
        ("1.2 × 10^3", 1200.0, -2),  # two significant figures: rounded to the hundreds
        ("1.2×10³", 1200.0, -2),
        ("1.2 x 10-3", 1.2e-3, 4),
        ("1.2e-3", 1.2e-3, 4),
        ("1.2E3", 1200.0, -2),
        ("10^-4", 1e-4, 4),
        ("10⁻⁴", 1e-4, 4),
    ],
)
def test_scientific_notation(text: str, value: float, decimals: int) -> None:
    found = _one(text)
    assert _close(found.value, value) and found.decimals == decimals


def test_digit_groups_and_signs() -> None:
    # SI Brochure (9th ed.), section 5.4.4: digits in groups of three, separated by a thin
    # space (from memory); commas as separators are common English practice (no source).
    assert _one("12\u2009000 nests").value == 12000.0 and _one("12\u202f000 nests").value == 12000.0
    assert _one("12,000.5 nests").value == 12000.5 and _one("12,000.5 nests").decimals == 1
    assert _one("changed by −0.3").value == -0.3 and _one("changed by -0.3").value == -0.3
    assert [q.value for q in quantities("COVID-19 cases")] == []  # a name, not minus nineteen
    assert [(q.value, q.high) for q in quantities("in 12-15 plots")] == [(12.0, 15.0)]  # a range, not −15


def test_ranges_carry_their_unit_to_both_ends() -> None:
    for text in ("12–15 mg", "12-15 mg", "12 to 15 mg", "between 12 and 15 mg", "12 mg–15 mg"):
        found = _one(text)
        assert (_close(found.value, 12e-6), _close(found.high, 15e-6), found.kind) == (True, True, "mass"), text
    assert _one("between 20 and 30%").kind == "%" and _one("between 20 and 30%").high == 30.0
    assert _one("rose from 12 to 15 nests").kind == "nest" and _one("rose from 12 to 15.").kind == ""


def test_spread_is_kept_apart_from_the_value() -> None:
    found = _one("4.2 ± 0.3 mg")
    assert _close(found.value, 4.2e-6) and _close(found.spread, 0.3e-6) and found.kind == "mass"
    assert _one("3.4 ± 1.2 nests per m²").kind == "nest"


def test_labels_references_and_clock_times_stay_out() -> None:
    assert quantities("see Fig. 2, Table 3, Section 4, Eq. 5 and pp. 201–205") == []
    assert quantities("as reported [12] and [3, 7]") == []
    assert quantities("between 09:00 and 12:00") == []


def test_spelled_out_numbers_take_units_and_kinds() -> None:
    assert (_one("five percent").kind, _one("five percent").value) == ("%", 5.0)
    assert _one("six days").value == 6 * 86400.0
    assert _one("a dozen nests").value == 12.0


# --- matching: claim against passage --------------------------------------------------------


def test_equal_after_unit_conversion_is_found_both_ways() -> None:
    # 500 mg = 0.5 g (SI Brochure, 9th ed., Table 7: milli = 10⁻³; from memory).
    assert _findings("a dose of 500 mg", "a dose of 0.5 g") == []
    assert _findings("a dose of 0.5 g", "a dose of 500 mg") == []
    assert _findings("a dose of 600 mg", "a dose of 0.5 g") == [("600 mg", "0.5 g")]
    assert _findings("held 20 µg/mL", "held 20 mg/L") == []  # 1 µg/mL = 1 mg/L
    assert _findings("5.5 mmol/L", "5.5 mM") == []
    # K = °C + 273.15 (SI Brochure, 9th ed., section 2.3.1; from memory).
    assert _findings("kept at 37 °C", "kept at 310.15 K") == []
    assert _findings("kept at 37 °C", "kept at 37 K") == [("37 °C", "37 K")]


def test_rounding_follows_significant_figures_of_scientific_notation() -> None:
    # "1.2 × 10³" covers 1150 to 1250 (rounding to the written digit; common practice, no source).
    assert _findings("about 1.2 × 10^3 cells", "1,180 cells") == []
    assert _findings("about 1,200 cells", "1,180 cells") == [("1,200", "1,180")]
    assert _findings("1.2e-3", "0.00118") == []


def test_percent_fraction_points_and_folds_never_cross() -> None:
    assert _findings("45% of nests", "a proportion of 0.45 of nests") == []
    assert _findings("45% of nests", "0.45 of nests") == [("45%", None)]  # no proportion word: not a percentage
    assert _findings("rose by 3 percentage points", "rose by 3%") == [("3 percentage points", None)]
    assert _findings("rose by 3%", "rose by 3 percentage points") == [("3%", None)]
    assert _findings("rose 2.5-fold", "rose by 2.5%") == [("2.5-fold", None)]
    assert _findings("rose 2.5-fold", "rose 2.5×") == []
    assert _findings("rose 2.5-fold", "rose 4-fold") == [("2.5-fold", "4-fold")]


def test_named_ratios_match_only_their_own_name() -> None:
    # Odds, hazard and risk ratios are different measures (APA 7th ed., Table 6.5; from memory).
    assert _findings("OR 1.8", "odds ratio of 1.8") == []
    assert _findings("OR 1.8", "HR 1.8") == [("OR 1.8", None)]
    assert _findings("OR 1.8", "OR = 2.1") == [("OR 1.8", "OR = 2.1")]
    assert _findings("a 3:1 ratio", "a ratio of 3:1") == []


def test_a_claimed_bound_must_be_implied_by_the_source() -> None:
    assert _findings("p < 0.05", "p = 0.03") == []
    assert _findings("p < 0.05", "p < 0.01") == []
    assert _findings("p < 0.05", "p < 0.05") == []
    assert _findings("p ≤ 0.05", "p = 0.05") == []
    assert _findings("p < 0.05", "p = 0.05") == [("p < 0.05", None)]  # may round from 0.049: no contradiction
    assert _findings("p < 0.05", "p = 0.2") == [("p < 0.05", "p = 0.2")]
    assert _findings("p < 0.01", "p < 0.05") == [("p < 0.01", None)]  # weaker statement: not a contradiction
    assert _findings("p = 0.03", "p < 0.05") == [("p = 0.03", None)]  # a bound states no value
    assert _findings("p = 0.03", "p < 0.01") == [("p = 0.03", "p < 0.01")]
    assert _findings("P = .003", "p = 0.003") == []
    assert _findings("p > 0.1", "p = 0.4") == []


def test_ranges_match_ranges_and_ends() -> None:
    assert _findings("doses of 12–15 mg", "between 12 and 15 mg") == []
    assert _findings("doses of 12–15 mg", "12 mg and 15 mg") == []  # both ends stated
    assert _findings("doses of 12–16 mg", "12–15 mg") == [("12–16 mg", "12–15 mg")]
    assert _findings("a dose of 12 mg", "doses of 12–15 mg") == []  # a stated end
    assert _findings("a dose of 13 mg", "doses of 12–15 mg") == [("13 mg", None)]  # inside: not stated
    assert _findings("a dose of 16 mg", "doses of 12–15 mg") == [("16 mg", "12–15 mg")]


def test_spread_must_agree_when_both_state_one() -> None:
    assert _findings("held 4.2 mg", "held 4.2 ± 0.3 mg") == []
    assert _findings("held 4.2 ± 0.3 mg", "held 4.2 ± 0.3 mg") == []
    assert _findings("held 4.2 ± 0.3 mg", "held 4.2 ± 0.5 mg") == [("4.2 ± 0.3 mg", "4.2 ± 0.5 mg")]


def test_sample_size_matches_a_count_of_the_same_value() -> None:
    assert _findings("(n = 48)", "48 participants took part") == []
    assert _findings("48 participants", "(n = 48)") == []
    assert _findings("(n = 48)", "(n = 52)") == [("n = 48", "n = 52")]


def test_a_unit_written_once_for_a_list_applies_to_each_number() -> None:
    assert _findings("a dose of 250 mg/kg", "doses of 250 and 500 mg/kg") == []
    assert _findings("a rise of 20%", "rises of 10, 20 or 30%") == []
    assert [q.unit for q in quantities("5 sites and 10 mg")] == ["", "mg"]  # a word between: no list


def test_a_sign_counts_only_when_both_numbers_carry_one() -> None:
    assert _findings("fell by 0.3", "a change of −0.3") == []
    assert _findings("a change of +0.3", "a change of −0.3") == [("+0.3", None)]


def test_a_bare_word_is_not_a_unit() -> None:
    assert _findings("5 m apart", "the 5 most common") == [("5 m", None)]
    assert _one("the 5 most common").unit == ""


def test_a_mismatch_in_another_unit_is_restated_in_the_claims_unit() -> None:
    # SI Brochure (BIPM, 9th ed., 2019), Table 7: milli = 10^-3, micro = 10^-6 (from memory).
    [finding] = unsupported_numbers("The dose was 0.5 g per day.", "The dose was 400 mg per day.", [])
    assert finding.counterpart is not None
    assert in_claim_unit(finding.claim, finding.counterpart) == " (= 0.4 g per day)"
    [finding] = unsupported_numbers("Levels were 12 µg/mL in serum.", "Levels were 0.02 mg/mL in serum.", [])
    assert finding.counterpart is not None
    assert in_claim_unit(finding.claim, finding.counterpart) == " (= 20 µg/mL)"


def test_same_unit_or_temperature_is_not_restated() -> None:
    # Common practice, no source: restating "18%" as "18%" or 300 K as °C adds nothing.
    [finding] = unsupported_numbers("Cover was 23% of plots.", "Cover was 18% of plots.", [])
    assert finding.counterpart is not None
    assert in_claim_unit(finding.claim, finding.counterpart) == ""
    [finding] = unsupported_numbers("Temperature was 25 °C.", "Temperature was 300 K.", [])
    assert finding.counterpart is not None
    assert in_claim_unit(finding.claim, finding.counterpart) == ""


@pytest.mark.parametrize(
    ("text", "percent"),
    [("One in five trials stopped early.", 20.0), ("1 in 4 plots", 25.0), ("three out of four nests", 75.0)],
)
def test_a_proportion_written_as_one_in_n_is_a_percentage(text: str, percent: float) -> None:
    # "one in five" = 1/5 = 20% (arithmetic; the form is common practice, no source).
    [q] = [q for q in quantities(text) if q.kind == "%"]
    assert q.value == pytest.approx(percent)
    assert not [q for q in quantities(text) if q.kind != "%"]  # "one" and "five" are not counts too


def test_one_in_n_matches_the_rounded_percentage_and_flags_another_ratio() -> None:
    # A rate given as "one in five" is a round figure: 21% is the same figure, "one in
    # three" is not (common practice, no source).
    assert unsupported_numbers("About one in five nests failed.", "Of the nests, 21% failed.", []) == []
    [finding] = unsupported_numbers("One in two trials stop early.", "One in three trials stop early.", [])
    assert finding.counterpart is not None and finding.counterpart.text == "One in three"


@pytest.mark.parametrize(
    ("text", "value"),
    [
        ("1.2 million people", 1.2e6),
        ("3 thousand nests", 3e3),
        ("$5 billion", 5e9),
        ("between 2 and 3 million plots", 2e6),
    ],
)
def test_a_scale_word_multiplies_the_number(text: str, value: float) -> None:
    # Short scale, as English-language style guides use it: a million is 10^6, a billion
    # 10^9 (Chicago Manual of Style, 17th ed., 9.24-9.25; from memory).
    assert _one(text).value == pytest.approx(value)


def test_a_scaled_number_matches_the_same_figure_in_digits_and_rounds_in_its_own_unit() -> None:
    # "1.2 million" is written to the nearest 0.1 million, so it covers 1,150,000-1,250,000
    # (common practice, no source).
    assert unsupported_numbers("About 1.2 million people.", "We counted 1,230,000 people.", []) == []
    [finding] = unsupported_numbers("About 1.2 million people.", "We counted 1,300,000 people.", [])
    assert finding.counterpart is not None


def test_a_scaled_number_is_not_found_in_the_bare_digits() -> None:
    # "$5 billion" is not backed by "5 sites" (common practice, no source).
    [finding] = unsupported_numbers("The plan saves $5 billion.", "The plan covered 5 sites.", [])
    assert finding.counterpart is None


def test_amounts_of_money_compare_across_scale_words_and_currency_forms() -> None:
    # "$" and "dollars" name one currency (ISO 4217 code USD; from memory).
    assert unsupported_numbers("It would save $5 billion.", "It would save 5 billion dollars.", []) == []
    [finding] = unsupported_numbers("It would save up to $5 billion.", "It would save as much as $750 million.", [])
    assert finding.counterpart is not None and finding.counterpart.text == "$750 million"
    # A different currency is another kind: no counterpart, only "not found".
    [finding] = unsupported_numbers("It would save €5 billion.", "It would save $5 billion.", [])
    assert finding.counterpart is None


def test_a_scale_word_before_a_unit_scales_the_converted_value() -> None:
    # 1 ha = 10^4 m^2 (SI Brochure, 9th ed., Table 8; from memory), so 1.2 million ha = 1.2 × 10^10 m^2.
    assert _one("1.2 million ha").value == pytest.approx(1.2e10)


@pytest.mark.parametrize(
    ("text", "value", "decimals"),
    [("rose by 12,5 %", 12.5, 1), ("p < 0,05", 0.05, 2), ("3,14159 units", 3.14159, 5), ("12,50 %", 12.5, 2)],
)
def test_a_comma_that_can_only_be_a_decimal_marker_is_read_as_one(text: str, value: float, decimals: int) -> None:
    # The SI Brochure (9th ed., 5.4.2; from memory) allows the comma on the line as the
    # decimal marker; before one, two or four or more digits a comma cannot group thousands.
    found = quantities(text)[0]
    assert found.value == pytest.approx(value) and found.decimals == decimals


def test_a_comma_before_three_digits_still_groups_thousands_and_year_lists_stay_years() -> None:
    # Three digits after a comma is the English thousands group (common practice, no source).
    assert _one("12,500 nests").value == 12500.0
    assert [q.value for q in quantities("as reported (Hale 2001,2003)")] != [2001.2003]


def test_a_decimal_comma_in_the_source_backs_a_decimal_point_in_the_claim() -> None:
    assert unsupported_numbers("Cover rose by 12.5%.", "Cover rose by 12,5 % on every site.", []) == []
    [finding] = unsupported_numbers("Cover rose by 12.5%.", "Cover rose by 14,5 % on every site.", [])
    assert finding.counterpart is not None and finding.counterpart.text == "14,5 %"


def test_a_raised_decimal_point_is_a_decimal_point() -> None:
    # The Lancet prints decimals with a middle dot ("3·4%", "OR 1·62"; house style, from memory).
    found = {(q.value, q.kind) for q in quantities("Injury accounted for 98 (3·4%) of datapoints; SMR 11·86")}
    assert (3.4, "%") in found and (11.86, "") in found
