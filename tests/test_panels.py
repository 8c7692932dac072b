"""The notebook panels driven from Python, without a kernel or a browser.

Each test sets values the way a user would (typing into a text box, clicking a button) and checks
that what the panel shows equals a direct call of the core on the same design, or a published
formula named beside the check.
"""
from __future__ import annotations

import math

import numpy as np
import pytest

pytest.importorskip("ipywidgets")
pytest.importorskip("matplotlib")

import bilayer as bl  # noqa: E402
from bilayer import plots
from bilayer.plots.canvas import PALETTE
from bilayer.panels import StackExplorer, example_design
from bilayer.panels.stack_editor import CUSTOM
from bilayer.core.units import format_quantity


@pytest.fixture
def explorer():
    return StackExplorer(example_design())


def direct(design):
    """The core call the panels must agree with."""
    return bl.evaluate(design.stack, design.temperatures, design.state)


def assert_table_matches(explorer, result):
    shown = explorer.table.shown
    assert shown["curvature"] == result.curvature
    assert shown["state"] == result.state.value
    assert shown["stress_bottom"] == tuple(float(s) for s in result.stress_bottom)
    assert shown["stress_top"] == tuple(float(s) for s in result.stress_top)
    system = explorer.model.system
    html = explorer.table.html.value
    assert format_quantity(result.curvature, "curvature", system=system, digits=4) in html
    for i in range(result.n_layers):
        assert format_quantity(result.stress_top[i], "stress", system=system, digits=4) in html


def stress_line(explorer):
    """(stress in display units, plotted heights) of the profile line in the stress view."""
    line = explorer.stress.ax._bilayer_artists["line"]
    return np.asarray(line.get_xdata()), np.asarray(line.get_ydata())


# ---------------------------------------------------------------------------------------------
# What the panel shows equals the core


def test_start_design_is_shown_as_the_engine_computes_it(explorer):
    assert_table_matches(explorer, direct(example_design()))


def test_typing_an_operating_temperature_updates_design_table_and_figure(explorer):
    before = explorer.stress.png
    explorer.editor.operating.text.value = "150 degC"
    design = explorer.model.design
    assert design.temperatures.operating == pytest.approx(423.15, abs=1e-9)
    result = direct(design)
    assert_table_matches(explorer, result)
    stress, _ = stress_line(explorer)
    expected = np.column_stack([result.stress_bottom, result.stress_top]).ravel() * 1e-6  # MPa
    np.testing.assert_allclose(stress, expected, rtol=1e-12)
    assert explorer.stress.png != before
    assert explorer.editor.operating_slider.value == pytest.approx(150.0)


def test_the_slider_sets_the_operating_temperature(explorer):
    explorer.editor.operating_slider.value = 60.0
    assert explorer.model.design.temperatures.operating == pytest.approx(333.15)
    assert explorer.editor.operating.text.value == format_quantity(333.15, "temperature", system="si", digits=6)
    assert_table_matches(explorer, direct(explorer.model.design))


def test_thickness_with_units_and_label(explorer):
    row = explorer.editor.rows[0]
    row.thickness.text.value = "10 mil"
    row.label.value = "thin side"
    layer = explorer.model.design.stack[0]
    assert layer.thickness == pytest.approx(10 * 25.4e-6, rel=1e-12)
    assert layer.label == "thin side"
    assert_table_matches(explorer, direct(explorer.model.design))


def test_bending_state_changes_stresses_more_than_curvature(explorer):
    narrow = direct(explorer.model.design)
    explorer.editor.state.value = "plate"
    plate = direct(explorer.model.design)
    assert explorer.model.design.state is bl.BendingState.PLATE
    assert_table_matches(explorer, plate)
    # design.md: the choice changes stresses and forces far more than curvature
    curvature_change = abs(plate.curvature / narrow.curvature - 1)
    stress_change = abs(plate.stress_top[-1] / narrow.stress_top[-1] - 1)
    assert stress_change > curvature_change


