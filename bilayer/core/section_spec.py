"""Declarative description of one table of a design file: its keys, their unit kinds and defaults.

A :class:`SectionSpec` lists :class:`Field` entries. ``read`` turns a TOML table into a dict of SI
values (unknown keys, missing required keys, wrong types and out-of-range values raise
:class:`~bilayer.core.errors.DesignFileError` naming the table and key, with a "did you mean"
suggestion for misspelt keys); ``write`` turns the dict back into TOML values, quantities as
readable unit strings that parse back to the identical float.
"""
from __future__ import annotations

import difflib
import math
from dataclasses import dataclass, field
from decimal import Decimal
from enum import Enum
from typing import Any, Callable, Iterable, Mapping

from .errors import DesignFileError, InputError

__all__ = ["Field", "SectionSpec", "Location", "exact_text", "suggest", "TEXT", "CHOICE", "INTEGER", "BOOLEAN", "TABLE"]

TEXT = "text"
CHOICE = "choice"
INTEGER = "integer"
BOOLEAN = "boolean"
TABLE = "table"
_PLAIN_KINDS = (TEXT, CHOICE, INTEGER, BOOLEAN, TABLE)

SCALAR = "scalar"
LIST = "list"
SCALAR_OR_LIST = "scalar_or_list"


@dataclass(frozen=True)
class Location:
    """Where a value sits: the file name and the table path, e.g. ``design.toml`` and ``[[layer]] 2``."""

    source: str
    table: str
    line_of: Callable[[str], int | None] = field(default=lambda key: None, compare=False, repr=False)

    def field(self, key: str) -> str:
        line = self.line_of(key)
        where = f"{self.source}, line {line}" if line else self.source
        table = f" {self.table}" if self.table else ""
        return f"{where}{table}: {key}" if key else f"{where}{table}"

    def error(self, key: str, value: object, valid: str, hint: str = "") -> DesignFileError:
        return DesignFileError(self.field(key), value, valid, hint)

    def wrap(self, key: str, error: InputError) -> DesignFileError:
        """Re-raise an InputError from a value check with this location in front of its field name."""
        return DesignFileError(self.field(key), error.value, error.valid, _hint_of(error))


def _hint_of(error: InputError) -> str:
    base = f"{error.field}: {error.value!r} is not valid; expected {error.valid}"
    message = str(error.args[0]) if error.args else ""
    return message[len(base) + 2:-1] if message.startswith(base + " (") else ""


def suggest(key: str, known: Iterable[str]) -> str:
    """ "did you mean 'x'?" for the closest known key, or an empty text."""
    known = list(known)
    lowered = {k.lower(): k for k in known}
    if str(key).lower() in lowered:
        return f"did you mean {lowered[str(key).lower()]!r}?"
    close = difflib.get_close_matches(str(key), known, n=1, cutoff=0.6)
    return f"did you mean {close[0]!r}?" if close else ""


@dataclass(frozen=True)
class Field:
    """One key of a table.

    ``kind`` is a unit kind of :mod:`bilayer.core.units` ("length", "temperature", ...) or one of
    ``text``, ``choice`` (with ``choices``), ``integer``, ``boolean``, ``table`` (a sub-table passed
    through as a dict). ``shape`` is ``scalar``, ``list`` or ``scalar_or_list``; lists read as
    tuples. ``low``/``high`` bound SI values (exclusive unless ``inclusive``).
    """

    name: str
    kind: str
    required: bool = False
    default: Any = None
    choices: tuple[str, ...] = ()
    shape: str = SCALAR
    low: float | None = None
    high: float | None = None
    inclusive: bool = False
    doc: str = ""

    def read(self, raw: object, location: Location) -> Any:
        if self.shape == LIST or (self.shape == SCALAR_OR_LIST and isinstance(raw, list)):
            if not isinstance(raw, list) or not raw:
                raise location.error(self.name, raw, f"a non-empty list of {self._describe()}")
            return tuple(self._read_one(item, location, f"{self.name}[{i}]") for i, item in enumerate(raw))
        if isinstance(raw, list):
            raise location.error(self.name, raw, f"one value: {self._describe()}")
        return self._read_one(raw, location, self.name)

    def _describe(self) -> str:
        if self.kind == CHOICE:
            return "one of " + ", ".join(repr(c) for c in self.choices)
        if self.kind in _PLAIN_KINDS:
            return {TEXT: "a text", INTEGER: "an integer", BOOLEAN: "true or false", TABLE: "a table"}[self.kind]
        from .units import kind_info

        info = kind_info(self.kind)
        examples = ", ".join(repr(e) for e in info.examples[:2])
        return f"{info.description} (e.g. {examples})"

    def _read_one(self, raw: object, location: Location, key: str) -> Any:
        if self.kind == TEXT:
            if not isinstance(raw, str):
                raise location.error(key, raw, "a text in quotes")
            return raw
        if self.kind == CHOICE:
            if not isinstance(raw, str) or raw.strip().lower() not in self.choices:
                hint = suggest(raw, self.choices) if isinstance(raw, str) else ""
                raise location.error(key, raw, self._describe(), hint)
            return raw.strip().lower()
        if self.kind == BOOLEAN:
            if not isinstance(raw, bool):
                raise location.error(key, raw, "true or false")
            return raw
        if self.kind == INTEGER:
            if isinstance(raw, bool) or not isinstance(raw, int):
                raise location.error(key, raw, "an integer")
            self._check_bounds(raw, raw, location, key)
            return raw
        if self.kind == TABLE:
            if not isinstance(raw, Mapping):
                raise location.error(key, raw, "a table")
            return dict(raw)
        from .units import parse

        try:
            value = parse(raw, self.kind, key)
        except InputError as error:
            raise location.wrap(key, error) from None
        self._check_bounds(value, raw, location, key)
        return value

    def _check_bounds(self, value: float, raw: object, location: Location, key: str) -> None:
        too_low = self.low is not None and (value < self.low if self.inclusive else value <= self.low)
        too_high = self.high is not None and (value > self.high if self.inclusive else value >= self.high)
        if too_low or too_high:
            sign = "<=" if self.inclusive else "<"
            low = f"{self.low:g} {sign} " if self.low is not None else ""
            high = f" {sign} {self.high:g}" if self.high is not None else ""
            unit = ""
            if self.kind not in _PLAIN_KINDS:
                from .units import kind_info

                si_unit = kind_info(self.kind).si_unit
                unit = f" (in SI: {si_unit})" if si_unit else ""
            raise location.error(key, raw, f"{low}{self.name}{high}{unit}")

    def write(self, value: Any, system: str) -> Any:
        if isinstance(value, (list, tuple)) or (hasattr(value, "ndim") and getattr(value, "ndim", 0) > 0):
            if self.shape == SCALAR:
                raise InputError(self.name, value, f"one value: {self._describe()}")
            return [self._write_one(v, system) for v in list(value)]
        if self.shape == LIST:
            raise InputError(self.name, value, f"a list of {self._describe()}")
        return self._write_one(value, system)

    def _write_one(self, value: Any, system: str) -> Any:
        if isinstance(value, Enum):
            value = value.value
        if self.kind in (TEXT, CHOICE, TABLE):
            return value if self.kind != TABLE else dict(value)
        if self.kind in (INTEGER, BOOLEAN):
            return value
        return exact_text(float(value), self.kind, system)


