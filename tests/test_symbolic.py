"""Tests of bilayer.core.symbolic: the sympy-derived n-layer strip solution and its exact sensitivities.

References used (each check names its own):
* S. Timoshenko, "Analysis of bi-metal thermostats", J. Opt. Soc. Am. 11(3):233-255 (1925): bimetal
  curvature kappa = 6 da dT (1+m)^2 / (h [3(1+m)^2 + (1+mn)(m^2 + 1/(mn))]), m = t1/t2, n = E1/E2,
  h = t1 + t2, da = a2 - a1, layer 1 at the bottom; and his decomposition into an axial force P and layer
  moments E_i t_i^3 kappa / 12 that balance P h / 2.
* Transformed-section (modulus-weighted) composite-beam closed form for n layers, as used for multilayers
  by C.H. Hsueh, Thin Solid Films 418:182-188 (2002) and Hsueh, Lee & Chuang, J. Appl. Mech. 70:151
  (2003) (bending axis = neutral axis of the transformed section), in the notation of layers.md §3.2: c = (N + sum Y t a dT)/sum Y t,
  t_b = sum Y t z_c / sum Y t, EI = sum Y (t^3/12 + t (z_c - t_b)^2), M_T = sum Y t a dT (z_c - t_b),
  kappa = (M_b + M_T)/EI. Written out independently below (numpy), not imported from the package.
* Euler's theorem on homogeneous functions: kappa is of degree 0 in the moduli and -1 in the
  thicknesses, the stresses of degree 1 and 0, hence sum Y dkappa/dY = 0, sum t dkappa/dt = -kappa, ...
"""
from __future__ import annotations

import subprocess
import sys
import time
from pathlib import Path

import numpy as np
import pytest
import sympy as sp
from hypothesis import given, settings
from hypothesis import strategies as st

from bilayer.core import symbolic
from bilayer.core.errors import InputError

REPOSITORY = Path(__file__).resolve().parents[1]


# --- independent references written out here ------------------------------------------------------


def timoshenko_curvature(E1, E2, t1, t2, a1, a2, dT):
    """Timoshenko 1925, bimetal curvature (layer 1 at the bottom); works for numbers and sympy symbols."""
    m, n, h = t1 / t2, E1 / E2, t1 + t2
    return 6 * (a2 - a1) * dT * (1 + m) ** 2 / (h * (3 * (1 + m) ** 2 + (1 + m * n) * (m ** 2 + 1 / (m * n))))


def transformed_section(Y, t, a, dT, N=0.0, M=0.0):
    """Hsueh (2002) transformed-section solution, numpy over the last axis (layers, bottom first).

    Returns c (strain at the bending axis), t_b, kappa and face stresses (bottom, top).
    """
    Y, t, a = (np.asarray(x, dtype=float) for x in (Y, t, a))
    dT = np.asarray(dT, dtype=float)[..., None]
    top = np.cumsum(t, axis=-1)
    bottom = top - t
    z_c = bottom + t / 2
    free = a * dT
    EA = np.sum(Y * t, axis=-1)
    c = (N + np.sum(Y * t * free, axis=-1)) / EA
    t_b = np.sum(Y * t * z_c, axis=-1) / EA
    EI = np.sum(Y * (t ** 3 / 12 + t * (z_c - t_b[..., None]) ** 2), axis=-1)
    M_T = np.sum(Y * t * free * (z_c - t_b[..., None]), axis=-1)
    kappa = (M + M_T) / EI

    def stress(z):
        return Y * (c[..., None] + kappa[..., None] * (z - t_b[..., None]) - free)

    return c, t_b, kappa, stress(bottom), stress(top)


def resultants(thicknesses, stress_bottom, stress_top, about):
    """Force and moment per width of face stresses linear in z through each layer (Simpson, exact here)."""
    top = np.cumsum(thicknesses, axis=-1)
    bottom = top - thicknesses
    mid = (bottom + top) / 2
    s_mid = (stress_bottom + stress_top) / 2
    force = np.sum(thicknesses * s_mid, axis=-1)
    arm = lambda z: z - np.asarray(about)[..., None]  # noqa: E731
    moment = np.sum(thicknesses / 6 * (stress_bottom * arm(bottom) + 4 * s_mid * arm(mid)
                                       + stress_top * arm(top)), axis=-1)
    return force, moment


