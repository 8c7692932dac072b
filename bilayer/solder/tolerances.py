"""Scatter of the joint's shear strain, life, chamber life and assembly warpage from tolerances.

Inputs that scatter (keys of the ``tolerances`` mapping, :class:`bilayer.core.scatter.Tolerance` values):

    dnp             distance to the neutral point L_D (relative)
    standoff        joint height h (relative)
    cte_component   the component's alpha(T), scaled as a whole (relative); also its layer in the warpage
    cte_board       the board's alpha(T), likewise (relative)
    factor          Engelmaier's non-ideality factor F (relative)
    cycle_low       low temperature of the field cycle (absolute, K)
    cycle_high      high temperature of the field cycle (absolute, K)

Every sample re-evaluates the same closed forms as the nominal result, vectorised: the mismatch strain
(integrated CTEs over the sampled cycle), the joint strain of the geometry, the life law, the chamber
life (the law on the test cycle, or the field life over the Norris-Landzberg factor of the sampled
cycle), and the warpage through the laminate kernel with the sampled CTEs at each cycle extreme (the
field extremes move with the sampled cycle; test extremes are held). A law whose input is a given
energy density or inelastic strain keeps that input fixed, so its life does not scatter.

Monte Carlo and first-order propagation, sampling and the ranking of contributors are those of
:mod:`bilayer.core.scatter`; first-order slopes are central differences of the same vectorised function.
"""
from __future__ import annotations

import time
from dataclasses import dataclass
from typing import Mapping

import numpy as np

from ..core.errors import InputError
from ..core.progress import Progress
from ..core.units import from_si
from ..core.scatter import (ScatterSummary, Tolerance, contributors_text, first_order, monte_carlo, normal_percentiles,
                            numeric_sensitivities, summary)
from .acceleration import acceleration_factors
from .joint import SolderJointResult, thermal_strain

__all__ = ["TOLERANCE_KEYS", "INPUT_LABELS", "WarpageModel", "ResultScatter", "SolderScatter", "joint_scatter"]

TOLERANCE_KEYS = ("dnp", "standoff", "cte_component", "cte_board", "factor", "cycle_low", "cycle_high")
INPUT_LABELS = {
    "dnp": "distance to the neutral point",
    "standoff": "joint height",
    "cte_component": "component CTE",
    "cte_board": "board CTE",
    "factor": "non-ideality factor F",
    "cycle_low": "low temperature of the field cycle",
    "cycle_high": "high temperature of the field cycle",
}
"""Plain words for each input, used when the contributors are named."""
_ABSOLUTE = ("cycle_low", "cycle_high")


@dataclass(frozen=True, eq=False)
class WarpageModel:
    """What the warpage part of a sample needs: the design's ``stack``, the board and component layer
    indices (0-based) and the nominal :class:`~bilayer.solder.warpage.WarpageResult`."""

    stack: object
    board_layer: int
    component_layer: int
    result: object


@dataclass(frozen=True, eq=False)
class ResultScatter(ScatterSummary):
    """Scatter of one result (the statistics of :class:`ScatterSummary`; first-order ``sensitivities`` per
    unit fraction for relative inputs, per K for temperatures), its ``name`` (also the plain label),
    ``unit`` and ``text``, the contributors in words."""

    name: str
    unit: str
    text: str

    def to_dict(self) -> dict:
        return {"name": self.name, "unit": self.unit, **self.summary_dict(), "text": self.text}


@dataclass(frozen=True, eq=False)
class SolderScatter:
    """Scatter of every result of a joint under its tolerances, by ``method`` ("first order" or
    "monte carlo"); ``results`` in the order strain, life, chamber life, warpage at each temperature."""

    method: str
    results: tuple[ResultScatter, ...]
    tolerances: Mapping[str, Tolerance]
    samples: int
    failed: int
    seconds: float
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]

    def __getitem__(self, name: str) -> ResultScatter:
        for item in self.results:
            if item.name == name:
                return item
        raise KeyError(name)

    def to_dict(self) -> dict:
        return {"method": self.method, "results": [r.to_dict() for r in self.results],
                "tolerances": {k: t.to_dict() for k, t in self.tolerances.items()},
                "input_labels": {k: INPUT_LABELS[k] for k in self.tolerances}, "samples": self.samples,
                "failed": self.failed, "seconds": self.seconds, "warnings": list(self.warnings),
                "assumptions": list(self.assumptions),
                "units": {"tolerances": "relative (fraction) or K for cycle_low and cycle_high", "seconds": "s"}}


