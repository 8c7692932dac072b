"""Finite-element check: unknowns and time of the default run, with a baseline of the same run.

Target (issue 3): the default FE check of a three-layer strip in under 10 s on one core.
Printed: unknowns (dofs), elements, seconds for the default mesh and for the refinement study,
and the ratio to a single-layer strip of the same size and mesh (a run whose answer is known: no
stress) and to one sparse solve of the same size alone.

Run: python benchmarks/bench_fe.py
"""
from __future__ import annotations

import os
import time

os.environ.setdefault("OMP_NUM_THREADS", "1")
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

import bilayer as bl  # noqa: E402
from bilayer.strip.fe import MeshOptions, fe_check, refinement_study
from bilayer.core.materials import Material


def best_of(fn, repeat=3):
    times, result = [], None
    for _ in range(repeat):
        start = time.perf_counter()
        result = fn()
        times.append(time.perf_counter() - start)
    return min(times), result


def main():
    # invented demo stack: alumina carrier / epoxy bond line / silicon die, cooled 190 K, L/H = 10
    stack = bl.Stack.of(
        (Material("carrier demo", 303e9, 0.21, 7.4e-6), 0.6e-3),
        (Material("bond demo", 3e9, 0.35, 60e-6), 0.025e-3),
        (Material("die demo", 130e9, 0.28, 2.8e-6), 0.4e-3),
    )
    temps = bl.Temperatures(423.15, 233.15)
    length = 10 * stack.total_thickness
    single = bl.Stack.of((Material("homogeneous demo", 303e9, 0.21, 7.4e-6), stack.total_thickness))

    fe_check(stack, temps, length)  # warm up imports and caches
    for state in ("narrow", "wide"):
        seconds, run = best_of(lambda: fe_check(stack, temps, length, state))
        print(f"default FE check, three layers, {run.plane}: {run.dofs} unknowns, {run.elements} elements, "
              f"{seconds:.3f} s; target < 10 s: {'met' if seconds < 10 else 'NOT met'}")

    # baseline 1: a one-layer strip of the same size with as many elements through the thickness (24)
    seconds, run = best_of(lambda: fe_check(stack, temps, length))
    base_seconds, base = best_of(lambda: fe_check(single, temps, length, mesh=MeshOptions(layer_elements=24)))
    print(f"  baseline one-layer strip ({base.dofs} unknowns): {base_seconds:.3f} s; ratio {seconds / base_seconds:.2f}x")

    # baseline 2: one sparse direct solve of the same size (assembly and evaluation excluded)
    import numpy as np
    import scipy.sparse as sp
    import scipy.sparse.linalg as sla

    n = int(np.sqrt(run.dofs / 2))
    grid = sp.kron(sp.eye(n), sp.diags([-1.0, 4.0, -1.0], [-1, 0, 1], (n, n))) + sp.diags([-1.0, -1.0], [-n, n], (n * n, n * n))
    matrix = sp.kron(sp.eye(2), grid).tocsc()
    rhs = np.ones(matrix.shape[0])
    solve_seconds, _ = best_of(lambda: sla.spsolve(matrix, rhs))
    print(f"  baseline sparse solve of a {matrix.shape[0]}-unknown 5-point Laplacian pair: {solve_seconds:.3f} s; "
          f"ratio {seconds / solve_seconds:.1f}x")

    start = time.perf_counter()
    study = refinement_study(stack, temps, length)
    total = time.perf_counter() - start
    print(f"refinement study (default + every element halved): {[r.dofs for r in study.runs]} unknowns, {total:.2f} s; "
          f"curvature change {study.curvature_changes[0]:.1e}")


if __name__ == "__main__":
    main()
