"""Solder fatigue life laws, each with its constants and, beside every constant, where it comes from.

Strain laws (Coffin-Manson family; Coffin, Trans. ASME 76:931, 1954; Manson, NACA TN 2933, 1953):

    D / 2 = eps_f' (2 N_f)^c   ->   N_f(50 %) = 1/2 (D / (2 eps_f'))^(1/c)
    c = c0 + c_T T_m + c_D ln(1 + 360 / t_D)        (temperature and dwell terms optional)

D is the cyclic strain range of the law's measure: the shear strain range of the joint (``shear``, from
the DNP model of :mod:`bilayer.solder.geometry`) or an inelastic (normal) strain range (``inelastic``,
given by the user or taken from a history calculation); eps_f' the fatigue ductility coefficient, c the
exponent (negative), T_m the mean cyclic joint temperature [degC] and t_D the half-cycle dwell [min],
the units in which these constants are published. The law is a low-cycle fatigue fit: at D >= 2 eps_f'
it gives under half a cycle, outside its range.

Engelmaier-Wild (eutectic and near-eutectic Sn-Pb) is this law in shear with eps_f' = 0.325,
c0 = -0.442, c_T = -6e-4 per degC, c_D = 1.74e-2 (Engelmaier, IEEE Trans. CHMT-6:232, 1983; IPC-D-279,
IPC-SM-785).

Energy laws (Darveaux's form; R. Darveaux, ECTC 2000):

    N_0 = K1 (dW / W_u)^K2                      cycles to crack initiation
    da/dN = K3 (dW / W_u)^K4                    crack growth per cycle [m]
    N_f = N_0 + a / (da/dN)                     (the growth term only when K3, K4 and a are given)

dW is the inelastic strain energy density per cycle [J/m^3] as the law's constants define it (which
energy, which cycle, averaged over which volume: :attr:`EnergyLaw.energy_definition`), W_u = 1 MJ/m^3
(= 1 MPa), a the crack length at failure [m]. With K2 = -1 and no growth term the form is Syed's
N_f = (C' dW)^-1 (K1 = 1/C').

The energy density is a plain number here. It comes from the user, or from a history calculation of
the solder layer (the seam: :func:`bilayer.solder.joint.check_solder_joint` takes ``energy_density`` in
J/m^3, whatever produced it).

Every constant is a :class:`Constant` with its source and a status: "published" (read in the source),
"secondary" (the source's value seen only in secondary sources), "from memory" (recalled, source named,
not read), "derived" (converted here from such a value) or "user" (the user's own).
"""
from __future__ import annotations

import math
from dataclasses import dataclass, replace
from types import MappingProxyType
from typing import Mapping

import numpy as np

from ..core.errors import InputError, check_range
from ..core.units import from_si
from .alloys import TIN_LEAD, TIN_SILVER_COPPER

__all__ = [
    "STATUSES",
    "Constant",
    "user_constant",
    "CoffinManson",
    "EnergyLaw",
    "ENGELMAIER_WILD",
    "SYED_2004_SAC",
    "DARVEAUX_2000_SNPB",
    "LIFE_LAWS",
    "ENERGY_UNIT",
    "engelmaier_exponent",
    "engelmaier_median_life",
    "weibull_scale",
    "weibull_life",
]

STATUSES = ("published", "secondary", "from memory", "derived", "user")
ENERGY_UNIT = 1e6
"""W_u = 1 MJ/m^3 (1 MPa): the energy density at which K1 and K3 are stated [J/m^3]."""


