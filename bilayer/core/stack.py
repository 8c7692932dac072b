"""Stack model: layers, bending state, temperatures, designs, and the one engine call `evaluate`.

Conventions (shown in every panel and report):

    z ^                         layer n   (top)
      |   ...                   ...
      |   -------------------   interface 1 at z = t_1
      |   layer 1 (bottom)
      +----------------------> x
    kappa > 0: the top face is the longer (convex) one, centre of curvature below the strip.
    sigma > 0: tension.  Delta T = T_operating - T_stress_free (cooling after bonding is negative).

Bending states (chosen explicitly; reported in every result):
    narrow  narrow strip, uniaxial stress:             Y = E,          f = eps_th
    wide    wide strip in cylindrical bending, plane
            strain eps_y = 0 (2-D plane strain):         Y = E/(1-nu^2), f = (1+nu) eps_th
    plate   free plate or disc, equal-biaxial bending: Y = E/(1-nu),   f = eps_th, kappa_x = kappa_y
where eps_th = integral of alpha dT from the stress-free to the operating temperature.
"""
from __future__ import annotations

import enum
from dataclasses import dataclass, field, replace
from types import MappingProxyType
from typing import TYPE_CHECKING, Mapping

import numpy as np

from .errors import InputError, check_finite, check_range

if TYPE_CHECKING:  # pragma: no cover
    from .materials import Material
    from .results import StackResult

__all__ = ["BendingState", "Layer", "Stack", "Temperatures", "Design", "evaluate"]


class BendingState(str, enum.Enum):
    """Stress state of the stack in the width direction."""

    NARROW = "narrow"
    WIDE = "wide"
    PLATE = "plate"

    @classmethod
    def parse(cls, value: "BendingState | str") -> "BendingState":
        """Accept a member or its name ("narrow", "wide", "plate"), case-insensitive."""
        if isinstance(value, cls):
            return value
        if isinstance(value, str):
            try:
                return cls(value.strip().lower())
            except ValueError:
                pass
        raise InputError("bending state", value, "one of 'narrow', 'wide', 'plate'")

    @property
    def description(self) -> str:
        return _STATE_TEXT[self]


_STATE_TEXT = {
    BendingState.NARROW: "narrow strip, uniaxial stress: modulus E, free strain alpha*dT",
    BendingState.WIDE: (
        "wide strip in cylindrical bending (plane strain, eps_y = 0): modulus E/(1-nu^2), "
        "free strain (1+nu)*alpha*dT"
    ),
    BendingState.PLATE: (
        "free plate or disc in equal-biaxial bending: modulus E/(1-nu), free strain alpha*dT, "
        "kappa_x = kappa_y"
    ),
}


def _as_material(value, field_name: str) -> "Material":
    from .materials import Material, get_material

    if isinstance(value, Material):
        return value
    if isinstance(value, str):
        return get_material(value)
    raise InputError(field_name, value, "a Material or a library material name")


@dataclass(frozen=True)
class Layer:
    """One bonded layer: a material, a thickness [m] and an optional label."""

    material: "Material"
    thickness: float
    label: str = ""

    def __post_init__(self):
        object.__setattr__(self, "material", _as_material(self.material, "layer.material"))
        check_range("layer.thickness", self.thickness, 0.0, 1.0, high_inclusive=True, unit="m")
        object.__setattr__(self, "thickness", float(self.thickness))
        if not isinstance(self.label, str):
            raise InputError("layer.label", self.label, "a text label")

    @property
    def name(self) -> str:
        """The label if given, else the material name."""
        return self.label or self.material.name


@dataclass(frozen=True)
class Stack:
    """An ordered, immutable tuple of layers, numbered from the bottom (index 0 = layer 1)."""

    layers: tuple[Layer, ...]

    def __post_init__(self):
        layers = tuple(self.layers)
        if not layers:
            raise InputError("stack.layers", [], "at least one layer")
        for i, layer in enumerate(layers):
            if not isinstance(layer, Layer):
                raise InputError(f"layers[{i}]", layer, "a Layer")
        object.__setattr__(self, "layers", layers)

    @classmethod
    def of(cls, *layers: "Layer | tuple") -> "Stack":
        """Build from Layer objects or (material, thickness[, label]) tuples, bottom first."""
        return cls(tuple(layer if isinstance(layer, Layer) else Layer(*layer) for layer in layers))

    def __len__(self) -> int:
        return len(self.layers)

    def __iter__(self):
        return iter(self.layers)

    def __getitem__(self, index: int) -> Layer:
        return self.layers[index]

    @property
    def n_layers(self) -> int:
        return len(self.layers)

    @property
    def thicknesses(self) -> np.ndarray:
        return np.array([layer.thickness for layer in self.layers])

    @property
    def total_thickness(self) -> float:
        return float(self.thicknesses.sum())

    @property
    def interface_heights(self) -> np.ndarray:
        """Heights z of the n-1 interfaces above the bottom face [m]."""
        return np.cumsum(self.thicknesses)[:-1]

    @property
    def labels(self) -> tuple[str, ...]:
        return tuple(layer.name for layer in self.layers)

    def reversed(self) -> "Stack":
        """The same stack turned upside down (top layer first)."""
        return Stack(self.layers[::-1])

    def with_layer(self, index: int, layer: Layer) -> "Stack":
        layers = list(self.layers)
        layers[index] = layer
        return Stack(tuple(layers))

    def with_thickness(self, index: int, thickness: float) -> "Stack":
        return self.with_layer(index, replace(self.layers[index], thickness=thickness))


