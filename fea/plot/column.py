"""The drawing of the column model: segment band, joints, stations, restraints, foundations, loads.

This is the one drawing of a column in the tool.  The mode figures place it
beside the mode panels (:func:`fea.plot.plot_modes`), the report shows it
alone (:func:`fea.plot.plot_sketch`).  The symbols are those of
:mod:`fea.plot.symbols` (meanings in ``docs/symbols.md``); numbers are written
with :func:`fea.plot.text.format_number`.

matplotlib is imported inside the functions, so importing this module is light.
"""

from __future__ import annotations

import math
from typing import TYPE_CHECKING

import numpy as np

from ..model import STATION_TOL, Column, Restraint
from . import symbols as sym
from .labels import Label, draw_labels
from .style import (
    AXIS_GREY,
    BAND_EDGE,
    BAND_FILL,
    BAND_MAX,
    BAND_MIN,
    FS,
    FS_TICK,
    FS_TITLE,
    INK,
    SPRING_LEN,
    X_LEFT_LABEL,
    X_RIGHT_LOAD,
)
from .text import (
    PlotUnits,
    dist_text,
    format_number,
    found_text,
    inertia_texts,
    lean_text,
    load_text,
    spring_text,
    text_height,
    text_width,
)

if TYPE_CHECKING:
    from matplotlib.axes import Axes

__all__ = ["draw_column", "draw_model_panel", "model_extent", "set_height_axis", "draw_band", "draw_stations",
           "draw_restraints", "merged_restraints", "point_load_groups"]


# -- model geometry ----------------------------------------------------------------------
def band_profile(column: Column) -> list[tuple[np.ndarray, np.ndarray]]:
    """(heights, half-widths in pt) of the segment band, one pair per segment."""
    i_max = 0.0
    out = []
    for seg in column.segments:
        s = np.linspace(0.0, seg.length, 24 if seg.tapered else 2)
        i_max = max(i_max, float(np.max(seg.inertia_at(s))))
    for (a, _b), seg in zip(column.segment_bounds(), column.segments):
        s = np.linspace(0.0, seg.length, 24 if seg.tapered else 2)
        hw = np.maximum(BAND_MAX * np.sqrt(np.asarray(seg.inertia_at(s), dtype=float) / i_max), BAND_MIN)
        out.append((a + s, hw))
    return out


def half_width_at(column: Column, y: float) -> float:
    """Half-width of the segment band at height ``y`` [pt] (the wider one at a joint)."""
    best = BAND_MIN
    for ys, hw in band_profile(column):
        if ys[0] - 1e-12 <= y <= ys[-1] + 1e-12:
            best = max(best, float(np.interp(y, ys, hw)))
    return best


def merged_restraints(column: Column) -> list[Restraint]:
    """Restraints at the same station combined (stiffnesses add; rigid wins)."""
    tol = STATION_TOL * column.height
    groups: list[Restraint] = []
    for r in sorted(column.restraints, key=lambda r: r.at):
        if groups and abs(groups[-1].at - r.at) <= tol:
            g = groups[-1]
            groups[-1] = Restraint(g.at, g.lateral + r.lateral, g.rotation + r.rotation)
        else:
            groups.append(r)
    return [r for r in groups if r.lateral > 0 or r.rotation > 0]


def point_load_groups(column: Column) -> list[tuple[float, list]]:
    """Non-zero point loads grouped by station, ascending.

    Joint loads that stand for member forces given per segment are left out: the axial-force diagram
    shows those (:mod:`fea.plot.forces`).
    """
    tol = STATION_TOL * column.height
    groups: dict[float, list] = {}
    for p in column.point_loads:
        if p.P == 0 or p.member_forces:
            continue
        key = next((k for k in groups if abs(k - p.at) <= tol), p.at)
        groups.setdefault(key, []).append(p)
    return sorted(groups.items())


