"""Design files: our TOML format for a stack, its load case, job sections and a results snapshot.

Format (docs/design-file.md)::

    format_version = 1
    name = "Thermostat strip"
    [conditions]
    bending_state = "narrow"                 # narrow | wide | plate
    stress_free_temperature = "20 degC"
    operating_temperature = "120 degC"       # or a list, or temperature_change = "100 K"
    [[layer]]                                # bottom layer first
    material = "fe36ni"                      # library key or name, or a [materials.<id>] id
    thickness = "0.5 mm"
    [materials.<id>]                         # optional custom materials (material-file format)

Values are SI numbers or texts with units (``bilayer.core.units``). Every table is described by a
:class:`bilayer.designs.sections.SectionSpec`; unknown keys, missing keys and wrong values raise
:class:`DesignFileError` naming the file, the line where it can be found, the table and the key.

Writing is exact: each quantity is written in a readable unit only when it reads back to the
identical float, else as the repr of its SI value. ``save_design`` writes atomically (temporary
file in the same directory, fsync, ``os.replace``), so a failed save leaves the old file intact.
"""
from __future__ import annotations

import os
import re
import warnings
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Mapping

from ..core.errors import DesignFileError, InputError, SuspiciousInputWarning
from ..core.files import write_text_atomic
from ..core.toml_text import BARE_KEY, dumps
from ..core.section_spec import Location, suggest
from .sections import RECORD_TABLES, job_sections, section, sections
from ..core.section_spec import _hint_of

__all__ = [
    "FORMAT_VERSION",
    "DesignDocument",
    "load_design",
    "read_design",
    "read_design_text",
    "save_design",
    "design_to_text",
    "write_text_atomic",
]

FORMAT_VERSION = 1
_TOP_KEYS = ("format_version", "name", "notes")


@dataclass(frozen=True)
class DesignDocument:
    """What a design file holds: the design, its results snapshot (or None) and the format version.

    ``extra`` holds, as read, the tables of other registered core sections that this module does not
    interpret (e.g. ``[record]`` and ``[[review]]`` of :mod:`bilayer.records`); ``line_of(table, key)``
    gives the line of a key for their error messages.
    """

    design: Any
    results: Mapping[str, Any] | None
    format_version: int
    source: str
    extra: Mapping[str, Any] = field(default_factory=dict)
    line_of: Any = field(default=lambda table, key: None, compare=False, repr=False)


# --- locating keys for error messages -------------------------------------------------------------

_HEADER = re.compile(r"^\s*(\[\[?)\s*([^\]#]+?)\s*\]\]?\s*(#.*)?$")
_KEY_LINE = re.compile(r"^\s*(\"[^\"]*\"|'[^']*'|[A-Za-z0-9_\-]+)\s*(?:\.|=)")


class _LineIndex:
    """Line numbers of table headers and keys, for messages (tomllib does not report them)."""

    def __init__(self, text: str):
        self._lines: dict[tuple[str, str], int] = {}
        counts: dict[str, int] = {}
        table = ""
        for number, line in enumerate(text.splitlines(), start=1):
            header = _HEADER.match(line)
            if header:
                name = ".".join(part.strip().strip("\"'") for part in header.group(2).split("."))
                if header.group(1) == "[[":
                    index = counts.get(name, 0)
                    counts[name] = index + 1
                    table = f"{name}#{index}"
                else:
                    table = name
                self._lines.setdefault((table, ""), number)
                continue
            key = _KEY_LINE.match(line)
            if key:
                self._lines.setdefault((table, key.group(1).strip("\"'")), number)

    def __call__(self, table: str, key: str) -> int | None:
        found = self._lines.get((table, key)) or self._lines.get((table, ""))
        if found is None and "." in table:  # a table written as a key of its parent: [materials] alloy = {...}
            parent, _, name = table.rpartition(".")
            found = self._lines.get((parent, name))
        return found


# --- reading --------------------------------------------------------------------------------------


def _read_text(source: "str | os.PathLike") -> tuple[str, str]:
    if isinstance(source, os.PathLike) or (isinstance(source, str) and "\n" not in source and "=" not in source):
        path = Path(source)
        try:
            return path.read_text(encoding="utf-8"), str(path)
        except UnicodeDecodeError as error:
            raise DesignFileError(str(path), f"byte {error.start}", "a UTF-8 text file") from None
        except OSError as error:
            raise DesignFileError(str(path), str(path), "a readable design file", error.strerror or "") from None
    if isinstance(source, str):
        return source, "<text>"
    raise InputError("source", source, "a path or the text of a design file")


def _toml(text: str, where: str) -> dict:
    import tomllib

    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as error:
        message = str(error)
        match = re.search(r"line (\d+)", message)
        lines = text.splitlines()
        number = int(match.group(1)) if match else (len(lines) if "end of document" in message else 0)
        if 0 < number <= len(lines):
            raise DesignFileError(f"{where}, line {number}", lines[number - 1].strip(), "valid TOML", message) from None
        raise DesignFileError(where, "(file contents)", "valid TOML", message) from None


