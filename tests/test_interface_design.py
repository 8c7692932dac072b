"""The [interface] design-file section and the ``bilayer interface`` command: what they format_quantity equals
direct core calls (bilayer.strip.interface, bilayer.strip.fe_comparison), errors name the key, exit codes follow docs/cli.md."""
import json
from pathlib import Path

import numpy as np
import pytest

from bilayer.cli.entry import EXIT_INVALID_INPUT, EXIT_OK, main
from bilayer.designs.design_file import design_to_text, read_design_text
from bilayer.core.errors import DesignFileError, InputError
from bilayer.strip.interface import interface_stresses
from bilayer.strip.assessment import check_temperature, interface_for_design, trust_report_for_design
from bilayer.core.stack import Temperatures
from bilayer.core.units import format_quantity

EXAMPLE = Path(__file__).parents[1] / "bilayer" / "examples" / "sensor_die_on_alumina.toml"

TEXT = """
format_version = 1
name = "bonded strip"

[conditions]
bending_state = "wide"
stress_free_temperature = "120 degC"
operating_temperature = ["-20 degC", "60 degC"]

[[layer]]
material = "copper_c11000"
thickness = "0.8 mm"

[[layer]]
material = "epoxy_adhesive"
thickness = "40 um"
label = "glue"

[[layer]]
material = "silicon_100"
thickness = "0.5 mm"

[interface]
length = "14 mm"
bond_layers = [2]
sample_distances = ["0.1 mm", "0.4 mm"]
refine = false
"""


def _design(text=TEXT):
    return read_design_text(text, "test.toml").design


def test_section_reads_si_values_and_round_trips():
    design = _design()
    values = design.sections["interface"]
    assert values["length"] == pytest.approx(14e-3)
    assert values["bond_layers"] == (2,)
    assert values["sample_distances"] == pytest.approx((1e-4, 4e-4))
    assert values["model"] == "bending" and values["layer_elements"] == 8 and values["refine"] is False
    again = read_design_text(design_to_text(design), "again.toml").design
    assert dict(again.sections["interface"]) == dict(values)


@pytest.mark.parametrize(
    "old, new, key",
    [
        ('length = "14 mm"', 'lenght = "14 mm"', "lenght"),
        ('length = "14 mm"', 'length = "14 kg"', "length"),
        ("bond_layers = [2]", "bond_layers = [1]", "bond_layers"),
        ("bond_layers = [2]", "bond_layers = [2, 2]", "bond_layers"),
        ("refine = false", 'model = "rigid"', "model"),
    ],
)
def test_section_errors_name_the_key(old, new, key):
    with pytest.raises(DesignFileError) as error:
        read_design_text(TEXT.replace(old, new), "test.toml")
    assert key in error.value.field


def test_results_per_operating_temperature_equal_direct_calls():
    """One interface result per operating temperature; file layer numbers are 1-based, core indices 0-based."""
    design = _design()
    results = interface_for_design(design)
    assert len(results) == 2
    for result, T in zip(results, (253.15, 333.15)):
        direct = interface_stresses(design.stack, Temperatures(393.15, T), 14e-3, "wide", bonds=(1,))
        assert result.interfaces[0].max_shear == direct.interfaces[0].max_shear
        np.testing.assert_array_equal(result.interfaces[0].peel, direct.interfaces[0].peel)
    assert check_temperature(design) == pytest.approx(253.15)


def test_bond_layer_outside_the_stack_is_refused():
    design = _design(TEXT.replace("bond_layers = [2]", "bond_layers = [3]"))
    with pytest.raises(InputError, match="inner layer number, 2 to 2"):
        interface_for_design(design)


def test_command_text_shows_core_numbers(capsys, tmp_path):
    design = _design()
    code = main(["interface", str(_write(design, tmp_path))])
    out = capsys.readouterr().out
    assert code == EXIT_OK
    for result in interface_for_design(design):
        assert format_quantity(result.interfaces[0].max_shear, "stress") in out
        assert format_quantity(result.interfaces[0].decay_length, "length") in out
    assert "Cautions:" in out and "nominal" in out


def test_command_json_with_fe_equals_the_trust_report(capsys, tmp_path):
    design = _design()
    code = main(["interface", str(_write(design, tmp_path)), "--fe", "--json"])
    assert code == EXIT_OK
    data = json.loads(capsys.readouterr().out)
    report = trust_report_for_design(design)
    assert data["trust"]["ok"] == report.ok
    assert data["trust"]["rows"][0]["fe"] == pytest.approx(report.rows[0].fe, rel=1e-12)
    assert data["trust"]["fe"]["dofs"] == report.fe.dofs and data["trust"]["refinement"] is None
    assert data["interface"][0]["interfaces"][0]["bond"] == 2
    assert len(data["cautions"]) >= 2


def test_command_options_override_the_file(capsys, tmp_path):
    code = main(["interface", str(_write(_design(), tmp_path)), "--length", "30 mm", "--model", "no_bending", "--json"])
    data = json.loads(capsys.readouterr().out)
    assert code == EXIT_OK
    assert data["interface"][0]["length"] == pytest.approx(30e-3)
    assert data["interface"][0]["model"] == "no_bending"


def test_command_errors_exit_with_invalid_input(capsys, tmp_path):
    no_section = tmp_path / "plain.toml"
    no_section.write_text(TEXT.split("[interface]")[0])
    assert main(["interface", str(no_section)]) == EXIT_INVALID_INPUT
    assert "length" in capsys.readouterr().err
    assert main(["interface", str(no_section), "--length", "10 mm", "--bond", "1"]) == EXIT_INVALID_INPUT
    assert "bond_layers" in capsys.readouterr().err


def test_example_design_runs_with_the_fe_check(capsys):
    code = main(["interface", str(EXAMPLE), "--fe", "--no-refine"])
    out = capsys.readouterr().out
    assert code == EXIT_OK
    assert "Finite-element check" in out and "Trust flags" in out


def _write(design, folder):
    path = folder / "design.toml"
    path.write_text(design_to_text(design))
    return path
