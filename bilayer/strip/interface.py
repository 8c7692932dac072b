"""Interfacial shear and peel stresses along a bonded strip: closed-form beam-type models.

Geometry and signs (the project conventions plus the length coordinate)::

      z                  part above (layers over the interface, composite beam 2)
      ^   ----------------------------------------------   <- bond layer h0 (optional, shear only)
      |                  part below (layers under the interface, composite beam 1)
      +----|-----------------------|-----------------------|----> x
          x = 0 (left end)       x = L/2 (mid-length)     x = L (right end)

    T(x)   axial force of the part below [N/m]; the part above carries -T (no applied load)
    tau(x) shear traction on the top face of the part below, positive in +x [Pa]; T' = -tau
    p(x)   peel (through-thickness normal) stress on the bond mid-plane, tension positive [Pa]

For interface k of an N-layer stack the layers below and above are treated as two perfectly bonded
composite beams (rigidities from :func:`bilayer.core.laminate.solve`); each interface is solved on its
own. A bond layer (adhesive, solder, die attach) is a layer of the stack named in ``bonds``: it
carries shear only across the interface it forms and no axial force or bending of its own.

Shear lag (structure of Suhir, J. Appl. Mech. 53:657, 1986; bond term and composite parts derived
in :mod:`bilayer.strip.derivation`), with xi = x - L/2, l = L/2::

    chi T'' - lambda T = -Delta,   T(+-l) = 0
    lambda = 1/A1 + 1/A2 + e^2/D                          axial compliance [m/N]
    Delta  = N_T2/A2 - N_T1/A1 - e (M_T1 + M_T2)/D        mismatch strain [-] (= (alpha2-alpha1) dT for 2 layers)
    chi    = chi_1 + chi_2 + h0/G0,  chi_i = int phi^2/G dz   shear compliance [m^3/N]
    T   = (Delta/lambda) (1 - cosh k xi / cosh k l),   tau = Delta/(chi k) sinh k xi / cosh k l,   k^2 = lambda/chi

A_i, D_i, N_Ti, M_Ti: axial and flexural rigidity and thermal resultants of part i about its own
bending axis; e: distance between the two bending axes (includes h0); D = D1 + D2. phi(z) is the
share of the part's axial stiffness between its free face and z, so chi_i = t_i/(3 G_i) for one layer
(Suhir's longitudinal interfacial compliance; the shear-strain energy of a linear shear flow).

Peel, common deflection (Suhir 1986): p = mu tau', mu = (a2 D1 - a1 D2)/D, where a_i is the distance
from the bond mid-plane to the bending axis of part i. Peel with through-thickness compliance K
(w2 - w1 = K p; structure of Suhir, J. Appl. Mech. 56:595, 1989)::

    K p'''' + (1/D1 + 1/D2) p = c_p tau',   c_p = a2/D2 - a1/D1
    K p''(+-l) = M_T1/D1 - M_T2/D2 (free ends, M_i = 0),   K p'''(+-l) = c_p tau(+-l)
    K = K_1 + K_2 + h0/E0',  K_i = int psi^2/E' dz, psi falling linearly from 1 at the interface to 0
    at the free face (t_i/(3 E_i') for one layer); E' = E (narrow, plate) or E/(1-nu^2) (wide).

The second end condition splits the bond's vertical shear force tau h0 equally between the two
parts; it makes p self-equilibrated (int p dx = 0, int x p dx = 0).

No-bending limit (Chen & Nelson, IBM J. Res. Dev. 23:179, 1979; Volkersen-type thermal shear lag):
bending suppressed, lambda = 1/A1 + 1/A2, Delta = N_T2/A2 - N_T1/A1, chi = h0/G0 (needs a bond).

Model limits: thin layers (L >> thickness), linear elastic, small deflection. The exact corner field
at a free end is singular or steep (Bogy-type); these models smear the interface into compliances and
give finite end values that depend on chi and K. Within about one thickness of the end the shear and
peel are nominal; tau(+-l) != 0 violates the traction-free end face. Use the FE check (bilayer.strip.fe)
for the distribution near the end.
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Sequence

import numpy as np

from ..core import laminate
from ..core.jsonable import plain
from ..core.errors import InputError, check_range
from ..core.stack import BendingState, Stack, Temperatures

__all__ = [
    "MODELS",
    "InterfaceParameters",
    "InterfaceProfile",
    "InterfaceResult",
    "interface_parameters",
    "interface_stresses",
    "shear_lag",
    "peel_compliant",
    "resolve_bonds",
    "soft_inner_layers",
    "ASSUMPTIONS",
]

MODELS = ("bending", "no_bending")
"""bending: Suhir-type model with bending, layer and bond compliances; no_bending: Chen & Nelson limit."""

ASSUMPTIONS = (
    "beam-type interface model: thin layers, linear elastic, small deflection",
    "each interface solved with the layers below and above it as two perfectly bonded composite beams",
    "bond layers carry shear (and peel) only, no axial force or bending of their own",
    "layer shear compliance from a shear flow that falls linearly in axial stiffness to the free face "
    "(t/(3G) for one layer)",
    "finite end values: the exact corner field is singular or steep; within about one thickness of "
    "the end the shear and peel are nominal and depend on the compliances",
)

LONG_JOINT_KL = 3.0
"""k l above which the edge zones are independent of length (tanh k l > 0.995)."""
SHORT_STRIP_RATIO = 10.0
"""Length over total thickness below which beam-type models are rough."""
THICK_BOND_RATIO = 0.25
"""Bond thickness over the thinner adjacent part above which shear is no longer uniform across it."""
BOND_STIFFNESS_SHARE = 0.05
"""Share of the stack's axial rigidity in a bond layer above which neglecting it is noticeable."""
SOFT_LAYER_RATIO = 0.05
"""Shear modulus of an inner layer over its stiffer neighbour's below which it should be a bond layer."""


