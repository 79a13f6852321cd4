"""The axial-force diagram beside the column: N(x) at load factor 1, compression to the right.

The diagram is read from :meth:`fea.model.Column.axial_force` (variable plus
permanent loads, at load factor 1), so it shows member forces given per
segment as given, point loads as steps and distributed loads as slopes.  It is
drawn beside the model sketch when the axial force changes along the column or
the forces are given per segment (:func:`needs_force_diagram`).

matplotlib is imported inside the functions, so importing this module is light.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

import numpy as np

from ..model import STATION_TOL, Column
from . import style
from .symbols import y_to_pt
from .text import PlotUnits, format_number, text_width

if TYPE_CHECKING:
    from matplotlib.axes import Axes

__all__ = ["axial_force_diagram", "needs_force_diagram", "draw_force_panel"]


def axial_force_diagram(column: Column) -> tuple[np.ndarray, np.ndarray]:
    """Heights and axial force of the diagram, base upward, steps drawn as two points at one height.

    Returns
    -------
    y : (m,) heights [m], ascending (a step repeats its height)
    N : (m,) axial compression there at load factor 1, variable plus permanent [N]
        (from :meth:`Column.axial_force`; just below and just above every station)
    """
    H = column.height
    delta = 4.0 * STATION_TOL * H      # beyond the station tolerance of Column.axial_force
    y = []
    for s in column.stations():
        if s > 0.0:
            y.append(s - delta)
        if s < H:
            y.append(s + delta)
    ys = np.clip(np.array(sorted(y)), 0.0, H)
    N = column.axial_force(ys, permanent=False) + column.axial_force(ys, permanent=True)
    # a step is drawn at the station itself
    snap = np.array(column.stations())
    ys = snap[np.argmin(np.abs(ys[:, None] - snap[None, :]), axis=1)]
    return ys, np.asarray(N, dtype=float)


def needs_force_diagram(column: Column) -> bool:
    """Whether the sketch draws the diagram: forces given per segment, or an axial force that changes."""
    if column.member_forces_given:
        return True
    _y, N = axial_force_diagram(column)
    scale = max(float(np.max(np.abs(N))), 1e-300)
    return bool(np.ptp(N) > 1e-9 * scale)


def _annotations(ax: Axes, y: np.ndarray, N: np.ndarray) -> list[tuple[float, float]]:
    """(height, force) of the values written on the diagram: each constant piece once at its middle, a
    sloping piece at both ends; kept only where they do not crowd each other (larger forces first)."""
    cands: list[tuple[float, float]] = []
    for i in range(0, y.size - 1, 2):   # pieces run from y[i] to y[i + 1]
        a, b, Na, Nb = y[i], y[i + 1], N[i], N[i + 1]
        if abs(Na - Nb) <= 1e-9 * max(abs(Na), abs(Nb), 1e-300):
            cands.append((0.5 * (a + b), Na))
        else:
            cands += [(a, Na), (b, Nb)]
    kept: list[tuple[float, float]] = []
    for yc, n in sorted(cands, key=lambda c: -abs(c[1])):
        if all(abs(y_to_pt(ax, yc) - y_to_pt(ax, k)) >= style.FS_TICK * 1.4 for k, _ in kept):
            kept.append((yc, n))
    return sorted(kept)


def draw_force_panel(ax: Axes, column: Column, units: PlotUnits, y_max: float, title: bool) -> None:
    """The axial-force diagram on ``ax`` (heights shared with the model panel), labelled "axial force"."""
    from matplotlib.lines import Line2D

    from .column import set_height_axis

    y, N = axial_force_diagram(column)
    n_disp = N / units.force_si
    lo, hi = min(0.0, float(n_disp.min())), max(0.0, float(n_disp.max()))
    span = hi - lo if hi > lo else 1.0
    ax.set_xlim(lo - 0.08 * span, hi + 0.08 * span)
    set_height_axis(ax, column, y_max, units, False)
    ax.set_label("axial force")
    for side in ("top", "right", "left"):
        ax.spines[side].set_visible(False)
    ax.spines["bottom"].set_visible(False)
    ax.tick_params(axis="both", length=0, labelbottom=False, labelleft=False)
    ax.set_xticks([])
    ax.fill_betweenx(y, 0.0, n_disp, facecolor=style.BAND_FILL, edgecolor="none", zorder=1)
    line = Line2D(n_disp, y, color=style.INK, lw=1.0, zorder=3, solid_joinstyle="miter")
    line.set_gid("axial force")
    line.set_label("axial force")
    ax.add_line(line)
    ax.plot([0.0, 0.0], [0.0, column.height], color=style.AXIS_GREY, lw=0.7, zorder=2)
    width_pt = ax.get_position().width * ax.figure.get_figwidth() * 72.0
    per_pt = (ax.get_xlim()[1] - ax.get_xlim()[0]) / width_pt
    for yc, n in _annotations(ax, y, N):
        v = n / units.force_si
        text = format_number(v)
        w = text_width(text, style.FS_TICK) * per_pt
        inside = abs(v) >= w + 3.0 * per_pt
        if v >= 0:
            x, ha = (v - 2.0 * per_pt, "right") if inside else (v + 2.0 * per_pt, "left")
        else:
            x, ha = (v + 2.0 * per_pt, "left") if inside else (v - 2.0 * per_pt, "right")
        ax.text(x, yc, text, ha=ha, va="center", fontsize=style.FS_TICK, zorder=4, clip_on=False)
    if title:
        ax.set_title(f"N [{units.force}]", fontsize=style.FS_TITLE)
    else:  # above the top of the column (the model panel keeps that room for the loads)
        from .symbols import pt

        ax.text(0.0, 16.0, f"N [{units.force}]", transform=pt(ax, sum(ax.get_xlim()) / 2, column.height), ha="center",
                va="bottom", fontsize=style.FS, clip_on=False)
