"""Self-contained HTML report of a design record, for reviewers (opens offline, no network at all).

One file holds everything: inline CSS, figures as base64 PNG made by :mod:`bilayer.plots` (the same
functions the panels draw with, with the recorded strip length and support), the equations as
base64 SVG rendered offline by matplotlib's mathtext (their LaTeX source is the alt text and is shown
as plain text if rendering fails), and no script, font or style sheet from anywhere else.

Contents: review state and drift check, cautions, provenance, inputs, the recorded results in the
chosen unit system, figures, equations used, assumptions and warnings, material data with their
sources, and the review log.
"""
from __future__ import annotations

import base64
import io
import math
import os
from html import escape
from pathlib import Path
from typing import Any, Sequence

import numpy as np

from ..core.errors import InputError
from ..records.check import INTERFACE_LABELS, LAYER_LABELS, RESULT_LABELS, CheckReport, check_record
from ..records.record import DesignRecord, now_utc

__all__ = ["report_html", "write_report", "equations", "figure_images"]

_STYLE = """
body{font-family:"DejaVu Sans",Arial,Helvetica,sans-serif;margin:2em auto;max-width:62em;color:#222;line-height:1.4}
h1{font-size:1.6em;margin-bottom:.2em} h2{font-size:1.2em;border-bottom:1px solid #bbb;margin-top:1.8em}
h3{font-size:1.02em;margin-bottom:.3em}
table{border-collapse:collapse;margin:.4em 0 1em 0;font-size:.92em}
td,th{border:1px solid #ccc;padding:2px 8px;text-align:left;vertical-align:top} th{background:#f1f1f1}
td.num{text-align:right;white-space:nowrap;font-variant-numeric:tabular-nums}
.status{padding:.6em 1em;border-radius:4px;margin:.6em 0;font-weight:bold}
.good{background:#e3f3e3;border:1px solid #7fb77f} .bad{background:#fbe3e3;border:1px solid #d07a7a}
.pending{background:#fff4d6;border:1px solid #d8b24a}
.cautions{background:#fff8e6;border:1px solid #e0b040;padding:.4em 1.2em;border-radius:4px}
.warnings li{color:#8a4a00} figure{margin:1em 0} figcaption{font-size:.88em;color:#444}
figure img{max-width:100%;border:1px solid #ddd}
.equation{overflow-x:auto;margin:.3em 0 .8em 0} .equation img{max-width:none;vertical-align:middle}
code,pre{font-family:"DejaVu Sans Mono",monospace;font-size:.88em} pre{background:#f6f6f6;padding:.6em;overflow-x:auto;white-space:pre-wrap}
.small{font-size:.85em;color:#555}
"""


# --- small formatting helpers ----------------------------------------------------------------------


def _fmt(value: Any, kind: str, system: str, digits: int = 4) -> str:
    from ..core.units import format_quantity

    if value is None:
        return "undefined"
    if isinstance(value, float) and not math.isfinite(value):
        return "undefined"
    if kind in ("", "dimensionless", "strain"):
        return f"{value:.{digits}g}" if isinstance(value, float) else str(value)
    return format_quantity(float(value), kind, system=system, digits=digits)


def _at(value: Any, index: int | None) -> Any:
    if index is None or not isinstance(value, (list, tuple)):
        return value
    return value[index]


def _table(header: Sequence[str], rows: Sequence[Sequence[str]], numeric_from: int = 99) -> str:
    head = "".join(f"<th>{escape(h)}</th>" for h in header)
    body = "".join(
        "<tr>" + "".join(f"<td class='num'>{c}</td>" if i >= numeric_from else f"<td>{c}</td>"
                         for i, c in enumerate(row)) + "</tr>"
        for row in rows
    )
    return f"<table><tr>{head}</tr>{body}</table>"


def _png(figure: Any, dpi: float = 110) -> str:
    buffer = io.BytesIO()
    figure.savefig(buffer, format="png", dpi=dpi, metadata={"Software": None})
    return "data:image/png;base64," + base64.b64encode(buffer.getvalue()).decode("ascii")


# --- figures ---------------------------------------------------------------------------------------


