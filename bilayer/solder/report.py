"""The text report of a solder-joint assessment (``bilayer solder`` and the solder panel)."""
from __future__ import annotations

import numpy as np

__all__ = ["report"]


def _cycle_text(cycle, system: str) -> str:
    from ..core.units import format_quantity

    return (f"{format_quantity(cycle.low, 'temperature', system)} to {format_quantity(cycle.high, 'temperature', system)}, dwell "
            f"{format_quantity(cycle.dwell, 'time', system)}, {cycle.cycles_per_day:g} cycles/day")


def report(design, assessment, system: str = "si", source: str = "") -> str:
    """Plain-text report of a :class:`bilayer.solder.SolderAssessment`."""
    from .joint import NORRIS_LANDZBERG_CONVENTION
    from ..core.units import format_quantity

    j = assessment.joint
    title = design.name or "(unnamed design)"
    lines = [f"{title}  [{source}]" if source else title, "", "Solder joint (Engelmaier-Wild, screening estimate)"]
    lines.append(f"  field cycle          {_cycle_text(j.cycle, system)}")
    if j.board_cycle is not j.cycle:
        lines.append(f"  board cycle          {_cycle_text(j.board_cycle, system)}")
    lines.append(f"  DNP, stand-off       {format_quantity(j.dnp, 'length', system)}, {format_quantity(j.standoff, 'length', system)};"
                 f" non-ideality factor F = {j.factor:g}")
    lines.append(f"  mismatch strain      {j.mismatch_strain:.4g} (board minus component, integrated CTEs)")
    lines.append(f"  global shear strain  {j.shear_strain:.4g} ({100 * j.shear_strain:.3g} %)")
    if j.local_mismatch_component is not None:
        lines.append(f"  local mismatch       solder/component {j.local_mismatch_component:.3g}, "
                     f"solder/board {j.local_mismatch_board:.3g} (not amplified by DNP/h)")
    lines.append(f"  exponent c           {j.fatigue_exponent:.5f}   (eps_f' = {j.ductility:g})")
    lines.append(f"  median life N50      {j.median_life:.4g} cycles")
    lines.append(f"  Weibull (shape {j.weibull_shape:g}, assumed): eta = {j.weibull_scale:.4g} cycles, "
                 f"{100 * j.early_fraction:g} % failed at {j.early_life:.4g} cycles")
    if j.test is not None:
        s = j.acceleration_set
        lines.append("")
        lines.append(f"Acceleration against the test cycle {j.test.label}: {_cycle_text(j.test, system)}")
        lines.append(f"  parameter set        {s.label}: n = {s.swing_exponent:g}, m = {s.frequency_exponent:.4g}, "
                     f"Ea/k = {s.activation_temperature:g} K")
        lines.append(f"  status               {s.status}")
        lines.append(f"  Norris-Landzberg AF  {j.acceleration_factor:.4g}")
        lines.append(f"  Engelmaier, test     N50 = {j.test_median_life:.4g} cycles "
                     f"(field/test ratio {j.engelmaier_acceleration:.4g})")
        lines.append(f"  convention           {NORRIS_LANDZBERG_CONVENTION}")
    w = assessment.warpage
    if w is not None:
        lines.append("")
        lines.append(f"Assembly warpage ({w.stack_result.state.value} state; stress-free "
                     f"{format_quantity(w.stress_free_temperature, 'temperature', system)}, {w.stress_free_basis})")
        lines.append("  sign: curvature and bow > 0 when the top layer's face is convex (centre high, top up)")
        operating = np.atleast_1d(np.asarray(w.stack_result.operating_temperature, float))
        kappa = np.atleast_1d(w.curvature)
        bows = [np.atleast_1d(b) for b in (w.bow_length, w.bow_width, w.bow_diagonal)]
        lines.append(f"  {'operating':>12}  {'curvature':>14}  {'bow length':>12}  {'bow width':>12}  {'bow diagonal':>12}")
        for i, t in enumerate(operating):
            lines.append(f"  {format_quantity(t, 'temperature', system):>12}  {format_quantity(kappa[i], 'curvature', system):>14}  "
                         + "  ".join(f"{format_quantity(b[i], 'length', system):>12}" for b in bows))
    warnings = assessment.warnings
    if warnings:
        lines += ["", "Warnings:"] + [f"  - {text}" for text in warnings]
    lines += ["", "Assumptions:"] + [f"  - {text}" for text in j.assumptions]
    return "\n".join(lines)
