"""[thermostat] design-file section and the report built from it (the shipped invented example).

Checks are consistency checks against the direct API calls (which carry the sourced checks in
test_thermostat.py) plus the design-file error rules of the project (bad keys name the key).
"""
from __future__ import annotations

import json
from pathlib import Path

import numpy as np
import pytest

from bilayer.designs.design_file import load_design, read_design_text
from bilayer.core.errors import DesignFileError
from bilayer.thermostat.element import closing_temperature
from bilayer.thermostat.assessment import analyse, element_from_design

EXAMPLE = Path(__file__).resolve().parents[1] / "bilayer" / "examples" / "propagator_heat_mat_cutout.toml"

BASE = """
format_version = 1
name = "check"
[conditions]
bending_state = "narrow"
stress_free_temperature = "20 degC"
operating_temperature = "60 degC"
[[layer]]
material = "fe36ni"
thickness = "0.2 mm"
[[layer]]
material = "nicrfe_22_3"
thickness = "0.2 mm"
"""


def test_example_design_runs_and_closes_at_its_set_point():
    """The shipped example: the solved gap makes the element close exactly at the stated set point."""
    design = load_design(EXAMPLE)
    report = analyse(design)
    assert report.set_point.temperature == pytest.approx(design.sections["thermostat"]["set_point"], abs=1e-6)
    element = element_from_design(design)
    assert closing_temperature(element, report.gap).temperature == pytest.approx(report.set_point.temperature, abs=1e-9)
    assert report.monte_carlo.samples == design.sections["thermostat"]["samples"]
    assert report.monte_carlo.std == pytest.approx(report.first_order.std, rel=0.05)
    text = report.to_text()
    assert "IEC 60730" in text and "Cautions" in text
    data = json.loads(json.dumps(report.to_dict()))
    assert data["cautions"] and data["set_point"]["temperature"] == pytest.approx(313.15, abs=1e-6)
    assert "degF" in report.to_text("us")


def test_datasheet_flexivity_in_a_design_file_is_labelled():
    design = read_design_text(BASE + """
[thermostat]
form = "cantilever"
width = "5 mm"
length = "30 mm"
flexivity = "20e-6 1/K"
strip_thickness = "0.4 mm"
flexural_modulus = "170 GPa"
gap = "1.35 mm"
limit_stress = "150 MPa"
""").design
    report = analyse(design)
    assert report.element.strip.source == "flexivity from a data sheet"
    # applications.md 1.8 by hand: small-deflection closure at 20 + 2 g t / (F L^2) = 80 degC
    assert report.set_point.temperature_small == pytest.approx(353.15, abs=1e-6)
    assert report.span.overtravel == pytest.approx(150e6 / (0.75 * 170e9 * 20e-6), rel=1e-7)


def test_coil_and_disc_sections():
    spiral = read_design_text(BASE + """
[thermostat]
form = "spiral"
width = "3 mm"
length = "300 mm"
angle_gap = "30 deg"
limit_stress = "300 MPa"
""").design
    report = analyse(spiral)
    assert report.set_point.direction in ("heating", "cooling")
    assert np.isfinite(report.load.force[0])
    disc = read_design_text(BASE.replace('"narrow"', '"plate"') + """
[thermostat]
form = "disc"
width = "20 mm"
diameter = "20 mm"
dome_height = "-0.6 mm"
""").design
    snap = analyse(disc).snap
    assert snap.label == "indicative"


@pytest.mark.parametrize("extra, key", [
    ('form = "cantilever"\nwidth = "5 mm"\n', "length"),
    ('form = "cantilever"\nwidth = "5 mm"\nlength = "3 cm"\ngap = "1 mm"\nset_point = "80 degC"\n', "set_point"),
    ('form = "spiral"\nwidth = "5 mm"\nlength = "30 cm"\ngap = "1 mm"\n', "gap"),
    ('form = "cantilever"\nwidth = "5 mm"\nlength = "3 cm"\nflexivity = "2e-5 1/K"\n', "strip_thickness"),
    ('form = "cantilever"\nwidth = "5 mm"\nlenght = "3 cm"\n', "lenght"),
    ('form = "wire"\nwidth = "5 mm"\n', "form"),
])
def test_bad_thermostat_sections_name_the_key(extra, key):
    with pytest.raises(DesignFileError, match=key):
        read_design_text(BASE + "[thermostat]\n" + extra)


def test_command_line_runs_the_example(capsys):
    from bilayer.cli.entry import main

    assert main(["thermostat", str(EXAMPLE), "--no-monte-carlo", "--units", "us"]) == 0
    out = capsys.readouterr().out
    assert "set point" in out and "degF" in out and "IEC 60730" in out
    assert main(["thermostat", str(EXAMPLE), "--json", "--samples", "2000"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["tolerance_monte_carlo"]["samples"] == 2000
    assert any("IEC 60730" in c for c in data["cautions"])


def test_command_line_refuses_a_design_without_thermostat_table(tmp_path, capsys):
    from bilayer.cli.entry import main

    path = tmp_path / "plain.toml"
    path.write_text(BASE)
    assert main(["thermostat", str(path)]) == 2
    assert "[thermostat]" in capsys.readouterr().err


def test_sizing_from_a_design_file_meets_both_targets():
    """sizing_force: the sized element closes `gap` at `set_point` and pushes `sizing_force` after the
    overtravel (checked by direct calls on the sized element)."""
    from bilayer.thermostat.element import contact_load

    design = read_design_text(BASE + """
[thermostat]
form = "cantilever"
width = "5 mm"
length = "30 mm"
gap = "1 mm"
set_point = "70 degC"
sizing_force = "0.3 N"
overtravel = "10 K"
limit_stress = "300 MPa"
""").design
    report = analyse(design)
    element = report.sizing.element
    assert closing_temperature(element, 1e-3).temperature == pytest.approx(343.15, abs=1e-6)
    assert contact_load(element, 1e-3, [353.15]).force[0] == pytest.approx(0.3, rel=1e-6)
    assert "sized:" in report.to_text()


def test_command_line_design_helpers(capsys):
    from bilayer.cli.entry import main

    assert main(["thermostat", str(EXAMPLE), "--no-monte-carlo", "--optimum-ratio", "--rank-pairs", "flexivity",
                 "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    # Timoshenko (1925): flexivity at the optimum ratio is 1.5 x the (secant) CTE difference
    assert data["optimum_ratio"]["flexivity_over_cte_difference"] == pytest.approx(1.5, rel=1e-9)
    flex = [row["flexivity"] for row in data["ranked_pairs"] if row["admissible"]]
    assert flex == sorted(flex, reverse=True)
