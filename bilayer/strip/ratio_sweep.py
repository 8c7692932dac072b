"""Design sweeps over the stack: curvature and peak interface shear against the thickness ratio.

At fixed total thickness, the part below the first interface (the bottom layer) and the part above it
are scaled against each other; a bond layer keeps its thickness. Curvature comes from one vectorised
engine call over all ratios (:func:`bilayer.core.laminate.solve`), the peak interface shear from the
interface model (:mod:`bilayer.strip.interface`) at mid-length of a strip of the given length.
"""
from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np

from .interface import interface_parameters, resolve_bonds
from ..core.laminate import effective_properties, solve
from ..core.results import layer_inputs
from ..core.stack import Design, Stack

__all__ = ["ThicknessRatioSweep", "thickness_ratio_sweep", "ratio_of_largest"]


@dataclass(frozen=True, eq=False)
class ThicknessRatioSweep:
    """Curvature [1/m] and peak |interface shear| [Pa] per thickness ratio (part below / part above),
    with the current design's values and the ratio of largest |curvature| (None at the sweep's end)."""

    ratios: np.ndarray
    curvature: np.ndarray
    peak_shear: np.ndarray
    current_ratio: float
    current_curvature: float
    current_peak_shear: float
    best_ratio: float | None


def thickness_ratio_sweep(design: Design, length: float, bonds=(), ratios=None, points: int = 41) -> ThicknessRatioSweep:
    """Sweep the thickness ratio of ``design`` (default: ``points`` ratios from 1/16 to 16 times the
    current one, logarithmically spaced); ``length`` [m] is the strip length for the interface model."""
    stack = design.stack
    bond_set = resolve_bonds(stack, bonds)
    first_bond = 1 if 1 in bond_set else None
    below = [0]
    above = [i for i in range(1, stack.n_layers) if i != first_bond]
    t = stack.thicknesses
    t_below, t_above = t[below].sum(), t[above].sum()
    current = float(t_below / t_above)
    if ratios is None:
        ratios = current * np.logspace(-1.2, 1.2, points)
    ratios = np.asarray(ratios, float)
    every = np.append(ratios, current)  # the current design rides along as the last point
    total = t_below + t_above
    thickness = np.tile(t, (every.size, 1))
    thickness[:, below] *= (total * every / (1 + every) / t_below)[:, None]
    thickness[:, above] *= (total / (1 + every) / t_above)[:, None]
    thickness[-1] = t  # exactly the design's thicknesses
    E, nu, thermal_strain = layer_inputs(stack, design.temperatures)
    Y, f = effective_properties(E, nu, thermal_strain, design.state.value)
    curvature = solve(Y, thickness, f, design.axial_force, design.bending_moment).curvature
    peak = np.empty(every.size)
    half = 0.5 * length
    for k, row in enumerate(thickness):
        swept = Stack(tuple(replace(layer, thickness=float(h)) for layer, h in zip(stack.layers, row)))
        params = interface_parameters(swept, design.temperatures, design.state, bonds=bond_set)
        peak[k] = max(abs(float(p.force_and_shear(np.array([half]), half)[1][0])) for p in params)
    return ThicknessRatioSweep(ratios, curvature[:-1], peak[:-1], current, float(curvature[-1]), float(peak[-1]),
                               ratio_of_largest(ratios, np.abs(curvature[:-1])))


def ratio_of_largest(ratios: np.ndarray, values: np.ndarray) -> float | None:
    """Ratio of the largest value, refined by a parabola through the best sample and its neighbours
    (in log ratio); None when the largest value sits at the end of the sweep."""
    i = int(np.argmax(values))
    if i == 0 or i == len(values) - 1:
        return None
    x = np.log(ratios[i - 1:i + 2])
    y = values[i - 1:i + 2]
    a, b, _ = np.polyfit(x, y, 2)
    return float(np.exp(-b / (2 * a))) if a < 0 else float(ratios[i])
