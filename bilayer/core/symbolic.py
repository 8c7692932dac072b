"""Symbolic derivation of the layered-strip solution (sympy), derived once per layer count and cached.

Model (Euler-Bernoulli strip, perfect bonding, linear elasticity, small strain, away from the free ends):

* layers i = 1..n numbered from the bottom, thickness t_i [m], interface heights h_i = t_1 + ... + t_i,
  z [m] upward from the bottom face (h_0 = 0);
* strain eps(z) = eps0 + kappa z, eps0 = strain of the bottom face, kappa [1/m] > 0 when the top face is
  the longer (convex) one;
* stress sigma_i(z) = Y_i (eps(z) - a_i dT) [Pa], tension positive; Y_i is the effective modulus of the
  bending state (E, E/(1-nu) or E/(1-nu^2)) and a_i dT the free strain (pass (1+nu) alpha as a_i for a wide
  strip in plane strain);
* applied loads per unit width: axial force N [N/m] acting along the bending axis z = t_b and moment M [N]
  **about the bending axis** (M > 0 lengthens the top face). Their moment about z = 0 is M + N t_b.

Balance of forces and of moments about z = 0 gives the linear system (the 1-D laminate "ABD" form)

    A eps0 + B kappa = N + N_T,     B eps0 + D kappa = M + N t_b + M_T,
    A = sum Y_i t_i,   B = sum Y_i t_i (2 h_(i-1) + t_i)/2,   D = sum Y_i t_i (3 h_(i-1)^2 + 3 h_(i-1) t_i
    + t_i^2)/3,   N_T = sum Y_i a_i dT t_i,   M_T = sum Y_i a_i dT t_i (2 h_(i-1) + t_i)/2,   t_b = B/A,

whose solution is kappa = (A (M + M_T) - B N_T) / (A D - B^2) and eps0 = N/A + (D N_T - B (M + M_T)) /
(A D - B^2). For two layers it equals Timoshenko's bimetal formula (S. Timoshenko, "Analysis of bi-metal
thermostats", J. Opt. Soc. Am. 11:233-255, 1925); for n layers it is the transformed-section solution used
for multilayers by C.H. Hsueh (Thin Solid Films 418:182-188, 2002).

The system is solved once with generic coefficient symbols and the per-layer sums are substituted, so
deriving n = 10 takes a fraction of a second. Numeric functions are lambdified (numpy) from a chain of
intermediate definitions, and exact derivatives are built by the chain rule through that chain, which keeps
them compact for any n. sympy is imported inside functions so that ``import bilayer`` stays fast.
"""
from __future__ import annotations

import functools
from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass
from functools import cached_property
from types import MappingProxyType
from typing import TYPE_CHECKING, Any

import numpy as np

from .errors import InputError

if TYPE_CHECKING:
    import sympy

__all__ = [
    "LayeredStripSolution",
    "NumericFunction",
    "StripValues",
    "Sensitivities",
    "SensitivityValues",
    "OptimumThicknessRatio",
    "derive",
    "curvature_expression",
    "evaluate",
    "sensitivities",
    "evaluate_sensitivities",
    "timoshenko_residual",
    "optimum_thickness_ratio",
]

Definitions = tuple[tuple["sympy.Symbol", "sympy.Expr"], ...]


