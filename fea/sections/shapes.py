"""The concrete section shapes, each a frozen, validated dataclass of dimensions in metres.

A shape states its outline (:mod:`fea.sections.geometry`) and its torsion
constant; :class:`fea.sections.base.Shape` computes the rest.  :data:`SHAPES`
names them for the case file.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Callable, ClassVar, Sequence

import numpy as np

from fea.errors import ModelError

from .base import Axis, FibreSet, Shape, positive, require
from .geometry import Region, circle, rounded_polygon
from .thinwall import OpenProfile

__all__ = ["FlangedShape", "Rectangle", "Round", "RectangularHollow", "CircularHollow", "ISection", "Channel",
           "Angle", "Tee", "Cruciform", "SHAPES"]


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
class Rectangle(Shape):
    """Solid rectangle, width ``b`` (along y) and depth ``h`` (along z) [m]."""

    b: float
    h: float
    kind: ClassVar[str] = "rectangle"

    def __post_init__(self) -> None:
        self._check_lengths("b", "h")

    def _region(self) -> Region:
        b, h = self.b, self.h
        return Region(tuple(rounded_polygon([(0, 0), (b, 0), (b, h), (0, h)], [0] * 4, "b")))

    def torsion_constant(self) -> float:
        """Exact series solution for a solid rectangle [m^4] (St Venant)."""
        return _rect_torsion(self.b, self.h)


@dataclass(frozen=True, slots=True)
class Round(Shape):
    """Solid circle of diameter ``d`` [m]."""

    d: float
    kind: ClassVar[str] = "round"

    def __post_init__(self) -> None:
        self._check_lengths("d")

    def _region(self) -> Region:
        R = 0.5 * self.d
        return Region(tuple(circle(R, R, R)))

    def torsion_constant(self) -> float:
        """pi d^4 / 32 [m^4] (exact)."""
        return math.pi * self.d**4 / 32.0


@dataclass(frozen=True, slots=True)
class CircularHollow(Shape):
    """Circular hollow section: outer diameter ``d`` and either wall ``t`` or
    inner diameter ``d_inner`` [m] (exactly one of them)."""

    d: float
    t: float | None = None
    d_inner: float | None = None
    kind: ClassVar[str] = "circular_hollow"

    def __post_init__(self) -> None:
        positive("d", self.d)
        if (self.t is None) == (self.d_inner is None):
            raise ModelError("t", "give exactly one of t (wall thickness) and d_inner (inner diameter)")
        if self.t is None:
            positive("d_inner", self.d_inner)  # type: ignore[arg-type]
            require(self.d_inner < self.d, "d_inner", f"{self.d_inner:g} m is not below d = {self.d:g} m")  # type: ignore[operator]
            object.__setattr__(self, "t", 0.5 * (self.d - self.d_inner))  # type: ignore[operator]
        else:
            positive("t", self.t)
            require(self.t < 0.5 * self.d, "t", f"{self.t:g} m is not below d/2 = {0.5 * self.d:g} m; use Round")
            object.__setattr__(self, "d_inner", self.d - 2.0 * self.t)

    def _region(self) -> Region:
        R, Ri = 0.5 * self.d, 0.5 * self.d_inner  # type: ignore[operator]
        return Region(tuple(circle(R, R, R) + circle(R, R, Ri, ccw=False)))

    def torsion_constant(self) -> float:
        """pi (d^4 - d_inner^4) / 32 [m^4] (exact for a circular tube)."""
        return math.pi * (self.d**4 - self.d_inner**4) / 32.0  # type: ignore[operator]


@dataclass(frozen=True, slots=True)
class RectangularHollow(Shape):
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
        self._check_lengths("b", "h", "t", optional=("r_out",))
        require(2.0 * self.t < min(self.b, self.h), "t", f"{self.t:g} m leaves no hole in {self.b:g} x {self.h:g} m")
        require(2.0 * self.r_out <= min(self.b, self.h), "r_out", f"{self.r_out:g} m exceeds half of min(b, h)")

    @property
    def r_in(self) -> float:
        """Inner corner radius [m]."""
        return max(self.r_out - self.t, 0.0)

    def _region(self) -> Region:
        b, h, t = self.b, self.h, self.t
        outer = rounded_polygon([(0, 0), (b, 0), (b, h), (0, h)], [self.r_out] * 4, "r_out")
        inner = rounded_polygon([(t, t), (t, h - t), (b - t, h - t), (b - t, t)], [self.r_in] * 4, "r_out")
        return Region(tuple(outer + inner))

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
class FlangedShape(Shape):
    """Common dimensions of the flanged shapes [m]: flange width ``b``, overall
    depth ``h``, flange thickness ``tf``, web thickness ``tw`` and root fillet
    radius ``r``; a subclass states how many flanges it has (``flanges``) and
    how many root fillets sit beside the web on each flange (``fillets_across``)."""

    b: float
    h: float
    tf: float
    tw: float
    r: float = 0.0
    flanges: ClassVar[int] = 2
    fillets_across: ClassVar[int] = 2

    def __post_init__(self) -> None:
        self._check_lengths("b", "h", "tf", "tw", optional=("r",))
        b, h, tf, tw, r, n = self.b, self.h, self.tf, self.tw, self.r, self.flanges
        require(n * tf < h, "tf", f"{n} x tf = {n * tf:g} m is not below h = {h:g} m")
        require(tw < b, "tw", f"{tw:g} m is not below b = {b:g} m")
        require(tw + self.fillets_across * r <= b, "r", f"fillets {r:g} m do not fit beside the web on b = {b:g} m")
        require(n * (tf + r) <= h, "r", f"fillets {r:g} m do not fit in the web depth of h = {h:g} m")


@dataclass(frozen=True, slots=True)
class ISection(FlangedShape):
    """Doubly symmetric I or H section [m].

    Flange width ``b``, overall depth ``h``, flange thickness ``tf``, web
    thickness ``tw`` and root fillet radius ``r`` (four fillets at the
    web-flange junctions).  The web is vertical (along z), so ``y-y`` is the
    major axis.
    """

    kind: ClassVar[str] = "i_section"

    def _region(self) -> Region:
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        c = 0.5 * b
        pts = [
            (0, 0), (b, 0), (b, tf), (c + tw / 2, tf), (c + tw / 2, h - tf), (b, h - tf),
            (b, h), (0, h), (0, h - tf), (c - tw / 2, h - tf), (c - tw / 2, tf), (0, tf),
        ]  # fmt: skip
        radii = [0, 0, 0, r, r, 0, 0, 0, 0, r, r, 0]
        return Region(tuple(rounded_polygon(pts, radii, "r")))

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

    def midline(self) -> OpenProfile:
        """Flange mid-lines ``b`` wide at ``tf/2`` from the faces, web between them (``h_s = h - tf``).

        Thin-walled result: shear centre at the centroid, ``I_w = I_f h_s^2 / 2``
        with ``I_f = tf b^3 / 12`` one flange (plus the small secondary term);
        fillets are left out of ``I_w``.
        """
        b, h, tf, tw = self.b, self.h, self.tf, self.tw
        z1, z2 = 0.5 * tf, h - 0.5 * tf
        return OpenProfile([(0, z1), (0.5 * b, z1), (b, z1), (0, z2), (0.5 * b, z2), (b, z2)],
                           [(0, 1, tf), (1, 2, tf), (1, 4, tw), (3, 4, tf), (4, 5, tf)])

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

        def flange_across(x: float, y: float) -> float:
            return 2.0 * abs(y) / b if abs(x) > zi else math.nan

        return v_edges, u_edges, flange_across

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
        return Shape.fibres(self, axis, n)


def _open_sum(parts: Sequence[tuple[float, float, int]]) -> float:
    """Thin-walled open-section sum with the classical free-end correction.

    Each part is ``(L, t, free_ends)``: ``L t^3 / 3 - 0.105 t^4`` per free end
    (the long-rectangle expansion of the exact series, which gives
    ``b t^3 / 3 - 0.21 t^4`` for a rectangle with two free ends).
    """
    return sum(L * t**3 / 3.0 - 0.105 * k * t**4 for L, t, k in parts)


@dataclass(frozen=True, slots=True)
class Channel(FlangedShape):
    """Parallel-flange channel [m]: flange width ``b`` (web back at y = 0,
    toes at y = b), depth ``h``, flange thickness ``tf``, web thickness
    ``tw``, root fillet radius ``r``."""

    kind: ClassVar[str] = "channel"
    fillets_across: ClassVar[int] = 1

    def _region(self) -> Region:
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        pts = [(0, 0), (b, 0), (b, tf), (tw, tf), (tw, h - tf), (b, h - tf), (b, h), (0, h)]
        return Region(tuple(rounded_polygon(pts, [0, 0, 0, r, r, 0, 0, 0], "r")))

    def torsion_constant(self) -> float:
        """Thin-walled open-section sum [m^4], fillets and junctions neglected.

        ``J = 2 (b tf^3 / 3 - 0.105 tf^4) + (h - 2 tf) tw^3 / 3``: flanges
        over the full width with one free end each, web between the flanges.
        Neglecting the fillets makes it conservative (a few per cent below a
        finite-element solution for rolled proportions, see the tests).
        """
        return _open_sum([(self.b, self.tf, 1), (self.b, self.tf, 1), (self.h - 2 * self.tf, self.tw, 0)])

    def midline(self) -> OpenProfile:
        """Web mid-line at ``y = tw/2`` between the flange mid-lines (``h_s = h - tf``), flanges
        ``b - tw/2`` long from it.  Thin-walled shear centre on the axis of symmetry at
        ``e = 3 b_s^2 tf / (6 b_s tf + h_s tw)`` behind the web mid-line, ``b_s = b - tw/2``."""
        b, h, tf, tw = self.b, self.h, self.tf, self.tw
        y1, z1, z2 = 0.5 * tw, 0.5 * tf, h - 0.5 * tf
        return OpenProfile([(b, z1), (y1, z1), (y1, z2), (b, z2)], [(0, 1, tf), (1, 2, tw), (2, 3, tf)])


@dataclass(frozen=True, slots=True)
class Angle(Shape):
    """Angle [m]: horizontal leg ``b`` (along y), vertical leg ``d`` (along z),
    thickness ``t``, root fillet radius ``r``; heel at the origin.  Equal
    angle when ``b == d``."""

    b: float
    d: float
    t: float
    r: float = 0.0
    kind: ClassVar[str] = "angle"

    def __post_init__(self) -> None:
        self._check_lengths("b", "d", "t", optional=("r",))
        require(self.t < min(self.b, self.d), "t", f"{self.t:g} m is not below the shorter leg")
        require(self.t + self.r <= min(self.b, self.d), "r", f"fillet {self.r:g} m does not fit on the legs")

    def _region(self) -> Region:
        b, d, t, r = self.b, self.d, self.t, self.r
        pts = [(0, 0), (b, 0), (b, t), (t, t), (t, d), (0, d)]
        return Region(tuple(rounded_polygon(pts, [0, 0, 0, r, 0, 0], "r")))

    def torsion_constant(self) -> float:
        """Thin-walled open-section sum [m^4], fillet and junction neglected.

        ``J = (b t^3 / 3 - 0.105 t^4) + ((d - t) t^3 / 3 - 0.105 t^4)``: the
        horizontal leg over its full length and the vertical leg above it,
        each with one free end.  Neglecting the root fillet makes it
        conservative (below a finite-element solution, see the tests).
        """
        return _open_sum([(self.b, self.t, 1), (self.d - self.t, self.t, 1)])

    def midline(self) -> OpenProfile:
        """Leg mid-lines from the corner ``(t/2, t/2)`` to the toes.  Thin-walled shear centre at
        that corner; the primary warping vanishes and ``I_w = t^3 (b_s^3 + d_s^3) / 36`` with the
        mid-line leg lengths ``b_s = b - t/2``, ``d_s = d - t/2`` (secondary warping)."""
        b, d, t = self.b, self.d, self.t
        c = 0.5 * t
        return OpenProfile([(b, c), (c, c), (c, d)], [(0, 1, t), (1, 2, t)])


@dataclass(frozen=True, slots=True)
class Tee(FlangedShape):
    """Tee [m]: flange width ``b`` at the top, overall depth ``h``, flange
    thickness ``tf``, stem thickness ``tw``, root fillet radius ``r``."""

    kind: ClassVar[str] = "tee"
    flanges: ClassVar[int] = 1

    def _region(self) -> Region:
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        c = 0.5 * b
        pts = [(c - tw / 2, 0), (c + tw / 2, 0), (c + tw / 2, h - tf), (b, h - tf), (b, h), (0, h),
               (0, h - tf), (c - tw / 2, h - tf)]  # fmt: skip
        return Region(tuple(rounded_polygon(pts, [0, 0, r, 0, 0, 0, 0, r], "r")))

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

    def midline(self) -> OpenProfile:
        """Flange mid-line ``b`` wide at ``h - tf/2``, stem from there to the stem's end.  Thin-walled
        shear centre where they meet; the primary warping vanishes and
        ``I_w = tf^3 b^3 / 144 + tw^3 h_s^3 / 36``, ``h_s = h - tf/2`` (secondary warping)."""
        b, h, tf, tw = self.b, self.h, self.tf, self.tw
        z1 = h - 0.5 * tf
        return OpenProfile([(0, z1), (0.5 * b, z1), (b, z1), (0.5 * b, 0)], [(0, 1, tf), (1, 2, tf), (1, 3, tw)])


@dataclass(frozen=True, slots=True)
class Cruciform(Shape):
    """Cruciform of two crossing plates [m]: a horizontal plate ``b`` wide (along y) and ``tf``
    thick, a vertical plate ``h`` deep (along z) and ``tw`` thick, crossing at their centres, with
    root fillet radius ``r`` at the four re-entrant corners."""

    b: float
    h: float
    tf: float
    tw: float
    r: float = 0.0
    kind: ClassVar[str] = "cruciform"

    def __post_init__(self) -> None:
        self._check_lengths("b", "h", "tf", "tw", optional=("r",))
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        require(tf < h, "tf", f"{tf:g} m is not below h = {h:g} m")
        require(tw < b, "tw", f"{tw:g} m is not below b = {b:g} m")
        require(tw + 2.0 * r <= b and tf + 2.0 * r <= h, "r",
                f"fillets {r:g} m do not fit on the arms of {b:g} x {h:g} m")

    def _region(self) -> Region:
        b, h, tf, tw, r = self.b, self.h, self.tf, self.tw, self.r
        yl, yr, zb, zt = 0.5 * (b - tw), 0.5 * (b + tw), 0.5 * (h - tf), 0.5 * (h + tf)
        pts = [(yl, 0), (yr, 0), (yr, zb), (b, zb), (b, zt), (yr, zt), (yr, h), (yl, h), (yl, zt), (0, zt),
               (0, zb), (yl, zb)]  # fmt: skip
        return Region(tuple(rounded_polygon(pts, [0, 0, r, 0, 0, r, 0, 0, r, 0, 0, r], "r")))

    def torsion_constant(self) -> float:
        """Thin-walled open-section sum [m^4], fillets and the junction neglected.

        ``J = (b tf^3 / 3 - 0.21 tf^4) + 2 ((h - tf)/2 tw^3 / 3 - 0.105 tw^4)``:
        the horizontal plate over its full width with two free ends, the two
        vertical arms beside it with one free end each (the long-rectangle
        form of the exact series, as for the other open shapes).  Sharp
        corners of ordinary proportions agree with a finite-element solution
        to about 1 %; root fillets add stiffness the sum leaves out.
        """
        b, h, tf, tw = self.b, self.h, self.tf, self.tw
        arm = 0.5 * (h - tf)
        return _open_sum([(b, tf, 2), (arm, tw, 1), (arm, tw, 1)])

    def midline(self) -> OpenProfile:
        """Four arms from the centre; thin-walled shear centre at the centre, primary warping zero,
        ``I_w = (tf^3 b^3 + tw^3 h^3) / 144`` (secondary warping)."""
        b, h, tf, tw = self.b, self.h, self.tf, self.tw
        c = (0.5 * b, 0.5 * h)
        return OpenProfile([c, (0, c[1]), (b, c[1]), (c[0], 0), (c[0], h)],
                           [(0, 1, tf), (0, 2, tf), (0, 3, tw), (0, 4, tw)])


SHAPES: dict[str, type[Shape]] = {
    "rectangle": Rectangle,
    "round": Round,
    "rectangular_hollow": RectangularHollow,
    "circular_hollow": CircularHollow,
    "i_section": ISection,
    "channel": Channel,
    "angle": Angle,
    "tee": Tee,
    "cruciform": Cruciform,
}
"""Shape classes by name, for building a shape from a case file:
``SHAPES[name](**dimensions_in_metres)``."""
