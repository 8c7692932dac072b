"""Base of the job panels: entries for one design-file section, one job call, a figure and a report.

A job panel edits the section ``section`` of the current design through a :class:`SectionForm`
(checked by the section's spec, exactly as a design file is read). After each entry it builds the
candidate design, runs the job's one core call (:meth:`JobPanel.compute`) and, if both work, makes
the candidate current; otherwise the message appears under the entries and the figure and report
keep the last valid case. Until the user enters something, the panel shows ``defaults`` (invented
demo values) without writing them into the design.
"""
from __future__ import annotations

from html import escape
from typing import Any

import ipywidgets as widgets

from ..core.errors import BilayerError
from ._base import DesignModel, FigureImage, View, message_html
from .section_form import SectionForm

__all__ = ["JobPanel", "caution_box"]


def caution_box(title: str, lines) -> str:
    """An amber box with the job's cautions (shown above the entries, never folded away)."""
    items = "".join(f"<li>{escape(line)}</li>" for line in lines)
    return (f"<div style='border:1px solid #d9a400;background:#fff8e1;padding:4px 8px;font-size:0.85em'>"
            f"<b>{escape(title)}</b><ul style='margin:2px 0'>{items}</ul></div>")


class JobPanel(View):
    """Common behaviour of the job panels (see the module docstring). Subclasses set the class
    attributes and implement :meth:`compute` and :meth:`render`."""

    section: str = ""
    fields: tuple[str, ...] = ()
    labels: dict[str, str] = {}
    defaults: dict[str, Any] = {}
    caution_title: str = "Caution"
    height: float = 3.4
    margins = {"left": 0.12, "right": 0.97, "bottom": 0.14, "top": 0.9}

    def __init__(self, model: DesignModel, active: bool = True):
        self.form = SectionForm(self.section, self.fields, model.system, self.labels, on_change=self.entries_changed)
        self.message = widgets.HTML()
        self.image = FigureImage(self.height, self.margins)
        self.image.add_class(f"bilayer-{self.section}-figure")
        self.ax = self.image.figure.add_subplot()
        self.summary = widgets.HTML()
        self.result = None
        self._proposed = None
        self._filling = False
        self._cache: tuple = (None, None)
        super().__init__(model, [widgets.HTML(caution_box(self.caution_title, self.cautions())), self.controls(),
                                 self.message, self.image, self.summary], active=active)
        model.observe(self._design_changed, names="design")
        model.observe(lambda change: self.form.convert(change["new"]), names="system")
        self.fill(model.design)
        self._on_model()

    # -- to be provided by each job ------------------------------------------------------------
    @property
    def job(self):
        """The job of this panel's section (:data:`bilayer.designs.jobs.JOBS`)."""
        from ..designs.jobs import JOBS

        return JOBS[self.section]

    def cautions(self) -> tuple[str, ...]:
        """The job's cautions (the shared ones for a job without its own)."""
        from ..core.cautions import CAUTIONS

        return self.job.cautions or tuple(CAUTIONS)

    def controls(self) -> widgets.Widget:
        """The entry widgets, arranged (default: one column in field order)."""
        return widgets.VBox([entry.widget for entry in self.form.entries.values()])

    def grouped_controls(self, groups) -> widgets.Widget:
        """Entry widgets in an accordion of ``(title, field names)`` groups, the first one open."""
        boxes = [widgets.VBox([self.form.entries[name].widget for name in names]) for _, names in groups]
        accordion = widgets.Accordion(boxes, titles=tuple(title for title, _ in groups))
        accordion.selected_index = 0
        return accordion

    def report_text(self, assessment) -> str:
        """The job's text report of ``assessment`` (as the command line prints it, cautions aside: they
        are in the box above the entries)."""
        return self.job.report(self.current_design(), assessment, self.model.system)

    def shown_fields(self) -> tuple[str, ...]:
        """Fields that apply to the current choices (the others are hidden and not written)."""
        return self.fields

    def compute(self, design):
        """The job's assessment of ``design``."""
        return self.job.assess(design)

    def render(self, result) -> None:  # pragma: no cover - abstract
        raise NotImplementedError

    def fill_extra(self, values: dict) -> None:
        """Set controls that are not section fields from section values (default: none)."""

    # -- entries -------------------------------------------------------------------------------
    def fill(self, design) -> None:
        values = dict(design.sections.get(self.section, self.defaults))
        self._filling = True
        try:
            self.fill_extra(values)
            self.form.show(values, self.model.system)
            self.form.show_only(self.shown_fields())
        finally:
            self._filling = False

    def section_values(self) -> dict:
        """Validated section values from the entries (raises the project error of the first bad one)."""
        self.form.show_only(self.shown_fields())
        return self.form.values()

    def entries_changed(self) -> None:
        if self._filling:
            return
        try:
            candidate = self.model.design.with_section(self.section, self.section_values())
            result = self.compute(candidate)
        except BilayerError as error:
            self.message.value = message_html(f"{error}. The figure and report show the last valid case.")
            return
        self._proposed = candidate
        self._cache = (candidate, result)  # the redraw that the proposal triggers reuses it
        error = self.model.propose(candidate)
        self._proposed = None
        if error:
            self.message.value = message_html(f"{error}. The figure and report show the last valid case.")
            return
        self.message.value = ""
        self.after_change()

    def after_change(self) -> None:
        """Hook after an accepted entry (default: nothing)."""

    def _design_changed(self, change) -> None:
        if change["new"] is not self._proposed and self.section in change["new"].sections:
            self.fill(change["new"])

    # -- computing and drawing -----------------------------------------------------------------
    def latest(self):
        """The job result for the current design, computed now if the panel was hidden when it changed."""
        if self._stale:
            self.redraw()
        return self.result

    def current_design(self):
        """The model's design, with the default section until one is entered."""
        design = self.model.design
        if self.section in design.sections:
            return design
        from ..designs.sections import section

        return design.with_section(self.section, section(self.section).normalise(self.defaults))

    def draw(self) -> None:
        design = self.current_design()
        cached_design, cached_result = self._cache
        try:
            result = cached_result if cached_design is design else self.compute(design)
        except BilayerError as error:
            self.message.value = message_html(f"{error}. The figure and report show the last valid case.")
            return
        self.result = result
        self.render(result)
        self.image.refresh()
