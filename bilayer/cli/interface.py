"""``bilayer interface FILE [--length L] [--bond N] [--model M] [--fe] [--units si|us] [--json]``."""
from __future__ import annotations

import argparse
import json
import math
import sys
import time

import numpy as np

NAME = "interface"
HELP = "stresses along the strip: interface shear and peel near the ends; with --fe the FE trust report"
DESCRIPTION = (
    "Interface shear and peel along a free strip of the design's stack (beam-type interface model, one "
    "row per interface and operating temperature), axial force per layer at mid-length, and with --fe "
    "the 2-D finite-element check side by side with the closed forms, with flags where they are not to "
    "be trusted. Reads the [interface] table; --length and --bond give or override its values. "
    "x runs from the left end; shear is the traction on the top face of the part below, +x positive; "
    "peel > 0 is tension across the interface."
)

def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", help="design file (TOML); an [interface] table or --length is needed")
    parser.add_argument("--length", metavar="L", help="strip length, e.g. '12 mm' (overrides [interface] length)")
    parser.add_argument("--bond", type=int, action="append", metavar="N",
                        help="layer number (1 = bottom) of a bond line; repeat for several (overrides the file)")
    parser.add_argument("--model", choices=("bending", "no_bending"), help="interface model (overrides the file)")
    parser.add_argument("--fe", action="store_true", help="run the finite-element check and print the trust report")
    parser.add_argument("--no-refine", action="store_true", help="with --fe: one mesh only (no refinement study)")
    parser.add_argument("--units", choices=("si", "us"), default="si", help="display units (default si)")
    parser.add_argument("--json", action="store_true", help="print JSON with SI values instead of text")


class _Progress:
    """Progress on stderr, shown only once a run has lasted more than a few seconds."""

    def __init__(self, delay: float = 2.0):
        self.start = time.perf_counter()
        self.delay = delay
        self.shown = False

    def __call__(self, fraction: float, message: str) -> None:
        if not self.shown and (fraction >= 1.0 or time.perf_counter() - self.start < self.delay):
            return
        self.shown = True
        print(f"\rbilayer: finite-element check {100 * fraction:3.0f} % ({message})".ljust(78), end="",
              file=sys.stderr, flush=True)
        if fraction >= 1.0:
            print(file=sys.stderr)


def _design_with_options(args):
    from ..designs.design_file import read_design
    from ..core.errors import InputError
    from ..designs.sections import section
    from ..core.units import parse

    document = read_design(args.file)
    design = document.design
    values = dict(design.sections.get("interface", {}))
    if args.length is not None:
        values["length"] = parse(args.length, "length", "--length")
    if args.bond:
        values["bond_layers"] = tuple(args.bond)
    if args.model:
        values["model"] = args.model
    if "length" not in values:
        raise InputError(f"{args.file}: [interface] length", None, "a strip length in the file or --length")
    values = section("interface").normalise(values, f"{args.file} with command-line options")
    return document, design.with_section("interface", values)


def run(args: argparse.Namespace) -> int:
    from ..core.cautions import CAUTIONS
    from ..strip.assessment import check_temperature, interface_for_design, trust_report_for_design
    from ..strip.job import INTERFACE_CAUTIONS

    document, design = _design_with_options(args)
    results = interface_for_design(design)
    report = None
    if args.fe:
        report = trust_report_for_design(design, None if args.json else _Progress(),
                                         refine=False if args.no_refine else None)
    if args.json:
        data = {
            "design_name": design.name,
            "interface": [r.to_dict() for r in results],
            "trust": None if report is None else {**report.to_dict(), "temperature": check_temperature(design)},
            "cautions": list(CAUTIONS) + list(INTERFACE_CAUTIONS),
        }
        sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")
    else:
        sys.stdout.write(text(design, results, report, args.units, document.source) + "\n")
    return 0


def _value(value: float, kind: str, system: str) -> str:
    from ..core.units import format_quantity

    return format_quantity(value, kind, system) if math.isfinite(value) else "-"


def text(design, results, report=None, system: str = "si", source: str = "") -> str:
    """The plain-text output of ``bilayer interface`` (also usable by other faces)."""
    from ..core.cautions import cautions_text
    from ..strip.job import INTERFACE_CAUTIONS

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
    if report is not None:
        lines += [""] + _trust_lines(report, system, design)
    warnings = []
    for result in results:
        warnings += [w for w in result.warnings if w not in warnings]
    if warnings:
        lines += ["", "Warnings:"] + [f"  - {w}" for w in warnings]
    lines += ["", "Assumptions:"] + [f"  - {a}" for a in first.assumptions]
    lines += ["", cautions_text(INTERFACE_CAUTIONS)]
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