@dataclass(frozen=True, eq=False)
class LayeredStripSolution:
    """Symbolic governing equations and solution of an n-layer strip (see the module docstring).

    Symbols: moduli Y1..Yn [Pa], thicknesses t1..tn [m], CTEs a1..an [1/K], temperature change dT [K]
    (operating minus stress-free), axial force N [N/m] along the bending axis, moment M [N] about the
    bending axis; unknowns eps0 (bottom-face strain) and kappa [1/m].

    ``equations`` are the force and moment balances as integrated over the layers; ``reduced_equations``
    the same in the sums A, B, D, N_T, M_T (defined in ``sums``); ``reduced_solution`` maps eps0, kappa
    and the bending-axis symbol t_b (``axis``) to their values in those sums, and ``reduced_stress_bottom``
    / ``reduced_stress_top`` give the face stresses in eps0 and kappa. ``interface_heights`` holds 0 and
    the symbols h1..h(n-1) (h_i = h_(i-1) + t_i). ``definitions`` chains the heights, sums, t_b, eps0
    and kappa in dependency order. The explicit expressions (``curvature``, ``base_strain``,
    ``stress_bottom``...) are functions of the layer symbols only.
    """

    n_layers: int
    moduli: tuple[sympy.Symbol, ...]
    thicknesses: tuple[sympy.Symbol, ...]
    ctes: tuple[sympy.Symbol, ...]
    temperature_change: sympy.Symbol
    axial_force: sympy.Symbol
    bending_moment: sympy.Symbol
    height: sympy.Symbol
    unknowns: tuple[sympy.Symbol, sympy.Symbol]
    axis: sympy.Symbol
    equations: tuple[sympy.Eq, sympy.Eq]
    sums: Mapping[sympy.Symbol, sympy.Expr]
    reduced_equations: tuple[sympy.Eq, sympy.Eq]
    reduced_solution: Mapping[sympy.Symbol, sympy.Expr]
    definitions: Definitions
    interface_heights: tuple[sympy.Expr, ...]
    reduced_stress_bottom: tuple[sympy.Expr, ...]
    reduced_stress_top: tuple[sympy.Expr, ...]
    base_strain: sympy.Expr
    curvature: sympy.Expr
    bending_axis: sympy.Expr
    axis_strain: sympy.Expr
    stress_bottom: tuple[sympy.Expr, ...]
    stress_top: tuple[sympy.Expr, ...]

    @property
    def parameters(self) -> tuple[sympy.Symbol, ...]:
        """Design parameters for sensitivities: Y1..Yn, t1..tn, a1..an, dT."""
        return (*self.moduli, *self.thicknesses, *self.ctes, self.temperature_change)

    @property
    def arguments(self) -> tuple[sympy.Symbol, ...]:
        """All inputs in the order numeric functions take them: the parameters, then N and M."""
        return (*self.parameters, self.axial_force, self.bending_moment)

    def explicit(self, expr: sympy.Expr) -> sympy.Expr:
        """``expr`` with the intermediate symbols (h_i, sums, t_b, eps0, kappa) replaced by their solution."""
        return _substitute(self.definitions, expr)

    def latex(self) -> dict[str, str]:
        """LaTeX strings of the equations, the sums and the solution (Greek letters for a, eps0, kappa, dT)."""
        import sympy as sp

        names = {a: rf"\alpha_{{{i + 1}}}" for i, a in enumerate(self.ctes)}
        names |= {self.temperature_change: r"\Delta T", self.unknowns[0]: r"\varepsilon_0",
                  self.unknowns[1]: r"\kappa"}

        def tex(expr: Any) -> str:
            return sp.latex(expr, symbol_names=names)

        eps0, kappa = self.unknowns
        out = {
            "force_balance": tex(self.equations[0]),
            "moment_balance": tex(self.equations[1]),
            "reduced_force_balance": tex(self.reduced_equations[0]),
            "reduced_moment_balance": tex(self.reduced_equations[1]),
            "base_strain": tex(sp.Eq(eps0, self.reduced_solution[eps0])),
            "curvature": tex(sp.Eq(kappa, self.reduced_solution[kappa])),
            "bending_axis": tex(sp.Eq(self.axis, self.reduced_solution[self.axis])),
            "curvature_explicit": tex(sp.Eq(kappa, self.curvature)),
        }
        out |= {f"sum_{symbol.name}": tex(sp.Eq(symbol, value)) for symbol, value in self.sums.items()}
        return out


def _check_n_layers(n_layers: object) -> int:
    if isinstance(n_layers, bool) or not isinstance(n_layers, (int, np.integer)) or n_layers < 1:
        raise InputError("n_layers", n_layers, "an integer >= 1")
    return int(n_layers)


def derive(n_layers: int) -> LayeredStripSolution:
    """Derive (once, cached) the n-layer solution from force and moment balance; see the module docstring."""
    return _derive(_check_n_layers(n_layers))


