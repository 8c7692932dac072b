"""``bilayer interface FILE [--length L] [--bond N] [--model M] [--fe] [--units si|us] [--json]``."""
from __future__ import annotations

import argparse
import json
import sys

from .job_output import StderrProgress, print_assessment


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
    from ..strip.assessment import assess_interface_design
    from ..strip.job import JOB

    document, design = _design_with_options(args)
    progress = None if args.json else StderrProgress("finite-element check")
    assessment = assess_interface_design(design, args.fe, progress, refine=False if args.no_refine else None)
    if args.json:
        data = {"design_name": design.name, **assessment.to_dict(), "cautions": list(CAUTIONS) + list(JOB.cautions)}
        sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")
    else:
        print_assessment(args, JOB, design, assessment, document.source)
    return 0
