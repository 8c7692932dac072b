"""Interface shear-lag and peel models (bilayer.strip.interface) against independent references.

References used here:
- scipy.integrate.solve_bvp on the same differential equations in dimensionless form (a reference
  library solving the boundary-value problem numerically, independent of the closed forms);
- the sympy derivation (bilayer.strip.derivation) from the governing relations;
- the stack engine (bilayer.core.laminate, Timoshenko/Hsueh transformed section) for the far-field forces;
- derived check values of layers.md sec. 5.4 (Example A stack) and applications.md sec. 5.1
  (aluminium/steel joint), each also reproduced here by solve_bvp or by a closed form checked against it;
- invariants of layers.md sec. 9 items 15-16 (equilibrium, symmetry, limits).
"""
import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.integrate import quad, solve_bvp

import bilayer as bl
from bilayer.core import laminate
from bilayer.core.errors import InputError, SuspiciousInputWarning
from bilayer.strip.interface import interface_parameters, interface_stresses, peel_compliant, shear_lag
from bilayer.core.materials import Material

pytestmark = pytest.mark.filterwarnings("ignore", category=SuspiciousInputWarning)

# layers.md sec. 0 "Example A": E 140/100 GPa, nu 0.30/0.33, alpha 1.5/19.5 ppm/K, 0.5 mm each, dT = +100 K
LAYER_A = Material("example layer A", 140e9, 0.30, 1.5e-6)
LAYER_B = Material("example layer B", 100e9, 0.33, 19.5e-6)
# layers.md sec. 5.4 case 2 bond: h0 = 50 um, G0 = 1 GPa, E0 = 2.7 GPa (nu0 = E0/(2 G0) - 1 = 0.35)
BOND = Material("example bond", 2.7e9, 0.35, 50e-6)
HEATED = bl.Temperatures(293.15, 393.15)
MISMATCH = 18e-6 * 100.0


def bilayer_stack():
    return bl.Stack.of((LAYER_A, 0.5e-3), (LAYER_B, 0.5e-3))


def bonded_stack():
    return bl.Stack.of((LAYER_A, 0.5e-3), (BOND, 50e-6, "bond"), (LAYER_B, 0.5e-3))


def three_layer_stack():
    """layers.md sec. 3.5 stack (E 200/3/70 GPa, t 0.30/0.05/0.20 mm), cooled by 80 K."""
    return bl.Stack.of(
        (Material("s1", 200e9, 0.30, 12e-6), 0.30e-3),
        (Material("s2", 3e9, 0.35, 60e-6), 0.05e-3),
        (Material("s3", 70e9, 0.33, 23e-6), 0.20e-3),
    )


COOLED = bl.Temperatures(293.15, 213.15)


# --- reference values -------------------------------------------------------------------------------


def test_example_a_bilayer_matches_derived_check_values():
    """Derived check values, layers.md sec. 5.4 case 1 (also reproduced by solve_bvp below)."""
    result = interface_stresses(bilayer_stack(), HEATED, 20e-3)
    p = result.interfaces[0].parameters
    assert p.axial_compliance == pytest.approx(1.342857e-7, rel=1e-6)
    assert p.shear_compliance == pytest.approx(7.528571e-15, rel=1e-6)
    assert p.decay_rate == pytest.approx(4223.365, rel=1e-6)
    assert p.long_strip_force == pytest.approx(13404.2553, rel=1e-8)
    assert result.interfaces[0].max_shear == pytest.approx(56.6111e6, rel=1e-5)
    assert p.peel_lever == pytest.approx(4.1667e-5, rel=1e-4)
    assert result.interfaces[0].peel_common_deflection[-1] == pytest.approx(9.9620e6, rel=1e-4)


def test_example_a_long_strip_force_is_the_timoshenko_force():
    """chi -> 0 limit: the long-strip force equals the engine's layer force (Timoshenko P, layers.md 1.7)."""
    result = interface_stresses(bilayer_stack(), HEATED, 20e-3, x=[10e-3])
    Y = np.array([140e9, 100e9])
    sol = laminate.solve(Y, [0.5e-3, 0.5e-3], [1.5e-4, 19.5e-4])
    engine_force = 0.5 * (sol.stress_bottom + sol.stress_top) * 0.5e-3
    np.testing.assert_allclose(result.layer_force[0], engine_force, rtol=1e-12)
    assert engine_force[0] == pytest.approx(13404.255, rel=1e-7)


