"""Figures of stresses along the strip: interface shear and peel, closed forms against the FE check."""
from __future__ import annotations

from typing import TYPE_CHECKING, Mapping

import numpy as np
from matplotlib.figure import Figure
from .canvas import (
    PALETTE,
    axis_label,
    axis_unit,
    mark_dynamic,
    material_colours,
    new_figure,
    remember,
    reusable,
    sticky_limits,
    target,
)

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.axes import Axes


__all__ = ["interface_stresses", "closed_form_against_fe"]


# --------------------------------------------------------------------------------------------
# Interface shear and peel along the length


def interface_stresses(
    distance: np.ndarray,
    shear: Mapping[str, np.ndarray],
    peel: Mapping[str, np.ndarray] | None = None,
    system: str = "si",
    ax: "Axes | None" = None,
    title: str = "Interface stresses near a free end",
    note: str = "",
    decay_length: float | None = None,
) -> Figure:
    """Interfacial shear tau (solid) and peel sigma_z (dashed) against the distance from a free end.

    ``distance`` [m] runs from the free end (0) inward; ``shear`` and ``peel`` map an interface name
    to its profile [Pa] at those distances. Shear is the traction on the top face of the part below,
    positive in +x (toward the right end); peel > 0 is tension across the interface. A dotted line
    marks three decay lengths 3/k, where the layer force has reached 95 % of its long-strip value.
    Values within about one thickness of the end are model values (the real corner field is singular).
    """
    d = np.asarray(distance, float)
    every = [np.asarray(v, float) for v in shear.values()] + [np.asarray(v, float) for v in (peel or {}).values()]
    low = min((float(np.nanmin(v)) for v in every if v.size), default=0.0)
    high = max((float(np.nanmax(v)) for v in every if v.size), default=0.0)
    peak = max(abs(low), abs(high))
    s_unit = axis_unit("stress", system, peak if peak > 0 else None)
    d_unit = axis_unit("length", system, float(np.max(d)) if d.size else None)
    names = list(shear) + [k for k in (peel or {}) if k not in shear]
    curves = [(name, "shear") for name in names if name in shear] + [
        (name, "peel") for name in names if peel and name in peel]
    key = ("interface", tuple(curves), s_unit.label, d_unit.label, d.size)
    art = reusable(ax, key)
    if art is None:
        figure, ax = target(ax, 3.4)
        lines = {}
        for k, name in enumerate(names):
            colour = PALETTE[(k * 5) % len(PALETTE)]
            if name in shear:
                lines[name, "shear"] = ax.plot(d_unit(d), s_unit(shear[name]), color=colour, lw=1.8,
                                               label=f"shear τ, {name}")[0]
            if peel and name in peel:
                lines[name, "peel"] = ax.plot(d_unit(d), s_unit(peel[name]), color=colour, lw=1.4, ls="--",
                                              label=f"peel σz, {name}")[0]
        ax.axhline(0.0, color="0.2", lw=0.8)
        marker = ax.axvline(0.0, color="0.4", ls=":", lw=1.0, visible=False)
        marker_text = ax.text(0.0, 0.97, " 3/k", transform=ax.get_xaxis_transform(), fontsize=7, color="0.3",
                              va="top", visible=False)
        note_text = ax.text(0.01, 0.02, "", transform=ax.transAxes, ha="left", va="bottom", fontsize=7, color="0.3")
        ax.legend(fontsize=7, loc="upper left", frameon=False)
        ax.grid(True, lw=0.3, alpha=0.6)
        art = remember(ax, key, lines=lines, marker=marker, marker_text=marker_text, note=note_text)
        current = None
    else:
        figure = ax.figure
        for (name, what), line in art["lines"].items():
            line.set_data(d_unit(d), s_unit((shear if what == "shear" else peel)[name]))
        current = ax.get_ylim()
    show_marker = decay_length is not None and d.size > 0 and 3 * decay_length < d.max()
    art["marker"].set_visible(show_marker)
    art["marker_text"].set_visible(show_marker)
    if show_marker:
        art["marker"].set_xdata([float(d_unit(3 * decay_length))] * 2)
        art["marker_text"].set_x(float(d_unit(3 * decay_length)))
    art["note"].set_text(note)
    ax.set_xlabel(axis_label("distance from the free end", d_unit))
    ax.set_ylabel(axis_label("interface stress", s_unit))
    ax.set_title(title, fontsize=10, y=1.0, pad=5)
    if d.size:
        ax.set_xlim(float(d_unit(d.max())), 0.0)  # the free end on the right, as on the strip
    span = (high - low) or 1.0
    ax.set_ylim(*sticky_limits(current, float(s_unit(min(low, 0.0) - 0.08 * span)),
                                float(s_unit(max(high, 0.0) + 0.08 * span)), share=0.5, pad=0.1))
    mark_dynamic(ax, [*art["lines"].values(), ax.title], note, show_marker and float(d_unit(3 * decay_length)))
    return figure


