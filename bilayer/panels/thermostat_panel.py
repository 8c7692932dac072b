"""Thermostat element panel: form and size of the element, contact gap or set point, stress limit,
tolerances; travel against temperature and the element report, live; the Monte Carlo scatter of the
set point behind a button with a progress bar.

Entries fill the design's ``[thermostat]`` section (checked by the same spec as a design file), and
the report is :func:`bilayer.thermostat.assessment.analyse` of the current design: the panel computes
nothing itself. Thermal cut-outs and protectors are safety devices; the cautions stay on screen.
"""
from __future__ import annotations

import threading
from html import escape

import ipywidgets as widgets

from .. import plots
from ..core.errors import BilayerError
from ._base import DesignModel, message_html
from .job_panel import JobPanel

__all__ = ["ThermostatPanel", "DEFAULT_THERMOSTAT"]

DEFAULT_THERMOSTAT = {
    "form": "cantilever",
    "width": 5e-3,
    "length": 30e-3,
    "gap": 1e-3,
    "overtravel": 10.0,
}
"""Starting entries when the design has no [thermostat] section yet (invented demo values)."""

FORM_FIELDS = {
    "cantilever": ("length",),
    "supported": ("length",),
    "u_shape": ("leg_length", "bend_radius", "bend_toward"),
    "spiral": ("length", "pointer_length"),
    "helix": ("length", "pointer_length", "lead_angle"),
    "disc": ("diameter", "dome_height"),
}
COMMON = ("form", "width", "reference_temperature", "contact_side", "limit_stress", "stress_factor", "overtravel",
          "curve_from", "curve_to")
TOLERANCES = ("tolerance_thickness", "tolerance_length", "tolerance_cte", "tolerance_modulus", "tolerance_gap",
              "samples")
DATASHEET = ("flexivity", "strip_thickness", "flexural_modulus", "poisson_ratio", "tolerance_flexivity")
LABELS = {
    "form": "element form", "width": "strip width", "length": "length", "leg_length": "leg length",
    "bend_radius": "bend radius", "bend_toward": "second leg on the", "pointer_length": "pointer length",
    "lead_angle": "lead angle", "diameter": "disc diameter", "dome_height": "formed dome height",
    "reference_temperature": "reference temperature", "gap": "gap to the contact",
    "angle_gap": "rotation to the stop", "set_point": "required set point", "contact_side": "contact on the side",
    "limit_stress": "stress limit", "stress_factor": "stress factor",
    "overtravel": "overtravel", "curve_from": "curve from", "curve_to": "curve to",
    "tolerance_thickness": "± thickness (relative, 3σ)", "tolerance_length": "± length (relative, 3σ)",
    "tolerance_cte": "± CTE (relative, 3σ)", "tolerance_modulus": "± modulus (relative, 3σ)",
    "tolerance_gap": "± gap (3σ)", "samples": "Monte Carlo samples", "flexivity": "flexivity (data sheet)",
    "strip_thickness": "strip thickness", "flexural_modulus": "flexural modulus", "poisson_ratio": "Poisson's ratio",
    "tolerance_flexivity": "± flexivity (relative, 3σ)",
}


