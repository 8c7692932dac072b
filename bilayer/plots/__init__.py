"""Figures of stack results: pure functions, no pyplot global state.

Every function takes results (and display choices) and either returns a new
:class:`matplotlib.figure.Figure` or, when ``ax`` is given, clears that axes and draws into it in
place (the panels redraw this way). Nothing here computes mechanics: curves come from the engine's
results or from the interface model's profiles.

Conventions drawn (see :mod:`bilayer.core.stack`): layers numbered from the bottom, z upward from the
bottom face, curvature kappa > 0 when the top face is the longer one (centre of curvature below),
stress positive in tension.

Display systems: ``"si"`` (mm or um, MPa, degC, 1/m) and ``"us"`` (in or mil, ksi or psi, degF,
1/in). Each material keeps one colour in every view (:func:`material_colours`).
"""
from __future__ import annotations

import math
from functools import lru_cache
import zlib
from dataclasses import dataclass
from typing import TYPE_CHECKING, Mapping, Sequence

import numpy as np
from matplotlib.figure import Figure
from matplotlib.patches import FancyArrowPatch, Rectangle

from ..core.errors import InputError

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.axes import Axes

    from ..core.results import StackResult

__all__ = [
    "SYSTEMS",
    "AxisUnit",
    "axis_unit",
    "material_colours",
    "stress_through_thickness",
    "deflected_shape",
    "interface_stresses",
    "thickness_ratio_tradeoff",
    "sign_convention_sketch",
    "travel_curve",
    "weibull_failures",
    "stoney_error_curve",
    "parameter_sweep",
    "closed_form_against_fe",
    "new_figure",
]

SYSTEMS = ("si", "us")

# A fixed, colour-blind-friendly palette (Okabe & Ito 2008 plus neutral tones); a material's colour
# is chosen by a stable hash of its name, so it is the same in every view and every session.
PALETTE = (
    "#0072B2",  # blue
    "#E69F00",  # orange
    "#009E73",  # green
    "#CC79A7",  # purple-pink
    "#56B4E9",  # sky blue
    "#D55E00",  # vermillion
    "#F0E442",  # yellow
    "#7F7F7F",  # grey
    "#8C564B",  # brown
    "#332288",  # indigo
    "#88CCEE",  # cyan
    "#117733",  # dark green
)

FIGURE_WIDTH = 7.0  # inches; fits a notebook cell at 100 dpi
FIGURE_DPI = 90


# --------------------------------------------------------------------------------------------
# Units on axes


@dataclass(frozen=True)
class AxisUnit:
    """A display unit for one axis: shown = value_si * factor + offset."""

    label: str
    factor: float
    offset: float = 0.0

    def __call__(self, value_si):
        return np.asarray(value_si, float) * self.factor + self.offset


def _axis(shown_label: str, kind: str, unit: str) -> AxisUnit:
    """The display unit ``unit`` of bilayer.core.units as an axis map, labelled ``shown_label``."""
    from ..core import units

    if kind == "temperature":  # shown = T * scale + offset; the scale is that of a difference
        delta = {"degC": "K", "degF": "delta_degF"}[unit]
        return AxisUnit(shown_label, units.from_si(1.0, "temperature_difference", delta),
                        units.from_si(0.0, "temperature", unit))
    return AxisUnit(shown_label, units.from_si(1.0, kind, unit))


_AXES = {  # axis kind -> (shown label, bilayer.core.units kind, unit) per system
    "si": {
        "length": ("mm", "length", "mm"),
        "small_length": ("µm", "length", "um"),
        "stress": ("MPa", "stress", "MPa"),
        "small_stress": ("kPa", "stress", "kPa"),
        "modulus": ("GPa", "stress", "GPa"),
        "curvature": ("1/m", "curvature", "1/m"),
        "temperature": ("°C", "temperature", "degC"),
        "temperature_difference": ("K", "temperature_difference", "K"),
    },
    "us": {
        "length": ("in", "length", "in"),
        "small_length": ("mil", "length", "mil"),
        "stress": ("ksi", "stress", "ksi"),
        "small_stress": ("psi", "stress", "psi"),
        "modulus": ("Msi", "stress", "Msi"),
        "curvature": ("1/in", "curvature", "1/in"),
        "temperature": ("°F", "temperature", "degF"),
        "temperature_difference": ("°F", "temperature_difference", "delta_degF"),
    },
}


