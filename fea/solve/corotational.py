"""Co-rotational planar beam-column element and global assembly.

Formulation (co-rotational formulation of a two-node planar beam as described by
Crisfield, *Non-linear Finite Element Analysis of Solids and Structures*, Vol. 1,
chapter 7): the rigid-body motion of every element is removed by a frame that
follows the chord between its nodes; in that frame a *shallow-arch* local beam
carries the deformation.

* Plane: x lateral, y height; 3 DOFs per node ``(u_x, u_y, theta)``, DOF index
  ``3 * node + k``; theta counter-clockwise.
* Local deformations: chord elongation ``u_l = (l^2 - L^2) / (l + L)`` (numerator
  formed from the displacement differences, free of cancellation) and end
  rotations relative to the chord ``theta_i,l = theta_i - (beta - beta_0)``
  (wrapped to (-pi, pi]), with ``L``, ``beta_0`` the initial and ``l``, ``beta``
  the current chord length and angle.
* Local beam (shallow arch): axial displacement linear, transverse displacement
  cubic (Hermite, zero at both ends, end slopes theta_1, theta_2).  Curvature
  ``kappa(xi) = ((6 xi - 4) theta_1 + (6 xi - 2) theta_2) / L`` and an axial
  strain constant along the element, the element mean of ``u' + w'^2 / 2``:
  ``eps0 = u_l / L + (2 theta_1^2 - theta_1 theta_2 + 2 theta_2^2) / 30``.
* Integration: ``n_ip`` = 2 or 3 Gauss-Legendre points along the element
  (default 3); the section law (elastic or fibre, see :mod:`fea.solve.fibre`) is
  evaluated at each point.
* Local transverse axis: the element axis turned +90 degrees (counter-clockwise).
  For an element running upwards (+y), a fibre at positive ``y_f`` lies towards
  global -x.  Fibre strain ``eps = eps0 - y_f * kappa``.
* Local end forces ``(N, M_1, M_2)`` are conjugate to ``(u_l, theta_1, theta_2)``:
  N tension positive, end moments counter-clockwise on the element.

Everything is vectorised over elements x integration points x fibres; the
functions are pure (arrays in, arrays out, SI units).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import partial

import numpy as np

from fea.errors import ModelError
from fea.solve.fibre import ElasticSection, FibreSection, FibreState, initial_state, section_response
from fea.util.numbers import readonly

__all__ = ["BeamModel", "Assembly", "gauss_points", "make_model", "local_deformations", "assemble"]

_G = np.array([[0.0, 0.0, 0.0], [0.0, 4.0, -1.0], [0.0, -1.0, 4.0]]) / 30.0


def gauss_points(n_ip: int) -> tuple[np.ndarray, np.ndarray]:
    """Gauss-Legendre points on [0, 1].

    Parameters
    ----------
    n_ip : int
        Number of points, 2 or 3.

    Returns
    -------
    xi : ndarray, shape (n_ip,)
        Positions along the element [-] (0 at node 1, 1 at node 2).
    w : ndarray, shape (n_ip,)
        Weights [-], summing to 1.
    """
    if n_ip not in (2, 3):
        raise ModelError("n_ip", f"is {n_ip!r}, expected 2 or 3 integration points")
    x, w = np.polynomial.legendre.leggauss(n_ip)
    return 0.5 * (x + 1.0), 0.5 * w


@dataclass(frozen=True)
class BeamModel:
    """Checked geometry, connectivity and sections of a planar frame.

    Attributes
    ----------
    xy0 : ndarray, shape (n_nodes, 2)
        Initial node coordinates [m] (imperfections included).
    conn : ndarray of int, shape (n_el, 2)
        Element end nodes.
    section : ElasticSection or FibreSection
        Per-element section data.
    n_ip : int
        Integration points per element.
    xi, w : ndarray, shape (n_ip,)
        Integration point positions on [0, 1] and weights.
    L0 : ndarray, shape (n_el,)
        Initial element lengths [m].
    c0, s0 : ndarray, shape (n_el,)
        Cosine and sine of the initial element angles.
    edofs : ndarray of int, shape (n_el, 6)
        Global DOF indices of each element.
    """

    xy0: np.ndarray
    conn: np.ndarray
    section: ElasticSection | FibreSection
    n_ip: int
    xi: np.ndarray
    w: np.ndarray
    L0: np.ndarray
    c0: np.ndarray
    s0: np.ndarray
    edofs: np.ndarray

    @property
    def n_nodes(self) -> int:
        return int(self.xy0.shape[0])

    @property
    def n_el(self) -> int:
        return int(self.conn.shape[0])

    @property
    def n_dof(self) -> int:
        return 3 * self.n_nodes

    @property
    def is_fibre(self) -> bool:
        return isinstance(self.section, FibreSection)

    def initial_state(self) -> FibreState | None:
        """Virgin fibre history (None for elastic sections)."""
        return initial_state(self.section, self.n_ip) if isinstance(self.section, FibreSection) else None


def make_model(xy0, conn, section, n_ip: int = 3) -> BeamModel:
    """Check the input and precompute the element geometry.

    Parameters
    ----------
    xy0 : array_like, shape (n_nodes, 2)
        Initial node coordinates [m].
    conn : array_like of int, shape (n_el, 2)
        Element end nodes.
    section : ElasticSection or FibreSection
        Built by :func:`fea.solve.fibre.make_elastic_section` or
        :func:`fea.solve.fibre.make_fibre_section` with the same ``n_el``.
    n_ip : int, optional
        Gauss-Legendre points per element, 2 or 3 (default 3).

    Returns
    -------
    BeamModel

    Raises
    ------
    ModelError
        On wrong shapes, non-finite coordinates, bad node numbers, zero-length
        elements or a section of the wrong kind or size.
    """
    try:
        xy = np.asarray(xy0, dtype=float)
    except (TypeError, ValueError):
        raise ModelError("xy0", "expected an array of node coordinates of shape (n_nodes, 2)") from None
    if xy.ndim != 2 or xy.shape[1] != 2 or xy.shape[0] < 2:
        raise ModelError("xy0", f"has shape {xy.shape}, expected (n_nodes, 2) with n_nodes >= 2")
    if not np.all(np.isfinite(xy)):
        raise ModelError("xy0", "contains non-finite coordinates, expected finite numbers in m")
    c = np.asarray(conn)
    if c.ndim != 2 or c.shape[1] != 2 or c.shape[0] < 1:
        raise ModelError("conn", f"has shape {c.shape}, expected (n_el, 2) with n_el >= 1")
    if not np.issubdtype(c.dtype, np.integer):
        if not (np.issubdtype(c.dtype, np.floating) and np.all(c == np.round(c))):
            raise ModelError("conn", f"has dtype {c.dtype}, expected integer node numbers")
    c = c.astype(np.int64)
    n_nodes = xy.shape[0]
    if np.any((c < 0) | (c >= n_nodes)):
        bad = c[(c < 0) | (c >= n_nodes)][0]
        raise ModelError("conn", f"refers to node {bad}, expected node numbers in 0..{n_nodes - 1}")
    if np.any(c[:, 0] == c[:, 1]):
        e = int(np.argmax(c[:, 0] == c[:, 1]))
        raise ModelError(f"conn[{e}]", f"joins node {c[e, 0]} to itself, expected two different nodes")
    if not isinstance(section, (ElasticSection, FibreSection)):
        raise ModelError("section", f"is a {type(section).__name__}, expected an ElasticSection or FibreSection")
    if section.n_el != c.shape[0]:
        raise ModelError("section", f"describes {section.n_el} elements, expected {c.shape[0]} (one per element of "
                                    "conn)")
    xi, w = gauss_points(n_ip)
    d = xy[c[:, 1]] - xy[c[:, 0]]
    L0 = np.hypot(d[:, 0], d[:, 1])
    scale = max(float(np.ptp(xy, axis=0).max()), 1e-300)
    if np.any(L0 <= 1e-12 * scale):
        e = int(np.argmin(L0))
        raise ModelError(f"conn[{e}]", f"has length {L0[e]!r} m, expected a positive element length")
    edofs = (3 * c[:, :, None] + np.arange(3)[None, None, :]).reshape(-1, 6)
    ro = partial(readonly, dtype=None)  # keeps the integer arrays integer
    return BeamModel(xy0=ro(xy), conn=ro(c), section=section, n_ip=int(n_ip), xi=ro(xi), w=ro(w),
                     L0=ro(L0), c0=ro(d[:, 0] / L0), s0=ro(d[:, 1] / L0), edofs=ro(edofs))


def local_deformations(model: BeamModel, u: np.ndarray):
    """Co-rotational kinematics of all elements.

    Parameters
    ----------
    model : BeamModel
    u : ndarray, shape (n_dof,)
        Global displacements [m, m, rad per node].

    Returns
    -------
    ul : ndarray, shape (n_el,)
        Chord elongation [m].
    th1, th2 : ndarray, shape (n_el,)
        End rotations relative to the chord [rad].
    ln : ndarray, shape (n_el,)
        Current chord length [m].
    c, s : ndarray, shape (n_el,)
        Cosine and sine of the current chord angle.
    """
    ue = u[model.edofs]
    dux = ue[:, 3] - ue[:, 0]
    duy = ue[:, 4] - ue[:, 1]
    dx = model.L0 * model.c0 + dux
    dy = model.L0 * model.s0 + duy
    ln = np.hypot(dx, dy)
    c = dx / ln
    s = dy / ln
    # rigid rotation of the chord, beta - beta_0, without branch trouble
    alpha = np.arctan2(model.c0 * s - model.s0 * c, model.c0 * c + model.s0 * s)
    t1 = ue[:, 2] - alpha
    t2 = ue[:, 5] - alpha
    t1 = np.arctan2(np.sin(t1), np.cos(t1))
    t2 = np.arctan2(np.sin(t2), np.cos(t2))
    # l^2 - L^2 from the displacement differences: no cancellation for small elongations
    ul = (2.0 * model.L0 * (model.c0 * dux + model.s0 * duy) + dux * dux + duy * duy) / (ln + model.L0)
    return ul, t1, t2, ln, c, s


@dataclass(frozen=True)
class Assembly:
    """Internal force, tangent and integration-point results at one configuration.

    Attributes
    ----------
    f_int : ndarray, shape (n_dof,)
        Global internal force vector [N, N, N m].
    K : ndarray, shape (n_dof, n_dof)
        Global tangent stiffness (material + geometric) [N/m, N, N m].
    local_forces : ndarray, shape (n_el, 3)
        Local end forces (N, M_1, M_2) [N, N m, N m].
    N, M : ndarray, shape (n_el, n_ip)
        Axial force and bending moment at the integration points [N, N m].
    eps0, kappa : ndarray, shape (n_el, n_ip)
        Generalised strains at the integration points [-, 1/m].
    state : FibreState or None
        Trial history matching this configuration.
    yielding : ndarray of bool, shape (n_el, n_ip, n_fib) or None
        Fibres yielding at this configuration.
    stress : ndarray, shape (n_el, n_ip, n_fib) or None
        Fibre stresses [Pa].
    """

    f_int: np.ndarray
    K: np.ndarray
    local_forces: np.ndarray
    N: np.ndarray
    M: np.ndarray
    eps0: np.ndarray
    kappa: np.ndarray
    state: FibreState | None
    yielding: np.ndarray | None
    stress: np.ndarray | None


def assemble(model: BeamModel, u: np.ndarray, state: FibreState | None, *, tangent: bool = True) -> Assembly:
    """Internal forces and tangent stiffness of the whole frame.

    Parameters
    ----------
    model : BeamModel
    u : ndarray, shape (n_dof,)
        Global displacements [m, m, rad].
    state : FibreState or None
        Committed fibre history (None for elastic sections).
    tangent : bool, optional
        Build the tangent (default True); when False ``K`` is an empty array.

    Returns
    -------
    Assembly
    """
    L0 = model.L0
    ul, t1, t2, ln, c, s = local_deformations(model, u)
    xi = model.xi
    eps0 = (ul / L0 + (2.0 * t1 * t1 - t1 * t2 + 2.0 * t2 * t2) / 30.0)[:, None]
    kappa = ((6.0 * xi - 4.0)[None, :] * t1[:, None] + (6.0 * xi - 2.0)[None, :] * t2[:, None]) / L0[:, None]
    sec = section_response(model.section, eps0, kappa, state)
    n_el, n_ip = kappa.shape
    # strain-displacement rows, shape (n_el, n_ip, 2, 3)
    b = np.zeros((n_el, n_ip, 2, 3))
    b[:, :, 0, 0] = (1.0 / L0)[:, None]
    b[:, :, 0, 1] = ((4.0 * t1 - t2) / 30.0)[:, None]
    b[:, :, 0, 2] = ((4.0 * t2 - t1) / 30.0)[:, None]
    b[:, :, 1, 1] = ((6.0 * xi - 4.0)[None, :] / L0[:, None])
    b[:, :, 1, 2] = ((6.0 * xi - 2.0)[None, :] / L0[:, None])
    wl = model.w[None, :] * L0[:, None]  # (n_el, n_ip)
    stress = np.stack([sec.N, sec.M], axis=-1)  # (n_el, n_ip, 2)
    fl = np.einsum("ek,ekij,eki->ej", wl, b, stress)  # (n_el, 3)
    # transformation
    z6 = np.zeros(n_el)
    r = np.stack([-c, -s, z6, c, s, z6], axis=1)
    zv = np.stack([s, -c, z6, -s, c, z6], axis=1)
    B = np.empty((n_el, 3, 6))
    B[:, 0] = r
    B[:, 1] = -zv / ln[:, None]
    B[:, 1, 2] += 1.0
    B[:, 2] = -zv / ln[:, None]
    B[:, 2, 5] += 1.0
    fg = np.einsum("eij,ei->ej", B, fl)
    n_dof = model.n_dof
    f_int = np.bincount(model.edofs.ravel(), weights=fg.ravel(), minlength=n_dof)
    K: np.ndarray
    if tangent:
        Kl = np.einsum("ek,ekai,ekab,ekbj->eij", wl, b, sec.D, b)
        Kl += np.einsum("ek,ek->e", wl, sec.N)[:, None, None] * _G[None]
        Kg = np.einsum("eai,eab,ebj->eij", B, Kl, B)
        Kg += (fl[:, 0] / ln)[:, None, None] * zv[:, :, None] * zv[:, None, :]
        rz = r[:, :, None] * zv[:, None, :]
        Kg += ((fl[:, 1] + fl[:, 2]) / (ln * ln))[:, None, None] * (rz + rz.transpose(0, 2, 1))
        idx = (model.edofs[:, :, None] * n_dof + model.edofs[:, None, :]).ravel()
        K = np.bincount(idx, weights=Kg.ravel(), minlength=n_dof * n_dof).reshape(n_dof, n_dof)
    else:
        K = np.empty((0, 0))
    return Assembly(f_int=f_int, K=K, local_forces=fl, N=sec.N, M=sec.M, eps0=np.broadcast_to(eps0, kappa.shape),
                    kappa=kappa, state=sec.state, yielding=sec.yielding, stress=sec.stress)
