"""[solder_joint]: solder-joint fatigue screening, chamber life, tolerances and assembly warpage
(job: :mod:`bilayer.solder`).

The design's layers give the board (``board_layer``, default layer 1) and the component
(``component_layer``, default the top layer); the design's [conditions] give the stack and the
stress-free temperature of the warpage, which is evaluated at the extremes of the field and test
cycles (``warpage_at = "cycles"``, default) or at the design's operating temperatures ("conditions").

Keys that belong to one choice (the joint type, the life law, the acceleration set) are refused with
the others, so a file says only what is used.
"""
from __future__ import annotations

from ..core.section_spec import BOOLEAN, CHOICE, INTEGER, TEXT, Field, Location, SectionSpec

JOINT_TYPE_KEYS = {
    "chip_carrier": ("dnp",),
    "chip": ("dnp",),
    "area_array": ("dnp", "ball_pitch", "ball_columns", "ball_rows", "joint_height"),
    "leaded": ("dnp", "lead_stiffness", "joint_area"),
}
LAW_KEYS = {
    "coffin_manson": ("strain_measure", "ductility", "fatigue_exponent", "exponent_temperature_term",
                      "exponent_dwell_term", "inelastic_strain_range", "test_inelastic_strain_range"),
    "energy": ("energy_coefficient", "energy_exponent", "growth_coefficient", "growth_exponent", "crack_length",
               "energy_density", "test_energy_density"),
    "syed_2004_sac": ("energy_density", "test_energy_density"),
    "darveaux_2000_snpb": ("crack_length", "energy_density", "test_energy_density"),
    "engelmaier_wild": (),
    "by_solder": (),
}
ACCELERATION_KEYS = ("acceleration_n", "acceleration_m", "acceleration_activation")
TOLERANCE_FIELDS = ("tolerance_dnp", "tolerance_standoff", "tolerance_cte_component", "tolerance_cte_board",
                    "tolerance_factor", "tolerance_cycle")


def _only_with(values: dict, location: Location, keys, allowed, condition: str) -> None:
    for key in keys:
        if key in values and key not in allowed:
            raise location.error(key, values[key], f"only with {condition}")


def _check(values: dict, location: Location) -> dict:
    if values["cycle_high"] <= values["cycle_low"]:
        raise location.error("cycle_high", values["cycle_high"], f"above cycle_low = {values['cycle_low']:g} K")
    board = [key for key in ("board_cycle_low", "board_cycle_high") if key in values]
    if len(board) == 1:
        raise location.error(board[0], values[board[0]], "both board_cycle_low and board_cycle_high, or neither")
    if board and values["board_cycle_high"] <= values["board_cycle_low"]:
        raise location.error("board_cycle_high", values["board_cycle_high"], "above board_cycle_low")
    if "test_cycle" not in values:
        for key in ("test_dwell", "test_cycle_rate", "test_inelastic_strain_range", "test_energy_density"):
            if key in values:
                raise location.error(key, values[key], "only together with test_cycle")
    if values.get("stress_free_basis") == "solidus" and "solder_material" not in values:
        raise location.error("stress_free_basis", "solidus", "'conditions' unless solder_material is given")
    if "outline_width" in values and "outline_length" not in values:
        raise location.error("outline_width", values["outline_width"], "only together with outline_length")

    joint_type = values["joint_type"]
    every_joint_key = {key for keys in JOINT_TYPE_KEYS.values() for key in keys}
    _only_with(values, location, sorted(every_joint_key), JOINT_TYPE_KEYS[joint_type],
               f"a joint_type that uses it (this one is {joint_type!r})")
    if joint_type == "area_array":
        if ("dnp" in values) == ("ball_pitch" in values or "ball_columns" in values):
            raise location.error("dnp", values.get("dnp"), "either dnp (to the outermost ball) or ball_pitch with "
                                 "ball_columns (full array), not both")
        if "ball_pitch" in values and "ball_columns" not in values:
            raise location.error("ball_columns", None, "the number of balls along a side, with ball_pitch")
        if "ball_rows" in values and "ball_columns" not in values:
            raise location.error("ball_rows", values["ball_rows"], "only together with ball_columns")
    else:
        for key in JOINT_TYPE_KEYS[joint_type]:
            if key not in values:
                raise location.error(key, None, f"a value for joint_type {joint_type!r}", "required key is missing")

    law = values["life_law"]
    if law in ("by_solder", "engelmaier_wild") and values.get("ductility") == 0.325:
        del values["ductility"]  # files saved before the life laws carry Engelmaier's value as a default
    every_law_key = {key for keys in LAW_KEYS.values() for key in keys}
    _only_with(values, location, sorted(every_law_key), LAW_KEYS[law], f"a life_law that uses it (this one is {law!r})")
    required = {"coffin_manson": ("ductility", "fatigue_exponent"), "energy": ("energy_coefficient", "energy_exponent",
                                                                               "energy_density"),
                "syed_2004_sac": ("energy_density",), "darveaux_2000_snpb": ("crack_length", "energy_density")}
    for key in required.get(law, ()):
        if key not in values:
            raise location.error(key, None, f"a value for life_law {law!r}", "required key is missing")
    if law == "coffin_manson":
        inelastic = values.get("strain_measure", "shear") == "inelastic"
        if inelastic and "inelastic_strain_range" not in values:
            raise location.error("inelastic_strain_range", None, "the inelastic strain range per field cycle",
                                 "strain_measure = 'inelastic' uses it")
        for key in ("inelastic_strain_range", "test_inelastic_strain_range"):
            if key in values and not inelastic:
                raise location.error(key, values[key], "only with strain_measure = 'inelastic'")
    if law == "energy":
        growth = [key for key in ("growth_coefficient", "growth_exponent", "crack_length") if key in values]
        if growth and len(growth) != 3:
            raise location.error(growth[0], values[growth[0]], "growth_coefficient, growth_exponent and crack_length "
                                 "together (the crack-growth term), or none")

    user_set = values.get("acceleration_set") == "user"
    _only_with(values, location, ACCELERATION_KEYS, ACCELERATION_KEYS if user_set else (),
               "acceleration_set = 'user'")
    if user_set:
        for key in ACCELERATION_KEYS:
            if key not in values:
                raise location.error(key, None, "a value for acceleration_set = 'user'", "required key is missing")
    if "samples" in values and not values.get("monte_carlo", True):
        raise location.error("samples", values["samples"], "only with monte_carlo = true")
    return values