@functools.cache
def _derive(n: int) -> LayeredStripSolution:
    import sympy as sp

    moduli = sp.symbols(f"Y1:{n + 1}", positive=True)
    thicknesses = sp.symbols(f"t1:{n + 1}", positive=True)
    ctes = sp.symbols(f"a1:{n + 1}", real=True)
    dT, N, M = sp.symbols("dT N M", real=True)
    z, eps0, kappa = sp.symbols("z eps0 kappa", real=True)
    A, B, D, N_T, M_T, t_b = sp.symbols("A B D N_T M_T t_b", real=True)

    # Interface heights h_i = h_(i-1) + t_i, kept as symbols (h0 = 0, top face h_(n-1) + t_n).
    height_symbols = sp.symbols(f"h1:{n}", real=True)
    height_definitions = tuple((h, (height_symbols[i - 1] if i else 0) + thicknesses[i])
                               for i, h in enumerate(height_symbols))
    heights = (sp.Integer(0), *height_symbols)

    # One generic layer, modulus (eps0 + kappa z - cte dT) on low <= z <= low + t: its force and moment
    # about z = 0 are linear in (eps0, kappa); read off and factor the coefficients.
    low, t, modulus, cte = sp.symbols("low t modulus cte", real=True)
    stress = modulus * (eps0 + kappa * z - cte * dT)
    unloaded = {eps0: 0, kappa: 0}
    layer = {}
    for name, integrand in (("force", stress), ("moment", stress * z)):
        integral = sp.integrate(integrand, (z, low, low + t))
        coefficients = (integral.diff(eps0), integral.diff(kappa), -integral.subs(unloaded))
        layer[name] = [sp.factor(c) for c in coefficients]
    if sp.expand(layer["force"][1] - layer["moment"][0]) != 0:
        raise ArithmeticError("the force/moment coefficient matrix is not symmetric")

    def summed(coefficient: sympy.Expr) -> sympy.Expr:
        layers = zip(moduli, ctes, heights, thicknesses)
        return sp.Add(*(coefficient.subs({modulus: Y, cte: a, low: h, t: th}) for Y, a, h, th in layers))

    stiffness, first_moment, thermal_force = layer["force"]
    second_moment, thermal_moment = layer["moment"][1:]
    sums = {A: summed(stiffness), B: summed(first_moment), D: summed(second_moment),
            N_T: summed(thermal_force), M_T: summed(thermal_moment)}
    force = sums[A] * eps0 + sums[B] * kappa - sums[N_T]
    moment = sums[B] * eps0 + sums[D] * kappa - sums[M_T]
    axis = B / A  # height about which the moment does not depend on eps0 (modulus-weighted centroid)

    reduced = (sp.Eq(A * eps0 + B * kappa, N + N_T), sp.Eq(B * eps0 + D * kappa, M + N * t_b + M_T))
    generic = sp.solve(reduced, [eps0, kappa], dict=True)[0]
    solution = {u: sp.factor(sp.cancel(generic[u].subs(t_b, axis))) for u in (eps0, kappa)}
    solution[eps0] = N / A + sp.factor(sp.cancel(solution[eps0] - N / A))
    solution[t_b] = axis

    definitions = (*height_definitions, *sums.items(), (t_b, axis), (eps0, solution[eps0]),
                   (kappa, solution[kappa]))

    def explicit(expr: sympy.Expr) -> sympy.Expr:
        return _substitute(definitions, expr)

    faces = list(zip(moduli, ctes, heights, thicknesses))
    bottom = tuple(Y * (eps0 + kappa * h - a * dT) for Y, a, h, _ in faces)
    top = tuple(Y * (eps0 + kappa * (h + t) - a * dT) for Y, a, h, t in faces)
    return LayeredStripSolution(
        n_layers=n, moduli=moduli, thicknesses=thicknesses, ctes=ctes, temperature_change=dT,
        axial_force=N, bending_moment=M, height=z, unknowns=(eps0, kappa), axis=t_b,
        equations=(sp.Eq(force, N), sp.Eq(moment, M + N * t_b)),
        sums=MappingProxyType(sums), reduced_equations=reduced,
        reduced_solution=MappingProxyType(solution), definitions=definitions,
        interface_heights=heights, reduced_stress_bottom=bottom, reduced_stress_top=top,
        base_strain=explicit(eps0), curvature=explicit(kappa), bending_axis=explicit(t_b),
        axis_strain=explicit(eps0 + kappa * t_b), stress_bottom=tuple(map(explicit, bottom)),
        stress_top=tuple(map(explicit, top)),
    )