def test_bonded_example_matches_derived_check_values():
    """Derived check values, layers.md sec. 5.4 case 2, shear part (lambda, chi, k, T(0), tau_max)."""
    result = interface_stresses(bonded_stack(), HEATED, 20e-3, bonds=["bond"], x=[10e-3])
    profile = result.interfaces[0]
    p = profile.parameters
    assert p.lever_arm == pytest.approx(0.55e-3)
    assert p.axial_compliance == pytest.approx(1.552857e-7, rel=1e-6)
    assert p.shear_compliance == pytest.approx(5.752857e-14, rel=1e-6)
    assert p.decay_rate == pytest.approx(1642.949, rel=1e-6)
    assert profile.force[0] == pytest.approx(11591.5346, rel=1e-8)
    assert p.long_strip_force == pytest.approx(11591.5363, rel=1e-8)
    assert profile.max_shear == pytest.approx(19.0443e6, rel=1e-5)
    np.testing.assert_allclose(result.layer_force[0], [11591.5346, 0.0, -11591.5346], rtol=1e-8)


def test_sheet_peel_equation_case_2_values():
    """layers.md sec. 5.4 case 2 peel, with the sheet's own coefficients (bond moment neglected,
    c_p = t2/(2 D2) - t1/(2 D1), K = h0/E0): p(l) = -2.3245 MPa, largest tension +0.5070 MPa about
    0.905 mm from the end, and p(l) ~ K^(-1/4) while p(l - 3/k) -> mu tau'(l - 3/k) = 0.06491 MPa.
    The same equation is solved independently with solve_bvp in test_peel_matches_solve_bvp."""
    D1, D2 = 140e9 * 0.5e-3**3 / 12, 100e9 * 0.5e-3**3 / 12
    s, c_p, K = 1 / D1 + 1 / D2, 0.25e-3 / D2 - 0.25e-3 / D1, 50e-6 / 2.7e9
    chi, l = 5.752857142857e-14, 10e-3
    k = math.sqrt(1.552857142857e-7 / chi)
    xi = np.linspace(-l, l, 400001)
    p = peel_compliant(xi, l, MISMATCH, chi, k, K, s, c_p)
    assert p[-1] == pytest.approx(-2.3245e6, rel=1e-4)
    assert p.max() == pytest.approx(0.5070e6, rel=1e-3)
    assert l - abs(xi[np.argmax(p)]) == pytest.approx(0.905e-3, abs=0.005e-3)
    ends = [peel_compliant(np.array([l, l - 3 / k]), l, MISMATCH, chi, k, K * f, s, c_p) for f in (1, 1e-2, 1e-4, 1e-6)]
    np.testing.assert_allclose([e[0] for e in ends], [-2.32e6, -9.62e6, -33.16e6, -107.65e6], rtol=2e-3)
    np.testing.assert_allclose([e[1] for e in ends], [0.10076e6, 0.06481e6, 0.06491e6, 0.06491e6], rtol=2e-3)


def test_no_bending_limit_matches_chen_nelson_values():
    """Chen & Nelson (1979) no-bending shear lag; derived check values layers.md sec. 5.4 case 3:
    k_s = 828.08 1/m, tau_max = 43.4741 MPa, T(0) = 52 473.400 N/m (4.5x the bending value)."""
    result = interface_stresses(bonded_stack(), HEATED, 20e-3, bonds=[1], model="no_bending", x=[10e-3])
    profile = result.interfaces[0]
    assert profile.parameters.decay_rate == pytest.approx(828.08, rel=1e-5)
    assert profile.max_shear == pytest.approx(43.4741e6, rel=1e-6)
    assert profile.force[0] == pytest.approx(52473.400, rel=1e-7)
    assert profile.peel is None and math.isnan(profile.max_peel)


