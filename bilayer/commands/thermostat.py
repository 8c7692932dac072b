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


def _progress(done: int, total: int) -> None:
    print(f"\rbilayer: Monte Carlo {done}/{total} samples ({100 * done / total:.0f} %)", end="", file=sys.stderr)
    if done == total:
        print(file=sys.stderr)


def run(args: argparse.Namespace) -> int:
    from ..cautions import CAUTIONS, cautions_text
    from ..design_file import read_design
    from ..errors import InputError
    from ..thermostat_report import analyse

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
    report = analyse(design, progress=_progress if show_progress else None)
    if args.json:
        data = {**report.to_dict(), "cautions": list(CAUTIONS) + list(report.cautions)}
        sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")
    else:
        sys.stdout.write(report.to_text(args.units, cautions=False) + "\n\n" + cautions_text(report.cautions) + "\n")
    return 0
