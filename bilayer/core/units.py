"""Units at the edges: parse what the user typed into SI floats, convert SI floats for display.

Inside bilayer every quantity is a plain SI float: m, Pa, 1/K, K (absolute temperatures in kelvin),
N/m (force per width), N (moment per width). This module is the only place that knows about units.

* :func:`parse` takes a number (already SI), a string such as ``"0.25 mm"``, ``"10 mil"``,
  ``"28 ppm/K"``, ``"15.5e-6/degF"``, ``"120 degC"`` or ``"30 Msi"``, or a pint Quantity, checks its
  physical dimension against a *kind* (``"length"``, ``"temperature"``, ``"cte"``...) and returns the
  SI float.
* :func:`to_display` and :func:`format` convert an SI float into a readable unit of the SI or the US
  customary system (``UNIT_SYSTEMS``).

Conventions:

* ``temperature`` is absolute (kelvin inside, degC / degF on display). ``temperature_difference``
  accepts ``"100 K"``, ``"100 delta_degC"``, ``"180 delta_degF"`` and refuses ``"100 degC"``, which is
  an absolute temperature.
* A temperature unit inside a compound unit (``ppm/degF``, ``1/degC``) means a temperature step:
  ``15.5e-6/degF`` is read as 15.5e-6 per delta_degF = 27.9e-6 per K.
* ``mil`` is a thousandth of an inch (pint's own ``mil`` is a milliradian), ``Msi`` is 1e6 psi and
  ``cycles/day`` counts cycles (not radians).

pint is imported lazily (``import bilayer`` stays fast) and runs with exact rational arithmetic, so
each conversion is correctly rounded: ``parse("10 mil", "length") == 0.000254`` exactly. User text is
read by pint's own expression parser, never by ``eval``.
"""
from __future__ import annotations

import math
import numbers
import re
from dataclasses import dataclass
from fractions import Fraction
from functools import lru_cache
from typing import Any

import numpy as np

from .errors import InputError, UnitError

__all__ = [
    "UNIT_SYSTEMS",
    "Kind",
    "KINDS",
    "register_kind",
    "kind_info",
    "parse",
    "to_si",
    "to_display",
    "display_unit",
    "from_si",
    "format_quantity",
    "shown_label",
    "registry",
]

UNIT_SYSTEMS: tuple[str, ...] = ("si", "us")

_INF = math.inf
_MAX_TEXT = 100
_MAX_DECIMAL_EXPONENT = 400


@dataclass(frozen=True)
class Kind:
    """A physical kind of quantity: its SI unit, a description for messages and display units.

    ``display`` maps a unit system to ``((label, upper_bound), ...)``: the first label whose upper
    bound exceeds ``abs(value_si)`` is used. Labels are unit strings that :func:`parse` reads back.
    """

    name: str
    si_unit: str
    description: str
    examples: tuple[str, ...]
    display: dict[str, tuple[tuple[str, float], ...]]

_PSI = 6894.757293168361  # Pa per psi (lbf/in^2 with g = 9.80665 m/s^2, 1 in = 25.4 mm)


def _same(label: str) -> dict[str, tuple[tuple[str, float], ...]]:
    return {"si": ((label, _INF),), "us": ((label, _INF),)}


KINDS: dict[str, Kind] = {}


def register_kind(kind: Kind, *aliases: str) -> Kind:
    """Add a kind (and optional alias names) so that :func:`parse` and :func:`format` know it."""
    for name in (kind.name, *aliases):
        KINDS[name] = kind
    return kind


register_kind(Kind("length", "m", "a length", ("0.25 mm", "10 mil", "1.5 in"),
                   {"si": (("um", 1e-4), ("mm", 1.0), ("m", _INF)),
                    "us": (("mil", 2.54e-3), ("in", _INF))}))
register_kind(Kind("temperature", "K", "an absolute temperature", ("120 degC", "70 degF", "393.15 K"),
                   {"si": (("degC", _INF),), "us": (("degF", _INF),)}))
register_kind(Kind("temperature_difference", "K", "a temperature difference",
                   ("100 K", "100 delta_degC", "180 delta_degF"),
                   {"si": (("K", _INF),), "us": (("delta_degF", _INF),)}))
register_kind(Kind("modulus", "Pa", "an elastic modulus (a pressure)", ("200 GPa", "30 Msi", "2.1 GPa"),
                   {"si": (("kPa", 1e6), ("MPa", 1e9), ("GPa", _INF)),
                    "us": (("psi", 1e3 * _PSI), ("ksi", 1e6 * _PSI), ("Msi", _INF))}))