def test_no_bending_joint_of_applications_sheet():
    """applications.md sec. 5.1 check (derived there): 2 mm aluminium (70 GPa, 23 ppm/K) on 2 mm steel
    (200 GPa, 12 ppm/K), epoxy G = 1 GPa, 0.2 mm, overlap 50 mm, dT = -160 K: decay rate 0.220 /mm,
    |tau_max| = 40.1 MPa, force at mid-length 181.0 N/mm, mean aluminium stress 91 MPa; bond-line sweep
    0.05/0.1/0.2/0.5/1.0 mm -> 80.2/56.7/40.1/25.3/17.7 MPa. Independently, tau_max(h0) must scale as
    h0^(-1/2) for the long joints of the sweep (k l > 3; long-joint limit of the closed form)."""
    steel = Material("steel example", 200e9, 0.30, 12e-6)
    aluminium = Material("aluminium example", 70e9, 0.33, 23e-6)
    cooled = bl.Temperatures(393.15, 233.15)
    sweep = []
    for h0 in (0.05e-3, 0.1e-3, 0.2e-3, 0.5e-3, 1.0e-3):
        epoxy = Material("epoxy example", 2.0e9, 0.0, 60e-6)  # E = 2 G with nu = 0: G = 1 GPa
        stack = bl.Stack.of((steel, 2e-3), (epoxy, h0), (aluminium, 2e-3))
        result = interface_stresses(stack, cooled, 50e-3, bonds=[1], model="no_bending", x=[25e-3])
        sweep.append(result)
    main = sweep[2].interfaces[0]
    assert main.parameters.decay_rate == pytest.approx(220.0, rel=2e-3)
    assert abs(main.max_shear) == pytest.approx(40.1e6, rel=2e-3)
    assert abs(main.force[0]) == pytest.approx(181.0e3, rel=1e-3)
    assert abs(sweep[2].layer_force[0, 2]) / 2e-3 == pytest.approx(91e6, rel=1e-2)
    shear = np.array([abs(r.interfaces[0].max_shear) for r in sweep])
    np.testing.assert_allclose(shear, [80.2e6, 56.7e6, 40.1e6, 25.3e6, 17.7e6], rtol=3e-3)
    long_ = [i for i, r in enumerate(sweep) if r.interfaces[0].parameters.decay_rate * 25e-3 > 3.0]
    assert long_ == [0, 1, 2, 3]
    np.testing.assert_allclose((shear * np.sqrt([0.05, 0.1, 0.2, 0.5, 1.0]))[long_], shear[2] * math.sqrt(0.2), rtol=3e-3)


# --- independent solutions: solve_bvp and the symbolic derivation --------------------------------------


def _cases():
    return [
        ("bilayer", bilayer_stack(), HEATED, "narrow", (), 20e-3),
        ("bonded", bonded_stack(), HEATED, "wide", (1,), 12e-3),
        ("three layers, composite part", three_layer_stack(), COOLED, "narrow", (), 8e-3),
        ("three layers, bonded", three_layer_stack(), COOLED, "plate", (1,), 8e-3),
    ]


def _crowded(half, n):
    """Initial solve_bvp mesh on [-half, half], crowded toward both ends (boundary layers)."""
    near = np.geomspace(1e-3, half + 1e-3, n) - 1e-3
    return np.unique(np.clip(np.concatenate([-half + near, half - near]), -half, half))


def _unit_cosh(y, half_length, rate):
    """cosh(rate y)/cosh(rate l) without overflow."""
    return (np.exp(-rate * (half_length - np.abs(y))) + np.exp(-rate * (half_length + np.abs(y)))) / (
        1 + np.exp(-2 * rate * half_length)
    )


@pytest.mark.parametrize("name, stack, temps, state, bonds, length", _cases(), ids=[c[0] for c in _cases()])
def test_shear_lag_matches_solve_bvp(name, stack, temps, state, bonds, length):
    """solve_bvp (scipy) on theta'' - theta = -1, theta(+-kl) = 0 with xi = kx, T = (Delta/lambda) theta:
    the closed-form T and tau agree to 1e-6 of their largest values."""
    l = 0.5 * length
    for p in interface_parameters(stack, temps, state, bonds):
        k = p.decay_rate
        kl = k * l
        xi = _crowded(kl, 300)
        guess = np.vstack([np.ones_like(xi), np.zeros_like(xi)])
        sol = solve_bvp(lambda x, y: np.vstack([y[1], y[0] - 1.0]), lambda a, b: np.array([a[0], b[0]]),
                        xi, guess, tol=1e-10, max_nodes=200000)
        assert sol.status == 0, sol.message
        x = np.linspace(-l, l, 2001)
        theta, dtheta = sol.sol(k * x)
        force, shear = p.force_and_shear(x, l)
        scale = p.mismatch_strain / p.axial_compliance
        assert np.max(np.abs(force - scale * theta)) <= 1e-6 * np.max(np.abs(force))
        assert np.max(np.abs(shear + scale * k * dtheta)) <= 1e-6 * np.max(np.abs(shear))


