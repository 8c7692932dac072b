"""``bilayer check FILE... [--rtol R] [--units si|us]``: re-evaluate design records and report drift."""
from __future__ import annotations

import argparse
import sys

NAME = "check"
HELP = "re-evaluate design records and compare with their stored results (exit 1 on drift or edited inputs)"
DESCRIPTION = (
    "For each design record: check that the inputs still match their hash, compare the material data "
    "with the copy in the record, re-evaluate with this bilayer and compare every stored result within "
    "the tolerance, and verify the review log's chain. Prints a readable difference; exits 1 when any "
    "record fails, so a CI job can run it over all records. See docs/records.md."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("files", nargs="+", metavar="FILE", help="design records (TOML)")
    parser.add_argument("--rtol", type=float, default=1e-6,
                        help="relative tolerance, of the value or of the largest recorded value of its kind "
                             "(default 1e-6)")
    parser.add_argument("--units", choices=("si", "us"), default="si", help="units of the printed differences")
    parser.add_argument("-q", "--quiet", action="store_true", help="print one line per record")


def run(args: argparse.Namespace) -> int:
    from .exit_codes import EXIT_CHECK_FAILED, EXIT_INVALID_INPUT, EXIT_OK
    from ..designs.jobs import cautions_for
    from ..core.errors import BilayerError
    from ..records.check import Tolerance, check_record
    from ..records.record import read_record

    tolerance = Tolerance(args.rtol)
    failed = unreadable = 0
    for file in args.files:
        try:
            record = read_record(file)
        except (BilayerError, OSError) as error:  # report it and go on with the other records
            print(f"{file}: UNREADABLE: {' '.join(str(error).split())}", file=sys.stdout)
            unreadable += 1
            continue
        report = check_record(record, tolerance, cautions=cautions_for(record.design))
        text = f"{report.source}: {report.summary()}" if args.quiet else report.text(args.units)
        print(text, file=sys.stdout)
        failed += not report.ok
    if len(args.files) > 1:
        good = len(args.files) - failed - unreadable
        print(f"{good} of {len(args.files)} records OK", file=sys.stdout)
    if unreadable:
        return EXIT_INVALID_INPUT
    return EXIT_CHECK_FAILED if failed else EXIT_OK