# -- parts of the drawing ---------------------------------------------------------------------
def draw_band(ax: Axes, column: Column, edge: bool) -> None:
    """The segment band (width ∝ √I) and the undeformed axis."""
    from matplotlib.patches import Polygon

    tr = sym.xpt(ax)
    for ys, hw in band_profile(column):
        verts = list(zip(-hw, ys)) + list(zip(hw[::-1], ys[::-1]))
        ax.add_patch(Polygon(verts, closed=True, transform=tr, facecolor=BAND_FILL if edge else "0.9",
                             edgecolor=BAND_EDGE if edge else "none", lw=0.5, zorder=1, clip_on=False))
    H = column.height
    sym.line(ax, ax.transData, [0.0, 0.0], [0.0, H], color=AXIS_GREY, lw=0.7, zorder=2)


def draw_stations(ax: Axes, column: Column, tick: float) -> None:
    """Joints as bars across the band, other stations as dots on the axis."""
    tol = STATION_TOL * column.height
    joints = column.joints
    tr = sym.xpt(ax)
    for y in joints:
        w = half_width_at(column, y) + tick
        sym.line(ax, tr, [-w, w], [y, y], lw=1.3, zorder=5)
    others = [s for s in column.stations() if min(abs(s - j) for j in joints) > tol]
    if others:
        ax.plot(np.zeros(len(others)), others, ls="none", marker="o", ms=2.8, color=INK, zorder=5, clip_on=False)


def draw_restraints(ax: Axes, column: Column, units: PlotUnits | None, scale: float) -> list[Label]:
    """Restraint symbols; returns left-hand labels when ``units`` is given."""
    labels = []
    for r in merged_restraints(column):
        hw = half_width_at(column, r.at)
        left = 0.0
        if math.isinf(r.lateral):
            left = sym.triangle(ax, 0.0, r.at, tip=-hw - 0.8, scale=scale)
        elif r.lateral > 0:
            left = sym.zigzag(ax, 0.0, r.at, tip=-hw, scale=scale)
        if math.isinf(r.rotation):
            sym.square(ax, 0.0, r.at, scale=scale)
            left = min(left, -3.3 * scale)
        elif r.rotation > 0:
            left = min(left, sym.coil(ax, 0.0, r.at, scale=scale))
        text = spring_text(r, units) if units else ""
        if text:
            yp = sym.y_to_pt(ax, r.at)
            labels.append(Label(yp, text, left - 1.5, yp))
    return labels


def _inertia_labels(ax: Axes, column: Column) -> list[Label]:
    labels = []
    for y, text in inertia_texts(column):
        yp = sym.y_to_pt(ax, y)
        labels.append(Label(yp, text, -half_width_at(column, y) - 1.0, yp, size=FS_TICK, style="italic"))
    return labels


ARROW_LEN = 22.0     # point-load arrow [pt]
LOAD_STEP = 10.0     # between the arrows of loads at one station [pt]
DIST_STEP = 9.0      # between the columns of distributed loads [pt]


def _dist_x0(column: Column) -> float:
    """x of the first column of distributed-load arrows: next to the band, or beyond the foundation strip."""
    return (foundation_right() + 5.0) if column.foundations else BAND_MAX + 7.0


def _pt_per_m(column: Column, ax: Axes | None) -> float:
    """Points per metre of height: of ``ax`` when given, else of the standard panel (:data:`style.AX_HEIGHT`)."""
    if ax is not None:
        return sym.y_to_pt(ax, 1.0) - sym.y_to_pt(ax, 0.0)
    from .style import AX_HEIGHT

    return (AX_HEIGHT * 72.0 - 50.0) / column.height


