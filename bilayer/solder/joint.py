"""Solder joints under temperature cycling: DNP shear strain, Engelmaier life, Weibull spread,
Norris-Landzberg acceleration and test-profile presets.

Equations (SI inside; the empirical Engelmaier exponent is written in its published units, degC and
minutes, and converted here):

    global shear strain      dgamma = F * L_D * |eps_board - eps_component| / h
                             eps = integral of alpha dT over each part's own cycle (secant CTE x swing);
                             L_D distance to the neutral point, h stand-off height, F non-ideality factor
                             (Engelmaier, IEEE Trans. CHMT-6:232, 1983)
    local mismatch           |eps_solder - eps_part| (not amplified by L_D/h)
    Engelmaier-Wild life     N_f(50 %) = 1/2 (dgamma / (2 eps_f'))^(1/c),   eps_f' = 0.325 (eutectic Sn-Pb)
                             c = -0.442 - 6e-4 T_SJ + 1.74e-2 ln(1 + 360/t_D)
                             T_SJ mean cyclic joint temperature [degC], t_D half-cycle dwell [min]
    Weibull spread           eta = N_50 / (ln 2)^(1/beta),   N(p) = eta (-ln(1 - p))^(1/beta)
    Norris-Landzberg         AF = N_field / N_test
                                = (dT_test/dT_field)^n (f_field/f_test)^m exp[(E_a/k)(1/Tmax_field - 1/Tmax_test)]
                             (Norris & Landzberg, IBM J. Res. Dev. 13:266, 1969); f in cycles per day,
                             Tmax absolute. Convention: life grows with cycling frequency (N ~ f^m, the
                             1969 fit), so a slower field cycle gives a frequency factor below 1.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import TYPE_CHECKING, Mapping

import numpy as np

from ..core.cautions import CAUTIONS
from ..core.errors import InputError, check_range, warn_suspicious
from ..core.units import from_si, to_si

if TYPE_CHECKING:  # pragma: no cover
    from ..core.results import StackResult
    from ..core.stack import Stack

__all__ = [
    "TIN_LEAD_DUCTILITY",
    "CycleProfile",
    "CYCLING_PRESETS",
    "preset_cycle",
    "NorrisLandzbergSet",
    "NORRIS_LANDZBERG_SETS",
    "NORRIS_LANDZBERG_CONVENTION",
    "thermal_strain",
    "global_shear_strain",
    "engelmaier_exponent",
    "engelmaier_median_life",
    "weibull_scale",
    "weibull_life",
    "norris_landzberg_factor",
    "SolderJointResult",
    "check_solder_joint",
    "WarpageResult",
    "assembly_warpage",
    "SOLDER_CAUTIONS",
    "SolderAssessment",
    "assess_solder_design",
]

TIN_LEAD_DUCTILITY = 0.325
"""Engelmaier fatigue ductility coefficient eps_f' of eutectic Sn-Pb (2 eps_f' = 0.65)."""

SOLDER_CAUTIONS = (
    "Screening estimate only: the solder-joint life and acceleration factor are first-order empirical "
    "estimates. Qualification by test per IPC-9701, the JEDEC temperature-cycling standards "
    "(JESD22-A104) and the customer's requirements decides.",
    "Model limits: the Engelmaier model covers creep-fatigue of the bulk solder of leadless joints; it "
    "does not cover vibration, mechanical shock, brittle intermetallic fracture or pad cratering, nor "
    "underfilled or compliant-lead joints without their own factors.",
    "The life is the median of a wide distribution; early failures follow from the assumed Weibull shape. "
    "Acceleration factors differ by up to about ten times between published parameter sets.",
)
"""Job-specific cautions; results carry them after the shared :data:`bilayer.core.cautions.CAUTIONS`."""


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


# --------------------------------------------------------------------------------- Norris-Landzberg
@dataclass(frozen=True)
class NorrisLandzbergSet:
    """Exponents of one Norris-Landzberg fit: n (temperature swing), m (frequency), E_a/k [K]."""

    key: str
    label: str
    swing_exponent: float
    frequency_exponent: float
    activation_temperature: float
    status: str
    source: str

    def to_dict(self) -> dict:
        return {
            "key": self.key,
            "label": self.label,
            "n": self.swing_exponent,
            "m": self.frequency_exponent,
            "activation_temperature": self.activation_temperature,
            "status": self.status,
            "source": self.source,
        }


NORRIS_LANDZBERG_SETS: Mapping[str, NorrisLandzbergSet] = MappingProxyType(
    {
        s.key: s
        for s in (
            NorrisLandzbergSet(
                "snpb_1969",
                "Sn-Pb (Norris & Landzberg 1969)",
                1.9,
                1.0 / 3.0,
                1414.0,
                "parameters confirmed only in secondary sources",
                "Norris, K. C. & Landzberg, A. H., IBM J. Res. Dev. 13(3):266-271 (1969), high-lead C4 joints",
            ),
            NorrisLandzbergSet(
                "sac_pan_2005",
                "SAC (Pan et al. 2005)",
                2.65,
                0.136,
                2185.0,
                "from memory, not verified; the paper's time term may be a dwell time, not a frequency",
                "Pan, N. et al., SMTA International (2005)",
            ),
            NorrisLandzbergSet(
                "sac305_2012",
                "SAC305 (J. Electron. Packag. 2012)",
                2.3,
                0.3,
                4560.0,
                "secondary (public code comments), not the paper; E_a/k quoted as 4560-4640 K",
                "Norris-Landzberg acceleration factors and Goldmann constants for SAC305 lead-free "
                "electronics, J. Electron. Packag. (Sept. 2012)",
            ),
        )
    }
)

NORRIS_LANDZBERG_CONVENTION = (
    "AF = N_field / N_test (field cycles per test cycle) = (dT_test/dT_field)^n (f_field/f_test)^m "
    "exp[(Ea/k)(1/Tmax_field - 1/Tmax_test)]; life taken to grow with cycling frequency (N ~ f^m, the "
    "1969 fit), so a slower field cycle lowers AF. Some secondary sources invert the frequency term."
)


def _nl_set(parameters: "NorrisLandzbergSet | str") -> NorrisLandzbergSet:
    if isinstance(parameters, NorrisLandzbergSet):
        return parameters
    if isinstance(parameters, str) and parameters in NORRIS_LANDZBERG_SETS:
        return NORRIS_LANDZBERG_SETS[parameters]
    raise InputError("acceleration parameters", parameters, "one of " + ", ".join(NORRIS_LANDZBERG_SETS))


def norris_landzberg_factor(
    test: CycleProfile, field: CycleProfile, parameters: "NorrisLandzbergSet | str" = "snpb_1969"
) -> float:
    """Acceleration factor AF = N_field / N_test between a test and a field cycle (convention above)."""
    if not isinstance(test, CycleProfile) or not isinstance(field, CycleProfile):
        raise InputError("cycles", (test, field), "two CycleProfile values (test, field)")
    p = _nl_set(parameters)
    return (
        (test.swing / field.swing) ** p.swing_exponent
        * (field.cycles_per_day / test.cycles_per_day) ** p.frequency_exponent
        * math.exp(p.activation_temperature * (1.0 / field.high - 1.0 / test.high))
    )


# ------------------------------------------------------------------------------------ strain, life
def thermal_strain(expansion, low: float, high: float) -> float:
    """Free thermal strain from ``low`` to ``high`` [K] of a Material, a CTE model or a constant CTE [1/K]."""
    cte = getattr(expansion, "cte", expansion)
    if hasattr(cte, "thermal_strain"):
        return float(cte.thermal_strain(low, high))
    alpha = check_range("cte", cte, -1e-3, 1e-3, unit="1/K")
    return alpha * (high - low)


def global_shear_strain(dnp, standoff, mismatch_strain, factor=1.0):
    """Cyclic shear strain range of the joint, dgamma = F L_D |mismatch| / h (vectorised; SI)."""
    dnp = np.asarray(dnp, float)
    h = np.asarray(standoff, float)
    eps = np.asarray(mismatch_strain, float)
    F = np.asarray(factor, float)
    for name, value in (("dnp", dnp), ("standoff", h), ("factor", F)):
        if not np.all(np.isfinite(value)) or np.any(value <= 0):
            raise InputError(name, value.tolist(), f"{name} > 0 (finite)")
    if not np.all(np.isfinite(eps)):
        raise InputError("mismatch_strain", eps.tolist(), "a finite strain")
    out = F * dnp * np.abs(eps) / h
    return float(out) if out.ndim == 0 else out


def engelmaier_exponent(mean_temperature, dwell):
    """Engelmaier fatigue ductility exponent c from the mean cyclic joint temperature [K] and dwell [s].

    c = -0.442 - 6e-4 T_SJ + 1.74e-2 ln(1 + 360/t_D), T_SJ in degC, t_D in minutes (converted here).
    """
    T = np.asarray(mean_temperature, float)
    t = np.asarray(dwell, float)
    if not np.all(np.isfinite(T)) or np.any(T <= 0):
        raise InputError("mean_temperature", T.tolist(), "an absolute temperature > 0 K")
    if not np.all(np.isfinite(t)) or np.any(t <= 0):
        raise InputError("dwell", t.tolist(), "a dwell time > 0 s")
    c = -0.442 - 6e-4 * from_si(T, "temperature", "degC") + 1.74e-2 * np.log1p(360.0 / (t / 60.0))
    return float(c) if c.ndim == 0 else c


def engelmaier_median_life(shear_strain, mean_temperature, dwell, ductility: float = TIN_LEAD_DUCTILITY):
    """Median cycles to failure N_f(50 %) = 1/2 (dgamma / (2 eps_f'))^(1/c) (vectorised)."""
    gamma = np.asarray(shear_strain, float)
    if not np.all(np.isfinite(gamma)) or np.any(gamma <= 0):
        raise InputError("shear_strain", gamma.tolist(), "a cyclic shear strain range > 0")
    eps_f = check_range("ductility", ductility, 0.0, 2.0)
    c = np.asarray(engelmaier_exponent(mean_temperature, dwell))
    if np.any(c >= 0):
        raise InputError("fatigue exponent", c.tolist(), "c < 0 (the mean temperature and dwell are far outside "
                         "the model's use)")
    life = 0.5 * (gamma / (2.0 * eps_f)) ** (1.0 / c)
    return float(life) if life.ndim == 0 else life


def weibull_scale(median, shape: float):
    """Weibull characteristic life eta = N_50 / (ln 2)^(1/beta)."""
    beta = check_range("weibull_shape", shape, 0.0, 100.0)
    return np.asarray(median, float) / math.log(2.0) ** (1.0 / beta)


def weibull_life(median, shape: float, fraction):
    """Cycles by which the failed ``fraction`` (0..1) is reached: eta (-ln(1 - p))^(1/beta)."""
    p = np.asarray(fraction, float)
    if not np.all((p > 0) & (p < 1)):
        raise InputError("failure fraction", p.tolist(), "0 < fraction < 1")
    beta = check_range("weibull_shape", shape, 0.0, 100.0)
    life = weibull_scale(median, beta) * (-np.log1p(-p)) ** (1.0 / beta)
    return float(life) if np.ndim(life) == 0 else life


# --------------------------------------------------------------------------------------- job result
@dataclass(frozen=True)
class SolderJointResult:
    """Solder-joint screening result: strains, Engelmaier life and spread, acceleration (SI)."""

    dnp: float
    standoff: float
    factor: float
    cycle: CycleProfile
    board_cycle: CycleProfile
    mismatch_strain: float
    shear_strain: float
    local_mismatch_component: float | None
    local_mismatch_board: float | None
    fatigue_exponent: float
    ductility: float
    median_life: float
    weibull_shape: float
    weibull_scale: float
    early_fraction: float
    early_life: float
    test: CycleProfile | None
    acceleration_set: NorrisLandzbergSet | None
    acceleration_factor: float | None
    test_median_life: float | None
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    cautions: tuple[str, ...] = field(default=CAUTIONS + SOLDER_CAUTIONS)

    @property
    def engelmaier_acceleration(self) -> float | None:
        """N_50(field)/N_50(test) by Engelmaier on both cycles (beside the Norris-Landzberg value)."""
        return None if self.test_median_life is None else self.median_life / self.test_median_life

    def to_dict(self) -> dict:
        return {
            "dnp": self.dnp,
            "standoff": self.standoff,
            "factor": self.factor,
            "cycle": self.cycle.to_dict(),
            "board_cycle": self.board_cycle.to_dict(),
            "mismatch_strain": self.mismatch_strain,
            "shear_strain": self.shear_strain,
            "local_mismatch_component": self.local_mismatch_component,
            "local_mismatch_board": self.local_mismatch_board,
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
            "engelmaier_acceleration": self.engelmaier_acceleration,
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "cautions": list(self.cautions),
            "units": {
                "dnp": "m", "standoff": "m", "factor": "1", "mismatch_strain": "1", "shear_strain": "1",
                "local_mismatch_component": "1", "local_mismatch_board": "1", "fatigue_exponent": "1",
                "ductility": "1", "median_life": "cycles", "weibull_scale": "cycles", "early_life": "cycles",
                "test_median_life": "cycles", "acceleration_factor": "1", "cycle": "K, s, 1/day",
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
    dnp: float,
    standoff: float,
    component,
    board,
    cycle: CycleProfile,
    factor: float = 1.0,
    *,
    board_cycle: CycleProfile | None = None,
    solder=None,
    ductility: float = TIN_LEAD_DUCTILITY,
    weibull_shape: float = 4.0,
    early_fraction: float = 0.01,
    test: CycleProfile | str | None = None,
    acceleration_set: "NorrisLandzbergSet | str" = "snpb_1969",
) -> SolderJointResult:
    """Screen a leadless or area-array solder joint under temperature cycling.

    ``component`` and ``board`` (and ``solder``) are Materials, CTE models or constant CTEs [1/K];
    their strains are integrated over the cycle, i.e. secant CTEs. ``cycle`` is the joint's (and the
    component's) temperature cycle; ``board_cycle`` the board's when it differs (power cycling).
    ``dnp`` distance to the neutral point [m], ``standoff`` joint height [m], ``factor`` Engelmaier's
    non-ideality factor F. ``test`` (a CycleProfile or a preset name) adds the Norris-Landzberg
    acceleration factor with ``acceleration_set`` and the Engelmaier life under the test cycle.
    """
    if not isinstance(cycle, CycleProfile):
        raise InputError("cycle", cycle, "a CycleProfile")
    board_cycle = cycle if board_cycle is None else board_cycle
    if not isinstance(board_cycle, CycleProfile):
        raise InputError("board_cycle", board_cycle, "a CycleProfile")
    dnp = check_range("dnp", dnp, 0.0, 1.0, unit="m")
    standoff = check_range("standoff", standoff, 0.0, 0.1, unit="m")
    factor = check_range("factor", factor, 0.0, 10.0)
    shape = check_range("weibull_shape", weibull_shape, 0.0, 100.0)
    fraction = check_range("early_fraction", early_fraction, 0.0, 1.0)
    eps_f = check_range("ductility", ductility, 0.0, 2.0)
    if not 0.5 <= factor <= 1.5:
        warn_suspicious("factor", factor, "Engelmaier's non-ideality factor is usually 0.7 to 1.5 (from memory)")
    if not 1e-5 <= standoff <= 2e-3:
        warn_suspicious("standoff", standoff, "solder joint heights are usually 10 um to 2 mm")

    warnings: list[str] = []
    eps_component = thermal_strain(component, cycle.low, cycle.high)
    eps_board = thermal_strain(board, board_cycle.low, board_cycle.high)
    warnings += _material_warnings("component", component, cycle)
    warnings += _material_warnings("board", board, board_cycle)
    mismatch = eps_board - eps_component
    if mismatch == 0.0:
        raise InputError("component/board CTE", (component, board), "different expansions over the cycle",
                         "with no global mismatch the DNP strain and Engelmaier life are undefined")
    gamma = float(global_shear_strain(dnp, standoff, mismatch, factor))
    local_component = local_board = None
    if solder is not None:
        eps_solder = thermal_strain(solder, cycle.low, cycle.high)
        local_component = abs(eps_solder - eps_component)
        local_board = abs(eps_solder - eps_board)
        solidus = getattr(solder, "solidus", None)
        if solidus is not None and max(cycle.high, board_cycle.high) >= solidus:
            raise InputError("cycle.high", cycle.high, f"below the solder solidus {solidus:g} K")
        if max(local_component, local_board) > gamma:
            warnings.append(
                "local (solder to part) mismatch strain exceeds the global DNP shear strain: the DNP model "
                "alone does not describe this joint"
            )
    c = float(engelmaier_exponent(cycle.mean, cycle.dwell))
    median = float(engelmaier_median_life(gamma, cycle.mean, cycle.dwell, eps_f))
    if gamma >= 2.0 * eps_f:
        warnings.append("shear strain range reaches 2 eps_f': beyond the low-cycle range of the model")
    if cycle.dwell < 60.0:
        warnings.append("dwell under 1 min: the dwell term is not meant for very short dwells or high rates")
    if abs(eps_f - TIN_LEAD_DUCTILITY) > 1e-12:
        warnings.append(
            f"ductility coefficient {eps_f:g} differs from the Sn-Pb value 0.325 while the exponent c keeps "
            "the Sn-Pb coefficients"
        )

    nl_set = af = test_life = None
    if test is not None:
        test = preset_cycle(test) if isinstance(test, str) else test
        if not isinstance(test, CycleProfile):
            raise InputError("test", test, "a CycleProfile or a preset name such as '-40/+125'")
        warnings += [f"test cycle, {text}" for text in _material_warnings("component", component, test)
                     + _material_warnings("board", board, test)]
        nl_set = _nl_set(acceleration_set)
        af = norris_landzberg_factor(test, cycle, nl_set)
        test_gamma = float(global_shear_strain(
            dnp, standoff,
            thermal_strain(board, test.low, test.high) - thermal_strain(component, test.low, test.high),
            factor,
        ))
        test_life = float(engelmaier_median_life(test_gamma, test.mean, test.dwell, eps_f))
        if not nl_set.key.startswith("snpb") and abs(eps_f - TIN_LEAD_DUCTILITY) < 1e-12:
            warnings.append(
                "lead-free acceleration set with Sn-Pb Engelmaier constants: the two lives are not comparable"
            )

    assumptions = (
        "leadless (stiff) joints; elastic, plastic and creep behaviour lumped into the factor F",
        "component and board expand freely in-plane about the neutral point (no board bending)",
        "Engelmaier-Wild coefficients for eutectic or near-eutectic Sn-Pb",
        f"Weibull shape beta = {shape:g} assumed for the spread (beta = 4 is a typical Sn-Pb value, from memory)",
        "CTEs integrated over each part's own cycle (secant values)",
    )
    return SolderJointResult(
        dnp=dnp,
        standoff=standoff,
        factor=factor,
        cycle=cycle,
        board_cycle=board_cycle,
        mismatch_strain=abs(mismatch),
        shear_strain=gamma,
        local_mismatch_component=local_component,
        local_mismatch_board=local_board,
        fatigue_exponent=c,
        ductility=eps_f,
        median_life=median,
        weibull_shape=shape,
        weibull_scale=float(weibull_scale(median, shape)),
        early_fraction=fraction,
        early_life=float(weibull_life(median, shape, fraction)),
        test=test,
        acceleration_set=nl_set,
        acceleration_factor=af,
        test_median_life=test_life,
        warnings=tuple(warnings),
        assumptions=assumptions,
    )


# ----------------------------------------------------------------------------------------- warpage
@dataclass(frozen=True, eq=False)
class WarpageResult:
    """Warpage of a component-on-board or die-on-substrate stack from the engine (SI)."""

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
    cautions: tuple[str, ...] = field(default=CAUTIONS + SOLDER_CAUTIONS)

    def to_dict(self) -> dict:
        from ..core.jsonable import plain

        return {
            "stress_free_temperature": self.stress_free_temperature,
            "stress_free_basis": self.stress_free_basis,
            "length": self.length,
            "width": self.width,
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
                "stress_free_temperature": "K", "length": "m", "width": "m", "curvature": "1/m",
                "bow_length": "m", "bow_width": "m", "bow_diagonal": "m",
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
) -> WarpageResult:
    """Warpage of a soldered assembly (board or base at the bottom, component or die on top).

    The stress-free temperature is the solder's solidus (``solder`` a Material with ``solidus``) or an
    effective value the user sets (``stress_free_temperature`` [K], usually lower because the solder
    creeps during cooling). The engine solves the stack in the equal-biaxial ``plate`` state by default;
    bows over the length, width and diagonal [m] follow exactly from the curvature.
    """
    from ..core.sagitta import bow_from_curvature
    from ..core.stack import Temperatures, evaluate

    length = check_range("length", length, 0.0, 10.0, unit="m")
    width = length if width is None else check_range("width", width, 0.0, 10.0, unit="m")
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
    )


# ---------------------------------------------------------------------------------- design files
@dataclass(frozen=True, eq=False)
class SolderAssessment:
    """Joint screening and (when an outline is given) assembly warpage of one design."""

    joint: SolderJointResult
    warpage: WarpageResult | None

    @property
    def warnings(self) -> tuple[str, ...]:
        return self.joint.warnings + (() if self.warpage is None else self.warpage.warnings)

    @property
    def cautions(self) -> tuple[str, ...]:
        return self.joint.cautions

    def to_dict(self) -> dict:
        return {
            "solder_joint": self.joint.to_dict(),
            "warpage": None if self.warpage is None else self.warpage.to_dict(),
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


def assess_solder_design(design) -> SolderAssessment:
    """Run the ``[solder_joint]`` section of a design: joint screening and warpage.

    The board and component CTEs come from the design's layers; the warpage uses the design's stack
    and operating temperature(s), with the stress-free temperature from [conditions] (an effective
    value) or the solder solidus (``stress_free_basis = "solidus"``).
    """
    if "solder_joint" not in design.sections:
        raise InputError("design.sections", sorted(design.sections), "a [solder_joint] section")
    values = dict(design.sections["solder_joint"])
    board = design.stack[_layer_number(design, values, "board_layer", 1) - 1].material
    component = design.stack[_layer_number(design, values, "component_layer", design.stack.n_layers) - 1].material
    solder_material = _design_material(design, values["solder_material"]) if "solder_material" in values else None
    field_cycle = CycleProfile(values["cycle_low"], values["cycle_high"], values["dwell"],
                               values["cycle_rate"] * 86400.0, "field cycle")
    board_cycle = None
    if "board_cycle_low" in values:
        board_cycle = CycleProfile(values["board_cycle_low"], values["board_cycle_high"], values["dwell"],
                                   values["cycle_rate"] * 86400.0, "board cycle")
    test = None
    if "test_cycle" in values:
        rate = values.get("test_cycle_rate")
        test = preset_cycle(values["test_cycle"], values.get("test_dwell"), None if rate is None else rate * 86400.0)
    joint = check_solder_joint(
        values["dnp"], values["standoff"], component, board, field_cycle, values.get("nonideality_factor", 1.0),
        board_cycle=board_cycle, solder=solder_material, ductility=values.get("ductility", TIN_LEAD_DUCTILITY),
        weibull_shape=values.get("weibull_shape", 4.0), early_fraction=values.get("early_fraction", 0.01),
        test=test, acceleration_set=values.get("acceleration_set", "snpb_1969"),
    )
    warpage = None
    if "outline_length" in values:
        by_solidus = values.get("stress_free_basis", "conditions") == "solidus"
        warpage = assembly_warpage(
            design.stack, design.temperatures.operating, values["outline_length"], values.get("outline_width"),
            solder=solder_material if by_solidus else None,
            stress_free_temperature=None if by_solidus else design.temperatures.stress_free,
            state=design.state.value,
        )
    return SolderAssessment(joint, warpage)
