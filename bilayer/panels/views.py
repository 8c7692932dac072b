"""Live views of the current design: a result table, stress through the thickness, the deflected
shape and the sign-convention sketch. Each redraws in place when the model publishes a new result
or unit system; none of them computes mechanics (the model's one engine call did)."""
from __future__ import annotations

from html import escape

import ipywidgets as widgets
import numpy as np

from .. import plots
from ..core.errors import BilayerError
from ._base import DesignModel, FigureImage, QuantityField, View, message_html

__all__ = ["ResultTable", "StressView", "ShapeView", "SignConventionSketch", "UnitSystemSwitch", "caution_html"]


def caution_html() -> str:
    """The project's cautions as a small grey paragraph."""
    from ..core.cautions import CAUTIONS

    text = " ".join(CAUTIONS)
    return f"<p style='color:#666;font-size:0.8em;line-height:1.3'>{escape(text)}</p>"


def _fmt(value: float, kind: str, system: str) -> str:
    from ..core.units import format_quantity

    return format_quantity(value, kind, system=system, digits=4)


class ResultTable(View):
    """Curvature, radius and the stress at the bottom and top of every layer, in the chosen units.

    ``shown`` holds the SI numbers behind the table (tests compare them with a direct engine call).
    """

    def __init__(self, model: DesignModel, active: bool = True):
        self.html = widgets.HTML()
        self.html.add_class("bilayer-result-table")
        self.shown: dict = {}
        super().__init__(model, [self.html], active=active)
        self._on_model()

    watches = ("result", "system", "case")

    def draw(self) -> None:
        result, system, case = self.model.result, self.model.system, self.model.case_index

        def pick(values):
            values = np.asarray(values, float)
            return values if case is None else values[case]

        kappa = float(pick(result.curvature))
        radius_value = float(pick(result.radius))
        bottom, top = pick(result.stress_bottom), pick(result.stress_top)
        change = float(pick(result.temperature_change))
        self.shown = {
            "state": result.state.value,
            "temperature_change": change,
            "curvature": kappa,
            "radius": radius_value,
            "stress_bottom": tuple(float(s) for s in bottom),
            "stress_top": tuple(float(s) for s in top),
        }
        radius = "flat (infinite)" if not np.isfinite(radius_value) else _fmt(radius_value, "length", system)
        head = (
            f"<b>{escape(result.state.description)}</b><br>"
            f"ΔT = {_fmt(change, 'temperature_difference', system)} &nbsp; "
            f"curvature κ = {_fmt(kappa, 'curvature', system)} &nbsp; radius = {radius}"
        )
        rows = "".join(
            f"<tr><td>{i + 1}</td><td>{escape(result.labels[i])}</td>"
            f"<td>{_fmt(result.thicknesses[i], 'length', system)}</td>"
            f"<td style='text-align:right'>{_fmt(bottom[i], 'stress', system)}</td>"
            f"<td style='text-align:right'>{_fmt(top[i], 'stress', system)}</td></tr>"
            for i in reversed(range(result.n_layers))
        )
        table = (
            "<style>.bilayer-result-table td, .bilayer-result-table th {padding: 1px 10px; text-align: left}</style>"
            "<table style='border-collapse:collapse;font-size:0.9em'>"
            "<tr><th>layer</th><th>name</th><th>thickness</th><th>σx at bottom face</th><th>σx at top face</th></tr>"
            f"{rows}</table>"
        )
        notes = list(result.warnings) + [m for m in self.model.messages if m not in result.warnings]
        warning = "".join(f"<li>{escape(n)}</li>" for n in notes)
        warning = f"<ul style='color:#8a5a00;font-size:0.85em'>{warning}</ul>" if warning else ""
        self.html.value = head + table + warning + caution_html()