register_kind(Kind("stress", "Pa", "a stress (a pressure)", ("250 MPa", "36 ksi", "5000 psi"),
                   {"si": (("MPa", _INF),), "us": (("psi", 1e3 * _PSI), ("ksi", _INF))}),
              "pressure")
register_kind(Kind("cte", "1/K", "a thermal expansion coefficient (per temperature step)",
                   ("28 ppm/K", "15.5e-6/degF", "1.2e-6 1/K"),
                   {"si": (("ppm/K", _INF),), "us": (("ppm/degF", _INF),)}))
register_kind(Kind("force_per_width", "N/m", "a force per unit width", ("5 N/mm", "30 lbf/in", "5000 N/m"),
                   {"si": (("N/mm", _INF),), "us": (("lbf/in", _INF),)}))
register_kind(Kind("moment_per_width", "N", "a bending moment per unit width",
                   ("0.5 N*m/m", "2 N*mm/mm", "1 lbf*in/in"),
                   {"si": (("N*m/m", _INF),), "us": (("lbf*in/in", _INF),)}))
register_kind(Kind("force", "N", "a force", ("10 N", "2 lbf"), {"si": (("N", _INF),), "us": (("lbf", _INF),)}))
register_kind(Kind("dimensionless", "", "a plain number", ("0.3", "0.3 dimensionless"), _same("")))
register_kind(Kind("strain", "", "a strain (dimensionless)", ("1e-3", "1000 ppm", "0.1 percent"), _same("")))
register_kind(Kind("time", "s", "a time", ("30 s", "15 min", "2 h"),
                   {"si": (("s", 3600.0), ("h", _INF)), "us": (("s", 3600.0), ("h", _INF))}))
register_kind(Kind("frequency", "1/s", "a frequency", ("2 cycles/day", "1 Hz", "0.5 1/h"),
                   {"si": (("cycles/day", 1e-2), ("Hz", _INF)), "us": (("cycles/day", 1e-2), ("Hz", _INF))}))
register_kind(Kind("curvature", "1/m", "a curvature", ("0.5 1/m", "0.01 1/in", "2 1/km"),
                   {"si": (("1/m", _INF),), "us": (("1/in", _INF),)}))
register_kind(Kind("density", "kg/m^3", "a density", ("7850 kg/m^3", "8.9 g/cm^3", "0.28 lb/in^3"),
                   {"si": (("kg/m^3", _INF),), "us": (("lb/in^3", _INF),)}))
register_kind(Kind("flexural_rigidity", "N*m", "a flexural rigidity per unit width (N*m^2/m)",
                   ("1.2 N*m", "10 lbf*in"), {"si": (("N*m", _INF),), "us": (("lbf*in", _INF),)}))
register_kind(Kind("energy_per_area", "J/m^2", "an energy per unit area", ("0.5 J/m^2", "1 N/mm"),
                   {"si": (("J/m^2", _INF),), "us": (("lbf*in/in^2", _INF),)}))
register_kind(Kind("angle", "rad", "an angle", ("15 deg", "0.2 rad"), _same("deg")))
register_kind(Kind("stiffness", "N/m", "a stiffness (force per deflection)", ("50 N/mm", "300 lbf/in"),
                   {"si": (("N/mm", _INF),), "us": (("lbf/in", _INF),)}))
register_kind(Kind("area", "m^2", "an area", ("0.1 mm^2", "0.0002 in^2"),
                   {"si": (("mm^2", _INF),), "us": (("in^2", _INF),)}))
register_kind(Kind("energy_density", "J/m^3", "an energy per unit volume", ("0.2 MJ/m^3", "0.2 MPa", "30 psi"),
                   {"si": (("MJ/m^3", _INF),), "us": (("psi", _INF),)}))


def kind_info(kind: str) -> Kind:
    """Return the :class:`Kind` called ``kind`` or raise :class:`InputError` listing the known kinds."""
    try:
        return KINDS[kind]
    except (KeyError, TypeError):
        raise InputError("kind", kind, "one of " + ", ".join(sorted(KINDS))) from None


# --- the registry -------------------------------------------------------------------------------


@lru_cache(maxsize=None)
def registry() -> Any:
    """The one pint UnitRegistry of bilayer (exact rational arithmetic), created on first use."""
    import pint

    ureg = pint.UnitRegistry(non_int_type=Fraction)
    ureg.define("Msi = 1e6 * psi")
    return ureg


@lru_cache(maxsize=None)
def _dimensionality_of(si_unit: str) -> Any:
    ureg = registry()
    return ureg.Quantity(Fraction(1), ureg.parse_units(si_unit)).dimensionality