@pytest.mark.parametrize("name, stack, temps, state, bonds, length", _cases(), ids=[c[0] for c in _cases()])
def test_peel_matches_solve_bvp(name, stack, temps, state, bonds, length):
    """solve_bvp on the dimensionless peel problem (xi = beta x, p = p0 q, p0 = c_p Delta/(chi s)):
    q'''' + 4 q = 4 cosh(kx)/cosh(kl), q''(+-beta l) = g/(K beta^2 p0), q'''(+-beta l) = +-4 beta tanh(kl)/k.
    The closed form agrees to 1e-6 of the largest |p|."""
    l = 0.5 * length
    for p in interface_parameters(stack, temps, state, bonds):
        if abs(p.peel_coefficient) < 1e-12 * (1 / p.flexural_rigidity_below):
            continue
        beta, k, K = 1 / p.peel_decay_length, p.decay_rate, p.peel_compliance
        p0 = p.peel_coefficient * p.mismatch_strain / (p.shear_compliance * (1 / p.flexural_rigidity_below + 1 / p.flexural_rigidity_above))
        g = p.end_curvature_mismatch / (K * beta**2 * p0)
        third = 4 * beta * math.tanh(k * l) / k
        xi = _crowded(beta * l, 400)

        def rhs(s, y):
            forcing = 4.0 * _unit_cosh(s / beta, l, k)
            return np.vstack([y[1], y[2], y[3], forcing - 4.0 * y[0]])

        def bc(a, b):
            return np.array([a[2] - g, b[2] - g, a[3] + third, b[3] - third])

        sol = solve_bvp(rhs, bc, xi, np.zeros((4, xi.size)), tol=1e-10, max_nodes=400000)
        assert sol.status == 0, sol.message
        x = np.linspace(-l, l, 4001)
        closed = p.peel(x, l)
        assert np.max(np.abs(closed - p0 * sol.sol(beta * x)[0])) <= 1e-6 * np.max(np.abs(closed))


def test_symbolic_derivation_gives_the_documented_coefficients():
    """The sympy derivation from the governing relations (bilayer.strip.derivation) reproduces
    lambda, Delta, chi of the numeric model for a bonded three-layer case with composite parts."""
    from bilayer.strip.derivation import shear_lag_derivation

    d = shear_lag_derivation()
    stack = bl.Stack.of((LAYER_A, 0.4e-3), (LAYER_B, 0.2e-3), (BOND, 40e-6), (LAYER_A, 0.3e-3))
    (p,) = [q for q in interface_parameters(stack, HEATED, "narrow", bonds=[2]) if q.bond == 2]
    E = np.array([140e9, 100e9, 2.7e9, 140e9])
    f = np.array([1.5e-4, 19.5e-4, 50e-4, 1.5e-4])
    t = stack.thicknesses
    low, high = laminate.solve(E[:2], t[:2], f[:2]), laminate.solve(E[3:], t[3:], f[3:])
    zb2 = t[:3].sum() + float(high.bending_axis)
    values = {
        "A1": float(low.axial_rigidity), "A2": float(high.axial_rigidity), "D1": float(low.flexural_rigidity),
        "D2": float(high.flexural_rigidity), "N_T1": float(low.thermal_force), "N_T2": float(high.thermal_force),
        "M_T1": float(low.thermal_moment), "M_T2": float(high.thermal_moment),
        "e": zb2 - float(low.bending_axis), "h0": t[2], "G0": 2.7e9 / 2.7,
    }
    subs = {d.symbols[name]: value for name, value in values.items()}
    assert float(d.axial_compliance.subs(subs)) == pytest.approx(p.axial_compliance, rel=1e-12)
    assert float(d.mismatch.subs(subs)) == pytest.approx(p.mismatch_strain, rel=1e-12)
    layer_terms = p.shear_compliance - t[2] / (2.7e9 / 2.7)
    chi = d.shear_compliance.subs(subs).subs({d.symbols["chi1"]: layer_terms, d.symbols["chi2"]: 0.0})
    assert float(chi) == pytest.approx(p.shear_compliance, rel=1e-12)


