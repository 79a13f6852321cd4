"""A sketch of the column as analysed, drawn directly as SVG for the report.

One panel per bending plane, side by side.  Heights are to scale; widths are
schematic (band width grows with the square root of I).  Every number drawn
is a :class:`~fea.report.document.Q` with its source, written as a
``<tspan data-src=... data-u=...>`` so the report's number check covers the
sketch too.  The drawing reads in black and white.

Symbols (our own)
-----------------
* rigid lateral support: a short link from a hatched wall to the axis;
* lateral spring: a zig-zag from the wall to the axis;
* rigid rotational restraint: a filled square on the axis;
* rotational spring: an open circle on the axis;
* axial point load: a downward arrow, solid head for a variable load, open
  head for a permanent one;
* distributed axial load: small downward arrows beside the column;
* elastic foundation: a hatched strip beside the column;
* leaning load: a dashed horizontal arrow pointing at the axis.
"""

from __future__ import annotations

import html
import math

from ..model.case import Case
from .content import Units
from .document import Em, Q, T, q, unit_label

__all__ = ["column_sketch"]

PANEL_W = 310.0
TOP, BOTTOM = 46.0, 330.0
X_AXIS = 120.0
X_WALL = 78.0
X_HEIGHT = 40.0
X_LABEL = 170.0
LINE = 11.5
FONT = 'font-family="Liberation Sans, Arial, Helvetica, sans-serif" font-size="10"'


def _inline(parts) -> str:
    out = []
    for p in parts:
        if isinstance(p, Q):
            out.append(f'<tspan data-src="{html.escape(p.src)}" data-u="{html.escape(p.unit)}">'
                       f"{html.escape(p.text)}</tspan>")
        elif isinstance(p, T):
            out.append(f'<tspan data-src="{html.escape(p.src)}">{html.escape(p.text)}</tspan>')
        elif isinstance(p, Em):
            out.append(f'<tspan font-style="italic">{html.escape(p.text)}</tspan>')
        else:
            out.append(html.escape(str(p)))
    return "".join(out)


def _text(x: float, y: float, parts, anchor: str = "start", extra: str = "") -> str:
    return f'<text x="{x:.1f}" y="{y:.1f}" text-anchor="{anchor}" {extra}>{_inline(parts)}</text>'


def _spread(wanted: list[float], gap: float, lo: float, hi: float) -> list[float]:
    """Positions as close to ``wanted`` (ascending) as possible, at least ``gap`` apart, within [lo, hi]."""
    out: list[float] = []
    for w in wanted:
        out.append(max(w, out[-1] + gap) if out else max(w, lo))
    over = out[-1] - hi if out else 0.0
    if over > 0:
        out[-1] -= over
        for i in range(len(out) - 2, -1, -1):
            out[i] = min(out[i], out[i + 1] - gap)
    return out


def _arrow_down(x: float, y_tip: float, length: float, hollow: bool) -> str:
    head = 7.0
    fill = "white" if hollow else "black"
    return (f'<line x1="{x:.1f}" y1="{y_tip - length:.1f}" x2="{x:.1f}" y2="{y_tip - head:.1f}" stroke="black" '
            f'stroke-width="1.4"/>'
            f'<polygon points="{x - 3.5:.1f},{y_tip - head:.1f} {x + 3.5:.1f},{y_tip - head:.1f} {x:.1f},{y_tip:.1f}" '
            f'fill="{fill}" stroke="black" stroke-width="1"/>')


def _wall(y: float) -> str:
    s = [f'<line x1="{X_WALL:.1f}" y1="{y - 8:.1f}" x2="{X_WALL:.1f}" y2="{y + 8:.1f}" stroke="black" '
         f'stroke-width="1.4"/>']
    for k in range(5):
        yy = y - 8 + 4 * k
        s.append(f'<line x1="{X_WALL:.1f}" y1="{yy:.1f}" x2="{X_WALL - 4:.1f}" y2="{yy + 4:.1f}" stroke="black" '
                 f'stroke-width="0.7"/>')
    return "".join(s)


