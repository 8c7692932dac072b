"""Design files (bilayer.designs.design_file): exact round trips, atomic saves, located errors.

These are format and robustness tests; the physics behind the numbers is tested elsewhere. The
results-snapshot test compares the stored values with a fresh engine call (a regression snapshot,
not a validation).
"""
from __future__ import annotations

import math
import os
import warnings
from importlib import resources
from pathlib import Path

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from bilayer import Design, Stack, Temperatures
from bilayer.designs.design_file import FORMAT_VERSION, design_to_text, load_design, read_design, read_design_text, save_design
from bilayer.core.errors import DesignFileError, InputError, SuspiciousInputWarning
from bilayer.core.materials import ConstantCTE, InstantaneousCTETable, Material, MeanCTETable, default_library
from bilayer.core.section_spec import Field, SectionSpec
from bilayer.designs.sections import register, sections

EXAMPLES = sorted((resources.files("bilayer") / "examples").iterdir(), key=lambda p: p.name)
EXAMPLES = [p for p in EXAMPLES if p.name.endswith(".toml")]

BASE = """\
format_version = 1
name = "Test strip"

[conditions]
bending_state = "narrow"
stress_free_temperature = "20 degC"
operating_temperature = "120 degC"

[[layer]]
material = "fe36ni"
thickness = "0.5 mm"

[[layer]]
material = "alloy_a"
thickness = "0.5 mm"
label = "active"

[materials.alloy_a]
name = "Alloy A"
youngs_modulus = "170 GPa"
poisson_ratio = 0.3
cte = "27 ppm/K"
"""


def test_base_text_reads_as_written():
    design = read_design_text(BASE).design
    assert design.name == "Test strip"
    assert design.state.value == "narrow"
    assert design.temperatures == Temperatures(293.15, 393.15)
    assert [layer.thickness for layer in design.stack] == [0.0005, 0.0005]
    assert design.stack[0].material is default_library()["fe36ni"]
    custom = design.stack[1].material
    assert (custom.key, custom.name, custom.youngs_modulus, custom.poisson_ratio, custom.alpha) == (
        "alloy_a", "Alloy A", 170e9, 0.3, 27e-6)
    assert design.stack[1].label == "active"


@pytest.mark.parametrize("path", EXAMPLES, ids=lambda p: p.name)
@pytest.mark.parametrize("system", ["si", "us"])
def test_examples_round_trip_exactly(path, system, tmp_path):
    design = load_design(Path(str(path)))
    target = tmp_path / "copy.toml"
    save_design(design, target, system=system)
    assert load_design(target) == design
    with_results = tmp_path / "with_results.toml"
    save_design(design, with_results, results=design.evaluate(), system=system)
    assert load_design(with_results) == design


def test_saved_text_is_readable():
    design = read_design_text(BASE).design
    text = design_to_text(design)
    assert 'thickness = "0.5 mm"' in text
    assert 'stress_free_temperature = "20 degC"' in text
    assert 'youngs_modulus = "170 GPa"' in text
    assert "[[layer]]" in text and f"format_version = {FORMAT_VERSION}" in text
    us = design_to_text(design, system="us")
    assert 'stress_free_temperature = "68 degF"' in us
    assert 'operating_temperature = "248 degF"' in us


def test_value_that_has_no_short_text_falls_back_to_si_repr():
    """A thickness of 0.1 + 0.2 mm (binary round-off) is written so it reads back to the same float."""
    design = read_design_text(BASE).design
    odd = (0.1 + 0.2) * 1e-3
    changed = design.replace(stack=design.stack.with_thickness(0, odd))
    again = read_design_text(design_to_text(changed)).design
    assert again.stack[0].thickness == odd
    assert again == changed