def random_stacks(rng, count, n, thickness_ratio=10.0, modulus_ratio=10.0):
    """Random stacks with thickness and modulus ratios up to the given factors and |da| >= 1e-6 /K."""
    t = 1e-4 * thickness_ratio ** rng.uniform(-0.5, 0.5, (count, n))
    Y = 1e10 * modulus_ratio ** rng.uniform(-0.5, 0.5, (count, n))
    a = rng.uniform(0.0, 25e-6, (count, 1)) + np.cumsum(
        rng.choice([-1.0, 1.0], (count, n)) * rng.uniform(1e-6, 2e-5, (count, n)), axis=-1)
    dT = rng.uniform(-300.0, 300.0, count)
    return Y, t, a, dT


# --- Timoshenko 1925 by simplification ------------------------------------------------------------


def test_two_layer_curvature_is_timoshenko_formula_exactly():
    """Source: Timoshenko, J. Opt. Soc. Am. 11:233 (1925), bimetal curvature; simplify(difference) == 0."""
    solution = symbolic.derive(2)
    (Y1, Y2), (t1, t2), (a1, a2) = solution.moduli, solution.thicknesses, solution.ctes
    formula = timoshenko_curvature(Y1, Y2, t1, t2, a1, a2, solution.temperature_change)
    assert sp.simplify(solution.curvature.subs(solution.bending_moment, 0) - formula) == 0
    assert symbolic.timoshenko_residual() == 0


def test_timoshenko_check_detects_a_wrong_formula():
    """The identity check can fail: a formula with 4 instead of 3 in the bracket differs (exact rationals)."""
    solution = symbolic.derive(2)
    (Y1, Y2), (t1, t2), (a1, a2) = solution.moduli, solution.thicknesses, solution.ctes
    m, n, h = t1 / t2, Y1 / Y2, t1 + t2
    wrong = 6 * (a2 - a1) * solution.temperature_change * (1 + m) ** 2 / (
        h * (4 * (1 + m) ** 2 + (1 + m * n) * (m ** 2 + 1 / (m * n))))
    point = {s: sp.Rational(k + 2, 2 * k + 3) for k, s in enumerate(solution.arguments)}
    assert (solution.curvature - wrong).subs(point) != 0


def test_equal_layers_give_three_halves_da_dT_over_h():
    """Timoshenko 1925 formula at m = n = 1: kappa = 6*4/(h*(12 + 4)) da dT = 3 da dT / (2h)."""
    solution = symbolic.derive(2)
    (Y1, Y2), (t1, t2), (a1, a2) = solution.moduli, solution.thicknesses, solution.ctes
    Y, h = sp.symbols("Y h", positive=True)
    kappa = solution.curvature.subs({solution.bending_moment: 0, Y1: Y, Y2: Y, t1: h / 2, t2: h / 2})
    assert sp.simplify(kappa - sp.Rational(3, 2) * (a2 - a1) * solution.temperature_change / h) == 0


# --- optimum thickness ratio ----------------------------------------------------------------------


def test_optimum_ratio_factorises_to_m2n_equal_one():
    """d kappa/dm = 0 at fixed h and n has the factor (m^2 n - 1); the other factors have no root m > 0."""
    optimum = symbolic.optimum_thickness_ratio()
    m, n, h, da, dT = optimum.symbols
    factors = [f for f, _ in sp.factor_list(optimum.slope_numerator)[1] if f.has(m)]
    assert any(sp.expand(f - (m ** 2 * n - 1)) == 0 or sp.expand(f + (m ** 2 * n - 1)) == 0 for f in factors)
    assert sp.simplify(optimum.ratio - 1 / sp.sqrt(n)) == 0
    assert sp.simplify(optimum.curvature_at_optimum - sp.Rational(3, 2) * da * dT / h) == 0
    assert n not in optimum.curvature_at_optimum.free_symbols
    # The derived kappa(m) is Timoshenko's formula written in m, n, h (Timoshenko 1925).
    reference = 6 * da * dT * (1 + m) ** 2 / (h * (3 * (1 + m) ** 2 + (1 + m * n) * (m ** 2 + 1 / (m * n))))
    assert sp.simplify(optimum.curvature - reference) == 0