def load_lanes(column: Column, ax: Axes | None = None) -> dict[float, float]:
    """x [pt from the axis] of the first arrow of each station's point loads.

    Loads at the top stand on the axis.  Loads lower down stand beside the column, right of any
    distributed loads; where the arrows of two stations would overlap (they are 22 pt tall), the
    upper one moves to the next lane to the right, so no arrow is drawn over another.
    """
    H = column.height
    tol = STATION_TOL * H
    n_dist = sum(1 for d in column.distributed_loads if d.q != 0)
    x0 = max(X_RIGHT_LOAD, _dist_x0(column) + DIST_STEP * n_dist + 4.0) if n_dist else X_RIGHT_LOAD
    ppm = _pt_per_m(column, ax)
    lanes: list[tuple[float, float]] = []   # (top of the highest arrow [pt], width) per lane
    out: dict[float, float] = {}
    for at, loads in point_load_groups(column):
        if abs(at - H) <= tol:
            out[at] = 0.0
            continue
        yp = at * ppm
        width = LOAD_STEP * len(loads)
        k = next((i for i, (top, _w) in enumerate(lanes) if top <= yp - 2.0), len(lanes))
        if k == len(lanes):
            lanes.append((yp + ARROW_LEN, width))
        else:
            lanes[k] = (yp + ARROW_LEN, max(lanes[k][1], width))
        out[at] = float(k)   # a lane number for now
    starts = [x0]
    for _top, w in lanes[:-1]:
        starts.append(starts[-1] + w + 2.0)
    return {at: (0.0 if abs(at - H) <= tol else starts[int(k)]) for at, k in out.items()}


def _draw_point_loads(ax: Axes, column: Column, units: PlotUnits) -> list[Label]:
    """Point loads: at the top on the axis, elsewhere beside the column with a line to the axis; several
    at one station side by side, one label listing them left to right.  Each arrow points the way its load
    acts: down for a positive (compressive) load, up from the station for a negative one."""
    H = column.height
    tol = STATION_TOL * H
    lanes = load_lanes(column, ax)
    labels = []
    for at, loads in point_load_groups(column):
        yp = sym.y_to_pt(ax, at)
        top = abs(at - H) <= tol
        hw = half_width_at(column, at)
        x_end = 0.0
        for i, p in enumerate(loads):
            dx = lanes[at] + i * LOAD_STEP
            if not top and i == len(loads) - 1:   # behind the distributed-load arrows it may cross
                sym.line(ax, sym.pt(ax, 0.0, at), [hw, dx], [0.0, 0.0], lw=0.9, zorder=6.5)
            sym.load_arrow(ax, 0.0, at, dx=dx, length=ARROW_LEN if p.P > 0 else -ARROW_LEN, hollow=p.permanent)
            x_end = dx + 5.0
        text = "\n".join(load_text(p, units) for p in loads)
        labels.append(Label(yp + 13.0, text, x_end, yp + 13.0))
    return labels


def _draw_distributed_loads(ax: Axes, column: Column, units: PlotUnits) -> list[Label]:
    """Distributed loads: a column of small arrows each, next to the column; they point the way the load acts."""
    labels = []
    k_dist = 0
    for d in column.distributed_loads:
        if d.q == 0:
            continue
        x = _dist_x0(column) + DIST_STEP * k_dist
        k_dist += 1
        y0, y1 = sym.y_to_pt(ax, d.bottom), sym.y_to_pt(ax, d.top)
        length = 8.0 if d.q > 0 else -8.0
        n = max(2, int((y1 - y0) / 13.0))
        for j in range(n):
            yy = y0 + (y1 - y0 - 8.0) * (j / max(n - 1, 1))
            tip = sym.pt_to_y(ax, yy if d.q > 0 else yy + 8.0)
            sym.small_arrow(ax, 0.0, tip, dx=x, length=length, hollow=d.permanent)
        ym = 0.5 * (y0 + y1)
        labels.append(Label(ym, dist_text(d, units), x + 3.0, ym))
    return labels


def ground_level(column: Column) -> float | None:
    """Height of the ground line: the top of the highest foundation, when it is below the top of the column."""
    if not column.foundations:
        return None
    top = max(f.top for f in column.foundations)
    return top if top < column.height * (1.0 - STATION_TOL) else None


def draw_foundations(ax: Axes, column: Column, ground_span: tuple[float, float], **kw) -> None:
    """Foundation strips whose width follows the modulus (relative to the largest of the column), and the
    ground line across the column at the top of the highest foundation."""
    k_max = max((max(abs(f.k_bottom), abs(f.k_top_value)) for f in column.foundations), default=0.0)
    for f in column.foundations:
        sym.foundation(ax, f.bottom, f.top, abs(f.k_bottom) / k_max, abs(f.k_top_value) / k_max, **kw)
    g = ground_level(column)
    if g is not None:
        sym.ground(ax, g, *ground_span, color=kw.get("color", INK))


