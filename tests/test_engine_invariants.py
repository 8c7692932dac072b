"""Physics invariants of the stack engine on random stacks (hypothesis).

Each property is exact for the model (layers.md sec. 9 lists them; they follow from force and moment
balance with a linear strain field), so tolerances are near machine precision.
"""
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import bilayer as bl
from bilayer.core.errors import SuspiciousInputWarning
from bilayer.core.materials import Material

# random stacks include negative CTEs and extreme moduli on purpose; their warnings are expected
pytestmark = pytest.mark.filterwarnings("ignore", category=SuspiciousInputWarning)

STATES = st.sampled_from(["narrow", "wide", "plate"])


@st.composite
def stacks(draw, min_layers=1, max_layers=6):
    n = draw(st.integers(min_layers, max_layers))
    layers = []
    for i in range(n):
        E = draw(st.floats(1e8, 5e11))
        nu = draw(st.floats(0.0, 0.49))
        alpha = draw(st.floats(-5e-6, 2e-4))
        t = draw(st.floats(1e-6, 5e-3))
        layers.append((Material(f"m{i}", E, nu, alpha), t))
    return bl.Stack.of(*layers)


temperature_changes = st.floats(-250, 250).filter(lambda x: abs(x) > 1e-3)


def stress_scale(stack, dT):
    """Largest stress the thermal load could produce, E_max * max |f|: the scale for round-off."""
    E = max(l.material.youngs_modulus for l in stack) / (1 - max(l.material.poisson_ratio for l in stack))
    return E * 1.5 * max(abs(l.material.alpha) for l in stack) * abs(dT) + 1e-6


def curvature_scale(stack, dT):
    """Largest curvature the thermal load could produce, ~ max |f| / H: the scale for round-off."""
    return 1.5 * max(abs(l.material.alpha) for l in stack) * abs(dT) / stack.total_thickness + 1e-300


def _resultants(result):
    """Force and moment (about the bending axis) of the stress field, exact for linear stress per layer."""
    t = result.thicknesses
    sb, st_ = result.stress_bottom, result.stress_top
    force = np.sum(0.5 * (sb + st_) * t)
    zb, zt = result.layer_bottom - result.bending_axis, result.layer_top - result.bending_axis
    # integral of a linear function times (z - t_b) over each layer (Simpson is exact for quadratics)
    zm = 0.5 * (zb + zt)
    sm = 0.5 * (sb + st_)
    moment = np.sum(t / 6 * (sb * zb + 4 * sm * zm + st_ * zt))
    scale = np.sum(np.abs(sb) * t + np.abs(st_) * t) + 1e-30
    return force, moment, scale


@settings(max_examples=150, deadline=None)
@given(stacks(), temperature_changes, STATES, st.floats(-1e4, 1e4), st.floats(-10, 10))
def test_force_and_moment_balance(stack, dT, state, N, M):
    r = bl.evaluate(stack, bl.Temperatures(400.0, 400.0 + dT), state, axial_force=N, bending_moment=M)
    force, moment, scale = _resultants(r)
    scale = max(scale, stress_scale(stack, dT) * r.total_thickness)  # round-off floor of a stress-free stack
    assert abs(force - N) <= 1e-9 * max(scale, abs(N))
    assert abs(moment - M) <= 1e-9 * max(scale * r.total_thickness, abs(M))


@settings(max_examples=100, deadline=None)
@given(stacks(min_layers=2), temperature_changes, STATES)
def test_reversing_the_layer_order_flips_the_curvature(stack, dT, state):
    temps = bl.Temperatures(400.0, 400.0 + dT)
    r, f = bl.evaluate(stack, temps, state), bl.evaluate(stack.reversed(), temps, state)
    assert f.curvature == pytest.approx(-r.curvature, rel=1e-9, abs=1e-12 * curvature_scale(stack, dT))
    assert f.axial_strain == pytest.approx(r.axial_strain, rel=1e-9, abs=1e-18)
    assert f.bending_axis == pytest.approx(r.total_thickness - r.bending_axis, rel=1e-9)
    scale = stress_scale(stack, dT)
    np.testing.assert_allclose(f.stress_top[::-1], r.stress_bottom, atol=1e-9 * scale)
    np.testing.assert_allclose(f.stress_bottom[::-1], r.stress_top, atol=1e-9 * scale)


@settings(max_examples=100, deadline=None)
@given(stacks(), temperature_changes, st.floats(-5e-6, 1e-4), STATES)
def test_equal_ctes_give_no_curvature_and_no_stress(stack, dT, alpha, state):
    """Equal CTEs: no curvature, no stress, c = alpha dT. In plane strain the free strain is
    (1+nu) alpha dT, so the statement needs equal Poisson's ratios there too."""
    nu0 = stack[0].material.poisson_ratio
    same = bl.Stack.of(*[(Material("x", l.material.youngs_modulus,
                                   nu0 if state == "wide" else l.material.poisson_ratio, alpha), l.thickness)
                         for l in stack])
    r = bl.evaluate(same, bl.Temperatures(400.0, 400.0 + dT), state)
    assert abs(r.curvature) <= 1e-12 * abs(alpha * dT) / r.total_thickness + 1e-300
    E = max(l.material.youngs_modulus for l in stack)
    assert np.max(np.abs(r.stress_top)) <= 1e-9 * E * abs(alpha * dT) + 1e-9
    expected = (1 + nu0) * alpha * dT if state == "wide" else alpha * dT
    assert r.axial_strain == pytest.approx(expected, rel=1e-9, abs=1e-20)


