"""Material record, built-in library and user material files."""
from __future__ import annotations

import codecs
import dataclasses
import re
import subprocess
import sys
import warnings
from pathlib import Path

import pytest

from bilayer.core.errors import DesignFileError, InputError, SuspiciousInputWarning, UnknownMaterialError
from bilayer.core.materials import ConstantCTE, InstantaneousCTETable, Material, MaterialLibrary, MeanCTETable, SiliconCTE, default_library, get_material, load_material_file, write_material_file
from bilayer.core.materials.library import LIBRARY_FILE

C = 273.15
ROOT = Path(__file__).resolve().parents[1]


def steel(**changes) -> Material:
    values = dict(name="test steel", youngs_modulus=200e9, poisson_ratio=0.3, cte=12e-6, density=7850.0)
    values.update(changes)
    return Material(**values)


# --- validation ---------------------------------------------------------------------------------------------


@pytest.mark.parametrize(
    "changes, field, valid_text",
    [
        (dict(youngs_modulus=0.0), "youngs_modulus", "1.25e+12"),
        (dict(youngs_modulus=2e12), "youngs_modulus", "1.25e+12"),
        (dict(youngs_modulus=float("nan")), "youngs_modulus", "finite"),
        (dict(poisson_ratio=0.5), "poisson_ratio", "-1 < poisson_ratio < 0.5"),
        (dict(poisson_ratio=-1.0), "poisson_ratio", "-1 < poisson_ratio < 0.5"),
        (dict(cte=1.2e-3), "cte", "1/K"),
        (dict(density=30000.0), "density", "23000"),
        (dict(density=0.0), "density", "23000"),
        (dict(strength=-5e6), "strength", "0 < strength"),
        (dict(temperature_range=(-40.0, 125.0)), "temperature_range[0]", "> 0 K"),
        (dict(temperature_range=(400.0, 300.0)), "temperature_range", "low < high"),
        (dict(glass_transition=-120.0), "glass_transition", "> 0 K"),
        (dict(name=""), "name", "non-empty"),
    ],
)
def test_invalid_values_name_field_value_and_range(changes, field, valid_text):
    with pytest.raises(InputError) as info:
        steel(**changes)
    error = info.value
    assert error.field == field
    assert valid_text in error.valid
    assert field in str(error) and repr(error.value) in str(error)


def test_ppm_and_gpa_slips_get_hints():
    with pytest.raises(InputError, match="17 ppm/K is 17e-6"):
        steel(cte=17.0)
    with pytest.warns(SuspiciousInputWarning, match="below 1 MPa"):
        steel(youngs_modulus=200.0)  # GPa typed as Pa


def test_psi_typed_as_pascal_warns_for_a_metal_but_not_for_a_silicone():
    """Steel is 29e6 psi = 200 GPa (common practice); a 29e6 'Pa' steel is a unit slip."""
    with pytest.warns(SuspiciousInputWarning, match="psi"):
        steel(youngs_modulus=29e6)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        Material("soft silicone", 2e6, 0.49, 270e-6, density=1200.0)


@pytest.mark.parametrize(
    "changes, text",
    [
        (dict(poisson_ratio=0.495), "0.49"),
        (dict(poisson_ratio=-0.2), "negative"),
        (dict(cte=4e-4), "3e-4"),
        (dict(cte=-1e-6), "negative CTE"),
        (dict(density=7.85), "g/cm"),
        (dict(youngs_modulus=9e11), "500 GPa"),
        (dict(strength=20e9), "E/20"),
    ],
)
def test_suspicious_values_warn(changes, text):
    with pytest.warns(SuspiciousInputWarning, match=re.escape(text)):
        steel(**changes)


def test_ordinary_material_gives_no_warning():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        steel()


def test_float_cte_becomes_constant_model_valid_over_the_temperature_range():
    material = steel(temperature_range=(223.15, 423.15))
    assert isinstance(material.cte, ConstantCTE)
    assert material.cte.valid_range == (223.15, 423.15)
    assert material.alpha == 12e-6


def test_derived_moduli():
    """G = E/(2(1+nu)), biaxial E/(1-nu), plane strain E/(1-nu^2): 200 GPa, nu 0.3 by hand."""
    material = steel()
    assert material.shear_modulus == pytest.approx(200e9 / 2.6)
    assert material.biaxial_modulus == pytest.approx(200e9 / 0.7)
    assert material.plane_strain_modulus == pytest.approx(200e9 / 0.91)


