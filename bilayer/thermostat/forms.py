"""Thermostat element forms: exact arc kinematics, small-deflection values, stiffness at the working point.

Every form is a planar centre line clamped at s = 0 (tangent along +x, the stack's top face toward +z)
whose curvature changes uniformly by ``dkappa`` [1/m] when the temperature changes. The curvature
change itself always comes from a strip (:mod:`bilayer.thermostat.strip`): from the engine's stack, or
from a flexivity taken from a data sheet, never from a formula here.

Sign convention (the engine's): kappa > 0 when the top face is the longer one, so the tangent angle
obeys d(theta)/ds = -kappa and a straight cantilever with dkappa > 0 moves toward -z.

Exact kinematics: each segment (straight or a formed arc of curvature kappa_0) becomes an arc of
curvature kappa_0 + dkappa of unchanged length (inextensible centre line; layers.md section 6), and
the working point is found by chaining the arcs. The small-deflection value is the first-order term

    delta = dkappa * integral_0^L ( z_e - z(s), -(x_e - x(s)) ) ds          (rotation of the tail)

which for a cantilever of length L gives w = -dkappa L^2 / 2 (ASTM B106 flexivity F: dkappa = F dT/t).

Forces (small deflection, Maxwell-Mohr unit-load method): a force P along +z at the working point
gives the bending moment M(s) = -P (x_e - x(s)) (engine sign), the compliance
C = integral (x_e - x)^2 ds / (E I b), and the blocked force after a curvature change dkappa is
P_b = dkappa * integral (x_e - x) ds / C; for a cantilever 3 E I b dkappa / (2 L) = 3 M_T / (2 L)
(layers.md section 7). Coils work in rotation and torque: theta = dkappa L exactly, C = L / (E I b).
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from typing import ClassVar

import numpy as np

from ..core.errors import InputError, check_range

__all__ = [
    "ElementForm",
    "Cantilever",
    "SupportedStrip",
    "UShape",
    "Spiral",
    "Helix",
    "FlatDisc",
    "ELEMENT_FORMS",
    "element_from_mapping",
]

_GAUSS_NODES, _GAUSS_WEIGHTS = np.polynomial.legendre.leggauss(24)
_SAMPLES_PER_SEGMENT = 401


def _sinc(u):
    """sin(u)/u, finite at u = 0."""
    return np.sinc(np.asarray(u, float) / math.pi)


def _chain(segments: tuple[tuple[float, float], ...], dkappa):
    """Exact end point (x, z) and end tangent angle of a chain of arcs, broadcast over ``dkappa``.

    ``segments`` holds (length, formed curvature) pairs from the clamp; each becomes an arc of curvature
    kappa_0 + dkappa. An arc from angle theta with curvature k and length l advances by
    l * sinc(k l / 2) * (cos, sin)(theta - k l / 2) and turns by -k l.
    """
    dkappa = np.asarray(dkappa, float)
    x = np.zeros_like(dkappa)
    z = np.zeros_like(dkappa)
    theta = np.zeros_like(dkappa)
    for length, formed in segments:
        turn = (formed + dkappa) * length
        chord = length * _sinc(0.5 * turn)
        mid = theta - 0.5 * turn
        x = x + chord * np.cos(mid)
        z = z + chord * np.sin(mid)
        theta = theta - turn
    return x, z, theta


def _points(segments: tuple[tuple[float, float], ...], unit: np.ndarray):
    """Points of the formed (reference) centre line at fractions ``unit`` of every segment.

    Returns (x, z, length of the segment each point belongs to) as flat arrays.
    """
    xs, zs, ls = [], [], []
    x0 = z0 = theta = 0.0
    for length, formed in segments:
        s = unit * length
        turn = formed * s
        chord = s * _sinc(0.5 * turn)
        mid = theta - 0.5 * turn
        xs.append(x0 + chord * np.cos(mid))
        zs.append(z0 + chord * np.sin(mid))
        ls.append(np.full_like(unit, length))
        turn_full = formed * length
        chord_full = length * float(_sinc(0.5 * turn_full))
        x0 += chord_full * math.cos(theta - 0.5 * turn_full)
        z0 += chord_full * math.sin(theta - 0.5 * turn_full)
        theta -= turn_full
    return np.concatenate(xs), np.concatenate(zs), np.concatenate(ls)


@dataclass(frozen=True)
class ElementForm:
    """Base class: a planar element made of thermostat strip, clamped at one end.

    Subclasses give ``segments`` (length, formed curvature) from the clamp to the working point.
    ``output`` is "deflection" (working point moves along z, metres) or "rotation" (radians).
    """

    kind: ClassVar[str] = ""
    output: ClassVar[str] = "deflection"
    description: ClassVar[str] = ""

    # --- geometry -----------------------------------------------------------------------------
    @property
    def segments(self) -> tuple[tuple[float, float], ...]:  # pragma: no cover - abstract
        raise NotImplementedError

    @property
    def strip_length(self) -> float:
        """Length of thermostat strip in the element [m] (for volume and work per volume)."""
        return float(sum(length for length, _ in self.segments))

    @property
    def size(self) -> float:
        """A length scale of the form [m]; :meth:`scaled` multiplies every length by a factor."""
        return self.strip_length

    def scaled(self, factor: float) -> "ElementForm":  # pragma: no cover - abstract
        raise NotImplementedError

    # --- kinematics -------------------------------------------------------------------------------
    def travel(self, dkappa):
        """Exact motion of the working point along z [m] (rotation [rad] for coils) for a uniform
        curvature change ``dkappa`` [1/m]; broadcasts over arrays."""
        x0, z0, _ = _chain(self.segments, 0.0)
        _, z, _ = _chain(self.segments, dkappa)
        return z - z0

    def travel_rate(self) -> float:
        """Small-deflection travel per unit curvature change, d(travel)/d(dkappa) at zero [m^2]
        (= -integral (x_e - x(s)) ds for a deflection form)."""
        x, _, weight = self._quadrature()
        xe = float(_chain(self.segments, 0.0)[0])
        return float(-np.sum(weight * (xe - x)))

    def travel_small(self, dkappa):
        """First-order (small-deflection) travel, linear in ``dkappa``."""
        return self.travel_rate() * np.asarray(dkappa, float)

    def working_point(self, dkappa):
        """Exact (x, z) of the working point [m] in the clamp frame."""
        x, z, _ = _chain(self.segments, dkappa)
        return x, z

    def end_rotation(self, dkappa):
        """Exact change of the end tangent angle [rad] (counter-clockwise in x-z): -dkappa * L."""
        return -np.asarray(dkappa, float) * self.strip_length

    # --- statics (small deflection, unit-load method) ----------------------------------------------
    def compliance(self, bending_stiffness: float) -> float:
        """Travel per unit force at the working point [m/N] (rad/(N m) for coils) for a strip of
        bending stiffness E I b [N m^2]."""
        x, _, weight = self._quadrature()
        xe = float(_chain(self.segments, 0.0)[0])
        return float(np.sum(weight * (xe - x) ** 2)) / bending_stiffness

    def moment_arm(self) -> float:
        """Largest |bending moment| along the strip per unit force at the working point [m]
        (1 for coils: a torque is uniform along the strip)."""
        unit = np.linspace(0.0, 1.0, _SAMPLES_PER_SEGMENT)
        x, _, _ = _points(self.segments, unit)
        xe = float(_chain(self.segments, 0.0)[0])
        return float(np.max(np.abs(xe - x)))

    def _quadrature(self):
        """Gauss-Legendre nodes on every segment: (x, z, weight) of the formed centre line."""
        unit = 0.5 * (_GAUSS_NODES + 1.0)
        x, z, lengths = _points(self.segments, unit)
        weight = np.tile(0.5 * _GAUSS_WEIGHTS, len(self.segments)) * lengths
        return x, z, weight

    def inverse_travel(self, travel, *, exact: bool = True):
        """Curvature change [1/m] that gives ``travel`` (array); exact kinematics by Newton iteration
        started from the small-deflection value, or the small-deflection inverse.

        At large rotation the exact travel of a form passes through a maximum (a cantilever at
        k L ~ 2.33 rad); the root returned is the one on the branch that starts at zero.
        """
        travel = np.asarray(travel, float)
        rate = self.travel_rate()
        dkappa = travel / rate
        if not exact:
            return dkappa
        step = 1e-7 / max(self.size, 1e-12)
        for _ in range(30):
            f = self.travel(dkappa) - travel
            slope = (self.travel(dkappa + step) - self.travel(dkappa - step)) / (2 * step)
            update = f / slope
            dkappa = dkappa - update
            if np.all(np.abs(update) <= 1e-13 * (np.abs(dkappa) + 1e-9 / max(self.size, 1e-12))):
                break
        return dkappa

    def to_dict(self) -> dict:
        values = {k: getattr(self, k) for k in self.__dataclass_fields__}
        return {"form": self.kind, "output": self.output, **values}


def _positive(field: str, value: float) -> float:
    return check_range(field, value, 0.0, 100.0, unit="m")


@dataclass(frozen=True)
class Cantilever(ElementForm):
    """Straight strip clamped at one end; working point at the free tip.

    Exact tip motion (layers.md section 6): x = sin(phi)/k, w = -(1 - cos(phi))/k, phi = k L, tip
    rotation exactly -k L; small deflection w = -k L^2 / 2 (= F dT L^2 / (2 t) in magnitude).
    Tip stiffness 3 E I b / L^3; blocked force 3 M_T b / (2 L).
    """

    length: float
    kind: ClassVar[str] = "cantilever"
    description: ClassVar[str] = "straight strip clamped at one end, working point at the free tip"

    def __post_init__(self):
        object.__setattr__(self, "length", _positive("thermostat.length", self.length))

    @property
    def segments(self):
        return ((self.length, 0.0),)

    def scaled(self, factor: float) -> "Cantilever":
        return Cantilever(self.length * factor)


@dataclass(frozen=True)
class SupportedStrip(ElementForm):
    """Straight strip on two supports with ends free to slide (ASTM B106 Method A arrangement);
    working point at midspan, ``length`` is the arc length between the supports.

    By symmetry each half is a cantilever of length L/2 clamped at midspan. Exact midspan rise over
    the support chord (1 - cos(k L / 2))/k (layers.md section 6), small-deflection k L^2 / 8; centre
    stiffness 48 E I b / L^3, blocked centre force 6 M_T b / L.
    """

    length: float
    kind: ClassVar[str] = "supported"
    description: ClassVar[str] = "strip on two supports, ends free to slide, working point at midspan"

    def __post_init__(self):
        object.__setattr__(self, "length", _positive("thermostat.length", self.length))

    @property
    def segments(self):
        return ((0.5 * self.length, 0.0),)

    def scaled(self, factor: float) -> "SupportedStrip":
        return SupportedStrip(self.length * factor)

    def travel(self, dkappa):
        return -super().travel(dkappa)  # midspan relative to the supports = minus half-cantilever tip

    def travel_rate(self) -> float:
        return -super().travel_rate()

    def compliance(self, bending_stiffness: float) -> float:
        return 0.5 * super().compliance(bending_stiffness)  # each half carries half of the centre force

    def moment_arm(self) -> float:
        return 0.5 * super().moment_arm()

    def end_rotation(self, dkappa):
        return -np.asarray(dkappa, float) * 0.5 * self.length  # support-end slope relative to midspan


@dataclass(frozen=True)
class UShape(ElementForm):
    """Hairpin: a leg of ``leg_length``, a half-turn of centre-line radius ``bend_radius`` and a second
    equal leg; clamped at the end of the first leg, working point at the end of the second.

    ``bend_toward`` says which face of the clamped leg the second leg lies on ("top" = +z). Small
    deflection across the legs: |w| = dkappa (L^2 + pi r L + 2 r^2) exactly (the familiar
    dkappa (L^2 + pi r L) drops the 2 r^2 of the bend itself); the working point also moves along the
    legs by dkappa (2 r L + pi r^2).
    """

    leg_length: float
    bend_radius: float
    bend_toward: str = "top"
    kind: ClassVar[str] = "u_shape"
    description: ClassVar[str] = "hairpin clamped at one leg end, working point at the other leg end"

    def __post_init__(self):
        object.__setattr__(self, "leg_length", _positive("thermostat.leg_length", self.leg_length))
        object.__setattr__(self, "bend_radius", _positive("thermostat.bend_radius", self.bend_radius))
        if self.bend_toward not in ("top", "bottom"):
            raise InputError("thermostat.bend_toward", self.bend_toward, "'top' or 'bottom'")

    @property
    def segments(self):
        formed = (-1.0 if self.bend_toward == "top" else 1.0) / self.bend_radius
        return (
            (self.leg_length, 0.0),
            (math.pi * self.bend_radius, formed),
            (self.leg_length, 0.0),
        )

    @property
    def size(self) -> float:
        return self.leg_length

    def scaled(self, factor: float) -> "UShape":
        return UShape(self.leg_length * factor, self.bend_radius * factor, self.bend_toward)


@dataclass(frozen=True)
class Spiral(ElementForm):
    """Flat spiral coil of strip ``length``, one end fixed; output is the rotation of the other end.

    The end tangent turns by exactly -dkappa L for any initial shape (planar bending, uniform dkappa;
    layers.md section 6), so exact and small values coincide. Torsional stiffness E I b / L, blocked
    torque E I b dkappa = M_T b. An optional pointer of ``pointer_length`` gives the arc travel of its tip.
    """

    length: float
    pointer_length: float = 0.0
    kind: ClassVar[str] = "spiral"
    output: ClassVar[str] = "rotation"
    description: ClassVar[str] = "flat spiral coil, output is the rotation of the free end"

    def __post_init__(self):
        object.__setattr__(self, "length", _positive("thermostat.length", self.length))
        object.__setattr__(
            self, "pointer_length",
            check_range("thermostat.pointer_length", self.pointer_length, 0.0, 100.0, low_inclusive=True, unit="m"),
        )

    @property
    def segments(self):
        return ((self.length, 0.0),)

    @property
    def axial_factor(self) -> float:
        return 1.0

    def scaled(self, factor: float) -> "Spiral":
        return Spiral(self.length * factor, self.pointer_length * factor)

    def travel(self, dkappa):
        return -np.asarray(dkappa, float) * self.length * self.axial_factor

    def travel_rate(self) -> float:
        return -self.length * self.axial_factor

    def inverse_travel(self, travel, *, exact: bool = True):
        return np.asarray(travel, float) / self.travel_rate()

    def compliance(self, bending_stiffness: float) -> float:
        return self.length * self.axial_factor**2 / bending_stiffness

    def moment_arm(self) -> float:
        return 1.0

@dataclass(frozen=True)
class Helix(Spiral):
    """Helical coil (strip width along the coil axis) with lead angle ``lead_angle`` [rad].

    Rotation about the coil axis ~ -dkappa L cos(psi): a first-order estimate (the bending vector of the
    strip projected on the axis), not taken from a source; torque stiffness as for a spiral with the same
    projection.
    """

    lead_angle: float = 0.0
    kind: ClassVar[str] = "helix"
    description: ClassVar[str] = "helical coil, output is the rotation of the free end about the coil axis"

    def __post_init__(self):
        super().__post_init__()
        object.__setattr__(
            self, "lead_angle",
            check_range("thermostat.lead_angle", self.lead_angle, 0.0, math.pi / 3, low_inclusive=True, unit="rad"),
        )

    @property
    def axial_factor(self) -> float:
        return math.cos(self.lead_angle)

    def scaled(self, factor: float) -> "Helix":
        return Helix(self.length * factor, self.pointer_length * factor, self.lead_angle)


@dataclass(frozen=True)
class FlatDisc(ElementForm):
    """Flat disc of ``diameter`` (no snap): rise of the centre over the rim for an equal-biaxial
    curvature change (use a strip in the plate bending state).

    Small deflection k a^2 / 2 = k D^2 / 8 (a = D/2); the "exact" value (1 - cos(k a))/k keeps the
    meridian length and is an estimate beyond shallow shapes (a real disc also strains in the hoop
    direction). Centre stiffness on a rim support, Kirchhoff plate with a central point load
    (Timoshenko & Woinowsky-Krieger, Theory of Plates and Shells, 1959, section 19):
    w = P a^2 (3 + nu) / (16 pi (1 + nu) D_p); bending stresses under a point load are singular and
    are not computed.
    """

    diameter: float
    kind: ClassVar[str] = "disc"
    description: ClassVar[str] = "flat disc without snap, working point at the centre, rim supported"

    def __post_init__(self):
        object.__setattr__(self, "diameter", _positive("thermostat.diameter", self.diameter))

    @property
    def segments(self):
        return ((0.5 * self.diameter, 0.0),)

    def scaled(self, factor: float) -> "FlatDisc":
        return FlatDisc(self.diameter * factor)

    def travel(self, dkappa):
        return -super().travel(dkappa)  # centre relative to the rim

    def travel_rate(self) -> float:
        return -super().travel_rate()

    def plate_compliance(self, plate_rigidity: float, poisson_ratio: float) -> float:
        """Centre deflection per unit central force [m/N] for a rim-supported disc of plate rigidity
        D_p [N m] (Kirchhoff; see class docstring)."""
        a = 0.5 * self.diameter
        return a * a * (3.0 + poisson_ratio) / (16.0 * math.pi * (1.0 + poisson_ratio) * plate_rigidity)

    def compliance(self, bending_stiffness: float) -> float:
        raise InputError("thermostat.form", "disc", "a strip form (use plate_compliance for discs)")

    def moment_arm(self) -> float:
        raise InputError("thermostat.form", "disc", "a strip form (stresses under a point load are singular)")

    @property
    def strip_length(self) -> float:
        return self.diameter


ELEMENT_FORMS = {cls.kind: cls for cls in (Cantilever, SupportedStrip, UShape, Spiral, Helix, FlatDisc)}


def element_from_mapping(values) -> ElementForm:
    """Build a form from ``{"form": kind, <its fields in SI>}`` (design-file section values)."""
    values = dict(values)
    kind = values.pop("form", None)
    if kind not in ELEMENT_FORMS:
        raise InputError("thermostat.form", kind, "one of " + ", ".join(ELEMENT_FORMS))
    cls = ELEMENT_FORMS[kind]
    fields = [name for name in cls.__dataclass_fields__]
    unknown = sorted(set(values) - set(fields))
    if unknown:
        raise InputError(f"thermostat.{unknown[0]}", values[unknown[0]], f"a field of form {kind!r}: {', '.join(fields)}")
    return cls(**values)