@pytest.mark.parametrize("n", [0.05, 0.4, 1.0, 1.4, 7.0, 30.0])
def test_optimum_ratio_matches_brute_force_maximum_of_timoshenko(n):
    """Numeric argmax over m of Timoshenko's 1925 formula agrees with m = 1/sqrt(n), kappa_max = 1.5 da dT/h."""
    h, da, dT = 1e-3, 1e-5, 50.0
    m = np.exp(np.linspace(np.log(1e-3), np.log(1e3), 400_001))
    kappa = timoshenko_curvature(n, 1.0, m * h / (1 + m), h / (1 + m), 0.0, da, dT)
    best = np.argmax(kappa)
    assert m[best] == pytest.approx(1 / np.sqrt(n), rel=1e-4)
    assert kappa[best] == pytest.approx(1.5 * da * dT / h, rel=1e-9)
    # The symbolic solution evaluated at m^2 n = 1 gives the same maximum.
    t1 = h / (1 + np.sqrt(n))
    values = symbolic.evaluate([n * 1e10, 1e10], [t1, h - t1], [3e-6, 3e-6 + da], dT)
    assert values.curvature == pytest.approx(1.5 * da * dT / h, rel=1e-12)


# --- numeric agreement with independent closed forms ----------------------------------------------


def test_random_two_layer_stacks_match_timoshenko_to_1e_12():
    """Lambdified symbolic curvature vs Timoshenko's 1925 formula (written above) for 2000 random stacks.

    Ranges: thickness and modulus ratios 0.1..10, |da| >= 1e-6 /K (with larger contrasts the z = 0
    referenced sums lose a few more digits to cancellation).
    """
    rng = np.random.default_rng(20251201)
    Y, t, a, dT = random_stacks(rng, 2000, 2)
    values = symbolic.evaluate(Y, t, a, dT)
    reference = timoshenko_curvature(Y[:, 0], Y[:, 1], t[:, 0], t[:, 1], a[:, 0], a[:, 1], dT)
    np.testing.assert_allclose(values.curvature, reference, rtol=1e-12, atol=0)


def test_two_layer_stresses_match_timoshenko_force_decomposition():
    """Face stresses vs Timoshenko's decomposition (1925): interface force P, layer moments E t^3 kappa/12.

    kappa = P h / (2 D), D = (E1 t1^3 + E2 t2^3)/12; bottom face P/t1 - E1 kappa t1/2, interface
    P/t1 + E1 kappa t1/2 and -P/t2 - E2 kappa t2/2, top face -P/t2 + E2 kappa t2/2.
    """
    rng = np.random.default_rng(7)
    Y, t, a, dT = random_stacks(rng, 500, 2)
    values = symbolic.evaluate(Y, t, a, dT)
    kappa = timoshenko_curvature(Y[:, 0], Y[:, 1], t[:, 0], t[:, 1], a[:, 0], a[:, 1], dT)
    D = (Y[:, 0] * t[:, 0] ** 3 + Y[:, 1] * t[:, 1] ** 3) / 12
    P = kappa * 2 * D / t.sum(axis=1)
    expected_bottom = np.stack([P / t[:, 0] - Y[:, 0] * kappa * t[:, 0] / 2,
                                -P / t[:, 1] - Y[:, 1] * kappa * t[:, 1] / 2], axis=-1)
    expected_top = np.stack([P / t[:, 0] + Y[:, 0] * kappa * t[:, 0] / 2,
                             -P / t[:, 1] + Y[:, 1] * kappa * t[:, 1] / 2], axis=-1)
    scale = np.abs(expected_top).max(axis=1, keepdims=True)
    np.testing.assert_allclose(values.stress_bottom / scale, expected_bottom / scale, rtol=0, atol=1e-11)
    np.testing.assert_allclose(values.stress_top / scale, expected_top / scale, rtol=0, atol=1e-11)


def test_example_a_check_values():
    """Derived check values, layers.md §1.7 (Example A), verified here against Timoshenko's 1925 formula."""
    args = ([140e9, 100e9], [0.5e-3, 0.5e-3], [1.5e-6, 19.5e-6], 100.0)
    values = symbolic.evaluate(*args)
    assert values.curvature == pytest.approx(timoshenko_curvature(140e9, 100e9, 0.5e-3, 0.5e-3, 1.5e-6,
                                                                  19.5e-6, 100.0), rel=1e-13)
    assert values.curvature == pytest.approx(2.680851, rel=1e-6)
    assert values.bending_axis == pytest.approx(0.4583333e-3, rel=1e-6)
    assert values.axis_strain == pytest.approx(9.0e-4, rel=1e-9)
    faces = [values.stress_bottom[0], values.stress_top[0], values.stress_bottom[1], values.stress_top[1]]
    published = [-67.021e6, 120.638e6, -93.830e6, 40.213e6]  # given to 3 decimals in MPa
    np.testing.assert_allclose(faces, published, rtol=0, atol=0.6e3)


