"""Notebook panels (ipywidgets): thin views over one current design.

A :class:`DesignModel` holds the current immutable design and its engine result. Controls rebuild a
design and propose it; views observe the model and redraw in place. Invalid entries show their
message beside the control and the views keep the last valid design. Nothing in the core imports
this package.

    from bilayer.panels import StackExplorer
    StackExplorer()                          # editor, unit switch, design files and live views
    StackExplorer(design, jobs=("thermostat",))   # plus a job panel (also added for every job
                                                  # section the design already holds)

Job panels: :class:`ThermostatPanel`, :class:`SolderPanel`, :class:`AdhesivePanel`,
:class:`FilmPanel`; the record's review state: :class:`ReviewPanel`; slow work behind a button: :class:`FECheckPanel` and the thermostat's Monte Carlo.
"""
from __future__ import annotations

from ._base import DesignModel, FigureImage, QuantityField, View
from .adhesive_panel import AdhesivePanel
from .design_files import DesignFilePanel
from .explorer import JOB_PANELS, StackExplorer, example_design
from .fe_check_panel import FECheckPanel
from .film_panel import FilmPanel
from .interface_views import InterfaceView, RatioTradeoffView, thickness_ratio_sweep
from .review import ReviewPanel
from .job_panel import JobPanel
from .section_form import SectionForm
from .solder_panel import SolderPanel
from .stack_editor import StackEditor
from .thermostat_panel import ThermostatPanel
from .views import ResultTable, ShapeView, SignConventionSketch, StressView, UnitSystemSwitch

__all__ = [
    "AdhesivePanel",
    "DesignModel",
    "DesignFilePanel",
    "FECheckPanel",
    "FigureImage",
    "FilmPanel",
    "InterfaceView",
    "JOB_PANELS",
    "JobPanel",
    "RatioTradeoffView",
    "QuantityField",
    "ResultTable",
    "ReviewPanel",
    "SectionForm",
    "ShapeView",
    "SignConventionSketch",
    "SolderPanel",
    "StackEditor",
    "StackExplorer",
    "StressView",
    "ThermostatPanel",
    "UnitSystemSwitch",
    "View",
    "example_design",
    "thickness_ratio_sweep",
]