@lru_cache(maxsize=None)
def _axis_units(system: str) -> dict[str, AxisUnit]:
    table = {kind: _axis(*spec) for kind, spec in _AXES[system].items()}
    table["ratio"] = AxisUnit("", 1.0)
    return table


def _check_system(system: str) -> str:
    key = str(system).strip().lower()
    if key not in _AXES:
        raise InputError("unit system", system, "'si' or 'us'")
    return key


def axis_unit(kind: str, system: str = "si", magnitude: float | None = None) -> AxisUnit:
    """Display unit for ``kind`` ("length", "stress", "curvature", "temperature", ...).

    With ``magnitude`` (the largest |value| in SI), lengths under 0.1 mm (0.1 in) switch to um (mil)
    and stresses under 1 MPa (1 ksi) to kPa (psi), so tick labels stay readable.
    """
    units = _axis_units(_check_system(system))
    if kind not in units or kind.startswith("small_"):
        raise InputError("axis kind", kind, "one of " + ", ".join(sorted(k for k in units if not k.startswith("small_"))))
    if magnitude is not None and math.isfinite(magnitude):  # below 0.1 mm (0.1 in) or 1 MPa (1 ksi)
        if kind == "length" and units["length"](magnitude) < 0.1:
            return units["small_length"]
        if kind == "stress" and units["stress"](magnitude) < 1.0:
            return units["small_stress"]
    return units[kind]


def _axis_label(name: str, unit: AxisUnit) -> str:
    return f"{name} [{unit.label}]" if unit.label else name


# --------------------------------------------------------------------------------------------
# Colours


def material_colours(materials: Sequence[str]) -> dict[str, str]:
    """One colour per distinct material name, stable across views and sessions.

    Each name hashes (CRC-32) to a palette slot; when two materials of the same stack land on the
    same slot, the later one takes the next free slot, so the layers of one figure never share a
    colour (up to the palette size).
    """
    colours: dict[str, str] = {}
    used: set[int] = set()
    for name in materials:
        if name in colours:
            continue
        slot = zlib.crc32(name.encode("utf-8")) % len(PALETTE)
        for step in range(len(PALETTE)):
            candidate = (slot + step) % len(PALETTE)
            if candidate not in used or len(used) >= len(PALETTE):
                slot = candidate
                break
        used.add(slot)
        colours[name] = PALETTE[slot]
    return colours


# --------------------------------------------------------------------------------------------
# Figure helpers


def new_figure(height: float = 3.6, width: float = FIGURE_WIDTH, dpi: float = FIGURE_DPI,
               layout: str | None = "constrained") -> Figure:
    """A pyplot-free figure with an Agg canvas attached (so it can be drawn and saved headless).

    ``layout=None`` keeps fixed margins (set them with ``subplots_adjust``): panels redraw many
    times and the constrained layout costs more than the drawing itself.
    """
    from matplotlib.backends.backend_agg import FigureCanvasAgg

    figure = Figure(figsize=(width, height), dpi=dpi, layout=layout)
    FigureCanvasAgg(figure)
    return figure


def _target(ax: "Axes | None", height: float) -> "tuple[Figure, Axes]":
    """A new figure and axes, or the given axes cleared."""
    if ax is None:
        figure = new_figure(height)
        return figure, figure.add_subplot()
    ax.clear()
    ax.__dict__.pop("_bilayer_artists", None)
    return ax.figure, ax


def _reusable(ax: "Axes | None", key: tuple) -> dict | None:
    """The artists this module drew into ``ax`` last time, if they had the same structure ``key``.

    Redrawing by updating those artists (instead of clearing the axes) keeps the tick objects and
    roughly halves the time of a panel redraw.
    """
    if ax is None:
        return None
    cached = ax.__dict__.get("_bilayer_artists")
    return cached if cached is not None and cached.get("key") == key else None


def _remember(ax: "Axes", key: tuple, **artists) -> dict:
    artists["key"] = key
    ax.__dict__["_bilayer_artists"] = artists
    return artists


def _mark_dynamic(ax: "Axes", dynamic: list, *static) -> None:
    """Record which artists change on every redraw and a key of everything else.

    A figure shown in a panel can then redraw only the ``dynamic`` artists over a saved background
    while the key (limits, labels, ticks, layer bands...) stays the same (blitting).
    """
    art = ax.__dict__["_bilayer_artists"]
    art["dynamic"] = dynamic
    art["static_key"] = (
        art["key"], ax.get_xlim(), ax.get_ylim(), ax.get_xlabel(), ax.get_ylabel(),
        tuple(ax.get_yticks()), ax.get_xscale(), ax.get_yscale(), *static,
    )


