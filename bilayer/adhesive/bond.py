"""Adhesive bonds under temperature change: end shear and peel from the interface model, the cure
temperature as stress-free reference, glass-transition checks, allowables and sweeps.

The joint is two adherends bonded over an overlap by an adhesive layer of thickness h0 (the bond
line)::

      upper adherend (layer 3)
    ================================   adhesive, h0 (layer 2, shear and peel only)
      lower adherend (layer 1)
    |<---------- overlap ---------->|

End shear and peel come from :mod:`bilayer.strip.interface` (nothing is re-derived here): with
``model="bending"`` the free joint bends (Suhir-type shear lag with layer and bond compliances, peel
with through-thickness compliance); with ``model="no_bending"`` bending is suppressed (Chen & Nelson,
IBM J. Res. Dev. 23:179, 1979), the long-joint end shear is

    tau_end = |Delta| sqrt(G0/h0) / sqrt(1/(E1 t1) + 1/(E2 t2)) tanh(k l),   k^2 = (G0/h0)(1/(E1 t1) + 1/(E2 t2))

and no peel is given. Delta = (alpha_2 - alpha_1)(T - T_0) for constant CTEs; T_0 is the stress-free
temperature: the cure temperature, or the adhesive's glass transition when that is lower (a rubbery
adhesive above Tg stores little stress).

Signs: tau is the shear traction on the top face of the lower adherend, positive in +x, reported at
the right end (x = overlap); peel is positive in tension across the bond line.
"""
from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from ..core.cautions import CAUTIONS
from ..core.errors import InputError, check_range, warn_suspicious
from ..core.units import from_si

__all__ = [
    "ADHESIVE_CAUTIONS",
    "AdhesiveJoint",
    "AdhesiveResult",
    "check_adhesive_joint",
    "AdhesiveSweep",
    "SWEEP_PARAMETERS",
    "sweep_adhesive_joint",
    "AdhesiveAssessment",
    "joint_from_design",
    "assess_adhesive_design",
]


ADHESIVE_CAUTIONS = (
    "Screening estimate only: end shear and peel come from a beam-type interface model. Qualification "
    "by test (for electronics: IPC-9701 and the JEDEC temperature-cycling standards; otherwise the "
    "standard that applies) and the customer's requirements decides.",
    "Model limits: the exact stresses at a free end are singular or steep; the end values here are "
    "nominal and depend on the bond and adherend compliances. Viscoelastic relaxation, moisture uptake, "
    "cure shrinkage, voids and fillets are not modelled.",
    "Above the glass transition the adhesive modulus drops by one to three orders of magnitude and its "
    "CTE rises; results across Tg need temperature-dependent data.",
)
"""Job-specific cautions; results carry them after the shared :data:`bilayer.core.cautions.CAUTIONS`."""

SWEEP_PARAMETERS = ("bond_line", "overlap", "adhesive_modulus")


