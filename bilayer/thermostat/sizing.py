"""Design helpers for thermostat elements: optimum thickness ratio, sizing, ranking of material pairs.

* Optimum ratio (Timoshenko 1925): at fixed total thickness the curvature of a two-layer strip is
  largest when m^2 n = 1, i.e. t_bottom / t_top = sqrt(Y_top / Y_bottom); the flexivity there is exactly
  1.5 times the CTE difference for any modulus ratio. The ratio is taken from the symbolic core's
  derivation (:func:`bilayer.core.symbolic.optimum_thickness_ratio`), the flexivity from the engine.
* Sizing: total thickness t (at a fixed layer ratio) and element size L such that the element travels a
  target distance at a target temperature and then pushes with a target force after a stated overtravel
  (scipy.optimize.root on log t, log L); the peak layer stress there is checked against the allowable.
* Ranking: library pairs (low-expansion bottom, high-expansion top) at their optimum ratio, by secant
  flexivity F and by work per unit volume E_f F^2 (E_f = 12 E I / t^3), keeping pairs whose peak layer
  stress with the tip of a cantilever fully blocked over the span stays within strength / factor.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import Sequence

import numpy as np

from ..core.errors import InputError, check_range
from ..core.stack import BendingState, Layer, Stack
from .element import THERMOSTAT_CAUTIONS, ThermalElement, _loads, _result_dict, closing_temperature
from .forms import ElementForm
from .strip import ThermostatStrip

__all__ = [
    "OptimumRatio",
    "optimum_thickness_ratio",
    "SizedElement",
    "size_element",
    "PairRating",
    "rank_pairs",
]


@dataclass(frozen=True, eq=False)
class OptimumRatio:
    """t_bottom / t_top that maximises the flexivity, and the flexivity there (engine, secant)."""

    ratio: float
    bottom: str
    top: str
    state: str
    flexivity: float
    cte_difference: float
    flexivity_over_cte_difference: float
    temperature_low: float
    temperature_high: float
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        return _result_dict(self)


def _ratio_function():
    """t1/t2 as a numeric function of n = Y1/Y2 from the symbolic core (derived once, cached there)."""
    import sympy as sp

    from ..core.symbolic import optimum_thickness_ratio as derived

    result = derived()
    n = result.symbols[1]
    return sp.lambdify(n, result.ratio, "math")


def optimum_thickness_ratio(
    bottom, top, state: str = "narrow", total_thickness: float = 1e-3,
    temperature_low: float = 293.15, temperature_high: float = 373.15,
) -> OptimumRatio:
    """Optimum t_bottom/t_top for two materials (Material or library name) in a bending state."""
    state = BendingState.parse(state)
    probe = Stack.of((bottom, 0.5 * total_thickness), (top, 0.5 * total_thickness))
    strip = ThermostatStrip(probe, 1e-3, temperature_low, state=state)
    Y = strip.elastic_constants[0]
    ratio = float(_ratio_function()(Y[0] / Y[1]))
    t_top = total_thickness / (1.0 + ratio)
    best = strip.with_stack(Stack.of((probe[0].material, ratio * t_top), (probe[1].material, t_top)))
    flex = best.flexivity(temperature_low, temperature_high).per_kelvin
    factor = best.elastic_constants[1]
    strains = [layer.material.cte.thermal_strain(temperature_low, temperature_high) for layer in best.stack]
    difference = float((factor[1] * strains[1] - factor[0] * strains[0]) / (temperature_high - temperature_low))
    return OptimumRatio(ratio, probe[0].material.name, probe[1].material.name, state.value, flex, difference,
                        flex / difference, temperature_low, temperature_high)


@dataclass(frozen=True, eq=False)
class SizedElement:
    """Result of :func:`size_element`: the element, its thickness and size, and the stress check."""

    element: ThermalElement
    thickness: float
    size: float
    travel: float
    force: float
    peak_stress: np.ndarray
    allowable: np.ndarray
    utilisation: float
    within_limit: bool
    warnings: tuple[str, ...]
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        out = _result_dict(self)
        out["element"] = self.element.to_dict()
        return out


def _scaled_stack(stack: Stack, total: float) -> Stack:
    factor = total / stack.total_thickness
    return Stack(tuple(replace(layer, thickness=layer.thickness * factor) for layer in stack.layers))


def size_element(
    strip: ThermostatStrip, form: ElementForm, travel: float, temperature: float,
    force: float | None = None, overtravel: float = 0.0, thickness: float | None = None,
    factor: float = 1.0, limit_stress: float | None = None,
) -> SizedElement:
    """Thickness and size of an element that travels ``travel`` [m] (exact kinematics) at ``temperature``
    [K] and, when ``force`` [N] is given, pushes with that force on a rigid contact ``overtravel`` [K]
    further on. Give either ``force`` (solve thickness and size) or ``thickness`` (solve size only).

    ``strip`` fixes the materials, layer ratio, width and temperatures; ``form`` the shape (its lengths
    are scaled together). The peak layer stress at ``temperature`` + ``overtravel`` is checked against
    (``limit_stress`` or strength) / ``factor``.
    """
    from scipy.optimize import brentq, root

    travel = check_range("sizing.travel", travel, 0.0, 1.0, unit="m")
    temperature = check_range("sizing.temperature", temperature, 0.0, 5000.0, unit="K")
    overtravel = check_range("sizing.overtravel", overtravel, 0.0, 1000.0, low_inclusive=True, unit="K")
    if (force is None) == (thickness is None):
        raise InputError("sizing.force", force, "exactly one of force or thickness")
    hot = temperature + overtravel * (1 if temperature >= strip.reference_temperature else -1)

    def element(t: float, size: float) -> ThermalElement:
        return ThermalElement(strip.with_stack(_scaled_stack(strip.stack, t)), form.scaled(size / form.size))

    def travel_error(t: float, size: float) -> float:
        return abs(float(element(t, size).travel(np.array([temperature]))[0])) / travel - 1.0

    def pushing_force(t: float, size: float) -> float:
        e = element(t, size)
        gap = abs(float(e.travel(np.array([temperature]))[0]))
        return float(_loads(e, np.array([hot]), temperature, factor, limit_stress)[0][0]) if gap > 0 else 0.0

    def size_for(t: float) -> float:
        e0 = element(t, form.size)
        rate = abs(e0.form.travel_rate() * float(e0.strip.curvature_change(np.array([temperature]))[0]))
        guess = form.size * math.sqrt(travel / rate) if rate > 0 else form.size
        return brentq(lambda s: travel_error(t, s), 0.2 * guess, 5.0 * guess, xtol=1e-15, rtol=1e-13)

    if thickness is not None:
        t = check_range("sizing.thickness", thickness, 0.0, 0.1, unit="m")
        size = size_for(t)
    else:
        force = check_range("sizing.force", force, 0.0, 1e6, unit="N")
        if overtravel == 0.0:
            raise InputError("sizing.overtravel", overtravel, "> 0 K when a force is required after closure")
        t0 = strip.thickness
        s0 = size_for(t0)
        solution = root(
            lambda v: [travel_error(math.exp(v[0]), math.exp(v[1])),
                       pushing_force(math.exp(v[0]), math.exp(v[1])) / force - 1.0],
            [math.log(t0), math.log(s0)], method="hybr", options={"xtol": 1e-12},
        )
        if not solution.success:
            raise InputError("sizing.force", force, "a force and travel the element can reach", solution.message)
        t, size = (math.exp(v) for v in solution.x)
    sized = element(t, size)
    closing = closing_temperature(sized, abs(float(sized.travel(np.array([temperature]))[0])))
    P, _, _, _, peak, allow, util = _loads(sized, np.array([hot]), closing.temperature, factor, limit_stress)
    utilisation = float(util[0])
    warnings = closing.warnings
    if not np.isfinite(utilisation):
        warnings += ("no allowable stress for some layers: give limit_stress",)
    return SizedElement(sized, t, size, travel, float(P[0]), peak[0], allow, utilisation,
                        bool(np.isfinite(utilisation) and utilisation <= 1.0), warnings)


@dataclass(frozen=True, eq=False)
class PairRating:
    """One material pair at its optimum ratio: flexivity [1/K], flexural modulus [Pa], E_f F^2 [Pa/K^2],
    peak stress over allowable with the cantilever tip blocked across the span."""

    bottom: str
    top: str
    ratio: float
    flexivity: float
    flexural_modulus: float
    merit: float
    utilisation: float
    admissible: bool
    note: str = ""

    def to_dict(self) -> dict:
        return _result_dict(self)


_METAL_WORDS = ("steel", "alloy", "copper", "nickel", "metal", "brass")


def rank_pairs(
    library=None, temperature_low: float = 293.15, temperature_high: float = 373.15, factor: float = 1.5,
    limit_stress: float | None = None, candidates: Sequence[str] | None = None, state: str = "narrow",
    by: str = "flexivity",
) -> tuple[PairRating, ...]:
    """Rank pairs of library materials by ``by`` = "flexivity" or "merit" (E_f F^2), admissible first.

    Each ordered pair puts the lower-expansion material at the bottom, at the optimum thickness ratio.
    Stress check (common practice, worst ordinary case): a cantilever heated from ``temperature_low`` to
    ``temperature_high`` with its tip blocked carries 1.5 times the thermal moment change at the root;
    every layer's peak stress (thermal layer stresses included) must stay within strength / ``factor``
    (``limit_stress`` / ``factor`` for materials without a strength).
    """
    from ..core.materials import default_library

    if by not in ("flexivity", "merit"):
        raise InputError("rank.by", by, "'flexivity' or 'merit'")
    library = default_library() if library is None else library
    if candidates is None:
        candidates = [key for key, m in library.items()
                      if any(word in (m.category or "").lower() for word in _METAL_WORDS)]
    materials = [library[key] if isinstance(key, str) else key for key in candidates]
    ratio_of = _ratio_function()
    ratings = []
    for i, a in enumerate(materials):
        for b in materials[i + 1:]:
            low, high = sorted((a, b), key=lambda m: m.cte.secant(temperature_low, temperature_high))
            if high.cte.secant(temperature_low, temperature_high) - low.cte.secant(temperature_low, temperature_high) <= 1e-7:
                continue
            ratings.append(_rate(low, high, ratio_of, temperature_low, temperature_high, factor, limit_stress, state))
    key = (lambda r: r.flexivity) if by == "flexivity" else (lambda r: r.merit)
    return tuple(sorted(ratings, key=lambda r: (not r.admissible, -key(r))))


def _rate(low, high, ratio_of, t_low, t_high, factor, limit_stress, state) -> PairRating:
    total = 1e-3
    probe = ThermostatStrip(Stack.of((low, 0.5e-3), (high, 0.5e-3)), 1e-3, t_low, state=state)
    Y = probe.elastic_constants[0]
    ratio = float(ratio_of(Y[0] / Y[1]))
    t_top = total / (1.0 + ratio)
    strip = probe.with_stack(Stack((Layer(low, ratio * t_top), Layer(high, t_top))))
    flex = strip.flexivity(t_low, t_high).per_kelvin
    modulus = strip.flexural_modulus
    strengths = [m.strength if m.strength is not None else limit_stress for m in (low, high)]
    note = ""
    if None in strengths:
        utilisation = math.nan
        note = "no strength data: give limit_stress"
    else:
        moment = -1.5 * float(strip.thermal_moment_change(np.array([t_high]))[0])
        sb, st = strip.face_stresses(np.array([t_high]), moment)
        peak = np.maximum(np.abs(sb[0]), np.abs(st[0]))
        utilisation = float(np.max(peak / (np.array(strengths) / factor)))
    return PairRating(low.name, high.name, ratio, flex, modulus, modulus * flex * flex, utilisation,
                      bool(np.isfinite(utilisation) and utilisation <= 1.0), note)
