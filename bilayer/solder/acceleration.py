"""Norris-Landzberg acceleration between a test and a field cycle, its parameter sets, and the one
chamber life a solder result stands behind.

    AF = N_field / N_test = (dT_test/dT_field)^n (f_field/f_test)^m exp[(E_a/k)(1/Tmax_field - 1/Tmax_test)]

(Norris & Landzberg, IBM J. Res. Dev. 13:266, 1969); f in cycles per day, Tmax absolute. Direction of
the frequency term: life grows with the cycling frequency, N ~ f^m (the form of the 1969 fit). A slower
cycle leaves more time for creep in each cycle, so each cycle does more damage; a field cycle slower
than the test therefore lowers AF. This is the physics of creep-fatigue, not a convention to choose.

Chamber life: the life under the test cycle can be had two ways, the life law applied to the test
cycle itself, or the field life divided by AF. The result stands behind the first whenever the law can
evaluate the test cycle (it recomputes the joint's strain and the law's temperature and dwell terms
for that cycle, with the same constants as the field life) and shows the second as a cross-check with
their difference; when the law cannot (an energy or inelastic-strain input known only for the field
cycle), the second is the figure.
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from types import MappingProxyType
from typing import Mapping

import numpy as np

from ..core.errors import InputError
from .alloys import TIN_LEAD, TIN_SILVER_COPPER

__all__ = ["NorrisLandzbergSet", "NORRIS_LANDZBERG_SETS", "NORRIS_LANDZBERG_CONVENTION", "user_acceleration_set",
           "acceleration_set", "norris_landzberg_factor", "acceleration_factors", "ChamberLife", "chamber_life"]


@dataclass(frozen=True)
class NorrisLandzbergSet:
    """Exponents of one Norris-Landzberg fit: n (temperature swing), m (frequency), E_a/k [K]; ``family``
    the alloy family of the joints it was fitted on ("" for the user's own exponents)."""

    key: str
    label: str
    swing_exponent: float
    frequency_exponent: float
    activation_temperature: float
    status: str
    source: str
    family: str = ""

    def to_dict(self) -> dict:
        return {
            "key": self.key,
            "label": self.label,
            "n": self.swing_exponent,
            "m": self.frequency_exponent,
            "activation_temperature": self.activation_temperature,
            "status": self.status,
            "source": self.source,
            "family": self.family,
        }


NORRIS_LANDZBERG_SETS: Mapping[str, NorrisLandzbergSet] = MappingProxyType(
    {
        s.key: s
        for s in (
            NorrisLandzbergSet(
                "snpb_1969", "Sn-Pb (Norris & Landzberg 1969)", 1.9, 1.0 / 3.0, 1414.0,
                "parameters confirmed only in secondary sources",
                "Norris, K. C. & Landzberg, A. H., IBM J. Res. Dev. 13(3):266-271 (1969), high-lead C4 joints",
                TIN_LEAD,
            ),
            NorrisLandzbergSet(
                "sac_pan_2005", "SAC (Pan et al. 2005)", 2.65, 0.136, 2185.0,
                "from memory, not verified; the paper's time term may be a dwell time, not a frequency",
                "Pan, N. et al., SMTA International (2005)",
                TIN_SILVER_COPPER,
            ),
            NorrisLandzbergSet(
                "sac305_2012", "SAC305 (J. Electron. Packag. 2012)", 2.3, 0.3, 4560.0,
                "secondary (public code comments), not the paper; E_a/k quoted as 4560-4640 K",
                "Norris-Landzberg acceleration factors and Goldmann constants for SAC305 lead-free "
                "electronics, J. Electron. Packag. (Sept. 2012)",
                TIN_SILVER_COPPER,
            ),
        )
    }
)

NORRIS_LANDZBERG_CONVENTION = (
    "AF = N_field / N_test (field cycles per test cycle) = (dT_test/dT_field)^n (f_field/f_test)^m "
    "exp[(Ea/k)(1/Tmax_field - 1/Tmax_test)]; life grows with the cycling frequency (N ~ f^m): a slower cycle "
    "leaves more time for creep in each cycle, so a field cycle slower than the test lowers AF."
)


def user_acceleration_set(swing_exponent: float, frequency_exponent: float, activation_temperature: float
                          ) -> NorrisLandzbergSet:
    """A set of the user's own exponents n, m and E_a/k [K] (taken as fitted on the joint's alloy)."""
    values = {"acceleration_n": swing_exponent, "acceleration_m": frequency_exponent,
              "acceleration_activation": activation_temperature}
    for name, value in values.items():
        if not math.isfinite(value) or value < 0:
            raise InputError(name, value, "a finite value >= 0")
    return NorrisLandzbergSet("user", "the user's exponents", swing_exponent, frequency_exponent,
                              activation_temperature, "the user's values", "the user's values")


def acceleration_set(parameters: "NorrisLandzbergSet | str") -> NorrisLandzbergSet:
    """A set by key (one of :data:`NORRIS_LANDZBERG_SETS`) or as given."""
    if isinstance(parameters, NorrisLandzbergSet):
        return parameters
    if isinstance(parameters, str) and parameters in NORRIS_LANDZBERG_SETS:
        return NORRIS_LANDZBERG_SETS[parameters]
    raise InputError("acceleration parameters", parameters, "one of " + ", ".join(NORRIS_LANDZBERG_SETS))


def norris_landzberg_factor(test, field, parameters: "NorrisLandzbergSet | str" = "snpb_1969") -> float:
    """Acceleration factor AF = N_field / N_test between a test and a field
    :class:`~bilayer.solder.joint.CycleProfile` (direction of the frequency term: see the module)."""
    for name, cycle in (("test", test), ("field", field)):
        if not all(hasattr(cycle, a) for a in ("swing", "high", "cycles_per_day")):
            raise InputError(name, cycle, "a CycleProfile")
    return float(acceleration_factors(test.swing, test.cycles_per_day, test.high, field.swing, field.cycles_per_day,
                                      field.high, parameters))


def acceleration_factors(test_swing, test_rate, test_high, field_swing, field_rate, field_high,
                         parameters: "NorrisLandzbergSet | str" = "snpb_1969"):
    """Norris-Landzberg AF from the swings [K], rates [1/day] and peak temperatures [K] (vectorised)."""
    p = acceleration_set(parameters)
    return (
        (np.asarray(test_swing, float) / field_swing) ** p.swing_exponent
        * (np.asarray(field_rate, float) / test_rate) ** p.frequency_exponent
        * np.exp(p.activation_temperature * (1.0 / np.asarray(field_high, float) - 1.0 / np.asarray(test_high, float)))
    )


@dataclass(frozen=True)
class ChamberLife:
    """The median life under the test cycle the result stands behind, and its cross-check.

    ``basis`` says how ``life`` was found; ``cross_check`` (or None) is the other route, ``difference``
    = cross_check / life - 1, ``explanation`` one sentence on why they differ.
    """

    life: float
    basis: str
    cross_check: float | None
    cross_check_basis: str
    difference: float | None
    explanation: str

    def to_dict(self) -> dict:
        return {"life": self.life, "basis": self.basis, "cross_check": self.cross_check,
                "cross_check_basis": self.cross_check_basis, "difference": self.difference,
                "explanation": self.explanation, "units": {"life": "cycles", "cross_check": "cycles",
                                                           "difference": "1"}}


def chamber_life(field_life: float, factor: float, law_test_life: float | None, law_name: str, set_label: str,
                 missing_input: str = "") -> ChamberLife:
    """Choose the chamber life (see the module): the law on the test cycle when ``law_test_life`` is known,
    else ``field_life / factor``; ``missing_input`` names what the law lacks for the test cycle."""
    by_factor = field_life / factor
    if law_test_life is None:
        return ChamberLife(by_factor, f"field life / Norris-Landzberg factor ({set_label})", None, "", None,
                           f"The {law_name} law needs the {missing_input} of the test cycle to give its own "
                           "chamber life, so the field life is carried over by the acceleration factor.")
    difference = by_factor / law_test_life - 1.0
    return ChamberLife(
        law_test_life, f"{law_name} law applied to the test cycle", by_factor,
        f"field life / Norris-Landzberg factor ({set_label})", difference,
        f"They differ by {100 * difference:+.0f} % because the law recomputes this joint's strain and its own "
        f"temperature and dwell terms for the test cycle, while the factor scales the field life by exponents "
        f"fitted to other joints ({set_label}); the law's figure is the one used.")
