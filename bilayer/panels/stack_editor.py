"""Stack editor: layers (add, remove, reorder; library or custom material; thickness with units),
bending state, stress-free and operating temperatures.

Every entry is a text box that keeps what was typed. After each change the editor rebuilds an
immutable :class:`~bilayer.core.stack.Design` from all entries and proposes it to the model. An entry
that does not parse, or a design the engine refuses, shows its message beside the entry and the
views keep the last valid design.
"""
from __future__ import annotations

import contextlib
from typing import TYPE_CHECKING

import ipywidgets as widgets
import numpy as np

from ..core.errors import BilayerError
from ..core.stack import BendingState, Layer, Stack, Temperatures
from ..core.units import display_unit, from_si, to_si
from ._base import DesignModel, QuantityField, capture_warnings, message_html

if TYPE_CHECKING:  # pragma: no cover
    from ..core.materials import Material, MaterialLibrary

__all__ = ["StackEditor", "LayerRow", "CUSTOM"]

CUSTOM = "__custom__"
"""Dropdown value of a layer whose material is given by its own values instead of the library."""

STATE_CHOICES = (
    ("narrow strip", BendingState.NARROW.value),
    ("wide strip", BendingState.WIDE.value),
    ("plate / disc", BendingState.PLATE.value),
)

SLIDER_RANGE = {"si": (-60.0, 300.0), "us": (-76.0, 572.0)}
"""Default span of the operating-temperature slider (degC / degF); a convenience, never validation."""


