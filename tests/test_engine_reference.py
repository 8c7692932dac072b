"""The stack engine against published formulas and independent methods.

Sources named beside each check. Check values quoted from layers.md are derived values of that sheet;
each one is recomputed here by a second, independent route before it is trusted.
"""
import mpmath
import numpy as np
import pytest

import bilayer as bl
from bilayer.core import laminate
from bilayer.core.materials import Material

RNG = np.random.default_rng(1925)


def timoshenko_curvature(E1, E2, t1, t2, dalpha, dT):
    """Timoshenko (1925), J. Opt. Soc. Am. 11:233, eq. for 1/rho: layer 1 at the bottom, dalpha = a2 - a1."""
    m, n, h = t1 / t2, E1 / E2, t1 + t2
    return 6 * dalpha * dT * (1 + m) ** 2 / (h * (3 * (1 + m) ** 2 + (1 + m * n) * (m**2 + 1 / (m * n))))


def two_layer(E1, E2, t1, t2, a1, a2, nu1=0.3, nu2=0.3):
    return bl.Stack.of((Material("bottom", E1, nu1, a1), t1), (Material("top", E2, nu2, a2), t2))


def test_random_two_layer_stacks_match_timoshenko_to_1e_12():
    """Timoshenko (1925): narrow strip, both the engine and the fast two-layer kernel."""
    n = 200
    E1, E2 = 10 ** RNG.uniform(9, 11.7, (2, n))
    t1, t2 = 10 ** RNG.uniform(-6, -2, (2, n))
    a1, a2 = RNG.uniform(-5e-6, 60e-6, (2, n))
    dT = RNG.uniform(-200, 200, n)
    # the reference formula is evaluated in 40-digit arithmetic so that its own rounding cannot
    # hide or fake a difference (thickness ratios here reach 1e4)
    with mpmath.workdps(40):
        expected = np.array([float(timoshenko_curvature(*map(mpmath.mpf, (p, q, r, s)), mpmath.mpf(b) - mpmath.mpf(a),
                                                        mpmath.mpf(d)))
                             for p, q, r, s, a, b, d in zip(E1, E2, t1, t2, a1, a2, dT)])
    fast = laminate.bilayer_extremes(E1, E2, t1, t2, a1 * dT, a2 * dT)[0]
    general = laminate.solve(np.c_[E1, E2], np.c_[t1, t2], np.c_[a1 * dT, a2 * dT]).curvature
    np.testing.assert_allclose(fast, expected, rtol=1e-12)
    np.testing.assert_allclose(general, expected, rtol=1e-12)
    for i in range(5):  # and through the public API with materials and temperatures
        stack = two_layer(E1[i], E2[i], t1[i], t2[i], a1[i], a2[i])
        result = bl.evaluate(stack, bl.Temperatures(300.0, 300.0 + dT[i]))
        assert result.curvature == pytest.approx(expected[i], rel=1e-12)


def test_equal_layers_give_three_halves_and_quarter_stresses():
    """Timoshenko (1925), m = n = 1: kappa = 3 dalpha dT/(2h); interface stresses +-E dalpha dT/2, faces -+/4."""
    E, t, da, dT = 100e9, 0.5e-3, 18e-6, 100.0
    r = bl.evaluate(two_layer(E, E, t, t, 1.5e-6, 1.5e-6 + da), bl.Temperatures(293.15, 393.15))
    assert r.curvature == pytest.approx(3 * da * dT / (2 * 2 * t), rel=1e-13)
    s = E * da * dT
    np.testing.assert_allclose(
        [r.stress_bottom[0], r.stress_top[0], r.stress_bottom[1], r.stress_top[1]],
        [-s / 4, s / 2, -s / 2, s / 4],
        rtol=1e-12,
    )


@pytest.mark.parametrize("n", [0.2, 0.7, 1.0, 1.4, 3.0, 10.0])
def test_optimum_thickness_ratio_gives_one_and_a_half_dalpha(n):
    """Timoshenko (1925): at m^2 n = 1 the curvature is 1.5 dalpha dT/h for any modulus ratio n."""
    E2, h, da, dT = 40e9, 1e-3, 20e-6, 50.0
    m = 1 / np.sqrt(n)
    t2 = h / (1 + m)
    t1 = h - t2
    r = bl.evaluate(two_layer(n * E2, E2, t1, t2, 1e-6, 1e-6 + da), bl.Temperatures(300, 300 + dT))
    assert r.curvature == pytest.approx(1.5 * da * dT / h, rel=1e-12)
    # and it is a maximum: nearby ratios at the same total thickness bend less
    for factor in (0.9, 1.1):
        t2b = h / (1 + m * factor)
        rb = bl.evaluate(two_layer(n * E2, E2, h - t2b, t2b, 1e-6, 1e-6 + da), bl.Temperatures(300, 300 + dT))
        assert rb.curvature < r.curvature


