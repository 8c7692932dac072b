"""Save and load design files from the panels.

Saving writes the model's current design with :func:`bilayer.designs.design_file.save_design` (atomic: a
temporary file, then a rename). It refuses while an entry is invalid, so a file never silently
holds something other than what is on screen; the typed entries stay as they are. It also refuses
to overwrite a reviewed design record (a file with ``[record]`` or ``[[review]]`` tables): that is
saved from the review panel, which keeps the review log. Loading a file that fails to parse shows
the error and changes nothing.
"""
from __future__ import annotations

from pathlib import Path
from typing import Callable

import ipywidgets as widgets

from ..core.errors import BilayerError
from ._base import DesignModel, message_html

__all__ = ["DesignFilePanel"]


class DesignFilePanel(widgets.VBox):
    """A path box with "save design" and "load design" buttons and a message line."""

    def __init__(self, model: DesignModel, path: str = "my_design.toml",
                 pending_error: Callable[[], str] | None = None):
        self.model = model
        self.pending_error = pending_error or (lambda: "")
        self.path = widgets.Text(value=str(path), description="design file", style={"description_width": "initial"},
                                 layout=widgets.Layout(width="28em"))
        self.save_button = widgets.Button(description="save design", icon="save", tooltip="write the current design to the file")
        self.load_button = widgets.Button(description="load design", icon="folder-open", tooltip="read a design from the file")
        self.message = widgets.HTML()
        self.save_button.on_click(lambda _: self.save())
        self.load_button.on_click(lambda _: self.load())
        super().__init__([widgets.HBox([self.path, self.save_button, self.load_button]), self.message])

    def save(self) -> bool:
        """Write the current design; returns True on success."""
        pending = self.pending_error()
        if pending:
            self.message.value = message_html(f"Not saved: {pending}")
            return False
        from ..designs.design_file import save_design

        path = Path(self.path.value.strip()).expanduser()
        if _is_record(path):
            self.message.value = message_html(
                f"Not saved: {path} is a reviewed design record; save it from the review panel, which keeps "
                "its review log (nothing was written)")
            return False
        try:
            save_design(self.model.design, path)
        except (BilayerError, OSError) as error:
            self.message.value = message_html(f"Not saved: {error}")
            return False
        self.message.value = message_html(f"Saved to {path}.", "info")
        return True

    def load(self) -> bool:
        """Read a design file and make it current; returns True on success."""
        from ..designs.design_file import load_design

        path = Path(self.path.value.strip()).expanduser()
        try:
            design = load_design(path)
        except (BilayerError, OSError) as error:
            self.message.value = message_html(f"Not loaded: {error}")
            return False
        error = self.model.propose(design)
        if error:
            self.message.value = message_html(f"Not loaded: {error}")
            return False
        self.message.value = message_html(f"Loaded {path}.", "info")
        return True


def _is_record(path: Path) -> bool:
    """True if ``path`` holds a design record (a results snapshot with provenance or a review log)."""
    import tomllib

    try:
        data = tomllib.loads(path.read_text(encoding="utf-8"))
    except (OSError, UnicodeDecodeError, tomllib.TOMLDecodeError):
        return False
    return "record" in data or "review" in data
