"""Solder joints under temperature cycling: DNP shear strain, Engelmaier life, Weibull spread,
Norris-Landzberg acceleration, cycling presets and assembly warpage, and the design-file job.

Short paths::

    from bilayer.solder import check_solder_joint, CycleProfile, preset_cycle, assembly_warpage
"""
from .joint import (
    TIN_LEAD_DUCTILITY,
    CycleProfile,
    CYCLING_PRESETS,
    preset_cycle,
    NorrisLandzbergSet,
    NORRIS_LANDZBERG_SETS,
    NORRIS_LANDZBERG_CONVENTION,
    thermal_strain,
    global_shear_strain,
    engelmaier_exponent,
    engelmaier_median_life,
    weibull_scale,
    weibull_life,
    norris_landzberg_factor,
    SolderJointResult,
    check_solder_joint,
    WarpageResult,
    assembly_warpage,
    SOLDER_CAUTIONS,
    SolderAssessment,
    assess_solder_design,
)

__all__ = [
    "TIN_LEAD_DUCTILITY",
    "CycleProfile",
    "CYCLING_PRESETS",
    "preset_cycle",
    "NorrisLandzbergSet",
    "NORRIS_LANDZBERG_SETS",
    "NORRIS_LANDZBERG_CONVENTION",
    "thermal_strain",
    "global_shear_strain",
    "engelmaier_exponent",
    "engelmaier_median_life",
    "weibull_scale",
    "weibull_life",
    "norris_landzberg_factor",
    "SolderJointResult",
    "check_solder_joint",
    "WarpageResult",
    "assembly_warpage",
    "SOLDER_CAUTIONS",
    "SolderAssessment",
    "assess_solder_design",
]
