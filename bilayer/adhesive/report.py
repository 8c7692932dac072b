"""The text report of an adhesive-bond assessment (``bilayer bond`` and the adhesive panel)."""
from __future__ import annotations

import math

__all__ = ["report"]


def _stress(value: float, system: str) -> str:
    from ..core.units import format_quantity

    return format_quantity(value, "stress", system) if math.isfinite(value) else "-"


def report(design, assessment, system: str = "si", source: str = "") -> str:
    """Plain-text report of a :class:`bilayer.adhesive.AdhesiveAssessment`."""
    from ..core.units import format_quantity

    r = assessment.result
    j = r.joint
    title = design.name or "(unnamed design)"
    lines = [f"{title}  [{source}]" if source else title, ""]
    lines.append(f"Adhesive joint ({j.model.replace('_', ' ')} model, {j.state} state)")
    lines.append(f"  adherends            {j.lower.name} {format_quantity(j.lower_thickness, 'length', system)} / "
                 f"{j.upper.name} {format_quantity(j.upper_thickness, 'length', system)}")
    lines.append(f"  adhesive             {j.adhesive.name}, bond line {format_quantity(j.bond_line, 'length', system)}, "
                 f"E {format_quantity(j.adhesive.youngs_modulus, 'modulus', system)}, G {format_quantity(j.adhesive.shear_modulus, 'modulus', system)}")
    lines.append(f"  overlap              {format_quantity(j.overlap, 'length', system)}; stress-free "
                 f"{format_quantity(j.stress_free_temperature, 'temperature', system)}")
    lines.append(f"  shear decay length   {format_quantity(r.decay_length, 'length', system)}"
                 + (f"; peel decay length {format_quantity(r.peel_decay_length, 'length', system)}"
                    if math.isfinite(r.peel_decay_length) else ""))
    lines.append("  sign: shear on the lower adherend's top face at the right end, +x positive; peel > 0 tension")
    lines.append(f"  {'operating':>12}  {'Delta T':>10}  {'end shear':>12}  {'peel max':>12}  {'peel min':>12}")
    for i, t in enumerate(r.operating_temperatures):
        lines.append(f"  {format_quantity(t, 'temperature', system):>12}  {format_quantity(r.temperature_change[i], 'temperature_difference', system):>10}"
                     f"  {_stress(r.end_shear[i], system):>12}  {_stress(r.max_peel[i], system):>12}"
                     f"  {_stress(r.min_peel[i], system):>12}")
    if r.shear_margin is not None:
        lines.append(f"  shear margin         {r.shear_margin:.3g} (allowable {_stress(r.allowable_shear, system)})")
    if r.peel_margin is not None:
        lines.append(f"  peel margin          {r.peel_margin:.3g} (allowable {_stress(r.allowable_peel, system)})")
    units = {"bond_line": "length", "overlap": "length", "adhesive_modulus": "modulus"}
    for sweep in assessment.sweeps:
        lines.append("")
        lines.append(f"Sweep of {sweep.parameter.replace('_', ' ')} at {format_quantity(sweep.operating_temperature, 'temperature', system)}")
        lines.append(f"  {'value':>12}  {'end shear':>12}  {'peel max':>12}  {'decay length':>12}")
        for value, shear, peel, decay in zip(sweep.values, sweep.end_shear, sweep.max_peel, sweep.decay_length):
            lines.append(f"  {format_quantity(value, units[sweep.parameter], system):>12}  {_stress(shear, system):>12}  "
                         f"{_stress(peel, system):>12}  {format_quantity(decay, 'length', system):>12}")
    if r.warnings:
        lines += ["", "Warnings:"] + [f"  - {text}" for text in r.warnings]
    lines += ["", "Assumptions:"] + [f"  - {text}" for text in r.assumptions]
    return "\n".join(lines)