def test_three_layer_check_values_and_transformed_section():
    """Derived check values, layers.md §3.5 (beam row, with and without N, M_b), verified here against
    the Hsueh (2002) transformed-section form written in this file."""
    Y, t, a, dT = [200e9, 3e9, 70e9], [0.30e-3, 0.05e-3, 0.20e-3], [12e-6, 60e-6, 23e-6], -80.0
    values = symbolic.evaluate(Y, t, a, dT)
    c, t_b, kappa, bottom, top = transformed_section(Y, t, a, dT)
    assert values.curvature == pytest.approx(kappa, rel=1e-12)
    assert values.axis_strain == pytest.approx(c, rel=1e-12)
    assert values.bending_axis == pytest.approx(t_b, rel=1e-12)
    np.testing.assert_allclose(values.stress_bottom, bottom, rtol=1e-10)
    np.testing.assert_allclose(values.stress_top, top, rtol=1e-10)
    assert values.curvature == pytest.approx(-2.013783, rel=1e-6)
    assert values.axis_strain == pytest.approx(-1.133918e-3, rel=1e-6)
    assert values.bending_axis == pytest.approx(0.2069960e-3, rel=1e-6)
    faces = np.ravel(np.stack([values.stress_bottom, values.stress_top], -1))
    published = [48.585e6, -72.242e6, 10.436e6, 10.134e6, 29.267e6, 1.074e6]  # given to 3 decimals in MPa
    np.testing.assert_allclose(faces, published, rtol=0, atol=0.6e3)
    loaded = symbolic.evaluate(Y, t, a, dT, axial_force=100.0, bending_moment=0.05)
    assert loaded.axis_strain == pytest.approx(-1.132569e-3, rel=1e-6)
    assert loaded.curvature == pytest.approx(-1.980897, rel=1e-6)
    assert loaded.curvature == pytest.approx(transformed_section(Y, t, a, dT, 100.0, 0.05)[2], rel=1e-12)


@pytest.mark.parametrize("n", [3, 10])
def test_n_layer_solution_satisfies_force_and_moment_balance(n):
    """Physics invariants (layers.md §9, items 1-2): integrated stresses give the applied N and M_b, and
    kappa, c equal the transformed-section form (Hsueh 2002) to 1e-12."""
    rng = np.random.default_rng(n)
    Y, t, a, dT = random_stacks(rng, 200, n)
    N = rng.uniform(-500.0, 500.0, 200)
    M = rng.uniform(-0.2, 0.2, 200)
    values = symbolic.evaluate(Y, t, a, dT, N, M)
    force, moment = resultants(t, values.stress_bottom, values.stress_top, values.bending_axis)
    force_scale = np.sum(np.abs(values.stress_top) * t, axis=-1)
    moment_scale = force_scale * t.sum(axis=-1)
    np.testing.assert_allclose((force - N) / force_scale, 0, atol=1e-12)
    np.testing.assert_allclose((moment - M) / moment_scale, 0, atol=1e-12)
    c, t_b, kappa, bottom, top = transformed_section(Y, t, a, dT, N, M)
    np.testing.assert_allclose(values.curvature, kappa, rtol=1e-11)
    np.testing.assert_allclose(values.axis_strain, c, rtol=1e-11)
    np.testing.assert_allclose(values.bending_axis, t_b, rtol=1e-12)
    np.testing.assert_allclose(values.base_strain, c - kappa * t_b, rtol=1e-9, atol=1e-15)


@pytest.mark.parametrize("n", [1, 2, 5, 10])
def test_agrees_with_the_numeric_laminate_backend(n):
    """Cross-check of backends (no external reference): lambdified symbolic solution vs bilayer.core.laminate.solve
    with free strains a_i dT, loads included."""
    from bilayer.core import laminate

    rng = np.random.default_rng(40 + n)
    Y, t, a, dT = random_stacks(rng, 300, n)
    N, M = rng.uniform(-500.0, 500.0, 300), rng.uniform(-0.2, 0.2, 300)
    ours = symbolic.evaluate(Y, t, a, dT, N, M)
    theirs = laminate.solve(Y, t, a * dT[:, None], N, M)
    kappa_scale = np.abs(theirs.curvature) + np.max(np.abs(a), axis=-1) * np.abs(dT) / t.sum(axis=-1)
    assert np.all(np.abs(ours.curvature - theirs.curvature) <= 1e-11 * kappa_scale)
    np.testing.assert_allclose(ours.axis_strain, theirs.axial_strain, rtol=1e-11)
    np.testing.assert_allclose(ours.bending_axis, theirs.bending_axis, rtol=1e-12)
    stress_scale = np.max(np.abs(theirs.stress_top), axis=-1, keepdims=True) + 1.0
    np.testing.assert_allclose(ours.stress_top / stress_scale, theirs.stress_top / stress_scale, atol=1e-11)
    np.testing.assert_allclose(ours.stress_bottom / stress_scale, theirs.stress_bottom / stress_scale, atol=1e-11)


