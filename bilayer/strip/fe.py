"""Independent 2-D finite-element check of a free layered strip under a temperature change.

The strip of length L and the stack's layers is meshed in the x-z plane with biquadratic
(9-node, ElementQuad2) elements of scikit-fem (optional extra ``bilayer[fe]``, imported lazily).
Plane stress represents a narrow strip (state "narrow"), plane strain a wide strip in cylindrical
bending (state "wide"); the equal-biaxial plate has no 2-D counterpart. Each layer is linear
elastic and isotropic with a free thermal strain; in the x-z plane

    sigma = lam' tr(eps) I + 2 mu eps - 2 (lam' + mu) eps* I
    plane stress: lam' = E nu/(1 - nu^2),                eps* = eps_th
    plane strain: lam' = E nu/((1 + nu)(1 - 2 nu)),      eps* = (1 + nu) eps_th

(the plane-strain free strain (1+nu) eps_th and modulus E/(1-nu^2) are exactly the engine's "wide"
state). Only rigid-body motion is restrained, at mid-length: u_x = u_z = 0 at the bottom face and
u_x = 0 at the top face; the load is self-equilibrated, so these supports carry no reaction.

Mesh: tensor-product, graded toward both free ends (geometric growth from a small end element)
and toward both faces of every layer (so every interface). Outputs: mid-length curvature (least
squares of eps_xx(z)), sigma_xx through the thickness and layer forces at mid-length, shear and
peel along each interface at stated distances from the right end (never at the corner: the exact
corner field may be singular, see bilayer.strip.interface), their profiles at Gauss points, the integral of
the shear from mid-length to the end, and the end deflection. Stresses at a point are averaged
over the elements that touch it (both sides of an interface).
"""
from __future__ import annotations

import time
from dataclasses import dataclass, replace
from typing import Sequence

import numpy as np

from ..core.progress import Progress
from ..core.errors import InputError, check_range, require
from ..core.stack import BendingState, Stack, Temperatures

__all__ = ["MeshOptions", "FEInterface", "FEResult", "RefinementStudy", "fe_check", "refinement_study", "strip_mesh"]


PLANE = {BendingState.NARROW: "plane stress", BendingState.WIDE: "plane strain"}


@dataclass(frozen=True)
class MeshOptions:
    """Mesh density of the strip (all sizes relative, so one setting suits any stack).

    ``layer_elements`` elements through each layer, graded toward both faces; along x the smallest
    element at each end is ``end_element`` times the thinnest layer and grows by ``growth`` per element
    up to ``max_element`` times the total thickness. ``refinement`` multiplies the element counts
    (and divides the end element) so that refinement 2 halves every element.
    """

    layer_elements: int = 8
    end_element: float = 0.02
    growth: float = 1.3
    max_element: float = 0.5
    refinement: int = 1

    def __post_init__(self):
        if not isinstance(self.layer_elements, int) or not 2 <= self.layer_elements <= 200:
            raise InputError("mesh.layer_elements", self.layer_elements, "an integer from 2 to 200")
        check_range("mesh.end_element", self.end_element, 0.0, 1.0, high_inclusive=True)
        check_range("mesh.growth", self.growth, 1.0, 2.0, low_inclusive=True, high_inclusive=True)
        check_range("mesh.max_element", self.max_element, 0.0, 5.0, high_inclusive=True)
        if not isinstance(self.refinement, int) or not 1 <= self.refinement <= 16:
            raise InputError("mesh.refinement", self.refinement, "an integer from 1 to 16")

    def refined(self, factor: int = 2) -> "MeshOptions":
        """The same mesh with every element divided ``factor`` times in each direction."""
        return replace(self, refinement=self.refinement * factor)


def _layer_grid(thickness: float, n: int) -> np.ndarray:
    """n elements across one layer, crowded toward both faces (cosine spacing).

    The stresses on an interface come from the elements next to it, so their height sets the error
    of the interface shear and peel; cosine spacing makes them about 2.5/n^2 of the layer thickness.
    """
    return thickness * 0.5 * (1.0 - np.cos(np.pi * np.linspace(0.0, 1.0, n + 1)))


