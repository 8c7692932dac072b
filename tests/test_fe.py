"""2-D finite-element check (bilayer.strip.fe) against the closed forms and exact properties of elasticity.

References:
- the stack engine's closed form (Timoshenko 1925 / Hsueh 2002 transformed section, bilayer.evaluate),
  whose values for the Example A and three-layer stacks are also the derived check values of layers.md
  sec. 1.7, 2.1 and 3.5 (verified here independently: the FE is a second method);
- equilibrium of a free end (the end face carries no traction, so the shear on an interface between
  mid-length and the end carries the whole mid-length force of the part below);
- reflection symmetry of the elasticity problem (mirror x -> L - x; for two layers of equal modulus,
  Poisson's ratio and thickness also z -> H - z, which makes the interface peel vanish);
- equal CTEs give a stress-free state (layers.md sec. 9 item 4, exact in elasticity too).
"""
import numpy as np
import pytest

import bilayer as bl
from bilayer.core import laminate
from bilayer.core.errors import InputError, SuspiciousInputWarning
from bilayer.strip.fe import MeshOptions, fe_check, refinement_study, strip_mesh
from bilayer.core.materials import Material

pytest.importorskip("skfem")
pytestmark = pytest.mark.filterwarnings("ignore", category=SuspiciousInputWarning)

LAYER_A = Material("example layer A", 140e9, 0.30, 1.5e-6)  # layers.md sec. 0, Example A
LAYER_B = Material("example layer B", 100e9, 0.33, 19.5e-6)
HEATED = bl.Temperatures(293.15, 393.15)
EXAMPLE_A = bl.Stack.of((LAYER_A, 0.5e-3), (LAYER_B, 0.5e-3))
# layers.md sec. 3.5: E 200/3/70 GPa, nu 0.30/0.35/0.33, t 0.30/0.05/0.20 mm, alpha 12/60/23 ppm/K, dT = -80 K
THREE = bl.Stack.of(
    (Material("s1", 200e9, 0.30, 12e-6), 0.30e-3),
    (Material("s2", 3e9, 0.35, 60e-6), 0.05e-3),
    (Material("s3", 70e9, 0.33, 23e-6), 0.20e-3),
)
COOLED = bl.Temperatures(293.15, 213.15)


def _largest_stress_difference(fe, engine):
    faces = np.concatenate([engine.stress_bottom, engine.stress_top])
    fe_faces = np.concatenate([fe.stress_bottom, fe.stress_top])
    return np.max(np.abs(fe_faces - faces)) / np.max(np.abs(faces))


@pytest.mark.parametrize("state, curvature", [("narrow", 2.680851), ("wide", 3.575324)])
def test_example_a_curvature_and_stresses_match_the_closed_form(state, curvature):
    """Example A, L/H = 10: FE curvature and mid-length face stresses within 0.5 % of the closed form.
    Curvatures are the derived check values of layers.md sec. 1.7 (narrow) and sec. 2.1 ('strict plane
    strain 3.575324'), reproduced here by plane stress and plane strain FE."""
    fe = fe_check(EXAMPLE_A, HEATED, 10e-3, state)
    engine = bl.evaluate(EXAMPLE_A, HEATED, state)
    assert fe.curvature == pytest.approx(float(engine.curvature), rel=5e-3)
    assert fe.curvature == pytest.approx(curvature, rel=5e-3)
    assert _largest_stress_difference(fe, engine) < 5e-3
    np.testing.assert_allclose(fe.layer_force, engine.layer_force, rtol=5e-3)
    assert fe.plane == {"narrow": "plane stress", "wide": "plane strain"}[state]


@pytest.mark.parametrize("state", ["narrow", "wide"])
def test_three_layer_stack_matches_the_closed_form(state):
    """layers.md sec. 3.5 stack (soft middle layer), L/H = 10: within 0.5 % in both states; the beam
    curvature is the derived check value -2.013783 1/m (sec. 3.5)."""
    fe = fe_check(THREE, COOLED, 10 * THREE.total_thickness, state)
    engine = bl.evaluate(THREE, COOLED, state)
    assert fe.curvature == pytest.approx(float(engine.curvature), rel=5e-3)
    assert _largest_stress_difference(fe, engine) < 5e-3
    if state == "narrow":
        assert fe.curvature == pytest.approx(-2.013783, rel=5e-3)


