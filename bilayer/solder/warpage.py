"""Warpage of a soldered assembly (board or base at the bottom, component or die on top) from the engine.

The stack goes through :func:`bilayer.core.stack.evaluate` (equal-biaxial ``plate`` state by default)
from a stress-free temperature, the solder's solidus or an effective lower value, to each temperature
asked for; the bows over the length, width and diagonal are the exact sagittas of the curvature
(:func:`bilayer.core.sagitta.bow_from_curvature`). The solder job asks for the extremes of the field and
test cycles by default, each labelled with its role.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Sequence

import numpy as np

from ..core.cautions import CAUTIONS
from ..core.errors import InputError, check_range, warn_suspicious
from .cautions import SOLDER_CAUTIONS

if TYPE_CHECKING:  # pragma: no cover
    from ..core.results import StackResult
    from ..core.stack import Stack

__all__ = ["WarpageResult", "assembly_warpage"]


@dataclass(frozen=True, eq=False)
class WarpageResult:
    """Warpage of a component-on-board or die-on-substrate stack (SI); ``temperature_labels`` name each
    operating temperature (e.g. "field low", "test high"), empty when they are the design's own."""

    stack_result: "StackResult"
    stress_free_temperature: float
    stress_free_basis: str
    length: float
    width: float
    curvature: "float | np.ndarray"
    bow_length: "float | np.ndarray"
    bow_width: "float | np.ndarray"
    bow_diagonal: "float | np.ndarray"
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    temperature_labels: tuple[str, ...] = ()
    cautions: tuple[str, ...] = field(default=CAUTIONS + SOLDER_CAUTIONS)

    @property
    def temperatures(self) -> np.ndarray:
        """The operating temperatures [K] (one or more)."""
        return np.atleast_1d(np.asarray(self.stack_result.operating_temperature, float))

    def to_dict(self) -> dict:
        from ..core.jsonable import plain

        return {
            "stress_free_temperature": self.stress_free_temperature,
            "stress_free_basis": self.stress_free_basis,
            "length": self.length,
            "width": self.width,
            "temperatures": plain(self.temperatures),
            "temperature_labels": list(self.temperature_labels),
            "curvature": plain(self.curvature),
            "bow_length": plain(self.bow_length),
            "bow_width": plain(self.bow_width),
            "bow_diagonal": plain(self.bow_diagonal),
            "sign_convention": "kappa > 0 and bow > 0: top face convex, centre high with the top layer up",
            "stack": self.stack_result.to_dict(),
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "cautions": list(self.cautions),
            "units": {
                "stress_free_temperature": "K", "length": "m", "width": "m", "temperatures": "K",
                "curvature": "1/m", "bow_length": "m", "bow_width": "m", "bow_diagonal": "m",
            },
        }


def assembly_warpage(
    stack: "Stack",
    operating,
    length: float,
    width: float | None = None,
    *,
    solder=None,
    stress_free_temperature: float | None = None,
    state: str = "plate",
    labels: Sequence[str] = (),
) -> WarpageResult:
    """Warpage of a soldered assembly at the ``operating`` temperature(s) [K].

    The stress-free temperature is the solder's solidus (``solder`` a Material with ``solidus``) or an
    effective value the user sets (``stress_free_temperature`` [K], usually lower because the solder
    creeps during cooling). ``labels`` name the operating temperatures (one per temperature).
    """
    from ..core.sagitta import bow_from_curvature
    from ..core.stack import Temperatures, evaluate

    length = check_range("length", length, 0.0, 10.0, unit="m")
    width = length if width is None else check_range("width", width, 0.0, 10.0, unit="m")
    labels = tuple(labels)
    if labels and len(labels) != np.size(operating):
        raise InputError("labels", labels, f"one label per operating temperature ({np.size(operating)})")
    solidus = None
    if solder is not None:
        solidus = getattr(solder, "solidus", None)
        if solidus is None:
            raise InputError("solder", getattr(solder, "name", solder), "a solder material with a solidus")
    warnings = []
    if stress_free_temperature is not None:
        t0 = check_range("stress_free_temperature", stress_free_temperature, 0.0, 5000.0, unit="K")
        basis = "effective value set by the user"
        if solidus is not None and t0 > solidus:
            warn_suspicious("stress_free_temperature", t0, f"above the solder solidus {solidus:g} K")
    elif solidus is not None:
        t0 = float(solidus)
        basis = f"solidus of {getattr(solder, 'name', 'the solder')}"
        warnings.append(
            "stress-free temperature at the solidus: creep during cooling makes the effective value lower, "
            "so the warpage and stresses are upper bounds"
        )
    else:
        raise InputError(
            "stress_free_temperature", None, "a temperature [K], or a solder material with a solidus"
        )
    result = evaluate(stack, Temperatures(t0, operating), state)
    kappa = result.curvature
    diagonal = math.hypot(length, width)
    warnings.extend(result.warnings)
    return WarpageResult(
        stack_result=result,
        stress_free_temperature=t0,
        stress_free_basis=basis,
        length=length,
        width=width,
        curvature=kappa,
        bow_length=bow_from_curvature(kappa, length),
        bow_width=bow_from_curvature(kappa, width),
        bow_diagonal=bow_from_curvature(kappa, diagonal),
        warnings=tuple(warnings),
        assumptions=tuple(result.assumptions) + (
            "uniform spherical curvature over the outline (free plate); bow is the exact sagitta over each span",
            "elastic layers: yielding or creep of solder and copper lowers the real warpage",
        ),
        temperature_labels=labels,
    )
