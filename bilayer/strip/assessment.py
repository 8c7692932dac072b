"""The [interface] job of a design: interface stresses per operating temperature and the trust report.

Reads ``design.sections["interface"]`` (see :mod:`bilayer.strip.section`): bond layers are
layer numbers counted from 1 at the bottom, as everywhere in files and reports.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np

from ..core.errors import InputError
from ..core.progress import Progress

__all__ = ["InterfaceAssessment", "interface_options", "interface_for_design", "check_temperature",
           "trust_report_for_design", "assess_interface_design"]


@dataclass(frozen=True)
class InterfaceAssessment:
    """The [interface] job's answer: one interface result per operating temperature and, when the FE
    check ran, its trust report (at :func:`check_temperature`)."""

    results: tuple
    trust: Any = None
    trust_temperature: float | None = None

    @property
    def warnings(self) -> tuple[str, ...]:
        found: list[str] = []
        for result in self.results:
            found += [text for text in result.warnings if text not in found]
        return tuple(found)

    def to_dict(self) -> dict:
        trust = None if self.trust is None else {**self.trust.to_dict(), "temperature": self.trust_temperature}
        return {"interface": [result.to_dict() for result in self.results], "trust": trust}


def interface_options(design) -> dict:
    """The [interface] values of ``design`` with the bond layers turned into 0-based indices."""
    if "interface" not in design.sections:
        raise InputError("design.sections", sorted(design.sections), "an [interface] section")
    values = dict(design.sections["interface"])
    n = design.stack.n_layers
    numbers = tuple(values.get("bond_layers", ()))
    for number in numbers:
        if not 2 <= number <= n - 1:
            valid = f"an inner layer number, 2 to {n - 1}" if n >= 3 else "no bond layer in a stack of two layers"
            raise InputError("interface.bond_layers", number, valid, "a bond needs a layer below and above it")
    values["bonds"] = tuple(number - 1 for number in numbers)
    return values


def interface_for_design(design) -> tuple:
    """One :class:`bilayer.strip.interface.InterfaceResult` per operating temperature of the design."""
    from .interface import interface_stresses
    from ..core.stack import Temperatures

    options = interface_options(design)
    operating = np.atleast_1d(np.asarray(design.temperatures.operating, float))
    return tuple(
        interface_stresses(
            design.stack, Temperatures(design.temperatures.stress_free, float(t)), options["length"], design.state,
            options["bonds"], options.get("model", "bending"), options.get("points", 401),
        )
        for t in operating
    )


def check_temperature(design) -> float:
    """The FE check temperature: the section's, else the operating temperature farthest from stress-free."""
    options = interface_options(design)
    if options.get("check_temperature") is not None:
        return float(options["check_temperature"])
    operating = np.atleast_1d(np.asarray(design.temperatures.operating, float))
    return float(operating[np.argmax(np.abs(operating - design.temperatures.stress_free))])


def trust_report_for_design(design, progress: Progress | None = None, refine: bool | None = None):
    """The trust report of the design at :func:`check_temperature` (FE options from the section)."""
    from .fe import MeshOptions
    from ..core.stack import Temperatures
    from .fe_comparison import trust_report

    options = interface_options(design)
    distances = options.get("sample_distances")
    return trust_report(
        design.stack,
        Temperatures(design.temperatures.stress_free, check_temperature(design)),
        options["length"],
        design.state,
        options["bonds"],
        options.get("model", "bending"),
        mesh=MeshOptions(layer_elements=options.get("layer_elements", 8)),
        refine=options.get("refine", True) if refine is None else refine,
        distances=None if distances is None else np.asarray(distances, float),
        width=options.get("width"),
        progress=progress,
    )


def assess_interface_design(design, fe: bool = False, progress: Progress | None = None,
                            refine: bool | None = None) -> InterfaceAssessment:
    """Interface stresses at every operating temperature; with ``fe`` also the trust report."""
    results = interface_for_design(design)
    if not fe:
        return InterfaceAssessment(results)
    return InterfaceAssessment(results, trust_report_for_design(design, progress, refine), check_temperature(design))
