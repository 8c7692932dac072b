"""[conditions]: bending state, stress-free and operating temperatures, loads per unit width.

Delta T = T_operating - T_stress_free. Instead of ``operating_temperature`` a file may give
``temperature_change`` (a difference: "100 K", "-180 delta_degF"); it is turned into operating
temperatures on reading, so the Design always holds absolute temperatures.
"""
from __future__ import annotations

from ...core.section_spec import CHOICE, SCALAR_OR_LIST, Field, Location, SectionSpec


def _one_temperature_input(values: dict, location: Location) -> dict:
    given = [key for key in ("operating_temperature", "temperature_change") if key in values]
    if len(given) != 1:
        raise location.error(
            "operating_temperature", given or None,
            "exactly one of operating_temperature (absolute) or temperature_change (a difference)",
            "both given" if given else "neither given",
        )
    if "temperature_change" in values:
        change = values.pop("temperature_change")
        base = values["stress_free_temperature"]
        values["operating_temperature"] = (
            tuple(base + step for step in change) if isinstance(change, tuple) else base + change
        )
    return values


SECTION = SectionSpec(
    "conditions",
    (
        Field("bending_state", CHOICE, required=True, choices=("narrow", "wide", "plate"),
              doc="narrow strip (E), wide strip in cylindrical bending (plane strain), plate or disc (biaxial)"),
        Field("stress_free_temperature", "temperature", required=True,
              doc="temperature at which the bonded stack is free of stress (bonding, cure, deposition)"),
        Field("operating_temperature", "temperature", shape=SCALAR_OR_LIST,
              doc="one operating temperature or a list of them"),
        Field("temperature_change", "temperature_difference", shape=SCALAR_OR_LIST,
              doc="alternative to operating_temperature: T_operating - T_stress_free"),
        Field("axial_force", "force_per_width", default=0.0, doc="applied axial force per unit width"),
        Field("bending_moment", "moment_per_width", default=0.0, doc="applied bending moment per unit width"),
    ),
    doc="load case: bending state, temperatures and mechanical loads",
    core=True,
    check=_one_temperature_input,
)
