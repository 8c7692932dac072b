"""Thin films and wafer bow: Stoney, the exact bilayer correction, bow <-> curvature, silicon moduli,
two-substrate inversion. Each check names its source; derived values from the reference sheets are
recomputed here by a second route (the engine's N-layer kernel, a rotated stiffness tensor, geometry).
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from bilayer.films import stress as films
from bilayer.core import laminate
from bilayer.core.errors import InputError
from bilayer.core.sagitta import bow_from_curvature, curvature_from_bow


def engine_plate_film(h_s, h_f, M_s, M_f, misfit):
    """Film (top) on substrate (bottom) in the engine's equal-biaxial kernel: substrate free strain 0,
    film free strain -misfit (a positive misfit = film wants to shrink relative to the substrate)."""
    sol = laminate.solve([M_s, M_f], [h_s, h_f], [0.0, -misfit])
    mean_film_stress = 0.5 * (sol.stress_bottom[1] + sol.stress_top[1])
    return float(sol.curvature), float(mean_film_stress)


# ----------------------------------------------------------------------------------------- Stoney
def test_stoney_worked_number_and_project_sign():
    """Stoney (1909) in biaxial form; derived check value, layers.md sec. 4.3, recomputed by hand:
    M_s = 130 GPa/(1 - 0.28), h_s = 525 um, h_f = 1 um, R = 50 m -> |sigma_f| = 165.885 MPa.
    Project sign: film side convex (kappa > 0) -> compressive film."""
    M_s = 130e9 / (1 - 0.28)
    hand = M_s * 525e-6**2 * (1 / 50) / (6 * 1e-6)
    assert hand == pytest.approx(165.885e6, rel=1e-5)
    assert films.stoney_stress(1 / 50, 525e-6, 1e-6, M_s) == pytest.approx(-hand, rel=1e-12)
    assert films.stoney_stress(-1 / 50, 525e-6, 1e-6, M_s) == pytest.approx(hand, rel=1e-12)


def test_stoney_matches_engine_thin_film_limit_and_sign():
    """Thin-film limit of the engine's plate solution (layers.md invariant 12): a tensile misfit bends
    the film side concave, and Stoney's stress equals the mean film stress as h_f/h_s -> 0."""
    M_s, M_f, h_s = 180e9, 100e9, 725e-6
    for h_f in (1e-9, 1e-8, 1e-7):
        kappa, mean_stress = engine_plate_film(h_s, h_f, M_s, M_f, 1e-3)
        assert kappa < 0 and mean_stress > 0
        assert films.stoney_stress(kappa, h_s, h_f, M_s) == pytest.approx(mean_stress, rel=2 * h_f / h_s)
        assert films.stoney_curvature(mean_stress, h_s, h_f, M_s) == pytest.approx(kappa, rel=2 * h_f / h_s)


@pytest.mark.parametrize("g", [0.1, 0.5, 1.0, 2.0, 5.0])
def test_exact_bilayer_ratio_tends_to_one_with_first_order_correction(g):
    """kappa_exact/kappa_Stoney = (1 + r)/(1 + 4gr + 6gr^2 + 4gr^3 + g^2 r^4) = 1 + (1 - 4g) r + O(r^2)
    (derived from force and moment balance; Freund & Suresh 2003 form, from memory). Checked here
    against the engine's N-layer kernel, and the remainder shrinks like r^2."""
    M_s, h_s, misfit = 100e9, 1e-3, 2e-3
    remainders = []
    for r in (1e-2, 1e-3, 1e-4):
        kappa_engine, _ = engine_plate_film(h_s, r * h_s, M_s, g * M_s, misfit)
        kappa_stoney = films.stoney_curvature(g * M_s * misfit, h_s, r * h_s, M_s)
        ratio = kappa_engine / kappa_stoney
        assert ratio == pytest.approx(films.stoney_curvature_ratio(r, g), rel=1e-12)
        assert films.exact_film_curvature(misfit, h_s, r * h_s, M_s, g * M_s) == pytest.approx(kappa_engine, rel=1e-12)
        remainders.append(abs(ratio - (1 + (1 - 4 * g) * r)))
    assert remainders[1] < remainders[0] / 50 and remainders[2] < remainders[1] / 50


