"""[film]: film stress from wafer bow or curvature, Stoney and the exact bilayer (job: :mod:`bilayer.films`).

The design has two layers: substrate (layer 1) and film (layer 2). Bow > 0 when the centre is high
with the film facing up; curvature > 0 when the film side is convex.
"""
from __future__ import annotations

from ..core.section_spec import BOOLEAN, CHOICE, LIST, Field, Location, SectionSpec


def _check(values: dict, location: Location) -> dict:
    bows = [key for key in ("bow_before", "bow_after") if key in values]
    curvatures = [key for key in ("curvature_before", "curvature_after") if key in values]
    if bows and curvatures:
        raise location.error(curvatures[0], values[curvatures[0]], "either bows or curvatures, not both")
    if bows and "bow_after" not in values:
        raise location.error("bow_before", values["bow_before"], "together with bow_after")
    if curvatures and "curvature_after" not in values:
        raise location.error("curvature_before", values["curvature_before"], "together with curvature_after")
    if bows and "scan_diameter" not in values:
        raise location.error("scan_diameter", None, "a length (needed to turn bow into curvature)", "required with bows")
    scan = [key for key in ("scan_temperatures", "scan_stress_1", "scan_stress_2", "second_substrate_cte") if key in values]
    if scan and len(scan) != 4:
        missing = sorted({"scan_temperatures", "scan_stress_1", "scan_stress_2", "second_substrate_cte"} - set(scan))
        raise location.error(missing[0], None, "given together with " + ", ".join(scan))
    if scan:
        n = len(values["scan_temperatures"])
        for key in ("scan_stress_1", "scan_stress_2"):
            if len(values[key]) != n:
                raise location.error(key, values[key], f"{n} values, one per scan temperature")
    return values


SECTION = SectionSpec(
    "film",
    (
        Field("substrate_orientation", CHOICE, default="isotropic", choices=("isotropic", "100", "111"),
              doc="silicon wafer orientation for the biaxial modulus, or isotropic (E/(1-nu) of the material)"),
        Field("substrate_biaxial_modulus", "modulus", low=0.0, doc="overrides the substrate biaxial modulus"),
        Field("scan_diameter", "length", low=0.0, doc="diameter over which the bow is measured"),
        Field("bow_before", "length", doc="bow before deposition (signed)"),
        Field("bow_after", "length", doc="bow after deposition (signed)"),
        Field("curvature_before", "curvature", doc="curvature before deposition (signed)"),
        Field("curvature_after", "curvature", doc="curvature after deposition (signed)"),
        Field("film_facing", CHOICE, default="up", choices=("up", "down"), doc="film side during the measurement"),
        Field("exact_correction", BOOLEAN, default=True,
              doc="use the film material's biaxial modulus for the exact bilayer correction"),
        Field("scan_temperatures", "temperature", shape=LIST, doc="temperatures of a stress scan"),
        Field("scan_stress_1", "stress", shape=LIST, doc="film stress at those temperatures on this substrate"),
        Field("scan_stress_2", "stress", shape=LIST, doc="film stress on the second substrate"),
        Field("second_substrate_cte", "cte", doc="secant CTE of the second substrate over the scan"),
    ),
    doc="thin film on a substrate: Stoney stress from bow, exact correction, two-substrate inversion",
    check=_check,
)
