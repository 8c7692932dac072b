"""Thin films on substrates: Stoney stress from curvature, the exact bilayer correction, wafer bow,
silicon biaxial moduli, and film CTE and biaxial modulus from two substrates.

Sign convention (the project's, stated once and used everywhere here)::

        film (top, thickness h_f, biaxial modulus M_f)
    ==================================  z = h_s
        substrate (bottom, thickness h_s, biaxial modulus M_s)
    ----------------------------------  z = 0
    kappa > 0: top (film) face convex.  sigma > 0: tension.  bow b > 0: centre above the edges, film up.

With this convention Stoney's relation reads

    sigma_f = -M_s h_s^2 Delta_kappa / (6 h_f)                    (Stoney 1909; biaxial form, M_s = E_s/(1-nu_s))

so a tensile film makes the film side concave (Delta_kappa < 0). The traditional statement
sigma_f = +M_s h_s^2 Delta_kappa' / (6 h_f) counts curvature positive when the film side is concave
(Delta_kappa' = -Delta_kappa); the conversion happens here, at the edge, and nowhere else.
Delta_kappa is always the change caused by the film (after minus before deposition).

Exact two-layer plate (film notation r = h_f/h_s, g = M_f/M_s, misfit eps_m = (alpha_s - alpha_f) dT
for a thermal misfit; derived from force and moment balance of the bilayer in equal-biaxial bending):

    kappa_exact / kappa_Stoney = (1 + r) / (1 + 4gr + 6gr^2 + 4gr^3 + g^2 r^4) = 1 + (1 - 4g) r + O(r^2)
    <sigma_f>  / sigma_Stoney  = (1 + g r^3) / (1 + r)          (mean film stress from a measured curvature)

The second ratio is the correction factor of Klein (J. Appl. Phys. 88:5487, 2000).
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..core.errors import InputError, check_finite, check_range
from ..core.sagitta import bow_from_curvature, curvature_from_bow

__all__ = [
    "SILICON_STIFFNESS",
    "cubic_biaxial_modulus",
    "silicon_biaxial_modulus",
    "stoney_stress",
    "stoney_curvature",
    "exact_film_curvature",
    "stoney_curvature_ratio",
    "stoney_stress_ratio",
    "FilmStressResult",
    "film_stress_from_curvature",
    "film_stress_from_bow",
    "TwoSubstrateResult",
    "stress_temperature_slope",
    "film_properties_from_two_substrates",
    "curvature_from_bow",
    "bow_from_curvature",
    "STONEY_ASSUMPTIONS",
    "FilmThermalResult",
    "film_thermal_stress",
    "FilmAssessment",
    "assess_film_design",
]

SILICON_STIFFNESS = {"c11": 165.7e9, "c12": 63.9e9, "c44": 79.6e9}
"""Single-crystal silicon elastic constants near room temperature [Pa]; values as tabulated by
Hopcroft, Nix & Kenny, J. Microelectromech. Syst. 19:229 (2010) (from memory; verify before citing)."""

STONEY_ASSUMPTIONS = (
    "film much thinner than the substrate (Stoney); the exact bilayer correction is shown when the film "
    "biaxial modulus is given",
    "uniform equal-biaxial film stress and uniform (spherical) curvature over the measured span",
    "substrate elastically isotropic in its plane (true for Si(100) and Si(111) wafers), uniform thickness",
    "small deflection of a free, unclamped plate",
    "curvature change caused by the film: measured after minus before deposition",
)

LARGE_DEFLECTION_LIMIT = 1.0
"""Plate parameter D^2 |kappa| / h_s above which geometric non-linearity changes the curvature by more
than about 1 % (derived estimate, layers.md sec. 2.3 homogenised model; Freund, Floro & Chason 1999)."""

THICK_FILM_RATIO = 0.1
"""h_f/h_s above which Stoney's stress is off by about 10 % (Klein 2000; Hu & Huang 2004)."""


