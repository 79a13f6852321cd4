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
import scipy.sparse as sp

from .elements import elastic_stiffness, foundation_stiffness, geometric_stiffness
from .mesh import Mesh

__all__ = ["Assembled", "assemble"]


@dataclass(frozen=True)
class Assembled:
    """Reduced global matrices of the eigenproblem ``K phi = lam G phi`` (sparse, CSR).

    Attributes
    ----------
    Ks : (n, n) elastic + springs + foundation, minus the permanent-load geometric
        stiffness (the stiffness the variable load acts against) [SI]
    K0s : (n, n) elastic + springs + foundation only (no geometric terms)
    Gs : (n, n) geometric stiffness of the variable loads at load factor 1
    free : (n,) indices of the retained degrees of freedom in the full numbering
    n_full : number of degrees of freedom before elimination
    k_bending : (n_el, 4, 4) element bending stiffness, for energy shares

    ``K``, ``K0`` and ``G`` give the same matrices as dense arrays (built on
    first use).
    """

    Ks: sp.csr_matrix
    K0s: sp.csr_matrix
    Gs: sp.csr_matrix
    free: np.ndarray
    n_full: int
    k_bending: np.ndarray

    @cached_property
    def K(self) -> np.ndarray:
        return self.Ks.toarray()

    @cached_property
    def K0(self) -> np.ndarray:
        return self.K0s.toarray()

    @cached_property
    def G(self) -> np.ndarray:
        return self.Gs.toarray()

    @property
    def n(self) -> int:
        return self.Ks.shape[0]


def _scatter(ke: np.ndarray, n_dof: int, diag: np.ndarray | None = None) -> sp.csr_matrix:
    """Add element matrices (n_el, 4, 4) of a chain of elements (and a diagonal) into a sparse matrix."""
    n_el = ke.shape[0]
    # element e couples dofs 2e .. 2e+3; overlapping 2x2 blocks at shared nodes
    idx = 2 * np.arange(n_el)[:, None] + np.arange(4)[None, :]
    rows = np.repeat(idx, 4, axis=1).ravel()
    cols = np.tile(idx, (1, 4)).ravel()
    vals = ke.reshape(n_el, 16).ravel()
    if diag is not None:
        d = np.arange(n_dof)
        rows, cols, vals = np.concatenate([rows, d]), np.concatenate([cols, d]), np.concatenate([vals, diag])
    return sp.csr_matrix((vals, (rows, cols)), shape=(n_dof, n_dof))  # duplicates are summed


def assemble(mesh: Mesh) -> Assembled:
    """Assemble and reduce the global matrices of ``mesh``."""
    n = mesh.n_dof
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

    K0 = _scatter(ke, n, np.where(rigid, 0.0, springs))
    G = _scatter(geometric_stiffness(mesh.L, mesh.N_var, mesh.phi), n, lean_var)
    free = np.flatnonzero(~rigid)
    K0r = K0[free][:, free]
    if np.any(mesh.N_perm) or np.any(lean_perm):
        Kp = _scatter(geometric_stiffness(mesh.L, mesh.N_perm, mesh.phi), n, lean_perm)
        Kr = (K0 - Kp)[free][:, free]
    else:
        Kr = K0r
    return Assembled(Ks=Kr.tocsr(), K0s=K0r.tocsr(), Gs=G[free][:, free].tocsr(), free=free, n_full=n,
                     k_bending=kb)
