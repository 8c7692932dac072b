"""[thermostat]: a thermostat or sensor element made of the design's stack (or of a data-sheet flexivity).

The strip is the design's [[layer]] stack in the [conditions] bending state, stress-free at the stated
stress-free temperature; ``reference_temperature`` is where the element shape and the gap are given.
Giving ``flexivity`` (with ``strip_thickness`` and ``flexural_modulus``) switches to the labelled
"flexivity from a data sheet" path, and the layers are then not used for curvature.
"""
from __future__ import annotations

from ..core.section_spec import BOOLEAN, CHOICE, INTEGER, Field, Location, SectionSpec

FORMS = ("cantilever", "supported", "u_shape", "spiral", "helix", "disc")
_NEEDS = {
    "cantilever": ("length",),
    "supported": ("length",),
    "u_shape": ("leg_length", "bend_radius"),
    "spiral": ("length",),
    "helix": ("length",),
    "disc": ("diameter",),
}
_TOLERANCES = ("tolerance_thickness", "tolerance_length", "tolerance_cte", "tolerance_modulus",
               "tolerance_flexivity", "tolerance_gap")


def _consistent(values: dict, location: Location) -> dict:
    form = values["form"]
    for key in _NEEDS[form]:
        if key not in values:
            raise location.error(key, None, f"a value: form {form!r} needs {', '.join(_NEEDS[form])}", "required key is missing")
    coil = form in ("spiral", "helix")
    if coil and "gap" in values:
        raise location.error("gap", values["gap"], "angle_gap for a coil (its output is a rotation)")
    if not coil and "angle_gap" in values:
        raise location.error("angle_gap", values["angle_gap"], "gap (a length) for this form")
    if "sizing_force" in values:
        if coil or form == "disc" or "flexivity" in values:
            raise location.error("sizing_force", values["sizing_force"], "a strip form (cantilever, supported, u_shape) with layers")
        for key in ("set_point", "gap"):
            if key not in values:
                raise location.error(key, None, "a value when sizing_force is given (travel gap at set_point)", "required key is missing")
        if not values.get("overtravel"):
            raise location.error("overtravel", values.get("overtravel"), "> 0 K when sizing_force is given")
    elif "set_point" in values and ("gap" in values or "angle_gap" in values):
        raise location.error("set_point", values["set_point"], "either set_point (gap is then solved) or a gap, not both")
    if "flexivity" in values:
        for key in ("strip_thickness", "flexural_modulus"):
            if key not in values:
                raise location.error(key, None, "a value when flexivity is taken from a data sheet", "required key is missing")
    elif "strip_thickness" in values:
        raise location.error("strip_thickness", values["strip_thickness"], "only with flexivity (the layers give the thickness)")
    if "dome_height" in values and form != "disc":
        raise location.error("dome_height", values["dome_height"], "only for form = 'disc' (snap-disc estimate)")
    if ("curve_from" in values) != ("curve_to" in values):
        raise location.error("curve_to", values.get("curve_to"), "both curve_from and curve_to, or neither")
    if any(key in values for key in _TOLERANCES) and not any(key in values for key in ("gap", "angle_gap", "set_point")):
        raise location.error("tolerance_gap", None, "a gap, angle_gap or set_point for the tolerance analysis")
    return values


SECTION = SectionSpec(
    "thermostat",
    (
        Field("form", CHOICE, required=True, choices=FORMS,
              doc="cantilever, supported (two supports, ends sliding), u_shape (hairpin), spiral, helix, disc"),
        Field("width", "length", required=True, low=0.0, doc="strip width"),
        Field("length", "length", low=0.0, doc="free length (cantilever), span (supported), coil strip length"),
        Field("leg_length", "length", low=0.0, doc="u_shape: length of each leg"),
        Field("bend_radius", "length", low=0.0, doc="u_shape: centre-line radius of the half-turn"),
        Field("bend_toward", CHOICE, default="top", choices=("top", "bottom"),
              doc="u_shape: face of the clamped leg on which the second leg lies"),
        Field("pointer_length", "length", low=0.0, inclusive=True, doc="spiral/helix: pointer radius"),
        Field("lead_angle", "angle", low=0.0, inclusive=True, doc="helix: lead angle"),
        Field("diameter", "length", low=0.0, doc="disc diameter"),
        Field("reference_temperature", "temperature",
              doc="temperature at which the shape and gap are given (default: the stress-free temperature)"),
        Field("flexivity", "cte", doc="flexivity from a data sheet (ASTM B106; per K or per degF)"),
        Field("strip_thickness", "length", low=0.0, doc="data-sheet path: strip thickness"),
        Field("flexural_modulus", "modulus", low=0.0, doc="data-sheet path: flexural modulus of the strip"),
        Field("poisson_ratio", "dimensionless", default=0.3, low=-1.0, high=0.5,
              doc="data-sheet path: Poisson's ratio (discs)"),
        Field("gap", "length", low=0.0, doc="distance from the working point to the contact at the reference temperature"),
        Field("angle_gap", "angle", low=0.0, doc="coils: rotation to the stop at the reference temperature"),
        Field("set_point", "temperature", doc="required closing temperature (the gap is then solved)"),
        Field("contact_side", CHOICE, default="auto", choices=("auto", "top", "bottom"),
              doc="side of the contact: auto = the side the element moves toward on heating"),
        Field("limit_stress", "stress", low=0.0,
              doc="maximum design stress of the strip (else each layer's strength)"),
        Field("stress_factor", "dimensionless", default=1.0, low=0.0, doc="allowable = limit / factor"),
        Field("overtravel", "temperature_difference", default=10.0, low=0.0, inclusive=True,
              doc="temperature beyond the set point at which the contact force is reported"),
        Field("curve_from", "temperature", doc="start of the travel-versus-temperature curve"),
        Field("curve_to", "temperature", doc="end of the travel-versus-temperature curve"),
        Field("curve_points", INTEGER, default=101, low=2, high=100000, inclusive=True, doc="points on the curve"),
        Field("tolerance_thickness", "dimensionless", low=0.0, inclusive=True,
              doc="+/- relative tolerance on the strip thickness (3 sigma)"),
        Field("tolerance_length", "dimensionless", low=0.0, inclusive=True, doc="+/- relative tolerance on lengths"),
        Field("tolerance_cte", "dimensionless", low=0.0, inclusive=True, doc="+/- relative tolerance on each layer's CTE"),
        Field("tolerance_modulus", "dimensionless", low=0.0, inclusive=True,
              doc="+/- relative tolerance on each layer's modulus"),
        Field("tolerance_flexivity", "dimensionless", low=0.0, inclusive=True,
              doc="data-sheet path: +/- relative tolerance on the flexivity"),
        Field("tolerance_gap", "length", low=0.0, inclusive=True, doc="+/- tolerance on the gap (or on the angle for coils, in rad)"),
        Field("samples", INTEGER, default=200000, low=1, high=100000000, inclusive=True, doc="Monte Carlo samples"),
        Field("sizing_force", "force", low=0.0,
              doc="solve thickness and length: travel `gap` at `set_point`, then push this force after `overtravel`"),
        Field("dome_height", "length", doc="disc: formed dome rise for the indicative snap-disc estimate (signed)"),
        Field("monte_carlo", BOOLEAN, default=True, doc="run the Monte Carlo besides first-order propagation"),
    ),
    doc="thermostat or sensor element: form, contact, stress limit, tolerances",
    check=_consistent,
)