def cubic_biaxial_modulus(c11: float, c12: float, c44: float, plane: str = "100") -> float:
    """Biaxial modulus [Pa] of a cubic crystal film or wafer strained equally in its (100) or (111) plane.

    Derived from Hooke's law with the out-of-plane normal stress set to zero:
      (100): M = c11 + c12 - 2 c12^2 / c11
      (111): M = 6 c44 (c11 + 2 c12) / (c11 + 2 c12 + 4 c44)
    Both planes are elastically isotropic in-plane under equal-biaxial strain. The (110) plane is not
    (equal strains give unequal stresses), so it has no single biaxial modulus and is refused.
    """
    c11 = check_range("c11", c11, 0.0)
    c12 = check_finite("c12", c12)
    c44 = check_range("c44", c44, 0.0)
    key = str(plane).strip().strip("()").replace(" ", "")
    if key == "100":
        return c11 + c12 - 2.0 * c12 * c12 / c11
    if key == "111":
        bulk3 = c11 + 2.0 * c12
        return 6.0 * c44 * bulk3 / (bulk3 + 4.0 * c44)
    raise InputError(
        "plane",
        plane,
        "'100' or '111'",
        "a (110) wafer is anisotropic in its plane and has no single biaxial modulus",
    )


def silicon_biaxial_modulus(plane: str = "100") -> float:
    """Biaxial modulus [Pa] of a silicon wafer of the given orientation from :data:`SILICON_STIFFNESS`.

    About 180.3 GPa for (100) and 229.1 GPa for (111). Using E<100> = 130 GPa instead understates the
    Stoney stress by about 28 %.
    """
    return cubic_biaxial_modulus(plane=plane, **SILICON_STIFFNESS)


def _positive(field: str, value) -> np.ndarray:
    array = np.asarray(value, float)
    if not np.all(np.isfinite(array)) or np.any(array <= 0):
        raise InputError(field, array.tolist(), f"{field} > 0 (finite)")
    return array


def _out(value):
    array = np.asarray(value, float)
    return float(array) if array.ndim == 0 else array


def stoney_stress(curvature_change, substrate_thickness, film_thickness, substrate_biaxial_modulus):
    """Film stress [Pa] from the curvature change [1/m] by Stoney, project sign (film on top).

    sigma_f = -M_s h_s^2 Delta_kappa / (6 h_f): Delta_kappa > 0 (film side became convex) means a
    compressive film. Independent of the film's elastic constants. Broadcasts over arrays.
    """
    dk = np.asarray(curvature_change, float)
    if not np.all(np.isfinite(dk)):
        raise InputError("curvature_change", dk.tolist(), "a finite curvature [1/m]")
    hs = _positive("substrate_thickness", substrate_thickness)
    hf = _positive("film_thickness", film_thickness)
    ms = _positive("substrate_biaxial_modulus", substrate_biaxial_modulus)
    return _out(-ms * hs * hs * dk / (6.0 * hf))


def stoney_curvature(film_stress, substrate_thickness, film_thickness, substrate_biaxial_modulus):
    """Curvature change [1/m] that a film stress [Pa] causes by Stoney: -6 sigma_f h_f / (M_s h_s^2)."""
    sigma = np.asarray(film_stress, float)
    if not np.all(np.isfinite(sigma)):
        raise InputError("film_stress", sigma.tolist(), "a finite stress [Pa]")
    hs = _positive("substrate_thickness", substrate_thickness)
    hf = _positive("film_thickness", film_thickness)
    ms = _positive("substrate_biaxial_modulus", substrate_biaxial_modulus)
    return _out(-6.0 * sigma * hf / (ms * hs * hs))


def stoney_curvature_ratio(thickness_ratio, modulus_ratio):
    """kappa_exact / kappa_Stoney for a given misfit strain: (1 + r)/(1 + 4gr + 6gr^2 + 4gr^3 + g^2 r^4)."""
    r = _positive("thickness_ratio", thickness_ratio)
    g = _positive("modulus_ratio", modulus_ratio)
    return _out((1.0 + r) / (1.0 + 4 * g * r + 6 * g * r**2 + 4 * g * r**3 + g * g * r**4))


def stoney_stress_ratio(thickness_ratio, modulus_ratio):
    """sigma_Stoney / <sigma_f> for a given measured curvature: (1 + r)/(1 + g r^3) (Klein 2000)."""
    r = _positive("thickness_ratio", thickness_ratio)
    g = _positive("modulus_ratio", modulus_ratio)
    return _out((1.0 + r) / (1.0 + g * r**3))