def _tolerance(name: str, what: str, kind: str = "dimensionless") -> Field:
    bound = {"low": 0.0, "high": 1.0} if kind == "dimensionless" else {"low": 0.0}
    return Field(name, kind, inclusive=True, doc=f"+/- tolerance on {what} (3 sigma)", **bound)


SECTION = SectionSpec(
    "solder_joint",
    (
        Field("joint_type", CHOICE, default="chip_carrier", choices=("chip_carrier", "chip", "area_array", "leaded"),
              doc="leadless chip carrier, two-terminal chip, area array (ball grid) or part with compliant leads"),
        Field("dnp", "length", low=0.0, doc="distance from the neutral point to the farthest joint (per joint type)"),
        Field("standoff", "length", required=True, low=0.0,
              doc="joint height (leadless, leads); for area arrays the package-to-board gap"),
        Field("joint_height", "length", low=0.0, doc="area arrays: solder height between the pad faces "
                                                      "(default: the stand-off)"),
        Field("ball_pitch", "length", low=0.0, doc="area arrays: ball pitch of a full array"),
        Field("ball_columns", INTEGER, low=2, inclusive=True, doc="area arrays: balls along one side"),
        Field("ball_rows", INTEGER, low=2, inclusive=True, doc="area arrays: balls along the other side (default: columns)"),
        Field("lead_stiffness", "stiffness", low=0.0, doc="leaded parts: diagonal flexural stiffness of the corner lead"),
        Field("joint_area", "area", low=0.0, doc="leaded parts: effective load-bearing solder area"),
        Field("underfill", BOOLEAN, default=False, doc="underfilled joints are outside the DNP model (refused)"),
        Field("nonideality_factor", "dimensionless", low=0.0, doc="Engelmaier's factor F (default 1, with guidance)"),
        Field("board_layer", INTEGER, default=1, low=1, inclusive=True, doc="layer number of the board"),
        Field("component_layer", INTEGER, low=1, inclusive=True, doc="layer number of the component (default: top)"),
        Field("solder_material", TEXT, doc="solder material (library key or [materials.<id>]): alloy family, local "
                                           "mismatch, solidus"),
        Field("cycle_low", "temperature", required=True, doc="lowest joint temperature of the field cycle"),
        Field("cycle_high", "temperature", required=True, doc="highest joint temperature of the field cycle"),
        Field("dwell", "time", required=True, low=0.0, doc="half-cycle dwell at each extreme"),
        Field("cycle_rate", "frequency", required=True, low=0.0, doc="field cycling rate, e.g. '1 cycles/day'"),
        Field("board_cycle_low", "temperature", doc="board's lowest temperature when it differs (power cycling)"),
        Field("board_cycle_high", "temperature", doc="board's highest temperature when it differs"),
        Field("test_cycle", TEXT, doc="test preset named by its range in degC, e.g. '-40/+125'"),
        Field("test_dwell", "time", low=0.0, doc="test dwell (default: the preset's)"),
        Field("test_cycle_rate", "frequency", low=0.0, doc="test cycling rate (default: the preset's)"),
        Field("acceleration_set", CHOICE, default="by_solder",
              choices=("by_solder", "snpb_1969", "sac_pan_2005", "sac305_2012", "user"),
              doc="Norris-Landzberg parameter set; by_solder: the one for the solder's alloy family"),
        Field("acceleration_n", "dimensionless", low=0.0, inclusive=True, doc="user set: temperature-swing exponent n"),
        Field("acceleration_m", "dimensionless", low=0.0, inclusive=True, doc="user set: frequency exponent m"),
        Field("acceleration_activation", "temperature_difference", low=0.0, inclusive=True,
              doc="user set: E_a/k (e.g. '4560 K')"),
        Field("life_law", CHOICE, default="by_solder", choices=("by_solder", "engelmaier_wild", "coffin_manson", "energy",
                                                                "syed_2004_sac", "darveaux_2000_snpb"),
              doc="life law; by_solder: the one for the solder's alloy family (none built in for lead-free)"),
        Field("accept_other_alloy", BOOLEAN, default=False,
              doc="use a law or acceleration set fitted on another alloy family (with a warning in every output)"),
        Field("strain_measure", CHOICE, choices=("shear", "inelastic"),
              doc="coffin_manson: the DNP shear strain (default) or a given inelastic strain range"),
        Field("ductility", "dimensionless", low=0.0, doc="coffin_manson: fatigue ductility coefficient eps_f'"),
        Field("fatigue_exponent", "dimensionless", doc="coffin_manson: exponent c0 (negative)"),
        Field("exponent_temperature_term", "dimensionless", doc="coffin_manson: c per degC of the mean temperature"),
        Field("exponent_dwell_term", "dimensionless", doc="coffin_manson: coefficient of ln(1 + 360/t_D[min]) in c"),
        Field("inelastic_strain_range", "strain", low=0.0, doc="coffin_manson (inelastic): strain range per field cycle"),
        Field("test_inelastic_strain_range", "strain", low=0.0, doc="the same for the test cycle (optional)"),
        Field("energy_coefficient", "dimensionless", low=0.0, doc="energy: K1, cycles to initiation at 1 MJ/m^3"),
        Field("energy_exponent", "dimensionless", doc="energy: K2 (negative)"),
        Field("growth_coefficient", "length", low=0.0, doc="energy: K3, crack growth per cycle at 1 MJ/m^3"),
        Field("growth_exponent", "dimensionless", doc="energy: K4"),
        Field("crack_length", "length", low=0.0, doc="energy laws with growth: crack length at failure (pad diameter)"),
        Field("energy_density", "energy_density", low=0.0,
              doc="energy laws: inelastic energy density per field cycle, as the law defines it"),
        Field("test_energy_density", "energy_density", low=0.0, doc="the same for the test cycle (optional)"),
        Field("weibull_shape", "dimensionless", default=4.0, low=0.0, doc="assumed Weibull shape beta"),
        Field("early_fraction", "dimensionless", default=0.01, low=0.0, high=1.0, doc="failed fraction reported"),
        _tolerance("tolerance_dnp", "the distance to the neutral point (relative)"),
        _tolerance("tolerance_standoff", "the joint height (relative)"),
        _tolerance("tolerance_cte_component", "the component's CTE (relative)"),
        _tolerance("tolerance_cte_board", "the board's CTE (relative)"),
        _tolerance("tolerance_factor", "the factor F (relative)"),
        _tolerance("tolerance_cycle", "each field-cycle temperature", "temperature_difference"),
        Field("monte_carlo", BOOLEAN, default=True, doc="run the Monte Carlo besides first-order propagation"),
        Field("samples", INTEGER, low=1, high=10_000_000, inclusive=True, doc="Monte Carlo samples (default 100000)"),
        Field("stress_free_basis", CHOICE, default="conditions", choices=("conditions", "solidus"),
              doc="warpage stress-free temperature: the [conditions] value (effective) or the solder solidus"),
        Field("warpage_at", CHOICE, default="cycles", choices=("cycles", "conditions"),
              doc="warpage at the field and test cycle extremes, or at the design's operating temperatures"),
        Field("outline_length", "length", low=0.0, doc="component length; when given, the assembly warpage is computed"),
        Field("outline_width", "length", low=0.0, doc="component width (default: the length)"),
    ),
    doc="solder joint under temperature cycling: strain by joint type, life law by alloy, chamber life, "
        "tolerances, warpage",
    check=_check,
)
