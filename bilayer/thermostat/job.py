"""The thermostat job: the ``[thermostat]`` table, checked by :func:`bilayer.thermostat.assessment.analyse`."""
from ..core.job import Job
from .element import THERMOSTAT_CAUTIONS
from .section import SECTION

JOB = Job(SECTION, "thermostat element: flexivity, travel, set point, force, stress span, tolerances",
          THERMOSTAT_CAUTIONS)
