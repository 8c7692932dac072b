"""Trust report (bilayer.strip.fe_comparison): closed forms against FE side by side, with flags.

References: the engine closed form and the FE check (both tested on their own in test_engine_*.py and
test_fe.py); Dundurs parameters against their equivalent textbook forms (alpha = (E1' - E2')/(E1' + E2'),
and beta written with (1 - 2 nu), Dundurs, J. Appl. Mech. 36:650, 1969 - forms from memory) and the derived
check values of layers.md sec. 5.6; width guide values of layers.md sec. 2.2-2.3 (derived there, a guide).
"""
import json

import numpy as np
import pytest

import bilayer as bl
from bilayer.core.errors import InputError, SuspiciousInputWarning
from bilayer.core.materials import Material
from bilayer.strip.fe_comparison import dundurs_parameters, trust_report

pytest.importorskip("skfem")
pytestmark = pytest.mark.filterwarnings("ignore", category=SuspiciousInputWarning)

LAYER_A = Material("example layer A", 140e9, 0.30, 1.5e-6)  # layers.md sec. 0, Example A
LAYER_B = Material("example layer B", 100e9, 0.33, 19.5e-6)
BOND = Material("example bond", 2.7e9, 0.35, 50e-6)
HEATED = bl.Temperatures(293.15, 393.15)


def _codes(report):
    return {flag.code for flag in report.flags}


def test_long_bilayer_passes_with_side_by_side_rows():
    """Example A, L/H = 12, narrow: every toleranced row within 0.5 % (FE vs closed form) and FE equilibrium
    within 1 %; shear and peel rows are informative; the report serialises to JSON."""
    report = trust_report(bl.Stack.of((LAYER_A, 0.5e-3), (LAYER_B, 0.5e-3)), HEATED, 12e-3, "narrow")
    assert report.ok
    quantities = {row.quantity for row in report.rows}
    assert {"curvature", "stress", "layer force", "shear", "peel", "FE equilibrium", "end deflection"} <= quantities
    assert report.largest_differences["curvature"] < 1e-6
    assert report.largest_differences["stress"] < 5e-3
    assert all(row.tolerance is None for row in report.rows if row.quantity in ("shear", "peel"))
    assert "short_strip" not in _codes(report) and "nominal_end_values" in _codes(report)
    assert report.refinement is not None and report.fe is report.refinement.runs[-1]
    data = json.loads(json.dumps(report.to_dict()))
    assert data["ok"] is True and data["fe_plane"] == "plane stress"


def test_short_strip_is_flagged_and_beam_rows_fail():
    """L/H = 1.5: the end zones reach mid-length; the report warns and the beam rows leave their tolerance
    (the default sample distances are cut to those short of mid-length)."""
    report = trust_report(bl.Stack.of((LAYER_A, 0.5e-3), (LAYER_B, 0.5e-3)), HEATED, 1.5e-3, "narrow", refine=False)
    assert np.all(report.fe.interfaces[0].distances < 0.75e-3)
    assert "short_strip" in _codes(report)
    assert "long_edge_zone" in _codes(report)
    assert not report.ok and "fe_difference" in _codes(report)


def test_bond_line_flags_and_plate_state_comparison():
    """A thick, nearly incompressible bond line in a plate design: thick/soft bond flags; the plate is compared
    in plane strain and the flag gives the plate-to-plane-strain curvature ratio of the engine."""
    soft = Material("rubbery bond", 20e6, 0.49, 200e-6)
    stack = bl.Stack.of((LAYER_A, 0.5e-3), (soft, 0.2e-3, "bond"), (LAYER_B, 0.5e-3))
    report = trust_report(stack, HEATED, 15e-3, "plate", bonds=["bond"], refine=False)
    assert report.compared_state.value == "wide" and report.fe.plane == "plane strain"
    codes = _codes(report)
    assert {"thick_bond", "soft_bond", "bending_state"} <= codes
    plate = bl.evaluate(stack, HEATED, "plate").curvature
    wide = bl.evaluate(stack, HEATED, "wide").curvature
    message = next(f.message for f in report.flags if f.code == "bending_state")
    assert f"{plate / wide:.4g}" in message


def test_width_advice_follows_the_width_parameter():
    """Width parameter S = b^2 kappa/H (layers.md sec. 2.3 guide: spherical below about 2): a 4 mm wide
    strip in the wide state is flagged as plate-like; a wide narrow-state strip gets the plate-stress note."""
    stack = bl.Stack.of((LAYER_A, 0.5e-3), (LAYER_B, 0.5e-3))
    wide = trust_report(stack, HEATED, 12e-3, "wide", refine=False, width=4e-3)
    assert any(f.code == "bending_state" and f.severity == "warning" for f in wide.flags)
    narrow = trust_report(stack, HEATED, 12e-3, "narrow", refine=False, width=20e-3)
    assert any("1/(1-nu)" in f.message for f in narrow.flags)


