"""Thermostat elements: flexivity, element forms, set points, contact force, work and stress.

Every check names its source. "applications.md" / "layers.md" are the project's reference sheets
(shared/reference beside the checkout); their [D]/[DER] check values are used only where the test re-derives them by a
second, independent method (a hand formula or a numerical integration written here).
"""
from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.integrate import quad
from scipy.optimize import brentq

import bilayer as bl
from bilayer.core.errors import InputError
from bilayer.core.materials import InstantaneousCTETable
from bilayer.thermostat.element import THERMOSTAT_CAUTIONS, ThermalElement, closing_temperature, contact_load, gap_for_set_point, meeting_temperature, response, work_output, working_span
from bilayer.thermostat.forms import Cantilever, FlatDisc, Helix, Spiral, SupportedStrip, UShape
from bilayer.thermostat.strip import DatasheetStrip, Flexivity, ThermostatStrip

T0 = 293.15


def material(name, E, nu, alpha, strength=None):
    return bl.Material(name, E, nu, alpha, strength=strength, strength_kind="yield" if strength else "")


def example_a(width=5e-3, state="narrow"):
    """layers.md 'Example A': 140 GPa / 1.5 ppm/K under 100 GPa / 19.5 ppm/K, 0.5 mm each."""
    stack = bl.Stack.of((material("low", 140e9, 0.30, 1.5e-6), 0.5e-3), (material("high", 100e9, 0.33, 19.5e-6), 0.5e-3))
    return ThermostatStrip(stack, width, T0, state=state)


def timoshenko_curvature(E1, E2, t1, t2, dalpha, dT):
    """Timoshenko (1925), J. Opt. Soc. Am. 11:233, eq. for 1/rho, layer 1 at the bottom (hand formula)."""
    m, n, h = t1 / t2, E1 / E2, t1 + t2
    return 6 * dalpha * dT * (1 + m) ** 2 / (h * (3 * (1 + m) ** 2 + (1 + m * n) * (m * m + 1 / (m * n))))


def datasheet(F=20e-6, t=0.5e-3, w=6e-3, E=170e9, allowable=None):
    return DatasheetStrip(Flexivity.from_datasheet(F), t, w, T0, modulus=E, allowable=allowable)


# --- flexivity ------------------------------------------------------------------------------------------


def test_flexivity_follows_astm_b106_definition_from_the_engine():
    """ASTM B106: F = t (1/R2 - 1/R1)/(T2 - T1); curvatures here from bl.evaluate at two temperatures."""
    strip = example_a()
    T1, T2 = 300.0, 380.0
    k = bl.evaluate(strip.stack, bl.Temperatures(T0, np.array([T1, T2]))).curvature
    expected = strip.thickness * (k[1] - k[0]) / (T2 - T1)
    flex = strip.flexivity(T1, T2)
    assert flex.origin == "stack, secant"
    assert flex.per_kelvin == pytest.approx(expected, rel=1e-12)
    # and it equals Timoshenko's F = kappa h / dT for constant CTEs (layers.md 1.6, Timoshenko 1925)
    assert flex.per_kelvin == pytest.approx(timoshenko_curvature(140e9, 100e9, 0.5e-3, 0.5e-3, 18e-6, 1.0) * 1e-3, rel=1e-12)


def test_flexivity_per_degF_times_1p8_is_per_K():
    """ASTM B106 inch-pound units: 1 K = 1.8 degF, so F[1/K] = 1.8 F[1/degF] (definition of the degree)."""
    a = Flexivity.from_datasheet(150e-7, unit="1/degF")
    assert a.per_kelvin == pytest.approx(150e-7 * 1.8, rel=1e-15)
    assert a.per_fahrenheit * 1.8 == pytest.approx(a.per_kelvin, rel=1e-15)
    strip_value = example_a().flexivity(300.0, 350.0)
    assert strip_value.per_fahrenheit * 1.8 == pytest.approx(strip_value.per_kelvin, rel=1e-15)


