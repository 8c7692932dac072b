"""Figures of the stack engine's results: stress through the thickness, the deflected shape, curvature
against peak interface stress over the thickness ratio, and the sign-convention sketch."""
from __future__ import annotations

from typing import TYPE_CHECKING

import numpy as np
from matplotlib.figure import Figure
from matplotlib.patches import FancyArrowPatch, Rectangle

from ..core.sagitta import arc_shape
from .canvas import (
    PALETTE,
    axis_label,
    axis_unit,
    layer_values,
    mark_dynamic,
    material_colours,
    padded,
    remember,
    reusable,
    scalar_case,
    spread,
    sticky_limits,
    target,
    temperature_text,
)

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.axes import Axes

    from ..core.results import StackResult

__all__ = ["stress_through_thickness", "deflected_shape", "thickness_ratio_tradeoff", "sign_convention_sketch"]


# --------------------------------------------------------------------------------------------
# Stress through the thickness


MIN_LAYER_SHARE = 0.1
"""Smallest share of the plot height a layer is given when the axis is not to scale."""


def _display_heights(bottoms: np.ndarray, tops: np.ndarray) -> tuple[np.ndarray, bool]:
    """Plot coordinates of the layer faces: true heights, or, when a layer would be thinner than
    MIN_LAYER_SHARE / 2 of the plot, a piecewise-linear axis on which every layer gets at least
    MIN_LAYER_SHARE. Inside each layer the map is linear, so the linear stress stays a straight line."""
    thickness = tops - bottoms
    total = float(tops[-1])
    share = thickness / total
    if share.min() >= 0.5 * MIN_LAYER_SHARE or len(share) == 1:
        return np.concatenate([[0.0], tops]), True
    shown = np.maximum(share, MIN_LAYER_SHARE)
    shown = shown / shown.sum() * total
    return np.concatenate([[0.0], np.cumsum(shown)]), False