def _dimensionality(kind: Kind) -> Any:
    return _dimensionality_of(kind.si_unit)


# --- text clean-up ------------------------------------------------------------------------------

_NUMBER = r"[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?"
_LEADING_NUMBER = re.compile(rf"^\s*({_NUMBER})\s*(.*?)\s*$")
_OFFSET_TOKEN = re.compile(
    r"(?<![A-Za-z_])(degC|degF|°C|°F|℃|℉|celsius|fahrenheit|degree_Celsius|degree_Fahrenheit|degreeC|degreeF)(?![\w])",
    re.IGNORECASE,
)
_MIL_TOKEN = re.compile(r"(?<![A-Za-z_])mils?(?![\w])")
_CYCLE_TOKEN = re.compile(r"(?<![A-Za-z_])cycles?(?![\w])")
_EXPONENT_LITERAL = re.compile(r"\d[eE]([-+]?\d+)")
_POWER = re.compile(r"(\*\*|\^)")
_POWER_OK = re.compile(r"(?<=[A-Za-zµμ°_)])\s*(\*\*|\^)\s*[-+]?\d{1,2}(?![\d.*^])")
_NON_FINITE = re.compile(r"(?<![A-Za-z_])(nan|inf|infinity)(?![A-Za-z_])", re.IGNORECASE)


def _is_fahrenheit(token: str) -> bool:
    return "f" in token.lower() or token == "℉"


def _delta_name(token: str) -> str:
    return "delta_degF" if _is_fahrenheit(token) else "delta_degC"


def _normalise(text: str) -> str:
    for old, new in (("μ", "u"), ("µ", "u"), ("·", "*"), ("⋅", "*"), ("℃", "degC"), ("℉", "degF")):
        text = text.replace(old, new)
    text = _MIL_TOKEN.sub("mil_length", text)
    return _CYCLE_TOKEN.sub("count", text)


def _check_text(field: str, value: str, kind: Kind) -> str:
    """Refuse text that pint should never see (too long, non-finite, runaway powers)."""
    text = value.strip()
    if not text:
        raise UnitError(field, value, _expected(kind), "empty text")
    if len(text) > _MAX_TEXT:
        raise UnitError(field, value[:40] + "...", _expected(kind), f"text longer than {_MAX_TEXT} characters")
    if _NON_FINITE.search(text):
        raise InputError(field, value, "a finite number")
    for match in _EXPONENT_LITERAL.finditer(text):
        if abs(int(match.group(1))) > _MAX_DECIMAL_EXPONENT:
            raise InputError(field, value, "a finite number", "decimal exponent out of range")
    if len(_POWER.findall(text)) != len(_POWER_OK.findall(text)):
        raise UnitError(field, value, _expected(kind),
                        "powers are allowed only on unit names with a small integer exponent, e.g. 'kg/m^3'")
    if not re.search(r"\d", text):
        raise UnitError(field, value, _expected(kind), "no number given")
    return text


def _expected(kind: Kind) -> str:
    examples = ", ".join(repr(e) for e in kind.examples)
    si = f" or a number in {kind.si_unit}" if kind.si_unit else " or a number"
    return f"{kind.description}, e.g. {examples}{si}"


def _describe_dimension(quantity: Any) -> str:
    dims = quantity.dimensionality
    for other in KINDS.values():
        if _dimensionality(other) == dims:
            return other.description
    if not dims:
        return "a plain number without a unit"
    parts = [f"{name}^{Fraction(power)}" if power != 1 else name for name, power in dims.items()]
    return "a quantity of dimension " + " * ".join(parts)


def _to_float(field: str, value: object, magnitude: Any) -> float:
    try:
        result = float(magnitude)
    except OverflowError:
        raise InputError(field, value, "a finite number") from None
    if not math.isfinite(result):
        raise InputError(field, value, "a finite number")
    return result


# --- parsing ------------------------------------------------------------------------------------


def parse(value: object, kind: str, field: str = "value") -> float:
    """Return ``value`` as an SI float of the given kind.

    Numbers are taken as SI already (a temperature number is kelvin). Strings carry their unit
    (``"0.25 mm"``); pint Quantities are converted. Wrong dimensions and unreadable text raise
    :class:`UnitError` naming ``field``; NaN and infinity raise :class:`InputError`.
    """
    info = kind_info(kind)
    if isinstance(value, bool):
        raise InputError(field, value, _expected(info), "a boolean is not a quantity")
    if isinstance(value, numbers.Real):
        number = _to_float(field, value, value)
        if info.name == "temperature" and number < 0:
            raise InputError(field, value, "an absolute temperature >= 0 K")
        return number
    if isinstance(value, str):
        text = _check_text(field, value, info)
        return _parse_text(field, value, text, info)
    if hasattr(value, "magnitude") and hasattr(value, "units"):
        return _parse_quantity(field, value, info)
    raise InputError(field, value, _expected(info))