@dataclass(frozen=True)
class AdhesiveJoint:
    """Inputs of a bonded joint (SI): adherends, adhesive, bond line, overlap, stress-free temperature.

    ``stress_free_temperature`` is the cure temperature unless the user sets the adhesive's Tg.
    ``state`` is the bending state of the engine ("narrow", "wide", "plate"); ``model`` "bending" or
    "no_bending" (see the module docstring).
    """

    lower: object
    lower_thickness: float
    adhesive: object
    bond_line: float
    upper: object
    upper_thickness: float
    overlap: float
    stress_free_temperature: float
    state: str = "narrow"
    model: str = "bending"

    def __post_init__(self):
        from ..core.materials import Material, get_material
        from ..core.stack import BendingState

        for name in ("lower", "adhesive", "upper"):
            value = getattr(self, name)
            if isinstance(value, str):
                object.__setattr__(self, name, get_material(value))
            elif not isinstance(value, Material):
                raise InputError(name, value, "a Material or a library material name")
        for name, high in (("lower_thickness", 1.0), ("upper_thickness", 1.0), ("bond_line", 0.1), ("overlap", 100.0)):
            object.__setattr__(self, name, check_range(name, getattr(self, name), 0.0, high, unit="m"))
        object.__setattr__(
            self,
            "stress_free_temperature",
            check_range("stress_free_temperature", self.stress_free_temperature, 0.0, 5000.0, unit="K"),
        )
        object.__setattr__(self, "state", BendingState.parse(self.state).value)
        if self.model not in ("bending", "no_bending"):
            raise InputError("model", self.model, "'bending' or 'no_bending'")
        if not 1e-6 <= self.bond_line <= 5e-3:
            warn_suspicious("bond_line", self.bond_line, "adhesive bond lines are usually 1 um to 5 mm")

    @property
    def stack(self):
        """The three-layer stack (lower adherend, adhesive, upper adherend) for the engine."""
        from ..core.stack import Layer, Stack

        return Stack(
            (
                Layer(self.lower, self.lower_thickness, "lower adherend"),
                Layer(self.adhesive, self.bond_line, "adhesive"),
                Layer(self.upper, self.upper_thickness, "upper adherend"),
            )
        )

    def with_changes(self, **changes) -> "AdhesiveJoint":
        """A new joint with some fields changed (joints are immutable)."""
        return replace(self, **changes)


@dataclass(frozen=True, eq=False)
class AdhesiveResult:
    """End shear and peel at each operating temperature, with margins against the allowables (SI)."""

    joint: AdhesiveJoint
    operating_temperatures: np.ndarray
    temperature_change: np.ndarray
    end_shear: np.ndarray  # signed tau at the right end [Pa]
    max_peel: np.ndarray  # largest tensile peel [Pa] (NaN without bending)
    min_peel: np.ndarray  # largest compressive peel [Pa]
    mid_force: np.ndarray  # axial force of the lower adherend at mid-overlap [N/m]
    decay_length: float  # 1/k [m]
    peel_decay_length: float  # 1/beta [m] (NaN without bending)
    allowable_shear: float | None
    allowable_peel: float | None
    interface_results: tuple
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    cautions: tuple[str, ...] = field(default=CAUTIONS + ADHESIVE_CAUTIONS)

    @property
    def worst_shear(self) -> float:
        """Largest |end shear| over the operating temperatures [Pa]."""
        return float(np.max(np.abs(self.end_shear)))

    @property
    def worst_peel(self) -> float:
        """Largest tensile peel over the operating temperatures [Pa] (NaN without bending)."""
        return float(np.max(self.max_peel)) if np.all(np.isfinite(self.max_peel)) else float("nan")

    @property
    def shear_margin(self) -> float | None:
        """allowable shear / worst |end shear| (> 1 passes)."""
        return None if self.allowable_shear is None else self.allowable_shear / self.worst_shear

    @property
    def peel_margin(self) -> float | None:
        """allowable peel / worst tensile peel (> 1 passes); None without an allowable or without peel."""
        if self.allowable_peel is None or not np.isfinite(self.worst_peel) or self.worst_peel <= 0:
            return None
        return self.allowable_peel / self.worst_peel

    def to_dict(self) -> dict:
        from ..core.jsonable import plain

        j = self.joint
        return {
            "lower": {"material": j.lower.name, "thickness": j.lower_thickness},
            "adhesive": {
                "material": j.adhesive.name,
                "bond_line": j.bond_line,
                "youngs_modulus": j.adhesive.youngs_modulus,
                "shear_modulus": j.adhesive.shear_modulus,
                "glass_transition": j.adhesive.glass_transition,
            },
            "upper": {"material": j.upper.name, "thickness": j.upper_thickness},
            "overlap": j.overlap,
            "stress_free_temperature": j.stress_free_temperature,
            "bending_state": j.state,
            "model": j.model,
            "operating_temperatures": plain(self.operating_temperatures),
            "temperature_change": plain(self.temperature_change),
            "end_shear": plain(self.end_shear),
            "max_peel": plain(self.max_peel),
            "min_peel": plain(self.min_peel),
            "mid_force": plain(self.mid_force),
            "decay_length": self.decay_length,
            "peel_decay_length": plain(self.peel_decay_length),
            "worst_shear": self.worst_shear,
            "worst_peel": plain(self.worst_peel),
            "allowable_shear": self.allowable_shear,
            "allowable_peel": self.allowable_peel,
            "shear_margin": self.shear_margin,
            "peel_margin": self.peel_margin,
            "sign_convention": "shear: traction on the lower adherend's top face at the right end, +x positive; "
            "peel: tension across the bond line positive",
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "cautions": list(self.cautions),
            "units": {
                "thickness": "m", "bond_line": "m", "overlap": "m", "youngs_modulus": "Pa",
                "shear_modulus": "Pa", "glass_transition": "K", "stress_free_temperature": "K",
                "operating_temperatures": "K", "temperature_change": "K", "end_shear": "Pa",
                "max_peel": "Pa", "min_peel": "Pa", "mid_force": "N/m", "decay_length": "m",
                "peel_decay_length": "m", "worst_shear": "Pa", "worst_peel": "Pa",
                "allowable_shear": "Pa", "allowable_peel": "Pa", "shear_margin": "1", "peel_margin": "1",
            },
        }


