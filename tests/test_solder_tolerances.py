"""Scatter of the solder joint's strain, life, chamber life and warpage from tolerances.

Sources: the statistics are mathematical (for small tolerances a smooth function's scatter tends to its
linearisation, the delta method; the Monte Carlo standard deviation converges as 1/sqrt(samples)); the
exact first-order values of the strain are derived here from dgamma = F L_D dalpha dT / h (Engelmaier 1983).
"""
from __future__ import annotations

import math

import pytest

from bilayer import solder
from bilayer.core import scatter
from bilayer.core.materials import get_material
from bilayer.designs.design_file import read_design_text

C0 = 273.15
DESIGN = """
name = "tolerance case (invented)"
[conditions]
bending_state = "plate"
stress_free_temperature = "150 degC"
operating_temperature = "25 degC"
[[layer]]
material = "fr4"
thickness = "1.6 mm"
[[layer]]
material = "alumina_96"
thickness = "0.8 mm"
[solder_joint]
joint_type = "chip_carrier"
dnp = "6.36 mm"
standoff = "0.127 mm"
nonideality_factor = 1.0
solder_material = "solder_sn63pb37"
cycle_low = "0 degC"
cycle_high = "100 degC"
dwell = "10 min"
cycle_rate = "24 cycles/day"
test_cycle = "-40/+125"
outline_length = "9 mm"
tolerance_dnp = 0.01
tolerance_standoff = 0.03
tolerance_cte_component = 0.02
tolerance_cte_board = 0.03
tolerance_factor = 0.02
tolerance_cycle = "1 K"
samples = 200000
"""


@pytest.fixture(scope="module")
def assessment():
    return solder.assess_solder_design(read_design_text(DESIGN).design)


def test_monte_carlo_and_first_order_agree_within_2_percent(assessment):
    """Issue 12 check: with small tolerances (first order accurate) the Monte Carlo standard deviation of
    every result is within 2 % of the first-order one (delta method), and the ranking agrees."""
    first, mc = assessment.scatter
    assert (first.method, mc.method, mc.samples) == ("first order", "monte carlo", 200_000)
    names = [r.name for r in first.results]
    assert names[:3] == ["shear strain", "median life", "chamber life"] and len(names) == 3 + 4  # warpage at -40, 0, 100, 125 degC
    for fo in first.results:
        m = mc[fo.name]
        assert fo.std > 0
        assert m.std == pytest.approx(fo.std, rel=0.02), fo.name
        assert abs(m.mean - fo.nominal) < 0.02 * fo.std + 5 * m.std / math.sqrt(mc.samples) + 0.01 * fo.std, fo.name
        assert m.contributors[0][0] == fo.contributors[0][0]


def test_first_order_strain_scatter_matches_the_exact_linearisation(assessment):
    """Derived here: dgamma = F L_D (a_b - a_c) dT / h, so the relative slopes are 1 for L_D and F, -1 for h,
    a_b dT / (a_b - a_c) dT and -a_c / (a_b - a_c) for the CTE scales, and F L_D (a_b - a_c) / h per K for
    the high temperature (-that for the low one)."""
    first = assessment.scatter[0]
    gamma = assessment.joint.shear_strain
    s = first["shear strain"].sensitivities
    a_b, a_c = get_material("fr4").alpha, get_material("alumina_96").alpha
    assert s["dnp"] == pytest.approx(gamma, rel=1e-6)
    assert s["factor"] == pytest.approx(gamma, rel=1e-6)
    assert s["standoff"] == pytest.approx(-gamma, rel=1e-5)
    assert s["cte_board"] == pytest.approx(gamma * a_b / (a_b - a_c), rel=1e-6)
    assert s["cte_component"] == pytest.approx(-gamma * a_c / (a_b - a_c), rel=1e-6)
    assert s["cycle_high"] == pytest.approx(gamma / 100.0, rel=1e-6)
    assert s["cycle_low"] == pytest.approx(-gamma / 100.0, rel=1e-6)
    sigma = {"dnp": 0.01 / 3, "standoff": 0.03 / 3, "cte_component": 0.02 / 3, "cte_board": 0.03 / 3,
             "factor": 0.02 / 3, "cycle_low": 1 / 3, "cycle_high": 1 / 3}
    hand = math.sqrt(sum((s[k] * sigma[k]) ** 2 for k in sigma))
    assert first["shear strain"].std == pytest.approx(hand, rel=1e-12)


