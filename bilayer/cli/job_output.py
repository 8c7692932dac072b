"""Shared plumbing of the job subcommands that read one design file and print one assessment."""
from __future__ import annotations

import argparse
import json
import sys
from typing import Callable


def add_file_arguments(parser: argparse.ArgumentParser, section: str) -> None:
    """The FILE, --units and --json arguments every job subcommand takes."""
    parser.add_argument("file", help=f"design file with a [{section}] section")
    parser.add_argument("--units", choices=("si", "us"), default="si", help="display units (default si)")
    parser.add_argument("--json", action="store_true", help="print JSON with SI values instead of text")


def run_assessment(args: argparse.Namespace, assess: Callable, report: Callable) -> int:
    """Read the design, run ``assess(design)`` and print ``report(...)`` or the assessment's JSON."""
    from ..designs.design_file import read_design

    document = read_design(args.file)
    assessment = assess(document.design)
    if args.json:
        data = {"design_name": document.design.name, **assessment.to_dict()}
        sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")
    else:
        sys.stdout.write(report(document.design, assessment, args.units, document.source) + "\n")
    return 0
