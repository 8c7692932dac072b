"""Symbolic derivation of the interface closed forms used by :mod:`bilayer.strip.interface`.

Everything is derived from the governing relations with sympy, once per process (functions are
cached), and never during a numeric evaluation. The numeric module evaluates hand-written,
overflow-free forms of the same results; tests compare the two.

Derivation outline (two composite parts 1 below and 2 above, optional bond of thickness h0):

1. Equilibrium of part 1: T' = -tau. Whole-section moment balance M1 + M2 = T e and a common
   curvature kappa = (M_i + M_Ti)/D_i give kappa = (T e + M_T1 + M_T2)/D.
2. Kinematics: u_i(x, z) = u_i(x) - (z - z_bi) w'; the surface of part 1 moves chi_1 tau further,
   that of part 2 chi_2 tau less (interfacial compliance); the bond shear strain is
   gamma = (u_2s - u_1s)/h0 + w' and tau = G0 gamma. Differentiating once and inserting the centroid
   strains (T + N_T1)/A1, (-T + N_T2)/A2 and w'' = -kappa gives chi T'' - lambda T = -Delta.
3. Peel: integrating the local equilibrium of each part through its thickness gives
   V_1' = -p_1, M_1' = V_1 - c_1 tau and V_2' = p_2, M_2' = V_2 - c_2 tau, with the bond faces
   p_1,2 = p -+ h0 tau'/2 (p on the bond mid-plane). With M_i = -D_i w_i'' - M_Ti and w2 - w1 = K p
   this gives K p'''' + (1/D1 + 1/D2) p = c_p tau'; K = 0 gives Suhir's p = mu tau'.
4. Layer compliance: the shear-strain energy of a shear flow phi(z) tau, phi linear in axial
   stiffness from the free face, is chi_i tau^2/2 with chi_i = int phi^2/G dz (t/(3G) for one layer).
"""
from __future__ import annotations

from functools import lru_cache
from typing import NamedTuple

__all__ = [
    "ShearLagDerivation",
    "PeelDerivation",
    "shear_lag_derivation",
    "peel_derivation",
    "layer_compliance_derivation",
    "numeric_shear_lag",
    "numeric_peel",
]


class ShearLagDerivation(NamedTuple):
    """sympy results of the shear-lag derivation."""

    symbols: dict  # name -> sympy Symbol
    curvature: object  # kappa(T) from moment balance and common curvature
    axial_compliance: object  # lambda
    mismatch: object  # Delta
    shear_compliance: object  # chi (with the bond term)
    ode: object  # chi T'' - lambda T + Delta (== 0), in the symbols lam, chi, Delta
    force: object  # T(x) solving the ODE with T(+-l) = 0
    shear: object  # tau(x) = -T'(x)


class PeelDerivation(NamedTuple):
    """sympy results of the peel derivation."""

    symbols: dict
    stiffness_sum: object  # s = 1/D1 + 1/D2 (coefficient of p)
    forcing: object  # c_p (coefficient of tau')
    lever: object  # mu = c_p / s, common-deflection peel p = mu tau'
    end_second: object  # K p''(l) with M_i(l) = 0
    end_third: object  # K p'''(l) with V_i(l) = -tau h0/2
    particular: object  # C, coefficient of cosh(k x)/cosh(k l)
    solution: object  # p(x) = A cosh bx cos bx + B sinh bx sin bx + C cosh kx/cosh kl, A, B solved
    residual: object  # ODE residual of `solution` after simplification (0)