def exact_film_curvature(
    misfit_strain, substrate_thickness, film_thickness, substrate_biaxial_modulus, film_biaxial_modulus
):
    """Exact two-layer plate curvature [1/m] for a film misfit strain eps_m = (alpha_s - alpha_f) dT.

    kappa = -6 eps_m g r (1 + r) / (h_s (1 + 4gr + 6gr^2 + 4gr^3 + g^2 r^4)); a positive misfit (film
    wants to be shorter, tensile) bends the film side concave (kappa < 0).
    """
    em = np.asarray(misfit_strain, float)
    hs = _positive("substrate_thickness", substrate_thickness)
    hf = _positive("film_thickness", film_thickness)
    ms = _positive("substrate_biaxial_modulus", substrate_biaxial_modulus)
    mf = _positive("film_biaxial_modulus", film_biaxial_modulus)
    r, g = hf / hs, mf / ms
    kappa_stoney = -6.0 * mf * em * hf / (ms * hs * hs)
    return _out(kappa_stoney * stoney_curvature_ratio(r, g))


@dataclass(frozen=True)
class FilmStressResult:
    """Film stress read back from a curvature change (all SI; project sign, film on top)."""

    curvature_before: float
    curvature_after: float
    curvature_change: float
    substrate_thickness: float
    film_thickness: float
    substrate_biaxial_modulus: float
    film_biaxial_modulus: float | None
    stoney_stress: float
    mean_film_stress: float | None
    stoney_error: float | None
    span: float | None
    bow_before: float | None
    bow_after: float | None
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]

    @property
    def thickness_ratio(self) -> float:
        return self.film_thickness / self.substrate_thickness

    @property
    def film_stress(self) -> float:
        """Best estimate: the exact mean film stress when the film modulus is known, else Stoney's."""
        return self.stoney_stress if self.mean_film_stress is None else self.mean_film_stress

    @property
    def film_force(self) -> float:
        """Film force per unit width sigma_f h_f [N/m]."""
        return self.film_stress * self.film_thickness

    def to_dict(self) -> dict:
        return {
            "curvature_before": self.curvature_before,
            "curvature_after": self.curvature_after,
            "curvature_change": self.curvature_change,
            "substrate_thickness": self.substrate_thickness,
            "film_thickness": self.film_thickness,
            "thickness_ratio": self.thickness_ratio,
            "substrate_biaxial_modulus": self.substrate_biaxial_modulus,
            "film_biaxial_modulus": self.film_biaxial_modulus,
            "stoney_stress": self.stoney_stress,
            "mean_film_stress": self.mean_film_stress,
            "stoney_error": self.stoney_error,
            "film_stress": self.film_stress,
            "film_force": self.film_force,
            "span": self.span,
            "bow_before": self.bow_before,
            "bow_after": self.bow_after,
            "sign_convention": "kappa > 0 film side convex; bow > 0 centre high with the film up; "
            "stress > 0 tension",
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "units": {
                "curvature_before": "1/m", "curvature_after": "1/m", "curvature_change": "1/m",
                "substrate_thickness": "m", "film_thickness": "m", "thickness_ratio": "1",
                "substrate_biaxial_modulus": "Pa", "film_biaxial_modulus": "Pa", "stoney_stress": "Pa",
                "mean_film_stress": "Pa", "stoney_error": "1", "film_stress": "Pa", "film_force": "N/m",
                "span": "m", "bow_before": "m", "bow_after": "m",
            },
        }