def _sticky_limits(current: tuple[float, float] | None, low: float, high: float, share: float = 0.45,
                   pad: float = 0.1) -> tuple[float, float]:
    """Axis limits for data in [low, high]: keep ``current`` while it holds the data and the data fill at
    least ``share`` of it (so small changes redraw without moving the ticks); otherwise a padded range."""
    if high < low:
        low, high = high, low
    span = high - low
    if current is not None:
        a, b = current
        if a <= low and high <= b and span >= share * (b - a):
            return a, b
    if span == 0.0:
        span = abs(high) if high != 0.0 else 1.0
    return low - pad * span, high + pad * span


def _scalar_case(value, index: int | None, what: str) -> float:
    array = np.asarray(value, float)
    if array.ndim == 0:
        return float(array)
    if index is None:
        raise InputError(
            "index", index, f"an operating-temperature index (the result holds {array.size} {what} cases)"
        )
    return float(array.reshape(-1)[index])


def _layer_values(array, index: int | None) -> np.ndarray:
    array = np.asarray(array, float)
    if array.ndim == 1:
        return array
    return array.reshape(-1, array.shape[-1])[index]


def _spread(positions: Sequence[float], low: float, high: float, gap: float) -> list[float]:
    """Move label positions apart so neighbours are at least ``gap`` apart, in order, ending at or below ``high``."""
    placed = [min(max(p, low), high) for p in positions]
    for i in range(1, len(placed)):
        placed[i] = max(placed[i], placed[i - 1] + gap)
    if placed and placed[-1] > high:
        placed[-1] = high
        for i in range(len(placed) - 2, -1, -1):
            placed[i] = min(placed[i], placed[i + 1] - gap)
    return placed


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
    kappa = _scalar_case(result.curvature, index, "temperature")
    s_bottom = _layer_values(result.stress_bottom, index)
    s_top = _layer_values(result.stress_top, index)
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
    placed = _spread(list(centres), 0.04, 0.96, 0.11 if n <= 8 else 0.9 / n)
    names = []
    for i in range(n):
        t_unit = axis_unit("length", system, result.thicknesses[i])
        names.append(f"{i + 1}: {result.labels[i]}, {float(t_unit(result.thicknesses[i])):.4g} {t_unit.label}")
    state = getattr(result.state, "value", str(result.state))
    k_unit = axis_unit("curvature", system)
    operating = _scalar_case(result.operating_temperature, index, "temperature")
    heading = title if title is not None else (
        f"Stress through the thickness at {_temperature_text(operating, system)} ({state} state), "
        f"κ = {float(k_unit(kappa)):.4g} {k_unit.label}"
    )

    key = ("stress", n, to_scale)
    art = _reusable(ax, key)
    if art is None:
        figure, ax = _target(ax, 3.6)
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
        art = _remember(ax, key, spans=spans, joints=joints, line=line, tags=tags, leaders=leaders)
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
    ax.set_xlim(*_sticky_limits(current_xlim, min(0.0, float(np.min(s_line))), max(0.0, float(np.max(s_line)))))
    ax.set_ylim(0.0, v[-1])
    if not to_scale:
        ax.set_yticks(v, [f"{float(z_unit(z)):.4g}" for z in np.concatenate([[0.0], tops])], fontsize=7)
    ax.set_xlabel(_axis_label("stress σx (tension > 0)", s_unit))
    ax.set_ylabel(_axis_label("height z above bottom" if to_scale else "height z, not to scale", z_unit))
    ax.set_title(heading, fontsize=10, y=1.0, pad=5)
    _mark_dynamic(ax, [art["line"], ax.title], tuple(names), tuple(colours), tuple(placed), tuple(v))
    return figure


# --------------------------------------------------------------------------------------------
# Deflected shape


SUPPORTS = ("cantilever", "centre")


