"""Snap-action disc: a one-mode energy model, INDICATIVE ONLY (trends, sensitivities, fitting data).

A shallow disc of radius a formed to a spherical dome of rise H0 (formed curvature kappa0 = 2 H0 / a^2,
stress-free at the reference temperature) is given one degree of freedom, a uniform equal-biaxial
curvature kappa. Energy per unit area (derived here in the spirit of Wittrick, Myers & Blunden,
Q. J. Mech. Appl. Math. 6:15, 1953):

    Pi = (D_b / 2) 2 (kappa - kappa0 - kappa_T)^2  +  Eh a^4 (kappa^2 - kappa0^2)^2 / 384

with D_b = D (1 + nu) the equal-biaxial bending rigidity (engine plate state: E I of Y = E/(1-nu)),
Eh = (1 - nu) * (in-plane biaxial rigidity) the membrane stiffness, and kappa_T the free thermal
curvature change of the strip. The 1/384 term is the membrane energy of a free-edged disc whose Gaussian
curvature changes uniformly (plane-stress Airy solution). Equilibrium:

    kappa_T = (kappa - kappa0) + c kappa (kappa^2 - kappa0^2),   c = Eh a^4 / (192 D_b)
                                                                   (= (1 - nu) a^4 / (16 h^2) homogeneous)
    beta^2 = c kappa0^2 ; snap exists only for beta^2 > 1 (H0/h > 2/sqrt(1 - nu))
    G = 2 (beta^2 - 1)^(3/2) / (3 sqrt(3) beta)
    snap (trip) at kappa_T = -kappa0 (1 + G),  reset at kappa_T = -kappa0 (1 - G)

G > 1 means both shapes are stable at the reference temperature (a manual-reset disc).
Limits: single mode, spherical, elastic, shallow, free edge, uniform temperature, no load on the disc.
Real discs are formed non-spherically, stress-relieved and calibrated; never use this to certify a device.
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Union

import numpy as np

from ..core import laminate
from ..core.errors import InputError, check_range
from .element import THERMOSTAT_CAUTIONS, _first_crossing, _result_dict
from .strip import DatasheetStrip, ThermostatStrip

__all__ = ["SnapDisc", "SnapDiscResult", "snap_temperatures", "SNAP_DISC_LIMITS"]

SNAP_DISC_LIMITS = (
    "INDICATIVE: one-mode (uniform curvature) energy model for trends only",
    "spherical, shallow (dome rise much smaller than the radius), elastic, free edge, no load on the disc",
    "uniform temperature; real discs are formed non-spherically, stress-relieved and calibrated",
    "absolute snap temperatures are not reliable; fit the model to measured trip/reset data",
)


@dataclass(frozen=True, eq=False)
class SnapDisc:
    """A formed disc of ``diameter`` [m] with dome rise ``dome_height`` [m] at the reference temperature,
    signed: > 0 when the centre stands toward the strip's top face (top face convex, kappa0 > 0)."""

    strip: Union[ThermostatStrip, DatasheetStrip]
    diameter: float
    dome_height: float

    def __post_init__(self):
        if isinstance(self.strip, ThermostatStrip) and self.strip.state.value != "plate":
            raise InputError("snap_disc.bending_state", self.strip.state.value, "'plate' (equal-biaxial bending)")
        if not isinstance(self.strip, (ThermostatStrip, DatasheetStrip)):
            raise InputError("snap_disc.strip", self.strip, "a ThermostatStrip or DatasheetStrip")
        object.__setattr__(self, "diameter", check_range("snap_disc.diameter", self.diameter, 0.0, 1.0, unit="m"))
        height = check_range("snap_disc.dome_height", self.dome_height, -0.25 * self.diameter, 0.25 * self.diameter, unit="m")
        if height == 0.0:
            raise InputError("snap_disc.dome_height", height, "a non-zero dome rise")
        object.__setattr__(self, "dome_height", height)

    @property
    def radius(self) -> float:
        return 0.5 * self.diameter

    @property
    def formed_curvature(self) -> float:
        """kappa0 = 2 H0 / a^2 [1/m] (engine sign)."""
        return 2.0 * self.dome_height / self.radius**2

    @property
    def membrane_coefficient(self) -> float:
        """c = Eh a^4 / (192 D_b) [m^2] (see the module docstring)."""
        strip = self.strip
        a4 = self.radius**4
        if isinstance(strip, DatasheetStrip):
            return (1.0 - strip.poisson_ratio) * a4 / (16.0 * strip.thickness**2)
        Y, _, _, nu = strip.elastic_constants
        t = strip.stack.thicknesses
        section = laminate.solve(Y, t, np.zeros_like(Y))
        biaxial = float(section.axial_rigidity)
        nu_mean = float(np.sum(Y * t * nu) / np.sum(Y * t))
        return (1.0 - nu_mean) * biaxial * a4 / (192.0 * float(section.flexural_rigidity))


@dataclass(frozen=True, eq=False)
class SnapDiscResult:
    """Snap (trip) and reset temperatures [K] of the one-mode model; ``None`` where the disc does not
    snap (beta^2 <= 1) or the temperature lies outside the search range. Indicative only."""

    label: str
    formed_curvature: float
    beta_squared: float
    g_factor: float
    snaps: bool
    manual_reset: bool
    snap_curvature_change: float | None
    reset_curvature_change: float | None
    snap_temperature: float | None
    reset_temperature: float | None
    differential: float | None
    curvature_source: str
    warnings: tuple[str, ...]
    limits: tuple[str, ...] = SNAP_DISC_LIMITS
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        return _result_dict(self)


def equilibrium_thermal_curvature(disc: SnapDisc, kappa):
    """kappa_T that holds the disc at curvature ``kappa`` [1/m] (the equilibrium relation; vectorised)."""
    k0, c = disc.formed_curvature, disc.membrane_coefficient
    kappa = np.asarray(kappa, float)
    return (kappa - k0) + c * kappa * (kappa * kappa - k0 * k0)


def snap_temperatures(disc: SnapDisc, search=None) -> SnapDiscResult:
    """Trip and reset temperatures of the one-mode model (indicative; see :data:`SNAP_DISC_LIMITS`)."""
    k0 = disc.formed_curvature
    beta2 = disc.membrane_coefficient * k0 * k0
    strip = disc.strip
    warnings: tuple[str, ...] = ()
    if disc.dome_height / disc.radius > 0.2:
        warnings += ("dome rise over radius above 0.2: the shallow-shell model is outside its range",)
    if beta2 <= 1.0:
        return SnapDiscResult("indicative", k0, beta2, 0.0, False, False, None, None, None, None, None,
                              strip.source, warnings + ("beta^2 <= 1: the disc creeps through flat without snapping",))
    G = 2.0 * (beta2 - 1.0) ** 1.5 / (3.0 * math.sqrt(3.0) * math.sqrt(beta2))
    snap_k, reset_k = -k0 * (1.0 + G), -k0 * (1.0 - G)
    temps = []
    for target in (snap_k, reset_k):
        hit = _first_crossing(lambda T, target=target: np.asarray(strip.curvature_change(T)) - target,
                              strip.reference_temperature, search)
        temps.append(None if hit is None else hit[0])
    diff = None if None in temps else abs(temps[0] - temps[1])
    if G > 1.0:
        warnings += ("G > 1: both shapes are stable at the reference temperature (manual-reset disc)",)
    if None not in temps:
        warnings += strip.data_warnings(np.array(temps))
    return SnapDiscResult("indicative", k0, beta2, G, True, G > 1.0, snap_k, reset_k, temps[0], temps[1], diff,
                          strip.source, warnings)