@lru_cache(maxsize=None)
def shear_lag_derivation() -> ShearLagDerivation:
    """Derive lambda, Delta, chi and the closed-form T(x), tau(x) from the governing relations."""
    import sympy as sp

    x = sp.Symbol("x", real=True)
    l = sp.Symbol("l", positive=True)
    A1, A2, D1, D2, G0, h0, chi1, chi2 = sp.symbols("A1 A2 D1 D2 G0 h0 chi1 chi2", positive=True)
    e, zb1, zb2, ha, NT1, NT2, MT1, MT2 = sp.symbols("e z_b1 z_b2 h_a N_T1 N_T2 M_T1 M_T2", real=True)
    T, u1, u2, w = (sp.Function(name)(x) for name in ("T", "u1", "u2", "w"))
    M1, M2, kappa = sp.symbols("M1 M2 kappa")

    # 1. moment balance of the whole section and common curvature
    sol = sp.solve([M1 + M2 - T * e, M1 - (D1 * kappa - MT1), M2 - (D2 * kappa - MT2)], [M1, M2, kappa], dict=True)[0]
    curvature = sp.simplify(sol[kappa])  # (T e + M_T1 + M_T2)/(D1 + D2)

    # 2. kinematics of the bond line: tau h0/G0 = u2s - u1s + h0 w'
    tau = -sp.diff(T, x)
    u1s = u1 - (ha - zb1) * sp.diff(w, x) + chi1 * tau
    u2s = u2 - (ha + h0 - zb2) * sp.diff(w, x) - chi2 * tau
    bond_law = tau * h0 / G0 - (u2s - u1s + h0 * sp.diff(w, x))
    compat = sp.diff(bond_law, x)  # insert u_i' = centroid strains and w'' = -kappa
    compat = compat.subs(sp.Derivative(w, (x, 2)), -curvature.subs(e, zb2 - zb1))
    compat = compat.subs({sp.Derivative(u1, x): (T + NT1) / A1, sp.Derivative(u2, x): (-T + NT2) / A2})
    compat = sp.expand(compat.subs(zb2, zb1 + e))
    T2 = sp.Derivative(T, (x, 2))
    chi_total = -compat.coeff(T2)  # compat = -chi T'' + lambda T - Delta
    lam = compat.subs(T2, 0).coeff(T)
    delta = -compat.subs(T2, 0).subs(T, 0)
    D = D1 + D2

    lam_s, chi_s, delta_s = sp.symbols("lam chi Delta", positive=True)
    ode = chi_s * sp.diff(T, x, 2) - lam_s * T + delta_s
    force = sp.dsolve(ode, T, ics={T.subs(x, -l): 0, T.subs(x, l): 0}).rhs
    force = sp.simplify(force)
    shear = sp.simplify(-sp.diff(force, x))
    symbols = dict(
        x=x, l=l, A1=A1, A2=A2, D1=D1, D2=D2, G0=G0, h0=h0, chi1=chi1, chi2=chi2, e=e, N_T1=NT1, N_T2=NT2,
        M_T1=MT1, M_T2=MT2, lam=lam_s, chi=chi_s, Delta=delta_s,
    )
    if sp.simplify(lam - (1 / A1 + 1 / A2 + e**2 / D)) != 0:
        _fail("the axial compliance")
    if sp.simplify(delta - (NT2 / A2 - NT1 / A1 - e * (MT1 + MT2) / D)) != 0:
        _fail("the mismatch strain")
    if sp.simplify(chi_total - (chi1 + chi2 + h0 / G0)) != 0:
        _fail("the shear compliance")
    return ShearLagDerivation(
        symbols=symbols,
        curvature=curvature,
        axial_compliance=sp.simplify(lam),
        mismatch=sp.simplify(delta),
        shear_compliance=sp.simplify(chi_total),
        ode=ode,
        force=force,
        shear=shear,
    )


def _fail(what: str):
    raise ArithmeticError(f"symbolic derivation of {what} did not reduce to the documented form")


