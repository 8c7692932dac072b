"""Solder joints under temperature cycling: the cycles, the joint check and its result.

One call, :func:`check_solder_joint`, screens a joint:

    mismatch       eps_board - eps_component, each the integral of alpha dT over the part's own cycle
    shear strain   from the joint geometry (:mod:`bilayer.solder.geometry`: leadless, area array, leads)
    life           by the life law (:mod:`bilayer.solder.life_laws`), chosen by the solder's alloy family
                   (:mod:`bilayer.solder.alloys`) unless the user names one; a law or acceleration set of
                   another family is refused unless accepted, and then carried as a warning
    spread         Weibull: eta = N_50 / (ln 2)^(1/beta),  N(p) = eta (-ln(1 - p))^(1/beta)
    test cycle     Norris-Landzberg factor and the one chamber life (:mod:`bilayer.solder.acceleration`)
    local mismatch |eps_solder - eps_part| beside it (not amplified by L_D/h)

Defaults by the solder's family: tin-lead (and a joint whose alloy is not known, with a warning) takes
Engelmaier-Wild and the 1969 Sn-Pb acceleration set; tin-silver-copper takes the 2012 SAC305
acceleration set and has no built-in life law with constants that could be read in their source, so
it needs the user's law (Coffin-Manson or energy constants of the alloy, or a named set flagged "from
memory"); other lead-free alloys need the user's law and acceleration exponents.
"""
from __future__ import annotations

from dataclasses import dataclass, field
from types import MappingProxyType
from typing import Mapping

import numpy as np

from ..core.cautions import CAUTIONS
from ..core.errors import InputError, check_range, warn_suspicious
from ..core.units import from_si, to_si
from .acceleration import (NORRIS_LANDZBERG_CONVENTION, NORRIS_LANDZBERG_SETS, ChamberLife, NorrisLandzbergSet,
                           chamber_life, norris_landzberg_factor)
from .acceleration import acceleration_set as named_acceleration_set
from .alloys import OTHER_LEAD_FREE, TIN_SILVER_COPPER, AlloyFamily, alloy_family, family_check
from .cautions import SOLDER_CAUTIONS
from .geometry import FACTOR_GUIDANCE, JOINT_TYPES, AreaArrayJoint, LeadedJoint, LeadlessJoint
from .life_laws import ENGELMAIER_WILD, LIFE_LAWS, CoffinManson, EnergyLaw, weibull_life, weibull_scale

__all__ = [
    "CycleProfile",
    "CYCLING_PRESETS",
    "preset_cycle",
    "thermal_strain",
    "default_life_law",
    "default_acceleration_set",
    "SolderJointResult",
    "check_solder_joint",
]

# --------------------------------------------------------------------------------------------- cycles
@dataclass(frozen=True)
class CycleProfile:
    """A temperature cycle: extremes [K], half-cycle dwell [s] (time at each extreme), cycles per day."""

    low: float
    high: float
    dwell: float = 900.0
    cycles_per_day: float = 24.0
    name: str = ""
    note: str = ""

    def __post_init__(self):
        low = check_range("cycle.low", self.low, 0.0, 5000.0, unit="K")
        high = check_range("cycle.high", self.high, 0.0, 5000.0, unit="K")
        if high <= low:
            raise InputError("cycle.high", high, f"a temperature above cycle.low = {low:g} K")
        dwell = check_range("cycle.dwell", self.dwell, 0.0, 30 * 86400.0, unit="s")
        rate = check_range("cycle.cycles_per_day", self.cycles_per_day, 0.0, 1e5, unit="1/day")
        if 2.0 * dwell > 86400.0 / rate:
            raise InputError(
                "cycle.dwell",
                dwell,
                f"2 x dwell <= cycle period {86400.0 / rate:g} s",
                "the dwells at both extremes must fit in one cycle",
            )
        for name, value in (("low", low), ("high", high), ("dwell", dwell), ("cycles_per_day", rate)):
            object.__setattr__(self, name, value)

    @property
    def swing(self) -> float:
        """Temperature range high - low [K]."""
        return self.high - self.low

    @property
    def mean(self) -> float:
        """Mean cyclic temperature (low + high)/2 [K]."""
        return 0.5 * (self.low + self.high)

    @property
    def label(self) -> str:
        return self.name or f"{from_si(self.low, 'temperature', 'degC'):+.0f}/{from_si(self.high, 'temperature', 'degC'):+.0f} degC"

    def with_timing(self, dwell: float | None = None, cycles_per_day: float | None = None) -> "CycleProfile":
        """The same range with another dwell [s] or cycling rate [1/day]."""
        return CycleProfile(
            self.low,
            self.high,
            self.dwell if dwell is None else dwell,
            self.cycles_per_day if cycles_per_day is None else cycles_per_day,
            self.name,
            self.note,
        )

    def to_dict(self) -> dict:
        return {
            "name": self.label,
            "low": self.low,
            "high": self.high,
            "swing": self.swing,
            "mean": self.mean,
            "dwell": self.dwell,
            "cycles_per_day": self.cycles_per_day,
            "note": self.note,
        }


