"""Figure of an adhesive bond: end stresses against one joint parameter."""
from __future__ import annotations

from typing import TYPE_CHECKING

import numpy as np
from matplotlib.figure import Figure
from .canvas import PALETTE, axis_label, axis_unit, target

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.axes import Axes


__all__ = ["parameter_sweep"]


# --------------------------------------------------------------------------------------------
# Adhesive bonds: end stresses against one joint parameter

_SWEEP_KINDS = {"bond_line": ("bond-line thickness", "length"), "overlap": ("overlap length", "length"),
                "adhesive_modulus": ("adhesive Young's modulus", "modulus")}


def parameter_sweep(
    parameter: str,
    values: np.ndarray,
    end_shear: np.ndarray,
    max_peel: np.ndarray | None = None,
    system: str = "si",
    ax: "Axes | None" = None,
    current: float | None = None,
    allowable_shear: float | None = None,
    allowable_peel: float | None = None,
    title: str = "",
) -> Figure:
    """|End shear| (solid) and largest tensile peel (dashed) against a swept joint parameter
    ("bond_line", "overlap" or "adhesive_modulus"), with allowables as dotted lines and the current
    value as a vertical line."""
    figure, ax = target(ax, 3.2)
    name, kind = _SWEEP_KINDS[parameter]
    v = np.asarray(values, float)
    unit = axis_unit(kind, system, float(np.max(np.abs(v))))
    every = np.concatenate([np.abs(end_shear), [] if max_peel is None else np.asarray(max_peel, float)])
    finite = every[np.isfinite(every)]
    peak = float(finite.max()) if finite.size else 0.0
    s_unit = axis_unit("stress", system, peak if peak > 0 else None)
    ax.plot(unit(v), s_unit(np.abs(end_shear)), "o-", color=PALETTE[0], lw=1.8, ms=4, label="|end shear|")
    if max_peel is not None and np.any(np.isfinite(max_peel)):
        ax.plot(unit(v), s_unit(max_peel), "s--", color=PALETTE[5], lw=1.4, ms=4, label="largest tensile peel")
    for value, colour, label in ((allowable_shear, PALETTE[0], "allowable shear"),
                                 (allowable_peel, PALETTE[5], "allowable peel")):
        if value is not None:
            ax.axhline(float(s_unit(value)), color=colour, ls=":", lw=1.0, label=label)
    if current is not None:
        ax.axvline(float(unit(current)), color="0.5", lw=0.8, label="this design")
    if v.size > 1 and v.max() / v.min() > 20:
        ax.set_xscale("log")
    ax.set_xlabel(axis_label(name, unit))
    ax.set_ylabel(axis_label("stress at the joint end", s_unit))
    ax.set_title(title or f"End stresses against the {name}", fontsize=10, y=1.0, pad=5)
    ax.legend(fontsize=7, loc="best", frameon=False)
    ax.grid(True, lw=0.3, alpha=0.6)
    return figure
