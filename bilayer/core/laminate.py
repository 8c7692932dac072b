"""Vectorised closed-form solution of a bonded layer stack (the numeric backend).

Model (transformed section; Hsueh, Thin Solid Films 418:182, 2002, in the form of layers.md eq. 3.2;
for two layers identical to Timoshenko, J. Opt. Soc. Am. 11:233, 1925):

    strain       eps(z) = c + kappa (z - t_b)                 z upward from the bottom face [m]
    stress       sigma_i(z) = Y_i (eps(z) - f_i)              f_i = free (thermal) strain of layer i
    EA  = sum Y_i t_i                                         axial rigidity per width [N/m]
    t_b = sum Y_i t_i z_i / EA                                bending axis, z_i = layer centroid [m]
    EI  = sum Y_i (t_i^3/12 + t_i (z_i - t_b)^2)              flexural rigidity per width [N m]
    N_T = sum Y_i t_i f_i,   M_T = sum Y_i t_i f_i (z_i - t_b)
    c   = (N + N_T) / EA,    kappa = (M + M_T) / EI

Sign convention: kappa > 0 when the top face is the longer (convex) one; stress > 0 in tension;
N > 0 is tension acting along the bending axis; M > 0 lengthens the top fibres and is taken about the
bending axis (a force N acting at height z_N adds N (z_N - t_b) to M).

Every function broadcasts: per-layer inputs have shape (..., n), loads shape (...). Y is the
effective modulus of the bending state (E, E/(1-nu^2) or E/(1-nu)); see :mod:`bilayer.core.stack`.
"""
from __future__ import annotations

from typing import NamedTuple

import numpy as np

__all__ = ["LaminateSolution", "solve", "effective_properties", "bilayer_extremes", "RESTRAINTS"]

RESTRAINTS = ("free", "flat", "fixed")
"""free: no support; flat: curvature held at zero, ends free to slide; fixed: no strain at all."""


class LaminateSolution(NamedTuple):
    """Arrays of the closed-form solution; per-layer fields have a trailing layer axis."""

    axial_strain: np.ndarray  # c, strain at the bending axis [-]
    curvature: np.ndarray  # kappa [1/m]
    bending_axis: np.ndarray  # t_b above the bottom face [m]
    axial_rigidity: np.ndarray  # EA [N/m]
    flexural_rigidity: np.ndarray  # EI about the bending axis [N m]
    thermal_force: np.ndarray  # N_T [N/m]
    thermal_moment: np.ndarray  # M_T about the bending axis [N]
    layer_bottom: np.ndarray  # z of each layer's bottom face [m]
    layer_top: np.ndarray  # z of each layer's top face [m]
    stress_bottom: np.ndarray  # sigma at each layer's bottom face [Pa]
    stress_top: np.ndarray  # sigma at each layer's top face [Pa]
    mechanical_strain_bottom: np.ndarray  # eps - f at each layer's bottom face [-]
    mechanical_strain_top: np.ndarray  # eps - f at each layer's top face [-]


def solve(
    modulus,
    thickness,
    free_strain,
    axial_force=0.0,
    bending_moment=0.0,
    restraint: str = "free",
    layer_axis: int = -1,
) -> LaminateSolution:
    """Solve the stack for every design in the broadcast arrays.

    ``modulus`` Y_i [Pa], ``thickness`` t_i [m] and ``free_strain`` f_i [-] carry the layer index on
    ``layer_axis`` (last by default; pass 0 for layer-major arrays of shape (n, ...), the fastest
    layout for millions of designs); ``axial_force`` N [N/m] and ``bending_moment`` M [N] broadcast
    against the design shape. ``restraint`` is one of :data:`RESTRAINTS`: "flat" holds the
    curvature at zero (reaction moment -M - M_T), "fixed" holds all strain at zero
    (sigma_i = -Y_i f_i, the fully restrained limit). Per-layer outputs keep the layer on ``layer_axis``.
    """
    if restraint not in RESTRAINTS:
        from .errors import InputError

        raise InputError("restraint", restraint, "one of " + ", ".join(RESTRAINTS))
    Y, t, f = (_layers_first(np.asarray(a, float), layer_axis) for a in (modulus, thickness, free_strain))
    n = max(Y.shape[0], t.shape[0], f.shape[0])
    shape = np.broadcast_shapes(Y.shape[1:], t.shape[1:], f.shape[1:], np.shape(axial_force),
                                np.shape(bending_moment))

    def layer(a, i):
        return np.broadcast_to(a[i if a.shape[0] > 1 else 0], shape)

    Ys, ts, fs = [[layer(a, i) for i in range(n)] for a in (Y, t, f)]
    heights = np.empty((2, n) + shape)  # bottom and top face of every layer
    z = np.zeros(shape)
    EA = np.zeros(shape)
    first_moment = np.zeros(shape)
    for i, (Yi, ti) in enumerate(zip(Ys, ts)):
        heights[0, i, ...] = z
        np.add(z, ti, out=heights[1, i, ...])
        z = heights[1, i, ...]
        Yt = Yi * ti
        EA += Yt
        first_moment += Yt * (heights[0, i, ...] + 0.5 * ti)
    t_b = first_moment / EA
    # Free strains are taken relative to their stiffness-weighted mean, g_i = f_i - N_T/EA. Since
    # sum Y_i t_i (z_i - t_b) = 0 this leaves M_T unchanged, and it removes the cancellation that
    # otherwise appears when one layer dominates the stiffness (its lever arm z_i - t_b is then a
    # small difference of large numbers, but its g_i is small too).
    N_T = np.zeros(shape)
    for Yi, ti, fi in zip(Ys, ts, fs):
        N_T += Yi * ti * fi
    f_ref = N_T / EA
    gs = [fi - f_ref for fi in fs]
    EI = np.zeros(shape)
    M_T = np.zeros(shape)
    for i, (Yi, ti, gi) in enumerate(zip(Ys, ts, gs)):
        Yt = Yi * ti
        lever = heights[0, i, ...] + 0.5 * ti - t_b
        EI += Yt * (ti * ti / 12.0 + lever * lever)
        M_T += Yt * gi * lever
    if restraint == "fixed":
        c_rel = -f_ref
        kappa = np.zeros(shape)
    else:
        c_rel = axial_force / EA
        kappa = (bending_moment + M_T) / EI if restraint == "free" else np.zeros(shape)
    c_rel = np.broadcast_to(c_rel, shape)
    c = np.broadcast_to(c_rel + f_ref, shape)
    kappa = np.broadcast_to(kappa, shape)
    strain = np.empty((2, n) + shape)  # mechanical strain eps(z) - f_i at bottom and top faces
    stress = np.empty((2, n) + shape)
    for face in (0, 1):
        for i, (Yi, gi) in enumerate(zip(Ys, gs)):
            s = strain[face, i, ...]
            np.subtract(heights[face, i, ...], t_b, out=s)
            s *= kappa
            s += c_rel
            s -= gi
            np.multiply(Yi, s, out=stress[face, i, ...])

    def per_layer(values):
        return values if values.ndim == 1 else np.moveaxis(values, 0, layer_axis)

    return LaminateSolution(
        axial_strain=c,
        curvature=kappa,
        bending_axis=t_b,
        axial_rigidity=EA,
        flexural_rigidity=EI,
        thermal_force=N_T,
        thermal_moment=M_T,
        layer_bottom=per_layer(heights[0]),
        layer_top=per_layer(heights[1]),
        stress_bottom=per_layer(stress[0]),
        stress_top=per_layer(stress[1]),
        mechanical_strain_bottom=per_layer(strain[0]),
        mechanical_strain_top=per_layer(strain[1]),
    )


