"""Coefficient of thermal expansion (CTE) models.

Every model gives the free thermal strain between two absolute temperatures (kelvin),

    eps_th(T1 -> T2) = integral from T1 to T2 of alpha(T) dT,

where alpha(T) = (1/L) dL/dT is the instantaneous (tangent) coefficient. A *mean* (secant)
coefficient from a reference T0 to T is abar(T0, T) = eps_th(T0 -> T) / (T - T0); handbooks tabulate
either kind, so a table must say which one it holds.

All methods broadcast over numpy arrays of temperatures and return a float for scalar input.
Outside the data of a table or fit the end value is held (the strain is extrapolated linearly);
``covers`` tells whether a range stays inside, and :func:`range_warning` words the caution that
callers raise as :class:`~bilayer.core.errors.ModelLimitWarning`.
"""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import ClassVar, Sequence

import numpy as np

from ..errors import InputError, check_finite

__all__ = [
    "CTEModel",
    "ConstantCTE",
    "MeanCTETable",
    "InstantaneousCTETable",
    "SiliconCTE",
    "NOMINAL_RANGE",
    "ALPHA_LIMIT",
    "range_warning",
]

NOMINAL_RANGE = (293.15, 373.15)
"""Temperatures [K] of the representative mean coefficient of tables and fits: 20 to 100 degC."""
ALPHA_LIMIT = 1.0e-3
"""Hard limit on |alpha| [1/K]; the largest real values (soft polymers) are below 5e-4 /K."""
_RANGE_TOLERANCE = 1e-6  # K; absorbs round-off of degC -> K conversions in ``covers``

def _celsius(kelvin: float) -> str:
    from ..units import format_quantity

    return format_quantity(kelvin, "temperature", "si", digits=6)


def _celsius_number(kelvin: float) -> str:
    from ..units import from_si

    return f"{from_si(kelvin, 'temperature', 'degC'):g}"


def _absolute_temperatures(field_name: str, value) -> np.ndarray:
    """Return ``value`` as a float array of absolute temperatures [K], or raise InputError."""
    try:
        array = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise InputError(field_name, value, "absolute temperatures in kelvin (numbers)") from None
    good = np.isfinite(array) & (array > 0.0)
    if not np.all(good):
        bad = float(array[~good].flat[0]) if array.ndim else float(array)
        hint = "temperatures are absolute, in kelvin (add 273.15 to degC)" if bad <= 0 else ""
        raise InputError(field_name, bad, "a finite absolute temperature > 0 K", hint)
    return array


def _output(array: np.ndarray):
    return float(array) if np.ndim(array) == 0 else array


def _check_alpha(field_name: str, value) -> float:
    value = check_finite(field_name, value)
    if not abs(value) < ALPHA_LIMIT:
        raise InputError(
            field_name, value, f"|alpha| < {ALPHA_LIMIT:g} 1/K",
            "CTE is in 1/K: 17 ppm/K is 17e-6" if abs(value) >= 1e-2 else "",
        )
    return value


def _check_range(field_name: str, value) -> tuple[float, float] | None:
    """Validate an optional (low, high) pair of absolute temperatures [K]."""
    if value is None:
        return None
    try:
        low, high = value
    except (TypeError, ValueError):
        raise InputError(field_name, value, "a pair (low, high) of absolute temperatures in K") from None
    low = check_finite(f"{field_name}[0]", low)
    high = check_finite(f"{field_name}[1]", high)
    if not 0.0 < low < high:
        hint = "temperatures are absolute, in kelvin (add 273.15 to degC)" if low <= 0 else ""
        raise InputError(field_name, (low, high), "0 K < low < high", hint)
    return (low, high)


def _check_table(
    temperatures: Sequence[float], values: Sequence[float], minimum: int
) -> tuple[tuple[float, ...], tuple[float, ...]]:
    try:
        t = tuple(check_finite(f"cte.temperatures[{i}]", x) for i, x in enumerate(temperatures))
        v = tuple(_check_alpha(f"cte.values[{i}]", x) for i, x in enumerate(values))
    except TypeError:
        raise InputError("cte.temperatures", temperatures, "sequences of numbers") from None
    if len(t) != len(v):
        raise InputError("cte.values", values, f"one value per temperature ({len(t)} values)")
    if len(t) < minimum:
        raise InputError(
            "cte.temperatures", temperatures, f"at least {minimum} points",
            "use ConstantCTE for a single value",
        )
    if t[0] <= 0.0:
        raise InputError("cte.temperatures[0]", t[0], "an absolute temperature > 0 K",
                         "temperatures are absolute, in kelvin (add 273.15 to degC)")
    for i in range(1, len(t)):
        if not t[i] > t[i - 1]:
            raise InputError(f"cte.temperatures[{i}]", t[i], f"strictly increasing temperatures (> {t[i - 1]:g} K)")
    return t, v


