"""Immutable result of the stack engine, with its warnings, assumptions and JSON form.

All values are SI: m, 1/m, Pa, N/m (force per unit width), N (moment per unit width), J/m^2
(strain energy per unit area of the strip), K. Per-layer arrays have a trailing layer axis, and a
leading axis when several operating temperatures were evaluated at once.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from . import laminate
from .jsonable import plain

if TYPE_CHECKING:  # pragma: no cover
    from .stack import BendingState

__all__ = ["StackResult", "build_result", "layer_inputs", "RESULT_UNITS", "ASSUMPTIONS"]

MISMATCH_STRAIN_WARNING = 2.0e-3  # above this metals yield (250 MPa / 200 GPa = 1.25e-3); materials.md sec. 9
SMALL_DEFLECTION_LIMIT = 0.05  # kappa * total thickness; beyond it strains are no longer small

ASSUMPTIONS = (
    "linear elastic layers, small strains and small deflection",
    "uniform temperature through the stack",
    "perfect bonds (no slip), plane sections remain plane",
    "stresses valid farther than a few thicknesses from free ends and edges",
)

RESULT_UNITS = {
    "stress_free_temperature": "K",
    "operating_temperature": "K",
    "temperature_change": "K",
    "curvature": "1/m",
    "radius": "m",
    "bending_axis": "m",
    "neutral_axis": "m",
    "axial_strain": "1",
    "midplane_strain": "1",
    "axial_rigidity": "N/m",
    "flexural_rigidity": "N*m",
    "thermal_force": "N/m",
    "thermal_moment": "N",
    "effective_cte": "1/K",
    "strain_energy": "J/m^2",
    "thickness": "m",
    "bottom": "m",
    "top": "m",
    "height": "m",
    "stress_bottom": "Pa",
    "stress_top": "Pa",
    "transverse_stress_bottom": "Pa",
    "transverse_stress_top": "Pa",
    "force": "N/m",
    "stress_below": "Pa",
    "stress_above": "Pa",
}


@dataclass(frozen=True, eq=False)
class StackResult:
    """Curvature and stresses of one stack under one load case (or one per operating temperature)."""

    state: "BendingState"
    labels: tuple[str, ...]
    materials: tuple[str, ...]
    thicknesses: np.ndarray
    stress_free_temperature: float
    operating_temperature: "float | np.ndarray"
    temperature_change: "float | np.ndarray"
    axial_force: float
    bending_moment: float
    restraint: str
    curvature: "float | np.ndarray"
    bending_axis: float
    axial_strain: "float | np.ndarray"
    axial_rigidity: float
    flexural_rigidity: float
    thermal_force: "float | np.ndarray"
    thermal_moment: "float | np.ndarray"
    layer_bottom: np.ndarray
    layer_top: np.ndarray
    stress_bottom: np.ndarray
    stress_top: np.ndarray
    transverse_stress_bottom: np.ndarray
    transverse_stress_top: np.ndarray
    effective_modulus: np.ndarray
    free_strain: np.ndarray
    strain_energy: "float | np.ndarray"
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]

    @property
    def n_layers(self) -> int:
        return len(self.labels)

    @property
    def total_thickness(self) -> float:
        return float(self.layer_top[-1])

    @property
    def radius(self):
        """Radius of curvature 1/kappa [m]; infinite for a flat stack."""
        with np.errstate(divide="ignore"):
            r = 1.0 / np.asarray(self.curvature, float)
        return float(r) if np.ndim(r) == 0 else r

    @property
    def midplane_strain(self):
        """Total strain at mid-thickness z = H/2."""
        return self.strain_at(0.5 * self.total_thickness)

    @property
    def neutral_axis(self):
        """Height of zero total strain, t_b - c/kappa [m]; NaN when kappa = 0 (may lie outside the stack)."""
        kappa = np.asarray(self.curvature, float)
        with np.errstate(divide="ignore", invalid="ignore"):
            z0 = np.where(kappa != 0, self.bending_axis - np.asarray(self.axial_strain) / kappa, np.nan)
        return float(z0) if z0.ndim == 0 else z0

    @property
    def effective_cte(self):
        """Free expansion of the stack per kelvin, N_T/(EA dT) [1/K] (in plane strain: along x with eps_y = 0)."""
        dT = np.asarray(self.temperature_change, float)
        with np.errstate(divide="ignore", invalid="ignore"):
            value = np.where(dT != 0, np.asarray(self.thermal_force) / self.axial_rigidity / dT, np.nan)
        return float(value) if value.ndim == 0 else value

    @property
    def layer_force(self) -> np.ndarray:
        """Axial force carried by each layer per unit width [N/m] (sums to the applied force)."""
        return 0.5 * (self.stress_bottom + self.stress_top) * self.thicknesses

    @property
    def interface_heights(self) -> np.ndarray:
        return self.layer_top[:-1]

    @property
    def interface_stress_below(self) -> np.ndarray:
        """sigma_x just below each interface (top face of layers 1..n-1) [Pa]."""
        return self.stress_top[..., :-1]

    @property
    def interface_stress_above(self) -> np.ndarray:
        """sigma_x just above each interface (bottom face of layers 2..n) [Pa]."""
        return self.stress_bottom[..., 1:]

    def strain_at(self, z):
        """Total axial strain eps(z) = c + kappa (z - t_b) [-]."""
        c = np.asarray(self.axial_strain, float)
        kappa = np.asarray(self.curvature, float)
        value = c[..., None] + kappa[..., None] * (np.atleast_1d(z) - self.bending_axis)
        return value[..., 0] if np.ndim(z) == 0 else value

    def layer_index(self, z, side: str = "above") -> np.ndarray:
        """Index of the layer holding height z; at an interface, the layer above or below it."""
        z = np.asarray(z, float)
        edges = self.layer_top[:-1]
        index = np.searchsorted(edges, z, side="right" if side == "above" else "left")
        return np.clip(index, 0, self.n_layers - 1)

    def stress_at(self, z, side: str = "above"):
        """sigma_x(z) [Pa] for heights z in [0, H]; at an interface take ``side`` ("above"/"below")."""
        z_arr = np.atleast_1d(np.asarray(z, float))
        i = self.layer_index(z_arr, side)
        Y = self.effective_modulus[..., i]
        f = np.asarray(self.free_strain)[..., i]
        value = Y * (self.strain_at(z_arr) - f)
        return value[..., 0] if np.ndim(z) == 0 else value

    def profile(self, points_per_layer: int = 2):
        """(z, sigma_x, layer index) sampled through every layer, both sides of each interface."""
        z = np.concatenate(
            [np.linspace(b, t, points_per_layer) for b, t in zip(self.layer_bottom, self.layer_top)]
        )
        index = np.repeat(np.arange(self.n_layers), points_per_layer)
        Y = self.effective_modulus[..., index]
        f = np.asarray(self.free_strain)[..., index]
        return z, Y * (self.strain_at(z) - f), index

    def free_expansion(self, length: float):
        """Length change of a free stack of ``length`` [m] at the bending axis [m]."""
        return np.asarray(self.axial_strain) * length

    def to_dict(self) -> dict:
        """JSON-ready SI values under documented keys (docs/api.md); infinities and NaN become None."""
        layers = []
        for i in range(self.n_layers):
            layers.append(
                {
                    "label": self.labels[i],
                    "material": self.materials[i],
                    "thickness": plain(self.thicknesses[i]),
                    "bottom": plain(self.layer_bottom[i]),
                    "top": plain(self.layer_top[i]),
                    "stress_bottom": plain(self.stress_bottom[..., i]),
                    "stress_top": plain(self.stress_top[..., i]),
                    "transverse_stress_bottom": plain(self.transverse_stress_bottom[..., i]),
                    "transverse_stress_top": plain(self.transverse_stress_top[..., i]),
                    "force": plain(self.layer_force[..., i]),
                }
            )
        interfaces = [
            {
                "height": plain(self.layer_top[i]),
                "stress_below": plain(self.stress_top[..., i]),
                "stress_above": plain(self.stress_bottom[..., i + 1]),
            }
            for i in range(self.n_layers - 1)
        ]
        return {
            "bending_state": self.state.value,
            "restraint": self.restraint,
            "stress_free_temperature": plain(self.stress_free_temperature),
            "operating_temperature": plain(self.operating_temperature),
            "temperature_change": plain(self.temperature_change),
            "axial_force": plain(self.axial_force),
            "bending_moment": plain(self.bending_moment),
            "curvature": plain(self.curvature),
            "radius": plain(self.radius),
            "bending_axis": plain(self.bending_axis),
            "neutral_axis": plain(self.neutral_axis),
            "axial_strain": plain(self.axial_strain),
            "midplane_strain": plain(self.midplane_strain),
            "axial_rigidity": plain(self.axial_rigidity),
            "flexural_rigidity": plain(self.flexural_rigidity),
            "thermal_force": plain(self.thermal_force),
            "thermal_moment": plain(self.thermal_moment),
            "effective_cte": plain(self.effective_cte),
            "strain_energy": plain(self.strain_energy),
            "layers": layers,
            "interfaces": interfaces,
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "units": dict(RESULT_UNITS),
        }


def layer_inputs(stack, temperatures):
    """(E, nu, eps_th) of each layer: moduli, Poisson's ratios and the free thermal strain, the integral
    of alpha dT from the stress-free to each operating temperature (shape (..., n)). With
    :func:`bilayer.core.laminate.effective_properties` and :func:`bilayer.core.laminate.solve` these are the
    engine's inputs, e.g. for sweeping thicknesses of many variants in one call."""
    T0 = temperatures.stress_free
    T = np.asarray(temperatures.operating, float)
    materials = [layer.material for layer in stack.layers]
    thermal_strain = np.stack([np.asarray(m.cte.thermal_strain(T0, T), float) for m in materials], axis=-1)
    E = np.array([m.youngs_modulus for m in materials])
    nu = np.array([m.poisson_ratio for m in materials])
    return E, nu, thermal_strain