def test_custom_material_values(explorer):
    row = explorer.editor.rows[1]
    row.material.value = CUSTOM
    assert row.custom_box.layout.display == ""
    with row.editor.quiet():
        row.custom_name.value = "made-up alloy"
        row.custom_modulus.text.value = "120 GPa"
        row.custom_poisson.text.value = "0.31"
    row.custom_cte.text.value = "17 ppm/K"
    material = explorer.model.design.stack[1].material
    assert (material.name, material.youngs_modulus, material.poisson_ratio) == ("made-up alloy", 120e9, 0.31)
    assert material.alpha == pytest.approx(17e-6, rel=1e-12)
    same = bl.Material("made-up alloy", 120e9, 0.31, 17e-6)
    d = explorer.model.design
    stack = bl.Stack.of(d.stack[0], bl.Layer(same, d.stack[1].thickness, d.stack[1].label))
    result = bl.evaluate(stack, d.temperatures, d.state)
    assert explorer.table.shown["curvature"] == pytest.approx(result.curvature, rel=1e-12)


def test_library_material_choice(explorer):
    explorer.editor.rows[1].material.value = "brass_70_30"
    assert explorer.model.design.stack[1].material == bl.get_material("brass_70_30")
    assert_table_matches(explorer, direct(explorer.model.design))


# ---------------------------------------------------------------------------------------------
# Layers: add, remove, reorder


def test_add_remove_and_reorder_layers(explorer):
    editor = explorer.editor
    editor.add()
    assert explorer.model.design.stack.n_layers == 3
    assert_table_matches(explorer, direct(explorer.model.design))
    editor.remove(editor.rows[2])
    assert explorer.model.design.stack.n_layers == 2
    flat = direct(explorer.model.design)
    editor.move(editor.rows[0], +1)
    flipped = explorer.model.design
    assert flipped.stack.labels == tuple(reversed(example_design().stack.labels))
    # layers.md section 9: reversing the layer order flips the sign of the curvature
    assert explorer.table.shown["curvature"] == pytest.approx(-flat.curvature, rel=1e-12)
    assert editor.rows[0].move_down.disabled and editor.rows[-1].move_up.disabled


def test_the_last_layer_cannot_be_removed(explorer):
    editor = explorer.editor
    editor.remove(editor.rows[1])
    assert editor.rows[0].remove.disabled
    editor.remove(editor.rows[0])
    assert explorer.model.design.stack.n_layers == 1


# ---------------------------------------------------------------------------------------------
# Invalid entries: message in place, last valid design kept, nothing typed lost


@pytest.mark.parametrize(
    "text, words",
    [("-0.2 mm", ["thickness", "-0.0002"]), ("0.2 kg", ["thickness"]), ("abc", ["thickness"]), ("", ["thickness"])],
)
def test_bad_thickness_keeps_last_valid_design(explorer, text, words):
    before = explorer.model.design
    png = explorer.stress.png
    row = explorer.editor.rows[0]
    row.thickness.text.value = text
    assert explorer.model.design is before
    assert explorer.stress.png == png
    assert row.thickness.text.value == text  # nothing typed is lost
    for word in words:
        assert word in row.message.value
    assert "last valid design" in explorer.editor.message.value
    assert explorer.editor.pending_error()
    row.thickness.text.value = "0.3 mm"
    assert explorer.model.design.stack[0].thickness == pytest.approx(0.3e-3)
    assert row.message.value == "" and not explorer.editor.pending_error()


def test_absolute_temperature_below_zero_kelvin_is_refused(explorer):
    before = explorer.model.design
    explorer.editor.stress_free.text.value = "-300 degC"
    assert explorer.model.design is before
    assert "stress_free_temperature" in explorer.editor.temperature_message.value
    assert explorer.editor.stress_free.text.value == "-300 degC"


def test_temperature_difference_is_not_an_absolute_temperature(explorer):
    before = explorer.model.design
    explorer.editor.operating.text.value = "20 delta_degC"
    assert explorer.model.design is before
    assert "operating_temperature" in explorer.editor.temperature_message.value


def test_bad_custom_poisson_ratio(explorer):
    row = explorer.editor.rows[0]
    row.material.value = CUSTOM
    row.custom_poisson.text.value = "0.6"
    assert "poisson" in row.message.value.lower()
    assert row.custom_poisson.text.value == "0.6"