def _unit_shape(xi, half_length, rate):
    """(cosh(rate xi), sinh(rate xi)) / cosh(rate l), overflow-free for any rate*l."""
    decay = rate * (half_length - np.abs(xi))
    far = rate * (half_length + np.abs(xi))
    scale = 1.0 + math.exp(-2.0 * rate * half_length)
    near_term = np.exp(-decay)
    far_term = np.exp(-far)
    even = (near_term + far_term) / scale
    odd = np.sign(xi) * (near_term - far_term) / scale
    return even, odd


def shear_lag(xi, half_length, mismatch, axial_compliance, shear_compliance):
    """Axial force T [N/m] of the part below and interface shear tau [Pa] at xi = x - L/2.

    Solution of chi T'' - lambda T = -Delta with T(+-l) = 0:
    T = (Delta/lambda)(1 - cosh k xi/cosh k l), tau = -T' = Delta sinh(k xi)/(chi k cosh k l).
    Vectorised over ``xi``; exact for any k l (no overflow).
    """
    k = math.sqrt(axial_compliance / shear_compliance)
    even, odd = _unit_shape(np.asarray(xi, float), half_length, k)
    force = mismatch / axial_compliance * (1.0 - even)
    shear = mismatch / (shear_compliance * k) * odd
    return force, shear


def _peel_constants(half_length, mismatch, shear_compliance, k, peel_compliance, s, c_p, g):
    """Coefficients (C, A, B, beta) of the even peel solution; see :func:`peel_compliant`."""
    beta = (s / (4.0 * peel_compliance)) ** 0.25
    C = c_p * mismatch / shear_compliance / (peel_compliance * k**4 + s)
    tanh_kl = math.tanh(k * half_length)
    tau_end = mismatch / (shear_compliance * k) * tanh_kl
    root = complex(-1.0, 1.0) * beta  # f(r) = Re[(A - iB) exp(root r)], r = distance from an end
    mirror = np.exp(root * 2.0 * half_length)
    matrix = np.empty((2, 2))
    for column, weight in enumerate((1.0, -1.0j)):  # unit A, unit B
        matrix[0, column] = (weight * root**2 * (1.0 + mirror)).real  # p''(l)
        matrix[1, column] = (weight * root**3 * (mirror - 1.0)).real  # p'''(l)
    rhs = np.array(
        [g / peel_compliance - C * k**2, c_p * tau_end / peel_compliance - C * k**3 * tanh_kl]
    )
    A, B = np.linalg.solve(matrix, rhs)
    return C, A, B, beta