def test_example_a_forces_and_stresses_by_timoshenko_force_method():
    """Timoshenko (1925) force method P = dalpha dT / lambda, layers.md eqs. 1.4-1.5, Example A.

    The test recomputes P, kappa and the face stresses from the force method and compares them with
    the engine's transformed-section solution (a different route), then with the sheet's values.
    """
    E1, E2, t1, t2, a1, a2, dT = 140e9, 100e9, 0.5e-3, 0.5e-3, 1.5e-6, 19.5e-6, 100.0
    h = t1 + t2
    D = (E1 * t1**3 + E2 * t2**3) / 12
    lam = 1 / (E1 * t1) + 1 / (E2 * t2) + h**2 / (4 * D)
    P = (a2 - a1) * dT / lam
    kappa = P * h / (2 * D)
    expected = [P / t1 - E1 * kappa * t1 / 2, P / t1 + E1 * kappa * t1 / 2,
                -P / t2 - E2 * kappa * t2 / 2, -P / t2 + E2 * kappa * t2 / 2]
    r = bl.evaluate(two_layer(E1, E2, t1, t2, a1, a2), bl.Temperatures(293.15, 393.15))
    assert r.curvature == pytest.approx(kappa, rel=1e-12)
    got = [r.stress_bottom[0], r.stress_top[0], r.stress_bottom[1], r.stress_top[1]]
    np.testing.assert_allclose(got, expected, rtol=1e-11)
    assert r.layer_force[0] == pytest.approx(P, rel=1e-11)
    # layers.md sec. 1.7 table (derived check values)
    assert r.curvature == pytest.approx(2.680851, rel=1e-6)
    np.testing.assert_allclose(np.array(got) / 1e6, [-67.021, 120.638, -93.830, 40.213], atol=1e-3)
    assert r.bending_axis == pytest.approx(0.4583333e-3, rel=1e-6)
    assert r.flexural_rigidity == pytest.approx(9.791667, rel=1e-6)


def _two_by_two_balance(E, t, f, N=0.0, M0=0.0):
    """Independent route: solve force and moment balance about z = 0 for eps = e0 + k z directly."""
    top = np.cumsum(t)
    bot = top - t
    A = np.sum(E * t)
    B = np.sum(E * (top**2 - bot**2) / 2)
    D = np.sum(E * (top**3 - bot**3) / 3)
    NT = np.sum(E * f * t)
    MT = np.sum(E * f * (top**2 - bot**2) / 2)
    e0, k = np.linalg.solve([[A, B], [B, D]], [N + NT, M0 + MT])
    return e0, k


def test_three_layer_stack_by_direct_balance_and_hsueh_values():
    """Hsueh, Thin Solid Films 418:182 (2002) multilayer form; layers.md sec. 3.5 three-layer example.

    Recomputed by solving the 2x2 force/moment balance about the bottom face (a different route).
    """
    mats = [Material("metal", 200e9, 0.30, 12e-6), Material("bond", 3e9, 0.35, 60e-6),
            Material("cover", 70e9, 0.33, 23e-6)]
    t = np.array([0.30e-3, 0.05e-3, 0.20e-3])
    stack = bl.Stack.of(*zip(mats, t))
    r = bl.evaluate(stack, bl.Temperatures(373.15, 293.15))
    E = np.array([m.youngs_modulus for m in mats])
    a = np.array([m.alpha for m in mats])
    e0, k = _two_by_two_balance(E, t, a * -80)
    assert r.curvature == pytest.approx(k, rel=1e-11)
    assert r.strain_at(0.0) == pytest.approx(e0, rel=1e-11)
    assert r.curvature == pytest.approx(-2.013783, rel=1e-6)
    assert r.bending_axis == pytest.approx(0.2069960e-3, rel=1e-6)
    np.testing.assert_allclose(r.stress_bottom / 1e6, [48.585, 10.436, 29.267], atol=1e-3)
    np.testing.assert_allclose(r.stress_top / 1e6, [-72.242, 10.134, 1.074], atol=1e-3)
    # superposed loads about the bending axis: N = 100 N/m, M = 0.05 N (layers.md sec. 3.5)
    rl = bl.evaluate(stack, bl.Temperatures(373.15, 293.15), axial_force=100.0, bending_moment=0.05)
    assert rl.axial_strain - r.axial_strain == pytest.approx(100.0 / r.axial_rigidity, rel=1e-10)
    assert rl.curvature - r.curvature == pytest.approx(0.05 / r.flexural_rigidity, rel=1e-10)
    assert rl.curvature == pytest.approx(-1.980897, rel=1e-6)
    # the same loads expressed about z = 0 for the independent balance: M_0 = M_b + N t_b
    e0, k = _two_by_two_balance(E, t, a * -80, N=100.0, M0=0.05 + 100.0 * r.bending_axis)
    assert rl.curvature == pytest.approx(k, rel=1e-10)


