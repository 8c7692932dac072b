"""[adhesive_bond]: end shear and peel of a bonded joint (job: :mod:`bilayer.adhesive`).

The design has three layers: lower adherend, adhesive (the bond line), upper adherend. The
[conditions] stress-free temperature is the cure temperature (or the adhesive's Tg when lower);
the operating temperatures are checked one by one.
"""
from __future__ import annotations

from ..core.section_spec import CHOICE, LIST, Field, Location, SectionSpec


def _check(values: dict, location: Location) -> dict:
    sweeps = [key for key in ("sweep_bond_line", "sweep_overlap", "sweep_adhesive_modulus") if key in values]
    if "sweep_temperature" in values and not sweeps:
        raise location.error("sweep_temperature", values["sweep_temperature"], "only together with a sweep_* list")
    return values


SECTION = SectionSpec(
    "adhesive_bond",
    (
        Field("overlap", "length", required=True, low=0.0, doc="bonded overlap length"),
        Field("model", CHOICE, default="bending", choices=("bending", "no_bending"),
              doc="bending: free joint with peel; no_bending: bending prevented (Chen & Nelson)"),
        Field("allowable_shear", "stress", low=0.0, doc="allowable adhesive shear stress at temperature"),
        Field("allowable_peel", "stress", low=0.0, doc="allowable tensile peel stress at temperature"),
        Field("sweep_bond_line", "length", shape=LIST, low=0.0, doc="bond-line thicknesses to sweep"),
        Field("sweep_overlap", "length", shape=LIST, low=0.0, doc="overlap lengths to sweep"),
        Field("sweep_adhesive_modulus", "modulus", shape=LIST, low=0.0, doc="adhesive Young's moduli to sweep"),
        Field("sweep_temperature", "temperature",
              doc="temperature of the sweeps (default: the operating temperature farthest from stress-free)"),
    ),
    doc="adhesive joint: end shear and peel, Tg check, allowables, sweeps",
    check=_check,
)
