"""Isotropic layer material: elastic constants, CTE model and the data's provenance.

All values SI: Pa, 1/K, kg/m^3, absolute temperatures in K. Derived moduli used by the bending
states of the engine (narrow strip E, wide strip E/(1-nu^2), equal-biaxial plate E/(1-nu)).
"""
from __future__ import annotations

from dataclasses import dataclass, field, replace
from types import MappingProxyType
from typing import Mapping

from ..errors import InputError, check_finite, warn_suspicious
from .cte import ALPHA_LIMIT, CTEModel, ConstantCTE

__all__ = ["Material", "E_MAX", "DENSITY_MAX"]

E_MAX = 1.25e12
"""Upper limit of Young's modulus [Pa]: diamond, the stiffest solid, is 0.7-1.2 TPa."""
DENSITY_MAX = 23000.0
"""Upper limit of density [kg/m^3]: osmium, the densest element, is about 22 600 kg/m^3."""

_E_WARN_LOW = 1.0e6
_E_WARN_HIGH = 5.0e11
_PSI_BAND = (1.0e6, 1.0e8)
_ALPHA_WARN = 3.0e-4
_NU_WARN_HIGH = 0.49
_DENSITY_WARN_LOW = 500.0


def _optional_positive(name: str, value, label: str, high: float | None = None, unit: str = "") -> float | None:
    if value is None:
        return None
    value = check_finite(name, value)
    if not (value > 0.0 and (high is None or value <= high)):
        valid = f"0 < {name}" + (f" <= {high:g}" if high is not None else "") + (f" {unit}" if unit else "")
        raise InputError(name, value, valid, f"material {label!r}")
    return value


def _temperature(name: str, value, label: str) -> float | None:
    if value is None:
        return None
    value = check_finite(name, value)
    if value <= 0.0:
        raise InputError(name, value, "an absolute temperature > 0 K", f"material {label!r}; add 273.15 to degC")
    return value