# ---------------------------------------------------------------------------------------------
# Unit systems


def test_unit_switch_rewrites_entries_without_changing_the_design(explorer):
    before = explorer.model.design
    si_text = explorer.editor.rows[0].thickness.text.value
    explorer.units.value = "us"
    assert explorer.model.system == "us"
    assert explorer.model.design == before  # exact SI values kept
    thickness = before.stack[0].thickness
    assert explorer.editor.rows[0].thickness.text.value == format_quantity(thickness, "length", system="us", digits=6)
    assert explorer.editor.rows[0].thickness.text.value.endswith("mil")
    assert explorer.editor.operating.text.value.endswith("degF")
    assert "ksi" in explorer.stress.ax.get_xlabel() or "psi" in explorer.stress.ax.get_xlabel()
    assert_table_matches(explorer, direct(before))
    explorer.units.value = "si"
    assert explorer.editor.rows[0].thickness.text.value == si_text
    assert explorer.model.design == before


def test_unit_switch_leaves_an_invalid_entry_as_typed(explorer):
    row = explorer.editor.rows[0]
    row.thickness.text.value = "0.5 parsecs per"
    explorer.units.value = "us"
    assert row.thickness.text.value == "0.5 parsecs per"


# ---------------------------------------------------------------------------------------------
# Design files


def test_save_and_load_round_trip(explorer, tmp_path):
    path = tmp_path / "strip.toml"
    explorer.files.path.value = str(path)
    explorer.editor.operating.text.value = "77 degC"
    saved = explorer.model.design
    assert explorer.files.save(), explorer.files.message.value
    explorer.editor.operating.text.value = "10 degC"
    explorer.editor.rows[0].thickness.text.value = "0.2 mm"
    assert explorer.files.load(), explorer.files.message.value
    assert explorer.model.design.stack == saved.stack
    assert explorer.model.design.temperatures == saved.temperatures
    assert explorer.model.design.state == saved.state
    assert explorer.editor.rows[0].thickness.value() == saved.stack[0].thickness
    assert_table_matches(explorer, direct(saved))


def test_save_refused_while_an_entry_is_invalid(explorer, tmp_path):
    path = tmp_path / "never.toml"
    explorer.files.path.value = str(path)
    explorer.editor.rows[0].thickness.text.value = "zero"
    assert not explorer.files.save()
    assert not path.exists()
    assert "Not saved" in explorer.files.message.value


def test_loading_a_broken_file_changes_nothing(explorer, tmp_path):
    path = tmp_path / "broken.toml"
    path.write_text("[stack\nthis is not toml")
    explorer.files.path.value = str(path)
    explorer.editor.rows[0].label.value = "typed before loading"
    before = explorer.model.design
    assert not explorer.files.load()
    assert "Not loaded" in explorer.files.message.value
    assert explorer.model.design is before
    assert explorer.editor.rows[0].label.value == "typed before loading"


# ---------------------------------------------------------------------------------------------
# Views against published formulas


EXAMPLE_A = {"E1": 140e9, "nu1": 0.30, "a1": 1.5e-6, "E2": 100e9, "nu2": 0.33, "a2": 19.5e-6, "t": 0.5e-3}


def timoshenko_curvature(E1, E2, t1, t2, dalpha_dT):
    """Timoshenko, J. Opt. Soc. Am. 11:233 (1925): kappa = 6 da dT (1+m)^2 / (h (3(1+m)^2 + (1+mn)(m^2 + 1/(mn))))."""
    m, n, h = t1 / t2, E1 / E2, t1 + t2
    return 6 * dalpha_dT * (1 + m) ** 2 / (h * (3 * (1 + m) ** 2 + (1 + m * n) * (m * m + 1 / (m * n))))


def example_a_design(state="narrow"):
    a = EXAMPLE_A
    low = bl.Material("layer 1 (example)", a["E1"], a["nu1"], a["a1"])
    high = bl.Material("layer 2 (example)", a["E2"], a["nu2"], a["a2"])
    return bl.Design(bl.Stack.of((low, a["t"]), (high, a["t"])), bl.Temperatures(293.15, 393.15), state)


