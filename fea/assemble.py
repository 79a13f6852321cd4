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

from .elements import elastic_stiffness, foundation_stiffness, geometric_stiffness
from .mesh import Mesh

__all__ = ["Assembled", "assemble"]


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
