"""Bow (sagitta) over a span and curvature of a spherically or cylindrically bent surface, exactly.

A circular arc of radius R spanning a chord D rises by the sagitta b at its centre:

    R = D^2/(8 b) + b/2        (from R^2 = (D/2)^2 + (R - b)^2)
    kappa = 1/R = 8 b / (D^2 + 4 b^2)
    b = (1 - sqrt(1 - (kappa D/2)^2)) / kappa = kappa D^2 / (4 (1 + sqrt(1 - (kappa D/2)^2)))

Sign convention (the project's): b > 0 when the centre lies above the plane through the edge points
with the top face up, which is kappa > 0 (top face convex). The formulas hold for either sign. The
small-curvature forms kappa ~ 8 b / D^2 and b ~ kappa D^2 / 8 are not used; they differ by the
relative amount (kappa D / 4)^2 to leading order.
"""
from __future__ import annotations

import numpy as np

from .errors import InputError

__all__ = ["curvature_from_bow", "bow_from_curvature", "arc_shape", "SUPPORTS"]


def _positive_span(span) -> np.ndarray:
    span = np.asarray(span, float)
    if not np.all(np.isfinite(span)) or np.any(span <= 0):
        raise InputError("span", span.tolist(), "a finite length > 0 m (chord or scan diameter)")
    return span


def curvature_from_bow(bow, span):
    """Exact curvature [1/m] of the arc that rises ``bow`` [m] over the chord ``span`` [m].

    kappa = 8 b / (D^2 + 4 b^2); broadcasts over arrays. A bow larger than half the span has no
    circular-arc reading (the arc would pass a half circle) and is rejected.
    """
    bow = np.asarray(bow, float)
    span = _positive_span(span)
    if not np.all(np.isfinite(bow)):
        raise InputError("bow", bow.tolist(), "a finite length [m]")
    if np.any(np.abs(bow) > 0.5 * span):
        raise InputError("bow", bow.tolist(), "|bow| <= span/2 (a circular arc no deeper than a half circle)")
    kappa = 8.0 * bow / (span * span + 4.0 * bow * bow)
    return float(kappa) if kappa.ndim == 0 else kappa


def bow_from_curvature(curvature, span):
    """Exact bow (sagitta) [m] over the chord ``span`` [m] of an arc of ``curvature`` [1/m].

    b = kappa D^2 / (4 (1 + sqrt(1 - (kappa D/2)^2))), the cancellation-free form of
    (1 - sqrt(1 - (kappa D/2)^2))/kappa; requires |kappa| D/2 <= 1.
    """
    kappa = np.asarray(curvature, float)
    span = _positive_span(span)
    if not np.all(np.isfinite(kappa)):
        raise InputError("curvature", kappa.tolist(), "a finite curvature [1/m]")
    half_angle_sine = 0.5 * kappa * span
    if np.any(np.abs(half_angle_sine) > 1.0):
        raise InputError(
            "curvature", kappa.tolist(), "|curvature| <= 2/span (the chord cannot exceed the diameter)"
        )
    bow = kappa * span * span / (4.0 * (1.0 + np.sqrt(1.0 - half_angle_sine**2)))
    return float(bow) if bow.ndim == 0 else bow


SUPPORTS = ("cantilever", "centre")


def arc_shape(curvature: float, length: float, support: str = "cantilever", points: int = 121):
    """Centre line (x, w) of a strip of arc length ``length`` bent to uniform ``curvature``.

    Exact arc kinematics (layers.md section 6): with s the arc length from the held point and the
    tangent horizontal there, x = sin(kappa s)/kappa and w = -(1 - cos(kappa s))/kappa. The minus sign
    follows kappa = -w'' (kappa > 0 bends the ends down). ``support``: "cantilever" (held at x = 0)
    or "centre" (a free strip, plate or wafer held at its middle, s from -L/2 to L/2).
    """
    if support not in SUPPORTS:
        raise InputError("support", support, "one of " + ", ".join(SUPPORTS))
    s = np.linspace(0.0, length, points) if support == "cantilever" else np.linspace(-0.5, 0.5, points) * length
    phi = curvature * s
    if abs(curvature) * length < 1e-9:
        return s.copy(), -0.5 * curvature * s * s
    return np.sin(phi) / curvature, -(1.0 - np.cos(phi)) / curvature
