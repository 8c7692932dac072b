"""Adhesive bonds under temperature change: end shear and peel from the interface model, cure
temperature, glass-transition checks, allowables and sweeps, and the design-file job.

Short paths::

    from bilayer.adhesive import AdhesiveJoint, check_adhesive_joint, sweep_adhesive_joint
"""
from .bond import (
    ADHESIVE_CAUTIONS,
    AdhesiveJoint,
    AdhesiveResult,
    check_adhesive_joint,
    AdhesiveSweep,
    SWEEP_PARAMETERS,
    sweep_adhesive_joint,
    AdhesiveAssessment,
    joint_from_design,
    assess_adhesive_design,
)

__all__ = [
    "ADHESIVE_CAUTIONS",
    "AdhesiveJoint",
    "AdhesiveResult",
    "check_adhesive_joint",
    "AdhesiveSweep",
    "SWEEP_PARAMETERS",
    "sweep_adhesive_joint",
    "AdhesiveAssessment",
    "joint_from_design",
    "assess_adhesive_design",
]
