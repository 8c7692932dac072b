"""Design records: a design with its results snapshot, provenance and an append-only review log.

A record is a design file (:mod:`bilayer.designs.design_file`) with three more parts:

* ``[results]``: the engine's answer (``StackResult.to_dict()``, SI) when the record was made;
* ``[record]``: record format, bilayer version, creation time (UTC), the hash of the canonical
  inputs, the deflected-shape figure settings, the cautions shown, and ``[record.materials.<id>]``,
  a copy of every material used (material-file format, sources with full citations);
* ``[[review]]``: reviewer, date, verdict, comment, the inputs hash the reviewer saw, and a hash
  chaining the entry to the ones before it.

Canonical inputs (what the hash covers): the conditions, the layers (material id, thickness,
label), the data of each material used (every property, not its sources or notes) and the job
sections, as JSON with sorted keys and SI floats written by ``repr`` (exact). The design's name and
notes are descriptive and not covered. The hash is SHA-256; like the review chain it detects edits
and copying mistakes, it is not a signature (anyone can recompute it).

:func:`bilayer.records.check.check_record` re-evaluates a record and says what changed. Older
record formats are migrated on reading (:data:`MIGRATIONS`); files are written atomically and a
review is appended to the file's text without rewriting anything above it.
"""
from __future__ import annotations

import hashlib
import json
import os
import re
import warnings
from dataclasses import dataclass, replace
from datetime import date as _date
from datetime import datetime, timezone
from pathlib import Path
from typing import Any, Callable, Iterable, Mapping, Sequence


from ..core.errors import DesignFileError, InputError
from ..core.jsonable import plain
from ..core.toml_text import dumps
from .section import RECORD, REVIEW, SUPPORTS, VERDICTS

__all__ = [
    "RECORD_FORMAT",
    "VERDICTS",
    "MIGRATIONS",
    "ReviewEntry",
    "ReviewState",
    "DesignRecord",
    "canonical_inputs",
    "inputs_hash",
    "material_ids",
    "material_data",
    "results_dict",
    "with_full_sources",
    "make_record",
    "record_to_text",
    "save_record",
    "read_record",
    "read_record_text",
    "append_review",
    "verify_review_log",
    "review_state",
    "now_utc",
]

RECORD_FORMAT = 2
"""Current record format. 1: first layout (reviews inside [record], no material copy); 2: this one."""

DEFAULT_STRIP_LENGTH = 0.05  # m; the panels' default strip length for the deflected-shape figure
_HASH_PREFIX = "sha256:"
_DATE = re.compile(r"\d{4}-\d{2}-\d{2}([T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?")


# --- canonical inputs and their hash ---------------------------------------------------------------


def material_ids(design: Any) -> tuple[str, ...]:
    """The id of each layer's material (bottom first): its key, else its name; a different material
    that would take an id already used gets ``_2``, ``_3``... in layer order."""
    taken: dict[str, Any] = {}
    ids = []
    for layer in design.stack:
        material = layer.material
        base = material.key or material.name
        material_id, counter = base, 1
        while material_id in taken and material_data(taken[material_id]) != material_data(material):
            counter += 1
            material_id = f"{base}_{counter}"
        taken.setdefault(material_id, material)
        ids.append(material_id)
    return tuple(ids)


def material_data(material: Any) -> dict:
    """Every property of a material as SI numbers (the material-file table without sources and notes)."""
    from ..core.materials import material_to_table

    table = material_to_table(material)
    table.pop("sources", None)
    table.pop("notes", None)
    return table


