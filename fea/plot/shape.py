"""Mode shapes between the nodes: the element's own interpolation, for drawing.

A buckling result holds the lateral displacement ``w`` and the section rotation
``psi`` of every node.  Inside a shear-rigid element the solver's displacement
field is the Hermite cubic of ``w`` and ``psi = dw/dx``
(:func:`fea.elements.shape_functions`); drawing the mode with it gives the
true curve between the nodes, so a higher mode on a coarse mesh is smooth
instead of a polyline with kinks at the nodes.

With shear flexibility (``phi = 12 EI / (S L^2) > 0``) ``psi`` is the section
rotation, not the slope.  The element's own shear-deformable cubics assume a
constant shear without axial load, which is exact at the nodes but only of
second order between them; the curve is therefore drawn as the Hermite cubic
of ``w`` and the slope ``dw/dx`` at the nodes, each node's slope the mean of
the slopes of the elements meeting there, from their own fields (third order:
on a pinned laced column's second mode, 16 elements, 6e-4 against 1e-2).

Pure numpy (no matplotlib): :func:`mode_curve` and :func:`shear_parameters`.
"""

from __future__ import annotations

import math

import numpy as np

from ..elements import GAUSS_W, GAUSS_XI, shape_functions
from ..model import Column

__all__ = ["mode_curve", "nodal_slopes", "shear_parameters", "points_per_element"]

#: About this many points along the whole curve (at least one per element, at most 16).
CURVE_POINTS = 600


def points_per_element(n_el: int) -> int:
    """Points drawn inside each element (excluding its first node) for a smooth curve."""
    return int(min(16, max(1, math.ceil(CURVE_POINTS / max(n_el, 1)))))


def mode_curve(heights: np.ndarray, w: np.ndarray, psi: np.ndarray, phi: np.ndarray | float = 0.0,
               per_element: int | None = None) -> tuple[np.ndarray, np.ndarray]:
    """The mode between the nodes, from the nodal displacements and rotations.

    Parameters
    ----------
    heights : (n,) node heights, ascending [m]
    w : (n,) lateral displacement of the nodes [-]
    psi : (n,) section rotation of the nodes, on the scale of ``w`` [1/m]
    phi : float or (n - 1,) shear parameter ``12 EI / (S L^2)`` of each element [-] (0: shear-rigid)
    per_element : points inside each element (default :func:`points_per_element`)

    Returns
    -------
    x : (m,) heights of the curve, the nodes among them [m]
    w : (m,) displacement there [-]; at the nodes exactly the nodal values

    Notes
    -----
    The cubic Hermite interpolant of ``w`` and ``dw/dx`` (:func:`fea.elements.shape_functions` with
    ``phi = 0``): with ``phi = 0`` it is the element's own field, reproduces any cubic exactly and its
    error for a smooth function is of order ``h^4``; with ``phi > 0`` the slopes come from
    :func:`nodal_slopes`.
    """
    x = np.asarray(heights, dtype=float)
    w = np.asarray(w, dtype=float)
    psi = np.asarray(psi, dtype=float)
    n_el = x.size - 1
    if n_el < 1:
        return x.copy(), w.copy()
    m = points_per_element(n_el) if per_element is None else max(1, int(per_element))
    L = np.diff(x)
    p = np.broadcast_to(np.asarray(phi, dtype=float), (n_el,))
    slope = nodal_slopes(x, w, psi, p) if np.any(p > 0) else psi
    xi = np.arange(1, m + 1) / m                      # (m,): the element's end node last
    N, _ = shape_functions(xi, L, np.zeros(n_el))     # (n_el, m, 4): the Hermite cubics
    dofs = np.stack([w[:-1], slope[:-1], w[1:], slope[1:]], axis=-1)  # (n_el, 4)
    inside = np.einsum("egk,ek->eg", N, dofs)         # (n_el, m)
    xs = x[:-1, None] + L[:, None] * xi[None, :]
    inside[:, -1] = w[1:]                             # the nodes exactly
    xs[:, -1] = x[1:]
    return np.concatenate([x[:1], xs.ravel()]), np.concatenate([w[:1], inside.ravel()])


def nodal_slopes(x: np.ndarray, w: np.ndarray, psi: np.ndarray, phi: np.ndarray) -> np.ndarray:
    """``dw/dx`` at the nodes: the mean of the adjacent elements' end slopes in their own fields [1/m].

    Equal to ``psi`` at a node whose elements are all shear-rigid.
    """
    L = np.diff(x)
    _, dN = shape_functions(np.array([0.0, 1.0]), L, phi)            # (n_el, 2, 4)
    dofs = np.stack([w[:-1], psi[:-1], w[1:], psi[1:]], axis=-1)
    ends = np.einsum("egk,ek->eg", dN, dofs)                          # (n_el, 2): slope at start and end
    total = np.zeros_like(w)
    count = np.zeros_like(w)
    np.add.at(total, np.arange(L.size), ends[:, 0])
    np.add.at(total, np.arange(1, L.size + 1), ends[:, 1])
    np.add.at(count, np.arange(L.size), 1.0)
    np.add.at(count, np.arange(1, L.size + 1), 1.0)
    return total / count


def shear_parameters(column: Column, heights: np.ndarray) -> np.ndarray:
    """``phi = 12 EI / (S L^2)`` of each element between ``heights``, as the mesh builds it (0 without ``S``).

    ``EI`` is the element's mean over its four Gauss points (:func:`fea.mesh.build_mesh`).
    """
    x = np.asarray(heights, dtype=float)
    L = np.diff(x)
    phi = np.zeros_like(L)
    joints = np.asarray(column.joints, dtype=float)
    mid = 0.5 * (x[:-1] + x[1:])
    seg = np.clip(np.searchsorted(joints, mid, side="right") - 1, 0, len(column.segments) - 1)
    for i, s in enumerate(column.segments):
        if s.S is None:
            continue
        m = seg == i
        if not np.any(m):
            continue
        xg = x[:-1][m, None] + L[m, None] * GAUSS_XI[None, :]
        EI_mean = (s.E * np.asarray(s.inertia_at(xg - joints[i]), dtype=float)) @ GAUSS_W
        phi[m] = 12.0 * EI_mean / (s.S * L[m] ** 2)
    return phi
