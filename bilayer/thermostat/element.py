"""Thermostat and sensor elements: travel versus temperature, set points, contact force, work, stress.

A :class:`ThermalElement` joins a strip (curvature from the engine's stack, or an explicit data-sheet
flexivity; :mod:`bilayer.thermostat.strip`) with a form (:mod:`bilayer.thermostat.forms`). Its
working point moves by ``travel`` along z (the direction of the strip's top face at the clamp), or turns
by ``travel`` radians for coils.

Set point: the temperature at which ``side * travel(T) = gap`` (the contact lies ``gap`` away on the
``side`` the element moves toward; "auto" = the side it moves toward on heating). After closure the
contact is taken as rigid: the curvature change beyond the closing temperature T_c turns into force,

    P(T) = rate * (dkappa(T) - dkappa(T_c)) / C          rate = d travel / d dkappa, C = compliance

(small-deflection beam theory, Maxwell-Mohr; for a cantilever P = 3 E I b (dkappa - dkappa_c) / (2 L),
layers.md section 7), and the strip at the most loaded section carries its own thermal layer stresses
plus the moment P * arm (engine superposition). Work against a constant load is largest at half the
blocked force and half the free travel: W_max = travel^2 / (4 C) (applications.md section 1.6, re-derived).

Every result carries warnings, assumptions and the thermostat cautions (:data:`THERMOSTAT_CAUTIONS`).
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Union

import numpy as np

from ..core.errors import InputError, check_range
from .forms import ElementForm, FlatDisc
from .strip import DatasheetStrip, Flexivity, ThermostatStrip

__all__ = [
    "THERMOSTAT_CAUTIONS",
    "THERMOSTAT_ASSUMPTIONS",
    "ThermalElement",
    "ResponseCurve",
    "SetPoint",
    "GapForSetPoint",
    "ContactLoad",
    "WorkOutput",
    "WorkingSpan",
    "response",
    "closing_temperature",
    "meeting_temperature",
    "gap_for_set_point",
    "contact_load",
    "work_output",
    "working_span",
]

Strip = Union[ThermostatStrip, DatasheetStrip]

THERMOSTAT_CAUTIONS = (
    "Thermal protectors, cut-outs, limiters, motor protectors and breaker trip elements are safety "
    "devices: a wrong set point or a drifting one can cause fire, scalding or electric shock.",
    "These figures are engineering estimates from elastic beam and plate theory with nominal data; "
    "they do not qualify, certify or calibrate a device.",
    "Qualification is by test under the applicable standards (for example the IEC 60730 series for "
    "automatic electrical controls, with IEC 60730-2-9 for temperature-sensing controls, or the national "
    "adoption in force), and production devices are calibrated; certification bodies, local codes and "
    "licensed practice decide.",
    "Check the stress-free and reference temperatures, the sign of the temperature change, the flexivity "
    "origin (stack or data sheet, per K or per degF) and the supplier's maximum design stress.",
)

THERMOSTAT_ASSUMPTIONS = (
    "uniform temperature along and through the element; no self-heating by current",
    "free motion by exact arc kinematics of an inextensible centre line with uniform curvature change",
    "forces and stresses after contact by small-deflection beam theory superposed on the free thermal state",
    "rigid contact acting at the working point normal to the reference centre line; no friction",
    "elastic strip: no creep, relaxation or permanent set (stay below the maximum design stress)",
)

_DEFAULT_SEARCH = (-250.0, 450.0)  # K around the reference temperature
_GRID = 1025


@dataclass(frozen=True, eq=False)
class ThermalElement:
    """A thermostat element: ``strip`` (curvature source) formed into ``form``."""

    strip: Strip
    form: ElementForm
    name: str = ""

    def __post_init__(self):
        if not isinstance(self.strip, (ThermostatStrip, DatasheetStrip)):
            raise InputError("thermostat.strip", self.strip, "a ThermostatStrip or DatasheetStrip")
        if not isinstance(self.form, ElementForm):
            raise InputError("thermostat.form", self.form, "an element form (Cantilever, UShape, ...)")
        if isinstance(self.form, FlatDisc) and isinstance(self.strip, ThermostatStrip) and self.strip.state.value != "plate":
            raise InputError("thermostat.bending_state", self.strip.state.value, "'plate' for a disc (equal-biaxial bending)")

    @property
    def reference_temperature(self) -> float:
        return self.strip.reference_temperature

    @property
    def unit(self) -> str:
        return "rad" if self.form.output == "rotation" else "m"

    def curvature_change(self, temperature):
        return self.strip.curvature_change(temperature)

    def travel(self, temperature, exact: bool = True):
        """Working-point travel from the reference temperature [m or rad] (exact or small-deflection)."""
        dkappa = self.strip.curvature_change(temperature)
        return self.form.travel(dkappa) if exact else self.form.travel_small(dkappa)

    def heating_direction(self) -> int:
        """+1 if heating moves the working point toward +z (or turns it positively), else -1."""
        rate = float(self.strip.curvature_rate(self.reference_temperature)) * self.form.travel_rate()
        if rate == 0.0:
            raise InputError("thermostat.stack", "equal CTEs", "layers whose expansion differs (the element does not move)")
        return 1 if rate > 0 else -1

    def side_sign(self, side: str) -> int:
        """Sign of the contact side: "auto" (the heating direction), "top"/"positive" (+), "bottom"/"negative" (-)."""
        if side == "auto":
            return self.heating_direction()
        signs = {"top": 1, "positive": 1, "bottom": -1, "negative": -1}
        if side not in signs:
            raise InputError("thermostat.contact_side", side, "one of auto, top, bottom (positive, negative for coils)")
        return signs[side]

    def compliance(self) -> float:
        """Travel per unit force (per unit torque for coils) at the working point [m/N]."""
        if isinstance(self.form, FlatDisc):
            return self.form.plate_compliance(self.strip.plate_rigidity, self.strip.mean_poisson_ratio)
        return self.form.compliance(self.strip.bending_stiffness)

    @property
    def stiffness(self) -> float:
        """Force per unit travel at the working point [N/m] (torque per radian for coils [N m/rad])."""
        return 1.0 / self.compliance()

    def blocked_force(self, temperature):
        """Force [N] (torque [N m] for coils) to hold the working point at its reference position."""
        return np.abs(self.travel(temperature, exact=False)) / self.compliance()

    def strip_volume(self) -> float:
        """Volume of thermostat metal in the element [m^3] (disc: pi D^2 t / 4)."""
        if isinstance(self.form, FlatDisc):
            return math.pi * self.form.diameter**2 * self.strip.thickness / 4.0
        return self.strip.width * self.strip.thickness * self.form.strip_length

    def describe(self) -> str:
        return f"{self.form.description}; {self.strip.describe()}"

    def to_dict(self) -> dict:
        return {"name": self.name, "form": self.form.to_dict(), "strip": self.strip.to_dict()}


def _check_temperature(name: str, value) -> float:
    return check_range(name, value, 0.0, 5000.0, unit="K")


def _search_grid(reference: float, search) -> np.ndarray:
    if search is None:
        low, high = reference + _DEFAULT_SEARCH[0], reference + _DEFAULT_SEARCH[1]
    else:
        low, high = (_check_temperature("thermostat.search_range", t) for t in search)
        if not low < high:
            raise InputError("thermostat.search_range", search, "low < high (K)")
    return np.linspace(max(low, 1.0), high, _GRID)


def _first_crossing(function, reference: float, search) -> tuple[float, str] | None:
    """Temperature nearest ``reference`` where the vectorised ``function`` changes sign, refined by brentq."""
    from scipy.optimize import brentq

    grid = _search_grid(reference, search)
    if grid[0] <= reference <= grid[-1]:
        grid = np.unique(np.append(grid, reference))  # the crossing search starts exactly at the reference
    values = np.asarray(function(grid), float)
    best = None
    for direction, indices in (("heating", np.flatnonzero(grid >= reference)), ("cooling", np.flatnonzero(grid <= reference)[::-1])):
        if indices.size < 2:
            continue
        v = values[indices]
        change = np.flatnonzero(np.sign(v[1:]) != np.sign(v[:-1]))
        if change.size == 0:
            continue
        a, b = grid[indices[change[0]]], grid[indices[change[0] + 1]]
        root = brentq(lambda t: float(function(np.array([t]))[0]), min(a, b), max(a, b), xtol=1e-10, rtol=1e-14)
        if best is None or abs(root - reference) < abs(best[0] - reference):
            best = (float(root), direction)
    return best


def _result_dict(obj) -> dict:
    out = {}
    for name in obj.__dataclass_fields__:
        value = getattr(obj, name)
        if isinstance(value, np.ndarray):
            value = [None if not math.isfinite(v) else float(v) for v in value.ravel()] if value.ndim == 1 else value.tolist()
        elif isinstance(value, (np.floating, np.integer)):
            value = float(value)
        elif isinstance(value, float) and not math.isfinite(value):
            value = None
        elif isinstance(value, tuple):
            value = list(value)
        elif hasattr(value, "to_dict"):
            value = value.to_dict()
        out[name] = value
    return out


@dataclass(frozen=True, eq=False)
class ResponseCurve:
    """Travel of an element over temperatures: exact, small-deflection, curvature change, flexivity.

    ``travel``/``travel_small`` [m] (or [rad] for coils, see ``unit``), ``curvature_change`` [1/m],
    ``flexivity`` the instantaneous t d kappa/dT [1/K] at each temperature.
    """

    temperatures: np.ndarray
    curvature_change: np.ndarray
    travel: np.ndarray
    travel_small: np.ndarray
    flexivity: np.ndarray
    unit: str
    curvature_source: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...] = THERMOSTAT_ASSUMPTIONS
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        return _result_dict(self)


def response(element: ThermalElement, temperatures) -> ResponseCurve:
    """Travel versus temperature over an array of absolute temperatures [K] (vectorised engine call)."""
    T = np.atleast_1d(np.asarray(temperatures, float))
    dkappa = np.atleast_1d(element.strip.curvature_change(T))
    return ResponseCurve(
        temperatures=T,
        curvature_change=dkappa,
        travel=np.asarray(element.form.travel(dkappa)),
        travel_small=np.asarray(element.form.travel_small(dkappa)),
        flexivity=np.atleast_1d(element.strip.flexivity_curve(T)),
        unit=element.unit,
        curvature_source=element.strip.source,
        warnings=element.strip.data_warnings(T),
    )


@dataclass(frozen=True, eq=False)
class SetPoint:
    """Temperature at which an element (or two facing elements) closes a gap.

    ``temperature`` uses exact kinematics, ``temperature_small`` the small-deflection travel; ``direction``
    says whether the contact is reached on heating or cooling from the reference temperature;
    ``travel_rate`` is d travel / dT at closure [m/K or rad/K].
    """

    temperature: float
    temperature_small: float
    direction: str
    gap: float
    side: int
    reference_temperature: float
    travel_rate: float
    curvature_source: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...] = THERMOSTAT_ASSUMPTIONS
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        return _result_dict(self)


def _check_gap(element: ThermalElement, gap: float) -> float:
    high = 10.0 if element.form.output == "rotation" else 1.0
    return check_range("thermostat.gap", gap, 0.0, high, unit=element.unit)


def closing_temperature(element: ThermalElement, gap: float, side: str = "auto", search=None) -> SetPoint:
    """Temperature [K] at which the working point has travelled ``gap`` toward the contact on ``side``.

    The crossing nearest the reference temperature within ``search`` (K, default reference -250 K to
    +450 K) is returned; InputError when the gap is not reached there.
    """
    gap = _check_gap(element, gap)
    sign = element.side_sign(side)
    T, T_small, direction, rate = _closure(
        lambda T, exact: sign * element.travel(T, exact), gap, element.reference_temperature, search,
        InputError("thermostat.gap", gap, "a gap the element reaches within the search range",
                   f"the element travels toward side {'+' if sign > 0 else '-'}z; check the contact side"))
    span = np.array([element.reference_temperature, T])
    return SetPoint(T, T_small, direction, gap, sign, element.reference_temperature, sign * rate,
                    element.strip.source, element.strip.data_warnings(span))


def _closure(approach, gap: float, reference: float, search, not_reached: InputError):
    """Where ``approach(T, exact)`` first reaches ``gap`` from the reference temperature.

    Returns (T exact, T small-deflection, direction, d approach/dT at T exact); raises
    ``not_reached`` when either kinematics misses the gap within ``search``.
    """
    found = {}
    for exact in (True, False):
        hit = _first_crossing(lambda T, exact=exact: approach(T, exact) - gap, reference, search)
        if hit is None:
            raise not_reached
        found[exact] = hit
    T, direction = found[True]
    h = 1e-3
    rate = float(np.diff(approach(np.array([T - h, T + h]), True))[0] / (2 * h))
    return T, found[False][0], direction, rate


def meeting_temperature(
    first: ThermalElement, second: ThermalElement, gap: float,
    first_faces: str = "top", second_faces: str = "top", search=None,
) -> SetPoint:
    """Temperature at which the working points of two facing elements meet.

    At the common reference temperature the points are ``gap`` apart; ``first_faces``/``second_faces``
    say which face ("top" = +z side of its own strip) of each element looks at the other. The gap closes
    when approach_1 + approach_2 = gap, approach_i = (+1 for "top", -1 for "bottom") * travel_i(T).
    """
    if not math.isclose(first.reference_temperature, second.reference_temperature, abs_tol=1e-9):
        raise InputError("thermostat.reference_temperature", second.reference_temperature,
                         f"the same reference temperature for both elements ({first.reference_temperature} K)")
    gap = _check_gap(first, gap)
    signs = []
    for field_name, faces in (("first_faces", first_faces), ("second_faces", second_faces)):
        if faces not in ("top", "bottom"):
            raise InputError(f"thermostat.{field_name}", faces, "'top' or 'bottom'")
        signs.append(1 if faces == "top" else -1)
    T, T_small, direction, rate = _closure(
        lambda T, exact: signs[0] * first.travel(T, exact) + signs[1] * second.travel(T, exact), gap,
        first.reference_temperature, search,
        InputError("thermostat.gap", gap, "a gap the two elements close within the search range"))
    span = np.array([first.reference_temperature, T])
    source = first.strip.source if first.strip.source == second.strip.source else f"{first.strip.source} / {second.strip.source}"
    return SetPoint(T, T_small, direction, gap, 0, first.reference_temperature, rate, source,
                    first.strip.data_warnings(span) + second.strip.data_warnings(span))


@dataclass(frozen=True, eq=False)
class GapForSetPoint:
    """Gap [m or rad] that an element closes exactly at ``set_point`` [K] (exact and small-deflection)."""

    set_point: float
    gap: float
    gap_small: float
    side: int
    reference_temperature: float
    curvature_source: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...] = THERMOSTAT_ASSUMPTIONS
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        return _result_dict(self)


def gap_for_set_point(element: ThermalElement, set_point: float) -> GapForSetPoint:
    """The gap to set at the reference temperature so that the element closes at ``set_point`` [K]
    (the contact goes on the side the element moves toward)."""
    set_point = _check_temperature("thermostat.set_point", set_point)
    exact = float(element.travel(np.array([set_point]))[0])
    small = float(element.travel(np.array([set_point]), exact=False)[0])
    if exact == 0.0:
        raise InputError("thermostat.set_point", set_point, "a temperature different from the reference temperature")
    sign = 1 if exact > 0 else -1
    span = np.array([element.reference_temperature, set_point])
    return GapForSetPoint(set_point, abs(exact), abs(small), sign, element.reference_temperature,
                          element.strip.source, element.strip.data_warnings(span))


@dataclass(frozen=True, eq=False)
class ContactLoad:
    """Contact force after closure and the strip stresses, over temperatures.

    ``force`` [N] (torque [N m] for coils) is zero before closure; ``moment`` is the bending moment per
    width at the most loaded section [N] (engine sign); ``stress_bottom``/``stress_top`` (..., n) [Pa]
    include the layers' thermal stresses; ``utilisation`` = max over layers of |sigma| / allowable
    (NaN where no allowable is known). ``allowable`` per layer [Pa] = limit / factor.
    """

    temperatures: np.ndarray
    closing_temperature: float
    force: np.ndarray
    moment: np.ndarray
    stress_bottom: np.ndarray
    stress_top: np.ndarray
    peak_stress: np.ndarray
    allowable: np.ndarray
    utilisation: np.ndarray
    stiffness: float
    force_unit: str
    curvature_source: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...] = THERMOSTAT_ASSUMPTIONS
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        return _result_dict(self)


def _allowables(element: ThermalElement, factor: float, limit_stress: float | None) -> np.ndarray:
    factor = check_range("thermostat.stress_factor", factor, 0.0, 100.0)
    if limit_stress is not None:
        limit = check_range("thermostat.limit_stress", limit_stress, 0.0, 1e11, unit="Pa")
        return np.full(element.strip.n_layers, limit / factor)
    return element.strip.allowable_stresses(factor)


def _loads(element: ThermalElement, T: np.ndarray, closing: float | None, factor: float, limit_stress):
    """Force, moment, face stresses and utilisation at temperatures ``T`` with a contact closed at
    ``closing`` (None: free element)."""
    dkappa = np.asarray(element.strip.curvature_change(T), float)
    allow = _allowables(element, factor, limit_stress)
    if closing is None:
        over = np.zeros_like(dkappa)
    else:
        kc = float(element.strip.curvature_change(np.array([closing]))[0])
        over = dkappa - kc  # pushes on the contact only while the curvature keeps changing the same way
        over = np.where(over * np.sign(kc) > 0, over, 0.0)
    compliance = element.compliance()
    force = np.abs(element.form.travel_rate() * over) / compliance
    if isinstance(element.form, FlatDisc):
        moment = np.zeros_like(force)  # stresses under a point load are singular: thermal part only
    else:
        moment = -np.sign(over) * force * element.form.moment_arm() / element.strip.width
    sb, st = element.strip.face_stresses(T, moment)
    peak = np.maximum(np.abs(sb), np.abs(st))
    with np.errstate(invalid="ignore"):
        util = np.max(peak / allow, axis=-1) if np.all(np.isfinite(allow)) else np.full(T.shape, np.nan)
    return force, moment, sb, st, peak, allow, util


def contact_load(
    element: ThermalElement, gap: float, temperatures, side: str = "auto",
    factor: float = 1.0, limit_stress: float | None = None, search=None,
) -> ContactLoad:
    """Contact force and stresses over ``temperatures`` [K] for a rigid contact ``gap`` away on ``side``.

    The allowable of each layer is (``limit_stress`` if given, else the material strength) / ``factor``.
    """
    T = np.atleast_1d(np.asarray(temperatures, float))
    closing = closing_temperature(element, gap, side, search).temperature
    force, moment, sb, st, peak, allow, util = _loads(element, T, closing, factor, limit_stress)
    warnings = element.strip.data_warnings(np.append(T, closing))
    if isinstance(element.form, FlatDisc):
        warnings += ("disc: the stress under the central contact force is not computed (point-load singularity); "
                     "stresses shown are the free thermal layer stresses",)
    if np.any(np.isnan(allow)):
        warnings += ("no allowable stress for some layers: give limit_stress (the supplier's maximum design stress)",)
    return ContactLoad(T, closing, force, moment, sb, st, peak, allow, util, element.stiffness,
                       "N m" if element.form.output == "rotation" else "N", element.strip.source, warnings)


@dataclass(frozen=True, eq=False)
class WorkOutput:
    """Best work against a constant load between the reference temperature and ``temperature``.

    W_max = travel^2 / (4 C) at load = blocked/2 and stroke = travel/2 [J]; ``work_per_volume`` = W_max /
    strip volume [J/m^3] (a cantilever of homogeneous modulus E gives E (F dT)^2 / 64); ``merit`` = E_f F^2
    [Pa/K^2] with E_f the strip's flexural modulus and F its secant flexivity over the range.
    """

    temperature: float
    free_travel: float
    blocked_force: float
    optimum_load: float
    optimum_stroke: float
    work: float
    work_per_volume: float
    flexivity: Flexivity
    flexural_modulus: float
    merit: float
    curvature_source: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...] = THERMOSTAT_ASSUMPTIONS
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        return _result_dict(self)


def work_output(element: ThermalElement, temperature: float) -> WorkOutput:
    """Work the element can do against a constant load when it goes from the reference temperature to
    ``temperature`` [K] (small-deflection travel and stiffness)."""
    T = _check_temperature("thermostat.temperature", temperature)
    if T == element.reference_temperature:
        raise InputError("thermostat.temperature", T, "a temperature different from the reference temperature")
    travel = abs(float(element.travel(np.array([T]), exact=False)[0]))
    compliance = element.compliance()
    blocked = travel / compliance
    work = travel * travel / (4.0 * compliance)
    strip = element.strip
    if isinstance(strip, ThermostatStrip):
        flex = strip.flexivity(min(T, strip.reference_temperature), max(T, strip.reference_temperature))
    else:
        flex = strip.flexivity
    modulus = strip.flexural_modulus
    span = np.array([strip.reference_temperature, T])
    return WorkOutput(T, travel, blocked, 0.5 * blocked, 0.5 * travel, work, work / element.strip_volume(),
                      flex, modulus, modulus * flex.per_kelvin**2, strip.source, strip.data_warnings(span))


@dataclass(frozen=True, eq=False)
class WorkingSpan:
    """Usable temperature span of an element against a rigid contact, limited by stress.

    ``lower_limit``/``upper_limit`` [K]: nearest temperatures below/above the reference at which the peak
    layer stress reaches the allowable (None if not within the search range); ``overtravel`` [K]: span
    spent pushing on the contact before the limit on the contact side.
    """

    reference_temperature: float
    closing_temperature: float
    closing_direction: str
    lower_limit: float | None
    upper_limit: float | None
    overtravel: float | None
    allowable: np.ndarray
    factor: float
    curvature_source: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...] = THERMOSTAT_ASSUMPTIONS
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        return _result_dict(self)


def working_span(
    element: ThermalElement, gap: float, side: str = "auto", factor: float = 1.0,
    limit_stress: float | None = None, search=None,
) -> WorkingSpan:
    """Temperatures at which the peak layer stress reaches (limit or strength) / ``factor``, with the
    element pushing on a rigid contact after it closes (overtravel) and free on the other side."""
    set_point = closing_temperature(element, gap, side, search)
    allow = _allowables(element, factor, limit_stress)
    if np.any(np.isnan(allow)):
        raise InputError("thermostat.limit_stress", None, "a limit stress in Pa (some layers have no strength data)")
    closing = set_point.temperature

    def margin(T):
        T = np.asarray(T, float)
        beyond = (T - closing) * (1 if set_point.direction == "heating" else -1) > 0
        util = np.where(beyond, _loads(element, T, closing, factor, limit_stress)[-1],
                        _loads(element, T, None, factor, limit_stress)[-1])
        return util - 1.0

    reference = element.reference_temperature
    if margin(np.array([reference]))[0] >= 0:
        raise InputError("thermostat.limit_stress", float(allow.min()), "an allowable above the stress at the reference temperature")
    grid = _search_grid(reference, search)
    limits = {}
    for label, part in (("upper", grid[grid >= reference]), ("lower", grid[grid <= reference][::-1])):
        hit = _first_crossing(margin, reference, (float(part.min()), float(part.max()))) if part.size > 1 else None
        limits[label] = None if hit is None else hit[0]
    contact_limit = limits["upper" if set_point.direction == "heating" else "lower"]
    overtravel = None if contact_limit is None else abs(contact_limit - closing)
    warnings = set_point.warnings
    if contact_limit is not None and abs(contact_limit - reference) < abs(closing - reference):
        warnings += ("the stress limit is reached before the contact closes",)
        overtravel = 0.0
    return WorkingSpan(reference, closing, set_point.direction, limits["lower"], limits["upper"], overtravel,
                       allow, float(factor), element.strip.source, warnings)