def _frozen_array(values: Sequence[float]) -> np.ndarray:
    array = np.array(values, dtype=float)
    array.setflags(write=False)
    return array


class CTEModel:
    """Common interface of the CTE models (all temperatures absolute, in kelvin; alpha in 1/K).

    Subclasses implement ``_strain(t1, t2)`` and ``_alpha(t)`` on validated float arrays and set
    ``kind`` (the name used in material files).
    """

    kind: ClassVar[str] = ""

    # --- to be provided by subclasses -------------------------------------------------------------
    def _strain(self, t1: np.ndarray, t2: np.ndarray) -> np.ndarray:  # pragma: no cover - abstract
        raise NotImplementedError

    def _alpha(self, t: np.ndarray) -> np.ndarray:  # pragma: no cover - abstract
        raise NotImplementedError

    @property
    def valid_range(self) -> tuple[float, float] | None:  # pragma: no cover - abstract
        raise NotImplementedError

    # --- public interface ---------------------------------------------------------------------------
    def thermal_strain(self, t_from, t_to):
        """Free thermal strain eps = integral of alpha(T) dT from ``t_from`` to ``t_to`` [K]."""
        t1 = _absolute_temperatures("t_from", t_from)
        t2 = _absolute_temperatures("t_to", t_to)
        return _output(self._strain(t1, t2))

    def secant(self, t_from, t_to):
        """Mean coefficient eps(t_from -> t_to) / (t_to - t_from); alpha(t_from) where they are equal."""
        t1 = _absolute_temperatures("t_from", t_from)
        t2 = _absolute_temperatures("t_to", t_to)
        t1, t2 = np.broadcast_arrays(t1, t2)
        span = t2 - t1
        same = span == 0.0
        with np.errstate(invalid="ignore", divide="ignore"):
            mean = self._strain(t1, t2) / np.where(same, 1.0, span)
        return _output(np.where(same, self._alpha(t1), mean))

    def instantaneous(self, t):
        """Instantaneous (tangent) coefficient alpha(T) = d eps / dT [1/K]."""
        return _output(self._alpha(_absolute_temperatures("t", t)))

    @property
    def nominal(self) -> float:
        """A representative constant [1/K] for tables: the mean coefficient from 20 to 100 degC."""
        return float(self.secant(*NOMINAL_RANGE))

    def covers(self, t_from, t_to) -> bool:
        """True when every temperature in ``t_from``..``t_to`` lies inside ``valid_range``.

        A model without a stated range covers everything.
        """
        limits = self.valid_range
        if limits is None:
            return True
        t1 = _absolute_temperatures("t_from", t_from)
        t2 = _absolute_temperatures("t_to", t_to)
        low = min(float(np.min(t1)), float(np.min(t2)))
        high = max(float(np.max(t1)), float(np.max(t2)))
        return low >= limits[0] - _RANGE_TOLERANCE and high <= limits[1] + _RANGE_TOLERANCE

    def describe(self) -> str:  # pragma: no cover - abstract
        raise NotImplementedError


@dataclass(frozen=True)
class ConstantCTE(CTEModel):
    """A constant coefficient: eps = value * (T2 - T1).

    ``reference_range`` (K) records where a mean value was measured (e.g. 20 to 100 degC); it does
    not limit use. ``valid_range`` (K) is where the constant is accepted; None means no stated limit.
    """

    value: float
    valid_range: tuple[float, float] | None = None
    reference_range: tuple[float, float] | None = None
    kind: ClassVar[str] = "constant"

    def __post_init__(self):
        object.__setattr__(self, "value", _check_alpha("cte.value", self.value))
        object.__setattr__(self, "valid_range", _check_range("cte.valid_range", self.valid_range))
        object.__setattr__(self, "reference_range", _check_range("cte.reference_range", self.reference_range))

    def _strain(self, t1, t2):
        return self.value * (t2 - t1)

    def _alpha(self, t):
        return np.full_like(t, self.value, dtype=float)

    @property
    def nominal(self) -> float:
        return self.value

    def describe(self) -> str:
        text = f"constant {self.value * 1e6:.4g} ppm/K"
        if self.reference_range is not None:
            low, high = self.reference_range
            text += f" (mean {_celsius_number(low)} to {_celsius(high)})"
        return text


