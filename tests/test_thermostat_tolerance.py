"""Set-point tolerances: Monte Carlo against first-order propagation with the symbolic sensitivities.

Sources: the statistics checks are mathematical (law of large numbers; for small tolerances a smooth
function's scatter tends to its linearisation, the delta method); the worked shifts are the invented
example of applications.md 1.8, re-computed here by hand (T - T0 = 2 g t / (F L^2)).
"""
from __future__ import annotations

import math

import numpy as np
import pytest

import bilayer as bl
from bilayer.core.errors import InputError
from bilayer.thermostat.element import ThermalElement, closing_temperature, gap_for_set_point
from bilayer.thermostat.forms import Cantilever, UShape
from bilayer.thermostat.strip import DatasheetStrip, Flexivity, ThermostatStrip
from bilayer.thermostat.tolerances import Tolerance, first_order_set_point, monte_carlo_set_point, tolerance_keys

T0 = 293.15


def engine_element(form=None):
    stack = bl.Stack.of(("fe36ni", 0.2e-3), ("nicrfe_22_3", 0.2e-3))
    return ThermalElement(ThermostatStrip(stack, 5e-3, T0), form or Cantilever(0.03))


def datasheet_element():
    strip = DatasheetStrip(Flexivity.from_datasheet(20e-6), 0.4e-3, 5e-3, T0, modulus=170e9)
    return ThermalElement(strip, Cantilever(0.03))


SMALL = {
    "thickness_1": Tolerance(0.003), "thickness_2": Tolerance(0.002), "modulus_1": Tolerance(0.004),
    "modulus_2": Tolerance(0.002, distribution="uniform"), "cte_1": Tolerance(0.004), "cte_2": Tolerance(0.003),
    "length": Tolerance(0.002), "gap": Tolerance(2e-6, relative=False),
}


def test_monte_carlo_mean_and_std_match_first_order_for_small_tolerances():
    """Delta method: for small tolerances the Monte Carlo mean converges to the nominal set point and its
    standard deviation to the first-order value (exact symbolic curvature sensitivities)."""
    element = engine_element()
    gap = gap_for_set_point(element, T0 + 60).gap
    first = first_order_set_point(element, gap, SMALL)
    mc = monte_carlo_set_point(element, gap, SMALL, samples=200_000, seed=1)
    assert first.nominal == pytest.approx(T0 + 60, abs=1e-7)
    assert mc.nominal == first.nominal
    assert abs(mc.mean - first.nominal) < 5 * mc.std / math.sqrt(mc.samples) + 1e-3 * mc.std
    assert mc.std == pytest.approx(first.std, rel=0.01)
    assert mc.failed == 0
    # contributors ranked alike by both methods
    assert [k for k, _ in mc.contributors[:3]] == [k for k, _ in first.contributors[:3]]
    assert sum(share for _, share in first.contributors) == pytest.approx(1.0, rel=1e-12)


def test_first_order_sensitivities_match_finite_differences_of_the_solver():
    """Second method for the symbolic sensitivities: rebuild the element with one input changed and solve
    the set point again (central differences)."""
    element = engine_element()
    gap = gap_for_set_point(element, T0 + 60).gap
    first = first_order_set_point(element, gap, {"thickness_1": Tolerance(0.01), "cte_2": Tolerance(0.01),
                                                 "modulus_1": Tolerance(0.01), "length": Tolerance(0.01)})
    h = 1e-4
    stack = element.strip.stack

    def set_point(stack=stack, length=0.03):
        e = ThermalElement(element.strip.with_stack(stack), Cantilever(length))
        return closing_temperature(e, gap).temperature

    layer = stack[0]
    thick = [set_point(stack.with_thickness(0, layer.thickness * (1 + s * h))) for s in (-1, 1)]
    assert first.sensitivities["thickness_1"] == pytest.approx((thick[1] - thick[0]) / (2 * h), rel=1e-5)
    top = stack[1].material
    cte = []
    for s in (-1, 1):
        scaled = top.with_changes(cte=top.cte.value * (1 + s * h))
        cte.append(set_point(stack.with_layer(1, bl.Layer(scaled, stack[1].thickness))))
    assert first.sensitivities["cte_2"] == pytest.approx((cte[1] - cte[0]) / (2 * h), rel=1e-5)
    bottom = stack[0].material
    mod = [set_point(stack.with_layer(0, bl.Layer(bottom.with_changes(youngs_modulus=bottom.youngs_modulus * (1 + s * h)),
                                                    stack[0].thickness))) for s in (-1, 1)]
    assert first.sensitivities["modulus_1"] == pytest.approx((mod[1] - mod[0]) / (2 * h), rel=1e-5)
    lengths = [set_point(length=0.03 * (1 + s * h)) for s in (-1, 1)]
    assert first.sensitivities["length"] == pytest.approx((lengths[1] - lengths[0]) / (2 * h), rel=1e-5)


