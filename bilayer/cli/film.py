"""``bilayer film FILE [--units si|us] [--json]``: film stress, wafer bow, Stoney and its error."""
from __future__ import annotations

import argparse


from .job_output import add_file_arguments, run_assessment

NAME = "film"
HELP = "film on a substrate from a design file: thermal stress and bow, stress from measured bow, two-substrate fit"
DESCRIPTION = (
    "Run the [film] section of a two-layer design (substrate at the bottom, film on top): thermal film "
    "stress and curvature from the engine beside Stoney, film stress from bow or curvature measured before "
    "and after deposition (exact bilayer correction when the film modulus is known), and film CTE and "
    "biaxial modulus from stress scans on two substrates. Curvature > 0: film side convex."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    add_file_arguments(parser, "film")


def run(args: argparse.Namespace) -> int:
    from ..films.job import JOB

    return run_assessment(args, JOB)


