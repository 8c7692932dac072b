"""Solder joint panel: joint type and geometry, field and test cycles, the life law chosen by the
solder's alloy (or the user's), the one chamber life with its cross-check, tolerances and the
assembly warpage at the cycle extremes, from :func:`bilayer.solder.assess_solder_design`.

The board and the component are layers of the design (``board layer`` and ``component layer``
numbers, from the bottom); entries that do not apply to the chosen joint type, life law or
acceleration set are hidden. Warnings (a law or acceleration set accepted for another alloy family
first) are shown in a box above the report; the report text is the one ``bilayer solder`` prints.
"""
from __future__ import annotations

from html import escape

import ipywidgets as widgets

from .. import plots
from ._base import DesignModel
from .job_panel import JobPanel

__all__ = ["SolderPanel", "DEFAULT_SOLDER_JOINT"]

DEFAULT_SOLDER_JOINT = {
    "dnp": 5e-3,
    "standoff": 0.1e-3,
    "cycle_low": 273.15,
    "cycle_high": 373.15,
    "dwell": 900.0,
    "cycle_rate": 1.0 / 86400.0,
}
"""Starting entries when the design has no [solder_joint] section yet (invented demo values)."""

LABELS = {
    "joint_type": "joint type", "dnp": "distance to neutral point", "standoff": "stand-off height",
    "joint_height": "joint height (if not the stand-off)", "ball_pitch": "ball pitch", "ball_columns": "balls per side",
    "ball_rows": "balls per other side", "lead_stiffness": "corner lead stiffness K_D",
    "joint_area": "solder load-bearing area A", "underfill": "underfilled", "nonideality_factor": "non-ideality factor F",
    "board_layer": "board layer number", "component_layer": "component layer number",
    "solder_material": "solder material (library key)", "cycle_low": "field cycle low", "cycle_high": "field cycle high",
    "dwell": "dwell (half cycle)", "cycle_rate": "field cycles per time", "board_cycle_low": "board low (if different)",
    "board_cycle_high": "board high (if different)", "test_cycle": "test cycle (e.g. -40/+125)",
    "test_dwell": "test dwell", "test_cycle_rate": "test cycles per time", "acceleration_set": "Norris-Landzberg set",
    "acceleration_n": "swing exponent n", "acceleration_m": "frequency exponent m",
    "acceleration_activation": "Ea/k", "life_law": "life law", "accept_other_alloy": "accept a law of another alloy",
    "strain_measure": "strain measure", "ductility": "fatigue ductility εf'", "fatigue_exponent": "exponent c0",
    "exponent_temperature_term": "c per degC (optional)", "exponent_dwell_term": "c dwell term (optional)",
    "inelastic_strain_range": "inelastic strain range", "test_inelastic_strain_range": "test inelastic strain range",
    "energy_coefficient": "K1 (cycles at 1 MJ/m^3)", "energy_exponent": "K2", "growth_coefficient": "K3 (growth)",
    "growth_exponent": "K4", "crack_length": "crack length at failure", "energy_density": "energy density per cycle",
    "test_energy_density": "test energy density", "weibull_shape": "Weibull shape (assumed)",
    "early_fraction": "early-failure fraction", "tolerance_dnp": "± DNP (relative)",
    "tolerance_standoff": "± joint height (relative)", "tolerance_cte_component": "± component CTE (relative)",
    "tolerance_cte_board": "± board CTE (relative)", "tolerance_factor": "± F (relative)",
    "tolerance_cycle": "± cycle temperatures", "monte_carlo": "Monte Carlo too", "samples": "Monte Carlo samples",
    "stress_free_basis": "warpage stress-free from", "warpage_at": "warpage at",
    "outline_length": "component length (for warpage)", "outline_width": "component width",
}
GROUPS = (
    ("joint", ("joint_type", "dnp", "ball_pitch", "ball_columns", "ball_rows", "standoff", "joint_height",
               "lead_stiffness", "joint_area", "underfill", "nonideality_factor", "board_layer", "component_layer",
               "solder_material")),
    ("field cycle", ("cycle_low", "cycle_high", "dwell", "cycle_rate", "board_cycle_low", "board_cycle_high")),
    ("life law", ("life_law", "accept_other_alloy", "strain_measure", "ductility", "fatigue_exponent",
                  "exponent_temperature_term", "exponent_dwell_term", "inelastic_strain_range",
                  "test_inelastic_strain_range", "energy_coefficient", "energy_exponent", "growth_coefficient",
                  "growth_exponent", "crack_length", "energy_density", "test_energy_density", "weibull_shape",
                  "early_fraction")),
    ("test cycle and acceleration", ("test_cycle", "test_dwell", "test_cycle_rate", "acceleration_set",
                                     "acceleration_n", "acceleration_m", "acceleration_activation")),
    ("tolerances", ("tolerance_dnp", "tolerance_standoff", "tolerance_cte_component", "tolerance_cte_board",
                    "tolerance_factor", "tolerance_cycle", "monte_carlo", "samples")),
    ("warpage", ("stress_free_basis", "warpage_at", "outline_length", "outline_width")),
)