def test_datasheet_flexivity_accepts_unit_strings():
    """150e-7/degF = 27.0e-6/K (unit arithmetic; applications.md 1.2 quotes the same pair)."""
    pytest.importorskip("pint")
    assert Flexivity.from_datasheet("150e-7 / degF").per_kelvin == pytest.approx(27.0e-6, rel=1e-12)


@pytest.mark.parametrize("n", [0.25, 0.5, 0.8, 1.0, 1.5, 3.0, 7.0])
def test_flexivity_at_optimum_ratio_is_one_and_a_half_cte_difference(n):
    """Timoshenko (1925): at t1/t2 = sqrt(E2/E1) the curvature is 3 da dT / (2h) for ANY modulus ratio,
    so the flexivity is exactly 1.5 da. Engine strip built at the design helper's optimum ratio."""
    from bilayer.thermostat.sizing import optimum_thickness_ratio

    low, high = material("low", n * 60e9, 0.3, 2e-6), material("high", 60e9, 0.3, 20e-6)
    result = optimum_thickness_ratio(low, high, total_thickness=0.6e-3)
    assert result.ratio == pytest.approx(math.sqrt(1 / n), rel=1e-12)
    assert result.flexivity == pytest.approx(1.5 * 18e-6, rel=1e-12)
    assert result.flexivity_over_cte_difference == pytest.approx(1.5, rel=1e-12)


def test_temperature_dependent_cte_is_integrated():
    """Curvature follows the integrated mismatch int(a2 - a1) dT, not a room-temperature product
    (applications.md section 7). Equal moduli and thicknesses: kappa = 1.5 (eps2 - eps1) / h (Timoshenko
    1925, m = n = 1); the integral is done here with scipy quad over the piecewise-linear table."""
    temps, values = (250.0, 350.0, 450.0, 550.0), (15e-6, 18e-6, 24e-6, 26e-6)
    high = bl.Material("rising", 150e9, 0.3, InstantaneousCTETable(temps, values))
    low = material("flat", 150e9, 0.3, 1.5e-6)
    strip = ThermostatStrip(bl.Stack.of((low, 0.3e-3), (high, 0.3e-3)), 5e-3, T0)
    T = np.array([320.0, 400.0, 500.0])
    mismatch = np.array([quad(lambda x: np.interp(x, temps, values) - 1.5e-6, T0, Ti, points=temps[1:3])[0] for Ti in T])
    np.testing.assert_allclose(strip.curvature(T), 1.5 * mismatch / 0.6e-3, rtol=1e-10)
    # instantaneous flexivity = 1.5 (a2(T) - a1)
    np.testing.assert_allclose(strip.flexivity_curve(T), 1.5 * (np.interp(T, temps, values) - 1.5e-6), rtol=1e-12)


def test_range_outside_cte_data_is_warned():
    """The engine warns when the range leaves a material's CTE data (design rule, applications.md 7)."""
    pytest.importorskip("bilayer.core.units")
    high = bl.Material("rising", 150e9, 0.3, InstantaneousCTETable((250.0, 450.0), (15e-6, 20e-6)))
    strip = ThermostatStrip(bl.Stack.of((material("flat", 150e9, 0.3, 1.5e-6), 0.3e-3), (high, 0.3e-3)), 5e-3, T0)
    curve = response(ThermalElement(strip, Cantilever(0.03)), np.linspace(280.0, 600.0, 50))
    assert any("CTE" in w for w in curve.warnings)


def test_datasheet_path_is_labelled_and_refuses_non_datasheet_values():
    """Flexivity from a data sheet drives the elements directly (applications.md 1.2: dkappa = F dT / t)."""
    strip = datasheet()
    assert strip.source == "flexivity from a data sheet"
    assert strip.curvature_change(T0 + 50) == pytest.approx(2.0, rel=1e-14)  # 20e-6 * 50 / 0.5e-3
    with pytest.raises(InputError):
        DatasheetStrip(example_a().flexivity(300.0, 350.0), 0.5e-3, 5e-3)
    with pytest.raises(InputError):
        Flexivity.from_datasheet(20e-6, unit="1/degR")


