"""Units after a number: SI prefixes, the unit table, compound units and whole-token reading."""

import math

import pytest

from sourcecheck.judge.units import dims_signature, lookup, read_unit

MASS = (1, 0, 0, 0, 0)


def _unit(written: str):
    found = read_unit(written, 0)
    assert found is not None, written
    return found[0]


# SI Brochure (BIPM, 9th ed., 2019), Table 7, SI prefixes and their factors (from memory).
@pytest.mark.parametrize(
    ("prefix", "factor"),
    [
        ("T", 1e12),
        ("G", 1e9),
        ("M", 1e6),
        ("k", 1e3),
        ("h", 1e2),
        ("d", 1e-1),
        ("c", 1e-2),
        ("m", 1e-3),
        ("µ", 1e-6),  # MICRO SIGN
        ("μ", 1e-6),  # GREEK SMALL LETTER MU, the form the Brochure prints
        ("n", 1e-9),
        ("p", 1e-12),
        ("f", 1e-15),
    ],
)
def test_si_prefixes_scale_the_second(prefix: str, factor: float) -> None:
    known = lookup(prefix + "s")
    assert known is not None
    assert math.isclose(known[0], factor, rel_tol=1e-12) and known[1] == (0, 0, 1, 0, 0)


def test_the_kilogram_is_the_base_unit_of_mass() -> None:
    # SI Brochure (9th ed.), section 2.3.1 and Table 2: the kilogram is the base unit; the
    # gram carries the prefixes (section 3: prefixes attach to "gram"; from memory).
    assert lookup("kg")[:2] == (1.0, MASS)
    assert math.isclose(lookup("mg")[0], 1e-6) and math.isclose(lookup("µg")[0], 1e-9)


def test_the_litre_is_a_cubic_decimetre() -> None:
    # SI Brochure (9th ed.), Table 8: 1 L = 1 dm³ = 10⁻³ m³ (from memory).
    litre, cubic_decimetre = _unit(" L"), _unit(" dm³")
    assert litre.dims == cubic_decimetre.dims == (0, 3, 0, 0, 0)
    assert math.isclose(litre.factor, cubic_decimetre.factor) and math.isclose(litre.factor, 1e-3)
    assert math.isclose(_unit(" mL").factor, 1e-6) and _unit(" ml").factor == _unit(" mL").factor


def test_time_units_accepted_for_use_with_the_si() -> None:
    # SI Brochure (9th ed.), Table 8: min = 60 s, h = 3600 s, d = 86 400 s (from memory).
    assert (_unit(" min").factor, _unit(" h").factor, _unit(" d").factor) == (60.0, 3600.0, 86400.0)
    assert _unit(" days").factor == 86400.0 and _unit(" hours").kind == "time"


def test_degree_celsius_is_kelvin_less_273_15() -> None:
    # SI Brochure (9th ed.), section 2.3.1: t/°C = T/K − 273.15 (from memory).
    celsius = _unit(" °C")
    assert math.isclose(celsius.to_base(37.0), 310.15) and celsius.kind == "temperature"
    assert _unit(" ° C").to_base(0.0) == 273.15 and _unit(" K").to_base(300.0) == 300.0


def test_pressure_units_convert_to_pascals() -> None:
    # 1 bar = 10⁵ Pa and 1 mmHg = 133.322 387 415 Pa (ISO 80000-4; from memory).
    assert _unit(" MPa").factor == 1e6 and _unit(" kPa").kind == "pressure"
    assert _unit(" bar").factor == 1e5 and math.isclose(_unit(" mmHg").factor, 133.322387415)


def test_molar_is_mole_per_litre() -> None:
    # IUPAC Green Book (3rd ed., 2007), section 2.10: M = mol dm⁻³ = mol/L (from memory).
    assert math.isclose(_unit(" mM").factor, _unit(" mmol/L").factor)
    assert _unit(" µM").kind == _unit(" µmol L-1").kind == "concentration"


@pytest.mark.parametrize("written", [" mg/kg", " mg kg-1", " mg kg⁻¹", " mg·kg⁻¹", " mg per kg"])
def test_compound_units_in_their_written_forms(written: str) -> None:
    # SI Brochure (9th ed.), section 5.4.6: a quotient of units written with a solidus or
    # negative powers (m/s, m s⁻¹, m·s⁻¹; from memory).
    unit = _unit(written)
    assert math.isclose(unit.factor, 1e-6) and unit.dims == (0, 0, 0, 0, 0) and unit.kind == "unit ratio"


def test_mass_concentration_and_areas() -> None:
    # 1 µg/mL = 1 mg/L = 10⁻³ kg/m³ (SI prefixes, Table 7; from memory).
    assert math.isclose(_unit(" µg/mL").factor, _unit(" mg/L").factor) and _unit(" mg/L").kind == "mass concentration"
    # Hectare: 1 ha = 10⁴ m² (SI Brochure, 9th ed., Table 8; from memory).
    assert _unit(" ha").factor == 1e4 and _unit(" ha").dims == _unit(" m²").dims == (0, 2, 0, 0, 0)


def test_units_are_whole_tokens() -> None:
    # "the 5 most" holds no metre, "5 pm" no picometre, "nests" no unit at all.
    assert read_unit(" most", 0) is None and read_unit(" pm", 0) is None and read_unit(" nests", 0) is None
    assert read_unit(" nm", 0)[0].factor == 1e-9  # other prefixed metres still read
    assert read_unit(" m-long", 0) is None  # "5 m-long": a hyphenated word, not a metre
    # A space joins a second unit only with a negative power: "5 m high" is 5 metres.
    assert _unit(" m high").text == "m"


def test_unit_written_with_or_without_a_space() -> None:
    # SI Brochure (9th ed.), section 5.4.3: a space between number and unit ("5 mg");
    # "5mg" and "a 10-min interval" are common in practice (common practice, no source).
    assert read_unit("mg", 0)[0].text == read_unit(" mg", 0)[0].text == "mg"
    assert read_unit("-min interval", 0)[0].factor == 60.0


def test_dimension_signature_names_the_powers() -> None:
    assert dims_signature((1, -2, 0, 0, 0)) == "M L-2"
    assert _unit(" kg m-2").kind == "M L-2"  # no name in the table: the powers are the kind