def canonical_inputs(design: Any, materials: Mapping[str, Any] | None = None,
                     with_material_data: bool = True) -> dict:
    """The inputs of ``design`` as plain, JSON-ready SI values (what :func:`inputs_hash` covers).

    ``materials`` (id -> Material) replaces the data of the materials with those ids, e.g. by the
    copy kept in a record. ``with_material_data=False`` leaves the material data out (record format 1).
    """
    from ..designs.sections import job_sections

    ids = material_ids(design)
    operating = design.temperatures.operating
    inputs: dict[str, Any] = {
        "conditions": {
            "bending_state": design.state.value,
            "stress_free_temperature": float(design.temperatures.stress_free),
            "operating_temperature": plain(operating, finite_only=False),
            "axial_force": float(design.axial_force),
            "bending_moment": float(design.bending_moment),
        },
        "layers": [
            {"material": material_id, "thickness": float(layer.thickness), "label": layer.label}
            for material_id, layer in zip(ids, design.stack)
        ],
    }
    if with_material_data:
        chosen = dict(materials or {})
        inputs["materials"] = {
            material_id: material_data(chosen.get(material_id, layer.material))
            for material_id, layer in zip(ids, design.stack)
        }
    known = job_sections()
    sections = {}
    for name, values in design.sections.items():
        spec = known.get(name)
        sections[name] = plain(spec.normalise(values) if spec is not None else dict(values), finite_only=False)
    inputs["sections"] = sections
    return inputs


def _digest(data: Any) -> str:
    text = json.dumps(data, sort_keys=True, separators=(",", ":"), ensure_ascii=False, allow_nan=False)
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


def inputs_hash(design: Any, materials: Mapping[str, Any] | None = None) -> str:
    """``"sha256:<hex>"`` of :func:`canonical_inputs` (material data from ``materials`` where given)."""
    return _HASH_PREFIX + _digest(canonical_inputs(design, materials))


# --- review log ------------------------------------------------------------------------------------


def _check_date(text: str, field_name: str = "date") -> str:
    if not isinstance(text, str) or not _DATE.fullmatch(text.strip()):
        raise InputError(field_name, text, "an ISO 8601 date or date and time, e.g. 2026-12-03 or 2026-12-03T14:05Z")
    text = text.strip()
    try:
        if len(text) == 10:
            _date.fromisoformat(text)
        else:
            datetime.fromisoformat(text.replace("Z", "+00:00").replace(" ", "T"))
    except ValueError:
        raise InputError(field_name, text, "a real calendar date and time (ISO 8601)") from None
    return text


def now_utc() -> str:
    """The current time in UTC as ISO 8601 text to the second (``2026-12-03T14:05:09Z``)."""
    return datetime.now(timezone.utc).strftime("%Y-%m-%dT%H:%M:%SZ")


@dataclass(frozen=True)
class ReviewEntry:
    """One review: who, when, the verdict (:data:`VERDICTS`), what they said, and the inputs hash of the
    design they reviewed. ``log_hash`` chains the entry to the ones before it (set by the log)."""

    reviewer: str
    date: str
    verdict: str
    comment: str = ""
    inputs_hash: str = ""
    log_hash: str = ""

    def __post_init__(self):
        if not isinstance(self.reviewer, str) or not self.reviewer.strip():
            raise InputError("reviewer", self.reviewer, "a non-empty name")
        object.__setattr__(self, "reviewer", self.reviewer.strip())
        object.__setattr__(self, "date", _check_date(self.date))
        if self.verdict not in VERDICTS:
            from ..core.section_spec import suggest

            hint = suggest(self.verdict, VERDICTS) if isinstance(self.verdict, str) else ""
            raise InputError("verdict", self.verdict, "one of " + ", ".join(VERDICTS), hint)
        for name in ("comment", "inputs_hash", "log_hash"):
            if not isinstance(getattr(self, name), str):
                raise InputError(name, getattr(self, name), "a text")

    def payload(self) -> dict:
        """The fields the chain hash covers (everything except the chain hash itself)."""
        return {"reviewer": self.reviewer, "date": self.date, "verdict": self.verdict, "comment": self.comment,
                "inputs_hash": self.inputs_hash}

    def chained(self, previous: str) -> "ReviewEntry":
        """This entry with the log hash that follows ``previous`` (the log hash of the entry before, or "")."""
        return replace(self, log_hash=_chain(previous, self))


