"""CTE models: published formula, table re-basing, exact integration, validation, broadcasting."""
from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.integrate import quad

from bilayer.core.errors import InputError
from bilayer.core.materials import ConstantCTE, InstantaneousCTETable, MeanCTETable, SiliconCTE, range_warning

C = 273.15  # degC -> K


def okada_tokumaru_alpha(t: float) -> float:
    """alpha(T) of silicon as published by Okada & Tokumaru, J. Appl. Phys. 56, 314 (1984), T in K."""
    return (3.725 * (1.0 - math.exp(-5.88e-3 * (t - 124.0))) + 5.548e-4 * t) * 1e-6


# --- mean tables -------------------------------------------------------------------------------------


def test_mean_table_rebasing_hand_arithmetic():
    """Re-basing means from 20 degC: 16.9 ppm/K to 100 degC and 17.9 ppm/K to 300 degC.

    Definition of a mean (secant) coefficient (ASM Handbook thermal-expansion chapter; IEC 60050
    561-06-08): eps(20 -> T) = abar(T) (T - 20). By hand: eps(20 -> 300) = 17.9e-6 * 280 = 5.012e-3,
    eps(20 -> 100) = 16.9e-6 * 80 = 1.352e-3, so eps(100 -> 300) = 3.660e-3 and the mean between
    100 and 300 degC is 3.660e-3 / 200 = 18.30e-6 /K, not the 17.9e-6 of the table.
    """
    table = MeanCTETable(20 + C, (100 + C, 300 + C), (16.9e-6, 17.9e-6))
    assert table.thermal_strain(100 + C, 300 + C) == pytest.approx(3.660e-3, rel=1e-12)
    assert table.secant(100 + C, 300 + C) == pytest.approx(18.30e-6, rel=1e-12)
    assert table.thermal_strain(20 + C, 300 + C) == pytest.approx(5.012e-3, rel=1e-12)
    assert table.thermal_strain(300 + C, 100 + C) == pytest.approx(-3.660e-3, rel=1e-12)


def test_mean_table_holds_end_values_and_interpolates_the_mean():
    """abar is linear between points and constant outside (documented extrapolation rule)."""
    table = MeanCTETable(20 + C, (100 + C, 300 + C), (16.9e-6, 17.9e-6))
    # 200 degC: abar = 17.4e-6 by linear interpolation; strain = 17.4e-6 * 180
    assert table.thermal_strain(20 + C, 200 + C) == pytest.approx(17.4e-6 * 180, rel=1e-12)
    # 50 degC lies below the first point: abar held at 16.9e-6
    assert table.thermal_strain(20 + C, 50 + C) == pytest.approx(16.9e-6 * 30, rel=1e-12)
    # 400 degC lies above the table: abar held at 17.9e-6
    assert table.thermal_strain(20 + C, 400 + C) == pytest.approx(17.9e-6 * 380, rel=1e-12)
    assert table.valid_range == pytest.approx((20 + C, 300 + C))
    assert table.covers(20 + C, 300 + C)
    assert not table.covers(20 + C, 400 + C)


def test_mean_table_instantaneous_is_the_derivative_of_the_strain():
    """alpha = d eps/dT = abar + (T - T0) dabar/dT, checked by central differences off the knots."""
    table = MeanCTETable(30 + C, (100 + C, 150 + C, 200 + C, 300 + C), (1.93e-6, 2.38e-6, 3.03e-6, 6.05e-6))
    for t in (60 + C, 120 + C, 175 + C, 260 + C, 350 + C):
        h = 1e-3
        numeric = (table.thermal_strain(t - h, t + h)) / (2 * h)
        assert table.instantaneous(t) == pytest.approx(numeric, rel=1e-6)


def test_mean_table_with_points_on_both_sides_of_the_reference():
    """A table of means from 70 degF with points below and above it: zero strain at the reference."""
    reference = (70 - 32) / 1.8 + C
    table = MeanCTETable(reference, ((-100 - 32) / 1.8 + C, (200 - 32) / 1.8 + C), (6.3e-6 * 1.8, 7.4e-6 * 1.8))
    assert table.thermal_strain(reference, reference) == 0.0
    # cooling 70 -> -100 degF with the tabulated mean 6.3e-6/degF: -6.3e-6 * 170 = -1.071e-3
    assert table.thermal_strain(reference, (-100 - 32) / 1.8 + C) == pytest.approx(-1.071e-3, rel=1e-9)
    assert table.valid_range[0] == pytest.approx((-100 - 32) / 1.8 + C)


# --- instantaneous tables -------------------------------------------------------------------------------