def test_material_is_immutable_and_hashable():
    material = steel(sources={"youngs_modulus": "from memory"})
    with pytest.raises(dataclasses.FrozenInstanceError):
        material.youngs_modulus = 1.0
    with pytest.raises(TypeError):
        material.sources["youngs_modulus"] = "changed"
    assert hash(material) == hash(steel(sources={"youngs_modulus": "other"}))
    assert material.with_changes(poisson_ratio=0.28).poisson_ratio == 0.28
    with pytest.raises(InputError):
        material.with_changes(poisson_ratio=0.6)


# --- the built-in library ----------------------------------------------------------------------------------

REQUIRED_KEYS = {
    "fe36ni", "fe42ni", "fe29ni17co", "mncuni_72_18_10", "nicrfe_22_3", "brass_70_30", "copper_c11000",
    "nickel", "steel_plain_carbon", "stainless_304", "stainless_430", "aluminium_6061_t6", "ti_6al_4v",
    "molybdenum", "tungsten", "gold", "silicon_100", "polysilicon", "sio2_thermal", "si3n4_lpcvd",
    "fused_silica", "glass_borosilicate", "glass_soda_lime", "alumina_96", "aln", "fr4", "polyimide_film",
    "epoxy_adhesive", "silicone_encapsulant", "underfill", "solder_sac305", "solder_sn63pb37",
    "concrete_reference",
}
SOURCED_FIELDS = ("youngs_modulus", "poisson_ratio", "cte", "density", "strength", "temperature_range",
                  "glass_transition", "solidus")
SOURCE_KINDS = ("from memory", "secondary:", "derived:")


def test_library_holds_the_generic_materials():
    library = default_library()
    assert len(library) >= 32
    assert REQUIRED_KEYS <= set(library)
    assert default_library() is library  # cached


def test_library_loads_without_warnings():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        MaterialLibrary.from_toml(LIBRARY_FILE)


def test_every_library_value_has_a_source():
    library = default_library()
    for key, material in library.items():
        for name in SOURCED_FIELDS:
            value = material.cte if name == "cte" else getattr(material, name)
            if value is None:
                continue
            source = material.sources.get(name, "").strip()
            assert source, f"{key}.{name} has no source"
            cited = re.findall(r"\[([A-Za-z0-9_\-]+)\]", source)
            assert all(c in library.citations for c in cited), f"{key}.{name}: unknown citation in {source!r}"
            assert cited or source.startswith(SOURCE_KINDS), f"{key}.{name}: unclear source {source!r}"
        assert material.temperature_range is not None, key
        assert material.cte.valid_range is not None, key
        assert set(material.sources) <= set(SOURCED_FIELDS), key


def test_citations_expand_to_full_references():
    library = default_library()
    text = library.expand_source(library["silicon_100"].sources["cte"])
    assert "Okada" in text and "J. Appl. Phys. 56, 314 (1984)" in text


def test_library_uses_the_right_cte_kinds():
    library = default_library()
    assert isinstance(library["silicon_100"].cte, SiliconCTE)
    fe36ni = library["fe36ni"].cte
    assert isinstance(fe36ni, MeanCTETable) and fe36ni.reference_temperature == pytest.approx(30 + C)
    for key in ("stainless_304", "stainless_430", "copper_c11000", "aluminium_6061_t6", "ti_6al_4v"):
        assert isinstance(library[key].cte, MeanCTETable), key


# Banned trade names from the project rules, stored ROT13-encoded so the names do not appear here.
BANNED_ROT13 = [
    "vaine", "xbine", "clerk", "xncgba", "zbary", "vapbary", "pbafgnagna", "avpuebzr", "grsyba", "zlyne",
    "mrebqhe", r"nyybl\f*42",
]


@pytest.mark.parametrize(
    "path",
    [LIBRARY_FILE, ROOT / "docs" / "materials.md", *sorted((ROOT / "bilayer" / "materials").glob("*.py"))],
    ids=lambda p: p.name,
)
def test_no_trade_names(path):
    text = path.read_text(encoding="utf-8").casefold()
    for encoded in BANNED_ROT13:
        pattern = codecs.decode(encoded, "rot13")
        assert not re.search(rf"\b{pattern}\b", text), f"{path.name} contains a trade name"


