"""The solder job: the ``[solder_joint]`` table, checked by :func:`bilayer.solder.assessment.assess_solder_design`."""
from ..core.job import Job
from .assessment import assess_solder_design
from .cautions import SOLDER_CAUTIONS
from .report import report
from .section import SECTION

JOB = Job(SECTION, "solder joint: strain by joint type, life law by alloy, chamber life, tolerances, warpage",
          assess_solder_design, report, SOLDER_CAUTIONS)