_PRESET_TIMING = "dwell 15 min and 24 cycles/day are placeholders (common practice); set your chamber's"


def _preset(low_c: float, high_c: float, note: str) -> CycleProfile:
    name = f"{low_c:+.0f}/{high_c:+.0f}".replace("+0/", "0/")
    return CycleProfile(to_si(low_c, "temperature", "degC"), to_si(high_c, "temperature", "degC"), 900.0, 24.0, name, note + "; " + _PRESET_TIMING)


CYCLING_PRESETS: Mapping[str, CycleProfile] = MappingProxyType(
    {
        p.name: p
        for p in (
            _preset(0, 100, "IPC-9701 reference cycle TC1; JESD22-A104 letter J (both from memory)"),
            _preset(-25, 100, "IPC-9701 TC2 (from memory)"),
            _preset(-40, 85, "JESD22-A104 letter N (from memory)"),
            _preset(-40, 125, "IPC-9701 TC3; JESD22-A104 letter G (both from memory)"),
            _preset(-40, 150, "JESD22-A104 letter M (from memory)"),
            _preset(-55, 85, "JESD22-A104 letter A (secondary table, not verified)"),
            _preset(-55, 100, "IPC-9701 TC5 (from memory)"),
            _preset(-55, 125, "JESD22-A104 letter B (secondary table); IPC-9701 TC4 (from memory)"),
            _preset(-55, 150, "JESD22-A104 letter H (from memory)"),
            _preset(-65, 150, "JESD22-A104 letter C (secondary table, not verified)"),
            _preset(0, 125, "JESD22-A104 letter K (from memory)"),
        )
    }
)
"""Common temperature-cycling test ranges, named by their range in degC. Letter codes and IPC level
names beside them are recalled, not read in the standards: check the current edition."""


def preset_cycle(name: str, dwell: float | None = None, cycles_per_day: float | None = None) -> CycleProfile:
    """A preset from :data:`CYCLING_PRESETS` by its range name, e.g. "-40/+125" (degC), optionally re-timed."""
    def plain(text: str) -> str:
        return str(text).replace(" ", "").replace("degC", "").replace("+", "")

    matches = [preset for key, preset in CYCLING_PRESETS.items() if plain(key) == plain(name)]
    if not matches:
        raise InputError("test profile", name, "one of " + ", ".join(CYCLING_PRESETS))
    return matches[0].with_timing(dwell, cycles_per_day)


def thermal_strain(expansion, low, high):
    """Free thermal strain from ``low`` to ``high`` [K] (vectorised) of a Material, a CTE model or a constant
    CTE [1/K]."""
    cte = getattr(expansion, "cte", expansion)
    if hasattr(cte, "thermal_strain"):
        out = np.asarray(cte.thermal_strain(low, high), float)
    else:
        alpha = check_range("cte", cte, -1e-3, 1e-3, unit="1/K")
        out = alpha * (np.asarray(high, float) - np.asarray(low, float))
    return float(out) if out.ndim == 0 else out


def default_life_law(family: AlloyFamily) -> "CoffinManson | EnergyLaw":
    """The built-in law for the joint's alloy family: Engelmaier-Wild for tin-lead (and, with a warning,
    an alloy that is not known); a project error for lead-free alloys, which need the user's law."""
    if family.key in (TIN_SILVER_COPPER, OTHER_LEAD_FREE):
        raise InputError(
            "life_law", "by_solder", f"a life law for {family.label} solder",
            f"the solder is {family.label} ({family.basis}); no built-in life law for it has constants that "
            "could be read in their source, and the tin-lead Engelmaier-Wild law does not apply. Give the "
            "Coffin-Manson constants of your alloy (life_law = 'coffin_manson' with ductility and "
            "fatigue_exponent), an energy law (life_law = 'energy', or 'syed_2004_sac' whose constants are "
            "from memory), or, to use the tin-lead law anyway, life_law = 'engelmaier_wild' with "
            "accept_other_alloy = true (every output then carries a warning)")
    return ENGELMAIER_WILD


