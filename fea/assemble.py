"""Global matrices of a mesh, with rigid restraints eliminated.

Pure: arrays in, arrays out.  Degrees of freedom are numbered ``2 * node + k``
with ``k = 0`` lateral displacement and ``k = 1`` rotation.  Rigid restraints
(``inf`` springs) remove their degree of freedom; finite springs are added to
the diagonal.  No penalty numbers are used anywhere.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

import numpy as np

from .elements import GAUSS_W, GAUSS_XI, elastic_stiffness, foundation_stiffness, geometric_stiffness, shape_functions
from .mesh import Mesh

__all__ = ["Assembled", "assemble", "element_bending_energies", "rayleigh_quotients", "residual"]


#: Systems up to this size are assembled and solved densely with numpy alone
#: (importing scipy.sparse costs more start-up time than such a solve).
DENSE_ASSEMBLY_MAX_DOF = 600


@dataclass(frozen=True)
class Assembled:
    """Reduced global matrices of the eigenproblem ``K phi = lam G phi``.

    Small systems are held as dense arrays, large ones as sparse CSR matrices;
    ``K``/``K0``/``G`` always give dense arrays and ``Ks``/``K0s``/``Gs``
    always give sparse ones (converted on first use).

    Attributes
    ----------
    K : (n, n) elastic + springs + foundation, minus the permanent-load geometric
        stiffness (the stiffness the variable load acts against) [SI]
    K0 : (n, n) elastic + springs + foundation only (no geometric terms)
    G : (n, n) geometric stiffness of the variable loads at load factor 1
    free : (n,) indices of the retained degrees of freedom in the full numbering
    n_full : number of degrees of freedom before elimination
    k_bending : (n_el, 4, 4) element bending stiffness, for energy shares
    """

    matrices: tuple
    free: np.ndarray
    n_full: int
    k_bending: np.ndarray

    @property
    def n(self) -> int:
        return self.matrices[0].shape[0]

    @property
    def is_sparse(self) -> bool:
        return not isinstance(self.matrices[0], np.ndarray)

    def _dense(self, i: int) -> np.ndarray:
        m = self.matrices[i]
        return m if isinstance(m, np.ndarray) else m.toarray()

    def _sparse(self, i: int):
        import scipy.sparse as sp

        m = self.matrices[i]
        return sp.csr_matrix(m) if isinstance(m, np.ndarray) else m

    @cached_property
    def K(self) -> np.ndarray:
        return self._dense(0)

    @cached_property
    def K0(self) -> np.ndarray:
        return self._dense(1)

    @cached_property
    def G(self) -> np.ndarray:
        return self._dense(2)

    @cached_property
    def Ks(self):
        return self._sparse(0)

    @cached_property
    def K0s(self):
        return self._sparse(1)

    @cached_property
    def Gs(self):
        return self._sparse(2)


def _scatter(ke: np.ndarray, n_dof: int, diag: np.ndarray, sparse: bool):
    """Add element matrices (n_el, 4, 4) of a chain of elements and a diagonal into a global matrix."""
    n_el = ke.shape[0]
    # element e couples dofs 2e .. 2e+3; overlapping 2x2 blocks at shared nodes
    idx = 2 * np.arange(n_el)[:, None] + np.arange(4)[None, :]
    rows = np.repeat(idx, 4, axis=1).ravel()
    cols = np.tile(idx, (1, 4)).ravel()
    vals = ke.reshape(n_el, 16).ravel()
    if not sparse:
        out = np.zeros((n_dof, n_dof))
        np.add.at(out, (rows, cols), vals)
        out[np.diag_indices(n_dof)] += diag
        return out
    import scipy.sparse as sp

    d = np.arange(n_dof)
    rows, cols, vals = np.concatenate([rows, d]), np.concatenate([cols, d]), np.concatenate([vals, diag])
    return sp.csr_matrix((vals, (rows, cols)), shape=(n_dof, n_dof))  # duplicates are summed


def _reduce(m, free: np.ndarray):
    return m[np.ix_(free, free)] if isinstance(m, np.ndarray) else m[free][:, free].tocsr()


def assemble(mesh: Mesh, sparse: bool | None = None) -> Assembled:
    """Assemble and reduce the global matrices of ``mesh`` (sparse when large, unless told)."""
    n = mesh.n_dof
    if sparse is None:
        sparse = n > DENSE_ASSEMBLY_MAX_DOF
    kb = elastic_stiffness(mesh.L, mesh.EI, mesh.phi)
    ke = kb.copy()
    if np.any(mesh.k_found):
        ke += foundation_stiffness(mesh.L, mesh.k_found, mesh.phi)
    springs = np.empty(n)
    springs[0::2] = mesh.k_lat
    springs[1::2] = mesh.k_rot
    rigid = np.isinf(springs)
    lean_var = np.zeros(n)
    lean_var[0::2] = mesh.lean_var
    lean_perm = np.zeros(n)
    lean_perm[0::2] = mesh.lean_perm

    K0 = _scatter(ke, n, np.where(rigid, 0.0, springs), sparse)
    G = _scatter(geometric_stiffness(mesh.L, mesh.N_var, mesh.phi), n, lean_var, sparse)
    free = np.flatnonzero(~rigid)
    K0r = _reduce(K0, free)
    if np.any(mesh.N_perm) or np.any(lean_perm):
        Kp = _scatter(geometric_stiffness(mesh.L, mesh.N_perm, mesh.phi), n, lean_perm, sparse)
        Kr = _reduce(K0 - Kp, free)
    else:
        Kr = K0r
    return Assembled(matrices=(Kr, K0r, _reduce(G, free)), free=free, n_full=n, k_bending=kb)


def _chord_rotations(mesh: Mesh, w: np.ndarray, th: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Chord slopes ``psi`` and end rotations relative to the chord ``a``, ``b`` of every element."""
    L = mesh.L if w.ndim == 1 else mesh.L[:, None]
    psi = (w[1:] - w[:-1]) / L
    return psi, th[:-1] - psi, th[1:] - psi