def _clt(E, nu, t, theta, cylindrical=False):
    """Classical laminate theory (isotropic plies, Q matrix, ABD with thermal resultants).

    Jones, Mechanics of Composite Materials (from memory for the attribution). Free plate: solve the
    6x6 system; cylindrical bending with eps_y = 0 and kappa_y = 0 (plane strain): solve for
    (eps0_x, kappa_x) from N_x = M_x = 0.
    """
    top = np.cumsum(t)
    bot = top - t
    A = np.zeros((3, 3)); B = np.zeros((3, 3)); D = np.zeros((3, 3))
    NT = np.zeros(3); MT = np.zeros(3)
    for Ei, ni, ti, th, zb, zt in zip(E, nu, t, theta, bot, top):
        Q = Ei / (1 - ni**2) * np.array([[1, ni, 0], [ni, 1, 0], [0, 0, (1 - ni) / 2]])
        A += Q * (zt - zb); B += Q * (zt**2 - zb**2) / 2; D += Q * (zt**3 - zb**3) / 3
        NT += Q @ np.array([th, th, 0]) * (zt - zb); MT += Q @ np.array([th, th, 0]) * (zt**2 - zb**2) / 2
    ABD = np.block([[A, B], [B, D]])
    if not cylindrical:
        sol = np.linalg.solve(ABD, np.r_[NT, MT])
        return sol[0], sol[3], sol[4]  # eps0_x, kappa_x, kappa_y
    idx = [0, 3]  # eps0_x and kappa_x free; the rest held at zero
    sol = np.linalg.solve(ABD[np.ix_(idx, idx)], np.r_[NT, MT][idx])
    return sol[0], sol[1], 0.0


@pytest.mark.parametrize("seed", range(5))
def test_classical_laminate_theory_equals_plate_and_wide_states(seed):
    """CLT (ABD matrices with thermal resultants, isotropic plies) equals the plate state (kappa_x = kappa_y)
    and, with eps_y = kappa_y = 0, the wide (plane-strain) state with E/(1-nu^2) and (1+nu) alpha."""
    rng = np.random.default_rng(seed)
    n = rng.integers(2, 6)
    E = 10 ** rng.uniform(9.5, 11.5, n)
    nu = rng.uniform(0.05, 0.45, n)
    a = rng.uniform(0, 30e-6, n)
    t = 10 ** rng.uniform(-5, -3, n)
    dT = rng.uniform(-150, 150)
    stack = bl.Stack.of(*[(Material(f"m{i}", E[i], nu[i], a[i]), t[i]) for i in range(n)])
    temps = bl.Temperatures(400.0, 400.0 + dT)
    e0, kx, ky = _clt(E, nu, t, a * dT)
    plate = bl.evaluate(stack, temps, "plate")
    assert plate.curvature == pytest.approx(kx, rel=1e-10)
    assert ky == pytest.approx(kx, rel=1e-10)
    assert plate.strain_at(0.0) == pytest.approx(e0, rel=1e-9, abs=1e-15)
    e0c, kc, _ = _clt(E, nu, t, a * dT, cylindrical=True)
    wide = bl.evaluate(stack, temps, "wide")
    assert wide.curvature == pytest.approx(kc, rel=1e-10)
    assert wide.strain_at(0.0) == pytest.approx(e0c, rel=1e-9, abs=1e-15)


def test_equal_poisson_ratios_plate_equals_beam_and_wide_is_one_plus_nu_times():
    """layers.md sec. 2.1 (derived, here checked through the engine): equal nu -> plate kappa = beam kappa,
    wide (plane strain) kappa = (1 + nu) x beam kappa; stresses scale by 1/(1-nu) in the plate."""
    nu = 0.3
    stack = two_layer(140e9, 100e9, 0.5e-3, 0.5e-3, 1.5e-6, 19.5e-6, nu, nu)
    temps = bl.Temperatures(293.15, 393.15)
    beam, plate, wide = (bl.evaluate(stack, temps, s) for s in ("narrow", "plate", "wide"))
    assert plate.curvature == pytest.approx(beam.curvature, rel=1e-12)
    assert wide.curvature == pytest.approx((1 + nu) * beam.curvature, rel=1e-12)
    np.testing.assert_allclose(plate.stress_top, beam.stress_top / (1 - nu), rtol=1e-12)


