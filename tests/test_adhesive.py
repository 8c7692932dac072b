"""Adhesive bonds: end shear and peel through the interface model, limits, equilibrium, Tg checks,
allowables and sweeps. Each check names its source; closed forms are written out in the test."""
import math
import warnings

import numpy as np
import pytest
from scipy.integrate import quad

from bilayer.adhesive import bond as ad
from bilayer.core.errors import InputError, SuspiciousInputWarning
from bilayer.core.materials import Material

C0 = 273.15
ALUMINIUM = Material("aluminium alloy", 70e9, 0.33, 23e-6)
STEEL = Material("carbon steel", 200e9, 0.30, 12e-6)
EPOXY = Material("structural epoxy", 2.6e9, 0.30, 60e-6, glass_transition=130 + C0)  # G = 1 GPa


def joint(model="no_bending", overlap=50e-3, bond_line=0.2e-3, adhesive=EPOXY, cure=120 + C0):
    return ad.AdhesiveJoint(ALUMINIUM, 2e-3, adhesive, bond_line, STEEL, 2e-3, overlap, cure, model=model)


def chen_nelson_end_shear(G, h0, E1t1, E2t2, mismatch, half_length):
    """Chen & Nelson (IBM J. Res. Dev. 23:179, 1979) no-bending thermal shear lag, written here:
    tau(l) = G Delta tanh(k l) / (h0 k), k^2 = (G/h0)(1/E1t1 + 1/E2t2)."""
    k = math.sqrt(G / h0 * (1 / E1t1 + 1 / E2t2))
    return G * mismatch * math.tanh(k * half_length) / (h0 * k), k


def test_chen_nelson_worked_joint():
    """Aluminium 2 mm on steel 2 mm, epoxy G = 1 GPa, h0 = 0.2 mm, overlap 50 mm, cured 120 degC,
    used at -40 degC: applications.md sec. 5.1 [D] tau_max = 40.1 MPa, decay length 4.55 mm, force at
    mid-overlap 181.0 N/mm; recomputed here from the closed form above."""
    mismatch = (12e-6 - 23e-6) * (-160.0)
    expected, k = chen_nelson_end_shear(1e9, 0.2e-3, 140e6, 400e6, mismatch, 25e-3)
    result = ad.check_adhesive_joint(joint(), -40 + C0)
    assert result.end_shear[0] == pytest.approx(expected, rel=1e-9)
    assert expected == pytest.approx(40.1e6, rel=1e-3)
    assert result.decay_length == pytest.approx(1 / k, rel=1e-12) and 1 / k == pytest.approx(4.55e-3, rel=1e-3)
    long_force = mismatch / (1 / 140e6 + 1 / 400e6)
    assert result.mid_force[0] == pytest.approx(long_force * (1 - 1 / math.cosh(k * 25e-3)), rel=1e-9)
    assert result.mid_force[0] == pytest.approx(181.0e3, rel=1e-3)


def test_long_and_short_joint_limits():
    """Limits of the shear-lag solution (Volkersen-type; applications.md sec. 5.1): long joint
    tau -> |Delta| sqrt(G/h0)/sqrt(1/E1t1 + 1/E2t2); short joint tau -> G |Delta| l / h0. The sheet's
    2 mm joint: 8.66 MPa against the limit 8.80 MPa."""
    mismatch = 11e-6 * 160.0
    long_limit = mismatch * math.sqrt(1e9 / 0.2e-3) / math.sqrt(1 / 140e6 + 1 / 400e6)
    long = ad.check_adhesive_joint(joint(overlap=0.5), -40 + C0)
    assert long.end_shear[0] == pytest.approx(long_limit, rel=1e-12)
    for overlap in (0.2e-3, 0.02e-3):
        short_limit = 1e9 * mismatch * (overlap / 2) / 0.2e-3
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            short = ad.check_adhesive_joint(joint(overlap=overlap), -40 + C0)
        kl = overlap / 2 / short.decay_length
        assert short.end_shear[0] / short_limit == pytest.approx(1 - kl**2 / 3, abs=kl**4)  # tanh(x)/x
    two_mm = ad.check_adhesive_joint(joint(overlap=2e-3), -40 + C0)
    assert two_mm.end_shear[0] == pytest.approx(8.66e6, rel=1e-3)
    assert any("edge zone" in w for w in two_mm.warnings)