def build_result(stack, temperatures, state, axial_force, bending_moment, restraint) -> StackResult:
    """Evaluate the engine for a validated stack and load case (called by :func:`bilayer.core.stack.evaluate`)."""
    T0 = temperatures.stress_free
    T = np.asarray(temperatures.operating, float)
    materials = [layer.material for layer in stack.layers]
    E, nu, thermal_strain = layer_inputs(stack, temperatures)
    Y, f = laminate.effective_properties(E, nu, thermal_strain, state.value)  # Y per layer, f (..., n)
    t = stack.thicknesses
    sol = laminate.solve(Y, t, f, axial_force, bending_moment, restraint)
    sb, st = sol.stress_bottom, sol.stress_top
    if state.value == "narrow":
        tb, tt = np.zeros_like(sb), np.zeros_like(st)
    elif state.value == "plate":
        tb, tt = sb, st
    else:  # plane strain: sigma_y = nu sigma_x - E eps_th
        tb, tt = nu * sb - E * thermal_strain, nu * st - E * thermal_strain
    energy = _strain_energy(state.value, Y, t, sol, E, thermal_strain)
    warnings = _warnings(stack, T0, T, thermal_strain, sb, st, sol.curvature)
    return StackResult(
        state=state,
        labels=stack.labels,
        materials=tuple(m.name for m in materials),
        thicknesses=t,
        stress_free_temperature=T0,
        operating_temperature=temperatures.operating,
        temperature_change=temperatures.change,
        axial_force=axial_force,
        bending_moment=bending_moment,
        restraint=restraint,
        curvature=_scalar(sol.curvature),
        bending_axis=float(np.asarray(sol.bending_axis).reshape(-1)[0]),
        axial_strain=_scalar(sol.axial_strain),
        axial_rigidity=float(np.asarray(sol.axial_rigidity).reshape(-1)[0]),
        flexural_rigidity=float(np.asarray(sol.flexural_rigidity).reshape(-1)[0]),
        thermal_force=_scalar(sol.thermal_force),
        thermal_moment=_scalar(sol.thermal_moment),
        layer_bottom=sol.layer_bottom.reshape(-1, len(t))[0],
        layer_top=sol.layer_top.reshape(-1, len(t))[0],
        stress_bottom=sb,
        stress_top=st,
        transverse_stress_bottom=tb,
        transverse_stress_top=tt,
        effective_modulus=Y,
        free_strain=f,
        strain_energy=_scalar(energy),
        warnings=warnings,
        assumptions=ASSUMPTIONS + (state.description,),
    )