def test_results_snapshot_round_trip():
    """The stored snapshot equals StackResult.to_dict() (a regression snapshot, SI values)."""
    design = read_design_text(BASE.replace('"120 degC"', '["20 degC", "120 degC"]')).design
    result = design.evaluate()
    document = read_design_text(design_to_text(design, results=result))
    expected = result.to_dict()
    expected.pop("units")
    stored = dict(document.results)
    for key, value in expected.items():
        assert stored.get(key) == value, key
    assert read_design_text(BASE).results is None


def test_results_snapshot_keys_match_the_engine():
    """The [results] section knows exactly the keys of StackResult.to_dict() (besides 'units')."""
    design = read_design_text(BASE).design
    keys = set(design.evaluate().to_dict()) - {"units"}
    assert keys == set(sections()["results"].keys)


def test_design_file_atomic_save_keeps_old_file_when_writing_fails(tmp_path, monkeypatch):
    design = read_design_text(BASE).design
    target = tmp_path / "design.toml"
    target.write_text("old contents\n")
    os.chmod(target, 0o640)

    def broken_fsync(fd):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "fsync", broken_fsync)
    with pytest.raises(OSError):
        save_design(design, target)
    assert target.read_text() == "old contents\n"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["design.toml"]  # no temporary file left

    monkeypatch.undo()

    def broken_replace(source, destination):
        raise OSError(13, "Permission denied")

    monkeypatch.setattr(os, "replace", broken_replace)
    with pytest.raises(OSError):
        save_design(design, target)
    assert target.read_text() == "old contents\n"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["design.toml"]
    monkeypatch.undo()

    save_design(design, target)
    assert load_design(target) == design
    assert (target.stat().st_mode & 0o777) == 0o640  # the replaced file keeps its mode


def test_invalid_design_never_touches_the_file(tmp_path):
    target = tmp_path / "design.toml"
    target.write_text("old")
    with pytest.raises(InputError):
        save_design("not a design", target)
    with pytest.raises(InputError):
        save_design(read_design_text(BASE).design, target, system="metric")
    assert target.read_text() == "old"


