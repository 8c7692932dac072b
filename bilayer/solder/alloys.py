"""Solder alloy families and the rule that keeps a life law or an acceleration set on its own family.

Life laws and acceleration sets are fitted on joints of one alloy family; applied to another they give
numbers without support (tin-lead constants on a tin-silver-copper joint are the classic case). The
family of the joint's solder is read from the material's ``composition`` ("Sn-3.0Ag-0.5Cu"), else from
its name ("Sn63Pb37 eutectic solder", "SAC305"):

    tin-lead            any tin-based composition naming Pb (eutectic and near-eutectic Sn-Pb, Sn-Pb-Ag)
    tin-silver-copper   Sn with Ag and Cu, no Pb ("SAC" alloys)
    other lead-free     Sn without Pb that is not Sn-Ag-Cu (Sn-Ag, Sn-Cu, Sn-Bi, Sn-Sb, Au-Sn, ...)
    unknown             no solder named, or no element symbols found in its composition or name

:func:`family_check` applies the rule: an item calibrated for another family is refused (a project
error saying how to accept it); accepted explicitly it becomes a warning carried by every output.
"""
from __future__ import annotations

import re
from dataclasses import dataclass

from ..core.errors import InputError

__all__ = ["TIN_LEAD", "TIN_SILVER_COPPER", "OTHER_LEAD_FREE", "UNKNOWN", "FAMILY_LABELS", "AlloyFamily",
           "alloy_family", "family_check"]

TIN_LEAD = "tin-lead"
TIN_SILVER_COPPER = "tin-silver-copper"
OTHER_LEAD_FREE = "other lead-free"
UNKNOWN = "unknown"
FAMILY_LABELS = {
    TIN_LEAD: "tin-lead (Sn-Pb)",
    TIN_SILVER_COPPER: "lead-free tin-silver-copper (Sn-Ag-Cu)",
    OTHER_LEAD_FREE: "lead-free, not Sn-Ag-Cu",
    UNKNOWN: "alloy not known",
}

_ELEMENTS = {"Sn", "Pb", "Ag", "Cu", "Bi", "In", "Sb", "Zn", "Ni", "Au", "Ge", "Co"}
_SYMBOL = re.compile(r"([A-Z][a-z]?)(?![a-z])")
_SAC_NAME = re.compile(r"(?i)(?<![a-z])sac\d*")


@dataclass(frozen=True)
class AlloyFamily:
    """The family of a joint's solder: ``key`` (one of the module constants), ``basis`` how it was found."""

    key: str
    basis: str

    @property
    def label(self) -> str:
        return FAMILY_LABELS[self.key]

    @property
    def known(self) -> bool:
        return self.key != UNKNOWN

    def to_dict(self) -> dict:
        return {"family": self.key, "label": self.label, "basis": self.basis}


def _elements(text: str) -> set[str]:
    found = {symbol for symbol in _SYMBOL.findall(text) if symbol in _ELEMENTS}
    if _SAC_NAME.search(text):
        found |= {"Sn", "Ag", "Cu"}
    return found


def _family_of(elements: set[str]) -> str:
    if "Sn" not in elements and "Pb" not in elements:
        return UNKNOWN
    if "Pb" in elements:
        return TIN_LEAD
    if {"Ag", "Cu"} <= elements:
        return TIN_SILVER_COPPER
    return OTHER_LEAD_FREE


def alloy_family(solder) -> AlloyFamily:
    """The family of ``solder`` (a Material, or None when the joint names no solder)."""
    if solder is None:
        return AlloyFamily(UNKNOWN, "no solder material named")
    name = getattr(solder, "name", None)
    if name is None:
        return AlloyFamily(UNKNOWN, "the solder is given as a number (a CTE), not as a material")
    composition = getattr(solder, "composition", "")
    if composition:
        key = _family_of(_elements(composition))
        if key != UNKNOWN:
            return AlloyFamily(key, f"composition {composition!r} of {name!r}")
    key = _family_of(_elements(name))
    if key != UNKNOWN:
        return AlloyFamily(key, f"the name {name!r} (no composition given)")
    return AlloyFamily(UNKNOWN, f"{name!r} names no alloying elements; give its composition, e.g. 'Sn-3.0Ag-0.5Cu'")


def family_check(what: str, field: str, choice: str, calibrated_for: str, joint: AlloyFamily,
                 accepted: bool) -> str | None:
    """Apply the family rule to one item (a life law or an acceleration set).

    ``calibrated_for`` is the family the item was fitted on ("" for the user's own constants, which are
    taken as fitted on the joint's alloy). Returns the warning text to carry, or None; raises
    :class:`InputError` naming ``field`` when the families differ and the user has not accepted it.
    """
    if not calibrated_for:
        return None
    if not joint.known:
        return (f"the {what} {choice!r} is calibrated for {FAMILY_LABELS[calibrated_for]} joints and the "
                f"joint's alloy is not known ({joint.basis}): it is used unchecked")
    if calibrated_for == joint.key:
        return None
    if not accepted:
        raise InputError(
            field, choice, f"a {what} calibrated for {joint.label} solder",
            f"{choice!r} is calibrated for {FAMILY_LABELS[calibrated_for]} joints and the solder is {joint.label} "
            f"({joint.basis}); its numbers would have no support for this joint. Choose one for the joint's "
            f"alloy, or set accept_other_alloy = true to use it anyway (every output then carries a warning)")
    return (f"ACCEPTED BY THE USER: the {what} {choice!r} is calibrated for {FAMILY_LABELS[calibrated_for]} "
            f"joints but the solder is {joint.label} ({joint.basis}); its results for this joint have no "
            f"calibration behind them")
