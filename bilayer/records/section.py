"""[record] and [[review]]: provenance and review log of a design record (read by :mod:`bilayer.records`).

A design record is a design file that also holds a results snapshot (``[results]``), a ``[record]``
table (record format, bilayer version, creation time, hash of the inputs, figure settings, the
cautions shown, and ``[record.materials.<id>]``, a copy of the material data used with their
sources) and an append-only log of ``[[review]]`` entries. The design-file reader accepts these
tables and leaves them to :mod:`bilayer.records`, which validates them with these specs (current
record format; older formats are migrated there before validation).
"""
from __future__ import annotations

from ..core.section_spec import CHOICE, INTEGER, LIST, TABLE, TEXT, Field, SectionSpec

VERDICTS = ("accepted", "accepted_with_notes", "changes_needed", "rejected")
"""Review verdicts: accepted as is; accepted with notes to act on; changes needed before it can be
accepted; rejected (the approach is wrong)."""

SUPPORTS = ("cantilever", "centre")

RECORD = SectionSpec(
    "record",
    (
        Field("format", INTEGER, required=True, low=1, inclusive=True, doc="record format version"),
        Field("bilayer_version", TEXT, required=True, doc="bilayer version that computed [results]"),
        Field("created", TEXT, required=True, doc="when the results were computed (ISO 8601, UTC)"),
        Field("inputs_hash", TEXT, required=True,
              doc="sha256 of the canonical inputs: conditions, layers, material data and job sections"),
        Field("strip_length", "length", low=0.0, doc="strip length of the deflected-shape figure"),
        Field("support", CHOICE, choices=SUPPORTS, doc="support of the deflected-shape figure"),
        Field("cautions", TEXT, shape=LIST, doc="the cautions shown with the results when they were recorded"),
        Field("notes", TEXT, shape=LIST, doc="provenance notes, e.g. what a format migration reconstructed"),
        Field("materials", TABLE, required=True,
              doc="[record.materials.<id>]: the material data used, in the material-file format, with sources"),
    ),
    doc="provenance of the results snapshot (bilayer.records)",
    core=True,
)

REVIEW = SectionSpec(
    "review",
    (
        Field("reviewer", TEXT, required=True, doc="who reviewed"),
        Field("date", TEXT, required=True, doc="ISO 8601 date or date and time"),
        Field("verdict", CHOICE, required=True, choices=VERDICTS, doc=" | ".join(VERDICTS)),
        Field("comment", TEXT, default="", doc="what the reviewer said"),
        Field("inputs_hash", TEXT, required=True, doc="inputs_hash of the design the reviewer saw"),
        Field("log_hash", TEXT, required=True,
              doc="sha256 chaining this entry to the ones before it (detects edited or removed entries)"),
    ),
    doc="one review of the record, appended, never edited",
    core=True,
    array=True,
)

SECTIONS = (RECORD, REVIEW)