@pytest.mark.parametrize("state", ["narrow", "plate", "wide"])
def test_generalised_hooke_law_in_three_axes(state):
    """Generalised Hooke's law with thermal strain (any elasticity text):
    eps_x = (sigma_x - nu (sigma_y + sigma_z))/E + alpha dT and likewise for y, with sigma_z = 0.
    The reported sigma_x, sigma_y must reproduce the engine's eps_x(z) and the state's eps_y:
    narrow sigma_y = 0; plate eps_y = eps_x (hence the biaxial modulus E/(1-nu)); wide eps_y = 0."""
    mats = [Material("a", 150e9, 0.27, 2e-6), Material("b", 90e9, 0.36, 21e-6), Material("c", 60e9, 0.2, 9e-6)]
    stack = bl.Stack.of(*zip(mats, (0.3e-3, 0.2e-3, 0.4e-3)))
    dT = -120.0
    r = bl.evaluate(stack, bl.Temperatures(420.0, 420.0 + dT), state)
    for i, m in enumerate(mats):
        for z, sx, sy in ((r.layer_bottom[i], r.stress_bottom[i], r.transverse_stress_bottom[i]),
                          (r.layer_top[i], r.stress_top[i], r.transverse_stress_top[i])):
            E, nu, th = m.youngs_modulus, m.poisson_ratio, m.alpha * dT
            eps_x = (sx - nu * sy) / E + th
            eps_y = (sy - nu * sx) / E + th
            assert eps_x == pytest.approx(float(r.strain_at(z)), rel=1e-10, abs=1e-16)
            expected_y = {"narrow": None, "plate": eps_x, "wide": 0.0}[state]
            if expected_y is None:
                assert sy == 0.0
            else:
                assert eps_y == pytest.approx(expected_y, abs=1e-15)
    # biaxial modulus from Hooke's law: sigma_x = sigma_y = s and eps = s (1-nu)/E
    E, nu = 150e9, 0.27
    s = 1e8
    assert s / ((s - nu * s) / E) == pytest.approx(Material("x", E, nu, 0).biaxial_modulus, rel=1e-14)


@pytest.mark.parametrize("g", [0.25, 0.5, 1.0, 2.0])
def test_thin_film_limit_is_stoney_with_first_order_correction(g):
    """Stoney (1909), biaxial form (Feng, Huang & Rosakis 2007): kappa_St = -6 M_f eps_m h_f/(M_s h_s^2)
    for a film on top (project sign: kappa > 0 top convex), eps_m = (alpha_s - alpha_f) dT.
    Exact bilayer / Stoney = 1 + (1 - 4g) r + O(r^2), r = h_f/h_s, g = M_f/M_s (layers.md eq. 4.2,
    re-derived here from the engine for shrinking r)."""
    nu_s, nu_f = 0.28, 0.3
    M_s = 130e9 / (1 - nu_s)
    E_f = g * M_s * (1 - nu_f)
    h_s = 500e-6
    a_s, a_f, dT = 2.6e-6, 14e-6, -200.0
    ratios, rs = [], [1e-3, 1e-4, 1e-5]
    for r in rs:
        stack = bl.Stack.of((Material("substrate", 130e9, nu_s, a_s), h_s),
                            (Material("film", E_f, nu_f, a_f), r * h_s))
        result = bl.evaluate(stack, bl.Temperatures(600.0, 600.0 + dT), "plate")
        stoney = -6 * g * M_s * (a_s - a_f) * dT * r * h_s / (M_s * h_s**2)
        ratios.append(result.curvature / stoney)
    for r, ratio in zip(rs, ratios):
        # first-order term exact; the series of eq. 4.2 gives the r^2 coefficient 16 g^2 - 10 g
        assert abs(ratio - 1 - (1 - 4 * g) * r) < 1.5 * (16 * g**2 + 10 * g + 1) * r**2
    assert abs(ratios[-1] - 1) <= abs(ratios[0] - 1)


