"""``bilayer thermostat FILE [--units si|us] [--json] [--samples N]``: the [thermostat] checks of a design."""
from __future__ import annotations

import argparse
import json
import sys

NAME = "thermostat"
HELP = "thermostat element of a design file: flexivity, travel, set point, force, stress span, tolerances"
DESCRIPTION = (
    "Read a design file with a [thermostat] table and print the element's flexivity (ASTM B106), travel "
    "versus temperature, set point (or the gap for a required set point), contact force after overtravel, "
    "usable span against the stress limit, work output and set-point scatter. Travel is along the strip's "
    "top face (+z) at the clamp; curvature is positive when the top face is convex. Thermal protectors and "
    "cut-outs are safety devices: read the cautions printed with the results."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", help="design file (TOML) with a [thermostat] table")
    parser.add_argument("--units", choices=("si", "us"), default="si", help="display units (default si)")
    parser.add_argument("--json", action="store_true", help="print JSON with SI values instead of a summary")
    parser.add_argument("--samples", type=int, metavar="N", help="Monte Carlo samples (overrides the file)")
    parser.add_argument("--no-monte-carlo", action="store_true", help="first-order tolerance propagation only")
    parser.add_argument("--optimum-ratio", action="store_true",
                        help="also print the thickness ratio of the two layers that maximises the flexivity")
    parser.add_argument("--rank-pairs", choices=("flexivity", "merit"), metavar="BY",
                        help="also rank library material pairs by 'flexivity' or 'merit' (E*F^2) within the stress limit")


def run(args: argparse.Namespace) -> int:
    from ..core.cautions import CAUTIONS, cautions_text
    from ..designs.design_file import read_design
    from ..core.errors import InputError
    from ..core.jsonable import plain
    from ..thermostat.assessment import analyse
    from .job_output import StderrProgress

    design = read_design(args.file).design
    if "thermostat" not in design.sections:
        raise InputError(f"{args.file}: [thermostat]", None, "a [thermostat] table in the design file")
    changes = {}
    if args.samples is not None:
        if args.samples < 1:
            raise InputError("--samples", args.samples, "a positive number of samples")
        changes["samples"] = args.samples
    if args.no_monte_carlo:
        changes["monte_carlo"] = False
    if changes:
        design = design.with_section("thermostat", {**design.sections["thermostat"], **changes})
    samples = design.sections["thermostat"].get("samples", 0)
    show_progress = not args.json and design.sections["thermostat"].get("monte_carlo") and samples >= 500_000
    report = analyse(design, progress=StderrProgress("Monte Carlo", delay=0.0) if show_progress else None)
    extra, text = {}, []
    if args.optimum_ratio:
        extra["optimum_ratio"] = _optimum(report, design)
        o = extra["optimum_ratio"]
        text.append(f"optimum thickness ratio bottom/top {o['ratio']:.4g} ({o['bottom']} / {o['top']}): flexivity "
                    f"{o['flexivity']:.4g} 1/K = {o['flexivity_over_cte_difference']:.4f} x the CTE difference")
    if args.rank_pairs:
        rows = _ranking(report, design.sections["thermostat"], args.rank_pairs)
        extra["ranked_pairs"] = [row.to_dict() for row in rows]
        text.append(f"library pairs ranked by {args.rank_pairs} (optimum ratio, cantilever tip blocked over the curve range):")
        for row in rows[:10]:
            status = "ok" if row.admissible else ("no strength data" if row.note else "over the stress limit")
            text.append(f"  {row.bottom} / {row.top}: F {row.flexivity:.4g} 1/K, E_f F^2 {row.merit:.4g} Pa/K^2, "
                        f"utilisation {row.utilisation:.3g} ({status})")
    if args.json:
        data = {**report.to_dict(), **extra, "cautions": list(CAUTIONS) + list(report.cautions)}
        sys.stdout.write(json.dumps(plain(data), indent=2, allow_nan=False) + "\n")
    else:
        body = report.to_text(args.units, cautions=False)
        if text:
            body += "\n" + "\n".join(text)
        sys.stdout.write(body + "\n\n" + cautions_text(report.cautions) + "\n")
    return 0


def _optimum(report, design) -> dict:
    from ..core.errors import InputError
    from ..thermostat.sizing import optimum_thickness_ratio

    stack = design.stack
    if stack.n_layers != 2:
        raise InputError("--optimum-ratio", stack.n_layers, "a two-layer stack")
    curve = report.curve.temperatures
    return optimum_thickness_ratio(stack[0].material, stack[1].material, design.state.value,
                                   stack.total_thickness, float(curve.min()), float(curve.max())).to_dict()


def _ranking(report, values, by: str):
    from ..thermostat.sizing import rank_pairs

    curve = report.curve.temperatures
    return rank_pairs(temperature_low=float(curve.min()), temperature_high=float(curve.max()),
                      factor=values.get("stress_factor", 1.0), limit_stress=values.get("limit_stress"),
                      state=report.element.strip.state.value, by=by)
