"""Views along the strip: interface shear and peel near the free ends, and the trade-off between
curvature and peak interface shear over the thickness ratio.

Both call the interface model (:mod:`bilayer.strip.interface`) for the current design, the shared strip
length and the bond layers chosen here.
"""
from __future__ import annotations

from html import escape

import ipywidgets as widgets
import numpy as np

from .. import plots
from ..core.errors import BilayerError
from ..core.stack import Stack
from ..strip.ratio_sweep import thickness_ratio_sweep
from ._base import DesignModel, FigureImage, View, message_html
from .views import StripLengthField, _fmt

__all__ = ["InterfaceView", "RatioTradeoffView", "thickness_ratio_sweep", "interface_short_names"]


def interface_short_names(stack: Stack, result) -> list[str]:
    """Short names "layers 1-2" or "layers 1-3, bond 2" for the interfaces of an interface result."""
    names = []
    for profile in result.interfaces:
        p = profile.parameters
        name = f"layers {p.below[-1] + 1}–{p.above[0] + 1}"
        if p.bond is not None:
            name += f" (bond {p.bond + 1})"
        names.append(name)
    return names


class BondChooser(widgets.SelectMultiple):
    """Pick which inner layers are bond layers (adhesive, solder, die attach: shear only)."""

    def __init__(self, model: DesignModel):
        super().__init__(description="bond layers", rows=3, style={"description_width": "initial"},
                         layout=widgets.Layout(width="22em"),
                         tooltip="inner layers that carry shear only across their interface (ctrl-click for several)")
        self.model = model
        self._syncing = False
        self._sync()
        self.observe(self._chosen, names="value")
        model.observe(lambda change: self._sync(), names=["design", "bonds"])

    def _sync(self) -> None:
        stack = self.model.design.stack
        options = tuple((f"{i + 1}: {stack.labels[i]}", i) for i in range(1, stack.n_layers - 1))
        chosen = tuple(i for i in self.model.bonds if 0 < i < stack.n_layers - 1)
        self._syncing = True
        try:
            if tuple(self.options) != options:
                self.options = options
            if tuple(self.value) != chosen:
                self.value = chosen
        finally:
            self._syncing = False

    def _chosen(self, change) -> None:
        if not self._syncing and tuple(change["new"]) != tuple(self.model.bonds):
            self.model.bonds = tuple(change["new"])


