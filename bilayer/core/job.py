"""What a job of bilayer declares: its design-file table, its checks, its text report and its cautions.

Each job folder (``bilayer/thermostat``, ``bilayer/solder``, ``bilayer/adhesive``, ``bilayer/films``,
``bilayer/strip``) defines one :class:`Job` in its ``job.py``; :mod:`bilayer.designs.jobs` lists them.
The design-file reader takes the tables from there, the faces (command line, panels, HTML report) take
the assessment, the report and the cautions, and records take the results, so a job is added in one
place and every face shows it the same way.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Callable

from .section_spec import SectionSpec

__all__ = ["Job"]


@dataclass(frozen=True)
class Job:
    """A job of bilayer.

    ``section``  its design-file table (its name names the job);
    ``title``    what it checks, in plain words;
    ``assess``   ``assess(design) -> assessment``: every check of the table on the design's stack; the
                 assessment has ``to_dict()`` (SI values with a ``units`` map) and ``warnings``;
    ``report``   ``report(design, assessment, system, source) -> str``: the plain-text report in the
                 unit system ``system`` ("si" or "us"), without the cautions;
    ``cautions`` the lines shown after the shared cautions with its results.
    """

    section: SectionSpec
    title: str
    assess: Callable[[Any], Any]
    report: Callable[..., str]
    cautions: tuple[str, ...] = ()

    @property
    def name(self) -> str:
        return self.section.name
