"""The stack explorer: the stack editor, unit switch and design files above tabs of live views.

Only the view on the selected tab redraws on a change; the others redraw when their tab opens.
"""
from __future__ import annotations

import ipywidgets as widgets

from ..core.stack import Design, Layer, Stack, Temperatures
from ._base import DesignModel
from .design_files import DesignFilePanel
from .fe_check_panel import FECheckPanel
from .interface_views import InterfaceView, RatioTradeoffView
from .stack_editor import StackEditor
from .views import ResultTable, ShapeView, SignConventionSketch, StressView, UnitSystemSwitch

__all__ = ["StackExplorer", "example_design", "JOB_PANELS"]


def _thermostat():
    from .thermostat_panel import ThermostatPanel

    return ThermostatPanel


def _solder():
    from .solder_panel import SolderPanel

    return SolderPanel


def _film():
    from .film_panel import FilmPanel

    return FilmPanel


def _adhesive():
    from .adhesive_panel import AdhesivePanel

    return AdhesivePanel


JOB_PANELS = {
    "thermostat": ("thermostat", _thermostat),
    "solder_joint": ("solder joint", _solder),
    "adhesive_bond": ("adhesive bond", _adhesive),
    "film": ("film", _film),
}
"""Job panels by design-file section name: (tab title, factory returning the panel class)."""


def example_design() -> Design:
    """An invented starting point: a two-layer strip for an oven-door switch, bonded at 20 degC,
    looked at 100 K hotter (demo data, not a reference)."""
    return Design(
        stack=Stack((Layer("fe36ni", 0.5e-3, "low-expansion side"), Layer("mncuni_72_18_10", 0.5e-3, "high-expansion side"))),
        temperatures=Temperatures(293.15, 393.15),
        state="narrow",
        name="oven-door switch strip (demo)",
    )


class StackExplorer(widgets.VBox):
    """Edit a stack and watch its response.

    Parts (attributes): ``model`` (the current design and result), ``editor``, ``units``,
    ``files``, ``table``, and the views ``stress``, ``shape``, ``interface``, ``tradeoff`` and
    ``fe_check`` (closed forms against finite elements, behind a button) and ``sketch`` in ``tabs``;
    job panels added with :meth:`add_view` appear as further tabs.
    """

    def __init__(self, design: Design | None = None, system: str = "si", path: str = "my_design.toml",
                 jobs: tuple[str, ...] = ()):
        self.model = DesignModel(design if design is not None else example_design(), system)
        self.editor = StackEditor(self.model)
        self.units = UnitSystemSwitch(self.model)
        self.files = DesignFilePanel(self.model, path, pending_error=self.editor.pending_error)
        self.table = ResultTable(self.model)
        self.stress = StressView(self.model)
        self.shape = ShapeView(self.model, active=False)
        self.interface = InterfaceView(self.model, active=False)
        self.tradeoff = RatioTradeoffView(self.model, active=False)
        self.fe_check = FECheckPanel(self.model)
        self.sketch = SignConventionSketch()
        self.tabs = widgets.Tab()
        self._views: list[tuple[str, widgets.Widget]] = []
        for title, view in (("stress", self.stress), ("shape", self.shape), ("interface", self.interface),
                            ("thickness ratio", self.tradeoff), ("FE check", self.fe_check),
                            ("conventions", self.sketch)):
            self.add_view(title, view)
        self.jobs = {}
        for job in dict.fromkeys((*jobs, *(name for name in JOB_PANELS if name in self.model.design.sections))):
            self.add_job(job)
        self.tabs.observe(self._tab_changed, names="selected_index")
        self.tabs.selected_index = 0
        self._tab_changed()
        super().__init__([
            widgets.HBox([self.units]),
            self.editor,
            self.files,
            self.tabs,
            self.table,
        ])

    def add_job(self, job: str) -> widgets.Widget:
        """Add the panel of a job ("thermostat", ...) as a tab sharing this explorer's design."""
        if job not in JOB_PANELS:
            from ..core.errors import InputError

            raise InputError("job", job, "one of " + ", ".join(JOB_PANELS))
        if job not in self.jobs:
            title, factory = JOB_PANELS[job]
            self.jobs[job] = factory()(self.model, active=False)
            self.add_view(title, self.jobs[job])
        return self.jobs[job]

    def add_view(self, title: str, view: widgets.Widget) -> None:
        """Add a view as a tab; views with an ``active`` flag redraw only while their tab is open."""
        self._views.append((title, view))
        self.tabs.children = [v for _, v in self._views]
        for i, (name, _) in enumerate(self._views):
            self.tabs.set_title(i, name)
        self._tab_changed()

    def _tab_changed(self, change=None) -> None:
        selected = self.tabs.selected_index
        for i, (_, view) in enumerate(self._views):
            if hasattr(view, "active"):
                view.active = i == selected

    def show(self, title: str) -> None:
        """Open the tab called ``title``."""
        self.tabs.selected_index = [name for name, _ in self._views].index(title)