# --- element forms -------------------------------------------------------------------------------------
# Check strip of applications.md 1.5: F = 20e-6/K, dT = 50 K, t = 0.5 mm -> dkappa = 2.0 1/m.


def test_cantilever_small_deflection_is_F_dT_L2_over_2t():
    """Cantilever tip deflection F dT L^2 / (2t) in the small-rotation limit (beam theory, B106 flexivity)."""
    element = ThermalElement(datasheet(), Cantilever(0.04))
    small = element.travel(T0 + 50, exact=False)
    assert abs(small) == pytest.approx(20e-6 * 50 * 0.04**2 / (2 * 0.5e-3), rel=1e-13)  # 1.600 mm
    tiny = element.travel(T0 + 1e-4)
    assert abs(tiny) == pytest.approx(20e-6 * 1e-4 * 0.04**2 / (2 * 0.5e-3), rel=1e-9)


@settings(max_examples=60, deadline=None)
@given(st.floats(0.02, 3.0))
def test_cantilever_exact_arc_matches_integrated_tangent(phi):
    """Exact tip of a uniformly curved cantilever by numerical integration of the tangent angle
    (x' = cos theta, z' = sin theta, theta = -kappa s): an independent check of the closed-form arc chain
    (layers.md section 6). End rotation equals curvature times length exactly; the exact deflection never
    exceeds the small-deflection value (layers.md invariant 18)."""
    L = 0.05
    kappa = phi / L
    form = Cantilever(L)
    x = quad(lambda s: math.cos(-kappa * s), 0, L, epsabs=1e-15)[0]
    z = quad(lambda s: math.sin(-kappa * s), 0, L, epsabs=1e-15)[0]
    xe, ze = form.working_point(kappa)
    assert xe == pytest.approx(x, rel=1e-10, abs=1e-15)
    assert ze == pytest.approx(z, rel=1e-10, abs=1e-15)
    assert form.end_rotation(kappa) == pytest.approx(-kappa * L, rel=1e-15)
    assert abs(form.travel(kappa)) <= abs(form.travel_small(kappa)) * (1 + 1e-12)


def test_cantilever_large_rotation_table():
    """layers.md section 6 table (derived there): delta/L = (1 - cos phi)/phi, e.g. 0.459698 at phi = 1,
    0.708073 at phi = 2, 0.636620 (= 2/pi) at phi = pi/2; here against the hand formula."""
    form = Cantilever(1.0)
    for phi in (0.1, 0.5, 1.0, math.pi / 2, 2.0):
        assert -form.travel(phi) == pytest.approx((1 - math.cos(phi)) / phi, rel=1e-13)
    assert -form.travel(math.pi / 2) == pytest.approx(2 / math.pi, rel=1e-13)
    # small-deflection error ~ phi^2 / 12 (series of (1 - cos phi)/phi against phi/2)
    phi = 0.01
    assert form.travel_small(phi) / form.travel(phi) - 1 == pytest.approx(phi**2 / 12, rel=1e-3)