def _end_grid(half: float, first: float, growth: float, largest: float, divide: int) -> np.ndarray:
    """Points from one end (0) to mid-length (half): geometric growth, then uniform; subdivided."""
    points = [0.0]
    size = first
    while points[-1] + size < half:
        points.append(points[-1] + size)
        size = min(size * growth, largest)
    if half - points[-1] < 0.5 * size and len(points) > 1:
        points.pop()  # avoid a sliver next to mid-length
    points.append(half)
    coarse = np.asarray(points)
    if divide == 1:
        return coarse
    fine = [np.linspace(a, b, divide + 1)[:-1] for a, b in zip(coarse[:-1], coarse[1:])]
    return np.concatenate(fine + [[half]])


def strip_mesh(thicknesses: Sequence[float], length: float, options: MeshOptions = MeshOptions()):
    """(x, z) node coordinates of the graded tensor-product mesh; x includes L/2 exactly."""
    t = np.asarray(thicknesses, float)
    H = float(t.sum())
    r = options.refinement
    z = [np.zeros(1)]
    bottom = 0.0
    for ti in t:
        z.append(bottom + _layer_grid(ti, options.layer_elements * r)[1:])
        bottom += ti
    z = np.concatenate(z)
    z[-1] = H
    half = 0.5 * length
    left = _end_grid(half, options.end_element * t.min(), options.growth, options.max_element * H, r)
    x = np.concatenate([left, length - left[-2::-1]])
    return x, z


@dataclass(frozen=True, eq=False)
class FEInterface:
    """FE shear and peel along one height (an interface, or the mid-plane of a bond layer)."""

    height: float  # z [m]
    distances: np.ndarray  # from the right end [m]
    shear: np.ndarray  # sigma_xz at those distances [Pa] (sign as tau in bilayer.strip.interface)
    peel: np.ndarray  # sigma_zz [Pa]
    shear_left: np.ndarray  # sigma_xz at the same distances from the left end [Pa]
    peel_left: np.ndarray
    x: np.ndarray  # profile positions (Gauss points, never at an end) [m]
    shear_profile: np.ndarray
    peel_profile: np.ndarray
    shear_integral: float  # integral of sigma_xz from mid-length to the right end [N/m]
    force_below: float  # sigma_xx integrated over the stack below this height at mid-length [N/m]


@dataclass(frozen=True, eq=False)
class FEResult:
    """Outputs of one FE run (SI units)."""

    state: BendingState
    plane: str  # "plane stress" or "plane strain"
    length: float
    thicknesses: np.ndarray
    mesh: MeshOptions
    dofs: int
    elements: int
    seconds: float
    curvature: float  # mid-length, from the slope of eps_xx(z) [1/m]
    bottom_strain: float  # eps_xx at z = 0, mid-length (linear fit) [-]
    linearity: float  # largest deviation of eps_xx(z) from the fit over the strain range [-]
    z: np.ndarray  # heights of the mid-length samples [m]
    stress: np.ndarray  # sigma_xx at mid-length at z [Pa]
    stress_bottom: np.ndarray  # just inside the bottom face of each layer [Pa]
    stress_top: np.ndarray  # just inside the top face of each layer [Pa]
    layer_force: np.ndarray  # int sigma_xx dz per layer at mid-length [N/m]
    end_deflection: float  # mean of w at both ends minus w at mid-length, at mid-thickness [m]
    interfaces: tuple[FEInterface, ...]

    def to_dict(self) -> dict:
        return {
            "bending_state": self.state.value,
            "plane": self.plane,
            "length": self.length,
            "dofs": self.dofs,
            "elements": self.elements,
            "seconds": self.seconds,
            "mesh": {
                "layer_elements": self.mesh.layer_elements,
                "end_element": self.mesh.end_element,
                "growth": self.mesh.growth,
                "max_element": self.mesh.max_element,
                "refinement": self.mesh.refinement,
            },
            "curvature": self.curvature,
            "bottom_strain": self.bottom_strain,
            "linearity": self.linearity,
            "z": self.z.tolist(),
            "stress": self.stress.tolist(),
            "stress_bottom": self.stress_bottom.tolist(),
            "stress_top": self.stress_top.tolist(),
            "layer_force": self.layer_force.tolist(),
            "end_deflection": self.end_deflection,
            "interfaces": [
                {
                    "height": i.height,
                    "distances": i.distances.tolist(),
                    "shear": i.shear.tolist(),
                    "peel": i.peel.tolist(),
                    "shear_left": i.shear_left.tolist(),
                    "peel_left": i.peel_left.tolist(),
                    "shear_integral": i.shear_integral,
                    "force_below": i.force_below,
                }
                for i in self.interfaces
            ],
            "units": {
                "length": "m", "seconds": "s", "curvature": "1/m", "bottom_strain": "1", "linearity": "1",
                "z": "m", "stress": "Pa", "stress_bottom": "Pa", "stress_top": "Pa", "layer_force": "N/m",
                "end_deflection": "m", "height": "m", "distances": "m", "shear": "Pa", "peel": "Pa",
                "shear_integral": "N/m", "force_below": "N/m",
            },
        }


