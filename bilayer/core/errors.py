"""Project error and warning classes.

Every invalid input raises a subclass of :class:`BilayerError` whose message names the field, the
value and the valid range. The classes also subclass the matching built-in error, so callers that
catch ``ValueError`` or ``KeyError`` keep working.
"""
from __future__ import annotations

import math
import warnings

__all__ = [
    "BilayerError",
    "InputError",
    "UnitError",
    "UnknownMaterialError",
    "DesignFileError",
    "MissingDependencyError",
    "require",
    "SuspiciousInputWarning",
    "ModelLimitWarning",
    "check_finite",
    "check_range",
    "warn_suspicious",
]


class BilayerError(Exception):
    """Base class of every error raised on purpose by bilayer."""


class InputError(BilayerError, ValueError):
    """A value is out of its valid range, of the wrong type, NaN or infinite.

    ``field`` names the input (for example ``"layers[1].thickness"``), ``value`` is what was given
    and ``valid`` describes the accepted range.
    """

    def __init__(self, field: str, value: object, valid: str, hint: str = ""):
        self.field = field
        self.value = value
        self.valid = valid
        self.hint = hint
        message = f"{field}: {value!r} is not valid; expected {valid}"
        if hint:
            message += f" ({hint})"
        super().__init__(message)

    def __reduce__(self):
        """Pickle by the constructor's arguments, so the error crosses to and from worker processes."""
        return type(self), (self.field, self.value, self.valid, self.hint)


class UnitError(InputError, TypeError):
    """A quantity has the wrong physical dimension or an unreadable unit."""


class UnknownMaterialError(InputError, KeyError):
    """A material name is not in the library; the message suggests close matches."""

    def __str__(self) -> str:  # KeyError would otherwise quote the message
        return self.args[0]


class DesignFileError(InputError):
    """A design file is malformed, truncated, or has an unknown or misplaced key."""


class MissingDependencyError(BilayerError, ImportError):
    """An optional library that a feature needs is not installed; the message says which extra to install."""


def require(module: str, feature: str, extra: str):
    """Import and return ``module``, or raise :class:`MissingDependencyError` saying that ``feature``
    needs it and how to install it (``pip install 'bilayer[extra]'``)."""
    from importlib import import_module

    try:
        return import_module(module)
    except ImportError as error:
        raise MissingDependencyError(
            f"{feature} needs {module.split('.')[0]}, which is not installed: pip install 'bilayer[{extra}]'"
        ) from error


class SuspiciousInputWarning(UserWarning):
    """A legal value that is probably a slip (wrong unit, typo); the result is still computed."""


class ModelLimitWarning(UserWarning):
    """A result is computed outside the range where its model is trustworthy."""


def check_finite(field: str, value: float) -> float:
    """Return ``value`` as a float, or raise :class:`InputError` for NaN, infinity or non-numbers."""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        try:
            import numpy as np

            if isinstance(value, np.generic) and np.isreal(value):
                value = float(value)
            else:
                raise TypeError
        except TypeError:
            raise InputError(field, value, "a real number") from None
    value = float(value)
    if not math.isfinite(value):
        raise InputError(field, value, "a finite number")
    return value


def check_range(
    field: str,
    value: float,
    low: float | None = None,
    high: float | None = None,
    low_inclusive: bool = False,
    high_inclusive: bool = False,
    unit: str = "",
) -> float:
    """Check ``low < value < high`` (inclusive where asked) and return the value as a float."""
    value = check_finite(field, value)
    ok = True
    if low is not None:
        ok &= value >= low if low_inclusive else value > low
    if high is not None:
        ok &= value <= high if high_inclusive else value < high
    if not ok:
        lo = "" if low is None else f"{low:g} {'<=' if low_inclusive else '<'} "
        hi = "" if high is None else f" {'<=' if high_inclusive else '<'} {high:g}"
        raise InputError(field, value, f"{lo}{field.split('.')[-1]}{hi}{(' ' + unit) if unit else ''}")
    return value


def warn_suspicious(field: str, value: object, reason: str, stacklevel: int = 3) -> None:
    """Issue a :class:`SuspiciousInputWarning` naming the field and the reason.

    ``stacklevel`` counts frames from this function (as for :func:`warnings.warn`); pass the depth
    of the user's call so the warning points at the line that gave the value.
    """
    warnings.warn(f"{field}: {value!r} looks suspicious: {reason}", SuspiciousInputWarning, stacklevel=stacklevel)
