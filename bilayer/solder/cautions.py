"""The cautions of the solder job, shown after the shared :data:`bilayer.core.cautions.CAUTIONS`."""
from __future__ import annotations

__all__ = ["SOLDER_CAUTIONS"]

SOLDER_CAUTIONS = (
    "Screening estimate only: the solder-joint life and acceleration factor are first-order empirical "
    "estimates. Qualification by test per IPC-9701, the JEDEC temperature-cycling standards "
    "(JESD22-A104) and the customer's requirements decides; for medical, aerospace, automotive or other "
    "safety-related electronics the applicable standards and licensed practice decide acceptance.",
    "Model limits: the distance-to-neutral-point strain and the life laws cover creep-fatigue of the bulk "
    "solder of leadless, area-array and leaded joints; they do not cover vibration, mechanical shock, "
    "brittle intermetallic fracture or pad cratering, and underfilled joints are outside them.",
    "A life law or acceleration set holds only for the alloy family it was fitted on: tin-lead constants "
    "on a lead-free joint (or the reverse) give numbers without support. Constants marked 'from memory' "
    "must be checked against their source before use.",
    "The life is the median of a wide distribution; early failures follow from the assumed Weibull shape. "
    "Acceleration factors differ by up to about ten times between published parameter sets.",
)
"""Job-specific cautions; results carry them after the shared ones."""
