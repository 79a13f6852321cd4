"""Cross-section shapes and their properties.

Every shape is a frozen, validated dataclass built from dimensions in metres.
Its outline is an exact boundary made of straight edges and circular arcs
(fillets, corner radii and circles are *not* discretised).  All area integrals
are boundary integrals (Green's theorem)::

    integral over region of f(v) dA = closed integral of u f(v) dv

evaluated edge by edge with 16-point Gauss-Legendre quadrature.  Along a
straight edge the integrand is a polynomial and the rule is exact; arcs are cut
into pieces of at most 90 degrees, on which the trigonometric integrand is
integrated to round-off.  Wherever the integrand has a kink (a plastic neutral
axis, the edge of a fibre strip) the edge is first cut at the kink, so the
quadrature stays exact.

Coordinate system
-----------------
* ``y`` horizontal (to the right), ``z`` vertical (upward); the origin is the
  lower-left corner of the shape's bounding box.
* ``I_yy = integral (z - z_c)^2 dA`` is the second moment about the horizontal
  centroidal axis (the ``y`` axis), ``I_zz = integral (y - y_c)^2 dA`` about
  the vertical one, ``I_yz = integral (y - y_c)(z - z_c) dA`` the product.
  For an I section standing upright, ``y-y`` is the major axis, as in
  EN 1993-1-1.
* The principal angle ``theta`` [rad] is measured counter-clockwise from the
  ``+y`` axis to the *major* principal axis, ``-pi/2 < theta <= pi/2``.  The
  major axis has direction ``e1 = (cos theta, sin theta)``, the minor axis
  ``e2 = (-sin theta, cos theta)``.  Principal coordinates of a point are
  ``p = (r - r_c).e1`` and ``q = (r - r_c).e2``; bending about the major axis
  strains fibres in proportion to ``q``, bending about the minor axis in
  proportion to ``p``.  When ``I_yy == I_zz`` and ``I_yz == 0`` (square, round)
  every axis is principal and ``theta = 0``.
"""

from __future__ import annotations

import abc

import math
import numbers
from dataclasses import dataclass
from typing import Callable, ClassVar, Literal, Sequence

import numpy as np

from fea.errors import ModelError

__all__ = [
    "SectionProperties",
    "FibreSet",
    "Rectangle",
    "Round",
    "RectangularHollow",
    "CircularHollow",
    "ISection",
    "Channel",
    "Angle",
    "Tee",
    "SHAPES",
]

Axis = Literal["major", "minor"]

_GX, _GW = np.polynomial.legendre.leggauss(16)
_GX = 0.5 * (_GX + 1.0)  # nodes on [0, 1]
_GW = 0.5 * _GW


# --------------------------------------------------------------------------
# Boundary geometry: straight edges and circular arcs
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class _Line:
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

    def transformed(self, fn: Callable[[float, float], tuple[float, float]]) -> "_Line":
        y0, z0 = fn(self.y0, self.z0)
        y1, z1 = fn(self.y1, self.z1)
        return _Line(y0, z0, y1, z1)


@dataclass(frozen=True, slots=True)
class _Arc:
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

    def transformed_rigid(self, y0: float, z0: float, theta: float) -> "_Arc":
        """The arc in a frame translated by (y0, z0) and rotated by theta."""
        ct, st = math.cos(theta), math.sin(theta)
        dy, dz = self.cy - y0, self.cz - z0
        return _Arc(dy * ct + dz * st, -dy * st + dz * ct, self.R, self.a0 - theta, self.a1 - theta)


_Edge = _Line | _Arc


def _split_arc(cy: float, cz: float, R: float, a0: float, a1: float) -> list[_Arc]:
    """Cut an arc into pieces of at most 90 degrees (quadrature accuracy)."""
    n = max(1, math.ceil(abs(a1 - a0) / (0.5 * math.pi) - 1e-12))
    angs = np.linspace(a0, a1, n + 1)
    return [_Arc(cy, cz, R, float(angs[i]), float(angs[i + 1])) for i in range(n)]


def _circle(cy: float, cz: float, R: float, ccw: bool = True) -> list[_Edge]:
    return list(_split_arc(cy, cz, R, 0.0, 2.0 * math.pi) if ccw else _split_arc(cy, cz, R, 2.0 * math.pi, 0.0))