def test_plane_strain_needs_both_modulus_and_free_strain_factors():
    """Plane strain needs E/(1-nu^2) and (1+nu) alpha dT together (shared/README.md settled point):
    the engine with both matches FE; E/(1-nu^2) alone is about 30 % low in curvature."""
    fe = fe_check(EXAMPLE_A, HEATED, 10e-3, "wide")
    E, nu = np.array([140e9, 100e9]), np.array([0.30, 0.33])
    f = np.array([1.5e-4, 19.5e-4])
    both = laminate.solve(E / (1 - nu**2), EXAMPLE_A.thicknesses, (1 + nu) * f)
    modulus_only = laminate.solve(E / (1 - nu**2), EXAMPLE_A.thicknesses, f)
    assert fe.curvature == pytest.approx(float(both.curvature), rel=1e-4)
    assert float(modulus_only.curvature) / fe.curvature == pytest.approx(0.75, abs=0.03)


def test_shear_integral_equals_force_below_each_interface():
    """Free-end equilibrium: int of sigma_xz from mid-length to the end equals the force of the part
    below at mid-length, within 1 %, on every interface of the three-layer stack."""
    fe = fe_check(THREE, COOLED, 10 * THREE.total_thickness, "narrow")
    engine = bl.evaluate(THREE, COOLED, "narrow")
    below = np.cumsum(engine.layer_force)[:-1]
    for line, force in zip(fe.interfaces, below):
        assert line.shear_integral == pytest.approx(line.force_below, rel=1e-2)
        assert line.force_below == pytest.approx(force, rel=5e-3)


def test_shear_is_odd_and_peel_even_and_equal_layers_have_no_peel():
    """Mirror x -> L - x: shear odd, peel even about mid-length. Two layers of equal E, nu and t with
    different CTEs: mirror z -> H - z maps the load to its negative, so the interface peel vanishes
    while the shear does not."""
    one, two = Material("equal one", 120e9, 0.3, 5e-6), Material("equal two", 120e9, 0.3, 17e-6)
    stack = bl.Stack.of((one, 0.4e-3), (two, 0.4e-3))
    fe = fe_check(stack, HEATED, 8e-3, "narrow")
    line = fe.interfaces[0]
    scale = np.max(np.abs(line.shear))
    assert scale > 10e6
    np.testing.assert_allclose(line.shear_left, -line.shear, atol=1e-6 * scale)
    np.testing.assert_allclose(line.peel_left, line.peel, atol=1e-6 * scale)
    assert np.max(np.abs(line.peel)) < 1e-6 * scale
    assert np.max(np.abs(line.peel_profile)) < 1e-6 * scale


@pytest.mark.parametrize("state, nu_q", [("narrow", 0.2), ("wide", 0.3)])
def test_equal_free_strains_give_no_stress(state, nu_q):
    """Equal CTEs: free expansion, no stress and no curvature (layers.md sec. 9 item 4), in plane stress
    for any Poisson's ratios; in plane strain only with equal ones, since the free strain is (1+nu) alpha dT."""
    stack = bl.Stack.of((Material("p", 200e9, 0.3, 10e-6), 0.3e-3), (Material("q", 50e9, nu_q, 10e-6), 0.4e-3))
    fe = fe_check(stack, HEATED, 8e-3, state)
    assert abs(fe.curvature) * stack.total_thickness < 1e-12
    assert np.max(np.abs(fe.stress)) < 1e-6 * 200e9 * 10e-6 * 100
    assert np.max(np.abs(fe.interfaces[0].shear)) < 1e-6 * 200e9 * 10e-6 * 100


def test_default_mesh_curvature_converges():
    """Refinement study: the default mesh's curvature changes by less than 1e-4 when every element is halved."""
    study = refinement_study(THREE, COOLED, 10 * THREE.total_thickness, "wide", levels=2)
    assert study.runs[1].dofs > 3 * study.runs[0].dofs
    assert study.curvature_changes[0] < 1e-4
    assert study.stress_changes[0] < 1e-3
    assert study.shear_changes.shape == (1, 2)
    assert set(study.to_dict()) >= {"dofs", "curvature_changes", "shear_changes", "peel_changes"}


def test_mesh_is_graded_toward_interfaces_and_ends_and_has_a_mid_node():
    x, z = strip_mesh([0.5e-3, 0.05e-3, 0.5e-3], 12e-3, MeshOptions())
    assert 6e-3 in x and x[0] == 0 and x[-1] == 12e-3
    assert np.all(np.diff(x) > 0) and np.all(np.diff(z) > 0)
    dx = np.diff(x)
    assert dx[0] == pytest.approx(0.02 * 0.05e-3) and dx[-1] == pytest.approx(dx[0])
    assert dx.max() <= 0.5 * 1.05e-3 * (1 + 1e-9)
    layer = np.diff(z[: 9])  # the eight elements of the bottom layer
    assert layer[0] < layer[3] and layer[-1] < layer[3]
    for h in (0.5e-3, 0.55e-3):
        assert np.min(np.abs(z - h)) < 1e-15
    fine_x, fine_z = strip_mesh([0.5e-3, 0.05e-3, 0.5e-3], 12e-3, MeshOptions().refined())
    assert len(fine_x) - 1 == 2 * (len(x) - 1) and len(fine_z) - 1 == 2 * (len(z) - 1)


