"""One converter from results to plain data for JSON and TOML.

Results hold numpy arrays, numpy scalars, enums and tuples; JSON and TOML want lists, Python numbers and
texts. :func:`plain` converts any nesting of them. JSON has no NaN or infinity, so non-finite numbers
become ``None`` (``null``) by default; TOML writers pass ``finite_only=False`` to keep them.
"""
from __future__ import annotations

import math
from enum import Enum
from typing import Any, Mapping

import numpy as np

__all__ = ["plain"]


def plain(value: Any, finite_only: bool = True) -> Any:
    """A plain copy of ``value``: Enum -> its value, Mapping -> dict with text keys, list, tuple or
    array -> list, numpy scalars -> Python numbers, an object with ``to_dict()`` -> that dict; a
    non-finite float -> ``None`` when ``finite_only`` (JSON), else kept (TOML has nan and inf)."""
    if value is None or isinstance(value, str):
        return value
    if isinstance(value, Enum):
        return value.value
    if isinstance(value, Mapping):
        return {str(key): plain(item, finite_only) for key, item in value.items()}
    if isinstance(value, np.ndarray):
        return plain(value.tolist(), finite_only)
    if isinstance(value, (list, tuple)):
        return [plain(item, finite_only) for item in value]
    if isinstance(value, (bool, np.bool_)):
        return bool(value)
    if isinstance(value, (int, np.integer)):
        return int(value)
    if isinstance(value, (float, np.floating)):
        number = float(value)
        return None if finite_only and not math.isfinite(number) else number
    if hasattr(value, "to_dict"):
        return plain(value.to_dict(), finite_only)
    return value
