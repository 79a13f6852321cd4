"""The discretised imperfect column of one bending plane: mesh, matrices, bow and lateral loads.

Shared by the second-order elastic analysis (:mod:`fea.solve.second_order`) and
the nonlinear path (:mod:`fea.solve.imperfect_path`), which both solve on these
nested meshes.  Element matrices are those of :mod:`fea.elements`; the bow
shapes are described in :mod:`fea.model.imperfection`.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np

from ..assemble import Assembled, assemble
from ..elements import GAUSS_W, GAUSS_XI, elastic_stiffness, foundation_stiffness, geometric_stiffness, shape_functions
from ..errors import ModelError
from ..mesh import Mesh, build_mesh
from ..model import STATION_TOL, Column, Restraint
from ..model.imperfection import Imperfection, LateralActions, bow_pieces, offsets_interpolant, piece_value
from .eigen import solve_assembled

__all__ = ["Discrete", "discretise", "first_mode", "segment_of_elements"]


@dataclass(frozen=True)
class Discrete:
    """One mesh of the column with everything the second-order solution needs."""

    column: Column
    mesh: Mesh
    asm: Assembled         # the matrices of this mesh
    free: np.ndarray
    K: np.ndarray          # reduced, elastic + springs + foundation - permanent geometric
    K0: np.ndarray         # reduced, no geometric terms
    G: np.ndarray          # reduced, variable geometric at lam = 1
    k_el: np.ndarray       # (n_el, 4, 4) elastic + foundation element matrices
    kg_var: np.ndarray     # (n_el, 4, 4)
    kg_perm: np.ndarray    # (n_el, 4, 4)
    idx: np.ndarray        # (n_el, 4) element dofs in the full numbering
    w0e: np.ndarray        # (n_el, 4) element bow dofs (values and slopes)
    w0n: np.ndarray        # (n_nodes,) bow at the nodes
    fq_var: np.ndarray     # (n_el, 4) consistent element lateral loads, variable
    fq_perm: np.ndarray    # (n_el, 4) permanent
    f0: np.ndarray         # (n_full,) load at lam = 0 (permanent actions and bow terms)
    f1: np.ndarray         # (n_full,) load per unit lam
    f0_lat: np.ndarray     # (n_full,) the lateral actions alone (no bow terms), permanent
    f1_lat: np.ndarray     # (n_full,) the same, per unit lam
    N_end_var: np.ndarray  # (n_el, 2) axial compression at the element ends per unit lam
    N_end_perm: np.ndarray
    lean_var: np.ndarray   # (n_nodes,)
    lean_perm: np.ndarray


def _with_stations(column: Column, xs) -> Column:
    """The column with zero-stiffness restraints added so that ``xs`` are stations (nodes)."""
    H = column.height
    tol = STATION_TOL * H
    have = column.stations()
    extra: list[float] = []
    for x in xs:
        x = min(max(float(x), 0.0), H)
        if all(abs(x - s) > tol for s in have) and all(abs(x - e) > tol for e in extra):
            extra.append(x)
    if not extra:
        return column
    return replace(column, restraints=column.restraints + tuple(Restraint(x, 0.0, 0.0) for x in extra))


def _element_bow(column: Column, imp: Imperfection | None, mesh: Mesh, mode_full: np.ndarray | None):
    n_el = mesh.n_el
    x0, x1 = mesh.x[:-1], mesh.x[1:]
    w0e = np.zeros((n_el, 4))
    if imp is None or imp.is_zero:
        return w0e
    if imp.shape == "mode":
        assert mode_full is not None, "a mode-shaped bow needs the mode"
        idx = 2 * np.arange(n_el)[:, None] + np.arange(4)[None, :]
        m = mode_full[idx]
        return imp.piece_amplitude(column.height) * m
    if imp.shape == "offsets":
        f = offsets_interpolant(imp)
        v0, s0 = f(x0)
        v1, s1 = f(x1)
        return np.stack([v0, s0, v1, s1], axis=1)
    mid = 0.5 * (x0 + x1)
    for a, b, kind, amp in bow_pieces(column, imp):
        sel = (mid > a) & (mid < b)
        if not np.any(sel):
            continue
        v0, s0 = piece_value(kind, a, b, amp, x0[sel])
        v1, s1 = piece_value(kind, a, b, amp, x1[sel])
        w0e[sel] = np.stack([v0, s0, v1, s1], axis=1)
    return w0e


def first_mode(mesh: Mesh, asm) -> np.ndarray:
    """First buckling mode on ``mesh`` in the full numbering, largest lateral value +1."""
    lam, vec, _ = solve_assembled(asm, 1)
    if lam.size == 0:
        raise ModelError("imperfection.shape", "'mode' needs a buckling mode, but the variable loads cause no "
                                               "buckling in this plane; use 'half-sine' or 'between-restraints'")
    full = np.zeros(asm.n_full)
    full[asm.free] = vec[:, 0]
    w = full[0::2]
    j = int(np.argmax(np.abs(w)))
    return full / w[j]


def _axial_ends(column: Column, mesh: Mesh, permanent: bool) -> np.ndarray:
    H = column.height
    d = 10.0 * STATION_TOL * H
    xb = mesh.x[:-1] + d
    xt = mesh.x[1:] - d
    return np.stack([column.axial_force(xb, permanent=permanent), column.axial_force(xt, permanent=permanent)],
                    axis=1)


def discretise(column: Column, imperfection: Imperfection | None = None, actions: LateralActions | None = None,
               level: int = 1) -> Discrete:
    """Mesh, matrices, bow and loads of ``column`` at refinement ``level``.

    Stations are added (as zero-stiffness restraints, which change nothing) at
    the heights of the lateral actions and of measured bow offsets, so that
    every one is a node.
    """
    actions = actions or LateralActions()
    actions.check(column)
    xs = list(actions.stations())
    if imperfection is not None and imperfection.shape == "offsets":
        xs += [h for h, _ in imperfection.offsets if 0 <= h <= column.height]
    col = _with_stations(column, xs)
    mesh = build_mesh(col, level)
    asm = assemble(mesh)
    n = asm.n_full
    kb = elastic_stiffness(mesh.L, mesh.EI, mesh.phi)
    k_el = kb + (foundation_stiffness(mesh.L, mesh.k_found, mesh.phi) if np.any(mesh.k_found) else 0.0)
    kg_var = geometric_stiffness(mesh.L, mesh.N_var, mesh.phi)
    kg_perm = geometric_stiffness(mesh.L, mesh.N_perm, mesh.phi)
    idx = 2 * np.arange(mesh.n_el)[:, None] + np.arange(4)[None, :]

    mode_full = None
    if imperfection is not None and imperfection.shape == "mode" and not imperfection.is_zero:
        mode_full = first_mode(mesh, asm)
    w0e = _element_bow(col, imperfection, mesh, mode_full)
    w0n = np.zeros(mesh.n_nodes)
    w0n[:-1] = w0e[:, 0]
    w0n[-1] = w0e[-1, 2]

    # consistent lateral loads per element (4-point Gauss: exact for linear q on cubics)
    N_sh, _ = shape_functions(GAUSS_XI, mesh.L, mesh.phi)  # (n_el, 4, 4)
    fq = {False: np.zeros((mesh.n_el, 4)), True: np.zeros((mesh.n_el, 4))}
    tol = STATION_TOL * col.height
    mid = 0.5 * (mesh.x[:-1] + mesh.x[1:])
    for d in actions.distributed:
        inside = (mid > d.bottom - tol) & (mid < d.top + tol)
        if not np.any(inside):
            continue
        q = d.q_at(mesh.x_gauss[inside])  # (m, 4)
        wts = q * (GAUSS_W[None, :] * mesh.L[inside, None])
        fq[d.permanent][inside] += np.einsum("eg,egi->ei", wts, N_sh[inside])
    nodal = {False: np.zeros(n), True: np.zeros(n)}
    for p in actions.point:
        node = int(np.argmin(np.abs(mesh.x - p.at)))
        nodal[p.permanent][2 * node] += p.force
    for m in actions.moments:
        node = int(np.argmin(np.abs(mesh.x - m.at)))
        nodal[m.permanent][2 * node + 1] += m.moment

    def scatter(fe):
        out = np.zeros(n)
        np.add.at(out, idx, fe)
        return out

    bow_var = scatter(np.einsum("eij,ej->ei", kg_var, w0e))
    bow_var[0::2] += mesh.lean_var * w0n
    bow_perm = scatter(np.einsum("eij,ej->ei", kg_perm, w0e))
    bow_perm[0::2] += mesh.lean_perm * w0n
    f1_lat = scatter(fq[False]) + nodal[False]
    f0_lat = scatter(fq[True]) + nodal[True]
    return Discrete(column=col, mesh=mesh, asm=asm, free=asm.free, K=asm.K, K0=asm.K0, G=asm.G, k_el=k_el,
                    kg_var=kg_var, kg_perm=kg_perm, idx=idx, w0e=w0e, w0n=w0n, fq_var=fq[False], fq_perm=fq[True],
                    f0=bow_perm + f0_lat, f1=bow_var + f1_lat, f0_lat=f0_lat, f1_lat=f1_lat,
                    N_end_var=_axial_ends(col, mesh, False), N_end_perm=_axial_ends(col, mesh, True),
                    lean_var=mesh.lean_var, lean_perm=mesh.lean_perm)


def segment_of_elements(column: Column, x: np.ndarray) -> np.ndarray:
    """Segment index (of ``column``'s segments) of every element of a mesh with node heights ``x``."""
    joints = np.array(column.joints)
    mid = 0.5 * (x[:-1] + x[1:])
    return np.clip(np.searchsorted(joints, mid, side="right") - 1, 0, len(column.segments) - 1)