def _prune(definitions: Definitions, exprs: Sequence[sympy.Expr]) -> Definitions:
    """The definitions that ``exprs`` need, in their original (dependency) order."""
    needed = set().union(*(e.free_symbols for e in exprs))
    kept = []
    for symbol, value in reversed(definitions):
        if symbol in needed:
            kept.append((symbol, value))
            needed |= value.free_symbols
    return tuple(reversed(kept))


def _substitute(definitions: Definitions, expr: sympy.Expr) -> sympy.Expr:
    """Replace the intermediate symbols of ``definitions`` in ``expr`` by their explicit expressions."""
    explicit: dict[sympy.Symbol, sympy.Expr] = {}
    for symbol, value in _prune(definitions, [expr]):
        explicit[symbol] = value.xreplace(explicit)
    return expr.xreplace(explicit)


def curvature_expression(n_layers: int) -> tuple[sympy.Expr, tuple[sympy.Symbol, ...]]:
    """Explicit curvature kappa(Y, t, a, dT, M) [1/m] and the argument symbols (Y.., t.., a.., dT, N, M).

    For benchmarks of evaluation by ``expr.subs(dict(zip(symbols, values))).evalf()``.
    """
    solution = derive(n_layers)
    return solution.curvature, solution.arguments


# --- numeric evaluation ---------------------------------------------------------------------------


def _lambdify(arguments: Sequence[sympy.Symbol], definitions: Definitions, exprs: list[sympy.Expr]) -> Callable:
    """numpy function of ``arguments`` that computes the needed definitions in turn, then ``exprs``."""
    import sympy as sp

    chain = list(_prune(definitions, exprs))
    return sp.lambdify(arguments, exprs, modules="numpy", cse=lambda e: (chain, e))


def _layer_count(moduli: Any) -> int:
    shape = np.shape(moduli)
    if not shape:
        raise InputError("moduli", moduli, "an array whose last axis runs over the layers")
    return _check_n_layers(shape[-1])


def _columns(n: int, moduli: Any, thicknesses: Any, ctes: Any, temperature_change: Any,
             axial_force: Any, bending_moment: Any) -> tuple[list[np.ndarray], tuple[int, ...]]:
    """Split (..., n) layer arrays into per-layer columns; return them and the broadcast batch shape."""
    layered = []
    for field, value in (("moduli", moduli), ("thicknesses", thicknesses), ("ctes", ctes)):
        array = np.asarray(value, dtype=float)
        if array.ndim == 0 or array.shape[-1] != n:
            raise InputError(field, array.shape, f"an array shape whose last axis is n_layers = {n}")
        layered.append(array)
    loads = [np.asarray(v, dtype=float) for v in (temperature_change, axial_force, bending_moment)]
    shape = np.broadcast_shapes(*(a.shape[:-1] for a in layered), *(a.shape for a in loads))
    return [*(array[..., i] for array in layered for i in range(n)), *loads], shape


def _broadcast(values: Sequence[Any], shape: tuple[int, ...]) -> np.ndarray:
    """Stack lambdified outputs (arrays or constant scalars) along a new last axis."""
    return np.stack([np.broadcast_to(np.asarray(v, dtype=float), shape) for v in values], axis=-1)


@dataclass(frozen=True, eq=False)
class NumericFunction:
    """One exact expression of an n-layer strip, lambdified (numpy) on first call and reused after.

    ``expression`` is written with the intermediate symbols of ``definitions`` (h_i, A, B, D, N_T, M_T,
    t_b, eps0, kappa and their derivatives d_<s>_<p>); :meth:`explicit` substitutes them to give the
    expression in the layer symbols alone. Call with arrays whose last axis runs over the layers (bottom
    first): ``f(moduli [Pa], thicknesses [m], ctes [1/K], temperature_change [K], axial_force [N/m] = 0,
    bending_moment [N] = 0)``; the result has the broadcast batch shape.
    """

    n_layers: int
    arguments: tuple[sympy.Symbol, ...]
    definitions: Definitions
    expression: sympy.Expr

    def explicit(self) -> sympy.Expr:
        """The expression in the layer symbols only (no intermediate symbols)."""
        return _substitute(self.definitions, self.expression)

    @cached_property
    def _compiled(self) -> Callable:
        return _lambdify(self.arguments, self.definitions, [self.expression])

    def __call__(self, moduli: Any, thicknesses: Any, ctes: Any, temperature_change: Any,
                 axial_force: Any = 0.0, bending_moment: Any = 0.0) -> np.ndarray:
        columns, shape = _columns(self.n_layers, moduli, thicknesses, ctes, temperature_change,
                                  axial_force, bending_moment)
        return _broadcast(self._compiled(*columns), shape)[..., 0]