def _scalar(value):
    array = np.asarray(value, float)
    return float(array) if array.ndim == 0 else array


def _strain_energy(state, Y, t, sol, E, thermal_strain):
    """Elastic strain energy per unit area [J/m^2].

    Per layer, with mechanical strain s linear in z between s_b and s_t:
    narrow: U = sum Y t (s_b^2 + s_b s_t + s_t^2)/6;  plate (two equal directions): twice that;
    wide (plane strain, sigma_y = nu sigma_x - E eps_th): narrow form + sum E eps_th^2 t / 2.
    """
    sb, st = sol.mechanical_strain_bottom, sol.mechanical_strain_top
    per_layer = Y * t * (sb * sb + sb * st + st * st) / 6.0
    if state == "plate":
        per_layer = 2.0 * per_layer
    elif state == "wide":
        per_layer = per_layer + 0.5 * E * thermal_strain**2 * t
    return per_layer.sum(axis=-1)


def _warnings(stack, T0, T, thermal_strain, sb, st, kappa) -> tuple[str, ...]:
    """Model-limit and data-range warnings that apply to this result."""
    from .units import format_quantity

    messages = []
    Tmin, Tmax = float(np.min(T)), float(np.max(T))
    lo, hi = min(T0, Tmin), max(T0, Tmax)
    for i, layer in enumerate(stack.layers):
        m = layer.material
        name = f"layer {i + 1} ({layer.name})"
        cte = m.cte
        if not cte.covers(lo, hi):
            messages.append(
                f"{name}: the range {format_quantity(lo, 'temperature')} to {format_quantity(hi, 'temperature')} leaves its CTE "
                f"data ({_range_text(cte.valid_range)}); the thermal strain is extrapolated"
            )
        if m.temperature_range is not None and (lo < m.temperature_range[0] or hi > m.temperature_range[1]):
            messages.append(
                f"{name}: temperatures outside the material's valid range ({_range_text(m.temperature_range)})"
            )
        if m.glass_transition is not None and lo < m.glass_transition < hi:
            messages.append(
                f"{name}: the range crosses the glass transition ({format_quantity(m.glass_transition, 'temperature')}); "
                "modulus and CTE change there, so the elastic constants used are not valid over the whole range"
            )
        peak = float(np.max(np.abs(np.concatenate([np.ravel(sb[..., i]), np.ravel(st[..., i])]))))
        if m.strength is not None and peak > m.strength:
            messages.append(
                f"{name}: peak |stress| {format_quantity(peak, 'stress')} exceeds its {m.strength_kind or 'strength'} "
                f"{format_quantity(m.strength, 'stress')}; the elastic result is an upper bound"
            )
    mismatch = np.max(np.ptp(np.reshape(thermal_strain, (-1, stack.n_layers)), axis=-1))
    if mismatch > MISMATCH_STRAIN_WARNING:
        messages.append(
            f"thermal mismatch strain {mismatch:.2e} exceeds {MISMATCH_STRAIN_WARNING:.0e}: metals may yield "
            "and polymers creep; treat elastic stresses as upper bounds"
        )
    if float(np.max(np.abs(kappa))) * stack.total_thickness > SMALL_DEFLECTION_LIMIT:
        messages.append("curvature times thickness exceeds 0.05: strains are no longer small")
    return tuple(messages)


def _range_text(bounds) -> str:
    from .units import format_quantity

    if bounds is None:
        return "no stated range"
    return f"{format_quantity(bounds[0], 'temperature')} to {format_quantity(bounds[1], 'temperature')}"
