"""[materials.<id>]: materials defined inside a design file.

The tables follow the material-file format of :mod:`bilayer.core.materials` (docs/materials.md), so a
table can be copied between a material file and a design file. One extra optional key, ``key``,
sets the material's key when it differs from the table id. Layers refer to these tables by id.
"""
from __future__ import annotations

import warnings
from dataclasses import replace
from typing import Any, Callable, Mapping

from ...core.errors import DesignFileError, InputError
from ...core.section_spec import LIST, TABLE, TEXT, Field, Location, SectionSpec, exact_text, suggest

SECTION = SectionSpec(
    "materials",
    (
        Field("name", TEXT, required=True, doc="material name shown in tables"),
        Field("key", TEXT, doc="material key when it differs from the table id"),
        Field("category", TEXT),
        Field("composition", TEXT, doc="nominal alloy composition, e.g. 'Sn-3.0Ag-0.5Cu' (solders: selects the life law)"),
        Field("youngs_modulus", "modulus", required=True),
        Field("poisson_ratio", "dimensionless", required=True),
        Field("cte", "cte", required=True, doc="a constant or a table with kind = ... (docs/materials.md)"),
        Field("density", "density"),
        Field("strength", "stress"),
        Field("strength_kind", TEXT, doc="yield, tensile, flexural..."),
        Field("temperature_range", "temperature", shape=LIST),
        Field("temperature_range_C", "dimensionless", shape=LIST),
        Field("glass_transition", "temperature"),
        Field("glass_transition_C", "dimensionless"),
        Field("solidus", "temperature"),
        Field("solidus_C", "dimensionless"),
        Field("notes", TEXT),
        Field("sources", TABLE, doc="field name = where the value comes from"),
    ),
    doc="custom materials, one table per id, in the material-file format",
    core=True,
)

_RANGE = ("valid_range", "valid_range_C")
CTE_KEYS: dict[str, tuple[str, ...]] = {
    "constant": ("kind", "value", "measured", "measured_C", *_RANGE),
    "mean_table": ("kind", "reference", "reference_C", "temperatures", "temperatures_C", "values", *_RANGE),
    "instantaneous_table": ("kind", "temperatures", "temperatures_C", "values", *_RANGE),
    "silicon_okada_tokumaru": ("kind",),
}


def _check_cte_table(cte: Mapping, location: Location) -> None:
    kind = cte.get("kind")
    if kind not in CTE_KEYS:
        hint = suggest(kind, CTE_KEYS) if isinstance(kind, str) else ""
        raise location.error("kind", kind, "one of " + ", ".join(repr(k) for k in CTE_KEYS), hint)
    allowed = CTE_KEYS[kind]
    for key in cte:
        if key not in allowed:
            hint = "unknown key" + (f"; {suggest(key, allowed)}" if suggest(key, allowed) else "")
            raise location.error(key, cte[key], f"a key of a {kind} CTE table: " + ", ".join(allowed), hint)


def read_materials(table: object, source: str, line_of: Callable[[str, str], int | None]) -> dict[str, Any]:
    """Materials of the [materials] tables by id; errors name the table and key."""
    from ...core.materials import MaterialLibrary
    from ...core.materials.library import warn_if_unit_slip

    top = Location(source, "[materials]", lambda key: line_of("materials", key))
    if not isinstance(table, Mapping):
        raise top.error("", table, "tables [materials.<id>] of material properties")
    found: dict[str, Any] = {}
    for material_id, body in table.items():
        path = f"materials.{material_id}"
        location = Location(source, f"[{path}]", lambda key, path=path: line_of(path, key))
        if not isinstance(body, Mapping):
            raise location.error("", body, f"a table [materials.{material_id}] of material properties")
        SECTION.check_keys(body, location)
        for item in SECTION.fields:
            if item.required and item.name not in body:
                raise location.error(item.name, None, item._describe(), "required key is missing")
        key = body.get("key", material_id)
        if not isinstance(key, str):
            raise location.error("key", key, "a text")
        if isinstance(body["cte"], Mapping):
            cte_path = f"{path}.cte"
            _check_cte_table(body["cte"], Location(source, f"[{cte_path}]", lambda k: line_of(cte_path, k)))
        document = {"materials": {material_id: {k: v for k, v in body.items() if k != "key"}}}
        try:
            library = MaterialLibrary.from_document(document, where=source)
        except DesignFileError as error:
            raise _relocated(error, source, material_id, location) from None
        except InputError as error:
            raise location.wrap(error.field, error) from None
        material = library[material_id]
        if key != material.key:
            with warnings.catch_warnings():  # the checks already warned once for this material
                warnings.simplefilter("ignore")
                material = replace(material, key=key)
        warn_if_unit_slip(material)
        found[material_id] = material
    return found


def _relocated(error: DesignFileError, source: str, material_id: str, location: Location) -> DesignFileError:
    """Put the design file's own location (with line number) on an error of the material reader."""
    prefix = f"{source} [materials.{material_id}]: "
    if error.field.startswith(prefix):
        key = error.field[len(prefix):]
        message = str(error.args[0])
        base = f"{error.field}: {error.value!r} is not valid; expected {error.valid}"
        hint = message[len(base) + 2:-1] if message.startswith(base + " (") else ""
        return location.error(key, error.value, error.valid, hint)
    return error


_QUANTITY_KEYS = {"youngs_modulus": "modulus", "density": "density", "strength": "stress",
                  "glass_transition": "temperature", "solidus": "temperature"}
_CTE_TEMPERATURE_KEYS = ("reference", "temperatures", "valid_range", "measured")


def write_material(material: Any, system: str = "si") -> dict:
    """The [materials.<id>] table of a material, quantities as exact unit texts."""
    from ...core.materials import ConstantCTE, material_to_table

    table = material_to_table(material)
    for key, kind in _QUANTITY_KEYS.items():
        if key in table:
            table[key] = exact_text(table[key], kind, system)
    if "temperature_range" in table:
        table["temperature_range"] = [exact_text(t, "temperature", system) for t in table["temperature_range"]]
    cte = material.cte
    plain_constant = (
        isinstance(cte, ConstantCTE) and cte.reference_range is None and cte.valid_range == material.temperature_range
    )
    if plain_constant:
        table["cte"] = exact_text(cte.value, "cte", system)
    else:
        cte_table = dict(table["cte"])
        for key in _CTE_TEMPERATURE_KEYS:
            if key in cte_table:
                value = cte_table[key]
                cte_table[key] = ([exact_text(t, "temperature", system) for t in value]
                                  if isinstance(value, list) else exact_text(value, "temperature", system))
        if "value" in cte_table:
            cte_table["value"] = exact_text(cte_table["value"], "cte", system)
        if "values" in cte_table:
            cte_table["values"] = [exact_text(v, "cte", system) for v in cte_table["values"]]
        table["cte"] = cte_table
    ordered = {key: table[key] for key in SECTION.keys if key in table}
    ordered.update({key: value for key, value in table.items() if key not in ordered})
    return ordered