def _operating(operating) -> np.ndarray:
    T = np.atleast_1d(np.asarray(operating, float)).ravel()
    if T.size == 0 or not np.all(np.isfinite(T)) or np.any(T <= 0):
        raise InputError("operating_temperature", T.tolist(), "absolute temperatures > 0 K")
    return T


def _glass_transition_warnings(joint: AdhesiveJoint, T: np.ndarray) -> list[str]:
    tg = joint.adhesive.glass_transition
    if tg is None:
        return ["adhesive glass transition not given: cannot check whether the range crosses it"]
    messages = []
    low, high = float(T.min()), float(T.max())
    tg_c = from_si(tg, "temperature", "degC")
    if low < tg < high:
        messages.append(
            f"the operating range {from_si(low, 'temperature', 'degC'):.0f} to {from_si(high, 'temperature', 'degC'):.0f} degC crosses the "
            f"adhesive glass transition ({tg_c:.0f} degC): modulus and CTE change there; the elastic results "
            "on the hot side are not valid with these constants"
        )
    elif high > tg:
        messages.append(
            f"operating temperatures above the adhesive glass transition ({tg_c:.0f} degC): the adhesive "
            "is rubbery there and its data must be the above-Tg values"
        )
    if tg < joint.stress_free_temperature:
        messages.append(
            f"the adhesive glass transition ({tg_c:.0f} degC) is below the stress-free temperature "
            f"({from_si(joint.stress_free_temperature, 'temperature', 'degC'):.0f} degC): little stress builds while the "
            "adhesive is rubbery, so Tg is usually the better stress-free temperature"
        )
    return messages


