"""What a job of bilayer declares: its design-file table, its title and its cautions.

Each job folder (``bilayer/thermostat``, ``bilayer/solder``, ``bilayer/adhesive``, ``bilayer/films``,
``bilayer/strip``) defines one :class:`Job` in its ``job.py``; :mod:`bilayer.designs.jobs` lists them.
The design-file reader takes the tables from there, the faces take the cautions, and records take the
results, so a new job is added in one place.
"""
from __future__ import annotations

from dataclasses import dataclass

from .section_spec import SectionSpec

__all__ = ["Job"]


@dataclass(frozen=True)
class Job:
    """A job: ``section`` is its design-file table (its name names the job), ``title`` says in plain
    words what it checks, ``cautions`` are the lines shown after the shared cautions with its results."""

    section: SectionSpec
    title: str
    cautions: tuple[str, ...] = ()

    @property
    def name(self) -> str:
        return self.section.name