class LayerRow:
    """Controls of one layer. ``layer()`` builds the Layer or raises the project error."""

    def __init__(self, editor: "StackEditor", layer: Layer, system: str):
        self.editor = editor
        self.number = widgets.HTML(layout=widgets.Layout(width="2.2em"))
        key = editor.library_key(layer.material)
        self.material = widgets.Dropdown(
            options=editor.material_options,
            value=key or CUSTOM,
            layout=widgets.Layout(width="19em"),
            tooltip="material from the library, or custom values",
        )
        self.thickness = QuantityField("thickness", "length", "thickness", layer.thickness, system, width="13em")
        self.label = widgets.Text(
            value=layer.label, placeholder="label (optional)", continuous_update=False,
            layout=widgets.Layout(width="10em"),
        )
        button = dict(layout=widgets.Layout(width="2.4em"))
        self.move_up = widgets.Button(description="▲", tooltip="move this layer up (toward the top)", **button)
        self.move_down = widgets.Button(description="▼", tooltip="move this layer down (toward the bottom)", **button)
        self.remove = widgets.Button(description="✕", tooltip="remove this layer", **button)
        self.original = layer.material
        material = layer.material
        self.custom_name = widgets.Text(
            value=material.name if key is None else "custom material", description="name",
            continuous_update=False, layout=widgets.Layout(width="16em"), style={"description_width": "initial"},
        )
        self.custom_modulus = QuantityField("E", "modulus", "youngs_modulus", material.youngs_modulus, system, width="10em")
        self.custom_poisson = QuantityField("ν", "dimensionless", "poisson_ratio", material.poisson_ratio, system, width="7em")
        self.custom_cte = QuantityField("CTE", "cte", "cte", material.alpha, system, width="11em")
        self._custom_texts = self._custom_snapshot() if key is None else None
        self.custom_box = widgets.HBox(
            [self.custom_name, self.custom_modulus.text, self.custom_poisson.text, self.custom_cte.text],
            layout=widgets.Layout(margin="0 0 0 2.4em"),
        )
        self.message = widgets.HTML(layout=widgets.Layout(margin="0 0 0 2.4em"))
        self.box = widgets.VBox([
            widgets.HBox([self.number, self.material, self.thickness.text, self.label,
                          self.move_up, self.move_down, self.remove]),
            self.custom_box,
            self.message,
        ])
        self._show_custom()
        for control in (self.material, self.label, self.custom_name):
            control.observe(self._changed, names="value")
        for field in (self.thickness, self.custom_modulus, self.custom_poisson, self.custom_cte):
            field.observe(self._changed)
        self.move_up.on_click(lambda _: editor.move(self, +1))
        self.move_down.on_click(lambda _: editor.move(self, -1))
        self.remove.on_click(lambda _: editor.remove(self))

    def _custom_snapshot(self) -> tuple[str, ...]:
        return (self.custom_name.value, self.custom_modulus.text.value, self.custom_poisson.text.value,
                self.custom_cte.text.value)

    def _show_custom(self) -> None:
        self.custom_box.layout.display = "" if self.material.value == CUSTOM else "none"

    def _changed(self, change) -> None:
        self._show_custom()
        self.editor.rebuild()

    def set_index(self, index: int, count: int) -> None:
        """Layer ``index`` (0 = bottom) of ``count``: number the row and name its fields."""
        where = " (top)" if index == count - 1 and count > 1 else " (bottom)" if index == 0 and count > 1 else ""
        self.number.value = f"<b title='layer {index + 1}{where}'>{index + 1}</b>"
        self.thickness.field = f"layers[{index}].thickness"
        self.custom_modulus.field = f"layers[{index}].youngs_modulus"
        self.custom_poisson.field = f"layers[{index}].poisson_ratio"
        self.custom_cte.field = f"layers[{index}].cte"
        self.move_up.disabled = index == count - 1
        self.move_down.disabled = index == 0
        self.remove.disabled = count == 1

    def material_value(self) -> "Material":
        if self.material.value != CUSTOM:
            return self.editor.library[self.material.value]
        if self._custom_texts is not None and self._custom_snapshot() == self._custom_texts:
            return self.original  # untouched custom material: keep it whole (CTE tables included)
        from ..core.materials import Material

        return Material(
            name=self.custom_name.value.strip() or "custom material",
            youngs_modulus=self.custom_modulus.value(),
            poisson_ratio=self.custom_poisson.value(),
            cte=self.custom_cte.value(),
            category="custom",
        )

    def layer(self) -> Layer:
        return Layer(self.material_value(), self.thickness.value(), self.label.value.strip())

    def set_system(self, system: str) -> None:
        for field in (self.thickness, self.custom_modulus, self.custom_cte):
            field.convert(system)
        if self._custom_texts is not None:
            self._custom_texts = self._custom_snapshot()

    @property
    def fields(self) -> tuple[QuantityField, ...]:
        return (self.thickness, self.custom_modulus, self.custom_poisson, self.custom_cte)


