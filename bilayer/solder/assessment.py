"""The solder job on a design: the ``[solder_joint]`` table turned into one joint check, the warpage at
the cycle extremes and the scatter from the tolerances (:func:`assess_solder_design`)."""
from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from ..core.errors import InputError
from ..core.progress import Progress
from ..core.scatter import Tolerance
from .acceleration import user_acceleration_set
from .geometry import AreaArrayJoint, LeadedJoint, LeadlessJoint
from .joint import CycleProfile, SolderJointResult, check_solder_joint, preset_cycle
from .life_laws import LIFE_LAWS, CoffinManson, EnergyLaw, user_constant
from .tolerances import SolderScatter, WarpageModel, joint_scatter
from .warpage import WarpageResult, assembly_warpage

if TYPE_CHECKING:  # pragma: no cover
    from ..core.stack import Design

__all__ = ["SolderAssessment", "assess_solder_design", "joint_from_section", "law_from_section",
           "warpage_temperatures"]


@dataclass(frozen=True, eq=False)
class SolderAssessment:
    """Joint screening, assembly warpage (when an outline is given) and scatter (when tolerances are
    given: first order, and Monte Carlo when asked) of one design."""

    joint: SolderJointResult
    warpage: WarpageResult | None
    scatter: tuple[SolderScatter, ...] = ()

    @property
    def warnings(self) -> tuple[str, ...]:
        texts = list(self.joint.warnings)
        if self.warpage is not None:
            texts += self.warpage.warnings
        for item in self.scatter:
            texts += item.warnings
        return tuple(dict.fromkeys(texts))

    @property
    def cautions(self) -> tuple[str, ...]:
        return self.joint.cautions

    def to_dict(self) -> dict:
        return {
            "solder_joint": self.joint.to_dict(),
            "warpage": None if self.warpage is None else self.warpage.to_dict(),
            "scatter": [item.to_dict() for item in self.scatter],
            "warnings": list(self.warnings),
        }


def _design_material(design, name: str):
    """A material named in a section: a layer material with that key or name, else the library."""
    from ..core.materials import get_material

    for layer in design.stack.layers:
        if name in (layer.material.key, layer.material.name):
            return layer.material
    return get_material(name)


def _layer_number(design, values, key: str, default: int) -> int:
    number = values.get(key, default)
    if not 1 <= number <= design.stack.n_layers:
        raise InputError(f"solder_joint.{key}", number, f"a layer number 1 to {design.stack.n_layers}")
    return number


def joint_from_section(values: dict):
    """The joint geometry of a ``[solder_joint]`` table."""
    kind = values.get("joint_type", "chip_carrier")
    underfilled = values.get("underfill", False)
    if kind == "area_array":
        return AreaArrayJoint(values["standoff"], values.get("ball_pitch"), values.get("ball_columns"),
                              values.get("ball_rows"), values.get("dnp"), values.get("joint_height"), underfilled)
    if kind == "leaded":
        return LeadedJoint(values["dnp"], values["standoff"], values["lead_stiffness"], values["joint_area"],
                           underfilled)
    return LeadlessJoint(values["dnp"], values["standoff"], kind, underfilled)


def law_from_section(values: dict) -> "CoffinManson | EnergyLaw | None":
    """The life law a ``[solder_joint]`` table asks for (None: chosen by the solder's alloy family)."""
    choice = values.get("life_law", "by_solder")
    if choice == "coffin_manson":
        optional = {name: user_constant(values[key], unit) for name, key, unit in (
            ("temperature_term", "exponent_temperature_term", "1/degC"), ("dwell_term", "exponent_dwell_term", "1"))
            if key in values}
        return CoffinManson("coffin_manson", "Coffin-Manson (the user's constants)",
                            values.get("strain_measure", "shear"), user_constant(values["ductility"]),
                            user_constant(values["fatigue_exponent"]), source="the user's constants", **optional)
    if choice == "energy":
        growth = {}
        if "growth_coefficient" in values:
            growth = {"growth_coefficient": user_constant(values["growth_coefficient"], "m/cycle"),
                      "growth_exponent": user_constant(values["growth_exponent"]),
                      "crack_length": user_constant(values["crack_length"], "m")}
        return EnergyLaw("energy", "energy law (the user's constants)", user_constant(values["energy_coefficient"],
                                                                                      "cycles"),
                         user_constant(values["energy_exponent"]), source="the user's constants", **growth)
    if choice == "by_solder":
        return None
    law = LIFE_LAWS[choice]
    if isinstance(law, EnergyLaw) and "crack_length" in values:
        law = law.with_crack_length(values["crack_length"])
    return law


def warpage_temperatures(field: CycleProfile, test: CycleProfile | None) -> tuple[tuple[float, ...], tuple[str, ...]]:
    """The extremes of the field (and test) cycle, sorted, each with its role ("field low", "test high");
    equal temperatures share one entry whose label names both roles."""
    roles: dict[float, list[str]] = {}
    for name, cycle in (("field", field), ("test", test)):
        if cycle is not None:
            roles.setdefault(cycle.low, []).append(f"{name} low")
            roles.setdefault(cycle.high, []).append(f"{name} high")
    temperatures = tuple(sorted(roles))
    return temperatures, tuple(" and ".join(roles[t]) for t in temperatures)


