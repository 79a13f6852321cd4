"""The symbol set of the column drawing: supports, springs, loads, foundation.

Every glyph is drawn in printer's points around a station of the column, so it
keeps its size whatever the column height, and reads in black and white.  What
each glyph means is written once, in ``docs/symbols.md``; the key at the foot
of a figure (:mod:`fea.plot.key`) repeats it in short.

matplotlib is imported inside the functions, so importing this module is light.
"""

from __future__ import annotations

import math
from typing import TYPE_CHECKING

import numpy as np

from .style import BAND_MAX, INK, SPRING_LEN

if TYPE_CHECKING:
    from matplotlib.axes import Axes
    from matplotlib.transforms import Transform

__all__ = ["pt", "xpt", "axes_height_pt", "y_to_pt", "pt_to_y", "line", "triangle", "zigzag", "square", "coil",
           "load_arrow", "small_arrow", "side_arrow", "foundation", "ground", "FOUNDATION_WIDTH"]

#: Width of a foundation strip where its modulus is largest [pt].
FOUNDATION_WIDTH = 11.0


# -- transforms ----------------------------------------------------------------------
def pt(ax: Axes, x: float, y: float) -> Transform:
    """Transform whose input is in points, with origin at data point (x, y)."""
    from matplotlib.transforms import Affine2D, ScaledTranslation

    return Affine2D().scale(1.0 / 72.0) + ax.figure.dpi_scale_trans + ScaledTranslation(x, y, ax.transData)


def xpt(ax: Axes) -> Transform:
    """Blended transform: x in points from data x = 0, y in data units."""
    from matplotlib.transforms import Affine2D, ScaledTranslation, blended_transform_factory

    xt = Affine2D().scale(1.0 / 72.0) + ax.figure.dpi_scale_trans + ScaledTranslation(0.0, 0.0, ax.transData)
    return blended_transform_factory(xt, ax.transData)


def axes_height_pt(ax: Axes) -> float:
    """Height of the axes on the page [pt]."""
    return ax.get_position().height * ax.figure.get_figheight() * 72.0


def y_to_pt(ax: Axes, y: float) -> float:
    """Data height -> points above the bottom of the axes."""
    y0, y1 = ax.get_ylim()
    return (y - y0) / (y1 - y0) * axes_height_pt(ax)


def pt_to_y(ax: Axes, p: float) -> float:
    """Points above the bottom of the axes -> data height."""
    y0, y1 = ax.get_ylim()
    return y0 + p / axes_height_pt(ax) * (y1 - y0)


# -- glyphs (all sizes in points) -----------------------------------------------------
def line(ax, tr, xs, ys, **kw) -> None:
    """A line in transform ``tr``, never clipped."""
    from matplotlib.lines import Line2D

    kw.setdefault("color", INK)
    kw.setdefault("lw", 0.9)
    kw.setdefault("solid_capstyle", "butt")
    ax.add_line(Line2D(xs, ys, transform=tr, clip_on=False, **kw))


def _polygon(ax, pts, tr, **kw) -> None:
    from matplotlib.patches import Polygon

    ax.add_patch(Polygon(pts, closed=True, transform=tr, clip_on=False, **kw))


def triangle(ax, x, y, tip=0.0, scale=1.0, color=INK) -> float:
    """Rigid lateral support: solid triangle whose tip touches ``tip`` pt; returns its left end."""
    w, h = 10.0 * scale, 4.6 * scale
    _polygon(ax, [(tip, 0.0), (tip - w, h), (tip - w, -h)], pt(ax, x, y), facecolor=color, edgecolor=color,
             lw=0.6, zorder=6)
    return tip - w


def zigzag_outline(tip: float = 0.0, scale: float = 1.0) -> tuple[list[float], list[float], float, list]:
    """The lateral spring's geometry in pt, from the wall to ``tip``: the zig-zag's points (xs, ys), the wall's
    position, and its hatch strokes ((x0, y0), (x1, y1)); shared by the figures and the explorer's SVG."""
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
    h = 5.5 * scale
    strokes = [((x0, -h), (x0, h))]
    for k in range(3):
        yy = -h + (k + 0.5) * 2 * h / 3
        strokes.append(((x0, yy + 1.2 * scale), (x0 - 2.5 * scale, yy - 1.2 * scale)))
    return xs, ys, x0, strokes


def zigzag(ax, x, y, tip=0.0, scale=1.0, color=INK) -> float:
    """Lateral spring: wall, zig-zag, lead to ``tip``; returns the wall position."""
    xs, ys, x0, strokes = zigzag_outline(tip, scale)
    tr = pt(ax, x, y)
    line(ax, tr, xs, ys, color=color, lw=0.9, zorder=6, solid_joinstyle="miter")
    for k, ((a, b), (c, d)) in enumerate(strokes):
        line(ax, tr, [a, c], [b, d], color=color, lw=1.2 if k == 0 else 0.6, zorder=6)
    return x0 - 2.5 * scale


