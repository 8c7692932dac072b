"""Legal but suspicious inputs that are probably unit slips give warnings, not errors (issue 2, item 10)."""
import warnings

import pytest

import bilayer as bl
from bilayer.designs.design_file import read_design_text
from bilayer.core.errors import SuspiciousInputWarning
from bilayer.core.materials import Material
from bilayer.core.materials.library import warn_if_unit_slip


def test_per_degf_cte_typed_as_per_kelvin_warns():
    """Common practice: steel expands about 6.5e-6 per degF = 11.7e-6 per K (ASME BPVC II-D TE-1 gives
    6.5e-6/degF mean from 70 to 100 degF). Typing the per-degF number as per-K is a factor 1.8 slip."""
    with pytest.warns(SuspiciousInputWarning, match="per-degF value typed as per-K"):
        warn_if_unit_slip(Material("steel_plain_carbon", 200e9, 0.29, 6.5e-6))
    with pytest.warns(SuspiciousInputWarning, match="per-K value typed as per-degF"):
        warn_if_unit_slip(Material("steel_plain_carbon", 200e9, 0.29, 11.7e-6 * 1.8))


def test_plausible_values_and_unknown_names_do_not_warn():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        warn_if_unit_slip(Material("steel_plain_carbon", 200e9, 0.29, 12.0e-6))  # within scatter
        warn_if_unit_slip(Material("my own alloy", 200e9, 0.29, 6.5e-6))  # nothing to compare with


def test_modulus_in_psi_typed_as_pascal_warns():
    """Steel: 29e6 psi = 200 GPa (common practice); 29e6 'Pa' for a metal is almost surely psi."""
    with pytest.warns(SuspiciousInputWarning, match="psi"):
        Material("steel typed in psi", 29e6, 0.29, 11.7e-6)


def test_design_file_custom_material_is_checked_for_the_slip():
    text = """
format_version = 1
name = "slip check"

[conditions]
bending_state = "narrow"
stress_free_temperature = "20 degC"
operating_temperature = "120 degC"

[materials.brass_70_30]
name = "Brass 70/30"
youngs_modulus = "110 GPa"
poisson_ratio = 0.33
cte = "11.06 ppm/K"

[[layer]]
material = "brass_70_30"
thickness = "0.5 mm"

[[layer]]
material = "fe36ni"
thickness = "0.5 mm"
"""
    with pytest.warns(SuspiciousInputWarning, match="per-degF value typed as per-K"):
        design = read_design_text(text).design
    assert design.stack[0].material.alpha == pytest.approx(11.06e-6)
    assert isinstance(design.evaluate(), bl.StackResult)
