"""Figures of the imperfect-column analysis (matplotlib; imported only when plotting).

* :func:`plot_path` -- load factor against the lateral deflection at the control
  point: the nonlinear path (first yield and peak marked) and the second-order
  elastic curve, with the elastic critical load as a horizontal line.
* :func:`plot_diagrams` -- bow and deflection, bending moment and extreme-fibre
  stress along the height at one load factor (second-order elastic analysis),
  the column drawn upright.
* :func:`plot_comparison` -- bars of the load factors: elastic critical (eigen),
  Euler load of the segment, Perry-Robertson first yield, the first yield of
  each model that found one (elastic second order without residual stress;
  fibre model, with residual stress when given) and the ultimate load.

Every function takes an :class:`~fea.solve.imperfect.ImperfectResult` and
returns a :class:`matplotlib.figure.Figure`; units are given as
``(label, SI value of one unit)`` pairs, e.g. ``("mm", 1e-3)``.
"""

from __future__ import annotations

import math
from typing import TYPE_CHECKING

import numpy as np

if TYPE_CHECKING:
    from matplotlib.figure import Figure

    from ..solve.imperfect import ImperfectResult

__all__ = ["plot_path", "plot_diagrams", "plot_comparison"]

INK = "#222222"
C_NL = "#1f5fa8"
C_SO = "#c4572a"
C_CR = "#6b6b6b"
C_YIELD = "#d9a400"


def _new_figure(size: tuple[float, float]) -> Figure:
    from matplotlib.figure import Figure

    return Figure(figsize=size, constrained_layout=True)


def _title(r: ImperfectResult, what: str) -> str:
    return f"{what}, {r.axis} axis" if r.axis else what


def plot_path(r: ImperfectResult, *, length_unit=("mm", 1e-3), fig: Figure | None = None) -> Figure:
    """Load factor against the total lateral deflection at the control height.

    Parameters
    ----------
    r : ImperfectResult
    length_unit : (label, metres per unit)
    fig : an existing figure to draw into (a new one by default)
    """
    fig = fig or _new_figure((6.4, 4.6))
    from ..solve.imperfect import ELASTIC_MODEL

    ax = fig.add_subplot()
    lu, ls = length_unit
    nl, so = r.nonlinear, r.second_order
    h_ctrl = None
    if nl is not None:
        h_ctrl = nl.control_height
        x = nl.control_deflection / ls
        ax.plot(x, nl.load_factors, "-", color=C_NL, lw=1.8, label=f"nonlinear ({r.fibre_model})")
        if nl.limit_load_factor is not None:
            i = nl.limit_index
            ax.plot([x[i]], [nl.limit_load_factor], "o", color=C_NL, ms=7, mfc="white", mew=1.8)
            ax.annotate(f"ultimate {nl.limit_load_factor:.4g}", (x[i], nl.limit_load_factor),
                        textcoords="offset points", xytext=(8, 6), color=C_NL, fontsize=9)
        if nl.first_yield_load_factor is not None:
            yi = float(np.interp(nl.first_yield_load_factor, nl.load_factors[: (nl.limit_index or len(x) - 1) + 1],
                                 x[: (nl.limit_index or len(x) - 1) + 1]))
            ax.plot([yi], [nl.first_yield_load_factor], "s", color=C_YIELD, ms=6, mec=INK, mew=0.6,
                    label=f"first yield, {r.fibre_model} {nl.first_yield_load_factor:.4g}")
    if so is not None:
        j = int(np.argmin(np.abs(so.heights - h_ctrl))) if h_ctrl is not None else \
            int(np.argmax(np.abs(so.deflection[-1])))
        h_ctrl = so.heights[j] if h_ctrl is None else h_ctrl
        lam = so.load_factors
        ax.plot(so.deflection[:, j] / ls, lam, "--", color=C_SO, lw=1.4, label="elastic second order")
        if so.first_yield_load_factor is not None:
            k = int(np.argmin(np.abs(lam - so.first_yield_load_factor)))
            ax.plot([so.deflection[k, j] / ls], [lam[k]], "D", color=C_SO, ms=5, mfc="white",
                    label=f"first yield, {ELASTIC_MODEL} {so.first_yield_load_factor:.4g}")
    if math.isfinite(r.critical_load_factor):
        ax.axhline(r.critical_load_factor, color=C_CR, lw=1.0, ls=":")
        ax.annotate(f"elastic critical {r.critical_load_factor:.4g}", (0.01, r.critical_load_factor),
                    xycoords=("axes fraction", "data"), textcoords="offset points", xytext=(2, 3), color=C_CR,
                    fontsize=9)
        top = ax.get_ylim()[1]
        ax.set_ylim(0.0, max(top, 1.08 * r.critical_load_factor) if r.critical_load_factor < 3 * top else top)
    else:
        ax.set_ylim(bottom=0.0)
    where = f" at {h_ctrl / ls:.4g} {lu} up" if h_ctrl is not None else ""
    ax.set_xlabel(f"total lateral deflection{where} [{lu}]")
    ax.set_ylabel("load factor [-]")
    ax.set_title(_title(r, "Load-deflection path"))
    ax.grid(True, lw=0.4, alpha=0.5)
    ax.legend(loc="lower right", fontsize=8, frameon=False)
    return fig


