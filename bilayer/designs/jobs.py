"""The jobs bilayer knows, and which cautions apply to a design.

One registry: the design-file reader takes each job's table from :data:`JOBS`, and the faces
(command line, panels, reports) and records take each job's cautions, so a report of a thermostat
element carries the thermostat cautions and one of a solder joint the solder cautions.
"""
from __future__ import annotations

from typing import Any

from ..adhesive.job import JOB as ADHESIVE
from ..core.job import Job
from ..films.job import JOB as FILM
from ..solder.job import JOB as SOLDER
from ..strip.job import JOB as INTERFACE
from ..thermostat.job import JOB as THERMOSTAT

__all__ = ["JOBS", "cautions_for", "job_warnings"]

JOBS: dict[str, Job] = {job.name: job for job in (INTERFACE, THERMOSTAT, SOLDER, ADHESIVE, FILM)}
"""Every job by the name of its design-file table."""


def cautions_for(design: Any) -> tuple[str, ...]:
    """The shared :data:`bilayer.core.cautions.CAUTIONS`, then the cautions of each job section of
    ``design`` (in section order), each text once."""
    from ..core.cautions import CAUTIONS

    texts = list(CAUTIONS)
    for name in design.sections:
        job = JOBS.get(name)
        if job is not None:
            texts += [text for text in job.cautions if text not in texts]
    return tuple(texts)


def job_warnings(design: Any) -> dict[str, tuple[str, ...]]:
    """The warnings of each job section of ``design``, computed now by the job's assessment (a section the
    job refuses gives its error as the one warning), keyed by section name in section order."""
    from ..core.errors import BilayerError

    out: dict[str, tuple[str, ...]] = {}
    for name in design.sections:
        job = JOBS.get(name)
        if job is None:
            continue
        try:
            out[name] = tuple(job.assess(design).warnings)
        except BilayerError as error:
            out[name] = (f"the job refuses this design: {error}",)
    return out