def _materials(stack: Stack, temperatures: Temperatures, state: BendingState):
    """Per-layer Lame parameters of the 2-D problem and the free strain eps*."""
    if np.ndim(temperatures.operating):
        raise InputError("operating_temperature", temperatures.operating, "a single temperature for the FE check")
    E = np.array([layer.material.youngs_modulus for layer in stack.layers])
    nu = np.array([layer.material.poisson_ratio for layer in stack.layers])
    thermal = np.array(
        [float(layer.material.cte.thermal_strain(temperatures.stress_free, temperatures.operating)) for layer in stack.layers]
    )
    mu = E / (2.0 * (1.0 + nu))
    if state is BendingState.NARROW:
        lam = E * nu / (1.0 - nu * nu)
        free = thermal
    else:
        lam = E * nu / ((1.0 + nu) * (1.0 - 2.0 * nu))
        free = (1.0 + nu) * thermal
    return lam, mu, free


class _Solution:
    """Displacements on the mesh with point evaluation of values and stresses."""

    def __init__(self, basis, u, lam, mu, free, layer_top, x_nodes, z_nodes):
        self.basis, self.u = basis, u
        self.lam, self.mu, self.free, self.layer_top = lam, mu, free, layer_top
        self.x_nodes, self.z_nodes = x_nodes, z_nodes
        mesh = basis.mesh
        column = np.searchsorted(x_nodes, mesh.p[0, mesh.t].mean(axis=0)) - 1
        row = np.searchsorted(z_nodes, mesh.p[1, mesh.t].mean(axis=0)) - 1
        self.cell_of = np.empty((len(x_nodes) - 1, len(z_nodes) - 1), dtype=np.int64)
        self.cell_of[column, row] = np.arange(mesh.t.shape[1])

    def _cells(self, points: np.ndarray) -> np.ndarray:
        """Element holding each point of the tensor-product mesh (direct lookup, no search)."""
        column = np.clip(np.searchsorted(self.x_nodes, points[0], side="right") - 1, 0, len(self.x_nodes) - 2)
        row = np.clip(np.searchsorted(self.z_nodes, points[1], side="right") - 1, 0, len(self.z_nodes) - 2)
        return self.cell_of[column, row]

    def _local(self, points: np.ndarray, cells: np.ndarray) -> np.ndarray:
        """Reference coordinates (2, m, 1) of points in their rectangles (exact: the map is affine).

        Computed directly because a Newton inverse with an absolute tolerance fails on
        sub-micrometre elements far from the origin.
        """
        p, t = self.basis.mesh.p, self.basis.mesh.t
        origin = p[:, t[0, cells]]
        local = np.empty((2, points.shape[1], 1))
        for axis, corner in enumerate((1, 3)):  # reference axes run from vertex 0 to vertices 1 and 3
            edge = p[:, t[corner, cells]] - origin
            local[axis, :, 0] = np.clip(np.sum((points - origin) * edge, axis=0) / np.sum(edge * edge, axis=0), 0.0, 1.0)
        return local

    def _fields(self, points: np.ndarray):
        """(u (2, m), grad u (2, 2, m)) at points (2, m) inside the mesh."""
        basis = self.basis
        cells = self._cells(points)
        local = self._local(points, cells)
        dofs = basis.element_dofs[:, cells]
        value = np.zeros((2, points.shape[1]))
        grad = np.zeros((2, 2, points.shape[1]))
        for k in range(basis.Nbfun):
            field = basis.elem.gbasis(basis.mapping, local, k, tind=cells)[0]
            coefficient = self.u[dofs[k]]
            value += np.asarray(field)[:, :, 0] * coefficient
            grad += field.grad[:, :, :, 0] * coefficient
        return value, grad

    def displacement(self, x, z) -> np.ndarray:
        return self._fields(np.vstack([np.ravel(x), np.ravel(z)]))[0]

    def stress(self, x, z, layer) -> np.ndarray:
        """(sigma_xx, sigma_zz, sigma_xz) at points inside ``layer`` (array of layer indices)."""
        _, g = self._fields(np.vstack([np.ravel(x), np.ravel(z)]))
        lam, mu, free = self.lam[layer], self.mu[layer], self.free[layer]
        trace = g[0, 0] + g[1, 1]
        thermal = 2.0 * (lam + mu) * free
        return np.array([
            lam * trace + 2.0 * mu * g[0, 0] - thermal,
            lam * trace + 2.0 * mu * g[1, 1] - thermal,
            mu * (g[0, 1] + g[1, 0]),
        ])

    def averaged_stress(self, x, z, step_x: float, step_z: float) -> np.ndarray:
        """Stress at (x, z) averaged over the elements touching the point (up to four)."""
        x, z = np.ravel(x), np.ravel(z)
        shifts_x = (-step_x, step_x) if step_x else (0.0,)
        total = 0.0
        for dz in (-step_z, step_z):
            zz = z + dz
            layer = np.clip(np.searchsorted(self.layer_top, zz), 0, len(self.layer_top) - 1)
            for dx in shifts_x:
                total = total + self.stress(x + dx, zz, layer)
        return total / (2.0 * len(shifts_x))