def figure_images(record: DesignRecord, system: str = "si", result: Any = None) -> list[tuple[str, str, str]]:
    """(title, data URI, caption) of each figure: stress through the thickness, deflected shape and the
    sign conventions, drawn by :mod:`bilayer.plots` from ``result`` (default: the recorded design
    evaluated with the recorded material data)."""
    from .. import plots

    result = result if result is not None else record.recorded_design().evaluate()
    index = None
    change = np.asarray(result.temperature_change, float)
    if change.ndim:
        index = int(np.argmax(np.abs(change)))
    at = "" if index is None else (
        f" Shown at the operating temperature with the largest |ΔT| "
        f"({_fmt(float(np.asarray(result.operating_temperature)[index]), 'temperature', system)}).")
    length, support = record.figure_length, record.figure_support
    support_text = "clamped at one end" if support == "cantilever" else "held at its centre"
    images = []
    figure = plots.stress_through_thickness(result, system, index=index)
    images.append(("Stress through the thickness", _png(figure),
                   "σx across the layers far from the ends (tension > 0); the stress jumps at each interface." + at))
    figure = plots.deflected_shape(result, length, support, system, index=index)
    images.append(("Deflected shape", _png(figure),
                   f"Strip of {_fmt(length, 'length', system)} {support_text}, exact arc for the uniform curvature."
                   + at))
    figure = plots.sign_convention_sketch()
    images.append(("Sign conventions", _png(figure),
                   "Layers numbered from the bottom, z upward, κ > 0 when the top face is the longer one, "
                   "tension positive, ΔT = T_operating − T_stress-free."))
    return images


# --- equations -------------------------------------------------------------------------------------

_STATE_EQUATIONS = {
    "narrow": (r"Y_i = E_i,\qquad f_i = \int_{T_0}^{T}\alpha_i\,dT",
               "narrow strip, uniaxial stress"),
    "wide": (r"Y_i = \frac{E_i}{1-\nu_i^2},\qquad f_i = (1+\nu_i)\int_{T_0}^{T}\alpha_i\,dT",
             "wide strip in cylindrical bending (plane strain, ε_y = 0)"),
    "plate": (r"Y_i = \frac{E_i}{1-\nu_i},\qquad f_i = \int_{T_0}^{T}\alpha_i\,dT",
              "plate or disc in equal-biaxial bending"),
}


def equations(n_layers: int, state: str) -> list[tuple[str, str]]:
    """(what it is, LaTeX) of the equations the engine solves for ``n_layers`` in bending ``state``:
    effective modulus and free strain of the state, the stress law, the force and moment balances in
    the laminate sums, the sums themselves and the solution (from :func:`bilayer.core.symbolic.derive`)."""
    from ..core.symbolic import derive

    if state not in _STATE_EQUATIONS:
        raise InputError("state", state, "one of " + ", ".join(_STATE_EQUATIONS))
    latex = derive(n_layers).latex()
    modulus, title = _STATE_EQUATIONS[state]
    items = [
        (f"Effective modulus and free strain, {title}", modulus),
        ("Stress in layer i at height z (z from the bottom face, ε0 = strain of the bottom face)",
         r"\sigma_i(z) = Y_i\,(\varepsilon_0 + \kappa z - f_i)"),
        ("Force balance", latex["reduced_force_balance"]),
        ("Moment balance about the bottom face", latex["reduced_moment_balance"]),
    ]
    for key in ("sum_A", "sum_B", "sum_D", "sum_N_T", "sum_M_T"):
        if key in latex:
            items.append((f"Laminate sum {key[4:]}", latex[key]))
    items += [
        ("Curvature", latex["curvature"]),
        ("Strain of the bottom face", latex["base_strain"]),
        ("Bending axis height", latex["bending_axis"]),
    ]
    return items


def _math_svg(latex: str) -> str | None:
    """Base64 SVG data URI of ``$latex$`` rendered by matplotlib mathtext (fractions in display size),
    or None if mathtext cannot render it."""
    import matplotlib
    from matplotlib import mathtext
    from matplotlib.font_manager import FontProperties

    buffer = io.BytesIO()
    text = latex.replace(r"\frac", r"\dfrac")
    try:
        with matplotlib.rc_context({"svg.hashsalt": "bilayer", "svg.fonttype": "path"}):
            mathtext.math_to_image(f"${text}$", buffer, prop=FontProperties(size=15), format="svg", dpi=100)
    except (ValueError, RuntimeError):
        return None
    return "data:image/svg+xml;base64," + base64.b64encode(buffer.getvalue()).decode("ascii")


# --- the report ------------------------------------------------------------------------------------