def test_symbolic_equations_hold_for_the_solution():
    """Substituting the solution into the symbolic force and moment balances leaves zero (exact rationals),
    and a perturbed curvature does not."""
    solution = symbolic.derive(3)
    rng = np.random.default_rng(3)
    point = {s: sp.Rational(int(rng.integers(1, 50)), int(rng.integers(1, 50))) for s in solution.arguments}
    for equation in solution.equations:
        assert solution.explicit(equation.lhs - equation.rhs).subs(point) == 0
    kappa = solution.unknowns[1]
    moment = solution.equations[1].lhs - solution.equations[1].rhs
    assert solution.explicit(moment.subs(kappa, kappa * sp.Rational(101, 100))).subs(point) != 0


# --- invariants (hypothesis) ----------------------------------------------------------------------


def stacks(min_layers=1, max_layers=6):
    layer = st.tuples(st.floats(1e9, 4e11), st.floats(1e-6, 2e-3), st.floats(-5e-6, 3e-5))
    return st.lists(layer, min_size=min_layers, max_size=max_layers).map(lambda rows: tuple(np.array(rows).T))


temperature_changes = st.floats(-400.0, 400.0).filter(lambda x: abs(x) >= 0.1)


def thermal_scales(Y, t, a, dT):
    """Typical stress [Pa] and curvature [1/m] of a stack: max Y * max |a dT| and max |a dT| / min t."""
    strain = max(np.max(np.abs(a)), 1e-6) * abs(dT)
    return np.max(Y) * strain, strain / np.min(t)


@settings(max_examples=60, deadline=None)
@given(stacks(), temperature_changes)
def test_flipping_the_stack_mirrors_the_solution(stack, dT):
    """layers.md §9 item 3: reversing the layers changes the sign of kappa, keeps c and mirrors stresses."""
    Y, t, a = stack
    stress_scale, kappa_scale = thermal_scales(Y, t, a, dT)
    up = symbolic.evaluate(Y, t, a, dT)
    down = symbolic.evaluate(Y[::-1], t[::-1], a[::-1], dT)
    assert abs(down.curvature + up.curvature) <= 1e-9 * kappa_scale
    assert abs(down.axis_strain - up.axis_strain) <= 1e-12 * stress_scale / np.max(Y)
    np.testing.assert_allclose(down.stress_top[::-1], up.stress_bottom, rtol=0, atol=1e-9 * stress_scale)


@settings(max_examples=60, deadline=None)
@given(stacks(), temperature_changes, st.floats(-1e-5, 1e-5))
def test_common_cte_shift_changes_only_the_uniform_strain(stack, dT, shift):
    """layers.md §9 item 6: a_i -> a_i + d for all i shifts c by d dT; kappa and stresses unchanged."""
    Y, t, a = stack
    stress_scale, kappa_scale = thermal_scales(Y, t, np.abs(a) + abs(shift), dT)
    base = symbolic.evaluate(Y, t, a, dT)
    shifted = symbolic.evaluate(Y, t, a + shift, dT)
    assert np.isclose(shifted.axis_strain, base.axis_strain + shift * dT, rtol=1e-9, atol=1e-18 * abs(dT))
    assert abs(shifted.curvature - base.curvature) <= 1e-9 * kappa_scale
    np.testing.assert_allclose(shifted.stress_top, base.stress_top, rtol=0, atol=1e-9 * stress_scale)


@settings(max_examples=40, deadline=None)
@given(st.floats(1e9, 4e11), st.floats(1e-6, 2e-3), st.floats(-5e-6, 3e-5), temperature_changes,
       st.lists(st.floats(0.05, 1.0), min_size=1, max_size=5))
def test_same_material_everywhere_is_stress_free(Y, thickness, alpha, dT, fractions):
    """layers.md §9 items 4-5: one material split into any layers has kappa = 0, sigma = 0, c = a dT."""
    n = len(fractions)
    t = thickness * np.array(fractions)
    stress_scale, kappa_scale = thermal_scales([Y], t, [alpha], dT)
    values = symbolic.evaluate(np.full(n, Y), t, np.full(n, alpha), dT)
    assert abs(values.curvature) <= 1e-9 * kappa_scale
    assert np.all(np.abs(values.stress_top) <= 1e-9 * stress_scale)
    assert np.all(np.abs(values.stress_bottom) <= 1e-9 * stress_scale)
    assert np.isclose(values.axis_strain, alpha * dT, rtol=1e-12, atol=1e-20)


