"""Panel responsiveness: time from a control change to the redrawn figure, inside the kernel process.

A change is a new operating temperature typed into the stack editor (``text.value = "..."``): the
editor rebuilds the design, the model calls the engine once, and the view on the open tab updates its
artists, renders the figure with Agg and encodes the PNG the front end shows. Every step is
synchronous, so the wall time of the assignment is the full kernel-side latency.

Baseline, measured in the same run: the same-size figure with one line, redrawn and encoded the same
way (the floor for any matplotlib view). Ratios against it are printed so the numbers can be compared
between machines. Target: median under 30 ms for the closed-form views (stress, shape, interface).

    python benchmarks/bench_panels.py [--repeats 40]
"""
from __future__ import annotations

import argparse
import os
import statistics
import sys
import time
from pathlib import Path

os.environ.setdefault("MPLBACKEND", "Agg")
sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

import numpy as np  # noqa: E402

from bilayer import plots
from bilayer.panels import JOB_PANELS, FigureImage, StackExplorer

TARGET_MS = 30.0


def median_ms(action, values, warmup: int = 3) -> tuple[float, float]:
    """Median and 90th percentile [ms] of ``action(value)`` over ``values`` after a warm-up."""
    for value in values[:warmup]:
        action(value)
    times = []
    for value in values[warmup:]:
        start = time.perf_counter()
        action(value)
        times.append(time.perf_counter() - start)
    times_ms = np.array(times) * 1e3
    return float(np.median(times_ms)), float(np.percentile(times_ms, 90))


def baseline(repeats: int) -> tuple[float, float]:
    image = FigureImage(3.6, {"left": 0.12, "right": 0.97, "bottom": 0.14, "top": 0.91})
    ax = image.figure.add_subplot()
    x = np.linspace(0.0, 1.0, 8)
    (line,) = ax.plot(x, x)

    def redraw(k):
        line.set_ydata(x * (1 + 0.01 * k))
        ax.relim()
        ax.autoscale_view()
        image.refresh()

    return median_ms(redraw, list(range(repeats + 3)))


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeats", type=int, default=40)
    args = parser.parse_args()
    temperatures = [f"{40 + 0.5 * k:g} degC" for k in range(args.repeats + 3)]

    base, base90 = baseline(args.repeats)
    explorer = StackExplorer()
    design = explorer.model.design
    engine, _ = median_ms(lambda _: design.evaluate(), list(range(args.repeats + 3)))

    def typed(text):
        explorer.editor.operating.text.value = text

    rows = []
    for tab, closed_form in (("stress", True), ("shape", True), ("interface", True), ("thickness ratio", False)):
        explorer.show(tab)
        median, p90 = median_ms(typed, temperatures if tab != "thickness ratio" else temperatures[:13])
        rows.append((tab, median, p90, closed_form))

    print(f"panel latency, control change -> redrawn figure (median of {args.repeats}; 2 shared cores)")
    print(f"  baseline: one-line figure of the same size, redraw + PNG   {base:7.2f} ms (p90 {base90:.2f})")
    print(f"  engine call alone (Design.evaluate)                        {engine:7.3f} ms")
    failed = False
    for tab, median, p90, closed_form in rows:
        verdict = ""
        if closed_form:
            verdict = "ok" if median < TARGET_MS else f"ABOVE the {TARGET_MS:.0f} ms target"
            failed |= median >= TARGET_MS
        print(f"  view '{tab}':{' ' * (16 - len(tab))}{median:8.2f} ms (p90 {p90:7.2f})  "
              f"ratio to baseline {median / base:5.2f}  {verdict}")
    print(f"target: closed-form views (stress, shape, interface) median < {TARGET_MS:.0f} ms")
    print("job panels, entry typed -> job report and figure redrawn (no target; each runs the job's full check):")
    for name, median, p90 in job_panels(max(8, args.repeats // 4)):
        print(f"  {name:<16}{median:8.2f} ms (p90 {p90:7.2f})  ratio to baseline {median / base:5.2f}")
    return 1 if failed else 0


EXAMPLES = Path(__file__).resolve().parent.parent / "bilayer" / "examples"
JOBS = (
    ("thermostat", "propagator_heat_mat_cutout.toml", "length", "{:g} mm", 25.0),
    ("solder_joint", "irrigation_timer_chip_carrier.toml", "dnp", "{:g} mm", 5.0),
    ("adhesive_bond", "tank_gauge_glass_strip.toml", "overlap", "{:g} mm", 60.0),
    ("film", "nitride_on_wafer.toml", "bow_after", "-{:g} um", 25.0),
)


def job_panels(repeats: int):
    """Median and p90 [ms] of one typed entry per job panel, on the shipped invented examples."""
    from bilayer.designs.design_file import load_design

    rows = []
    for section, example, field, pattern, start in JOBS:
        path = EXAMPLES / example
        if not path.exists():
            continue
        explorer = StackExplorer(load_design(path))
        explorer.show(JOB_PANELS[section][0])
        entry = explorer.jobs[section].form[field]
        values = [pattern.format(start * (1 + 0.002 * k)) for k in range(repeats + 3)]

        def typed(text, entry=entry):
            entry.value = text

        rows.append((section, *median_ms(typed, values)))
    return rows


if __name__ == "__main__":
    sys.exit(main())