def _layers_first(array: np.ndarray, layer_axis: int) -> np.ndarray:
    """The array with its layer axis first (a one-design, 1-D array already has it)."""
    return array if array.ndim <= 1 else np.moveaxis(array, layer_axis, 0)


def effective_properties(youngs_modulus, poisson_ratio, thermal_strain, state: str):
    """Effective modulus Y and free strain f of each layer for a bending state.

    narrow: Y = E, f = eps_th (uniaxial stress).
    wide:   Y = E/(1-nu^2), f = (1+nu) eps_th (plane strain, eps_y = 0, cylindrical bending).
    plate:  Y = E/(1-nu), f = eps_th (equal-biaxial stress, spherical bending of a free plate or disc).
    ``thermal_strain`` is the free thermal strain integral of alpha dT from the stress-free temperature.
    """
    E = np.asarray(youngs_modulus, float)
    nu = np.asarray(poisson_ratio, float)
    eps = np.asarray(thermal_strain, float)
    if state == "narrow":
        return E, eps
    if state == "wide":
        return E / (1.0 - nu * nu), (1.0 + nu) * eps
    if state == "plate":
        return E / (1.0 - nu), eps
    from .errors import InputError

    raise InputError("bending state", state, "one of narrow, wide, plate")


def bilayer_extremes(E1, E2, t1, t2, f1, f2, chunk: int = 16384):
    """Fast two-layer closed form under free thermal load: curvature and the four face stresses.

    Timoshenko (1925) in force form (layers.md eqs. 1.4-1.5): layer 1 at the bottom,
    P = (f2 - f1)/lambda, lambda = 1/(E1 t1) + 1/(E2 t2) + h^2/(4 D), D = (E1 t1^3 + E2 t2^3)/12,
    kappa = P h/(2 D); layer 1 carries +P, layer 2 -P, each plus its own bending stress E_i kappa z_i.
    Inputs are 1-D arrays of equal length (or scalars broadcast to them); evaluated in cache-sized
    chunks. Returns (kappa, sigma1_bottom, sigma1_top, sigma2_bottom, sigma2_top).
    """
    arrays = np.broadcast_arrays(*(np.asarray(a, float).ravel() for a in (E1, E2, t1, t2, f1, f2)))
    size = arrays[0].size
    out = np.empty((5, size))
    for start in range(0, size, chunk):
        stop = min(start + chunk, size)
        e1, e2, a, b, g1, g2 = (x[start:stop] for x in arrays)
        k, s1b, s1t, s2b, s2t = out[:, start:stop]
        ea = e1 * a  # E1 t1
        eb = e2 * b  # E2 t2
        h = a + b
        twelve_d = ea * a * a
        twelve_d += eb * b * b  # 12 D
        lam = h * h
        lam *= 3.0
        lam /= twelve_d
        lam += 1.0 / ea
        lam += 1.0 / eb
        p = g2 - g1
        p /= lam  # P = df / lambda
        np.multiply(p, h, out=k)
        k *= 6.0
        k /= twelve_d  # kappa = P h / (2 D) = 6 P h / (12 D)
        np.divide(p, a, out=s1b)  # P / t1
        bend = e1 * k
        bend *= 0.5 * a  # E1 kappa t1 / 2
        np.add(s1b, bend, out=s1t)
        s1b -= bend
        np.divide(p, b, out=s2t)
        np.negative(s2t, out=s2t)  # -P / t2
        bend = e2 * k
        bend *= 0.5 * b
        np.subtract(s2t, bend, out=s2b)
        s2t += bend
    return out[0], out[1], out[2], out[3], out[4]
