"""``bilayer solder FILE [--units si|us] [--json]``: solder-joint screening and assembly warpage."""
from __future__ import annotations

import argparse


from .job_output import add_file_arguments, run_assessment

NAME = "solder"
HELP = "screen the solder joint of a design file: DNP strain, Engelmaier life, acceleration, warpage"
DESCRIPTION = (
    "Run the [solder_joint] section of a design file: global (DNP) and local mismatch strains, the "
    "Engelmaier median life with its Weibull spread, the Norris-Landzberg acceleration factor against "
    "a test cycle, and the warpage of the assembly from the stack engine. Screening estimates only."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    add_file_arguments(parser, "solder_joint")


def run(args: argparse.Namespace) -> int:
    from ..solder.job import JOB

    return run_assessment(args, JOB)