def _rounded_polygon(
    pts: Sequence[tuple[float, float]], radii: Sequence[float], field_name: str
) -> list[_Edge]:
    """Closed loop through ``pts`` with each corner rounded by its radius.

    The arc at a corner is tangent to both adjacent edges; left turns give
    counter-clockwise arcs, right turns clockwise arcs, so the same routine
    serves convex corners, re-entrant fillets and clockwise hole loops.
    """
    n = len(pts)
    P = np.asarray(pts, dtype=float)
    tan_pts: list[tuple[np.ndarray, np.ndarray, _Arc | None]] = []
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
        tan_pts.append((T1, T2, _Arc(float(Cc[0]), float(Cc[1]), r, a0, a0 + sweep)))
    for i in range(n):
        length = float(np.linalg.norm(P[(i + 1) % n] - P[i]))
        if tdist[i] + tdist[(i + 1) % n] > length * (1.0 + 1e-9):
            raise ModelError(
                field_name,
                f"corner radii {radii[i]:g} m and {radii[(i + 1) % n]:g} m do not fit on an edge "
                f"{length:g} m long; expected smaller radii",
            )
    edges: list[_Edge] = []
    for i in range(n):
        T1, T2, arc = tan_pts[i]
        if arc is not None:
            edges.extend(_split_arc(arc.cy, arc.cz, arc.R, arc.a0, arc.a1))
        N1 = tan_pts[(i + 1) % n][0]
        if float(np.linalg.norm(N1 - T2)) > 0.0:
            edges.append(_Line(float(T2[0]), float(T2[1]), float(N1[0]), float(N1[1])))
    return edges


@dataclass(frozen=True, slots=True)
class _Region:
    """Signed boundary loops (outer counter-clockwise, holes clockwise)."""

    edges: tuple[_Edge, ...]

    def in_frame(self, y0: float, z0: float, theta: float) -> "_Region":
        """The region in coordinates (u, v): origin (y0, z0), u at angle theta."""
        ct, st = math.cos(theta), math.sin(theta)

        def fn(y: float, z: float) -> tuple[float, float]:
            dy, dz = y - y0, z - z0
            return dy * ct + dz * st, -dy * st + dz * ct

        out: list[_Edge] = []
        for e in self.edges:
            out.append(e.transformed(fn) if isinstance(e, _Line) else e.transformed_rigid(y0, z0, theta))
        return _Region(tuple(out))

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


# --------------------------------------------------------------------------
# Results
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class SectionProperties:
    """Geometric properties of a cross-section (SI units).

    Attributes
    ----------
    area : float
        Cross-sectional area A [m^2].
    y_c, z_c : float
        Centroid [m] from the lower-left corner of the bounding box.
    I_yy, I_zz, I_yz : float
        Second moments about the centroidal axes parallel to ``y`` and ``z``
        and the product moment [m^4] (see module docstring).
    I_major, I_minor : float
        Principal second moments [m^4], ``I_major >= I_minor``.
    theta : float
        Angle [rad] from ``+y`` to the major principal axis, counter-clockwise,
        in ``(-pi/2, pi/2]``.
    r_major, r_minor : float
        Radii of gyration sqrt(I/A) [m].
    e_major_pos, e_major_neg : float
        Distances [m] from the major axis to the extreme fibres on its
        ``+q`` and ``-q`` sides (both >= 0).
    e_minor_pos, e_minor_neg : float
        Distances [m] from the minor axis to the extreme fibres on its
        ``+p`` and ``-p`` sides (both >= 0).
    W_el_major, W_el_minor : float
        Elastic moduli [m^3] = I / (largest extreme-fibre distance), i.e. the
        minimum over the two extreme fibres (governs for asymmetric shapes).
    W_pl_major, W_pl_minor : float
        Plastic moduli [m^3] = integral |distance from the plastic neutral
        axis| dA, with the plastic neutral axis parallel to the principal axis
        at the equal-area position (found numerically).  For shapes with no
        axis of symmetry (unequal angles) this is the conventional value; the
        true fully-plastic moment of such a shape about a principal axis has an
        inclined neutral axis.
    pna_major, pna_minor : float
        Offset [m] of the plastic neutral axis from the centroid, along ``q``
        (major) and ``p`` (minor).
    J : float
        St Venant torsion constant [m^4]; the formula used is stated by each
        shape's ``torsion_constant`` docstring.
    """

    area: float
    y_c: float
    z_c: float
    I_yy: float
    I_zz: float
    I_yz: float
    I_major: float
    I_minor: float
    theta: float
    r_major: float
    r_minor: float
    e_major_pos: float
    e_major_neg: float
    e_minor_pos: float
    e_minor_neg: float
    W_el_major: float
    W_el_minor: float
    W_pl_major: float
    W_pl_minor: float
    pna_major: float
    pna_minor: float
    J: float

    @property
    def r_least(self) -> float:
        """Least radius of gyration [m] (= ``r_minor``)."""
        return self.r_minor


