"""Figure of a thermostat element: travel against temperature."""
from __future__ import annotations

from typing import TYPE_CHECKING

import numpy as np
from matplotlib.figure import Figure
from .canvas import PALETTE, axis_label, axis_unit, target

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.axes import Axes


__all__ = ["travel_curve"]


# --------------------------------------------------------------------------------------------
# Thermostat element: travel against temperature


def travel_curve(
    temperatures: np.ndarray,
    travel: np.ndarray,
    travel_small: np.ndarray | None = None,
    unit: str = "m",
    system: str = "si",
    ax: "Axes | None" = None,
    contact: float | None = None,
    set_point: float | None = None,
    reference: float | None = None,
    title: str = "Travel of the working point against temperature",
) -> Figure:
    """Travel (along the strip's top-face normal at the clamp, + toward the top face) against temperature.

    Exact arc kinematics solid, the small-deflection value dashed. ``unit`` "m" for a travel, "rad" for
    the rotation of a coil (shown in degrees). ``contact`` draws the contact position (signed travel at
    which the gap closes), ``set_point`` the closing temperature, ``reference`` the temperature at which
    the shape and gap are given.
    """
    figure, ax = target(ax, 3.4)
    t_unit = axis_unit("temperature", system)
    T = t_unit(np.asarray(temperatures, float))
    if unit == "rad":
        y_unit = axis_unit("angle", system)
        name = "rotation of the free end"
    else:
        extent = max(float(np.max(np.abs(travel))), abs(contact or 0.0))
        y_unit = axis_unit("length", system, extent if extent > 0 else None)
        name = "travel of the working point"
    ax.plot(T, y_unit(travel), color=PALETTE[0], lw=2.0, label="exact arc kinematics")
    if travel_small is not None:
        ax.plot(T, y_unit(travel_small), color=PALETTE[5], lw=1.2, ls="--", label="small-deflection formula")
    ax.axhline(0.0, color="0.3", lw=0.7)
    if contact is not None:
        ax.axhline(float(y_unit(contact)), color="0.2", ls=":", lw=1.2, label="contact")
    if reference is not None:
        ax.axvline(float(t_unit(reference)), color="0.6", lw=0.8)
        ax.text(float(t_unit(reference)), 0.02, " reference", transform=ax.get_xaxis_transform(), fontsize=7,
                color="0.4")
    if set_point is not None:
        x = float(t_unit(set_point))
        ax.axvline(x, color=PALETTE[2], lw=1.0)
        if contact is not None:
            ax.plot([x], [float(y_unit(contact))], "o", color=PALETTE[2], mec="black", ms=7,
                    label=f"closes at {x:.4g} {t_unit.label}")
    ax.set_xlabel(axis_label("temperature", t_unit))
    ax.set_ylabel(axis_label(name, y_unit))
    ax.set_title(title, fontsize=10, y=1.0, pad=5)
    ax.legend(fontsize=7, loc="best", frameon=False)
    ax.grid(True, lw=0.3, alpha=0.6)
    return figure
