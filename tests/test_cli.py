"""The command line (bilayer.cli): output equals direct core calls, exit codes, one-line errors."""
from __future__ import annotations

import json
import subprocess
import sys
from importlib import resources
from pathlib import Path

import pytest

from bilayer.core.cautions import CAUTIONS
from bilayer.cli.entry import EXIT_CHECK_FAILED, EXIT_INTERNAL_ERROR, EXIT_INVALID_INPUT, EXIT_OK, commands, main
from bilayer.designs.design_file import load_design
from bilayer.core.units import format_quantity

EXAMPLES = {p.name[:-5]: Path(str(p)) for p in (resources.files("bilayer") / "examples").iterdir()
            if p.name.endswith(".toml")}


def run(capsys, *argv):
    code = main(list(argv))
    captured = capsys.readouterr()
    return code, captured.out, captured.err


def test_exit_code_values_are_documented():
    assert (EXIT_OK, EXIT_CHECK_FAILED, EXIT_INVALID_INPUT, EXIT_INTERNAL_ERROR) == (0, 1, 2, 3)
    docs = (Path(__file__).parents[1] / "docs" / "cli.md").read_text()
    for line in ("| 0 |", "| 1 |", "| 2 |", "| 3 |"):
        assert line in docs


def test_subcommands_are_found_as_modules():
    assert {"evaluate", "materials", "example"} <= set(commands())


@pytest.mark.parametrize("name", sorted(EXAMPLES))
def test_evaluate_json_equals_core_result(capsys, name):
    code, out, err = run(capsys, "evaluate", str(EXAMPLES[name]), "--json")
    assert code == 0, err
    data = json.loads(out)
    expected = load_design(EXAMPLES[name]).evaluate().to_dict()
    for key, value in expected.items():
        assert data[key] == value, key
    assert data["cautions"] == list(CAUTIONS)
    assert {"curvature", "radius", "bending_axis", "effective_cte", "layers", "bending_state",
            "stress_free_temperature", "operating_temperature", "warnings"} <= set(data)


def test_evaluate_table_shows_core_numbers(capsys):
    path = EXAMPLES["die_on_copper"]
    design = load_design(path)
    result = design.evaluate()
    code, out, err = run(capsys, "evaluate", str(path))
    assert code == 0, err
    assert format_quantity(result.curvature, "curvature") in out
    assert format_quantity(result.bending_axis, "length") in out
    assert format_quantity(result.effective_cte, "cte") in out
    for i, layer in enumerate(design.stack):
        assert layer.material.name in out
        assert format_quantity(float(result.stress_top[i]), "stress", unit="MPa") in out
    assert "plate" in out and "217 degC" in out and "25 degC" in out
    assert "Cautions:" in out and "IEC 60730-2-9" in out
    for warning in result.warnings:
        assert warning in out


def test_evaluate_us_units(capsys):
    code, out, _ = run(capsys, "evaluate", str(EXAMPLES["thermostat_blade"]), "--units", "us")
    assert code == 0
    assert "68 degF" in out and "mil" in out and "ksi" in out and "ppm/degF" in out


def test_bad_design_file_is_one_line_exit_2(capsys, tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text(EXAMPLES["die_on_copper"].read_text().replace("bending_state", "bendng_state"))
    code, out, err = run(capsys, "evaluate", str(bad))
    assert code == EXIT_INVALID_INPUT
    assert out == ""
    assert err.count("\n") == 1 and err.startswith("bilayer: error:")
    assert "bendng_state" in err and "did you mean 'bending_state'" in err and "Traceback" not in err


@pytest.mark.parametrize("argv", [
    ["evaluate", "/nonexistent/design.toml"],
    ["evaluate"],
    ["evaluate", "x.toml", "--units", "metric"],
    ["no-such-command"],
    [],
    ["materials", "unobtainium"],
    ["example", "no_such_example"],
])
def test_invalid_input_and_usage_exit_2(capsys, argv):
    code, _, err = run(capsys, *argv)
    assert code == EXIT_INVALID_INPUT
    assert "Traceback" not in err and err.strip()


def test_unknown_example_suggests(capsys):
    code, _, err = run(capsys, "example", "die_on_coper")
    assert code == 2 and "did you mean 'die_on_copper'" in err


def test_internal_error_exit_3_without_traceback(capsys, monkeypatch):
    module = commands()["materials"]

    def broken(args):
        raise RuntimeError("simulated bug")

    monkeypatch.setattr(module, "run", broken)
    code, _, err = run(capsys, "materials")
    assert code == EXIT_INTERNAL_ERROR
    assert "internal error" in err and "simulated bug" in err and "Traceback" not in err


def test_materials_lists_values_and_sources(capsys):
    code, out, _ = run(capsys, "materials")
    assert code == 0
    assert "fe36ni" in out and "copper_c11000" in out and "source of" in out and "References:" in out
    code, out, _ = run(capsys, "materials", "solder", "--json")
    rows = json.loads(out)
    assert rows and all("solder" in (r["key"] + r["name"] + r["category"]).lower() for r in rows)
    from bilayer.core.materials import default_library

    for row in rows:
        material = default_library()[row["key"]]
        assert row["youngs_modulus"] == material.youngs_modulus and row["sources"] == dict(material.sources)


def test_example_list_print_and_write(capsys, tmp_path):
    code, out, _ = run(capsys, "example")
    assert code == 0 and set(EXAMPLES) <= {line.split()[0] for line in out.splitlines()}
    code, out, _ = run(capsys, "example", "bonded_window")
    assert code == 0 and out == EXAMPLES["bonded_window"].read_text()
    target = tmp_path / "window.toml"
    assert run(capsys, "example", "bonded_window", "-o", str(target))[0] == 0
    assert load_design(target) == load_design(EXAMPLES["bonded_window"])
    code, _, err = run(capsys, "example", "bonded_window", "-o", str(target))
    assert code == 2 and "--force" in err
    assert run(capsys, "example", "thermostat_blade", "-o", str(target), "--force")[0] == 0
    assert load_design(target) == load_design(EXAMPLES["thermostat_blade"])


def test_help_lists_exit_codes_in_a_subprocess():
    """The installed entry point runs as a module in a fresh interpreter; --help exits 0."""
    done = subprocess.run([sys.executable, "-m", "bilayer", "--help"], capture_output=True, text=True)
    assert done.returncode == 0
    assert "exit codes" in done.stdout and "evaluate" in done.stdout
    done = subprocess.run([sys.executable, "-m", "bilayer", "evaluate", str(EXAMPLES["oxide_on_wafer"]), "--json"],
                          capture_output=True, text=True)
    assert done.returncode == 0 and json.loads(done.stdout)["bending_state"] == "plate"


def test_suspicious_input_is_a_one_line_warning(capsys, tmp_path):
    """A legal but suspicious value (nu > 0.49) still evaluates, with one warning line on stderr."""
    text = EXAMPLES["bonded_window"].read_text().replace("poisson_ratio = 0.38", "poisson_ratio = 0.495")
    path = tmp_path / "soft.toml"
    path.write_text(text)
    code, out, err = run(capsys, "evaluate", str(path), "--json")
    assert code == 0 and json.loads(out)["bending_state"] == "wide"
    lines = [line for line in err.splitlines() if line]
    assert lines and all(line.startswith("bilayer: warning:") for line in lines)
    assert any("poisson_ratio" in line for line in lines)
