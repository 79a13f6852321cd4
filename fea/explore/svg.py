"""The explorer's figure as inline SVG: per bending plane the column with its symbols, and its lowest mode.

The same drawing as the tool's figures (``docs/symbols.md``), written directly
as SVG text so that it is redrawn in well under a millisecond on every move of
a slider: the segment band (width growing with the square root of I), joints
and stations, rigid supports as solid triangles, lateral springs as zig-zags
from a hatched wall, rigid rotational restraints as filled squares, rotational
springs as open spirals, foundations as hatched strips whose width follows the
modulus, point loads as block arrows (hollow when permanent), distributed loads
as rows of small arrows, leaning loads as open-headed side arrows.  Labels are
spread so that none overlap (:func:`fea.plot.labels.spread`) and numbers use
the figures' format (:mod:`fea.plot.text`).

Beside each model the lowest mode is drawn as a thick line over a lighter copy
of the column, scaled so that its largest displacement is one.

Pure: model and result objects in, text out.
"""

from __future__ import annotations

import math
from dataclasses import replace
from functools import lru_cache
from html import escape

import numpy as np

from ..model import STATION_TOL, Column
from ..plot.column import band_profile, merged_restraints, point_load_groups
from ..plot.labels import Label, spread
from ..plot.style import SPRING_LEN
from ..plot.symbols import zigzag_outline
from ..plot.text import PlotUnits, dist_text, format_number, found_text, lean_text, load_text, spring_text
from ..results import BucklingResult

__all__ = ["figure_svg", "MODE_ID", "TITLE_ID"]

#: Screen pixels per printer's point of the symbol sizes of :mod:`fea.plot.symbols`.
S = 1.3
FONT = 11.0
TOP, BOTTOM = 78.0, 22.0      # room above the column (titles, top loads) and below it [px]
PLOT_H = 380.0                # column height on the page [px]
MODEL_W, MODE_W = 290.0, 130.0
AXIS_X = 165.0                # the column's axis in the model panel [px from the panel's left]
MODE_AMP = 48.0               # largest mode displacement [px]
MODE_POINTS = 240             # at most this many points of a mode's line (the panel is 380 px tall)
INK, GREY, LIGHT = "#000", "#808080", "#d1d1d1"
#: The id of each plane's mode-shape path: ``MODE_ID.format(axis=...)``.
MODE_ID = "mode-{axis}"
#: The id of each plane's mode title (with its load factor).
TITLE_ID = "mode-title-{axis}"


def _n(x: float) -> str:
    return f"{x:.1f}"


def _pts(points) -> str:
    return " ".join(f"{_n(x)},{_n(y)}" for x, y in points)


def _poly(points, fill=INK, stroke=INK, width=0.8, extra="") -> str:
    return f'<polygon points="{_pts(points)}" fill="{fill}" stroke="{stroke}" stroke-width="{width}"{extra}/>'


def _line(points, stroke=INK, width=1.0, extra="") -> str:
    return f'<polyline points="{_pts(points)}" fill="none" stroke="{stroke}" stroke-width="{width}"{extra}/>'


def _text(x: float, y: float, text: str, anchor: str = "start", size: float = FONT, extra: str = "") -> str:
    lines = text.split("\n")
    h = 1.22 * size
    y0 = y - 0.5 * h * (len(lines) - 1) + 0.35 * size
    spans = "".join(f'<tspan x="{_n(x)}" y="{_n(y0 + i * h)}">{escape(t)}</tspan>' for i, t in enumerate(lines))
    return f'<text font-size="{_n(size)}" text-anchor="{anchor}"{extra}>{spans}</text>'


class _Panel:
    """Coordinates of one panel: heights to page y, symbols drawn around the axis at ``x``."""

    def __init__(self, x: float, column: Column, y_top: float = TOP) -> None:
        self.x = x
        self.H = column.height
        self.y_top = y_top

    def y(self, h: float) -> float:
        return self.y_top + (self.H - h) / self.H * PLOT_H

    def at(self, dx: float, h: float, dy: float = 0.0) -> tuple[float, float]:
        """The point ``dx`` px right of the axis and ``dy`` px above height ``h``."""
        return self.x + dx, self.y(h) - dy