def _zigzag(x0: float, x1: float, y: float) -> str:
    n = 6
    pts = [f"{x0:.1f},{y:.1f}", f"{x0 + 5:.1f},{y:.1f}"]
    step = (x1 - x0 - 10) / n
    for k in range(n):
        pts.append(f"{x0 + 5 + step * (k + 0.5):.1f},{y + (-4 if k % 2 == 0 else 4):.1f}")
    pts += [f"{x1 - 5:.1f},{y:.1f}", f"{x1:.1f},{y:.1f}"]
    return f'<polyline points="{" ".join(pts)}" fill="none" stroke="black" stroke-width="1"/>'


def _panel(case: Case, p: int, u: Units, x_off: float) -> tuple[str, set[str]]:
    axis, col = case.planes[p]
    H = col.height
    scale = (BOTTOM - TOP) / H

    def Y(x: float) -> float:
        return BOTTOM - x * scale

    used: set[str] = set()
    g = [f'<g transform="translate({x_off:.1f},0)">']
    title = f"{axis} axis" if axis != "in-plane" else "in plane"
    g.append(_text(X_AXIS, 16, (title,), "middle", 'font-weight="bold"'))

    I_max = max(max(s.I, s.I_top or 0.0) for s in col.segments)

    def hw(I: float) -> float:
        return 2.5 + 6.5 * math.sqrt(I / I_max)

    # segment bands and joints
    z = 0.0
    for i, s in enumerate(col.segments):
        b, t = Y(z), Y(z + s.length)
        w0, w1 = hw(s.I), hw(s.I_top if s.I_top is not None else s.I)
        g.append(f'<polygon points="{X_AXIS - w0:.1f},{b:.1f} {X_AXIS + w0:.1f},{b:.1f} {X_AXIS + w1:.1f},{t:.1f} '
                 f'{X_AXIS - w1:.1f},{t:.1f}" fill="#d9d9d9" stroke="black" stroke-width="0.9"/>')
        g.append(_text(X_AXIS + max(w0, w1) + 4, (b + t) / 2 + 3.5,
                       (Q(i + 1, f"ord:{i + 1}", "", 6),), "start", 'font-size="9" fill="#444"'))
        z += s.length
    g.append(f'<line x1="{X_AXIS:.1f}" y1="{TOP - 4:.1f}" x2="{X_AXIS:.1f}" y2="{BOTTOM + 4:.1f}" stroke="black" '
             f'stroke-width="0.5" stroke-dasharray="6 2 1 2"/>')

    # stations and their heights (left scale)
    stations: dict[float, Q] = {}

    def station(x: float, src: str) -> None:
        for k in stations:
            if abs(k - x) <= 1e-9 * max(H, 1.0):
                return
        stations[x] = q(x, src, u.length)

    station(0.0, "case:segments/0/bottom")
    for i, si in enumerate(case.segments):
        station(si.top, f"case:segments/{i}/top")
    for j, r in enumerate(col.restraints):
        station(r.at, f"case:planes/{p}/1/restraints/{j}/at")
    for j, ld in enumerate(col.point_loads):
        station(ld.at, f"case:planes/{p}/1/point_loads/{j}/at")
    for j, ll in enumerate(col.leaning_loads):
        station(ll.at, f"case:planes/{p}/1/leaning_loads/{j}/at")
    xs = sorted(stations)
    g.append(f'<line x1="{X_HEIGHT + 6:.1f}" y1="{Y(0):.1f}" x2="{X_HEIGHT + 6:.1f}" y2="{Y(H):.1f}" '
             f'stroke="black" stroke-width="0.6"/>')
    ys = [Y(x) for x in reversed(xs)]  # top first (ascending y)
    placed = _spread(ys, LINE, TOP - 6, BOTTOM + 6)
    for x, yl in zip(reversed(xs), placed):
        g.append(f'<line x1="{X_HEIGHT + 3:.1f}" y1="{Y(x):.1f}" x2="{X_HEIGHT + 9:.1f}" y2="{Y(x):.1f}" '
                 f'stroke="black" stroke-width="0.6"/>')
        g.append(f'<line x1="{X_HEIGHT + 9:.1f}" y1="{Y(x):.1f}" x2="{X_WALL - 8:.1f}" y2="{Y(x):.1f}" '
                 f'stroke="#999" stroke-width="0.4" stroke-dasharray="1 2"/>')
        g.append(_text(X_HEIGHT + 1, yl + 3.5, (stations[x],), "end"))
    g.append(_text(X_HEIGHT + 6, TOP - 16, (f"height [{unit_label(u.length)}]",), "middle", 'font-size="9"'))

    # restraints (left) and their labels (right)
    labels: list[tuple[float, tuple]] = []
    for j, r in enumerate(col.restraints):
        y = Y(r.at)
        src = f"case:planes/{p}/1/restraints/{j}"
        edge = X_AXIS - 1.0
        if math.isinf(r.lateral):
            used.add("rigid")
            g.append(_wall(y))
            g.append(f'<line x1="{X_WALL:.1f}" y1="{y:.1f}" x2="{edge:.1f}" y2="{y:.1f}" stroke="black" '
                     f'stroke-width="1.6"/><circle cx="{X_WALL + 4:.1f}" cy="{y:.1f}" r="2" fill="white" '
                     f'stroke="black"/>')
        elif r.lateral > 0:
            used.add("spring")
            g.append(_wall(y))
            g.append(_zigzag(X_WALL, edge, y))
            labels.append((y, (Em("k"), " = ", q(r.lateral, f"{src}/lateral", u.lateral), " ",
                               unit_label(u.lateral))))
        if math.isinf(r.rotation):
            used.add("fixed")
            g.append(f'<rect x="{X_AXIS - 4.5:.1f}" y="{y - 4.5:.1f}" width="9" height="9" fill="black"/>')
        elif r.rotation > 0:
            used.add("rot")
            g.append(f'<circle cx="{X_AXIS:.1f}" cy="{y:.1f}" r="5.5" fill="white" stroke="black" '
                     f'stroke-width="1.2"/><circle cx="{X_AXIS:.1f}" cy="{y:.1f}" r="1.4" fill="black"/>')
            labels.append((y, (Em("k"), "θ = ", q(r.rotation, f"{src}/rotation", u.rotational), " ",
                               unit_label(u.rotational))))

    # loads
    top_loads = 0
    for j, ld in enumerate(col.point_loads):
        y = Y(ld.at)
        src = f"case:planes/{p}/1/point_loads/{j}"
        used.add("perm" if ld.permanent else "var")
        if ld.at >= H * (1 - 1e-9):
            x = X_AXIS + 9 * top_loads
            top_loads += 1
            g.append(_arrow_down(x, y - 1, 28, ld.permanent))
        else:
            x = X_AXIS + 16
            g.append(f'<line x1="{X_AXIS:.1f}" y1="{y:.1f}" x2="{x + 4:.1f}" y2="{y:.1f}" stroke="black" '
                     f'stroke-width="1.6"/>')
            g.append(_arrow_down(x, y - 1, 24, ld.permanent))
        labels.append((y - 12, (Em("P"), " = ", q(ld.P, f"{src}/P", u.force), " ", unit_label(u.force),
                                " permanent" if ld.permanent else " variable")))
    for j, dl in enumerate(col.distributed_loads):
        src = f"case:planes/{p}/1/distributed_loads/{j}"
        used.add("dist")
        y0, y1 = Y(dl.bottom), Y(dl.top)
        n = max(2, int((y0 - y1) / 18))
        for k in range(n + 1):
            yy = y1 + (y0 - y1) * k / n
            g.append(_arrow_down(X_AXIS + 22, yy, 10, dl.permanent))
        labels.append(((y0 + y1) / 2, (Em("q"), " = ", q(dl.q, f"{src}/q", u.line_load), " ",
                                       unit_label(u.line_load), " permanent" if dl.permanent else " variable")))
    for j, f in enumerate(col.foundations):
        src = f"case:planes/{p}/1/foundations/{j}"
        used.add("found")
        y0, y1 = Y(f.bottom), Y(f.top)
        g.append(f'<rect x="{X_AXIS - 32:.1f}" y="{y1:.1f}" width="10" height="{y0 - y1:.1f}" fill="white" '
                 f'stroke="black" stroke-width="0.8"/>')
        for k in range(int((y0 - y1) / 5)):
            yy = y1 + 5 * k
            g.append(f'<line x1="{X_AXIS - 32:.1f}" y1="{yy + 5:.1f}" x2="{X_AXIS - 22:.1f}" y2="{yy:.1f}" '
                     f'stroke="black" stroke-width="0.5"/>')
        parts: tuple = (Em("k"), "s = ", q(f.k_bottom, f"{src}/k_bottom", u.modulus))
        if f.k_top is not None and f.k_top != f.k_bottom:
            parts += (" to ", q(f.k_top, f"{src}/k_top", u.modulus))
        labels.append(((y0 + y1) / 2, parts + (" ", unit_label(u.modulus))))
    for j, ll in enumerate(col.leaning_loads):
        src = f"case:planes/{p}/1/leaning_loads/{j}"
        used.add("lean")
        y = Y(ll.at) + 10
        g.append(f'<line x1="{X_AXIS + 40:.1f}" y1="{y:.1f}" x2="{X_AXIS + 8:.1f}" y2="{y:.1f}" stroke="black" '
                 f'stroke-width="1.1" stroke-dasharray="4 2"/><polyline points="{X_AXIS + 14:.1f},{y - 4:.1f} '
                 f'{X_AXIS + 8:.1f},{y:.1f} {X_AXIS + 14:.1f},{y + 4:.1f}" fill="none" stroke="black"/>')
        labels.append((y, ("leaning ", Em("P"), " = ", q(ll.P, f"{src}/P", u.force), " ", unit_label(u.force),
                           ", ", Em("h"), " = ", q(ll.height, f"{src}/height", u.length), " ",
                           unit_label(u.length))))
    labels.sort(key=lambda e: e[0])
    placed = _spread([y for y, _ in labels], LINE, TOP - 20, BOTTOM + 20)
    for (y, parts), yl in zip(labels, placed):
        g.append(_text(X_LABEL, yl + 3.5, parts))
    g.append("</g>")
    return "".join(g), used