def foundation_right() -> float:
    """Right end of the widest foundation strip [pt from the axis]."""
    return BAND_MAX + 3.0 + sym.FOUNDATION_WIDTH


def draw_loads(ax: Axes, column: Column, units: PlotUnits, x_label: float) -> list[Label]:
    """Axial point and distributed loads, foundations and leaning loads; returns right-hand labels."""
    labels: list[Label] = []
    draw_foundations(ax, column, (-(BAND_MAX + 9.0), foundation_right() + 3.0))
    for f in column.foundations:
        ym = sym.y_to_pt(ax, 0.5 * (f.bottom + f.top))
        labels.append(Label(ym, found_text(f, units), foundation_right() + 1.5, ym))
    labels += _draw_point_loads(ax, column, units)
    labels += _draw_distributed_loads(ax, column, units)
    for lean in column.leaning_loads:
        if lean.P == 0:
            continue
        clear = _axis_clearance(column, lean.at)
        tail = sym.side_arrow(ax, 0.0, lean.at, tip=clear + 1.0, length=x_label - clear - 5.0, dashed=lean.permanent)
        yp = sym.y_to_pt(ax, lean.at)
        # the label hangs below the arrow's line, clear of a point load's label above the station
        text = lean_text(lean, units)
        labels.append(Label(yp + 4.0 - 0.5 * text_height(text, FS), text, tail, yp))
    return labels


def _axis_clearance(column: Column, at: float) -> float:
    """Half-width taken up on the axis at station ``at`` by the band and any rotational symbol [pt]."""
    clear = half_width_at(column, at)
    tol = STATION_TOL * column.height
    for r in merged_restraints(column):
        if abs(r.at - at) <= tol:
            if math.isinf(r.rotation):
                clear = max(clear, 3.3)
            elif r.rotation > 0:
                clear = max(clear, 6.8)
    return clear


# -- room for the labels ------------------------------------------------------------------------
def right_label_x(column: Column, ax: Axes | None = None) -> float:
    """Where the right-hand labels start [pt from the axis]: just clear of the symbols there."""
    ext = 0.0
    lanes = load_lanes(column, ax)
    for at, loads in point_load_groups(column):
        ext = max(ext, lanes[at] + (len(loads) - 1) * LOAD_STEP + 4.5)
    if column.foundations:
        ext = max(ext, foundation_right() + 3.0)
    n_dist = sum(1 for d in column.distributed_loads if d.q != 0)
    if n_dist:
        ext = max(ext, _dist_x0(column) + DIST_STEP * (n_dist - 1) + 3.0)
    if any(lean.P != 0 for lean in column.leaning_loads):
        ext = max(ext, BAND_MAX + 24.0)
    return ext + 7.0


def left_label_x(column: Column) -> float:
    """Where the left-hand labels end [pt from the axis, negative]: just clear of the symbols there."""
    rs = merged_restraints(column)
    if any(0 < r.lateral < math.inf for r in rs):
        return X_LEFT_LABEL
    if any(math.isinf(r.lateral) for r in rs):
        return -(BAND_MAX + 12.0 + 5.0)
    return -(BAND_MAX + 8.0)


def model_extent(column: Column, units: PlotUnits) -> tuple[float, float]:
    """Points needed left and right of the axis by the model sketch and its labels."""
    left = 12.0
    for r in merged_restraints(column):
        if math.isinf(r.lateral):
            left = max(left, BAND_MAX + 12.0 + 6.0)
        elif r.lateral > 0:
            left = max(left, BAND_MAX + SPRING_LEN + 3.0 + 6.0)
    lt = [t for t in (spring_text(r, units) for r in merged_restraints(column)) if t]
    lt += [t for _y, t in inertia_texts(column)]
    if lt:
        left = -left_label_x(column) + max(text_width(t, FS) for t in lt) + 8.0
    rt = [found_text(f, units) for f in column.foundations]
    rt += ["\n".join(load_text(p, units) for p in loads) for _at, loads in point_load_groups(column)]
    rt += [dist_text(d, units) for d in column.distributed_loads if d.q != 0]
    rt += [lean_text(lean, units) for lean in column.leaning_loads if lean.P != 0]
    x_label = right_label_x(column)
    right = x_label
    if rt:
        right = x_label + max(text_width(t, FS) for t in rt) + 4.0
    return max(left, 20.0), max(right, 20.0)