# -- the glyphs (sizes of fea.plot.symbols, in points times S) -------------------------------------------------
def _triangle(p: _Panel, h: float, tip: float, s: float = S) -> str:
    w, a = 10.0 * s, 4.6 * s
    return _poly([p.at(tip, h), p.at(tip - w, h, a), p.at(tip - w, h, -a)], width=0.6)


def _zigzag(p: _Panel, h: float, tip: float, s: float = S) -> str:
    xs, ys, _, strokes = zigzag_outline(tip, s)
    out = [_line([p.at(x, h, y) for x, y in zip(xs, ys)], width=1.0, extra=' stroke-linejoin="miter"')]
    out += [_line([p.at(a, h, b), p.at(c, h, d)], width=1.4 if k == 0 else 0.7)
            for k, ((a, b), (c, d)) in enumerate(strokes)]
    return "".join(out)


def _square(p: _Panel, h: float, s: float = S) -> str:
    a = 3.3 * s
    return _poly([p.at(-a, h, -a), p.at(a, h, -a), p.at(a, h, a), p.at(-a, h, a)], width=0.5)


_T = np.linspace(0.0, 4.0 * math.pi, 64)
#: The rotational spring's spiral at unit scale: two turns, radius 1.2 to 6.8 pt.
_SPIRAL = [(float(a), float(b)) for a, b in zip((1.2 + 5.6 * _T / _T[-1]) * np.cos(_T + math.pi / 2),
                                                (1.2 + 5.6 * _T / _T[-1]) * np.sin(_T + math.pi / 2))]


def _coil(p: _Panel, h: float, s: float = S) -> str:
    return _line([p.at(a * s, h, b * s) for a, b in _SPIRAL], width=1.0)


def _block_arrow(p: _Panel, h: float, dx: float, length: float, hollow: bool, shaft=1.2, head_len=6.5,
                 head_w=3.8, s: float = S) -> str:
    """Vertical block arrow, tip at ``dx`` px right of the axis at height ``h``; pointing down when
    ``length`` > 0, else up from the station."""
    L = abs(length)
    hl = min(head_len, 0.6 * L)
    pts = [(0.0, 0.0), (head_w, hl), (shaft, hl), (shaft, L), (-shaft, L), (-shaft, hl), (-head_w, hl)]
    if length < 0:  # tail at the station, tip above it
        pts = [(x, L - y) for x, y in pts]
    return _poly([p.at(dx + x * s, h, y * s) for x, y in pts], fill="#fff" if hollow else INK,
                 extra=' stroke-linejoin="miter"')


def _side_arrow(p: _Panel, h: float, tip: float, length: float, dashed: bool) -> str:
    dash = ' stroke-dasharray="4,2"' if dashed else ""
    return (_line([p.at(tip + 0.6, h), p.at(tip + length, h)], width=1.2, extra=dash)
            + _line([p.at(tip + 7.5, h, 4.4), p.at(tip + 0.4, h), p.at(tip + 7.5, h, -4.4)], width=1.2))


# -- the model panel ---------------------------------------------------------------------------------------------
@lru_cache(maxsize=64)
def _profile(segments: tuple) -> list[tuple[list[float], list[float]]]:
    """The band's (heights, half-widths [pt]) per segment, from the segments alone (cached: sliders leave them)."""
    return [(ys.tolist(), hw.tolist()) for ys, hw in band_profile(Column(segments=segments))]


def _band(p: _Panel, column: Column, light: bool) -> list[str]:
    out = []
    for ys, hw in _profile(column.segments):
        pts = [p.at(-w * S, y) for y, w in zip(ys, hw)] + [p.at(w * S, y) for y, w in zip(ys[::-1], hw[::-1])]
        out.append(_poly(pts, fill="#e6e6e6" if light else LIGHT, stroke="none" if light else "#595959",
                         width=0.6))
    out.append(_line([p.at(0, 0), p.at(0, column.height)], stroke=GREY, width=0.8))
    return out


def _half_width(column: Column, h: float) -> float:
    best = 0.9
    for ys, hw in _profile(column.segments):
        if ys[0] - 1e-12 <= h <= ys[-1] + 1e-12:
            best = max(best, float(np.interp(h, ys, hw)))
    return best * S