def test_single_layer_limits():
    """Free expansion dL = alpha L dT and the fully restrained stress -E alpha dT (-E alpha dT/(1-nu)
    biaxially); any elasticity text."""
    steel = Material("plain steel", 200e9, 0.29, 11.7e-6)
    stack = bl.Stack.of((steel, 2e-3))
    temps = bl.Temperatures(293.15, 343.15)
    r = bl.evaluate(stack, temps)
    assert r.curvature == 0.0
    assert r.free_expansion(30.48) == pytest.approx(11.7e-6 * 30.48 * 50, rel=1e-13)
    np.testing.assert_allclose([r.stress_bottom[0], r.stress_top[0]], 0.0, atol=1e-6)
    fixed = bl.evaluate(stack, temps, restraint="fixed")
    assert fixed.stress_top[0] == pytest.approx(-200e9 * 11.7e-6 * 50, rel=1e-13)
    fixed_plate = bl.evaluate(stack, temps, "plate", restraint="fixed")
    assert fixed_plate.stress_top[0] == pytest.approx(-200e9 * 11.7e-6 * 50 / (1 - 0.29), rel=1e-13)
    assert r.effective_cte == pytest.approx(11.7e-6, rel=1e-13)


def test_held_flat_strip_carries_plus_minus_stresses():
    """Held flat, free to slide (layers.md sec. 7): sigma_i = Y_i (c - alpha_i dT), c = N_T/EA.
    For equal layers of Example B this is +-E dalpha dT/2 in each layer (hand value: 90 MPa)."""
    r = bl.evaluate(two_layer(100e9, 100e9, 0.5e-3, 0.5e-3, 1.5e-6, 19.5e-6), bl.Temperatures(293.15, 393.15),
                    restraint="flat")
    assert r.curvature == 0.0
    np.testing.assert_allclose(r.stress_top, [90e6, -90e6], rtol=1e-12)


@pytest.mark.parametrize("state", ["narrow", "plate", "wide"])
def test_strain_energy_matches_quadrature_of_three_axis_energy_density(state):
    """Elastic energy density w = (sigma_x eps_x,el + sigma_y eps_y,el)/2 with elastic strains from
    the generalised Hooke's law, integrated numerically through the thickness (independent of the
    closed-form layer sums used by the engine)."""
    mats = [Material("a", 150e9, 0.27, 2e-6), Material("b", 90e9, 0.36, 21e-6)]
    stack = bl.Stack.of(*zip(mats, (0.3e-3, 0.2e-3)))
    dT = 80.0
    r = bl.evaluate(stack, bl.Temperatures(300.0, 300.0 + dT), state)
    total = 0.0
    for i, m in enumerate(mats):
        z = np.linspace(r.layer_bottom[i], r.layer_top[i], 4001)
        sx = r.stress_at(z, side="above" if i else "below")
        E, nu, th = m.youngs_modulus, m.poisson_ratio, m.alpha * dT
        sy = {"narrow": 0 * sx, "plate": sx, "wide": nu * sx - E * th}[state]
        w = 0.5 * (sx * (sx - nu * sy) / E + sy * (sy - nu * sx) / E)
        total += np.trapezoid(w, z)
    assert r.strain_energy == pytest.approx(total, rel=1e-6)


def test_ten_layer_stack_balances_and_sublayers_change_nothing():
    """N = 10 layers: force and moment balance; splitting each layer in two identical halves gives the
    same curvature (layers.md invariant 5, sublayer split)."""
    rng = np.random.default_rng(10)
    mats = [Material(f"m{i}", 10 ** rng.uniform(9.5, 11.5), rng.uniform(0.1, 0.45), rng.uniform(0, 40e-6))
            for i in range(10)]
    t = 10 ** rng.uniform(-5, -3.5, 10)
    stack = bl.Stack.of(*zip(mats, t))
    temps = bl.Temperatures(450.0, 300.0)
    r = bl.evaluate(stack, temps, "wide", axial_force=12.0, bending_moment=-0.3)
    # resultants by 3-point Gauss-Legendre quadrature of stress_at in each layer (exact for the
    # linear stress times the lever arm), independent of the closed-form layer sums
    x, w = np.polynomial.legendre.leggauss(3)
    force = moment = 0.0
    for b, tp in zip(r.layer_bottom, r.layer_top):
        z = 0.5 * (b + tp) + 0.5 * (tp - b) * x
        s = r.stress_at(z)
        force += 0.5 * (tp - b) * np.sum(w * s)
        moment += 0.5 * (tp - b) * np.sum(w * s * (z - r.bending_axis))
    scale = np.sum(np.abs(r.stress_top) * t)
    assert abs(force - 12.0) < 1e-9 * scale
    assert abs(moment + 0.3) < 1e-9 * scale * r.total_thickness
    split = bl.Stack.of(*[(m, ti / 2) for m, ti in zip(mats, t) for _ in range(2)])
    rs = bl.evaluate(split, temps, "wide", axial_force=12.0, bending_moment=-0.3)
    assert rs.curvature == pytest.approx(r.curvature, rel=1e-10)
