"""Design helpers and the indicative snap-disc model.

Sources: Timoshenko (1925, J. Opt. Soc. Am. 11:233) for the optimum ratio; the snap-disc check values
of applications.md section 2 (derived there) are re-derived here by a second method (numerical search for
the folds of the equilibrium curve and numerical minimisation of the energy).
"""
from __future__ import annotations

import math

import pytest
from scipy.optimize import minimize_scalar

import bilayer as bl
from bilayer.core.errors import InputError
from bilayer.thermostat.snap_disc import SNAP_DISC_LIMITS, SnapDisc, equilibrium_thermal_curvature, snap_temperatures
from bilayer.thermostat.element import closing_temperature, contact_load
from bilayer.thermostat.sizing import rank_pairs, size_element
from bilayer.thermostat.forms import Cantilever
from bilayer.thermostat.strip import DatasheetStrip, Flexivity, ThermostatStrip

T0 = 293.15


def disc_strip(F=20e-6, h=0.2e-3, nu=0.3):
    return DatasheetStrip(Flexivity.from_datasheet(F), h, 1e-3, T0, modulus=170e9, poisson_ratio=nu)


def test_snap_disc_check_values_by_a_second_method():
    """applications.md 2 (derived there): E = 170 GPa, nu = 0.3, h = 0.2 mm, 20 mm, H0 = 0.6 mm,
    F = 20e-6/K: beta^2 = 1.575, G = 0.1337, snap at +136.0 K, reset at +104.0 K. Second method here: the
    extremes of kappa_T(kappa) found numerically (minimize_scalar) give the fold curvatures, and
    kappa_T / (F/h) the temperatures."""
    disc = SnapDisc(disc_strip(), 0.02, -0.6e-3)  # high-expansion face concave: heating drives it flat
    result = snap_temperatures(disc)
    assert result.label == "indicative" and result.limits == SNAP_DISC_LIMITS
    assert result.beta_squared == pytest.approx(0.7 * 0.36 / 0.16, rel=1e-12)
    k0 = disc.formed_curvature
    fold_a = minimize_scalar(lambda k: -equilibrium_thermal_curvature(disc, k), bounds=(k0, 0), method="bounded",
                             options={"xatol": 1e-12}).x
    fold_b = minimize_scalar(lambda k: equilibrium_thermal_curvature(disc, k), bounds=(0, -k0), method="bounded",
                             options={"xatol": 1e-12}).x
    per_kelvin = 20e-6 / 0.2e-3
    snap = float(equilibrium_thermal_curvature(disc, fold_a)) / per_kelvin
    reset = float(equilibrium_thermal_curvature(disc, fold_b)) / per_kelvin
    assert result.snap_temperature - T0 == pytest.approx(snap, rel=1e-7)
    assert result.reset_temperature - T0 == pytest.approx(reset, rel=1e-7)
    assert result.snap_temperature - T0 == pytest.approx(136.0, abs=0.05)
    assert result.reset_temperature - T0 == pytest.approx(104.0, abs=0.05)
    assert result.differential == pytest.approx(32.1, abs=0.05)


def test_snap_disc_equilibrium_is_stationary_energy():
    """The equilibrium relation is dPi/dkappa = 0 of Pi = D(1+nu)(k - k0 - kT)^2 + E h a^4 (k^2 - k0^2)^2/384
    (energy written out here; its membrane term was checked symbolically by the Airy solution)."""
    E, nu, h, a, H0 = 170e9, 0.3, 0.2e-3, 0.01, 0.6e-3
    disc = SnapDisc(disc_strip(), 2 * a, H0)
    D = E * h**3 / (12 * (1 - nu**2))
    k0 = 2 * H0 / a**2
    for kT in (-5.0, 3.0, -14.0):
        energy = lambda k: D * (1 + nu) * (k - k0 - kT) ** 2 + E * h * a**4 * (k * k - k0 * k0) ** 2 / 384
        k_min = minimize_scalar(energy, bounds=(-3 * k0, 3 * k0), method="bounded", options={"xatol": 1e-10}).x
        assert equilibrium_thermal_curvature(disc, k_min) == pytest.approx(kT, abs=1e-6)