def _stations(p: _Panel, column: Column) -> list[str]:
    tol = STATION_TOL * column.height
    out = []
    for y in column.joints:
        w = _half_width(column, y) + 3.0 * S
        out.append(_line([p.at(-w, y), p.at(w, y)], width=1.7))
    for s in column.stations():
        if min(abs(s - j) for j in column.joints) > tol:
            cx, cy = p.at(0.0, s)
            out.append(f'<circle cx="{_n(cx)}" cy="{_n(cy)}" r="2.2" fill="{INK}"/>')
    return out


def _restraints(p: _Panel, column: Column, units: PlotUnits | None, s: float = S) -> tuple[list[str], list[Label]]:
    out, labels = [], []
    for r in merged_restraints(column):
        hw = _half_width(column, r.at)
        left = 0.0
        if math.isinf(r.lateral):
            out.append(_triangle(p, r.at, -hw - 0.8, s))
            left = -hw - 0.8 - 10.0 * s
        elif r.lateral > 0:
            out.append(_zigzag(p, r.at, -hw, s))
            left = -hw - SPRING_LEN * s - 2.5 * s
        if math.isinf(r.rotation):
            out.append(_square(p, r.at, s))
            left = min(left, -3.3 * s)
        elif r.rotation > 0:
            out.append(_coil(p, r.at, s))
            left = min(left, -6.8 * s)
        text = spring_text(r, units) if units else ""
        if text:
            labels.append(Label(PLOT_H - (p.y(r.at) - p.y_top), text, left - 3.0, p.y(r.at), size=FONT))
    return out, labels


def _foundations(p: _Panel, column: Column, units: PlotUnits | None, light: bool = False
                 ) -> tuple[list[str], list[Label]]:
    if not column.foundations:
        return [], []
    out, labels = [], []
    k_max = max(max(abs(f.k_bottom), abs(f.k_top_value)) for f in column.foundations)
    x0, width = 5.0 * S + 3.0, 11.0 * S
    for f in column.foundations:
        wb, wt = width * abs(f.k_bottom) / k_max, width * abs(f.k_top_value) / k_max
        pts = [p.at(x0, f.bottom), p.at(x0 + wb, f.bottom), p.at(x0 + wt, f.top), p.at(x0, f.top)]
        colour = GREY if light else INK
        out.append(_poly(pts, fill="url(#hatch)", stroke="none"))
        out.append(_line([p.at(x0, f.bottom), p.at(x0, f.top)], stroke=colour, width=1.0))
        out.append(_line([p.at(x0 + wb, f.bottom), p.at(x0 + wt, f.top)], stroke=colour, width=0.6))
        if units:
            ym = 0.5 * (f.bottom + f.top)
            labels.append(Label(PLOT_H - (p.y(ym) - p.y_top), found_text(f, units), x0 + width + 4.0, p.y(ym),
                                size=FONT))
    top = max(f.top for f in column.foundations)
    if top < column.height * (1.0 - STATION_TOL):
        out.append(_line([p.at(-(5.0 * S + 9.0), top), p.at(x0 + width + 3.0, top)], width=1.2))
    return out, labels