def _tolerances(values: dict) -> dict[str, Tolerance]:
    out = {}
    for key in ("dnp", "standoff", "cte_component", "cte_board", "factor"):
        if values.get(f"tolerance_{key}"):
            out[key] = Tolerance(values[f"tolerance_{key}"])
    if values.get("tolerance_cycle"):
        out["cycle_low"] = Tolerance(values["tolerance_cycle"], relative=False)
        out["cycle_high"] = Tolerance(values["tolerance_cycle"], relative=False)
    return out


def assess_solder_design(design: "Design", progress: Progress | None = None) -> SolderAssessment:
    """Run the ``[solder_joint]`` section of a design: joint check, warpage and scatter.

    The board and component CTEs come from the design's layers; the warpage uses the design's stack
    and state with the stress-free temperature from [conditions] (an effective value) or the solder
    solidus (``stress_free_basis = "solidus"``), at the extremes of the field and test cycles (or the
    design's operating temperatures, ``warpage_at = "conditions"``).
    """
    if "solder_joint" not in design.sections:
        raise InputError("design.sections", sorted(design.sections), "a [solder_joint] section")
    values = dict(design.sections["solder_joint"])
    board_number = _layer_number(design, values, "board_layer", 1)
    component_number = _layer_number(design, values, "component_layer", design.stack.n_layers)
    if board_number == component_number:
        raise InputError("solder_joint.component_layer", component_number, "a layer other than the board's")
    board = design.stack[board_number - 1].material
    component = design.stack[component_number - 1].material
    solder = _design_material(design, values["solder_material"]) if "solder_material" in values else None
    rate = values["cycle_rate"] * 86400.0
    field_cycle = CycleProfile(values["cycle_low"], values["cycle_high"], values["dwell"], rate, "field cycle")
    board_cycle = None
    if "board_cycle_low" in values:
        board_cycle = CycleProfile(values["board_cycle_low"], values["board_cycle_high"], values["dwell"], rate,
                                   "board cycle")
    test = None
    if "test_cycle" in values:
        test_rate = values.get("test_cycle_rate")
        test = preset_cycle(values["test_cycle"], values.get("test_dwell"),
                            None if test_rate is None else test_rate * 86400.0)
    nl_set = values.get("acceleration_set", "by_solder")
    if nl_set == "by_solder":
        nl_set = None
    elif nl_set == "user":
        nl_set = user_acceleration_set(values["acceleration_n"], values["acceleration_m"],
                                       values["acceleration_activation"])
    joint = check_solder_joint(
        joint_from_section(values), component, board, field_cycle, values.get("nonideality_factor"),
        board_cycle=board_cycle, solder=solder, life_law=law_from_section(values),
        accept_other_alloy=values.get("accept_other_alloy", False),
        inelastic_strain_range=values.get("inelastic_strain_range"), energy_density=values.get("energy_density"),
        test_inelastic_strain_range=values.get("test_inelastic_strain_range"),
        test_energy_density=values.get("test_energy_density"), weibull_shape=values.get("weibull_shape", 4.0),
        early_fraction=values.get("early_fraction", 0.01), test=test, acceleration_set=nl_set,
    )
    warpage = None
    if "outline_length" in values:
        by_solidus = values.get("stress_free_basis", "conditions") == "solidus"
        if values.get("warpage_at", "cycles") == "cycles":
            temperatures, labels = warpage_temperatures(field_cycle, joint.test)
        else:
            temperatures, labels = design.temperatures.operating, ()
        warpage = assembly_warpage(
            design.stack, np.asarray(temperatures, float) if labels else temperatures, values["outline_length"],
            values.get("outline_width"), solder=solder if by_solidus else None,
            stress_free_temperature=None if by_solidus else design.temperatures.stress_free,
            state=design.state.value, labels=labels,
        )
        if labels and board_cycle is not None:
            warpage = _with_warning(warpage, "the warpage is for the whole assembly at one temperature (the joint's "
                                    "cycle extremes); with the board at other temperatures (power cycling) it differs")
    scatter = ()
    tolerances = _tolerances(values)
    if tolerances:
        model = None if warpage is None else WarpageModel(design.stack, board_number - 1, component_number - 1, warpage)
        scatter = (joint_scatter(joint, component, board, tolerances, warpage=model),)
        if values.get("monte_carlo", True):
            scatter += (joint_scatter(joint, component, board, tolerances, warpage=model, method="monte carlo",
                                      samples=values.get("samples", 100_000), progress=progress),)
    return SolderAssessment(joint, warpage, scatter)


def _with_warning(warpage: WarpageResult, text: str) -> WarpageResult:
    from dataclasses import replace

    return replace(warpage, warnings=warpage.warnings + (text,))
