"""Bad input, generated: malformed or out-of-range design files and API calls.

Every case must end in a project error (bilayer.core.errors.BilayerError) or a SuspiciousInputWarning,
never in another exception; and when a changed file is accepted, the value that was read must be
the value the text means (checked against bilayer.core.units.parse on its own), so a slip cannot turn
into a silently different design. About 1600 generated cases in all (see max_examples).
"""
from __future__ import annotations

import math
import warnings

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from bilayer import Design, Layer, Stack, Temperatures
from bilayer.designs.design_file import read_design_text
from bilayer.core.errors import BilayerError, SuspiciousInputWarning
from bilayer.core.materials import Material
from bilayer.core.units import KINDS, parse

BASE = """\
format_version = 1
name = "Generated case"

[conditions]
bending_state = "wide"
stress_free_temperature = "150 degC"
operating_temperature = ["25 degC", "-40 degC"]
axial_force = "2 N/mm"
bending_moment = "0.1 N*m/m"

[[layer]]
material = "copper_c11000"
thickness = "1 mm"
label = "base"

[[layer]]
material = "custom_film"
thickness = "25 um"

[materials.custom_film]
name = "Custom film"
youngs_modulus = "90 GPa"
poisson_ratio = 0.25
cte = "3 ppm/K"
density = "2.3 g/cm^3"
"""

# key path -> unit kind of the value found there, for checking accepted values independently
QUANTITIES = {
    ("conditions", "stress_free_temperature"): "temperature",
    ("conditions", "axial_force"): "force_per_width",
    ("conditions", "bending_moment"): "moment_per_width",
    ("layer", 0, "thickness"): "length",
    ("layer", 1, "thickness"): "length",
    ("materials", "custom_film", "youngs_modulus"): "modulus",
    ("materials", "custom_film", "poisson_ratio"): "dimensionless",
    ("materials", "custom_film", "cte"): "cte",
    ("materials", "custom_film", "density"): "density",
}
TEXT_KEYS = [("name",), ("conditions", "bending_state"), ("layer", 0, "material"), ("layer", 1, "material"),
             ("layer", 0, "label"), ("materials", "custom_film", "name")]
ALL_PATHS = [*QUANTITIES, *TEXT_KEYS, ("format_version",), ("conditions", "operating_temperature")]


def _document():
    import tomllib

    return tomllib.loads(BASE)


def _get(document, path):
    for part in path:
        document = document[part]
    return document


def _set(document, path, value):
    for part in path[:-1]:
        document = document[part]
    document[path[-1]] = value


def _delete(document, path):
    for part in path[:-1]:
        document = document[part]
    del document[path[-1]]


def _dumps(document) -> str:
    """Mutated documents are written by an independent TOML writer (tomli-w), not by bilayer's own."""
    import tomli_w

    return tomli_w.dumps(document)


def _read_value(design, path):
    """The value the loaded design holds for a quantity path (SI)."""
    if path[0] == "conditions":
        return {"stress_free_temperature": design.temperatures.stress_free, "axial_force": design.axial_force,
                "bending_moment": design.bending_moment}[path[1]]
    if path[0] == "layer":
        return design.stack[path[1]].thickness
    material = design.stack[1].material
    return {"youngs_modulus": material.youngs_modulus, "poisson_ratio": material.poisson_ratio,
            "cte": material.alpha, "density": material.density}[path[2]]


junk_numbers = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-10**30, max_value=10**30),
    st.sampled_from([0, -1, 1e-320, 1e308, -0.0, 0.5, 1e12, 2e12]),
)
unit_words = ["mm", "um", "mil", "in", "m", "GPa", "MPa", "psi", "ksi", "Msi", "ppm/K", "ppm/degF", "1/degC", "degC",
              "degF", "K", "delta_degC", "N/mm", "N*m/m", "lbf/in", "g/cm^3", "kg/m^3", "s", "1/s", "", "furlong",
              "mmm", "GPaa", "ppm", "%", "dimensionless", "m^2", "N", "J"]
junk_texts = st.one_of(
    st.builds(lambda x, u: f"{x} {u}", junk_numbers, st.sampled_from(unit_words)),
    st.text(max_size=30),
    st.sampled_from(["", " ", "nan mm", "inf GPa", "1e999 mm", "10**10**10 m", "__import__('os') m", "1 (",
                     "0.5 mm mm", "-", "1/0 mm", "0/0 mm", "1e-999 mm", "narrow", "NARROW", "fe36ni", "plate "]),
)
junk_values = st.one_of(junk_numbers, junk_texts, st.booleans(), st.lists(junk_numbers, max_size=3),
                        st.dictionaries(st.text(max_size=5), junk_numbers, max_size=2))


