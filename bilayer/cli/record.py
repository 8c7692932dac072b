"""``bilayer record FILE [-o OUT] [--units si|us]``: evaluate a design and write it as a design record."""
from __future__ import annotations

import argparse
import sys

NAME = "record"
HELP = "evaluate a design file and write a design record (results snapshot, provenance, review log kept)"
DESCRIPTION = (
    "Read a design file (or an existing record), run the engine and write a design record: the inputs, a "
    "[results] snapshot, the bilayer version, a copy of the material data used with their sources, the hash "
    "of the inputs and the cautions. An existing review log is carried over unchanged; reviews given for "
    "other inputs then show as 'changed since review'. See docs/records.md."
)


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", help="design file or design record (TOML)")
    parser.add_argument("-o", "--output", metavar="PATH", help="write the record here (default: replace FILE)")
    parser.add_argument("--units", choices=("si", "us"), default="si",
                        help="unit system of the quantities written in the file (numbers stay exact)")
    parser.add_argument("--strip-length", metavar="LENGTH",
                        help="strip length of the deflected-shape figure, e.g. '40 mm' (default: kept, or "
                             "the thermostat length, or 50 mm)")
    parser.add_argument("--support", choices=("cantilever", "centre"),
                        help="support of the deflected-shape figure (default: kept, or by bending state)")


def run(args: argparse.Namespace) -> int:
    from pathlib import Path

    from ..designs.jobs import cautions_for
    from ..designs.design_file import read_design
    from ..records.record import make_record, read_record, review_state, save_record
    from ..core.units import parse

    document = read_design(args.file)
    old = read_record(args.file) if "record" in document.extra else None
    length = parse(args.strip_length, "length", "--strip-length") if args.strip_length else (
        old.strip_length if old else None)
    support = args.support or (old.support if old else None)
    record = make_record(document.design, reviews=old.reviews if old else (),
                         cautions=cautions_for(document.design), strip_length=length, support=support)
    path = Path(args.output or args.file)
    save_record(record, path, system=args.units)
    state = review_state(record.reviews, record.inputs_hash)
    print(f"wrote {path}: inputs hash {record.inputs_hash[:19]}..., review: {state.text()}", file=sys.stderr)
    for warning in record.results.get("warnings", []):
        print(f"bilayer: warning: {warning}", file=sys.stderr)
    return 0