def peel_compliant(xi, half_length, mismatch, shear_compliance, k, peel_compliance, s, c_p, g=0.0):
    """Peel p(xi) [Pa] of K p'''' + s p = c_p tau' with K p''(+-l) = g, K p'''(+-l) = c_p tau(+-l).

    tau is the shear-lag solution (Delta, chi, k). Even solution
    p = C cosh(k xi)/cosh(k l) + sum over both ends of exp(-beta r)(A cos beta r + B sin beta r),
    r = distance from that end, beta = (s/(4K))^(1/4); equivalent to the cosh-cos/sinh-sin form
    but free of overflow. Vectorised over ``xi``.
    """
    xi = np.asarray(xi, float)
    C, A, B, beta = _peel_constants(half_length, mismatch, shear_compliance, k, peel_compliance, s, c_p, g)
    even, _ = _unit_shape(xi, half_length, k)
    root = complex(-1.0, 1.0) * beta
    weight = complex(A, -B)
    boundary = (weight * (np.exp(root * (half_length - xi)) + np.exp(root * (half_length + xi)))).real
    return C * even + boundary


@dataclass(frozen=True)
class InterfaceParameters:
    """Constants of the beam-type model at one interface (per unit width, SI units).

    ``below``/``above`` are the layer indices (0 = bottom layer) of the two composite parts,
    ``bond`` the index of the bond layer between them (or None).
    """

    below: tuple[int, ...]
    above: tuple[int, ...]
    bond: int | None
    height: float  # z of the interface, or of the bond mid-plane [m]
    bond_thickness: float  # h0 [m]
    axial_compliance: float  # lambda [m/N]
    shear_compliance: float  # chi [m^3/N]
    peel_compliance: float  # K [m^3/N]
    mismatch_strain: float  # Delta [-]
    lever_arm: float  # e, distance between the parts' bending axes [m]
    flexural_rigidity_below: float  # D1 [N m]
    flexural_rigidity_above: float  # D2 [N m]
    arm_below: float  # a1, bond mid-plane to the bending axis of the part below [m]
    arm_above: float  # a2 [m]
    thermal_moment_below: float  # M_T1 about the part's own bending axis [N]
    thermal_moment_above: float  # M_T2 [N]
    bending: bool  # False in the no-bending (Chen & Nelson) limit

    @property
    def decay_rate(self) -> float:
        """k = sqrt(lambda/chi) [1/m]."""
        return math.sqrt(self.axial_compliance / self.shear_compliance)

    @property
    def decay_length(self) -> float:
        """1/k [m]: the force reaches 95 % of its long-strip value about 3/k from the end."""
        return 1.0 / self.decay_rate

    @property
    def peel_decay_length(self) -> float:
        """1/beta [m], beta = ((1/D1 + 1/D2)/(4K))^(1/4); NaN without bending."""
        if not self.bending:
            return math.nan
        return (4.0 * self.peel_compliance / self._s) ** 0.25

    @property
    def long_strip_force(self) -> float:
        """Delta/lambda [N/m]: force of the part below far from the ends of a long strip."""
        return self.mismatch_strain / self.axial_compliance

    @property
    def _s(self) -> float:
        return 1.0 / self.flexural_rigidity_below + 1.0 / self.flexural_rigidity_above

    @property
    def peel_coefficient(self) -> float:
        """c_p = a2/D2 - a1/D1 [1/(N)], forcing coefficient of the peel equation."""
        return self.arm_above / self.flexural_rigidity_above - self.arm_below / self.flexural_rigidity_below

    @property
    def peel_lever(self) -> float:
        """mu = (a2 D1 - a1 D2)/D [m]: common-deflection peel p = mu tau' (Suhir 1986)."""
        D1, D2 = self.flexural_rigidity_below, self.flexural_rigidity_above
        return (self.arm_above * D1 - self.arm_below * D2) / (D1 + D2)

    @property
    def end_curvature_mismatch(self) -> float:
        """g = M_T1/D1 - M_T2/D2 [1/m]: K p'' at the free ends (zero for single-layer parts)."""
        return (
            self.thermal_moment_below / self.flexural_rigidity_below
            - self.thermal_moment_above / self.flexural_rigidity_above
        )

    def force_and_shear(self, xi, half_length):
        """(T, tau) at xi = x - L/2 [N/m, Pa]."""
        return shear_lag(xi, half_length, self.mismatch_strain, self.axial_compliance, self.shear_compliance)

    def peel(self, xi, half_length):
        """Peel with through-thickness compliance at xi [Pa]; None without bending."""
        if not self.bending:
            return None
        return peel_compliant(
            xi, half_length, self.mismatch_strain, self.shear_compliance, self.decay_rate,
            self.peel_compliance, self._s, self.peel_coefficient, self.end_curvature_mismatch,
        )

    def peel_common_deflection(self, xi, half_length):
        """Suhir-1986 peel mu tau' (no through-thickness compliance) at xi [Pa]; None without bending."""
        if not self.bending:
            return None
        even, _ = _unit_shape(np.asarray(xi, float), half_length, self.decay_rate)
        return self.peel_lever * self.mismatch_strain / self.shear_compliance * even

    def curvature(self, xi, half_length):
        """Common-deflection curvature kappa(x) = (T e + M_T1 + M_T2)/D [1/m] (0 without bending)."""
        force, _ = self.force_and_shear(xi, half_length)
        if not self.bending:
            return np.zeros_like(force)
        D = self.flexural_rigidity_below + self.flexural_rigidity_above
        return (force * self.lever_arm + self.thermal_moment_below + self.thermal_moment_above) / D


