"""Charts of restraint studies: sweep curves, two-parameter contour charts, brace-stiffness curves.

Consumes :class:`fea.study.sweep.SweepResult` and :class:`fea.study.brace.BraceResult`;
never recomputes physics.  Stiffnesses and lengths are drawn in the case's
display units.  Save with :func:`fea.plot.save_figure`.

Load factors below 1 (the column buckles under the case loads): the region
below load factor 1 is hatched in grey under a black line at 1 labelled
"buckles under the case loads", and the points below it are drawn as black
crosses, so that the charts read in black and white.  When the case as given
buckles, the figure's title says so.
"""

from __future__ import annotations

import math

import numpy as np
from matplotlib.figure import Figure

from ..cautions import CAUTION
from .style import FS_TICK, INK

#: Label of the line at load factor 1 and of the hatched region below it.
BELOW_ONE_LABEL = "buckles under the case loads"
#: Hatch of the region below load factor 1.
BELOW_ONE_HATCH = "//"
#: Grey of the hatch lines (light, so that the curves stay legible over it).
BELOW_ONE_GREY = "0.62"
#: Added to the figure title when the case as given buckles under its case loads.
CASE_BELOW_ONE_TITLE = "WARNING: the case as given buckles under its case loads (lowest load factor below 1)"

__all__ = ["plot_sweep", "plot_brace"]


def _scale_of(key, display, values=()):
    """(SI value of one display unit, unit label) for a key's values: the case's display units, stiffnesses
    in engineering units sized to the values (180 MN*m/rad)."""
    from ..io.study_output import key_unit
    from ..units import DisplayUnits

    unit, scale = key_unit(key, values, display or DisplayUnits())
    return scale, unit


def _axis_label(key, unit: str) -> str:
    """A readable axis label: "restraint 1 rotation stiffness [MN*m/rad]"."""
    return f"{key.label} [{unit}]"


def _caption(fig: Figure) -> None:
    fig.supxlabel(CAUTION, fontsize=6, color="0.35", x=0.01, ha="left", wrap=True)


def _suptitle(fig: Figure, title: str, case_below_one: bool) -> None:
    if case_below_one:
        title = f"{title}\n{CASE_BELOW_ONE_TITLE}"
    fig.suptitle(title, fontsize=11)


def _below(y) -> np.ndarray:
    """Mask of values below 1 (NaN, a point not analysed, is not)."""
    a = np.asarray(y, dtype=float)
    return np.less(a, 1.0, where=~np.isnan(a), out=np.zeros(a.shape, bool))


def _below_one_band(ax, y_line: float = 1.0) -> None:
    """Hatch the part of ``ax`` below ``y_line`` (where the load factor is below 1), with the line and its label.

    Drawn only when the axes reach below the line; the axes' limits are kept.
    """
    lo, hi = ax.get_ylim()
    if lo >= y_line:
        return
    ax.axhspan(lo, y_line, facecolor="none", edgecolor=BELOW_ONE_GREY, hatch=BELOW_ONE_HATCH, lw=0.0,
               hatch_linewidth=0.6, zorder=0)
    ax.axhline(y_line, color=INK, lw=1.0, zorder=1)
    ax.annotate(BELOW_ONE_LABEL, xy=(0.99, y_line), xycoords=("axes fraction", "data"), ha="right", va="top",
                fontsize=FS_TICK - 1, color=INK, xytext=(0, -2), textcoords="offset points",
                bbox={"boxstyle": "square,pad=0.15", "fc": "white", "ec": "none"}, zorder=3)
    ax.set_ylim(lo, hi)