@dataclass(frozen=True)
class Temperatures:
    """Stress-free (reference) temperature and operating temperature(s), absolute, in kelvin.

    ``operating`` may be an array; results then carry one value per operating temperature.
    """

    stress_free: float
    operating: "float | np.ndarray"

    def __post_init__(self):
        check_range("stress_free_temperature", self.stress_free, 0.0, 5000.0, unit="K")
        object.__setattr__(self, "stress_free", float(self.stress_free))
        operating = np.asarray(self.operating, float)
        if operating.ndim == 0:
            check_range("operating_temperature", float(operating), 0.0, 5000.0, unit="K")
            object.__setattr__(self, "operating", float(operating))
        else:
            if not np.all(np.isfinite(operating)) or np.any(operating <= 0) or np.any(operating >= 5000):
                bad = operating[~(np.isfinite(operating) & (operating > 0) & (operating < 5000))][0]
                raise InputError("operating_temperature", float(bad), "0 < T < 5000 K (absolute)")
            operating = operating.copy()
            operating.setflags(write=False)
            object.__setattr__(self, "operating", operating)

    @classmethod
    def from_change(cls, change: float, stress_free: float = 293.15) -> "Temperatures":
        """A plain temperature change [K] from a stress-free temperature (default 20 degC)."""
        check_finite("temperature_change", change)
        return cls(stress_free, stress_free + np.asarray(change, float))

    @property
    def change(self) -> "float | np.ndarray":
        """Delta T = T_operating - T_stress_free [K]."""
        if np.ndim(self.operating):
            return np.asarray(self.operating) - self.stress_free
        return self.operating - self.stress_free

    def __eq__(self, other):
        if not isinstance(other, Temperatures):
            return NotImplemented
        return self.stress_free == other.stress_free and np.array_equal(self.operating, other.operating)

    def __hash__(self):
        return hash((self.stress_free, np.asarray(self.operating).tobytes()))


def evaluate(
    stack: Stack,
    temperatures: Temperatures,
    state: "BendingState | str" = BendingState.NARROW,
    axial_force: float = 0.0,
    bending_moment: float = 0.0,
    restraint: str = "free",
) -> "StackResult":
    """Curvature and stresses of ``stack`` for a temperature change plus optional loads.

    ``axial_force`` [N/m] and ``bending_moment`` [N m/m] are per unit width (equal-biaxial
    resultants in the plate state); the force acts along the bending axis and the moment is taken
    about it. Loads superpose with the thermal solution. See :mod:`bilayer.core.laminate` for equations.
    """
    from .results import build_result

    if not isinstance(stack, Stack):
        raise InputError("stack", stack, "a Stack")
    if not isinstance(temperatures, Temperatures):
        raise InputError("temperatures", temperatures, "a Temperatures(stress_free, operating)")
    state = BendingState.parse(state)
    axial_force = check_finite("axial_force", axial_force)
    bending_moment = check_finite("bending_moment", bending_moment)
    return build_result(stack, temperatures, state, axial_force, bending_moment, restraint)


@dataclass(frozen=True)
class Design:
    """Everything needed to reproduce a calculation: stack, conditions and job sections.

    ``sections`` holds job-specific inputs (thermostat element, solder joint, film, ...) as
    read-only mappings of SI values, keyed by section name.
    """

    stack: Stack
    temperatures: Temperatures
    state: BendingState = BendingState.NARROW
    axial_force: float = 0.0
    bending_moment: float = 0.0
    name: str = ""
    notes: str = ""
    sections: Mapping[str, Mapping[str, object]] = field(default_factory=dict)

    def __post_init__(self):
        if not isinstance(self.stack, Stack):
            raise InputError("design.stack", self.stack, "a Stack")
        if not isinstance(self.temperatures, Temperatures):
            raise InputError("design.temperatures", self.temperatures, "a Temperatures")
        object.__setattr__(self, "state", BendingState.parse(self.state))
        object.__setattr__(self, "axial_force", check_finite("axial_force", self.axial_force))
        object.__setattr__(self, "bending_moment", check_finite("bending_moment", self.bending_moment))
        frozen = {str(k): MappingProxyType(dict(v)) for k, v in dict(self.sections).items()}
        object.__setattr__(self, "sections", MappingProxyType(frozen))

    def __eq__(self, other):
        if not isinstance(other, Design):
            return NotImplemented
        return (
            self.stack == other.stack
            and self.temperatures == other.temperatures
            and self.state == other.state
            and self.axial_force == other.axial_force
            and self.bending_moment == other.bending_moment
            and self.name == other.name
            and self.notes == other.notes
            and {k: dict(v) for k, v in self.sections.items()}
            == {k: dict(v) for k, v in other.sections.items()}
        )

    __hash__ = None  # designs compare by value; sections make them unhashable

    def evaluate(self) -> "StackResult":
        """Run the engine on this design."""
        return evaluate(self.stack, self.temperatures, self.state, self.axial_force, self.bending_moment)

    def replace(self, **changes) -> "Design":
        """A new design with some fields changed (designs are immutable)."""
        return replace(self, **changes)

    def with_section(self, name: str, values: Mapping[str, object]) -> "Design":
        sections = dict(self.sections)
        sections[name] = values
        return replace(self, sections=sections)