def _loads(p: _Panel, column: Column, units: PlotUnits) -> tuple[list[str], list[Label]]:
    out, labels = [], []
    H = column.height
    tol = STATION_TOL * H
    n_dist = 0
    x_dist = (5.0 * S + 3.0 + 11.0 * S + 6.0) if column.foundations else 5.0 * S + 9.0
    for d in column.distributed_loads:
        if d.q == 0:
            continue
        x = x_dist + 11.0 * n_dist
        n_dist += 1
        y0, y1 = PLOT_H - (p.y(d.bottom) - p.y_top), PLOT_H - (p.y(d.top) - p.y_top)
        n = max(2, int((y1 - y0) / 16.0))
        for j in range(n):
            yy = y0 + (y1 - y0 - 10.0) * (j / max(n - 1, 1))
            tip_h = (yy if d.q > 0 else yy + 10.0) / PLOT_H * H  # the height of the arrow's tip
            out.append(_block_arrow(p, tip_h, x, 8.0 if d.q > 0 else -8.0, d.permanent, shaft=0.45, head_len=3.6,
                                    head_w=2.3))
        labels.append(Label(0.5 * (y0 + y1), dist_text(d, units), x + 5.0, p.y(0.5 * (d.bottom + d.top)),
                            size=FONT))
    x_side = max(5.0 * S + 26.0, x_dist + 11.0 * n_dist + 6.0)
    lane_top: list[float] = []
    for at, loads in point_load_groups(column):
        top = abs(at - H) <= tol
        yp = PLOT_H - (p.y(at) - p.y_top)
        lane = 0
        if not top:
            lane = next((i for i, t in enumerate(lane_top) if t <= yp - 2.0), len(lane_top))
            if lane == len(lane_top):
                lane_top.append(0.0)
            lane_top[lane] = yp + 22.0 * S
        x_end = 0.0
        for i, ld in enumerate(loads):
            dx = (0.0 if top else x_side + 16.0 * lane) + i * 13.0
            if not top and i == len(loads) - 1:
                out.append(_line([p.at(_half_width(column, at), at), p.at(dx, at)], width=1.0))
            out.append(_block_arrow(p, at, dx, 22.0 if ld.P > 0 else -22.0, ld.permanent))
            x_end = dx + 7.0
        labels.append(Label(yp + 17.0, "\n".join(load_text(ld, units) for ld in loads), x_end, p.y(at) - 17.0,
                            size=FONT))
    for lean in column.leaning_loads:
        if lean.P == 0:
            continue
        clear = max(_half_width(column, lean.at), 8.8 if any(abs(r.at - lean.at) <= tol and r.rotation > 0
                                                            for r in column.restraints) else 0.0)
        length = 58.0
        out.append(_side_arrow(p, lean.at, clear + 1.0, length, lean.permanent))
        yp = PLOT_H - (p.y(lean.at) - p.y_top)
        text = lean_text(lean, units)
        labels.append(Label(yp + 2.0 - 0.61 * FONT * (text.count("\n") + 1), text, clear + length + 4.0,
                            p.y(lean.at), size=FONT))
    return out, labels


def _labels(p: _Panel, labels: list[Label], side: str) -> list[str]:
    if not labels:
        return []
    out = []
    centres = spread(labels, -BOTTOM + 6.0, PLOT_H + TOP - 18.0)
    x_text = min(lb.anchor_x for lb in labels) if side == "left" else max(lb.anchor_x for lb in labels)
    for lb, c in zip(labels, centres):
        y = p.y_top + PLOT_H - c
        if abs(y - lb.anchor_y) > 1.0:  # moved: a thin leader to its symbol
            out.append(_line([(p.x + lb.anchor_x, lb.anchor_y), (p.x + x_text, y)], stroke="#737373", width=0.6))
        out.append(_text(p.x + x_text + (-2.0 if side == "left" else 2.0), y, lb.text,
                         "end" if side == "left" else "start"))
    return out


def _height_axis(x: float, p: _Panel, column: Column, units: PlotUnits) -> list[str]:
    out = [_line([(x, p.y(0)), (x, p.y(column.height))], stroke=GREY, width=0.8)]
    last = None
    for h in sorted(set(column.stations())):
        y = p.y(h)
        out.append(_line([(x - 4.0, y), (x, y)], stroke=GREY, width=0.8))
        if last is None or abs(last - y) >= 1.25 * FONT:
            out.append(_text(x - 6.0, y, format_number(h / units.length_si), "end", FONT - 1.0,
                             f' fill="{GREY}"'))
            last = y
    out.append(_text(x - 6.0, p.y(column.height) - 16.0, units.length, "end", FONT - 1.0, f' fill="{GREY}"'))
    return out


@lru_cache(maxsize=32)
def model_panel(x: float, column: Column, units: PlotUnits) -> str:
    """The model of one plane (cached: while one spring moves, the other planes' models stay as they are)."""
    p = _Panel(x + AXIS_X, column)
    out = _height_axis(x + 30.0, p, column, units)
    out += _band(p, column, light=False)
    found, right = _foundations(p, column, units)
    out += found
    out += _stations(p, column)
    rs, left = _restraints(p, column, units)
    out += rs
    loads, more = _loads(p, column, units)
    out += loads
    out += _labels(p, left, "left") + _labels(p, right + more, "right")
    return "".join(out)