@dataclass(frozen=True)
class MeanCTETable(CTEModel):
    """Mean (secant) coefficients abar(T) from a stated reference temperature T0.

    eps(T0 -> T) = abar(T) (T - T0), with abar linearly interpolated in T and held at the end values
    outside the table, so eps(T1 -> T2) = abar(T2)(T2 - T0) - abar(T1)(T1 - T0) (re-basing of a mean
    table, e.g. ASM Handbook thermal-expansion chapter). The instantaneous coefficient is
    alpha(T) = abar(T) + (T - T0) dabar/dT, using the right-hand slope at table points.

    ``valid_range`` defaults to the data, from min(T0, first point) to max(T0, last point).
    """

    reference_temperature: float
    temperatures: tuple[float, ...]
    values: tuple[float, ...]
    valid_range: tuple[float, float] | None = None
    kind: ClassVar[str] = "mean_table"
    _t: np.ndarray = field(init=False, repr=False, compare=False)
    _v: np.ndarray = field(init=False, repr=False, compare=False)

    def __post_init__(self):
        reference = check_finite("cte.reference_temperature", self.reference_temperature)
        if reference <= 0.0:
            raise InputError("cte.reference_temperature", reference, "an absolute temperature > 0 K",
                             "temperatures are absolute, in kelvin (add 273.15 to degC)")
        t, v = _check_table(self.temperatures, self.values, minimum=2)
        object.__setattr__(self, "reference_temperature", reference)
        object.__setattr__(self, "temperatures", t)
        object.__setattr__(self, "values", v)
        limits = _check_range("cte.valid_range", self.valid_range)
        if limits is None:
            limits = (min(reference, t[0]), max(reference, t[-1]))
        object.__setattr__(self, "valid_range", limits)
        object.__setattr__(self, "_t", _frozen_array(t))
        object.__setattr__(self, "_v", _frozen_array(v))

    def _strain_from_reference(self, t):
        return np.interp(t, self._t, self._v) * (t - self.reference_temperature)

    def _strain(self, t1, t2):
        return self._strain_from_reference(t2) - self._strain_from_reference(t1)

    def _alpha(self, t):
        t_knots, v_knots = self._t, self._v
        index = np.searchsorted(t_knots, t, side="right") - 1
        inside = (index >= 0) & (index < len(t_knots) - 1)
        segment = np.clip(index, 0, len(t_knots) - 2)
        slope = (v_knots[segment + 1] - v_knots[segment]) / (t_knots[segment + 1] - t_knots[segment])
        slope = np.where(inside, slope, 0.0)
        return np.interp(t, t_knots, v_knots) + (t - self.reference_temperature) * slope

    def describe(self) -> str:
        return (
            f"mean coefficients from {_celsius(self.reference_temperature)}, table "
            f"{_celsius_number(self.temperatures[0])} to {_celsius(self.temperatures[-1])}"
        )