def _outcome(text: str):
    """Read ``text``; return the design or None if a project error was raised. Anything else fails."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", SuspiciousInputWarning)
        try:
            return read_design_text(text, "generated.toml")
        except BilayerError as error:
            message = str(error)
            assert message.startswith("generated.toml"), message
            return None


@settings(max_examples=600, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(path=st.sampled_from(ALL_PATHS), value=junk_values)
def test_changed_value_gives_project_error_or_the_meant_value(path, value):
    document = _document()
    _set(document, path, value)
    try:
        text = _dumps(document)
    except (TypeError, ValueError):  # not representable in TOML at all (e.g. a huge integer)
        return
    result = _outcome(text)
    if result is None or path not in QUANTITIES:
        return
    kind = QUANTITIES[path]
    meant = parse(value, kind, "check")  # an accepted value must be what the text means
    assert _read_value(result.design, path) == pytest.approx(meant, rel=1e-12, abs=0.0)


OPTIONAL = {("name",), ("format_version",), ("layer", 0, "label"), ("conditions", "axial_force"),
            ("conditions", "bending_moment"), ("materials", "custom_film", "density")}


def _known_keys(table_path) -> set[str]:
    from bilayer.designs.design_file import _TOP_KEYS
    from bilayer.designs.sections import sections

    if not table_path:
        return {*_TOP_KEYS, *sections()}
    name = "materials" if table_path[0] == "materials" else table_path[0]
    return set(sections()[name].keys)


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(path=st.sampled_from(ALL_PATHS), new_key=st.none() | st.text(min_size=1, max_size=12))
def test_renamed_or_deleted_key_gives_project_error(path, new_key):
    """A deleted key is accepted only if optional; a renamed one only if the new name is a known key."""
    document = _document()
    value = _get(document, path)
    parent = _get(document, path[:-1]) if len(path) > 1 else document
    if new_key is not None and (new_key == path[-1] or new_key in parent):
        return
    _delete(document, path)
    if new_key is not None:
        _set(document, (*path[:-1], new_key), value)
    if _outcome(_dumps(document)) is not None:
        assert path in OPTIONAL, path
        assert new_key is None or new_key in _known_keys(path[:-1]), new_key


def test_every_truncation_is_refused_or_harmless():
    """Cutting the file anywhere inside a line gives a DesignFileError with a line number, or the cut
    only removed whitespace; cuts at line ends may drop whole lines (legal TOML) and are checked by
    the comparison with the design read from those complete lines."""
    full = _outcome(BASE).design
    for cut in range(len(BASE)):
        prefix = BASE[:cut]
        line_start = prefix.rfind("\n") + 1
        rest_of_line = BASE[cut:BASE.find("\n", cut)] if "\n" in BASE[cut:] else BASE[cut:]
        result = _outcome(prefix)
        if result is None:
            continue
        if not rest_of_line.strip() or not prefix[line_start:].strip():
            continue  # cut at a line boundary: the shorter file means what it says
        pytest.fail(f"truncation at {cut} accepted: ...{prefix[-30:]!r}")
    assert full.stack.n_layers == 2


@settings(max_examples=300, deadline=None)
@given(text=st.text(max_size=200))
def test_random_text_is_refused_cleanly(text):
    _outcome(text)


@settings(max_examples=200, deadline=None)
@given(value=st.one_of(junk_values, st.none(), st.tuples(st.floats())), kind=st.sampled_from(sorted(KINDS)))
def test_parse_api_raises_only_project_errors(value, kind):
    try:
        result = parse(value, kind, "field")
    except BilayerError as error:
        assert "field" in str(error)
        return
    assert isinstance(result, float) and math.isfinite(result)


@settings(max_examples=200, deadline=None)
@given(thickness=junk_values, stress_free=junk_values, operating=junk_values, state=junk_values,
       modulus=junk_values, poisson=junk_values, cte=junk_values)
def test_core_constructors_raise_only_project_errors(thickness, stress_free, operating, state, modulus, poisson, cte):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", SuspiciousInputWarning)
        try:
            material = Material("generated", modulus, poisson, cte)
            design = Design(Stack.of(Layer(material, thickness), ("copper_c11000", 1e-3)),
                            Temperatures(stress_free, operating), state)
        except BilayerError:
            return
    # accepted: the values must be the ones given, and within their documented ranges
    assert design.stack[0].thickness == float(thickness) and 0 < design.stack[0].thickness <= 1.0
    assert material.youngs_modulus == float(modulus) and -1 < material.poisson_ratio < 0.5
    assert 0 < design.temperatures.stress_free < 5000
