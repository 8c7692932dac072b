"""bilayer: curvature, stresses and joint checks for bonded layer stacks under temperature change.

Quick start (SI floats; kelvin for temperatures)::

    import bilayer as bl
    stack = bl.Stack.of(("fe36ni", 0.5e-3), ("nicrfe_22_3", 0.5e-3))
    result = bl.evaluate(stack, bl.Temperatures(293.15, 393.15), state="narrow")
    result.curvature, result.stress_bottom, result.stress_top

Heavy modules (pint, sympy, scipy) load only when first used, so importing bilayer is cheap.
"""
from __future__ import annotations

from importlib import import_module

from .core.errors import (
    BilayerError,
    DesignFileError,
    InputError,
    ModelLimitWarning,
    SuspiciousInputWarning,
    UnitError,
    UnknownMaterialError,
)
from .core.stack import BendingState, Design, Layer, Stack, Temperatures, evaluate
from .core.version import VERSION as __version__

_LAZY = {
    "Material": "bilayer.core.materials",
    "MaterialLibrary": "bilayer.core.materials",
    "get_material": "bilayer.core.materials",
    "default_library": "bilayer.core.materials",
    "load_material_file": "bilayer.core.materials",
    "StackResult": "bilayer.core.results",
    "load_design": "bilayer.designs.design_file",
    "save_design": "bilayer.designs.design_file",
    "parse": "bilayer.core.units",
    "CAUTIONS": "bilayer.core.cautions",
}

__all__ = [
    "BendingState",
    "BilayerError",
    "Design",
    "DesignFileError",
    "InputError",
    "Layer",
    "ModelLimitWarning",
    "Stack",
    "SuspiciousInputWarning",
    "Temperatures",
    "UnitError",
    "UnknownMaterialError",
    "evaluate",
    "__version__",
    *_LAZY,
]


def __getattr__(name: str):
    if name in _LAZY:
        return getattr(import_module(_LAZY[name]), name)
    raise AttributeError(f"module 'bilayer' has no attribute {name!r}")
