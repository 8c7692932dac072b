"""Figure of a film on a substrate: how far Stoney is off against the thickness ratio."""
from __future__ import annotations

from typing import TYPE_CHECKING

import numpy as np
from matplotlib.figure import Figure
from .canvas import PALETTE, axis_label, axis_unit, target

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.axes import Axes


__all__ = ["stoney_error_curve"]


# --------------------------------------------------------------------------------------------
# Thin films: how far Stoney is off


def stoney_error_curve(
    film_thickness: np.ndarray,
    stress_error: np.ndarray,
    curvature_error: np.ndarray,
    current_thickness: float,
    current_stress_error: float,
    current_curvature_error: float,
    system: str = "si",
    ax: "Axes | None" = None,
    title: str = "Stoney against the exact bilayer, over the film thickness",
) -> Figure:
    """Relative error of Stoney's film stress (read from a curvature) and of Stoney's curvature (predicted
    from a misfit) against the film thickness, logarithmic, with the current film marked. Errors as
    fractions (sigma_Stoney/<sigma_f> - 1 and kappa_Stoney/kappa_exact - 1), shown in percent."""
    figure, ax = target(ax, 3.4)
    t = np.asarray(film_thickness, float)
    x_unit = axis_unit("length", system, float(np.max(t)) if t.size else None)
    ax.plot(x_unit(t), 100 * np.asarray(stress_error), color=PALETTE[0], lw=2.0,
            label="film stress from a measured curvature")
    ax.plot(x_unit(t), 100 * np.asarray(curvature_error), color=PALETTE[5], lw=1.6, ls="--",
            label="curvature predicted from a misfit")
    ax.plot([float(x_unit(current_thickness))] * 2, [100 * current_stress_error, 100 * current_curvature_error], "o",
            color="black", ms=5, label=f"this film, {float(x_unit(current_thickness)):.4g} {x_unit.label}")
    ax.axhline(0.0, color="0.3", lw=0.7)
    ax.set_xscale("log")
    ax.set_xlabel(axis_label("film thickness", x_unit))
    ax.set_ylabel("Stoney error [%]")
    ax.set_title(title, fontsize=10, y=1.0, pad=5)
    ax.legend(fontsize=7, loc="best", frameon=False)
    ax.grid(True, which="both", lw=0.3, alpha=0.5)
    return figure