def test_contributors_are_named_in_plain_words(assessment):
    first = assessment.scatter[0]
    text = first["median life"].text
    assert "board CTE" in text and "joint height" in text and "%" in text
    assert "cte_board" not in text
    warpage = first["bow over the diagonal at field high"]
    assert {name for name, share in warpage.contributors if share > 0.01} <= {"cte_board", "cte_component",
                                                                               "cycle_high"}
    assert warpage.sensitivities["dnp"] == 0.0 and warpage.sensitivities["standoff"] == 0.0


def test_report_shows_the_scatter(assessment):
    from bilayer.solder.report import report

    text = report(read_design_text(DESIGN).design, assessment)
    assert "Scatter from tolerances (first order" in text and "Monte Carlo, 200000 samples" in text
    assert "The scatter of the median life comes" in text


def test_energy_law_life_does_not_scatter():
    design = DESIGN.replace('test_cycle = "-40/+125"', 'life_law = "energy"\nenergy_coefficient = 1000\n'
                            'energy_exponent = -1.2\nenergy_density = "0.25 MJ/m^3"').replace(
        'samples = 200000', 'monte_carlo = false')
    result = solder.assess_solder_design(read_design_text(design).design)
    life = result.scatter[0]["median life"]
    assert life.std == 0.0 and life.text.startswith("No input moves")
    assert any("do not move the life" in w for w in result.warnings)


def test_thermostat_and_solder_share_one_tolerance_machinery():
    """Reuse, not a copy: the thermostat's Tolerance is the core one."""
    from bilayer.thermostat import tolerances as thermostat_tolerances

    assert thermostat_tolerances.Tolerance is scatter.Tolerance
    assert thermostat_tolerances.monte_carlo is scatter.monte_carlo
    assert thermostat_tolerances.first_order is scatter.first_order


def test_bad_tolerances_name_the_input():
    from bilayer.core.errors import InputError

    result = solder.check_solder_joint(solder.LeadlessJoint(5e-3, 0.1e-3), 6.5e-6, 16e-6,
                                       solder.CycleProfile(C0, C0 + 100))
    with pytest.raises(InputError, match="tolerances.height"):
        solder.joint_scatter(result, 6.5e-6, 16e-6, {"height": scatter.Tolerance(0.01)})
    with pytest.raises(InputError, match="cycle_low.relative"):
        solder.joint_scatter(result, 6.5e-6, 16e-6, {"cycle_low": scatter.Tolerance(0.01)})
    with pytest.raises(InputError, match="method"):
        solder.joint_scatter(result, 6.5e-6, 16e-6, {"dnp": scatter.Tolerance(0.01)}, method="exact")


def test_report_says_when_first_order_is_not_accurate():
    """Delta method limit: dgamma ~ 1/h, so a +/-60 % (3 sigma) stand-off tolerance makes the strain's
    scatter skewed and wider than the linearisation; the report says the Monte Carlo holds."""
    from bilayer.solder.report import report

    wide = DESIGN.replace("tolerance_standoff = 0.03", "tolerance_standoff = 0.6").replace("samples = 200000",
                                                                                           "samples = 50000")
    design = read_design_text(wide).design
    assessment = solder.assess_solder_design(design)
    first, mc = assessment.scatter
    assert mc["shear strain"].std > 1.1 * first["shear strain"].std
    assert "too wide for the linearisation" in report(design, assessment)