def test_supported_strip_u_shape_spiral_helix_disc_values():
    """applications.md 1.5 check strip (dkappa = 2.0 1/m): supported span 0.400 mm (k L^2/8), spiral
    L = 300 mm 34.38 deg (k L), disc 20 mm 0.100 mm (k D^2/8); U-shape by the hand integral of the
    moment arm over legs and bend: dkappa (L^2 + pi r L + 2 r^2) (the sheet's formula drops 2 r^2:
    3.451 mm vs its own numerical 3.455 mm)."""
    strip = datasheet()
    T = T0 + 50
    assert ThermalElement(strip, SupportedStrip(0.04)).travel(T, exact=False) == pytest.approx(0.4e-3, rel=1e-13)
    assert ThermalElement(strip, SupportedStrip(0.04)).travel(T) == pytest.approx((1 - math.cos(0.04)) / 2.0, rel=1e-12)
    u = ThermalElement(strip, UShape(0.04, 1e-3))
    L, r = 0.04, 1e-3
    assert u.travel(T, exact=False) == pytest.approx(2.0 * (L * L + math.pi * r * L + 2 * r * r), rel=1e-12)
    assert abs(u.travel(T, exact=False)) * 1e3 == pytest.approx(3.455, abs=5e-4)
    spiral = ThermalElement(strip, Spiral(0.3))
    assert math.degrees(abs(spiral.travel(T))) == pytest.approx(34.38, abs=5e-3)
    helix = ThermalElement(strip, Helix(0.3, lead_angle=0.1))
    assert helix.travel(T) == pytest.approx(spiral.travel(T) * math.cos(0.1), rel=1e-14)
    disc = ThermalElement(strip, FlatDisc(0.02))
    assert disc.travel(T, exact=False) == pytest.approx(0.1e-3, rel=1e-13)


def test_u_shape_exact_travel_against_numerical_integration():
    """Second method for the hairpin: integrate the deformed tangent angle numerically along legs and bend."""
    L, r, dk = 0.03, 2e-3, 8.0
    form = UShape(L, r)
    k0 = -1 / r  # bend toward the top face

    def angle(s):
        bend = min(max(s - L, 0.0), math.pi * r)
        return -(dk * s + k0 * bend)

    total = 2 * L + math.pi * r
    z_def = quad(lambda s: math.sin(angle(s)), 0, total, points=[L, L + math.pi * r], epsabs=1e-14)[0]
    z_ref = quad(lambda s: math.sin(-k0 * min(max(s - L, 0.0), math.pi * r)), 0, total, points=[L, L + math.pi * r])[0]
    assert form.travel(dk) == pytest.approx(z_def - z_ref, rel=1e-9)


# --- forces, work, stress ------------------------------------------------------------------------------


def test_element_stiffness_and_work_match_hand_formulas():
    """applications.md 1.6 (derived there) re-derived by hand here: k = 3 E I / L^3 (498.0 N/m),
    blocked force E w t^2 F dT / (8 L) (0.797 N), spiral torque E w t^2 F dT / 12 (2.125e-2 N m),
    W_max = k D^2 / 4 (3.19e-4 J), W/V = E (F dT)^2 / 64 (2656 J/m^3)."""
    E, w, t, L, F, dT = 170e9, 6e-3, 0.5e-3, 0.04, 20e-6, 50.0
    element = ThermalElement(datasheet(), Cantilever(L))
    I = w * t**3 / 12
    assert element.stiffness == pytest.approx(3 * E * I / L**3, rel=1e-12)
    assert element.blocked_force(T0 + dT) == pytest.approx(E * w * t * t * F * dT / (8 * L), rel=1e-12)
    spiral = ThermalElement(datasheet(), Spiral(0.3))
    assert spiral.blocked_force(T0 + dT) == pytest.approx(E * w * t * t * F * dT / 12, rel=1e-12)
    work = work_output(element, T0 + dT)
    D = F * dT * L * L / (2 * t)
    assert work.work == pytest.approx(3 * E * I / L**3 * D * D / 4, rel=1e-12)
    assert work.work_per_volume == pytest.approx(E * (F * dT) ** 2 / 64, rel=1e-12)
    assert work.optimum_load == pytest.approx(0.5 * work.blocked_force, rel=1e-14)
    assert work.merit == pytest.approx(E * F * F, rel=1e-12)
    assert work.cautions == THERMOSTAT_CAUTIONS


