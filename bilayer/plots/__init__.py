"""Figures of stack results: pure functions, no pyplot global state.

Every function takes results (and display choices) and either returns a new
:class:`matplotlib.figure.Figure` or, when ``ax`` is given, clears that axes and draws into it in
place (the panels redraw this way). Nothing here computes mechanics: curves come from the engine's
results or from the interface model's profiles.

Conventions drawn (see :mod:`bilayer.core.stack`): layers numbered from the bottom, z upward from the
bottom face, curvature kappa > 0 when the top face is the longer one (centre of curvature below),
stress positive in tension.

Display systems: ``"si"`` (mm or um, MPa, degC, 1/m) and ``"us"`` (in or mil, ksi or psi, degF,
1/in). Each material keeps one colour in every view (:func:`material_colours`).
"""
from .adhesive import parameter_sweep
from .canvas import SYSTEMS, AxisUnit, axis_unit, material_colours, new_figure
from .films import stoney_error_curve
from .solder import weibull_failures
from .stack import deflected_shape, sign_convention_sketch, stress_through_thickness, thickness_ratio_tradeoff
from .strip import closed_form_against_fe, interface_stresses
from .thermostat import travel_curve

__all__ = [
    "SYSTEMS",
    "AxisUnit",
    "axis_unit",
    "material_colours",
    "new_figure",
    "stress_through_thickness",
    "deflected_shape",
    "thickness_ratio_tradeoff",
    "sign_convention_sketch",
    "interface_stresses",
    "closed_form_against_fe",
    "travel_curve",
    "weibull_failures",
    "stoney_error_curve",
    "parameter_sweep",
]