def default_acceleration_set(family: AlloyFamily) -> NorrisLandzbergSet:
    """The acceleration set for the joint's alloy family (see the module)."""
    if family.key == TIN_SILVER_COPPER:
        return NORRIS_LANDZBERG_SETS["sac305_2012"]
    if family.key == OTHER_LEAD_FREE:
        raise InputError(
            "acceleration_set", "by_solder", f"Norris-Landzberg exponents for {family.label} solder",
            "no built-in set is fitted on this alloy; give acceleration_n, acceleration_m and "
            "acceleration_activation, or name a set with accept_other_alloy = true")
    return NORRIS_LANDZBERG_SETS["snpb_1969"]


def _law(life_law, family: AlloyFamily) -> "CoffinManson | EnergyLaw":
    if life_law is None:
        return default_life_law(family)
    if isinstance(life_law, (CoffinManson, EnergyLaw)):
        return life_law
    if isinstance(life_law, str) and life_law in LIFE_LAWS:
        return LIFE_LAWS[life_law]
    raise InputError("life_law", life_law, "one of " + ", ".join(LIFE_LAWS)
                     + ", or a CoffinManson / EnergyLaw with the user's constants")


_MISSING = {"inelastic": "inelastic strain range", "energy": "inelastic energy density"}


def _measure(law) -> str:
    return "energy" if law.kind == "energy" else law.measure


# --------------------------------------------------------------------------------------- job result
@dataclass(frozen=True)
class SolderJointResult:
    """Solder-joint screening result: geometry, strains, the life law and its life and spread, the
    acceleration to a test cycle with the one chamber life, guidance notes (SI)."""

    joint: "LeadlessJoint | AreaArrayJoint | LeadedJoint"
    factor: float
    factor_given: bool
    cycle: CycleProfile
    board_cycle: CycleProfile
    mismatch_strain: float
    shear_strain: float
    local_mismatch_component: float | None
    local_mismatch_board: float | None
    alloy: AlloyFamily
    life_law: "CoffinManson | EnergyLaw"
    law_input: float
    law_input_origin: str
    fatigue_exponent: float | None
    median_life: float
    weibull_shape: float
    weibull_scale: float
    early_fraction: float
    early_life: float
    test: CycleProfile | None
    acceleration_set: NorrisLandzbergSet | None
    acceleration_factor: float | None
    test_law_input: float | None
    test_median_life: float | None
    chamber: ChamberLife | None
    notes: tuple[str, ...]
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    cautions: tuple[str, ...] = field(default=CAUTIONS + SOLDER_CAUTIONS)

    @property
    def dnp(self) -> float:
        return self.joint.dnp

    @property
    def standoff(self) -> float:
        return self.joint.standoff

    @property
    def joint_height(self) -> float:
        return self.joint.joint_height

    @property
    def ductility(self) -> float | None:
        """eps_f' of a strain law (None for an energy law)."""
        return self.life_law.ductility.value if self.life_law.kind == "strain" else None

    @property
    def law_input_name(self) -> str:
        return self.life_law.input_name

    def test_cycles_for(self, field_cycles: float) -> float:
        """Test cycles equivalent to ``field_cycles`` by the Norris-Landzberg factor."""
        if self.acceleration_factor is None:
            raise InputError("test", None, "a test cycle given to check_solder_joint")
        return check_range("field_cycles", field_cycles, 0.0) / self.acceleration_factor

    def to_dict(self) -> dict:
        energy = self.life_law.kind == "energy"
        return {
            "joint_type": self.joint.kind,
            "geometry": self.joint.to_dict(),
            "dnp": self.dnp,
            "standoff": self.standoff,
            "joint_height": self.joint_height,
            "factor": self.factor,
            "factor_given": self.factor_given,
            "factor_guidance": dict(zip(("low", "high", "source"), FACTOR_GUIDANCE[self.joint.kind])),
            "cycle": self.cycle.to_dict(),
            "board_cycle": self.board_cycle.to_dict(),
            "mismatch_strain": self.mismatch_strain,
            "shear_strain": self.shear_strain,
            "local_mismatch_component": self.local_mismatch_component,
            "local_mismatch_board": self.local_mismatch_board,
            "alloy": self.alloy.to_dict(),
            "life_law": self.life_law.to_dict(),
            "law_input": {"name": self.law_input_name, "value": self.law_input, "origin": self.law_input_origin,
                          "test_value": self.test_law_input, "unit": "J/m^3" if energy else "1"},
            "fatigue_exponent": self.fatigue_exponent,
            "ductility": self.ductility,
            "median_life": self.median_life,
            "weibull_shape": self.weibull_shape,
            "weibull_scale": self.weibull_scale,
            "early_fraction": self.early_fraction,
            "early_life": self.early_life,
            "test": None if self.test is None else self.test.to_dict(),
            "acceleration_set": None if self.acceleration_set is None else self.acceleration_set.to_dict(),
            "acceleration_convention": NORRIS_LANDZBERG_CONVENTION,
            "acceleration_factor": self.acceleration_factor,
            "test_median_life": self.test_median_life,
            "chamber_life": None if self.chamber is None else self.chamber.to_dict(),
            "notes": list(self.notes),
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "cautions": list(self.cautions),
            "units": {
                "dnp": "m", "standoff": "m", "joint_height": "m", "factor": "1", "mismatch_strain": "1",
                "shear_strain": "1", "local_mismatch_component": "1", "local_mismatch_board": "1",
                "fatigue_exponent": "1", "ductility": "1", "median_life": "cycles", "weibull_scale": "cycles",
                "early_life": "cycles", "test_median_life": "cycles", "acceleration_factor": "1",
                "cycle": "K, s, 1/day", "law_input": "1 (strain) or J/m^3 (energy)",
            },
        }