def test_supported_strip_blocked_force_is_six_thermal_moments_over_span():
    """layers.md section 7: simply supported span L, centre force, blocked force 6 M_T / L; here against
    the hand value 48 E I / L^3 * (k L^2 / 8)."""
    strip = example_a()
    form = SupportedStrip(0.05)
    element = ThermalElement(strip, form)
    M_T = strip.thermal_moment_change(T0 + 100) * strip.width
    assert element.blocked_force(T0 + 100) == pytest.approx(6 * M_T / 0.05, rel=1e-12)


def test_blocked_tip_force_is_three_thermal_moments_over_two_lengths():
    """layers.md section 7 (derived there): blocked tip force 3 M_T / (2L), independent of E I, 3.9375 N for
    Example A (b = 5 mm, L = 50 mm). Second method here: the engine's loaded curvature
    kappa(x) = (M_T + M(x))/EI with M(x) = -P (L - x)/b, integrated twice (tip deflection
    int kappa (L - x) dx) must vanish at that force."""
    strip = example_a()
    L = 0.05
    element = ThermalElement(strip, Cantilever(L))
    M_T = float(strip.thermal_moment_change(T0 + 100)) * strip.width
    P = element.blocked_force(T0 + 100)
    assert P == pytest.approx(3 * M_T / (2 * L), rel=1e-12)
    assert P == pytest.approx(3.9375, rel=1e-9)

    def kappa(x):
        moment = -P * (L - x) / strip.width
        return bl.evaluate(strip.stack, bl.Temperatures(T0, T0 + 100), bending_moment=moment).curvature

    tip = quad(lambda x: kappa(x) * (L - x), 0, L, epsabs=1e-15)[0]
    assert abs(tip) < 1e-12 * L
    # independence of E I: stiffer and softer versions with the same thermal moment need the same force
    for scale in (0.5, 2.0):
        stack = bl.Stack.of((material("low", 140e9 * scale, 0.3, 1.5e-6 / scale), 0.5e-3),
                            (material("high", 100e9 * scale, 0.33, 19.5e-6 / scale), 0.5e-3))
        other = ThermalElement(ThermostatStrip(stack, 5e-3, T0), Cantilever(L))
        assert other.blocked_force(T0 + 100) == pytest.approx(P, rel=1e-12)


def test_root_stresses_of_blocked_cantilever_match_engine_superposition():
    """Stresses at the root with the tip held (layers.md 7 table: 191.011 / 97.181 / -110.585 / -177.606 MPa)
    re-derived here from bl.evaluate with the root moment -1.5 M_T per width (second method)."""
    strip = example_a()
    element = ThermalElement(strip, Cantilever(0.05))
    load = contact_load(element, 1e-12, [T0 + 100], limit_stress=400e6)
    M_T = float(strip.thermal_moment_change(T0 + 100))
    direct = bl.evaluate(strip.stack, bl.Temperatures(T0, T0 + 100), bending_moment=-1.5 * M_T)
    got = np.array([load.stress_bottom[0, 0], load.stress_top[0, 0], load.stress_bottom[0, 1], load.stress_top[0, 1]])
    want = np.array([direct.stress_bottom[0], direct.stress_top[0], direct.stress_bottom[1], direct.stress_top[1]])
    np.testing.assert_allclose(got, want, rtol=1e-8)
    np.testing.assert_allclose(got / 1e6, [191.011, 97.181, -110.585, -177.606], atol=2e-3)


