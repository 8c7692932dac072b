"""Thermostat speed: travel-versus-temperature curve and set-point Monte Carlo, with same-run baselines.

Targets (issue 4): a full 500-point deflection-versus-temperature curve in under 5 ms; a 1e6-sample
set-point Monte Carlo in under 1 s. Printed ratios: the curve against 500 separate scalar engine calls
(bl.evaluate per temperature), the Monte Carlo against drawing the same random numbers alone (the floor
any sampler pays) and against solving the set point sample by sample (scalar root finding, extrapolated
from 200 samples).

Run: python benchmarks/bench_thermostat.py
"""
from __future__ import annotations

import os
import time

import numpy as np

os.environ.setdefault("OMP_NUM_THREADS", "1")

from timing import best_of  # noqa: E402  (benchmarks/timing.py)

import bilayer as bl  # noqa: E402
from bilayer.thermostat.element import ThermalElement, closing_temperature, gap_for_set_point, response
from bilayer.thermostat.forms import Cantilever
from bilayer.thermostat.strip import ThermostatStrip
from bilayer.thermostat.tolerances import Tolerance, first_order_set_point, monte_carlo_set_point

T0 = 293.15




def element():
    stack = bl.Stack.of(("fe36ni", 0.2e-3), ("nicrfe_22_3", 0.2e-3))
    return ThermalElement(ThermostatStrip(stack, 5e-3, T0), Cantilever(0.03))


def curve():
    e = element()
    temperatures = np.linspace(233.15, 473.15, 500)
    response(e, temperatures)  # warm caches
    t_core = best_of(lambda: e.form.travel(e.strip.curvature_change(temperatures)), repeat=20)
    t_full = best_of(lambda: response(e, temperatures), repeat=20)
    t_loop = best_of(lambda: [bl.evaluate(e.strip.stack, bl.Temperatures(T0, float(T))).curvature
                              for T in temperatures], repeat=2)
    print(f"travel curve, 500 temperatures, engine + exact arc: {t_core * 1e3:.3f} ms; "
          f"target 5 ms: {'met' if t_core < 5e-3 else 'NOT met'}")
    print(f"  full response() with small-deflection values, flexivity and data warnings: {t_full * 1e3:.3f} ms")
    print(f"  ratio: 500 scalar engine calls take {t_loop / t_core:.0f}x the vectorised curve "
          f"({t_loop * 1e3:.1f} ms)")


def monte_carlo(samples=1_000_000):
    e = element()
    gap = gap_for_set_point(e, T0 + 60).gap
    tol = {
        "thickness_1": Tolerance(0.03), "thickness_2": Tolerance(0.03), "modulus_1": Tolerance(0.05),
        "modulus_2": Tolerance(0.05), "cte_1": Tolerance(0.05), "cte_2": Tolerance(0.03),
        "length": Tolerance(0.01), "gap": Tolerance(0.02e-3, relative=False),
    }
    monte_carlo_set_point(e, gap, tol, samples=10_000)  # warm caches
    ticks = []
    t_mc = best_of(lambda: monte_carlo_set_point(e, gap, tol, samples=samples, progress=lambda d, n: ticks.append(d)),
                   repeat=3)
    rng = np.random.default_rng(0)
    t_draw = best_of(lambda: [t.sample(rng, samples) for t in tol.values()], repeat=3)
    few = 200
    start = time.perf_counter()
    strip = e.strip
    for j in range(few):
        scaled = strip.with_stack(strip.stack.with_thickness(0, strip.stack[0].thickness * (1 + 1e-3 * (j % 7))))
        closing_temperature(ThermalElement(scaled, e.form), gap)
    t_scalar = (time.perf_counter() - start) / few * samples
    result = monte_carlo_set_point(e, gap, tol, samples=samples)
    first_order_set_point(e, gap, tol)  # the symbolic sensitivities are derived once and cached
    first = first_order_set_point(e, gap, tol)
    print(f"set-point Monte Carlo, {samples:.0e} samples, 8 tolerances: {t_mc:.3f} s; "
          f"target 1 s: {'met' if t_mc < 1.0 else 'NOT met'}")
    print(f"  ratio to drawing the random numbers alone: {t_mc / t_draw:.1f}x ({t_draw * 1e3:.0f} ms)")
    print(f"  ratio: sample-by-sample scalar solving would take {t_scalar / t_mc:.0f}x "
          f"(~{t_scalar:.0f} s, extrapolated from {few})")
    print(f"  set point {result.nominal - 273.15:.3f} degC: MC mean {result.mean - 273.15:.3f}, std {result.std:.3f} K; "
          f"first order std {first.std:.3f} K ({first.seconds * 1e3:.1f} ms)")


if __name__ == "__main__":
    curve()
    monte_carlo()