def arc_shape(curvature: float, length: float, support: str = "cantilever", points: int = 121):
    """Centre line (x, w) of a strip of arc length ``length`` bent to uniform ``curvature``.

    Exact arc kinematics (layers.md section 6): with s the arc length from the held point and the
    tangent horizontal there, x = sin(kappa s)/kappa and w = -(1 - cos(kappa s))/kappa. The minus sign
    follows kappa = -w'' (kappa > 0 bends the ends down). ``support``: "cantilever" (held at x = 0)
    or "centre" (a free strip, plate or wafer held at its middle, s from -L/2 to L/2).
    """
    if support not in SUPPORTS:
        raise InputError("support", support, "one of " + ", ".join(SUPPORTS))
    s = np.linspace(0.0, length, points) if support == "cantilever" else np.linspace(-0.5, 0.5, points) * length
    phi = curvature * s
    if abs(curvature) * length < 1e-9:
        return s.copy(), -0.5 * curvature * s * s
    return np.sin(phi) / curvature, -(1.0 - np.cos(phi)) / curvature


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

    kappa = _scalar_case(result.curvature, index, "temperature")
    x, w = arc_shape(kappa, length, support)
    x_unit = axis_unit("length", system, length)
    colours = material_colours(result.materials)
    top_colour, bottom_colour = colours[result.materials[-1]], colours[result.materials[0]]
    flat = np.array([0.0, length]) if support == "cantilever" else np.array([-0.5, 0.5]) * length
    free = _temperature_text(result.stress_free_temperature, system)
    labels = (f"flat at {free} (stress-free)", f"top: {result.labels[-1]}", f"bottom: {result.labels[0]}",
              "clamp" if support == "cantilever" else "held at centre")
    if support == "cantilever":
        end, small, where = w[-1], -0.5 * kappa * length**2, "tip"
    else:
        end, small, where = w[-1], -kappa * length**2 / 8.0, "edge"
    T = _scalar_case(result.operating_temperature, index, "temperature")
    heading = f"Deflected shape at {_temperature_text(T, system)}"
    span = abs(end) if abs(end) > 1e-9 * length else 1e-3 * length
    w_unit = axis_unit("length", system, float(np.max(np.abs(w))) or None)
    note = (f"{where} deflection {float(w_unit(end)):+.4g} {w_unit.label} "
            f"(small-deflection formula {float(w_unit(small)):+.4g})")
    if 1.7 * span < 0.2 * length:
        note += "; vertical scale stretched"

    key = ("shape", support, w_unit.label)
    art = _reusable(ax, key)
    if art is None:
        figure, ax = _target(ax, 3.2)
        above = offset_copy(ax.transData, fig=figure, y=1.6, units="points")
        below = offset_copy(ax.transData, fig=figure, y=-1.6, units="points")
        (reference,) = ax.plot(x_unit(flat), [0.0, 0.0], ls="--", color="0.5", lw=1.0)
        (top,) = ax.plot(x_unit(x), w_unit(w), color=top_colour, lw=3.2, transform=above)
        (bottom,) = ax.plot(x_unit(x), w_unit(w), color=bottom_colour, lw=3.2, transform=below)
        (holder,) = ax.plot([0.0], [0.0], marker="s" if support == "cantilever" else "^", color="0.3", ms=8, ls="")
        text = ax.text(0.99, 0.97, "", transform=ax.transAxes, fontsize=8, ha="right",
                       bbox={"fc": "white", "alpha": 0.85, "lw": 0})
        ax.grid(True, lw=0.3, alpha=0.6)
        art = _remember(ax, key, reference=reference, top=top, bottom=bottom, holder=holder, text=text)
        current_ylim = None
    else:
        figure = ax.figure
        current_ylim = ax.get_ylim()
        art["reference"].set_xdata(x_unit(flat))
        for name, colour in (("top", top_colour), ("bottom", bottom_colour)):
            art[name].set_data(x_unit(x), w_unit(w))
            art[name].set_color(colour)
    ax.set_xlim(*_padded(*x_unit(flat)))  # the flat length: steady while the arc shortens its chord
    shown_w = w_unit(w)
    low, high = float(min(0.0, shown_w.min())), float(max(0.0, shown_w.max()))
    ax.set_ylim(*_sticky_limits(current_ylim, low - 0.3 * (high - low), high + 0.3 * (high - low), share=0.5))
    art["text"].set_text(note)
    art["text"].set_y(0.97 if end <= 0 else 0.03)
    art["text"].set_va("top" if end <= 0 else "bottom")
    legend_key = (labels, end <= 0)
    if art.get("legend_key") != legend_key:
        place = ("lower " if end <= 0 else "upper ") + ("left" if support == "cantilever" else "center")
        ax.legend([art["reference"], art["top"], art["bottom"], art["holder"]], labels, fontsize=7, loc=place,
                  frameon=False)
        art["legend_key"] = legend_key
    ax.set_xlabel(_axis_label(f"position x along the strip (exact arc of length {float(x_unit(length)):.4g} "
                              f"{x_unit.label})", x_unit))
    ax.set_ylabel(_axis_label("deflection w (up > 0)", w_unit))
    ax.set_title(heading, fontsize=10, y=1.0, pad=5)
    _mark_dynamic(ax, [art["top"], art["bottom"], art["text"], ax.title], labels, top_colour, bottom_colour,
                  end <= 0, tuple(x_unit(flat)))
    return figure


