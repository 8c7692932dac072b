"""The film job: the ``[film]`` table, checked by :func:`bilayer.films.stress.assess_film_design`."""
from ..core.job import Job
from .report import report
from .section import SECTION
from .stress import assess_film_design

JOB = Job(SECTION, "film on a substrate: thermal stress and bow, stress from measured bow, two-substrate fit",
          assess_film_design, report)
