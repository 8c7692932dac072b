"""``bilayer evaluate FILE [--units si|us] [--json]``: curvature and layer stresses of a design file."""
from __future__ import annotations

import argparse
import json
import math
import sys

import numpy as np

NAME = "evaluate"
HELP = "evaluate a design file: layer stresses, curvature, bending axis, effective CTE"
DESCRIPTION = (
    "Read a design file, run the stack engine and print a table (or JSON with --json). "
    "Layers are numbered from the bottom; stress is positive in tension; curvature is positive "
    "when the top face is convex; Delta T = T_operating - T_stress_free."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", help="design file (TOML, see docs/design-file.md)")
    parser.add_argument("--units", choices=("si", "us"), default="si", help="display units of the table (default si)")
    parser.add_argument("--json", action="store_true",
                        help="print JSON with SI values under the keys of StackResult.to_dict() instead of a table")


def run(args: argparse.Namespace) -> int:
    from ..core.cautions import CAUTIONS
    from ..designs.design_file import read_design

    document = read_design(args.file)
    result = document.design.evaluate()
    if args.json:
        data = {**result.to_dict(), "design_name": document.design.name, "cautions": list(CAUTIONS)}
        sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")
    else:
        sys.stdout.write(report(document.design, result, args.units, source=document.source) + "\n")
    return 0


def _at(value, index: int | None) -> float:
    array = np.asarray(value, float)
    return float(array if index is None or array.ndim == 0 else array[index])


def _bending_sense(curvature: float) -> str:
    if curvature > 0:
        return "top face convex"
    if curvature < 0:
        return "bottom face convex"
    return "flat"


def report(design, result, system: str = "si", source: str = "") -> str:
    """The plain-text table printed by ``bilayer evaluate`` (also usable by other faces)."""
    from ..core.cautions import cautions_text
    from ..core.units import display_unit
    from ..core.units import format_quantity

    lines = []
    title = design.name or "(unnamed design)"
    lines.append(f"{title}  [{source}]" if source else title)
    lines.append(f"bending state    {result.state.value}: {result.state.description}")
    lines.append(f"stress-free      {format_quantity(result.stress_free_temperature, 'temperature', system)}")
    if design.axial_force or design.bending_moment:
        lines.append(f"applied loads    axial force {format_quantity(design.axial_force, 'force_per_width', system)}, "
                     f"bending moment {format_quantity(design.bending_moment, 'moment_per_width', system)} (per unit width)")
    operating = np.asarray(result.operating_temperature, float)
    indices = [None] if operating.ndim == 0 else list(range(operating.size))
    transverse = result.state.value != "narrow"
    stresses = [np.asarray(result.stress_bottom), np.asarray(result.stress_top)]
    if transverse:
        stresses += [np.asarray(result.transverse_stress_bottom), np.asarray(result.transverse_stress_top)]
    biggest = max(float(np.max(np.abs(s))) if s.size else 0.0 for s in stresses)
    stress_unit = display_unit("stress", system, biggest)
    names = [layer.label + f" ({layer.material.name})" if layer.label else layer.material.name for layer in design.stack]
    name_width = max(20, *(len(n) for n in names))
    for index in indices:
        lines.append("")
        change = _at(result.temperature_change, index)
        lines.append(f"operating        {format_quantity(_at(result.operating_temperature, index), 'temperature', system)}"
                     f"   (Delta T = {format_quantity(change, 'temperature_difference', system)})")
        header = f"  {'#':>2}  {'layer (top first)':<{name_width}}  {'thickness':>12}  {'stress bottom':>15}  {'stress top':>15}"
        if transverse:
            header += f"  {'transverse bottom':>17}  {'transverse top':>15}"
        lines.append(header)
        for number in range(result.n_layers, 0, -1):
            i = number - 1
            row = (f"  {number:>2}  {names[i]:<{name_width}}  "
                   f"{format_quantity(design.stack[i].thickness, 'length', system):>12}  "
                   f"{format_quantity(_row(result.stress_bottom, index, i), 'stress', system, unit=stress_unit):>15}  "
                   f"{format_quantity(_row(result.stress_top, index, i), 'stress', system, unit=stress_unit):>15}")
            if transverse:
                row += (f"  {format_quantity(_row(result.transverse_stress_bottom, index, i), 'stress', system, unit=stress_unit):>17}"
                        f"  {format_quantity(_row(result.transverse_stress_top, index, i), 'stress', system, unit=stress_unit):>15}")
            lines.append(row)
        curvature = _at(result.curvature, index)
        radius = _at(result.radius, index)
        lines.append(f"  curvature      {format_quantity(curvature, 'curvature', system)}   ({_bending_sense(curvature)})")
        lines.append("  radius         " + (format_quantity(radius, 'length', system) if math.isfinite(radius) else "infinite (flat)"))
        lines.append(f"  bending axis   {format_quantity(result.bending_axis, 'length', system)} above the bottom face")
        cte = _at(result.effective_cte, index)
        lines.append("  effective CTE  " + (format_quantity(cte, 'cte', system) if math.isfinite(cte) else "undefined (Delta T = 0)"))
    if result.warnings:
        lines.append("")
        lines.append("Warnings:")
        lines.extend(f"  - {warning}" for warning in result.warnings)
    lines.append("")
    lines.append("Assumptions:")
    lines.extend(f"  - {assumption}" for assumption in result.assumptions)
    lines.append("")
    lines.append(cautions_text())
    return "\n".join(lines)


def _row(values, index: int | None, layer: int) -> float:
    array = np.asarray(values, float)
    return float(array[layer] if index is None or array.ndim == 1 else array[index, layer])