def test_progress_is_reported_to_the_end():
    seen = []
    fe_check(EXAMPLE_A, HEATED, 10e-3, progress=lambda fraction, message: seen.append((fraction, message)))
    fractions = [f for f, _ in seen]
    assert fractions == sorted(fractions) and fractions[0] == 0.0 and fractions[-1] == 1.0
    assert any("solving" in m for _, m in seen)


@pytest.mark.parametrize(
    "kwargs, field",
    [
        (dict(state="plate"), "bending state"),
        (dict(distances=[0.0]), "distances"),
        (dict(distances=[6e-3]), "distances"),
        (dict(length=-1.0), "length"),
        (dict(heights=[2e-3]), "heights"),
        (dict(mesh="fine"), "mesh"),
    ],
)
def test_bad_input_names_the_field(kwargs, field):
    args = dict(stack=EXAMPLE_A, temperatures=HEATED, length=10e-3)
    args.update(kwargs)
    with pytest.raises(InputError) as error:
        fe_check(**args)
    assert error.value.field == field


def test_mesh_options_are_validated():
    with pytest.raises(InputError, match="layer_elements"):
        MeshOptions(layer_elements=1)
    with pytest.raises(InputError, match="growth"):
        MeshOptions(growth=3.0)
    with pytest.raises(InputError, match="levels"):
        refinement_study(EXAMPLE_A, HEATED, 10e-3, levels=1)


@pytest.mark.parametrize("state", ["narrow", "wide"])
def test_four_layer_stack_with_a_bond_converges_and_matches(state):
    """A four-layer stack with a thin bond line and a soft top coat (L/H = 12), two meshes: curvature and
    stresses within 0.5 % of the closed form on both, changes between meshes below 1e-4, equilibrium within 1 %
    (the soft coat's singular corner makes this the hardest interface for the shear integral)."""
    stack = bl.Stack.of(
        (Material("substrate", 130e9, 0.28, 3e-6), 0.4e-3),
        (Material("die attach", 5e9, 0.35, 40e-6), 0.03e-3),
        (Material("metal", 120e9, 0.34, 17e-6), 0.25e-3),
        (Material("coat", 3e9, 0.40, 50e-6), 0.05e-3),
    )
    cooled = bl.Temperatures(450.0, 250.0)
    study = refinement_study(stack, cooled, 12 * stack.total_thickness, state, levels=2)
    engine = bl.evaluate(stack, cooled, state)
    for run in study.runs:
        assert run.curvature == pytest.approx(float(engine.curvature), rel=5e-3)
        assert _largest_stress_difference(run, engine) < 5e-3
        for line in run.interfaces:
            assert line.shear_integral == pytest.approx(line.force_below, rel=1e-2)
    assert np.all(study.curvature_changes < 1e-4)



def _random_stacks(count=10, seed=20240611):
    """Fixed pseudo-random stacks of 2-4 layers (seeded: reproducible, no shrinking of FE runs)."""
    rng = np.random.default_rng(seed)
    for _ in range(count):
        n = int(rng.integers(2, 5))
        alphas = rng.permutation(np.linspace(2e-6, 28e-6, n))  # distinct CTEs: a real mismatch
        yield bl.Stack.of(*(
            (Material(f"m{i}", float(10 ** rng.uniform(9.5, 11.6)), float(rng.uniform(0.05, 0.45)), float(alphas[i])),
             float(10 ** rng.uniform(-4.5, -3.0)))
            for i in range(n)
        ))


@pytest.mark.slow
@pytest.mark.parametrize("state", ["narrow", "wide"])
def test_random_stacks_match_the_closed_form_far_from_the_ends(state):
    """Seeded random stacks of 2-4 layers, L/H = 25: FE mid-length curvature and face stresses within 0.5 %
    of the engine's closed form; equilibrium of every interface within 1 % of the larger of its own force
    and a tenth of the largest interface force (a nearly unloaded interface has no meaningful relative error)."""
    for stack in _random_stacks():
        fe = fe_check(stack, COOLED, 25 * stack.total_thickness, state)
        engine = bl.evaluate(stack, COOLED, state)
        assert fe.curvature == pytest.approx(float(engine.curvature), rel=5e-3)
        assert _largest_stress_difference(fe, engine) < 5e-3
        largest = np.max(np.abs(np.cumsum(engine.layer_force)[:-1]))
        for line in fe.interfaces:
            assert abs(line.shear_integral - line.force_below) <= 1e-2 * max(abs(line.force_below), 0.1 * largest)
