"""The cautions shown with every result (command line, panels, reports): one text for all outputs.

Results of bilayer can feed devices whose failure hurts people or property (thermal cut-outs and
protectors, breaker trip elements, medical or aerospace electronics), so every output that shows
numbers also shows these lines. Jobs may append their own, more specific lines.
"""
from __future__ import annotations

import textwrap
from typing import Iterable

__all__ = ["CAUTIONS", "cautions_text"]

CAUTIONS: tuple[str, ...] = (
    "Results are engineering estimates under stated assumptions: linear elastic layers, a uniform "
    "temperature through the stack and perfect bonds. They do not qualify, certify or calibrate a product.",
    "Devices that protect people or property (thermal cut-outs, limiters, motor protectors, breaker trip "
    "elements, medical or aerospace electronics) need qualification by test under the applicable standards "
    "(for example IEC 60730-2-9 for temperature-sensing controls, or its national adoption); local codes, "
    "certification bodies and licensed engineers decide acceptance.",
    "Check the stress-free temperature, the sign of the temperature change (operating minus stress-free) "
    "and the kind of CTE data (mean over your range, not a value at one temperature): these cause most "
    "wrong answers.",
    "Elastic stresses from a high stress-free temperature are upper bounds when solder, copper or polymers "
    "yield, creep or pass their glass transition.",
)


def cautions_text(extra: Iterable[str] = (), width: int = 100) -> str:
    """The cautions (plus job-specific ``extra`` lines) as a wrapped, bulleted plain text."""
    lines = ["Cautions:"]
    for caution in (*CAUTIONS, *extra):
        lines.append(textwrap.fill(caution, width=width, initial_indent="  - ", subsequent_indent="    "))
    return "\n".join(lines)