def check_strip_inputs(stack, temperatures, length, state, distances, mesh=None):
    """Validated (length, state, distances) of an FE run; default distances cut to those short of mid-length.

    The one place where the inputs of an FE run are checked: the runs behind it (:func:`solve_strip`,
    :func:`refine_strip`) take them as they are."""
    if mesh is not None and not isinstance(mesh, MeshOptions):
        raise InputError("mesh", mesh, "a MeshOptions")
    if not isinstance(stack, Stack):
        raise InputError("stack", stack, "a Stack")
    if not isinstance(temperatures, Temperatures):
        raise InputError("temperatures", temperatures, "a Temperatures(stress_free, operating)")
    length = check_range("length", length, 0.0, 100.0, unit="m")
    state = BendingState.parse(state)
    if state not in PLANE:
        raise InputError(
            "bending state", state.value, "'narrow' (plane stress) or 'wide' (plane strain) for the 2-D FE check",
            "a free plate bends in two directions; the trust report compares a plate design in plane strain",
        )
    H = stack.total_thickness
    if distances is None:
        distances = H * np.array([0.05, 0.1, 0.25, 0.5, 1.0])
        distances = distances[distances < 0.5 * length] if distances[0] < 0.5 * length else np.array([0.25 * length])
    distances = np.asarray(distances, float).ravel()
    if distances.size == 0 or not np.all((distances > 0.0) & (distances < 0.5 * length)):
        raise InputError(
            "distances", distances.tolist(), f"distances from the end in (0, L/2 = {0.5 * length:g} m)",
            "the corner itself (distance 0) is singular and never sampled",
        )
    return length, state, distances


