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

_PASS, _FAIL, _GOV, _BEND = "#4477aa", "#cc3311", "#222222", "#66aacc"


def _axes(ax: Axes | None, size: tuple[float, float]) -> Axes:
    if ax is not None:
        return ax
    fig = Figure(figsize=size, layout="constrained")
    return fig.add_subplot()


def _short(route) -> str:
    """A short name of a route of the member checks with bending, for a bar label."""
    if route.key == "second-order":
        plane = "major" if "major" in route.title else "minor"
        return f"2nd order, imperfections {plane}"
    return {"member": "6.3.3", "direct-analysis": "H1.1, direct analysis"}.get(route.key, route.key)


def plot_utilisation(result: DesignResult, ax: Axes | None = None, title: str = "") -> Axes:
    """Bar chart of the utilisation of every check (segment and axis, or tension).

    Bars above 1 are drawn in the failing colour; the member checks with
    bending (one bar per segment and route) in a lighter colour; the check
    with the largest utilisation is outlined; a dashed line marks
    utilisation 1; the title gives the verdict with bending, else whether
    the axial checks pass.

    Parameters
    ----------
    result : the design check
    ax : axes to draw on (a new figure when None)
    title : figure title (the standard is added)

    Returns
    -------
    matplotlib.axes.Axes
    """
    routes = list(result.bending.routes) if result.bending is not None else []
    ax = _axes(ax, (6.5, 0.45 * (len(result.checks) + len(routes)) + 1.6))
    checks = result.checks
    labels = [f"{c.segment + 1} {c.name} - {'tension' if c.kind == 'tension' else c.axis}" for c in checks]
    labels += [f"{r.segment + 1} {r.name} - bending: {_short(r)}" for r in routes]
    u = np.array([c.utilisation for c in checks] + [r.utilisation for r in routes], dtype=float)
    shown = np.where(np.isfinite(u), u, 0.0)
    top = float(shown.max()) if len(shown) else 1.0
    bent = result.bending.governing if result.bending is not None else None
    gov_index = checks.index(result.governing)
    if bent is not None and bent.utilisation > result.governing.utilisation:
        gov_index = len(checks) + routes.index(bent)
    y = np.arange(len(u))[::-1]
    colours = [_FAIL if v > 1 else (_BEND if k >= len(checks) else _PASS) for k, v in enumerate(u)]
    bars = ax.barh(y, np.where(np.isfinite(u), u, 1.15 * max(top, 1.0)), color=colours, height=0.6)
    for k, (b, v) in enumerate(zip(bars, u)):
        if k == gov_index:
            b.set_edgecolor(_GOV)
            b.set_linewidth(1.8)
        ax.text(b.get_width(), b.get_y() + b.get_height() / 2, f" {v:.2f}" if math.isfinite(v) else " no equilibrium",
                va="center", fontsize=8)
    ax.set_yticks(y, labels, fontsize=8)
    ax.axvline(1.0, color=_GOV, linestyle="--", linewidth=1)
    ax.set_xlim(0, max(1.15, top * 1.15))
    ax.set_xlabel("utilisation N_Ed / N_Rd [-]" if not routes else "utilisation [-]")
    if routes or result.bending is not None:
        state = result.verdict  # with bending the verdict, not the axial checks alone
    else:
        state = "passes" if result.passed else "fails"
    finite = u[np.isfinite(u)]
    peak = f"{float(finite.max()):.2f}" if len(finite) == len(u) else "inf"
    ax.set_title(f"{title + ': ' if title else ''}{result.standard}, {state} (max {peak})", fontsize=9)
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
