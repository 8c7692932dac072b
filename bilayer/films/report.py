"""The text report of a film assessment (``bilayer film`` and the film panel)."""
from __future__ import annotations

import numpy as np

__all__ = ["report"]


def report(design, assessment, system: str = "si", source: str = "") -> str:
    """Plain-text report of a :class:`bilayer.films.FilmAssessment`."""
    from ..core.units import format_quantity

    th = assessment.thermal
    title = design.name or "(unnamed design)"
    substrate, film = design.stack.layers
    lines = [f"{title}  [{source}]" if source else title, ""]
    lines.append("Sign: curvature > 0 film side convex; bow > 0 centre high with the film up; stress > 0 tension")
    lines.append(f"  substrate            {substrate.name}, {format_quantity(substrate.thickness, 'length', system)}, biaxial modulus "
                 f"{format_quantity(th.substrate_biaxial_modulus, 'modulus', system)}")
    lines.append(f"  film                 {film.name}, {format_quantity(film.thickness, 'length', system)}, biaxial modulus "
                 f"{format_quantity(th.film_biaxial_modulus, 'modulus', system)}")
    lines.append("")
    lines.append(f"Thermal film stress (plate state, stress-free {format_quantity(design.temperatures.stress_free, 'temperature', system)},"
                 " no intrinsic stress)")
    header = f"  {'operating':>12}  {'film stress':>12}  {'curvature':>14}  {'Stoney kappa':>14}  {'kappa error':>11}  {'stress error':>12}"
    if th.bow is not None:
        header += f"  {'bow':>10}"
    lines.append(header)
    operating = np.atleast_1d(np.asarray(design.temperatures.operating, float))
    columns = [np.atleast_1d(np.asarray(v, float)) for v in
               (th.mean_film_stress, th.curvature, th.stoney_curvature, th.curvature_error, th.stress_error)]
    bow = None if th.bow is None else np.atleast_1d(th.bow)
    for i, t in enumerate(operating):
        row = (f"  {format_quantity(t, 'temperature', system):>12}  {format_quantity(columns[0][i], 'stress', system):>12}  "
               f"{format_quantity(columns[1][i], 'curvature', system):>14}  {format_quantity(columns[2][i], 'curvature', system):>14}  "
               f"{100 * columns[3][i]:>10.3g}%  {100 * columns[4][i]:>11.3g}%")
        if bow is not None:
            row += f"  {format_quantity(bow[i], 'length', system):>10}"
        lines.append(row)
    m = assessment.measured
    if m is not None:
        lines.append("")
        lines.append("Film stress from the measured change (Stoney, biaxial substrate modulus)")
        if m.bow_before is not None:
            lines.append(f"  bow before / after   {format_quantity(m.bow_before, 'length', system)} / {format_quantity(m.bow_after, 'length', system)}"
                         f" over {format_quantity(m.span, 'length', system)}")
        lines.append(f"  curvature change     {format_quantity(m.curvature_change, 'curvature', system)}")
        lines.append(f"  Stoney stress        {format_quantity(m.stoney_stress, 'stress', system)}")
        if m.mean_film_stress is not None:
            lines.append(f"  exact mean stress    {format_quantity(m.mean_film_stress, 'stress', system)} "
                         f"(Stoney error {100 * m.stoney_error:.3g} %)")
    two = assessment.two_substrate
    if two is not None:
        lines.append("")
        lines.append("Film properties from two substrates")
        lines.append(f"  stress slopes        {format_quantity(two.slopes[0], 'stress', system)}/K, {format_quantity(two.slopes[1], 'stress', system)}/K")
        lines.append(f"  substrate CTEs       {format_quantity(two.substrate_ctes[0], 'cte', system)}, {format_quantity(two.substrate_ctes[1], 'cte', system)}")
        lines.append(f"  film biaxial modulus {format_quantity(two.film_biaxial_modulus, 'modulus', system)} "
                     f"(1 % slope error -> {two.modulus_sensitivity:.3g} %)")
        lines.append(f"  film CTE             {format_quantity(two.film_cte, 'cte', system)}")
    if assessment.warnings:
        lines += ["", "Warnings:"] + [f"  - {text}" for text in assessment.warnings]
    lines += ["", "Assumptions:"] + [f"  - {text}" for text in th.assumptions]
    if m is not None:
        lines += [f"  - {text}" for text in m.assumptions]
    return "\n".join(lines)