@dataclass(frozen=True)
class Constant:
    """One constant of a law: ``value`` in ``unit``, its ``source`` and ``status`` (see :data:`STATUSES`)."""

    value: float
    unit: str
    source: str
    status: str

    def __post_init__(self):
        if not math.isfinite(self.value):
            raise InputError("constant", self.value, "a finite number")
        if self.status not in STATUSES:
            raise InputError("constant.status", self.status, "one of " + ", ".join(STATUSES))

    @property
    def flag(self) -> str:
        """Short tag shown beside the value ("from memory", "secondary", ...)."""
        return self.status

    def text(self) -> str:
        unit = f" {self.unit}" if self.unit and self.unit != "1" else ""
        return f"{self.value:.6g}{unit} [{self.status}: {self.source}]"

    def to_dict(self) -> dict:
        return {"value": self.value, "unit": self.unit, "source": self.source, "status": self.status}


def user_constant(value: float, unit: str = "1") -> Constant:
    """A constant typed in by the user."""
    return Constant(float(value), unit, "the user's value", "user")


# ------------------------------------------------------------------------------------ strain laws
@dataclass(frozen=True)
class CoffinManson:
    """Coffin-Manson strain law with an optional temperature- and dwell-dependent exponent (see module).

    ``measure`` "shear" (the joint's shear strain range) or "inelastic" (an inelastic strain range);
    ``family`` the alloy family the constants were fitted on ("" for the user's own constants).
    """

    key: str
    name: str
    measure: str
    ductility: Constant
    exponent: Constant
    temperature_term: Constant | None = None
    dwell_term: Constant | None = None
    family: str = ""
    source: str = ""
    notes: tuple[str, ...] = ()

    def __post_init__(self):
        if self.measure not in ("shear", "inelastic"):
            raise InputError("life law measure", self.measure, "'shear' or 'inelastic'")
        check_range("ductility coefficient", self.ductility.value, 0.0, 10.0)
        if self.exponent.value >= 0.0 and self.temperature_term is None and self.dwell_term is None:
            raise InputError("fatigue exponent", self.exponent.value, "a negative exponent c",
                             "Coffin-Manson exponents of solders are about -0.3 to -0.7")

    kind = "strain"

    @property
    def input_name(self) -> str:
        return "shear strain range" if self.measure == "shear" else "inelastic strain range"

    @property
    def range_limit(self) -> float:
        """2 eps_f': the strain range at which the law gives half a cycle (the end of its range)."""
        return 2.0 * self.ductility.value

    def constants(self) -> dict[str, Constant]:
        items = {"ductility": self.ductility, "exponent": self.exponent}
        if self.temperature_term is not None:
            items["temperature_term"] = self.temperature_term
        if self.dwell_term is not None:
            items["dwell_term"] = self.dwell_term
        return items

    def exponent_at(self, mean_temperature, dwell):
        """c at the mean cyclic joint temperature [K] and half-cycle dwell [s] (vectorised)."""
        T = np.asarray(mean_temperature, float)
        t = np.asarray(dwell, float)
        if not np.all(np.isfinite(T)) or np.any(T <= 0):
            raise InputError("mean_temperature", T.tolist(), "an absolute temperature > 0 K")
        c = np.full(np.broadcast_shapes(T.shape, t.shape), self.exponent.value)
        if self.temperature_term is not None:
            c = c + self.temperature_term.value * from_si(T, "temperature", "degC")
        if self.dwell_term is not None:
            if not np.all(np.isfinite(t)) or np.any(t <= 0):
                raise InputError("dwell", t.tolist(), "a dwell time > 0 s")
            c = c + self.dwell_term.value * np.log1p(360.0 / (t / 60.0))
        return float(c) if c.ndim == 0 else c

    def life(self, strain_range, mean_temperature, dwell):
        """Median cycles to failure N_f(50 %) = 1/2 (D / (2 eps_f'))^(1/c) (vectorised)."""
        D = np.asarray(strain_range, float)
        if not np.all(np.isfinite(D)) or np.any(D <= 0):
            raise InputError(self.input_name, D.tolist(), f"a {self.input_name} > 0")
        c = np.asarray(self.exponent_at(mean_temperature, dwell))
        if np.any(c >= 0):
            raise InputError("fatigue exponent", c.tolist(), "c < 0 (the mean temperature and dwell are far "
                             "outside the law's use)")
        life = 0.5 * (D / self.range_limit) ** (1.0 / c)
        return float(life) if life.ndim == 0 else life

    def describe(self) -> str:
        c = f"c = {self.exponent.value:g}"
        if self.temperature_term is not None:
            c += f" {self.temperature_term.value:+g} T_m[degC]"
        if self.dwell_term is not None:
            c += f" {self.dwell_term.value:+g} ln(1 + 360/t_D[min])"
        return f"N50 = 1/2 (D / (2 x {self.ductility.value:g}))^(1/c), {c}; D = {self.input_name}"

    def to_dict(self) -> dict:
        return {"key": self.key, "name": self.name, "kind": self.kind, "measure": self.measure,
                "input": self.input_name, "family": self.family, "source": self.source,
                "equation": self.describe(), "notes": list(self.notes),
                "constants": {k: c.to_dict() for k, c in self.constants().items()}}