def test_instantaneous_table_matches_quad_of_the_piecewise_linear_alpha():
    """Exact piecewise integration against scipy.integrate.quad of the same interpolated alpha."""
    temps = (150.0, 250.0, 300.0, 400.0, 600.0)
    values = (0.5e-6, 2.0e-6, 2.6e-6, 3.3e-6, 3.9e-6)
    table = InstantaneousCTETable(temps, values)

    def alpha(t):
        return float(np.interp(t, temps, values))

    for t1, t2 in [(150, 600), (200, 290), (310, 305), (100, 700), (50, 180), (420, 900)]:
        expected, _ = quad(alpha, t1, t2, points=[t for t in temps if min(t1, t2) < t < max(t1, t2)], epsabs=1e-16)
        assert table.thermal_strain(t1, t2) == pytest.approx(expected, rel=1e-10, abs=1e-16)


def test_instantaneous_table_by_hand():
    """alpha 1, 2, 4 ppm/K at 200, 300, 400 K: trapezoids 150e-6 and 300e-6 between the points."""
    table = InstantaneousCTETable((200.0, 300.0, 400.0), (1e-6, 2e-6, 4e-6))
    assert table.thermal_strain(200, 400) == pytest.approx(450e-6, rel=1e-12)
    assert table.thermal_strain(250, 350) == pytest.approx(87.5e-6 + 125e-6, rel=1e-12)
    assert table.instantaneous(350.0) == pytest.approx(3e-6)
    assert table.instantaneous(500.0) == pytest.approx(4e-6)  # end value held


# --- silicon ------------------------------------------------------------------------------------------------


def test_silicon_alpha_is_the_published_formula():
    """Okada & Tokumaru (1984) alpha(T), evaluated independently above."""
    model = SiliconCTE()
    temps = np.array([120.0, 150.0, 200.0, 293.15, 300.0, 373.15, 573.15, 1000.0, 1500.0])
    expected = np.array([okada_tokumaru_alpha(t) for t in temps])
    assert np.allclose(model.instantaneous(temps), expected, rtol=1e-12, atol=0)


def test_silicon_closed_form_strain_matches_quad():
    """Closed-form strain against numerical integration (scipy quad) of the published alpha(T)."""
    model = SiliconCTE()
    pairs = [(120, 1500), (293.15, 673.15), (300, 300.5), (800, 250), (150, 160), (1400, 1499)]
    for t1, t2 in pairs:
        expected, _ = quad(okada_tokumaru_alpha, t1, t2, epsabs=1e-16, epsrel=1e-13)
        assert model.thermal_strain(t1, t2) == pytest.approx(expected, rel=1e-10)


def test_silicon_secant_25_to_400_degC():
    """Secant 25 -> 400 degC = 3.455 ppm/K and the 26 % error of using alpha(25 degC).

    Derived check value, applications.md section 7, re-verified here by quad of the published formula.
    """
    model = SiliconCTE()
    strain, _ = quad(okada_tokumaru_alpha, 25 + C, 400 + C, epsabs=1e-16)
    assert strain == pytest.approx(1.2955e-3, rel=1e-4)
    assert model.secant(25 + C, 400 + C) == pytest.approx(strain / 375.0, rel=1e-10)
    assert model.secant(25 + C, 400 + C) == pytest.approx(3.455e-6, rel=1e-3)
    understatement = 1 - model.instantaneous(25 + C) * 375.0 / model.thermal_strain(25 + C, 400 + C)
    assert understatement == pytest.approx(0.261, abs=0.001)


def test_silicon_outside_the_fit_holds_end_values_and_warns():
    model = SiliconCTE()
    assert model.valid_range == (120.0, 1500.0)
    assert model.instantaneous(50.0) == pytest.approx(okada_tokumaru_alpha(120.0))
    # below 120 K the strain continues with the 120 K coefficient
    assert model.thermal_strain(100.0, 120.0) == pytest.approx(20.0 * okada_tokumaru_alpha(120.0), rel=1e-12)
    assert not model.covers(100.0, 300.0)
    message = range_warning(model, 100.0, 300.0, "layers[0]")
    assert message is not None and "layers[0]" in message and "extrapolated" in message
    assert range_warning(model, 200.0, 300.0, "layers[0]") is None


# --- common behaviour ------------------------------------------------------------------------------------


MODELS = [
    ConstantCTE(11.7e-6),
    MeanCTETable(293.15, (373.15, 573.15, 773.15), (16.9e-6, 17.9e-6, 18.6e-6)),
    InstantaneousCTETable((200.0, 300.0, 500.0, 900.0), (1e-6, 3e-6, 2e-6, 6e-6)),
    SiliconCTE(),
]