# -- the panel ------------------------------------------------------------------------------------
def set_height_axis(ax: Axes, column: Column, y_max: float, units: PlotUnits, show_labels: bool,
                    height_label: bool = False) -> None:
    """Height limits, station ticks (thinned so that labels never overlap)."""
    h_pt = sym.axes_height_pt(ax)
    top_room = 40.0   # pt above the top for load arrows and their labels
    bottom_room = 10.0
    span = y_max * h_pt / (h_pt - top_room - bottom_room)
    ax.set_ylim(-bottom_room / h_pt * span, y_max + top_room / h_pt * span)
    stations = column.stations()
    joints = set(column.joints)
    prio = sorted(stations, key=lambda s: (0 if s in (0.0, column.height) else 1 if s in joints else 2, s))
    kept: list[float] = []
    for s in prio:
        if all(abs(sym.y_to_pt(ax, s) - sym.y_to_pt(ax, k)) >= FS_TICK * 1.25 for k in kept):
            kept.append(s)
    kept.sort()
    ax.set_yticks(kept)
    if show_labels:
        ax.set_yticklabels([format_number(s / units.length_si) for s in kept], fontsize=FS_TICK)
        if height_label:
            ax.set_ylabel(f"height [{units.length}]", fontsize=FS)
    else:
        ax.tick_params(labelleft=False)


def draw_model_panel(ax: Axes, column: Column, units: PlotUnits, y_max: float, extent: tuple[float, float],
                     height_label: bool, title: str | None = "model") -> None:
    """The model sketch on ``ax``: x data are points from the column axis, y data are heights [m].

    ``title`` heads the panel (None: no title, where a heading above names the plane).
    """
    left, _right = extent
    width_pt = ax.get_position().width * ax.figure.get_figwidth() * 72.0
    ax.set_xlim(-left, width_pt - left)  # x data = points from the axis; left-hand labels always fit
    set_height_axis(ax, column, y_max, units, True, height_label)
    ax.set_xticks([])
    for side in ("top", "right", "bottom"):
        ax.spines[side].set_visible(False)
    ax.spines["left"].set_linewidth(0.6)
    ax.tick_params(axis="y", length=3, width=0.6)
    if title:
        ax.set_title(title, fontsize=FS_TITLE)
    ax.set_label("model")
    draw_band(ax, column, edge=True)
    draw_stations(ax, column, tick=3.5)
    left_labels = draw_restraints(ax, column, units, scale=1.0) + _inertia_labels(ax, column)
    x_label = right_label_x(column, ax)
    right_labels = draw_loads(ax, column, units, x_label)
    draw_labels(ax, left_labels, left_label_x(column), "left")
    draw_labels(ax, right_labels, x_label, "right")


def draw_column(ax: Axes, column: Column, length_unit: tuple[str, float] = ("m", 1.0),
                force_unit: tuple[str, float] = ("kN", 1e3)) -> Axes:
    """Draw the model sketch of ``column`` on an existing ``ax``.

    The sketch shows the segment band (width ∝ √I), joints, stations,
    restraints, foundations and loads with their values; heights are to scale
    on the y axis (ticks at the stations).  Position the axes first: the
    sketch is laid out from their size, and its labels need about 2 to 3
    inches of width.  No key is drawn (see :func:`fea.plot.plot_sketch`).

    Parameters
    ----------
    ax : matplotlib.axes.Axes
    column : Column
    length_unit, force_unit : (str, float)
        Display unit as (label, value of one unit in SI), e.g. ``("mm", 1e-3)``.

    Returns
    -------
    matplotlib.axes.Axes
        ``ax``, labelled "model".

    Raises
    ------
    ModelError
        Bad units.
    """
    units = PlotUnits.make(length_unit, force_unit)
    draw_model_panel(ax, column, units, column.height, model_extent(column, units), height_label=True)
    return ax
