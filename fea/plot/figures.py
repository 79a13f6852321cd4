"""Mode-shape figures: a model sketch of the column beside its buckling modes.

Every figure is built on :class:`matplotlib.figure.Figure` directly (no
pyplot, no GUI).  The functions here only read :class:`~fea.model.Column` and
:class:`~fea.results.BucklingResult` objects; they never recompute physics.

Drawing conventions (the symbol set)
------------------------------------
The column stands upright, height upward, with its undeformed axis as a thin
grey line.  Symbols are drawn in printer's points, so they keep their size
whatever the column height, and they read in black and white.

* segment band: a light grey band along the axis whose width grows with the
  square root of the segment's second moment of area relative to the largest
  one (tapered segments taper);
* joint (segment change, base and top): a short horizontal bar across the band;
* other station (restraint or load position): a small black dot on the axis;
* rigid lateral support: a solid triangle pointing at the axis from the left;
* lateral spring: a zig-zag from a short wall on the left to the axis,
  labelled with its stiffness;
* rigid rotational restraint: a filled square on the axis;
* rotational spring: an open spiral on the axis, labelled with its stiffness;
* foundation: a hatched strip on the right of the column over its height range,
  labelled with its modulus;
* point axial load: a block arrow pointing down at its station (on the axis at
  the top, beside the column with a short leader elsewhere); solid black for a
  variable load, white (hollow) for a permanent one;
* distributed axial load: a row of small arrows beside the column over its
  range, solid or hollow as above;
* leaning load: a horizontal arrow with an open head pointing at the axis,
  labelled with the leaning load and the height of the leaning columns.

A key at the foot of the figure explains the symbols that appear in it.
"""

from __future__ import annotations

import math
import os
import tempfile
from dataclasses import dataclass
from pathlib import Path
from typing import Sequence

import numpy as np
from matplotlib import rc_context
from matplotlib.axes import Axes
from matplotlib.figure import Figure
from matplotlib.lines import Line2D
from matplotlib.patches import Polygon, Rectangle
from matplotlib.textpath import TextPath
from matplotlib.transforms import Affine2D, ScaledTranslation, Transform, blended_transform_factory

from ..errors import ModelError
from ..model import STATION_TOL, Column, Restraint
from ..results import BucklingResult

__all__ = ["plot_modes", "plot_planes", "save_figure", "format_load_factor"]

# -- style -------------------------------------------------------------------
FS = 8.5          # labels
FS_TICK = 8.0     # tick labels and key
FS_TITLE = 9.0    # panel titles
FS_HEAD = 10.0    # group headings
FS_SUPTITLE = 11.0
INK = "black"
AXIS_GREY = "0.5"
BAND_FILL = "0.82"
BAND_EDGE = "0.35"
GRID_GREY = "0.78"
LEADER_GREY = "0.45"

#: Largest half-width of the segment band [pt].
BAND_MAX = 5.0
#: Smallest half-width of the segment band [pt].
BAND_MIN = 0.9
#: Horizontal amplitude limit of the mode panels (modes are scaled to 1).
MODE_XLIM = 1.35
#: Smallest vertical distance between two labels or tick labels [pt].
LABEL_GAP = 2.0

# layout [in]
AX_HEIGHT = 4.4
LEFT_MARGIN = 0.72
RIGHT_MARGIN = 0.12
MODEL_GAP = 0.22     # model panel to first mode panel
MODE_GAP = 0.10      # between mode panels
GROUP_GAP = 0.55     # between bending planes (room for height tick labels)
TOP_SUPTITLE = 0.34
TOP_HEADING = 0.26
TOP_TITLES = 0.40
BOTTOM_AXIS = 0.46
KEY_ROW = 0.22
KEY_PAD = 0.10
MODE_WIDTH = 1.40
MODE_WIDTH_MIN = 0.75
MAX_WIDTH = 10.0

# x positions in the model panel [pt from the axis]
X_RIGHT_LOAD = BAND_MAX + 20.0     # intermediate point-load arrows
X_RIGHT_DIST = BAND_MAX + 31.0     # distributed-load arrows
SPRING_LEN = 26.0
X_LEFT_LABEL = -(BAND_MAX + SPRING_LEN + 8.0)


