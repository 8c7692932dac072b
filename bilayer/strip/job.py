"""Stresses along the strip as a job: the ``[interface]`` table, checked by :mod:`bilayer.strip.assessment`."""
from ..core.job import Job
from .assessment import assess_interface_design
from .report import report
from .section import SECTION

INTERFACE_CAUTIONS = (
    "Shear and peel at a free end are nominal model values: the real corner field is singular or steep. "
    "Judge bond strength from tests of the actual joint and the applicable standards, not from these peaks.",
)

JOB = Job(SECTION, "stresses along the strip: interface shear and peel near the ends, FE trust report",
          assess_interface_design, report, INTERFACE_CAUTIONS)
