"""The ``bilayer`` command line: :func:`main`, and one module per subcommand.

A module here that defines ``NAME`` (the subcommand), ``HELP`` (one line), ``add_arguments(parser)``
and ``run(args) -> int`` (an exit code of :mod:`bilayer.cli.exit_codes`) is picked up automatically. Raise a
:class:`bilayer.core.errors.BilayerError` for bad input; the command line turns it into one line on
stderr and exit code 2.
"""
from .exit_codes import EXIT_CHECK_FAILED, EXIT_INTERNAL_ERROR, EXIT_INVALID_INPUT, EXIT_OK
from .entry import main

__all__ = ["main", "EXIT_OK", "EXIT_CHECK_FAILED", "EXIT_INVALID_INPUT", "EXIT_INTERNAL_ERROR"]