def square(ax, x, y, scale=1.0, color=INK) -> None:
    """Rigid rotational restraint: filled square centred on the axis."""
    from matplotlib.patches import Rectangle

    a = 3.3 * scale
    ax.add_patch(Rectangle((-a, -a), 2 * a, 2 * a, transform=pt(ax, x, y), facecolor=color, edgecolor=color,
                           lw=0.5, clip_on=False, zorder=7))


def coil(ax, x, y, scale=1.0, color=INK) -> float:
    """Rotational spring: open spiral centred on the axis; returns its left extent."""
    t = np.linspace(0.0, 2.0 * 2.0 * math.pi, 120)
    r = (1.2 + 5.6 * t / t[-1]) * scale
    ang = t + math.pi / 2
    line(ax, pt(ax, x, y), r * np.cos(ang), r * np.sin(ang), color=color, lw=0.9, zorder=7)
    return -6.8 * scale


def _block_arrow(length: float, shaft: float = 1.2, head_len: float = 6.5, head_w: float = 3.8) -> list:
    """Vertical block arrow with its tip at (0, 0) and its tail at (0, length) (pointing down if length > 0)."""
    s = 1.0 if length >= 0 else -1.0
    L = abs(length)
    hl = min(head_len, 0.6 * L)
    pts = [(0.0, 0.0), (head_w, hl), (shaft, hl), (shaft, L), (-shaft, L), (-shaft, hl), (-head_w, hl)]
    return [(px, s * py) for px, py in pts]


def load_arrow(ax, x, y, dx=0.0, length=22.0, hollow=False, scale=1.0) -> None:
    """Point load: block arrow, tip at (dx, 0) pt from (x, y); hollow when permanent.

    A negative ``length`` draws an arrow pointing up from the station (tension).
    """
    if length >= 0:
        pts = [(dx + px * scale, py * scale) for px, py in _block_arrow(length)]
    else:  # tail at the station, tip above
        L = abs(length)
        pts = [(dx + px * scale, (L + py) * scale) for px, py in _block_arrow(-L)]
    _polygon(ax, pts, pt(ax, x, y), facecolor="white" if hollow else INK, edgecolor=INK, lw=0.8,
             joinstyle="miter", zorder=8)


def small_arrow(ax, x, y, dx=0.0, length=8.0, hollow=False) -> None:
    """One arrow of a distributed load (tip at (dx, 0) pt)."""
    pts = [(dx + px, py) for px, py in _block_arrow(length, shaft=0.45, head_len=3.6, head_w=2.3)]
    _polygon(ax, pts, pt(ax, x, y), facecolor="white" if hollow else INK, edgecolor=INK, lw=0.6,
             joinstyle="miter", zorder=8)


def side_arrow(ax, x, y, tip=0.0, length=30.0, dashed=False) -> float:
    """Leaning load: horizontal arrow with an open head pointing left at ``tip``; returns its tail."""
    tr = pt(ax, x, y)
    line(ax, tr, [tip + 0.6, tip + length], [0.0, 0.0], lw=1.0, zorder=8, ls=(0, (3, 1.5)) if dashed else "-")
    line(ax, tr, [tip + 6.0, tip + 0.3, tip + 6.0], [3.4, 0.0, -3.4], lw=1.0, zorder=8, solid_joinstyle="miter")
    return tip + length


def foundation(ax, bottom, top, w_bottom=1.0, w_top=1.0, x0=BAND_MAX + 3.0, width=FOUNDATION_WIDTH, color=INK,
               hatch_color=None) -> None:
    """Foundation: hatched strip from ``x0`` over [bottom, top] (data) whose width follows the modulus.

    ``w_bottom`` and ``w_top`` are the moduli at the ends as fractions of the largest modulus drawn,
    so a linearly varying modulus is a trapezoid (a triangle where it falls to zero), ``width`` pt
    wide at the largest modulus.
    """
    from matplotlib.patches import Polygon

    wb, wt = width * max(w_bottom, 0.0), width * max(w_top, 0.0)
    ax.add_patch(Polygon([(x0, bottom), (x0 + wb, bottom), (x0 + wt, top), (x0, top)], closed=True,
                         transform=xpt(ax), facecolor="white", edgecolor=hatch_color or color, hatch="////",
                         lw=0.0, clip_on=False, zorder=3))
    line(ax, xpt(ax), [x0, x0], [bottom, top], color=color, lw=0.9, zorder=4)
    line(ax, xpt(ax), [x0 + wb, x0 + wt], [bottom, top], color=color, lw=0.5, zorder=4)
    line(ax, xpt(ax), [x0, x0 + wb], [bottom, bottom], color=color, lw=0.5, zorder=4)


def ground(ax, y, left, right, color=INK) -> None:
    """Ground line: a horizontal line at height ``y`` (data) from ``left`` to ``right`` pt, hatched below."""
    tr = pt(ax, 0.0, y)
    line(ax, tr, [left, right], [0.0, 0.0], color=color, lw=1.0, zorder=4, gid="ground")
    for x in np.arange(left + 3.0, right + 0.1, 3.5):
        line(ax, tr, [x, x - 3.0], [0.0, -3.0], color=color, lw=0.5, zorder=4)
