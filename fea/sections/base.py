"""The abstract section shape and the records it computes: properties and fibres.

A shape subclass supplies its exact outline (:meth:`Shape._region`, see
:mod:`fea.sections.geometry`) and its St Venant torsion constant; this class
computes everything else from the outline.  Conventions (axes, principal angle)
are stated in :mod:`fea.sections`.
"""

from __future__ import annotations

import abc
import functools
import math
import numbers
from dataclasses import dataclass
from typing import Callable, ClassVar, Literal

import numpy as np

from fea.errors import ModelError

from .geometry import Region
from .thinwall import OpenProfile, TorsionConstants

__all__ = ["Axis", "SectionProperties", "FibreSet", "Shape", "positive", "non_negative", "require"]

Axis = Literal["major", "minor"]


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
            raise ModelError("fibres", "this fibre set has no flange fibres; the linear flange pattern needs an "
                                       "I section")
        s = np.where(flange, self.flange_s, 0.0)
        P = float(np.sum(self.area[flange] * s[flange]))
        gamma = beta * P / (float(np.sum(self.area)) - P)
        return np.where(flange, -gamma + (beta + gamma) * s, -gamma)



# --------------------------------------------------------------------------
# Shape base class
# --------------------------------------------------------------------------


def positive(name: str, value: float) -> None:
    if not (isinstance(value, numbers.Real) and math.isfinite(value) and value > 0.0):
        raise ModelError(name, f"{value!r} m is not a positive finite length; expected a dimension > 0")


def non_negative(name: str, value: float) -> None:
    if not (isinstance(value, numbers.Real) and math.isfinite(value) and value >= 0.0):
        raise ModelError(name, f"{value!r} m is not a non-negative finite length; expected >= 0")


def require(cond: bool, name: str, message: str) -> None:
    if not cond:
        raise ModelError(name, message)



class Shape(abc.ABC):
    """Common machinery; subclasses provide ``_region`` and ``torsion_constant``."""

    __slots__ = ()
    kind: ClassVar[str] = ""

    @abc.abstractmethod
    def _region(self) -> Region:
        """The outline of the section (exact lines and arcs)."""

    @abc.abstractmethod
    def torsion_constant(self) -> float:
        """St Venant torsion constant J [m^4]."""

    def midline(self) -> OpenProfile | None:
        """The thin-walled mid-line model of an open shape, ``None`` for solid and closed shapes."""
        return None

    def _warping(self) -> tuple[float, float, float]:
        """Warping constant I_w [m^6] and the shear centre (y, z) [m] in the shape's coordinates.

        Open shapes: the thin-walled integration of :meth:`midline`
        (:mod:`fea.sections.thinwall`), primary plus secondary warping.  Solid
        and closed shapes: ``I_w = 0`` (neglected; their warping resistance is
        negligible next to ``G J``) and the shear centre at the centroid, as
        for every doubly symmetric section.
        """
        prof = self.midline()
        if prof is None:
            _, yc, zc, *_ = self._moments()
            return 0.0, yc, zc
        r = prof.analyse()
        return r.I_w, r.y_s, r.z_s

    def torsion(self) -> TorsionConstants:
        """Torsion, warping and shear-centre constants of the section (SI).

        ``J`` is :meth:`torsion_constant`; ``I_w`` and the shear centre come
        from :meth:`_warping`; the Wagner integral ``integral q (p^2 + q^2) dA``
        of ``beta_major`` is integrated exactly over the outline (fillets
        included).  Axes and signs: :class:`~fea.sections.thinwall.TorsionConstants`.

        Returns
        -------
        TorsionConstants
        """
        A, yc, zc, _, _, _, I1, I2, theta = self._principal()
        Iw, ys, zs = self._warping()
        ct, st = math.cos(theta), math.sin(theta)
        dy, dz = ys - yc, zs - zc
        y0, z0 = dy * ct + dz * st, -dy * st + dz * ct
        scale = math.sqrt(A)
        y0 = 0.0 if abs(y0) < 1e-12 * scale else y0
        z0 = 0.0 if abs(z0) < 1e-12 * scale else z0
        u, v, w = self._frame("major").nodes()
        # integral over the region of v (u^2 + v^2) dA = closed integral of (u^3 v / 3 + u v^3) dv
        wagner = float(np.sum(w * (u**3 * v / 3.0 + u * v**3)))
        beta = wagner / I1 - 2.0 * z0
        beta = 0.0 if abs(beta) < 1e-10 * scale else beta
        return TorsionConstants(J=self.torsion_constant(), I_w=Iw, y0=y0, z0=z0,
                                i0=math.sqrt((I1 + I2) / A + y0**2 + z0**2), beta_major=beta)

    def _check_lengths(self, *names: str, optional: tuple[str, ...] = ()) -> None:
        """Each of ``names`` is a positive length, each of ``optional`` a non-negative one."""
        for name in names:
            positive(name, getattr(self, name))
        for name in optional:
            non_negative(name, getattr(self, name))

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

    def _frame(self, axis: Axis) -> Region:
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
        """All geometric properties of the section (computed once per distinct shape: shapes are immutable and
        compare by their dimensions, and the result is immutable).

        Returns
        -------
        SectionProperties
            See :class:`SectionProperties` for the fields and conventions.
        """
        return _properties_of(self)

    def _properties(self) -> SectionProperties:
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


@functools.lru_cache(maxsize=512)
def _properties_of(shape: Shape) -> SectionProperties:
    """:meth:`Shape.properties`, remembered per shape (the design check, the imperfect-column analysis and the
    design actions each ask for the same section's properties)."""
    return shape._properties()
