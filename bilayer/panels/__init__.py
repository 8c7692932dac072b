"""Notebook panels (ipywidgets): thin views over one current design.

A :class:`DesignModel` holds the current immutable design and its engine result. Controls rebuild a
design and propose it; views observe the model and redraw in place. Invalid entries show their
message beside the control and the views keep the last valid design. Nothing in the core imports
this package.

    from bilayer.panels import StackExplorer
    StackExplorer()          # editor, unit switch, design files and live views
"""
from __future__ import annotations

from ._base import DesignModel, FigureImage, QuantityField, View
from .design_files import DesignFilePanel
from .explorer import StackExplorer, example_design
from .interface_views import InterfaceView, RatioTradeoffView, thickness_ratio_sweep
from .stack_editor import StackEditor
from .views import ResultTable, ShapeView, SignConventionSketch, StressView, UnitSystemSwitch

__all__ = [
    "DesignModel",
    "DesignFilePanel",
    "FigureImage",
    "InterfaceView",
    "RatioTradeoffView",
    "QuantityField",
    "ResultTable",
    "ShapeView",
    "SignConventionSketch",
    "StackEditor",
    "StackExplorer",
    "StressView",
    "UnitSystemSwitch",
    "View",
    "example_design",
    "thickness_ratio_sweep",
]