MALFORMED = [
    # (description, text, words that must appear in the message)
    ("misspelt key", BASE.replace("bending_state", "bendng_state"), ["bendng_state", "[conditions]", "bending_state", "line 5"]),
    ("misspelt table", BASE.replace("[conditions]", "[condition]"), ["condition", "did you mean 'conditions'", "line 4"]),
    ("misspelt layer key", BASE.replace('thickness = "0.5 mm"\n\n[[layer]]', 'thicknes = "0.5 mm"\n\n[[layer]]'),
     ["thicknes", "[[layer]] 1", "did you mean 'thickness'"]),
    ("misspelt material key", BASE.replace("poisson_ratio", "poisson"), ["poisson", "[materials.alloy_a]", "poisson_ratio"]),
    ("unknown state", BASE.replace('"narrow"', '"narow"'), ["bending_state", "narow", "did you mean 'narrow'"]),
    ("unknown material", BASE.replace('"fe36ni"', '"fe63ni"'), ["material", "fe63ni", "[[layer]] 1"]),
    ("wrong dimension", BASE.replace('thickness = "0.5 mm"\n\n[[layer]]', 'thickness = "0.5 MPa"\n\n[[layer]]'),
     ["thickness", "0.5 MPa", "a length"]),
    ("absolute as difference", BASE.replace('operating_temperature = "120 degC"', 'temperature_change = "100 degC"'),
     ["temperature_change", "100 delta_degC"]),
    ("both temperatures", BASE.replace('operating_temperature = "120 degC"',
                                       'operating_temperature = "120 degC"\ntemperature_change = "100 K"'),
     ["operating_temperature", "temperature_change"]),
    ("no operating temperature", BASE.replace('operating_temperature = "120 degC"\n', ""), ["operating_temperature"]),
    ("negative thickness", BASE.replace('"0.5 mm"', '"-0.5 mm"', 1), ["thickness", "-0.5 mm", "[[layer]] 1"]),
    ("zero thickness", BASE.replace('"0.5 mm"', "0", 1), ["thickness", "[[layer]] 1"]),
    ("boolean thickness", BASE.replace('"0.5 mm"', "true", 1), ["thickness", "True"]),
    ("list thickness", BASE.replace('"0.5 mm"', '["0.5 mm"]', 1), ["thickness"]),
    ("nan thickness", BASE.replace('"0.5 mm"', "nan", 1), ["thickness", "finite"]),
    ("inf temperature", BASE.replace('"120 degC"', "inf"), ["operating_temperature", "finite"]),
    ("below absolute zero", BASE.replace('"20 degC"', '"-300 degC"'), ["stress_free_temperature", "0 K"]),
    ("poisson out of range", BASE.replace("poisson_ratio = 0.3", "poisson_ratio = 0.6"),
     ["poisson_ratio", "0.6", "[materials.alloy_a]"]),
    ("cte too large", BASE.replace('"27 ppm/K"', '"2 1/K"'), ["cte", "[materials.alloy_a]"]),
    ("missing material name", BASE.replace('name = "Alloy A"\n', ""), ["name", "[materials.alloy_a]", "required"]),
    ("material table not a table", BASE + "\n[materials]\nalloy_b = 3\n", ["[materials.alloy_b]", "a table", "line 25"]),
    ("single-bracket layer", BASE.replace("[[layer]]", "[layer]", 1).replace("[[layer]]", "[layer2]"),
     ["layer2"]),
    ("layer as key", BASE.split("[[layer]]")[0] + 'layer = "fe36ni"\n', ["layer", "[[layer]]"]),
    ("no layers", BASE.split("[[layer]]")[0], ["[[layer]]", "missing"]),
    ("no conditions", BASE.replace("[conditions]", "[junk]"), ["junk"]),
    ("newer format", BASE.replace("format_version = 1", "format_version = 99"), ["format_version", "99", "newer"]),
    ("format as text", BASE.replace("format_version = 1", 'format_version = "1"'), ["format_version"]),
    ("name not text", BASE.replace('name = "Test strip"', "name = 3"), ["name", "text"]),
    ("malformed TOML", BASE.replace("[[layer]]", "[[layer]", 1), ["valid TOML", "line 9"]),
    ("truncated string", BASE[: BASE.index('"0.5 mm"') + 4], ["valid TOML", "line 11"]),
    ("duplicate key", BASE.replace('name = "Test strip"', 'name = "a"\nname = "b"'), ["valid TOML", "line 3"]),
    ("cte table typo", BASE.replace('cte = "27 ppm/K"', 'cte = { kind = "constant", valeu = 27e-6 }'),
     ["valeu", "did you mean 'value'", "[materials.alloy_a.cte]"]),
    ("cte kind typo", BASE.replace('cte = "27 ppm/K"', 'cte = { kind = "constnt", value = 27e-6 }'),
     ["kind", "constnt", "did you mean 'constant'"]),
    ("results typo", BASE + "\n[results]\ncurvatur = 1.0\n", ["curvatur", "[results]", "did you mean 'curvature'"]),
    ("results text for number", BASE + '\n[results]\ncurvature = "1 1/m"\n', ["curvature", "SI number"]),
    ("job section typo", BASE + '\n[thermostatt]\nform = "cantilever"\n', ["thermostatt", "did you mean 'thermostat'"]),
    ("unreadable unit", BASE.replace('"170 GPa"', '"170 GPaa"'), ["youngs_modulus", "170 GPaa"]),
    ("eval attempt", BASE.replace('"0.5 mm"', '"__import__(\'os\').getcwd() m"', 1), ["thickness"]),
]


@pytest.mark.parametrize("text, words", [(c[1], c[2]) for c in MALFORMED], ids=[c[0] for c in MALFORMED])
def test_malformed_files_name_key_and_place(text, words):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", SuspiciousInputWarning)
        with pytest.raises(DesignFileError) as info:
            read_design_text(text, "case.toml")
    message = str(info.value)
    assert message.startswith("case.toml")
    for word in words:
        assert word in message, (word, message)