def check_adhesive_joint(
    joint: AdhesiveJoint,
    operating,
    allowable_shear: float | None = None,
    allowable_peel: float | None = None,
    points: int = 201,
) -> AdhesiveResult:
    """End shear and peel of ``joint`` at each operating temperature [K] (a value or an array).

    ``allowable_shear`` and ``allowable_peel`` [Pa] are the user's allowable stresses at temperature;
    the margins are allowable / worst stress. Uses :func:`bilayer.strip.interface.interface_stresses`.
    """
    from ..strip.interface import interface_stresses
    from ..core.stack import Temperatures

    if not isinstance(joint, AdhesiveJoint):
        raise InputError("joint", joint, "an AdhesiveJoint")
    T = _operating(operating)
    if allowable_shear is not None:
        allowable_shear = check_range("allowable_shear", allowable_shear, 0.0, unit="Pa")
    if allowable_peel is not None:
        allowable_peel = check_range("allowable_peel", allowable_peel, 0.0, unit="Pa")
    stack = joint.stack
    results = []
    for t in T:
        results.append(
            interface_stresses(
                stack, Temperatures(joint.stress_free_temperature, float(t)), joint.overlap, joint.state,
                bonds=(1,), model=joint.model, points=points,
            )
        )
    profiles = [r.interfaces[0] for r in results]
    params = profiles[0].parameters
    half = 0.5 * joint.overlap
    end_shear = np.array([p.max_shear for p in profiles])
    mid_force = np.array([float(p.parameters.force_and_shear(np.array([0.0]), half)[0][0]) for p in profiles])
    max_peel = np.array([p.max_peel for p in profiles])
    min_peel = np.array([p.min_peel for p in profiles])

    warnings: list[str] = []
    for r in results:
        for message in r.warnings:
            if message not in warnings:
                warnings.append(message)
    warnings += _glass_transition_warnings(joint, T)
    worst_shear = float(np.max(np.abs(end_shear)))
    if allowable_shear is not None and worst_shear > allowable_shear:
        warnings.append(
            f"end shear {worst_shear / 1e6:.3g} MPa exceeds the allowable {allowable_shear / 1e6:.3g} MPa: "
            "expect cracking or yielding at the ends"
        )
    if allowable_peel is not None and joint.model == "bending" and np.max(max_peel) > allowable_peel:
        warnings.append(
            f"tensile peel {np.max(max_peel) / 1e6:.3g} MPa exceeds the allowable {allowable_peel / 1e6:.3g} MPa"
        )
    if joint.model == "no_bending":
        warnings.append("no-bending model: peel is not computed; bending must really be prevented for this "
                        "shear to hold (symmetric or clamped joints)")
    return AdhesiveResult(
        joint=joint,
        operating_temperatures=T,
        temperature_change=T - joint.stress_free_temperature,
        end_shear=end_shear,
        max_peel=max_peel,
        min_peel=min_peel,
        mid_force=mid_force,
        decay_length=params.decay_length,
        peel_decay_length=params.peel_decay_length,
        allowable_shear=allowable_shear,
        allowable_peel=allowable_peel,
        interface_results=tuple(results),
        warnings=tuple(warnings),
        assumptions=tuple(results[0].assumptions) + (
            "stress-free at the given temperature (cure, or Tg when lower); elastic constants constant over the range",
        ),
    )


@dataclass(frozen=True)
class AdhesiveSweep:
    """End shear and peel as one joint parameter varies, at one operating temperature (SI)."""

    parameter: str
    values: np.ndarray
    operating_temperature: float
    end_shear: np.ndarray
    max_peel: np.ndarray
    decay_length: np.ndarray
    assumptions: tuple[str, ...]
    cautions: tuple[str, ...] = field(default=CAUTIONS + ADHESIVE_CAUTIONS)

    def to_dict(self) -> dict:
        from ..core.jsonable import plain

        unit = {"bond_line": "m", "overlap": "m", "adhesive_modulus": "Pa"}[self.parameter]
        return {
            "parameter": self.parameter,
            "values": plain(self.values),
            "operating_temperature": self.operating_temperature,
            "end_shear": plain(self.end_shear),
            "max_peel": plain(self.max_peel),
            "decay_length": plain(self.decay_length),
            "assumptions": list(self.assumptions),
            "cautions": list(self.cautions),
            "units": {"values": unit, "operating_temperature": "K", "end_shear": "Pa", "max_peel": "Pa",
                      "decay_length": "m"},
        }


