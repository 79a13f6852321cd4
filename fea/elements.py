"""Element kernels of the planar beam-column element, batched over elements.

Two nodes, two degrees of freedom each: lateral displacement ``w`` [m] and
section rotation ``psi`` [rad], ordered ``(w1, psi1, w2, psi2)``.  Without
shear flexibility ``psi = dw/dx`` and the shape functions are the Hermite
cubics; with a finite shear stiffness ``S`` they are the interdependent
(shear-deformable) cubics parametrised by ``phi = 12 EI / (S L^2)``, which
reduce to the Hermite cubics when ``phi = 0``.

Matrices (all symmetric, shape ``(n_el, 4, 4)``):

* elastic bending (and shear) stiffness ``k_e``;
* geometric stiffness ``k_g = integral N(x) w'_i w'_j dx`` for a unit load
  factor, with the axial compression ``N`` varying linearly along the element.
  A four-point Gauss rule integrates it exactly (the integrand is a polynomial
  of degree 5), so a distributed axial load is not smeared into a constant;
* foundation stiffness ``k_f = integral k(x) w_i w_j dx`` for a linearly
  varying modulus (degree 7: exact with four Gauss points).

References
----------
Timoshenko, S.P. & Gere, J.M., *Theory of Elastic Stability*, 2nd ed., 1961,
ch. 1-2 (energy method, beam-column).  The shear-deformable stiffness is the
classical Timoshenko beam element stiffness with ``phi = 12 EI / (kGA L^2)``.
"""

from __future__ import annotations

import numpy as np

__all__ = ["GAUSS_XI", "GAUSS_W", "shape_functions", "elastic_stiffness", "geometric_stiffness",
           "foundation_stiffness"]

# Four-point Gauss-Legendre rule on [0, 1]
_g, _w = np.polynomial.legendre.leggauss(4)
GAUSS_XI = 0.5 * (_g + 1.0)
GAUSS_W = 0.5 * _w


def shape_functions(xi: np.ndarray, L: np.ndarray, phi: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Lateral shape functions and their x-derivatives.

    Parameters
    ----------
    xi : (n_g,) local coordinate in [0, 1] [-]
    L : (n_el,) element lengths [m]
    phi : (n_el,) shear parameter 12 EI / (S L^2) [-] (0 for shear-rigid)

    Returns
    -------
    N : (n_el, n_g, 4) values [m/m, m/rad]
    dN : (n_el, n_g, 4) derivatives with respect to x [1/m, -]
    """
    xi = np.asarray(xi, dtype=float)[None, :]
    L = np.asarray(L, dtype=float)[:, None]
    p = np.asarray(phi, dtype=float)[:, None]
    c = 1.0 / (1.0 + p)
    x2, x3 = xi * xi, xi * xi * xi
    N = np.stack(
        [
            c * (1 - 3 * x2 + 2 * x3 + p * (1 - xi)),
            c * L * (xi - 2 * x2 + x3 + 0.5 * p * (xi - x2)),
            c * (3 * x2 - 2 * x3 + p * xi),
            c * L * (-x2 + x3 + 0.5 * p * (x2 - xi)),
        ],
        axis=-1,
    )
    dN = np.stack(
        [
            c * (-6 * xi + 6 * x2 - p) / L,
            c * (1 - 4 * xi + 3 * x2 + 0.5 * p * (1 - 2 * xi)),
            c * (6 * xi - 6 * x2 + p) / L,
            c * (-2 * xi + 3 * x2 + 0.5 * p * (2 * xi - 1)),
        ],
        axis=-1,
    )
    return N, dN


def elastic_stiffness(L: np.ndarray, EI_gauss: np.ndarray, phi: np.ndarray) -> np.ndarray:
    """Bending (and shear) stiffness of each element.

    Shear-rigid elements (``phi == 0``) integrate ``EI(x) w'' w''`` with the
    four-point rule, exact for EI varying up to the fifth power.  Shear-flexible
    elements use the closed-form Timoshenko stiffness with the element's
    mean EI (the mesh refinement makes this converge for tapered members).

    Parameters
    ----------
    L : (n_el,) [m]
    EI_gauss : (n_el, 4) flexural rigidity at the Gauss points [N m^2]
    phi : (n_el,) [-]

    Returns
    -------
    k_e : (n_el, 4, 4) [N/m, N, N m]
    """
    L = np.asarray(L, dtype=float)
    n = L.size
    xi = GAUSS_XI[None, :]
    Lc = L[:, None]
    # Hermite second derivatives d2N/dx2
    B = np.stack(
        [
            (-6 + 12 * xi) / Lc**2,
            (-4 + 6 * xi) / Lc,
            (6 - 12 * xi) / Lc**2,
            (-2 + 6 * xi) / Lc,
        ],
        axis=-1,
    )
    k = np.einsum("eg,egi,egj->eij", EI_gauss * (GAUSS_W[None, :] * Lc), B, B)
    shear = np.asarray(phi) > 0
    if np.any(shear):
        EIm = EI_gauss[shear] @ GAUSS_W
        Ls, p = L[shear], np.asarray(phi)[shear]
        c = EIm / (Ls**3 * (1 + p))
        ks = np.zeros((Ls.size, 4, 4))
        ks[:, 0, 0] = ks[:, 2, 2] = 12
        ks[:, 0, 2] = ks[:, 2, 0] = -12
        ks[:, 0, 1] = ks[:, 1, 0] = ks[:, 0, 3] = ks[:, 3, 0] = 6 * Ls
        ks[:, 1, 2] = ks[:, 2, 1] = ks[:, 2, 3] = ks[:, 3, 2] = -6 * Ls
        ks[:, 1, 1] = ks[:, 3, 3] = (4 + p) * Ls**2
        ks[:, 1, 3] = ks[:, 3, 1] = (2 - p) * Ls**2
        k[shear] = c[:, None, None] * ks
    assert k.shape == (n, 4, 4)
    return k


def geometric_stiffness(L: np.ndarray, N_gauss: np.ndarray, phi: np.ndarray) -> np.ndarray:
    """Consistent geometric stiffness for the axial compression ``N_gauss``.

    Parameters
    ----------
    L : (n_el,) [m]
    N_gauss : (n_el, 4) axial compression at the Gauss points [N]
    phi : (n_el,) [-]

    Returns
    -------
    k_g : (n_el, 4, 4), to be subtracted from the elastic stiffness [N/m, N, N m]
    """
    _, dN = shape_functions(GAUSS_XI, L, phi)
    wts = N_gauss * (GAUSS_W[None, :] * np.asarray(L)[:, None])
    return np.einsum("eg,egi,egj->eij", wts, dN, dN)


def foundation_stiffness(L: np.ndarray, k_gauss: np.ndarray, phi: np.ndarray) -> np.ndarray:
    """Consistent Winkler-foundation stiffness.

    Parameters
    ----------
    L : (n_el,) [m]
    k_gauss : (n_el, 4) foundation modulus at the Gauss points [N/m^2]
    phi : (n_el,) [-]

    Returns
    -------
    k_f : (n_el, 4, 4) [N/m, N, N m]
    """
    N, _ = shape_functions(GAUSS_XI, L, phi)
    wts = k_gauss * (GAUSS_W[None, :] * np.asarray(L)[:, None])
    return np.einsum("eg,egi,egj->eij", wts, N, N)