def test_snap_disc_thresholds():
    """No snap below H0/h = 2/sqrt(1-nu) (beta^2 = 1); G > 1 marks a manual-reset disc (one-mode model)."""
    threshold = 2 / math.sqrt(0.7) * 0.2e-3
    assert not snap_temperatures(SnapDisc(disc_strip(), 0.02, -0.99 * threshold)).snaps
    assert snap_temperatures(SnapDisc(disc_strip(), 0.02, -1.01 * threshold)).snaps
    assert snap_temperatures(SnapDisc(disc_strip(), 0.02, -5 * 0.2e-3)).manual_reset
    with pytest.raises(InputError, match="bending_state"):
        SnapDisc(ThermostatStrip(bl.Stack.of(("fe36ni", 1e-4), ("nicrfe_22_3", 1e-4)), 1e-3), 0.02, 1e-3)


def test_engine_disc_membrane_coefficient_reduces_to_homogeneous_form():
    """For two layers of one elastic material the composite c equals (1 - nu) a^4 / (16 h^2)."""
    a_mat = bl.Material("p", 150e9, 0.3, 2e-6)
    b_mat = bl.Material("q", 150e9, 0.3, 17e-6)
    strip = ThermostatStrip(bl.Stack.of((a_mat, 0.1e-3), (b_mat, 0.1e-3)), 1e-3, T0, state="plate")
    disc = SnapDisc(strip, 0.02, 0.6e-3)
    assert disc.membrane_coefficient == pytest.approx(0.7 * 0.01**4 / (16 * 0.2e-3**2), rel=1e-12)


def test_size_element_meets_travel_and_force_targets():
    """Sizing solves two targets with scipy; checked by re-evaluating the sized element directly."""
    strip = ThermostatStrip(bl.Stack.of(("fe36ni", 0.2e-3), ("nicrfe_22_3", 0.2e-3)), 5e-3, T0)
    sized = size_element(strip, Cantilever(0.03), travel=1.0e-3, temperature=T0 + 50, force=0.2,
                         overtravel=15.0, limit_stress=300e6, factor=1.2)
    element = sized.element
    assert abs(element.travel(T0 + 50)) == pytest.approx(1.0e-3, rel=1e-8)
    closing = closing_temperature(element, 1.0e-3).temperature
    assert closing == pytest.approx(T0 + 50, abs=1e-6)
    load = contact_load(element, 1.0e-3, [T0 + 65], limit_stress=300e6, factor=1.2)
    assert load.force[0] == pytest.approx(0.2, rel=1e-7)
    assert sized.utilisation == pytest.approx(float(load.utilisation[0]), rel=1e-9)
    assert sized.within_limit == (sized.utilisation <= 1)
    fixed = size_element(strip, Cantilever(0.03), travel=1.0e-3, temperature=T0 + 50, thickness=0.5e-3)
    assert fixed.thickness == 0.5e-3
    assert abs(fixed.element.travel(T0 + 50)) == pytest.approx(1.0e-3, rel=1e-8)
    with pytest.raises(InputError, match="sizing.force"):
        size_element(strip, Cantilever(0.03), travel=1e-3, temperature=T0 + 50)


def test_rank_pairs_orders_by_flexivity_and_merit():
    """Ranking: every pair's flexivity is 1.5 x its secant CTE difference at the optimum ratio (Timoshenko
    1925, narrow strip, constant or tabulated CTE); admissible pairs first, then by the chosen key."""
    ranked = rank_pairs(candidates=["fe36ni", "nicrfe_22_3", "brass_70_30", "stainless_304"], limit_stress=400e6,
                        temperature_high=353.15)
    assert len(ranked) == 6
    lib = bl.default_library()
    for r in ranked:
        low = next(m for m in lib.values() if m.name == r.bottom)
        high = next(m for m in lib.values() if m.name == r.top)
        da = high.cte.secant(T0, 353.15) - low.cte.secant(T0, 353.15)
        assert r.flexivity == pytest.approx(1.5 * da, rel=1e-9)
        assert r.merit == pytest.approx(r.flexural_modulus * r.flexivity**2, rel=1e-12)
    admissible = [r for r in ranked if r.admissible]
    assert [r.flexivity for r in admissible] == sorted((r.flexivity for r in admissible), reverse=True)
    by_merit = rank_pairs(candidates=["fe36ni", "nicrfe_22_3", "brass_70_30"], limit_stress=400e6, by="merit")
    good = [r for r in by_merit if r.admissible]
    assert [r.merit for r in good] == sorted((r.merit for r in good), reverse=True)