def sweep_adhesive_joint(joint: AdhesiveJoint, operating_temperature: float, parameter: str, values) -> AdhesiveSweep:
    """End shear, peel and decay length of ``joint`` as ``parameter`` takes ``values``.

    ``parameter``: "bond_line" [m], "overlap" [m] or "adhesive_modulus" [Pa] (Young's modulus of the
    adhesive, Poisson's ratio kept, so the shear modulus scales with it).
    """
    if parameter not in SWEEP_PARAMETERS:
        raise InputError("parameter", parameter, "one of " + ", ".join(SWEEP_PARAMETERS))
    values = np.asarray(values, float).ravel()
    if values.size == 0 or not np.all(np.isfinite(values)) or np.any(values <= 0):
        raise InputError(f"{parameter} values", values.tolist(), "finite values > 0")
    T = check_range("operating_temperature", operating_temperature, 0.0, 5000.0, unit="K")
    shear, peel, decay = [], [], []
    assumptions: tuple[str, ...] = ()
    for value in values:
        if parameter == "adhesive_modulus":
            changed = joint.with_changes(adhesive=joint.adhesive.with_changes(youngs_modulus=float(value)))
        else:
            changed = joint.with_changes(**{parameter: float(value)})
        result = check_adhesive_joint(changed, T, points=3)
        shear.append(result.end_shear[0])
        peel.append(result.max_peel[0])
        decay.append(result.decay_length)
        assumptions = result.assumptions
    return AdhesiveSweep(
        parameter=parameter,
        values=values,
        operating_temperature=T,
        end_shear=np.array(shear),
        max_peel=np.array(peel),
        decay_length=np.array(decay),
        assumptions=assumptions,
    )


# ---------------------------------------------------------------------------------- design files
@dataclass(frozen=True, eq=False)
class AdhesiveAssessment:
    """The check of one design at its operating temperatures plus the sweeps it asks for."""

    result: AdhesiveResult
    sweeps: tuple[AdhesiveSweep, ...]

    @property
    def warnings(self) -> tuple[str, ...]:
        return self.result.warnings

    @property
    def cautions(self) -> tuple[str, ...]:
        return self.result.cautions

    def to_dict(self) -> dict:
        return {"adhesive_bond": self.result.to_dict(), "sweeps": [s.to_dict() for s in self.sweeps]}


def joint_from_design(design) -> AdhesiveJoint:
    """The :class:`AdhesiveJoint` of a three-layer design (lower adherend, adhesive, upper adherend)."""
    if "adhesive_bond" not in design.sections:
        raise InputError("design.sections", sorted(design.sections), "an [adhesive_bond] section")
    if design.stack.n_layers != 3:
        raise InputError("design.layers", design.stack.n_layers,
                         "3 layers: lower adherend, adhesive, upper adherend (bottom first)")
    values = design.sections["adhesive_bond"]
    lower, bond, upper = design.stack.layers
    return AdhesiveJoint(
        lower.material, lower.thickness, bond.material, bond.thickness, upper.material, upper.thickness,
        values["overlap"], design.temperatures.stress_free, design.state.value, values.get("model", "bending"),
    )


def assess_adhesive_design(design) -> AdhesiveAssessment:
    """Run the ``[adhesive_bond]`` section: end shear and peel at every operating temperature of the
    design and the requested sweeps (at ``sweep_temperature``, default the operating temperature
    farthest from the stress-free temperature)."""
    joint = joint_from_design(design)
    values = design.sections["adhesive_bond"]
    operating = np.atleast_1d(np.asarray(design.temperatures.operating, float))
    result = check_adhesive_joint(joint, operating, values.get("allowable_shear"), values.get("allowable_peel"))
    sweep_temperature = values.get(
        "sweep_temperature", float(operating[np.argmax(np.abs(operating - joint.stress_free_temperature))])
    )
    sweeps = tuple(
        sweep_adhesive_joint(joint, sweep_temperature, parameter, values[f"sweep_{parameter}"])
        for parameter in SWEEP_PARAMETERS
        if f"sweep_{parameter}" in values
    )
    return AdhesiveAssessment(result, sweeps)
