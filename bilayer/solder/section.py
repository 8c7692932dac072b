"""[solder_joint]: solder-joint fatigue screening and assembly warpage (job: :mod:`bilayer.solder`).

The design's layers give the board (``board_layer``, default layer 1) and the component
(``component_layer``, default the top layer); the design's [conditions] give the stress-free and
operating temperatures of the warpage calculation.
"""
from __future__ import annotations

from ..core.section_spec import CHOICE, INTEGER, TEXT, Field, Location, SectionSpec


def _check(values: dict, location: Location) -> dict:
    if values["cycle_high"] <= values["cycle_low"]:
        raise location.error("cycle_high", values["cycle_high"], f"above cycle_low = {values['cycle_low']:g} K")
    board = [key for key in ("board_cycle_low", "board_cycle_high") if key in values]
    if len(board) == 1:
        raise location.error(board[0], values[board[0]], "both board_cycle_low and board_cycle_high, or neither")
    if board and values["board_cycle_high"] <= values["board_cycle_low"]:
        raise location.error("board_cycle_high", values["board_cycle_high"], "above board_cycle_low")
    if "test_cycle" not in values:
        for key in ("test_dwell", "test_cycle_rate"):
            if key in values:
                raise location.error(key, values[key], "only together with test_cycle")
    if values.get("stress_free_basis") == "solidus" and "solder_material" not in values:
        raise location.error("stress_free_basis", "solidus", "'conditions' unless solder_material is given")
    if "outline_width" in values and "outline_length" not in values:
        raise location.error("outline_width", values["outline_width"], "only together with outline_length")
    return values


SECTION = SectionSpec(
    "solder_joint",
    (
        Field("dnp", "length", required=True, low=0.0, doc="distance from the neutral point to the joint"),
        Field("standoff", "length", required=True, low=0.0, doc="solder joint height"),
        Field("nonideality_factor", "dimensionless", default=1.0, low=0.0, doc="Engelmaier's factor F"),
        Field("board_layer", INTEGER, default=1, low=1, inclusive=True, doc="layer number of the board"),
        Field("component_layer", INTEGER, low=1, inclusive=True, doc="layer number of the component (default: top)"),
        Field("solder_material", TEXT, doc="solder material (library key or [materials.<id>]) for local mismatch and solidus"),
        Field("cycle_low", "temperature", required=True, doc="lowest joint temperature of the field cycle"),
        Field("cycle_high", "temperature", required=True, doc="highest joint temperature of the field cycle"),
        Field("dwell", "time", required=True, low=0.0, doc="half-cycle dwell at each extreme"),
        Field("cycle_rate", "frequency", required=True, low=0.0, doc="field cycling rate, e.g. '1 cycles/day'"),
        Field("board_cycle_low", "temperature", doc="board's lowest temperature when it differs (power cycling)"),
        Field("board_cycle_high", "temperature", doc="board's highest temperature when it differs"),
        Field("test_cycle", TEXT, doc="test preset named by its range in degC, e.g. '-40/+125'"),
        Field("test_dwell", "time", low=0.0, doc="test dwell (default: the preset's)"),
        Field("test_cycle_rate", "frequency", low=0.0, doc="test cycling rate (default: the preset's)"),
        Field("acceleration_set", CHOICE, default="snpb_1969", choices=("snpb_1969", "sac_pan_2005", "sac305_2012"),
              doc="Norris-Landzberg parameter set"),
        Field("weibull_shape", "dimensionless", default=4.0, low=0.0, doc="assumed Weibull shape beta"),
        Field("early_fraction", "dimensionless", default=0.01, low=0.0, high=1.0, doc="failed fraction reported"),
        Field("ductility", "dimensionless", default=0.325, low=0.0, doc="fatigue ductility coefficient eps_f'"),
        Field("stress_free_basis", CHOICE, default="conditions", choices=("conditions", "solidus"),
              doc="warpage stress-free temperature: the [conditions] value (effective) or the solder solidus"),
        Field("outline_length", "length", low=0.0, doc="component length; when given, the assembly warpage is computed"),
        Field("outline_width", "length", low=0.0, doc="component width (default: the length)"),
    ),
    doc="solder joint under temperature cycling: DNP strain, Engelmaier life, acceleration, warpage",
    check=_check,
)