def stress_through_thickness(
    result: "StackResult",
    system: str = "si",
    ax: "Axes | None" = None,
    index: int | None = None,
    title: str | None = None,
) -> Figure:
    """sigma_x through the thickness at a section far from the ends, layers shaded and named.

    The stress is linear inside each layer and jumps at every interface (sigma = Y (eps(z) - f)).
    When one layer is much thinner than the stack (a film on a substrate) the height axis is drawn
    piecewise so every layer stays visible; its ticks then mark the true interface heights and a
    note says the axis is not to scale. ``index`` picks one operating temperature when the result
    holds several. Redrawing into the same axes updates the existing artists in place.
    """
    kappa = scalar_case(result.curvature, index, "temperature")
    s_bottom = layer_values(result.stress_bottom, index)
    s_top = layer_values(result.stress_top, index)
    bottoms, tops = np.asarray(result.layer_bottom, float), np.asarray(result.layer_top, float)
    n = result.n_layers
    height = float(tops[-1])
    faces, to_scale = _display_heights(bottoms, tops)
    z_unit = axis_unit("length", system, height)
    peak = float(np.max(np.abs(np.concatenate([s_bottom, s_top])))) if s_bottom.size else 0.0
    s_unit = axis_unit("stress", system, peak if peak > 0 else None)
    colours = [material_colours(result.materials)[m] for m in result.materials]
    v = z_unit(faces)  # plot coordinates of the faces, in display length units
    z_line = np.repeat(v, 2)[1:-1]
    s_line = s_unit(np.column_stack([s_bottom, s_top]).ravel())
    centres = 0.5 * (v[:-1] + v[1:]) / v[-1]
    placed = spread(list(centres), 0.04, 0.96, 0.11 if n <= 8 else 0.9 / n)
    names = []
    for i in range(n):
        t_unit = axis_unit("length", system, result.thicknesses[i])
        names.append(f"{i + 1}: {result.labels[i]}, {float(t_unit(result.thicknesses[i])):.4g} {t_unit.label}")
    state = getattr(result.state, "value", str(result.state))
    k_unit = axis_unit("curvature", system)
    operating = scalar_case(result.operating_temperature, index, "temperature")
    heading = title if title is not None else (
        f"Stress through the thickness at {temperature_text(operating, system)} ({state} state), "
        f"κ = {float(k_unit(kappa)):.4g} {k_unit.label}"
    )

    key = ("stress", n, to_scale)
    art = reusable(ax, key)
    if art is None:
        figure, ax = target(ax, 3.6)
        spans = [ax.axhspan(v[i], v[i + 1], color=colours[i], alpha=0.3, lw=0) for i in range(n)]
        joints = [ax.axhline(face, color="0.35", lw=0.6) for face in v[1:-1]]
        ax.axvline(0.0, color="0.2", lw=0.8)
        (line,) = ax.plot(s_line, z_line, color="black", lw=1.8)
        # Layer names in the right margin, spread apart, with plain leader lines (cheaper to draw
        # than annotation arrows).
        tags = [
            ax.text(1.04, placed[i], names[i], transform=ax.transAxes, va="center", ha="left", fontsize=8,
                    bbox={"boxstyle": "round,pad=0.2", "fc": colours[i], "alpha": 0.35, "lw": 0}, clip_on=False)
            for i in range(n)
        ]
        leaders = [
            ax.plot([1.0, 1.04], [centres[i], placed[i]], transform=ax.transAxes, color="0.4", lw=0.6,
                    clip_on=False)[0]
            for i in range(n)
        ]
        ax.grid(True, axis="x", lw=0.3, alpha=0.6)
        art = remember(ax, key, spans=spans, joints=joints, line=line, tags=tags, leaders=leaders)
        current_xlim = None
    else:
        current_xlim = ax.get_xlim()
        figure = ax.figure
        for i, span in enumerate(art["spans"]):
            span.set_y(v[i])
            span.set_height(v[i + 1] - v[i])
            span.set_facecolor(colours[i])
            span.set_alpha(0.3)
        for joint, face in zip(art["joints"], v[1:-1]):
            joint.set_ydata([face, face])
        art["line"].set_data(s_line, z_line)
        for i, (tag, leader) in enumerate(zip(art["tags"], art["leaders"])):
            tag.set_text(names[i])
            tag.set_y(placed[i])
            tag.get_bbox_patch().set_facecolor(colours[i])
            tag.get_bbox_patch().set_alpha(0.35)
            leader.set_ydata([centres[i], placed[i]])
    ax.set_xlim(*sticky_limits(current_xlim, min(0.0, float(np.min(s_line))), max(0.0, float(np.max(s_line)))))
    ax.set_ylim(0.0, v[-1])
    if not to_scale:
        ax.set_yticks(v, [f"{float(z_unit(z)):.4g}" for z in np.concatenate([[0.0], tops])], fontsize=7)
    ax.set_xlabel(axis_label("stress σx (tension > 0)", s_unit))
    ax.set_ylabel(axis_label("height z above bottom" if to_scale else "height z, not to scale", z_unit))
    ax.set_title(heading, fontsize=10, y=1.0, pad=5)
    mark_dynamic(ax, [art["line"], ax.title], tuple(names), tuple(colours), tuple(placed), tuple(v))
    return figure


# --------------------------------------------------------------------------------------------
# Deflected shape


