"""Joint geometry for the global-mismatch (DNP) strain: leadless parts, area arrays, compliant leads.

The component and the board expand by different amounts about the part's neutral (non-moving) point;
the joint at distance L_D from it is sheared over its height h (Engelmaier, IEEE Trans. CHMT-6:232, 1983):

    stiff joints (leadless parts, area arrays)   dgamma = F L_D |eps_board - eps_component| / h
    compliant leads                              dgamma = F K_D (L_D |eps_b - eps_c|)^2 / (sigma_r A h)

eps = integral of alpha dT over each part's own cycle. F is Engelmaier's non-ideality factor; K_D the
diagonal flexural stiffness of the corner lead [N/m], A the effective load-bearing solder area [m^2] and
sigma_r = 200 psi (1.379 MPa) Engelmaier's normalising stress. The lead form is from memory of
IPC-D-279 / IPC-SM-785 (not read) and is flagged so in every output; the lead can only lower the strain,
so it is capped at the stiff-joint value.

What L_D, the stand-off and h mean differs by joint type (the ``definitions`` of each class):

    chip_carrier  leadless chip carrier: L_D from the centre to the centre of the farthest joint (about half
                  the diagonal of a square carrier); h the solder thickness between termination and pad
    chip          two-terminal chip component: L_D half the distance between the termination centres
    area_array    ball grid: L_D from the package centre to the centre of the outermost (corner) ball,
                  pitch/2 sqrt((columns - 1)^2 + (rows - 1)^2) for a full array, or given for a
                  depopulated one; stand-off the gap from the package underside to the board surface;
                  h the solder height between the pad faces, equal to the stand-off unless given
    leaded        L_D to the corner lead; h the solder height at the lead foot

Underfilled joints are refused: the underfill bonds part and board over the whole area, so the joints
no longer take the DNP displacement in shear and the formulas above do not apply.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..core.errors import InputError, check_range, warn_suspicious

__all__ = [
    "JOINT_TYPES",
    "FACTOR_GUIDANCE",
    "LEAD_REFERENCE_STRESS",
    "UNDERFILL_EXPLANATION",
    "global_shear_strain",
    "area_array_dnp",
    "LeadlessJoint",
    "AreaArrayJoint",
    "LeadedJoint",
]

JOINT_TYPES = {
    "chip_carrier": "leadless chip carrier",
    "chip": "leadless two-terminal chip component (resistor, capacitor)",
    "area_array": "area array (ball grid)",
    "leaded": "part with compliant leads",
}

_F_SOURCE = "Engelmaier / IPC-D-279 tables, from memory (not read)"
FACTOR_GUIDANCE = {
    "chip_carrier": (0.7, 1.2, _F_SOURCE),
    "chip": (1.0, 1.5, _F_SOURCE),
    "area_array": (1.0, 1.0, _F_SOURCE + "; 'about 1 for many area arrays'"),
    "leaded": (1.0, 1.0, _F_SOURCE + "; 'about 1 for leaded parts'"),
}
"""Typical range (low, high, source) of the non-ideality factor F per joint type."""

LEAD_REFERENCE_STRESS = 200.0 * 6894.757293168
"""Engelmaier's normalising stress of the lead form, 200 psi [Pa] (from memory)."""

UNDERFILL_EXPLANATION = (
    "an underfill bonds the part to the board over its whole area: the joints no longer take the "
    "distance-to-neutral-point displacement in shear (the underfill carries most of the mismatch and the "
    "assembly bends), so dgamma = F L_D dalpha dT / h does not apply. The joint strain then depends on the "
    "underfill's modulus, CTE and glass transition; it needs a model of the bonded layers (for example a "
    "finite-element model) and a life law fitted to underfilled joints"
)


def global_shear_strain(dnp, standoff, mismatch_strain, factor=1.0):
    """Cyclic shear strain range of a stiff joint, dgamma = F L_D |mismatch| / h (vectorised; SI)."""
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


def area_array_dnp(pitch: float, columns: int, rows: int | None = None) -> float:
    """Distance from the centre of a full columns x rows array to its corner ball, pitch/2 sqrt((c-1)^2 + (r-1)^2)."""
    pitch = check_range("ball_pitch", pitch, 0.0, 0.1, unit="m")
    rows = columns if rows is None else rows
    for name, count in (("ball_columns", columns), ("ball_rows", rows)):
        if isinstance(count, bool) or not isinstance(count, (int, np.integer)) or count < 2:
            raise InputError(name, count, "an integer >= 2 (balls along that side)")
    return 0.5 * pitch * math.hypot(columns - 1, rows - 1)