def _status_box(record: DesignRecord, check: CheckReport) -> str:
    state = check.review
    css = "good" if state.accepted else ("bad" if state.status in ("changes_needed", "rejected") else "pending")
    review = f"<div class='status {css}' id='review-state'>Review: {escape(state.text())}</div>"
    css = "good" if check.ok else "bad"
    drift = (f"<div class='status {css}' id='check-state'>Check: {escape(check.summary())} "
             f"<span class='small'>(re-evaluated with bilayer {escape(check.current_version)} when this report "
             "was made)</span></div>")
    return review + drift


def _inputs(record: DesignRecord, system: str) -> str:
    from ..designs.sections import job_sections
    from ..core.section_spec import _PLAIN_KINDS

    design = record.design
    temperatures = design.temperatures
    operating = np.atleast_1d(np.asarray(temperatures.operating, float))
    rows = [
        ("bending state", f"{escape(design.state.value)}: {escape(design.state.description)}"),
        ("stress-free temperature", _fmt(temperatures.stress_free, "temperature", system)),
        ("operating temperature", ", ".join(_fmt(t, "temperature", system) for t in operating)),
        ("temperature change ΔT", ", ".join(_fmt(t - temperatures.stress_free, "temperature_difference", system)
                                             for t in operating)),
        ("applied axial force per width", _fmt(design.axial_force, "force_per_width", system)),
        ("applied bending moment per width", _fmt(design.bending_moment, "moment_per_width", system)),
    ]
    html = "<h3>Conditions</h3>" + _table(("input", "value"), [(escape(a), b) for a, b in rows])
    layer_rows = []
    for number in range(design.stack.n_layers, 0, -1):
        layer = design.stack[number - 1]
        layer_rows.append((str(number), escape(layer.label or "—"), escape(layer.material.name),
                           escape(layer.material.key or ""), _fmt(layer.thickness, "length", system)))
    html += ("<h3>Layers (listed top first, numbered from the bottom)</h3>"
             + _table(("#", "label", "material", "key", "thickness"), layer_rows, numeric_from=4))
    known = job_sections()
    for name, values in design.sections.items():
        spec = known.get(name)
        rows = []
        for key, value in values.items():
            kind = ""
            if spec is not None and key in spec.keys:
                kind = spec.field_named(key).kind
                kind = "" if kind in _PLAIN_KINDS else kind
            if isinstance(value, (list, tuple)):
                shown = ", ".join(_fmt(v, kind, system) if kind else escape(str(v)) for v in value)
            else:
                shown = _fmt(value, kind, system) if kind else escape(str(value))
            rows.append((escape(key), shown))
        html += f"<h3>[{escape(name)}]</h3>" + _table(("input", "value"), rows)
    return html


def _results(record: DesignRecord, system: str) -> str:
    results = record.results
    operating = results.get("operating_temperature")
    count = len(operating) if isinstance(operating, list) else None
    indices = [None] if count is None else list(range(count))
    header = ["quantity"] + (["value"] if count is None else
                             [f"at {_fmt(t, 'temperature', system)}" for t in operating])
    rows = []
    for key, (name, kind) in RESULT_LABELS.items():
        if key in results:
            rows.append([escape(name)] + [_fmt(_at(results[key], i), kind, system) for i in indices])
    state = results.get("bending_state", "")
    html = (f"<p>Bending state <b>{escape(state)}</b>, restraint {escape(str(results.get('restraint', '')))}. "
            "Values from the [results] snapshot stored in the record.</p>")
    html += _table(header, rows, numeric_from=1)
    shown_keys = [key for key in LAYER_LABELS if key not in ("bottom", "top")
                  and not (state == "narrow" and key.startswith("transverse"))]
    for i in indices:
        title = "Layers" if i is None else f"Layers at {_fmt(operating[i], 'temperature', system)}"
        layer_rows = []
        layers = results.get("layers", [])
        for number in range(len(layers), 0, -1):
            layer = layers[number - 1]
            layer_rows.append([str(number), escape(layer.get("label") or layer.get("material", ""))]
                              + [_fmt(_at(layer.get(key), i), LAYER_LABELS[key][1], system) for key in shown_keys])
        names = [LAYER_LABELS[key][0] for key in shown_keys]
        html += f"<h3>{escape(title)} (top first)</h3>" + _table(["#", "layer", *names], layer_rows, numeric_from=2)
        interfaces = results.get("interfaces", [])
        if interfaces:
            rows_i = [[f"layers {n} and {n + 1}"]
                      + [_fmt(_at(entry.get(key), i), kind, system) for key, (_, kind) in INTERFACE_LABELS.items()]
                      for n, entry in reversed(list(enumerate(interfaces, start=1)))]
            html += _table(["interface between", *[label for label, _ in INTERFACE_LABELS.values()]], rows_i,
                           numeric_from=1)
    return html


