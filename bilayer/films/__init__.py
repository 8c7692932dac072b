"""Thin films on substrates: Stoney stress from curvature or bow, the exact bilayer correction,
silicon biaxial moduli, film thermal stress, two-substrate inversion, and the design-file job.

Short paths::

    from bilayer.films import stoney_stress, film_stress_from_bow, film_thermal_stress
"""
from .stress import (
    SILICON_STIFFNESS,
    cubic_biaxial_modulus,
    silicon_biaxial_modulus,
    stoney_stress,
    stoney_curvature,
    exact_film_curvature,
    stoney_curvature_ratio,
    stoney_stress_ratio,
    FilmStressResult,
    film_stress_from_curvature,
    film_stress_from_bow,
    TwoSubstrateResult,
    stress_temperature_slope,
    film_properties_from_two_substrates,
    curvature_from_bow,
    bow_from_curvature,
    STONEY_ASSUMPTIONS,
    FilmThermalResult,
    film_thermal_stress,
    FilmAssessment,
    assess_film_design,
)

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