_ENGELMAIER_SOURCE = ("W. Engelmaier, IEEE Trans. CHMT-6(3):232-237 (1983); IPC-D-279 and IPC-SM-785 "
                      "(Engelmaier-Wild model, eutectic and near-eutectic Sn-Pb)")
_ENGELMAIER_SHORT = "Engelmaier 1983; IPC-D-279, IPC-SM-785"

ENGELMAIER_WILD = CoffinManson(
    "engelmaier_wild", "Engelmaier-Wild (tin-lead)", "shear",
    ductility=Constant(0.325, "1", f"{_ENGELMAIER_SHORT} (2 eps_f' = 0.65)", "secondary"),
    exponent=Constant(-0.442, "1", _ENGELMAIER_SHORT, "secondary"),
    temperature_term=Constant(-6e-4, "1/degC", _ENGELMAIER_SHORT, "secondary"),
    dwell_term=Constant(1.74e-2, "1", f"{_ENGELMAIER_SHORT}; t_D in minutes", "secondary"),
    family=TIN_LEAD, source=_ENGELMAIER_SOURCE,
    notes=("constants seen in secondary sources and reproduced by an independent public implementation's anchor "
           "c(55 degC, 15 min) = -0.41899; the primary texts were not read",
           "creep-fatigue of the bulk solder of leadless and area-array joints; not for very short dwells "
           "or high cycling rates (Chauhan, Pecht, Osterman & Lee, IEEE Trans. CPT, doi "
           "10.1109/TCAPT.2009.2030983, review its limits)",
           "Engelmaier published separate lead-free parameters (\"Solder creep-fatigue model parameters for "
           "SAC & SnAg lead-free solder joint reliability estimation\"); they were not read and are not built in"),
)
"""Engelmaier-Wild law for eutectic and near-eutectic Sn-Pb, in shear."""


def engelmaier_exponent(mean_temperature, dwell):
    """Engelmaier fatigue exponent c at the mean cyclic joint temperature [K] and dwell [s] (vectorised)."""
    return ENGELMAIER_WILD.exponent_at(mean_temperature, dwell)


def engelmaier_median_life(shear_strain, mean_temperature, dwell, ductility: float = 0.325):
    """Engelmaier-Wild median life N_f(50 %) (vectorised); ``ductility`` other than 0.325 replaces eps_f'
    as a user value while the exponent keeps the Sn-Pb coefficients."""
    law = ENGELMAIER_WILD
    if ductility != law.ductility.value:
        law = replace(law, ductility=user_constant(check_range("ductility", ductility, 0.0, 10.0)))
    return law.life(shear_strain, mean_temperature, dwell)


