"""Thermostat and sensor elements: where a strip's curvature comes from, element forms, set points,
contact force, stress span, sizing, tolerances, snap discs, and the design-file job.

Short paths::

    from bilayer.thermostat import ThermostatStrip, Cantilever, ThermalElement, response, closing_temperature

Modules: ``strip`` (engine or data-sheet flexivity), ``forms`` (cantilever, U-shape, spiral, helix, disc),
``element`` (travel, set point, force, work, span), ``sizing`` (optimum ratio, sizing, pair ranking),
``tolerances`` (set-point scatter), ``snap_disc``, ``assessment`` (every check of a [thermostat] table),
``section`` (the table), ``job`` (its registration).
"""
from .strip import Flexivity, ThermostatStrip, DatasheetStrip, FAHRENHEIT_PER_KELVIN
from .forms import (
    ElementForm,
    Cantilever,
    SupportedStrip,
    UShape,
    Spiral,
    Helix,
    FlatDisc,
    ELEMENT_FORMS,
    element_from_mapping,
)
from .element import (
    THERMOSTAT_CAUTIONS,
    THERMOSTAT_ASSUMPTIONS,
    ThermalElement,
    ResponseCurve,
    SetPoint,
    GapForSetPoint,
    ContactLoad,
    WorkOutput,
    WorkingSpan,
    response,
    closing_temperature,
    meeting_temperature,
    gap_for_set_point,
    contact_load,
    work_output,
    working_span,
)
from .sizing import (
    OptimumRatio,
    optimum_thickness_ratio,
    SizedElement,
    size_element,
    PairRating,
    rank_pairs,
)
from .tolerances import (
    Tolerance,
    SetPointScatter,
    monte_carlo_set_point,
    first_order_set_point,
    tolerance_keys,
)
from .snap_disc import SnapDisc, SnapDiscResult, snap_temperatures, SNAP_DISC_LIMITS
from .assessment import ThermostatReport, element_from_design, analyse

__all__ = [
    "Flexivity",
    "ThermostatStrip",
    "DatasheetStrip",
    "FAHRENHEIT_PER_KELVIN",
    "ElementForm",
    "Cantilever",
    "SupportedStrip",
    "UShape",
    "Spiral",
    "Helix",
    "FlatDisc",
    "ELEMENT_FORMS",
    "element_from_mapping",
    "THERMOSTAT_CAUTIONS",
    "THERMOSTAT_ASSUMPTIONS",
    "ThermalElement",
    "ResponseCurve",
    "SetPoint",
    "GapForSetPoint",
    "ContactLoad",
    "WorkOutput",
    "WorkingSpan",
    "response",
    "closing_temperature",
    "meeting_temperature",
    "gap_for_set_point",
    "contact_load",
    "work_output",
    "working_span",
    "OptimumRatio",
    "optimum_thickness_ratio",
    "SizedElement",
    "size_element",
    "PairRating",
    "rank_pairs",
    "Tolerance",
    "SetPointScatter",
    "monte_carlo_set_point",
    "first_order_set_point",
    "tolerance_keys",
    "SnapDisc",
    "SnapDiscResult",
    "snap_temperatures",
    "SNAP_DISC_LIMITS",
    "ThermostatReport",
    "element_from_design",
    "analyse",
]