# --- lookup -----------------------------------------------------------------------------------------------


@pytest.mark.parametrize("name", ["fe36ni", "FE36NI", "Fe-36Ni", "fe_36_ni", " Fe 36 Ni ",
                                  "Fe-36Ni low-expansion alloy", "FE-36NI LOW EXPANSION ALLOY"])
def test_lookup_ignores_case_spaces_and_punctuation(name):
    assert get_material(name).key == "fe36ni"


def test_unknown_name_suggests_close_matches():
    with pytest.raises(UnknownMaterialError) as info:
        get_material("fe36nl")
    assert isinstance(info.value, KeyError)
    assert "did you mean 'fe36ni'" in str(info.value)
    assert info.value.field == "material" and info.value.value == "fe36nl"
    with pytest.raises(UnknownMaterialError, match="did you mean 'stainless_304'"):
        get_material("stainles 304")
    with pytest.raises(UnknownMaterialError, match="search"):
        get_material("unobtainium")


def test_search_and_mapping_behaviour():
    library = default_library()
    keys = {m.key for m in library.search("solder")}
    assert keys == {"solder_sac305", "solder_sn63pb37"}
    assert "Fe-36Ni" in library and "unobtainium" not in library
    assert library.get("unobtainium") is None
    assert get_material(library["gold"]) is library["gold"]


def test_with_materials_adds_and_guards_keys():
    library = default_library()
    mine = Material("My spring alloy", 190e9, 0.3, 13e-6)
    bigger = library.with_materials(mine)
    assert len(bigger) == len(library) + 1 and bigger["my_spring_alloy"].name == "My spring alloy"
    assert len(library) == len(default_library())  # the original is unchanged
    override = dataclasses.replace(library["fe42ni"], cte=4.5e-6)
    with pytest.raises(InputError, match="replace=True"):
        library.with_materials(override)
    assert library.with_materials(override, replace=True)["fe42ni"].alpha == 4.5e-6
    with pytest.raises(InputError, match="clashes"):
        library.with_materials(Material("Gold", 70e9, 0.4, 14e-6, key="my_gold"))


# --- common-practice and reference sanity checks -------------------------------------------------------------


def test_steel_expansion_rule_of_thumb():
    """Common practice: steel ~6.5e-6 /degF, so 100 ft of steel grows ~0.078 in for +10 degF.

    Also ASME BPVC II-D Table TE-1: mean coefficient 70 -> 100 degF of group-1 carbon steel 6.5e-6 /degF.
    """
    cte = get_material("steel_plain_carbon").cte
    per_degF = cte.secant(20 + C, 100 + C) / 1.8
    assert per_degF == pytest.approx(6.5e-6, rel=0.01)
    growth_in = cte.thermal_strain(70 + C, 70 + C + 10 / 1.8) * 100 * 12
    assert growth_in == pytest.approx(0.078, abs=0.001)


def test_aluminium_expands_about_twice_as_much_as_steel():
    """Common practice: aluminium ~2x steel."""
    ratio = get_material("aluminium_6061_t6").alpha / get_material("steel_plain_carbon").alpha
    assert 1.8 < ratio < 2.2


def test_concrete_expands_nearly_as_much_as_steel():
    """Common practice: concrete expands nearly as steel (why reinforced concrete works)."""
    ratio = get_material("concrete_reference").alpha / get_material("steel_plain_carbon").alpha
    assert 0.85 < ratio < 1.16


@pytest.mark.parametrize(
    "key, low, high",
    [
        ("steel_plain_carbon", 0.25, 0.30),  # common practice: steel 0.25-0.30
        ("stainless_304", 0.25, 0.31),
        ("stainless_430", 0.25, 0.30),
        ("aluminium_6061_t6", 0.32, 0.34),  # common practice: aluminium ~0.33
        ("concrete_reference", 0.10, 0.20),  # common practice: concrete 0.1-0.2
    ],
)
def test_poisson_ratios_common_practice(key, low, high):
    assert low <= get_material(key).poisson_ratio <= high