def _symbolic(column: Column) -> Column:
    """``column`` with every finite, nonzero spring set to 1: what the unlabelled symbols depend on."""
    def one(v: float) -> float:
        return v if v == 0 or math.isinf(v) else 1.0

    return replace(column, restraints=tuple(replace(r, lateral=one(r.lateral), rotation=one(r.rotation))
                                            for r in column.restraints))


@lru_cache(maxsize=32)
def _mode_background(x: float, column: Column) -> str:
    """The lighter column behind a mode: band, foundations, restraints and a dotted line at every station."""
    p = _Panel(x + MODE_W / 2, column)
    out = [_line([(x + 8.0, p.y(h)), (x + MODE_W - 8.0, p.y(h))], stroke=LIGHT, width=0.7,
                 extra=' stroke-dasharray="1.5,2.5"') for h in column.stations()]
    out += _band(p, column, light=True)
    found, _ = _foundations(p, column, None, light=True)
    out += found
    rs, _ = _restraints(p, column, None, s=0.8 * S)
    out.append(f'<g opacity="0.55">{"".join(rs)}</g>')
    return "".join(out)


def mode_panel(x: float, column: Column, r: BucklingResult | None, axis: str) -> list[str]:
    p = _Panel(x + MODE_W / 2, column)
    d = ""
    if r is not None and r.modes.size:
        w = np.asarray(r.modes[0], dtype=float)
        h = np.asarray(r.heights, dtype=float)
        step = max(1, h.size // MODE_POINTS)
        idx = np.unique(np.r_[np.arange(0, h.size, step), h.size - 1])
        xs = p.x + MODE_AMP * w[idx]
        ys = p.y_top + (p.H - h[idx]) / p.H * PLOT_H
        d = "M" + " L".join(f"{a:.1f},{b:.1f}" for a, b in zip(xs.tolist(), ys.tolist()))
    return [_mode_background(x, _symbolic(column)),
            f'<path id="{escape(MODE_ID.format(axis=axis))}" class="mode" d="{d}" fill="none" stroke="{INK}" '
            'stroke-width="2.6" stroke-linejoin="round"/>']


def figure_svg(planes: tuple[tuple[str, Column], ...], results: dict[str, BucklingResult | None],
               units: PlotUnits, governing: str | None = None) -> str:
    """The figure: for each plane ``(axis, column)`` the model and its lowest mode (``results[axis]``; None:
    not available), titled with the lowest load factor; ``governing`` names the governing plane."""
    width = len(planes) * (MODEL_W + MODE_W) + 10.0
    height = TOP + PLOT_H + BOTTOM
    out = [f'<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {_n(width)} {_n(height)}" width="{_n(width)}" '
           f'height="{_n(height)}" '
           f'font-family="Liberation Sans, Arial, Helvetica, sans-serif" role="img" '
           f'aria-label="the column of each bending plane and its lowest buckling mode">',
           '<defs><pattern id="hatch" width="5" height="5" patternUnits="userSpaceOnUse" '
           'patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="5" stroke="#000" stroke-width="0.8"/>'
           '</pattern></defs>']
    for i, (axis, column) in enumerate(planes):
        x = i * (MODEL_W + MODE_W)
        r = results.get(axis)
        lam = f"λ₁ = {format_number(r.load_factor)}" if r is not None else "λ₁ not available"
        gov = " (governs)" if governing == axis and len(planes) > 1 else ""
        out.append(_text(x + (MODEL_W + MODE_W) / 2 + 15.0, 16.0, f"{axis} axis{gov}", "middle", FONT + 2.0,
                         ' font-weight="bold"'))
        out.append(_line([(x + 40.0, 26.0), (x + MODEL_W + MODE_W - 10.0, 26.0)], stroke=GREY, width=0.6))
        out.append(_text(x + MODEL_W + MODE_W / 2, 42.0, f"mode 1, {lam}", "middle", FONT,
                         f' id="{escape(TITLE_ID.format(axis=axis))}"'))
        out.append(model_panel(x, column, units))
        out += mode_panel(x + MODEL_W, column, r, axis)
    out.append("</svg>")
    return "".join(out)