@dataclass(frozen=True)
class StripValues:
    """Numeric solution: strains [-], curvature [1/m], bending axis height [m], face stresses (..., n) [Pa].

    ``axis_strain`` is the strain at the bending axis (Hsueh's c, Thin Solid Films 418:182, 2002).
    """

    base_strain: np.ndarray
    curvature: np.ndarray
    bending_axis: np.ndarray
    axis_strain: np.ndarray
    stress_bottom: np.ndarray
    stress_top: np.ndarray


@functools.cache
def _compiled_solution(n: int) -> Callable:
    solution = derive(n)
    eps0, kappa = solution.unknowns
    outputs = [eps0, kappa, solution.axis, eps0 + kappa * solution.axis,
               *solution.reduced_stress_bottom, *solution.reduced_stress_top]
    return _lambdify(solution.arguments, solution.definitions, outputs)


def evaluate(moduli: Any, thicknesses: Any, ctes: Any, temperature_change: Any,
             axial_force: Any = 0.0, bending_moment: Any = 0.0) -> StripValues:
    """Evaluate the lambdified symbolic solution for arrays of stacks (last axis = layers, bottom first).

    Units: moduli [Pa], thicknesses [m], ctes [1/K], temperature_change [K], axial_force [N/m] along the
    bending axis, bending_moment [N] about it. Symbolic work happens only on the first call for each n.
    Inputs are not range-checked (``bilayer.core.stack`` validates designs). The sums are referenced to the
    bottom face, so strongly contrasting stacks lose digits to cancellation (measured against Timoshenko's
    formula: relative error up to ~5e-13 for thickness and modulus ratios within 10, ~5e-11 within 100);
    this evaluator is for cross-checks, the vectorised backend is ``bilayer.core.laminate``.
    """
    n = _layer_count(moduli)
    columns, shape = _columns(n, moduli, thicknesses, ctes, temperature_change, axial_force, bending_moment)
    values = _broadcast(_compiled_solution(n)(*columns), shape)
    return StripValues(base_strain=values[..., 0], curvature=values[..., 1], bending_axis=values[..., 2],
                       axis_strain=values[..., 3], stress_bottom=values[..., 4:4 + n],
                       stress_top=values[..., 4 + n:])


# --- exact sensitivities --------------------------------------------------------------------------


def _chain_rule(definitions: Definitions, outputs: Sequence[sympy.Expr],
                parameters: Sequence[sympy.Symbol]) -> tuple[Definitions, list[list[sympy.Expr]]]:
    """Exact derivatives of ``outputs`` w.r.t. each parameter by the chain rule through ``definitions``.

    Returns new definitions (a symbol d_<s>_<p> for each non-constant derivative of an intermediate s)
    and gradients[k][j] = d outputs[k] / d parameters[j] written with them (forward-mode differentiation).
    """
    import sympy as sp

    new: list[tuple[sympy.Symbol, sympy.Expr]] = []
    gradients: list[list[sympy.Expr]] = [[] for _ in outputs]
    for p in parameters:
        derivative: dict[sympy.Symbol, sympy.Expr] = {}

        def total(expr: sympy.Expr) -> sympy.Expr:
            inner = expr.free_symbols & derivative.keys()
            return expr.diff(p) + sp.Add(*(expr.diff(s) * derivative[s] for s in inner))

        for symbol, value in definitions:
            d_value = total(value)
            if d_value.is_Number:
                derivative[symbol] = d_value
            else:
                derivative[symbol] = sp.Symbol(f"d_{symbol.name}_{p.name}", real=True)
                new.append((derivative[symbol], d_value))
        for k, output in enumerate(outputs):
            gradients[k].append(total(output))
    return tuple(new), gradients


