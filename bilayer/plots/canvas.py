"""What every figure shares: display units on axes (derived from :mod:`bilayer.core.units`), one
colour per material, pyplot-free figures, and the helpers that let panels redraw in place."""
from __future__ import annotations

import math
import zlib
from dataclasses import dataclass
from functools import lru_cache
from typing import TYPE_CHECKING, Sequence

import numpy as np
from matplotlib.figure import Figure

from ..core.errors import InputError

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.axes import Axes


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


RATIO = AxisUnit("", 1.0)


@lru_cache(maxsize=None)
def _linear_map(kind: str, unit: str) -> AxisUnit:
    """The unit ``unit`` of :mod:`bilayer.core.units` as a linear map (offset only for temperatures)."""
    from ..core import units

    if kind == "temperature":  # shown = T * scale + offset; the scale is that of a difference
        step = {"degC": "K", "degF": "delta_degF", "K": "K"}[unit]
        return AxisUnit(units.shown_label(unit), units.from_si(1.0, "temperature_difference", step),
                        units.from_si(0.0, "temperature", unit))
    return AxisUnit(units.shown_label(unit), units.from_si(1.0, kind, unit))


def check_system(system: str) -> str:
    from ..core.units import UNIT_SYSTEMS

    key = str(system).strip().lower()
    if key not in UNIT_SYSTEMS:
        raise InputError("unit system", system, "'si' or 'us'")
    return key


def axis_unit(kind: str, system: str = "si", magnitude: float | None = None) -> AxisUnit:
    """Display unit for a quantity of ``kind`` (a kind of :mod:`bilayer.core.units`: "length",
    "stress", "modulus", "curvature", "temperature", "angle"...; "ratio" for a plain number).

    The unit is the one :func:`bilayer.core.units.display_unit` chooses for values of about
    ``magnitude`` (the largest |value| in SI), so lengths under 0.1 mm (0.1 in) show in um (mil) and
    the axes agree with the printed reports.
    """
    from ..core.units import display_unit

    system = check_system(system)
    if kind == "ratio":
        return RATIO
    size = magnitude if magnitude is not None and math.isfinite(magnitude) else 0.0
    return _linear_map(kind, display_unit(kind, system, size))


def axis_label(name: str, unit: AxisUnit) -> str:
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


def target(ax: "Axes | None", height: float) -> "tuple[Figure, Axes]":
    """A new figure and axes, or the given axes cleared."""
    if ax is None:
        figure = new_figure(height)
        return figure, figure.add_subplot()
    ax.clear()
    ax.__dict__.pop("_bilayer_artists", None)
    return ax.figure, ax


def reusable(ax: "Axes | None", key: tuple) -> dict | None:
    """The artists this module drew into ``ax`` last time, if they had the same structure ``key``.

    Redrawing by updating those artists (instead of clearing the axes) keeps the tick objects and
    roughly halves the time of a panel redraw.
    """
    if ax is None:
        return None
    cached = ax.__dict__.get("_bilayer_artists")
    return cached if cached is not None and cached.get("key") == key else None


def remember(ax: "Axes", key: tuple, **artists) -> dict:
    artists["key"] = key
    ax.__dict__["_bilayer_artists"] = artists
    return artists


def mark_dynamic(ax: "Axes", dynamic: list, *static) -> None:
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


def sticky_limits(current: tuple[float, float] | None, low: float, high: float, share: float = 0.45,
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


def scalar_case(value, index: int | None, what: str) -> float:
    array = np.asarray(value, float)
    if array.ndim == 0:
        return float(array)
    if index is None:
        raise InputError(
            "index", index, f"an operating-temperature index (the result holds {array.size} {what} cases)"
        )
    return float(array.reshape(-1)[index])


def layer_values(array, index: int | None) -> np.ndarray:
    array = np.asarray(array, float)
    if array.ndim == 1:
        return array
    return array.reshape(-1, array.shape[-1])[index]


def spread(positions: Sequence[float], low: float, high: float, gap: float) -> list[float]:
    """Move label positions apart so neighbours are at least ``gap`` apart, in order, ending at or below ``high``."""
    placed = [min(max(p, low), high) for p in positions]
    for i in range(1, len(placed)):
        placed[i] = max(placed[i], placed[i - 1] + gap)
    if placed and placed[-1] > high:
        placed[-1] = high
        for i in range(len(placed) - 2, -1, -1):
            placed[i] = min(placed[i], placed[i + 1] - gap)
    return placed


def padded(low: float, high: float, share: float = 0.04) -> tuple[float, float]:
    pad = share * (high - low) if high > low else 1.0
    return low - pad, high + pad


def temperature_text(kelvin: float, system: str) -> str:
    unit = axis_unit("temperature", system)
    return f"{float(unit(kelvin)):.4g} {unit.label}"