_ASSUMPTIONS = (
    "inputs scatter independently; a normal tolerance is read as 3 standard deviations",
    "a CTE tolerance scales that part's alpha(T) over the whole range, in the joint and in the warpage alike",
    "test-cycle temperatures and the other layers of the stack are held at their nominal values",
)


def _check(tolerances: Mapping[str, Tolerance]) -> dict[str, Tolerance]:
    checked = {}
    for key, value in dict(tolerances).items():
        if key not in TOLERANCE_KEYS:
            raise InputError(f"tolerances.{key}", value, "one of " + ", ".join(TOLERANCE_KEYS))
        if not isinstance(value, Tolerance):
            raise InputError(f"tolerances.{key}", value, "a Tolerance")
        if value.relative == (key in _ABSOLUTE):
            kind = "an absolute tolerance in K" if key in _ABSOLUTE else "a relative tolerance"
            raise InputError(f"tolerances.{key}.relative", value.relative, kind)
        checked[key] = value
    if not checked:
        raise InputError("tolerances", {}, "at least one tolerance")
    return checked


class _Model:
    """The vectorised evaluation of every result for deviations of the inputs."""

    def __init__(self, result: SolderJointResult, component, board, warpage: WarpageModel | None):
        self.result, self.component, self.board, self.warpage = result, component, board, warpage
        self.law = result.life_law
        self.shear_law = self.law.kind == "strain" and self.law.measure == "shear"
        self.names = ["shear strain", "median life"]
        chamber = result.chamber
        if chamber is not None:
            self.names.append("chamber life")
            self.chamber_by_law = chamber.cross_check is not None
        if warpage is not None:
            labels = warpage.result.temperature_labels or tuple(
                f"{from_si(t, 'temperature', 'degC'):.6g} degC" for t in warpage.result.temperatures)
            self.warpage_labels = labels
            self.names += [f"bow over the diagonal at {label}" for label in labels]

    def nominal(self) -> dict[str, float]:
        values = self(dict(), 1)
        return {name: float(np.asarray(values[name]).reshape(-1)[0]) for name in self.names}

    def __call__(self, deviations: Mapping[str, np.ndarray], size: int) -> dict[str, np.ndarray]:
        r = self.result

        def scale(key):
            return 1.0 + deviations[key] if key in deviations else np.ones(size)

        def shift(key):
            return deviations[key] if key in deviations else np.zeros(size)

        low = r.cycle.low + shift("cycle_low")
        high = r.cycle.high + shift("cycle_high")
        ok = high > low
        if r.board_cycle is r.cycle:
            board_low, board_high = low, high
        else:
            board_low, board_high = np.full(size, r.board_cycle.low), np.full(size, r.board_cycle.high)
        s_c, s_b = scale("cte_component"), scale("cte_board")
        mismatch = (s_b * thermal_strain(self.board, board_low, board_high)
                    - s_c * thermal_strain(self.component, low, high))
        factor = r.factor * scale("factor")
        dnp, height = scale("dnp"), scale("standoff")
        gamma = np.asarray(r.joint.shear_strain(mismatch, factor, dnp, height), float) * np.ones(size)
        gamma = np.where(ok, gamma, np.nan)
        mean = 0.5 * (low + high)
        if self.shear_law:
            life = np.asarray(self.law.life(np.where(ok, gamma, 1.0), mean, r.cycle.dwell)) * np.ones(size)
            life = np.where(ok, life, np.nan)
        else:
            life = np.full(size, r.median_life)
        out = {"shear strain": gamma, "median life": life}
        if r.chamber is not None:
            out["chamber life"] = self._chamber(life, low, high, mismatch_scales=(s_c, s_b),
                                                factor=factor, dnp=dnp, height=height, size=size)
        if self.warpage is not None:
            out.update(self._warpage(low, high, s_c, s_b, size))
        return out

    def _chamber(self, life, low, high, mismatch_scales, factor, dnp, height, size):
        r = self.result
        test = r.test
        if not self.chamber_by_law:
            af = acceleration_factors(test.swing, test.cycles_per_day, test.high, high - low, r.cycle.cycles_per_day,
                                      high, r.acceleration_set)
            return life / af
        if not self.shear_law:
            return np.full(size, r.chamber.life)
        s_c, s_b = mismatch_scales
        mismatch = (s_b * thermal_strain(self.board, test.low, test.high)
                    - s_c * thermal_strain(self.component, test.low, test.high))
        gamma = np.asarray(r.joint.shear_strain(mismatch, factor, dnp, height), float)
        return np.asarray(self.law.life(gamma, test.mean, test.dwell)) * np.ones(size)

    def _warpage(self, low, high, s_c, s_b, size):
        from ..core import laminate
        from ..core.results import layer_inputs
        from ..core.sagitta import bow_from_curvature
        from ..core.stack import Temperatures

        w = self.warpage
        nominal = w.result
        span = float(np.hypot(nominal.length, nominal.width))
        state = nominal.stack_result.state.value
        out = {}
        for label, temperature in zip(self.warpage_labels, nominal.temperatures):
            moved = low if "field low" in label else high if "field high" in label else None
            T = np.full(size, temperature) if moved is None else moved
            E, nu, eps = layer_inputs(w.stack, Temperatures(nominal.stress_free_temperature, T))
            eps = np.array(eps, float)
            eps[:, w.board_layer] *= s_b
            eps[:, w.component_layer] *= s_c
            Y, f = laminate.effective_properties(E, nu, eps, state)
            kappa = laminate.solve(Y, w.stack.thicknesses, f).curvature
            out[f"bow over the diagonal at {label}"] = bow_from_curvature(kappa, span)
        return out