def test_copper_cte_common_practice():
    """Common practice: copper ~9.4e-6 /degF near room temperature (Callister Table B.6: 17.0e-6 /K)."""
    assert get_material("copper_c11000").alpha / 1.8 == pytest.approx(9.4e-6, rel=0.02)


def test_silicon_elastic_constants():
    """E<100>, nu<100> and the (100) biaxial modulus from cubic stiffness constants.

    Formulas for cubic crystals (Hopcroft, Nix & Kenny 2010): E<100> = (C11-C12)(C11+2C12)/(C11+C12),
    nu = C12/(C11+C12), biaxial (100) = C11 + C12 - 2 C12^2/C11; constants C11 = 165.7, C12 = 63.9 GPa
    (from memory, the values used in that paper).
    """
    c11, c12 = 165.7e9, 63.9e9
    silicon = get_material("silicon_100")
    assert silicon.youngs_modulus == pytest.approx((c11 - c12) * (c11 + 2 * c12) / (c11 + c12), rel=5e-4)
    assert silicon.poisson_ratio == pytest.approx(c12 / (c11 + c12), rel=5e-4)
    assert silicon.biaxial_modulus == pytest.approx(c11 + c12 - 2 * c12**2 / c11, rel=5e-4)


@pytest.mark.parametrize("active, specific_curvature", [("mncuni_72_18_10", 39.0e-6), ("nicrfe_22_3", 26.2e-6)])
def test_thermostat_pairs_reproduce_supplier_flexivity(active, specific_curvature):
    """Timoshenko (1925) bimetal curvature, equal thicknesses, 20 -> 130 degC, against the specific
    curvature of the Fe-36Ni pairs on supplier data sheets (secondary, tolerance +-5 %).

    Consistency check of the derived library CTEs: t kappa / dT = dalpha 6(1+m)^2 / (3(1+m)^2 + (1+mn)(m^2 + 1/(mn))).
    """
    high, low = get_material(active), get_material("fe36ni")
    t1, t2 = 20 + C, 130 + C
    dalpha = high.cte.secant(t1, t2) - low.cte.secant(t1, t2)
    m, n = 1.0, low.youngs_modulus / high.youngs_modulus
    factor = 6 * (1 + m) ** 2 / (3 * (1 + m) ** 2 + (1 + m * n) * (m**2 + 1 / (m * n)))
    assert dalpha * factor == pytest.approx(specific_curvature, rel=0.05)


# --- user material files -------------------------------------------------------------------------------------

USER_FILE = """
[sources]
lab2024 = "Our own dilatometer run, report 17"

[materials.my_spring]
name = "Spring alloy X"
category = "spring"
youngs_modulus = 195e9
poisson_ratio = 0.29
density = 8000
strength = 900e6
strength_kind = "yield"
temperature_range_C = [-40, 150]
cte = 13.1e-6
[materials.my_spring.sources]
cte = "[lab2024]"

[materials.my_film]
name = "Deposited film Y"
youngs_modulus = 90e9
poisson_ratio = 0.25
glass_transition = 400.0
[materials.my_film.cte]
kind = "mean_table"
reference_C = 20
temperatures_C = [100, 200]
values = [5.0e-6, 5.5e-6]
"""


def test_user_file_is_read_in_si(tmp_path):
    path = tmp_path / "mine.toml"
    path.write_text(USER_FILE)
    mine = load_material_file(path)
    spring, film = mine["my_spring"], mine["Deposited film Y"]
    assert spring.youngs_modulus == 195e9 and spring.strength == 900e6
    assert spring.temperature_range == pytest.approx((233.15, 423.15))
    assert spring.cte.valid_range == pytest.approx((233.15, 423.15))
    assert mine.expand_source(spring.sources["cte"]) == "Our own dilatometer run, report 17"
    assert film.glass_transition == 400.0
    assert film.cte.thermal_strain(20 + C, 200 + C) == pytest.approx(5.5e-6 * 180)
    merged = default_library().with_file(path)
    assert merged["my_spring"] == spring and "fe36ni" in merged and "lab2024" in merged.citations