@dataclass(frozen=True, slots=True)
class FibreSet:
    """Fibres of a section for a fibre-based bending analysis about one axis.

    Attributes
    ----------
    axis : {"major", "minor"}
        Principal axis of bending.
    y : numpy.ndarray
        Signed distance [m] of each fibre's centroid from the bending axis
        (the principal coordinate ``q`` for the major axis, ``p`` for the
        minor axis).
    x : numpy.ndarray
        Coordinate [m] of each fibre's centroid along the bending axis.
    area : numpy.ndarray
        Fibre areas [m^2]; they sum to the section area to round-off.
    flange_s : numpy.ndarray
        For I sections: distance of the fibre centroid from the web centre
        line divided by half the flange width (0 at the flange centre, 1 at
        the tips) for flange fibres, NaN for web and fillet fibres.  For other
        shapes all NaN.
    """

    axis: str
    y: np.ndarray
    x: np.ndarray
    area: np.ndarray
    flange_s: np.ndarray

    def __post_init__(self) -> None:
        for name in ("y", "x", "area", "flange_s"):
            getattr(self, name).setflags(write=False)

    @property
    def n(self) -> int:
        """Number of fibres."""
        return int(self.area.size)

    @property
    def second_moment(self) -> float:
        """sum(A_i y_i^2) [m^4], the fibre approximation of I."""
        return float(np.sum(self.area * self.y**2))

    def residual_ratio(self, beta: float) -> np.ndarray:
        """Per-fibre residual stress divided by fy (compression positive).

        The pattern is the usual linear flange pattern for I sections: in each
        flange the ratio varies linearly with the distance from the web centre
        line, from ``+beta`` (compression) at the flange tips to ``-gamma``
        (tension) at the flange centre; the web and fillets carry a uniform
        ``-gamma``.  ``gamma`` is chosen so that the pattern is
        self-equilibrating over these fibres::

            flange: ratio = -gamma + (beta + gamma) * s,   s = flange_s
            web:    ratio = -gamma
            sum(ratio_i A_i) = 0  ->  gamma = beta P / (A - P),  P = sum_flange(s_i A_i)

        Flange fibres never straddle the flange centre, so ``P`` equals the
        exact integral ``A_flanges / 2`` and ``gamma = beta A_f / (A_f + 2 A_w)``
        with ``A_f`` the two full-width flange rectangles and ``A_w`` the rest.

        Parameters
        ----------
        beta : float
            Peak compressive residual stress at the flange tips divided by fy
            [-], ``0 <= beta < 1``.

        Returns
        -------
        numpy.ndarray
            Residual stress ratio per fibre [-].
        """
        if not (0.0 <= beta < 1.0):
            raise ModelError("beta", f"residual stress ratio {beta!r} is outside [0, 1); expected e.g. 0.3 or 0.5")
        flange = ~np.isnan(self.flange_s)
        if not flange.any():
            raise ModelError("fibres", "this fibre set has no flange fibres; the linear flange pattern needs an I section")
        s = np.where(flange, self.flange_s, 0.0)
        P = float(np.sum(self.area[flange] * s[flange]))
        gamma = beta * P / (float(np.sum(self.area)) - P)
        return np.where(flange, -gamma + (beta + gamma) * s, -gamma)


# --------------------------------------------------------------------------
# Shape base class
# --------------------------------------------------------------------------


def _positive(name: str, value: float) -> None:
    if not (isinstance(value, numbers.Real) and math.isfinite(value) and value > 0.0):
        raise ModelError(name, f"{value!r} m is not a positive finite length; expected a dimension > 0")


def _non_negative(name: str, value: float) -> None:
    if not (isinstance(value, numbers.Real) and math.isfinite(value) and value >= 0.0):
        raise ModelError(name, f"{value!r} m is not a non-negative finite length; expected >= 0")


def _require(cond: bool, name: str, message: str) -> None:
    if not cond:
        raise ModelError(name, message)


def _check_flanged(shape: "ISection | Channel | Tee", flanges: int, fillets_across: int) -> None:
    """Validate b, h, tf, tw, r of a shape with ``flanges`` flanges and
    ``fillets_across`` root fillets beside the web on each flange."""
    for name in ("b", "h", "tf", "tw"):
        _positive(name, getattr(shape, name))
    _non_negative("r", shape.r)
    b, h, tf, tw, r = shape.b, shape.h, shape.tf, shape.tw, shape.r
    _require(flanges * tf < h, "tf", f"{flanges} x tf = {flanges * tf:g} m is not below h = {h:g} m")
    _require(tw < b, "tw", f"{tw:g} m is not below b = {b:g} m")
    _require(tw + fillets_across * r <= b, "r", f"fillets {r:g} m do not fit beside the web on b = {b:g} m")
    _require(flanges * (tf + r) <= h, "r", f"fillets {r:g} m do not fit in the web depth of h = {h:g} m")