# -- text helpers --------------------------------------------------------------
_SUPERSCRIPT = str.maketrans("-0123456789", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹")


def _num(value: float, digits: int = 4) -> str:
    """A number with ``digits`` significant figures, plain for 1e-3..1e6, else ``a·10ⁿ``."""
    v = float(value)
    if v == 0.0 or not math.isfinite(v):
        return "0" if v == 0.0 else str(v)
    a = abs(v)
    if 1e-3 <= a < 1e6:
        decimals = max(0, digits - 1 - int(math.floor(math.log10(a))))
        text = f"{v:.{decimals}f}"
        if "." in text:
            text = text.rstrip("0").rstrip(".")
        return text.replace("-", "−")
    mant, exp = f"{v:.{digits - 1}e}".split("e")
    mant = mant.rstrip("0").rstrip(".")
    return f"{mant}·10{str(int(exp)).translate(_SUPERSCRIPT)}".replace("-", "−", 1)


def format_load_factor(value: float) -> str:
    """The text used for a load factor in panel titles (4 significant figures).

    Parameters
    ----------
    value : float
        Load factor.

    Returns
    -------
    str
        E.g. ``"12.39"``, ``"0.8513"``, ``"2.1·10⁶"``.
    """
    return _num(value, 4)


def _text_width(text: str, size: float) -> float:
    """Width of ``text`` at ``size`` pt in the default font, widest line [pt]."""
    widths = []
    for line in text.split("\n"):
        try:
            widths.append(TextPath((0.0, 0.0), line, size=size).get_extents().width if line.strip() else 0.0)
        except Exception:  # pragma: no cover - font trouble: fall back to an estimate
            widths.append(len(line) * 0.6 * size)
    return max(widths) * 1.04 + 1.0


def _text_height(text: str, size: float) -> float:
    return (text.count("\n") + 1) * 1.22 * size


# -- units -------------------------------------------------------------------
@dataclass(frozen=True)
class _Units:
    length: str
    length_si: float
    force: str
    force_si: float

    @classmethod
    def make(cls, length_unit, force_unit) -> "_Units":
        for name, u in (("length_unit", length_unit), ("force_unit", force_unit)):
            ok = (isinstance(u, (tuple, list)) and len(u) == 2 and isinstance(u[0], str)
                  and isinstance(u[1], (int, float)) and math.isfinite(u[1]) and u[1] > 0)
            if not ok:
                raise ModelError("plot", f"{name} must be (label, SI value of one unit), e.g. ('kN', 1e3); got {u!r}")
        return cls(length_unit[0], float(length_unit[1]), force_unit[0], float(force_unit[1]))

    def L(self, x: float) -> str:
        return f"{_num(x / self.length_si)} {self.length}"

    def F(self, p: float) -> str:
        return f"{_num(p / self.force_si)} {self.force}"

    def q(self, v: float) -> str:
        return f"{_num(v / (self.force_si / self.length_si))} {self.force}/{self.length}"

    def k_lat(self, v: float) -> str:
        return f"{_num(v / (self.force_si / self.length_si))} {self.force}/{self.length}"

    def k_rot(self, v: float) -> str:
        return f"{_num(v / (self.force_si * self.length_si))} {self.force}{self.length}/rad"

    def k_found(self, v: float) -> str:
        return f"{_num(v / (self.force_si / self.length_si**2))} {self.force}/{self.length}²"


# -- transforms ----------------------------------------------------------------
def _pt(ax: Axes, x: float, y: float) -> Transform:
    """Transform whose input is in points, with origin at data point (x, y)."""
    return Affine2D().scale(1.0 / 72.0) + ax.figure.dpi_scale_trans + ScaledTranslation(x, y, ax.transData)


def _xpt(ax: Axes) -> Transform:
    """Blended transform: x in points from data x = 0, y in data units."""
    xt = Affine2D().scale(1.0 / 72.0) + ax.figure.dpi_scale_trans + ScaledTranslation(0.0, 0.0, ax.transData)
    return blended_transform_factory(xt, ax.transData)


def _axes_height_pt(ax: Axes) -> float:
    return ax.get_position().height * ax.figure.get_figheight() * 72.0


def _y_to_pt(ax: Axes, y: float) -> float:
    y0, y1 = ax.get_ylim()
    return (y - y0) / (y1 - y0) * _axes_height_pt(ax)


def _pt_to_y(ax: Axes, p: float) -> float:
    y0, y1 = ax.get_ylim()
    return y0 + p / _axes_height_pt(ax) * (y1 - y0)


# -- symbols (all sizes in points) -----------------------------------------------
def _line(ax, tr, xs, ys, **kw) -> None:
    kw.setdefault("color", INK)
    kw.setdefault("lw", 0.9)
    kw.setdefault("solid_capstyle", "butt")
    ax.add_line(Line2D(xs, ys, transform=tr, clip_on=False, **kw))


def _sym_triangle(ax, x, y, tip=0.0, scale=1.0, color=INK) -> float:
    """Rigid lateral support: solid triangle whose tip touches ``tip`` pt; returns its left end."""
    w, h = 10.0 * scale, 4.6 * scale
    ax.add_patch(Polygon([(tip, 0.0), (tip - w, h), (tip - w, -h)], closed=True, transform=_pt(ax, x, y),
                         facecolor=color, edgecolor=color, lw=0.6, clip_on=False, zorder=6))
    return tip - w


def _sym_zigzag(ax, x, y, tip=0.0, scale=1.0, color=INK) -> float:
    """Lateral spring: wall, zig-zag, lead to ``tip``; returns the wall position."""
    L = SPRING_LEN * scale
    x0 = tip - L
    lead = 3.0 * scale
    n = 6
    amp = 3.2 * scale
    xs = [x0, x0 + lead]
    ys = [0.0, 0.0]
    span = L - 2 * lead
    for i in range(n):
        xs.append(x0 + lead + span * (i + 0.5) / n)
        ys.append(amp if i % 2 == 0 else -amp)
    xs += [tip - lead, tip]
    ys += [0.0, 0.0]
    tr = _pt(ax, x, y)
    _line(ax, tr, xs, ys, color=color, lw=0.9, zorder=6, solid_joinstyle="miter")
    h = 5.5 * scale
    _line(ax, tr, [x0, x0], [-h, h], color=color, lw=1.2, zorder=6)
    for k in range(3):
        yy = -h + (k + 0.5) * 2 * h / 3
        _line(ax, tr, [x0, x0 - 2.5 * scale], [yy + 1.2 * scale, yy - 1.2 * scale], color=color, lw=0.6, zorder=6)
    return x0 - 2.5 * scale


def _sym_square(ax, x, y, scale=1.0, color=INK) -> None:
    """Rigid rotational restraint: filled square centred on the axis."""
    a = 3.3 * scale
    ax.add_patch(Rectangle((-a, -a), 2 * a, 2 * a, transform=_pt(ax, x, y), facecolor=color, edgecolor=color,
                           lw=0.5, clip_on=False, zorder=7))


def _sym_coil(ax, x, y, scale=1.0, color=INK) -> float:
    """Rotational spring: open spiral centred on the axis; returns its left extent."""
    t = np.linspace(0.0, 2.0 * 2.0 * math.pi, 120)
    r = (1.2 + 5.6 * t / t[-1]) * scale
    ang = t + math.pi / 2
    _line(ax, _pt(ax, x, y), r * np.cos(ang), r * np.sin(ang), color=color, lw=0.9, zorder=7)
    return -6.8 * scale


def _block_arrow(length: float, shaft: float = 1.2, head_len: float = 6.5, head_w: float = 3.8) -> list:
    """Vertical block arrow with its tip at (0, 0) and its tail at (0, length) (pointing down if length > 0)."""
    s = 1.0 if length >= 0 else -1.0
    L = abs(length)
    hl = min(head_len, 0.6 * L)
    pts = [(0.0, 0.0), (head_w, hl), (shaft, hl), (shaft, L), (-shaft, L), (-shaft, hl), (-head_w, hl)]
    return [(px, s * py) for px, py in pts]


def _sym_load_arrow(ax, x, y, dx=0.0, length=22.0, hollow=False, scale=1.0) -> None:
    """Point load: block arrow, tip at (dx, 0) pt from (x, y); hollow when permanent.

    A negative ``length`` draws an arrow pointing up from the station (tension).
    """
    if length >= 0:
        pts = [(dx + px * scale, py * scale) for px, py in _block_arrow(length)]
    else:  # tail at the station, tip above
        L = abs(length)
        pts = [(dx + px * scale, (L + py) * scale) for px, py in _block_arrow(-L)]
    ax.add_patch(Polygon(pts, closed=True, transform=_pt(ax, x, y), facecolor="white" if hollow else INK,
                         edgecolor=INK, lw=0.8, joinstyle="miter", clip_on=False, zorder=8))


def _sym_small_arrow(ax, x, y, dx=0.0, length=8.0, hollow=False) -> None:
    """One arrow of a distributed load (tip at (dx, 0) pt)."""
    pts = [(dx + px, py) for px, py in _block_arrow(length, shaft=0.45, head_len=3.6, head_w=2.3)]
    ax.add_patch(Polygon(pts, closed=True, transform=_pt(ax, x, y), facecolor="white" if hollow else INK,
                         edgecolor=INK, lw=0.6, joinstyle="miter", clip_on=False, zorder=8))


def _sym_side_arrow(ax, x, y, tip=0.0, length=30.0, dashed=False) -> float:
    """Leaning load: horizontal arrow with an open head pointing left at ``tip``; returns its tail."""
    tr = _pt(ax, x, y)
    _line(ax, tr, [tip + 0.6, tip + length], [0.0, 0.0], lw=1.0, zorder=8, ls=(0, (3, 1.5)) if dashed else "-")
    _line(ax, tr, [tip + 6.0, tip + 0.3, tip + 6.0], [3.4, 0.0, -3.4], lw=1.0, zorder=8, solid_joinstyle="miter")
    return tip + length


def _sym_foundation(ax, bottom, top, x0=BAND_MAX + 3.0, width=9.0, color=INK, hatch_color=None) -> None:
    """Foundation: hatched strip from ``x0`` to ``x0 + width`` pt over [bottom, top] (data)."""
    ax.add_patch(Rectangle((x0, bottom), width, top - bottom, transform=_xpt(ax), facecolor="white",
                           edgecolor=hatch_color or color, hatch="////", lw=0.0, clip_on=False, zorder=3))
    _line(ax, _xpt(ax), [x0, x0], [bottom, top], color=color, lw=0.9, zorder=4)
    _line(ax, _xpt(ax), [x0 + width, x0 + width], [bottom, top], color=color, lw=0.5, zorder=4)


# -- model geometry helpers ------------------------------------------------------
def _band_profile(column: Column) -> list[tuple[np.ndarray, np.ndarray]]:
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


def _half_width_at(column: Column, y: float) -> float:
    best = BAND_MIN
    for ys, hw in _band_profile(column):
        if ys[0] - 1e-12 <= y <= ys[-1] + 1e-12:
            best = max(best, float(np.interp(y, ys, hw)))
    return best


def _merged_restraints(column: Column) -> list[Restraint]:
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


def _symbols_used(column: Column) -> set[str]:
    used = {"mode", "axis", "band", "joint"}
    if len(column.stations()) > len(column.joints):
        used.add("station")
    for r in _merged_restraints(column):
        if math.isinf(r.lateral):
            used.add("rigid_lateral")
        elif r.lateral > 0:
            used.add("lateral_spring")
        if math.isinf(r.rotation):
            used.add("rigid_rotation")
        elif r.rotation > 0:
            used.add("rotational_spring")
    if column.foundations:
        used.add("foundation")
    for p in column.point_loads:
        if p.P != 0:
            used.add("load_permanent" if p.permanent else "load_variable")
    for d in column.distributed_loads:
        if d.q != 0:
            used.add("distributed")
    for lean in column.leaning_loads:
        if lean.P != 0:
            used.add("leaning")
    return used


# -- label spreading ----------------------------------------------------------------
@dataclass
class _Label:
    y: float            # desired centre height [pt from the axes bottom]
    text: str
    anchor_x: float     # end of the symbol the label belongs to [pt from the axis]
    anchor_y: float     # height of that end [pt]
    size: float = FS
    style: str = "normal"

    @property
    def height(self) -> float:
        return _text_height(self.text, self.size)


def _spread(labels: list[_Label], lo: float, hi: float) -> list[float]:
    """Label centres moved as little as possible so that none overlap, kept within [lo, hi].

    Overlapping labels are merged into blocks centred on the mean of their wishes
    (repeated until no blocks overlap), then the blocks are pushed inside the bounds.
    """
    if not labels:
        return []
    order = sorted(range(len(labels)), key=lambda i: labels[i].y)
    hs = [labels[i].height + LABEL_GAP for i in order]
    wish = [labels[i].y for i in order]
    blocks = [[k] for k in range(len(order))]   # members (indices into order)

    def place(block):
        total = sum(hs[k] for k in block)
        centre = sum(wish[k] * hs[k] for k in block) / total
        return centre - total / 2, total

    changed = True
    while changed:
        changed = False
        for j in range(len(blocks) - 1):
            b0, t0 = place(blocks[j])
            b1, _ = place(blocks[j + 1])
            if b0 + t0 > b1:
                blocks[j] = blocks[j] + blocks.pop(j + 1)
                changed = True
                break
    starts = []
    for b in blocks:
        start, total = place(b)
        starts.append([start, total])
    # push inside the bounds, bottom-up then top-down
    prev_end = lo
    for s in starts:
        s[0] = max(s[0], prev_end)
        prev_end = s[0] + s[1]
    nxt = hi
    for s in reversed(starts):
        if s[0] + s[1] > nxt:
            s[0] = nxt - s[1]
        nxt = s[0]
    centres = [0.0] * len(labels)
    for b, (start, _t) in zip(blocks, starts):
        y = start
        for k in b:
            centres[order[k]] = y + hs[k] / 2
            y += hs[k]
    return centres


def _draw_labels(ax: Axes, labels: list[_Label], x_text: float, side: str) -> None:
    """Write labels at ``x_text`` pt, spread vertically, with leaders where moved."""
    if not labels:
        return
    h = _axes_height_pt(ax)
    centres = _spread(labels, -4.0, h + 6.0)
    ha = "left" if side == "right" else "right"
    for lab, yc in zip(labels, centres):
        tr = _pt(ax, 0.0, _pt_to_y(ax, 0.0))
        ax.text(x_text, yc, lab.text, transform=tr, ha=ha, va="center", fontsize=lab.size,
                style=lab.style, color="0.25" if lab.style == "italic" else INK, clip_on=False, zorder=9,
                linespacing=1.1)
        if abs(yc - lab.anchor_y) > 1.5:
            gap = 2.0 if side == "right" else -2.0
            _line(ax, tr, [lab.anchor_x, x_text - gap], [lab.anchor_y, yc], color=LEADER_GREY, lw=0.5, zorder=5)


# -- panels ------------------------------------------------------------------------
def _draw_band(ax: Axes, column: Column, edge: bool) -> None:
    tr = _xpt(ax)
    for ys, hw in _band_profile(column):
        verts = list(zip(-hw, ys)) + list(zip(hw[::-1], ys[::-1]))
        ax.add_patch(Polygon(verts, closed=True, transform=tr, facecolor=BAND_FILL if edge else "0.9",
                             edgecolor=BAND_EDGE if edge else "none", lw=0.5, zorder=1, clip_on=False))
    H = column.height
    _line(ax, ax.transData, [0.0, 0.0], [0.0, H], color=AXIS_GREY, lw=0.7, zorder=2)


def _draw_stations(ax: Axes, column: Column, tick: float) -> None:
    """Joints as bars across the band, other stations as dots on the axis."""
    tol = STATION_TOL * column.height
    joints = column.joints
    tr = _xpt(ax)
    for y in joints:
        w = _half_width_at(column, y) + tick
        _line(ax, tr, [-w, w], [y, y], lw=1.3, zorder=5)
    others = [s for s in column.stations() if min(abs(s - j) for j in joints) > tol]
    if others:
        ax.plot(np.zeros(len(others)), others, ls="none", marker="o", ms=2.8, color=INK, zorder=5, clip_on=False)


def _draw_restraints(ax: Axes, column: Column, units: _Units | None, scale: float) -> list[_Label]:
    """Restraint symbols; returns left-hand labels when ``units`` is given."""
    labels = []
    for r in _merged_restraints(column):
        hw = _half_width_at(column, r.at)
        left = 0.0
        if math.isinf(r.lateral):
            left = _sym_triangle(ax, 0.0, r.at, tip=-hw - 0.8, scale=scale)
        elif r.lateral > 0:
            left = _sym_zigzag(ax, 0.0, r.at, tip=-hw, scale=scale)
        if math.isinf(r.rotation):
            _sym_square(ax, 0.0, r.at, scale=scale)
            left = min(left, -3.3 * scale)
        elif r.rotation > 0:
            left = min(left, _sym_coil(ax, 0.0, r.at, scale=scale))
        text = _spring_text(r, units) if units else ""
        if text:
            yp = _y_to_pt(ax, r.at)
            labels.append(_Label(yp, text, left - 1.5, yp))
    return labels


def _inertia_texts(column: Column) -> list[tuple[float, str]]:
    """(mid-height, "I/Imax = ...") per segment, or nothing when I is the same throughout."""
    ends = [(float(seg.inertia_at(0.0)), float(seg.inertia_at(seg.length))) for seg in column.segments]
    i_max = max(max(e) for e in ends)
    if all(abs(a - i_max) <= 1e-9 * i_max and abs(b - i_max) <= 1e-9 * i_max for a, b in ends):
        return []
    out = []
    for (lo, hi), (a, b) in zip(column.segment_bounds(), ends):
        ra, rb = _num(a / i_max, 2), _num(b / i_max, 2)
        out.append((0.5 * (lo + hi), f"I/Imax {ra}" if ra == rb else f"I/Imax {ra}→{rb}"))
    return out


def _draw_inertia_labels(ax: Axes, column: Column) -> list[_Label]:
    labels = []
    for y, text in _inertia_texts(column):
        yp = _y_to_pt(ax, y)
        labels.append(_Label(yp, text, -_half_width_at(column, y) - 1.0, yp, size=FS_TICK, style="italic"))
    return labels


def _found_text(f, units: _Units) -> str:
    if f.k_top is None or f.k_top == f.k_bottom:
        k = units.k_found(f.k_bottom)
    else:
        k = f"{_num(f.k_bottom / (units.force_si / units.length_si**2))}→{units.k_found(f.k_top_value)}"
    return f"foundation\n{k}"


def _load_text(p, units: _Units) -> str:
    return units.F(p.P) + (" perm." if p.permanent else "") + (" (tension)" if p.P < 0 else "")


def _dist_text(d, units: _Units) -> str:
    return f"q = {units.q(d.q)}" + (" perm." if d.permanent else "")


def _lean_text(lean, units: _Units) -> str:
    return f"leaning {units.F(lean.P)}" + (" perm." if lean.permanent else "") + f"\nh = {units.L(lean.height)}"


def _spring_text(r: Restraint, units: _Units) -> str:
    texts = []
    if 0 < r.lateral < math.inf:
        texts.append(units.k_lat(r.lateral))
    if 0 < r.rotation < math.inf:
        texts.append(units.k_rot(r.rotation))
    return "\n".join(texts)


def _point_load_groups(column: Column) -> list[tuple[float, list]]:
    """Non-zero point loads grouped by station, ascending."""
    tol = STATION_TOL * column.height
    groups: dict[float, list] = {}
    for p in column.point_loads:
        if p.P == 0:
            continue
        key = next((k for k in groups if abs(k - p.at) <= tol), p.at)
        groups.setdefault(key, []).append(p)
    return sorted(groups.items())


def _draw_loads(ax: Axes, column: Column, units: _Units, x_label: float) -> list[_Label]:
    """Axial point and distributed loads, foundations and leaning loads; returns right-hand labels."""
    H = column.height
    tol = STATION_TOL * H
    labels: list[_Label] = []

    for f in column.foundations:
        _sym_foundation(ax, f.bottom, f.top)
        ym = _y_to_pt(ax, 0.5 * (f.bottom + f.top))
        labels.append(_Label(ym, _found_text(f, units), BAND_MAX + 12.5, ym))

    # point loads: at the top on the axis, elsewhere beside the column with a leader;
    # several at one station side by side, one label listing them left to right
    for at, loads in _point_load_groups(column):
        yp = _y_to_pt(ax, at)
        top = abs(at - H) <= tol
        hw = _half_width_at(column, at)
        x_end = 0.0
        for i, p in enumerate(loads):
            dx = (0.0 if top else X_RIGHT_LOAD) + i * 10.0
            if not top and i == len(loads) - 1:
                _line(ax, _pt(ax, 0.0, at), [hw, dx], [0.0, 0.0], lw=0.9, zorder=7)
            _sym_load_arrow(ax, 0.0, at, dx=dx, length=22.0 if p.P > 0 else -22.0, hollow=p.permanent)
            x_end = dx + 5.0
        text = "\n".join(_load_text(p, units) for p in loads)
        labels.append(_Label(yp + 13.0, text, x_end, yp + 13.0))

    # distributed loads
    k_dist = 0
    for d in column.distributed_loads:
        if d.q == 0:
            continue
        x = X_RIGHT_DIST + 9.0 * k_dist
        k_dist += 1
        y0, y1 = _y_to_pt(ax, d.bottom), _y_to_pt(ax, d.top)
        length = 8.0 if d.q > 0 else -8.0
        n = max(2, int((y1 - y0) / 13.0))
        for j in range(n):
            yy = y0 + (y1 - y0 - 8.0) * (j / max(n - 1, 1))
            tip = _pt_to_y(ax, yy if d.q > 0 else yy + 8.0)
            _sym_small_arrow(ax, 0.0, tip, dx=x, length=length, hollow=d.permanent)
        ym = 0.5 * (y0 + y1)
        labels.append(_Label(ym, _dist_text(d, units), x + 3.0, ym))

    for lean in column.leaning_loads:
        if lean.P == 0:
            continue
        hw = _half_width_at(column, lean.at)
        tail = _sym_side_arrow(ax, 0.0, lean.at, tip=hw + 1.0, length=x_label - hw - 5.0,
                               dashed=lean.permanent)
        yp = _y_to_pt(ax, lean.at)
        labels.append(_Label(yp, _lean_text(lean, units), tail, yp))
    return labels


def _right_label_x(column: Column) -> float:
    """Where the right-hand labels start [pt from the axis]: just clear of the symbols there."""
    H = column.height
    tol = STATION_TOL * H
    ext = 0.0
    for at, loads in _point_load_groups(column):
        base = 0.0 if abs(at - H) <= tol else X_RIGHT_LOAD
        ext = max(ext, base + (len(loads) - 1) * 10.0 + 4.5)
    if column.foundations:
        ext = max(ext, BAND_MAX + 12.0)
    n_dist = sum(1 for d in column.distributed_loads if d.q != 0)
    if n_dist:
        ext = max(ext, X_RIGHT_DIST + 9.0 * (n_dist - 1) + 3.0)
    if any(lean.P != 0 for lean in column.leaning_loads):
        ext = max(ext, BAND_MAX + 24.0)
    return ext + 7.0


def _left_label_x(column: Column) -> float:
    """Where the left-hand labels end [pt from the axis, negative]: just clear of the symbols there."""
    rs = _merged_restraints(column)
    if any(0 < r.lateral < math.inf for r in rs):
        return X_LEFT_LABEL
    if any(math.isinf(r.lateral) for r in rs):
        return -(BAND_MAX + 12.0 + 5.0)
    return -(BAND_MAX + 8.0)


def _model_extent(column: Column, units: _Units) -> tuple[float, float]:
    """Points needed left and right of the axis by the model sketch and its labels."""
    left = 12.0
    for r in _merged_restraints(column):
        if math.isinf(r.lateral):
            left = max(left, BAND_MAX + 12.0 + 6.0)
        elif r.lateral > 0:
            left = max(left, BAND_MAX + SPRING_LEN + 3.0 + 6.0)
    lt = [t for t in (_spring_text(r, units) for r in _merged_restraints(column)) if t]
    lt += [t for _y, t in _inertia_texts(column)]
    if lt:
        left = -_left_label_x(column) + max(_text_width(t, FS) for t in lt) + 8.0
    rt = [_found_text(f, units) for f in column.foundations]
    rt += ["\n".join(_load_text(p, units) for p in loads) for _at, loads in _point_load_groups(column)]
    rt += [_dist_text(d, units) for d in column.distributed_loads if d.q != 0]
    rt += [_lean_text(lean, units) for lean in column.leaning_loads if lean.P != 0]
    x_label = _right_label_x(column)
    right = x_label
    if rt:
        right = x_label + max(_text_width(t, FS) for t in rt) + 4.0
    return max(left, 20.0), max(right, 20.0)


def _set_height_axis(ax: Axes, column: Column, y_max: float, units: _Units, show_labels: bool,
                     height_label: bool = False) -> None:
    """Height limits, station ticks (thinned so that labels never overlap)."""
    h_pt = _axes_height_pt(ax)
    top_room = 40.0   # pt above the top for load arrows and their labels
    bottom_room = 10.0
    span = y_max * h_pt / (h_pt - top_room - bottom_room)
    ax.set_ylim(-bottom_room / h_pt * span, y_max + top_room / h_pt * span)
    stations = column.stations()
    joints = set(column.joints)
    prio = sorted(stations, key=lambda s: (0 if s in (0.0, column.height) else 1 if s in joints else 2, s))
    kept: list[float] = []
    for s in prio:
        if all(abs(_y_to_pt(ax, s) - _y_to_pt(ax, k)) >= FS_TICK * 1.25 for k in kept):
            kept.append(s)
    kept.sort()
    ax.set_yticks(kept)
    if show_labels:
        ax.set_yticklabels([_num(s / units.length_si) for s in kept], fontsize=FS_TICK)
        if height_label:
            ax.set_ylabel(f"height [{units.length}]", fontsize=FS)
    else:
        ax.tick_params(labelleft=False)


def _draw_model_panel(ax: Axes, column: Column, units: _Units, y_max: float, extent: tuple[float, float],
                      height_label: bool) -> None:
    left, _right = extent
    width_pt = ax.get_position().width * ax.figure.get_figwidth() * 72.0
    ax.set_xlim(-left, width_pt - left)  # x data = points from the axis; left-hand labels always fit
    _set_height_axis(ax, column, y_max, units, True, height_label)
    ax.set_xticks([])
    for side in ("top", "right", "bottom"):
        ax.spines[side].set_visible(False)
    ax.spines["left"].set_linewidth(0.6)
    ax.tick_params(axis="y", length=3, width=0.6)
    ax.set_title("model", fontsize=FS_TITLE)
    ax.set_label("model")
    _draw_band(ax, column, edge=True)
    _draw_stations(ax, column, tick=3.5)
    left_labels = _draw_restraints(ax, column, units, scale=1.0) + _draw_inertia_labels(ax, column)
    x_label = _right_label_x(column)
    right_labels = _draw_loads(ax, column, units, x_label)
    _draw_labels(ax, left_labels, _left_label_x(column), "left")
    _draw_labels(ax, right_labels, x_label, "right")


def _mode_title(k: int, lam: float, narrow: bool) -> str:
    sep = "\n" if narrow else ", "
    return f"mode {k}{sep}λ = {format_load_factor(lam)}"


def _draw_mode_panel(ax: Axes, column: Column, result: BucklingResult, k: int, units: _Units, y_max: float,
                     narrow: bool) -> None:
    ax.set_xlim(-MODE_XLIM, MODE_XLIM)
    _set_height_axis(ax, column, y_max, units, False)
    for s in column.stations():
        ax.axhline(s, color=GRID_GREY, lw=0.5, ls=(0, (1, 2)), zorder=0)
    ax.set_xticks([-1.0, 0.0, 1.0])
    ax.set_xticklabels(["−1", "0", "1"], fontsize=FS_TICK)
    ax.tick_params(axis="both", length=2.5, width=0.6)
    for sp in ax.spines.values():
        sp.set_linewidth(0.6)
        sp.set_color("0.4")
    for f in column.foundations:
        _sym_foundation(ax, f.bottom, f.top, color="0.45", hatch_color="0.65")
    _draw_band(ax, column, edge=False)
    _draw_stations(ax, column, tick=2.5)
    _draw_restraints(ax, column, None, scale=0.8)
    ax.plot(result.modes[k], result.heights, color=INK, lw=1.6, zorder=9, solid_joinstyle="round")
    ax.set_title(_mode_title(k + 1, float(result.load_factors[k]), narrow), fontsize=FS_TITLE)
    ax.set_label(f"mode {k + 1}")


# -- key ----------------------------------------------------------------------------
def _key_entries(used: set[str]) -> list[tuple[str, str]]:
    entries = [
        ("mode", "mode shape"),
        ("axis", "undeformed axis"),
        ("band", "band width ∝ √I"),
        ("joint", "joint / end"),
        ("station", "station"),
        ("rigid_lateral", "rigid lateral support"),
        ("lateral_spring", "lateral spring"),
        ("rigid_rotation", "rigid rotational restraint"),
        ("rotational_spring", "rotational spring"),
        ("foundation", "foundation"),
        ("load_variable", "variable load"),
        ("load_permanent", "permanent load"),
        ("distributed", "distributed load"),
        ("leaning", "leaning load"),
    ]
    return [(k, t) for k, t in entries if k in used]


KEY_SYMBOL_W = 26.0
KEY_ENTRY_GAP = 14.0


def _key_rows(used: set[str], width_pt: float) -> list[list[tuple[str, str, float]]]:
    rows: list[list[tuple[str, str, float]]] = [[]]
    x = 0.0
    for key, text in _key_entries(used):
        w = KEY_SYMBOL_W + _text_width(text, FS_TICK) + KEY_ENTRY_GAP
        if rows[-1] and x + w > width_pt:
            rows.append([])
            x = 0.0
        rows[-1].append((key, text, w))
        x += w
    return rows


def _draw_key_symbol(ax: Axes, key: str, x: float, y: float) -> None:
    """Draw the key symbol of ``key`` centred at data (x, y) of the key axes (data units = points)."""
    c = x + KEY_SYMBOL_W / 2 - 2.0
    tr = _pt(ax, c, y)
    if key == "mode":
        _line(ax, tr, [-10, 10], [0, 0], lw=1.6)
    elif key == "axis":
        _line(ax, tr, [-10, 10], [0, 0], color=AXIS_GREY, lw=0.7)
    elif key == "band":
        ax.add_patch(Polygon([(-10, -BAND_MAX), (10, -BAND_MAX * 0.5), (10, BAND_MAX * 0.5), (-10, BAND_MAX)],
                             closed=True, transform=tr, facecolor=BAND_FILL, edgecolor=BAND_EDGE, lw=0.5))
        _line(ax, tr, [-10, 10], [0, 0], color=AXIS_GREY, lw=0.7)
    elif key == "joint":
        _line(ax, tr, [0, 0], [-8, 8], color=AXIS_GREY, lw=0.7)
        _line(ax, tr, [-8, 8], [0, 0], lw=1.3)
    elif key == "station":
        _line(ax, tr, [0, 0], [-8, 8], color=AXIS_GREY, lw=0.7)
        ax.plot([c], [y], ls="none", marker="o", ms=2.8, color=INK)
    elif key == "rigid_lateral":
        _line(ax, tr, [5, 5], [-8, 8], color=AXIS_GREY, lw=0.7)
        _sym_triangle(ax, c, y, tip=4.2)
    elif key == "lateral_spring":
        _line(ax, tr, [9, 9], [-8, 8], color=AXIS_GREY, lw=0.7)
        _sym_zigzag(ax, c, y, tip=9.0, scale=0.75)
    elif key == "rigid_rotation":
        _line(ax, tr, [0, 0], [-8, 8], color=AXIS_GREY, lw=0.7)
        _sym_square(ax, c, y)
    elif key == "rotational_spring":
        _line(ax, tr, [0, 0], [-8, 8], color=AXIS_GREY, lw=0.7)
        _sym_coil(ax, c, y)
    elif key == "foundation":
        ax.add_patch(Rectangle((-4.5, -7), 9, 14, transform=tr, facecolor="white", edgecolor=INK, hatch="////",
                               lw=0.0))
        _line(ax, tr, [-4.5, -4.5], [-7, 7], lw=0.9)
        _line(ax, tr, [4.5, 4.5], [-7, 7], lw=0.5)
    elif key in ("load_variable", "load_permanent"):
        _sym_load_arrow(ax, c, y - 8.0, length=16.0, hollow=key == "load_permanent")
    elif key == "distributed":
        for dx in (-6.0, 0.0, 6.0):
            _sym_small_arrow(ax, c, y - 4.0, dx=dx, length=8.0)
    elif key == "leaning":
        _line(ax, tr, [-9, -9], [-8, 8], color=AXIS_GREY, lw=0.7)
        _sym_side_arrow(ax, c, y, tip=-8.5, length=20.0)


def _draw_key(fig: Figure, left_in: float, bottom_in: float, width_in: float, rows) -> None:
    W, Hh = fig.get_figwidth(), fig.get_figheight()
    height_in = len(rows) * KEY_ROW
    ax = fig.add_axes((left_in / W, bottom_in / Hh, width_in / W, height_in / Hh))
    ax.set_axis_off()
    ax.set_label("key")
    ax.set_xlim(0, width_in * 72.0)
    ax.set_ylim(0, height_in * 72.0)
    for r, row in enumerate(rows):
        y = (len(rows) - r - 0.5) * KEY_ROW * 72.0
        x = 0.0
        for key, text, w in row:
            _draw_key_symbol(ax, key, x, y)
            ax.text(x + KEY_SYMBOL_W + 2.0, y, text, fontsize=FS_TICK, va="center", ha="left")
            x += w


# -- public functions ------------------------------------------------------------------
def _check_pair(column: Column, result: BucklingResult, where: str = "plot") -> None:
    if not isinstance(column, Column):
        raise ModelError(where, f"expected a Column, got {type(column).__name__}")
    if not isinstance(result, BucklingResult):
        raise ModelError(where, f"expected a BucklingResult, got {type(result).__name__}")
    h = np.asarray(result.heights, dtype=float)
    H = column.height
    if h.size < 2 or abs(h[0]) > 1e-6 * H or abs(h[-1] - H) > 1e-6 * H:
        raise ModelError(where, f"the result does not belong to this column (its heights run from "
                                f"{h[0]:g} to {h[-1]:g} m, the column is {H:g} m high)")


def _n_drawn(result: BucklingResult, n_modes: int) -> int:
    if not isinstance(n_modes, int) or isinstance(n_modes, bool) or n_modes < 1:
        raise ModelError("plot", f"number of modes to draw must be a whole number >= 1, got {n_modes!r}")
    return min(n_modes, int(np.asarray(result.modes).shape[0]))


@dataclass
class _Group:
    label: str
    column: Column
    result: BucklingResult
    n: int
    extent: tuple[float, float]


def _figure(groups: list[_Group], units: _Units, suptitle: str, headings: list[str] | None,
            governing: int | None) -> Figure:
    """Lay out model and mode panels of each group side by side, then the key."""
    model_w = [(g.extent[0] + g.extent[1]) / 72.0 for g in groups]
    n_modes_total = sum(g.n for g in groups)
    fixed = (LEFT_MARGIN + RIGHT_MARGIN + sum(model_w) + len(groups) * MODEL_GAP
             + sum((g.n - 1) * MODE_GAP for g in groups) + (len(groups) - 1) * GROUP_GAP)
    mode_w = MODE_WIDTH
    if fixed + n_modes_total * mode_w > MAX_WIDTH:
        mode_w = max(MODE_WIDTH_MIN, (MAX_WIDTH - fixed) / n_modes_total)
    fig_w = fixed + n_modes_total * mode_w
    used: set[str] = set()
    for g in groups:
        used |= _symbols_used(g.column)
    rows = _key_rows(used, (fig_w - LEFT_MARGIN - RIGHT_MARGIN) * 72.0)
    top = TOP_SUPTITLE + TOP_TITLES + (TOP_HEADING if headings else 0.0)
    bottom = BOTTOM_AXIS + KEY_PAD + len(rows) * KEY_ROW + 0.08
    fig_h = top + AX_HEIGHT + bottom
    fig = Figure(figsize=(fig_w, fig_h))
    narrow = mode_w < 1.3
    y_max = max(g.column.height for g in groups)
    x = LEFT_MARGIN
    b = bottom / fig_h
    hh = AX_HEIGHT / fig_h
    mode_axes_all = []
    for gi, g in enumerate(groups):
        group_left = x
        axm = fig.add_axes((x / fig_w, b, model_w[gi] / fig_w, hh))
        x += model_w[gi] + MODEL_GAP
        mode_axes = []
        for k in range(g.n):
            ax = fig.add_axes((x / fig_w, b, mode_w / fig_w, hh), sharey=axm)
            mode_axes.append(ax)
            x += mode_w + (MODE_GAP if k < g.n - 1 else 0.0)
        _draw_model_panel(axm, g.column, units, y_max, g.extent, height_label=(gi == 0))
        for k, ax in enumerate(mode_axes):
            _draw_mode_panel(ax, g.column, g.result, k, units, y_max, narrow)
        mode_axes_all += mode_axes
        if headings:
            xc = 0.5 * (group_left + x) / fig_w
            yc = (fig_h - TOP_SUPTITLE - 0.5 * TOP_HEADING) / fig_h
            fig.text(xc, yc, headings[gi], ha="center", va="center", fontsize=FS_HEAD,
                     fontweight="bold" if gi == governing else "normal")
            if len(groups) > 1:  # a rule under the heading spanning the group
                y_rule = yc - 0.11 / fig_h
                fig.add_artist(Line2D([(group_left + 0.05) / fig_w, (x - 0.05) / fig_w], [y_rule, y_rule],
                                      color="0.3", lw=0.6))
        x += GROUP_GAP
    # one amplitude label under the mode panels
    first = mode_axes_all[0].get_position()
    last = mode_axes_all[-1].get_position()
    fig.text(0.5 * (first.x0 + last.x1), (bottom - BOTTOM_AXIS + 0.06) / fig_h, "relative displacement",
             ha="center", va="bottom", fontsize=FS)
    fig.suptitle(suptitle, fontsize=FS_SUPTITLE, y=1.0 - 0.08 / fig_h, va="top")
    _draw_key(fig, LEFT_MARGIN, 0.08, fig_w - LEFT_MARGIN - RIGHT_MARGIN, rows)
    return fig


def _default_title(column: Column, result: BucklingResult) -> str:
    parts = ["Buckling modes"]
    if column.title:
        parts.append(column.title)
    if result.axis:
        parts.append(f"bending plane: {result.axis}")
    return " — ".join(parts)


def plot_modes(column: Column, result: BucklingResult, ax_list: Sequence[Axes] | None = None, n_modes: int = 3,
               length_unit: tuple[str, float] = ("m", 1.0), force_unit: tuple[str, float] = ("kN", 1e3),
               title: str | None = None) -> Figure:
    """Draw a column and its first buckling modes side by side.

    The first panel is a sketch of the model (segment band, joints, stations,
    restraints, foundations and loads with their values); each further panel
    shows one mode shape against height, titled with its load factor
    ("mode 1, λ = 12.39").  All panels share the height axis.  A key at the
    foot explains the symbols used (see :mod:`fea.plot.figures`).

    Parameters
    ----------
    column : Column
        The analysed column.
    result : BucklingResult
        Its buckling result (from :func:`fea.buckling`).
    ax_list : sequence of Axes, optional
        Axes of one existing figure to draw into: the first receives the model
        sketch, each further one a mode (so ``len(ax_list) - 1`` modes are
        drawn and ``n_modes`` is ignored).  No key is drawn in this case.
        Position the axes first: the sketch is laid out from their size, and
        its labels need the model axes to be about 2 to 3 inches wide.
        When omitted a new figure, sized for an A4 page, is made.
    n_modes : int
        Number of modes to draw (at most the number in ``result``).
    length_unit, force_unit : (str, float)
        Display unit as (label, value of one unit in SI), e.g. ``("mm", 1e-3)``
        or ``("kN", 1e3)``.
    title : str, optional
        Figure title; by default "Buckling modes" with the column title and
        the bending plane.

    Returns
    -------
    matplotlib.figure.Figure
        Panels are labelled (``Axes.get_label()``) "model", "mode 1", ... and
        "key".

    Raises
    ------
    ModelError
        Result not of this column, bad units or number of modes, wrong axes.
    """
    _check_pair(column, result)
    units = _Units.make(length_unit, force_unit)
    if ax_list is not None:
        axes = list(ax_list)
        n_avail = int(np.asarray(result.modes).shape[0])
        if len(axes) < 2 or len(axes) - 1 > n_avail:
            raise ModelError("plot", f"ax_list needs one axes for the model and one per mode (2 to {n_avail + 1}), "
                                     f"got {len(axes)}")
        fig = axes[0].figure
        if any(ax.figure is not fig for ax in axes):
            raise ModelError("plot", "all axes in ax_list must belong to one figure")
        extent = _model_extent(column, units)
        y_max = column.height
        _draw_model_panel(axes[0], column, units, y_max, extent, height_label=True)
        w_in = axes[1].get_position().width * fig.get_figwidth()
        for k, ax in enumerate(axes[1:]):
            _draw_mode_panel(ax, column, result, k, units, y_max, narrow=w_in < 1.3)
        if title is not None:
            fig.suptitle(title, fontsize=FS_SUPTITLE)
        return fig
    n = _n_drawn(result, n_modes)
    group = _Group(result.axis, column, result, n, _model_extent(column, units))
    return _figure([group], units, title if title is not None else _default_title(column, result), None, None)


def plot_planes(planes: Sequence[tuple[str, Column, BucklingResult]], n_modes: int = 3, **kw) -> Figure:
    """Draw the buckling modes of several bending planes side by side.

    Parameters
    ----------
    planes : sequence of (str, Column, BucklingResult)
        ``(axis_label, column, result)`` per bending plane, e.g.
        ``[("major", col_y, res_y), ("minor", col_z, res_z)]``.
    n_modes : int
        Modes drawn per plane.
    **kw
        ``length_unit``, ``force_unit`` and ``title`` as for :func:`plot_modes`.

    Returns
    -------
    matplotlib.figure.Figure
        One group (model sketch and mode panels) per plane, headed with its
        axis label; the governing plane (lowest first load factor) is headed in
        bold, marked "governs" and named in the figure title.

    Raises
    ------
    ModelError
        No planes, a malformed entry, unknown keywords or a result not of its column.
    """
    unknown = set(kw) - {"length_unit", "force_unit", "title"}
    if unknown:
        raise ModelError("plot", f"unknown keyword(s) {sorted(unknown)}; expected length_unit, force_unit or title")
    planes = list(planes)
    if not planes:
        raise ModelError("plot", "no bending planes to draw")
    units = _Units.make(kw.get("length_unit", ("m", 1.0)), kw.get("force_unit", ("kN", 1e3)))
    groups = []
    for i, entry in enumerate(planes):
        if not (isinstance(entry, (tuple, list)) and len(entry) == 3 and isinstance(entry[0], str)):
            raise ModelError("plot", f"plane {i}: expected (axis_label, column, result), got {entry!r:.80}")
        label, column, result = entry
        _check_pair(column, result, f"plane {label!r}")
        groups.append(_Group(label, column, result, _n_drawn(result, n_modes), _model_extent(column, units)))
    lams = [float(g.result.load_factors[0]) for g in groups]
    gov = int(np.argmin(lams))
    headings = [f"{g.label} axis" + (" (governs)" if i == gov and len(groups) > 1 else "")
                for i, g in enumerate(groups)]
    base = kw.get("title") or "Buckling modes by bending plane"
    suptitle = f"{base} — governing: {groups[gov].label} axis, λ = {format_load_factor(lams[gov])}"
    return _figure(groups, units, suptitle, headings, gov)


_FORMATS = {".png": "png", ".svg": "svg", ".pdf": "pdf"}


def save_figure(fig: Figure, path: str | os.PathLike) -> Path:
    """Write ``fig`` to PNG (150 dpi), SVG or PDF, chosen by the file extension.

    The figure is written to a temporary file in the same folder and renamed
    into place, so a failure leaves no half-written file behind.  SVG and PDF
    output carry no date, so equal figures give equal files.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
    path : str or os.PathLike
        Target file; its extension (``.png``, ``.svg`` or ``.pdf``, any case)
        selects the format.

    Returns
    -------
    pathlib.Path
        The path written.

    Raises
    ------
    ModelError
        Unknown extension or missing folder (field ``"plot"``).
    """
    target = Path(path)
    fmt = _FORMATS.get(target.suffix.lower())
    if fmt is None:
        raise ModelError("plot", f"cannot tell the file format of {target.name!r}: expected .png, .svg or .pdf")
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise ModelError("plot", f"folder {str(folder)!r} does not exist")
    fd, tmp = tempfile.mkstemp(prefix=f".{target.stem}-", suffix=target.suffix, dir=folder)
    os.close(fd)
    try:
        metadata = {"png": None, "svg": {"Date": None}, "pdf": {"CreationDate": None}}[fmt]
        with rc_context({"svg.hashsalt": "stanchion", "svg.fonttype": "path"}):
            fig.savefig(tmp, format=fmt, dpi=150, metadata=metadata, facecolor="white")
        os.replace(tmp, target)
    except BaseException:
        try:
            os.unlink(tmp)
        except FileNotFoundError:
            pass
        raise
    return target
