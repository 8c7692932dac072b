"""Exit codes of the ``bilayer`` command (docs/cli.md)."""

EXIT_OK = 0
EXIT_CHECK_FAILED = 1
EXIT_INVALID_INPUT = 2
EXIT_INTERNAL_ERROR = 3

EPILOG = """exit codes:
  0  success
  1  a check ran and failed (bilayer check: drift, edited inputs, broken review log)
  2  invalid input: bad design file, unknown material, wrong unit, usage error
  3  unexpected internal error (please report it with the input that caused it)"""