class _Shape(abc.ABC):
    """Common machinery; subclasses provide ``_region`` and ``torsion_constant``."""

    __slots__ = ()
    kind: ClassVar[str] = ""

    @abc.abstractmethod
    def _region(self) -> _Region:
        """The outline of the section (exact lines and arcs)."""

    @abc.abstractmethod
    def torsion_constant(self) -> float:
        """St Venant torsion constant J [m^4]."""

    # -- basic integrals ----------------------------------------------------
    def _moments(self) -> tuple[float, float, float, float, float, float]:
        """A, y_c, z_c, I_yy, I_zz, I_yz (centroidal)."""
        reg = self._region()
        u, v, w = reg.nodes()
        A = float(np.sum(w * u))
        Sy = float(np.sum(w * u * u / 2.0))  # integral y dA
        Sz = float(np.sum(w * u * v))  # integral z dA
        yc, zc = Sy / A, Sz / A
        reg = reg.in_frame(yc, zc, 0.0)
        u, v, w = reg.nodes()
        Izz = float(np.sum(w * u**3 / 3.0))
        Iyy = float(np.sum(w * u * v * v))
        Iyz = float(np.sum(w * u * u * v / 2.0))
        return A, yc, zc, Iyy, Izz, Iyz

    def _principal(self) -> tuple[float, float, float, float, float, float, float, float, float]:
        A, yc, zc, Iyy, Izz, Iyz = self._moments()
        mean = 0.5 * (Iyy + Izz)
        half = 0.5 * (Iyy - Izz)
        R = math.hypot(half, Iyz)
        tol = 1e-12 * (abs(Iyy) + abs(Izz))
        if abs(Iyz) <= tol:
            Iyz = 0.0
        if Iyz == 0.0 and abs(half) <= tol:
            theta = 0.0  # every axis is principal
        else:
            theta = 0.5 * math.atan2(-Iyz, half) + 0.0
            if theta <= -0.5 * math.pi:
                theta += math.pi
        return A, yc, zc, Iyy, Izz, Iyz, mean + R, max(mean - R, 0.0), theta

    def _frame(self, axis: Axis) -> _Region:
        """Region in (u, v): u along the bending axis, v the fibre distance."""
        _, yc, zc, *_, theta = self._principal()
        if axis == "major":
            return self._region().in_frame(yc, zc, theta)
        if axis == "minor":
            return self._region().in_frame(yc, zc, theta - 0.5 * math.pi)
        raise ModelError("axis", f"{axis!r} is not a bending axis; expected 'major' or 'minor'")

    def _plastic(self, axis: Axis) -> tuple[float, float]:
        reg = self._frame(axis)
        _, _, vmin, vmax = reg.extent()
        u, v, w = reg.nodes()
        A = float(np.sum(w * u))

        def excess(vp: float) -> float:
            uu, vv, ww = reg.nodes(v_breaks=(vp,))
            return float(np.sum(ww * uu * np.sign(vv - vp))) / A

        if abs(excess(0.0)) < 1e-13:
            vp = 0.0
        else:
            from scipy.optimize import brentq  # imported here: keeps `import fea` fast

            vp = brentq(excess, vmin, vmax, xtol=1e-15 * (vmax - vmin), rtol=1e-15, maxiter=200)
        uu, vv, ww = reg.nodes(v_breaks=(vp,))
        return float(np.sum(ww * uu * np.abs(vv - vp))), vp

    # -- public -------------------------------------------------------------
    def properties(self) -> SectionProperties:
        """All geometric properties of the section.

        Returns
        -------
        SectionProperties
            See :class:`SectionProperties` for the fields and conventions.
        """
        A, yc, zc, Iyy, Izz, Iyz, I1, I2, theta = self._principal()
        _, _, qmin, qmax = self._frame("major").extent()
        _, _, pmin, pmax = self._frame("minor").extent()
        Wpl1, pna1 = self._plastic("major")
        Wpl2, pna2 = self._plastic("minor")
        return SectionProperties(
            area=A,
            y_c=yc,
            z_c=zc,
            I_yy=Iyy,
            I_zz=Izz,
            I_yz=Iyz,
            I_major=I1,
            I_minor=I2,
            theta=theta,
            r_major=math.sqrt(I1 / A),
            r_minor=math.sqrt(I2 / A),
            e_major_pos=qmax,
            e_major_neg=-qmin,
            e_minor_pos=pmax,
            e_minor_neg=-pmin,
            W_el_major=I1 / max(qmax, -qmin),
            W_el_minor=I2 / max(pmax, -pmin),
            W_pl_major=Wpl1,
            W_pl_minor=Wpl2,
            pna_major=pna1,
            pna_minor=pna2,
            J=self.torsion_constant(),
        )

    def _fibre_grid(self, axis: Axis, n: int) -> tuple[list[float], list[float] | None, Callable | None]:
        """Strip edges along v, optional cell edges along u and a flange test.

        The default is ``n`` equal strips across the depth, one cell each.
        """
        reg = self._frame(axis)
        _, _, vmin, vmax = reg.extent()
        return list(np.linspace(vmin, vmax, n + 1)), None, None

    def fibres(self, axis: Axis = "major", n: int = 40) -> FibreSet:
        """Fibres for bending about a principal axis.

        The section is cut into ``n`` strips of equal thickness parallel to
        the bending axis (I sections: plus strip edges at the flange/web
        boundaries, and flange strips split across the flange width, see
        :meth:`ISection.fibres`).  Each fibre is the exact part of the section
        inside its cell; it is placed at the exact centroid of that part.
        Areas therefore sum to the section area, and ``sum(A_i y_i^2)``
        underestimates ``I`` only by the fibres' own second moments
        (about 1/n^2 relative for a solid rectangle).

        Parameters
        ----------
        axis : {"major", "minor"}
            Principal axis of bending.
        n : int
            Number of strips across the depth (>= 2).

        Returns
        -------
        FibreSet
        """
        if not (isinstance(n, int) and n >= 2):
            raise ModelError("n", f"{n!r} fibres is too few; expected an integer >= 2")
        reg = self._frame(axis)
        v_edges, u_edges, flange_of = self._fibre_grid(axis, n)
        v_edges = sorted(set(v_edges))
        umin, umax, _, _ = reg.extent()
        u_cells = sorted(set(u_edges)) if u_edges is not None else [umin, umax]
        u, v, w = reg.nodes(u_breaks=u_cells[1:-1], v_breaks=v_edges[1:-1])
        v_lo, v_hi = np.array(v_edges[:-1]), np.array(v_edges[1:])
        u_lo, u_hi = np.array(u_cells[:-1]), np.array(u_cells[1:])
        inside_v = (v[None, :] > v_lo[:, None]) & (v[None, :] < v_hi[:, None])  # (nv, nodes)
        # cell integrals: Q = G(u) f(v), G = integral of the indicator of [u_lo, u_hi]
        a = np.empty((len(v_lo), len(u_lo)))
        sv = np.empty_like(a)
        su = np.empty_like(a)
        for j in range(len(u_lo)):
            uc = np.clip(u, u_lo[j], u_hi[j])
            G = uc - u_lo[j]
            H = 0.5 * (uc**2 - u_lo[j] ** 2)
            a[:, j] = (inside_v * (w * G)).sum(axis=1)
            sv[:, j] = (inside_v * (w * G * v)).sum(axis=1)
            su[:, j] = (inside_v * (w * H)).sum(axis=1)
        ys, xs, As, ss = [], [], [], []
        tiny = 1e-14 * (umax - umin)
        for i in range(len(v_lo)):
            web = [0.0, 0.0, 0.0]  # non-flange cells of this strip are merged
            for j in range(len(u_lo)):
                if a[i, j] <= tiny * (v_hi[i] - v_lo[i]):
                    continue
                yc, xc = sv[i, j] / a[i, j], su[i, j] / a[i, j]
                s = flange_of(xc, yc) if flange_of else math.nan
                if math.isnan(s):
                    web[0] += a[i, j]
                    web[1] += sv[i, j]
                    web[2] += su[i, j]
                else:
                    ys.append(yc)
                    xs.append(xc)
                    As.append(a[i, j])
                    ss.append(s)
            if web[0] > 0.0:
                ys.append(web[1] / web[0])
                xs.append(web[2] / web[0])
                As.append(web[0])
                ss.append(math.nan)
        return FibreSet(axis, np.array(ys), np.array(xs), np.array(As), np.array(ss, dtype=float))


