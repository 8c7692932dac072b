"""Where a thermostat element gets its curvature: the engine's stack, or a data-sheet flexivity.

Flexivity (ASTM B106): the change of curvature of the strip's centre line per degree, for unit
thickness,

    F = t (1/R2 - 1/R1) / (T2 - T1)          [1/K, or 1/degF in the inch-pound edition]

so F[1/K] = 1.8 F[1/degF]; a uniform temperature change gives dkappa = F dT / t. Flexivity is not the
"specific deflection" of a clamped strip (an empirical deflection constant, about half of F times a
calibration factor): this module accepts and reports flexivity only, always labelled with its origin.

:class:`ThermostatStrip` takes every curvature from the engine's laminate kernel with the layers'
thermal strains integrated from alpha(T) (secant and instantaneous tables handled by the material CTE
models). :class:`DatasheetStrip` is the explicit "flexivity from a data sheet" path:
dkappa = F (T - T_ref) / t with F a secant value over the sheet's range.
Sign: kappa > 0 when the top face is the longer one (engine convention).
"""
from __future__ import annotations

import warnings
from dataclasses import dataclass, field
from functools import cached_property

import numpy as np

from ..core import laminate
from ..core.errors import InputError, ModelLimitWarning, check_finite, check_range
from ..core.units import from_si
from ..core.stack import BendingState, Stack, Temperatures, evaluate

__all__ = ["Flexivity", "ThermostatStrip", "DatasheetStrip", "FAHRENHEIT_PER_KELVIN"]

FAHRENHEIT_PER_KELVIN = 1.8
"""Size of one kelvin in degrees Fahrenheit: a value per degF times 1.8 is the value per K."""

_FLEXIVITY_ORIGINS = ("stack, secant", "stack, instantaneous", "data sheet")


@dataclass(frozen=True)
class Flexivity:
    """A flexivity value (ASTM B106 definition) in 1/K with where it came from.

    ``origin`` is "stack, secant" (mean over ``temperature_low``..``temperature_high`` from the engine),
    "stack, instantaneous" (t dkappa/dT at ``temperature_low``) or "data sheet".
    """

    per_kelvin: float
    origin: str
    temperature_low: float | None = None
    temperature_high: float | None = None
    note: str = ""

    def __post_init__(self):
        value = check_finite("flexivity", self.per_kelvin)
        if abs(value) >= 1e-3:
            raise InputError("flexivity", value, "|F| < 1e-3 1/K", "flexivity is about 1e-5 to 4e-5 per K")
        object.__setattr__(self, "per_kelvin", value)
        if self.origin not in _FLEXIVITY_ORIGINS:
            raise InputError("flexivity.origin", self.origin, "one of " + ", ".join(_FLEXIVITY_ORIGINS))

    @property
    def per_fahrenheit(self) -> float:
        """The same flexivity per degF (ASTM B106 inch-pound form) = per_kelvin / 1.8."""
        return self.per_kelvin / FAHRENHEIT_PER_KELVIN

    @classmethod
    def from_datasheet(cls, value, unit: str = "1/K", temperature_range=None, note: str = "") -> "Flexivity":
        """A flexivity read from a data sheet: ``value`` per ``unit`` ("1/K", "1/degC" or "1/degF"),
        or a unit string such as "150e-7/degF" or "27 ppm/K" (then ``unit`` is ignored).

        ``temperature_range`` (K) is the range the sheet states for its (secant) value.
        """
        if isinstance(value, str):
            from ..core.units import parse

            per_kelvin = parse(value, "cte", "flexivity")
        else:
            factors = {"1/K": 1.0, "1/degC": 1.0, "1/degF": FAHRENHEIT_PER_KELVIN}
            if unit not in factors:
                raise InputError("flexivity unit", unit, "one of " + ", ".join(factors))
            per_kelvin = check_finite("flexivity", value) * factors[unit]
        low = high = None
        if temperature_range is not None:
            low, high = (check_range("flexivity.temperature_range", t, 0.0, 5000.0, unit="K") for t in temperature_range)
            if not low < high:
                raise InputError("flexivity.temperature_range", temperature_range, "low < high (K)")
        return cls(per_kelvin, "data sheet", low, high, note)

    def to_dict(self) -> dict:
        return {
            "quantity": "flexivity (ASTM B106)",
            "per_kelvin": self.per_kelvin,
            "per_fahrenheit": self.per_fahrenheit,
            "origin": self.origin,
            "temperature_low": self.temperature_low,
            "temperature_high": self.temperature_high,
            "note": self.note,
        }