class _FigureView(View):
    height = 3.6
    watches = ("result", "system", "case")
    margins = {"left": 0.12, "right": 0.97, "bottom": 0.15, "top": 0.9}

    def __init__(self, model: DesignModel, controls=(), active: bool = True):
        self.image = FigureImage(self.height, self.margins)
        self.figure = self.image.figure
        self.ax = self.figure.add_subplot()
        if not hasattr(self, "message"):
            self.message = widgets.HTML()
        super().__init__(model, [*controls, self.image, self.message], active=active)

    @property
    def png(self) -> bytes:
        return self.image.value


class StressView(_FigureView):
    """sigma_x through the thickness with the layers shaded and named (:func:`bilayer.plots.stress_through_thickness`)."""

    margins = {"left": 0.12, "right": 0.66, "bottom": 0.14, "top": 0.91}

    def __init__(self, model: DesignModel, active: bool = True):
        super().__init__(model, active=active)
        self.image.add_class("bilayer-stress-figure")
        self._on_model()

    def draw(self) -> None:
        plots.stress_through_thickness(self.model.result, self.model.system, ax=self.ax,
                                       index=self.model.case_index)
        self.image.refresh()


class StripLengthField:
    """The strip length shared by the shape, interface and trade-off views (model.strip_length)."""

    def __init__(self, model: DesignModel, message: widgets.HTML):
        self.model = model
        self.message = message
        self.field = QuantityField("strip length", "length", "strip_length", model.strip_length, model.system,
                                   width="16em")
        self.field.observe(self._typed)
        model.observe(self._model_changed, names=["strip_length", "system"])

    def _typed(self, change=None) -> None:
        try:
            value = self.field.value()
            if not 0 < value <= 100:
                from ..core.errors import InputError

                raise InputError("strip_length", value, "0 < strip_length <= 100 m")
        except BilayerError as error:
            self.message.value = message_html(f"{error}; the views keep the last valid length.")
            return
        self.message.value = ""
        self.model.strip_length = value

    def _model_changed(self, change) -> None:
        if change["name"] == "system":
            self.field.convert(change["new"])
        elif change["new"] != _safe_value(self.field):
            self.field.show(change["new"], self.model.system)


def _safe_value(field: QuantityField):
    try:
        return field.value()
    except BilayerError:
        return None


class ShapeView(_FigureView):
    """The deflected strip for the shared strip length and a support the user picks
    (:func:`bilayer.plots.deflected_shape`)."""

    height = 3.2
    margins = {"left": 0.12, "right": 0.98, "bottom": 0.15, "top": 0.9}
    watches = ("result", "system", "strip_length", "case")

    def __init__(self, model: DesignModel, support: str = "cantilever", active: bool = True):
        self.message = widgets.HTML()
        self.length = StripLengthField(model, self.message)
        self.support = widgets.Dropdown(
            options=(("clamped at one end", "cantilever"), ("held at its centre", "centre")),
            value=support, description="support", style={"description_width": "initial"},
        )
        super().__init__(model, [widgets.HBox([self.length.field.text, self.support])], active=active)
        self.support.observe(lambda change: self.redraw(), names="value")
        self._on_model()

    def draw(self) -> None:
        plots.deflected_shape(self.model.result, self.model.strip_length, self.support.value, self.model.system,
                              ax=self.ax, index=self.model.case_index)
        self.image.refresh()


class SignConventionSketch(widgets.VBox):
    """The project's sign conventions drawn once (numbering, z, kappa > 0, tension > 0, Delta T)."""

    def __init__(self):
        self.image = FigureImage(2.7)
        plots.sign_convention_sketch(ax=self.image.figure.add_subplot())
        self.image.refresh()
        super().__init__([self.image])


class UnitSystemSwitch(widgets.ToggleButtons):
    """Switch between SI and US customary units for every entry, table and figure."""

    def __init__(self, model: DesignModel):
        super().__init__(
            options=(("SI (mm, MPa, °C)", "si"), ("US (in, ksi, °F)", "us")),
            value=model.system,
            description="units",
            style={"description_width": "initial", "button_width": "10em"},
            tooltips=["SI: mm or µm, MPa, GPa, °C, ppm/K", "US customary: in or mil, ksi or psi, °F, ppm/°F"],
        )
        widgets.link((self, "value"), (model, "system"))