@dataclass(frozen=True)
class Material:
    """A homogeneous, isotropic (or in-plane isotropic) layer material.

    Fields: ``youngs_modulus`` E [Pa], ``poisson_ratio`` nu [-], ``cte`` a CTE model (a float is a
    constant coefficient [1/K]), ``density`` [kg/m^3], ``strength`` [Pa] with ``strength_kind``
    saying which (yield, tensile, flexural...), ``temperature_range`` (low, high) [K] where the data
    are meant to be used, ``glass_transition`` and ``solidus`` [K], ``sources`` naming where each
    value comes from (field name -> citation text), ``composition`` the nominal composition of an alloy
    in the usual notation ("Sn-3.0Ag-0.5Cu"; the solder job picks its life law from it).

    Hard limits (InputError): 0 < E <= 1.25e12 Pa, -1 < nu < 0.5 (stability of an isotropic solid),
    |alpha| < 1e-3 /K, 0 < density <= 23000 kg/m^3, strength > 0. Legal but suspicious values
    (E < 1 MPa or > 500 GPa, a metal-like material with E of 1-100 MPa, i.e. psi typed as Pa,
    nu < 0 or > 0.49, |alpha| > 3e-4 /K or alpha < 0, density < 500 kg/m^3, strength above E/20
    when E >= 20 GPa, an elastic strain over 5 % in a metal or ceramic) give a SuspiciousInputWarning.

    A float ``cte`` becomes ``ConstantCTE(value, valid_range=temperature_range)``.
    """

    name: str
    youngs_modulus: float
    poisson_ratio: float
    cte: CTEModel | float
    density: float | None = None
    strength: float | None = None
    strength_kind: str = ""
    temperature_range: tuple[float, float] | None = None
    glass_transition: float | None = None
    solidus: float | None = None
    category: str = ""
    key: str = ""
    sources: Mapping[str, str] = field(default_factory=dict, hash=False)
    notes: str = ""
    composition: str = ""

    def __post_init__(self):
        if not isinstance(self.name, str) or not self.name.strip():
            raise InputError("name", self.name, "a non-empty text")
        label = self.name
        for text_field in ("strength_kind", "category", "key", "notes", "composition"):
            if not isinstance(getattr(self, text_field), str):
                raise InputError(text_field, getattr(self, text_field), "a text", f"material {label!r}")
        set_ = object.__setattr__

        modulus = check_finite("youngs_modulus", self.youngs_modulus)
        if not 0.0 < modulus <= E_MAX:
            raise InputError("youngs_modulus", modulus, f"0 < youngs_modulus <= {E_MAX:g} Pa",
                             f"material {label!r}; modulus is in Pa: 200 GPa is 200e9")
        set_(self, "youngs_modulus", modulus)

        nu = check_finite("poisson_ratio", self.poisson_ratio)
        if not -1.0 < nu < 0.5:
            raise InputError("poisson_ratio", nu, "-1 < poisson_ratio < 0.5", f"material {label!r}")
        set_(self, "poisson_ratio", nu)

        set_(self, "density", _optional_positive("density", self.density, label, DENSITY_MAX, "kg/m^3"))
        set_(self, "strength", _optional_positive("strength", self.strength, label, unit="Pa"))

        if self.temperature_range is not None:
            try:
                low, high = self.temperature_range
            except (TypeError, ValueError):
                raise InputError("temperature_range", self.temperature_range,
                                 "a pair (low, high) of absolute temperatures in K", f"material {label!r}") from None
            low = _temperature("temperature_range[0]", low, label)
            high = _temperature("temperature_range[1]", high, label)
            if not low < high:
                raise InputError("temperature_range", (low, high), "low < high", f"material {label!r}")
            set_(self, "temperature_range", (low, high))
        set_(self, "glass_transition", _temperature("glass_transition", self.glass_transition, label))
        set_(self, "solidus", _temperature("solidus", self.solidus, label))

        cte = self.cte
        if not isinstance(cte, CTEModel):
            value = check_finite("cte", cte)
            if not abs(value) < ALPHA_LIMIT:
                raise InputError("cte", value, f"|alpha| < {ALPHA_LIMIT:g} 1/K",
                                 f"material {label!r}; CTE is in 1/K: 17 ppm/K is 17e-6")
            cte = ConstantCTE(value, valid_range=self.temperature_range)
            set_(self, "cte", cte)

        sources = self.sources
        if not isinstance(sources, Mapping) or not all(
            isinstance(k, str) and isinstance(v, str) for k, v in sources.items()
        ):
            raise InputError("sources", sources, "a mapping of field name to source text", f"material {label!r}")
        set_(self, "sources", MappingProxyType(dict(sources)))

        self._warn_if_suspicious()

    def _warn_if_suspicious(self) -> None:
        label = f"material {self.name!r}"
        modulus, nu, alpha = self.youngs_modulus, self.poisson_ratio, self.alpha
        if modulus < _E_WARN_LOW:
            warn_suspicious("youngs_modulus", modulus,
                            f"{label}: below 1 MPa (soft gels exist, but GPa or MPa typed as Pa is more likely)", stacklevel=5)
        elif modulus > _E_WARN_HIGH:
            warn_suspicious("youngs_modulus", modulus,
                            f"{label}: above 500 GPa, stiffer than all but diamond and a few carbides and metals", stacklevel=5)
        metal_like = (self.density is not None and self.density >= 2500.0) or abs(alpha) < 5e-5
        if _PSI_BAND[0] <= modulus < _PSI_BAND[1] and metal_like:
            warn_suspicious("youngs_modulus", modulus,
                            f"{label}: a stiff-looking material (dense or low CTE) with E of 1-100 MPa; "
                            "was the value typed in psi? (steel: 29e6 psi = 200e9 Pa)", stacklevel=5)
        if nu < 0.0:
            warn_suspicious("poisson_ratio", nu, f"{label}: negative (auxetic materials exist, but check)", stacklevel=5)
        elif nu > _NU_WARN_HIGH:
            warn_suspicious("poisson_ratio", nu,
                            f"{label}: above 0.49, nearly incompressible; formulas with 1/(1-2 nu) become ill-conditioned", stacklevel=5)
        if abs(alpha) > _ALPHA_WARN:
            warn_suspicious("cte", alpha, f"{label}: |alpha| above 3e-4 /K, beyond soft polymers", stacklevel=5)
        elif alpha < 0.0:
            warn_suspicious("cte", alpha, f"{label}: negative CTE (real for a few materials, but check the sign)", stacklevel=5)
        if self.density is not None and self.density < _DENSITY_WARN_LOW:
            warn_suspicious("density", self.density, f"{label}: below 500 kg/m^3 (g/cm^3 typed as kg/m^3?)", stacklevel=5)
        if self.strength is not None and modulus >= 20e9 and self.strength > modulus / 20.0:
            warn_suspicious("strength", self.strength, f"{label}: above E/20, an elastic strain over 5 %", stacklevel=5)

    # --- derived properties ----------------------------------------------------------------------
    @property
    def alpha(self) -> float:
        """Representative CTE [1/K]: the constant, or the 20-100 degC mean of a table or fit."""
        return self.cte.nominal

    @property
    def shear_modulus(self) -> float:
        """G = E / (2 (1 + nu)) [Pa]."""
        return self.youngs_modulus / (2.0 * (1.0 + self.poisson_ratio))

    @property
    def biaxial_modulus(self) -> float:
        """E / (1 - nu) [Pa], equal-biaxial (plate, wafer, thin film) stiffness."""
        return self.youngs_modulus / (1.0 - self.poisson_ratio)

    @property
    def plane_strain_modulus(self) -> float:
        """E / (1 - nu^2) [Pa], wide strip in cylindrical bending."""
        return self.youngs_modulus / (1.0 - self.poisson_ratio**2)

    def with_changes(self, **changes) -> "Material":
        """A new, re-validated material with some fields changed."""
        return replace(self, **changes)
