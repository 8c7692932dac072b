"""Subcommands of the ``bilayer`` command line, one module each.

A module here that defines ``NAME`` (the subcommand), ``HELP`` (one line), ``add_arguments(parser)``
and ``run(args) -> int`` (an exit code of :mod:`bilayer.cli`) is picked up automatically. Raise a
:class:`bilayer.errors.BilayerError` for bad input; the command line turns it into one line on
stderr and exit code 2.
"""
