"""Adhesive bond panel: overlap, joint model and allowables; end shear and peel at every operating
temperature, the shear and peel near the joint end, and sweeps of bond line, overlap and adhesive
modulus, all from :func:`bilayer.adhesive.assess_adhesive_design`.

The design's three layers are the lower adherend, the adhesive (bond line) and the upper adherend;
the stress-free temperature of the conditions is the cure temperature.
"""
from __future__ import annotations

from html import escape

import ipywidgets as widgets
import numpy as np

from .. import plots
from ._base import DesignModel, FigureImage
from .job_panel import JobPanel

__all__ = ["AdhesivePanel", "DEFAULT_ADHESIVE_BOND"]

DEFAULT_ADHESIVE_BOND = {"overlap": 25e-3}
"""Starting entries when the design has no [adhesive_bond] section yet (invented demo value)."""

LABELS = {
    "overlap": "bonded overlap", "model": "joint model", "allowable_shear": "allowable shear (optional)",
    "allowable_peel": "allowable peel (optional)", "sweep_bond_line": "bond lines to sweep",
    "sweep_overlap": "overlaps to sweep", "sweep_adhesive_modulus": "adhesive moduli to sweep",
    "sweep_temperature": "sweep at temperature",
}
GROUPS = (
    ("joint", ("overlap", "model", "allowable_shear", "allowable_peel")),
    ("sweeps", ("sweep_bond_line", "sweep_overlap", "sweep_adhesive_modulus", "sweep_temperature")),
)


class AdhesivePanel(JobPanel):
    """End shear and peel of a bonded joint against temperature, bond line, overlap and adhesive modulus."""

    section = "adhesive_bond"
    fields = tuple(name for _, names in GROUPS for name in names)
    labels = LABELS
    defaults = DEFAULT_ADHESIVE_BOND
    caution_title = "Screening estimate"

    def __init__(self, model: DesignModel, active: bool = True):
        self.sweep_choice = widgets.Dropdown(description="sweep shown", style={"description_width": "initial"})
        self.sweep_image = FigureImage(3.2, {"left": 0.12, "right": 0.97, "bottom": 0.15, "top": 0.9})
        self.sweep_ax = self.sweep_image.figure.add_subplot()
        super().__init__(model, active=active)
        self.sweep_choice.observe(lambda change: self._draw_sweep(), names="value")
        self.children = (*self.children, self.sweep_choice, self.sweep_image)

    @property
    def assessment(self):
        """The assessment on screen (:class:`bilayer.adhesive.AdhesiveAssessment`)."""
        return self.latest()

    def controls(self) -> widgets.Widget:
        return self.grouped_controls(GROUPS)

    def worst_case(self, assessment) -> int:
        """Index of the operating temperature with the largest |end shear|."""
        return int(np.argmax(np.abs(assessment.result.end_shear)))

    def render(self, assessment) -> None:
        from .interface_views import interface_short_names

        result = assessment.result
        worst = self.worst_case(assessment)
        along = result.interface_results[worst]
        params = [p.parameters for p in along.interfaces]
        zone = min(along.half_length, 10.0 * max(max(p.decay_length, p.peel_decay_length if p.bending else 0.0)
                                                  for p in params))
        distance = zone * np.linspace(0.0, 1.0, 301) ** 1.5
        sampled = along.sample(distance, end="right")
        names = interface_short_names(self.current_design().stack, along)
        shear = {name: s[1] for name, s in zip(names, sampled)}
        peel = {name: s[2] for name, s in zip(names, sampled) if s[2] is not None}
        T = plots.axis_unit("temperature", self.model.system)(result.operating_temperatures[worst])
        plots.interface_stresses(distance, shear, peel, self.model.system, ax=self.ax,
                                 title=f"Shear and peel in the bond near the joint end at {T:.4g} "
                                       f"{plots.axis_unit('temperature', self.model.system).label} (largest shear)",
                                 note="within about one bond-line thickness of the end: nominal model values",
                                 decay_length=min(p.decay_length for p in params))
        self.summary.value = (f"<pre style='white-space:pre-wrap;font-size:0.85em'>"
                              f"{escape(self.report_text(assessment))}</pre>")
        options = [(s.parameter.replace("_", " "), i) for i, s in enumerate(assessment.sweeps)]
        if list(self.sweep_choice.options) != options:
            self.sweep_choice.options = options
        if options and self.sweep_choice.value is None:
            self.sweep_choice.value = 0  # draws through the observer
        else:
            self._draw_sweep()

    def _draw_sweep(self) -> None:
        assessment = self.result
        shown = assessment is not None and len(assessment.sweeps) > 0 and self.sweep_choice.value is not None
        self.sweep_choice.layout.display = "" if shown else "none"
        self.sweep_image.layout.display = "" if shown else "none"
        if not shown:
            return
        sweep = assessment.sweeps[self.sweep_choice.value]
        joint = assessment.result.joint
        current = {"bond_line": joint.bond_line, "overlap": joint.overlap,
                   "adhesive_modulus": joint.adhesive.youngs_modulus}[sweep.parameter]
        T = plots.axis_unit("temperature", self.model.system)
        plots.parameter_sweep(sweep.parameter, sweep.values, sweep.end_shear, sweep.max_peel, self.model.system,
                              ax=self.sweep_ax, current=current, allowable_shear=assessment.result.allowable_shear,
                              allowable_peel=assessment.result.allowable_peel,
                              title=f"End stresses against the {sweep.parameter.replace('_', ' ')} at "
                                    f"{T(sweep.operating_temperature):.4g} {T.label}")
        self.sweep_image.refresh()