def test_design_file_errors_are_value_errors():
    """DesignFileError subclasses InputError and ValueError, so generic callers can catch it."""
    with pytest.raises(ValueError):
        read_design_text(BASE.replace("bending_state", "bendng_state"))


def test_missing_and_undecodable_files(tmp_path):
    with pytest.raises(DesignFileError, match="readable"):
        load_design(tmp_path / "nowhere.toml")
    binary = tmp_path / "binary.toml"
    binary.write_bytes(b"name = \"\xff\xfe\"\n")
    with pytest.raises(DesignFileError, match="UTF-8"):
        load_design(binary)


def test_unused_custom_material_warns():
    text = BASE + '\n[materials.spare]\nname = "Spare"\nyoungs_modulus = 1e11\npoisson_ratio = 0.3\ncte = 1e-5\n'
    with pytest.warns(SuspiciousInputWarning, match="spare"):
        read_design_text(text)


def test_temperature_change_gives_operating_temperatures():
    text = BASE.replace('operating_temperature = "120 degC"', 'temperature_change = ["-180 delta_degF", "100 K"]')
    design = read_design_text(text).design
    assert np.array_equal(design.temperatures.operating, [293.15 - 100.0, 293.15 + 100.0])


def test_custom_material_with_tables_round_trips():
    """CTE tables (mean from a reference, instantaneous) and optional fields survive a round trip."""
    mean = Material("Mean-table alloy", 150e9, 0.3, MeanCTETable(293.15, (373.15, 573.15), (16.9e-6, 17.9e-6)),
                    density=8000.0, strength=300e6, strength_kind="yield", glass_transition=None, category="test",
                    key="mean_alloy", sources={"cte": "invented for this test"}, notes="demo")
    tangent = Material("Tangent-table film", 90e9, 0.25,
                       InstantaneousCTETable((250.0, 400.0, 600.0), (2e-6, 3e-6, 3.5e-6)), key="")
    # the material-file format gives a constant CTE the material's temperature range as its valid range
    constant = Material("Constant with range", 70e9, 0.33,
                        ConstantCTE(23e-6, valid_range=(200.0, 500.0), reference_range=(293.15, 373.15)),
                        temperature_range=(200.0, 500.0), key="with range")
    stack = Stack.of((mean, 1e-3), (tangent, 2e-6, "film"), (constant, 0.3e-3), (mean, 1e-4))
    design = Design(stack, Temperatures(450.0, [300.0, 350.0]), "plate", axial_force=12.5, bending_moment=-0.25,
                    name="tables", notes="line 1\nline 2 'quoted' \"double\"")
    for system in ("si", "us"):
        assert read_design_text(design_to_text(design, system=system)).design == design


def test_job_sections_round_trip_through_their_spec():
    spec = register(SectionSpec("probe_job_for_tests", (
        Field("span", "length", required=True, low=0.0),
        Field("limit", "stress"),
        Field("mode", "choice", default="fast", choices=("fast", "slow")),
        Field("points", "integer", default=11),
        Field("temperatures", "temperature", shape="list"),
    )))
    text = BASE + '\n[probe_job_for_tests]\nspan = "30 mm"\ntemperatures = ["20 degC", "150 degF"]\n'
    design = read_design_text(text).design
    values = dict(design.sections["probe_job_for_tests"])
    assert values == {"span": 0.03, "mode": "fast", "points": 11,
                      "temperatures": (293.15, (150 + 459.67) / 1.8)}
    assert read_design_text(design_to_text(design)).design == design
    with pytest.raises(DesignFileError, match="spam.*did you mean 'span'"):
        read_design_text(BASE + '\n[probe_job_for_tests]\nspam = "30 mm"\n')
    with pytest.raises(DesignFileError, match="span.*required"):
        read_design_text(BASE + '\n[probe_job_for_tests]\nlimit = "30 MPa"\n')
    with pytest.raises(InputError, match="did you mean 'span'"):
        design_to_text(design.with_section("probe_job_for_tests", {"spam": 1.0}))
    assert spec.normalise({"span": 0.01}) == {"span": 0.01, "mode": "fast", "points": 11}