@dataclass(frozen=True)
class InstantaneousCTETable(CTEModel):
    """Instantaneous coefficients alpha(T_i), linear between points, held at the end values outside.

    The strain is the exact integral of that piecewise-linear alpha (trapezoids between points plus
    the partial segment). ``valid_range`` defaults to the first and last table temperatures.
    """

    temperatures: tuple[float, ...]
    values: tuple[float, ...]
    valid_range: tuple[float, float] | None = None
    kind: ClassVar[str] = "instantaneous_table"
    _t: np.ndarray = field(init=False, repr=False, compare=False)
    _v: np.ndarray = field(init=False, repr=False, compare=False)
    _cumulative: np.ndarray = field(init=False, repr=False, compare=False)

    def __post_init__(self):
        t, v = _check_table(self.temperatures, self.values, minimum=2)
        object.__setattr__(self, "temperatures", t)
        object.__setattr__(self, "values", v)
        limits = _check_range("cte.valid_range", self.valid_range)
        object.__setattr__(self, "valid_range", limits if limits is not None else (t[0], t[-1]))
        t_knots, v_knots = _frozen_array(t), _frozen_array(v)
        cumulative = np.concatenate(([0.0], np.cumsum(0.5 * (v_knots[1:] + v_knots[:-1]) * np.diff(t_knots))))
        object.__setattr__(self, "_t", t_knots)
        object.__setattr__(self, "_v", v_knots)
        object.__setattr__(self, "_cumulative", _frozen_array(cumulative))

    def _integral(self, t):
        """Integral of alpha from the first table temperature to ``t``."""
        t_knots, v_knots = self._t, self._v
        clipped = np.clip(t, t_knots[0], t_knots[-1])
        segment = np.clip(np.searchsorted(t_knots, clipped, side="right") - 1, 0, len(t_knots) - 2)
        slope = (v_knots[segment + 1] - v_knots[segment]) / (t_knots[segment + 1] - t_knots[segment])
        step = clipped - t_knots[segment]
        inside = self._cumulative[segment] + v_knots[segment] * step + 0.5 * slope * step**2
        end_value = np.where(t < t_knots[0], v_knots[0], v_knots[-1])
        return inside + end_value * (t - clipped)

    def _strain(self, t1, t2):
        return self._integral(t2) - self._integral(t1)

    def _alpha(self, t):
        return np.interp(t, self._t, self._v)

    def describe(self) -> str:
        return (
            f"instantaneous coefficients, table {_celsius_number(self.temperatures[0])} to "
            f"{_celsius(self.temperatures[-1])}"
        )


@dataclass(frozen=True)
class SiliconCTE(CTEModel):
    """Single-crystal silicon, Okada & Tokumaru, J. Appl. Phys. 56, 314 (1984), valid 120-1500 K.

        alpha(T) = [3.725 (1 - exp(-k (T - 124))) + 5.548e-4 T] * 1e-6 /K,  k = 5.88e-3 /K, T in K

    integrated in closed form:

        eps(T1 -> T2) = 1e-6 {3.725 [(T2 - T1) + (exp(-k(T2-124)) - exp(-k(T1-124))) / k]
                              + 2.774e-4 (T2^2 - T1^2)}.

    Below 120 K the real coefficient falls through zero (negative between about 20 and 120 K); the
    formula is not extrapolated there: alpha is held at its 120 K (and 1500 K) value.
    """

    kind: ClassVar[str] = "silicon_okada_tokumaru"
    A: ClassVar[float] = 3.725e-6
    K: ClassVar[float] = 5.88e-3
    T_SHIFT: ClassVar[float] = 124.0
    B: ClassVar[float] = 5.548e-10
    LIMITS: ClassVar[tuple[float, float]] = (120.0, 1500.0)

    @property
    def valid_range(self) -> tuple[float, float]:
        return self.LIMITS

    def _formula_alpha(self, t):
        return self.A * (1.0 - np.exp(-self.K * (t - self.T_SHIFT))) + self.B * t

    def _antiderivative(self, t):
        clipped = np.clip(t, *self.LIMITS)
        inside = self.A * (clipped + np.exp(-self.K * (clipped - self.T_SHIFT)) / self.K) + 0.5 * self.B * clipped**2
        return inside + self._formula_alpha(clipped) * (t - clipped)

    def _strain(self, t1, t2):
        return self._antiderivative(t2) - self._antiderivative(t1)

    def _alpha(self, t):
        return self._formula_alpha(np.clip(t, *self.LIMITS))

    def describe(self) -> str:
        return "silicon, Okada & Tokumaru (1984) instantaneous formula, 120 to 1500 K"


def range_warning(model: CTEModel, t_from, t_to, field: str) -> str | None:
    """The caution text when ``t_from``..``t_to`` leaves ``model.valid_range``, else None.

    Callers raise it as :class:`~bilayer.core.errors.ModelLimitWarning` and put it in their results.
    """
    if model.covers(t_from, t_to):
        return None
    low = min(float(np.min(t_from)), float(np.min(t_to)))
    high = max(float(np.max(t_from)), float(np.max(t_to)))
    data_low, data_high = model.valid_range
    return (
        f"{field}: the temperatures {_celsius_number(low)} to {_celsius(high)} leave the CTE data "
        f"({model.describe()}; valid {_celsius_number(data_low)} to {_celsius(data_high)}); "
        "the end value is held, so the thermal strain there is extrapolated"
    )

