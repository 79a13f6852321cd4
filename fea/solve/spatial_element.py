"""Element matrices of the thin-walled beam-column: 2 nodes, 6 DOF per node, batched over elements.

Node DOF order: ``[u, u', v, v', phi, phi']``; every field is a cubic Hermite interpolant.  The
functional is written out in :mod:`fea.solve.spatial`.  Integrals use 4-point Gauss-Legendre rules,
exact to degree 7: the highest integrand is ``k (u - e phi)^2`` of a continuous restraint (degree 6);
the load terms are at most degree 5 (``M phi u''`` with ``M`` linear).
"""

from __future__ import annotations

import numpy as np

__all__ = ["U", "V", "PHI", "shape_functions", "elastic", "geometric", "offset_spring"]

#: Positions of each field's four DOFs in the element vector of 12.
U = np.array([0, 1, 6, 7])
V = np.array([2, 3, 8, 9])
PHI = np.array([4, 5, 10, 11])

_P, _W = np.polynomial.legendre.leggauss(4)
XI = 0.5 * (_P + 1.0)  # Gauss points on [0, 1]
WEIGHTS = 0.5 * _W


def shape_functions(h: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Hermite shape functions and their first two x-derivatives at the Gauss points.

    Parameters
    ----------
    h : (n_el,) element lengths [m]

    Returns
    -------
    N, dN, d2N : (n_el, 4, 4) values [element, Gauss point, function] for the DOFs (w1, w1', w2, w2')
    """
    t = XI
    H = np.stack([1 - 3 * t**2 + 2 * t**3, t - 2 * t**2 + t**3, 3 * t**2 - 2 * t**3, -(t**2) + t**3], axis=1)
    dH = np.stack([-6 * t + 6 * t**2, 1 - 4 * t + 3 * t**2, 6 * t - 6 * t**2, -2 * t + 3 * t**2], axis=1)
    d2H = np.stack([-6 + 12 * t, -4 + 6 * t, 6 - 12 * t, -2 + 6 * t], axis=1)
    h3 = h[:, None, None]
    slope = np.array([1.0, 0.0, 1.0, 0.0])  # value DOFs; the slope DOFs carry one more factor h
    scale = slope + (1 - slope) * h3  # (n_el, 1, 4): 1 for values, h for slopes
    N = H[None] * scale
    dN = dH[None] * scale / h3
    d2N = d2H[None] * scale / h3**2
    return N, dN, d2N


def _integral(f: np.ndarray, h: np.ndarray, a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """``int f a b^T dx`` over each element: f (n_el, 4) at the Gauss points, a, b (n_el, 4, 4) -> (n_el, 4, 4)."""
    return np.einsum("eg,egi,egj->eij", f * WEIGHTS[None, :] * h[:, None], a, b)


def elastic(h: np.ndarray, EIz: np.ndarray, EIy: np.ndarray, EIw: np.ndarray, GJ: np.ndarray) -> np.ndarray:
    """Elastic stiffness (n_el, 12, 12): ``int E I_z u''^2 + E I_y v''^2 + E I_w phi''^2 + G J phi'^2 dx``."""
    N, dN, d2N = shape_functions(h)
    one = np.ones((h.size, XI.size))
    k = np.zeros((h.size, 12, 12))
    base2 = _integral(one, h, d2N, d2N)
    base1 = _integral(one, h, dN, dN)
    k[:, U[:, None], U[None, :]] = EIz[:, None, None] * base2
    k[:, V[:, None], V[None, :]] = EIy[:, None, None] * base2
    k[:, PHI[:, None], PHI[None, :]] = EIw[:, None, None] * base2 + GJ[:, None, None] * base1
    return k


def geometric(h: np.ndarray, N_ax: np.ndarray, M: np.ndarray, i0sq: np.ndarray, y0: np.ndarray, z0: np.ndarray,
              beta: np.ndarray) -> np.ndarray:
    """Second-order energy matrix ``A`` (n_el, 12, 12) with ``V2 = 1/2 d^T A d`` of the stress resultants.

    ``V2 = -1/2 int N (u'^2 + v'^2 + i0^2 phi'^2 + 2 z0 u' phi' - 2 y0 v' phi') dx
    - int M phi u'' dx - 1/2 int beta_y M phi'^2 dx``.

    Parameters
    ----------
    h : (n_el,) lengths [m]
    N_ax : (n_el,) axial compression, constant in each element [N]
    M : (n_el, 4) major-axis moment at the Gauss points [N m]
    i0sq, y0, z0, beta : (n_el,) section constants [m^2, m, m, m]
    """
    Nf, dN, d2N = shape_functions(h)
    n = h.size
    Ng = np.broadcast_to(N_ax[:, None], (n, XI.size))
    a11 = _integral(Ng, h, dN, dN)  # int N w'_i w'_j
    m11 = _integral(M, h, dN, dN)  # int M w'_i w'_j
    m20 = _integral(M, h, d2N, Nf)  # int M w''_i w_j
    A = np.zeros((n, 12, 12))
    A[:, U[:, None], U[None, :]] = -a11
    A[:, V[:, None], V[None, :]] = -a11
    A[:, PHI[:, None], PHI[None, :]] = -i0sq[:, None, None] * a11 - beta[:, None, None] * m11
    up = -z0[:, None, None] * a11 - m20  # rows u, columns phi
    vp = y0[:, None, None] * a11
    A[:, U[:, None], PHI[None, :]] = up
    A[:, PHI[:, None], U[None, :]] = np.swapaxes(up, 1, 2)
    A[:, V[:, None], PHI[None, :]] = vp
    A[:, PHI[:, None], V[None, :]] = np.swapaxes(vp, 1, 2)
    return A


def offset_spring(h: np.ndarray, k_u: np.ndarray, k_v: np.ndarray, ey: np.ndarray, ez: np.ndarray) -> np.ndarray:
    """Continuous springs on a point off the shear centre (n_el, 12, 12), per unit length [N/m^2]:

    ``1/2 int k_u (u - ez phi)^2 + k_v (v + ey phi)^2 dx`` (offsets from the shear centre).
    """
    Nf, _, _ = shape_functions(h)
    one = np.ones((h.size, XI.size))
    m = _integral(one, h, Nf, Nf)
    k = np.zeros((h.size, 12, 12))
    ku, kv = k_u[:, None, None], k_v[:, None, None]
    ez3, ey3 = ez[:, None, None], ey[:, None, None]
    k[:, U[:, None], U[None, :]] = ku * m
    k[:, V[:, None], V[None, :]] = kv * m
    k[:, PHI[:, None], PHI[None, :]] = (ku * ez3**2 + kv * ey3**2) * m
    c = (-ku * ez3) * m
    d = (kv * ey3) * m
    k[:, U[:, None], PHI[None, :]] = c
    k[:, PHI[:, None], U[None, :]] = c
    k[:, V[:, None], PHI[None, :]] = d
    k[:, PHI[:, None], V[None, :]] = d
    return k