@pytest.mark.parametrize(
    "r, g, kappa_ratio, stress_ratio",
    [(0.01, 0.5, 0.989903, 1.009999), (0.1, 2.0, 0.570421, 1.097804), (0.5, 1.0, 0.296296, 1.333333)],
)
def test_cross_check_points_against_engine(r, g, kappa_ratio, stress_ratio):
    """Derived check values, layers.md sec. 4.3 cross-check points, verified independently with the
    engine's kernel; the stress ratio is Klein's factor (J. Appl. Phys. 88:5487, 2000)."""
    M_s, h_s = 150e9, 500e-6
    kappa, mean_stress = engine_plate_film(h_s, r * h_s, M_s, g * M_s, 1e-3)
    assert kappa / films.stoney_curvature(g * M_s * 1e-3, h_s, r * h_s, M_s) == pytest.approx(kappa_ratio, abs=1e-6)
    assert films.stoney_stress(kappa, h_s, r * h_s, M_s) / mean_stress == pytest.approx(stress_ratio, abs=1e-6)
    assert films.stoney_stress_ratio(r, g) == pytest.approx(stress_ratio, abs=1e-6)
    result = films.film_stress_from_curvature(kappa, h_s, r * h_s, M_s, film_biaxial_modulus=g * M_s)
    assert result.mean_film_stress == pytest.approx(mean_stress, rel=1e-12)
    assert result.stoney_error == pytest.approx(stress_ratio - 1, abs=1e-6)


def test_stoney_error_on_silicon_grows_like_the_thickness_ratio():
    """applications.md sec. 6.1 [D]: 100 GPa film on 725 um Si(100): Stoney error 0.14 % at 1 um,
    1.4 % at 10 um, 6.9 % at 50 um; here from the engine kernel as the second route."""
    M_s = films.silicon_biaxial_modulus("100")
    for h_f, expected in ((1e-6, 0.0014), (10e-6, 0.014), (50e-6, 0.069)):
        kappa, mean_stress = engine_plate_film(725e-6, h_f, M_s, 100e9, 1e-3)
        error = films.stoney_stress(kappa, 725e-6, h_f, M_s) / mean_stress - 1
        assert error == pytest.approx(expected, abs=0.0005)


# ---------------------------------------------------------------------------------------- bow
def test_bow_to_curvature_is_the_exact_circle():
    """Geometry of a circular arc: R^2 = (D/2)^2 + (R - b)^2; applications.md sec. 6.2 check
    b = 20 um over 200 mm -> kappa = 4.000e-3 1/m (R = 250 m), which Pythagoras confirms here."""
    b, D = 20e-6, 0.2
    R = 1 / curvature_from_bow(b, D)
    assert R == pytest.approx(250.0, rel=1e-6)
    assert R**2 == pytest.approx((D / 2) ** 2 + (R - b) ** 2, rel=1e-15)
    for b in (0.3, -0.04, 1e-7):  # deep arcs too: the exact form, not 8b/D^2
        R = 1 / curvature_from_bow(b, 1.0)
        assert R**2 == pytest.approx(0.25 + (R - b) ** 2, rel=1e-12)


@settings(max_examples=200, deadline=None)
@given(
    bow=st.floats(-0.49, 0.49).filter(lambda b: abs(b) > 1e-9),
    span=st.floats(1e-3, 1.0),
)
def test_bow_curvature_round_trip(bow, span):
    """Invariant: bow -> curvature -> bow returns the input (exact formulas both ways)."""
    b = bow * span
    assert bow_from_curvature(curvature_from_bow(b, span), span) == pytest.approx(b, rel=1e-12, abs=1e-18)


def test_half_circle_limits_and_errors():
    """A half circle (b = D/2) has R = D/2; deeper bows and over-curved chords are rejected."""
    assert curvature_from_bow(0.5, 1.0) == pytest.approx(2.0)
    assert bow_from_curvature(2.0, 1.0) == pytest.approx(0.5)
    with pytest.raises(InputError, match="bow"):
        curvature_from_bow(0.6, 1.0)
    with pytest.raises(InputError, match="curvature"):
        bow_from_curvature(2.1, 1.0)
    with pytest.raises(InputError, match="span"):
        curvature_from_bow(1e-6, 0.0)


def test_film_stress_from_bow_before_and_after():
    """applications.md sec. 6.3 [D]: 1 um film, 725 um Si(100), bow change 5 -> 25 um over 200 mm ->
    |sigma_f| = 63.3 MPa; recomputed by hand with the small-bow curvature 8 db / D^2 (differs ~1e-7)."""
    M_s = films.silicon_biaxial_modulus("100")
    hand = M_s * 725e-6**2 * (8 * 20e-6 / 0.2**2) / (6 * 1e-6)
    result = films.film_stress_from_bow(25e-6, 0.2, 725e-6, 1e-6, M_s, bow_before=5e-6)
    assert result.stoney_stress == pytest.approx(-hand, rel=1e-6)
    assert abs(result.stoney_stress) == pytest.approx(63.3e6, rel=2e-3)
    flipped = films.film_stress_from_bow(-25e-6, 0.2, 725e-6, 1e-6, M_s, bow_before=-5e-6, film_facing="down")
    assert flipped.stoney_stress == pytest.approx(result.stoney_stress, rel=1e-12)
    assert result.to_dict()["bow_after"] == pytest.approx(25e-6, rel=1e-12)