class InterfaceView(View):
    """Interface shear (solid) and peel (dashed) from mid-length to a free end, with their maxima."""

    watches = ("result", "system", "strip_length", "bonds", "case")
    margins = {"left": 0.12, "right": 0.97, "bottom": 0.14, "top": 0.9}

    def __init__(self, model: DesignModel, active: bool = True):
        self.message = widgets.HTML()
        self.length = StripLengthField(model, self.message)
        self.bonds = BondChooser(model)
        self.bending = widgets.Dropdown(
            options=(("with bending (Suhir-type)", "bending"), ("no bending (Chen & Nelson)", "no_bending")),
            value="bending", description="model", style={"description_width": "initial"},
        )
        self.image = FigureImage(3.4, self.margins)
        self.ax = self.image.figure.add_subplot()
        self.table = widgets.HTML()
        self.result = None
        super().__init__(model, [widgets.HBox([self.length.field.text, self.bending]), self.bonds, self.image,
                                 self.message, self.table], active=active)
        self.bending.observe(lambda change: self.redraw(), names="value")
        self._on_model()

    def compute(self):
        """The interface model for the current design (one core call)."""
        from ..strip.interface import interface_stresses

        design = self.model.case_design()
        return interface_stresses(design.stack, design.temperatures, self.model.strip_length, design.state,
                                  bonds=self.model.bonds, model=self.bending.value)

    def draw(self) -> None:
        stack = self.model.design.stack
        if stack.n_layers < 2:
            self.result = None
            self.message.value = message_html("A single layer has no interface.", "note")
            return
        try:
            result = self.compute()
        except BilayerError as error:
            self.message.value = message_html(f"{error}. The figure shows the last valid case.")
            return
        self.result = result
        params = [p.parameters for p in result.interfaces]
        scale = max(max(p.decay_length, p.peel_decay_length if p.bending else 0.0) for p in params)
        zone = min(result.half_length, 10.0 * scale)
        self.distance = zone * np.linspace(0.0, 1.0, 301) ** 1.5
        sampled = result.sample(self.distance, end="right")
        names = interface_short_names(stack, result)
        shear = {name: s[1] for name, s in zip(names, sampled)}
        peel = {name: s[2] for name, s in zip(names, sampled) if s[2] is not None}
        system = self.model.system
        plots.interface_stresses(
            self.distance, shear, peel, system, ax=self.ax,
            title=f"Interface stresses near the right-hand free end ({result.state.value} state, "
                  f"strip {_fmt(result.length, 'length', system)})",
            note="within about one thickness of the end: nominal model values",
            decay_length=min(p.decay_length for p in params),
        )
        self.image.refresh()
        rows = []
        for name, p in zip(names, result.interfaces):
            peel_text = ("–" if not np.isfinite(p.max_peel) else
                         f"{_fmt(p.max_peel, 'stress', system)} at {_fmt(p.max_peel_distance, 'length', system)}")
            end_peel = "–" if not np.isfinite(p.end_peel) else _fmt(p.end_peel, "stress", system)
            rows.append(f"<tr><td>{escape(name)}</td><td>{_fmt(p.max_shear, 'stress', system)}</td>"
                        f"<td>{peel_text}</td><td>{end_peel}</td><td>{_fmt(p.decay_length, 'length', system)}</td></tr>")
        warnings = "".join(f"<li>{escape(w)}</li>" for w in result.warnings)
        self.table.value = (
            "<table style='font-size:0.9em'><tr><th>interface</th><th>shear at the end</th>"
            "<th>largest tensile peel (from the end)</th><th>peel at the end</th><th>decay length 1/k</th></tr>"
            + "".join(rows) + "</table>"
            + (f"<ul style='color:#8a5a00;font-size:0.85em'>{warnings}</ul>" if warnings else "")
        )
        self.message.value = ""


class RatioTradeoffView(View):
    """Curvature and peak interface shear over the thickness ratio, with the current design marked."""

    watches = ("result", "system", "strip_length", "bonds", "case")
    margins = {"left": 0.12, "right": 0.87, "bottom": 0.15, "top": 0.9}

    def __init__(self, model: DesignModel, active: bool = True):
        self.message = widgets.HTML()
        self.image = FigureImage(3.4, self.margins)
        self.ax = self.image.figure.add_subplot()
        self.sweep = None
        super().__init__(model, [widgets.HTML(
            "<span style='color:#555;font-size:0.9em'>Total thickness fixed; the part below the first interface "
            "against the part above (a bond keeps its thickness). Strip length and bonds as on the interface tab.</span>"),
            self.image, self.message], active=active)
        self._on_model()

    def draw(self) -> None:
        design = self.model.case_design()
        if design.stack.n_layers < 2:
            self.message.value = message_html("A single layer has no thickness ratio.", "note")
            return
        try:
            sweep = thickness_ratio_sweep(design, self.model.strip_length, self.model.bonds)
        except BilayerError as error:
            self.message.value = message_html(f"{error}. The figure shows the last valid case.")
            return
        self.sweep = (sweep.ratios, sweep.curvature, sweep.peak_shear)
        plots.thickness_ratio_tradeoff(
            sweep.ratios, sweep.curvature, sweep.peak_shear, sweep.current_ratio, sweep.current_curvature,
            sweep.current_peak_shear, self.model.system, ax=self.ax, best_ratio=sweep.best_ratio,
            ratio_label="thickness ratio, part below / part above the first interface",
        )
        self.image.refresh()
        self.message.value = ""


