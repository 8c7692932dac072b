"""The text report of a solder-joint assessment (``bilayer solder`` and the solder panel)."""
from __future__ import annotations

import numpy as np

__all__ = ["report"]


def _cycle_text(cycle, system: str) -> str:
    from ..core.units import format_quantity

    return (f"{format_quantity(cycle.low, 'temperature', system)} to {format_quantity(cycle.high, 'temperature', system)}, dwell "
            f"{format_quantity(cycle.dwell, 'time', system)}, {cycle.cycles_per_day:g} cycles/day")


def _law_input(law, value: float, system: str) -> str:
    from ..core.units import format_quantity

    if law.kind == "energy":
        return format_quantity(value, "energy_density", system)
    return f"{value:.4g} ({100 * value:.3g} %)"


def _joint_lines(j, system: str) -> list[str]:
    from ..core.units import format_quantity
    from .geometry import JOINT_TYPES

    def length(value):
        return format_quantity(value, "length", system)

    g = j.joint
    lines = [f"  joint                {JOINT_TYPES[g.kind]}"]
    sizes = f"L_D {length(g.dnp)}, stand-off {length(g.standoff)}"
    if g.joint_height != g.standoff:
        sizes += f", joint height h {length(g.joint_height)}"
    if g.kind == "leaded":
        sizes += (f", lead stiffness {format_quantity(g.lead_stiffness, 'stiffness', system)}, "
                  f"area {format_quantity(g.joint_area, 'area', system)}")
    lines.append(f"  sizes                {sizes}")
    lines += [f"    {text}" for text in g.definitions]
    lines.append(f"  factor F             {j.factor:g}" + ("" if j.factor_given else " (not given: default)"))
    return lines


