"""Stresses along the strip: interface shear and peel near the free ends (beam-type closed forms and
their sympy derivation), the independent 2-D finite-element check, the report that sets them side by
side, the thickness-ratio sweep, and the ``[interface]`` job.

Short paths::

    from bilayer.strip import interface_stresses, fe_check, trust_report
"""
from .interface import (
    MODELS,
    InterfaceParameters,
    InterfaceProfile,
    InterfaceResult,
    interface_parameters,
    interface_stresses,
    shear_lag,
    peel_compliant,
    resolve_bonds,
    soft_inner_layers,
    ASSUMPTIONS,
)
from .derivation import (
    ShearLagDerivation,
    PeelDerivation,
    shear_lag_derivation,
    peel_derivation,
    layer_compliance_derivation,
    numeric_shear_lag,
    numeric_peel,
)
from .fe import (
    MeshOptions,
    FEInterface,
    FEResult,
    RefinementStudy,
    fe_check,
    refinement_study,
    strip_mesh,
)
from .fe_comparison import TrustRow, TrustFlag, TrustReport, trust_report, dundurs_parameters, TOLERANCE
from .ratio_sweep import ThicknessRatioSweep, thickness_ratio_sweep, ratio_of_largest
from .assessment import (
    interface_options,
    interface_for_design,
    check_temperature,
    trust_report_for_design,
)

__all__ = [
    "MODELS",
    "InterfaceParameters",
    "InterfaceProfile",
    "InterfaceResult",
    "interface_parameters",
    "interface_stresses",
    "shear_lag",
    "peel_compliant",
    "resolve_bonds",
    "soft_inner_layers",
    "ASSUMPTIONS",
    "ShearLagDerivation",
    "PeelDerivation",
    "shear_lag_derivation",
    "peel_derivation",
    "layer_compliance_derivation",
    "numeric_shear_lag",
    "numeric_peel",
    "MeshOptions",
    "FEInterface",
    "FEResult",
    "RefinementStudy",
    "fe_check",
    "refinement_study",
    "strip_mesh",
    "TrustRow",
    "TrustFlag",
    "TrustReport",
    "trust_report",
    "dundurs_parameters",
    "TOLERANCE",
    "ThicknessRatioSweep",
    "thickness_ratio_sweep",
    "ratio_of_largest",
    "interface_options",
    "interface_for_design",
    "check_temperature",
    "trust_report_for_design",
]
