"""Unit parsing and display (bilayer.core.units).

Reference values: the inch is exactly 25.4 mm and the pound exactly 0.45359237 kg (international
yard and pound agreement, 1959); standard gravity is exactly 9.80665 m/s^2 (3rd CGPM, 1901); a
Fahrenheit degree is 5/9 K and T[K] = (T[degF] + 459.67)/1.8, T[K] = T[degC] + 273.15 (NIST SP 811,
2008 edition, Appendix B). From these: 1 psi = 0.45359237*9.80665/0.0254^2 Pa = 6894.757... Pa.
"""
from __future__ import annotations

import math
import subprocess
import sys
from fractions import Fraction

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from bilayer.core.errors import InputError, UnitError
from bilayer.core.units import KINDS, UNIT_SYSTEMS, display_unit, format_quantity, from_si, kind_info, parse, to_display

PSI = Fraction("0.45359237") * Fraction("9.80665") / Fraction("0.0254") ** 2  # Pa, exact (1959 + CGPM)


def test_one_mil_is_exactly_25_4_micrometres():
    """1 mil = 0.001 in = 25.4 um exactly (inch = 25.4 mm by definition)."""
    assert parse("1 mil", "length") == 25.4e-6
    assert parse("10 mil", "length") == 0.000254
    assert parse("10mil", "length") == 0.000254
    assert to_display(25.4e-6, "length", "us") == (1.0, "mil")


def test_thirty_msi_is_206_84_gpa():
    """30 Msi = 30e6 psi; psi from the exact definitions of pound, inch and standard gravity."""
    value = parse("30 Msi", "modulus")
    assert value == float(30_000_000 * PSI)
    assert value == pytest.approx(206.84e9, rel=1e-4)
    assert parse("36 ksi", "stress") == float(36_000 * PSI)
    assert parse("5000 psi", "stress") == float(5000 * PSI)


def test_cte_per_degree_fahrenheit():
    """15.5e-6 per degF step is 15.5e-6 * 9/5 = 27.9e-6 per K (NIST SP 811: 1 degF step = 5/9 K)."""
    assert parse("15.5e-6/degF", "cte") == 27.9e-6
    assert parse("15.5e-6/delta_degF", "cte") == 27.9e-6
    assert parse("15.5 ppm/°F", "cte") == 27.9e-6


def test_steel_cte_common_practice():
    """Common practice: steel CTE 6.5e-6/degF = 11.7e-6/K (materials.md sec. 10 checks it as 11.7 ppm/K)."""
    assert parse("6.5e-6/degF", "cte") == pytest.approx(11.7e-6, rel=1e-15)


@pytest.mark.parametrize("ppm_per_degf", [0.5, 1.0, 6.5, 9.4, 15.5, 28.0])
def test_ppm_per_degf_times_1_8_is_ppm_per_k(ppm_per_degf):
    """1 ppm/degF = 1.8 ppm/K (a degF step is 5/9 K; NIST SP 811)."""
    assert parse(f"{ppm_per_degf} ppm/degF", "cte") == pytest.approx(ppm_per_degf * 1.8e-6, rel=1e-15)


def test_absolute_temperatures():
    """NIST SP 811 B.9: T[K] = T[degC] + 273.15 and T[K] = (T[degF] + 459.67)/1.8."""
    assert parse("70 degF", "temperature") == pytest.approx(294.261111, abs=1e-6)
    assert parse("70 degF", "temperature") == float((Fraction(70) + Fraction("459.67")) / Fraction("1.8"))
    assert parse("120 degC", "temperature") == 393.15
    assert parse("-40 degC", "temperature") == parse("-40 degF", "temperature")  # the scales cross at -40
    assert parse("300 K", "temperature") == 300.0
    assert parse(300, "temperature") == 300.0  # numbers are kelvin


def test_temperature_differences():
    """A 180 degF step equals a 100 K step (5/9 K per degF)."""
    assert parse("100 K", "temperature_difference") == 100.0
    assert parse("100 delta_degC", "temperature_difference") == 100.0
    assert parse("180 delta_degF", "temperature_difference") == 100.0
    assert parse("-25 delta_degC", "temperature_difference") == -25.0


