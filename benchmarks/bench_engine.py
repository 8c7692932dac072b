"""Engine speed: designs per second of the closed forms, with baselines measured in the same run.

Targets (issue 2): two-layer curvature and all four extreme stresses >= 3e7 designs/s on one core;
five-layer stack >= 5e6 designs/s; `import bilayer` < 0.5 s on a warm machine.
Printed ratios: against a plain memory copy of the same input arrays (the floor any array code pays)
and against evaluating the sympy curvature expression by substitution, one design at a time.

Run: python benchmarks/bench_engine.py
"""
from __future__ import annotations

import os
import subprocess
import sys
import time

import numpy as np

os.environ.setdefault("OMP_NUM_THREADS", "1")

from timing import best_of  # noqa: E402  (benchmarks/timing.py)

from bilayer.core import laminate




def two_layer(n=2_000_000):
    rng = np.random.default_rng(0)
    E1, E2 = rng.uniform(5e10, 2e11, (2, n))
    t1, t2 = rng.uniform(1e-4, 1e-3, (2, n))
    f1, f2 = rng.uniform(0, 2e-3, (2, n))
    inputs = (E1, E2, t1, t2, f1, f2)
    t_kernel = best_of(lambda: laminate.bilayer_extremes(*inputs))
    t_copy = best_of(lambda: [a.copy() for a in inputs])
    rate = n / t_kernel
    print(f"two-layer closed form (curvature + 4 extreme stresses): {rate:.3g} designs/s "
          f"({t_kernel * 1e3:.1f} ms for {n:.0e}); target 3e7/s: {'met' if rate >= 3e7 else 'NOT met'}")
    print(f"  ratio to a plain copy of the 6 input arrays: {t_kernel / t_copy:.2f}x the copy time")

    from bilayer.core.symbolic import curvature_expression

    expr, symbols = curvature_expression(2)  # arguments (Y1, Y2, t1, t2, a1, a2, dT, N, M)
    sample = 200

    def by_substitution():
        for k in range(sample):  # free strain f = a * dT with dT = 1; no mechanical load
            values = (E1[k], E2[k], t1[k], t2[k], f1[k], f2[k], 1.0, 0.0, 0.0)
            expr.subs(dict(zip(symbols, map(float, values)))).evalf()

    t_sub = best_of(by_substitution, repeat=1) / sample
    print(f"  sympy substitution: {1 / t_sub:.3g} designs/s; the closed form is {t_sub * rate:.3g}x faster")


def five_layer(n=1_000_000):
    """Layer-major arrays (5, n): each layer's values are contiguous, the fastest layout."""
    rng = np.random.default_rng(1)
    Y = rng.uniform(1e9, 3e11, (5, n))
    t = rng.uniform(1e-5, 1e-3, (5, n))
    f = rng.uniform(0, 2e-3, (5, n))
    chunk = 8192

    def run():
        for s in range(0, n, chunk):
            laminate.solve(Y[:, s:s + chunk], t[:, s:s + chunk], f[:, s:s + chunk], layer_axis=0)

    t_kernel = best_of(run, repeat=3)
    t_copy = best_of(lambda: (Y.copy(), t.copy(), f.copy()))
    rate = n / t_kernel
    print(f"five-layer general closed form (all face stresses, rigidities): {rate:.3g} designs/s; "
          f"target 5e6/s: {'met' if rate >= 5e6 else 'NOT met'}; ratio to copying the inputs: "
          f"{t_kernel / t_copy:.1f}x")


def import_time(repeat=7):
    def run(code):
        samples = []
        for _ in range(repeat):
            start = time.perf_counter()
            subprocess.run([sys.executable, "-c", code], check=True)
            samples.append(time.perf_counter() - start)
        return min(samples)

    bare = run("pass")
    numpy_only = run("import numpy")
    full = run("import bilayer")
    print(f"import bilayer: {full - bare:.3f} s above a bare interpreter ({full:.3f} s total; "
          f"numpy alone {numpy_only - bare:.3f} s); target < 0.5 s: {'met' if full - bare < 0.5 else 'NOT met'}")


if __name__ == "__main__":
    two_layer()
    five_layer()
    import_time()