def _cte_kind(cte: Any, system: str) -> str:
    kind = getattr(cte, "kind", "")
    if kind == "mean_table":
        return f"table of mean values from {_fmt(cte.reference_temperature, 'temperature', system)}"
    return {"constant": "constant", "instantaneous_table": "table of instantaneous values",
            "silicon_okada_tokumaru": "silicon, Okada and Tokumaru 1984 formula"}.get(kind, kind or "model")


def _materials(record: DesignRecord, system: str) -> str:
    html = ""
    for material_id, material in record.materials.items():
        rows = [
            ("Young's modulus E", _fmt(material.youngs_modulus, "modulus", system), "youngs_modulus"),
            ("Poisson's ratio ν", f"{material.poisson_ratio:.4g}", "poisson_ratio"),
            ("CTE", f"{_fmt(material.cte.nominal, 'cte', system)} nominal ({escape(_cte_kind(material.cte, system))}"
                    + (f", valid {_fmt(material.cte.valid_range[0], 'temperature', system)} to "
                       f"{_fmt(material.cte.valid_range[1], 'temperature', system)}"
                       if material.cte.valid_range else "") + ")", "cte"),
        ]
        if material.density is not None:
            rows.append(("density", _fmt(material.density, "density", system), "density"))
        if material.strength is not None:
            rows.append((f"strength ({material.strength_kind or 'unspecified'})",
                         _fmt(material.strength, "stress", system), "strength"))
        if material.temperature_range is not None:
            low, high = material.temperature_range
            rows.append(("temperature range", f"{_fmt(low, 'temperature', system)} to {_fmt(high, 'temperature', system)}",
                         "temperature_range"))
        for key, label in (("glass_transition", "glass transition"), ("solidus", "solidus")):
            if getattr(material, key) is not None:
                rows.append((label, _fmt(getattr(material, key), "temperature", system), key))
        table_rows = [(escape(label), value, escape(material.sources.get(key, "no source given")))
                      for label, value, key in rows]
        extra = [(escape(key), "", escape(text)) for key, text in material.sources.items()
                 if key not in {row[2] for row in rows}]
        html += (f"<h3>{escape(material.name)} <span class='small'>(id {escape(material_id)})</span></h3>"
                 + _table(("property", "value", "source"), table_rows + extra))
        if material.notes:
            html += f"<p class='small'>{escape(material.notes)}</p>"
    return html


def _reviews(record: DesignRecord, check: CheckReport) -> str:
    if not record.reviews:
        return "<p>No reviews yet.</p>"
    rows = []
    for number, entry in enumerate(record.reviews, start=1):
        same = "yes" if entry.inputs_hash == check.current_hash else "no (other inputs)"
        rows.append((str(number), escape(entry.date), escape(entry.reviewer), escape(entry.verdict.replace("_", " ")),
                     escape(entry.comment), same))
    html = _table(("#", "date", "reviewer", "verdict", "comment", "for these inputs"), rows)
    for problem in check.review_problems:
        html += f"<p class='status bad'>{escape(problem)}</p>"
    return html