def _temperature_array(name: str, value) -> np.ndarray:
    array = np.asarray(value, float)
    if not np.all(np.isfinite(array)) or np.any(array <= 0.0):
        raise InputError(name, value, "absolute temperatures > 0 K")
    return array


@dataclass(frozen=True, eq=False)
class ThermostatStrip:
    """A strip of layered thermostat metal of ``width`` [m]: curvature from the engine's stack.

    ``stress_free_temperature`` [K] is where the layers carry no stress and the strip is flat;
    ``reference_temperature`` [K] is where the element's shape and gaps are stated (default: the
    stress-free temperature). ``state`` is the engine's bending state (narrow strip for most elements,
    plate for discs).
    """

    stack: Stack
    width: float
    stress_free_temperature: float = 293.15
    reference_temperature: float | None = None
    state: BendingState = BendingState.NARROW
    source: str = field(default="engine stack", init=False)

    def __post_init__(self):
        if not isinstance(self.stack, Stack):
            raise InputError("thermostat.stack", self.stack, "a Stack")
        object.__setattr__(self, "width", check_range("thermostat.width", self.width, 0.0, 10.0, unit="m"))
        t0 = check_range("stress_free_temperature", self.stress_free_temperature, 0.0, 5000.0, unit="K")
        object.__setattr__(self, "stress_free_temperature", t0)
        ref = t0 if self.reference_temperature is None else self.reference_temperature
        object.__setattr__(
            self, "reference_temperature", check_range("thermostat.reference_temperature", ref, 0.0, 5000.0, unit="K")
        )
        object.__setattr__(self, "state", BendingState.parse(self.state))

    # --- section properties (engine kernel) -----------------------------------------------------------
    @cached_property
    def elastic_constants(self) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
        """(Y, free-strain factor, E, nu) per layer for the bending state (laminate.effective_properties)."""
        materials = [layer.material for layer in self.stack.layers]
        E = np.array([m.youngs_modulus for m in materials])
        nu = np.array([m.poisson_ratio for m in materials])
        Y, factor = laminate.effective_properties(E, nu, np.ones_like(E), self.state.value)
        return np.broadcast_to(Y, E.shape).copy(), np.asarray(factor, float), E, nu

    @property
    def thickness(self) -> float:
        """Total strip thickness t [m]."""
        return self.stack.total_thickness

    @cached_property
    def _section(self) -> laminate.LaminateSolution:
        Y, _, _, _ = self.elastic_constants
        return laminate.solve(Y, self.stack.thicknesses, np.zeros_like(Y))

    @property
    def flexural_rigidity(self) -> float:
        """E I per unit width about the bending axis [N m] (engine kernel, transformed section)."""
        return float(self._section.flexural_rigidity)

    @property
    def bending_stiffness(self) -> float:
        """E I b of the strip [N m^2]."""
        return self.flexural_rigidity * self.width

    @property
    def flexural_modulus(self) -> float:
        """Equivalent homogeneous modulus 12 E I / t^3 [Pa] (what ASTM B223 measures on the composite)."""
        return 12.0 * self.flexural_rigidity / self.thickness**3

    @cached_property
    def plate_rigidity(self) -> float:
        """Cylindrical-bending plate rigidity D_p per unit width [N m] (engine, wide-strip moduli)."""
        _, _, E, nu = self.elastic_constants
        Y, _ = laminate.effective_properties(E, nu, np.zeros_like(E), "wide")
        return float(laminate.solve(Y, self.stack.thicknesses, np.zeros_like(E)).flexural_rigidity)

    @property
    def mean_poisson_ratio(self) -> float:
        """Poisson's ratio averaged with weights Y_i t_i (an estimate used for discs)."""
        Y, _, _, nu = self.elastic_constants
        weights = Y * self.stack.thicknesses
        return float(np.sum(weights * nu) / np.sum(weights))

    # --- curvature (engine kernel) ---------------------------------------------------------------------
    def free_strains(self, temperature) -> np.ndarray:
        """Free strains f_i of the bending state at ``temperature`` [K], shape (..., n)."""
        T = _temperature_array("temperature", temperature)
        _, factor, _, _ = self.elastic_constants
        eps = [np.asarray(layer.material.cte.thermal_strain(self.stress_free_temperature, T), float)
               for layer in self.stack.layers]
        return np.stack(eps, axis=-1) * factor

    def solve(self, temperature, bending_moment=0.0) -> laminate.LaminateSolution:
        """The engine kernel at ``temperature`` with an extra moment per width [N] (broadcasts)."""
        Y, _, _, _ = self.elastic_constants
        return laminate.solve(Y, self.stack.thicknesses, self.free_strains(temperature), 0.0, bending_moment)

    def curvature(self, temperature):
        """kappa(T) [1/m] of the free strip relative to its flat stress-free state."""
        return _scalar_or_array(self.solve(temperature).curvature)

    def curvature_change(self, temperature):
        """kappa(T) - kappa(T_ref) [1/m]: the curvature change that drives every element."""
        return _scalar_or_array(np.asarray(self.curvature(temperature)) - self.curvature(self.reference_temperature))

    def curvature_rate(self, temperature):
        """d kappa / dT [1/(m K)] at ``temperature`` from the layers' instantaneous alpha(T)."""
        T = _temperature_array("temperature", temperature)
        Y, factor, _, _ = self.elastic_constants
        alpha = np.stack([np.asarray(layer.material.cte.instantaneous(T), float) for layer in self.stack.layers], axis=-1)
        return _scalar_or_array(laminate.solve(Y, self.stack.thicknesses, alpha * factor).curvature)

    def thermal_moment_change(self, temperature):
        """E I dkappa per unit width [N]: the moment that holds the element in its reference shape."""
        return _scalar_or_array(self.flexural_rigidity * np.asarray(self.curvature_change(temperature)))

    def face_stresses(self, temperature, bending_moment=0.0):
        """(stress_bottom, stress_top) [Pa] of every layer, shape (..., n), for the strip at
        ``temperature`` under an extra bending moment per width [N] (engine sign)."""
        solution = self.solve(temperature, bending_moment)
        return solution.stress_bottom, solution.stress_top

    # --- flexivity -----------------------------------------------------------------------------------------
    def flexivity(self, t_low: float, t_high: float) -> Flexivity:
        """Secant flexivity over [t_low, t_high] [K]: t (kappa(T2) - kappa(T1)) / (T2 - T1)."""
        t_low = check_range("flexivity.t_low", t_low, 0.0, 5000.0, unit="K")
        t_high = check_range("flexivity.t_high", t_high, 0.0, 5000.0, unit="K")
        if t_high == t_low:
            return self.instantaneous_flexivity(t_low)
        kappa = self.curvature(np.array([t_low, t_high]))
        value = self.thickness * (kappa[1] - kappa[0]) / (t_high - t_low)
        return Flexivity(float(value), "stack, secant", min(t_low, t_high), max(t_low, t_high))

    def instantaneous_flexivity(self, temperature: float) -> Flexivity:
        """t d kappa/dT at one temperature [1/K]."""
        value = self.thickness * float(self.curvature_rate(temperature))
        return Flexivity(value, "stack, instantaneous", float(temperature), float(temperature))

    def flexivity_curve(self, temperatures) -> np.ndarray:
        """Instantaneous flexivity t d kappa/dT [1/K] at every temperature (vectorised)."""
        return self.thickness * np.asarray(self.curvature_rate(temperatures))

    # --- limits --------------------------------------------------------------------------------------------
    def allowable_stresses(self, factor: float) -> np.ndarray:
        """Per-layer allowable stress: material strength / ``factor`` [Pa]; NaN where no strength is known."""
        factor = check_range("thermostat.stress_factor", factor, 0.0, 100.0, unit="")
        return np.array([
            np.nan if layer.material.strength is None else layer.material.strength / factor
            for layer in self.stack.layers
        ])

    def evaluate(self, temperature):
        """Full engine result (with its warnings) at one or many temperatures."""
        return evaluate(self.stack, Temperatures(self.stress_free_temperature, temperature), self.state)

    def data_warnings(self, temperatures) -> tuple[str, ...]:
        """Engine warnings over the range spanned by ``temperatures`` (CTE data range, strength...)."""
        T = _temperature_array("temperature", temperatures)
        span = np.array([float(np.min(T)), float(np.max(T)), self.reference_temperature])
        return self.evaluate(span).warnings

    @property
    def n_layers(self) -> int:
        return self.stack.n_layers

    @property
    def labels(self) -> tuple[str, ...]:
        return self.stack.labels

    def with_stack(self, stack: Stack) -> "ThermostatStrip":
        return ThermostatStrip(stack, self.width, self.stress_free_temperature, self.reference_temperature, self.state)

    def describe(self) -> str:
        layers = ", ".join(f"{layer.name} {layer.thickness * 1e3:.4g} mm" for layer in self.stack.layers)
        return f"engine stack (bottom to top: {layers}), {self.state.value} bending state"

    def to_dict(self) -> dict:
        return {
            "curvature_source": self.source,
            "layers": [
                {"material": layer.material.name, "thickness": layer.thickness, "label": layer.label}
                for layer in self.stack.layers
            ],
            "width": self.width,
            "stress_free_temperature": self.stress_free_temperature,
            "reference_temperature": self.reference_temperature,
            "bending_state": self.state.value,
            "flexural_rigidity": self.flexural_rigidity,
        }


