"""Shared plumbing of the job subcommands that read one design file and print one assessment."""
from __future__ import annotations

import argparse
import json
import sys
import time


def add_file_arguments(parser: argparse.ArgumentParser, section: str) -> None:
    """The FILE, --units and --json arguments every job subcommand takes."""
    parser.add_argument("file", help=f"design file with a [{section}] section")
    parser.add_argument("--units", choices=("si", "us"), default="si", help="display units (default si)")
    parser.add_argument("--json", action="store_true", help="print JSON with SI values instead of text")


def print_assessment(args: argparse.Namespace, job, design, assessment, source: str = "") -> None:
    """Print the job's assessment: its JSON (SI, with ``design_name``), or its text report followed by the
    shared and the job's cautions."""
    from ..core.cautions import cautions_text

    if args.json:
        data = {"design_name": design.name, **assessment.to_dict()}
        sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")
    else:
        text = job.report(design, assessment, args.units, source)
        sys.stdout.write(text + "\n\n" + cautions_text(job.cautions) + "\n")


def run_assessment(args: argparse.Namespace, job) -> int:
    """Read the design, run the job's assessment and print it."""
    from ..designs.design_file import read_design

    document = read_design(args.file)
    print_assessment(args, job, document.design, job.assess(document.design), document.source)
    return 0


class StderrProgress:
    """A :data:`bilayer.core.progress.Progress` printed on one stderr line, shown only once the run has
    lasted ``delay`` seconds (short runs stay quiet)."""

    def __init__(self, what: str, delay: float = 2.0):
        self.what = what
        self.start = time.perf_counter()
        self.delay = delay
        self.shown = False

    def __call__(self, fraction: float, message: str) -> None:
        if not self.shown and (fraction >= 1.0 or time.perf_counter() - self.start < self.delay):
            return
        self.shown = True
        print(f"\rbilayer: {self.what} {100 * fraction:3.0f} % ({message})".ljust(78), end="", file=sys.stderr,
              flush=True)
        if fraction >= 1.0:
            print(file=sys.stderr)