def _rect_torsion(a: float, b: float, terms: int = 50) -> float:
    """Exact St Venant constant of a solid a x b rectangle (series solution).

    J = (b t^3 / 3) [1 - (192 t / (pi^5 b)) sum_{k odd} tanh(k pi b / (2 t)) / k^5],
    t = min(a, b), b = max(a, b).
    """
    t, b_ = min(a, b), max(a, b)
    k = np.arange(1, 2 * terms, 2, dtype=float)
    s = float(np.sum(np.tanh(k * math.pi * b_ / (2.0 * t)) / k**5))
    return b_ * t**3 / 3.0 * (1.0 - 192.0 * t / (math.pi**5 * b_) * s)


# --------------------------------------------------------------------------
# Shapes
# --------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class Rectangle(_Shape):
    """Solid rectangle, width ``b`` (along y) and depth ``h`` (along z) [m]."""

    b: float
    h: float
    kind: ClassVar[str] = "rectangle"

    def __post_init__(self) -> None:
        _positive("b", self.b)
        _positive("h", self.h)

    def _region(self) -> _Region:
        b, h = self.b, self.h
        return _Region(tuple(_rounded_polygon([(0, 0), (b, 0), (b, h), (0, h)], [0] * 4, "b")))

    def torsion_constant(self) -> float:
        """Exact series solution for a solid rectangle [m^4] (St Venant)."""
        return _rect_torsion(self.b, self.h)


@dataclass(frozen=True, slots=True)
class Round(_Shape):
    """Solid circle of diameter ``d`` [m]."""

    d: float
    kind: ClassVar[str] = "round"

    def __post_init__(self) -> None:
        _positive("d", self.d)

    def _region(self) -> _Region:
        R = 0.5 * self.d
        return _Region(tuple(_circle(R, R, R)))

    def torsion_constant(self) -> float:
        """pi d^4 / 32 [m^4] (exact)."""
        return math.pi * self.d**4 / 32.0