def _chain(previous: str, entry: ReviewEntry) -> str:
    return _HASH_PREFIX + _digest({"previous": previous, "entry": entry.payload()})


def verify_review_log(reviews: Sequence[ReviewEntry]) -> list[str]:
    """Problems of the review chain: an entry whose log hash does not follow from the entries before
    it was edited, or an entry before it was removed or reordered. Empty when the chain is whole."""
    problems = []
    previous = ""
    for number, entry in enumerate(reviews, start=1):
        expected = _chain(previous, entry)
        if entry.log_hash != expected:
            problems.append(
                f"review {number} ({entry.reviewer}, {entry.date}) does not match its log hash: it or an entry "
                "before it was edited, removed or reordered"
            )
        previous = entry.log_hash
    return problems


@dataclass(frozen=True)
class ReviewState:
    """Where a design stands in review.

    ``status``: "not reviewed", a verdict of :data:`VERDICTS` given for exactly these inputs, or
    "changed since review" when the latest review saw other inputs. ``entry`` is the review the
    status comes from (the latest one for these inputs, else the latest one), or None.
    """

    status: str
    entry: ReviewEntry | None
    current: bool

    @property
    def accepted(self) -> bool:
        return self.current and self.status in ("accepted", "accepted_with_notes")

    def text(self) -> str:
        if self.entry is None:
            return "not reviewed"
        who = f"{self.entry.verdict.replace('_', ' ')} by {self.entry.reviewer} on {self.entry.date}"
        if self.current:
            return f"{who}, for these inputs"
        return f"changed since review: the latest review ({who}) saw other inputs"


def review_state(reviews: Sequence[ReviewEntry], current_hash: str) -> ReviewState:
    """The review state of a design whose inputs hash is ``current_hash``."""
    if not reviews:
        return ReviewState("not reviewed", None, False)
    latest = reviews[-1]
    if latest.inputs_hash == current_hash:
        return ReviewState(latest.verdict, latest, True)
    return ReviewState("changed since review", latest, False)


# --- the record ------------------------------------------------------------------------------------


@dataclass(frozen=True, eq=False)
class DesignRecord:
    """A design, its results snapshot (``StackResult.to_dict()`` without ``units``), provenance and reviews.

    ``materials`` maps material id (:func:`material_ids`) to the copy of the material used, with
    sources carrying full citations. ``inputs_hash`` is the hash stored when the record was made;
    ``format`` the record format the file was written in (older ones are migrated on reading, and
    ``notes`` say what the migration had to reconstruct).
    """

    design: Any
    results: Mapping[str, Any]
    bilayer_version: str
    created: str
    inputs_hash: str
    materials: Mapping[str, Any]
    cautions: tuple[str, ...] = ()
    reviews: tuple[ReviewEntry, ...] = ()
    strip_length: float | None = None
    support: str | None = None
    notes: tuple[str, ...] = ()
    format: int = RECORD_FORMAT
    source: str = "<record>"

    @property
    def review_state(self) -> ReviewState:
        """Review state of the inputs as they are in the file now (with the recorded material copy):
        a review counts only if it was given for exactly these inputs."""
        return review_state(self.reviews, inputs_hash(self.design, self.materials))

    @property
    def figure_length(self) -> float:
        """Strip length for the deflected-shape figure: the recorded one, a thermostat length, or 50 mm."""
        if self.strip_length is not None:
            return self.strip_length
        section = self.design.sections.get("thermostat", {})
        for key in ("length", "leg_length", "diameter"):
            if section.get(key):
                return float(section[key])
        return DEFAULT_STRIP_LENGTH

    @property
    def figure_support(self) -> str:
        if self.support is not None:
            return self.support
        return "centre" if self.design.state.value == "plate" else "cantilever"

    def with_review(self, reviewer: str, verdict: str, comment: str = "", date: str | None = None) -> "DesignRecord":
        """A new record with one review appended (for the recorded inputs; the log is never edited)."""
        previous = self.reviews[-1].log_hash if self.reviews else ""
        entry = ReviewEntry(reviewer, date or now_utc(), verdict, comment, self.inputs_hash).chained(previous)
        return replace(self, reviews=(*self.reviews, entry))

    def recorded_design(self) -> Any:
        """The design with the recorded copy of each material (what the snapshot was computed from)."""
        from ..core.stack import Stack

        ids = material_ids(self.design)
        layers = tuple(
            replace(layer, material=self.materials[material_id]) if material_id in self.materials else layer
            for material_id, layer in zip(ids, self.design.stack)
        )
        return self.design.replace(stack=Stack(layers))


