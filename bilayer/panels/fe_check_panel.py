"""Finite-element check panel: the closed forms against a 2-D finite-element model of the same strip.

The run (:func:`bilayer.strip.fe_comparison.trust_report`: engine, interface model and scikit-fem, optionally on two
meshes) takes seconds, so it waits behind a button and runs in a background thread with a progress
bar; typing in the other panels stays responsive. The strip length and bond layers are the ones of the
interface tab. When the design changes after a run, the panel says the figures are out of date.
"""
from __future__ import annotations

import threading
from html import escape

import ipywidgets as widgets

from .. import plots
from ..core.errors import BilayerError
from ._base import DesignModel, FigureImage, message_html

__all__ = ["FECheckPanel", "MESHES"]

MESHES = {"coarse": dict(layer_elements=4, growth=1.5), "default": {}, "fine": dict(layer_elements=12, growth=1.2)}
"""Mesh densities offered (keyword arguments of :class:`bilayer.strip.fe.MeshOptions`)."""


class FECheckPanel(widgets.VBox):
    """Run the trust report of the current design and show closed form against FE, with its flags."""

    def __init__(self, model: DesignModel, active: bool = True):
        self.model = model
        self.mesh = widgets.Dropdown(options=tuple(MESHES), value="default", description="mesh",
                                     style={"description_width": "initial"})
        self.refine = widgets.Checkbox(value=True, description="also on a mesh with every element halved",
                                       indent=False)
        self.run_button = widgets.Button(description="run the FE check", icon="play", button_style="",
                                         tooltip="2-D finite elements of this strip (seconds; runs in the background)")
        self.progress = widgets.FloatProgress(value=0.0, min=0.0, max=1.0, description="progress",
                                              layout=widgets.Layout(width="28em"))
        self.status = widgets.HTML()
        self.image = FigureImage(3.6, {"left": 0.08, "right": 0.98, "bottom": 0.15, "top": 0.85, "wspace": 0.3})
        self.image.layout.display = "none"
        self.image.add_class("bilayer-fe-figure")
        self.run_button.add_class("bilayer-fe-run")
        self.table = widgets.HTML()
        self.thread: threading.Thread | None = None
        self.report = None
        self._design = None
        self.run_button.on_click(lambda _: self.run())
        model.observe(self._design_changed, names=["design", "strip_length", "bonds", "case"])
        model.observe(lambda change: self._show() if self.report is not None else None, names="system")
        super().__init__([
            widgets.HTML("<span style='color:#555;font-size:0.9em'>Plane stress for a narrow strip, plane strain "
                         "for a wide one (a plate is compared in plane strain). Strip length and bond layers as on "
                         "the interface tab.</span>"),
            widgets.HBox([self.mesh, self.refine]), widgets.HBox([self.run_button, self.progress]), self.status,
            self.image, self.table,
        ])

    def _inputs(self):
        design = self.model.case_design()
        return design, self.model.strip_length, tuple(self.model.bonds)

    def run(self) -> threading.Thread | None:
        """Start the FE check in a background thread (returns it; a running check is not restarted)."""
        if self.thread is not None and self.thread.is_alive():
            return self.thread
        from ..strip.fe import MeshOptions

        design, length, bonds = inputs = self._inputs()
        mesh = MeshOptions(**MESHES[self.mesh.value])
        refine = self.refine.value
        self.progress.value = 0.0
        self.run_button.disabled = True
        self.status.value = message_html("running…", "info")

        def progress(fraction: float, message: str) -> None:
            self.progress.value = float(fraction)
            self.progress.description = "progress"
            self.status.value = message_html(message, "info")

        def work() -> None:
            from ..strip.fe_comparison import trust_report

            try:
                report = trust_report(design.stack, design.temperatures, length, design.state, bonds=bonds,
                                      mesh=mesh, refine=refine, progress=progress)
            except (BilayerError, ImportError) as error:
                self.status.value = message_html(f"The FE check did not run: {error}")
            else:
                self.report, self._design = report, inputs
                self.progress.value = 1.0
                self._show()
            finally:
                self.run_button.disabled = False

        self.thread = threading.Thread(target=work, name="bilayer-fe-check", daemon=True)
        self.thread.start()
        return self.thread

    def _design_changed(self, change=None) -> None:
        if self.report is not None and self._inputs() != self._design:
            self.status.value = message_html("The design changed since this check: run it again.", "note")

    def _show(self) -> None:
        from ..core.units import format_quantity

        report, system = self.report, self.model.system
        plots.closed_form_against_fe(report, system, figure=self.image.figure)
        self.image.figure.subplots_adjust(left=0.09, right=0.98, bottom=0.15, top=0.85, wspace=0.3)
        self.image.refresh()
        self.image.layout.display = ""
        fe = report.fe
        rows = []
        for row in report.rows:
            within = "" if row.tolerance is None else ("✓" if abs(row.difference) <= row.tolerance else "✗")
            rows.append(f"<tr><td>{escape(row.quantity)}</td><td>{escape(row.where)}</td>"
                        f"<td>{format_quantity(row.closed_form, row.kind, system)}</td><td>{format_quantity(row.fe, row.kind, system)}</td>"
                        f"<td>{100 * row.difference:+.3f} %</td><td>{within}</td></tr>")
        flags = "".join(
            f"<li style='color:{'#b00020' if flag.severity == 'warning' else '#8a5a00'}'>{escape(flag.message)}</li>"
            for flag in report.flags)
        verdict = "all compared quantities within tolerance" if report.ok else "differences above tolerance"
        self.status.value = message_html(
            f"{fe.plane}, {fe.dofs} dofs, {fe.elements} elements, {fe.seconds:.2f} s: {verdict}.",
            "info" if report.ok else "error")
        self.table.value = (
            "<table style='font-size:0.85em'><tr><th>quantity</th><th>where</th><th>closed form</th><th>FE</th>"
            "<th>difference</th><th>within tolerance</th></tr>" + "".join(rows) + "</table>"
            + (f"<ul style='font-size:0.85em'>{flags}</ul>" if flags else "")
        )
        if self._inputs() != self._design:
            self._design_changed()