@dataclass(frozen=True, slots=True)
class CircularHollow(_Shape):
    """Circular hollow section: outer diameter ``d`` and either wall ``t`` or
    inner diameter ``d_inner`` [m] (exactly one of them)."""

    d: float
    t: float | None = None
    d_inner: float | None = None
    kind: ClassVar[str] = "circular_hollow"

    def __post_init__(self) -> None:
        _positive("d", self.d)
        if (self.t is None) == (self.d_inner is None):
            raise ModelError("t", "give exactly one of t (wall thickness) and d_inner (inner diameter)")
        if self.t is None:
            _positive("d_inner", self.d_inner)  # type: ignore[arg-type]
            _require(self.d_inner < self.d, "d_inner", f"{self.d_inner:g} m is not below d = {self.d:g} m")  # type: ignore[operator]
            object.__setattr__(self, "t", 0.5 * (self.d - self.d_inner))  # type: ignore[operator]
        else:
            _positive("t", self.t)
            _require(self.t < 0.5 * self.d, "t", f"{self.t:g} m is not below d/2 = {0.5 * self.d:g} m; use Round")
            object.__setattr__(self, "d_inner", self.d - 2.0 * self.t)

    def _region(self) -> _Region:
        R, Ri = 0.5 * self.d, 0.5 * self.d_inner  # type: ignore[operator]
        return _Region(tuple(_circle(R, R, R) + _circle(R, R, Ri, ccw=False)))

    def torsion_constant(self) -> float:
        """pi (d^4 - d_inner^4) / 32 [m^4] (exact for a circular tube)."""
        return math.pi * (self.d**4 - self.d_inner**4) / 32.0  # type: ignore[operator]


@dataclass(frozen=True, slots=True)
class RectangularHollow(_Shape):
    """Rectangular (square when b == h) hollow section [m].

    ``r_out`` is the outer corner radius; the inner corner radius is
    ``max(r_out - t, 0)``.
    """

    b: float
    h: float
    t: float
    r_out: float = 0.0
    kind: ClassVar[str] = "rectangular_hollow"

    def __post_init__(self) -> None:
        _positive("b", self.b)
        _positive("h", self.h)
        _positive("t", self.t)
        _non_negative("r_out", self.r_out)
        _require(2.0 * self.t < min(self.b, self.h), "t", f"{self.t:g} m leaves no hole in {self.b:g} x {self.h:g} m")
        _require(2.0 * self.r_out <= min(self.b, self.h), "r_out", f"{self.r_out:g} m exceeds half of min(b, h)")

    @property
    def r_in(self) -> float:
        """Inner corner radius [m]."""
        return max(self.r_out - self.t, 0.0)

    def _region(self) -> _Region:
        b, h, t = self.b, self.h, self.t
        outer = _rounded_polygon([(0, 0), (b, 0), (b, h), (0, h)], [self.r_out] * 4, "r_out")
        inner = _rounded_polygon([(t, t), (t, h - t), (b - t, h - t), (b - t, t)], [self.r_in] * 4, "r_out")
        return _Region(tuple(outer + inner))

    def torsion_constant(self) -> float:
        """Bredt's thin-walled formula plus the wall's own St Venant term [m^4].

        ``J = 4 A_m^2 t / p_m + p_m t^3 / 3`` with the mid-line corner radius
        ``r_m = max(r_out - t/2, 0)``, enclosed mid-line area
        ``A_m = (b - t)(h - t) - (4 - pi) r_m^2`` and mid-line perimeter
        ``p_m = 2(b - t) + 2(h - t) - (8 - 2 pi) r_m``.
        """
        t = self.t
        rm = max(self.r_out - 0.5 * t, 0.0)
        Am = (self.b - t) * (self.h - t) - (4.0 - math.pi) * rm**2
        pm = 2.0 * (self.b - t) + 2.0 * (self.h - t) - (8.0 - 2.0 * math.pi) * rm
        return 4.0 * Am**2 * t / pm + pm * t**3 / 3.0