@pytest.mark.parametrize("text, suggestion", [("100 degC", "100 delta_degC"), ("180 degF", "180 delta_degF"),
                                              ("5°C", "5 delta_degC")])
def test_absolute_temperature_refused_as_difference(text, suggestion):
    with pytest.raises(UnitError) as info:
        parse(text, "temperature_difference", "conditions.temperature_change")
    message = str(info.value)
    assert "conditions.temperature_change" in message
    assert "absolute temperature" in message
    assert suggestion in message


def test_difference_refused_as_absolute_temperature():
    with pytest.raises(UnitError, match="temperature difference"):
        parse("100 delta_degC", "temperature", "stress_free_temperature")


def test_below_absolute_zero_refused():
    with pytest.raises(InputError, match=">= 0 K"):
        parse("-300 degC", "temperature", "t")
    with pytest.raises(InputError):
        parse(-1.0, "temperature", "t")


@pytest.mark.parametrize("text, kind, expected", [
    ("0.25 mm", "length", 0.00025),
    ("1/8 in", "length", 0.003175),  # 0.125 * 25.4 mm
    ("2.1 GPa", "modulus", 2.1e9),
    ("28 ppm/K", "cte", 28e-6),
    ("5 N/mm", "force_per_width", 5000.0),
    ("0.5 N*m/m", "moment_per_width", 0.5),
    ("2 N*mm/mm", "moment_per_width", 2.0),  # N*mm/mm = N
    ("10 N", "force", 10.0),
    ("2 h", "time", 7200.0),
    ("15 min", "time", 900.0),
    ("1 Hz", "frequency", 1.0),
    ("0.5 1/m", "curvature", 0.5),
    ("8.9 g/cm^3", "density", 8900.0),
    ("1000 ppm", "strain", 1e-3),
    ("0.3", "dimensionless", 0.3),
])
def test_unit_texts(text, kind, expected):
    assert parse(text, kind) == expected


def test_cycles_per_day_count_cycles_not_radians():
    """'2 cycles/day' is 2 per 86400 s (pint's own 'cycle' would be 2*pi radians)."""
    assert parse("2 cycles/day", "frequency") == 2 / 86400
    assert parse("1 cycle/day", "frequency") == 1 / 86400


def test_pound_force_per_inch():
    """1 lbf/in = 0.45359237*9.80665 N / 0.0254 m (exact definitions)."""
    assert parse("1 lbf/in", "force_per_width") == float(Fraction("0.45359237") * Fraction("9.80665")
                                                         / Fraction("0.0254"))


def test_numbers_are_si_and_quantities_accepted():
    import pint

    assert parse(0.00025, "length") == 0.00025
    assert parse(3, "length") == 3.0
    other = pint.UnitRegistry()  # a caller's own registry
    assert parse(other.Quantity(0.25, "mm"), "length") == 0.00025
    assert parse(other.Quantity(120, "degC"), "temperature") == 393.15
    assert parse(other.Quantity(15.5e-6, "1/delta_degF"), "cte") == 27.9e-6
    with pytest.raises(UnitError):
        parse(other.Quantity(100, "degC"), "temperature_difference")
    with pytest.raises(UnitError):
        parse(other.Quantity(1, "s"), "length")


def test_wrong_dimension_names_field_value_and_expected_units():
    with pytest.raises(UnitError) as info:
        parse("0.5 MPa", "length", "layers[2].thickness")
    message = str(info.value)
    assert "layers[2].thickness" in message and "0.5 MPa" in message
    assert "a length" in message and "mm" in message  # expected dimension with examples
    assert "modulus" in message  # what was given instead


@pytest.mark.parametrize("value", [math.nan, math.inf, -math.inf, "nan mm", "inf mm", "1e999 mm"])
def test_non_finite_is_input_error(value):
    with pytest.raises(InputError, match="finite"):
        parse(value, "length", "thickness")


@pytest.mark.parametrize("text", ["", "   ", "mm", "0.25", "1 (", "furlongs 3 3 (", "__import__('os') m",
                                  "0.25 mmm", "10**10**10 m", "10**3 Pa", "1 m^0.5", "x" * 200,
                                  "().__class__ m", "1 m; import os"])
