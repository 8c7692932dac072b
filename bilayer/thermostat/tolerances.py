"""Set-point scatter of a thermostat element from tolerances: Monte Carlo and first-order propagation.

Inputs that scatter (keys of the ``tolerances`` mapping):

    thickness           all layer thicknesses together (relative)        engine stack or data sheet
    thickness_i         layer i (1 = bottom) thickness (relative)        engine stack
    modulus_i           layer i Young's modulus (relative)               engine stack
    cte_i               layer i alpha(T), scaled as a whole (relative)   engine stack
    flexivity           the data-sheet flexivity (relative)              data sheet
    length              every length of the element form (relative or absolute on the form's size)
    gap                 the contact gap (absolute [m or rad], or relative)

Tolerances, sampling, first-order propagation and the ranking of contributors are the generic ones of
:mod:`bilayer.core.scatter` (a :class:`Tolerance` is a half-width, read as 3 sigma for "normal"); this
module adds what is particular to a set point.

Set point of one sample: the temperature T where the curvature change of the strip equals the one the
form needs to close the gap, dkappa(T) = dkappa_req. A form scaled in length by lambda needs
dkappa_req = inv(g / lambda) / lambda (inv: exact inverse of the form's travel). The strip curvature is
linear in the layers' free strains, kappa = sum_i g_i(Y, t) f_i, with g_i from the engine's fast two-layer
kernel (n = 2) or the laminate kernel (n > 2); T follows from Newton's method on the CTE models'
integrated strains.

First order: dT/dp = -(d dkappa/dp - d dkappa_req/dp) / (d dkappa/dT), with d kappa/d(Y_i, t_i, a_i) the
exact sensitivities of the symbolic core (:func:`bilayer.core.symbolic.evaluate_sensitivities`) and
sigma_T^2 = sum_p (dT/dp sigma_p)^2. Contributors are ranked by their share of that variance (and, in the
Monte Carlo, by the squared correlation of each input with the set point).
"""
from __future__ import annotations

import time
from dataclasses import dataclass
from typing import Mapping

import numpy as np

from ..core import laminate
from ..core.progress import Progress
from ..core.errors import InputError
from ..core.scatter import ScatterSummary, Tolerance, first_order, monte_carlo, normal_percentiles, summary
from .element import THERMOSTAT_CAUTIONS, ThermalElement, closing_temperature
from .strip import DatasheetStrip, ThermostatStrip

__all__ = ["Tolerance", "SetPointScatter", "monte_carlo_set_point", "first_order_set_point", "tolerance_keys"]

_NEWTON_STEPS = 30


def tolerance_keys(element: ThermalElement) -> tuple[str, ...]:
    """The input names that can scatter for this element."""
    if isinstance(element.strip, DatasheetStrip):
        return ("flexivity", "thickness", "length", "gap")
    n = element.strip.n_layers
    per_layer = tuple(f"{kind}_{i}" for kind in ("thickness", "modulus", "cte") for i in range(1, n + 1))
    return ("thickness",) + per_layer + ("length", "gap")


@dataclass(frozen=True, eq=False)
class SetPointScatter(ScatterSummary):
    """Statistics of the set point [K] under tolerances (the fields of :class:`ScatterSummary`, then these).

    ``method`` "monte carlo" or "first order"; ``contributors`` lists (input, share of variance) from the
    largest down (MC: squared correlation of each input with the set point); ``sensitivities`` dT/dp per
    unit of each input (relative inputs: per unit fraction) for first order; ``values`` the sampled set
    points when asked for (``keep_values=True``), else None.
    """

    method: str
    samples: int
    failed: int
    seconds: float
    tolerances: Mapping[str, Tolerance]
    curvature_source: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS
    values: np.ndarray | None = None

    def to_dict(self) -> dict:
        return {
            "method": self.method,
            **self.summary_dict(),
            "samples": self.samples,
            "failed": self.failed,
            "seconds": self.seconds,
            "tolerances": {k: t.to_dict() for k, t in self.tolerances.items()},
            "curvature_source": self.curvature_source,
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "cautions": list(self.cautions),
        }


_ASSUMPTIONS = (
    "inputs scatter independently",
    "set point: first temperature at which the free element closes the gap (exact kinematics)",
    "a CTE tolerance scales a layer's alpha(T) over the whole range",
)


def _check_tolerances(element: ThermalElement, tolerances: Mapping[str, Tolerance]) -> dict[str, Tolerance]:
    allowed = tolerance_keys(element)
    checked = {}
    for key, value in dict(tolerances).items():
        if key not in allowed:
            raise InputError(f"tolerances.{key}", value, "one of " + ", ".join(allowed))
        if not isinstance(value, Tolerance):
            raise InputError(f"tolerances.{key}", value, "a Tolerance")
        if value.relative is False and key not in ("length", "gap"):
            raise InputError(f"tolerances.{key}.relative", False, "a relative tolerance for this input")
        checked[key] = value
    if not checked:
        raise InputError("tolerances", {}, "at least one tolerance")
    return checked