def test_worked_set_point_example():
    """applications.md 1.8 invented example, re-computed by hand formulas in this test: cantilever
    F = 20e-6/K, t = 0.4 mm, w = 5 mm, L = 30 mm, E = 170 GPa, calibrated at 20 degC, closing at 80 degC."""
    F, t, w, L, E = 20e-6, 0.4e-3, 5e-3, 0.03, 170e9
    element = ThermalElement(datasheet(F, t, w, E), Cantilever(L))
    gap = gap_for_set_point(element, T0 + 60)
    assert gap.gap_small == pytest.approx(F * 60 * L * L / (2 * t), rel=1e-12)  # 1.350 mm
    assert gap.gap == pytest.approx((1 - math.cos(F * 60 / t * L)) / (F * 60 / t), rel=1e-12)
    k = 3 * E * w * t**3 / 12 / L**3  # 503.7 N/m
    assert element.stiffness == pytest.approx(k, rel=1e-12)
    load = contact_load(element, gap.gap_small, [closing_temperature(element, gap.gap_small).temperature + 10])
    assert load.force[0] == pytest.approx(k * F * 10 * L * L / (2 * t), rel=1e-9)  # 0.113 N
    assert load.force[0] * L * 6 / (w * t * t) / 1e6 == pytest.approx(25.5, abs=0.05)
    # set-point shifts of the sheet (small deflection): T = T0 + 2 g t / (F L^2)
    for kwargs, shifted in (({"F": 1.05 * F}, 77.14), ({"t": 1.02 * t}, 81.20)):
        changed = ThermalElement(datasheet(kwargs.get("F", F), kwargs.get("t", t), w, E), Cantilever(L))
        assert closing_temperature(changed, 1.35e-3).temperature_small - 273.15 == pytest.approx(shifted, abs=0.005)
    longer = ThermalElement(datasheet(F, t, w, E), Cantilever(1.01 * L))
    assert closing_temperature(longer, 1.35e-3).temperature_small - 273.15 == pytest.approx(78.82, abs=0.005)
    assert closing_temperature(element, 1.37e-3).temperature_small - 273.15 == pytest.approx(80.89, abs=0.005)


def test_gap_closure_of_two_facing_strips_by_hand():
    """Two cantilevers facing each other, worked by hand here (Timoshenko 1925 curvature per kelvin, then
    the tip formulas): strip A (140/100 GPa, 0.3 + 0.3 mm, da = 12 ppm/K), L = 40 mm; strip B (equal
    moduli 150 GPa, 0.25 + 0.25 mm, da = 10 ppm/K), L = 30 mm, mounted upside down so both move toward
    each other on heating; gap 1.0 mm.

    Hand: kA = 6 da (1+m)^2 / (h (3 (1+m)^2 + (1+mn)(m^2 + 1/(mn)))) with m = 1, n = 1.4:
    (1+mn)(m^2 + 1/(mn)) = 2.4 * (1 + 1/1.4) = 4.114286; kA = 6 * 12e-6 * 4 / (0.6e-3 * 16.114286)
    = 0.0297872 1/(m K). kB = 1.5 * 10e-6 / 0.5e-3 = 0.03 1/(m K).
    Small deflection: dT = g / (kA LA^2/2 + kB LB^2/2) = 1e-3 / (2.382979e-5 + 1.35e-5) = 26.7883 K.
    Exact: solve (1-cos(kA dT LA))/(kA dT) + (1-cos(kB dT LB))/(kB dT) = g with brentq.
    """
    A = ThermostatStrip(bl.Stack.of((material("a1", 140e9, 0.3, 3e-6), 0.3e-3), (material("a2", 100e9, 0.3, 15e-6), 0.3e-3)), 5e-3, T0)
    B = ThermostatStrip(bl.Stack.of((material("b1", 150e9, 0.3, 4e-6), 0.25e-3), (material("b2", 150e9, 0.3, 14e-6), 0.25e-3)), 5e-3, T0)
    kA = 6 * 12e-6 * 4 / (0.6e-3 * (12 + 2.4 * (1 + 1 / 1.4)))
    kB = 1.5 * 10e-6 / 0.5e-3
    assert kA == pytest.approx(0.0297872, rel=1e-5)
    # both heat toward -z (top convex); A's bottom face looks at B, B is mounted with its bottom face at A
    result = meeting_temperature(ThermalElement(A, Cantilever(0.04)), ThermalElement(B, Cantilever(0.03)), 1e-3,
                                 first_faces="bottom", second_faces="bottom")
    assert result.temperature_small - T0 == pytest.approx(26.7883, abs=1e-4)
    assert result.temperature_small - T0 == pytest.approx(1e-3 / (kA * 0.04**2 / 2 + kB * 0.03**2 / 2), rel=1e-10)

    def gap_left(dT):
        return (1 - math.cos(kA * dT * 0.04)) / (kA * dT) + (1 - math.cos(kB * dT * 0.03)) / (kB * dT) - 1e-3

    exact = brentq(gap_left, 1.0, 100.0, xtol=1e-13)
    assert result.temperature - T0 == pytest.approx(exact, rel=1e-9)
    assert result.direction == "heating"