def film_stress_from_curvature(
    curvature_after: float,
    substrate_thickness: float,
    film_thickness: float,
    substrate_biaxial_modulus: float,
    curvature_before: float = 0.0,
    film_biaxial_modulus: float | None = None,
    span: float | None = None,
    film_facing: str = "up",
) -> FilmStressResult:
    """Film stress from the substrate curvature measured before and after deposition.

    Curvatures are in the project sign with the film on top; pass ``film_facing="down"`` when they were
    measured with the film facing down (their signs are then flipped here). With the film biaxial
    modulus, the exact mean film stress <sigma_f> = sigma_Stoney (1 + g r^3)/(1 + r) and Stoney's
    relative error sigma_Stoney/<sigma_f> - 1 are returned as well.
    """
    flip = _facing_sign(film_facing)
    k0 = flip * check_finite("curvature_before", curvature_before)
    k1 = flip * check_finite("curvature_after", curvature_after)
    hs = check_range("substrate_thickness", substrate_thickness, 0.0, 0.1, unit="m")
    hf = check_range("film_thickness", film_thickness, 0.0, 0.1, unit="m")
    ms = check_range("substrate_biaxial_modulus", substrate_biaxial_modulus, 0.0, 2e12, unit="Pa")
    dk = k1 - k0
    sigma = float(stoney_stress(dk, hs, hf, ms))
    r = hf / hs
    warnings = []
    mean = error = None
    if film_biaxial_modulus is not None:
        mf = check_range("film_biaxial_modulus", film_biaxial_modulus, 0.0, 2e12, unit="Pa")
        ratio = float(stoney_stress_ratio(r, mf / ms))
        mean = sigma / ratio
        error = ratio - 1.0
    else:
        mf = None
    if r > THICK_FILM_RATIO:
        warnings.append(
            f"film/substrate thickness ratio {r:.3g} exceeds {THICK_FILM_RATIO}: Stoney is off by about "
            f"{100 * r:.0f} %; give the film biaxial modulus for the exact bilayer value"
        )
    elif r > 0.01 and mf is None:
        warnings.append(f"thickness ratio {r:.3g}: Stoney overstates the stress by about {100 * r:.1f} %")
    if span is not None:
        span = check_range("span", span, 0.0, 10.0, unit="m")
        size = span * span * max(abs(k0), abs(k1)) / hs
        if size > LARGE_DEFLECTION_LIMIT:
            warnings.append(
                f"D^2|kappa|/h_s = {size:.3g} > {LARGE_DEFLECTION_LIMIT:g}: large-deflection effects may "
                "change the curvature (geometric non-linearity; Freund, Floro & Chason 1999)"
            )
    return FilmStressResult(
        curvature_before=k0,
        curvature_after=k1,
        curvature_change=dk,
        substrate_thickness=hs,
        film_thickness=hf,
        substrate_biaxial_modulus=ms,
        film_biaxial_modulus=mf,
        stoney_stress=sigma,
        mean_film_stress=mean,
        stoney_error=error,
        span=span,
        bow_before=None if span is None else float(bow_from_curvature(k0, span)),
        bow_after=None if span is None else float(bow_from_curvature(k1, span)),
        warnings=tuple(warnings),
        assumptions=STONEY_ASSUMPTIONS,
    )


def film_stress_from_bow(
    bow_after: float,
    span: float,
    substrate_thickness: float,
    film_thickness: float,
    substrate_biaxial_modulus: float,
    bow_before: float = 0.0,
    film_biaxial_modulus: float | None = None,
    film_facing: str = "up",
) -> FilmStressResult:
    """Film stress from the bow (sagitta) [m] over a scan diameter ``span`` [m], before and after.

    Each bow is turned into a curvature exactly (kappa = 8b/(D^2 + 4b^2)); the film stress follows
    from the change. b > 0 when the centre is high with the film facing up.
    """
    k0 = curvature_from_bow(check_finite("bow_before", bow_before), span)
    k1 = curvature_from_bow(check_finite("bow_after", bow_after), span)
    return film_stress_from_curvature(
        k1, substrate_thickness, film_thickness, substrate_biaxial_modulus, k0, film_biaxial_modulus,
        span, film_facing,
    )


def _facing_sign(film_facing: str) -> float:
    if film_facing == "up":
        return 1.0
    if film_facing == "down":
        return -1.0
    raise InputError("film_facing", film_facing, "'up' or 'down' (film side during the measurement)")