_UNITS = {"shear strain": "1", "median life": "cycles", "chamber life": "cycles"}


def joint_scatter(result: SolderJointResult, component, board, tolerances: Mapping[str, Tolerance], *,
                  warpage: WarpageModel | None = None, method: str = "first order", samples: int = 100_000,
                  seed: int | None = 0, chunk: int = 100_000, progress: Progress | None = None) -> SolderScatter:
    """Scatter of the results of ``result`` (the nominal check, made with ``component`` and ``board``)
    under ``tolerances``, by ``method`` "first order" or "monte carlo" (``samples`` draws in chunks)."""
    start = time.perf_counter()
    tolerances = _check(tolerances)
    if method not in ("first order", "monte carlo"):
        raise InputError("method", method, "'first order' or 'monte carlo'")
    model = _Model(result, component, board, warpage)
    nominal = model.nominal()
    warnings = []
    if not model.shear_law:
        warnings.append(f"the {model.law.name} law takes a fixed {model.law.input_name}: the tolerances do not move "
                        "the life")
    failed = 0
    results = []
    if method == "first order":
        slopes = numeric_sensitivities(model, tolerances)
        for name in model.names:
            std, ranked = first_order(slopes[name], tolerances)
            results.append(ResultScatter(nominal[name], nominal[name], std, normal_percentiles(nominal[name], std),
                                         ranked, slopes[name], name, _UNITS.get(name, "m"),
                                         contributors_text(name, ranked, INPUT_LABELS)))
        samples = 0
        assumptions = _ASSUMPTIONS + ("linearised about the nominal design; percentiles from a normal distribution",)
    else:
        run = monte_carlo(model, tolerances, nominal, samples, seed, chunk, progress)
        for name in model.names:
            values = run.values[name]
            good = np.isfinite(values)
            failed = max(failed, int(values.size - good.sum()))
            mean, std, pct = summary(values[good])
            ranked = run.shares[name]
            results.append(ResultScatter(nominal[name], mean, std, pct, ranked, {}, name, _UNITS.get(name, "m"),
                                         contributors_text(name, ranked, INPUT_LABELS)))
        if failed:
            warnings.append(f"{failed} samples had the cycle's low temperature above its high one and were left out")
        assumptions = _ASSUMPTIONS
    return SolderScatter(method, tuple(results), tolerances, samples, failed, time.perf_counter() - start,
                         tuple(warnings), assumptions)