def test_symbolic_closed_forms_equal_the_numeric_ones():
    """Lambdified sympy solutions (dsolve for T; ansatz plus linear solve for p) against the
    overflow-free numeric forms, at moderate k l and beta l."""
    from bilayer.strip.derivation import layer_compliance_derivation, numeric_peel, numeric_shear_lag, peel_derivation

    x = np.linspace(-3e-3, 3e-3, 301)
    T_sym, tau_sym = numeric_shear_lag()(x, 3e-3, 1.4e-7, 2e-14, -1.2e-3)
    T_num, tau_num = shear_lag(x, 3e-3, -1.2e-3, 1.4e-7, 2e-14)
    np.testing.assert_allclose(T_num, T_sym, rtol=1e-10, atol=1e-10 * np.max(np.abs(T_num)))
    np.testing.assert_allclose(tau_num, tau_sym, rtol=1e-10, atol=1e-10 * np.max(np.abs(tau_num)))

    D1, D2, c1, c2, h0, K, chi, k, Delta, MT1, MT2 = 1.2, 0.4, 2.5e-4, 1.5e-4, 3e-5, 3e-14, 2e-14, 2600.0, 1.5e-3, 0.02, -0.01
    p_sym = numeric_peel()(x, 3e-3, k, K, D1, D2, chi, c1, c2, h0, Delta, MT1, MT2)
    s = 1 / D1 + 1 / D2
    c_p = (c2 + h0 / 2) / D2 - (c1 + h0 / 2) / D1
    p_num = peel_compliant(x, 3e-3, Delta, chi, k, K, s, c_p, MT1 / D1 - MT2 / D2)
    assert (s / (4 * K)) ** 0.25 * 3e-3 > 5  # a real boundary layer, still no overflow in cosh*cos
    np.testing.assert_allclose(p_num, p_sym, rtol=1e-8, atol=1e-8 * np.max(np.abs(p_num)))
    assert peel_derivation().residual == 0
    single, _ = layer_compliance_derivation()
    assert str(single) == "t/(3*G)"  # Suhir's longitudinal compliance of one layer


# --- invariants (layers.md sec. 9 items 15-16) on random stacks -------------------------------------------


@st.composite
def interface_cases(draw):
    n = draw(st.integers(2, 4))
    layers = []
    for i in range(n):
        E = draw(st.floats(2e9, 4e11))
        nu = draw(st.floats(0.0, 0.45))
        alpha = draw(st.one_of(st.just(0.0), st.floats(1e-8, 3e-5)))  # no subnormal CTEs: they underflow the scales
        t = draw(st.floats(2e-5, 2e-3))
        layers.append((Material(f"m{i}", E, nu, alpha), t))
    stack = bl.Stack.of(*layers)
    bonds = (draw(st.integers(1, n - 2)),) if n > 2 and draw(st.booleans()) else ()
    ratio = draw(st.floats(5.0, 60.0))
    state = draw(st.sampled_from(["narrow", "wide", "plate"]))
    dT = draw(st.sampled_from([-120.0, 80.0]))
    return stack, bonds, ratio * stack.total_thickness, state, bl.Temperatures(300.0, 300.0 + dT)


def _breaks(l, *scales):
    return sorted({min(c * s, 0.999 * l) for s in scales for c in (1, 3, 10, 30)})