def _material_warnings(label: str, expansion, cycle: CycleProfile) -> list[str]:
    messages = []
    tg = getattr(expansion, "glass_transition", None)
    if tg is not None and cycle.low < tg < cycle.high:
        messages.append(
            f"{label}: the cycle crosses its glass transition ({from_si(tg, 'temperature', 'degC'):.0f} degC); its CTE rises "
            "above it, so use a CTE model that covers both sides"
        )
    cte = getattr(expansion, "cte", None)
    if cte is not None and hasattr(cte, "covers") and not cte.covers(cycle.low, cycle.high):
        messages.append(f"{label}: the cycle leaves its CTE data range; the strain is extrapolated")
    return messages




def check_solder_joint(
    joint: "LeadlessJoint | AreaArrayJoint | LeadedJoint",
    component,
    board,
    cycle: CycleProfile,
    factor: float | None = None,
    *,
    board_cycle: CycleProfile | None = None,
    solder=None,
    life_law: "CoffinManson | EnergyLaw | str | None" = None,
    accept_other_alloy: bool = False,
    inelastic_strain_range: float | None = None,
    energy_density: float | None = None,
    test_inelastic_strain_range: float | None = None,
    test_energy_density: float | None = None,
    weibull_shape: float = 4.0,
    early_fraction: float = 0.01,
    test: CycleProfile | str | None = None,
    acceleration_set: "NorrisLandzbergSet | str | None" = None,
) -> SolderJointResult:
    """Screen a solder joint under temperature cycling (see the module).

    ``joint`` its geometry (:mod:`bilayer.solder.geometry`); ``component`` and ``board`` (and ``solder``)
    Materials, CTE models or constant CTEs [1/K], their strains integrated over the cycle (secant CTEs).
    ``cycle`` is the joint's (and the component's) cycle, ``board_cycle`` the board's when it differs
    (power cycling). ``factor`` is Engelmaier's F (None: 1, with the typical range for the joint type
    in the notes). ``life_law``: None (chosen by the solder's family), a key of
    :data:`~bilayer.solder.life_laws.LIFE_LAWS`, or a law with the user's constants; a law or
    ``acceleration_set`` fitted on another alloy family raises :class:`InputError` unless
    ``accept_other_alloy``. Inputs of laws that do not use the DNP strain: ``inelastic_strain_range`` [-]
    or ``energy_density`` [J/m^3] per field cycle (from the user or a history calculation), and the
    same for the test cycle (optional). ``test`` (a CycleProfile or a preset name) adds the
    acceleration factor and the chamber life.
    """
    if not isinstance(joint, (LeadlessJoint, AreaArrayJoint, LeadedJoint)):
        raise InputError("joint", joint, "a LeadlessJoint, AreaArrayJoint or LeadedJoint (bilayer.solder.geometry)")
    if not isinstance(cycle, CycleProfile):
        raise InputError("cycle", cycle, "a CycleProfile")
    board_cycle = cycle if board_cycle is None else board_cycle
    if not isinstance(board_cycle, CycleProfile):
        raise InputError("board_cycle", board_cycle, "a CycleProfile")
    factor_given = factor is not None
    factor = 1.0 if factor is None else check_range("factor", factor, 0.0, 10.0)
    shape = check_range("weibull_shape", weibull_shape, 0.0, 100.0)
    fraction = check_range("early_fraction", early_fraction, 0.0, 1.0)
    if not 0.5 <= factor <= 1.5:
        warn_suspicious("factor", factor, "Engelmaier's non-ideality factor is usually 0.7 to 1.5 (from memory)")

    warnings: list[str] = []
    notes: list[str] = []
    eps_component = thermal_strain(component, cycle.low, cycle.high)
    eps_board = thermal_strain(board, board_cycle.low, board_cycle.high)
    warnings += _material_warnings("component", component, cycle)
    warnings += _material_warnings("board", board, board_cycle)
    mismatch = eps_board - eps_component
    if mismatch == 0.0:
        raise InputError("component/board CTE", (component, board), "different expansions over the cycle",
                         "with no global mismatch the DNP strain and the life are undefined")
    gamma = float(joint.shear_strain(mismatch, factor))
    local_component = local_board = None
    if solder is not None:
        eps_solder = thermal_strain(solder, cycle.low, cycle.high)
        local_component = abs(eps_solder - eps_component)
        local_board = abs(eps_solder - eps_board)
        solidus = getattr(solder, "solidus", None)
        if solidus is not None and max(cycle.high, board_cycle.high) >= solidus:
            raise InputError("cycle.high", cycle.high, f"below the solder solidus {solidus:g} K")
        if max(local_component, local_board) > gamma:
            warnings.append("local (solder to part) mismatch strain exceeds the global DNP shear strain: the DNP "
                            "model alone does not describe this joint")

    family = alloy_family(solder)
    law = _law(life_law, family)
    accepted = family_check("life law", "life_law", law.key, law.family, family, accept_other_alloy)
    if accepted:
        warnings.append(accepted)
    remembered = [name for name, constant in law.constants().items() if constant.status == "from memory"]
    if remembered:
        warnings.append(f"the {law.name} constants {', '.join(remembered)} are from memory (source named, not "
                        f"read): check them against {law.source} before relying on the life")
    measure = _measure(law)
    given = {"shear": gamma, "inelastic": inelastic_strain_range, "energy": energy_density}[measure]
    if given is None:
        raise InputError("energy_density" if measure == "energy" else "inelastic_strain_range", None,
                         f"the {_MISSING[measure]} per field cycle", f"the {law.name} law uses it"
                         + (" (from the user, or a history calculation of the solder layer)" if measure == "energy"
                            else ""))
    value = check_range(law.input_name, given, 0.0, 1e12 if measure == "energy" else 10.0)
    origin = {"shear": "the DNP shear strain above", "inelastic": "given", "energy": "given"}[measure]
    median = float(law.life(value, cycle.mean, cycle.dwell))
    exponent = float(law.exponent_at(cycle.mean, cycle.dwell)) if law.kind == "strain" else None
    warnings += _range_warnings(law, value, "field")
    if law.kind == "strain" and law.dwell_term is not None and cycle.dwell < 60.0:
        warnings.append("dwell under 1 min: the dwell term is not meant for very short dwells or high rates")
    notes += _factor_notes(joint, factor, factor_given, law, mismatch, cycle)
    notes += list(joint.notes)
    if isinstance(joint, LeadedJoint) and joint.capped(mismatch):
        notes.append("the lead is stiff enough that the lead form exceeds the stiff-joint strain: the stiff-joint "
                     "strain F L_D dalpha dT / h is used")

    nl_set = af = test_value = test_life = chamber = None
    if test is not None:
        test = preset_cycle(test) if isinstance(test, str) else test
        if not isinstance(test, CycleProfile):
            raise InputError("test", test, "a CycleProfile or a preset name such as '-40/+125'")
        warnings += [f"test cycle, {text}" for text in _material_warnings("component", component, test)
                     + _material_warnings("board", board, test)]
        nl_set = default_acceleration_set(family) if acceleration_set is None else named_acceleration_set(acceleration_set)
        accepted = family_check("acceleration set", "acceleration_set", nl_set.key, nl_set.family, family,
                                accept_other_alloy)
        if accepted:
            warnings.append(accepted)
        af = norris_landzberg_factor(test, cycle, nl_set)
        test_gamma = float(joint.shear_strain(
            thermal_strain(board, test.low, test.high) - thermal_strain(component, test.low, test.high), factor))
        test_value = {"shear": test_gamma, "inelastic": test_inelastic_strain_range,
                      "energy": test_energy_density}[measure]
        if test_value is not None:
            test_value = check_range(f"test {law.input_name}", test_value, 0.0, 1e12 if measure == "energy" else 10.0)
            test_life = float(law.life(test_value, test.mean, test.dwell))
            warnings += _range_warnings(law, test_value, "test")
        chamber = chamber_life(median, af, test_life, law.name, nl_set.label, _MISSING.get(measure, ""))

    assumptions = [
        f"joint: {JOINT_TYPES[joint.kind]}; component and board expand freely in-plane about the neutral point "
        "(no board bending)",
        f"solder alloy: {family.label} ({family.basis})",
        f"life law: {law.name} ({law.describe()})",
        f"Weibull shape beta = {shape:g} assumed for the spread (beta = 4 is a typical Sn-Pb value, from memory)",
        "CTEs integrated over each part's own cycle (secant values)",
    ]
    if measure == "shear":
        assumptions.insert(1, "elastic, plastic and creep behaviour of the joint lumped into the factor F")
    if not law.family:
        assumptions.append(f"the law's constants are the user's, taken as fitted on this joint's alloy "
                           f"({family.label})")
    if law.kind == "energy":
        assumptions.append(f"energy density defined as: {law.energy_definition}")
    return SolderJointResult(
        joint=joint, factor=factor, factor_given=factor_given, cycle=cycle, board_cycle=board_cycle,
        mismatch_strain=abs(mismatch), shear_strain=gamma, local_mismatch_component=local_component,
        local_mismatch_board=local_board, alloy=family, life_law=law, law_input=value, law_input_origin=origin,
        fatigue_exponent=exponent, median_life=median, weibull_shape=shape,
        weibull_scale=float(weibull_scale(median, shape)), early_fraction=fraction,
        early_life=float(weibull_life(median, shape, fraction)), test=test, acceleration_set=nl_set,
        acceleration_factor=af, test_law_input=test_value, test_median_life=test_life, chamber=chamber,
        notes=tuple(notes), warnings=tuple(warnings), assumptions=tuple(assumptions),
    )


