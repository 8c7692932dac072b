"""The adhesive job: the ``[adhesive_bond]`` table, checked by :func:`bilayer.adhesive.bond.assess_adhesive_design`."""
from ..core.job import Job
from .bond import ADHESIVE_CAUTIONS, assess_adhesive_design
from .report import report
from .section import SECTION

JOB = Job(SECTION, "adhesive joint: end shear and peel, Tg, allowables, sweeps", assess_adhesive_design, report,
          ADHESIVE_CAUTIONS)