def report_html(record: DesignRecord, system: str = "si", check: CheckReport | None = None,
                cautions: Sequence[str] | None = None, generated: str | None = None) -> str:
    """The HTML text of the report of ``record`` in unit ``system`` ("si" or "us").

    ``check`` defaults to :func:`bilayer.records.check_record` run now; ``cautions`` to today's
    cautions for the design (:func:`bilayer.designs.jobs.cautions_for`).
    """
    from ..designs.jobs import cautions_for, job_warnings
    from ..core.units import UNIT_SYSTEMS

    if system not in UNIT_SYSTEMS:
        raise InputError("system", system, "one of " + ", ".join(UNIT_SYSTEMS))
    cautions = tuple(cautions if cautions is not None else cautions_for(record.design))
    check = check if check is not None else check_record(record, cautions=cautions)
    design = record.design
    title = design.name or Path(record.source).name or "design record"
    parts = [
        "<!DOCTYPE html>",
        "<html lang='en'><head><meta charset='utf-8'>",
        "<meta http-equiv='Content-Security-Policy' content=\"default-src 'none'; img-src data:; style-src 'unsafe-inline'\">",
        f"<title>{escape(title)} — bilayer design report</title><style>{_STYLE}</style></head><body>",
        f"<h1>{escape(title)}</h1>",
        f"<p class='small'>Design report made by bilayer from <code>{escape(record.source)}</code> on "
        f"{escape(generated or now_utc())}; units: {'SI' if system == 'si' else 'US customary'}.</p>",
    ]
    if design.notes:
        parts.append(f"<p>{escape(design.notes)}</p>")
    parts.append(_status_box(record, check))
    parts.append("<h2 id='cautions'>Cautions</h2><div class='cautions'><ul>"
                 + "".join(f"<li>{escape(text)}</li>" for text in cautions) + "</ul></div>")
    parts.append("<h2 id='provenance'>Provenance</h2>" + _table(("item", "value"), [
        ("record format", str(record.format)),
        ("computed by", f"bilayer {escape(record.bilayer_version)}"),
        ("computed on", escape(record.created or "not recorded")),
        ("inputs hash", f"<code>{escape(record.inputs_hash)}</code>"),
        ("inputs now", "match the hash" if check.inputs_match else
         f"<b>do not match</b> (<code>{escape(check.current_hash)}</code>)"),
        *[("note", escape(note)) for note in check.notes],
    ]))
    parts.append(f"<h3>Drift check</h3><pre>{escape(check.text(system))}</pre>")
    parts.append("<h2 id='inputs'>Inputs</h2>" + _inputs(record, system))
    parts.append("<h2 id='results'>Results</h2>" + _results(record, system))
    parts.append("<h2 id='figures'>Figures</h2>")
    for figure_title, uri, caption in figure_images(record, system):
        parts.append(f"<figure><img class='bilayer-figure' alt='{escape(figure_title)}' src='{uri}'>"
                     f"<figcaption><b>{escape(figure_title)}.</b> {escape(caption)}</figcaption></figure>")
    parts.append("<h2 id='equations'>Equations used</h2><p>Euler–Bernoulli strip with perfectly bonded linear "
                 "elastic layers, solved by force and moment balance (S. Timoshenko, J. Opt. Soc. Am. 11:233, 1925, "
                 "for two layers; C.H. Hsueh, Thin Solid Films 418:182, 2002, for n layers). The sums are written "
                 f"out for this design's {design.stack.n_layers} layers by bilayer.core.symbolic; in them h_i is the height "
                 "of the top of layer i and α_i ΔT stands for the free strain f_i of the bending state.</p>")
    for what, latex in equations(design.stack.n_layers, design.state.value):
        uri = _math_svg(latex)
        shown = (f"<img alt='{escape(latex)}' src='{uri}'>" if uri else f"<code>{escape(latex)}</code>")
        parts.append(f"<div><span class='small'>{escape(what)}</span><div class='equation'>{shown}</div></div>")
    warnings_list = record.results.get("warnings", [])
    parts.append("<h2 id='assumptions'>Assumptions and warnings</h2><h3>Assumptions</h3><ul>"
                 + "".join(f"<li>{escape(a)}</li>" for a in record.results.get("assumptions", [])) + "</ul>")
    parts.append("<h3>Warnings</h3>" + ("<ul class='warnings'>" + "".join(f"<li>{escape(w)}</li>" for w in warnings_list)
                                        + "</ul>" if warnings_list else "<p>None.</p>"))
    for section, texts in job_warnings(design).items():
        parts.append(f"<h3>Warnings of the [{escape(section)}] job (computed from the design now)</h3>"
                     + ("<ul class='warnings'>" + "".join(f"<li>{escape(w)}</li>" for w in texts) + "</ul>"
                        if texts else "<p>None.</p>"))
    parts.append("<h2 id='materials'>Material data and sources</h2><p>The copy kept in the record (what the "
                 "results were computed with).</p>" + _materials(record, system))
    parts.append("<h2 id='reviews'>Review log</h2>" + _reviews(record, check))
    parts.append("<p class='small'>This file is self-contained: it loads nothing from the network.</p></body></html>")
    return "\n".join(parts)


def write_report(record: DesignRecord, path: "str | os.PathLike", system: str = "si",
                 check: CheckReport | None = None, cautions: Sequence[str] | None = None) -> Path:
    """Write the report of ``record`` to ``path`` atomically; returns the path."""
    from ..designs.design_file import write_text_atomic

    return write_text_atomic(path, report_html(record, system, check, cautions))