def _range_warnings(law, value: float, which: str) -> list[str]:
    """The note the issue asks for: a strain beyond twice the ductility coefficient is outside the law."""
    if law.kind != "strain" or value < law.range_limit:
        return []
    return [f"{which} cycle: the {law.input_name} {value:.3g} exceeds twice the ductility coefficient "
            f"(2 eps_f' = {law.range_limit:g}): the law is outside its range (it gives under half a cycle), so "
            "the life is not meaningful; the joint fails by overstress or in very few cycles"]


def _factor_notes(joint, factor: float, given: bool, law, mismatch: float, cycle: CycleProfile) -> list[str]:
    """Guidance on F: the typical range for the joint type with its source, and what it does to the life."""
    low, high, source = FACTOR_GUIDANCE[joint.kind]
    typical = f"about {low:g}" if low == high else f"{low:g} to {high:g}"
    kind = JOINT_TYPES[joint.kind]
    if _measure(law) != "shear":
        return [f"F = {factor:g} scales the DNP shear strain shown; the {law.name} law does not use it"]
    if not given:
        text = f"F not given: F = 1 is used. Typical F for a {kind}: {typical} ({source})"
    elif low - 1e-12 <= factor <= high + 1e-12:
        text = f"F = {factor:g}, within the typical {typical} for a {kind} ({source})"
    else:
        text = f"F = {factor:g} is outside the typical {typical} for a {kind} ({source})"
    if low != high:
        lives = [float(law.life(joint.shear_strain(mismatch, f), cycle.mean, cycle.dwell)) for f in (low, high)]
        text += f"; across that range the median field life runs from {lives[1]:.4g} (F = {high:g}) to " \
                f"{lives[0]:.4g} cycles (F = {low:g})"
    return [text + "; a larger F means a larger strain and a shorter life"]