def stress_temperature_slope(temperatures, stresses) -> float:
    """Least-squares slope d sigma_f / dT [Pa/K] of film stress measured at several temperatures."""
    T = np.asarray(temperatures, float)
    s = np.asarray(stresses, float)
    if T.shape != s.shape or T.ndim != 1 or T.size < 2:
        raise InputError("temperatures/stresses", (T.shape, s.shape), "two 1-D arrays of equal length >= 2")
    if not (np.all(np.isfinite(T)) and np.all(np.isfinite(s))):
        raise InputError("temperatures/stresses", "non-finite entries", "finite numbers")
    if np.ptp(T) == 0:
        raise InputError("temperatures", T.tolist(), "at least two different temperatures")
    return float(np.polyfit(T, s, 1)[0])


@dataclass(frozen=True)
class TwoSubstrateResult:
    """Film biaxial modulus and CTE from stress-temperature slopes on two substrates (SI)."""

    film_biaxial_modulus: float
    film_cte: float
    slopes: tuple[float, float]
    substrate_ctes: tuple[float, float]
    modulus_sensitivity: float
    cte_sensitivity: float
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]

    def to_dict(self) -> dict:
        return {
            "film_biaxial_modulus": self.film_biaxial_modulus,
            "film_cte": self.film_cte,
            "slopes": list(self.slopes),
            "substrate_ctes": list(self.substrate_ctes),
            "modulus_sensitivity": self.modulus_sensitivity,
            "cte_sensitivity": self.cte_sensitivity,
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "units": {
                "film_biaxial_modulus": "Pa", "film_cte": "1/K", "slopes": "Pa/K", "substrate_ctes": "1/K",
                "modulus_sensitivity": "1", "cte_sensitivity": "1/K",
            },
        }


def film_properties_from_two_substrates(
    slope_1: float, slope_2: float, substrate_cte_1: float, substrate_cte_2: float
) -> TwoSubstrateResult:
    """Film biaxial modulus and CTE from the thermal stress slopes S_i = d sigma_f/dT on two substrates.

    In the thin-film limit S_i = M_f (alpha_si - alpha_f), hence
        M_f = (S_1 - S_2) / (alpha_s1 - alpha_s2),   alpha_f = alpha_s1 - S_1 / M_f.
    Use substrate CTEs that are secant values over the scan range (Thurn & Hughey 2004 show the result
    otherwise depends on the range). Sensitivities: a relative error u in each slope gives
    |dM_f|/M_f = u sqrt(S_1^2 + S_2^2)/|S_1 - S_2| (``modulus_sensitivity`` is that factor) and
    |d alpha_f| = u sqrt(2) |(alpha_s1 - alpha_s2) S_1 S_2| / (S_1 - S_2)^2 (``cte_sensitivity`` per unit u),
    both to first order for independent slope errors.
    """
    s1 = check_finite("slope_1", slope_1)
    s2 = check_finite("slope_2", slope_2)
    a1 = check_range("substrate_cte_1", substrate_cte_1, -1e-3, 1e-3, unit="1/K")
    a2 = check_range("substrate_cte_2", substrate_cte_2, -1e-3, 1e-3, unit="1/K")
    if a1 == a2:
        raise InputError("substrate_cte_2", a2, "a CTE different from substrate_cte_1")
    if s1 == s2:
        raise InputError("slope_2", s2, "a slope different from slope_1 (equal slopes give no modulus)")
    modulus = (s1 - s2) / (a1 - a2)
    cte = a1 - s1 / modulus
    warnings = []
    if modulus <= 0:
        warnings.append(
            f"the slopes give a non-positive biaxial modulus ({modulus:.3g} Pa): check slope signs and CTEs"
        )
    norm = math.hypot(s1, s2)
    modulus_sensitivity = norm / abs(s1 - s2)
    cte_sensitivity = math.sqrt(2.0) * abs((a1 - a2) * s1 * s2) / (s1 - s2) ** 2
    if modulus_sensitivity > 3.0:
        warnings.append(
            f"ill-conditioned: a 1 % slope error moves the modulus by {modulus_sensitivity:.1f} %; choose "
            "substrates whose CTEs differ more"
        )
    return TwoSubstrateResult(
        film_biaxial_modulus=modulus,
        film_cte=cte,
        slopes=(s1, s2),
        substrate_ctes=(a1, a2),
        modulus_sensitivity=modulus_sensitivity,
        cte_sensitivity=cte_sensitivity,
        warnings=tuple(warnings),
        assumptions=(
            "thin film on both substrates (Stoney limit), same film on both",
            "linear elastic film, constant M_f and alpha_f over the scan, no relaxation or phase change",
            "substrate CTEs are secant values over the scan range",
        ),
    )