def report(design, assessment, system: str = "si", source: str = "") -> str:
    """Plain-text report of a :class:`bilayer.solder.SolderAssessment`."""
    from ..core.units import format_quantity
    from .acceleration import NORRIS_LANDZBERG_CONVENTION

    j = assessment.joint
    law = j.life_law
    title = design.name or "(unnamed design)"
    lines = [f"{title}  [{source}]" if source else title]
    warnings = assessment.warnings
    if warnings:
        lines += ["", "Warnings (read these first):"] + [f"  - {text}" for text in warnings]
    lines += ["", "Solder joint (screening estimate)"]
    lines += _joint_lines(j, system)
    lines.append(f"  solder               {j.alloy.label} ({j.alloy.basis})")
    lines.append(f"  field cycle          {_cycle_text(j.cycle, system)}")
    if j.board_cycle is not j.cycle:
        lines.append(f"  board cycle          {_cycle_text(j.board_cycle, system)}")
    lines.append(f"  mismatch strain      {j.mismatch_strain:.4g} (board minus component, integrated CTEs)")
    lines.append(f"  global shear strain  {j.shear_strain:.4g} ({100 * j.shear_strain:.3g} %)")
    if j.local_mismatch_component is not None:
        lines.append(f"  local mismatch       solder/component {j.local_mismatch_component:.3g}, "
                     f"solder/board {j.local_mismatch_board:.3g} (not amplified by L_D/h)")

    lines += ["", f"Life law: {law.name}", f"  equation             {law.describe()}",
              f"  source               {law.source or 'the user'}"]
    lines += [f"  note                 {text}" for text in law.notes]
    for name, constant in law.constants().items():
        lines.append(f"  {name:<20} {constant.value:.6g} {'' if constant.unit == '1' else constant.unit}".rstrip()
                     + f"   [{constant.status}] {constant.source}")
    if law.kind == "energy":
        lines.append(f"  energy defined as    {law.energy_definition}")
    lines.append(f"  input                {law.input_name} {_law_input(law, j.law_input, system)} "
                 f"({j.law_input_origin})")
    if j.fatigue_exponent is not None:
        lines.append(f"  exponent c           {j.fatigue_exponent:.5f} at the field cycle")
    lines.append(f"  median life N50      {j.median_life:.4g} cycles (field)")
    lines.append(f"  Weibull (shape {j.weibull_shape:g}, assumed): eta = {j.weibull_scale:.4g} cycles, "
                 f"{100 * j.early_fraction:g} % failed at {j.early_life:.4g} cycles")

    if j.test is not None:
        s, chamber = j.acceleration_set, j.chamber
        lines += ["", f"Test cycle {j.test.label}: {_cycle_text(j.test, system)}"]
        lines.append(f"  acceleration set     {s.label}: n = {s.swing_exponent:g}, m = {s.frequency_exponent:.4g}, "
                     f"Ea/k = {s.activation_temperature:g} K ({s.status})")
        lines.append(f"  Norris-Landzberg AF  {j.acceleration_factor:.4g} (field cycles per test cycle)")
        lines.append(f"  convention           {NORRIS_LANDZBERG_CONVENTION}")
        lines.append(f"  chamber life N50     {chamber.life:.4g} cycles  <- the figure this result stands behind "
                     f"({chamber.basis})")
        if chamber.cross_check is not None:
            lines.append(f"  cross-check          {chamber.cross_check:.4g} cycles ({chamber.cross_check_basis}; "
                         f"{100 * chamber.difference:+.0f} %)")
        lines.append(f"  why                  {chamber.explanation}")

    if j.notes:
        lines += ["", "Guidance:"] + [f"  - {text}" for text in j.notes]

    w = assessment.warpage
    if w is not None:
        lines.append("")
        lines.append(f"Assembly warpage ({w.stack_result.state.value} state; stress-free "
                     f"{format_quantity(w.stress_free_temperature, 'temperature', system)}, {w.stress_free_basis})")
        lines.append("  sign: curvature and bow > 0 when the top layer's face is convex (centre high, top up)")
        labels = w.temperature_labels or ("",) * w.temperatures.size
        kappa = np.atleast_1d(w.curvature)
        bows = [np.atleast_1d(b) for b in (w.bow_length, w.bow_width, w.bow_diagonal)]
        lines.append(f"  {'at':>22}  {'temperature':>12}  {'curvature':>14}  {'bow length':>12}  {'bow width':>12}  "
                     f"{'bow diagonal':>12}")
        for i, t in enumerate(w.temperatures):
            lines.append(f"  {labels[i]:>22}  {format_quantity(t, 'temperature', system):>12}  "
                         f"{format_quantity(kappa[i], 'curvature', system):>14}  "
                         + "  ".join(f"{format_quantity(b[i], 'length', system):>12}" for b in bows))

    first_order = next((s for s in assessment.scatter if s.method == "first order"), None)
    for scatter in assessment.scatter:
        how = "first order" if scatter.method == "first order" else f"Monte Carlo, {scatter.samples} samples"
        tolerances = ", ".join(
            f"{name} +/-{t.half_width:g}" + (" K" if not t.relative else "") + (" (uniform)" if t.distribution ==
                                                                                  "uniform" else "")
            for name, t in scatter.tolerances.items())
        lines += ["", f"Scatter from tolerances ({how}; {tolerances}; normal tolerances are 3 sigma)"]
        for item in scatter.results:
            kind = {"1": None, "cycles": None}.get(item.unit, "length")

            def show(value, kind=kind, unit=item.unit):
                if kind:
                    return format_quantity(value, kind, system)
                return f"{value:.4g}" + (" cycles" if unit == "cycles" else "")

            low, high = item.percentiles[0.135], item.percentiles[99.865]
            lines.append(f"  {item.name}: nominal {show(item.nominal)}, mean {show(item.mean)}, std {show(item.std)}, "
                         f"0.135 to 99.865 % {show(low)} to {show(high)}")
            lines.append(f"    {item.text}")
            if first_order is not None and scatter is not first_order and first_order[item.name].std > 0:
                change = item.std / first_order[item.name].std - 1.0
                if abs(change) > 0.1:
                    lines.append(f"    first order is {100 * -change:+.0f} % off this standard deviation: the tolerances "
                                 "are too wide for the linearisation, the Monte Carlo figures hold")
    lines += ["", "Assumptions:"] + [f"  - {text}" for text in j.assumptions]
    return "\n".join(lines)
