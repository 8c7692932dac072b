"""Layer materials: CTE models, the Material record and the material library.

The built-in data file ``library.toml`` is parsed on the first call of :func:`default_library`.
"""
from __future__ import annotations

from .cte import CTEModel, ConstantCTE, InstantaneousCTETable, MeanCTETable, SiliconCTE, range_warning
from .library import MaterialLibrary, default_library, get_material, load_material_file, material_to_table, write_material_file
from .material import Material

__all__ = [
    "CTEModel",
    "ConstantCTE",
    "InstantaneousCTETable",
    "Material",
    "MaterialLibrary",
    "MeanCTETable",
    "SiliconCTE",
    "default_library",
    "get_material",
    "load_material_file",
    "material_to_table",
    "range_warning",
    "write_material_file",
]
