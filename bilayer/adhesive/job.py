"""The adhesive job: the ``[adhesive_bond]`` table, checked by :func:`bilayer.adhesive.bond.assess_adhesive_design`."""
from ..core.job import Job
from .bond import ADHESIVE_CAUTIONS
from .section import SECTION

JOB = Job(SECTION, "adhesive joint: end shear and peel, Tg, allowables, sweeps", ADHESIVE_CAUTIONS)
