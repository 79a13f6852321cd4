"""Thin-walled open sections: the mid-line integrator and the torsion record.

An open thin-walled profile is a tree of straight plates along the wall
mid-line (:class:`OpenProfile`: mid-line nodes and plates ``(i, j, t)``).
:meth:`OpenProfile.analyse` integrates, over the mid-line with the wall
thickness as weight (Vlasov's thin-walled theory; Timoshenko & Gere, *Theory
of Elastic Stability*, ch. 5, from memory):

* the sectorial coordinate ``omega`` (twice the area swept by the radius from
  a pole), built plate by plate from a root node: on a straight plate
  ``omega`` is linear, ``omega_j = omega_i + (r_i - P) x (r_j - r_i)``;
* the shear centre ``S``: the pole for which ``integral omega y dA`` and
  ``integral omega z dA`` vanish (``y, z`` centroidal), a 2 x 2 linear system;
* the primary warping constant ``I_w = integral omega_n^2 dA`` with
  ``omega_n`` the sectorial coordinate about ``S`` less its mean;
* the secondary (through-thickness) warping constant
  ``sum t^3 / 12 integral r_t^2 ds``, ``r_t`` the component along the plate of
  the radius from ``S``: it is the whole warping constant of sections whose
  plates all meet at one point (angles, tees, cruciforms), for which the
  primary term vanishes; it gives ``t^3 L^3 / 36`` for a plate of length
  ``L`` running from ``S`` and ``t^3 b^3 / 144`` for a plate of width ``b``
  centred on ``S`` (the usual angle and tee formulas, from memory);
* the plain open-section sum ``sum L t^3 / 3`` for J (shapes add their own
  end and junction corrections).

Every integrand is a polynomial of degree <= 2 along a plate, integrated
exactly.  The results hold for thin walls (``t`` small next to the plate
lengths): against a finite-element warping solution the shear centre and
``I_w`` of rolled and welded proportions agree to about 1 % (see the tests).
Closed cells (loops of plates) are refused.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Sequence

import numpy as np

from fea.errors import ModelError

__all__ = ["TorsionConstants", "OpenProfile", "OpenProfileResult"]


@dataclass(frozen=True, slots=True)
class TorsionConstants:
    """Torsion and warping constants of a section (SI units).

    Axes: ``y0`` is measured along the *major* principal axis (direction
    ``e1 = (cos theta, sin theta)``) and ``z0`` along the *minor* principal
    axis direction ``e2 = (-sin theta, cos theta)``, i.e. ``z0`` is the
    distance from the major axis, positive on the side ``e2`` points to (up
    for an upright I, tee or channel, ``theta = 0``).  For ``theta = 0`` they
    are plain ``y - y_c`` and ``z - z_c`` (see :mod:`fea.sections`).

    Attributes
    ----------
    J : float
        St Venant torsion constant [m^4] (the shape's ``torsion_constant``).
    I_w : float
        Warping constant about the shear centre [m^6]; ``0`` for solid and
        closed sections (neglected: stated by each shape).
    y0, z0 : float
        Shear centre relative to the centroid, in principal axes [m].
    i0 : float
        Polar radius of gyration about the shear centre [m],
        ``sqrt((I_major + I_minor) / A + y0^2 + z0^2)``.
    beta_major : float
        Monosymmetry (Wagner) constant for bending about the major axis [m],
        ``beta = (1 / I_major) integral q (p^2 + q^2) dA - 2 z0`` with ``p``
        (along the major axis) and ``q`` (along ``e2``) principal coordinates
        from the centroid.  It is zero for a section symmetric about its
        major axis.  Sign: in the usual convention where ``beta > 0`` when
        the larger flange is in compression (Trahair & Bradford, *Behaviour
        and Design of Steel Structures*, lateral buckling of monosymmetric
        beams, from memory), this is the value for the ``-q`` side (the
        bottom, for ``theta = 0``) in compression; with the ``+q`` side in
        compression use ``-beta_major``.  A tee with its flange on the ``+q``
        side therefore has ``beta_major < 0``: its stem is then in compression.
    """

    J: float
    I_w: float
    y0: float
    z0: float
    i0: float
    beta_major: float


@dataclass(frozen=True, slots=True)
class OpenProfileResult:
    """What :meth:`OpenProfile.analyse` returns (mid-line integrals, SI).

    Attributes
    ----------
    area : float
        Mid-line area ``sum L t`` [m^2].
    y_c, z_c : float
        Mid-line centroid [m] in the profile's coordinates.
    I_yy, I_zz, I_yz : float
        Mid-line second moments about the centroid [m^4]: ``integral z^2``,
        ``integral y^2``, ``integral y z`` (no through-thickness terms).
    y_s, z_s : float
        Shear centre [m] in the profile's coordinates.
    I_w_primary : float
        Sectorial warping constant about the shear centre [m^6].
    I_w_secondary : float
        Through-thickness warping term [m^6] (see the module docstring).
    J_open : float
        ``sum L t^3 / 3`` [m^4], without end or junction corrections.
    """

    area: float
    y_c: float
    z_c: float
    I_yy: float
    I_zz: float
    I_yz: float
    y_s: float
    z_s: float
    I_w_primary: float
    I_w_secondary: float
    J_open: float

    @property
    def I_w(self) -> float:
        """Warping constant [m^6]: primary plus secondary."""
        return self.I_w_primary + self.I_w_secondary


@dataclass(frozen=True, slots=True)
class OpenProfile:
    """A thin-walled open profile: straight plates between mid-line nodes.

    Parameters
    ----------
    nodes : sequence of (y, z)
        Mid-line nodes [m].
    plates : sequence of (i, j, t)
        Plates from node ``i`` to node ``j`` with wall thickness ``t`` [m].
        The plates must join the nodes into one tree (no closed cell).
    """

    nodes: tuple[tuple[float, float], ...]
    plates: tuple[tuple[int, int, float], ...]

    def __init__(self, nodes: Sequence[tuple[float, float]], plates: Sequence[tuple[int, int, float]]) -> None:
        object.__setattr__(self, "nodes", tuple((float(y), float(z)) for y, z in nodes))
        object.__setattr__(self, "plates", tuple((int(i), int(j), float(t)) for i, j, t in plates))
        n = len(self.nodes)
        if len(self.plates) != n - 1 or n < 2:
            raise ModelError("plates", f"{len(self.plates)} plates on {n} nodes do not form an open tree; "
                                       "expected one plate fewer than nodes (closed cells are not open sections)")
        for k, (i, j, t) in enumerate(self.plates):
            if not (0 <= i < n and 0 <= j < n and i != j):
                raise ModelError(f"plates[{k}]", f"nodes ({i}, {j}) are not two distinct nodes of 0..{n - 1}")
            if not (math.isfinite(t) and t > 0.0):
                raise ModelError(f"plates[{k}]", f"thickness {t!r} m is not a positive finite length")
            (yi, zi), (yj, zj) = self.nodes[i], self.nodes[j]
            if not math.hypot(yj - yi, zj - zi) > 0.0:
                raise ModelError(f"plates[{k}]", "has zero length; expected two distinct mid-line points")
        if len(self._order()) != n - 1:
            raise ModelError("plates", "the plates do not join every node into one piece; expected a connected tree")

    def _order(self) -> list[tuple[int, int, float]]:
        """The plates oriented away from node 0, each after the plate reaching its start (tree walk)."""
        adj: dict[int, list[tuple[int, float]]] = {}
        for i, j, t in self.plates:
            adj.setdefault(i, []).append((j, t))
            adj.setdefault(j, []).append((i, t))
        seen, out, stack = {0}, [], [0]
        while stack:
            a = stack.pop()
            for b, t in adj.get(a, []):
                if b not in seen:
                    seen.add(b)
                    out.append((a, b, t))
                    stack.append(b)
        return out

    def analyse(self) -> OpenProfileResult:
        """Mid-line properties, shear centre and warping constants (see the module docstring)."""
        P = np.asarray(self.nodes, dtype=float)
        order = self._order()
        i = np.array([a for a, _, _ in order])
        j = np.array([b for _, b, _ in order])
        t = np.array([c for _, _, c in order])
        L = np.hypot(P[j, 0] - P[i, 0], P[j, 1] - P[i, 1])
        w = t * L  # plate areas

        def integral(fi: np.ndarray, fj: np.ndarray, gi: np.ndarray, gj: np.ndarray) -> float:
            # exact integral of the product of two linear fields over each plate
            return float(np.sum(w * (2.0 * fi * gi + fi * gj + fj * gi + 2.0 * fj * gj) / 6.0))

        A = float(np.sum(w))
        yc = float(np.sum(w * (P[i, 0] + P[j, 0]) / 2.0)) / A
        zc = float(np.sum(w * (P[i, 1] + P[j, 1]) / 2.0)) / A
        y, z = P[:, 0] - yc, P[:, 1] - zc
        Iyy = integral(z[i], z[j], z[i], z[j])
        Izz = integral(y[i], y[j], y[i], y[j])
        Iyz = integral(y[i], y[j], z[i], z[j])

        # sectorial coordinate about the centroid, zero at node 0
        om = np.zeros(len(P))
        for a, b, _ in order:
            om[b] = om[a] + y[a] * (z[b] - z[a]) - z[a] * (y[b] - y[a])
        Iwy = integral(om[i], om[j], y[i], y[j])
        Iwz = integral(om[i], om[j], z[i], z[j])
        # pole moved to S = (dy, dz) from the centroid: omega_S = omega + dz y - dy z + const;
        # the shear centre makes omega_S orthogonal to y and z
        M = np.array([[Izz, -Iyz], [Iyz, -Iyy]])
        rhs = -np.array([Iwy, Iwz])
        if abs(np.linalg.det(M)) <= 1e-12 * (Iyy + Izz) ** 2:
            raise ModelError("plates", "the mid-line lies on one straight line; its shear centre is not defined "
                                       "by thin-walled theory (use a solid rectangle)")
        dz, dy = np.linalg.solve(M, rhs)
        oms = om + dz * y - dy * z
        oms = oms - integral(oms[i], oms[j], np.ones_like(L), np.ones_like(L)) / A
        Iw1 = integral(oms[i], oms[j], oms[i], oms[j])

        # secondary warping: t^3/12 * integral of r_t^2 along each plate
        ey, ez = (P[j, 0] - P[i, 0]) / L, (P[j, 1] - P[i, 1]) / L
        a0 = (y[i] - dy) * ey + (z[i] - dz) * ez
        Iw2 = float(np.sum(t**3 / 12.0 * ((a0 + L) ** 3 - a0**3) / 3.0))
        return OpenProfileResult(
            area=A, y_c=yc, z_c=zc, I_yy=Iyy, I_zz=Izz, I_yz=Iyz, y_s=yc + float(dy), z_s=zc + float(dz),
            I_w_primary=max(Iw1, 0.0), I_w_secondary=Iw2, J_open=float(np.sum(L * t**3 / 3.0)),
        )