def read_design(source: "str | os.PathLike", library: Any = None) -> DesignDocument:
    """Read a design file (a path, or the TOML text itself) into a :class:`DesignDocument`."""
    text, where = _read_text(source)
    return read_design_text(text, where, library)


def load_design(source: "str | os.PathLike", library: Any = None) -> Any:
    """The :class:`~bilayer.core.stack.Design` of a design file (a path, or the TOML text itself)."""
    return read_design(source, library).design


def read_design_text(text: str, where: str = "<text>", library: Any = None) -> DesignDocument:
    """Parse the TOML text of a design file; ``where`` names it in messages."""
    from .sections.materials import read_materials
    from .sections.results import read_results
    from ..core.stack import Design, Temperatures

    document = _toml(text, where)
    line_of = _LineIndex(text)
    top = Location(where, "", lambda key: line_of("", key) or line_of(key, ""))
    known = (*_TOP_KEYS, *sorted((*sections(), *RECORD_TABLES)))
    for key in document:
        if key not in known:
            hint = "unknown key or table" + (f"; {suggest(key, known)}" if suggest(key, known) else "")
            raise top.error(key, _short(document[key]), "a top-level key or table: " + ", ".join(known), hint)
    version = document.get("format_version", FORMAT_VERSION)
    if isinstance(version, bool) or not isinstance(version, int) or not 1 <= version <= FORMAT_VERSION:
        raise top.error("format_version", version, f"an integer from 1 to {FORMAT_VERSION}",
                        "written by a newer bilayer?" if isinstance(version, int) and version > FORMAT_VERSION else "")
    texts = {}
    for key in ("name", "notes"):
        value = document.get(key, "")
        if not isinstance(value, str):
            raise top.error(key, value, "a text in quotes")
        texts[key] = value

    custom = read_materials(document.get("materials", {}), where, line_of)
    layers = _read_layers(document, where, line_of, custom, library)
    if "conditions" not in document:
        raise top.error("[conditions]", None, "a [conditions] table", "required table is missing")
    conditions_location = Location(where, "[conditions]", lambda key: line_of("conditions", key))
    conditions = section("conditions").read(document["conditions"], conditions_location)
    operating = conditions["operating_temperature"]
    try:
        temperatures = Temperatures(conditions["stress_free_temperature"],
                                    list(operating) if isinstance(operating, tuple) else operating)
    except InputError as error:
        key = "stress_free_temperature" if error.field.startswith("stress_free") else "operating_temperature"
        raise conditions_location.wrap(key, error) from None

    job_values = {}
    for name, spec in job_sections().items():
        if name in document:
            location = Location(where, f"[{name}]", lambda key, name=name: line_of(name, key))
            job_values[name] = spec.read(document[name], location)
    results = read_results(document["results"], where, line_of) if "results" in document else None

    from ..core.stack import Stack

    try:
        design = Design(
            stack=Stack(tuple(layers)),
            temperatures=temperatures,
            state=conditions["bending_state"],
            axial_force=conditions["axial_force"],
            bending_moment=conditions["bending_moment"],
            name=texts["name"],
            notes=texts["notes"],
            sections=job_values,
        )
    except DesignFileError:
        raise
    except InputError as error:
        raise top.wrap(error.field, error) from None
    extra = {name: document[name] for name in RECORD_TABLES if name in document}
    return DesignDocument(design, results, version, where, extra, line_of)


def _short(value: Any) -> Any:
    text = repr(value)
    return value if len(text) < 60 else text[:57] + "..."


def _read_layers(document: Mapping, where: str, line_of: _LineIndex, custom: Mapping[str, Any], library: Any) -> list:
    from ..core.materials import get_material
    from ..core.materials.library import normalize_name
    from ..core.stack import Layer

    spec = section("layer")
    top = Location(where, "", lambda key: line_of("", key))
    raw = document.get("layer")
    if raw is None:
        raise top.error("[[layer]]", None, "one [[layer]] table per layer, bottom layer first",
                        "required table is missing")
    if not isinstance(raw, list):
        raise top.error("layer", _short(raw), "an array of tables: write [[layer]] (double brackets) per layer")
    by_name: dict[str, str] = {}
    for material_id in custom:
        other = by_name.setdefault(normalize_name(material_id), material_id)
        if other != material_id:
            raise top.error(f"[materials.{material_id}]", material_id, "material ids that differ in more than case "
                            "and punctuation", f"clashes with [materials.{other}]")
    used: set[str] = set()
    layers = []
    for index, table in enumerate(raw):
        location = Location(where, f"[[layer]] {index + 1}", lambda key, i=index: line_of(f"layer#{i}", key))
        values = spec.read(table, location)
        reference = values["material"]
        material_id = by_name.get(normalize_name(reference))
        if material_id is not None:
            material = custom[material_id]
            used.add(material_id)
        else:
            try:
                material = get_material(reference, library)
            except InputError as error:
                hint = _hint_of(error)
                if custom:
                    hint += "; materials of this file: " + ", ".join(custom)
                raise location.error("material", reference, "a library key or name, or a [materials.<id>] id",
                                     hint) from None
        try:
            layers.append(Layer(material, values["thickness"], values["label"]))
        except InputError as error:
            raise location.wrap(error.field.split(".")[-1], error) from None
    for material_id in custom:
        if material_id not in used:
            warnings.warn(f"{where}: [materials.{material_id}] is not used by any layer", SuspiciousInputWarning,
                          stacklevel=3)
    return layers