@dataclass(frozen=True, eq=False)
class Sensitivities:
    """Exact first derivatives of curvature and face stresses of an n-layer strip.

    ``curvature[name]``, ``stress_bottom[i][name]`` and ``stress_top[i][name]`` (layer i from 0 at the
    bottom) are :class:`NumericFunction` s for each parameter name in ``parameters`` (Y1..Yn, t1..tn,
    a1..an, dT). Units: output unit per parameter unit, e.g. d kappa/d t1 in 1/m^2, d sigma/d Y1 in Pa/Pa.
    Within a layer stress is linear in z, so its extreme value is at one of the two faces.
    """

    n_layers: int
    parameters: tuple[str, ...]
    curvature: Mapping[str, NumericFunction]
    stress_bottom: tuple[Mapping[str, NumericFunction], ...]
    stress_top: tuple[Mapping[str, NumericFunction], ...]

    @cached_property
    def _compiled(self) -> Callable:
        """One numpy function returning values and all gradients, sharing the intermediate results."""
        first = self.curvature[self.parameters[0]]
        functions = [self.curvature, *self.stress_bottom, *self.stress_top]
        exprs = [f[name].expression for f in functions for name in self.parameters]
        solution = derive(self.n_layers)
        exprs += [solution.unknowns[1], *solution.reduced_stress_bottom, *solution.reduced_stress_top]
        return _lambdify(first.arguments, first.definitions, exprs)


def sensitivities(n_layers: int) -> Sensitivities:
    """Derive (once, cached) exact derivatives of curvature and face stresses for n layers."""
    return _sensitivities(_check_n_layers(n_layers))


@functools.cache
def _sensitivities(n: int) -> Sensitivities:
    solution = derive(n)
    outputs = [solution.unknowns[1], *solution.reduced_stress_bottom, *solution.reduced_stress_top]
    new, gradients = _chain_rule(solution.definitions, outputs, solution.parameters)
    definitions = solution.definitions + new
    names = tuple(p.name for p in solution.parameters)

    def functions(gradient: list[sympy.Expr]) -> Mapping[str, NumericFunction]:
        return MappingProxyType({name: NumericFunction(n, solution.arguments, definitions, g)
                                 for name, g in zip(names, gradient)})

    return Sensitivities(n_layers=n, parameters=names, curvature=functions(gradients[0]),
                         stress_bottom=tuple(map(functions, gradients[1:n + 1])),
                         stress_top=tuple(map(functions, gradients[n + 1:])))


@dataclass(frozen=True)
class SensitivityValues:
    """Values and exact gradients for arrays of stacks; the last axis of a gradient runs over ``parameters``.

    Shapes: curvature (...), curvature_gradient (..., p), stresses (..., n), stress gradients (..., n, p).
    ``stress_peak`` is the face stress of larger magnitude in each layer (``peak_on_top`` says which
    face) and ``stress_peak_gradient`` its gradient (one-sided where both faces have equal magnitude).
    """

    parameters: tuple[str, ...]
    curvature: np.ndarray
    curvature_gradient: np.ndarray
    stress_bottom: np.ndarray
    stress_bottom_gradient: np.ndarray
    stress_top: np.ndarray
    stress_top_gradient: np.ndarray
    stress_peak: np.ndarray
    stress_peak_gradient: np.ndarray
    peak_on_top: np.ndarray