@pytest.mark.parametrize("model", MODELS, ids=lambda m: m.kind)
def test_broadcasting_over_arrays(model):
    t_from = np.array([[250.0], [300.0], [350.0]])
    t_to = np.array([280.0, 400.0, 650.0, 1000.0])
    strain = model.thermal_strain(t_from, t_to)
    assert strain.shape == (3, 4)
    for i in range(3):
        for j in range(4):
            assert strain[i, j] == pytest.approx(model.thermal_strain(float(t_from[i, 0]), float(t_to[j])), rel=1e-13)
    assert isinstance(model.thermal_strain(300.0, 400.0), float)
    assert model.secant(np.array([300.0, 300.0]), np.array([300.0, 400.0])).shape == (2,)


@pytest.mark.parametrize("model", MODELS, ids=lambda m: m.kind)
@settings(max_examples=60, deadline=None)
@given(
    a=st.floats(100.0, 1600.0),
    b=st.floats(100.0, 1600.0),
    c=st.floats(100.0, 1600.0),
)
def test_strain_is_additive_and_antisymmetric(model, a, b, c):
    """eps(a->b) + eps(b->c) = eps(a->c) and eps(a->b) = -eps(b->a): a strain is a difference of states."""
    total = model.thermal_strain(a, c)
    assert model.thermal_strain(a, b) + model.thermal_strain(b, c) == pytest.approx(total, abs=1e-15)
    assert model.thermal_strain(a, b) == pytest.approx(-model.thermal_strain(b, a), abs=1e-18)


@pytest.mark.parametrize("model", MODELS, ids=lambda m: m.kind)
def test_secant_at_a_single_temperature_is_the_instantaneous_value(model):
    assert model.secant(350.0, 350.0) == pytest.approx(model.instantaneous(350.0))
    assert model.nominal == pytest.approx(model.secant(293.15, 373.15))


def test_constant_cte():
    model = ConstantCTE(11.7e-6, reference_range=(293.15, 373.15))
    assert model.thermal_strain(293.15, 303.15) == pytest.approx(11.7e-5)
    assert model.secant(250.0, 600.0) == pytest.approx(11.7e-6)
    assert model.nominal == 11.7e-6
    assert model.covers(4.0, 3000.0)  # no valid range stated
    limited = ConstantCTE(11.7e-6, valid_range=(223.15, 423.15))
    assert limited.covers(233.15, 423.15) and not limited.covers(233.15, 500.0)
    assert "extrapolated" in range_warning(limited, 233.15, 500.0, "steel")


# --- validation -------------------------------------------------------------------------------------------


def test_absolute_temperatures_are_required():
    with pytest.raises(InputError) as info:
        ConstantCTE(1e-5).thermal_strain(293.15, -20.0)
    assert info.value.field == "t_to" and info.value.value == -20.0
    assert "kelvin" in str(info.value)
    with pytest.raises(InputError) as info:
        SiliconCTE().thermal_strain(np.array([300.0, np.nan]), 400.0)
    assert info.value.field == "t_from"


@pytest.mark.parametrize(
    "build, field",
    [
        (lambda: ConstantCTE(17.0), "cte.value"),
        (lambda: ConstantCTE(float("inf")), "cte.value"),
        (lambda: MeanCTETable(293.15, (373.15, 373.15), (1e-5, 1e-5)), "cte.temperatures[1]"),
        (lambda: MeanCTETable(293.15, (373.15, 473.15), (1e-5, 2e-3)), "cte.values[1]"),
        (lambda: MeanCTETable(-20.0, (373.15, 473.15), (1e-5, 1e-5)), "cte.reference_temperature"),
        (lambda: InstantaneousCTETable((300.0,), (1e-5,)), "cte.temperatures"),
        (lambda: InstantaneousCTETable((300.0, 400.0), (1e-5,)), "cte.values"),
        (lambda: InstantaneousCTETable((0.0, 400.0), (1e-5, 1e-5)), "cte.temperatures[0]"),
        (lambda: ConstantCTE(1e-5, valid_range=(400.0, 300.0)), "cte.valid_range"),
    ],
)
def test_bad_tables_name_the_field_value_and_range(build, field):
    with pytest.raises(InputError) as info:
        build()
    assert info.value.field == field
    assert info.value.valid  # the accepted range is stated
    assert field in str(info.value)


def test_ppm_typed_as_per_kelvin_gets_a_hint():
    with pytest.raises(InputError, match="17 ppm/K is 17e-6"):
        ConstantCTE(17.0)
