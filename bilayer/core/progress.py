"""The one signature of progress callbacks in bilayer: ``progress(fraction, message)``.

Long runs (the finite-element check, Monte Carlo scatter, temperature histories, studies) call
``progress(fraction, message)`` as they advance, with ``fraction`` in [0, 1] (1 when done) and a short
``message`` saying where they are, e.g. ``"60000/200000 samples"``. Panels show it in a progress bar, the
command line on stderr.
"""
from __future__ import annotations

from typing import Callable

__all__ = ["Progress"]

Progress = Callable[[float, str], None]
"""``progress(fraction in [0, 1], message) -> None``."""
