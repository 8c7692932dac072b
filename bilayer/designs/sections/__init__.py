"""The tables a design file may hold: the stack's own tables and one per job.

The stack's tables (``[conditions]``, ``[[layer]]``, ``[materials]``, ``[results]``) are modules of this
package; each job declares its table beside its model (``bilayer/<job>/section.py``) and is listed in
:mod:`bilayer.designs.jobs`. ``[record]`` and ``[[review]]`` belong to :mod:`bilayer.records`: the
design-file reader keeps them as they are (:data:`RECORD_TABLES`) and the records package checks them.
Core sections fill the Design's own fields; job sections are stored as dicts of SI values in
``Design.sections[name]``.
"""
from __future__ import annotations

from functools import lru_cache

from ...core.errors import InputError
from ...core.section_spec import BOOLEAN, CHOICE, INTEGER, TABLE, TEXT, Field, Location, SectionSpec, exact_text, suggest

__all__ = [
    "Field",
    "SectionSpec",
    "Location",
    "exact_text",
    "suggest",
    "sections",
    "section",
    "job_sections",
    "register",
    "TEXT",
    "CHOICE",
    "INTEGER",
    "BOOLEAN",
    "TABLE",
]

_EXTRA: dict[str, SectionSpec] = {}


def register(spec: SectionSpec) -> SectionSpec:
    """Register a section defined outside this package (plug-ins, tests)."""
    if not isinstance(spec, SectionSpec):
        raise InputError("section", spec, "a SectionSpec")
    _EXTRA[spec.name] = spec
    return spec


RECORD_TABLES = ("record", "review")
"""Tables of a design record, kept unread by the design-file reader (checked by bilayer.records)."""


@lru_cache(maxsize=1)
def _known() -> dict[str, SectionSpec]:
    from ..jobs import JOBS
    from . import conditions, layer, materials, results

    found = {spec.name: spec for spec in (conditions.SECTION, layer.SECTION, materials.SECTION, results.SECTION)}
    for job in JOBS.values():
        if job.section.name in found:
            raise RuntimeError(f"design-file section {job.section.name!r} is defined twice")
        found[job.section.name] = job.section
    return dict(sorted(found.items()))


def sections() -> dict[str, SectionSpec]:
    """All known sections by table name (core and job sections)."""
    return {**_known(), **_EXTRA}


def section(name: str) -> SectionSpec:
    """The section called ``name``; InputError with a suggestion if unknown."""
    known = sections()
    if name not in known:
        raise InputError("section", name, "one of " + ", ".join(sorted(known)), suggest(name, known))
    return known[name]


def job_sections() -> dict[str, SectionSpec]:
    """The job sections (stored in ``Design.sections``)."""
    return {name: spec for name, spec in sections().items() if not spec.core}
