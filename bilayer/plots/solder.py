"""Figure of a solder joint: failed fraction against cycles (Weibull)."""
from __future__ import annotations

from typing import TYPE_CHECKING, Sequence

import numpy as np
from matplotlib.figure import Figure
from .canvas import PALETTE, target

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.axes import Axes


__all__ = ["weibull_failures"]


# --------------------------------------------------------------------------------------------
# Solder joints: failed fraction against cycles


def weibull_failures(
    populations: Sequence[tuple[str, float, float]],
    ax: "Axes | None" = None,
    marks: Sequence[tuple[str, float, float]] = (),
    title: str = "Failed fraction of joints against cycles (two-parameter Weibull)",
) -> Figure:
    """Cumulative failed fraction F(N) = 1 - exp(-(N/eta)^beta) of each population ``(label, eta, beta)``.

    ``marks`` adds points ``(label, cycles, fraction)`` (the median life at 50 %, an early-failure life).
    Cycles on a logarithmic axis; the fraction in percent.
    """
    figure, ax = target(ax, 3.4)
    etas = [eta for _, eta, _ in populations if np.isfinite(eta) and eta > 0]
    if etas:
        low, high = min(etas) * 1e-2, max(etas) * 3.0
        cycles = np.geomspace(low, high, 300)
        for k, (label, eta, beta) in enumerate(populations):
            fraction = 1.0 - np.exp(-((cycles / eta) ** beta))
            ax.plot(cycles, 100 * fraction, color=PALETTE[(3 * k) % len(PALETTE)], lw=2.0, label=label)
        ax.set_xscale("log")
        ax.set_xlim(low, high)
    for k, (label, n, fraction) in enumerate(marks):
        ax.plot([n], [100 * fraction], "o", color=PALETTE[(2 * k + 5) % len(PALETTE)], mec="black", ms=6,
                label=f"{label}: {n:.3g} cycles")
    ax.axhline(50.0, color="0.6", lw=0.6, ls=":")
    ax.set_ylim(0, 100)
    ax.set_xlabel("cycles to failure N (logarithmic)")
    ax.set_ylabel("failed fraction [%]")
    ax.set_title(title, fontsize=10, y=1.0, pad=5)
    ax.legend(fontsize=7, loc="upper left", frameon=False)
    ax.grid(True, which="both", lw=0.3, alpha=0.5)
    return figure