# --- sensitivities --------------------------------------------------------------------------------


def finite_difference_gradients(Y, t, a, dT, N, M, relative_step=1e-6):
    """Central differences of symbolic.evaluate(...) for each parameter (Y.., t.., a.., dT).

    Returns gradients of (curvature, stress_bottom, stress_top), parameter axis last.
    """
    base = [np.array(Y, float), np.array(t, float), np.array(a, float), np.array(dT, float)]
    columns = []
    for group, array in enumerate(base):
        for index in np.ndindex(array.shape):
            step = relative_step * max(abs(array[index]), 1e-6 if group == 2 else 1e-30)
            plus, minus = [b.copy() for b in base], [b.copy() for b in base]
            plus[group][index] += step
            minus[group][index] -= step
            up, down = symbolic.evaluate(*plus, N, M), symbolic.evaluate(*minus, N, M)
            columns.append([(getattr(up, q) - getattr(down, q)) / (2 * step)
                            for q in ("curvature", "stress_bottom", "stress_top")])
    return [np.stack(c, axis=-1) for c in zip(*columns)]


@pytest.mark.parametrize("n", [1, 2, 3, 10])
def test_sensitivities_match_central_differences(n):
    """Exact gradients vs central finite differences of the numeric solution (loads included)."""
    rng = np.random.default_rng(100 + n)
    Y, t, a, dT = (x[0] for x in random_stacks(rng, 1, n))
    N, M = 120.0, -0.03
    exact = symbolic.evaluate_sensitivities(Y, t, a, dT, N, M)
    assert exact.parameters == tuple(f"{s}{i}" for s in "Yta" for i in range(1, n + 1)) + ("dT",)
    numeric = finite_difference_gradients(Y, t, a, dT, N, M)
    params = np.concatenate([Y, t, a, [dT]])
    for name, fd in zip(("curvature", "stress_bottom", "stress_top"), numeric):
        value = np.max(np.abs(getattr(exact, name)))
        scale = value / np.maximum(np.abs(params), 1e-6)  # typical derivative size per parameter
        np.testing.assert_allclose(getattr(exact, name + "_gradient") / scale, fd / scale, rtol=0, atol=1e-6)


def test_single_callables_agree_with_the_vectorised_helper():
    """sensitivities(n).curvature[name] / .stress_top[i][name] equal evaluate_sensitivities columns."""
    rng = np.random.default_rng(11)
    Y, t, a, dT = random_stacks(rng, 50, 3)
    sens = symbolic.sensitivities(3)
    values = symbolic.evaluate_sensitivities(Y, t, a, dT)
    for j, name in enumerate(sens.parameters):
        np.testing.assert_allclose(sens.curvature[name](Y, t, a, dT), values.curvature_gradient[:, j],
                                   rtol=1e-12)
        for i in range(3):
            np.testing.assert_allclose(sens.stress_top[i][name](Y, t, a, dT),
                                       values.stress_top_gradient[:, i, j], rtol=1e-12, atol=1e-30)
            np.testing.assert_allclose(sens.stress_bottom[i][name](Y, t, a, dT),
                                       values.stress_bottom_gradient[:, i, j], rtol=1e-12, atol=1e-30)


def test_chain_rule_derivatives_equal_direct_sympy_derivatives():
    """For two layers the chain-rule derivative equals sympy.diff of the explicit curvature and stress
    (compared exactly at a random rational point)."""
    solution = symbolic.derive(2)
    sens = symbolic.sensitivities(2)
    point = {s: sp.Rational(k + 2, 3 * k + 1) for k, s in enumerate(solution.arguments)}
    for name, symbol in zip(sens.parameters, solution.parameters):
        for chain, explicit in ((sens.curvature[name], solution.curvature),
                                (sens.stress_top[1][name], solution.stress_top[1]),
                                (sens.stress_bottom[0][name], solution.stress_bottom[0])):
            assert chain.explicit().subs(point) == sp.diff(explicit, symbol).subs(point)