# --- hypothesis: generated designs round-trip exactly ------------------------------------------------

LIBRARY_KEYS = sorted(default_library())
positive = st.floats(min_value=1e-9, max_value=1.0, allow_nan=False, exclude_min=True)
kelvin = st.floats(min_value=1.0, max_value=4999.0, allow_nan=False)
loads = st.floats(min_value=-1e6, max_value=1e6, allow_nan=False)
texts = st.text(st.characters(blacklist_categories=("Cs",)), max_size=40)


@st.composite
def custom_materials(draw):
    low = draw(st.floats(min_value=1.0, max_value=2000.0))
    has_range = draw(st.booleans())
    return Material(
        name=draw(st.text(st.characters(blacklist_categories=("Cs", "Cc")), min_size=1, max_size=20).filter(str.strip)),
        youngs_modulus=draw(st.floats(min_value=1e3, max_value=1.25e12)),
        poisson_ratio=draw(st.floats(min_value=-0.99, max_value=0.499)),
        cte=draw(st.floats(min_value=-9.9e-4, max_value=9.9e-4)),
        density=draw(st.none() | st.floats(min_value=1.0, max_value=23000.0)),
        strength=draw(st.none() | st.floats(min_value=1.0, max_value=1e10)),
        temperature_range=(low, low + draw(st.floats(min_value=1.0, max_value=2000.0))) if has_range else None,
        solidus=draw(st.none() | kelvin),
        key=draw(st.sampled_from(["", "mat", "my-alloy", "x y", "fe36ni"])),
        notes=draw(texts),
    )


@st.composite
def designs(draw):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        materials = draw(st.lists(custom_materials(), max_size=3))
        choices = [default_library()[k] for k in draw(st.lists(st.sampled_from(LIBRARY_KEYS), min_size=1, max_size=3))]
        pool = materials + choices
        layers = draw(st.lists(st.tuples(st.sampled_from(pool), positive, texts), min_size=1, max_size=5))
        operating = draw(kelvin | st.lists(kelvin, min_size=1, max_size=4))
        return Design(
            Stack.of(*layers),
            Temperatures(draw(kelvin), operating),
            draw(st.sampled_from(["narrow", "wide", "plate"])),
            axial_force=draw(loads),
            bending_moment=draw(loads),
            name=draw(texts),
            notes=draw(texts),
        )


@settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(design=designs(), system=st.sampled_from(["si", "us"]))
def test_generated_designs_round_trip_exactly(design, system):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        again = read_design_text(design_to_text(design, system=system)).design
    assert again == design
    for old, new in zip(design.stack, again.stack):
        assert new.thickness == old.thickness and new.material.youngs_modulus == old.material.youngs_modulus


@settings(max_examples=100, deadline=None)
@given(value=st.floats(allow_nan=False, allow_infinity=False, min_value=-1e300, max_value=1e300),
       kind=st.sampled_from(["length", "modulus", "stress", "cte", "force_per_width", "moment_per_width",
                             "temperature_difference", "density", "curvature", "time", "frequency"]),
       system=st.sampled_from(["si", "us"]))
def test_exact_text_reads_back_identically(value, kind, system):
    from bilayer.core.section_spec import exact_text
    from bilayer.core.units import parse

    text = exact_text(value, kind, system)
    assert parse(text, kind) == value
    assert math.copysign(1.0, parse(text, kind)) == math.copysign(1.0, value) or value == 0.0


def test_read_design_from_path_and_text_agree(tmp_path):
    path = tmp_path / "d.toml"
    path.write_text(BASE)
    from_path = read_design(path)
    assert from_path.design == read_design_text(BASE).design
    assert from_path.source == str(path)
    assert load_design(str(path)) == from_path.design
    assert load_design(BASE) == from_path.design