def evaluate_sensitivities(moduli: Any, thicknesses: Any, ctes: Any, temperature_change: Any,
                           axial_force: Any = 0.0, bending_moment: Any = 0.0) -> SensitivityValues:
    """Evaluate curvature, face stresses and their exact gradients (arguments as in :func:`evaluate`)."""
    n = _layer_count(moduli)
    sens = sensitivities(n)
    p = len(sens.parameters)
    columns, shape = _columns(n, moduli, thicknesses, ctes, temperature_change, axial_force, bending_moment)
    values = _broadcast(sens._compiled(*columns), shape)
    gradients = values[..., :(2 * n + 1) * p].reshape(*shape, 2 * n + 1, p)
    curvature, bottom, top = values[..., -2 * n - 1], values[..., -2 * n:-n], values[..., -n:]
    on_top = np.abs(top) >= np.abs(bottom)
    return SensitivityValues(
        parameters=sens.parameters, curvature=curvature, curvature_gradient=gradients[..., 0, :],
        stress_bottom=bottom, stress_bottom_gradient=gradients[..., 1:n + 1, :], stress_top=top,
        stress_top_gradient=gradients[..., n + 1:, :], stress_peak=np.where(on_top, top, bottom),
        stress_peak_gradient=np.where(on_top[..., None], gradients[..., n + 1:, :], gradients[..., 1:n + 1, :]),
        peak_on_top=on_top,
    )


# --- two-layer results ----------------------------------------------------------------------------


def timoshenko_residual() -> sympy.Expr:
    """simplify(derived two-layer curvature - Timoshenko's formula); zero when the derivation is right.

    Timoshenko (J. Opt. Soc. Am. 11:233, 1925): kappa = 6 da dT (1+m)^2 / (h [3(1+m)^2 + (1+mn)(m^2 +
    1/(mn))]) with m = t1/t2, n = Y1/Y2, h = t1 + t2, da = a2 - a1 (layer 1 at the bottom), no loads.
    """
    import sympy as sp

    solution = derive(2)
    (Y1, Y2), (t1, t2), (a1, a2) = solution.moduli, solution.thicknesses, solution.ctes
    m, n, h, dT = t1 / t2, Y1 / Y2, t1 + t2, solution.temperature_change
    bracket = 3 * (1 + m) ** 2 + (1 + m * n) * (m ** 2 + 1 / (m * n))
    formula = 6 * (a2 - a1) * dT * (1 + m) ** 2 / (h * bracket)
    return sp.simplify(solution.curvature.subs(solution.bending_moment, 0) - formula)


@dataclass(frozen=True, eq=False)
class OptimumThicknessRatio:
    """Two-layer thickness ratio m = t1/t2 that maximises the curvature at fixed h = t1 + t2 and n = Y1/Y2.

    ``curvature`` is the derived kappa(m, n, h, da, dT) (da = a2 - a1, no loads), ``slope_numerator`` the
    factorised numerator of d kappa/dm, ``ratio`` its positive root (m^2 n = 1, i.e. t1/t2 = sqrt(Y2/Y1))
    and ``curvature_at_optimum`` the simplified kappa there (3 da dT / (2h), whatever n).
    """

    symbols: tuple[sympy.Symbol, ...]
    curvature: sympy.Expr
    slope_numerator: sympy.Expr
    ratio: sympy.Expr
    curvature_at_optimum: sympy.Expr


@functools.cache
def optimum_thickness_ratio() -> OptimumThicknessRatio:
    """Derive d kappa/dm = 0 from the two-layer solution (symbols m, n, h, da, dT; see the class docstring)."""
    import sympy as sp

    m, n, h = sp.symbols("m n h", positive=True)
    da, dT = sp.symbols("da dT", real=True)
    solution = derive(2)
    (Y1, Y2), (t1, t2), (a1, a2) = solution.moduli, solution.thicknesses, solution.ctes
    kappa = sp.factor(solution.curvature.subs({solution.bending_moment: 0, Y1: n * Y2, a2: a1 + da})
                      .subs({t1: m * h / (1 + m), t2: h / (1 + m)}))
    numerator = sp.factor(sp.numer(sp.together(kappa.diff(m))))
    roots = []
    for factor, _ in sp.factor_list(numerator)[1]:
        coefficients = sp.Poly(factor, m).coeffs() if factor.has(m) else []
        if coefficients and not all(c.is_positive for c in coefficients):  # else no root with m > 0
            roots += [root for root in sp.solve(factor, m) if root.is_positive]
    if len(roots) != 1:
        raise ArithmeticError(f"expected one positive stationary ratio, found {roots}")
    return OptimumThicknessRatio(symbols=(m, n, h, da, dT), curvature=kappa, slope_numerator=numerator,
                                 ratio=roots[0], curvature_at_optimum=sp.simplify(kappa.subs(m, roots[0])))