def _parse_quantity(field: str, value: Any, info: Kind) -> float:
    magnitude = value.magnitude
    if isinstance(magnitude, bool) or not isinstance(magnitude, numbers.Real):
        raise InputError(field, value, f"a scalar quantity: {_expected(info)}")
    number = _to_float(field, value, magnitude)
    ureg = registry()
    if getattr(value, "_REGISTRY", None) is ureg:
        unit_text = None
        units = value.units
    else:
        try:
            unit_text = _normalise(str(value.units))
        except Exception:  # a foreign object whose units cannot be printed
            raise UnitError(field, value, _expected(info), "unreadable units") from None
        units = None
    if info.name == "temperature":
        text = unit_text if unit_text is not None else str(units)
        return _parse_absolute(field, value, Fraction(number), text, info)
    if unit_text is not None:
        if info.name == "temperature_difference" and _OFFSET_TOKEN.search(unit_text):
            raise _absolute_given(field, value, Fraction(number), unit_text)
        try:
            units = ureg.parse_units(_OFFSET_TOKEN.sub(lambda m: _delta_name(m.group(1)), unit_text))
        except Exception:
            raise UnitError(field, value, _expected(info), "unknown unit") from None
    elif info.name == "temperature_difference" and not ureg.Quantity(1, units)._is_multiplicative:
        raise _absolute_given(field, value, Fraction(number), "")
    return _convert(field, value, ureg.Quantity(Fraction(number), units), info)


def _parse_text(field: str, value: str, text: str, info: Kind) -> float:
    text = _normalise(text)
    if info.name == "temperature":
        match = _LEADING_NUMBER.match(text)
        if not match:
            raise UnitError(field, value, _expected(info), "write a number followed by one temperature unit")
        return _parse_absolute(field, value, Fraction(match.group(1)), match.group(2), info)
    offset = _OFFSET_TOKEN.search(text)
    if offset and info.name == "temperature_difference":
        match = _LEADING_NUMBER.match(text)
        raise _absolute_given(field, value, Fraction(match.group(1)) if match else Fraction(100), offset.group(1))
    text = _OFFSET_TOKEN.sub(lambda m: _delta_name(m.group(1)), text)
    ureg = registry()
    try:
        quantity = ureg.parse_expression(text)
    except Exception:
        raise UnitError(field, value, _expected(info), "could not read the number or the unit") from None
    if not hasattr(quantity, "units"):
        quantity = ureg.Quantity(quantity, "dimensionless")
    return _convert(field, value, quantity, info)


def _convert(field: str, value: object, quantity: Any, info: Kind) -> float:
    if quantity.dimensionality != _dimensionality(info):
        raise UnitError(field, value, _expected(info), f"got {_describe_dimension(quantity)}")
    try:
        magnitude = quantity.to(registry().parse_units(info.si_unit)).magnitude
    except Exception:
        raise UnitError(field, value, _expected(info), "could not convert the unit") from None
    return _to_float(field, value, magnitude)


def _absolute_given(field: str, value: object, number: Fraction, token: str) -> UnitError:
    delta = _delta_name(token) if token else "delta_degC"
    shown = f"{float(number):g}"
    return UnitError(
        field, value, "a temperature difference, e.g. '100 K', '100 delta_degC' or '180 delta_degF'",
        f"{value!s} is an absolute temperature; for a difference write '{shown} {delta}'",
    )


_ABSOLUTE_UNITS = {"kelvin", "degree_Celsius", "degree_Fahrenheit", "degree_Rankine"}


def _parse_absolute(field: str, value: object, number: Fraction, unit_text: str, info: Kind) -> float:
    ureg = registry()
    unit_text = unit_text.strip()
    if not unit_text:
        raise UnitError(field, value, _expected(info), "no temperature unit given (numbers alone are kelvin)")
    try:
        units = ureg.parse_units(unit_text)
    except Exception:
        raise UnitError(field, value, _expected(info), "unknown temperature unit") from None
    items = list(units._units.items())
    if len(items) == 1 and items[0][0].startswith("delta_") and items[0][1] == 1:
        raise UnitError(field, value, _expected(info),
                        "this is a temperature difference; give an absolute temperature such as '120 degC'")
    if len(items) != 1 or items[0][0] not in _ABSOLUTE_UNITS or items[0][1] != 1:
        raise UnitError(field, value, _expected(info), "use one of K, degC, degF, degR")
    kelvin = _to_float(field, value, ureg.Quantity(number, units).to("kelvin").magnitude)
    if kelvin < 0:
        raise InputError(field, value, "an absolute temperature >= 0 K (-273.15 degC, -459.67 degF)")
    return kelvin