@settings(max_examples=40)
@given(interface_cases())
def test_shear_integral_equals_mid_length_force(case):
    """Equilibrium (layers.md 9.15): int_0^l tau dx = T(0) for every interface (closed form, quadrature)."""
    stack, bonds, length, state, temps = case
    l = 0.5 * length
    for p in interface_parameters(stack, temps, state, bonds):
        integral, _ = quad(lambda r: float(p.force_and_shear(np.array([l - r]), l)[1][0]), 0.0, l,
                           points=_breaks(l, p.decay_length), limit=400, epsabs=0.0, epsrel=1e-11)
        mid = float(p.force_and_shear(np.array([0.0]), l)[0][0])
        assert integral == pytest.approx(mid, rel=1e-8, abs=1e-9 * abs(p.long_strip_force))


@settings(max_examples=40)
@given(interface_cases())
def test_symmetry_about_mid_length(case):
    """T and p even, tau odd about mid-length (layers.md 9.15-9.16); layer forces sum to zero."""
    stack, bonds, length, state, temps = case
    result = interface_stresses(stack, temps, length, state, bonds, points=201)
    mirrored = interface_stresses(stack, temps, length, state, bonds, x=length - result.x)
    for a, b in zip(result.interfaces, mirrored.interfaces):
        scale_T, scale_tau = np.max(np.abs(a.force)), np.max(np.abs(a.shear))
        np.testing.assert_allclose(a.force, b.force, atol=1e-10 * scale_T)
        np.testing.assert_allclose(a.shear, -b.shear, atol=1e-10 * scale_tau)
        np.testing.assert_allclose(a.peel, b.peel, atol=1e-9 * np.max(np.abs(a.peel)) + 1e-300)
    np.testing.assert_allclose(result.layer_force.sum(axis=1), 0.0, atol=1e-9 * np.max(np.abs(result.layer_force)))


@settings(max_examples=30)
@given(interface_cases())
def test_peel_is_self_equilibrated(case):
    """int p dx = 0 over the strip for the peel with through-thickness compliance (layers.md 9.16).

    p is even, so this is int_0^l p dx = 0 (quadrature over the half strip). The sheet's second
    condition, int x p dx = 0 over the whole strip, holds for any even p and is not tested.
    """
    stack, bonds, length, state, temps = case
    l = 0.5 * length
    for p in interface_parameters(stack, temps, state, bonds):
        scale = float(np.max(np.abs(p.peel(l - l * np.linspace(0.0, 1.0, 4001) ** 3, l))))
        points = _breaks(l, p.decay_length, p.peel_decay_length)
        force, _ = quad(lambda r: float(p.peel(np.array([l - r]), l)[0]), 0.0, l, points=points, limit=600,
                        epsabs=1e-13 * scale * l)
        assert abs(force) <= 1e-7 * scale * l


@settings(max_examples=40)
@given(interface_cases())
def test_far_field_layer_forces_equal_the_engine(case):
    """Without bonds, a long strip carries the engine's layer forces at mid-length (Hsueh/Timoshenko
    transformed section, bilayer.core.laminate), in every bending state."""
    stack, _, _, state, temps = case
    length = 400 * stack.total_thickness
    result = interface_stresses(stack, temps, length, state, x=[0.5 * length])
    if min(p.parameters.decay_rate for p in result.interfaces) * 0.5 * length < 40:
        return  # not a long strip for this random case
    E = np.array([layer.material.youngs_modulus for layer in stack])
    nu = np.array([layer.material.poisson_ratio for layer in stack])
    f = np.array([layer.material.alpha * (temps.operating - temps.stress_free) for layer in stack])
    Y, free = laminate.effective_properties(E, nu, f, state)
    sol = laminate.solve(Y, stack.thicknesses, free)
    engine = 0.5 * (sol.stress_bottom + sol.stress_top) * stack.thicknesses
    load = np.max(np.abs(Y * free * stack.thicknesses))  # force scale; equal CTEs give zero forces
    np.testing.assert_allclose(result.layer_force[0], engine, atol=1e-9 * max(np.max(np.abs(engine)), load))


