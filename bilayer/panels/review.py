"""Review panel: where a design record stands in review, and how the design on screen differs from it.

The panel holds one record file. It shows the record's review state and log, and, whenever the
design on screen changes, every input that differs from the recorded one (exactly; material data
against the record's own copy) and every result that moved beyond the check tolerance.

"save record" writes the design on screen as a new record (fresh results and provenance) and keeps
the review log intact: the log is read again from the file just before writing, so a review added
meanwhile (from the command line, by a colleague) is not lost, and a file that cannot be read is
never overwritten. Reviews given for other inputs then show as "changed since review". "add review"
appends an entry to the file; it is offered only when the design on screen is the recorded one, so
a reviewer signs what was computed.

    from bilayer.panels import StackExplorer
    from bilayer.panels.review import ReviewPanel
    explorer = StackExplorer()
    explorer.add_view("review", ReviewPanel(explorer.model, "my_design.record.toml"))
"""
from __future__ import annotations

from html import escape
from pathlib import Path
from typing import Callable

import ipywidgets as widgets

from ..core.errors import BilayerError
from ..records.check import Difference, Tolerance, compare_results, input_differences
from ..records.record import DesignRecord, append_review, make_record, read_record, save_record
from ..records.section import VERDICTS
from ._base import DesignModel, message_html

__all__ = ["ReviewPanel"]

_STATE_COLOURS = {"accepted": "#1b7a1b", "accepted_with_notes": "#1b7a1b", "changes_needed": "#b00020",
                  "rejected": "#b00020"}