@lru_cache(maxsize=None)
def peel_derivation() -> PeelDerivation:
    """Derive the peel equation, its end conditions and the even closed-form solution."""
    import sympy as sp

    x = sp.Symbol("x", real=True)
    l, k, K, D1, D2, chi, beta = sp.symbols("l k K D1 D2 chi beta", positive=True)
    c1, c2, h0, Delta, MT1, MT2, A, B = sp.symbols("c1 c2 h0 Delta M_T1 M_T2 A B", real=True)
    p, w1, w2, tau = (sp.Function(name)(x) for name in ("p", "w1", "w2", "tau"))
    dtau = sp.diff(tau, x)

    # beam equations: V1' = -p1, M1' = V1 - c1 tau; V2' = p2, M2' = V2 - c2 tau; p1,2 = p -+ h0 tau'/2
    M1 = -D1 * sp.diff(w1, x, 2) - MT1
    M2 = -D2 * sp.diff(w2, x, 2) - MT2
    w1_4 = sp.solve(sp.Eq(sp.diff(M1, x, 2), -(p + h0 * dtau / 2) - c1 * dtau), sp.diff(w1, x, 4))[0]
    w2_4 = sp.solve(sp.Eq(sp.diff(M2, x, 2), (p - h0 * dtau / 2) - c2 * dtau), sp.diff(w2, x, 4))[0]
    # transverse compliance K p = w2 - w1, differentiated four times
    lhs = sp.expand(K * sp.diff(p, x, 4) - (w2_4 - w1_4))  # = K p'''' + s p - c_p tau'
    s = sp.simplify(lhs.coeff(p))
    c_p = sp.simplify(-lhs.coeff(dtau))
    mu = sp.simplify(c_p / s)

    # free ends: K p'' = w2'' - w1'' = (M1 + M_T1)/D1 - (M2 + M_T2)/D2 with M_i = 0, and
    # K p''' = M1'/D1 - M2'/D2 with M_i' = V_i - c_i tau and V_i = -tau h0/2 (bond shear force split)
    tau_l = sp.Symbol("tau_l", real=True)
    end_second = MT1 / D1 - MT2 / D2
    end_third = sp.simplify((-h0 / 2 - c1) * tau_l / D1 - (-h0 / 2 - c2) * tau_l / D2)

    # forcing from the shear-lag solution: tau' = (Delta/chi) cosh(kx)/cosh(kl)
    shape = sp.cosh(k * x) / sp.cosh(k * l)
    C = sp.Symbol("C")
    C_value = sp.solve(K * C * k**4 + s * C - c_p * Delta / chi, C)[0]
    homogeneous = A * sp.cosh(beta * x) * sp.cos(beta * x) + B * sp.sinh(beta * x) * sp.sin(beta * x)
    residual = sp.simplify(K * sp.diff(homogeneous, x, 4) + 4 * K * beta**4 * homogeneous)  # s = 4 K beta^4
    trial = C_value * shape + homogeneous
    conditions = [
        K * sp.diff(trial, x, 2).subs(x, l) - end_second,
        K * sp.diff(trial, x, 3).subs(x, l) - end_third.subs(tau_l, Delta * sp.tanh(k * l) / (chi * k)),
    ]
    matrix, rhs = sp.linear_eq_to_matrix(conditions, [A, B])
    AB = matrix.LUsolve(rhs)
    solution = trial.subs({A: AB[0], B: AB[1]}).subs(beta, (s / (4 * K)) ** sp.Rational(1, 4))
    symbols = dict(x=x, l=l, k=k, K=K, D1=D1, D2=D2, chi=chi, c1=c1, c2=c2, h0=h0, Delta=Delta, M_T1=MT1, M_T2=MT2)
    if sp.simplify(c_p - ((c2 + h0 / 2) / D2 - (c1 + h0 / 2) / D1)) != 0:
        _fail("the peel forcing coefficient")
    if sp.simplify(mu - ((c2 + h0 / 2) * D1 - (c1 + h0 / 2) * D2) / (D1 + D2)) != 0:
        _fail("the common-deflection peel lever")
    if sp.simplify(end_third - c_p * tau_l) != 0:
        _fail("the peel end condition")
    return PeelDerivation(
        symbols=symbols, stiffness_sum=s, forcing=c_p, lever=mu, end_second=end_second, end_third=end_third,
        particular=C_value, solution=solution, residual=residual,
    )


@lru_cache(maxsize=None)
def layer_compliance_derivation():
    """(single-layer chi, per-layer piece of int phi^2/G dz) as sympy expressions.

    phi rises linearly from phi_a to phi_b across a layer of thickness t: the piece is
    t (phi_a^2 + phi_a phi_b + phi_b^2)/(3 G); with phi 0 -> 1 it is t/(3 G) (Suhir's term).
    """
    import sympy as sp

    z, t, G = sp.symbols("z t G", positive=True)
    fa, fb = sp.symbols("phi_a phi_b", real=True)
    piece = sp.factor(sp.integrate((fa + (fb - fa) * z / t) ** 2 / G, (z, 0, t)))
    single = sp.simplify(piece.subs({fa: 0, fb: 1}))
    if sp.simplify(piece - t * (fa**2 + fa * fb + fb**2) / (3 * G)) != 0:
        _fail("the layer compliance")
    return single, piece


@lru_cache(maxsize=None)
def numeric_shear_lag():
    """f(x, l, lam, chi, Delta) -> (T, tau) lambdified from the symbolic solution (moderate k l only)."""
    import sympy as sp

    d = shear_lag_derivation()
    s = d.symbols
    args = (s["x"], s["l"], s["lam"], s["chi"], s["Delta"])
    return sp.lambdify(args, (d.force, d.shear), "numpy")


@lru_cache(maxsize=None)
def numeric_peel():
    """f(x, l, k, K, D1, D2, chi, c1, c2, h0, Delta, M_T1, M_T2) -> p lambdified (moderate beta l only)."""
    import sympy as sp

    d = peel_derivation()
    s = d.symbols
    args = tuple(s[name] for name in ("x", "l", "k", "K", "D1", "D2", "chi", "c1", "c2", "h0", "Delta", "M_T1", "M_T2"))
    return sp.lambdify(args, d.solution, "numpy")