def resolve_bonds(stack: Stack, bonds) -> tuple[int, ...]:
    """Bond layers as sorted 0-based indices; ``bonds`` holds indices or layer labels.

    A bond must have a layer on each side and two bonds may not touch (InputError otherwise).
    """
    if bonds is None:
        return ()
    if isinstance(bonds, (int, str)):
        bonds = (bonds,)
    indices = []
    for item in bonds:
        if isinstance(item, str):
            matches = [i for i, name in enumerate(stack.labels) if name == item]
            if len(matches) != 1:
                raise InputError("bonds", item, "the label of exactly one layer: " + ", ".join(stack.labels))
            index = matches[0]
        elif isinstance(item, (int, np.integer)) and not isinstance(item, bool):
            index = int(item)
        else:
            raise InputError("bonds", item, "a layer index (0 = bottom) or a layer label")
        if not 0 < index < stack.n_layers - 1:
            raise InputError(
                "bonds", item, f"an inner layer, index 1 to {stack.n_layers - 2}",
                "a bond layer needs a layer below and above it",
            )
        indices.append(index)
    indices = sorted(set(indices))
    for first, second in zip(indices, indices[1:]):
        if second == first + 1:
            raise InputError("bonds", [first, second], "bond layers that do not touch each other")
    return tuple(indices)


def soft_inner_layers(stack: Stack, bonds=()) -> list[int]:
    """Inner layers (not bonds) whose shear modulus is below SOFT_LAYER_RATIO of the stiffer neighbour's."""
    G = [layer.material.shear_modulus for layer in stack.layers]
    return [
        i for i in range(1, stack.n_layers - 1)
        if i not in bonds and G[i] < SOFT_LAYER_RATIO * max(G[i - 1], G[i + 1])
    ]


def _layer_properties(stack: Stack, temperatures: Temperatures, state: BendingState):
    """Per-layer E, nu, G, Y, free strain f and thickness for a scalar operating temperature."""
    if np.ndim(temperatures.operating):
        raise InputError("operating_temperature", temperatures.operating, "a single temperature for interface stresses")
    materials = [layer.material for layer in stack.layers]
    E = np.array([m.youngs_modulus for m in materials])
    nu = np.array([m.poisson_ratio for m in materials])
    thermal = np.array([float(m.cte.thermal_strain(temperatures.stress_free, temperatures.operating)) for m in materials])
    Y, f = laminate.effective_properties(E, nu, thermal, state.value)
    G = E / (2.0 * (1.0 + nu))
    transverse = E / (1.0 - nu * nu) if state is BendingState.WIDE else E
    return E, nu, G, np.asarray(Y, float), np.asarray(f, float), transverse, stack.thicknesses


