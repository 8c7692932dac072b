"""The solder job: the ``[solder_joint]`` table, checked by :func:`bilayer.solder.joint.assess_solder_design`."""
from ..core.job import Job
from .joint import SOLDER_CAUTIONS, assess_solder_design
from .report import report
from .section import SECTION

JOB = Job(SECTION, "solder joint: DNP strain, Engelmaier life, acceleration, warpage", assess_solder_design, report,
          SOLDER_CAUTIONS)
