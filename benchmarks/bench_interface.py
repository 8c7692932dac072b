"""Closed-form interface profiles: time for 1000 points along the strip, with baselines of the same run.

Target (issue 3): force, shear and peel profiles at 1000 points in under 1 ms.
Printed ratios: against a numpy memory copy of an array of the same size (the floor any array code
pays) and against one numpy exp of 1000 points (the kind of work a profile is made of); also the
full call (model constants from the stack, profiles, peel extremes) and the sympy-lambdified
solution for comparison.

Run: python benchmarks/bench_interface.py
"""
from __future__ import annotations

import os

import numpy as np

os.environ.setdefault("OMP_NUM_THREADS", "1")

from timing import best_of  # noqa: E402  (benchmarks/timing.py)

import bilayer as bl  # noqa: E402
from bilayer.strip.interface import interface_parameters, interface_stresses
from bilayer.core.materials import Material




def main(points=1000):
    # invented demo stack: copper / solder / silicon, cooled 200 K
    stack = bl.Stack.of(
        (Material("copper demo", 115e9, 0.34, 16.8e-6), 1.0e-3),
        (Material("solder demo", 45e9, 0.36, 22e-6), 0.08e-3),
        (Material("silicon demo", 130e9, 0.28, 2.8e-6), 0.5e-3),
    )
    temps = bl.Temperatures(493.15, 293.15)
    length = 12e-3
    half = 0.5 * length
    (params,) = interface_parameters(stack, temps, "narrow", bonds=[1])
    xi = np.linspace(-half, half, points)

    def profiles():
        params.force_and_shear(xi, half)
        params.peel(xi, half)
        params.peel_common_deflection(xi, half)

    t_profiles = best_of(profiles, repeat=200)
    t_copy = best_of(lambda: xi.copy(), repeat=200)
    t_exp = best_of(lambda: np.exp(xi), repeat=200)
    print(f"closed-form profiles (force, shear, peel with and without through-thickness compliance), "
          f"{points} points: {t_profiles * 1e3:.3f} ms; target < 1 ms: {'met' if t_profiles < 1e-3 else 'NOT met'}")
    print(f"  ratio to a memory copy of the {points}-point array: {t_profiles / t_copy:.0f}x; "
          f"to one numpy exp of it: {t_profiles / t_exp:.1f}x")
    t_full = best_of(lambda: interface_stresses(stack, temps, length, "narrow", bonds=[1], points=points), repeat=50)
    print(f"  full call (constants from the stack, profiles, layer forces, peel extremes): {t_full * 1e3:.3f} ms")

    from bilayer.strip.derivation import numeric_peel, numeric_shear_lag

    shear_sym, peel_sym = numeric_shear_lag(), numeric_peel()
    k, K = params.decay_rate, params.peel_compliance
    D1, D2 = params.flexural_rigidity_below, params.flexural_rigidity_above
    c1 = params.arm_below - 0.5 * params.bond_thickness
    c2 = params.arm_above - 0.5 * params.bond_thickness

    def lambdified():
        shear_sym(xi, half, params.axial_compliance, params.shear_compliance, params.mismatch_strain)
        peel_sym(xi, half, k, K, D1, D2, params.shear_compliance, c1, c2, params.bond_thickness,
                 params.mismatch_strain, params.thermal_moment_below, params.thermal_moment_above)

    with np.errstate(all="ignore"):  # cosh*cos of the symbolic form overflows for long strips
        t_sym = best_of(lambdified, repeat=50)
    print(f"  sympy-lambdified solution for comparison: {t_sym * 1e3:.3f} ms "
          f"({t_sym / t_profiles:.1f}x the hand-written overflow-free form)")


if __name__ == "__main__":
    main()