class SolderPanel(JobPanel):
    """Shear strain, life, Weibull spread, chamber life, scatter and warpage of a solder joint."""

    section = "solder_joint"
    fields = tuple(name for _, names in GROUPS for name in names)
    labels = LABELS
    defaults = DEFAULT_SOLDER_JOINT
    caution_title = "Screening estimate"

    def __init__(self, model: DesignModel, active: bool = True):
        super().__init__(model, active=active)

    @property
    def assessment(self):
        """The assessment on screen (:class:`bilayer.solder.SolderAssessment`)."""
        return self.latest()

    def controls(self) -> widgets.Widget:
        from ..solder.joint import CYCLING_PRESETS

        self.form.entries["test_cycle"].widget.placeholder = "one of " + ", ".join(CYCLING_PRESETS)
        return self.grouped_controls(GROUPS)

    def shown_fields(self) -> tuple[str, ...]:
        from ..solder.section import ACCELERATION_KEYS, JOINT_TYPE_KEYS, LAW_KEYS

        value = {name: self.form.entries[name].widget.value
                 for name in ("joint_type", "life_law", "acceleration_set", "strain_measure", "monte_carlo")}
        hidden = {key for keys in JOINT_TYPE_KEYS.values() for key in keys} - set(JOINT_TYPE_KEYS[value["joint_type"]])
        hidden |= {key for keys in LAW_KEYS.values() for key in keys} - set(LAW_KEYS[value["life_law"]])
        if value["life_law"] != "coffin_manson":
            hidden.add("strain_measure")
        elif value["strain_measure"] != "inelastic":
            hidden |= {"inelastic_strain_range", "test_inelastic_strain_range"}
        if value["acceleration_set"] != "user":
            hidden |= set(ACCELERATION_KEYS)
        if not value["monte_carlo"]:
            hidden.add("samples")
        return tuple(name for name in self.fields if name not in hidden)

    def render(self, assessment) -> None:
        from ..solder.life_laws import weibull_scale

        joint = assessment.joint
        populations = [("field cycle", joint.weibull_scale, joint.weibull_shape)]
        marks = [("field median", joint.median_life, 0.5),
                 (f"field {100 * joint.early_fraction:g} %", joint.early_life, joint.early_fraction)]
        chamber = joint.chamber
        if chamber is not None:
            populations.append((f"test cycle {joint.test.label}", weibull_scale(chamber.life, joint.weibull_shape),
                                joint.weibull_shape))
            marks.append(("chamber median (stood behind)", chamber.life, 0.5))
            if chamber.cross_check is not None:
                marks.append(("cross-check: field / AF", chamber.cross_check, 0.5))
        plots.weibull_failures(populations, ax=self.ax, marks=marks,
                               title=f"Failed fraction against cycles ({joint.life_law.name} median, Weibull shape "
                                     f"{joint.weibull_shape:g} assumed)")
        warnings = assessment.warnings
        box = ""
        if warnings:
            items = "".join(f"<li>{escape(text)}</li>" for text in warnings)
            box = (f"<div class='bilayer-solder-warnings' style='border:1px solid #b35c00;background:#fff3e0;"
                   f"padding:4px 8px;font-size:0.85em'><b>Warnings</b><ul style='margin:2px 0'>{items}</ul></div>")
        self.summary.value = (f"{box}<pre style='white-space:pre-wrap;font-size:0.85em'>"
                              f"{escape(self.report_text(assessment))}</pre>")