def plot_diagrams(r: ImperfectResult, load_factor: float | None = None, *, length_unit=("mm", 1e-3),
                  force_unit=("kN", 1e3), stress_unit=("MPa", 1e6), fy: float | None = None,
                  fig: Figure | None = None) -> Figure:
    """Deflection, bending moment and stress along the height at one load factor.

    Parameters
    ----------
    r : ImperfectResult with a second-order result
    load_factor : the level to show (default: 1.0 when stored, else the largest stored below first yield)
    length_unit, force_unit, stress_unit : (label, SI value of one unit)
    fy : yield strength [Pa] drawn on the stress panel (optional)
    fig : an existing figure to draw into
    """
    so = r.second_order
    if so is None:
        raise ValueError("plot_diagrams needs the second-order result (analysis 'second-order' or 'both')")
    lu, ls = length_unit
    fu, fs = force_unit
    su, ss = stress_unit
    if load_factor is None:
        load_factor = 1.0 if np.any(np.abs(so.load_factors - 1.0) < 1e-12) else float(so.load_factors[-1])
    k = so.at(load_factor)
    lam = so.load_factors[k]
    fig = fig or _new_figure((9.0, 5.2))
    axs = fig.subplots(1, 3, sharey=True)
    H = so.heights / ls
    he = so.end_heights / ls
    a = axs[0]
    a.plot(so.bow / ls, H, ":", color=C_CR, label="initial bow")
    a.plot(so.deflection[k] / ls, H, "-", color=C_SO, lw=1.6, label="total deflection")
    a.axvline(0.0, color=INK, lw=0.6)
    a.set_xlabel(f"lateral deflection [{lu}]")
    a.set_ylabel(f"height [{lu}]")
    a.legend(fontsize=8, frameon=False, loc="best")
    b = axs[1]
    M = so.moment[k] / (fs * ls)
    b.fill_betweenx(he, 0.0, M, color=C_SO, alpha=0.15, lw=0)
    b.plot(M, he, "-", color=C_SO, lw=1.6, label="second order")
    b.plot(so.first_order_moment[k] / (fs * ls), he, "--", color=C_CR, lw=1.0, label="first order")
    b.axvline(0.0, color=INK, lw=0.6)
    b.set_xlabel(f"bending moment [{fu}*{lu}]")
    b.legend(fontsize=8, frameon=False, loc="best")
    c = axs[2]
    if np.all(np.isnan(so.stress[k])):
        c.text(0.5, 0.5, "no section modulus:\nstresses not computed", ha="center", va="center",
               transform=c.transAxes, fontsize=9)
    else:
        c.plot(so.stress[k] / ss, he, "-", color=C_SO, lw=1.6, label="|N|/A + |M|/W")
        if fy is not None:
            c.axvline(fy / ss, color=C_YIELD, lw=1.2, ls="--", label="fy")
        c.set_xlim(left=0.0)
        c.legend(fontsize=8, frameon=False, loc="best")
    c.set_xlabel(f"extreme-fibre stress [{su}]")
    for x in (a, b, c):
        x.grid(True, lw=0.4, alpha=0.5)
    fig.suptitle(_title(r, f"Second-order elastic diagrams at load factor {lam:.4g}"))
    return fig


def plot_comparison(r: ImperfectResult, segment: int | None = None, *, fig: Figure | None = None) -> Figure:
    """Bars of the comparison figures of one segment, as load factors.

    Parameters
    ----------
    r : ImperfectResult
    segment : segment index (0-based); default the segment with the largest
        variable compression
    fig : an existing figure to draw into
    """
    rows = [c for c in r.comparison if c.variable_force > 0]
    if not rows:
        raise ValueError("no segment carries variable compression: nothing to compare")
    c = r.comparison[segment] if segment is not None else max(rows, key=lambda c: c.variable_force)
    so_fy, fib_fy = r.second_order_first_yield_load_factor, r.fibre_first_yield_load_factor
    items = [("elastic critical\n(eigen)", r.critical_load_factor, C_CR),
             ("Euler load of\nthe segment", c.load_factor(c.euler_force), C_CR),
             ("Perry-Robertson\nfirst yield", c.perry_load_factor, C_YIELD)]
    if so_fy is not None or fib_fy is None:
        items.append(("first yield,\nelastic 2nd order,\nno residual\nstress", so_fy, C_SO))
    if fib_fy is not None:
        items.append((f"first yield,\nfibre model,\n{'with' if r.residual_stress else 'no'} residual\nstress",
                      fib_fy, C_NL))
    items.append(("ultimate,\nfibre model", r.limit_load_factor, C_NL))
    fig = fig or _new_figure((8.0, 4.4))
    ax = fig.add_subplot()
    for i, (name, v, col) in enumerate(items):
        if v is None or not math.isfinite(v):
            ax.text(i, 0.0, "n/a", ha="center", va="bottom", fontsize=9, color=C_CR)
            continue
        ax.bar(i, v, color=col, width=0.6, alpha=0.85)
        ax.text(i, v, f"{v:.4g}", ha="center", va="bottom", fontsize=9)
    ax.set_xticks(range(len(items)), [n for n, _, _ in items], fontsize=8)
    ax.set_ylabel("load factor [-]")
    ax.axhline(1.0, color=INK, lw=0.6)
    ax.set_title(_title(r, f"Comparison, segment {c.index + 1}"))
    fy, src = r.reported_first_yield
    if fy is not None:
        ax.set_xlabel(f"headline first yield: {src} ({fy:.4g})", fontsize=8)
    ax.grid(True, axis="y", lw=0.4, alpha=0.5)
    return fig