def _part(Y, f, G, transverse, t, indices, from_top: bool):
    """Rigidities and compliances of a composite part; phi/psi measured from its free face."""
    sol = laminate.solve(Y[indices], t[indices], f[indices])
    order = indices[::-1] if from_top else indices
    Yt = Y[order] * t[order]
    share = np.concatenate([[0.0], np.cumsum(Yt)]) / Yt.sum()  # phi at each layer face, from the free face
    shear = float(np.sum(t[order] * (share[:-1] ** 2 + share[:-1] * share[1:] + share[1:] ** 2) / (3.0 * G[order])))
    height = t[order].sum()
    depth = np.concatenate([[0.0], np.cumsum(t[order])]) / height  # psi = depth share, 0 at the free face
    peel = float(np.sum(t[order] * (depth[:-1] ** 2 + depth[:-1] * depth[1:] + depth[1:] ** 2) / (3.0 * transverse[order])))
    return (
        float(sol.axial_rigidity), float(sol.flexural_rigidity), float(sol.bending_axis),
        float(sol.thermal_force), float(sol.thermal_moment), shear, peel, float(height),
    )


def interface_parameters(
    stack: Stack,
    temperatures: Temperatures,
    state: "BendingState | str" = BendingState.NARROW,
    bonds=(),
    model: str = "bending",
) -> tuple[InterfaceParameters, ...]:
    """Model constants for every interface of ``stack``, bottom to top (a bond and its two faces count once)."""
    if not isinstance(stack, Stack):
        raise InputError("stack", stack, "a Stack")
    if not isinstance(temperatures, Temperatures):
        raise InputError("temperatures", temperatures, "a Temperatures(stress_free, operating)")
    if stack.n_layers < 2:
        raise InputError("stack.layers", stack.n_layers, "at least two layers for an interface")
    if model not in MODELS:
        raise InputError("model", model, "one of " + ", ".join(MODELS))
    state = BendingState.parse(state)
    bond_set = resolve_bonds(stack, bonds)
    E, nu, G, Y, f, transverse, t = _layer_properties(stack, temperatures, state)
    heights = np.concatenate([[0.0], np.cumsum(t)])
    result = []
    boundary = 0
    while boundary < stack.n_layers - 1:
        bond = boundary + 1 if boundary + 1 in bond_set else None
        below = np.arange(0, boundary + 1)
        above = np.arange(boundary + (2 if bond is not None else 1), stack.n_layers)
        h0 = t[bond] if bond is not None else 0.0
        A1, D1, zb1, NT1, MT1, chi1, K1, H1 = _part(Y, f, G, transverse, t, below, from_top=False)
        A2, D2, zb2, NT2, MT2, chi2, K2, _ = _part(Y, f, G, transverse, t, above, from_top=True)
        bottom_of_above = heights[above[0]]
        zb2 = bottom_of_above + zb2
        e = zb2 - zb1
        if model == "bending":
            D = D1 + D2
            lam = 1.0 / A1 + 1.0 / A2 + e * e / D
            delta = NT2 / A2 - NT1 / A1 - e * (MT1 + MT2) / D
            chi = chi1 + chi2
        else:
            if bond is None:
                raise InputError(
                    "model", model, "'bending' for an interface without a bond layer",
                    f"the no-bending shear lag needs a bond at the interface above layer {boundary + 1}",
                )
            lam = 1.0 / A1 + 1.0 / A2
            delta = NT2 / A2 - NT1 / A1
            chi = 0.0
        K = K1 + K2
        if bond is not None:
            chi += h0 / G[bond]
            K += h0 / transverse[bond]
        result.append(
            InterfaceParameters(
                below=tuple(int(i) for i in below),
                above=tuple(int(i) for i in above),
                bond=bond,
                height=float(H1 + 0.5 * h0),
                bond_thickness=float(h0),
                axial_compliance=float(lam),
                shear_compliance=float(chi),
                peel_compliance=float(K),
                mismatch_strain=float(delta),
                lever_arm=float(e),
                flexural_rigidity_below=D1,
                flexural_rigidity_above=D2,
                arm_below=float(H1 + 0.5 * h0 - zb1),
                arm_above=float(zb2 - H1 - 0.5 * h0),
                thermal_moment_below=MT1,
                thermal_moment_above=MT2,
                bending=model == "bending",
            )
        )
        boundary += 2 if bond is not None else 1
    return tuple(result)