class _Problem:
    """Nominal set-point problem with vectorised pieces shared by both methods."""

    def __init__(self, element: ThermalElement, gap: float, side: str, search):
        self.element = element
        self.set_point = closing_temperature(element, gap, side, search)
        self.gap = self.set_point.gap
        self.sign = self.set_point.side
        self.form = element.form
        self.size = element.form.size
        self.strip = element.strip
        self.t_ref = element.reference_temperature

    # required curvature change for relative length scales and gaps (arrays)
    def required_curvature(self, length_scale: np.ndarray, gap: np.ndarray) -> np.ndarray:
        target = self.sign * gap / length_scale  # travel of the nominal-size form
        low, high = float(np.min(target)), float(np.max(target))
        ends = self.form.inverse_travel(np.array([low, high]))
        if high - low <= 1e-15 * max(abs(high), 1e-30):
            return np.full_like(target, ends[0]) / length_scale
        pad = 1e-6 * (ends[1] - ends[0])
        grid = np.linspace(ends[0] - pad, ends[1] + pad, 4097)
        travel = self.form.travel(grid)
        order = np.argsort(travel)
        return np.interp(target, travel[order], grid[order]) / length_scale


def _strain_weights(strip: ThermostatStrip, thickness_scale: np.ndarray, modulus_scale: np.ndarray) -> np.ndarray:
    """Curvature per unit free strain of each layer, g_i [1/m], shape (n, samples), from the engine kernels."""
    Y0, _, _, _ = strip.elastic_constants
    n = strip.n_layers
    Y = Y0[:, None] * modulus_scale
    t = strip.stack.thicknesses[:, None] * thickness_scale
    if n == 2:
        unit = laminate.bilayer_extremes(Y[0], Y[1], t[0], t[1], 0.0, 1.0)[0]  # kappa for f2 - f1 = 1
        return np.stack([-unit, unit])
    weights = np.empty((n,) + Y.shape[1:])
    for i in range(n):
        f = np.zeros((n, 1))
        f[i] = 1.0
        weights[i] = laminate.solve(Y, t, f, layer_axis=0).curvature
    return weights


def _solve_temperature(strip: ThermostatStrip, weights: np.ndarray, cte_scale: np.ndarray,
                       target: np.ndarray, start: np.ndarray) -> np.ndarray:
    """Newton on T: sum_i w_i s_i c_i (eps_i(T_ref -> T)) = target, per sample (eps from the CTE models)."""
    _, factor, _, _ = strip.elastic_constants
    w = weights * cte_scale * factor[:, None]
    models = [layer.material.cte for layer in strip.stack.layers]
    t_ref = strip.reference_temperature
    T = start.copy()
    for _ in range(_NEWTON_STEPS):
        T = np.clip(T, 1.0, 5000.0)
        value = sum(w[i] * np.asarray(m.thermal_strain(t_ref, T)) for i, m in enumerate(models)) - target
        slope = sum(w[i] * np.asarray(m.instantaneous(T)) for i, m in enumerate(models))
        step = value / slope
        T = T - step
        if float(np.max(np.abs(step))) < 1e-9:
            break
    return T


def _scales(draws: dict, key: str, size: int) -> np.ndarray:
    return 1.0 + draws[key] if key in draws else np.ones(size)


def _chunk_set_points(problem: _Problem, tolerances: dict, draws: dict, size: int) -> np.ndarray:
    strip = problem.strip
    length = tolerances.get("length")
    if length is None:
        length_scale = np.ones(size)
    else:
        length_scale = 1.0 + (draws["length"] if length.relative else draws["length"] / problem.size)
    gap_tol = tolerances.get("gap")
    if gap_tol is None:
        gap = np.full(size, problem.gap)
    else:
        gap = problem.gap * (1.0 + draws["gap"]) if gap_tol.relative else problem.gap + draws["gap"]
    required = problem.required_curvature(length_scale, gap)
    common = _scales(draws, "thickness", size)
    if isinstance(strip, DatasheetStrip):
        flex = strip.flexivity.per_kelvin * _scales(draws, "flexivity", size)
        return problem.t_ref + required * strip.thickness * common / flex
    n = strip.n_layers
    thickness = np.stack([common * _scales(draws, f"thickness_{i}", size) for i in range(1, n + 1)])
    modulus = np.stack([_scales(draws, f"modulus_{i}", size) for i in range(1, n + 1)])
    cte = np.stack([_scales(draws, f"cte_{i}", size) for i in range(1, n + 1)])
    weights = _strain_weights(strip, thickness, modulus)
    rate = float(strip.curvature_rate(problem.set_point.temperature))
    nominal_required = float(strip.curvature_change(problem.set_point.temperature))
    start = problem.set_point.temperature + (required - nominal_required) / rate
    return _solve_temperature(strip, weights, cte, required, start)