def test_hand_differentiated_two_layer_cases():
    """Timoshenko 1925 special cases differentiated by hand.

    * m = n = 1: kappa = 3 (a2 - a1) dT / (2h), so dkappa/da2 = -dkappa/da1 = 3 dT/(2h) and dkappa/ddT =
      kappa/dT; bottom-face stress -E (a2 - a1) dT / 4 (from P = E da dT t / 8, see the stress test above),
      so dsigma_bottom/da2 = -E dT / 4.
    * m = 1, n = Y1/Y2: kappa = 24 da dT / (h (14 + n + 1/n)), so dkappa/dY1 = -24 da dT (1 - 1/n^2) /
      (h (14 + n + 1/n)^2 Y2) (zero at n = 1).
    """
    E, t, dT, da = 100e9, 0.4e-3, 60.0, 12e-6
    h = 2 * t
    values = symbolic.evaluate_sensitivities([E, E], [t, t], [5e-6, 5e-6 + da], dT)
    grad = dict(zip(values.parameters, values.curvature_gradient))
    assert grad["a2"] == pytest.approx(1.5 * dT / h, rel=1e-12)
    assert grad["a1"] == pytest.approx(-1.5 * dT / h, rel=1e-12)
    assert grad["dT"] == pytest.approx(1.5 * da / h, rel=1e-12)
    assert abs(grad["Y1"]) <= 1e-12 * 1.5 * da * dT / h / E
    stress_grad = dict(zip(values.parameters, values.stress_bottom_gradient[0]))
    assert stress_grad["a2"] == pytest.approx(-E * dT / 4, rel=1e-12)
    assert stress_grad["a1"] == pytest.approx(E * dT / 4, rel=1e-12)
    for n in (0.5, 2.0, 5.0):
        values = symbolic.evaluate_sensitivities([n * E, E], [t, t], [5e-6, 5e-6 + da], dT)
        expected = -24 * da * dT * (1 - 1 / n ** 2) / (h * (14 + n + 1 / n) ** 2 * E)
        assert values.curvature_gradient[0] == pytest.approx(expected, rel=1e-10)


@settings(max_examples=30, deadline=None)
@given(stacks(min_layers=2, max_layers=5), temperature_changes)
def test_sensitivities_obey_euler_homogeneity(stack, dT):
    """Euler's theorem for the scaling invariants of layers.md §9 item 7 (no loads): kappa is homogeneous of
    degree 0 in Y and -1 in t, the stresses of degree 1 in Y and 0 in t, and both linear in dT."""
    Y, t, a = stack
    n = len(Y)
    v = symbolic.evaluate_sensitivities(Y, t, a, dT)
    gY, gt, gdT = slice(0, n), slice(n, 2 * n), 3 * n
    stress_scale, kappa_scale = thermal_scales(Y, t, a, dT)
    assert abs(v.curvature_gradient[gY] @ Y) <= 1e-8 * kappa_scale
    assert abs(v.curvature_gradient[gt] @ t + v.curvature) <= 1e-8 * kappa_scale
    assert v.curvature_gradient[gdT] * dT == pytest.approx(v.curvature, rel=1e-9, abs=1e-12 * kappa_scale)
    np.testing.assert_allclose(v.stress_top_gradient[:, gY] @ Y, v.stress_top, rtol=0, atol=1e-8 * stress_scale)
    np.testing.assert_allclose(v.stress_bottom_gradient[:, gt] @ t, 0, atol=1e-8 * stress_scale)


def test_curvature_is_stationary_under_thickness_transfer_at_the_optimum():
    """At m^2 n = 1 (Timoshenko optimum) moving thickness from layer 2 to layer 1 at fixed h leaves kappa
    unchanged to first order: dkappa/dt1 - dkappa/dt2 = 0; away from it the difference is not zero."""
    E2, n, h = 70e9, 2.9, 1e-3
    t1 = h / (1 + np.sqrt(n))
    at = symbolic.evaluate_sensitivities([n * E2, E2], [t1, h - t1], [4e-6, 17e-6], 90.0)
    off = symbolic.evaluate_sensitivities([n * E2, E2], [0.5 * h, 0.5 * h], [4e-6, 17e-6], 90.0)
    size = abs(at.curvature) / h
    assert abs(at.curvature_gradient[2] - at.curvature_gradient[3]) <= 1e-10 * size
    assert abs(off.curvature_gradient[2] - off.curvature_gradient[3]) > 1e-3 * size


