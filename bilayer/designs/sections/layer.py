"""[[layer]]: the layers, listed bottom first (the first [[layer]] is layer 1, at z = 0)."""
from __future__ import annotations

from ...core.section_spec import TEXT, Field, SectionSpec

SECTION = SectionSpec(
    "layer",
    (
        Field("material", TEXT, required=True,
              doc="a library key or name, or the id of a [materials.<id>] table in this file"),
        Field("thickness", "length", required=True, low=0.0, doc="layer thickness"),
        Field("label", TEXT, default="", doc="optional name shown in tables"),
    ),
    doc="one bonded layer; repeat [[layer]] bottom to top",
    core=True,
    array=True,
)