# --- display ------------------------------------------------------------------------------------


def display_unit(kind: str, system: str = "si", size: float = 0.0) -> str:
    """The display label for a value of about ``size`` (SI) in ``system`` ("si" or "us")."""
    info = kind_info(kind)
    if system not in UNIT_SYSTEMS:
        raise InputError("system", system, "one of " + ", ".join(UNIT_SYSTEMS))
    choices = info.display[system]
    size = abs(float(size))
    if size == 0.0 or not math.isfinite(size):
        return choices[min(1, len(choices) - 1)][0] if len(choices) > 2 else choices[0][0]
    for label, upper in choices:
        if size < upper:
            return label
    return choices[-1][0]


@lru_cache(maxsize=None)
def _factor(si_unit: str, label: str) -> Fraction:
    """SI value of one ``label`` (multiplicative units only)."""
    ureg = registry()
    text = _OFFSET_TOKEN.sub(lambda m: _delta_name(m.group(1)), _normalise(label))
    quantity = ureg.Quantity(Fraction(1), ureg.parse_units(text))
    return Fraction(quantity.to(ureg.parse_units(si_unit)).magnitude)


_OFFSETS = {"degC": (Fraction(1), Fraction("273.15")), "degF": (Fraction(5, 9), Fraction("459.67"))}


def from_si(value_si: Any, kind: str, label: str) -> Any:
    """Convert an SI value (float or numpy array) to the unit ``label`` (exact rounding for floats)."""
    info = kind_info(kind)
    if info.name == "temperature":
        scale, zero = _OFFSETS.get(label, (Fraction(1), Fraction(0)))
        if label not in _OFFSETS and label != "K":
            raise InputError("unit", label, "K, degC or degF")
        if isinstance(value_si, numbers.Real) and math.isfinite(value_si):
            shown = float(Fraction(value_si) / scale - zero)
            # 0 degC is 273.15 K only to within the rounding of the kelvin float: show it as 0
            return 0.0 if abs(shown) < 1e-12 * abs(value_si) else shown
        return value_si / float(scale) - float(zero)
    factor = _factor(info.si_unit, label)
    if isinstance(value_si, numbers.Real) and math.isfinite(value_si):
        return float(Fraction(value_si) / factor)
    return value_si / float(factor)


def to_si(value: Any, kind: str, label: str) -> Any:
    """Convert a value shown in unit ``label`` back to SI (the inverse of :func:`from_si`; exact
    rounding for floats, so a decimal typed in degC reads back as that decimal)."""
    info = kind_info(kind)
    if info.name == "temperature":
        scale, zero = _OFFSETS.get(label, (Fraction(1), Fraction(0)))
        if label not in _OFFSETS and label != "K":
            raise InputError("unit", label, "K, degC or degF")
        if isinstance(value, numbers.Real) and math.isfinite(value):
            return float((Fraction(repr(float(value))) + zero) * scale)
        return (np.asarray(value, float) + float(zero)) * float(scale)
    factor = _factor(info.si_unit, label)
    if isinstance(value, numbers.Real) and math.isfinite(value):
        return float(Fraction(repr(float(value))) * factor)
    return np.asarray(value, float) * float(factor)


def to_display(value_si: float, kind: str, system: str = "si", unit: str | None = None) -> tuple[float, str]:
    """Return ``(number, unit_label)`` showing ``value_si`` in a readable unit of ``system``.

    ``unit`` forces a label (e.g. one label for a whole table column).
    """
    label = unit if unit is not None else display_unit(kind, system, value_si)
    return from_si(value_si, kind, label), label


def format_quantity(value_si: float, kind: str, system: str = "si", digits: int = 4, unit: str | None = None) -> str:
    """Format ``value_si`` as ``"<number> <unit>"`` with ``digits`` significant digits."""
    number, label = to_display(value_si, kind, system, unit)
    text = f"{number:.{digits}g}"
    return f"{text} {label}" if label else text


_SHOWN = {"um": "µm", "degC": "°C", "degF": "°F", "delta_degF": "°F", "deg": "°"}


def shown_label(label: str) -> str:
    """How the unit ``label`` reads on screen ("µm", "°C"); the label itself is what :func:`parse`
    reads back, so entries keep it."""
    return _SHOWN.get(label, label)