def _refuse_underfill(kind: str, underfilled: bool) -> None:
    if underfilled:
        raise InputError("underfill", True, f"no underfill for the {JOINT_TYPES[kind]} DNP model",
                         UNDERFILL_EXPLANATION)


class _StiffJoint:
    """Strain of a joint that follows the DNP displacement fully (leadless parts, area arrays)."""

    def shear_strain(self, mismatch, factor, dnp_scale=1.0, height_scale=1.0):
        """dgamma for the mismatch strain(s) and F, with optional relative scales of L_D and h (vectorised)."""
        return global_shear_strain(self.dnp * np.asarray(dnp_scale, float),
                                   self.joint_height * np.asarray(height_scale, float), mismatch, factor)

    @property
    def notes(self) -> tuple[str, ...]:
        return ()


@dataclass(frozen=True)
class LeadlessJoint(_StiffJoint):
    """A leadless part's joint: ``dnp`` L_D [m], ``standoff`` the solder thickness h [m]; ``kind``
    "chip_carrier" or "chip" (two terminations). ``underfilled`` = True is refused (see the module)."""

    dnp: float
    standoff: float
    kind: str = "chip_carrier"
    underfilled: bool = False

    def __post_init__(self):
        if self.kind not in ("chip_carrier", "chip"):
            raise InputError("joint_type", self.kind, "'chip_carrier' or 'chip' for a leadless part")
        _refuse_underfill(self.kind, self.underfilled)
        object.__setattr__(self, "dnp", check_range("dnp", self.dnp, 0.0, 1.0, unit="m"))
        object.__setattr__(self, "standoff", check_range("standoff", self.standoff, 0.0, 0.1, unit="m"))
        if not 1e-5 <= self.standoff <= 2e-3:
            warn_suspicious("standoff", self.standoff, "solder joint heights are usually 10 um to 2 mm")

    @property
    def joint_height(self) -> float:
        return self.standoff

    @property
    def definitions(self) -> tuple[str, ...]:
        if self.kind == "chip":
            return ("L_D: half the distance between the centres of the two terminations",
                    "h: solder thickness between the termination and its pad (the stand-off)")
        return ("L_D: from the part's centre (neutral point) to the centre of the farthest joint, about half "
                "the diagonal of a square carrier",
                "h: solder thickness between the termination and its pad (the stand-off)")

    def to_dict(self) -> dict:
        return {"joint_type": self.kind, "description": JOINT_TYPES[self.kind], "dnp": self.dnp,
                "standoff": self.standoff, "joint_height": self.joint_height, "definitions": list(self.definitions),
                "units": {"dnp": "m", "standoff": "m", "joint_height": "m"}}


@dataclass(frozen=True)
class AreaArrayJoint(_StiffJoint):
    """The corner ball of an area array: ``standoff`` [m] and either ``pitch`` [m] with ``columns`` (and
    ``rows``, default = columns) of a full array, or ``dnp`` [m] to the outermost ball directly.
    ``joint_height`` [m], the solder height between the pad faces, defaults to the stand-off."""

    standoff: float
    pitch: float | None = None
    columns: int | None = None
    rows: int | None = None
    dnp: float | None = None
    joint_height: float | None = None
    underfilled: bool = False

    kind = "area_array"

    def __post_init__(self):
        _refuse_underfill(self.kind, self.underfilled)
        standoff = check_range("standoff", self.standoff, 0.0, 0.1, unit="m")
        object.__setattr__(self, "standoff", standoff)
        by_array = self.pitch is not None or self.columns is not None
        if by_array == (self.dnp is not None):
            raise InputError("dnp", self.dnp, "either ball_pitch with ball_columns (full array) or dnp (to the "
                             "outermost ball), not both and not neither")
        if by_array:
            if self.pitch is None or self.columns is None:
                raise InputError("ball_pitch" if self.pitch is None else "ball_columns",
                                 None, "ball_pitch and ball_columns together")
            rows = self.columns if self.rows is None else self.rows
            object.__setattr__(self, "rows", rows)
            object.__setattr__(self, "dnp", area_array_dnp(self.pitch, self.columns, rows))
        else:
            object.__setattr__(self, "dnp", check_range("dnp", self.dnp, 0.0, 1.0, unit="m"))
        height = standoff if self.joint_height is None else check_range("joint_height", self.joint_height, 0.0, 0.1,
                                                                        unit="m")
        object.__setattr__(self, "joint_height", height)
        if not 5e-5 <= height <= 1.5e-3:
            warn_suspicious("joint_height", height, "collapsed ball heights are usually 0.05 to 1.5 mm")

    @property
    def definitions(self) -> tuple[str, ...]:
        where = (f"full {self.columns} x {self.rows} array at {self.pitch * 1e3:g} mm pitch: "
                 f"pitch/2 sqrt((columns-1)^2 + (rows-1)^2)" if self.pitch is not None else "given by the user")
        return (f"L_D: from the package centre to the centre of the outermost (corner) ball ({where})",
                "stand-off: from the package underside to the board surface",
                "h: solder height between the pad faces (the collapsed ball)"
                + (", taken equal to the stand-off" if self.joint_height == self.standoff else ""))

    def to_dict(self) -> dict:
        return {"joint_type": self.kind, "description": JOINT_TYPES[self.kind], "dnp": self.dnp,
                "standoff": self.standoff, "joint_height": self.joint_height, "ball_pitch": self.pitch,
                "ball_columns": self.columns, "ball_rows": self.rows, "definitions": list(self.definitions),
                "units": {"dnp": "m", "standoff": "m", "joint_height": "m", "ball_pitch": "m"}}