# ------------------------------------------------------------------------------------ energy laws
@dataclass(frozen=True)
class EnergyLaw:
    """Energy law N_f = K1 (dW/W_u)^K2 [+ a / (K3 (dW/W_u)^K4)] (see module); dW in J/m^3, a in m.

    ``energy_definition`` says which energy density the constants belong to; ``family`` the alloy family
    they were fitted on ("" for the user's own).
    """

    key: str
    name: str
    coefficient: Constant
    exponent: Constant
    growth_coefficient: Constant | None = None
    growth_exponent: Constant | None = None
    crack_length: Constant | None = None
    energy_definition: str = "the user's definition"
    family: str = ""
    source: str = ""
    notes: tuple[str, ...] = ()

    kind = "energy"
    input_name = "inelastic energy density per cycle"

    def __post_init__(self):
        check_range("energy law coefficient K1", self.coefficient.value, 0.0)
        if self.exponent.value >= 0.0:
            raise InputError("energy law exponent K2", self.exponent.value, "K2 < 0 (life falls as the energy rises)")
        if (self.growth_coefficient is None) != (self.growth_exponent is None):
            raise InputError("energy law growth term", (self.growth_coefficient, self.growth_exponent),
                             "both K3 and K4, or neither")
        if self.growth_coefficient is None and self.crack_length is not None:
            raise InputError("crack_length", self.crack_length.value, "only with a growth term (K3, K4)")
        if self.growth_coefficient is not None:
            check_range("energy law growth coefficient K3", self.growth_coefficient.value, 0.0)
        if self.crack_length is not None:
            check_range("crack_length", self.crack_length.value, 0.0, 0.1, unit="m")

    def with_crack_length(self, crack_length: float) -> "EnergyLaw":
        """The law with the user's crack length at failure a [m] (the joint diameter at the pad)."""
        return replace(self, crack_length=user_constant(crack_length, "m"))

    def constants(self) -> dict[str, Constant]:
        items = {"coefficient": self.coefficient, "exponent": self.exponent}
        for name in ("growth_coefficient", "growth_exponent", "crack_length"):
            if getattr(self, name) is not None:
                items[name] = getattr(self, name)
        return items

    def initiation(self, energy_density):
        """Cycles to crack initiation N_0 = K1 (dW/W_u)^K2 (vectorised)."""
        W = self._energy(energy_density)
        return self.coefficient.value * (W / ENERGY_UNIT) ** self.exponent.value

    def life(self, energy_density, mean_temperature=None, dwell=None):
        """Median cycles to failure (vectorised): initiation plus growth across ``a`` when given. The cycle's
        temperatures and dwell act through the energy density itself; the two arguments keep the call
        the same as for the strain laws."""
        W = self._energy(energy_density)
        life = self.coefficient.value * (W / ENERGY_UNIT) ** self.exponent.value
        if self.growth_coefficient is not None:
            if self.crack_length is None:
                raise InputError("crack_length", None, "the crack length at failure a [m] (the joint diameter "
                                 "at the pad)", f"the {self.name} law has a crack-growth term")
            rate = self.growth_coefficient.value * (W / ENERGY_UNIT) ** self.growth_exponent.value
            life = life + self.crack_length.value / rate
        return float(life) if np.ndim(life) == 0 else life

    @staticmethod
    def _energy(energy_density) -> np.ndarray:
        W = np.asarray(energy_density, float)
        if not np.all(np.isfinite(W)) or np.any(W <= 0):
            raise InputError("energy_density", W.tolist(), "an inelastic energy density per cycle > 0 J/m^3")
        return W

    def describe(self) -> str:
        text = f"N50 = {self.coefficient.value:.6g} (dW / 1 MJ/m^3)^{self.exponent.value:g}"
        if self.growth_coefficient is not None:
            a = "a" if self.crack_length is None else f"{self.crack_length.value:.4g} m"
            text += (f" + {a} / ({self.growth_coefficient.value:.6g} m/cycle "
                     f"(dW / 1 MJ/m^3)^{self.growth_exponent.value:g})")
        return text

    def to_dict(self) -> dict:
        return {"key": self.key, "name": self.name, "kind": self.kind, "measure": "energy",
                "input": self.input_name, "family": self.family, "source": self.source,
                "equation": self.describe(), "energy_definition": self.energy_definition, "notes": list(self.notes),
                "constants": {k: c.to_dict() for k, c in self.constants().items()}}


