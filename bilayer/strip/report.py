"""The text report of stresses along the strip and of the FE trust report (``bilayer interface``)."""
from __future__ import annotations

import math

import numpy as np

__all__ = ["report"]


def _value(value: float, kind: str, system: str) -> str:
    from ..core.units import format_quantity

    return format_quantity(value, kind, system) if math.isfinite(value) else "-"


def report(design, assessment, system: str = "si", source: str = "") -> str:
    """Plain-text report of an :class:`~bilayer.strip.assessment.InterfaceAssessment` (``bilayer interface``)."""
    results, trust = assessment.results, assessment.trust
    first = results[0]
    lines = [(design.name or "(unnamed design)") + (f"  [{source}]" if source else ""), ""]
    lines.append(f"Stresses along the strip: {first.model.replace('_', ' ')} model, {first.state.value} state, "
                 f"length {_value(first.length, 'length', system)}")
    lines.append("  shear: traction on the top face of the part below, +x positive (x from the left end, values at "
                 "the right end); peel > 0: tension across the interface")
    for result in results:
        T = design.temperatures.stress_free + result.temperature_change
        lines.append("")
        lines.append(f"operating {_value(T, 'temperature', system)}  (Delta T = "
                     f"{_value(result.temperature_change, 'temperature_difference', system)})")
        lines.append(f"  {'interface':<34} {'decay':>10} {'end shear':>11} {'peel max':>11} {'at':>10} "
                     f"{'peel min':>11} {'at':>10} {'end peel':>11}")
        for profile in result.interfaces:
            lines.append(
                f"  {profile.name[:34]:<34} {_value(profile.decay_length, 'length', system):>10} "
                f"{_value(profile.max_shear, 'stress', system):>11} {_value(profile.max_peel, 'stress', system):>11} "
                f"{_value(profile.max_peel_distance, 'length', system):>10} {_value(profile.min_peel, 'stress', system):>11} "
                f"{_value(profile.min_peel_distance, 'length', system):>10} {_value(profile.end_peel, 'stress', system):>11}"
            )
        mid = int(np.argmin(np.abs(result.x - result.half_length)))
        forces = ", ".join(f"{i + 1}: {_value(f, 'force_per_width', system)}" for i, f in enumerate(result.layer_force[mid]))
        lines.append(f"  layer forces at mid-length (per width)  {forces}")
    if trust is not None:
        lines += [""] + _trust_lines(trust, system, design)
    warnings = []
    for result in results:
        warnings += [w for w in result.warnings if w not in warnings]
    if warnings:
        lines += ["", "Warnings:"] + [f"  - {w}" for w in warnings]
    lines += ["", "Assumptions:"] + [f"  - {a}" for a in first.assumptions]
    return "\n".join(lines)


def _trust_lines(report, system: str, design) -> list[str]:
    fe = report.fe
    T = design.temperatures.stress_free + report.interface.temperature_change
    lines = [f"Finite-element check at {_value(T, 'temperature', system)}: {fe.plane}, "
             f"{fe.dofs} unknowns, {fe.elements} biquadratic elements, {fe.seconds:.2f} s"]
    if report.refinement is not None:
        study = report.refinement
        lines.append(f"  refinement ({study.runs[0].dofs} -> {study.runs[-1].dofs} unknowns): curvature changes "
                     f"{study.curvature_changes[-1]:.1e}, mid-length stress {study.stress_changes[-1]:.1e}, "
                     f"sampled shear up to {np.max(study.shear_changes, initial=0.0):.1%}, "
                     f"peel up to {np.max(study.peel_changes, initial=0.0):.1%}")
    lines.append(f"  {'quantity':<22} {'where':<58} {'closed form':>13} {'FE':>13} {'diff':>8}  check")
    for row in report.rows:
        check = "-" if row.tolerance is None else ("ok" if row.ok else f"> {row.tolerance:.1%}")
        where = row.where if row.distance is None else f"{_value(row.distance, 'length', system)} from the end, {row.location}"
        lines.append(f"  {row.quantity:<22} {where[:58]:<58} {_value(row.closed_form, row.kind, system):>13} "
                     f"{_value(row.fe, row.kind, system):>13} {row.difference:>+8.2%}  {check}")
    lines.append("  (diff: FE minus closed form over the largest closed-form value of the group)")
    lines.append("")
    lines.append("Trust flags:" if report.flags else "Trust flags: none")
    lines += [f"  [{flag.severity}] {flag.message}" for flag in report.flags]
    return lines