@dataclass(frozen=True)
class LeadedJoint:
    """The corner joint of a part with compliant leads: ``dnp`` L_D [m], ``standoff`` the joint height h [m],
    ``lead_stiffness`` K_D, the diagonal flexural stiffness of the corner lead [N/m], ``joint_area`` A, the
    effective load-bearing solder area [m^2] (form from memory, see the module)."""

    dnp: float
    standoff: float
    lead_stiffness: float
    joint_area: float
    underfilled: bool = False

    kind = "leaded"

    def __post_init__(self):
        _refuse_underfill(self.kind, self.underfilled)
        object.__setattr__(self, "dnp", check_range("dnp", self.dnp, 0.0, 1.0, unit="m"))
        object.__setattr__(self, "standoff", check_range("standoff", self.standoff, 0.0, 0.1, unit="m"))
        object.__setattr__(self, "lead_stiffness", check_range("lead_stiffness", self.lead_stiffness, 0.0, 1e9,
                                                               unit="N/m"))
        object.__setattr__(self, "joint_area", check_range("joint_area", self.joint_area, 0.0, 1e-4, unit="m^2"))

    @property
    def joint_height(self) -> float:
        return self.standoff

    def shear_strain(self, mismatch, factor, dnp_scale=1.0, height_scale=1.0):
        """min(F K_D (L_D eps)^2 / (sigma_r A h), F L_D eps / h) (vectorised)."""
        dnp = self.dnp * np.asarray(dnp_scale, float)
        h = self.joint_height * np.asarray(height_scale, float)
        stiff = np.asarray(global_shear_strain(dnp, h, mismatch, factor))
        displacement = dnp * np.abs(np.asarray(mismatch, float))
        compliant = (np.asarray(factor, float) * self.lead_stiffness * displacement**2
                     / (LEAD_REFERENCE_STRESS * self.joint_area * h))
        out = np.minimum(compliant, stiff)
        return float(out) if out.ndim == 0 else out

    def capped(self, mismatch) -> bool:
        """True when the lead is so stiff that the stiff-joint strain applies (the cap is active)."""
        displacement = self.dnp * abs(mismatch)
        return self.lead_stiffness * displacement / (LEAD_REFERENCE_STRESS * self.joint_area) >= 1.0

    @property
    def definitions(self) -> tuple[str, ...]:
        return ("L_D: from the part's centre to the corner lead",
                "h: solder joint height at the lead foot",
                "K_D: diagonal flexural stiffness of the corner lead; A: effective load-bearing solder area")

    @property
    def notes(self) -> tuple[str, ...]:
        return ("compliant-lead strain F K_D (L_D dalpha dT)^2 / (200 psi A h): Engelmaier's lead form, "
                "from memory of IPC-D-279 / IPC-SM-785 (not read); capped at the stiff-joint strain",)

    def to_dict(self) -> dict:
        return {"joint_type": self.kind, "description": JOINT_TYPES[self.kind], "dnp": self.dnp,
                "standoff": self.standoff, "joint_height": self.joint_height, "lead_stiffness": self.lead_stiffness,
                "joint_area": self.joint_area, "lead_reference_stress": LEAD_REFERENCE_STRESS,
                "definitions": list(self.definitions), "notes": list(self.notes),
                "units": {"dnp": "m", "standoff": "m", "joint_height": "m", "lead_stiffness": "N/m",
                          "joint_area": "m^2", "lead_reference_stress": "Pa"}}
