"""The film job: the ``[film]`` table, checked by :func:`bilayer.films.stress.assess_film_design`."""
from ..core.job import Job
from .section import SECTION

JOB = Job(SECTION, "film on a substrate: thermal stress and bow, stress from measured bow, two-substrate fit")