@pytest.mark.parametrize(
    "E1, nu1, E2, nu2, alpha, beta, singular",
    [
        (140e9, 0.30, 100e9, 0.33, 0.1564, 0.0262, True),
        (400e9, 0.22, 70e9, 0.33, 0.6851, 0.1573, True),
        (130e9, 0.28, 3e9, 0.35, 0.9527, 0.2181, True),
        (200e9, 0.30, 200e9, 0.30, 0.0, 0.0, False),
        (100e9, 0.45, 100e9, 0.20, 0.0925, 0.1636, False),
    ],
)
def test_dundurs_parameters(E1, nu1, E2, nu2, alpha, beta, singular):
    """Plane strain: derived check values of layers.md sec. 5.6, and the equivalent forms
    alpha = (E1' - E2')/(E1' + E2'), E' = E/(1-nu^2), and
    beta = [G1(1-2nu2) - G2(1-2nu1)] / [2 G1(1-nu2) + 2 G2(1-nu1)] (Dundurs 1969, from memory)."""
    a, b = dundurs_parameters(E1, nu1, E2, nu2, plane_strain=True)
    assert a == pytest.approx(alpha, abs=1e-4) and b == pytest.approx(beta, abs=1e-4)
    Ep1, Ep2 = E1 / (1 - nu1**2), E2 / (1 - nu2**2)
    G1, G2 = E1 / (2 * (1 + nu1)), E2 / (2 * (1 + nu2))
    assert a == pytest.approx((Ep1 - Ep2) / (Ep1 + Ep2), abs=1e-14)
    assert b == pytest.approx((G1 * (1 - 2 * nu2) - G2 * (1 - 2 * nu1)) / (2 * G1 * (1 - nu2) + 2 * G2 * (1 - nu1)), abs=1e-14)
    assert (a * (a - 2 * b) > 1e-12) is singular
    swapped = dundurs_parameters(E2, nu2, E1, nu1)
    np.testing.assert_allclose(swapped, (-a, -b), atol=1e-15)


def test_plane_stress_dundurs_alpha_uses_plain_modulus():
    """Plane stress: alpha = (E1 - E2)/(E1 + E2) (E' = E)."""
    a, _ = dundurs_parameters(140e9, 0.30, 100e9, 0.33, plane_strain=False)
    assert a == pytest.approx(40 / 240, rel=1e-12)


def test_singular_corner_is_flagged_for_stiff_on_soft():
    stack = bl.Stack.of((LAYER_A, 0.5e-3), (BOND, 50e-6), (LAYER_B, 0.5e-3))
    report = trust_report(stack, HEATED, 12e-3, "wide", bonds=[1], refine=False)
    assert sum(f.code == "singular_corner" for f in report.flags) == 2


def test_bad_input():
    stack = bl.Stack.of((LAYER_A, 0.5e-3), (LAYER_B, 0.5e-3))
    with pytest.raises(InputError, match="width"):
        trust_report(stack, HEATED, 12e-3, width=-1.0)
    with pytest.raises(InputError, match="distances"):
        trust_report(stack, HEATED, 12e-3, distances=[0.0])


def test_soft_inner_layer_is_flagged_and_naming_it_a_bond_brings_shear_close_to_fe():
    """layers.md sec. 3.5 stack (3 GPa middle layer between 200 and 70 GPa), plane strain, L/H = 10: with the
    soft layer inside a composite part the sampled shear is far from FE; named a bond, the shear-lag shear at
    the sampled distances comes within 5 % of the largest closed-form value (measured 2 %)."""
    stack = bl.Stack.of(
        (Material("s1", 200e9, 0.30, 12e-6), 0.30e-3),
        (Material("s2", 3e9, 0.35, 60e-6), 0.05e-3),
        (Material("s3", 70e9, 0.33, 23e-6), 0.20e-3),
    )
    cooled = bl.Temperatures(293.15, 213.15)
    plain = trust_report(stack, cooled, 5.5e-3, "wide", refine=False)
    assert "soft_inner_layer" in _codes(plain)
    assert any("layer 2 is much softer" in w for w in plain.interface.warnings)
    bonded = trust_report(stack, cooled, 5.5e-3, "wide", bonds=[1], refine=False)
    assert "soft_inner_layer" not in _codes(bonded)
    assert plain.largest_differences["shear"] > 0.3
    assert bonded.largest_differences["shear"] < 0.05