def test_panel_curvature_is_timoshenkos():
    """Timoshenko (1925) bimetal formula; the stack of layers.md 'Example A' (kappa = 2.680851 1/m there)."""
    explorer = StackExplorer(example_a_design())
    a = EXAMPLE_A
    expected = timoshenko_curvature(a["E1"], a["E2"], a["t"], a["t"], (a["a2"] - a["a1"]) * 100.0)
    assert explorer.table.shown["curvature"] == pytest.approx(expected, rel=1e-12)
    assert expected == pytest.approx(2.680851, rel=1e-6)


def test_shape_view_tip_deflection_is_the_exact_arc():
    """Cantilever of arc length L bent to kappa: tip at w = -(1 - cos kappa L)/kappa (circle geometry,
    layers.md section 6: L = 50 mm, kappa = 2.680851 gives 3.346049 mm)."""
    explorer = StackExplorer(example_a_design())
    explorer.show("shape")
    explorer.shape.length.field.text.value = "50 mm"
    kappa = explorer.model.result.curvature
    tip = -(1 - math.cos(kappa * 0.05)) / kappa
    line = explorer.shape.ax._bilayer_artists["top"]
    assert line.get_ydata()[-1] == pytest.approx(tip * 1e3, rel=1e-12)  # mm
    assert tip == pytest.approx(-3.346049e-3, rel=1e-6)
    assert explorer.shape.ax.get_ylabel().endswith("[mm]")


def test_tradeoff_view_marks_the_current_design_and_the_curvature_optimum():
    """Largest curvature at m^2 n = 1, i.e. t1/t2 = sqrt(E2/E1) (Timoshenko 1925; layers.md section 1.5)."""
    explorer = StackExplorer(example_a_design())
    explorer.show("thickness ratio")
    ratios, curvature, peak = explorer.tradeoff.sweep
    best = math.sqrt(EXAMPLE_A["E2"] / EXAMPLE_A["E1"])
    i = int(np.argmax(curvature))
    assert ratios[i - 1] < best < ratios[i + 1]
    marker = explorer.tradeoff.ax.lines[1]
    assert marker.get_xdata()[0] == pytest.approx(1.0)
    assert marker.get_ydata()[0] == pytest.approx(explorer.model.result.curvature, rel=1e-12)
    assert np.all(peak > 0)


def test_interface_view_equals_the_interface_model(explorer):
    from bilayer.strip.interface import interface_stresses

    explorer.show("interface")
    explorer.model.strip_length = 0.02
    d = explorer.model.design
    direct_result = interface_stresses(d.stack, d.temperatures, 0.02, d.state)
    shown = explorer.interface.result
    assert shown.interfaces[0].max_shear == direct_result.interfaces[0].max_shear
    distance = explorer.interface.distance
    _, shear, _ = direct_result.sample(distance, end="right")[0]
    line = explorer.interface.ax.lines[0]
    np.testing.assert_allclose(line.get_ydata(), shear * 1e-6, rtol=1e-12)  # MPa
    assert format_quantity(direct_result.interfaces[0].max_shear, "stress", system="si", digits=4) in \
        explorer.interface.table.value


def test_interface_view_with_a_bond_layer():
    design = bl.Design(
        bl.Stack.of(("silicon_100", 0.5e-3, "die"), ("epoxy_adhesive", 40e-6, "bond"), ("copper_c11000", 1e-3, "base")),
        bl.Temperatures(423.15, 293.15), "narrow")
    explorer = StackExplorer(design)
    explorer.show("interface")
    explorer.interface.bonds.value = (1,)
    assert explorer.model.bonds == (1,)
    assert len(explorer.interface.result.interfaces) == 1
    assert explorer.interface.result.interfaces[0].parameters.bond == 1


def test_hidden_views_redraw_only_when_shown(explorer):
    png = explorer.shape.png
    explorer.editor.operating.text.value = "140 degC"
    assert explorer.shape.png == png  # its tab is closed
    explorer.show("shape")
    assert explorer.shape.png != png


# ---------------------------------------------------------------------------------------------
# Plots: colours and units


