"""Global matrices of a mesh, with rigid restraints eliminated.

Pure: arrays in, arrays out.  Degrees of freedom are numbered ``2 * node + k``
with ``k = 0`` lateral displacement and ``k = 1`` rotation.  Rigid restraints
(``inf`` springs) remove their degree of freedom; finite springs are added to
the diagonal.  No penalty numbers are used anywhere.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .elements import elastic_stiffness, foundation_stiffness, geometric_stiffness
from .mesh import Mesh

__all__ = ["Assembled", "assemble"]


@dataclass(frozen=True)
class Assembled:
    """Reduced global matrices of the eigenproblem ``K phi = lam G phi``.

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

    K: np.ndarray
    K0: np.ndarray
    G: np.ndarray
    free: np.ndarray
    n_full: int
    k_bending: np.ndarray


def _scatter(ke: np.ndarray, n_dof: int) -> np.ndarray:
    """Add element matrices (n_el, 4, 4) of a chain of elements into a dense matrix."""
    n_el = ke.shape[0]
    out = np.zeros((n_dof, n_dof))
    # element e couples dofs 2e .. 2e+3; overlapping 2x2 blocks at shared nodes
    idx = 2 * np.arange(n_el)[:, None] + np.arange(4)[None, :]
    rows = np.repeat(idx, 4, axis=1).ravel()
    cols = np.tile(idx, (1, 4)).ravel()
    np.add.at(out, (rows, cols), ke.reshape(n_el, 16).ravel())
    return out


def assemble(mesh: Mesh) -> Assembled:
    """Assemble and reduce the global matrices of ``mesh``."""
    n = mesh.n_dof
    kb = elastic_stiffness(mesh.L, mesh.EI, mesh.phi)
    ke = kb.copy()
    if np.any(mesh.k_found):
        ke += foundation_stiffness(mesh.L, mesh.k_found, mesh.phi)
    gv = geometric_stiffness(mesh.L, mesh.N_var, mesh.phi)
    K0 = _scatter(ke, n)
    G = _scatter(gv, n)
    Kp = np.zeros((n, n))
    if np.any(mesh.N_perm):
        Kp = _scatter(geometric_stiffness(mesh.L, mesh.N_perm, mesh.phi), n)

    springs = np.empty(n)
    springs[0::2] = mesh.k_lat
    springs[1::2] = mesh.k_rot
    rigid = np.isinf(springs)
    finite = ~rigid
    K0[np.diag_indices(n)] += np.where(finite, springs, 0.0)
    lean_var = np.zeros(n)
    lean_var[0::2] = mesh.lean_var
    lean_perm = np.zeros(n)
    lean_perm[0::2] = mesh.lean_perm
    G[np.diag_indices(n)] += lean_var
    Kp[np.diag_indices(n)] += lean_perm

    free = np.flatnonzero(finite)
    ix = np.ix_(free, free)
    K0r = K0[ix]
    return Assembled(K=K0r - Kp[ix], K0=K0r, G=G[ix], free=free, n_full=n, k_bending=kb)