@pytest.mark.parametrize("model", ["no_bending", "bending"])
def test_shear_integral_equals_adherend_force(model):
    """Equilibrium of a free end (layers.md invariant 15): the shear transferred between the end and
    mid-overlap equals the axial force of the adherend there, int_0^l tau dxi = T(0)."""
    result = ad.check_adhesive_joint(joint(model=model, overlap=20e-3), -40 + C0)
    params = result.interface_results[0].interfaces[0].parameters
    half = 10e-3
    integral, error = quad(lambda xi: float(params.force_and_shear(np.array([xi]), half)[1][0]), 0.0, half,
                           limit=200, epsabs=1e-9)
    assert integral == pytest.approx(result.mid_force[0], rel=1e-8)
    assert abs(result.mid_force[0]) > 0


def test_thicker_and_softer_bond_lines_lower_the_end_shear():
    """Long-joint scaling tau ~ h0^(-1/2) and ~ G^(1/2) (from the closed form); applications.md sec. 5.1
    [D] values 80.2/56.7/40.1/25.3/17.7 MPa for h0 = 0.05..1.0 mm; longer overlaps do not help."""
    values = [0.05e-3, 0.1e-3, 0.2e-3, 0.5e-3, 1.0e-3]
    sweep = ad.sweep_adhesive_joint(joint(), -40 + C0, "bond_line", values)
    np.testing.assert_allclose(sweep.end_shear, [80.2e6, 56.7e6, 40.1e6, 25.3e6, 17.7e6], rtol=0, atol=0.05e6)
    assert sweep.end_shear[0] / sweep.end_shear[2] == pytest.approx(2.0, rel=1e-3)  # tanh(k l) ~ 1
    moduli = ad.sweep_adhesive_joint(joint(), -40 + C0, "adhesive_modulus", [2.6e7, 2.6e8, 2.6e9, 5.2e9])
    np.testing.assert_allclose(moduli.end_shear, [2.0e6, 11.9e6, 40.1e6, 56.7e6], rtol=0, atol=0.05e6)
    overlaps = ad.sweep_adhesive_joint(joint(), -40 + C0, "overlap", [25e-3, 50e-3, 100e-3])
    assert overlaps.end_shear[2] == pytest.approx(overlaps.end_shear[1], rel=1e-4)
    assert overlaps.to_dict()["units"]["values"] == "m"


def test_bending_model_gives_peel_and_less_shear():
    """With bending allowed the free joint curls and part of the mismatch is taken by curvature
    (layers.md sec. 5.4 case 3 vs case 2: the no-bending force is several times larger); peel exists,
    is confined within a few peel decay lengths of the end, and is self-equilibrated."""
    free = ad.check_adhesive_joint(joint("bending"), -40 + C0)
    held = ad.check_adhesive_joint(joint("no_bending"), -40 + C0)
    assert abs(free.end_shear[0]) < abs(held.end_shear[0])
    assert free.max_peel[0] > 0 > free.min_peel[0]
    assert np.isnan(held.max_peel[0]) and held.peel_margin is None
    profile = free.interface_results[0].interfaces[0]
    x = free.interface_results[0].x
    assert np.trapezoid(profile.peel, x) == pytest.approx(0.0, abs=1e-3 * np.max(np.abs(profile.peel)) * 50e-3)
    assert free.peel_decay_length < 3e-3


def test_glass_transition_warnings():
    """Tg checks (applications.md sec. 5.3, from memory there): crossing Tg in the operating range, and
    Tg below the cure temperature suggesting Tg as the stress-free temperature."""
    crossing = ad.check_adhesive_joint(joint(), [-40 + C0, 150 + C0])
    assert any("crosses the adhesive glass transition" in w for w in crossing.warnings)
    low_tg = EPOXY.with_changes(glass_transition=90 + C0)
    cured_above = ad.check_adhesive_joint(joint(adhesive=low_tg), -40 + C0)
    assert any("better stress-free temperature" in w for w in cured_above.warnings)
    inside = ad.check_adhesive_joint(joint(), [-40 + C0, 85 + C0])
    assert not any("glass transition" in w for w in inside.warnings)


def test_allowables_and_margins():
    result = ad.check_adhesive_joint(joint("bending"), [-40 + C0, 85 + C0], allowable_shear=30e6, allowable_peel=5e6)
    assert result.shear_margin == pytest.approx(30e6 / result.worst_shear)
    assert result.peel_margin == pytest.approx(5e6 / result.worst_peel)
    assert any("tensile peel" in w for w in result.warnings)
    assert result.worst_shear == pytest.approx(np.max(np.abs(result.end_shear)))
    data = result.to_dict()
    assert "IPC-9701" in " ".join(data["cautions"]) and "singular" in " ".join(data["cautions"])


