"""Film-on-wafer panel: thermal film stress from the engine beside Stoney, film stress from a measured
bow or curvature change, and film CTE and biaxial modulus from two substrates, all from
:func:`bilayer.films.assess_film_design`. The design's layer 1 is the substrate, layer 2 the film.
"""
from __future__ import annotations

from html import escape

import ipywidgets as widgets
import numpy as np

from .. import plots
from ._base import DesignModel
from .job_panel import JobPanel

__all__ = ["FilmPanel"]

LABELS = {
    "substrate_orientation": "wafer orientation", "substrate_biaxial_modulus": "substrate biaxial modulus (optional)",
    "scan_diameter": "scan diameter", "bow_before": "bow before deposition", "bow_after": "bow after deposition",
    "curvature_before": "curvature before", "curvature_after": "curvature after",
    "film_facing": "film side during the scan", "exact_correction": "exact bilayer correction (film modulus)",
    "scan_temperatures": "scan temperatures", "scan_stress_1": "film stress on this substrate",
    "scan_stress_2": "film stress on the second substrate", "second_substrate_cte": "second substrate CTE",
}
GROUPS = (
    ("substrate", ("substrate_orientation", "substrate_biaxial_modulus", "exact_correction")),
    ("measured bow", ("scan_diameter", "bow_before", "bow_after", "film_facing")),
    ("measured curvature", ("curvature_before", "curvature_after")),
    ("two-substrate scan", ("scan_temperatures", "scan_stress_1", "scan_stress_2", "second_substrate_cte")),
)


class FilmPanel(JobPanel):
    """Stoney and the exact bilayer for the design's film; stress from bow; film properties from two substrates."""

    section = "film"
    fields = tuple(name for _, names in GROUPS for name in names)
    labels = LABELS
    defaults = {"substrate_orientation": "isotropic"}
    caution_title = "Engineering estimate"

    def __init__(self, model: DesignModel, active: bool = True):
        super().__init__(model, active=active)

    @property
    def assessment(self):
        """The assessment on screen (:class:`bilayer.films.FilmAssessment`)."""
        return self.latest()

    def controls(self) -> widgets.Widget:
        return self.grouped_controls(GROUPS)

    def render(self, assessment) -> None:
        from ..films.stress import stoney_curvature_ratio, stoney_stress_ratio

        thermal = assessment.thermal
        substrate, film = self.current_design().stack.layers
        g = thermal.film_biaxial_modulus / thermal.substrate_biaxial_modulus
        hs, hf = substrate.thickness, film.thickness
        thickness = hf * np.geomspace(1e-2, 1e2, 161)
        thickness = thickness[thickness < hs]
        stress_error = stoney_stress_ratio(thickness / hs, g) - 1.0
        curvature_error = 1.0 / stoney_curvature_ratio(thickness / hs, g) - 1.0
        plots.stoney_error_curve(thickness, stress_error, curvature_error, hf,
                                 float(stoney_stress_ratio(hf / hs, g)) - 1.0,
                                 1.0 / float(stoney_curvature_ratio(hf / hs, g)) - 1.0,
                                 self.model.system, ax=self.ax,
                                 title=f"Stoney against the exact bilayer on a {plots.axis_unit('length', self.model.system, hs)(hs):.4g} "
                                       f"{plots.axis_unit('length', self.model.system, hs).label} substrate")
        self.summary.value = (f"<pre style='white-space:pre-wrap;font-size:0.85em'>"
                              f"{escape(self.report_text(assessment))}</pre>")
