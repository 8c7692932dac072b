"""``bilayer example [NAME] [-o PATH]``: list, print or write the bundled example designs."""
from __future__ import annotations

import argparse
import sys
from importlib import resources

from ..core.errors import InputError
from ..core.section_spec import suggest

NAME = "example"
HELP = "list the bundled example designs, print one, or write it to a file"


def examples() -> dict[str, str]:
    """Example name -> TOML text of the designs shipped in bilayer/examples."""
    folder = resources.files("bilayer") / "examples"
    return {entry.name[:-5]: entry.read_text(encoding="utf-8")
            for entry in sorted(folder.iterdir(), key=lambda e: e.name) if entry.name.endswith(".toml")}


def _title(text: str) -> str:
    for line in text.splitlines():
        if line.startswith("name ="):
            return line.split("=", 1)[1].strip().strip('"')
    return ""


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("name", nargs="?", help="example to print (omit to list them)")
    parser.add_argument("-o", "--output", metavar="PATH", help="write the example to PATH instead of printing it")
    parser.add_argument("--force", action="store_true", help="overwrite PATH if it exists")


def run(args: argparse.Namespace) -> int:
    from pathlib import Path

    from ..designs.design_file import write_text_atomic

    available = examples()
    if args.name is None:
        width = max(len(name) for name in available)
        for name, text in available.items():
            print(f"{name:<{width}}  {_title(text)}")
        return 0
    if args.name not in available:
        raise InputError("example", args.name, "one of " + ", ".join(available), suggest(args.name, available))
    text = available[args.name]
    if args.output is None:
        sys.stdout.write(text)
        return 0
    path = Path(args.output)
    if path.exists() and not args.force:
        raise InputError("--output", str(path), "a path that does not exist yet", "use --force to overwrite it")
    write_text_atomic(path, text)
    print(f"wrote {path}", file=sys.stderr)
    return 0
