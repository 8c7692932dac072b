"""Solder joint panel: DNP, stand-off, field and test cycles; Engelmaier life with its Weibull spread,
Norris-Landzberg acceleration and the assembly warpage, from :func:`bilayer.solder.assess_solder_design`.

The board and the component are layers of the design (``board layer`` and ``component layer``
numbers, from the bottom); the report text is the one the ``bilayer solder`` command prints.
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
    "dnp": "distance to neutral point", "standoff": "stand-off height", "nonideality_factor": "non-ideality factor F",
    "board_layer": "board layer number", "component_layer": "component layer number",
    "solder_material": "solder material (library key)", "cycle_low": "field cycle low", "cycle_high": "field cycle high",
    "dwell": "dwell (half cycle)", "cycle_rate": "field cycles per time", "board_cycle_low": "board low (if different)",
    "board_cycle_high": "board high (if different)", "test_cycle": "test cycle (e.g. -40/+125)",
    "test_dwell": "test dwell", "test_cycle_rate": "test cycles per time", "acceleration_set": "Norris-Landzberg set",
    "weibull_shape": "Weibull shape (assumed)", "early_fraction": "early-failure fraction",
    "ductility": "fatigue ductility εf'", "stress_free_basis": "warpage stress-free from",
    "outline_length": "component length (for warpage)", "outline_width": "component width",
}
GROUPS = (
    ("joint", ("dnp", "standoff", "nonideality_factor", "board_layer", "component_layer", "solder_material")),
    ("field cycle", ("cycle_low", "cycle_high", "dwell", "cycle_rate", "board_cycle_low", "board_cycle_high")),
    ("test cycle and acceleration", ("test_cycle", "test_dwell", "test_cycle_rate", "acceleration_set")),
    ("life model", ("weibull_shape", "early_fraction", "ductility")),
    ("warpage", ("stress_free_basis", "outline_length", "outline_width")),
)


class SolderPanel(JobPanel):
    """Shear strain, Engelmaier life, Weibull spread, acceleration factor and warpage of a solder joint."""

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

    def render(self, assessment) -> None:
        joint = assessment.joint
        populations = [("field cycle", joint.weibull_scale, joint.weibull_shape)]
        marks = [("field median", joint.median_life, 0.5),
                 (f"field {100 * joint.early_fraction:g} %", joint.early_life, joint.early_fraction)]
        if joint.test_median_life is not None:
            from ..solder.joint import weibull_scale

            populations.append((f"test cycle {joint.test.label}", weibull_scale(joint.test_median_life,
                                                                                  joint.weibull_shape),
                                joint.weibull_shape))
            marks.append(("test median", joint.test_median_life, 0.5))
        plots.weibull_failures(populations, ax=self.ax, marks=marks,
                               title=f"Failed fraction against cycles (Engelmaier median, Weibull shape "
                                     f"{joint.weibull_shape:g} assumed)")
        self.summary.value = (f"<pre style='white-space:pre-wrap;font-size:0.85em'>"
                              f"{escape(self.report_text(assessment))}</pre>")