def deflected_shape(
    result: "StackResult",
    length: float,
    support: str = "cantilever",
    system: str = "si",
    ax: "Axes | None" = None,
    index: int | None = None,
) -> Figure:
    """The strip's centre line before (flat, dashed) and after the temperature change (solid).

    Exact arc for uniform curvature; the tip (cantilever) or edge (held at the centre) deflection
    is annotated beside its small-deflection value -kappa L^2/2 (or -kappa L^2/8). The strip is
    drawn as two bands, bottom layer below and top layer above the centre line. The vertical axis
    is stretched when the deflection is small compared with the length (a note says so).
    Redrawing into the same axes updates the existing artists in place.
    """
    from matplotlib.transforms import offset_copy

    kappa = scalar_case(result.curvature, index, "temperature")
    x, w = arc_shape(kappa, length, support)
    x_unit = axis_unit("length", system, length)
    colours = material_colours(result.materials)
    top_colour, bottom_colour = colours[result.materials[-1]], colours[result.materials[0]]
    flat = np.array([0.0, length]) if support == "cantilever" else np.array([-0.5, 0.5]) * length
    free = temperature_text(result.stress_free_temperature, system)
    labels = (f"flat at {free} (stress-free)", f"top: {result.labels[-1]}", f"bottom: {result.labels[0]}",
              "clamp" if support == "cantilever" else "held at centre")
    if support == "cantilever":
        end, small, where = w[-1], -0.5 * kappa * length**2, "tip"
    else:
        end, small, where = w[-1], -kappa * length**2 / 8.0, "edge"
    T = scalar_case(result.operating_temperature, index, "temperature")
    heading = f"Deflected shape at {temperature_text(T, system)}"
    span = abs(end) if abs(end) > 1e-9 * length else 1e-3 * length
    w_unit = axis_unit("length", system, float(np.max(np.abs(w))) or None)
    note = (f"{where} deflection {float(w_unit(end)):+.4g} {w_unit.label} "
            f"(small-deflection formula {float(w_unit(small)):+.4g})")
    if 1.7 * span < 0.2 * length:
        note += "; vertical scale stretched"

    key = ("shape", support, w_unit.label)
    art = reusable(ax, key)
    if art is None:
        figure, ax = target(ax, 3.2)
        above = offset_copy(ax.transData, fig=figure, y=1.6, units="points")
        below = offset_copy(ax.transData, fig=figure, y=-1.6, units="points")
        (reference,) = ax.plot(x_unit(flat), [0.0, 0.0], ls="--", color="0.5", lw=1.0)
        (top,) = ax.plot(x_unit(x), w_unit(w), color=top_colour, lw=3.2, transform=above)
        (bottom,) = ax.plot(x_unit(x), w_unit(w), color=bottom_colour, lw=3.2, transform=below)
        (holder,) = ax.plot([0.0], [0.0], marker="s" if support == "cantilever" else "^", color="0.3", ms=8, ls="")
        text = ax.text(0.99, 0.97, "", transform=ax.transAxes, fontsize=8, ha="right",
                       bbox={"fc": "white", "alpha": 0.85, "lw": 0})
        ax.grid(True, lw=0.3, alpha=0.6)
        art = remember(ax, key, reference=reference, top=top, bottom=bottom, holder=holder, text=text)
        current_ylim = None
    else:
        figure = ax.figure
        current_ylim = ax.get_ylim()
        art["reference"].set_xdata(x_unit(flat))
        for name, colour in (("top", top_colour), ("bottom", bottom_colour)):
            art[name].set_data(x_unit(x), w_unit(w))
            art[name].set_color(colour)
    ax.set_xlim(*padded(*x_unit(flat)))  # the flat length: steady while the arc shortens its chord
    shown_w = w_unit(w)
    low, high = float(min(0.0, shown_w.min())), float(max(0.0, shown_w.max()))
    ax.set_ylim(*sticky_limits(current_ylim, low - 0.3 * (high - low), high + 0.3 * (high - low), share=0.5))
    art["text"].set_text(note)
    art["text"].set_y(0.97 if end <= 0 else 0.03)
    art["text"].set_va("top" if end <= 0 else "bottom")
    legend_key = (labels, end <= 0)
    if art.get("legend_key") != legend_key:
        place = ("lower " if end <= 0 else "upper ") + ("left" if support == "cantilever" else "center")
        ax.legend([art["reference"], art["top"], art["bottom"], art["holder"]], labels, fontsize=7, loc=place,
                  frameon=False)
        art["legend_key"] = legend_key
    ax.set_xlabel(axis_label(f"position x along the strip (exact arc of length {float(x_unit(length)):.4g} "
                              f"{x_unit.label})", x_unit))
    ax.set_ylabel(axis_label("deflection w (up > 0)", w_unit))
    ax.set_title(heading, fontsize=10, y=1.0, pad=5)
    mark_dynamic(ax, [art["top"], art["bottom"], art["text"], ax.title], labels, top_colour, bottom_colour,
                  end <= 0, tuple(x_unit(flat)))
    return figure


# --------------------------------------------------------------------------------------------
# Curvature against peak interface stress over the thickness ratio