_SYED = ("A. Syed, Accumulated creep strain and energy density based thermal fatigue life prediction models "
         "for SnAgCu solder joints, ECTC 2004")
SYED_2004_SAC = EnergyLaw(
    "syed_2004_sac", "Syed 2004 creep-energy law (Sn-Ag-Cu)",
    coefficient=Constant(1.0 / 0.0019, "cycles", f"{_SYED}: N_f = (C' W)^-1 with C' = 0.0019 per MPa; value "
                         "recalled, paper not read", "from memory"),
    exponent=Constant(-1.0, "1", f"{_SYED}: life inversely proportional to the energy; form recalled", "from memory"),
    energy_definition=("creep energy density only (solder modelled as elastic plus Garofalo creep), accumulated "
                       "over a stabilised cycle and volume-averaged over the critical region of the joint in a "
                       "finite-element model"),
    family=TIN_SILVER_COPPER, source=_SYED,
    notes=("the constant belongs to its energy definition and constitutive model; a whole-layer average or an "
           "energy from another model is not comparable",),
)
"""Syed's creep-energy law for Sn-Ag-Cu, constants from memory (flagged in every output)."""

_PSI_PER_MPA = 1e6 / 6894.757293168  # 1 MPa in psi (1 psi = 6894.757293168 Pa, exact by definition of lbf and in)
_DARVEAUX = ("R. Darveaux, Effect of simulation methodology on solder joint crack growth correlation, ECTC 2000 "
             "(also J. Electron. Packag. 2002)")
_DARVEAUX_K = {"K1": 22400.0, "K2": -1.52, "K3": 5.86e-7, "K4": 0.98}
"""Darveaux's constants in inch-pound units as widely quoted (from memory): K1 cycles/psi^K2, K3 in/(cycle psi^K4)."""

DARVEAUX_2000_SNPB = EnergyLaw(
    "darveaux_2000_snpb", "Darveaux 2000 initiation and growth (tin-lead)",
    coefficient=Constant(_DARVEAUX_K["K1"] * _PSI_PER_MPA ** _DARVEAUX_K["K2"], "cycles",
                         f"{_DARVEAUX}: K1 = 22400 cycles/psi^K2 recalled, converted here to 1 MJ/m^3", "from memory"),
    exponent=Constant(_DARVEAUX_K["K2"], "1", f"{_DARVEAUX}: K2 = -1.52 recalled", "from memory"),
    growth_coefficient=Constant(_DARVEAUX_K["K3"] * 0.0254 * _PSI_PER_MPA ** _DARVEAUX_K["K4"], "m/cycle",
                                f"{_DARVEAUX}: K3 = 5.86e-7 in/(cycle psi^K4) recalled, converted here", "from memory"),
    growth_exponent=Constant(_DARVEAUX_K["K4"], "1", f"{_DARVEAUX}: K4 = 0.98 recalled", "from memory"),
    energy_definition=("viscoplastic (plastic plus creep) energy density per stabilised cycle, volume-averaged "
                       "over a layer of elements about 25 um thick along the pad interface where the crack runs"),
    family=TIN_LEAD, source=_DARVEAUX,
    notes=("needs the crack length at failure a (the joint diameter at the pad): the user's value",
           "the constants shift with the simulation method used to compute the energy (Darveaux 2000)"),
)
"""Darveaux's initiation-plus-growth law for Sn-Pb(-Ag), constants from memory; the crack length is the
user's (:meth:`EnergyLaw.with_crack_length`)."""

LIFE_LAWS: Mapping[str, "CoffinManson | EnergyLaw"] = MappingProxyType(
    {law.key: law for law in (ENGELMAIER_WILD, SYED_2004_SAC, DARVEAUX_2000_SNPB)}
)
"""The named laws; "coffin_manson" and "energy" with the user's constants are built by the caller."""


# ------------------------------------------------------------------------------------------ spread
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