def test_worked_example_sensitivities():
    """applications.md 1.8 (hand, small deflection T - T0 = 2 g t/(F L^2) = 60 K): dT/d(F rel) = -60 K,
    dT/d(t rel) = +60 K, dT/d(L rel) = -120 K, dT/dg = 60 K / 1.35 mm; exact kinematics shifts them by
    O(phi^2) (phi = 0.09 rad here), so they are compared to 0.3 %."""
    element = datasheet_element()
    tol = {"flexivity": Tolerance(0.05), "thickness": Tolerance(0.02), "length": Tolerance(0.01),
           "gap": Tolerance(0.02e-3, relative=False)}
    first = first_order_set_point(element, 1.35e-3, tol)
    s = first.sensitivities
    assert s["flexivity"] == pytest.approx(-60.0, rel=3e-3)
    assert s["thickness"] == pytest.approx(60.0, rel=3e-3)
    assert s["length"] == pytest.approx(-120.0, rel=3e-3)
    assert s["gap"] == pytest.approx(60.0 / 1.35e-3, rel=3e-3)
    assert first.contributors[0][0] == "flexivity"


def test_data_sheet_monte_carlo_is_exact_per_sample():
    """With data-sheet flexivity each sample's set point has a closed form; the Monte Carlo values must
    equal it on the same draws (hand: cantilever inverse (1 - cos(k L))/k = g by brentq, then
    T = T0 + k t / (F (1 + dF)); draws per chunk, flexivity first, then gap)."""
    from scipy.optimize import brentq

    element = datasheet_element()
    tol = {"flexivity": Tolerance(0.05), "gap": Tolerance(0.05e-3, relative=False, distribution="uniform")}
    mc = monte_carlo_set_point(element, 1.35e-3, tol, samples=7_000, seed=7, chunk=3_000, keep_values=True)
    rng = np.random.default_rng(7)
    checked = 0
    for start in range(0, 7_000, 3_000):
        size = min(3_000, 7_000 - start)
        dF = rng.normal(0, 0.05 / 3, size)
        dg = rng.uniform(-0.05e-3, 0.05e-3, size)
        for j in range(0, size, 97):
            k = brentq(lambda k: (1 - math.cos(k * 0.03)) / k - (1.35e-3 + dg[j]), 1e-3, 20.0, xtol=1e-15)
            assert mc.values[start + j] == pytest.approx(T0 + k * 0.4e-3 / (20e-6 * (1 + dF[j])), abs=1e-7)
            checked += 1
    assert checked > 60
    assert mc.mean == pytest.approx(np.mean(mc.values), rel=1e-15)


def test_progress_is_reported_per_chunk():
    calls = []
    monte_carlo_set_point(datasheet_element(), 1.35e-3, {"flexivity": Tolerance(0.05)}, samples=10_000,
                          chunk=3_000, progress=lambda fraction, message: calls.append((fraction, message)))
    assert calls == [(0.3, "3000/10000 samples"), (0.6, "6000/10000 samples"), (0.9, "9000/10000 samples"),
                     (1.0, "10000/10000 samples")]


def test_u_shape_monte_carlo_uses_exact_inverse():
    """Generic forms: the Monte Carlo inverts the exact hairpin travel; mean converges to the nominal."""
    element = engine_element(UShape(0.02, 1.5e-3))
    gap = gap_for_set_point(element, T0 + 50).gap
    tol = {"length": Tolerance(0.002), "gap": Tolerance(1e-6, relative=False)}
    mc = monte_carlo_set_point(element, gap, tol, samples=50_000, seed=3)
    first = first_order_set_point(element, gap, tol)
    assert mc.mean == pytest.approx(T0 + 50, abs=5 * mc.std / math.sqrt(50_000) + 1e-3 * mc.std)
    assert mc.std == pytest.approx(first.std, rel=0.02)


def test_tolerance_inputs_are_checked():
    element = engine_element()
    assert "cte_2" in tolerance_keys(element)
    with pytest.raises(InputError, match="tolerances.cte_3"):
        first_order_set_point(element, 1e-3, {"cte_3": Tolerance(0.01)})
    with pytest.raises(InputError, match="tolerance.half_width"):
        Tolerance(1.5)
    with pytest.raises(InputError, match="tolerance.distribution"):
        Tolerance(0.1, distribution="triangular")
    with pytest.raises(InputError, match="tolerances.modulus_1.relative"):
        first_order_set_point(element, 1e-3, {"modulus_1": Tolerance(10.0, relative=False)})