def thickness_ratio_tradeoff(
    ratio: np.ndarray,
    curvature: np.ndarray,
    peak_stress: np.ndarray,
    current_ratio: float,
    current_curvature: float,
    current_peak_stress: float,
    system: str = "si",
    ax: "Axes | None" = None,
    ratio_label: str = "thickness ratio t_bottom / t_top",
    stress_label: str = "peak interface shear |τ|",
    best_ratio: float | None = None,
) -> Figure:
    """Curvature (left axis) and peak interface stress (right axis) against the thickness ratio.

    The ratio axis is logarithmic; the current design is marked on both curves and, if given, the
    ratio of largest curvature is drawn as a dotted line.
    """
    k_unit = axis_unit("curvature", system)
    peak = float(np.nanmax(np.abs(peak_stress))) if np.size(peak_stress) else 0.0
    s_unit = axis_unit("stress", system, peak if peak > 0 else None)
    key = ("tradeoff", k_unit.label, s_unit.label, ratio_label, stress_label, np.size(ratio))
    art = reusable(ax, key)
    if art is None:
        figure, ax = target(ax, 3.4)
        for other in list(figure.axes):
            if other is not ax and getattr(other, "_bilayer_twin_of", None) is ax:
                other.remove()
        k_colour, s_colour = "#0072B2", "#D55E00"
        (k_line,) = ax.plot(ratio, k_unit(curvature), color=k_colour, lw=1.8)
        (k_mark,) = ax.plot([current_ratio], [k_unit(current_curvature)], "o", color=k_colour, ms=7, mec="black",
                            label="current design")
        ax.set_xscale("log")
        ax.set_xlabel(ratio_label)
        ax.set_ylabel(axis_label("curvature κ", k_unit), color=k_colour)
        ax.tick_params(axis="y", colors=k_colour)
        twin = ax.twinx()
        twin._bilayer_twin_of = ax  # so a fresh drawing into the same axes removes the old twin
        (s_line,) = twin.plot(ratio, s_unit(peak_stress), color=s_colour, lw=1.8, ls="-.")
        (s_mark,) = twin.plot([current_ratio], [s_unit(current_peak_stress)], "s", color=s_colour, ms=7, mec="black")
        twin.set_ylabel(axis_label(stress_label, s_unit), color=s_colour)
        twin.tick_params(axis="y", colors=s_colour)
        best_line = ax.axvline(current_ratio, color="0.4", ls=":", lw=1.0)
        best_text = ax.text(current_ratio, 0.02, "", transform=ax.get_xaxis_transform(), fontsize=7, color="0.3")
        current_line = ax.axvline(current_ratio, color="0.6", lw=0.6)
        ax.set_title("Curvature and peak interface stress against thickness ratio (total thickness fixed)", fontsize=9)
        ax.legend(fontsize=7, loc="upper right", frameon=False)
        ax.grid(True, which="major", lw=0.3, alpha=0.6)
        art = remember(ax, key, twin=twin, k_line=k_line, k_mark=k_mark, s_line=s_line, s_mark=s_mark,
                        best_line=best_line, best_text=best_text, current_line=current_line)
    else:  # same structure: update the artists in place (no new axes, no new ticks)
        figure = ax.figure
        art["k_line"].set_data(ratio, k_unit(curvature))
        art["k_mark"].set_data([current_ratio], [k_unit(current_curvature)])
        art["s_line"].set_data(ratio, s_unit(peak_stress))
        art["s_mark"].set_data([current_ratio], [s_unit(current_peak_stress)])
        art["current_line"].set_xdata([current_ratio] * 2)
    show_best = best_ratio is not None and bool(np.isfinite(best_ratio))
    art["best_line"].set_visible(show_best)
    art["best_text"].set_visible(show_best)
    art["best_line"].set_xdata([best_ratio if show_best else current_ratio] * 2)
    if show_best:
        art["best_text"].set_x(best_ratio)
        art["best_text"].set_text(f" largest κ at {best_ratio:.3g}")
    # fixed ratio range and sticky value ranges: a small change redraws only the curves (blitting)
    twin = art["twin"]
    ax.set_xlim(float(np.min(ratio)), float(np.max(ratio)))
    k_values = np.append(k_unit(curvature), k_unit(current_curvature))
    s_values = np.append(s_unit(peak_stress), s_unit(current_peak_stress))
    first_draw = not art.get("drawn", False)
    for axes, values in ((ax, k_values), (twin, s_values)):
        current = None if first_draw else axes.get_ylim()
        axes.set_ylim(*sticky_limits(current, float(np.nanmin(values)), float(np.nanmax(values)), share=0.5, pad=0.2))
    art["drawn"] = True
    mark_dynamic(ax, [art["k_line"], art["k_mark"], art["s_line"], art["s_mark"], art["current_line"],
                       art["best_line"], art["best_text"]],
                  twin.get_ylim(), tuple(twin.get_yticks()), twin.get_ylabel())
    return figure