def with_full_sources(material: Any, library: Any) -> Any:
    """``material`` with each ``[citation_key]`` in its sources replaced by the library's full citation."""
    if not material.sources:
        return material
    expanded = {key: library.expand_source(text) for key, text in material.sources.items()}
    if expanded == dict(material.sources):
        return material
    with warnings.catch_warnings():  # the material was checked (and warned about) when it was made
        warnings.simplefilter("ignore")
        return replace(material, sources=expanded)


def results_dict(result: Any) -> dict:
    """The snapshot form of a result: ``StackResult.to_dict()`` (or a copy of such a dict) without ``units``."""
    data = result.to_dict() if hasattr(result, "to_dict") else dict(result)
    data.pop("units", None)
    return data


def make_record(design: Any, reviews: Iterable[ReviewEntry] = (), cautions: Iterable[str] | None = None,
                strip_length: float | None = None, support: str | None = None, library: Any = None,
                created: str | None = None) -> DesignRecord:
    """Evaluate ``design`` and record it: results snapshot, version, material copy, inputs hash.

    ``reviews`` is an existing review log carried over unchanged (re-recording a design never drops a
    review; a review keeps the inputs hash it was given for). ``cautions`` default to the shared
    :data:`bilayer.core.cautions.CAUTIONS`; faces pass :func:`bilayer.designs.jobs.cautions_for`.
    """
    from ..core.version import VERSION
    from ..core.cautions import CAUTIONS
    from ..core.materials import default_library
    from ..core.stack import Design

    if not isinstance(design, Design):
        raise InputError("design", design, "a Design")
    library = library if library is not None else default_library()
    if strip_length is not None and not (isinstance(strip_length, (int, float)) and 0 < strip_length <= 100):
        raise InputError("strip_length", strip_length, "0 < strip_length <= 100 m")
    if support is not None and support not in SUPPORTS:
        raise InputError("support", support, "one of " + ", ".join(SUPPORTS))
    reviews = tuple(reviews)
    if verify_review_log(reviews):
        raise InputError("reviews", len(reviews), "a whole review log", "; ".join(verify_review_log(reviews)))
    result = design.evaluate()
    ids = material_ids(design)
    materials = {}
    for material_id, layer in zip(ids, design.stack):
        materials.setdefault(material_id, with_full_sources(layer.material, library))
    return DesignRecord(
        design=design,
        results=results_dict(result),
        bilayer_version=VERSION,
        created=_check_date(created, "created") if created is not None else now_utc(),
        inputs_hash=inputs_hash(design, materials),
        materials=materials,
        cautions=tuple(CAUTIONS if cautions is None else cautions),
        reviews=reviews,
        strip_length=None if strip_length is None else float(strip_length),
        support=support,
    )


# --- writing ---------------------------------------------------------------------------------------


