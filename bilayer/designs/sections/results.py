"""[results]: a snapshot of the engine's answer, stored beside the design for later comparison.

Values are SI numbers under the keys of ``StackResult.to_dict()`` (docs/api.md); the per-layer and
per-interface entries are arrays of tables ``[[results.layers]]`` and ``[[results.interfaces]]``.
A value that is undefined (an infinite radius, a NaN neutral axis) is written as ``nan`` inside
lists and left out elsewhere; both read back as None. The ``units`` entry of ``to_dict()`` is not
stored: the units are fixed (SI) and documented.
"""
from __future__ import annotations

import math
from typing import Any, Callable, Mapping

from ...core.section_spec import LIST, TEXT, Field, Location, SectionSpec, suggest

_NUMBER_KEYS = (
    "stress_free_temperature", "operating_temperature", "temperature_change", "axial_force", "bending_moment",
    "curvature", "radius", "bending_axis", "neutral_axis", "axial_strain", "midplane_strain", "axial_rigidity",
    "flexural_rigidity", "thermal_force", "thermal_moment", "effective_cte", "strain_energy",
)
LAYER_KEYS = ("label", "material", "thickness", "bottom", "top", "stress_bottom", "stress_top",
              "transverse_stress_bottom", "transverse_stress_top", "force")
INTERFACE_KEYS = ("height", "stress_below", "stress_above")
_TEXT_KEYS = ("label", "material", "bending_state", "restraint")

SECTION = SectionSpec(
    "results",
    (
        Field("bending_state", TEXT),
        Field("restraint", TEXT),
        *(Field(key, "dimensionless", doc="SI value (see docs/api.md)") for key in _NUMBER_KEYS),
        Field("layers", "table", shape=LIST, doc="[[results.layers]] bottom first"),
        Field("interfaces", "table", shape=LIST, doc="[[results.interfaces]] bottom first"),
        Field("warnings", TEXT, shape=LIST),
        Field("assumptions", TEXT, shape=LIST),
    ),
    doc="snapshot of StackResult.to_dict() in SI (written by save_design(results=...))",
    core=True,
)


def _number(value: Any, location: Location, key: str) -> Any:
    if isinstance(value, list):
        return [_number(item, location, f"{key}[{i}]") for i, item in enumerate(value)]
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise location.error(key, value, "an SI number (or nan for undefined)")
    return None if math.isnan(value) else float(value)


def _texts(value: Any, location: Location, key: str) -> list[str]:
    if not isinstance(value, list) or not all(isinstance(item, str) for item in value):
        raise location.error(key, value, "a list of texts")
    return list(value)


def _entry(table: Any, keys: tuple[str, ...], location: Location) -> dict:
    if not isinstance(table, Mapping):
        raise location.error("", table, "a table")
    entry = {}
    for key, value in table.items():
        if key not in keys:
            hint = "unknown key" + (f"; {suggest(key, keys)}" if suggest(key, keys) else "")
            raise location.error(key, value, "a key of " + location.table + ": " + ", ".join(keys), hint)
        if key in _TEXT_KEYS:
            if not isinstance(value, str):
                raise location.error(key, value, "a text")
            entry[key] = value
        else:
            entry[key] = _number(value, location, key)
    return entry


def read_results(table: object, source: str, line_of: Callable[[str, str], int | None]) -> dict:
    """The snapshot as a dict shaped like ``StackResult.to_dict()`` (without ``units``)."""
    location = Location(source, "[results]", lambda key: line_of("results", key))
    result = _entry({k: v for k, v in table.items() if k not in ("layers", "interfaces", "warnings", "assumptions")}
                    if isinstance(table, Mapping) else table, SECTION.keys, location)
    for name, keys in (("layers", LAYER_KEYS), ("interfaces", INTERFACE_KEYS)):
        if name in table:
            items = table[name]
            if not isinstance(items, list):
                raise location.error(name, items, f"an array of tables [[results.{name}]]")
            result[name] = [
                _entry(item, keys, Location(source, f"[[results.{name}]] {i + 1}",
                                            lambda key, p=f"results.{name}#{i}": line_of(p, key)))
                for i, item in enumerate(items)
            ]
    for name in ("warnings", "assumptions"):
        if name in table:
            result[name] = _texts(table[name], location, name)
    return result


def _nan_for_none(value: Any, in_list: bool = False) -> Any:
    if isinstance(value, (list, tuple)):
        return [_nan_for_none(item, True) for item in value]
    if value is None:
        return math.nan if in_list else None
    return value


def write_results(results: Any) -> dict:
    """TOML-ready snapshot of a StackResult or of its ``to_dict()``."""
    data = results.to_dict() if hasattr(results, "to_dict") else dict(results)
    known = set(SECTION.keys) | {"units"}
    for key in data:
        if key not in known:
            from ...core.errors import InputError

            raise InputError(f"results.{key}", data[key], "a key of StackResult.to_dict()", suggest(key, known))
    table: dict = {}
    for key in SECTION.keys:
        if key in ("layers", "interfaces") or data.get(key) is None:
            continue
        table[key] = _nan_for_none(data[key])
    for key in ("layers", "interfaces"):
        if data.get(key):
            table[key] = [{k: _nan_for_none(v) for k, v in entry.items() if v is not None} for entry in data[key]]
    return table
