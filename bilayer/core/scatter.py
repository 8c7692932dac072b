"""Scatter of results from tolerances on the inputs: Monte Carlo and first-order propagation.

The generic part that every job with tolerances uses (thermostat set points, solder-joint strain,
life and warpage): how a tolerance is described and sampled, the Monte Carlo loop in bounded chunks,
first-order (linearised) propagation, the ranking of contributors and its wording.

A :class:`Tolerance` is a half-width with a distribution: "normal" reads the half-width as 3 standard
deviations (common practice for a +/- production tolerance), "uniform" as the bound.

First order (the delta method): for independent inputs p_k with standard deviations s_k,

    sigma_y^2 = sum_k (dy/dp_k s_k)^2,     share_k = (dy/dp_k s_k)^2 / sigma_y^2

Monte Carlo shares: the squared correlation of each input with the result, r_k^2 = cov(p_k, y)^2 /
(var p_k var y); for a linear result with independent inputs they equal the first-order shares.
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from statistics import NormalDist
from typing import Callable, Mapping, Sequence

import numpy as np

from .errors import InputError, check_range
from .progress import Progress

__all__ = [
    "PERCENTILES",
    "Tolerance",
    "ScatterSummary",
    "summary",
    "normal_percentiles",
    "rank_shares",
    "first_order",
    "numeric_sensitivities",
    "MonteCarloRun",
    "monte_carlo",
    "contributors_text",
]

PERCENTILES = (0.135, 2.275, 15.865, 50.0, 84.135, 97.725, 99.865)
"""Percentiles reported: the normal -3, -2, -1, 0, +1, +2, +3 sigma levels."""


@dataclass(frozen=True)
class Tolerance:
    """A +/- ``half_width`` on an input; ``relative`` (fraction of the nominal) or absolute (SI units).

    ``distribution``: "normal" (half-width = 3 sigma, common practice) or "uniform" (bound).
    """

    half_width: float
    relative: bool = True
    distribution: str = "normal"

    def __post_init__(self):
        object.__setattr__(self, "half_width", check_range("tolerance.half_width", self.half_width, 0.0, 1e3, low_inclusive=True))
        if self.relative and self.half_width >= 1.0:
            raise InputError("tolerance.half_width", self.half_width, "a relative tolerance below 1 (100 %)")
        if self.distribution not in ("normal", "uniform"):
            raise InputError("tolerance.distribution", self.distribution, "'normal' or 'uniform'")

    @property
    def sigma(self) -> float:
        """Standard deviation of the deviation (same unit as ``half_width``)."""
        return self.half_width / 3.0 if self.distribution == "normal" else self.half_width / math.sqrt(3.0)

    def sample(self, rng: np.random.Generator, size: int) -> np.ndarray:
        if self.distribution == "normal":
            return rng.normal(0.0, self.sigma, size)
        return rng.uniform(-self.half_width, self.half_width, size)

    def to_dict(self) -> dict:
        return {"half_width": self.half_width, "relative": self.relative, "distribution": self.distribution}


@dataclass(frozen=True, eq=False)
class ScatterSummary:
    """Statistics of one result under tolerances: ``nominal``, ``mean`` and standard deviation ``std``,
    ``percentiles`` (of :data:`PERCENTILES`), ``contributors`` (input, share of variance) from the largest
    down, first-order ``sensitivities`` (empty for a Monte Carlo). Jobs extend it with their own fields."""

    nominal: float
    mean: float
    std: float
    percentiles: Mapping[float, float]
    contributors: tuple[tuple[str, float], ...]
    sensitivities: Mapping[str, float]

    def summary_dict(self) -> dict:
        return {
            "nominal": self.nominal,
            "mean": self.mean,
            "std": self.std,
            "percentiles": {f"{k:g}": v for k, v in self.percentiles.items()},
            "contributors": [[name, share] for name, share in self.contributors],
            "sensitivities": dict(self.sensitivities),
        }


def summary(values: np.ndarray) -> tuple[float, float, dict]:
    """Mean, sample standard deviation and the :data:`PERCENTILES` of ``values``."""
    mean = float(np.mean(values))
    std = float(np.std(values, ddof=1)) if values.size > 1 else 0.0
    pct = np.percentile(values, PERCENTILES)
    return mean, std, {p: float(v) for p, v in zip(PERCENTILES, pct)}


def normal_percentiles(nominal: float, std: float) -> dict:
    """The :data:`PERCENTILES` of a normal distribution about ``nominal`` (first-order results)."""
    return {p: nominal + std * NormalDist().inv_cdf(p / 100.0) for p in PERCENTILES}


def rank_shares(variances: Mapping[str, float]) -> tuple[tuple[str, float], ...]:
    """(input, share of the total variance) from the largest down."""
    total = sum(variances.values())
    return tuple(sorted(((k, v / total if total > 0 else 0.0) for k, v in variances.items()), key=lambda kv: -kv[1]))


def first_order(sensitivities: Mapping[str, float], tolerances: Mapping[str, Tolerance]
                ) -> tuple[float, tuple[tuple[str, float], ...]]:
    """Standard deviation and ranked contributors of a result from its sensitivities dy/dp (per unit of
    each tolerance's own measure: per unit fraction for a relative tolerance, per SI unit otherwise)."""
    variance = {key: (sensitivities[key] * tol.sigma) ** 2 for key, tol in tolerances.items()}
    return math.sqrt(sum(variance.values())), rank_shares(variance)


def numeric_sensitivities(evaluate: Callable[[dict, int], Mapping[str, np.ndarray]],
                          tolerances: Mapping[str, Tolerance], step: float = 1e-3) -> dict[str, dict[str, float]]:
    """dy/dp of every result of ``evaluate`` by central differences, {result: {input: slope}}.

    ``evaluate(deviations, size)`` is the same vectorised function the Monte Carlo calls: deviations
    {input: array} (missing inputs at nominal). Each input moves by +/- ``step`` times its standard
    deviation; for the smooth closed forms used here the truncation error is of order step^2.
    """
    keys = list(tolerances)
    size = 2 * len(keys)
    deviations = {key: np.zeros(size) for key in keys}
    for k, key in enumerate(keys):
        h = step * tolerances[key].sigma
        deviations[key][2 * k:2 * k + 2] = (-h, h)
    values = evaluate(deviations, size)
    out: dict[str, dict[str, float]] = {}
    for name, array in values.items():
        array = np.asarray(array, float)
        out[name] = {}
        for k, key in enumerate(keys):
            h = step * tolerances[key].sigma
            out[name][key] = float((array[2 * k + 1] - array[2 * k]) / (2 * h)) if h > 0 else 0.0
    return out


@dataclass(frozen=True, eq=False)
class MonteCarloRun:
    """Raw outcome of :func:`monte_carlo`: every sampled value per result (NaN where a sample failed),
    and per result the inputs ranked by their squared correlation with it."""

    values: Mapping[str, np.ndarray]
    shares: Mapping[str, tuple[tuple[str, float], ...]]
    samples: int


def monte_carlo(evaluate: Callable[[dict, int], Mapping[str, np.ndarray]], tolerances: Mapping[str, Tolerance],
                nominal: Mapping[str, float], samples: int, seed: int | None = 0, chunk: int = 250_000,
                progress: Progress | None = None) -> MonteCarloRun:
    """Sample ``samples`` designs in chunks of ``chunk`` (memory stays bounded).

    Draws are made per chunk, input by input in the order of ``tolerances``; ``evaluate(draws, size)``
    returns {result: array} for one chunk. Correlations are accumulated as running sums of the results
    centred on ``nominal``; ``progress(fraction, message)`` is called after every chunk.
    """
    samples = int(check_range("samples", samples, 1, 1e9, high_inclusive=True, low_inclusive=True))
    chunk = int(check_range("chunk", chunk, 1, 1e8, low_inclusive=True, high_inclusive=True))
    rng = np.random.default_rng(seed)
    keys = list(tolerances)
    names = list(nominal)
    out = {name: np.empty(samples) for name in names}
    sums = {name: np.zeros((len(keys), 3)) for name in names}  # sum x, sum x^2, sum x*y per input
    done = 0
    while done < samples:
        size = min(chunk, samples - done)
        draws = {key: tolerances[key].sample(rng, size) for key in keys}
        values = evaluate(draws, size)
        for name in names:
            chunk_values = np.broadcast_to(np.asarray(values[name], float), (size,))
            out[name][done:done + size] = chunk_values
            y = chunk_values - nominal[name]
            for k, key in enumerate(keys):
                x = draws[key]
                sums[name][k] += (x.sum(), (x * x).sum(), (x * y).sum())
        done += size
        if progress is not None:
            progress(done / samples, f"{done}/{samples} samples")
    shares = {}
    for name in names:
        good = out[name][np.isfinite(out[name])]
        y = good - nominal[name]
        y_mean, y_var = float(y.mean()), float(y.var())
        ranked = []
        for k, key in enumerate(keys):
            x_mean = sums[name][k, 0] / samples
            x_var = sums[name][k, 1] / samples - x_mean**2
            cov = sums[name][k, 2] / samples - x_mean * y_mean
            ranked.append((key, float(cov * cov / (x_var * y_var)) if x_var > 0 and y_var > 0 else 0.0))
        ranked.sort(key=lambda item: -item[1])
        shares[name] = tuple(ranked)
    return MonteCarloRun(out, shares, samples)


def contributors_text(what: str, contributors: Sequence[tuple[str, float]], labels: Mapping[str, str],
                      negligible: float = 0.01) -> str:
    """One plain sentence naming what drives the scatter of ``what``, largest first, with its share of the
    variance; inputs under ``negligible`` of it are summed as "the others" (named from 0.5 %)."""
    named = [(labels.get(key, key), share) for key, share in contributors if share >= negligible]
    rest = sum(share for _, share in contributors if share < negligible)
    if not named:
        return f"No input moves the {what} noticeably."
    words = [f"the {name} ({100 * share:.0f} %)" for name, share in named]
    if len(words) == 1:
        text = f"The scatter of the {what} comes {'almost only ' if named[0][1] >= 0.9 else ''}from {words[0]}"
    elif named[0][1] >= 0.5:
        text = f"The scatter of the {what} comes mostly from {words[0]}, then " + _listing(words[1:])
    else:
        text = f"The scatter of the {what} comes from " + _listing(words)
    if rest >= 0.005:
        text += f"; the others add {100 * rest:.1g} %"
    return text + " of its variance."


def _listing(words: Sequence[str]) -> str:
    return words[0] if len(words) == 1 else ", ".join(words[:-1]) + " and " + words[-1]