def test_thick_film_warns_and_needs_modulus():
    result = films.film_stress_from_curvature(-1.0, 100e-6, 20e-6, 180e9)
    assert any("Stoney is off" in w for w in result.warnings)
    assert result.mean_film_stress is None and result.film_stress == result.stoney_stress


# ------------------------------------------------------------------------------- silicon moduli
def _rotated_biaxial_modulus(c11, c12, c44, normal):
    """Second route: rotate the cubic stiffness tensor so z is along ``normal``, impose equal in-plane
    strains with zero normal and out-of-plane shear stress, and read sigma_xx."""
    C = np.zeros((3, 3, 3, 3))
    for i in range(3):
        for j in range(3):
            C[i, i, j, j] = c12
        C[i, i, i, i] = c11
        for j in range(3):
            if i != j:
                C[i, j, i, j] = C[i, j, j, i] = c44
    n = np.asarray(normal, float) / np.linalg.norm(normal)
    a = np.cross(n, [1.0, 0.0, 0.0] if abs(n[0]) < 0.9 else [0.0, 1.0, 0.0])
    a /= np.linalg.norm(a)
    Q = np.array([a, np.cross(n, a), n])
    Cr = np.einsum("ip,jq,kr,ls,pqrs->ijkl", Q, Q, Q, Q, C)
    voigt = [(0, 0), (1, 1), (2, 2), (1, 2), (0, 2), (0, 1)]
    S = np.array([[Cr[p + q] * (1 if k < 3 else 2) for k, q in enumerate(voigt)] for p in voigt])
    # tensor strains (e11, e22, e33, e23, e13, e12): e11 = e22 = 1, e12 = 0; solve sigma_33 = sigma_23 = sigma_13 = 0
    free = [2, 3, 4]
    fixed = np.array([1.0, 1.0, 0.0, 0.0, 0.0, 0.0])
    rhs = -S[np.ix_(free, [0, 1])] @ fixed[:2]
    fixed[free] = np.linalg.solve(S[np.ix_(free, free)], rhs)
    stress = S @ fixed
    return stress[0], stress[1], stress[5]


@pytest.mark.parametrize("plane, normal, expected", [("100", [0, 0, 1], 180.3e9), ("111", [1, 1, 1], 229.1e9)])
def test_silicon_biaxial_modulus_by_orientation(plane, normal, expected):
    """applications.md sec. 6.3 [D]: M(100) = 180.3 GPa, M(111) = 229.1 GPa with c11, c12, c44 =
    165.7, 63.9, 79.6 GPa (Hopcroft et al. 2010, values from memory); verified by rotating the
    stiffness tensor numerically (equal in-plane stresses confirm in-plane isotropy)."""
    M = films.silicon_biaxial_modulus(plane)
    assert M == pytest.approx(expected, rel=5e-4)
    sxx, syy, sxy = _rotated_biaxial_modulus(165.7e9, 63.9e9, 79.6e9, normal)
    assert sxx == pytest.approx(M, rel=1e-12) and syy == pytest.approx(M, rel=1e-12)
    assert abs(sxy) < 1e-6 * M


def test_110_wafer_refused_because_anisotropic():
    sxx, syy, _ = _rotated_biaxial_modulus(165.7e9, 63.9e9, 79.6e9, [1, 1, 0])
    assert abs(sxx - syy) > 0.1 * sxx  # the reason: unequal in-plane stresses
    with pytest.raises(InputError, match="plane"):
        films.silicon_biaxial_modulus("110")


def test_young_modulus_instead_of_biaxial_understates_stress():
    """applications.md sec. 6.3 [D]: E<100> = 130 GPa in Stoney instead of M(100) understates by ~28 %."""
    assert 1 - 130e9 / films.silicon_biaxial_modulus("100") == pytest.approx(0.279, abs=0.002)


