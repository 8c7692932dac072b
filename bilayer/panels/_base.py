"""Building blocks shared by the panels: the current-design model, quantity fields and figure images.

The panels are thin views. One :class:`DesignModel` holds the current (immutable) design and its
engine result; controls build a new design and *propose* it; the model evaluates it once and, if
that works, publishes design and result to every view. A proposal that fails leaves the last valid
design in place and returns the message to show beside the control.
"""
from __future__ import annotations

import io
import warnings
from typing import Callable

import ipywidgets as widgets
import numpy as np
import traitlets

from .. import plots
from ..plots.canvas import FIGURE_DPI, FIGURE_WIDTH
from ..core.errors import BilayerError
from ..core.stack import Design

__all__ = ["DesignModel", "QuantityField", "FigureImage", "View", "message_html", "capture_warnings"]

ERROR_STYLE = "color:#b00020"
NOTE_STYLE = "color:#8a5a00"


def message_html(text: str = "", kind: str = "error") -> str:
    """HTML for a short message shown in place (error in red, note in amber, info in grey)."""
    if not text:
        return ""
    style = {"error": ERROR_STYLE, "note": NOTE_STYLE}.get(kind, "color:#444")
    from html import escape

    return f"<span style='{style};font-size:0.9em'>{escape(text)}</span>"


class capture_warnings(warnings.catch_warnings):
    """Record warnings raised while building or evaluating a design so a panel can show them."""

    def __init__(self):
        super().__init__(record=True)

    def __enter__(self):
        log = super().__enter__()
        warnings.simplefilter("always")
        return log


class DesignModel(traitlets.HasTraits):
    """The one mutable thing of a panel set: the current design, its result and the unit system.

    ``propose(design)`` evaluates the design with the engine (one core call). On success ``design``
    and ``result`` change together and observers redraw; on a project error nothing changes and the
    error text is returned.
    """

    design = traitlets.Instance(Design)
    result = traitlets.Any(allow_none=True)
    system = traitlets.Enum(plots.SYSTEMS, default_value="si")
    messages = traitlets.Tuple()  # warnings raised while evaluating the current design
    strip_length = traitlets.Float(0.05)  # length of the strip shown by the shape and interface views [m]
    bonds = traitlets.Tuple()  # indices (0 = bottom) of layers that act as bond layers (shear only)
    case = traitlets.Int(0)  # which operating temperature the views show when the design holds several

    def __init__(self, design: Design, system: str = "si"):
        super().__init__()
        error = self.propose(design)
        if error:
            raise ValueError(f"the starting design is not valid: {error}")
        self.system = system

    def propose(self, design: Design) -> str:
        """Evaluate ``design`` and publish it; return "" on success or the error message."""
        try:
            with capture_warnings() as caught:
                result = design.evaluate()
        except BilayerError as error:
            return str(error)
        cases = int(np.size(design.temperatures.operating)) if np.ndim(design.temperatures.operating) else 1
        with self.hold_trait_notifications():
            self.messages = tuple(str(w.message) for w in caught)
            self.case = min(self.case, cases - 1)
            self.design = design
            self.result = result
        return ""

    @property
    def case_index(self) -> int | None:
        """Index of the operating temperature on show, or None when the design has a single one."""
        return self.case if np.ndim(self.design.temperatures.operating) else None

    def case_design(self) -> Design:
        """The current design reduced to the operating temperature on show (for single-case models)."""
        if self.case_index is None:
            return self.design
        from ..core.stack import Temperatures

        temperatures = self.design.temperatures
        return self.design.replace(temperatures=Temperatures(temperatures.stress_free,
                                                             float(temperatures.operating[self.case])))