# ------------------------------------------------------------------------- thermal film stress
@dataclass(frozen=True, eq=False)
class FilmThermalResult:
    """Thermal film stress and curvature of a film/substrate pair from the engine, beside Stoney (SI)."""

    stack_result: object
    substrate_biaxial_modulus: float
    film_biaxial_modulus: float
    misfit_strain: "float | np.ndarray"
    curvature: "float | np.ndarray"
    stoney_curvature: "float | np.ndarray"
    mean_film_stress: "float | np.ndarray"
    stoney_stress: "float | np.ndarray"
    span: float | None
    bow: "float | np.ndarray | None"
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]

    @property
    def curvature_error(self):
        """kappa_Stoney/kappa_exact - 1 for the known misfit (Stoney used as a predictor)."""
        return _out(np.asarray(self.stoney_curvature) / np.asarray(self.curvature) - 1.0)

    @property
    def stress_error(self):
        """sigma_Stoney/<sigma_f> - 1 for the curvature the exact bilayer has (Stoney used as a gauge)."""
        return _out(np.asarray(self.stoney_stress) / np.asarray(self.mean_film_stress) - 1.0)

    def to_dict(self) -> dict:
        from ..core.jsonable import plain

        return {
            "substrate_biaxial_modulus": self.substrate_biaxial_modulus,
            "film_biaxial_modulus": self.film_biaxial_modulus,
            "misfit_strain": plain(self.misfit_strain),
            "curvature": plain(self.curvature),
            "stoney_curvature": plain(self.stoney_curvature),
            "curvature_error": plain(self.curvature_error),
            "mean_film_stress": plain(self.mean_film_stress),
            "stoney_stress": plain(self.stoney_stress),
            "stress_error": plain(self.stress_error),
            "span": self.span,
            "bow": None if self.bow is None else plain(self.bow),
            "sign_convention": "kappa > 0 film side convex; bow > 0 centre high with the film up; stress > 0 tension",
            "stack": self.stack_result.to_dict(),
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "units": {
                "substrate_biaxial_modulus": "Pa", "film_biaxial_modulus": "Pa", "misfit_strain": "1",
                "curvature": "1/m", "stoney_curvature": "1/m", "curvature_error": "1", "mean_film_stress": "Pa",
                "stoney_stress": "Pa", "stress_error": "1", "span": "m", "bow": "m",
            },
        }


def _substrate_with_modulus(substrate, biaxial_modulus: float):
    """The substrate material with E set so that E/(1-nu) equals the given biaxial modulus."""
    return substrate.with_changes(youngs_modulus=biaxial_modulus * (1.0 - substrate.poisson_ratio))