class StackEditor(widgets.VBox):
    """Edits the stack, bending state and temperatures of the model's current design."""

    def __init__(self, model: DesignModel, library: "MaterialLibrary | None" = None):
        from ..core.materials import default_library

        super().__init__()
        self.model = model
        self.library = library if library is not None else default_library()
        self.material_options = self._material_options()
        self._quiet = False
        self._proposed = None
        self._failed = False
        design, system = model.design, model.system
        self.rows: list[LayerRow] = []
        self.add_button = widgets.Button(description="add layer on top", icon="plus", tooltip="add a layer on top of the stack")
        self.add_button.on_click(lambda _: self.add())
        self.state = widgets.ToggleButtons(
            options=STATE_CHOICES, value=design.state.value, description="bending state",
            style={"description_width": "initial", "button_width": "8.5em"},
            tooltips=[BendingState(v).description for _, v in STATE_CHOICES],
        )
        self.stress_free = QuantityField("stress-free temperature", "temperature", "stress_free_temperature",
                                         design.temperatures.stress_free, system, width="20em")
        self.operating = QuantityField("operating temperature", "temperature", "operating_temperature",
                                       design.temperatures.operating, system, width="24em", allow_list=True,
                                       tooltip="one temperature, or several separated by commas; press Enter")
        self.case = widgets.Dropdown(description="show the case at", style={"description_width": "initial"})
        self.case.observe(self._case_chosen, names="value")
        self.operating_slider = widgets.FloatSlider(
            description="operating", step=1.0, readout_format=".0f", continuous_update=False,
            style={"description_width": "initial"}, layout=widgets.Layout(width="28em"),
        )
        self.slider_unit = widgets.HTML()
        self.temperature_message = widgets.HTML()
        self.state_note = widgets.HTML()
        self.message = widgets.HTML()
        self.layer_box = widgets.VBox()
        self.children = [
            widgets.HTML("<b>Layers</b> <span style='color:#555'>(top of the stack first; numbered from the bottom)</span>"),
            self.layer_box,
            self.add_button,
            self.state,
            self.state_note,
            widgets.HBox([self.stress_free.text, self.operating.text]),
            widgets.HBox([self.operating_slider, self.slider_unit, self.case]),
            self.temperature_message,
            self.message,
        ]
        self.state.observe(self._changed, names="value")
        self.stress_free.observe(self._changed)
        self.operating.observe(self._changed)
        self.operating_slider.observe(self._slider_moved, names="value")
        model.observe(self._model_design, names="design")
        model.observe(self._model_system, names="system")
        self.show_design(design)

    # -- library -----------------------------------------------------------------------------
    def _material_options(self) -> list[tuple[str, str]]:
        items = sorted(self.library.items(), key=lambda kv: (kv[1].category, kv[1].name.lower()))
        options = [(f"{m.name}" + (f" [{m.category}]" if m.category else ""), key) for key, m in items]
        return options + [("custom values…", CUSTOM)]

    def library_key(self, material: "Material") -> str | None:
        key = getattr(material, "key", "")
        if key in self.library and self.library[key] == material:
            return key
        for k, m in self.library.items():
            if m == material:
                return k
        return None

    # -- showing a design --------------------------------------------------------------------
    @contextlib.contextmanager
    def quiet(self):
        """Change several controls without rebuilding after each one."""
        previous, self._quiet = self._quiet, True
        try:
            yield
        finally:
            self._quiet = previous

    def show_design(self, design) -> None:
        """Fill every control from ``design`` (used at start, after loading a file, ...)."""
        system = self.model.system
        with self.quiet():
            self.rows = [LayerRow(self, layer, system) for layer in design.stack.layers]
            self.state.value = design.state.value
            self.stress_free.show(design.temperatures.stress_free, system)
            self.operating.show(design.temperatures.operating, system)
            self._renumber()
            self._sync_slider()
            for row in self.rows:
                row.message.value = ""
            self.temperature_message.value = ""
            self.message.value = ""
            self._failed = False
            self.state_note.value = self._state_text(design.state)

    def _renumber(self) -> None:
        count = len(self.rows)
        for index, row in enumerate(self.rows):
            row.set_index(index, count)
        self.layer_box.children = [row.box for row in reversed(self.rows)]

    @staticmethod
    def _state_text(state: BendingState) -> str:
        return (f"<span style='color:#555;font-size:0.9em'>{state.description}. The choice changes stresses "
                "and forces far more than curvature.</span>")

    # -- layer operations --------------------------------------------------------------------
    def add(self) -> None:
        """Add a layer on top: a copy of the current top layer's material and thickness."""
        top = self.rows[-1]
        try:
            layer = top.layer()
        except BilayerError:
            layer = self.model.design.stack.layers[-1]
        self.rows.append(LayerRow(self, Layer(layer.material, layer.thickness), self.model.system))
        self._renumber()
        self.rebuild()

    def remove(self, row: LayerRow) -> None:
        if len(self.rows) > 1:
            self.rows.remove(row)
            self._renumber()
            self.rebuild()

    def move(self, row: LayerRow, step: int) -> None:
        """Move a layer up (+1, toward the top) or down (-1)."""
        i = self.rows.index(row)
        j = i + step
        if 0 <= j < len(self.rows):
            self.rows[i], self.rows[j] = self.rows[j], self.rows[i]
            self._renumber()
            self.rebuild()

    # -- rebuilding the design ---------------------------------------------------------------
    def _changed(self, change=None) -> None:
        self.rebuild()

    def rebuild(self) -> bool:
        """Build a design from every entry and propose it. Returns True if it became current."""
        if self._quiet:
            return False
        failed = False
        layers = []
        with capture_warnings() as caught:
            for row in self.rows:
                try:
                    layers.append(row.layer())
                    row.message.value = ""
                except BilayerError as error:
                    row.message.value = message_html(str(error))
                    failed = True
            try:
                temperatures = Temperatures(self.stress_free.value(), self.operating.value())
                self.temperature_message.value = ""
            except BilayerError as error:
                self.temperature_message.value = message_html(str(error))
                failed = True
        notes = sorted({str(w.message) for w in caught})
        self._failed = failed
        if failed:
            self.message.value = message_html("The views show the last valid design; fix the entry marked in red.")
            return False
        state = BendingState(self.state.value)
        design = self.model.design.replace(stack=Stack(tuple(layers)), temperatures=temperatures, state=state)
        self._proposed = design
        error = self.model.propose(design)
        self._proposed = None
        self._failed = bool(error)
        if error:
            self.message.value = message_html(f"{error}. The views show the last valid design.")
            return False
        self.state_note.value = self._state_text(state)
        self.message.value = message_html("; ".join(notes), "note")
        self._sync_slider()
        return True

    def pending_error(self) -> str:
        """"" when the entries on screen are the current design, else why they are not."""
        return "an entry of the stack is invalid (marked in red)" if self._failed else ""

    def _model_design(self, change) -> None:
        if change["new"] is not self._proposed:
            self.show_design(change["new"])

    def _model_system(self, change) -> None:
        system = change["new"]
        with self.quiet():
            for row in self.rows:
                row.set_system(system)
            self.stress_free.convert(system)
            self.operating.convert(system)
            self._sync_slider()

    # -- operating-temperature slider --------------------------------------------------------
    def _slider_unit(self) -> str:
        return display_unit("temperature", self.model.system)

    def _display_temperature(self, kelvin: float) -> float:
        return from_si(kelvin, "temperature", self._slider_unit())

    def _kelvin(self, shown: float) -> float:
        return to_si(shown, "temperature", self._slider_unit())

    def _sync_slider(self) -> None:
        """Put the slider on the operating temperature of the current design (display units); with
        several operating temperatures the slider rests and a case selector appears instead."""
        operating = self.model.design.temperatures.operating
        several = bool(np.ndim(operating))
        self.operating_slider.disabled = several
        self.operating_slider.layout.display = "none" if several else ""
        self.slider_unit.layout.display = "none" if several else ""
        self.case.layout.display = "" if several else "none"
        self.slider_unit.value = "°C" if self.model.system == "si" else "°F"
        if several:
            options = [(f"{self._display_temperature(float(t)):.4g} {self.slider_unit.value}", i)
                       for i, t in enumerate(operating)]
            previous, self._quiet = self._quiet, True
            try:
                if list(self.case.options) != options:
                    self.case.options = options
                self.case.value = self.model.case
            finally:
                self._quiet = previous
            return
        shown = self._display_temperature(float(operating))
        low, high = SLIDER_RANGE[self.model.system]
        previous, self._quiet = self._quiet, True
        try:
            slider = self.operating_slider
            with slider.hold_trait_notifications():
                slider.min, slider.max = min(low, shown), max(high, shown)
                slider.value = shown
        finally:
            self._quiet = previous

    def _case_chosen(self, change) -> None:
        if not self._quiet and change["new"] is not None:
            self.model.case = change["new"]

    def _slider_moved(self, change) -> None:
        if self._quiet:
            return
        self.operating.show(self._kelvin(change["new"]), self.model.system)
