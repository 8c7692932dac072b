"""Trust report: the closed forms against the 2-D finite-element check for one design.

For a stack, a load case and a strip length it runs the engine (beam theory, far from the ends), the
interface model (shear and peel along the strip, :mod:`bilayer.strip.interface`) and the FE check
(:mod:`bilayer.strip.fe`, by default with a refinement study) and sets the numbers side by side:

    mid-length curvature, sigma_xx at every layer face and layer forces     (tolerance 0.5 %)
    force below each interface at mid-length (interface model vs FE)       (informative)
    shear and peel at stated distances from the end                         (informative: nominal)
    end deflection against -kappa L^2/8                                     (informative)
    FE equilibrium: int tau from mid-length to the end vs the force below  (tolerance 1 %)

and flags what limits the closed forms for this geometry: short strips (L/H < 10), edge zones long
compared with the strip, thick or soft bond lines, the bending-state choice (plane strain vs plate,
narrow vs wide for a given width), singular corners (Dundurs parameters; Bogy 1968, with the
criterion alpha (alpha - 2 beta) > 0 of Kuo, J. Appl. Mech. 56:585, 1989), mesh sensitivity, and any
difference above its tolerance. The plate state has no 2-D counterpart: it is compared in plane
strain and flagged.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..core.progress import Progress
from ..core.results import build_result
from ..core.stack import BendingState, Stack, Temperatures

__all__ = ["TrustRow", "TrustFlag", "TrustReport", "trust_report", "dundurs_parameters", "TOLERANCE"]

TOLERANCE = 0.005
"""Relative tolerance of the beam-theory rows (curvature, stresses, forces) against FE."""
EQUILIBRIUM_TOLERANCE = 0.01
MESH_CHANGE_NOTE = 0.05
EDGE_ZONE_NOTE = 0.2
EDGE_ZONE_WARNING = 0.5
SOFT_BOND_RATIO = 1e-3
NARROW_WIDTH_RATIO = 5.0


@dataclass(frozen=True)
class TrustRow:
    """One quantity by closed form and by FE; ``difference`` is relative to ``scale``."""

    quantity: str
    where: str
    closed_form: float
    fe: float
    scale: float  # reference magnitude of the difference (largest |value| of the group)
    kind: str  # unit kind of bilayer.core.units ("curvature", "stress", "force_per_width", "length")
    tolerance: float | None  # None: informative only
    distance: float | None = None  # distance from the end of a shear or peel sample [m]
    location: str = ""  # ``where`` without the distance (faces that format the distance themselves)

    @property
    def difference(self) -> float:
        return (self.fe - self.closed_form) / self.scale if self.scale > 0 else 0.0

    @property
    def ok(self) -> bool:
        return self.tolerance is None or abs(self.difference) <= self.tolerance

    def to_dict(self) -> dict:
        return {
            "quantity": self.quantity, "where": self.where, "closed_form": self.closed_form, "fe": self.fe,
            "scale": self.scale, "difference": self.difference, "tolerance": self.tolerance, "ok": self.ok,
            "kind": self.kind, "distance": self.distance, "location": self.location or self.where,
        }


@dataclass(frozen=True)
class TrustFlag:
    """A reason to doubt (severity "warning") or to read with care (severity "note")."""

    code: str
    severity: str
    message: str

    def to_dict(self) -> dict:
        return {"code": self.code, "severity": self.severity, "message": self.message}


@dataclass(frozen=True, eq=False)
class TrustReport:
    """Closed form against FE for one design, with flags."""

    state: BendingState  # the design's bending state
    compared_state: BendingState  # the state compared with FE (plate -> wide)
    length: float
    labels: tuple[str, ...]
    engine: object  # StackResult in the compared state
    interface: object  # InterfaceResult in the compared state
    fe: object  # FEResult (the finest mesh when refined)
    refinement: object  # RefinementStudy or None
    rows: tuple[TrustRow, ...]
    flags: tuple[TrustFlag, ...]

    @property
    def ok(self) -> bool:
        """True when every row with a tolerance is within it."""
        return all(row.ok for row in self.rows)

    @property
    def largest_differences(self) -> dict:
        """Largest |difference| per quantity."""
        out: dict[str, float] = {}
        for row in self.rows:
            out[row.quantity] = max(out.get(row.quantity, 0.0), abs(row.difference))
        return out

    def to_dict(self) -> dict:
        return {
            "bending_state": self.state.value,
            "compared_state": self.compared_state.value,
            "fe_plane": self.fe.plane,
            "length": self.length,
            "ok": self.ok,
            "rows": [row.to_dict() for row in self.rows],
            "flags": [flag.to_dict() for flag in self.flags],
            "largest_differences": self.largest_differences,
            "fe": self.fe.to_dict(),
            "refinement": None if self.refinement is None else self.refinement.to_dict(),
        }


def dundurs_parameters(E1, nu1, E2, nu2, plane_strain: bool = True) -> tuple[float, float]:
    """Dundurs' bimaterial parameters (alpha, beta) of material 1 against material 2.

    alpha = [G1(k2+1) - G2(k1+1)]/[G1(k2+1) + G2(k1+1)], beta = [G1(k2-1) - G2(k1-1)]/[same],
    Kolosov k = 3 - 4 nu (plane strain) or (3 - nu)/(1 + nu) (plane stress), G = E/(2(1+nu)).
    The free-edge corner of the two bonded quarter planes is singular when alpha (alpha - 2 beta) > 0
    (Bogy 1968; criterion stated by Kuo 1989).
    """
    G1, G2 = E1 / (2 * (1 + nu1)), E2 / (2 * (1 + nu2))
    k1, k2 = ((3 - 4 * nu1), (3 - 4 * nu2)) if plane_strain else ((3 - nu1) / (1 + nu1), (3 - nu2) / (1 + nu2))
    denominator = G1 * (k2 + 1) + G2 * (k1 + 1)
    return (G1 * (k2 + 1) - G2 * (k1 + 1)) / denominator, (G1 * (k2 - 1) - G2 * (k1 - 1)) / denominator


def trust_report(
    stack: Stack,
    temperatures: Temperatures,
    length: float,
    state: "BendingState | str" = BendingState.NARROW,
    bonds=(),
    model: str = "bending",
    mesh=None,
    refine: bool = True,
    distances=None,
    width: float | None = None,
    progress: Progress | None = None,
) -> TrustReport:
    """Compare the closed forms with the FE check for this design and flag their limits.

    ``bonds`` and ``model`` as in :func:`bilayer.strip.interface.interface_stresses`; ``mesh`` a
    :class:`bilayer.strip.fe.MeshOptions`; ``refine`` runs a second mesh with every element halved and
    compares on the finer one; ``distances`` [m] from the end where shear and peel are compared;
    ``width`` [m] (optional) lets the report judge the bending-state choice.
    """
    from .fe import MeshOptions, check_strip_inputs, refine_strip, solve_strip
    from .interface import interface_stresses

    state = BendingState.parse(state)
    compared = BendingState.WIDE if state is BendingState.PLATE else state
    mesh = MeshOptions() if mesh is None else mesh
    length, _, distances = check_strip_inputs(stack, temperatures, length, compared, distances, mesh)
    if width is not None:
        from ..core.errors import check_range

        width = check_range("width", width, 0.0, 100.0, unit="m")
    engine = build_result(stack, temperatures, compared, 0.0, 0.0, "free")
    interface = interface_stresses(stack, temperatures, length, compared, bonds, model)
    heights = np.array([p.parameters.height for p in interface.interfaces])
    if refine:
        study = refine_strip(stack, temperatures, length, compared, mesh, 2, distances, heights, progress)
        fe = study.runs[-1]
    else:
        study = None
        fe = solve_strip(stack, temperatures, length, compared, mesh, distances, heights, progress)
    rows = _rows(engine, interface, fe, distances, length)
    flags = _flags(stack, temperatures, length, state, compared, engine, interface, study, rows, width)
    return TrustReport(
        state=state, compared_state=compared, length=length, labels=stack.labels, engine=engine,
        interface=interface, fe=fe, refinement=study, rows=tuple(rows), flags=tuple(flags),
    )


def _rows(engine, interface, fe, distances, length) -> list[TrustRow]:
    from ..core.units import format_quantity

    rows = []
    kappa = float(engine.curvature)
    rows.append(TrustRow("curvature", "mid-length", kappa, fe.curvature, abs(kappa), "curvature", TOLERANCE))
    faces = np.concatenate([engine.stress_bottom, engine.stress_top])
    stress_scale = float(np.max(np.abs(faces)))
    for i, label in enumerate(engine.labels):
        for face, cf, value in (("bottom", engine.stress_bottom[i], fe.stress_bottom[i]),
                                ("top", engine.stress_top[i], fe.stress_top[i])):
            rows.append(TrustRow("stress", f"layer {i + 1} {label}, {face} face", float(cf), float(value),
                                 stress_scale, "stress", TOLERANCE))
    force_scale = float(np.max(np.abs(engine.layer_force)))
    for i, label in enumerate(engine.labels):
        rows.append(TrustRow("layer force", f"layer {i + 1} {label}", float(engine.layer_force[i]),
                             float(fe.layer_force[i]), force_scale, "force_per_width", TOLERANCE))
    half = 0.5 * length
    deflection = -kappa * length**2 / 8.0
    rows.append(TrustRow("end deflection", "mid-thickness, against -kappa L^2/8", deflection, fe.end_deflection,
                         abs(deflection), "length", None))
    samples = interface.sample(distances, end="right")
    for profile, fe_line, (force, shear, peel) in zip(interface.interfaces, fe.interfaces, samples):
        name = profile.name
        mid_force = float(profile.parameters.force_and_shear(np.array([0.0]), half)[0][0])
        rows.append(TrustRow("force below interface", f"{name}, mid-length", mid_force, fe_line.force_below,
                             abs(mid_force), "force_per_width", None))
        rows.append(TrustRow("FE equilibrium", f"{name}, int tau mid-length to end vs force below",
                             fe_line.force_below, fe_line.shear_integral, abs(fe_line.force_below),
                             "force_per_width", EQUILIBRIUM_TOLERANCE))
        groups = [("shear", shear, fe_line.shear)] + ([("peel", peel, fe_line.peel)] if peel is not None else [])
        for quantity, closed, computed in groups:
            scale = float(np.max(np.abs(closed))) or 1.0
            for d, cf, value in zip(distances, closed, computed):
                rows.append(TrustRow(quantity, f"{format_quantity(d, 'length')} from the end, {name}", float(cf), float(value),
                                     scale, "stress", None, float(d), name))
    return rows


def _flags(stack, temperatures, length, state, compared, engine, interface, study, rows, width) -> list[TrustFlag]:
    from .interface import soft_inner_layers

    flags = []
    H = stack.total_thickness
    ratio = length / H
    if ratio < 10.0:
        flags.append(TrustFlag("short_strip", "warning", (
            f"the strip is only {ratio:.3g} total thicknesses long (< 10): the end zones may reach mid-length, "
            "where beam theory then no longer holds; go by the FE rows")))
    for profile in interface.interfaces:
        p = profile.parameters
        zone = 3.0 * max(p.decay_length, p.peel_decay_length if p.bending else 0.0)
        share = 2.0 * zone / length
        if share > EDGE_ZONE_NOTE:
            flags.append(TrustFlag("long_edge_zone", "warning" if share > EDGE_ZONE_WARNING else "note", (
                f"{profile.name}: the two edge zones (3 decay lengths each, {zone * 1e3:.3g} mm) cover "
                f"{min(share, 1.0):.0%} of the strip: the closed-form far field is reached "
                + ("nowhere" if share >= 1.0 else "only near mid-length"))))
        if p.bond is not None:
            below, above = list(p.below), list(p.above)
            thinner = min(stack.thicknesses[below].sum(), stack.thicknesses[above].sum())
            bond = stack[p.bond].material
            if p.bond_thickness > 0.25 * thinner:
                flags.append(TrustFlag("thick_bond", "warning", (
                    f"{profile.name}: the bond line is {p.bond_thickness / thinner:.2g} times the thinner part: "
                    "the shear-lag assumption (uniform shear across the bond, no axial stiffness) is strained")))
            adherend_G = min(stack[i].material.shear_modulus for i in below + above)
            if bond.shear_modulus < SOFT_BOND_RATIO * adherend_G:
                flags.append(TrustFlag("soft_bond", "note", (
                    f"{profile.name}: the bond is {adherend_G / bond.shear_modulus:.3g} times softer in shear than "
                    "the adherends: strains in it are large and time-dependent (creep, relaxation); the elastic "
                    "values are upper bounds")))
            if bond.poisson_ratio > 0.45:
                flags.append(TrustFlag("soft_bond", "warning", (
                    f"{profile.name}: nearly incompressible bond (nu = {bond.poisson_ratio:g}): the peel "
                    "compliance h0/E' overstates the compliance of a constrained bond line; trust FE peel")))
    for i in soft_inner_layers(stack, interface.bonds):
        flags.append(TrustFlag("soft_inner_layer", "warning", (
            f"layer {i + 1} is much softer in shear than its neighbours but is not a bond layer: inside a composite "
            "part it is taken as perfectly bonded, which misplaces the shear transfer; name it a bond layer")))
    if state is BendingState.PLATE:
        plate = build_result(stack, temperatures, BendingState.PLATE, 0.0, 0.0, "free")
        flags.append(TrustFlag("bending_state", "note", (
            "plate state: a 2-D model cannot bend in two directions, so the check compares the wide (plane-strain) "
            f"state; the plate curvature is {float(plate.curvature) / float(engine.curvature):.4g} times the "
            "plane-strain one and the plate stresses differ accordingly")))
    elif state is BendingState.WIDE:
        flags.append(TrustFlag("bending_state", "note", (
            "wide state: cylindrical bending with the width held straight (eps_y = 0). A free wide strip in small "
            "deflection bends equal-biaxially in its interior (plate state); choose 'wide' only if the width is "
            "held or the deflection is large")))
    if width is not None:
        flags.extend(_width_flags(stack, temperatures, state, width))
    for row in rows:
        if not row.ok:
            flags.append(TrustFlag("fe_difference", "warning", (
                f"{row.quantity} at {row.where}: FE differs by {row.difference:+.3%} (tolerance {row.tolerance:.1%})")))
    if study is not None:
        changes = [("shear", study.shear_changes), ("peel", study.peel_changes)]
        for name, values in changes:
            if values.size and float(np.max(values)) > MESH_CHANGE_NOTE:
                flags.append(TrustFlag("mesh_sensitive", "note", (
                    f"FE {name} at the sampled distances changes by up to {float(np.max(values)):.1%} between the two "
                    "meshes: close to a singular or steep corner the FE values are mesh dependent too")))
    plane_strain = compared is BendingState.WIDE
    for profile in interface.interfaces:
        p = profile.parameters
        pairs = [(p.below[-1], p.bond), (p.bond, p.above[0])] if p.bond is not None else [(p.below[-1], p.above[0])]
        for low, high in pairs:
            a, b = (stack[low].material, stack[high].material)
            alpha, beta = dundurs_parameters(a.youngs_modulus, a.poisson_ratio, b.youngs_modulus, b.poisson_ratio, plane_strain)
            if alpha * (alpha - 2.0 * beta) > 1e-12:
                flags.append(TrustFlag("singular_corner", "note", (
                    f"layers {low + 1}/{high + 1}: the free-edge corner is singular (Dundurs alpha = {alpha:.3g}, "
                    f"beta = {beta:.3g}); shear and peel at the corner have no finite value, so compare them at "
                    "stated distances, never at the end itself")))
    flags.append(TrustFlag("nominal_end_values", "note", (
        "closed-form shear and peel within about one thickness of the end are nominal: the model replaces the "
        "corner field by compliances. Strength checks there defer to test data and applicable standards")))
    return flags


def _width_flags(stack, temperatures, state, width) -> list[TrustFlag]:
    """Bending-state advice from the width (layers.md sec. 2.2-2.3: S_T = b^2 kappa/H, guide values)."""
    H = stack.total_thickness
    kappa_plate = abs(float(build_result(stack, temperatures, BendingState.PLATE, 0.0, 0.0, "free").curvature))
    S = width**2 * kappa_plate / H
    flags = []
    if state is BendingState.NARROW and width > NARROW_WIDTH_RATIO * H:
        flags.append(TrustFlag("bending_state", "note", (
            f"the strip is {width / H:.3g} times wider than thick: away from its long edges the stress state is "
            "closer to the plate state (stresses up to 1/(1-nu) times the narrow-strip values)")))
    if state is BendingState.WIDE and S < 2.0:
        flags.append(TrustFlag("bending_state", "warning", (
            f"width parameter b^2 kappa/H = {S:.3g} < 2: the strip bends almost spherically (plate state); the wide "
            "state overstates the curvature by up to (1 + nu)")))
    if state is BendingState.PLATE and S > 50.0:
        flags.append(TrustFlag("bending_state", "warning", (
            f"width parameter b^2 kappa/H = {S:.3g} > 50: large-deflection effects drive the strip toward "
            "cylindrical bending (wide state); the linear plate result is not reliable")))
    return flags