_KEY = {
    "rigid": ("rigid lateral support",
              f'{_wall(0)}<line x1="{X_WALL}" y1="0" x2="{X_WALL + 20}" y2="0" stroke="black" stroke-width="1.6"/>'),
    "spring": ("lateral spring", _wall(0) + _zigzag(X_WALL, X_WALL + 22, 0)),
    "fixed": ("rigid rotational restraint", f'<rect x="{X_WALL + 6}" y="-4.5" width="9" height="9" fill="black"/>'),
    "rot": ("rotational spring", f'<circle cx="{X_WALL + 10}" cy="0" r="5.5" fill="white" stroke="black" '
                                 f'stroke-width="1.2"/><circle cx="{X_WALL + 10}" cy="0" r="1.4" fill="black"/>'),
    "var": ("variable load", _arrow_down(X_WALL + 10, 6, 16, False)),
    "perm": ("permanent load", _arrow_down(X_WALL + 10, 6, 16, True)),
    "dist": ("distributed load", _arrow_down(X_WALL + 10, 6, 12, False)),
    "found": ("elastic foundation", f'<rect x="{X_WALL + 5}" y="-7" width="10" height="14" fill="white" '
                                    f'stroke="black" stroke-width="0.8"/>'),
    "lean": ("leaning columns", f'<line x1="{X_WALL + 24}" y1="0" x2="{X_WALL}" y2="0" stroke="black" '
                                f'stroke-dasharray="4 2"/>'),
}


