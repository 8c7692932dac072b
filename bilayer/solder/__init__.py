"""Solder joints under temperature cycling: joint geometry and DNP strain, life laws chosen by the solder's
alloy family, Weibull spread, Norris-Landzberg acceleration and the one chamber life, cycling presets,
assembly warpage at the cycle extremes, scatter from tolerances, and the design-file job.

Modules: ``joint`` (cycles, the check), ``geometry`` (leadless, area array, leaded), ``alloys`` (families
and the family rule), ``life_laws`` (Engelmaier-Wild, Coffin-Manson, energy laws), ``acceleration``
(Norris-Landzberg, chamber life), ``warpage``, ``tolerances``, ``assessment`` (the design-file job).

Short paths::

    from bilayer.solder import check_solder_joint, LeadlessJoint, CycleProfile, preset_cycle, assembly_warpage
"""
from .acceleration import (
    NORRIS_LANDZBERG_CONVENTION,
    NORRIS_LANDZBERG_SETS,
    ChamberLife,
    NorrisLandzbergSet,
    norris_landzberg_factor,
    user_acceleration_set,
)
from .alloys import AlloyFamily, alloy_family
from .assessment import SolderAssessment, assess_solder_design
from .cautions import SOLDER_CAUTIONS
from .geometry import (
    FACTOR_GUIDANCE,
    JOINT_TYPES,
    AreaArrayJoint,
    LeadedJoint,
    LeadlessJoint,
    area_array_dnp,
    global_shear_strain,
)
from .joint import CYCLING_PRESETS, CycleProfile, SolderJointResult, check_solder_joint, preset_cycle, thermal_strain
from .life_laws import (
    DARVEAUX_2000_SNPB,
    ENGELMAIER_WILD,
    LIFE_LAWS,
    SYED_2004_SAC,
    CoffinManson,
    Constant,
    EnergyLaw,
    engelmaier_exponent,
    engelmaier_median_life,
    user_constant,
    weibull_life,
    weibull_scale,
)
from .tolerances import SolderScatter, joint_scatter
from .warpage import WarpageResult, assembly_warpage

__all__ = [
    "NORRIS_LANDZBERG_CONVENTION", "NORRIS_LANDZBERG_SETS", "ChamberLife", "NorrisLandzbergSet",
    "norris_landzberg_factor", "user_acceleration_set",
    "AlloyFamily", "alloy_family",
    "SolderAssessment", "assess_solder_design",
    "SOLDER_CAUTIONS",
    "FACTOR_GUIDANCE", "JOINT_TYPES", "AreaArrayJoint", "LeadedJoint", "LeadlessJoint", "area_array_dnp",
    "global_shear_strain",
    "CYCLING_PRESETS", "CycleProfile", "SolderJointResult", "check_solder_joint", "preset_cycle", "thermal_strain",
    "DARVEAUX_2000_SNPB", "ENGELMAIER_WILD", "LIFE_LAWS", "SYED_2004_SAC", "CoffinManson", "Constant", "EnergyLaw",
    "engelmaier_exponent", "engelmaier_median_life", "user_constant", "weibull_life", "weibull_scale",
    "SolderScatter", "joint_scatter",
    "WarpageResult", "assembly_warpage",
]
