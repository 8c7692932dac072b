"""Entry forms for a job section of the design (``[thermostat]``, ``[solder_joint]``, ...).

A :class:`SectionForm` builds one control per field of the section's :class:`~bilayer.designs.sections.SectionSpec`:
a text box with units for physical quantities (blank = not given), a dropdown for choices, a check box
for yes/no, a plain text box for texts and integers. ``values()`` turns the entries into the SI values
the design file would hold and validates them with the spec (defaults filled in), so a panel checks a
section exactly as a saved file would be checked. Tooltips carry the spec's field documentation.
"""
from __future__ import annotations

from typing import Callable, Iterable, Mapping

import ipywidgets as widgets

from ..core.errors import BilayerError, InputError
from ._base import QuantityField

__all__ = ["SectionForm"]

_PLAIN = {"text", "integer", "choice", "boolean", "table", "list", "scalar_or_list"}


class _Entry:
    """One control of the form with ``get()`` -> SI value or None and ``set(value, system)``."""

    def __init__(self, field, system: str, label: str):
        self.field = field
        tooltip = field.doc or field.name
        if field.kind == "choice":
            self.widget = widgets.Dropdown(options=field.choices, value=field.default or field.choices[0],
                                           description=label, style={"description_width": "initial"},
                                           tooltip=tooltip)
        elif field.kind == "boolean":
            self.widget = widgets.Checkbox(value=bool(field.default), description=label, indent=False,
                                           tooltip=tooltip)
        elif field.kind in ("text", "integer") or field.shape != "scalar":
            self.widget = widgets.Text(value="" if field.default is None else str(field.default),
                                       description=label, continuous_update=False, tooltip=tooltip,
                                       placeholder="comma-separated" if field.shape != "scalar" else "",
                                       style={"description_width": "initial"}, layout=widgets.Layout(width="24em"))
        else:
            self.quantity = QuantityField(label, field.kind, field.name, 0.0, system, width="22em", tooltip=tooltip)
            self.widget = self.quantity.text
            self.set(field.default, system)
        self.widget.add_class(f"bilayer-field-{field.name}")  # a stable handle for browser tests
        if field.kind != "boolean":  # labels in one column, entries aligned beside them
            self.widget.style.description_width = "17em"
            self.widget.layout.width = "34em"

    def get(self):
        field = self.field
        if field.kind == "choice":
            return self.widget.value
        if field.kind == "boolean":
            return bool(self.widget.value)
        text = self.widget.value.strip()
        if not text:
            return None
        if field.shape != "scalar":
            from ..core.units import parse

            items = [item.strip() for item in text.split(",") if item.strip()]
            if field.kind == "text":
                return tuple(items)
            return tuple(parse(item, field.kind, f"{field.name}[{i}]") for i, item in enumerate(items))
        if field.kind == "text":
            return text
        if field.kind == "integer":
            try:
                return int(text)
            except ValueError:
                raise InputError(field.name, text, "a whole number") from None
        return self.quantity.value()

    def set(self, value, system: str) -> None:
        field = self.field
        if field.kind == "choice":
            self.widget.value = value if value is not None else (field.default or field.choices[0])
        elif field.kind == "boolean":
            self.widget.value = bool(value)
        elif field.kind in ("text", "integer") or field.shape != "scalar":
            if value is None:
                self.widget.value = ""
            elif field.shape != "scalar" and field.kind not in ("text",):
                from ..core.units import format_quantity

                self.widget.value = ", ".join(format_quantity(v, field.kind, system=system, digits=6) for v in value)
            elif field.shape != "scalar":
                self.widget.value = ", ".join(value)
            else:
                self.widget.value = str(value)
        elif value is None:
            self.quantity._exact = None
            self.widget.value = ""
        else:
            self.quantity.show(value, system)

    def convert(self, system: str) -> None:
        if hasattr(self, "quantity") and self.widget.value.strip():
            self.quantity.convert(system)
        elif self.field.shape != "scalar" and self.field.kind not in _PLAIN:
            try:
                value = self.get()
            except BilayerError:
                return
            self.set(value, system)


class SectionForm:
    """Controls for the fields ``names`` of the design-file section ``section_name``.

    ``labels`` renames fields for display; ``on_change`` is called after any entry changes.
    """

    def __init__(self, section_name: str, names: Iterable[str], system: str = "si",
                 labels: Mapping[str, str] | None = None, on_change: Callable[[], None] | None = None):
        from ..designs.sections import section

        self.spec = section(section_name)
        self.name = section_name
        labels = dict(labels or {})
        self.entries: dict[str, _Entry] = {}
        for name in names:
            field = self.spec.field_named(name)
            self.entries[name] = _Entry(field, system, labels.get(name, name.replace("_", " ")))
        self._on_change = on_change
        self._quiet = False
        for entry in self.entries.values():
            entry.widget.observe(self._changed, names="value")

    def __getitem__(self, name: str) -> widgets.Widget:
        return self.entries[name].widget

    def _changed(self, change) -> None:
        if not self._quiet and self._on_change is not None:
            self._on_change()

    def raw_values(self) -> dict:
        """SI values of the shown, non-blank entries (each parsed; the first bad entry raises)."""
        values = {}
        for name, entry in self.entries.items():
            if entry.widget.layout.display == "none":
                continue
            value = entry.get()
            if value is not None:
                values[name] = value
        return values

    def values(self, extra: Mapping | None = None) -> dict:
        """Validated section values (defaults filled in), as a design file would hold them."""
        values = self.raw_values()
        values.update(extra or {})
        return self.spec.normalise(values, source="panel")

    def show(self, values: Mapping, system: str) -> None:
        """Fill the entries from section values (missing keys become blank or the default)."""
        self._quiet = True
        try:
            for name, entry in self.entries.items():
                entry.set(values.get(name, entry.field.default), system)
        finally:
            self._quiet = False

    def convert(self, system: str) -> None:
        self._quiet = True
        try:
            for entry in self.entries.values():
                entry.convert(system)
        finally:
            self._quiet = False

    def show_only(self, names: Iterable[str]) -> None:
        """Hide every entry not in ``names`` (fields that do not apply to the current choice)."""
        keep = set(names)
        for name, entry in self.entries.items():
            entry.widget.layout.display = "" if name in keep else "none"