@dataclass(frozen=True, eq=False)
class InterfaceProfile:
    """Shear, peel and force along one interface, sampled at the result's x positions."""

    parameters: InterfaceParameters
    name: str
    force: np.ndarray  # T(x) of the part below [N/m]
    shear: np.ndarray  # tau(x) [Pa]
    peel: "np.ndarray | None"  # with through-thickness compliance [Pa]
    peel_common_deflection: "np.ndarray | None"  # Suhir 1986, mu tau' [Pa]
    curvature: np.ndarray  # common-deflection curvature [1/m]
    max_shear: float  # largest |tau| with its sign, at the ends [Pa]
    max_peel: float  # largest tensile peel [Pa] (NaN without bending)
    max_peel_distance: float  # its distance from the nearer end [m]
    min_peel: float  # largest compressive peel (most negative) [Pa]
    min_peel_distance: float  # [m]
    end_peel: float  # peel at the free end (nominal) [Pa]

    @property
    def decay_length(self) -> float:
        return self.parameters.decay_length

    @property
    def peel_decay_length(self) -> float:
        return self.parameters.peel_decay_length

    def to_dict(self) -> dict:
        p = self.parameters
        return {
            "name": self.name,
            "below": [i + 1 for i in p.below],
            "above": [i + 1 for i in p.above],
            "bond": None if p.bond is None else p.bond + 1,
            "height": p.height,
            "bond_thickness": p.bond_thickness,
            "axial_compliance": p.axial_compliance,
            "shear_compliance": p.shear_compliance,
            "peel_compliance": p.peel_compliance,
            "mismatch_strain": p.mismatch_strain,
            "lever_arm": p.lever_arm,
            "decay_length": p.decay_length,
            "peel_decay_length": plain(p.peel_decay_length),
            "long_strip_force": p.long_strip_force,
            "max_shear": self.max_shear,
            "max_peel": plain(self.max_peel),
            "max_peel_distance": plain(self.max_peel_distance),
            "min_peel": plain(self.min_peel),
            "min_peel_distance": plain(self.min_peel_distance),
            "end_peel": plain(self.end_peel),
            "force": plain(self.force),
            "shear": plain(self.shear),
            "peel": None if self.peel is None else plain(self.peel),
            "peel_common_deflection": None if self.peel_common_deflection is None else plain(self.peel_common_deflection),
            "curvature": plain(self.curvature),
        }


@dataclass(frozen=True, eq=False)
class InterfaceResult:
    """Interface stresses of a strip of length L under a temperature change (x from the left end)."""

    state: BendingState
    model: str
    length: float
    temperature_change: float
    labels: tuple[str, ...]
    bonds: tuple[int, ...]
    x: np.ndarray  # positions from the left end [m]
    interfaces: tuple[InterfaceProfile, ...]
    layer_force: np.ndarray  # (len(x), n_layers) axial force of every layer [N/m]
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]

    @property
    def half_length(self) -> float:
        return 0.5 * self.length

    def sample(self, distances, end: str = "right"):
        """(force, shear, peel) per interface at ``distances`` [m] from an end ("left"/"right").

        Returns a list of tuples of arrays; peel is None without bending.
        """
        d = np.asarray(distances, float)
        xi = self.half_length - d if end == "right" else d - self.half_length
        out = []
        for profile in self.interfaces:
            force, shear = profile.parameters.force_and_shear(xi, self.half_length)
            out.append((force, shear, profile.parameters.peel(xi, self.half_length)))
        return out

    def to_dict(self) -> dict:
        return {
            "bending_state": self.state.value,
            "model": self.model,
            "length": self.length,
            "temperature_change": self.temperature_change,
            "bonds": [i + 1 for i in self.bonds],
            "x": plain(self.x),
            "interfaces": [p.to_dict() for p in self.interfaces],
            "layer_force": [plain(self.layer_force[:, i]) for i in range(self.layer_force.shape[1])],
            "layer_labels": list(self.labels),
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "units": {
                "length": "m", "x": "m", "height": "m", "bond_thickness": "m", "lever_arm": "m",
                "decay_length": "m", "peel_decay_length": "m", "max_peel_distance": "m",
                "min_peel_distance": "m", "axial_compliance": "m/N", "shear_compliance": "m^3/N",
                "peel_compliance": "m^3/N", "mismatch_strain": "1", "temperature_change": "K",
                "force": "N/m", "long_strip_force": "N/m", "layer_force": "N/m", "shear": "Pa",
                "peel": "Pa", "peel_common_deflection": "Pa", "max_shear": "Pa", "max_peel": "Pa",
                "min_peel": "Pa", "end_peel": "Pa", "curvature": "1/m",
            },
        }