# --- writing --------------------------------------------------------------------------------------


def design_to_text(design: Any, results: Any = None, system: str = "si", library: Any = None,
                   extra: Mapping[str, Any] | None = None) -> str:
    """The TOML text of a design (and optional results snapshot) in unit ``system`` ("si" or "us").

    ``extra`` adds TOML-ready tables of other registered core sections after ``[results]`` (e.g.
    ``[record]`` and ``[[review]]`` from :mod:`bilayer.records`); they are written as given.
    """
    from .sections.materials import write_material
    from .sections.results import write_results
    from ..core.stack import Design
    from ..core.units import UNIT_SYSTEMS

    if not isinstance(design, Design):
        raise InputError("design", design, "a Design")
    if system not in UNIT_SYSTEMS:
        raise InputError("system", system, "one of " + ", ".join(UNIT_SYSTEMS))
    document: dict[str, Any] = {"format_version": FORMAT_VERSION}
    if design.name:
        document["name"] = design.name
    if design.notes:
        document["notes"] = design.notes
    operating = design.temperatures.operating
    conditions = {
        "bending_state": design.state.value,
        "stress_free_temperature": design.temperatures.stress_free,
        "operating_temperature": tuple(float(t) for t in operating) if hasattr(operating, "ndim") else operating,
        "axial_force": design.axial_force,
        "bending_moment": design.bending_moment,
    }
    document["conditions"] = section("conditions").write(conditions, system)
    ids = _material_ids(design, library)
    layer_spec = section("layer")
    document["layer"] = [
        layer_spec.write({"material": ids[id(layer.material)][0], "thickness": layer.thickness,
                          "label": layer.label or None}, system)
        for layer in design.stack
    ]
    custom: dict[str, Any] = {}
    for material_id, material in (value for value in ids.values() if value[1] is not None):
        table = write_material(material, system)
        if material.key != material_id:
            table = {"name": table.pop("name"), "key": material.key, **table}
        custom[material_id] = table
    if custom:
        document["materials"] = custom
    known = job_sections()
    for name, values in design.sections.items():
        if name not in known:
            raise InputError(f"sections.{name}", name, "a registered design-file section: " + ", ".join(known),
                             suggest(name, known))
        document[name] = known[name].write(values, system)
    if results is not None:
        document["results"] = write_results(results)
    for name, table in (extra or {}).items():
        if name not in RECORD_TABLES or name in document:
            raise InputError("extra", name, "one of the record tables: " + ", ".join(RECORD_TABLES))
        document[name] = table
    header = (
        f"# bilayer design file, format {FORMAT_VERSION} (docs/design-file.md)\n"
        "# Layers are listed bottom first. Quantities are texts with units or plain SI numbers.\n"
    )
    if results is not None:
        header += "# [results] is a snapshot of the engine's answer in SI units (m, Pa, 1/m, N/m, K).\n"
    return header + "\n" + dumps(document)


def _material_ids(design: Any, library: Any) -> dict[int, tuple[str, Any]]:
    """id(material) -> (reference written in [[layer]], material or None for a library entry).

    Custom materials get ids that match no library key or name and no other id (lookups ignore
    case and punctuation), so every reference reads back to the same material.
    """
    from ..core.materials import default_library
    from ..core.materials.library import normalize_name

    library = library if library is not None else default_library()
    ids: dict[int, tuple[str, Any]] = {}
    custom: list[tuple[str, Any]] = []
    taken: set[str] = set()
    for layer in design.stack:
        material = layer.material
        if id(material) in ids:
            continue
        same = next((m_id for m_id, other in custom if other == material), None)
        if same is not None:
            ids[id(material)] = (same, None)
        elif material.key and library.get(material.key) == material:
            ids[id(material)] = (material.key, None)
        else:
            base = material.key if material.key and BARE_KEY.fullmatch(material.key) else (
                re.sub(r"[^0-9a-z]+", "_", material.name.casefold()).strip("_") or "material")
            material_id, counter = base, 1
            while normalize_name(material_id) in taken or library.get(material_id) is not None:
                counter += 1
                material_id = f"{base}_{counter}"
            taken.add(normalize_name(material_id))
            custom.append((material_id, material))
            ids[id(material)] = (material_id, material)
    return ids


def save_design(design: Any, path: "str | os.PathLike", results: Any = None, system: str = "si",
                library: Any = None, extra: Mapping[str, Any] | None = None) -> Path:
    """Write ``design`` (and an optional results snapshot) to ``path`` atomically; returns the path.

    The text is built first; then it goes to a temporary file in the same directory, is flushed and
    fsync'ed, and replaces ``path`` with ``os.replace``. On any failure the old file is untouched
    and the temporary file removed.
    """
    return write_text_atomic(path, design_to_text(design, results, system, library, extra))
