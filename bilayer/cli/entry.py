"""The ``bilayer`` command: one subcommand per module of :mod:`bilayer.cli`.

Exit codes (docs/cli.md):
    0  success
    1  a check ran and failed (bilayer check: drift, edited inputs, broken review log)
    2  invalid input: a bad design file, an unknown material, a wrong unit, a usage error
    3  unexpected internal error (a bug: please report it with the input that caused it)

Errors print one line on stderr, without a traceback (``--traceback`` shows it for debugging).
Warnings (suspicious input, model limits) print one line each on stderr as ``bilayer: warning: ...``.
"""
from __future__ import annotations

import argparse
import sys
import warnings
from typing import Sequence

from ..core.errors import BilayerError
from .exit_codes import EPILOG, EXIT_CHECK_FAILED, EXIT_INTERNAL_ERROR, EXIT_INVALID_INPUT, EXIT_OK

__all__ = ["main", "build_parser", "commands", "EXIT_OK", "EXIT_CHECK_FAILED", "EXIT_INVALID_INPUT",
           "EXIT_INTERNAL_ERROR"]

def commands() -> dict[str, object]:
    """Subcommand modules by name. Each defines NAME, HELP, ``add_arguments(parser)`` and
    ``run(args) -> int``; a new subcommand is a module of this package added to the list below."""
    from . import bond, check, evaluate, example, film, interface, materials, record, report, review, solder, thermostat

    modules = (bond, check, evaluate, example, film, interface, materials, record, report, review, solder, thermostat)
    return {module.NAME: module for module in sorted(modules, key=lambda module: module.NAME)}


class _Parser(argparse.ArgumentParser):
    """argparse with one-line usage errors and exit code 2."""

    def error(self, message: str):  # noqa: D401 - argparse API
        self.print_usage(sys.stderr)
        self.exit(EXIT_INVALID_INPUT, f"{self.prog}: error: {message}\n")


def build_parser() -> argparse.ArgumentParser:
    from ..core.version import VERSION

    parser = _Parser(
        prog="bilayer",
        description="Curvature and stresses of bonded layer stacks under temperature change.",
        epilog=EPILOG,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("--version", action="version", version=f"bilayer {VERSION}")
    parser.add_argument("--traceback", action="store_true", help="show the Python traceback of an error")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    for name, module in commands().items():
        command = sub.add_parser(name, help=module.HELP, description=getattr(module, "DESCRIPTION", module.HELP),
                                 epilog=EPILOG, formatter_class=argparse.RawDescriptionHelpFormatter)
        module.add_arguments(command)
        command.set_defaults(run=module.run)
    return parser


def _show_warning(message, category, filename, lineno, file=None, line=None) -> None:
    text = " ".join(str(message).split())
    print(f"bilayer: warning: {text}", file=sys.stderr)


def main(argv: Sequence[str] | None = None) -> int:
    """Run the command line; returns the exit code (the console script passes it to sys.exit)."""
    try:
        parser = build_parser()
        args = parser.parse_args(argv)
    except SystemExit as stop:  # --help, --version, usage errors
        return int(stop.code or 0) if not isinstance(stop.code, str) else EXIT_INVALID_INPUT
    if not getattr(args, "run", None):
        parser.print_help(sys.stderr)
        return EXIT_INVALID_INPUT
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("always")
            warnings.showwarning = _show_warning
            return int(args.run(args))
    except BilayerError as error:
        if args.traceback:
            raise
        print(f"bilayer: error: {' '.join(str(error).split())}", file=sys.stderr)
        return EXIT_INVALID_INPUT
    except OSError as error:
        if args.traceback:
            raise
        print(f"bilayer: error: {error.strerror or error}: {error.filename or ''}".rstrip(": "), file=sys.stderr)
        return EXIT_INVALID_INPUT
    except KeyboardInterrupt:
        return 130
    except Exception as error:  # a bug: say so, briefly
        if args.traceback:
            raise
        print(f"bilayer: internal error: {type(error).__name__}: {error} (run with --traceback and please report it)",
              file=sys.stderr)
        return EXIT_INTERNAL_ERROR


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
