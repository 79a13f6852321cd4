"""Exact outlines of cross-sections: straight edges and circular arcs, and boundary integration.

An outline is a :class:`Region`: signed closed loops (outer counter-clockwise,
holes clockwise) of :class:`Line` and :class:`Arc` edges.  Area integrals are
boundary integrals (Green's theorem)::

    integral over region of f(v) dA = closed integral of u f(v) dv

evaluated edge by edge with 16-point Gauss-Legendre quadrature.  Along a
straight edge the integrand is a polynomial and the rule is exact; arcs are cut
into pieces of at most 90 degrees, on which the trigonometric integrand is
integrated to round-off.  Wherever the integrand has a kink (a plastic neutral
axis, the edge of a fibre strip) the edge is first cut at the kink
(:meth:`Region.nodes` with break lines), so the quadrature stays exact.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Callable, Sequence

import numpy as np

from fea.errors import ModelError

__all__ = ["Line", "Arc", "Edge", "Region", "split_arc", "circle", "rounded_polygon"]

_GX, _GW = np.polynomial.legendre.leggauss(16)
_GX = 0.5 * (_GX + 1.0)  # nodes on [0, 1]
_GW = 0.5 * _GW


@dataclass(frozen=True, slots=True)
class Line:
    y0: float
    z0: float
    y1: float
    z1: float

    def at(self, t: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
        """Points and derivatives at parameters ``t`` in [0, 1]."""
        dy, dz = self.y1 - self.y0, self.z1 - self.z0
        return self.y0 + t * dy, self.z0 + t * dz, np.full_like(t, dy), np.full_like(t, dz)

    def crossings(self, a: float, b: float, c: float, level: float) -> list[float]:
        """Parameters where ``a + b*y + c*z == level`` (strictly inside)."""
        f0 = a + b * self.y0 + c * self.z0 - level
        f1 = a + b * self.y1 + c * self.z1 - level
        if f0 == f1 or f0 * f1 >= 0.0:
            return []
        return [f0 / (f0 - f1)]

    def extreme(self, b: float, c: float) -> tuple[float, float]:
        """Min and max of ``b*y + c*z`` over the edge."""
        v0 = b * self.y0 + c * self.z0
        v1 = b * self.y1 + c * self.z1
        return min(v0, v1), max(v0, v1)

    def transformed(self, fn: Callable[[float, float], tuple[float, float]]) -> "Line":
        y0, z0 = fn(self.y0, self.z0)
        y1, z1 = fn(self.y1, self.z1)
        return Line(y0, z0, y1, z1)


@dataclass(frozen=True, slots=True)
class Arc:
    """Arc of centre (cy, cz), radius R, from angle a0 to a1 (a1 < a0: clockwise)."""

    cy: float
    cz: float
    R: float
    a0: float
    a1: float

    def at(self, t: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
        da = self.a1 - self.a0
        ang = self.a0 + t * da
        c, s = np.cos(ang), np.sin(ang)
        return self.cy + self.R * c, self.cz + self.R * s, -self.R * s * da, self.R * c * da

    def crossings(self, a: float, b: float, c: float, level: float) -> list[float]:
        # a + b(cy + R cos) + c(cz + R sin) = level  ->  rho cos(ang - psi) = k
        rho = self.R * math.hypot(b, c)
        if rho == 0.0:
            return []
        k = (level - a - b * self.cy - c * self.cz) / rho
        if abs(k) >= 1.0:
            return []
        psi = math.atan2(c, b)
        out = []
        da = self.a1 - self.a0
        for base in (psi + math.acos(k), psi - math.acos(k)):
            for m in range(-3, 4):
                t = (base + 2.0 * math.pi * m - self.a0) / da
                if 0.0 < t < 1.0:
                    out.append(t)
        return out

    def extreme(self, b: float, c: float) -> tuple[float, float]:
        pts = [self.a0, self.a1]
        psi = math.atan2(c, b)
        lo, hi = min(self.a0, self.a1), max(self.a0, self.a1)
        for base in (psi, psi + math.pi):
            for m in range(-3, 4):
                ang = base + 2.0 * math.pi * m
                if lo < ang < hi:
                    pts.append(ang)
        vals = [b * (self.cy + self.R * math.cos(x)) + c * (self.cz + self.R * math.sin(x)) for x in pts]
        return min(vals), max(vals)

    def transformed_rigid(self, y0: float, z0: float, theta: float) -> "Arc":
        """The arc in a frame translated by (y0, z0) and rotated by theta."""
        ct, st = math.cos(theta), math.sin(theta)
        dy, dz = self.cy - y0, self.cz - z0
        return Arc(dy * ct + dz * st, -dy * st + dz * ct, self.R, self.a0 - theta, self.a1 - theta)


Edge = Line | Arc


def split_arc(cy: float, cz: float, R: float, a0: float, a1: float) -> list[Arc]:
    """Cut an arc into pieces of at most 90 degrees (quadrature accuracy)."""
    n = max(1, math.ceil(abs(a1 - a0) / (0.5 * math.pi) - 1e-12))
    angs = np.linspace(a0, a1, n + 1)
    return [Arc(cy, cz, R, float(angs[i]), float(angs[i + 1])) for i in range(n)]


def circle(cy: float, cz: float, R: float, ccw: bool = True) -> list[Edge]:
    return list(split_arc(cy, cz, R, 0.0, 2.0 * math.pi) if ccw else split_arc(cy, cz, R, 2.0 * math.pi, 0.0))


def rounded_polygon(
    pts: Sequence[tuple[float, float]], radii: Sequence[float], field_name: str
) -> list[Edge]:
    """Closed loop through ``pts`` with each corner rounded by its radius.

    The arc at a corner is tangent to both adjacent edges; left turns give
    counter-clockwise arcs, right turns clockwise arcs, so the same routine
    serves convex corners, re-entrant fillets and clockwise hole loops.
    """
    n = len(pts)
    P = np.asarray(pts, dtype=float)
    tan_pts: list[tuple[np.ndarray, np.ndarray, Arc | None]] = []
    tdist = np.zeros(n)
    for i in range(n):
        r = float(radii[i])
        A, B, C = P[i - 1], P[i], P[(i + 1) % n]
        d1 = (A - B) / np.linalg.norm(A - B)
        d2 = (C - B) / np.linalg.norm(C - B)
        if r <= 0.0:
            tan_pts.append((B, B, None))
            continue
        half = 0.5 * math.acos(max(-1.0, min(1.0, float(d1 @ d2))))
        td = r / math.tan(half)
        tdist[i] = td
        T1, T2 = B + d1 * td, B + d2 * td
        bis = (d1 + d2) / np.linalg.norm(d1 + d2)
        Cc = B + bis * (r / math.sin(half))
        a0 = math.atan2(T1[1] - Cc[1], T1[0] - Cc[0])
        a1 = math.atan2(T2[1] - Cc[1], T2[0] - Cc[0])
        left = (B[0] - A[0]) * (C[1] - B[1]) - (B[1] - A[1]) * (C[0] - B[0]) > 0.0
        sweep = (a1 - a0) % (2.0 * math.pi)
        if not left:
            sweep -= 2.0 * math.pi
        tan_pts.append((T1, T2, Arc(float(Cc[0]), float(Cc[1]), r, a0, a0 + sweep)))
    for i in range(n):
        length = float(np.linalg.norm(P[(i + 1) % n] - P[i]))
        if tdist[i] + tdist[(i + 1) % n] > length * (1.0 + 1e-9):
            raise ModelError(
                field_name,
                f"corner radii {radii[i]:g} m and {radii[(i + 1) % n]:g} m do not fit on an edge "
                f"{length:g} m long; expected smaller radii",
            )
    edges: list[Edge] = []
    for i in range(n):
        T1, T2, arc = tan_pts[i]
        if arc is not None:
            edges.extend(split_arc(arc.cy, arc.cz, arc.R, arc.a0, arc.a1))
        N1 = tan_pts[(i + 1) % n][0]
        if float(np.linalg.norm(N1 - T2)) > 0.0:
            edges.append(Line(float(T2[0]), float(T2[1]), float(N1[0]), float(N1[1])))
    return edges


@dataclass(frozen=True, slots=True)
class Region:
    """Signed boundary loops (outer counter-clockwise, holes clockwise)."""

    edges: tuple[Edge, ...]

    def in_frame(self, y0: float, z0: float, theta: float) -> "Region":
        """The region in coordinates (u, v): origin (y0, z0), u at angle theta."""
        ct, st = math.cos(theta), math.sin(theta)

        def fn(y: float, z: float) -> tuple[float, float]:
            dy, dz = y - y0, z - z0
            return dy * ct + dz * st, -dy * st + dz * ct

        out: list[Edge] = []
        for e in self.edges:
            out.append(e.transformed(fn) if isinstance(e, Line) else e.transformed_rigid(y0, z0, theta))
        return Region(tuple(out))

    def nodes(
        self, u_breaks: Sequence[float] = (), v_breaks: Sequence[float] = ()
    ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """Quadrature nodes (u, v) and weights w such that, for any Q(u, v)
        smooth between the break lines, closed integral Q dv = sum(w * Q(u, v))."""
        us, vs, ws = [], [], []
        for e in self.edges:
            ts = [0.0, 1.0]
            for lvl in u_breaks:
                ts += e.crossings(0.0, 1.0, 0.0, lvl)
            for lvl in v_breaks:
                ts += e.crossings(0.0, 0.0, 1.0, lvl)
            ts = sorted(set(ts))
            for ta, tb in zip(ts[:-1], ts[1:]):
                if tb - ta <= 0.0:
                    continue
                t = ta + (tb - ta) * _GX
                u, v, _, dv = e.at(t)
                us.append(u)
                vs.append(v)
                ws.append(_GW * (tb - ta) * dv)
        return np.concatenate(us), np.concatenate(vs), np.concatenate(ws)

    def extent(self) -> tuple[float, float, float, float]:
        """(u_min, u_max, v_min, v_max) of the boundary."""
        umin = min(e.extreme(1.0, 0.0)[0] for e in self.edges)
        umax = max(e.extreme(1.0, 0.0)[1] for e in self.edges)
        vmin = min(e.extreme(0.0, 1.0)[0] for e in self.edges)
        vmax = max(e.extreme(0.0, 1.0)[1] for e in self.edges)
        return umin, umax, vmin, vmax