def bending_energies(asm: Assembled, a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Bending (and shear) energy ``0.5 [a b] k_rr [a b]^T`` of every element, (n_el,) or (n_el, m).

    ``a``, ``b`` are the end rotations relative to the element chord; a rigid-body motion stores no energy,
    so this equals ``0.5 u^T k_e u`` without its cancellation.
    """
    kb = asm.k_bending
    if a.ndim == 1:
        return 0.5 * (kb[:, 1, 1] * a * a + 2 * kb[:, 1, 3] * a * b + kb[:, 3, 3] * b * b)
    return 0.5 * (kb[:, 1, 1, None] * a * a + 2 * kb[:, 1, 3, None] * a * b + kb[:, 3, 3, None] * b * b)


def element_bending_energies(mesh: Mesh, asm: Assembled, full: np.ndarray) -> np.ndarray:
    """Bending energy of every element for mode vectors in the full numbering (n_full, m): (n_el, m)."""
    _, a, b = _chord_rotations(mesh, full[0::2], full[1::2])
    return bending_energies(asm, a, b)


def rayleigh_quotients(mesh: Mesh, asm: Assembled, vec: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Load factors ``v^T K v / v^T G v`` of vectors ``vec`` (n_red, m), evaluated element by element.

    Returns the quotients and, for each vector, the share of its elastic energy stored in the springs
    and foundations (as opposed to the members).

    The bending energy of an element depends only on its end rotations relative to its chord,
    ``a = theta_1 - psi`` and ``b = theta_2 - psi`` with ``psi = (w_2 - w_1) / L`` (a rigid-body motion
    stores none), so it is evaluated as ``[a b] k_rr [a b]^T`` with ``k_rr`` the rotation block of the
    element stiffness.  The assembled matrix instead sums terms of order ``EI / L^3 * w^2`` that
    cancel down to ``EI * curvature^2``: on fine meshes, or where a far stiffer part moves almost
    rigidly, that cancellation costs up to ``(H / L_e)^4`` in round-off.  The quotient is stationary at
    an eigenvector, so the solver's vectors give load factors accurate to second order.
    """
    full = np.zeros((asm.n_full, vec.shape[1]))
    full[asm.free] = vec
    w, th = full[0::2], full[1::2]  # (n_nodes, m)
    psi, a, b = _chord_rotations(mesh, w, th)
    U_members = 2.0 * np.sum(bending_energies(asm, a, b), axis=0)
    U = np.zeros_like(U_members)
    if np.any(mesh.k_found):
        kf = foundation_stiffness(mesh.L, mesh.k_found, mesh.phi)
        ue = np.stack([w[:-1], th[:-1], w[1:], th[1:]], axis=1)  # (n_el, 4, m)
        U += np.einsum("eim,eij,ejm->m", ue, kf, ue)
    k_lat = np.where(np.isinf(mesh.k_lat), 0.0, mesh.k_lat)
    k_rot = np.where(np.isinf(mesh.k_rot), 0.0, mesh.k_rot)
    U += k_lat @ (w * w) + k_rot @ (th * th)
    share = U / np.maximum(U + U_members, 1e-300)
    U += U_members
    _, dN = shape_functions(GAUSS_XI, mesh.L, mesh.phi)
    # slope at the Gauss points: the chord slope plus the part due to the relative rotations
    slope = psi[:, None, :] + dN[:, :, 1, None] * a[:, None, :] + dN[:, :, 3, None] * b[:, None, :]
    wts = GAUSS_W[None, :] * mesh.L[:, None]
    U -= np.einsum("eg,egm->m", mesh.N_perm * wts, slope * slope) + mesh.lean_perm @ (w * w)
    V = np.einsum("eg,egm->m", mesh.N_var * wts, slope * slope) + mesh.lean_var @ (w * w)
    return U / V, share


def residual(mesh: Mesh, asm: Assembled, v: np.ndarray, lam: float) -> np.ndarray:
    """``K v - lam G v`` for one vector (reduced numbering), element by element without cancellation.

    The member forces come from the end rotations relative to the chord (as in
    :func:`rayleigh_quotients`): moments ``m = k_rr [a b]^T`` at the ends and shears ``+-(m_1 + m_2) / L``.
    The geometric terms use the slope at the Gauss points in the same split form.
    """
    full = np.zeros(asm.n_full)
    full[asm.free] = v
    w, th = full[0::2], full[1::2]
    L = mesh.L
    psi, a, b = _chord_rotations(mesh, w, th)
    kb = asm.k_bending
    ma = kb[:, 1, 1] * a + kb[:, 1, 3] * b
    mb = kb[:, 3, 1] * a + kb[:, 3, 3] * b
    _, dN = shape_functions(GAUSS_XI, L, mesh.phi)
    d1, d3 = dN[:, :, 1], dN[:, :, 3]
    slope = psi[:, None] + d1 * a[:, None] + d3 * b[:, None]
    f = (mesh.N_perm + lam * mesh.N_var) * GAUSS_W[None, :] * L[:, None] * slope  # (n_el, 4) slope work
    # d slope / d(theta_1, theta_2, psi) = (d1, d3, 1 - d1 - d3); d psi / d(w_1, w_2) = (-1/L, 1/L)
    ga = ma - np.sum(f * d1, axis=1)
    gb = mb - np.sum(f * d3, axis=1)
    gpsi = -(ma + mb) - np.sum(f * (1.0 - d1 - d3), axis=1)
    r = np.zeros(asm.n_full)
    np.add.at(r, 2 * np.arange(mesh.n_el), -gpsi / L)
    np.add.at(r, 2 * np.arange(1, mesh.n_el + 1), gpsi / L)
    np.add.at(r, 2 * np.arange(mesh.n_el) + 1, ga)
    np.add.at(r, 2 * np.arange(1, mesh.n_el + 1) + 1, gb)
    if np.any(mesh.k_found):
        kf = foundation_stiffness(L, mesh.k_found, mesh.phi)
        idx = 2 * np.arange(mesh.n_el)[:, None] + np.arange(4)[None, :]
        np.add.at(r, idx, np.einsum("eij,ej->ei", kf, full[idx]))
    r[0::2] += (np.where(np.isinf(mesh.k_lat), 0.0, mesh.k_lat) - mesh.lean_perm - lam * mesh.lean_var) * w
    r[1::2] += np.where(np.isinf(mesh.k_rot), 0.0, mesh.k_rot) * th
    return r[asm.free]
