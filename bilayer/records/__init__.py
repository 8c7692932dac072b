"""Design records: a design with its results snapshot, provenance and an append-only review log;
the drift check that re-evaluates a record and compares.

Short paths::

    from bilayer.records import make_record, save_record, read_record, append_review, check_record
"""
from .record import (
    RECORD_FORMAT,
    VERDICTS,
    MIGRATIONS,
    ReviewEntry,
    ReviewState,
    DesignRecord,
    canonical_inputs,
    inputs_hash,
    material_ids,
    material_data,
    results_dict,
    with_full_sources,
    make_record,
    record_to_text,
    save_record,
    read_record,
    read_record_text,
    append_review,
    verify_review_log,
    review_state,
    now_utc,
)
from .check import (
    RESULT_LABELS,
    LAYER_LABELS,
    INTERFACE_LABELS,
    Tolerance,
    Difference,
    CheckReport,
    compare_results,
    input_differences,
    check_record,
)

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