def _record_table(record: DesignRecord, system: str) -> dict:
    from ..designs.sections.materials import write_material
    from ..core.section_spec import exact_text

    table: dict[str, Any] = {
        "format": RECORD_FORMAT,
        "bilayer_version": record.bilayer_version,
        "created": record.created,
        "inputs_hash": record.inputs_hash,
    }
    if record.strip_length is not None:
        table["strip_length"] = exact_text(record.strip_length, "length", system)
    if record.support is not None:
        table["support"] = record.support
    if record.cautions:
        table["cautions"] = list(record.cautions)
    if record.notes:
        table["notes"] = list(record.notes)
    materials = {}
    for material_id, material in record.materials.items():
        body = write_material(material, system)
        if material.key != material_id:
            body = {"name": body.pop("name"), "key": material.key, **body}
        materials[material_id] = body
    table["materials"] = materials
    return table


def _review_table(entry: ReviewEntry) -> dict:
    return {**entry.payload(), "log_hash": entry.log_hash}


def record_to_text(record: DesignRecord, system: str = "si", library: Any = None) -> str:
    """The TOML text of a record (quantities in unit ``system``, "si" or "us"; numbers exact)."""
    from ..designs.design_file import design_to_text

    extra: dict[str, Any] = {"record": _record_table(record, system)}
    if record.reviews:
        extra["review"] = [_review_table(entry) for entry in record.reviews]
    text = design_to_text(record.design, record.results, system, library, extra=extra)
    header = ("# bilayer design record (docs/records.md): inputs, [results] snapshot, [record] provenance and\n"
              "# an append-only [[review]] log. Check it with `bilayer check FILE`; do not edit reviews by hand.\n")
    return header + text


def save_record(record: DesignRecord, path: "str | os.PathLike", system: str = "si", library: Any = None) -> Path:
    """Write ``record`` to ``path`` atomically (temporary file, fsync, rename); returns the path."""
    from ..designs.design_file import write_text_atomic

    return write_text_atomic(path, record_to_text(record, system, library))


# --- reading and migration -------------------------------------------------------------------------


def _location(where: str, table: str, line_of: Callable[[str, str], int | None], path: str):
    from ..core.section_spec import Location

    return Location(where, table, lambda key: line_of(path, key))


def _migrate_1_to_2(tables: dict, design: Any, library: Any, where: str) -> tuple[dict, list[str]]:
    """Record format 1 -> 2.

    Format 1 kept ``version`` (bilayer version), ``inputs_sha256`` (hex of the canonical inputs
    without material data) and the reviews as ``[[record.reviews]]`` with ``by``, ``on``, ``status``
    ("ok" or "not ok") and ``note``; it had no creation time, no material copy and no review chain.
    The migration checks the old hash; when it holds, the material copy is taken from today's
    library (and a note says so), the new hash is computed and the reviews are given that hash,
    since they were given for those inputs. When it does not hold, the old hash is kept as
    ``sha256-v1:<hex>``, so the check reports the inputs as not matching.
    """
    from ..core.version import VERSION

    old = dict(tables.get("record", {}))
    location = _location(where, "[record]", lambda path, key: None, "record")
    allowed = ("format", "version", "inputs_sha256", "reviews")
    for key in old:
        if key not in allowed:
            raise location.error(key, old[key], "a key of a format-1 [record]: " + ", ".join(allowed), "unknown key")
    for key in ("version", "inputs_sha256"):
        if not isinstance(old.get(key), str):
            raise location.error(key, old.get(key), "a text", "required key of record format 1")
    old_inputs = _digest(canonical_inputs(design, with_material_data=False))
    verified = old["inputs_sha256"] == old_inputs
    ids = material_ids(design)
    materials = {}
    for material_id, layer in zip(ids, design.stack):
        materials.setdefault(material_id, with_full_sources(layer.material, library))
    new_hash = inputs_hash(design, materials) if verified else f"sha256-v1:{old['inputs_sha256']}"
    notes = [f"migrated from record format 1 by bilayer {VERSION}; format 1 kept no creation time and no cautions"]
    if verified:
        notes.append("format 1 kept no copy of the material data: the copy was taken from the material library "
                     "at migration, so a change of library data before then is not visible")
    else:
        notes.append("the inputs did not match the format-1 hash at migration")
    reviews = []
    status = {"ok": "accepted", "not ok": "changes_needed"}
    previous = ""
    for number, raw in enumerate(old.get("reviews", []), start=1):
        here = _location(where, f"[[record.reviews]] {number}", lambda path, key: None, "")
        if not isinstance(raw, Mapping) or set(raw) - {"by", "on", "status", "note"}:
            raise here.error("", raw, "a table with by, on, status and note")
        if raw.get("status") not in status:
            raise here.error("status", raw.get("status"), "'ok' or 'not ok'")
        try:
            entry = ReviewEntry(raw.get("by", ""), str(raw.get("on", "")), status[raw["status"]],
                                raw.get("note", ""), new_hash).chained(previous)
        except InputError as error:
            raise here.wrap(error.field, error) from None
        previous = entry.log_hash
        reviews.append(_review_table(entry))
    if reviews:
        notes.append(f"{len(reviews)} format-1 review(s) carried over; their chain hashes were computed at migration")
    record_table = {
        "format": 2,
        "bilayer_version": old["version"],
        "created": "",
        "inputs_hash": new_hash,
        "notes": notes,
        "materials": materials,  # Material objects, taken as read
    }
    return {"record": record_table, "review": reviews}, notes


