"""The thermostat job: the ``[thermostat]`` table, checked by :func:`bilayer.thermostat.assessment.analyse`."""
from ..core.job import Job
from .assessment import analyse
from .element import THERMOSTAT_CAUTIONS
from .section import SECTION


def report(design, assessment, system: str = "si", source: str = "") -> str:
    """The element's summary (:meth:`~bilayer.thermostat.assessment.ThermostatReport.to_text`), no cautions."""
    return assessment.to_text(system, cautions=False)


JOB = Job(SECTION, "thermostat element: flexivity, travel, set point, force, stress span, tolerances",
          analyse, report, THERMOSTAT_CAUTIONS)