def _mark_below(ax, x, y, low, label: str | None = "load factor below 1") -> None:
    """Black crosses on the points ``low`` of a curve."""
    if np.any(low):
        n = int(np.count_nonzero(low))
        ax.plot(x[low], y[low], ls="none", marker="x", ms=5, mew=1.2, color=INK, zorder=4, label=label,
                markevery=max(1, n // 12))  # a dense curve (a brace study's) keeps about a dozen crosses


def _hatch_below_2d(ax, X, Y, lam) -> None:
    """Hatch where a grid's load factor is below 1, with the contour at 1 drawn black and labelled."""
    if not np.any(_below(lam)):
        return
    z = np.where(np.isnan(lam), np.inf, lam)
    lo = float(np.min(z))
    cs = ax.contourf(X, Y, z, levels=[min(lo, 0.0) - 1.0, 1.0], colors="none", hatches=[BELOW_ONE_HATCH])
    cs.set_edgecolor(BELOW_ONE_GREY)
    cs.set_linewidth(0.0)
    if np.nanmax(lam) > 1.0:
        ax.contour(X, Y, z, levels=[1.0], colors=INK, linewidths=1.6)
    from matplotlib.patches import Patch

    ax.legend(handles=[Patch(facecolor="white", edgecolor=INK, hatch=BELOW_ONE_HATCH,
                             label=f"load factor < 1: {BELOW_ONE_LABEL}")],
              loc="upper right", fontsize=FS_TICK - 1, framealpha=0.9)


def plot_sweep(res, title: str = "", display=None, case_below_one: bool = False) -> Figure:
    """One parameter: load factor and K against the parameter.  Two: contour charts of K and load factor.

    Points below load factor 1 are marked and the region below 1 hatched; ``case_below_one`` (the case as
    given buckles under its case loads) adds a warning to the title.
    """
    fig = Figure(figsize=(10, 4.6), layout="constrained")
    if len(res.ranges) == 1:
        _sweep_1d(fig, res, display)
    else:
        _sweep_2d(fig, res, display)
    _suptitle(fig, title or "Sweep", case_below_one)
    _caption(fig)
    return fig


def _ends_note(ax, r, y, label_fmt, colour) -> None:
    """Free / rigid values of a spring range as dashed horizontal lines."""
    for i, v in enumerate(r.values):
        if r.key.is_spring and (v == 0 or math.isinf(v)) and np.isfinite(y[i]):
            name = "free" if v == 0 else "rigid"
            ax.axhline(y[i], ls="--", lw=0.8, color=colour, alpha=0.7)
            ax.annotate(f"{name}: {label_fmt(y[i])}", xy=(0.01 if v == 0 else 0.99, y[i]),
                        xycoords=("axes fraction", "data"), ha="left" if v == 0 else "right",
                        va="bottom", fontsize=7, color=colour)


def _sweep_1d(fig: Figure, res, display) -> None:
    r = res.ranges[0]
    f, unit = _scale_of(r.key, display, r.values)
    m = r.finite
    x = r.values[m] / f
    ax1, ax2 = fig.subplots(1, 2)
    g = res.governing
    ax1.plot(x, g[m], color="C0", lw=1.6, label="governing")
    if len(res.axes) > 1:
        for j, a in enumerate(res.axes):
            ax1.plot(x, res.load_factors[a][m], lw=0.9, ls=":", color=f"C{j + 1}", label=f"{a} axis")
    _ends_note(ax1, r, g, lambda v: f"{v:.4g}", "C0")
    low = _below(g[m])
    _mark_below(ax1, x, g[m], low)
    _below_one_band(ax1)
    ax1.set_ylabel("lowest load factor [-]")
    Kp = res.K_studied()
    plane = res.studied_axis or res.axes[0]
    for j, s in enumerate(res.segments):
        ax2.plot(x, Kp[m, j], lw=1.4, color=f"C{j}", label=f"segment {s + 1}")
        _ends_note(ax2, r, Kp[:, j], lambda v: f"K = {v:.4f}", f"C{j}")
        _mark_below(ax2, x, Kp[m, j], low, "load factor below 1" if j == 0 else None)
    other = res.other_governs()[m]
    if len(res.axes) > 1 and np.any(other):
        ax2.plot(x[other], Kp[m][other, 0], ls="none", marker="o", mfc="none", ms=5, color="0.3",
                 label="the other plane governs here", markevery=max(1, int(np.count_nonzero(other)) // 12))
    ax2.set_ylabel(f"effective-length factor K, {plane} plane [-]" if len(res.axes) > 1
                   else "effective-length factor K [-]")
    for ax in (ax1, ax2):
        if r.scale == "log":
            ax.set_xscale("log")
        else:
            ax.ticklabel_format(axis="x", useOffset=False)
        ax.set_xlabel(_axis_label(r.key, unit))
        ax.grid(True, which="both", lw=0.3, alpha=0.6)
        ax.legend(fontsize=8, loc="best")
    ax1.set_title("load factor", fontsize=10)
    ax2.set_title("effective-length factor", fontsize=10)


def _sweep_2d(fig: Figure, res, display) -> None:
    r1, r2 = res.ranges
    f1, u1 = _scale_of(r1.key, display, r1.values)
    f2, u2 = _scale_of(r2.key, display, r2.values)
    m1, m2 = r1.finite, r2.finite
    X, Y = np.meshgrid(r1.values[m1] / f1, r2.values[m2] / f2, indexing="ij")
    Kg = res.K_studied()[np.ix_(m1, m2)][..., 0]
    plane = res.studied_axis or res.axes[0]
    lam = res.governing[np.ix_(m1, m2)]
    ax1, ax2 = fig.subplots(1, 2)
    finite = np.isfinite(Kg)
    if np.any(finite):
        lo, hi = np.nanmin(Kg), np.nanmax(Kg)
        if hi - lo < 5e-4 * max(abs(hi), 1.0):  # K does not change over the grid: one colour, stated
            hi = lo + 1e-3
            ax1.text(0.5, 0.5, f"K = {lo:.3f} over the whole grid", transform=ax1.transAxes, ha="center",
                     fontsize=9, bbox={"fc": "white", "ec": "none"})
        levels = np.unique(np.round(np.linspace(lo, hi, 12), 3))
        cf = ax1.contourf(X, Y, Kg, levels=np.linspace(lo, hi, 25), cmap="viridis_r", extend="both")
        if levels.size > 1 and np.nanmax(Kg) - np.nanmin(Kg) >= 5e-4:
            cs = ax1.contour(X, Y, Kg, levels=levels, colors="k", linewidths=0.6)
            ax1.clabel(cs, fmt="%.3f", fontsize=7)
        cb = fig.colorbar(cf, ax=ax1, label="K [-]", shrink=0.9)
        cb.formatter.set_useOffset(False)
    _hatch_below_2d(ax1, X, Y, lam)
    ax1.set_title(f"K of segment {res.segments[0] + 1}" + (f", {plane} plane" if len(res.axes) > 1 else ""),
                  fontsize=10)
    cf2 = ax2.contourf(X, Y, lam, levels=24, cmap="magma")
    cs2 = ax2.contour(X, Y, lam, levels=10, colors="w", linewidths=0.5)
    ax2.clabel(cs2, fmt="%.4g", fontsize=7)
    fig.colorbar(cf2, ax=ax2, label="lowest load factor [-]", shrink=0.9)
    _hatch_below_2d(ax2, X, Y, lam)
    ax2.set_title("lowest load factor", fontsize=10)
    for ax in (ax1, ax2):
        if r1.scale == "log":
            ax.set_xscale("log")
        else:
            ax.ticklabel_format(axis="x", useOffset=False)
        if r2.scale == "log":
            ax.set_yscale("log")
        else:
            ax.ticklabel_format(axis="y", useOffset=False)
        ax.set_xlabel(_axis_label(r1.key, u1))
        ax.set_ylabel(_axis_label(r2.key, u2))
    ends = []
    for r in (r1, r2):
        if r.key.is_spring and (np.any(r.values == 0) or np.any(np.isinf(r.values))):
            ends.append(r.key.text)
    if ends:
        fig.text(0.99, 0.005, "free / rigid ends of " + ", ".join(ends) + " are in the table, not drawn",
                 fontsize=6, ha="right", va="bottom", color="0.35")


def plot_brace(res, title: str = "", display=None, case_below_one: bool = False) -> Figure:
    """Load factor against brace stiffness, with the threshold, the target fraction and Winter's rule.

    Where the load factor itself is below 1 (the ratio below ``1 / load factor with rigid braces``) the chart
    is hatched and the points are marked; ``case_below_one`` adds a warning to the title.
    """
    from ..study.paths import parse_key

    fig = Figure(figsize=(7.5, 4.8), layout="constrained")
    ax = fig.subplots()
    soil = res.kind not in ("lateral", "rotation")
    key = parse_key(f"foundation[1].{res.kind}" if soil else f"restraint[1].{res.kind}")
    f, unit = _scale_of(key, display, [res.fraction_stiffness or math.nan, *res.given_stiffness])
    ratio = res.curve_load_factor / res.load_factor_rigid
    what = "foundation" if soil else "braces"
    ax.plot(res.curve_k / f, ratio, color="C0", lw=1.6, label=f"this column ({what} varied together)")
    _mark_below(ax, res.curve_k / f, ratio, _below(res.curve_load_factor))
    ax.axhline(1.0, color="0.4", lw=0.8, ls="--")
    ax.annotate(f"rigid {'foundation' if soil else 'braces'}: load factor {res.load_factor_rigid:.4g}", xy=(0.01, 1.0),
                xycoords=("axes fraction", "data"), va="bottom", fontsize=7, color="0.3")
    marks = []
    for k in sorted(set(v for v in res.given_stiffness if v > 0 and math.isfinite(v))):
        marks.append((k, "this case", INK, "-"))
    if res.threshold_kind == "corner" and res.threshold:
        marks.append((res.threshold, "threshold (rigid-brace value reached)", "C3", "-"))
    if res.fraction_stiffness and res.fraction < 1:
        marks.append((res.fraction_stiffness, f"{100 * res.fraction:g}% of rigid", "C2", "-."))
    if res.kind == "lateral" and math.isfinite(res.winter_stiffness):
        marks.append((res.winter_stiffness, f"Winter 1960: {res.winter_coefficient:.3f} P/Lb", "C1", ":"))
    if res.kind == "lateral" and math.isfinite(res.aisc_stiffness):
        marks.append((res.aisc_stiffness, "AISC 360-16 App. 6 point bracing (P_r)", "C4", "--"))
    for k, label, c, ls in marks:
        ax.axvline(k / f, color=c, ls=ls, lw=2.0 if label == "this case" else 1.1,
                   label=f"{label}: {k / f:.4g} {unit}")
    ax.set_xscale("log")
    ax.set_xlabel(f"{'foundation ' + key.label.split(' ', 2)[2] if soil else 'brace ' + res.kind + ' stiffness'}"
                  f" [{unit}]")
    ax.set_ylabel(f"load factor / load factor with rigid {'foundation' if soil else 'braces'} [-]")
    lo = np.nanmin(ratio)
    one = 1.0 / res.load_factor_rigid if res.load_factor_rigid > 0 else math.inf  # load factor 1 on this axis
    top = 1.05 if not math.isfinite(one) or one <= 1.0 else one + 0.05 * max(one - lo, 0.2)
    ax.set_ylim(max(0.0, lo - 0.05), top)
    if math.isfinite(one):
        _below_one_band(ax, one)
    ax.grid(True, which="both", lw=0.3, alpha=0.6)
    ax.legend(fontsize=7, loc="center right" if ax.get_ylim()[0] < one else "lower right")
    stations = ", ".join(f"{s / (display.length_si if display else 1):.4g}" for s in res.stations)
    ax.set_title(f"{res.axis or 'in-plane'}: " + (f"{res.kind} of the foundation(s)" if soil else
                 f"{res.kind} brace(s) at {stations} {display.length if display else 'm'}"), fontsize=10)
    _suptitle(fig, title or "Brace stiffness", case_below_one)
    _caption(fig)
    return fig