def film_thermal_stress(stack, temperatures, substrate_biaxial_modulus: float | None = None,
                        span: float | None = None) -> FilmThermalResult:
    """Thermal film stress of a two-layer stack (substrate at the bottom, film on top) in the plate state.

    The engine gives the exact curvature and mean film stress; beside them Stoney's curvature for the
    same misfit, eps_m = eps_th,substrate - eps_th,film (integrated CTEs), and Stoney's stress read from
    the exact curvature. ``substrate_biaxial_modulus`` (e.g. :func:`silicon_biaxial_modulus`) replaces
    E/(1-nu) of the substrate material; ``span`` adds the bow over that diameter.
    """
    from ..core.stack import Layer, Stack, evaluate

    if not isinstance(stack, Stack) or stack.n_layers != 2:
        raise InputError("stack", stack, "a two-layer Stack: substrate (layer 1) and film (layer 2)")
    substrate, film = stack.layers
    if substrate_biaxial_modulus is not None:
        modulus = check_range("substrate_biaxial_modulus", substrate_biaxial_modulus, 0.0, 2e12, unit="Pa")
        stack = Stack((Layer(_substrate_with_modulus(substrate.material, modulus), substrate.thickness, substrate.label),
                       film))
        substrate = stack.layers[0]
    result = evaluate(stack, temperatures, "plate")
    ms, mf = substrate.material.biaxial_modulus, film.material.biaxial_modulus
    hs, hf = substrate.thickness, film.thickness
    t0, t = temperatures.stress_free, temperatures.operating
    misfit = _out(np.asarray(substrate.material.cte.thermal_strain(t0, t), float)
                  - np.asarray(film.material.cte.thermal_strain(t0, t), float))
    kappa = result.curvature
    mean_stress = _out(np.asarray(result.layer_force)[..., 1] / hf)
    warnings = list(result.warnings)
    if hf / hs > THICK_FILM_RATIO:
        warnings.append(f"film/substrate thickness ratio {hf / hs:.3g} > {THICK_FILM_RATIO}: Stoney is far off")
    bow = None
    if span is not None:
        span = check_range("span", span, 0.0, 10.0, unit="m")
        bow = bow_from_curvature(kappa, span)
    return FilmThermalResult(
        stack_result=result,
        substrate_biaxial_modulus=ms,
        film_biaxial_modulus=mf,
        misfit_strain=misfit,
        curvature=kappa,
        stoney_curvature=stoney_curvature(mf * np.asarray(misfit), hs, hf, ms),
        mean_film_stress=mean_stress,
        stoney_stress=stoney_stress(kappa, hs, hf, ms),
        span=span,
        bow=bow,
        warnings=tuple(warnings),
        assumptions=tuple(result.assumptions) + (
            "film stress is thermal only: intrinsic (growth) stress is not included",
        ),
    )


# ---------------------------------------------------------------------------------- design files
@dataclass(frozen=True, eq=False)
class FilmAssessment:
    """Thermal stress of the design's film, and (when given) stress from measured bow and the
    two-substrate inversion."""

    thermal: FilmThermalResult
    measured: FilmStressResult | None
    two_substrate: TwoSubstrateResult | None

    @property
    def warnings(self) -> tuple[str, ...]:
        out = self.thermal.warnings
        for part in (self.measured, self.two_substrate):
            out += () if part is None else part.warnings
        return out

    def to_dict(self) -> dict:
        return {
            "thermal": self.thermal.to_dict(),
            "measured": None if self.measured is None else self.measured.to_dict(),
            "two_substrate": None if self.two_substrate is None else self.two_substrate.to_dict(),
        }


def assess_film_design(design) -> FilmAssessment:
    """Run the ``[film]`` section of a two-layer design (substrate, film)."""
    if "film" not in design.sections:
        raise InputError("design.sections", sorted(design.sections), "a [film] section")
    if design.stack.n_layers != 2:
        raise InputError("design.layers", design.stack.n_layers, "2 layers: substrate (bottom) and film")
    values = design.sections["film"]
    substrate, film = design.stack.layers
    modulus = values.get("substrate_biaxial_modulus")
    orientation = values.get("substrate_orientation", "isotropic")
    if modulus is None and orientation != "isotropic":
        modulus = silicon_biaxial_modulus(orientation)
    ms = substrate.material.biaxial_modulus if modulus is None else modulus
    span = values.get("scan_diameter")
    thermal = film_thermal_stress(design.stack, design.temperatures, modulus, span)
    mf = film.material.biaxial_modulus if values.get("exact_correction", True) else None
    facing = values.get("film_facing", "up")
    measured = None
    if "bow_after" in values:
        measured = film_stress_from_bow(values["bow_after"], span, substrate.thickness, film.thickness, ms,
                                        values.get("bow_before", 0.0), mf, facing)
    elif "curvature_after" in values:
        measured = film_stress_from_curvature(values["curvature_after"], substrate.thickness, film.thickness, ms,
                                              values.get("curvature_before", 0.0), mf, span, facing)
    two = None
    if "scan_temperatures" in values:
        temps = values["scan_temperatures"]
        low, high = min(temps), max(temps)
        cte_1 = substrate.material.cte.secant(low, high)
        two = film_properties_from_two_substrates(
            stress_temperature_slope(temps, values["scan_stress_1"]),
            stress_temperature_slope(temps, values["scan_stress_2"]),
            float(cte_1), values["second_substrate_cte"],
        )
    return FilmAssessment(thermal, measured, two)