def test_unreadable_text_is_unit_error(text):
    with pytest.raises(UnitError):
        parse(text, "length", "thickness")


@pytest.mark.parametrize("value", [True, None, [1.0], {"a": 1}, b"1 mm", object()])
def test_non_quantities_refused(value):
    with pytest.raises(InputError):
        parse(value, "length", "thickness")


def test_unknown_kind():
    with pytest.raises(InputError, match="kind"):
        parse(1.0, "lenght")


@pytest.mark.parametrize("value, kind, system, text", [
    (0.00025, "length", "si", "0.25 mm"),
    (25e-6, "length", "si", "25 um"),
    (0.00025, "length", "us", "9.843 mil"),
    (0.0254, "length", "us", "1 in"),
    (393.15, "temperature", "si", "120 degC"),
    (393.15, "temperature", "us", "248 degF"),
    (273.15, "temperature", "si", "0 degC"),
    (100.0, "temperature_difference", "si", "100 K"),
    (100.0, "temperature_difference", "us", "180 delta_degF"),
    (200e9, "modulus", "si", "200 GPa"),
    (200e9, "modulus", "us", "29.01 Msi"),
    (250e6, "stress", "si", "250 MPa"),
    (250e6, "stress", "us", "36.26 ksi"),
    (27.9e-6, "cte", "si", "27.9 ppm/K"),
    (27.9e-6, "cte", "us", "15.5 ppm/degF"),
    (5000.0, "force_per_width", "si", "5 N/mm"),
    (8000.0, "density", "si", "8000 kg/m^3"),
])
def test_format(value, kind, system, text):
    assert format_quantity(value, kind, system) == text


def test_display_unit_choice_by_size():
    assert display_unit("length", "si", 10e-6) == "um"
    assert display_unit("length", "si", 1e-3) == "mm"
    assert display_unit("length", "si", 2.0) == "m"
    assert display_unit("stress", "us", 100 * 6894.757) == "psi"
    assert display_unit("stress", "us", 1e8) == "ksi"
    with pytest.raises(InputError):
        display_unit("length", "imperial")


finite = st.floats(min_value=-1e12, max_value=1e12, allow_nan=False, allow_infinity=False)


@settings(max_examples=300, deadline=None)
@given(value=finite, kind=st.sampled_from(sorted(k for k in KINDS if k != "temperature")),
       system=st.sampled_from(UNIT_SYSTEMS))
def test_format_parses_back(value, kind, system):
    """What format_quantity() prints reads back through parse() (to the printed precision)."""
    text = format_quantity(value, kind, system, digits=17)
    assert parse(text, kind) == pytest.approx(value, rel=1e-15, abs=1e-300)


@settings(max_examples=200, deadline=None)
@given(value=st.floats(min_value=0.0, max_value=5000.0), system=st.sampled_from(UNIT_SYSTEMS))
def test_temperature_display_parses_back(value, system):
    number, label = to_display(value, "temperature", system)
    assert parse(f"{number!r} {label}", "temperature") == pytest.approx(value, rel=1e-14, abs=1e-10)


@settings(max_examples=200, deadline=None)
@given(value=st.floats(min_value=-1e3, max_value=1e3, allow_nan=False))
def test_inch_conversions_are_correctly_rounded(value):
    """Conversions use exact rational factors (1 in = 0.0254 m exactly): results are correctly rounded."""
    assert from_si(value, "length", "in") == float(Fraction(value) / Fraction(254, 10_000))
    assert from_si(value, "length", "mil") == float(Fraction(value) / Fraction(254, 10_000_000))
    assert parse(f"{value!r} in", "length") == float(Fraction(repr(value)) * Fraction(254, 10_000))


def test_kind_info_lists_examples():
    info = kind_info("cte")
    assert info.si_unit == "1/K" and info.examples


def test_pint_is_not_imported_by_bilayer():
    """Import cost: pint loads on the first unit text, not on `import bilayer` or `import bilayer.core.units`."""
    code = "import sys, bilayer, bilayer.core.units; print('pint' in sys.modules)"
    output = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True).stdout
    assert output.strip() == "False"