def fe_check(
    stack: Stack,
    temperatures: Temperatures,
    length: float,
    state: "BendingState | str" = BendingState.NARROW,
    mesh: MeshOptions = MeshOptions(),
    distances=None,
    heights=None,
    progress: Progress | None = None,
) -> FEResult:
    """Solve the 2-D strip and return the quantities compared with the closed forms.

    ``distances`` [m] from the end where shear and peel are sampled (default 0.05, 0.1, 0.25, 0.5
    and 1 times the total thickness, those short of mid-length); ``heights`` [m] where they are
    sampled (default: every interface). ``progress(fraction, message)`` is called as the run advances.
    """
    length, state, distances = check_strip_inputs(stack, temperatures, length, state, distances, mesh)
    return solve_strip(stack, temperatures, length, state, mesh, distances, heights, progress)


def solve_strip(stack, temperatures, length, state, mesh, distances, heights=None, progress=None) -> FEResult:
    """:func:`fe_check` on inputs already checked by :func:`check_strip_inputs` (the door of every FE run)."""
    report = progress or (lambda fraction, message: None)
    start = time.perf_counter()
    fem = require("skfem", "the finite-element check", "fe")
    from skfem.helpers import ddot, sym_grad, trace

    report(0.0, "meshing")
    t = stack.thicknesses
    H = float(t.sum())
    layer_top = np.cumsum(t)
    x_nodes, z_nodes = strip_mesh(t, length, mesh)
    m = fem.MeshQuad.init_tensor(x_nodes, z_nodes)
    basis = fem.Basis(m, fem.ElementVector(fem.ElementQuad2()), intorder=4)
    constant = basis.with_element(fem.ElementQuad0())
    centre_z = m.p[1, m.t].mean(axis=0)
    layer_of_element = np.searchsorted(layer_top[:-1], centre_z)
    lam, mu, free = _materials(stack, temperatures, state)
    fields = {
        "lam": constant.interpolate(lam[layer_of_element]),
        "mu": constant.interpolate(mu[layer_of_element]),
        "free": constant.interpolate(free[layer_of_element]),
    }

    @fem.BilinearForm
    def stiffness(u, v, w):
        eu, ev = sym_grad(u), sym_grad(v)
        return 2.0 * w.mu * ddot(eu, ev) + w.lam * trace(eu) * trace(ev)

    @fem.LinearForm
    def thermal_load(v, w):
        return 2.0 * (w.lam + w.mu) * w.free * trace(sym_grad(v))

    report(0.1, f"assembling {basis.N} unknowns")
    K = stiffness.assemble(basis, **fields)
    F = thermal_load.assemble(basis, **fields)
    half = 0.5 * length
    bottom_mid = int(np.argmin((m.p[0] - half) ** 2 + m.p[1] ** 2))
    top_mid = int(np.argmin((m.p[0] - half) ** 2 + (m.p[1] - H) ** 2))
    fixed = np.array([basis.nodal_dofs[0, bottom_mid], basis.nodal_dofs[1, bottom_mid], basis.nodal_dofs[0, top_mid]])
    report(0.4, "solving")
    u = fem.solve(*fem.condense(K, F, D=fixed))
    report(0.8, "evaluating stresses")
    solution = _Solution(basis, u, lam, mu, free, layer_top, x_nodes, z_nodes)
    result = _postprocess(solution, stack, length, H, t, layer_top, x_nodes, z_nodes, distances, heights)
    seconds = time.perf_counter() - start
    report(1.0, f"done in {seconds:.2f} s")
    return FEResult(
        state=state, plane=PLANE[state], length=length, thicknesses=t, mesh=mesh, dofs=int(basis.N),
        elements=int(m.t.shape[1]), seconds=seconds, interfaces=result.pop("interfaces"), **result,
    )