class ThermostatPanel(JobPanel):
    """Travel, set point, contact force, stress span and set-point scatter of a thermostat element."""

    section = "thermostat"
    fields = (*COMMON, *sorted({n for group in FORM_FIELDS.values() for n in group}), "gap", "angle_gap",
              "set_point", *TOLERANCES, *DATASHEET)
    labels = LABELS
    defaults = DEFAULT_THERMOSTAT
    caution_title = "Safety device caution"

    def __init__(self, model: DesignModel, active: bool = True):
        self.goal = widgets.ToggleButtons(
            options=(("set point for a gap", "gap"), ("gap for a set point", "set_point")), value="gap",
            description="solve for", style={"description_width": "initial", "button_width": "11em"})
        self.datasheet = widgets.Checkbox(value=False, description="use a data-sheet flexivity instead of the layers",
                                          indent=False)
        self.goal.observe(lambda change: self.entries_changed(), names="value")
        self.datasheet.observe(lambda change: self.entries_changed(), names="value")
        self.scatter_button = widgets.Button(description="run Monte Carlo", icon="play",
                                             tooltip="set-point scatter from the tolerances (runs in the background)")
        self.progress = widgets.IntProgress(value=0, min=0, max=1, description="samples",
                                            layout=widgets.Layout(width="28em"))
        self.scatter = widgets.HTML()
        self.scatter_button.on_click(lambda _: self.run_monte_carlo())
        self.thread: threading.Thread | None = None
        self.scatter_result = None
        super().__init__(model, active=active)

    @property
    def report(self):
        """The element report on screen (:class:`bilayer.thermostat.assessment.ThermostatReport`)."""
        return self.latest()

    def controls(self) -> widgets.Widget:
        entries = self.form.entries
        geometry = widgets.VBox([entries[n].widget for n in self.fields if n in COMMON[:3] or
                                 any(n in group for group in FORM_FIELDS.values())])
        contact = widgets.VBox([self.goal] + [entries[n].widget for n in (
            "gap", "angle_gap", "set_point", "contact_side", "limit_stress", "stress_factor", "overtravel",
            "curve_from", "curve_to")])
        tolerances = widgets.VBox([entries[n].widget for n in TOLERANCES] +
                                  [widgets.HBox([self.scatter_button, self.progress]), self.scatter])
        datasheet = widgets.VBox([self.datasheet] + [entries[n].widget for n in DATASHEET])
        self.sections = widgets.Accordion([geometry, contact, tolerances, datasheet],
                                          titles=("element", "contact and limits", "tolerances", "data-sheet flexivity"))
        self.sections.selected_index = 0
        return self.sections

    def fill_extra(self, values: dict) -> None:
        self.goal.value = "set_point" if values.get("set_point") is not None and "gap" not in values else "gap"
        self.datasheet.value = values.get("flexivity") is not None

    def shown_fields(self) -> tuple[str, ...]:
        form = self.form.entries["form"].widget.value
        coil = form in ("spiral", "helix")
        shown = [*COMMON, *FORM_FIELDS[form], *TOLERANCES]
        shown.append("set_point" if self.goal.value == "set_point" else ("angle_gap" if coil else "gap"))
        if self.datasheet.value:
            shown += DATASHEET
        return tuple(shown)

    def after_change(self) -> None:
        self.scatter_result = None
        self.scatter.value = ""

    def compute(self, design):
        """The element report without the Monte Carlo run (that one waits for the button)."""
        from ..thermostat.assessment import analyse

        values = dict(design.sections["thermostat"])
        return analyse(design.with_section("thermostat", {**values, "monte_carlo": False}))

    def render(self, report) -> None:
        system = self.model.system
        curve, set_point = report.curve, report.set_point
        contact = None if set_point is None else set_point.side * set_point.gap
        plots.travel_curve(curve.temperatures, curve.travel, curve.travel_small, curve.unit, system, ax=self.ax,
                           contact=contact, set_point=None if set_point is None else set_point.temperature,
                           reference=report.element.reference_temperature,
                           title=f"{report.element.form.kind}: travel against temperature")
        self.summary.value = (f"<pre style='white-space:pre-wrap;font-size:0.85em'>"
                              f"{escape(report.to_text(system, cautions=False))}</pre>")

    # -- Monte Carlo behind a button ---------------------------------------------------------
    def run_monte_carlo(self) -> threading.Thread | None:
        """Start the set-point Monte Carlo in a background thread; typing stays responsive."""
        if self.thread is not None and self.thread.is_alive():
            return self.thread
        design = self.current_design()
        values = dict(design.sections["thermostat"])
        total = int(values.get("samples", 200_000))
        self.progress.max, self.progress.value = total, 0
        self.scatter_button.disabled = True
        self.scatter.value = message_html("running…", "info")

        def progress(fraction: float, message: str) -> None:
            self.progress.value = round(fraction * total)

        def work() -> None:
            from ..thermostat.assessment import analyse

            try:
                report = analyse(design.with_section("thermostat", {**values, "monte_carlo": True}), progress=progress)
            except BilayerError as error:
                self.scatter.value = message_html(str(error))
            else:
                self._show_scatter(report, design)
            finally:
                self.scatter_button.disabled = False

        self.thread = threading.Thread(target=work, name="bilayer-monte-carlo", daemon=True)
        self.thread.start()
        return self.thread

    def _show_scatter(self, report, design) -> None:
        stats = report.monte_carlo
        if stats is None:
            self.scatter.value = message_html("No tolerances entered, or no gap: nothing to scatter.", "note")
            return
        if design.sections["thermostat"] != self.current_design().sections["thermostat"] or \
                design.stack != self.model.design.stack:
            self.scatter.value = message_html("The design changed during the run; run it again.", "note")
            return
        from ..core.units import format_quantity

        system = self.model.system
        self.scatter_result = stats
        lo, hi = stats.percentiles[0.135], stats.percentiles[99.865]
        contributors = ", ".join(f"{name} {100 * share:.1f} %" for name, share in stats.contributors)
        self.scatter.value = (
            f"<b>Monte Carlo, {stats.samples} samples</b>: mean {format_quantity(stats.mean, 'temperature', system)}, "
            f"standard deviation {format_quantity(stats.std, 'temperature_difference', system)}, 0.135–99.865 % "
            f"{format_quantity(lo, 'temperature', system)} to {format_quantity(hi, 'temperature', system)}<br>contributors: {escape(contributors)}"
        )