def test_cure_temperature_is_the_stress_free_reference():
    """At the stress-free temperature there is no mismatch and no end shear (Delta T = 0)."""
    result = ad.check_adhesive_joint(joint(), [120 + C0, 20 + C0])
    assert result.end_shear[0] == 0.0 and result.end_shear[1] != 0.0
    assert result.temperature_change[1] == pytest.approx(-100.0)


def test_bad_inputs_name_the_field():
    with pytest.raises(InputError, match="bond_line"):
        joint(bond_line=-1e-4)
    with pytest.raises(InputError, match="model"):
        joint(model="stiff")
    with pytest.raises(InputError, match="parameter"):
        ad.sweep_adhesive_joint(joint(), 300.0, "width", [1.0])
    with pytest.raises(InputError, match="operating_temperature"):
        ad.check_adhesive_joint(joint(), [-10.0])
    with pytest.warns(SuspiciousInputWarning, match="bond_line"):
        joint(bond_line=0.02)


# ------------------------------------------------------------------------ design file and command
def _example_path():
    from pathlib import Path

    return Path(__file__).resolve().parent.parent / "bilayer" / "examples" / "tank_gauge_glass_strip.toml"


def test_example_design_runs_and_matches_direct_calls():
    """The shipped example (invented) through the design file equals the direct API call."""
    from bilayer.designs.design_file import load_design
    from bilayer.core.materials import get_material

    design = load_design(_example_path())
    assessment = ad.assess_adhesive_design(design)
    direct = ad.check_adhesive_joint(
        ad.AdhesiveJoint(get_material("aluminium_6061_t6"), 3e-3, get_material("epoxy_adhesive"), 0.15e-3,
                         get_material("glass_borosilicate"), 2e-3, 60e-3, 80 + C0),
        [-40 + C0, 25 + C0, 85 + C0],
    )
    np.testing.assert_allclose(assessment.result.end_shear, direct.end_shear, rtol=1e-12)
    assert [s.parameter for s in assessment.sweeps] == ["bond_line", "overlap", "adhesive_modulus"]
    assert assessment.sweeps[0].operating_temperature == pytest.approx(-40 + C0)


def test_command_line_prints_shear_peel_and_cautions(capsys):
    import json

    from bilayer.cli.entry import main

    assert main(["bond", str(_example_path())]) == 0
    text = capsys.readouterr().out
    for needle in ("end shear", "peel max", "shear margin", "Sweep of bond line", "singular", "IPC-9701"):
        assert needle in text
    assert main(["bond", str(_example_path()), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert len(data["adhesive_bond"]["end_shear"]) == 3 and len(data["sweeps"]) == 3


def test_two_layer_design_is_refused():
    from bilayer import Design, Stack, Temperatures

    design = Design(Stack.of((ALUMINIUM, 2e-3), (STEEL, 2e-3)), Temperatures(393.15, 233.15),
                    sections={"adhesive_bond": {"overlap": 0.05}})
    with pytest.raises(InputError, match="3 layers"):
        ad.assess_adhesive_design(design)


@pytest.mark.parametrize("model", ["no_bending", "bending"])
def test_linearity_and_adherend_swap(model):
    """Invariants of the linear model (layers.md sec. 9, items 3 and 7): end shear and peel scale with
    Delta T; swapping the adherends reverses the shear (no bending) and keeps its magnitude."""
    base = joint(model)
    one, two = ad.check_adhesive_joint(base, [20 + C0, -80 + C0]).end_shear  # Delta T = -100 K and -200 K
    assert two == pytest.approx(2 * one, rel=1e-10)
    if model == "no_bending":
        swapped = ad.AdhesiveJoint(STEEL, 2e-3, EPOXY, 0.2e-3, ALUMINIUM, 2e-3, 50e-3, 120 + C0, model=model)
        assert ad.check_adhesive_joint(swapped, 20 + C0).end_shear[0] == pytest.approx(-one, rel=1e-12)
    else:
        peel = ad.check_adhesive_joint(base, [20 + C0, -80 + C0]).max_peel
        assert peel[1] == pytest.approx(2 * peel[0], rel=1e-6)
