"""``bilayer review FILE --reviewer NAME --verdict V [--comment TEXT] [--date D]``: append a review."""
from __future__ import annotations

import argparse
import sys

from ..records.section import VERDICTS

NAME = "review"
HELP = "append a review (reviewer, verdict, comment) to a design record's log"
DESCRIPTION = (
    "Append one entry to the review log of a design record. The entry is added at the end of the file "
    "and nothing above it changes; it records the inputs hash the reviewer signed. Refused when the inputs "
    "no longer match their hash or the log is broken (exit 1). Verdicts: " + ", ".join(VERDICTS) + "."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", help="design record (TOML)")
    parser.add_argument("--reviewer", required=True, help="name of the reviewer")
    parser.add_argument("--verdict", required=True, choices=VERDICTS, help="the verdict")
    parser.add_argument("--comment", default="", help="what the reviewer says (quote it)")
    parser.add_argument("--date", help="ISO 8601 date or date and time (default: now, UTC)")


def run(args: argparse.Namespace) -> int:
    from .exit_codes import EXIT_CHECK_FAILED, EXIT_OK
    from ..core.errors import InputError
    from ..records.record import append_review

    try:
        record = append_review(args.file, args.reviewer, args.verdict, args.comment, args.date)
    except InputError as error:
        if error.field == "inputs_hash":
            print(f"bilayer: review refused: the inputs in {args.file} were changed after its results were recorded "
                  f"(they no longer match {error.value}); run `bilayer record {args.file}` first, so that the "
                  "review is for what was computed", file=sys.stderr)
            return EXIT_CHECK_FAILED
        if error.field == "review":
            print(f"bilayer: review refused: {' '.join(str(error).split())}", file=sys.stderr)
            return EXIT_CHECK_FAILED
        raise
    entry = record.reviews[-1]
    print(f"{args.file}: review {len(record.reviews)} added: {entry.verdict} by {entry.reviewer} on {entry.date}",
          file=sys.stderr)
    return EXIT_OK
