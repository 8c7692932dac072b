"""Checking design records: re-evaluate, compare with the snapshot, and say readably what changed.

:func:`check_record` compares (1) the inputs in the file with their recorded hash, (2) today's
material data with the copy in the record, (3) today's results with the snapshot within a stated
:class:`Tolerance`, and (4) the review log with its hash chain. :func:`input_differences` lists the
inputs of a design that differ from a record (used by the review panel). Differences carry their
unit kind, so they print in SI or US units.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Callable, Mapping, Sequence

from ..core.errors import InputError
from .record import DesignRecord, ReviewState, material_data, results_dict, with_full_sources, canonical_inputs, inputs_hash, material_ids, review_state, verify_review_log

__all__ = [
    "RESULT_LABELS",
    "LAYER_LABELS",
    "INTERFACE_LABELS",
    "Tolerance",
    "Difference",
    "CheckReport",
    "compare_results",
    "input_differences",
    "check_record",
]


RESULT_LABELS: dict[str, tuple[str, str]] = {
    # key of StackResult.to_dict(): (readable name, unit kind of bilayer.core.units)
    "stress_free_temperature": ("stress-free temperature", "temperature"),
    "operating_temperature": ("operating temperature", "temperature"),
    "temperature_change": ("temperature change ΔT", "temperature_difference"),
    "axial_force": ("applied axial force per width", "force_per_width"),
    "bending_moment": ("applied bending moment per width", "moment_per_width"),
    "curvature": ("curvature κ", "curvature"),
    "radius": ("radius of curvature", "length"),
    "bending_axis": ("bending axis height", "length"),
    "neutral_axis": ("neutral axis height (zero strain)", "length"),
    "axial_strain": ("strain at the bending axis", "strain"),
    "midplane_strain": ("strain at mid-thickness", "strain"),
    "axial_rigidity": ("axial rigidity per width", "force_per_width"),
    "flexural_rigidity": ("flexural rigidity per width", "flexural_rigidity"),
    "thermal_force": ("thermal force per width", "force_per_width"),
    "thermal_moment": ("thermal moment per width", "moment_per_width"),
    "effective_cte": ("effective CTE of the free stack", "cte"),
    "strain_energy": ("strain energy per area", "energy_per_area"),
}
LAYER_LABELS: dict[str, tuple[str, str]] = {
    "thickness": ("thickness", "length"),
    "bottom": ("bottom face height", "length"),
    "top": ("top face height", "length"),
    "stress_bottom": ("σx at bottom face", "stress"),
    "stress_top": ("σx at top face", "stress"),
    "transverse_stress_bottom": ("σy at bottom face", "stress"),
    "transverse_stress_top": ("σy at top face", "stress"),
    "force": ("axial force carried per width", "force_per_width"),
}
INTERFACE_LABELS: dict[str, tuple[str, str]] = {
    "height": ("height", "length"),
    "stress_below": ("σx just below", "stress"),
    "stress_above": ("σx just above", "stress"),
}
_TEXT_RESULT_KEYS = ("bending_state", "restraint")
_MATERIAL_KINDS = {
    "youngs_modulus": "modulus", "poisson_ratio": "dimensionless", "density": "density", "strength": "stress",
    "glass_transition": "temperature", "solidus": "temperature", "temperature_range": "temperature",
    "value": "cte", "values": "cte", "reference": "temperature", "temperatures": "temperature",
    "valid_range": "temperature", "measured": "temperature",
}
_INPUT_KINDS = {
    "stress_free_temperature": "temperature", "operating_temperature": "temperature",
    "axial_force": "force_per_width", "bending_moment": "moment_per_width", "thickness": "length",
}


@dataclass(frozen=True)
class Tolerance:
    """How closely re-evaluated results must match the snapshot.

    A number passes when |current - recorded| <= ``relative`` x max(|recorded|, |current|, S), where
    S is the largest recorded magnitude of the same kind (all stresses, all lengths...), so values
    near zero are judged against the scale of their kind. Texts, counts and undefined values
    (an infinite radius) must match exactly.
    """

    relative: float = 1e-6

    def __post_init__(self):
        if not (isinstance(self.relative, (int, float)) and 0.0 <= self.relative < 1.0):
            raise InputError("relative tolerance", self.relative, "0 <= relative tolerance < 1")

    def describe(self) -> str:
        return (f"|current - recorded| <= {self.relative:g} x the larger of |recorded|, |current| and the largest "
                "recorded value of the same kind")


def _format(value: Any, kind: str, system: str, digits: int = 7) -> str:
    from ..core.units import format_quantity

    if value is None:
        return "undefined"
    if isinstance(value, (list, tuple)):
        return "[" + ", ".join(_format(v, kind, system, digits) for v in value) + "]"
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not kind:
        return repr(value) if isinstance(value, str) else str(value)
    if kind in ("dimensionless", "strain"):
        return f"{value:.{digits}g}"
    return format_quantity(float(value), kind, system=system, digits=digits)


@dataclass(frozen=True)
class Difference:
    """One value that differs: a readable name, the recorded and the current value (SI) and its unit kind."""

    what: str
    recorded: Any
    current: Any
    kind: str = ""

    def text(self, system: str = "si") -> str:
        if self.recorded is None and self.kind == "":
            return f"{self.what}: now {_format(self.current, '', system)}"
        if self.current is None and self.kind == "":
            return f"{self.what}: recorded {_format(self.recorded, '', system)}, now gone"
        line = (f"{self.what}: recorded {_format(self.recorded, self.kind, system)}, "
                f"now {_format(self.current, self.kind, system)}")
        a, b = self.recorded, self.current
        numeric = all(isinstance(v, (int, float)) and not isinstance(v, bool) for v in (a, b))
        if numeric and self.kind:
            step_kind = "temperature_difference" if self.kind == "temperature" else self.kind
            line += f" (difference {_format(b - a, step_kind, system, 3)}"
            line += f", {100.0 * (b - a) / abs(a):+.3g} %)" if a and self.kind != "temperature" else ")"
        return line


def _numbers(value: Any) -> list[float]:
    if value is None:
        return []
    if isinstance(value, (list, tuple)):
        return [x for v in value for x in _numbers(v)]
    return [abs(float(value))] if isinstance(value, (int, float)) and not isinstance(value, bool) else []


def _scales(results: Mapping[str, Any]) -> dict[str, float]:
    scales: dict[str, float] = {}

    def add(kind: str, value: Any) -> None:
        scales[kind] = max([scales.get(kind, 0.0), *_numbers(value)])

    for key, (_, kind) in RESULT_LABELS.items():
        add(kind, results.get(key))
    for group, labels in (("layers", LAYER_LABELS), ("interfaces", INTERFACE_LABELS)):
        for entry in results.get(group, []) or []:
            for key, (_, kind) in labels.items():
                add(kind, entry.get(key))
    return scales


def _close(a: Any, b: Any, scale: float, tolerance: Tolerance) -> bool:
    if a is None or b is None:
        return a is None and b is None
    if isinstance(a, (list, tuple)) or isinstance(b, (list, tuple)):
        return (isinstance(a, (list, tuple)) and isinstance(b, (list, tuple)) and len(a) == len(b)
                and all(_close(x, y, scale, tolerance) for x, y in zip(a, b)))
    a, b = float(a), float(b)
    return abs(b - a) <= tolerance.relative * max(abs(a), abs(b), scale)


def compare_results(recorded: Mapping[str, Any], current: Any, tolerance: Tolerance = Tolerance()
                    ) -> tuple[list[Difference], int]:
    """Differences between a results snapshot and a current result (or its ``to_dict()``), and the
    number of values compared. Warnings and assumptions are compared as texts."""
    current = results_dict(current)
    scales = _scales(recorded)
    differences: list[Difference] = []
    compared = 0

    def number(what: str, a: Any, b: Any, kind: str) -> None:
        nonlocal compared
        compared += max(1, len(_numbers(a)))
        if not _close(a, b, scales.get(kind, 0.0), tolerance):
            differences.append(Difference(what, a, b, kind))

    for key in _TEXT_RESULT_KEYS:
        if key in recorded:
            compared += 1
            if recorded.get(key) != current.get(key):
                differences.append(Difference(key.replace("_", " "), recorded.get(key), current.get(key)))
    for key, (name, kind) in RESULT_LABELS.items():
        if key in recorded:  # values the snapshot holds; fields added to the engine later are not drift
            number(name, recorded.get(key), current.get(key), kind)
    for group, labels, title in (("layers", LAYER_LABELS, "layer"), ("interfaces", INTERFACE_LABELS, "interface")):
        if group not in recorded:
            continue
        old, new = list(recorded.get(group) or []), list(current.get(group) or [])
        compared += 1
        if len(old) != len(new):
            differences.append(Difference(f"number of {group}", len(old), len(new)))
            continue
        for index, (a, b) in enumerate(zip(old, new), start=1):
            name = f"{title} {index}" + (f" ({a.get('label')})" if a.get("label") else "")
            for key in ("label", "material"):
                if key in a:
                    compared += 1
                    if a.get(key) != b.get(key):
                        differences.append(Difference(f"{name}: {key}", a.get(key), b.get(key)))
            for key, (label, kind) in labels.items():
                if key in a:
                    number(f"{name}: {label}", a.get(key), b.get(key), kind)
    for key in ("warnings", "assumptions"):
        if key not in recorded:
            continue
        old, new = list(recorded.get(key) or []), list(current.get(key) or [])
        compared += 1
        for text in old:
            if text not in new:
                differences.append(Difference(f"{key[:-1]} no longer given", text, None))
        for text in new:
            if text not in old:
                differences.append(Difference(f"new {key[:-1]}", None, text))
    return differences, compared


def _diff_tree(path: str, a: Any, b: Any, kind_of: Callable[[str, str], str], out: list[Difference]) -> None:
    if isinstance(a, Mapping) and isinstance(b, Mapping):
        for key in list(a) + [k for k in b if k not in a]:
            _diff_tree(f"{path}.{key}" if path else str(key), a.get(key), b.get(key), kind_of, out)
        return
    if a != b:
        out.append(Difference(path, a, b, kind_of(path, path.rsplit(".", 1)[-1])))


def _input_kind(path: str, key: str) -> str:
    from ..designs.sections import job_sections
    from ..core.section_spec import _PLAIN_KINDS

    parts = path.split(".")
    if parts[0] == "materials":
        return _MATERIAL_KINDS.get(key, "")
    if parts[0] == "sections" and len(parts) >= 3:
        spec = job_sections().get(parts[1])
        if spec is not None and parts[2] in spec.keys:
            kind = spec.field_named(parts[2]).kind
            return "" if kind in _PLAIN_KINDS else kind
        return ""
    return _INPUT_KINDS.get(key, "")


def _readable_inputs(inputs: dict) -> dict:
    """Canonical inputs keyed for messages: layers as "layer 1", "layer 2"... (bottom first)."""
    readable = dict(inputs)
    readable["layers"] = {f"layer {i + 1}": layer for i, layer in enumerate(inputs["layers"])}
    if len(inputs["layers"]) == 0:
        readable.pop("layers")
    return readable


def input_differences(recorded: DesignRecord, design: Any) -> list[Difference]:
    """Every input of ``design`` that differs from the recorded inputs (with the recorded material data),
    named like ``conditions.operating_temperature``, ``layers.layer 2.thickness`` or
    ``materials.fe36ni.youngs_modulus``. Exact: any change counts. Name and notes are not inputs."""
    old = _readable_inputs(canonical_inputs(recorded.design, recorded.materials))
    new = _readable_inputs(canonical_inputs(design))
    differences: list[Difference] = []
    if len(old.get("layers", {})) != len(new.get("layers", {})):
        differences.append(Difference("number of layers", len(old.get("layers", {})), len(new.get("layers", {}))))
    _diff_tree("", old, new, _input_kind, differences)
    return differences


@dataclass(frozen=True)
class CheckReport:
    """What :func:`check_record` found. ``ok`` is False on any of: inputs that do not match their hash,
    material data that changed, results that moved beyond the tolerance, a broken review chain."""

    source: str
    record_format: int
    recorded_version: str
    current_version: str
    recorded_hash: str
    current_hash: str
    material_differences: tuple[Difference, ...]
    result_differences: tuple[Difference, ...]
    compared: int
    reproduces_with_recorded_materials: bool | None
    review_problems: tuple[str, ...]
    review: ReviewState
    notes: tuple[str, ...]
    tolerance: Tolerance

    @property
    def inputs_match(self) -> bool:
        return self.recorded_hash == self.current_hash

    @property
    def drift(self) -> bool:
        return bool(self.material_differences or self.result_differences)

    @property
    def ok(self) -> bool:
        return self.inputs_match and not self.drift and not self.review_problems

    def summary(self) -> str:
        if self.ok:
            return "OK"
        parts = []
        if not self.inputs_match:
            parts.append("inputs changed")
        if self.material_differences:
            parts.append("material data changed")
        if self.result_differences:
            parts.append("results drifted")
        if self.review_problems:
            parts.append("review log broken")
        return "FAILED: " + ", ".join(parts)

    def text(self, system: str = "si") -> str:
        """A readable account, one finding per line."""
        lines = [f"{self.source}: {self.summary()}"]
        version = self.recorded_version + ("" if self.recorded_version == self.current_version
                                           else f" (now {self.current_version})")
        lines.append(f"  record format {self.record_format}, computed by bilayer {version}")
        if self.inputs_match:
            lines.append(f"  inputs: match their hash {self.recorded_hash[:19]}...")
        else:
            lines.append(f"  inputs: DO NOT MATCH their hash: recorded {self.recorded_hash}, "
                         f"inputs in the file give {self.current_hash}")
            lines.append("    the inputs (or the material copy) were edited after the results were recorded")
        if self.material_differences:
            lines.append("  material data: the library now differs from the copy in the record:")
            lines += [f"    {d.text(system)}" for d in self.material_differences]
        else:
            lines.append("  material data: as recorded")
        if self.result_differences:
            lines.append(f"  results: {len(self.result_differences)} of {self.compared} values differ beyond the "
                         f"tolerance ({self.tolerance.describe()}):")
            lines += [f"    {d.text(system)}" for d in self.result_differences]
            if self.reproduces_with_recorded_materials is not None:
                lines.append("    with the recorded material data the stored results "
                             + ("are reproduced: the change comes from the material data"
                                if self.reproduces_with_recorded_materials else "are not reproduced either"))
        else:
            lines.append(f"  results: {self.compared} values reproduce within tolerance ({self.tolerance.describe()})")
        for problem in self.review_problems:
            lines.append(f"  review log: {problem}")
        lines.append(f"  review: {self.review.text()}")
        lines += [f"  note: {note}" for note in self.notes]
        return "\n".join(lines)


def check_record(record: DesignRecord, tolerance: Tolerance = Tolerance(),
                 cautions: Sequence[str] | None = None, library: Any = None) -> CheckReport:
    """Re-evaluate ``record`` with today's code and library and compare it with what was recorded.

    The design in the record was read with today's material library; the recorded copy of the data
    is compared with it property by property (sources are compared too, as notes). ``cautions``,
    when given, are today's cautions for the design; a change from the recorded ones is a note.
    ``library`` is the material library the record was read with (default: the built-in one).
    """
    from ..core.version import VERSION
    from ..core.materials import default_library

    library = library if library is not None else default_library()

    current_hash = inputs_hash(record.design, record.materials)
    material_differences: list[Difference] = []
    notes: list[str] = list(record.notes)
    seen = set()
    for material_id, layer in zip(material_ids(record.design), record.design.stack):
        if material_id in seen or material_id not in record.materials:
            continue
        seen.add(material_id)
        copy = record.materials[material_id]
        _diff_tree(f"material {material_id}", material_data(copy), material_data(layer.material),
                   lambda path, key: _MATERIAL_KINDS.get(key, ""), material_differences)
        if dict(copy.sources) != dict(with_full_sources(layer.material, library).sources):
            notes.append(f"material {material_id}: the sources given in the library changed since the record was made")
    current = record.design.evaluate()
    differences, compared = compare_results(record.results, current, tolerance)
    reproduces = None
    if material_differences and differences:
        again, _ = compare_results(record.results, record.recorded_design().evaluate(), tolerance)
        reproduces = not again
    if record.bilayer_version != VERSION:
        notes.append(f"recorded with bilayer {record.bilayer_version}, checked with {VERSION}")
    if cautions is not None and record.cautions and tuple(cautions) != tuple(record.cautions):
        notes.append("the cautions for this design changed since it was recorded (the report shows today's)")
    return CheckReport(
        source=record.source,
        record_format=record.format,
        recorded_version=record.bilayer_version,
        current_version=VERSION,
        recorded_hash=record.inputs_hash,
        current_hash=current_hash,
        material_differences=tuple(material_differences),
        result_differences=tuple(differences),
        compared=compared,
        reproduces_with_recorded_materials=reproduces,
        review_problems=tuple(verify_review_log(record.reviews)),
        review=review_state(record.reviews, current_hash),
        notes=tuple(notes),
        tolerance=tolerance,
    )