def _postprocess(solution, stack, length, H, t, layer_top, x_nodes, z_nodes, distances, heights) -> dict:
    half = 0.5 * length
    n = len(t)
    bottoms = layer_top - t
    step_x = 1e-9 * length
    # mid-length strain and stress through the thickness, inside every layer
    inset = 1e-7 * t
    per_layer = 9
    z = np.concatenate([np.linspace(b + d, b + ti - d, per_layer) for b, ti, d in zip(bottoms, t, inset)])
    layer = np.repeat(np.arange(n), per_layer)
    gradients = [solution._fields(np.vstack([np.full_like(z, half + s), z]))[1] for s in (-step_x, step_x)]
    eps_xx = 0.5 * (gradients[0][0, 0] + gradients[1][0, 0])
    slope, intercept = np.polyfit(z, eps_xx, 1)
    linearity = float(np.max(np.abs(eps_xx - (intercept + slope * z))) / max(np.ptp(eps_xx), 1e-300))
    stress = 0.5 * sum(
        solution.stress(np.full_like(z, half + s), z, layer)[0] for s in (-step_x, step_x)
    )
    faces = stress.reshape(n, per_layer)
    # layer forces: Gauss-Legendre in z over every element row at mid-length
    g, wg = np.polynomial.legendre.leggauss(5)
    z_lo, z_hi = z_nodes[:-1], z_nodes[1:]
    zq = (0.5 * (z_lo + z_hi)[:, None] + 0.5 * (z_hi - z_lo)[:, None] * g[None, :]).ravel()
    wq = (0.5 * (z_hi - z_lo)[:, None] * wg[None, :]).ravel()
    layer_q = np.searchsorted(layer_top[:-1], zq)
    sxx_q = 0.5 * sum(solution.stress(np.full_like(zq, half + s), zq, layer_q)[0] for s in (-step_x, step_x))
    layer_force = np.bincount(layer_q, weights=sxx_q * wq, minlength=n)
    # end deflection at mid-thickness
    w = solution.displacement(np.array([0.0, half, length]), np.full(3, 0.5 * H))[1]
    end_deflection = float(0.5 * (w[0] + w[2]) - w[1])
    # shear and peel along each requested height
    heights = stack.interface_heights if heights is None else np.asarray(heights, float).ravel()
    if heights.size and not np.all((heights > 0.0) & (heights < H)):
        raise InputError("heights", heights.tolist(), f"heights inside the stack, 0 < z < {H:g} m")
    step_z = 1e-9 * H
    x_lo, x_hi = x_nodes[:-1], x_nodes[1:]
    xq = (0.5 * (x_lo + x_hi)[:, None] + 0.5 * (x_hi - x_lo)[:, None] * g[None, :]).ravel()
    wxq = (0.5 * (x_hi - x_lo)[:, None] * wg[None, :]).ravel()
    interfaces = []
    for zh in heights:
        right = solution.averaged_stress(length - distances, np.full_like(distances, zh), step_x, step_z)
        left = solution.averaged_stress(distances, np.full_like(distances, zh), step_x, step_z)
        profile = solution.averaged_stress(xq, np.full_like(xq, zh), 0.0, step_z)
        right_half = xq > half
        interfaces.append(
            FEInterface(
                height=float(zh),
                distances=distances.copy(),
                shear=right[2], peel=right[1], shear_left=left[2], peel_left=left[1],
                x=xq, shear_profile=profile[2], peel_profile=profile[1],
                shear_integral=float(np.sum(profile[2][right_half] * wxq[right_half])),
                force_below=_force_below(solution, zh, half, z_nodes, layer_top, step_x),
            )
        )
    return dict(
        curvature=float(slope), bottom_strain=float(intercept), linearity=linearity, z=z, stress=stress,
        stress_bottom=faces[:, 0].copy(), stress_top=faces[:, -1].copy(), layer_force=layer_force,
        end_deflection=end_deflection, interfaces=tuple(interfaces),
    )


def _force_below(solution, zh, half, z_nodes, layer_top, step_x) -> float:
    """int sigma_xx dz from the bottom face to height zh at mid-length (5-point Gauss per element row)."""
    g, wg = np.polynomial.legendre.leggauss(5)
    tops = np.minimum(z_nodes[1:], zh)
    bottoms = z_nodes[:-1]
    rows = tops > bottoms
    lo, hi = bottoms[rows], tops[rows]
    zq = (0.5 * (lo + hi)[:, None] + 0.5 * (hi - lo)[:, None] * g[None, :]).ravel()
    wq = (0.5 * (hi - lo)[:, None] * wg[None, :]).ravel()
    layer = np.searchsorted(layer_top[:-1], zq)
    sxx = 0.5 * sum(solution.stress(np.full_like(zq, half + s), zq, layer)[0] for s in (-step_x, step_x))
    return float(np.sum(sxx * wq))