def _positions(length: float, params: Sequence[InterfaceParameters], points: int) -> np.ndarray:
    """Uniform points plus points crowded into both end zones (8 of the shortest decay lengths)."""
    scales = [p.decay_length for p in params] + [p.peel_decay_length for p in params if p.bending]
    zone = min(0.5 * length, 8.0 * min(scales))
    n_uniform = max(points // 2, 3)
    n_end = max((points - n_uniform) // 2, 2)
    near = zone * (np.linspace(0.0, 1.0, n_end) ** 2)
    x = np.concatenate([np.linspace(0.0, length, n_uniform), near, length - near])
    return np.unique(np.clip(x, 0.0, length))


def _peel_extremes(params: InterfaceParameters, half_length: float):
    """Largest tensile and compressive peel with their distances from the end (dense end-zone scan)."""
    zone = min(half_length, 10.0 * max(params.peel_decay_length, params.decay_length))
    d = zone * np.linspace(0.0, 1.0, 4001) ** 2
    p = params.peel(half_length - d, half_length)
    i_max, i_min = int(np.argmax(p)), int(np.argmin(p))
    return float(p[i_max]), float(d[i_max]), float(p[i_min]), float(d[i_min]), float(p[0])


def _interface_name(stack: Stack, params: InterfaceParameters) -> str:
    low, high = params.below[-1], params.above[0]
    name = f"{low + 1} {stack.labels[low]} / "
    if params.bond is not None:
        name += f"bond {params.bond + 1} {stack.labels[params.bond]} / "
    return name + f"{high + 1} {stack.labels[high]}"


def interface_stresses(
    stack: Stack,
    temperatures: Temperatures,
    length: float,
    state: "BendingState | str" = BendingState.NARROW,
    bonds=(),
    model: str = "bending",
    points: int = 401,
    x=None,
) -> InterfaceResult:
    """Axial force per layer, interface shear and peel along a free strip of ``length`` [m].

    ``bonds``: layer indices (0 = bottom) or labels of bond layers; ``model``: "bending" (default)
    or "no_bending" (Chen & Nelson limit, every interface needs a bond). ``x`` [m, from the left end]
    overrides the default positions (``points`` uniform and end-zone points). The operating
    temperature must be a single value. See the module docstring for equations and limits.
    """
    length = check_range("length", length, 0.0, 100.0, unit="m")
    state = BendingState.parse(state)
    params = interface_parameters(stack, temperatures, state, bonds, model)
    bond_set = resolve_bonds(stack, bonds)
    l = 0.5 * length
    if x is None:
        if not isinstance(points, (int, np.integer)) or points < 3:
            raise InputError("points", points, "an integer >= 3")
        x = _positions(length, params, int(points))
    else:
        x = np.asarray(x, float).ravel()
        if x.size == 0 or not np.all(np.isfinite(x)) or x.min() < 0.0 or x.max() > length:
            raise InputError("x", x, f"finite positions between 0 and the length {length:g} m")
    xi = x - l
    profiles = []
    boundary_force = np.zeros((x.size, stack.n_layers + 1))  # force below each layer boundary
    for p in params:
        force, shear = p.force_and_shear(xi, l)
        boundary_force[:, p.below[-1] + 1] = force
        if p.bond is not None:
            boundary_force[:, p.bond + 1] = force
        if p.bending:
            maxima = _peel_extremes(p, l)
            peel, common = p.peel(xi, l), p.peel_common_deflection(xi, l)
        else:
            maxima = (math.nan,) * 5
            peel = common = None
        profiles.append(
            InterfaceProfile(
                parameters=p,
                name=_interface_name(stack, p),
                force=force,
                shear=shear,
                peel=peel,
                peel_common_deflection=common,
                curvature=p.curvature(xi, l),
                max_shear=float(p.force_and_shear(np.array([l]), l)[1][0]),
                max_peel=maxima[0],
                max_peel_distance=maxima[1],
                min_peel=maxima[2],
                min_peel_distance=maxima[3],
                end_peel=maxima[4],
            )
        )
    layer_force = np.diff(boundary_force, axis=1)
    change = float(temperatures.operating - temperatures.stress_free)
    assumptions = ASSUMPTIONS + (state.description,)
    if model == "no_bending":
        assumptions += ("no-bending limit (Chen & Nelson 1979): bending suppressed, bond shear compliance only, no peel",)
    return InterfaceResult(
        state=state,
        model=model,
        length=length,
        temperature_change=change,
        labels=stack.labels,
        bonds=bond_set,
        x=x,
        interfaces=tuple(profiles),
        layer_force=layer_force,
        warnings=_warnings(stack, length, params, state),
        assumptions=assumptions,
    )


def _warnings(stack: Stack, length: float, params: Sequence[InterfaceParameters], state) -> tuple[str, ...]:
    """Model-limit warnings for this geometry."""
    messages = []
    H = stack.total_thickness
    if length / H < SHORT_STRIP_RATIO:
        messages.append(
            f"strip length is {length / H:.3g} total thicknesses (< {SHORT_STRIP_RATIO:g}): beam-type "
            "interface models are rough; compare with the finite-element check"
        )
    t = stack.thicknesses
    for p in params:
        where = f"interface above layer {p.below[-1] + 1}"
        kl = 0.5 * length * p.decay_rate
        if kl < LONG_JOINT_KL:
            messages.append(
                f"{where}: edge zone (3 decay lengths = {3 * p.decay_length * 1e3:.3g} mm) is longer than half the "
                f"strip (k l = {kl:.3g} < {LONG_JOINT_KL:g}): the layer force never reaches its long-strip value"
            )
        if p.bond is not None:
            thinner = min(t[list(p.below)].sum(), t[list(p.above)].sum())
            if p.bond_thickness > THICK_BOND_RATIO * thinner:
                messages.append(
                    f"{where}: bond is {p.bond_thickness / thinner:.2g} times as thick as the thinner part "
                    "(thick bond): shear is no longer uniform across it and the FE check should be preferred"
                )
            bond_material = stack[p.bond].material
            share = bond_material.youngs_modulus * p.bond_thickness / sum(
                layer.material.youngs_modulus * layer.thickness for layer in stack.layers
            )
            if share > BOND_STIFFNESS_SHARE:
                messages.append(
                    f"{where}: the bond carries {share:.1%} of the axial rigidity, which the interface model "
                    "neglects (the beam result includes it)"
                )
            if bond_material.poisson_ratio > 0.45:
                messages.append(
                    f"{where}: nearly incompressible bond (nu = {bond_material.poisson_ratio:g}): its "
                    "through-thickness compliance h0/E' overstates the peel compliance of a constrained bond line"
                )
    for i in soft_inner_layers(stack, {p.bond for p in params}):
        messages.append(
            f"layer {i + 1} is much softer in shear than its neighbours but is not a bond layer: the model "
            f"treats it as perfectly bonded inside a composite part; name it a bond (bonds=[{i}]) for its shear lag"
        )
    if state is BendingState.PLATE:
        messages.append(
            "plate state: the 1-D interface model with E/(1-nu) approximates the edge of an equal-biaxial "
            "plate; corners and width edges are not represented"
        )
    return tuple(messages)
