"""[interface]: stresses along the strip and the finite-element check (job: :mod:`bilayer.strip.assessment`).

Example::

    [interface]
    length = "12 mm"                 # strip length; both ends free
    bond_layers = [2]                # layer numbers (1 = bottom) that are bond lines: shear and peel only
    model = "bending"                # or "no_bending" (Chen & Nelson limit; every interface needs a bond)
    sample_distances = ["0.05 mm", "0.1 mm", "0.5 mm"]   # where shear and peel are compared with FE
    width = "8 mm"                   # optional: lets the trust report judge the bending state
"""
from __future__ import annotations

from ..core.section_spec import BOOLEAN, CHOICE, INTEGER, LIST, Field, Location, SectionSpec


def _check(values: dict, location: Location) -> dict:
    bonds = values.get("bond_layers", ())
    if len(set(bonds)) != len(bonds):
        raise location.error("bond_layers", list(bonds), "different layer numbers")
    return values


SECTION = SectionSpec(
    "interface",
    (
        Field("length", "length", required=True, low=0.0, high=100.0, doc="strip length along x; both ends are free"),
        Field("bond_layers", INTEGER, shape=LIST, low=2, inclusive=True,
              doc="layer numbers (1 = bottom) of bond lines (adhesive, solder, die attach): shear only"),
        Field("model", CHOICE, default="bending", choices=("bending", "no_bending"),
              doc="bending: Suhir-type with peel; no_bending: Chen & Nelson limit (bending prevented)"),
        Field("points", INTEGER, default=401, low=3, high=100000, inclusive=True,
              doc="positions along the strip in the closed-form profiles"),
        Field("sample_distances", "length", shape=LIST, low=0.0,
              doc="distances from the end where shear and peel are compared with FE (never 0: the corner)"),
        Field("check_temperature", "temperature",
              doc="operating temperature of the FE check (default: the one farthest from stress-free)"),
        Field("width", "length", low=0.0, doc="strip width, for the bending-state advice of the trust report"),
        Field("layer_elements", INTEGER, default=8, low=2, high=200, inclusive=True,
              doc="FE elements through each layer (graded toward its faces)"),
        Field("refine", BOOLEAN, default=True, doc="also run the FE mesh with every element halved and report the change"),
    ),
    doc="stresses along the strip: interface shear and peel, bond layers, FE check and trust report",
    check=_check,
)
