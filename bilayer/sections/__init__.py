"""Registry of the tables a design file may hold, one module per table.

Each module of this package defines ``SECTION`` (a :class:`SectionSpec`) or ``SECTIONS`` (several).
Modules are found automatically: a job adds its table (``[thermostat]``, ``[solder_joint]``...)
by adding a module here, for example ``bilayer/sections/thermostat.py``::

    from .spec import Field, SectionSpec

    SECTION = SectionSpec("thermostat", (
        Field("set_point", "temperature", required=True, doc="opening temperature"),
        Field("free_length", "length", required=True),
        Field("mounting", "choice", default="cantilever", choices=("cantilever", "simple_beam")),
    ), doc="thermostat element geometry and set point")

Core sections (``conditions``, ``layer``, ``materials``, ``results``) fill the Design's own fields;
job sections are stored as dicts of SI values in ``Design.sections[name]``.
"""
from __future__ import annotations

import importlib
import pkgutil
from functools import lru_cache

from ..errors import InputError
from .spec import (
    BOOLEAN,
    CHOICE,
    INTEGER,
    TABLE,
    TEXT,
    Field,
    Location,
    SectionSpec,
    exact_text,
    suggest,
)

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


@lru_cache(maxsize=1)
def _discovered() -> dict[str, SectionSpec]:
    found: dict[str, SectionSpec] = {}
    for module_info in sorted(pkgutil.iter_modules(__path__), key=lambda m: m.name):
        if module_info.name == "spec":
            continue
        module = importlib.import_module(f"{__name__}.{module_info.name}")
        specs = getattr(module, "SECTIONS", None) or (
            (module.SECTION,) if hasattr(module, "SECTION") else ()
        )
        for spec in specs:
            if spec.name in found:
                raise RuntimeError(f"design-file section {spec.name!r} is defined twice")
            found[spec.name] = spec
    return found


def sections() -> dict[str, SectionSpec]:
    """All known sections by table name (core and job sections)."""
    return {**_discovered(), **_EXTRA}


def section(name: str) -> SectionSpec:
    """The section called ``name``; InputError with a suggestion if unknown."""
    known = sections()
    if name not in known:
        raise InputError("section", name, "one of " + ", ".join(sorted(known)), suggest(name, known))
    return known[name]


def job_sections() -> dict[str, SectionSpec]:
    """The job sections (stored in ``Design.sections``)."""
    return {name: spec for name, spec in sections().items() if not spec.core}