class ReviewPanel(widgets.VBox):
    """Open, compare, save and review a design record beside the panels' current design.

    Parts: ``path``, ``open_button``, ``save_button``, ``use_button`` (put the recorded design on
    screen), ``state`` (review state), ``differences`` (on screen vs recorded), ``review_log`` (the review
    log), ``reviewer``, ``verdict``, ``comment``, ``review_button`` and ``message``. ``record`` is the
    record last opened or saved (None before). ``support`` optionally returns the support chosen in
    the shape view, stored with the record for its report.
    """

    def __init__(self, model: DesignModel, path: str = "my_design.record.toml",
                 pending_error: Callable[[], str] | None = None, support: Callable[[], str] | None = None,
                 tolerance: Tolerance = Tolerance()):
        self.model = model
        self.pending_error = pending_error or (lambda: "")
        self.support = support
        self.tolerance = tolerance
        self.record: DesignRecord | None = None
        self.input_changes: list[Difference] = []
        self.result_changes: list[Difference] = []
        wide = {"description_width": "initial"}
        self.path = widgets.Text(value=str(path), description="record file", style=wide,
                                 layout=widgets.Layout(width="28em"))
        self.open_button = widgets.Button(description="open record", icon="folder-open",
                                          tooltip="read the record file and compare it with the design on screen")
        self.save_button = widgets.Button(description="save record", icon="save",
                                          tooltip="record the design on screen (results, provenance); the review log is kept")
        self.use_button = widgets.Button(description="show recorded design", icon="undo",
                                         tooltip="put the recorded design on screen")
        self.state = widgets.HTML()
        self.state.add_class("bilayer-review-state")
        self.differences = widgets.HTML()
        self.differences.add_class("bilayer-review-differences")
        self.review_log = widgets.HTML()
        self.reviewer = widgets.Text(description="reviewer", style=wide, layout=widgets.Layout(width="16em"))
        self.verdict = widgets.Dropdown(options=[(v.replace("_", " "), v) for v in VERDICTS], value="accepted",
                                        description="verdict", style=wide)
        self.comment = widgets.Textarea(description="comment", style=wide, layout=widgets.Layout(width="40em"))
        self.review_button = widgets.Button(description="add review", icon="check",
                                            tooltip="append this review to the record file")
        self.message = widgets.HTML()
        self.open_button.on_click(lambda _: self.open_record())
        self.save_button.on_click(lambda _: self.save())
        self.use_button.on_click(lambda _: self.show_recorded())
        self.review_button.on_click(lambda _: self.add_review())
        model.observe(lambda change: self.compare(), names=["result", "system"])
        super().__init__([
            widgets.HBox([self.path, self.open_button, self.save_button, self.use_button]),
            self.message, self.state, self.differences, self.review_log,
            widgets.HBox([self.reviewer, self.verdict]), self.comment, self.review_button,
        ])
        self.compare()

    # --- actions -------------------------------------------------------------------------------

    def _file(self) -> Path:
        return Path(self.path.value.strip()).expanduser()

    def open_record(self) -> bool:
        """Read the record file and compare it with the design on screen; returns True on success."""
        try:
            self.record = read_record(self._file())
        except (BilayerError, OSError) as error:
            self.message.value = message_html(f"Not opened: {error}")
            return False
        self.message.value = message_html(f"Opened {self._file()}.", "info")
        self.compare()
        return True

    def save(self) -> bool:
        """Record the design on screen in the file, keeping the file's review log; returns True on success."""
        pending = self.pending_error()
        if pending:
            self.message.value = message_html(f"Not saved: {pending}")
            return False
        path = self._file()
        try:
            reviews = self._reviews_on_disk(path)
            from ..designs.jobs import cautions_for

            support = self.support() if self.support is not None else None
            record = make_record(self.model.design, reviews=reviews, cautions=cautions_for(self.model.design),
                                 strip_length=self.model.strip_length, support=support)
            save_record(record, path, system=self.model.system)
            self.record = read_record(path)
        except (BilayerError, OSError) as error:
            self.message.value = message_html(f"Not saved: {error}")
            return False
        kept = f"; review log of {len(reviews)} entr{'y' if len(reviews) == 1 else 'ies'} kept" if reviews else ""
        self.message.value = message_html(f"Saved the record to {path}{kept}.", "info")
        self.compare()
        return True

    @staticmethod
    def _reviews_on_disk(path: Path) -> tuple:
        """The review log of the file at ``path``: () for no file or a plain design file; an error for
        a file that cannot be read (so it is never overwritten)."""
        if not path.exists():
            return ()
        from ..designs.design_file import read_design

        document = read_design(path)
        if "record" not in document.extra:
            return ()
        return read_record(path).reviews

    def show_recorded(self) -> bool:
        """Put the recorded design on screen (as read today, with today's material library)."""
        if self.record is None:
            self.message.value = message_html("Open a record first.")
            return False
        error = self.model.propose(self.record.design)
        if error:
            self.message.value = message_html(f"Cannot show the recorded design: {error}")
            return False
        return True

    def add_review(self) -> bool:
        """Append the review typed in the panel to the record file; returns True on success."""
        if self.record is None:
            self.message.value = message_html("Open or save a record first.")
            return False
        self.compare()
        if self.input_changes:
            self.message.value = message_html(
                "Not added: the design on screen differs from the recorded one. Save the record first, so the "
                "review is for what was computed, or show the recorded design.")
            return False
        try:
            self.record = append_review(self._file(), self.reviewer.value, self.verdict.value, self.comment.value)
        except (BilayerError, OSError) as error:
            self.message.value = message_html(f"Not added: {error}")
            return False
        self.comment.value = ""
        self.message.value = message_html(f"Review {len(self.record.reviews)} added to {self._file()}.", "info")
        self.compare()
        return True

    # --- display -------------------------------------------------------------------------------

    def compare(self) -> None:
        """Recompute and show the review state and the differences from the recorded design."""
        system = self.model.system
        if self.record is None:
            self.input_changes, self.result_changes = [], []
            self.state.value = "<b>Review:</b> no record open"
            self.differences.value = ""
            self.review_log.value = ""
            return
        self.input_changes = input_differences(self.record, self.model.design)
        self.result_changes, _ = compare_results(self.record.results, self.model.result, self.tolerance)
        state = self.record.review_state
        colour = _STATE_COLOURS.get(state.status, "#8a5a00") if state.current else "#8a5a00"
        self.state.value = (f"<b>Review of the recorded design:</b> "
                            f"<span style='color:{colour}'>{escape(state.text())}</span>")
        if not self.input_changes and not self.result_changes:
            self.differences.value = "<p>The design on screen is the recorded design; its results match the record.</p>"
        else:
            parts = []
            if self.input_changes:
                parts.append("<b>On screen, these inputs differ from the record:</b><ul>" + "".join(
                    f"<li>{escape(d.text(system))}</li>" for d in self.input_changes) + "</ul>")
            else:
                parts.append("<p>The inputs on screen are the recorded ones.</p>")
            if self.result_changes:
                parts.append(f"<b>{len(self.result_changes)} results differ from the snapshot:</b><ul>" + "".join(
                    f"<li>{escape(d.text(system))}</li>" for d in self.result_changes[:12]) + "</ul>")
                if len(self.result_changes) > 12:
                    parts.append(f"<p>... and {len(self.result_changes) - 12} more.</p>")
            self.differences.value = "".join(parts)
        rows = "".join(
            f"<tr><td>{n}</td><td>{escape(e.date)}</td><td>{escape(e.reviewer)}</td>"
            f"<td>{escape(e.verdict.replace('_', ' '))}</td><td>{escape(e.comment)}</td>"
            f"<td>{'yes' if e.inputs_hash == self.record.inputs_hash else 'other inputs'}</td></tr>"
            for n, e in enumerate(self.record.reviews, start=1)
        )
        self.review_log.value = ("<table style='border-collapse:collapse;font-size:0.9em'><tr><th>#</th><th>date</th>"
                          "<th>reviewer</th><th>verdict</th><th>comment</th><th>for the recorded inputs</th></tr>"
                          f"{rows}</table>" if rows else "<p>No reviews yet.</p>")