# --------------------------------------------------------------------------- two substrates
def test_two_substrate_inversion_recovers_film_properties():
    """Double-substrate method (Retajczyk & Sinha 1980; applications.md sec. 6.4 check [D], recomputed
    here from the forward model S = M_f (alpha_s - alpha_f)): M_f = 100 GPa, alpha_f = 20 ppm/K on Si
    (2.6) and GaAs (5.7): slopes -1.740 and -1.430 MPa/K; +2 % on the first gives 111.2 GPa, 18.56 ppm/K."""
    temperatures = np.linspace(300, 500, 9)
    slopes = []
    for alpha_s in (2.6e-6, 5.7e-6):
        stress = 100e9 * (alpha_s - 20e-6) * (temperatures - 300) + 50e6
        slopes.append(films.stress_temperature_slope(temperatures, stress))
    assert slopes[0] == pytest.approx(-1.740e6) and slopes[1] == pytest.approx(-1.430e6)
    result = films.film_properties_from_two_substrates(slopes[0], slopes[1], 2.6e-6, 5.7e-6)
    assert result.film_biaxial_modulus == pytest.approx(100e9, rel=1e-10)
    assert result.film_cte == pytest.approx(20e-6, rel=1e-10)
    perturbed = films.film_properties_from_two_substrates(1.02 * slopes[0], slopes[1], 2.6e-6, 5.7e-6)
    assert perturbed.film_biaxial_modulus == pytest.approx(111.2e9, rel=1e-3)
    assert perturbed.film_cte == pytest.approx(18.56e-6, rel=1e-3)
    assert any("ill-conditioned" in w for w in perturbed.warnings)
    # first-order sensitivity against the finite difference above: dM/M = 0.02 * S1/(S1 - S2)
    assert 0.02 * abs(slopes[0]) / abs(slopes[0] - slopes[1]) == pytest.approx(0.112, abs=0.001)


def test_two_substrate_bad_input():
    with pytest.raises(InputError, match="substrate_cte_2"):
        films.film_properties_from_two_substrates(-1e6, -2e6, 3e-6, 3e-6)
    with pytest.raises(InputError, match="temperatures"):
        films.stress_temperature_slope([300, 300], [1.0, 2.0])


# ------------------------------------------------------------------------ design file and command
def _example_path():
    from pathlib import Path

    return Path(__file__).resolve().parent.parent / "bilayer" / "examples" / "nitride_on_wafer.toml"


def test_thermal_film_stress_matches_stoney_in_the_thin_limit():
    """Thermal misfit of a thin film (layers.md sec. 4.1 misfit form): <sigma_f> -> M_f eps_m with
    eps_m = integral (alpha_s - alpha_f) dT, exactly <sigma_f>/(M_f eps_m) = (1 + g r^3)/(1 + 4gr + 6gr^2
    + 4gr^3 + g^2 r^4) = 1 - 4gr + O(r^2) (derived from force and moment balance, checked with sympy);
    the curvature ratio equals the closed form of sec. 4.2."""
    from bilayer import Stack, Temperatures
    from bilayer.core.materials import Material

    substrate = Material("substrate", 130e9, 0.28, 2.6e-6)
    film = Material("film", 200e9, 0.25, 12e-6)
    result = films.film_thermal_stress(Stack.of((substrate, 500e-6), (film, 0.5e-6)), Temperatures(673.15, 298.15))
    misfit = (2.6e-6 - 12e-6) * (298.15 - 673.15)
    assert result.misfit_strain == pytest.approx(misfit, rel=1e-12)
    r, g = 1e-3, film.biaxial_modulus / substrate.biaxial_modulus
    exact = (1 + g * r**3) / (1 + 4 * g * r + 6 * g * r**2 + 4 * g * r**3 + g**2 * r**4)
    assert result.mean_film_stress / (film.biaxial_modulus * misfit) == pytest.approx(exact, rel=1e-10)
    assert exact == pytest.approx(1 - 4 * g * r, abs=20 * (g * r) ** 2)
    assert result.curvature / result.stoney_curvature == pytest.approx(films.stoney_curvature_ratio(r, g), rel=1e-9)
    assert result.stress_error == pytest.approx(films.stoney_stress_ratio(r, g) - 1, abs=1e-9)


def test_example_design_and_command_line(capsys):
    """The shipped example (invented data) runs from the design file and the command line; its scan
    data were made with M_f = 360 GPa and alpha_f = 3.0 ppm/K, which the two-substrate fit recovers."""
    import json

    from bilayer.cli.entry import main
    from bilayer.designs.design_file import load_design

    assessment = films.assess_film_design(load_design(_example_path()))
    assert assessment.two_substrate.film_biaxial_modulus == pytest.approx(360e9, rel=2e-3)
    assert assessment.two_substrate.film_cte == pytest.approx(3.0e-6, rel=2e-3)
    assert assessment.measured.stoney_stress > 0  # centre went down with the film up: tensile film
    assert assessment.thermal.substrate_biaxial_modulus == pytest.approx(films.silicon_biaxial_modulus("100"))
    assert main(["film", str(_example_path())]) == 0
    text = capsys.readouterr().out
    for needle in ("film side convex", "Stoney stress", "exact mean stress", "film biaxial modulus", "Cautions"):
        assert needle in text
    assert main(["film", str(_example_path()), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["measured"]["stoney_stress"] == pytest.approx(assessment.measured.stoney_stress)