@dataclass(frozen=True, eq=False)
class RefinementStudy:
    """FE runs on successively halved meshes and the changes between them."""

    runs: tuple[FEResult, ...]

    @staticmethod
    def _change(new, old, scale) -> float:
        return float(np.max(np.abs(np.asarray(new) - np.asarray(old))) / scale) if scale > 0 else 0.0

    @property
    def curvature_changes(self) -> np.ndarray:
        """|kappa_i - kappa_{i-1}| / |kappa_i| for each refinement step."""
        return np.array([self._change(b.curvature, a.curvature, abs(b.curvature)) for a, b in zip(self.runs, self.runs[1:])])

    @property
    def stress_changes(self) -> np.ndarray:
        """Largest change of mid-length sigma_xx over the largest |sigma_xx|, per step."""
        return np.array([
            self._change(b.stress, a.stress, np.max(np.abs(b.stress))) for a, b in zip(self.runs, self.runs[1:])
        ])

    @property
    def shear_changes(self) -> np.ndarray:
        """(steps, heights): largest change of the sampled shear over its largest |value|."""
        return np.array([
            [self._change(j.shear, i.shear, np.max(np.abs(j.shear))) for i, j in zip(a.interfaces, b.interfaces)]
            for a, b in zip(self.runs, self.runs[1:])
        ])

    @property
    def peel_changes(self) -> np.ndarray:
        """(steps, heights): largest change of the sampled peel over its largest |value|."""
        return np.array([
            [self._change(j.peel, i.peel, np.max(np.abs(j.peel))) for i, j in zip(a.interfaces, b.interfaces)]
            for a, b in zip(self.runs, self.runs[1:])
        ])

    def to_dict(self) -> dict:
        return {
            "dofs": [r.dofs for r in self.runs],
            "seconds": [r.seconds for r in self.runs],
            "curvature": [r.curvature for r in self.runs],
            "curvature_changes": self.curvature_changes.tolist(),
            "stress_changes": self.stress_changes.tolist(),
            "shear_changes": self.shear_changes.tolist(),
            "peel_changes": self.peel_changes.tolist(),
        }


def refinement_study(
    stack: Stack,
    temperatures: Temperatures,
    length: float,
    state: "BendingState | str" = BendingState.NARROW,
    mesh: MeshOptions = MeshOptions(),
    levels: int = 2,
    distances=None,
    heights=None,
    progress: Progress | None = None,
) -> RefinementStudy:
    """Run ``levels`` meshes, each with every element of the previous one halved (4x the unknowns)."""
    length, state, distances = check_strip_inputs(stack, temperatures, length, state, distances, mesh)
    return refine_strip(stack, temperatures, length, state, mesh, levels, distances, heights, progress)


def refine_strip(stack, temperatures, length, state, mesh, levels, distances, heights=None,
                 progress=None) -> RefinementStudy:
    """:func:`refinement_study` on inputs already checked by :func:`check_strip_inputs`."""
    if not isinstance(levels, int) or not 2 <= levels <= 4:
        raise InputError("levels", levels, "an integer from 2 to 4")
    weights = 4.0 ** np.arange(levels)
    done = np.concatenate([[0.0], np.cumsum(weights)]) / weights.sum()
    runs = []
    for i in range(levels):
        def step(fraction, message, i=i):
            if progress is not None:
                progress(done[i] + fraction * (done[i + 1] - done[i]), f"mesh {i + 1} of {levels}: {message}")

        runs.append(solve_strip(stack, temperatures, length, state, mesh.refined(2**i), distances, heights, step))
    return RefinementStudy(tuple(runs))
