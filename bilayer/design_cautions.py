"""Which cautions apply to a design: the shared ones plus those of each job section it holds.

Used by the faces (command line, panels, reports) and stored in design records, so a report of a
thermostat element carries the thermostat cautions and one of a solder joint the solder cautions.
The job modules are imported only when a design holds their section.
"""
from __future__ import annotations

from importlib import import_module
from typing import Any

__all__ = ["JOB_CAUTIONS", "cautions_for"]

JOB_CAUTIONS: dict[str, tuple[str, str]] = {
    # design-file section -> (module, name of its tuple of cautions)
    "thermostat": ("bilayer.thermostat", "THERMOSTAT_CAUTIONS"),
    "solder_joint": ("bilayer.solder", "SOLDER_CAUTIONS"),
    "adhesive_bond": ("bilayer.adhesive", "ADHESIVE_CAUTIONS"),
}


def cautions_for(design: Any) -> tuple[str, ...]:
    """The shared :data:`bilayer.cautions.CAUTIONS`, then the cautions of each job section of ``design``
    (in section order), each text once."""
    from .cautions import CAUTIONS

    texts = list(CAUTIONS)
    for name in design.sections:
        if name in JOB_CAUTIONS:
            module, attribute = JOB_CAUTIONS[name]
            texts += [text for text in getattr(import_module(module), attribute) if text not in texts]
    return tuple(texts)