MIGRATIONS: dict[int, Callable[[dict, Any, Any, str], tuple[dict, list[str]]]] = {1: _migrate_1_to_2}
"""format n -> function turning the record tables of format n into those of format n + 1."""


def read_record(source: "str | os.PathLike", library: Any = None) -> DesignRecord:
    """Read a design record (a path, or its TOML text), migrating older record formats."""
    from ..designs.design_file import read_design

    document = read_design(source, library)
    return _record_from_document(document, library)


def read_record_text(text: str, where: str = "<text>", library: Any = None) -> DesignRecord:
    """Parse the TOML text of a design record; ``where`` names it in messages."""
    from ..designs.design_file import read_design_text

    return _record_from_document(read_design_text(text, where, library), library)


def _record_from_document(document: Any, library: Any) -> DesignRecord:
    from ..core.materials import default_library
    from ..designs.sections.materials import read_materials

    library = library if library is not None else default_library()
    where, line_of = document.source, document.line_of
    tables = dict(document.extra)
    top = _location(where, "", line_of, "")
    if "record" not in tables:
        raise top.error("[record]", None, "a [record] table (this is a plain design file)",
                        "make a record with `bilayer record FILE`")
    if document.results is None:
        raise top.error("[results]", None, "the [results] snapshot of the record", "required table is missing")
    raw = tables["record"]
    version = raw.get("format") if isinstance(raw, Mapping) else None
    record_location = _location(where, "[record]", line_of, "record")
    if isinstance(version, bool) or not isinstance(version, int) or not 1 <= version <= RECORD_FORMAT:
        newer = isinstance(version, int) and not isinstance(version, bool) and version > RECORD_FORMAT
        raise record_location.error("format", version, f"a record format from 1 to {RECORD_FORMAT}",
                                    "written by a newer bilayer?" if newer else "")
    migrated_tables = None
    for step in range(version, RECORD_FORMAT):
        migrated_tables, _ = MIGRATIONS[step](tables, document.design, library, where)
        tables = {**tables, **migrated_tables}
    if migrated_tables is not None:
        values = dict(tables["record"])
        materials = values.pop("materials")
    else:
        values = RECORD.read(raw, record_location)
        materials = read_materials(values.pop("materials"), where,
                                   lambda path, key: line_of(f"record.{path}", key))
    reviews = []
    raw_reviews = tables.get("review", [])
    if not isinstance(raw_reviews, list):
        raise top.error("review", raw_reviews, "an array of tables: write [[review]] (double brackets) per entry")
    for index, table in enumerate(raw_reviews):
        location = _location(where, f"[[review]] {index + 1}", line_of, f"review#{index}")
        entry_values = REVIEW.read(table, location)
        try:
            reviews.append(ReviewEntry(**entry_values))
        except InputError as error:
            raise location.wrap(error.field, error) from None
    if values.get("created"):
        try:
            _check_date(values["created"], "created")
        except InputError as error:
            raise record_location.wrap("created", error) from None
    ids = set(material_ids(document.design))
    missing = sorted(ids - set(materials))
    if missing and migrated_tables is None:
        raise record_location.error("materials", sorted(materials), "a copy of every material used by a layer",
                                    "missing: " + ", ".join(missing))
    return DesignRecord(
        design=document.design,
        results=dict(document.results),
        bilayer_version=values["bilayer_version"],
        created=values.get("created", ""),
        inputs_hash=values["inputs_hash"],
        materials=materials,
        cautions=tuple(values.get("cautions", ())),
        reviews=tuple(reviews),
        strip_length=values.get("strip_length"),
        support=values.get("support"),
        notes=tuple(values.get("notes", ())),
        format=version,
        source=where,
    )


