"""Thickness-ratio sweep (bilayer.strip.ratio_sweep) against Timoshenko's optimum and direct engine calls."""
import math

import numpy as np
import pytest

import bilayer as bl
from bilayer.strip.interface import interface_stresses
from bilayer.core.materials import Material
from bilayer.strip.ratio_sweep import thickness_ratio_sweep


def _design():
    # layers.md Example A materials (narrow strip), an uneven thickness ratio to start from
    stack = bl.Stack.of((Material("a", 140e9, 0.30, 1.5e-6), 0.3e-3), (Material("b", 100e9, 0.33, 19.5e-6), 0.7e-3))
    return bl.Design(stack, bl.Temperatures(293.15, 393.15))


def test_best_ratio_is_timoshenko_optimum():
    """Timoshenko (1925): at fixed total thickness the curvature is largest at m^2 n = 1,
    t1/t2 = sqrt(E2/E1), where kappa = 1.5 dalpha dT / h."""
    sweep = thickness_ratio_sweep(_design(), 0.05, points=81)
    best = math.sqrt(100e9 / 140e9)
    assert sweep.best_ratio == pytest.approx(best, rel=2e-3)
    assert np.max(np.abs(sweep.curvature)) == pytest.approx(1.5 * 18e-6 * 100 / 1e-3, rel=1e-3)


def test_current_point_equals_direct_engine_and_interface_calls():
    design = _design()
    sweep = thickness_ratio_sweep(design, 0.05)
    assert sweep.current_ratio == pytest.approx(0.3 / 0.7, rel=1e-14)
    assert sweep.current_curvature == pytest.approx(design.evaluate().curvature, rel=1e-12)
    direct = interface_stresses(design.stack, design.temperatures, 0.05)
    assert sweep.current_peak_shear == pytest.approx(np.max(np.abs(direct.interfaces[0].shear)), rel=1e-9)
    assert sweep.ratios.size == 41 and sweep.curvature.shape == sweep.peak_shear.shape == (41,)