def monte_carlo_set_point(
    element: ThermalElement, gap: float, tolerances: Mapping[str, Tolerance], samples: int = 1_000_000,
    side: str = "auto", seed: int | None = 0, chunk: int = 250_000,
    progress: Progress | None = None, search=None, keep_values: bool = False,
) -> SetPointScatter:
    """Monte Carlo set-point scatter with ``samples`` draws, evaluated in chunks of ``chunk`` samples
    (memory stays bounded); ``progress(fraction, message)`` is called after every chunk. Draws are made per
    chunk, input by input in the order of ``tolerances``."""
    start_time = time.perf_counter()
    tolerances = _check_tolerances(element, tolerances)
    problem = _Problem(element, gap, side, search)
    nominal = problem.set_point.temperature
    run = monte_carlo(lambda draws, size: {"set point": _chunk_set_points(problem, tolerances, draws, size)},
                      tolerances, {"set point": nominal}, samples, seed, chunk, progress)
    out = run.values["set point"]
    good = np.isfinite(out)
    failed = int(run.samples - good.sum())
    mean, std, pct = summary(out[good])
    shares = run.shares["set point"]
    warnings = problem.set_point.warnings
    if failed:
        warnings += (f"{failed} samples gave no finite set point and were left out",)
    return SetPointScatter(
        nominal, mean, std, pct, shares, {}, method="monte carlo", samples=run.samples, failed=failed,
        seconds=time.perf_counter() - start_time, tolerances=tolerances, curvature_source=element.strip.source,
        warnings=warnings, assumptions=_ASSUMPTIONS, values=out if keep_values else None,
    )


def _required_derivatives(problem: _Problem) -> tuple[float, float]:
    """d dkappa_req / d(length scale) and d dkappa_req / d gap at the nominal (exact form inverse)."""
    h = 1e-6
    scale = problem.required_curvature(np.array([1 - h, 1 + h]), np.full(2, problem.gap))
    step = h * problem.gap
    by_gap = problem.required_curvature(np.ones(2), np.array([problem.gap - step, problem.gap + step]))
    return float(np.diff(scale)[0] / (2 * h)), float(np.diff(by_gap)[0] / (2 * step))


def _curvature_gradient(strip: ThermostatStrip, temperature: float) -> tuple[np.ndarray, np.ndarray]:
    """Curvature change dkappa between T_ref and T and its exact gradient with respect to relative
    changes of every layer's thickness, modulus and CTE scale: (thickness_i, modulus_i, cte_i) each (n,)."""
    from ..core.symbolic import evaluate_sensitivities

    n = strip.n_layers
    Y, factor, _, _ = strip.elastic_constants
    t = strip.stack.thicknesses
    gradient = np.zeros(3 * n)
    for T, weight in ((temperature, 1.0), (strip.reference_temperature, -1.0)):
        f = strip.free_strains(np.array([T]))[0]
        dT = T - strip.stress_free_temperature
        if dT == 0.0:
            continue
        values = evaluate_sensitivities(Y, t, f / dT, dT)
        g = dict(zip(values.parameters, np.asarray(values.curvature_gradient).reshape(-1)))
        gradient += weight * np.concatenate([
            [g[f"t{i}"] * t[i - 1] for i in range(1, n + 1)],
            [g[f"Y{i}"] * Y[i - 1] for i in range(1, n + 1)],
            [g[f"a{i}"] * f[i - 1] / dT for i in range(1, n + 1)],
        ])
    return gradient


def first_order_set_point(
    element: ThermalElement, gap: float, tolerances: Mapping[str, Tolerance], side: str = "auto", search=None,
) -> SetPointScatter:
    """First-order (linearised) set-point scatter with exact curvature sensitivities from the symbolic core."""
    start_time = time.perf_counter()
    tolerances = _check_tolerances(element, tolerances)
    problem = _Problem(element, gap, side, search)
    strip = element.strip
    T_set = problem.set_point.temperature
    rate = float(strip.curvature_rate(T_set))  # d dkappa / dT
    by_length, by_gap = _required_derivatives(problem)
    required = float(strip.curvature_change(T_set))
    derivative = {"length": -by_length, "gap": -by_gap}  # d(dkappa - dkappa_req)/dp
    if isinstance(strip, DatasheetStrip):
        derivative["flexivity"] = required
        derivative["thickness"] = -required
    else:
        n = strip.n_layers
        g = _curvature_gradient(strip, T_set)
        for i in range(n):
            derivative[f"thickness_{i + 1}"] = g[i]
            derivative[f"modulus_{i + 1}"] = g[n + i]
            derivative[f"cte_{i + 1}"] = g[2 * n + i]
        derivative["thickness"] = float(sum(g[:n]))
    sens = {}
    for key, tol in tolerances.items():
        dT_dp = -derivative[key] / rate
        if key == "length" and not tol.relative:
            dT_dp /= problem.size
        if key == "gap" and tol.relative:
            dT_dp *= problem.gap
        sens[key] = dT_dp
    std, ranked = first_order(sens, tolerances)
    pct = normal_percentiles(T_set, std)
    return SetPointScatter(
        T_set, T_set, std, pct, ranked, sens, method="first order", samples=0, failed=0,
        seconds=time.perf_counter() - start_time, tolerances=tolerances, curvature_source=strip.source,
        warnings=problem.set_point.warnings,
        assumptions=_ASSUMPTIONS + ("linearised about the nominal set point; percentiles from a normal distribution",),
    )