def test_no_bending_far_field_equals_the_flat_engine_solution():
    """With bending suppressed, the far-field force is the force of the parts held flat: the engine's
    'flat' restraint (bilayer.core.laminate) for single-layer parts, and equal part strains at each bond
    (part resultants from the engine) for composite parts."""
    stack = bl.Stack.of((LAYER_A, 0.4e-3), (BOND, 40e-6), (LAYER_B, 0.3e-3))
    result = interface_stresses(stack, HEATED, 0.2, bonds=[1], model="no_bending", x=[0.1])
    flat = laminate.solve([140e9, 100e9], [0.4e-3, 0.3e-3], [1.5e-4, 19.5e-4], restraint="flat")
    flat_force = 0.5 * (flat.stress_bottom[0] + flat.stress_top[0]) * 0.4e-3
    assert result.interfaces[0].force[0] == pytest.approx(flat_force, rel=1e-12)

    stack = bl.Stack.of((LAYER_A, 0.4e-3), (BOND, 40e-6), (LAYER_B, 0.2e-3), (BOND, 30e-6), (LAYER_A, 0.3e-3))
    result = interface_stresses(stack, HEATED, 0.2, bonds=[1, 3], model="no_bending", x=[0.1])
    E = np.array([140e9, 2.7e9, 100e9, 2.7e9, 140e9])
    f = np.array([1.5e-4, 50e-4, 19.5e-4, 50e-4, 1.5e-4])
    t = stack.thicknesses
    for profile, below, above in zip(result.interfaces, ([0], [0, 1, 2]), ([2, 3, 4], [4])):
        low, high = laminate.solve(E[below], t[below], f[below]), laminate.solve(E[above], t[above], f[above])
        A1, A2 = float(low.axial_rigidity), float(high.axial_rigidity)
        strain_gap = float(high.thermal_force) / A2 - float(low.thermal_force) / A1
        assert profile.force[0] == pytest.approx(strain_gap / (1 / A1 + 1 / A2), rel=1e-12)
    with pytest.raises(InputError, match="needs a bond"):
        interface_stresses(bl.Stack.of((LAYER_A, 0.4e-3), (LAYER_B, 0.2e-3), (BOND, 40e-6), (LAYER_B, 0.3e-3)),
                           HEATED, 0.2, bonds=[2], model="no_bending")


# --- symmetry and limits -------------------------------------------------------------------------------


def test_equal_layers_have_no_peel_but_shear():
    """Two layers of equal thickness and modulus (CTEs differ): mu = c_p = 0, so p = 0 while tau != 0
    (layers.md sec. 5.3 and 9.16); the same with a bond line in the middle."""
    one = Material("equal one", 120e9, 0.3, 5e-6)
    two = Material("equal two", 120e9, 0.3, 17e-6)
    for stack, bonds in ((bl.Stack.of((one, 0.4e-3), (two, 0.4e-3)), ()),
                         (bl.Stack.of((one, 0.4e-3), (BOND, 30e-6), (two, 0.4e-3)), (1,))):
        result = interface_stresses(stack, HEATED, 10e-3, bonds=bonds)
        profile = result.interfaces[0]
        assert np.max(np.abs(profile.shear)) > 1e6
        assert np.max(np.abs(profile.peel)) <= 1e-9 * np.max(np.abs(profile.shear))
        assert np.max(np.abs(profile.peel_common_deflection)) <= 1e-9 * np.max(np.abs(profile.shear))


def test_long_joint_limit_is_independent_of_length():
    """Long joint (k l >> 1): mid-length force and end shear do not depend on the length (layers.md 9.15)."""
    short, long_ = (interface_stresses(bonded_stack(), HEATED, L, bonds=[1], x=[0.5 * L, L]) for L in (40e-3, 120e-3))
    a, b = short.interfaces[0], long_.interfaces[0]
    assert a.parameters.decay_rate * 20e-3 > 30
    assert a.force[0] == pytest.approx(b.force[0], rel=1e-12)
    assert a.shear[1] == pytest.approx(b.shear[1], rel=1e-12)
    assert a.max_peel == pytest.approx(b.max_peel, rel=1e-9)
    assert a.shear[1] == pytest.approx(a.parameters.decay_rate * a.force[0], rel=1e-12)  # tau_max = k T(0)