def test_each_material_keeps_its_colour_in_every_view():
    result = direct(example_a_design())
    stress_figure = plots.stress_through_thickness(result)
    shape_figure = plots.deflected_shape(result, 0.05)
    colours = plots.material_colours(result.materials)
    spans = stress_figure.axes[0]._bilayer_artists["spans"]
    from matplotlib.colors import to_hex

    assert [to_hex(s.get_facecolor(), keep_alpha=False) for s in spans] == [colours[m].lower() for m in result.materials]
    lines = shape_figure.axes[0]._bilayer_artists
    assert to_hex(lines["bottom"].get_color()) == colours[result.materials[0]].lower()
    assert to_hex(lines["top"].get_color()) == colours[result.materials[-1]].lower()


def test_material_colours_are_distinct_within_a_stack():
    names = [f"material {i}" for i in range(len(PALETTE))]
    assert len(set(plots.material_colours(names).values())) == len(names)


@pytest.mark.parametrize("system", ["si", "us"])
def test_every_axis_has_a_unit(system):
    result = direct(example_a_design())
    figures = [
        plots.stress_through_thickness(result, system),
        plots.deflected_shape(result, 0.05, system=system),
        plots.interface_stresses(np.linspace(0, 1e-3, 5), {"1-2": np.ones(5)}, {"1-2": np.ones(5)}, system),
    ]
    for figure in figures:
        ax = figure.axes[0]
        assert ax.get_xlabel().endswith("]") and ax.get_ylabel().endswith("]")
    tradeoff = plots.thickness_ratio_tradeoff(np.array([0.5, 1, 2]), np.ones(3), np.ones(3) * 1e6, 1.0, 1.0, 1e6, system)
    assert all(a.get_ylabel().endswith("]") for a in tradeoff.axes)


def test_thin_films_get_a_readable_height_axis():
    film = bl.Design(bl.Stack.of(("silicon_100", 725e-6), ("si3n4_lpcvd", 1e-6)), bl.Temperatures(1073.15, 293.15), "plate")
    figure = plots.stress_through_thickness(direct(film))
    ax = figure.axes[0]
    spans = ax._bilayer_artists["spans"]
    assert spans[1].get_height() >= 0.05 * ax.get_ylim()[1]  # the 1 um film is visible
    assert "not to scale" in ax.get_ylabel()
    assert [t.get_text() for t in ax.get_yticklabels()][-1] == f"{726e-6 * 1e3:.4g}"  # true height at the top


def test_sign_convention_sketch_is_drawn(explorer):
    assert explorer.sketch.image.value[:4] == b"\x89PNG"
    texts = " ".join(t.get_text() for t in explorer.sketch.image.figure.axes[0].texts)
    assert "κ > 0" in texts and "tension" in texts and "ΔT" in texts


def test_several_operating_temperatures_and_the_case_selector(explorer):
    editor = explorer.editor
    editor.operating.text.value = "-40 degC, 25 degC, 125 degC"
    design = explorer.model.design
    np.testing.assert_allclose(design.temperatures.operating, [233.15, 298.15, 398.15])
    assert editor.case.layout.display == "" and editor.operating_slider.disabled
    editor.case.value = 2
    single = bl.evaluate(design.stack, bl.Temperatures(design.temperatures.stress_free, 398.15), design.state)
    assert_table_matches(explorer, single)
    stress, _ = stress_line(explorer)
    np.testing.assert_allclose(stress, np.column_stack([single.stress_bottom, single.stress_top]).ravel() * 1e-6,
                               rtol=1e-12)
    explorer.show("interface")
    assert explorer.interface.result.temperature_change == pytest.approx(398.15 - 293.15)
    editor.operating.text.value = "60 degC"
    assert explorer.model.case_index is None and not editor.operating_slider.disabled


def test_save_never_overwrites_a_reviewed_record(explorer, tmp_path):
    path = tmp_path / "reviewed.record.toml"
    text = '[record]\nformat = 1\n\n[[review]]\nreviewer = "someone"\n'
    path.write_text(text)
    explorer.files.path.value = str(path)
    assert not explorer.files.save()
    assert "review panel" in explorer.files.message.value
    assert path.read_text() == text