@dataclass(frozen=True, slots=True)
class ISection(_Shape):
    """Doubly symmetric I or H section [m].

    Flange width ``b``, overall depth ``h``, flange thickness ``tf``, web
    thickness ``tw`` and root fillet radius ``r`` (four fillets at the
    web-flange junctions).  The web is vertical (along z), so ``y-y`` is the
    major axis.
    """

    b: float
    h: float
    tf: float
    tw: float
    r: float = 0.0
    kind: ClassVar[str] = "i_section"

    def __post_init__(self) -> None:
        _check_flanged(self, flanges=2, fillets_across=2)

    def _region(self) -> _Region:
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        c = 0.5 * b
        pts = [
            (0, 0), (b, 0), (b, tf), (c + tw / 2, tf), (c + tw / 2, h - tf), (b, h - tf),
            (b, h), (0, h), (0, h - tf), (c - tw / 2, h - tf), (c - tw / 2, tf), (0, tf),
        ]  # fmt: skip
        radii = [0, 0, 0, r, r, 0, 0, 0, 0, r, r, 0]
        return _Region(tuple(_rounded_polygon(pts, radii, "r")))

    def torsion_constant(self) -> float:
        """Rolled-section formula with fillets (El Darwish & Johnston, 1965) [m^4].

        ``J = 2/3 b tf^3 + 1/3 (h - 2 tf) tw^3 + 2 alpha_1 D_1^4 - 0.420 tf^4``,
        ``alpha_1 = -0.042 + 0.2204 tw/tf + 0.1355 r/tf - 0.0865 r tw/tf^2
        - 0.0725 tw^2/tf^2``, ``D_1 = ((tf + r)^2 + tw (r + tw/4)) / (2 r + tf)``
        (formula from memory; checked against a finite-element solution in the
        tests).  ``-0.420 tf^4`` is the free-end correction of the four flange
        tips, ``2 alpha_1 D_1^4`` the two web-flange junctions.
        """
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        a1 = -0.042 + 0.2204 * tw / tf + 0.1355 * r / tf - 0.0865 * r * tw / tf**2 - 0.0725 * tw**2 / tf**2
        D1 = ((tf + r) ** 2 + tw * (r + tw / 4.0)) / (2.0 * r + tf)
        return 2.0 / 3.0 * b * tf**3 + (h - 2.0 * tf) * tw**3 / 3.0 + 2.0 * a1 * D1**4 - 0.420 * tf**4

    def _fibre_grid(self, axis: Axis, n: int) -> tuple[list[float], list[float] | None, Callable | None]:
        b, h, tf, tw = self.b, self.h, self.tf, self.tw
        zi = 0.5 * h - tf  # flange inner face, from the centroid
        if axis not in ("major", "minor"):
            raise ModelError("axis", f"{axis!r} is not a bending axis; expected 'major' or 'minor'")
        theta = self._principal()[-1]
        about_y = (abs(theta) < 0.25 * math.pi) == (axis == "major")
        # In the bending frame |v| and |u| are distances from the centroidal
        # axes (the section is doubly symmetric), so only the roles matter.
        if about_y:
            # strips through the depth (v ~ z), flanges split across the width
            v_edges = list(np.linspace(-0.5 * h, 0.5 * h, n + 1)) + [-zi, zi]
            m = max(2, n // 4)
            m += m % 2
            u_edges = list(np.linspace(-0.5 * b, 0.5 * b, m + 1)) + [0.0, -0.5 * tw, 0.5 * tw]

            def flange_of(x: float, y: float) -> float:
                return 2.0 * abs(x) / b if abs(y) > zi else math.nan

            return v_edges, u_edges, flange_of
        # strips across the flange width (v ~ y), split at the flange inner faces
        v_edges = list(np.linspace(-0.5 * b, 0.5 * b, n + 1)) + [0.0, -0.5 * tw, 0.5 * tw]
        u_edges = [-0.5 * h, -zi, zi, 0.5 * h]

        def flange_of(x: float, y: float) -> float:
            return 2.0 * abs(y) / b if abs(x) > zi else math.nan

        return v_edges, u_edges, flange_of

    def fibres(self, axis: Axis = "major", n: int = 40) -> FibreSet:
        """Fibres for bending about a principal axis, resolving the flanges.

        * ``axis="major"``: ``n`` equal strips through the depth plus strip
          edges at the flange inner faces; flange strips are split across the
          width into ``m = max(2, n // 4)`` (rounded up to even) equal cells
          and at the web faces and centre line; web strips are one fibre each
          (web plus fillets).
        * ``axis="minor"``: ``n`` equal strips across the flange width (plus
          edges at the web faces and centre line), each split at the flange
          inner faces into top flange, web zone and bottom flange fibres.

        ``flange_s`` is set for fibres in the two full-width flange rectangles
        (``|z - z_c| > h/2 - tf``); fillets count as web.  Use
        :meth:`FibreSet.residual_ratio` for the linear flange pattern.
        """
        return _Shape.fibres(self, axis, n)


def _open_sum(parts: Sequence[tuple[float, float, int]]) -> float:
    """Thin-walled open-section sum with the classical free-end correction.

    Each part is ``(L, t, free_ends)``: ``L t^3 / 3 - 0.105 t^4`` per free end
    (the long-rectangle expansion of the exact series, which gives
    ``b t^3 / 3 - 0.21 t^4`` for a rectangle with two free ends).
    """
    return sum(L * t**3 / 3.0 - 0.105 * k * t**4 for L, t, k in parts)


@dataclass(frozen=True, slots=True)
class Channel(_Shape):
    """Parallel-flange channel [m]: flange width ``b`` (web back at y = 0,
    toes at y = b), depth ``h``, flange thickness ``tf``, web thickness
    ``tw``, root fillet radius ``r``."""

    b: float
    h: float
    tf: float
    tw: float
    r: float = 0.0
    kind: ClassVar[str] = "channel"

    def __post_init__(self) -> None:
        _check_flanged(self, flanges=2, fillets_across=1)

    def _region(self) -> _Region:
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        pts = [(0, 0), (b, 0), (b, tf), (tw, tf), (tw, h - tf), (b, h - tf), (b, h), (0, h)]
        return _Region(tuple(_rounded_polygon(pts, [0, 0, 0, r, r, 0, 0, 0], "r")))

    def torsion_constant(self) -> float:
        """Thin-walled open-section sum [m^4], fillets and junctions neglected.

        ``J = 2 (b tf^3 / 3 - 0.105 tf^4) + (h - 2 tf) tw^3 / 3``: flanges
        over the full width with one free end each, web between the flanges.
        Neglecting the fillets makes it conservative (a few per cent below a
        finite-element solution for rolled proportions, see the tests).
        """
        return _open_sum([(self.b, self.tf, 1), (self.b, self.tf, 1), (self.h - 2 * self.tf, self.tw, 0)])


@dataclass(frozen=True, slots=True)
class Angle(_Shape):
    """Angle [m]: horizontal leg ``b`` (along y), vertical leg ``d`` (along z),
    thickness ``t``, root fillet radius ``r``; heel at the origin.  Equal
    angle when ``b == d``."""

    b: float
    d: float
    t: float
    r: float = 0.0
    kind: ClassVar[str] = "angle"

    def __post_init__(self) -> None:
        for name in ("b", "d", "t"):
            _positive(name, getattr(self, name))
        _non_negative("r", self.r)
        _require(self.t < min(self.b, self.d), "t", f"{self.t:g} m is not below the shorter leg")
        _require(self.t + self.r <= min(self.b, self.d), "r", f"fillet {self.r:g} m does not fit on the legs")

    def _region(self) -> _Region:
        b, d, t, r = self.b, self.d, self.t, self.r
        pts = [(0, 0), (b, 0), (b, t), (t, t), (t, d), (0, d)]
        return _Region(tuple(_rounded_polygon(pts, [0, 0, 0, r, 0, 0], "r")))

    def torsion_constant(self) -> float:
        """Thin-walled open-section sum [m^4], fillet and junction neglected.

        ``J = (b t^3 / 3 - 0.105 t^4) + ((d - t) t^3 / 3 - 0.105 t^4)``: the
        horizontal leg over its full length and the vertical leg above it,
        each with one free end.  Neglecting the root fillet makes it
        conservative (below a finite-element solution, see the tests).
        """
        return _open_sum([(self.b, self.t, 1), (self.d - self.t, self.t, 1)])


@dataclass(frozen=True, slots=True)
class Tee(_Shape):
    """Tee [m]: flange width ``b`` at the top, overall depth ``h``, flange
    thickness ``tf``, stem thickness ``tw``, root fillet radius ``r``."""

    b: float
    h: float
    tf: float
    tw: float
    r: float = 0.0
    kind: ClassVar[str] = "tee"

    def __post_init__(self) -> None:
        _check_flanged(self, flanges=1, fillets_across=2)

    def _region(self) -> _Region:
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        c = 0.5 * b
        pts = [(c - tw / 2, 0), (c + tw / 2, 0), (c + tw / 2, h - tf), (b, h - tf), (b, h), (0, h),
               (0, h - tf), (c - tw / 2, h - tf)]  # fmt: skip
        return _Region(tuple(_rounded_polygon(pts, [0, 0, r, 0, 0, 0, 0, r], "r")))

    def torsion_constant(self) -> float:
        """Open-section sum plus a junction term for the fillets [m^4].

        ``J = (b tf^3 / 3 - 0.21 tf^4) + ((h - tf) tw^3 / 3 - 0.105 tw^4)
        + alpha D^4`` with ``alpha = (t_min / t_max)(0.15 + 0.10 r / tf)``
        (``t_min, t_max`` the smaller and larger of tf, tw) and the inscribed
        junction diameter ``D = ((tf + r)^2 + r tw + tw^2 / 4) / (2 r + tf)``:
        the T-section form of Roark's formulas for torsion of rolled sections
        (from memory; checked against a finite-element solution in the tests).
        """
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        alpha = (min(tf, tw) / max(tf, tw)) * (0.15 + 0.10 * r / tf)
        D = ((tf + r) ** 2 + r * tw + tw**2 / 4.0) / (2.0 * r + tf)
        return _open_sum([(b, tf, 2), (h - tf, tw, 1)]) + alpha * D**4


SHAPES: dict[str, type[_Shape]] = {
    "rectangle": Rectangle,
    "round": Round,
    "rectangular_hollow": RectangularHollow,
    "circular_hollow": CircularHollow,
    "i_section": ISection,
    "channel": Channel,
    "angle": Angle,
    "tee": Tee,
}
"""Shape classes by name, for building a shape from a case file:
``SHAPES[name](**dimensions_in_metres)``."""