# --------------------------------------------------------------------------------------------
# Sign convention sketch


def sign_convention_sketch(ax: "Axes | None" = None) -> Figure:
    """A sketch of the project's conventions: numbering, z axis, kappa > 0, tension > 0, Delta T."""
    from matplotlib.patches import Polygon

    figure, ax = target(ax, 2.7)
    ax.set_xlim(0, 10)
    ax.set_ylim(0, 4.3)
    ax.set_aspect("equal")
    ax.axis("off")
    blue, orange = PALETTE[0], PALETTE[1]
    ax.text(5.0, 4.0, "ΔT = T_operating − T_stress-free   (cooling after bonding gives ΔT < 0)", ha="center", fontsize=8)
    # Flat stack: numbering and axes.
    ax.add_patch(Rectangle((0.6, 0.9), 3.0, 0.45, fc=blue, alpha=0.35, ec="0.3"))
    ax.add_patch(Rectangle((0.6, 1.35), 3.0, 0.45, fc=orange, alpha=0.35, ec="0.3"))
    ax.text(2.1, 1.12, "layer 1 (bottom)", ha="center", va="center", fontsize=7)
    ax.text(2.1, 1.57, "layer 2", ha="center", va="center", fontsize=7)
    ax.add_patch(FancyArrowPatch((0.6, 0.9), (0.6, 2.7), arrowstyle="-|>", mutation_scale=10, color="black"))
    ax.add_patch(FancyArrowPatch((0.6, 0.9), (4.2, 0.9), arrowstyle="-|>", mutation_scale=10, color="black"))
    ax.text(0.45, 2.7, "z", ha="right", va="top", fontsize=9)
    ax.text(4.2, 0.75, "x", ha="right", va="top", fontsize=9)
    ax.text(0.45, 0.9, "0", ha="right", va="center", fontsize=7)
    ax.text(2.1, 3.05, "z upward from the bottom face,\nlayers numbered from the bottom", ha="center", fontsize=7)
    # Tension positive.
    ax.add_patch(Rectangle((4.75, 2.55), 0.5, 0.3, fc="white", ec="black", lw=0.8))
    ax.add_patch(FancyArrowPatch((4.75, 2.7), (4.3, 2.7), arrowstyle="-|>", mutation_scale=8))
    ax.add_patch(FancyArrowPatch((5.25, 2.7), (5.7, 2.7), arrowstyle="-|>", mutation_scale=8))
    ax.text(5.0, 2.2, "σ > 0: tension", ha="center", fontsize=7)
    # Positive curvature: the top face is the longer one, the centre of curvature lies below.
    cx, cy, r0, t = 7.9, -2.2, 4.0, 0.35
    theta = np.linspace(np.radians(70), np.radians(110), 50)
    for k, colour in enumerate((blue, orange)):
        inner, outer = r0 + k * t, r0 + (k + 1) * t
        ring = np.concatenate([np.c_[cx + inner * np.cos(theta), cy + inner * np.sin(theta)],
                               np.c_[cx + outer * np.cos(theta[::-1]), cy + outer * np.sin(theta[::-1])]])
        ax.add_patch(Polygon(ring, closed=True, fc=colour, alpha=0.35, ec="0.3"))
    top = r0 + 2 * t
    ax.plot(cx + top * np.cos(theta), cy + top * np.sin(theta), color="black", lw=1.6)
    for angle in theta[[0, -1]]:
        ax.plot([cx + r0 * np.cos(angle), cx + 1.3 * np.cos(angle)], [cy + r0 * np.sin(angle), cy + 1.3 * np.sin(angle)],
                ls=":", color="0.4", lw=0.8)
    ax.text(cx, cy + top + 0.2, "κ > 0: top face longer (convex)", ha="center", fontsize=8)
    ax.text(cx, 0.15, "radii meet at the centre of curvature, below", ha="center", fontsize=7, color="0.3")
    return figure