def _padded(low: float, high: float, share: float = 0.04) -> tuple[float, float]:
    pad = share * (high - low) if high > low else 1.0
    return low - pad, high + pad


def _temperature_text(kelvin: float, system: str) -> str:
    unit = axis_unit("temperature", system)
    return f"{float(unit(kelvin)):.4g} {unit.label}"


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
    art = _reusable(ax, key)
    if art is None:
        figure, ax = _target(ax, 3.4)
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
        art = _remember(ax, key, lines=lines, marker=marker, marker_text=marker_text, note=note_text)
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
    ax.set_xlabel(_axis_label("distance from the free end", d_unit))
    ax.set_ylabel(_axis_label("interface stress", s_unit))
    ax.set_title(title, fontsize=10, y=1.0, pad=5)
    if d.size:
        ax.set_xlim(float(d_unit(d.max())), 0.0)  # the free end on the right, as on the strip
    span = (high - low) or 1.0
    ax.set_ylim(*_sticky_limits(current, float(s_unit(min(low, 0.0) - 0.08 * span)),
                                float(s_unit(max(high, 0.0) + 0.08 * span)), share=0.5, pad=0.1))
    _mark_dynamic(ax, [*art["lines"].values(), ax.title], note, show_marker and float(d_unit(3 * decay_length)))
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
    art = _reusable(ax, key)
    if art is None:
        figure, ax = _target(ax, 3.4)
        for other in list(figure.axes):
            if other is not ax and getattr(other, "_bilayer_twin_of", None) is ax:
                other.remove()
        k_colour, s_colour = "#0072B2", "#D55E00"
        (k_line,) = ax.plot(ratio, k_unit(curvature), color=k_colour, lw=1.8)
        (k_mark,) = ax.plot([current_ratio], [k_unit(current_curvature)], "o", color=k_colour, ms=7, mec="black",
                            label="current design")
        ax.set_xscale("log")
        ax.set_xlabel(ratio_label)
        ax.set_ylabel(_axis_label("curvature κ", k_unit), color=k_colour)
        ax.tick_params(axis="y", colors=k_colour)
        twin = ax.twinx()
        twin._bilayer_twin_of = ax  # so a fresh drawing into the same axes removes the old twin
        (s_line,) = twin.plot(ratio, s_unit(peak_stress), color=s_colour, lw=1.8, ls="-.")
        (s_mark,) = twin.plot([current_ratio], [s_unit(current_peak_stress)], "s", color=s_colour, ms=7, mec="black")
        twin.set_ylabel(_axis_label(stress_label, s_unit), color=s_colour)
        twin.tick_params(axis="y", colors=s_colour)
        best_line = ax.axvline(current_ratio, color="0.4", ls=":", lw=1.0)
        best_text = ax.text(current_ratio, 0.02, "", transform=ax.get_xaxis_transform(), fontsize=7, color="0.3")
        current_line = ax.axvline(current_ratio, color="0.6", lw=0.6)
        ax.set_title("Curvature and peak interface stress against thickness ratio (total thickness fixed)", fontsize=9)
        ax.legend(fontsize=7, loc="upper right", frameon=False)
        ax.grid(True, which="major", lw=0.3, alpha=0.6)
        art = _remember(ax, key, twin=twin, k_line=k_line, k_mark=k_mark, s_line=s_line, s_mark=s_mark,
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
        axes.set_ylim(*_sticky_limits(current, float(np.nanmin(values)), float(np.nanmax(values)), share=0.5, pad=0.2))
    art["drawn"] = True
    _mark_dynamic(ax, [art["k_line"], art["k_mark"], art["s_line"], art["s_mark"], art["current_line"],
                       art["best_line"], art["best_text"]],
                  twin.get_ylim(), tuple(twin.get_yticks()), twin.get_ylabel())
    return figure


# --------------------------------------------------------------------------------------------
# Sign convention sketch


def sign_convention_sketch(ax: "Axes | None" = None) -> Figure:
    """A sketch of the project's conventions: numbering, z axis, kappa > 0, tension > 0, Delta T."""
    from matplotlib.patches import Polygon

    figure, ax = _target(ax, 2.7)
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
    figure, ax = _target(ax, 3.4)
    t_unit = axis_unit("temperature", system)
    T = t_unit(np.asarray(temperatures, float))
    if unit == "rad":
        y_unit = AxisUnit("deg", 180.0 / math.pi)
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
    ax.set_xlabel(_axis_label("temperature", t_unit))
    ax.set_ylabel(_axis_label(name, y_unit))
    ax.set_title(title, fontsize=10, y=1.0, pad=5)
    ax.legend(fontsize=7, loc="best", frameon=False)
    ax.grid(True, lw=0.3, alpha=0.6)
    return figure


# --------------------------------------------------------------------------------------------
# Solder joints: failed fraction against cycles


def weibull_failures(
    populations: Sequence[tuple[str, float, float]],
    ax: "Axes | None" = None,
    marks: Sequence[tuple[str, float, float]] = (),
    title: str = "Failed fraction of joints against cycles (two-parameter Weibull)",
) -> Figure:
    """Cumulative failed fraction F(N) = 1 - exp(-(N/eta)^beta) of each population ``(label, eta, beta)``.

    ``marks`` adds points ``(label, cycles, fraction)`` (the median life at 50 %, an early-failure life).
    Cycles on a logarithmic axis; the fraction in percent.
    """
    figure, ax = _target(ax, 3.4)
    etas = [eta for _, eta, _ in populations if np.isfinite(eta) and eta > 0]
    if etas:
        low, high = min(etas) * 1e-2, max(etas) * 3.0
        cycles = np.geomspace(low, high, 300)
        for k, (label, eta, beta) in enumerate(populations):
            fraction = 1.0 - np.exp(-((cycles / eta) ** beta))
            ax.plot(cycles, 100 * fraction, color=PALETTE[(3 * k) % len(PALETTE)], lw=2.0, label=label)
        ax.set_xscale("log")
        ax.set_xlim(low, high)
    for k, (label, n, fraction) in enumerate(marks):
        ax.plot([n], [100 * fraction], "o", color=PALETTE[(2 * k + 5) % len(PALETTE)], mec="black", ms=6,
                label=f"{label}: {n:.3g} cycles")
    ax.axhline(50.0, color="0.6", lw=0.6, ls=":")
    ax.set_ylim(0, 100)
    ax.set_xlabel("cycles to failure N (logarithmic)")
    ax.set_ylabel("failed fraction [%]")
    ax.set_title(title, fontsize=10, y=1.0, pad=5)
    ax.legend(fontsize=7, loc="upper left", frameon=False)
    ax.grid(True, which="both", lw=0.3, alpha=0.5)
    return figure


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
    figure, ax = _target(ax, 3.4)
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
    ax.set_xlabel(_axis_label("film thickness", x_unit))
    ax.set_ylabel("Stoney error [%]")
    ax.set_title(title, fontsize=10, y=1.0, pad=5)
    ax.legend(fontsize=7, loc="best", frameon=False)
    ax.grid(True, which="both", lw=0.3, alpha=0.5)
    return figure


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
    figure, ax = _target(ax, 3.2)
    name, kind = _SWEEP_KINDS[parameter]
    v = np.asarray(values, float)
    if kind == "modulus":
        unit = axis_unit("modulus", system)
    else:
        unit = axis_unit("length", system, float(np.max(v)))
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
    ax.set_xlabel(_axis_label(name, unit))
    ax.set_ylabel(_axis_label("stress at the joint end", s_unit))
    ax.set_title(title or f"End stresses against the {name}", fontsize=10, y=1.0, pad=5)
    ax.legend(fontsize=7, loc="best", frameon=False)
    ax.grid(True, lw=0.3, alpha=0.6)
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
    left.set_xlabel(_axis_label("σx at mid-length", s_unit))
    left.set_ylabel(_axis_label("height z", z_unit))
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
    right.set_xlabel(_axis_label("distance from the free end", d_unit))
    right.set_ylabel(_axis_label("interface stress", t_unit))
    right.legend(fontsize=6, loc="best", frameon=False)
    right.set_title("Near the right-hand end (corner values are nominal)", fontsize=9)
    for ax in (left, right):
        ax.grid(True, lw=0.3, alpha=0.5)
    figure.suptitle(f"Closed forms against the 2-D finite-element check ({fe.plane}, {fe.dofs} dofs)", fontsize=10)
    return figure