def test_user_file_round_trip(tmp_path):
    """Write materials (including every CTE kind) and read them back: equal values."""
    library = default_library()
    chosen = [library[k] for k in ("fe36ni", "silicon_100", "steel_plain_carbon", "nickel", "fr4", "solder_sac305")]
    table = InstantaneousCTETable((200.0, 300.0, 450.0), (1.0e-6, 2.5e-6, 3.0e-6))
    chosen.append(Material("Table film", 100e9, 0.2, table, key="table_film",
                           notes='quotes " and \\ and unicode \u00b0C'))
    path = write_material_file(tmp_path / "out.toml", chosen, library.citations)
    back = load_material_file(path)
    assert list(back) == [m.key for m in chosen]
    for material in chosen:
        assert back[material.key] == material
    assert not list(tmp_path.glob(".*.tmp"))  # atomic write left no temporary file


@pytest.mark.parametrize(
    "text, where",
    [
        ("[materials.a]\nname = 'A'\nyoungs_modulus = 1e9\n poisson_ratio = ", "valid TOML"),
        ("[materials.a]\nname = 'A'\nyoungs_modulous = 1e9\npoisson_ratio = 0.3\ncte = 1e-5",
         "[materials.a]: youngs_modulous"),
        ("[materials.a]\nname = 'A'\nyoungs_modulus = 1e9\npoisson_ratio = 0.7\ncte = 1e-5",
         "[materials.a]: poisson_ratio"),
        ("[materials.a]\nname = 'A'\nyoungs_modulus = 1e9\npoisson_ratio = 0.3", "[materials.a]: cte"),
        ("[materials.a]\nname = 'A'\nyoungs_modulus = true\npoisson_ratio = 0.3\ncte = 1e-5",
         "[materials.a]: youngs_modulus"),
        ("[materials.a]\nname = 'A'\nyoungs_modulus = 1e9\npoisson_ratio = 0.3\n"
         "cte = { kind = 'mean_table', reference_C = 20, temperatures_C = [100, 50], values = [1e-5, 1e-5] }",
         "[materials.a]: cte.temperatures[1]"),
        ("[materials.a]\nname = 'A'\nyoungs_modulus = 1e9\npoisson_ratio = 0.3\ncte = { kind = 'spline' }",
         "[materials.a].cte: kind"),
        ("[materials.a]\nname = 'A'\nyoungs_modulus = 1e9\npoisson_ratio = 0.3\ncte = 1e-5\n"
         "temperature_range = [250, 400]\ntemperature_range_C = [-20, 120]", "temperature_range"),
        ("[materialz.a]\nname = 'A'", "materialz"),
    ],
)
def test_malformed_files_name_the_file_and_key(tmp_path, text, where):
    path = tmp_path / "bad.toml"
    path.write_text(text)
    with pytest.raises(DesignFileError) as info:
        load_material_file(path)
    message = str(info.value)
    assert str(path) in message
    assert where in message


def test_unit_strings_go_through_bilayer_units(tmp_path):
    pytest.importorskip("bilayer.core.units")
    path = tmp_path / "units.toml"
    path.write_text(
        "[materials.a]\nname = 'A'\nyoungs_modulus = '29e6 psi'\npoisson_ratio = 0.3\n"
        "cte = '6.5e-6/degF'\ndensity = '7.85 g/cm^3'\ntemperature_range = ['-40 degC', '150 degC']\n"
    )
    material = load_material_file(path)["a"]
    assert material.youngs_modulus == pytest.approx(199.95e9, rel=1e-3)
    assert material.alpha == pytest.approx(11.7e-6, rel=1e-6)
    assert material.density == pytest.approx(7850.0)
    assert material.temperature_range == pytest.approx((233.15, 423.15))
    path.write_text("[materials.a]\nname = 'A'\nyoungs_modulus = '200 mm'\npoisson_ratio = 0.3\ncte = 1e-5\n")
    with pytest.raises(DesignFileError, match=r"\[materials.a\]: youngs_modulus"):
        load_material_file(path)


def test_importing_materials_is_cheap():
    """The data file is parsed on first use only, and no heavy library is imported."""
    code = (
        "import sys, bilayer.core.materials as m\n"
        "assert m.default_library.cache_info().currsize == 0\n"
        "heavy = [n for n in ('pint', 'scipy', 'sympy') if n in sys.modules]\n"
        "assert not heavy, heavy\n"
    )
    subprocess.run([sys.executable, "-c", code], check=True, cwd=ROOT)