@dataclass(frozen=True, eq=False)
class DatasheetStrip:
    """Flexivity from a data sheet: dkappa = F (T - T_ref) / t, labelled as such in every result.

    ``modulus`` is the strip's flexural modulus (ASTM B223 type) [Pa], needed for forces and bending
    stresses; ``allowable`` [Pa] is the supplier's maximum design bending stress, if known. Only the
    mechanical bending stress 6 M / t^2 is known on this path, not the layers' internal thermal stresses.
    """

    flexivity: Flexivity
    thickness: float
    width: float
    reference_temperature: float = 293.15
    modulus: float | None = None
    poisson_ratio: float = 0.3
    allowable: float | None = None
    source: str = field(default="flexivity from a data sheet", init=False)

    def __post_init__(self):
        if not isinstance(self.flexivity, Flexivity) or self.flexivity.origin != "data sheet":
            raise InputError("thermostat.flexivity", self.flexivity, "a Flexivity.from_datasheet(...) value")
        object.__setattr__(self, "thickness", check_range("thermostat.thickness", self.thickness, 0.0, 0.1, unit="m"))
        object.__setattr__(self, "width", check_range("thermostat.width", self.width, 0.0, 10.0, unit="m"))
        object.__setattr__(
            self, "reference_temperature",
            check_range("thermostat.reference_temperature", self.reference_temperature, 0.0, 5000.0, unit="K"),
        )
        if self.modulus is not None:
            object.__setattr__(self, "modulus", check_range("thermostat.modulus", self.modulus, 0.0, 1.25e12, unit="Pa"))
        object.__setattr__(
            self, "poisson_ratio", check_range("thermostat.poisson_ratio", self.poisson_ratio, -1.0, 0.5)
        )
        if self.allowable is not None:
            object.__setattr__(self, "allowable", check_range("thermostat.allowable", self.allowable, 0.0, 1e11, unit="Pa"))

    @property
    def state(self) -> BendingState:
        return BendingState.NARROW

    @property
    def n_layers(self) -> int:
        return 1

    @property
    def labels(self) -> tuple[str, ...]:
        return ("strip (data sheet)",)

    def _require_modulus(self) -> float:
        if self.modulus is None:
            raise InputError("thermostat.modulus", None, "the strip's flexural modulus in Pa (needed for forces)")
        return self.modulus

    @property
    def flexural_rigidity(self) -> float:
        return self._require_modulus() * self.thickness**3 / 12.0

    @property
    def bending_stiffness(self) -> float:
        return self.flexural_rigidity * self.width

    @property
    def flexural_modulus(self) -> float:
        return self._require_modulus()

    @property
    def plate_rigidity(self) -> float:
        return self.flexural_rigidity / (1.0 - self.poisson_ratio**2)

    @property
    def mean_poisson_ratio(self) -> float:
        return self.poisson_ratio

    def curvature_change(self, temperature):
        T = _temperature_array("temperature", temperature)
        return _scalar_or_array(self.flexivity.per_kelvin * (T - self.reference_temperature) / self.thickness)

    def curvature_rate(self, temperature):
        T = _temperature_array("temperature", temperature)
        return _scalar_or_array(np.full_like(T, self.flexivity.per_kelvin / self.thickness))

    def thermal_moment_change(self, temperature):
        return _scalar_or_array(self.flexural_rigidity * np.asarray(self.curvature_change(temperature)))

    def face_stresses(self, temperature, bending_moment=0.0):
        """Mechanical bending stress only: top +6 M / t^2, bottom -6 M / t^2 [Pa], shape (..., 1)."""
        T = _temperature_array("temperature", temperature)
        sigma = np.broadcast_to(6.0 * np.asarray(bending_moment, float) / self.thickness**2, np.broadcast_shapes(T.shape, np.shape(bending_moment)))
        return (-sigma)[..., None], np.asarray(sigma)[..., None]

    def flexivity_curve(self, temperatures) -> np.ndarray:
        return np.full_like(_temperature_array("temperature", temperatures), self.flexivity.per_kelvin)

    def allowable_stresses(self, factor: float) -> np.ndarray:
        factor = check_range("thermostat.stress_factor", factor, 0.0, 100.0, unit="")
        return np.array([np.nan if self.allowable is None else self.allowable / factor])

    def data_warnings(self, temperatures) -> tuple[str, ...]:
        T = _temperature_array("temperature", temperatures)
        low, high = self.flexivity.temperature_low, self.flexivity.temperature_high
        if low is not None and (float(np.min(T)) < low - 1e-6 or float(np.max(T)) > high + 1e-6):
            message = (
                f"the temperatures leave the data sheet's flexivity range ({from_si(low, 'temperature', 'degC'):g} to "
                f"{from_si(high, 'temperature', 'degC'):g} degC); the flexivity is extrapolated"
            )
            warnings.warn(message, ModelLimitWarning, stacklevel=3)
            return (message,)
        return ()

    def describe(self) -> str:
        return (
            f"flexivity from a data sheet: F = {self.flexivity.per_kelvin:.4g} 1/K "
            f"({self.flexivity.per_fahrenheit:.4g} 1/degF), t = {self.thickness * 1e3:.4g} mm"
        )

    def to_dict(self) -> dict:
        return {
            "curvature_source": self.source,
            "flexivity": self.flexivity.to_dict(),
            "thickness": self.thickness,
            "width": self.width,
            "reference_temperature": self.reference_temperature,
            "modulus": self.modulus,
            "poisson_ratio": self.poisson_ratio,
            "allowable": self.allowable,
        }


def _scalar_or_array(value):
    array = np.asarray(value, float)
    return float(array) if array.ndim == 0 else array
