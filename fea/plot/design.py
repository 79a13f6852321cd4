"""Figures of design checks and sizing runs (the only design module that imports matplotlib).

Both functions consume result objects and return the ``Axes`` they drew on;
save with :func:`fea.plot.save_figure`.
"""

from __future__ import annotations

import math

import numpy as np
from matplotlib.axes import Axes
from matplotlib.figure import Figure

from ..design.check import DesignResult
from ..design.sizing import SizingResult

__all__ = ["plot_utilisation", "plot_candidates"]

_PASS, _FAIL, _GOV = "#4477aa", "#cc3311", "#222222"


def _axes(ax: Axes | None, size: tuple[float, float]) -> Axes:
    if ax is not None:
        return ax
    fig = Figure(figsize=size, layout="constrained")
    return fig.add_subplot()


def plot_utilisation(result: DesignResult, ax: Axes | None = None, title: str = "") -> Axes:
    """Bar chart of the utilisation of every check (segment and axis, or tension).

    Bars above 1 are drawn in the failing colour; the governing check is
    outlined; a dashed line marks utilisation 1.

    Parameters
    ----------
    result : the design check
    ax : axes to draw on (a new figure when None)
    title : figure title (the standard is added)

    Returns
    -------
    matplotlib.axes.Axes
    """
    ax = _axes(ax, (6.5, 0.45 * len(result.checks) + 1.6))
    checks = result.checks
    y = np.arange(len(checks))[::-1]
    u = np.array([c.utilisation for c in checks])
    gov = result.governing
    colours = [_FAIL if c.utilisation > 1 else _PASS for c in checks]
    bars = ax.barh(y, u, color=colours, height=0.6)
    for b, c in zip(bars, checks):
        if c is gov:
            b.set_edgecolor(_GOV)
            b.set_linewidth(1.8)
        ax.text(b.get_width(), b.get_y() + b.get_height() / 2, f" {c.utilisation:.2f}", va="center", fontsize=8)
    labels = [f"{c.segment + 1} {c.name} - {'tension' if c.kind == 'tension' else c.axis}" for c in checks]
    ax.set_yticks(y, labels, fontsize=8)
    ax.axvline(1.0, color=_GOV, linestyle="--", linewidth=1)
    ax.set_xlim(0, max(1.15, float(u.max()) * 1.15))
    ax.set_xlabel("utilisation N_Ed / N_Rd [-]")
    state = "passes" if result.passed else "fails"
    ax.set_title(f"{title + ': ' if title else ''}{result.standard}, {state} (max {gov.utilisation:.2f})",
                 fontsize=9)
    return ax


def plot_candidates(result: SizingResult, ax: Axes | None = None, title: str = "") -> Axes:
    """Largest utilisation against mass per length of every catalogue candidate.

    Passing candidates in one colour, failing ones in another, the chosen
    (lightest passing) one ringed; a dashed line marks the target utilisation.

    Returns
    -------
    matplotlib.axes.Axes
    """
    ax = _axes(ax, (6.5, 4.2))
    ok = [c for c in result.candidates if c.design is not None]
    m = np.array([c.candidate.mass for c in ok])
    u = np.array([c.max_utilisation for c in ok])
    passed = np.array([result.passes(c) for c in ok], dtype=bool)
    if len(ok):
        ax.scatter(m[passed], u[passed], color=_PASS, label="passes", zorder=3)
        ax.scatter(m[~passed], u[~passed], color=_FAIL, marker="x", label="fails", zorder=3)
    ch = result.chosen
    if ch is not None:
        ax.scatter([ch.candidate.mass], [ch.max_utilisation], s=160, facecolors="none", edgecolors=_GOV,
                   linewidths=1.5, label=f"lightest passing: {ch.candidate.name}", zorder=4)
    ax.axhline(result.target, color=_GOV, linestyle="--", linewidth=1)
    ax.set_xlabel("mass per length [kg/m]")
    ax.set_ylabel("largest utilisation [-]")
    if len(ok) and np.isfinite(u).any():
        top = float(np.nanmax(u[np.isfinite(u)]))
        ax.set_ylim(0, min(max(1.2 * result.target, 1.05 * top), 5 * result.target))
        if top > 5 * result.target:
            ax.text(0.99, 0.98, "some candidates above the axis", transform=ax.transAxes, ha="right",
                    va="top", fontsize=8)
    ax.legend(fontsize=8, loc="upper right" if not math.isfinite(u.max(initial=0)) else "best")
    ax.set_title(f"{title + ': ' if title else ''}candidates by {result.standard}", fontsize=9)
    return ax