@settings(max_examples=60, deadline=None)
@given(stacks(max_layers=1), st.integers(2, 5), temperature_changes, STATES)
def test_identical_layers_behave_as_one_homogeneous_layer(single, copies, dT, state):
    layer = single[0]
    temps = bl.Temperatures(400.0, 400.0 + dT)
    whole = bl.evaluate(bl.Stack.of((layer.material, layer.thickness)), temps, state, 5.0, 0.01)
    split = bl.evaluate(bl.Stack.of(*[(layer.material, layer.thickness / copies)] * copies), temps, state, 5.0, 0.01)
    assert split.curvature == pytest.approx(whole.curvature, rel=1e-9)
    assert split.axial_strain == pytest.approx(whole.axial_strain, rel=1e-9)
    unloaded = bl.evaluate(bl.Stack.of(*[(layer.material, layer.thickness / copies)] * copies), temps, state)
    assert abs(unloaded.curvature) < 1e-12 * abs(layer.material.alpha * dT) / layer.thickness + 1e-300


@settings(max_examples=100, deadline=None)
@given(stacks(), temperature_changes, st.floats(-1e-5, 1e-5), st.sampled_from(["narrow", "plate"]))
def test_common_cte_shift_changes_only_the_axial_strain(stack, dT, shift, state):
    shifted = bl.Stack.of(*[(Material("s", l.material.youngs_modulus, l.material.poisson_ratio,
                                      l.material.alpha + shift), l.thickness) for l in stack])
    temps = bl.Temperatures(400.0, 400.0 + dT)
    r, s = bl.evaluate(stack, temps, state), bl.evaluate(shifted, temps, state)
    assert s.curvature == pytest.approx(r.curvature, rel=1e-7, abs=1e-9 * abs(shift * dT) / r.total_thickness)
    assert s.axial_strain - r.axial_strain == pytest.approx(shift * dT, rel=1e-6, abs=1e-15)
    scale = stress_scale(stack, dT) + np.max([l.material.youngs_modulus for l in stack]) * abs(shift * dT)
    np.testing.assert_allclose(s.stress_top, r.stress_top, atol=1e-7 * scale)


@settings(max_examples=100, deadline=None)
@given(stacks(), temperature_changes, st.floats(0.1, 4), STATES)
def test_linear_in_temperature_change(stack, dT, factor, state):
    a = bl.evaluate(stack, bl.Temperatures(400.0, 400.0 + dT), state)
    b = bl.evaluate(stack, bl.Temperatures(1500.0, 1500.0 + factor * dT), state)
    assert b.curvature == pytest.approx(factor * a.curvature, rel=1e-9,
                                        abs=1e-12 * factor * curvature_scale(stack, dT))
    np.testing.assert_allclose(b.stress_top, factor * a.stress_top, rtol=1e-9,
                               atol=1e-9 * factor * stress_scale(stack, dT))


@settings(max_examples=100, deadline=None)
@given(stacks(), temperature_changes, st.floats(0.01, 100), STATES)
def test_scaling_all_thicknesses_scales_curvature_inversely(stack, dT, s, state):
    scaled = bl.Stack.of(*[(l.material, l.thickness * s) for l in stack])
    temps = bl.Temperatures(400.0, 400.0 + dT)
    a, b = bl.evaluate(stack, temps, state), bl.evaluate(scaled, temps, state)
    assert b.curvature == pytest.approx(a.curvature / s, rel=1e-9, abs=1e-12 * curvature_scale(stack, dT) / s)
    np.testing.assert_allclose(b.stress_top, a.stress_top, rtol=1e-8, atol=1e-9 * stress_scale(stack, dT))


@settings(max_examples=50, deadline=None)
@given(stacks(min_layers=2), STATES)
def test_vectorised_temperatures_equal_one_by_one(stack, state):
    temps = np.array([250.0, 300.0, 350.0, 500.0])
    many = bl.evaluate(stack, bl.Temperatures(320.0, temps), state)
    for k, T in enumerate(temps):
        one = bl.evaluate(stack, bl.Temperatures(320.0, T), state)
        assert many.curvature[k] == pytest.approx(one.curvature, rel=1e-12,
                                                  abs=1e-12 * curvature_scale(stack, 250.0))
        np.testing.assert_allclose(many.stress_top[k], one.stress_top, rtol=1e-12,
                                   atol=1e-12 * stress_scale(stack, 250.0))