def test_peak_stress_is_the_larger_face_with_its_gradient():
    """Stress is linear in z within a layer, so the extreme is a face value; under pure thermal load the
    peak of a bilayer layer is at the interface (layers.md §9 item 9, which follows from Timoshenko's
    decomposition: P and kappa have the same sign)."""
    rng = np.random.default_rng(5)
    Y, t, a, dT = random_stacks(rng, 300, 2)
    v = symbolic.evaluate_sensitivities(Y, t, a, dT)
    assert np.all(np.abs(v.stress_peak) == np.maximum(np.abs(v.stress_top), np.abs(v.stress_bottom)))
    assert np.all(v.peak_on_top[:, 0]) and not np.any(v.peak_on_top[:, 1])
    np.testing.assert_array_equal(v.stress_peak_gradient[:, 0], v.stress_top_gradient[:, 0])
    np.testing.assert_array_equal(v.stress_peak_gradient[:, 1], v.stress_bottom_gradient[:, 1])


# --- API, caching, laziness, errors ---------------------------------------------------------------


def test_derivation_and_sensitivities_are_cached():
    first = symbolic.derive(4)
    start = time.perf_counter()
    again = symbolic.derive(4)
    elapsed = time.perf_counter() - start
    assert again is first
    assert elapsed < 1e-3
    sens = symbolic.sensitivities(4)
    start = time.perf_counter()
    assert symbolic.sensitivities(4) is sens
    assert time.perf_counter() - start < 1e-3
    assert symbolic.optimum_thickness_ratio() is symbolic.optimum_thickness_ratio()


def test_ten_layer_derivation_is_fast():
    """The generic-sum derivation keeps n = 10 well below the 5 s slow-test limit (fresh interpreter,
    sympy import included; measured ~0.6 s)."""
    code = ("import time; t = time.perf_counter(); from bilayer.core import symbolic; s = symbolic.derive(10); "
            "print(time.perf_counter() - t, len(s.stress_top))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True,
                         cwd=REPOSITORY)
    elapsed, layers = out.stdout.split()
    assert float(elapsed) < 5.0 and layers == "10"


def test_curvature_expression_substitution_matches_numeric():
    """The explicit expression for a benchmark by .subs/.evalf equals the lambdified value."""
    expr, symbols = symbolic.curvature_expression(3)
    assert len(symbols) == 3 * 3 + 3
    Y, t, a, dT = [200e9, 3e9, 70e9], [0.30e-3, 0.05e-3, 0.20e-3], [12e-6, 60e-6, 23e-6], -80.0
    numbers = [*Y, *t, *a, dT, 0.0, 0.05]
    by_substitution = float(expr.subs(dict(zip(symbols, numbers))).evalf())
    lambdified = float(symbolic.evaluate(Y, t, a, dT, 0.0, 0.05).curvature)
    assert by_substitution == pytest.approx(lambdified, rel=1e-12)


def test_latex_strings_cover_equations_and_solution():
    latex = symbolic.derive(2).latex()
    for key in ("force_balance", "moment_balance", "reduced_force_balance", "reduced_moment_balance",
                "base_strain", "curvature", "bending_axis", "curvature_explicit", "sum_A", "sum_D"):
        assert isinstance(latex[key], str) and latex[key]
    assert r"\kappa" in latex["curvature"] and r"\Delta T" in latex["curvature_explicit"]
    assert r"\alpha_{2}" in latex["curvature_explicit"]


def test_numeric_functions_broadcast_over_batches():
    """One stack with an array of temperature changes gives an array; results are linear in dT."""
    dT = np.array([-50.0, 10.0, 100.0])
    values = symbolic.evaluate([140e9, 100e9], [0.5e-3, 0.5e-3], [1.5e-6, 19.5e-6], dT)
    assert values.curvature.shape == (3,) and values.stress_top.shape == (3, 2)
    np.testing.assert_allclose(values.curvature / dT, values.curvature[0] / dT[0], rtol=1e-12)
    f = symbolic.sensitivities(2).curvature["t1"]
    assert f([140e9, 100e9], [0.5e-3, 0.5e-3], [1.5e-6, 19.5e-6], dT).shape == (3,)


def test_import_does_not_load_sympy():
    code = "import sys, bilayer.core.symbolic; print('sympy' in sys.modules)"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True,
                         cwd=REPOSITORY)
    assert out.stdout.strip() == "False"


@pytest.mark.parametrize("bad", [0, -2, 2.5, True, "3"])
def test_bad_layer_count_is_an_input_error(bad):
    with pytest.raises(InputError, match="n_layers"):
        symbolic.derive(bad)


def test_mismatched_layer_arrays_name_the_field():
    with pytest.raises(InputError, match="thicknesses"):
        symbolic.evaluate([1e11, 1e11], [1e-3, 1e-3, 1e-3], [1e-6, 2e-6], 10.0)
    with pytest.raises(InputError, match="moduli"):
        symbolic.evaluate(1e11, [1e-3], [1e-6], 10.0)