class QuantityField:
    """A text box for one physical quantity, typed with its unit ("0.5 mm", "120 degF").

    The box keeps exactly what the user typed. ``value()`` parses it to SI (raising the project
    error that names the field). ``show(value_si, system)`` writes a formatted value and remembers the
    exact SI number behind that text, so switching unit systems never rounds a value away.
    """

    def __init__(self, description: str, kind: str, field: str, value_si: float, system: str = "si",
                 width: str = "11em", tooltip: str = "", allow_list: bool = False):
        self.kind = kind
        self.field = field
        self.allow_list = allow_list
        self.text = widgets.Text(
            description=description,
            continuous_update=False,
            layout=widgets.Layout(width=width),
            style={"description_width": "initial"},
            tooltip=tooltip or f"{field}: type a value with its unit; press Enter to apply",
        )
        self._exact: tuple[str, float] | None = None
        self.show(value_si, system)

    def value(self) -> float:
        text = self.text.value
        if self._exact is not None and text == self._exact[0]:
            return self._exact[1]
        from ..core.units import parse

        if self.allow_list and "," in text:
            items = [item.strip() for item in text.split(",")]
            return np.array([parse(item, self.kind, f"{self.field}[{i}]") for i, item in enumerate(items)])
        return parse(text.strip(), self.kind, self.field)

    def show(self, value_si, system: str) -> None:
        """Write ``value_si`` (a number, or a sequence when lists are allowed) in ``system`` units."""
        from ..core.units import format_quantity

        if np.ndim(value_si):
            values = np.array(value_si, float)
            text = ", ".join(format_quantity(float(v), self.kind, system=system, digits=6) for v in values)
            self._exact = (text, values)
        else:
            text = format_quantity(value_si, self.kind, system=system, digits=6)
            self._exact = (text, float(value_si))
        self.text.value = text

    def convert(self, system: str) -> None:
        """Rewrite the text in ``system`` if it currently holds a valid value; otherwise leave it."""
        try:
            value = self.value()
        except BilayerError:
            return
        self.show(value, system)

    def observe(self, callback: Callable) -> None:
        self.text.observe(callback, names="value")


class FigureImage(widgets.Image):
    """A matplotlib figure (no pyplot) shown as a PNG image widget and redrawn in place."""

    def __init__(self, height: float = 3.6, margins: dict | None = None, **kwargs):
        width = round(FIGURE_WIDTH * FIGURE_DPI)  # shown at its own pixel size: crisp text
        super().__init__(format="png", layout=widgets.Layout(width=f"{width}px", max_width="100%", height="auto"),
                         **kwargs)
        if margins is None:
            self.figure = plots.new_figure(height)
        else:  # fixed margins: much faster to redraw than the constrained layout
            self.figure = plots.new_figure(height, layout=None)
            self.figure.subplots_adjust(**margins)
        self._background = None
        self._static_key = None

    def refresh(self) -> None:
        """Render the figure (Agg) and send the PNG to the front end.

        When the plot function marked its dynamic artists (see :mod:`bilayer.plots`) and nothing else
        changed since the last full draw, only those artists are drawn over the saved background
        (blitting); otherwise the whole figure is drawn and its background saved.
        """
        canvas = self.figure.canvas
        # twin axes (see plots.thickness_ratio_tradeoff) are covered by their host's markings
        marked = [ax.__dict__.get("_bilayer_artists", {}) for ax in self.figure.axes
                  if getattr(ax, "_bilayer_twin_of", None) is None]
        blit = len(marked) == 1 and "static_key" in marked[0]
        if blit and self._background is not None and marked[0]["static_key"] == self._static_key:
            canvas.restore_region(self._background)
            for artist in marked[0]["dynamic"]:
                self.figure.draw_artist(artist)
        elif blit:
            dynamic = marked[0]["dynamic"]
            for artist in dynamic:
                artist.set_visible(False)
            canvas.draw()
            self._background = canvas.copy_from_bbox(self.figure.bbox)
            self._static_key = marked[0]["static_key"]
            for artist in dynamic:
                artist.set_visible(True)
                self.figure.draw_artist(artist)
        else:
            canvas.draw()
            self._background = None
        self.value = self.png_bytes()

    def png_bytes(self) -> bytes:
        """The last rendered frame as PNG (fast zlib level: these images live only on screen)."""
        from PIL import Image

        canvas = self.figure.canvas
        width, height = canvas.get_width_height(physical=True)
        buffer = io.BytesIO()
        Image.frombuffer("RGBA", (width, height), canvas.buffer_rgba(), "raw", "RGBA", 0, 1).save(
            buffer, format="png", compress_level=1
        )
        return buffer.getvalue()

    def save(self, path) -> None:
        """Write the current figure to ``path`` (format from the suffix)."""
        self.figure.savefig(path)


class View(widgets.VBox):
    """A view of the model's current result. Hidden views only mark themselves stale and redraw
    when shown again, so a change costs one redraw of what is on screen."""

    active = traitlets.Bool(True)
    watches = ("result", "system")  # model traits that trigger a redraw

    def __init__(self, model: DesignModel, children=(), active: bool = True, **kwargs):
        super().__init__(children=list(children), **kwargs)
        self.model = model
        self._stale = True
        self.active = active
        model.observe(self._on_model, names=list(self.watches))

    def _on_model(self, change=None) -> None:
        if self.active:
            self.redraw()
        else:
            self._stale = True

    @traitlets.observe("active")
    def _on_active(self, change) -> None:
        if change["new"] and self._stale:
            self.redraw()

    def redraw(self) -> None:
        self._stale = False
        self.draw()

    def draw(self) -> None:  # pragma: no cover - every view implements it
        raise NotImplementedError