def test_working_span_with_overtravel():
    """Stress limit on overtravel (applications.md 1.7, re-derived): a blocked cantilever adds
    sigma = 0.75 E F dT, so 150 MPa with E F = 3.4 MPa/K allows 150 / 2.55 = 58.82 K after closure."""
    element = ThermalElement(datasheet(allowable=150e6), Cantilever(0.04))
    span = working_span(element, 1e-3)
    assert span.overtravel == pytest.approx(150e6 / (0.75 * 170e9 * 20e-6), rel=1e-8)
    assert span.upper_limit == pytest.approx(span.closing_temperature + span.overtravel, rel=1e-12)
    assert span.lower_limit is None  # data-sheet path: no internal stress known when free
    halved = working_span(element, 1e-3, factor=2.0)
    assert halved.overtravel == pytest.approx(0.5 * span.overtravel, rel=1e-8)


def test_engine_working_span_uses_layer_stresses():
    """With an engine stack the free strip carries its thermal layer stresses (layers.md 1.4): the lower
    limit is where the largest of them reaches the allowable, found here by hand from linearity in dT."""
    strip = example_a()
    element = ThermalElement(strip, Cantilever(0.05))
    span = working_span(element, 2e-3, limit_stress=200e6)
    per_kelvin = bl.evaluate(strip.stack, bl.Temperatures(T0, T0 - 1.0))
    peak = max(np.max(np.abs(per_kelvin.stress_bottom)), np.max(np.abs(per_kelvin.stress_top)))
    assert span.lower_limit == pytest.approx(T0 - 200e6 / peak, rel=1e-8)
    assert span.upper_limit > span.closing_temperature > T0


def test_response_curve_shows_exact_and_small_values():
    """Response over a temperature array: small-deflection travel is linear in the curvature change
    (beam theory), exact travel from the arc; curve carries cautions naming IEC 60730."""
    element = ThermalElement(example_a(), Cantilever(0.05))
    curve = response(element, np.linspace(250.0, 450.0, 11))
    np.testing.assert_allclose(curve.travel_small, -curve.curvature_change * 0.05**2 / 2, rtol=1e-12)
    np.testing.assert_allclose(curve.travel, -(1 - np.cos(curve.curvature_change * 0.05)) / np.where(
        curve.curvature_change == 0, 1, curve.curvature_change), rtol=1e-9, atol=1e-18)
    assert any("IEC 60730" in text for text in curve.cautions)
    data = curve.to_dict()
    assert data["unit"] == "m" and len(data["travel"]) == 11


def test_bad_inputs_name_the_field():
    element = ThermalElement(datasheet(), Cantilever(0.04))
    with pytest.raises(InputError, match="thermostat.gap"):
        closing_temperature(element, -1e-3)
    with pytest.raises(InputError, match="thermostat.gap"):
        closing_temperature(element, 0.5, search=(250.0, 350.0))
    with pytest.raises(InputError, match="thermostat.length"):
        Cantilever(0.0)
    with pytest.raises(InputError, match="bending_state"):
        ThermalElement(example_a(), FlatDisc(0.02))
    with pytest.raises(InputError, match="contact_side"):
        closing_temperature(element, 1e-3, side="left")
    with pytest.raises(InputError, match="limit_stress"):
        working_span(ThermalElement(datasheet(), Cantilever(0.04)), 1e-3)