def _candidates(number: float):
    """Texts of ``number``, shortest first: fixed-point with 0-17 decimals, then 1-17 significant digits."""
    if abs(number) < 1e15:
        for decimals in range(18):
            yield f"{number:.{decimals}f}"
    for digits in range(1, 18):
        text = f"{number:.{digits}g}"
        if "e" in text and 1e-4 <= abs(number) < 1e15:
            text = f"{Decimal(text):f}"
        yield text


def exact_text(value: float, kind: str, system: str = "si") -> str | float:
    """A readable unit text for ``value`` (SI) that :func:`bilayer.core.units.parse` reads back exactly.

    Tries the display unit of ``system`` with the shortest number text first, then the repr of the SI
    value with its SI unit; dimensionless values stay plain numbers.
    """
    from .units import display_unit, from_si, kind_info, parse

    info = kind_info(kind)
    if not math.isfinite(value):
        raise InputError(kind, value, "a finite number")
    if not info.si_unit:
        return value
    label = display_unit(kind, system, value)
    number = from_si(value, kind, label)
    for candidate in _candidates(number):
        if float(candidate) == 0.0:
            candidate = "0"
        text = f"{candidate} {label}"
        try:
            if parse(text, kind) == value:
                return text
        except InputError:  # e.g. a text too long to read back
            continue
    text = f"{value!r} {info.si_unit}"
    return text if parse(text, kind) == value else value


@dataclass(frozen=True)
class SectionSpec:
    """A table of the design file: its name, fields and an optional cross-field check.

    ``core`` sections are read into the Design's own fields (conditions, layers, materials,
    results); the others are job sections stored in ``Design.sections[name]``. ``check`` receives
    the dict of read values and the location and returns the (possibly completed) dict.
    """

    name: str
    fields: tuple[Field, ...]
    doc: str = ""
    core: bool = False
    array: bool = False
    check: Callable[[dict, Location], dict] | None = None

    @property
    def keys(self) -> tuple[str, ...]:
        return tuple(f.name for f in self.fields)

    def field_named(self, name: str) -> Field:
        for item in self.fields:
            if item.name == name:
                return item
        raise KeyError(name)

    def check_keys(self, table: Mapping, location: Location) -> None:
        known = self.keys
        for key in table:
            if key not in known:
                raise location.error(
                    key, table[key], f"a key of {location.table or self.name}: " + ", ".join(known),
                    "unknown key" + (f"; {suggest(key, known)}" if suggest(key, known) else ""),
                )

    def read(self, table: object, location: Location) -> dict:
        """SI values of the table, defaults filled in; errors name the key and where it is."""
        if not isinstance(table, Mapping):
            raise location.error("", table, f"a table [{self.name}]")
        self.check_keys(table, location)
        values: dict = {}
        for item in self.fields:
            if item.name in table:
                values[item.name] = item.read(table[item.name], location)
            elif item.required:
                raise location.error(item.name, None, item._describe(), "required key is missing")
            elif item.default is not None:
                values[item.name] = item.default
        return self.check(values, location) if self.check else values

    def write(self, values: Mapping, system: str = "si") -> dict:
        """TOML-ready dict (unit texts) of ``values``; None values are left out."""
        known = self.keys
        for key in values:
            if key not in known:
                raise InputError(f"{self.name}.{key}", values[key], "a key of [" + self.name + "]: " + ", ".join(known),
                                 suggest(key, known))
        table = {}
        for item in self.fields:
            value = values.get(item.name)
            if value is not None:
                table[item.name] = item.write(value, system)
        return table

    def normalise(self, values: Mapping, source: str = "<values>") -> dict:
        """Validate a dict of SI values the way a file would be read (defaults filled in)."""
        return self.read(self.write(values), Location(source, f"[{self.name}]"))
