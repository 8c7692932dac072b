"""Run every thermostat check that a design's [thermostat] section asks for, and report it.

:func:`analyse` builds the element from a :class:`~bilayer.core.stack.Design` (stack + [conditions] +
[thermostat]) and returns a :class:`ThermostatReport`: flexivity, travel-versus-temperature curve, set
point (or the gap for a required set point), contact force and stresses after an overtravel, usable
temperature span, work output, tolerance scatter (first order and Monte Carlo) and, for a formed disc,
the indicative snap estimate. Every report carries the thermostat cautions.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import numpy as np

from ..core.progress import Progress
from ..core.errors import InputError
from ..core.stack import Design
from .element import THERMOSTAT_ASSUMPTIONS, THERMOSTAT_CAUTIONS, ThermalElement, closing_temperature, contact_load, gap_for_set_point, response, work_output, working_span
from .forms import element_from_mapping
from .strip import DatasheetStrip, Flexivity, ThermostatStrip

__all__ = ["ThermostatReport", "element_from_design", "analyse"]

_FORM_KEYS = {
    "cantilever": ("length",),
    "supported": ("length",),
    "u_shape": ("leg_length", "bend_radius", "bend_toward"),
    "spiral": ("length", "pointer_length"),
    "helix": ("length", "pointer_length", "lead_angle"),
    "disc": ("diameter",),
}


def element_from_design(design: Design) -> ThermalElement:
    """The thermal element described by ``design.sections["thermostat"]`` (SI values)."""
    if "thermostat" not in design.sections:
        raise InputError("design.sections", sorted(design.sections), "a [thermostat] section")
    values = dict(design.sections["thermostat"])
    form_values = {"form": values["form"]}
    form_values.update({k: values[k] for k in _FORM_KEYS[values["form"]] if values.get(k) is not None})
    form = element_from_mapping(form_values)
    reference = values.get("reference_temperature")
    if values.get("flexivity") is not None:
        flex = Flexivity.from_datasheet(values["flexivity"], note="design file [thermostat] flexivity")
        strip = DatasheetStrip(
            flex, values["strip_thickness"], values["width"],
            design.temperatures.stress_free if reference is None else reference,
            modulus=values["flexural_modulus"], poisson_ratio=values.get("poisson_ratio", 0.3),
            allowable=values.get("limit_stress"),
        )
    else:
        strip = ThermostatStrip(design.stack, values["width"], design.temperatures.stress_free, reference, design.state)
    return ThermalElement(strip, form, design.name)


@dataclass(frozen=True, eq=False)
class ThermostatReport:
    """Everything computed for one [thermostat] section; absent parts are None."""

    name: str
    element: ThermalElement
    flexivity: Flexivity
    curve: Any
    set_point: Any
    gap: float | None
    required_gap: Any
    load: Any
    span: Any
    work: Any
    first_order: Any
    monte_carlo: Any
    snap: Any
    sizing: Any
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...] = THERMOSTAT_ASSUMPTIONS
    cautions: tuple[str, ...] = THERMOSTAT_CAUTIONS

    def to_dict(self) -> dict:
        def part(value):
            return None if value is None else value.to_dict()

        return {
            "name": self.name,
            "element": self.element.to_dict(),
            "flexivity": self.flexivity.to_dict(),
            "curve": part(self.curve),
            "set_point": part(self.set_point),
            "gap": self.gap,
            "required_gap": part(self.required_gap),
            "contact_load": part(self.load),
            "working_span": part(self.span),
            "work": part(self.work),
            "tolerance_first_order": part(self.first_order),
            "tolerance_monte_carlo": part(self.monte_carlo),
            "snap_disc": part(self.snap),
            "sizing": part(self.sizing),
            "warnings": list(self.warnings),
            "assumptions": list(self.assumptions),
            "cautions": list(self.cautions),
        }

    def to_text(self, system: str = "si", cautions: bool = True) -> str:
        """A readable summary in the chosen unit system ("si" or "us"), with the cautions unless asked not to."""
        from ..core.units import format_quantity

        e = self.element
        rot = e.form.output == "rotation"

        def travel(x):
            return format_quantity(x, "angle", system) if rot else format_quantity(x, "length", system)

        lines = [f"Thermostat element: {self.name or e.form.kind}", f"  {e.describe()}"]
        if self.sizing is not None:
            z = self.sizing
            lines.append(f"  sized: thickness {format_quantity(z.thickness, 'length', system)}, size {format_quantity(z.size, 'length', system)} "
                         f"(force {format_quantity(z.force, 'force', system)} after the overtravel; "
                         f"{'within' if z.within_limit else 'ABOVE'} the stress limit, utilisation {z.utilisation:.3g})")
        f = self.flexivity
        over = ""
        if f.temperature_low is not None and f.temperature_high is not None:
            over = f" over {format_quantity(f.temperature_low, 'temperature', system)} to {format_quantity(f.temperature_high, 'temperature', system)}"
        lines.append(f"  flexivity ({f.origin}{over}): {f.per_kelvin:.4g} 1/K = {f.per_fahrenheit:.4g} 1/degF (ASTM B106)")
        if self.required_gap is not None:
            g = self.required_gap
            lines.append(f"  gap for a set point of {format_quantity(g.set_point, 'temperature', system)}: {travel(g.gap)} "
                         f"(small-deflection {travel(g.gap_small)})")
        if self.set_point is not None:
            s = self.set_point
            lines.append(f"  closes {travel(s.gap)} on {s.direction} at {format_quantity(s.temperature, 'temperature', system)} "
                         f"(small-deflection {format_quantity(s.temperature_small, 'temperature', system)})")
        if self.load is not None:
            at = format_quantity(self.load.temperatures[0], "temperature", system)
            if rot:
                lines.append(f"  contact torque at {at}: {self.load.force[0]:.4g} N*m; stiffness {self.load.stiffness:.4g} N*m/rad")
            else:
                lines.append(f"  contact force at {at}: {format_quantity(self.load.force[0], 'force', system)}; "
                             f"stiffness {self.load.stiffness:.4g} N/m")
            peak = self.load.peak_stress[0]
            lines.append("  peak layer stress: " + ", ".join(format_quantity(p, "stress", system) for p in np.atleast_1d(peak))
                         + (f" (utilisation {self.load.utilisation[0]:.3g})" if np.isfinite(self.load.utilisation[0]) else ""))
        if self.span is not None:
            sp = self.span
            limits = [format_quantity(t, "temperature", system) if t is not None else "not reached in the curve range"
                      for t in (sp.lower_limit, sp.upper_limit)]
            lines.append(f"  usable span (stress): {limits[0]} to {limits[1]}; overtravel "
                         + (format_quantity(sp.overtravel, "temperature_difference", system) if sp.overtravel is not None else "beyond the curve range"))
        if self.work is not None:
            w = self.work
            lines.append(f"  best work to the set point: {w.work:.4g} J ({w.work_per_volume:.4g} J/m^3); "
                         f"E_f F^2 = {w.merit:.4g} Pa/K^2")
        for label, stats in (("first order", self.first_order), ("Monte Carlo", self.monte_carlo)):
            if stats is not None:
                lo, hi = stats.percentiles[0.135], stats.percentiles[99.865]
                lines.append(f"  set-point scatter ({label}{', %d samples' % stats.samples if stats.samples else ''}): "
                             f"mean {format_quantity(stats.mean, 'temperature', system)}, std {format_quantity(stats.std, 'temperature_difference', system)}, "
                             f"0.135-99.865 % {format_quantity(lo, 'temperature', system)} to {format_quantity(hi, 'temperature', system)}")
                lines.append("    contributors: " + ", ".join(f"{k} {100 * v:.1f} %" for k, v in stats.contributors))
        if self.snap is not None:
            sn = self.snap
            if sn.snaps:
                lines.append(f"  snap disc (INDICATIVE): trip {_t(sn.snap_temperature, format_quantity, system)}, reset "
                             f"{_t(sn.reset_temperature, format_quantity, system)}")
            else:
                lines.append("  snap disc (INDICATIVE): no snap (dome too shallow)")
        for text in self.warnings:
            lines.append(f"  warning: {text}")
        if cautions:
            lines.append("Cautions:")
            lines += [f"  - {c}" for c in self.cautions]
        return "\n".join(lines)


def _t(value, format_quantity, system):
    return "outside the search range" if value is None else format_quantity(value, "temperature", system)


def analyse(design: Design, progress: Progress | None = None) -> ThermostatReport:
    """Run the checks the design's [thermostat] section asks for (see the module docstring).

    The travel curve and the search for the stress limits cover ``curve_from``..``curve_to`` (default:
    40 K below the reference temperature to 120 K above it, or past the set point plus twice the overtravel).
    """
    from .tolerances import Tolerance, first_order_set_point, monte_carlo_set_point

    element = element_from_design(design)
    values = dict(design.sections["thermostat"])
    sizing = None
    if values.get("sizing_force") is not None:
        from .sizing import size_element

        sizing = size_element(element.strip, element.form, values["gap"], values["set_point"], values["sizing_force"],
                              values["overtravel"], factor=values["stress_factor"], limit_stress=values.get("limit_stress"))
        element = sizing.element
        values.pop("set_point")
    strip = element.strip
    ref = element.reference_temperature
    warnings: list[str] = []
    required = None
    if values.get("set_point") is not None:
        required = gap_for_set_point(element, values["set_point"])
        gap = required.gap
    else:
        gap = values.get("gap", values.get("angle_gap"))
    set_point = closing_temperature(element, gap, values["contact_side"]) if gap is not None else None
    side = values["contact_side"]
    if values.get("curve_from") is not None:
        temps = np.linspace(values["curve_from"], values["curve_to"], values["curve_points"])
    else:
        top = max(ref + 120.0, (set_point.temperature + 2 * values["overtravel"]) if set_point else ref)
        temps = np.linspace(max(ref - 40.0, 1.0), top, values["curve_points"])
    curve = response(element, temps)
    if isinstance(strip, ThermostatStrip):
        flex = strip.flexivity(float(temps.min()), float(temps.max()))
    else:
        flex = strip.flexivity
    load = span = work = first = mc = snap = None
    if set_point is not None:
        beyond = set_point.temperature + values["overtravel"] * (1 if set_point.direction == "heating" else -1)
        load = contact_load(element, gap, [beyond], side, values["stress_factor"], values.get("limit_stress"))
        if np.all(np.isfinite(load.allowable)):
            try:
                span = working_span(element, gap, side, values["stress_factor"], values.get("limit_stress"),
                                    search=(float(temps.min()), float(temps.max())))
            except InputError as error:
                warnings.append(f"usable span not computed: {error}")
        else:
            warnings.append("usable span not computed: give limit_stress (some layers have no strength data)")
        work = work_output(element, set_point.temperature)
        tolerances = _tolerances(element, values, Tolerance)
        if tolerances:
            first = first_order_set_point(element, gap, tolerances, side)
            if values["monte_carlo"]:
                mc = monte_carlo_set_point(element, gap, tolerances, values["samples"], side, progress=progress)
    if values.get("dome_height") is not None:
        from .snap_disc import SnapDisc, snap_temperatures

        snap = snap_temperatures(SnapDisc(strip, values["diameter"], values["dome_height"]))
    return ThermostatReport(design.name, element, flex, curve, set_point, gap, required, load, span, work, first, mc,
                            snap, sizing, tuple(dict.fromkeys(curve.warnings + tuple(warnings))))


def _tolerances(element: ThermalElement, values: dict, Tolerance) -> dict:
    out = {}
    if values.get("tolerance_thickness"):
        out["thickness"] = Tolerance(values["tolerance_thickness"])
    if values.get("tolerance_length"):
        out["length"] = Tolerance(values["tolerance_length"])
    if values.get("tolerance_gap"):
        out["gap"] = Tolerance(values["tolerance_gap"], relative=False)
    if isinstance(element.strip, DatasheetStrip):
        if values.get("tolerance_flexivity"):
            out["flexivity"] = Tolerance(values["tolerance_flexivity"])
        return out
    for i in range(1, element.strip.n_layers + 1):
        if values.get("tolerance_cte"):
            out[f"cte_{i}"] = Tolerance(values["tolerance_cte"])
        if values.get("tolerance_modulus"):
            out[f"modulus_{i}"] = Tolerance(values["tolerance_modulus"])
    return out