def column_sketch(case: Case, u: Units) -> str:
    """The sketch as an ``<svg>`` element (one panel per bending plane and a key)."""
    panels, used = [], set()
    for p in range(len(case.planes)):
        svg, u_p = _panel(case, p, u, p * PANEL_W)
        panels.append(svg)
        used |= u_p
    width = PANEL_W * len(case.planes)
    keys = [k for k in _KEY if k in used]
    per_row = max(1, int(width // 150))
    rows = math.ceil(len(keys) / per_row)
    key_y = BOTTOM + 36
    height = key_y + 20 * rows + 6
    out = [f'<svg xmlns="http://www.w3.org/2000/svg" class="sketch" viewBox="0 0 {width:.0f} {height:.0f}" '
           f'style="max-width:{width:.0f}px" {FONT} role="img" aria-label="column sketch">']
    out.extend(panels)
    for n, k in enumerate(keys):
        r, c = divmod(n, per_row)
        x, y = 150 * c - 50, key_y + 20 * r
        label, sym = _KEY[k]
        out.append(f'<g transform="translate({x:.1f},{y:.1f})">{sym}</g>')
        out.append(_text(x + X_WALL + 34, y + 3.5, (label,), "start", 'font-size="9"'))
    out.append("</svg>")
    return "".join(out)