# --- appending a review to a file ------------------------------------------------------------------


def append_review(path: "str | os.PathLike", reviewer: str, verdict: str, comment: str = "",
                  date: str | None = None, library: Any = None) -> DesignRecord:
    """Append one review to the record file at ``path`` and return the updated record.

    The entry is added as a ``[[review]]`` block at the end of the file's text; nothing above it
    changes (a one-block diff in version control). The review is for the recorded inputs, so it is
    refused when the inputs in the file no longer match their hash or the review chain is broken.
    The file is locked while it is read and replaced (temporary file + rename), and the write is
    refused if the file changed in between. A record of an older format is first rewritten in the
    current format (reviews carried over).
    """
    from ..designs.design_file import write_text_atomic

    path = Path(path)
    with _locked(path):
        original = path.read_text(encoding="utf-8")
        record = read_record_text(original, str(path), library)
        base = original
        if record.format != RECORD_FORMAT:
            base = record_to_text(record, library=library)
            record = read_record_text(base, str(path), library)
        _refuse_unsound(record)
        updated = record.with_review(reviewer, verdict, comment, date)
        entry = updated.reviews[-1]
        block = dumps({"review": [_review_table(entry)]})
        new_text = base + ("" if base.endswith("\n") else "\n") + "\n" + block
        result = read_record_text(new_text, str(path), library)
        if result.reviews[:-1] != record.reviews or result.reviews[-1] != entry:
            raise DesignFileError(str(path), "[[review]]", "an appended review that reads back with the log intact")
        if path.read_text(encoding="utf-8") != original:
            raise DesignFileError(str(path), "(file contents)",
                                  "a file that nobody else changes while a review is added", "try again")
        write_text_atomic(path, new_text)
    return result


def _refuse_unsound(record: DesignRecord) -> None:
    current = inputs_hash(record.design, record.materials)
    if current != record.inputs_hash:
        raise InputError("inputs_hash", record.inputs_hash,
                         f"the hash of the inputs in the file ({current})",
                         "the inputs were changed after the record was made; re-record it (`bilayer record`) "
                         "so that reviewers sign what was computed")
    problems = verify_review_log(record.reviews)
    if problems:
        raise InputError("review", len(record.reviews), "a whole review log", "; ".join(problems))


class _locked:
    """An exclusive advisory lock (fcntl.flock) on a file, where the platform has one."""

    def __init__(self, path: Path):
        self.path = path
        self.handle = None

    def __enter__(self):
        try:
            import fcntl
        except ImportError:  # pragma: no cover - not POSIX
            return self
        self.handle = open(self.path, "rb")
        fcntl.flock(self.handle.fileno(), fcntl.LOCK_EX)
        return self

    def __exit__(self, *exc):
        if self.handle is not None:
            import fcntl

            fcntl.flock(self.handle.fileno(), fcntl.LOCK_UN)
            self.handle.close()
        return False
