"""``bilayer report FILE -o OUT.html [--units si|us]``: a self-contained offline HTML report of a record."""
from __future__ import annotations

import argparse
import sys

NAME = "report"
HELP = "write a self-contained HTML report of a design record (opens offline)"
DESCRIPTION = (
    "Write one HTML file with the review state, a fresh drift check, the cautions, provenance, inputs, "
    "the recorded results in the chosen units, the figures, the equations used, assumptions and warnings, "
    "material data with their sources, and the review log. Figures and equations are embedded images; "
    "the file loads nothing from the network."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", help="design record (TOML)")
    parser.add_argument("-o", "--output", required=True, metavar="PATH", help="HTML file to write")
    parser.add_argument("--units", choices=("si", "us"), default="si", help="unit system of the report (default si)")
    parser.add_argument("--rtol", type=float, default=1e-6, help="relative tolerance of the drift check (default 1e-6)")


def run(args: argparse.Namespace) -> int:
    from ..core.errors import require
    from ..designs.jobs import cautions_for

    require("matplotlib", "bilayer report (its figures)", "report")
    from ..records.check import Tolerance, check_record
    from ..records.record import read_record
    from ..report.html_report import write_report

    record = read_record(args.file)
    cautions = cautions_for(record.design)
    check = check_record(record, Tolerance(args.rtol), cautions=cautions)
    path = write_report(record, args.output, args.units, check=check, cautions=cautions)
    print(f"wrote {path} (check: {check.summary()}; review: {check.review.text()})", file=sys.stderr)
    return 0