@pytest.mark.parametrize("model", ["bending", "no_bending"])
def test_short_joint_limit_bond_takes_the_whole_mismatch(model):
    """Short joint (k l << 1): the adherends barely strain, so the relative displacement Delta x goes
    into shear: tau(x) -> Delta x/chi, i.e. G0 Delta x/h0 for the bond alone (applications.md sec. 5.1,
    'short joint: adhesive takes the whole mismatch')."""
    stack = bonded_stack()
    p0 = interface_parameters(stack, HEATED, bonds=[1], model=model)[0]
    length = 2e-3 / p0.decay_rate  # k l = 1e-3
    result = interface_stresses(stack, HEATED, length, bonds=[1], model=model, points=51)
    profile = result.interfaces[0]
    expected = p0.mismatch_strain * (result.x - 0.5 * length) / p0.shear_compliance
    np.testing.assert_allclose(profile.shear, expected, rtol=1e-6, atol=1e-6 * np.max(np.abs(expected)))
    assert np.max(np.abs(profile.force)) < 1e-5 * abs(p0.long_strip_force)
    if model == "no_bending":
        assert p0.shear_compliance == pytest.approx(50e-6 / 1e9)
        assert profile.max_shear == pytest.approx(1e9 * MISMATCH * 0.5 * length / 50e-6, rel=1e-6)


def test_stiff_interface_limit_interior_peel_tends_to_common_deflection():
    """As K -> 0 the interior peel tends to Suhir's mu tau' and |p(l)| grows as K^(-1/4) (layers.md 9.16)."""
    p = interface_parameters(bonded_stack(), HEATED, bonds=[1])[0]
    l, k = 10e-3, p.decay_rate
    s = 1 / p.flexural_rigidity_below + 1 / p.flexural_rigidity_above
    inner = np.array([l, l - 3 / k])
    values = [peel_compliant(inner, l, p.mismatch_strain, p.shear_compliance, k, p.peel_compliance * f, s,
                             p.peel_coefficient, p.end_curvature_mismatch) for f in (1e-6, 1e-8)]
    common = p.peel_common_deflection(np.array([l - 3 / k]), l)[0]
    assert values[1][1] == pytest.approx(common, rel=1e-4)
    assert values[1][0] / values[0][0] == pytest.approx(100**0.25, rel=0.02)


def test_warnings_name_the_model_limits():
    short = interface_stresses(bonded_stack(), HEATED, 3e-3, bonds=[1])  # k l = 2.5
    assert any("total thicknesses" in w for w in short.warnings)
    assert any("edge zone" in w for w in short.warnings)
    thick = bl.Stack.of((LAYER_A, 0.5e-3), (BOND, 0.3e-3), (LAYER_B, 0.5e-3))
    thick_result = interface_stresses(thick, HEATED, 40e-3, bonds=[1])
    assert any("thick bond" in w for w in thick_result.warnings)
    assert any("singular" in a for a in thick_result.assumptions)
    data = thick_result.to_dict()
    assert data["interfaces"][0]["bond"] == 2 and data["units"]["shear"] == "Pa"


# --- bad input --------------------------------------------------------------------------------------------


@pytest.mark.parametrize(
    "kwargs, field",
    [
        (dict(bonds=[0]), "bonds"),
        (dict(bonds=[2]), "bonds"),
        (dict(bonds=["nope"]), "bonds"),
        (dict(bonds=[1.5]), "bonds"),
        (dict(model="rigid"), "model"),
        (dict(model="no_bending"), "model"),
        (dict(length=0.0), "length"),
        (dict(length=float("nan")), "length"),
        (dict(x=[-1e-3]), "x"),
        (dict(points=2), "points"),
    ],
)
def test_bad_input_names_the_field(kwargs, field):
    args = dict(stack=bonded_stack(), temperatures=HEATED, length=10e-3)
    args.update(kwargs)
    if field == "model" and kwargs["model"] == "no_bending":
        args["stack"] = bilayer_stack()
    with pytest.raises(InputError) as error:
        interface_stresses(**args)
    assert error.value.field.startswith(field)


def test_touching_bonds_and_array_temperatures_are_refused():
    stack = bl.Stack.of((LAYER_A, 1e-3), (BOND, 1e-4), (BOND, 1e-4), (LAYER_B, 1e-3))
    with pytest.raises(InputError, match="do not touch"):
        interface_stresses(stack, HEATED, 10e-3, bonds=[1, 2])
    with pytest.raises(InputError, match="single temperature"):
        interface_stresses(bilayer_stack(), bl.Temperatures(293.15, [300.0, 310.0]), 10e-3)