# --------------------------------------------------------------------------------------------
# Closed forms against the finite-element check


def closed_form_against_fe(trust, system: str = "si", figure: Figure | None = None) -> Figure:
    """Two panels from a :class:`bilayer.strip.fe_comparison.TrustReport`: sigma_x through the thickness at mid-length
    (closed form as lines, FE as dots) and interface shear and peel near the right-hand end (closed form
    as lines, FE Gauss-point profiles as dots). ``figure`` is cleared and reused when given."""
    if figure is None:
        figure = new_figure(3.6)
    else:
        figure.clear()
        figure.__dict__.pop("_bilayer_artists", None)
    left, right = figure.subplots(1, 2, gridspec_kw={"width_ratios": [1, 1.4]})
    engine, fe, interface = trust.engine, trust.fe, trust.interface
    H = float(np.sum(fe.thicknesses))
    z_unit = axis_unit("length", system, H)
    every = np.concatenate([np.ravel(engine.stress_bottom), np.ravel(engine.stress_top), np.ravel(fe.stress)])
    s_unit = axis_unit("stress", system, float(np.max(np.abs(every))) or None)
    colours = material_colours(engine.materials)
    for i in range(engine.n_layers):
        left.axhspan(float(z_unit(engine.layer_bottom[i])), float(z_unit(engine.layer_top[i])),
                     color=colours[engine.materials[i]], alpha=0.3, lw=0)
        left.plot(s_unit([engine.stress_bottom[i], engine.stress_top[i]]),
                  z_unit([engine.layer_bottom[i], engine.layer_top[i]]), color="black", lw=1.6,
                  label="closed form" if i == 0 else None)
    left.plot(s_unit(fe.stress), z_unit(fe.z), "o", color=PALETTE[5], ms=3, label=f"FE ({fe.plane})")
    left.axvline(0.0, color="0.3", lw=0.6)
    left.set_ylim(0, float(z_unit(H)))
    left.set_xlabel(axis_label("σx at mid-length", s_unit))
    left.set_ylabel(axis_label("height z", z_unit))
    left.legend(fontsize=7, loc="best", frameon=False)
    left.set_title("Through the thickness", fontsize=9)
    half = 0.5 * fe.length
    zone = min(half, 10.0 * max(p.parameters.decay_length for p in interface.interfaces))
    d = zone * np.linspace(0.0, 1.0, 201) ** 1.5
    d_unit = axis_unit("length", system, zone)
    sampled = interface.sample(d, end="right")
    fe_values = [np.concatenate([np.ravel(i.shear_profile), np.ravel(i.peel_profile)]) for i in fe.interfaces]
    peak = max([float(np.max(np.abs(s[1]))) for s in sampled] + [float(np.max(np.abs(v))) for v in fe_values if v.size])
    t_unit = axis_unit("stress", system, peak or None)
    for k, ((_, shear, peel), fe_interface) in enumerate(zip(sampled, fe.interfaces)):
        colour = PALETTE[(k * 5) % len(PALETTE)]
        right.plot(d_unit(d), t_unit(shear), color=colour, lw=1.6, label=f"shear τ, interface {k + 1}")
        if peel is not None:
            right.plot(d_unit(d), t_unit(peel), color=colour, lw=1.2, ls="--", label=f"peel σz, interface {k + 1}")
        x = np.asarray(fe_interface.x, float)
        near = np.flatnonzero((x > half) & (fe.length - x <= zone))
        near = near[:: max(1, near.size // 40)]  # about 40 FE points per curve, so the lines stay visible
        right.plot(d_unit(fe.length - x[near]), t_unit(np.asarray(fe_interface.shear_profile)[near]), "o",
                   color="black", mfc=colour, ms=3.5, mew=0.4, ls="", label=f"FE shear, interface {k + 1}")
        right.plot(d_unit(fe.length - x[near]), t_unit(np.asarray(fe_interface.peel_profile)[near]), "^",
                   color="black", mfc="white", ms=3.5, mew=0.6, ls="", label=f"FE peel, interface {k + 1}")
    right.axhline(0.0, color="0.3", lw=0.6)
    right.set_xlim(float(d_unit(zone)), 0.0)
    right.set_xlabel(axis_label("distance from the free end", d_unit))
    right.set_ylabel(axis_label("interface stress", t_unit))
    right.legend(fontsize=6, loc="best", frameon=False)
    right.set_title("Near the right-hand end (corner values are nominal)", fontsize=9)
    for ax in (left, right):
        ax.grid(True, lw=0.3, alpha=0.5)
    figure.suptitle(f"Closed forms against the 2-D finite-element check ({fe.plane}, {fe.dofs} dofs)", fontsize=10)
    return figure
