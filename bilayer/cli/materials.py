"""``bilayer materials [SEARCH] [--units si|us] [--json]``: the material library with values and sources."""
from __future__ import annotations

import argparse
import json
import sys

NAME = "materials"
HELP = "list the material library (or the materials matching SEARCH) with values and sources"


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("search", nargs="?", help="part of a key, name or category (case and punctuation ignored)")
    parser.add_argument("--units", choices=("si", "us"), default="si", help="display units (default si)")
    parser.add_argument("--json", action="store_true", help="print JSON (SI values) instead of text")


def _row(material) -> dict:
    return {
        "key": material.key,
        "name": material.name,
        "category": material.category,
        "youngs_modulus": material.youngs_modulus,
        "poisson_ratio": material.poisson_ratio,
        "cte_nominal": material.alpha,
        "cte_model": material.cte.describe(),
        "density": material.density,
        "strength": material.strength,
        "strength_kind": material.strength_kind,
        "sources": dict(material.sources),
    }


def run(args: argparse.Namespace) -> int:
    from ..core.errors import InputError
    from ..core.materials import default_library
    from ..core.units import format_quantity

    library = default_library()
    found = library.search(args.search) if args.search else tuple(library.values())
    if not found:
        raise InputError("search", args.search, "part of a key, name or category of a library material",
                         "run 'bilayer materials' to list them all")
    if args.json:
        sys.stdout.write(json.dumps([_row(m) for m in found], indent=2, allow_nan=False) + "\n")
        return 0
    system = args.units
    out = []
    cited: dict[str, str] = {}
    for material in found:
        out.append(f"{material.key}  {material.name}" + (f"  [{material.category}]" if material.category else ""))
        values = [f"E {format_quantity(material.youngs_modulus, 'modulus', system)}", f"nu {material.poisson_ratio:g}",
                  f"CTE {format_quantity(material.alpha, 'cte', system)} ({material.cte.describe()})"]
        if material.density is not None:
            values.append(f"density {format_quantity(material.density, 'density', system)}")
        if material.strength is not None:
            values.append(f"strength {format_quantity(material.strength, 'stress', system)}"
                          + (f" ({material.strength_kind})" if material.strength_kind else ""))
        out.append("    " + "; ".join(values))
        for field_name, source in material.sources.items():
            out.append(f"    source of {field_name}: {source}")
            for key, citation in library.citations.items():
                if f"[{key}]" in source:
                    cited[key] = citation
        out.append("")
    if cited:
        out.append("References:")
        out.extend(f"  [{key}] {citation}" for key, citation in sorted(cited.items()))
    sys.stdout.write("\n".join(out).rstrip() + "\n")
    return 0
