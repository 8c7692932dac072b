"""``bilayer solder FILE [--units si|us] [--json]``: solder-joint screening and assembly warpage."""
from __future__ import annotations

import argparse


from .job_output import add_file_arguments, run_assessment

NAME = "solder"
HELP = "screen the solder joint of a design file: strain, life by the alloy's law, chamber life, scatter, warpage"
DESCRIPTION = (
    "Run the [solder_joint] section of a design file: global (DNP) strain by joint type (leadless, area "
    "array, leaded) and local mismatch; the median life by the life law the solder's alloy family selects "
    "(or the user's Coffin-Manson or energy law; a law of another family only when accepted, with a warning) "
    "and its Weibull spread; the Norris-Landzberg factor and the one chamber life with its cross-check; "
    "scatter from tolerances (first order and Monte Carlo); the warpage at the cycle extremes. Warnings are "
    "printed first. Screening estimates only."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    add_file_arguments(parser, "solder_joint")


def run(args: argparse.Namespace) -> int:
    from ..solder.job import JOB

    return run_assessment(args, JOB)


