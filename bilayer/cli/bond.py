"""``bilayer bond FILE [--units si|us] [--json]``: end shear and peel of an adhesive joint."""
from __future__ import annotations

import argparse

from .job_output import add_file_arguments, run_assessment

NAME = "bond"
HELP = "check the adhesive joint of a design file: end shear and peel, Tg, allowables, sweeps"
DESCRIPTION = (
    "Run the [adhesive_bond] section of a three-layer design (lower adherend, adhesive, upper adherend): "
    "end shear and peel from the interface model at every operating temperature, margins against the "
    "allowables, glass-transition warnings and the requested sweeps. Screening estimates only."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    add_file_arguments(parser, "adhesive_bond")


def run(args: argparse.Namespace) -> int:
    from ..adhesive.job import JOB

    return run_assessment(args, JOB)


