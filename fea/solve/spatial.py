r"""Flexural, torsional, flexural-torsional and lateral-torsional buckling of thin-walled members.

A self-contained, array-based kernel on the model of :mod:`fea.solve.spatial_model`; its element
matrices are in :mod:`fea.solve.spatial_element`.  Axes and signs (``docs/spatial.md``):

* ``x`` along the member; ``y`` the major and ``z`` the minor principal axis through the centroid;
* ``u``, ``v``: displacements of the shear centre along ``y`` and ``z`` (``u`` bends about the minor
  axis, stiffness ``E I_z``; ``v`` about the major axis, ``E I_y``);
* ``phi``: twist about the shear-centre axis, positive turning ``+y`` towards ``+z``; a point at
  ``(y, z)`` then moves by ``(u - (z - z0) phi, v + (y - y0) phi)``;
* ``(y0, z0)``: shear centre from the centroid; ``i0^2 = (I_y + I_z)/A + y0^2 + z0^2``;
* ``N``: axial force at the centroid, compression positive;
* ``M``: major-axis moment, positive when it compresses the fibres at ``z > 0``
  (fibre stress ``sigma = -N/A - M z / I_y``, tension positive);
* ``beta_y = (1/I_y) int z (y^2 + z^2) dA - 2 z0``: negative when the larger flange is at ``+z``.

The functional (total potential of the buckled shape, quadratic in the buckling displacements)::

    Pi = 1/2 int [ E I_z u''^2 + E I_y v''^2 + E I_w phi''^2 + G J phi'^2 ] dx
       - 1/2 int N [ u'^2 + v'^2 + i0^2 phi'^2 + 2 z0 u' phi' - 2 y0 v' phi' ] dx
       - int M phi u'' dx - 1/2 int beta_y M phi'^2 dx
       + 1/2 sum (springs) + 1/2 int (continuous offset springs)

The axial terms are the work of ``sigma`` through the second-order shortening
``1/2 (dy'^2 + dz'^2)`` of each fibre, integrated over the section (Timoshenko & Gere, *Theory of
Elastic Stability*, 2nd ed., 1961, section 5.3, from memory).  The moment term ``-M phi u''`` gives the
classical lateral-bending and torsion equations ``E I_z u'' = M phi`` and
``G J phi' - E I_w phi''' = -M u'`` in these axes (the twisted section turns a share ``phi`` of the
major-axis moment into a minor-axis moment; the bent axis a share ``u'`` into a torque:
Timoshenko & Gere section 6.2; Trahair, *Flexural-Torsional Buckling of Structures*, 1993, ch. 6,
both from memory); the Wagner term ``-1/2 beta_y M phi'^2`` is the same second-order work of the
bending stress ``-M z / I_y`` at radius ``(y - y0)^2 + (z - z0)^2`` from the shear centre (Trahair,
1993, from memory).  Pre-buckling deflections are neglected (the classical linear theory); moments
are taken as applied through the shear-centre axis without load-height effects.

Load factor: ``Pi = 1/2 d^T (K + A_perm) d + lam/2 d^T A_var d``; the lowest positive ``lam`` of
``(K + A_perm) d = lam (-A_var) d`` are sought (variable axial loads and every moment scaled together,
permanent axial loads held), as the largest positive ``mu = 1/lam`` of ``G d = mu K d``.

Discretisation: every interval between stations is split into ``2**level`` equal two-node elements,
each field a cubic Hermite interpolant; the mesh is doubled until the Richardson estimate of every
reported load factor is within the tolerance, with the order observed from three levels (about 4),
as :mod:`fea.solve.eigen` does for the plane column.

Storage and solvers: the global matrices are assembled in diagonal (banded) storage, 11 diagonals on
each side, and reduced there (rigid restraints removed); a reduced system of up to :data:`DENSE_MAX`
unknowns is expanded and solved dense with numpy alone, a larger one by a banded Cholesky factor and
ARPACK.  Rigid offset restraints (DOFs that follow others) are reduced dense, ``T^T A T``.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from ..errors import ModelError, SolverError
from . import spatial_element as el
from .spatial_model import AxialLoad, OffsetRestraint, SpatialColumn, SpatialRestraint, SpatialSegment

__all__ = ["SpatialColumn", "SpatialSegment", "SpatialRestraint", "OffsetRestraint", "AxialLoad", "SpatialResult",
           "CriticalMoment", "spatial_buckling", "critical_moment", "load_factors_on", "DEFAULT_TOL", "MODE_KINDS"]

DEFAULT_TOL = 1e-6
#: Deepest refinement level (2**level elements per interval) and largest system solved densely.
MAX_LEVEL = 9
MAX_DOF = 2400
#: A mode is of one kind when that kind holds at least this share of its elastic strain energy.
PURE_SHARE = 0.99
#: A segment with less than this share of a mode's elastic energy gets no effective-length factor.
SEGMENT_SHARE_MIN = 0.01

MODE_KINDS = ("flexural (minor axis)", "flexural (major axis)", "torsional", "flexural-torsional",
              "lateral-torsional", "flexural (both axes)")


@dataclass(frozen=True)
class SpatialResult:
    """Buckling of a thin-walled member.

    Attributes
    ----------
    load_factors : (m,) lowest positive load factors, ascending
    kinds : (m,) plain-word kind of each mode (:data:`MODE_KINDS`)
    heights : (n,) node stations [m]
    u, v, phi : (m, n) mode components at the nodes [m, m, rad], scaled so that the largest of
        ``|u|``, ``|v|`` and ``i0 |phi|`` is 1 and positive
    energy_shares : (m, 3) shares of each mode's elastic strain energy in u, v and phi
    segment_energy : (m, n_seg) share of each mode's elastic strain energy in each segment
    segment_N_cr : (m, n_seg) largest axial compression in each segment at each mode's load factor [N]
    segment_K : (m, n_seg) effective-length factor of each segment for the mode's kind (minor-axis or
        major-axis flexural from ``N_cr = pi^2 E I / (K L)^2``; torsional from
        ``N_cr i0^2 = G J + pi^2 E I_w / (K L)^2``); NaN where not meaningful (a flexural-torsional or
        lateral-torsional mode, no compression, or less than 1% of the mode's energy in the segment)
    discretisation_errors : (m,) Richardson estimates of the relative error of each load factor
    orders : (m,) last observed order of convergence of each load factor (NaN before three levels)
    history : (levels, ) lowest load factor at each mesh level
    n_elements : elements of the final mesh
    tolerance, converged, message : the requested tolerance, whether every reported factor met it, and why
    """

    load_factors: np.ndarray
    kinds: tuple[str, ...]
    heights: np.ndarray
    u: np.ndarray
    v: np.ndarray
    phi: np.ndarray
    energy_shares: np.ndarray
    segment_energy: np.ndarray
    segment_N_cr: np.ndarray
    segment_K: np.ndarray
    discretisation_errors: np.ndarray
    orders: np.ndarray
    history: np.ndarray
    n_elements: int
    tolerance: float
    converged: bool
    message: str


@dataclass(frozen=True)
class CriticalMoment:
    """Elastic critical moment: ``moment = load_factor * reference_moment`` [N m].

    ``reference_moment`` is the largest magnitude of the applied end moments; ``result`` the full analysis.
    """

    moment: float
    load_factor: float
    reference_moment: float
    result: SpatialResult


# -- mesh ---------------------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class _Mesh:
    x: np.ndarray  # (n_nodes,)
    seg: np.ndarray  # (n_el,) segment of each element
    h: np.ndarray  # (n_el,)
    station_node: dict[float, int]


def _build_mesh(col: SpatialColumn, level: int) -> _Mesh:
    st = np.asarray(col.stations())
    k = 2**level
    t = np.arange(k) / k
    return _mesh_on(col, np.append((st[:-1, None] + np.diff(st)[:, None] * t[None, :]).ravel(), st[-1]))


def _mesh_on(col: SpatialColumn, x: np.ndarray) -> _Mesh:
    """The mesh with nodes ``x`` (ascending, every station among them)."""
    st = np.asarray(col.stations())
    mid = 0.5 * (x[:-1] + x[1:])
    seg = np.clip(np.searchsorted(np.asarray(col.joints), mid) - 1, 0, len(col.segments) - 1)
    at = np.abs(x[None, :] - st[:, None]).argmin(axis=1)
    if np.any(np.abs(x[at] - st) > 1e-9 * col.length):
        raise ModelError("nodes", "every station of the member must be a node")
    return _Mesh(x=x, seg=seg, h=np.diff(x), station_node={float(s): int(i) for s, i in zip(st, at)})


def load_factors_on(column: SpatialColumn, nodes: np.ndarray, n_modes: int = 1) -> np.ndarray:
    """Lowest positive load factors on the mesh with the given nodes, without refinement (a check of the kernel).

    Parameters
    ----------
    column : the member
    nodes : (n,) ascending node stations [m], every station of ``column`` among them
    n_modes : number of load factors wanted
    """
    _check_loads(column)
    return _eigen(_assemble(column, _mesh_on(column, np.asarray(nodes, dtype=float))), n_modes)[0]


def _node_at(col: SpatialColumn, mesh: _Mesh, at: float) -> int:
    st = np.asarray(list(mesh.station_node))
    return mesh.station_node[float(st[int(np.argmin(np.abs(st - at)))])]


def _offset_from_sc(s: SpatialSegment, o: OffsetRestraint) -> tuple[float, float]:
    if o.reference == "centroid":
        return o.ey - s.y0, o.ez - s.z0
    return o.ey, o.ez


# -- assembly -----------------------------------------------------------------------------------------------------
#: Half-bandwidth of the global matrices in the full numbering: an element couples 12 consecutive DOFs.
HALF_BAND = 11


def _scatter(n_dof: int, mats: np.ndarray) -> np.ndarray:
    """Global matrix from element matrices (n_el, 12, 12) on consecutive nodes, in diagonal storage.

    Returns ``B`` (2 w + 1, n_dof), ``w = HALF_BAND``, with ``B[w + i - j, j] = A[i, j]`` (the banded form of
    ``scipy.linalg.solve_banded`` with ``w`` diagonals on each side).  The terms of each entry are summed in
    element order, as a dense scatter sums them: the stored values are the dense matrix's to the last bit.
    """
    n_el = mats.shape[0]
    w = HALF_BAND
    i = np.arange(12)
    idx = ((w + i[:, None] - i[None, :])[None] * n_dof + 6 * np.arange(n_el)[:, None, None] + i[None, None, :]).ravel()
    return np.bincount(idx, weights=mats.ravel(), minlength=(2 * w + 1) * n_dof).reshape(2 * w + 1, n_dof)


def _half(B: np.ndarray) -> int:
    """Number of diagonals on each side of the main one held by the diagonal storage ``B``."""
    return (B.shape[0] - 1) // 2


def _rows(B: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Row and column of every entry of the diagonal storage ``B`` (rows out of range included)."""
    w, n = _half(B), B.shape[1]
    cols = np.broadcast_to(np.arange(n)[None, :], B.shape)
    return cols + np.arange(-w, w + 1)[:, None], cols


def _diagonal_slices(n: int, w: int) -> list[tuple[int, slice, slice]]:
    """For each stored diagonal ``d`` of an (n, n) matrix: its row ``w + d`` of the storage, the slice of that
    row it fills, and the slice of the flattened matrix it occupies."""
    out = []
    for d in range(-min(w, n - 1), min(w, n - 1) + 1):
        if d >= 0:  # A[j + d, j], j = 0 .. n - d - 1
            out.append((w + d, slice(0, n - d), slice(d * n, n * n, n + 1)))
        else:  # A[j + d, j], j = -d .. n - 1
            out.append((w + d, slice(-d, n), slice(-d, (n + d) * n, n + 1)))
    return out


def _to_dense(B: np.ndarray) -> np.ndarray:
    """The dense (n, n) matrix of the diagonal storage ``B``."""
    n = B.shape[1]
    A = np.zeros((n, n))
    flat = A.reshape(-1)
    for k, part, at in _diagonal_slices(n, _half(B)):
        flat[at] = B[k, part]
    return A


def _to_diagonals(A: np.ndarray, w: int) -> np.ndarray:
    """Diagonal storage (2 w + 1, n) of a dense matrix that is zero outside ``w`` diagonals on each side."""
    n = A.shape[0]
    B = np.zeros((2 * w + 1, n))
    flat = A.reshape(-1)
    for k, part, at in _diagonal_slices(n, w):
        B[k, part] = flat[at]
    return B


def _bandwidth(A: np.ndarray) -> int:
    """Largest distance from the diagonal of a nonzero of the dense matrix ``A``."""
    rows, cols = np.nonzero(A)
    return int(np.max(np.abs(rows - cols), initial=0))


@dataclass
class _System:
    K: np.ndarray  # elastic stiffness with springs (full numbering, diagonal storage)
    Kel: np.ndarray  # (n_el, 12, 12) element elastic matrices (energy shares)
    A_perm: np.ndarray | None  # None: no permanent axial load
    A_var: np.ndarray
    T: np.ndarray | None  # full = T @ reduced when there are slave relations
    free: np.ndarray  # kept DOFs (full numbering) when T is None
    N_var: np.ndarray  # (n_el,)
    N_perm: np.ndarray
    reduced: tuple[np.ndarray, np.ndarray, np.ndarray] | None = None  # (K, K + A_perm, A_var), reduced, diagonals


def _reduced(sys: _System) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The reduced elastic stiffness, stiffness with the permanent loads, and variable-load matrix, in diagonal
    storage (computed once)."""
    if sys.reduced is None:
        if sys.T is None:
            if sys.A_perm is None:
                K0, A_var = _reduce_free(sys.free, sys.K, sys.A_var)
                Keff = K0
            else:
                K0, A_perm, A_var = _reduce_free(sys.free, sys.K, sys.A_perm, sys.A_var)
                Keff = K0 + A_perm
            sys.reduced = (K0, Keff, A_var)
        else:
            T = sys.T
            K0d = T.T @ _to_dense(sys.K) @ T
            Keffd = K0d if sys.A_perm is None else K0d + T.T @ _to_dense(sys.A_perm) @ T
            Ad = T.T @ _to_dense(sys.A_var) @ T
            w = max(_bandwidth(K0d), _bandwidth(Keffd), _bandwidth(Ad))
            sys.reduced = (_to_diagonals(K0d, w), _to_diagonals(Keffd, w), _to_diagonals(Ad, w))
    return sys.reduced


def _axial(col: SpatialColumn, mid: np.ndarray, permanent: bool) -> np.ndarray:
    N = np.zeros_like(mid)
    for p in col.loads:
        if p.permanent == permanent:
            N += np.where(mid < p.at, p.P, 0.0)
    return N


def _assemble(col: SpatialColumn, mesh: _Mesh) -> _System:
    segs = col.segments
    n_dof = 6 * mesh.x.size
    prop = {name: np.array([getattr(s, name) for s in segs])[mesh.seg]
            for name in ("E", "G", "I_y", "I_z", "J", "I_w", "y0", "z0", "beta_y", "M1", "M2", "length")}
    i0sq = np.array([s.i0**2 for s in segs])[mesh.seg]
    Kel = el.elastic(mesh.h, prop["E"] * prop["I_z"], prop["E"] * prop["I_y"], prop["E"] * prop["I_w"],
                     prop["G"] * prop["J"])
    K = _scatter(n_dof, Kel)
    mid = 0.5 * (mesh.x[:-1] + mesh.x[1:])
    joints = np.asarray(col.joints)
    xg = mesh.x[:-1, None] + mesh.h[:, None] * el.XI[None, :]
    s_loc = (xg - joints[mesh.seg][:, None]) / prop["length"][:, None]
    M = prop["M1"][:, None] + (prop["M2"] - prop["M1"])[:, None] * s_loc
    N_var, N_perm = _axial(col, mid, False), _axial(col, mid, True)
    zero = np.zeros_like(mid)
    A_var = _scatter(n_dof, el.geometric(mesh.h, N_var, M, i0sq, prop["y0"], prop["z0"], prop["beta_y"]))
    A_perm = None  # no permanent load: its matrix is zero
    if np.any(N_perm != 0):
        A_perm = _scatter(n_dof, el.geometric(mesh.h, N_perm, np.zeros_like(M), i0sq, prop["y0"], prop["z0"], zero))
    w = HALF_BAND

    zero_dofs: set[int] = set()
    slaves: dict[int, tuple[int, float]] = {}  # slave dof -> (master dof, coefficient)

    def spring(dof: int, k: float) -> None:
        if math.isinf(k):
            zero_dofs.add(dof)
        elif k > 0:
            K[w, dof] += k

    for r in col.restraints:
        b = 6 * _node_at(col, mesh, r.at)
        for off, k in ((0, r.u), (1, r.rotation_u), (2, r.v), (3, r.rotation_v), (4, r.twist)):
            spring(b + off, k)
        if r.warping:
            zero_dofs.add(b + 5)

    ranged: list[OffsetRestraint] = []
    for o in col.offset_restraints:
        if o.to is not None:
            ranged.append(o)
            continue
        b = 6 * _node_at(col, mesh, o.at)
        ey, ez = _offset_from_sc(segs[col.segment_at(o.at)], o)
        # point displacements: u - ez phi along y, v + ey phi along z
        for k, d, c in ((o.u, b, -ez), (o.v, b + 2, ey)):
            if math.isinf(k):
                slaves[d] = (b + 4, -c)  # d = -c phi
            elif k > 0:
                m2 = k * np.array([[1.0, c], [c, c * c]])  # on the DOFs (d, twist)
                K[w, d] += m2[0, 0]
                K[w + d - (b + 4), b + 4] += m2[0, 1]
                K[w + (b + 4) - d, d] += m2[1, 0]
                K[w, b + 4] += m2[1, 1]
    for o in ranged:
        inside = (mid > o.at) & (mid < o.to)
        if not np.any(inside):
            continue
        sc = [_offset_from_sc(segs[i], o) for i in mesh.seg[inside]]
        ey_a, ez_a = np.array([a for a, _ in sc]), np.array([b for _, b in sc])
        ku, kv = (np.full(ey_a.size, 0.0 if math.isinf(k) else k) for k in (o.u, o.v))
        if np.any(ku > 0) or np.any(kv > 0):
            mats = np.zeros((mid.size, 12, 12))
            mats[inside] = el.offset_spring(mesh.h[inside], ku, kv, ey_a, ez_a)
            K += _scatter(n_dof, mats)
        for e, ey, ez in zip(np.flatnonzero(inside), ey_a, ez_a):
            for node in (e, e + 1):
                b = 6 * int(node)
                if math.isinf(o.u):
                    slaves[b] = (b + 4, ez)
                    slaves[b + 1] = (b + 5, ez)
                if math.isinf(o.v):
                    slaves[b + 2] = (b + 4, -ey)
                    slaves[b + 3] = (b + 5, -ey)
    T, free = _reduction(n_dof, zero_dofs, slaves)
    return _System(K=K, Kel=Kel, A_perm=A_perm, A_var=A_var, T=T, free=free, N_var=N_var, N_perm=N_perm)


def _reduction(n: int, zero: set[int], slaves: dict[int, tuple[int, float]]) -> tuple[np.ndarray | None, np.ndarray]:
    """Kept DOFs, and the map ``full = T reduced`` when some DOFs follow others (rigid offset restraints)."""
    zero = set(zero)
    changed = True
    while changed:  # a slave held rigidly holds its master; a held master holds its slave
        changed = False
        for s, (m, c) in slaves.items():
            if s in zero and m not in zero and c != 0:
                zero.add(m)
                changed = True
            if m in zero and s not in zero:
                zero.add(s)
                changed = True
    live = {s: mc for s, mc in slaves.items() if s not in zero}
    free = np.array([i for i in range(n) if i not in zero and i not in live], dtype=int)
    if not live:
        return None, free
    pos = {int(d): j for j, d in enumerate(free)}
    T = np.zeros((n, free.size))
    T[free, np.arange(free.size)] = 1.0
    for s, (m, c) in live.items():
        T[s, pos[m]] = c
    return T, free


def _reduce_free(free: np.ndarray, *mats: np.ndarray) -> list[np.ndarray]:
    """``A[free][:, free]`` of each matrix in diagonal storage (all of one width), in diagonal storage."""
    w, n = _half(mats[0]), free.size
    out = np.zeros((2 * w + 1, n))
    r, c = _rows(out)
    ok = (r >= 0) & (r < n)
    rows, cols = free[r[ok]], free[c[ok]]
    near = np.abs(rows - cols) <= w  # the other terms are zero: outside the band of the full matrix
    at = np.flatnonzero(ok)[near]
    src = (w + rows[near] - cols[near]) * mats[0].shape[1] + cols[near]
    reduced = []
    for B in mats:
        R = out.copy()
        R.flat[at] = B.flat[src]
        reduced.append(R)
    return reduced


def _expand(sys: _System, vec: np.ndarray) -> np.ndarray:
    if sys.T is None:
        full = np.zeros((6 * (sys.Kel.shape[0] + 1), vec.shape[1]))
        full[sys.free] = vec
        return full
    return sys.T @ vec


# -- solve --------------------------------------------------------------------------------------------------------
def _cholesky(K: np.ndarray) -> tuple[np.ndarray, np.ndarray] | None:
    d = K.diagonal()
    if d.size == 0 or not np.all(d > 0):
        return None
    s = 1.0 / np.sqrt(d)
    try:
        L = np.linalg.cholesky(K * s[:, None] * s[None, :])
    except np.linalg.LinAlgError:
        return None
    if float(np.min(np.diag(L))) ** 2 < 64 * np.finfo(float).eps:
        return None
    return L, s


def _mechanism(sys: _System) -> str:
    K = _to_dense(_reduced(sys)[0])
    if sys.T is None:
        names = {0: "the displacement u (minor-axis direction)", 2: "the displacement v (major-axis direction)",
                 4: "the twist"}
        for off, what in names.items():
            block = np.flatnonzero(np.isin(sys.free % 6, [off, off + 1]))
            if block.size and _cholesky(K[np.ix_(block, block)]) is None:
                return f"nothing restrains {what} enough: the member is a mechanism; add restraints"
    return "the member is a mechanism (too little restraint)"


#: Largest reduced system solved dense with numpy (no scipy import; cheaper than that import up to here); larger
#: ones by a banded factor and ARPACK.
DENSE_MAX = 300


def _eig_banded(K: np.ndarray, G: np.ndarray, m: int) -> tuple[np.ndarray, np.ndarray] | None:
    """Largest ``mu`` of ``G x = mu K x`` (diagonal storage, ``K`` scaled to a unit diagonal): banded Cholesky
    and ARPACK; each triangular solve by the LAPACK banded LU that ``scipy.linalg.solve_banded`` uses, factored
    once."""
    import scipy.linalg as sla
    from scipy.linalg.lapack import dgbtrf, dgbtrs
    from scipy.sparse.linalg import LinearOperator, eigsh

    w, n = _half(K), K.shape[1]
    bw = max((d for d in range(w + 1) if np.any(K[w + d] != 0) or np.any(G[w + d] != 0)), default=0)
    try:
        cb = sla.cholesky_banded(K[w : w + bw + 1], lower=True, check_finite=False)
    except np.linalg.LinAlgError:
        return None
    if float(np.min(cb[0])) ** 2 < 64 * np.finfo(float).eps:
        return None
    ub = np.zeros_like(cb)
    for d in range(bw + 1):
        ub[bw - d, d:] = cb[d, : n - d]
    gb = G[w : w + bw + 1]
    # L^T and L factored once by the banded LU that solve_banded runs on every call: the same digits, less work
    upper, piv_u, info_u = dgbtrf(ub, 0, bw)
    low = np.zeros((2 * bw + 1, n))
    low[bw:] = cb
    lower, piv_l, info_l = dgbtrf(low, bw, 0, overwrite_ab=True)
    if info_u != 0 or info_l != 0:
        raise SolverError("the banded factor of the stiffness is singular")

    def solve_upper(b: np.ndarray) -> np.ndarray:
        return dgbtrs(upper, 0, bw, b, piv_u)[0]

    def matvec(x: np.ndarray) -> np.ndarray:
        z = solve_upper(np.ravel(x)[:, None])[:, 0]
        gz = gb[0] * z
        for d in range(1, bw + 1):
            gz[d:] += gb[d, : n - d] * z[: n - d]
            gz[: n - d] += gb[d, : n - d] * z[d:]
        return dgbtrs(lower, bw, 0, gz[:, None], piv_l)[0][:, 0]

    op = LinearOperator((n, n), matvec=matvec, dtype=float)
    v0 = np.cos(np.arange(n) * 0.7548776662466927) + 1.5  # fixed start: the same digits on every run
    mu, y = eigsh(op, k=min(m, n - 2), which="LA", tol=1e-14, ncv=min(n, max(2 * m + 1, 24)), v0=v0)
    order = np.argsort(mu)[::-1]
    return mu[order], solve_upper(y[:, order])


def _eigen(sys: _System, n_modes: int) -> tuple[np.ndarray, np.ndarray]:
    """Lowest positive load factors and their vectors (reduced numbering).  Small systems with numpy alone (no
    scipy import for an everyday column), larger ones by the banded factor and ARPACK."""
    n = sys.free.size if sys.T is None else sys.T.shape[1]
    if n == 0:
        raise ModelError("restraints", "every degree of freedom is rigidly restrained; nothing can buckle")
    K0, Keff, A_var = _reduced(sys)
    d = Keff[_half(Keff)].copy()
    if not np.all(d > 0):
        raise ModelError("restraints", _mechanism(sys))
    s = 1.0 / np.sqrt(d)
    m = min(n_modes, n)
    out = None
    with np.errstate(all="ignore"):
        if n > DENSE_MAX:
            r, c = _rows(Keff)
            si, sj = s[np.clip(r, 0, n - 1)], s[c]
            out = _eig_banded(Keff * si * sj, -A_var * si * sj, m)
        else:
            Ks = _to_dense(Keff) * s[:, None] * s[None, :]
            G = -_to_dense(A_var) * s[:, None] * s[None, :]
            fac = _cholesky(Ks)
            if fac is not None:
                L = fac[0]
                X = np.linalg.solve(L, G)
                C = np.linalg.solve(L, X.T)
                mu, y = np.linalg.eigh(0.5 * (C + C.T))
                mu, y = mu[::-1][:m], y[:, ::-1][:, :m]
                out = mu, np.linalg.solve(L.T, y)
    if out is None:
        if _cholesky(_to_dense(K0)) is None:
            raise ModelError("restraints", _mechanism(sys))
        raise ModelError("loads", "the permanent loads alone exceed the elastic critical load")
    mu, vec = out
    keep = mu > 1e-12 * max(float(np.max(np.abs(mu), initial=0.0)), 1e-300)
    vec = vec[:, keep] * s[:, None]
    if not (np.all(np.isfinite(mu)) and np.all(np.isfinite(vec))):
        raise SolverError("the eigensolver returned non-finite values")
    return 1.0 / mu[keep], vec


def _roundoff(sys: _System, vec: np.ndarray) -> np.ndarray:
    """Estimated relative round-off of each load factor: ``eps / rho``, ``rho = v^T K v / v^T diag(K) v``.

    ``rho`` is the share of the diagonal stiffness a mode mobilises; it falls as ``h^2`` to ``h^4``
    on fine meshes (the terms ``E I / h^3`` cancel down to ``E I`` times the curvature squared).
    """
    K = _to_dense(_reduced(sys)[1])  # dense: the order of its sums sets the last digits of the estimate
    d = np.abs(K.diagonal())
    rho = np.einsum("im,ij,jm->m", vec, K, vec) / np.einsum("im,i,im->m", vec, d, vec)
    return np.finfo(float).eps / np.maximum(rho, 1e-300)


def _order(d_prev: float, d: float, orders: list[float]) -> float | None:
    if d_prev > 0 and d > 0:
        orders.append(math.log2(d_prev / d))
    ok = len(orders) >= 2 and abs(orders[-1] - orders[-2]) < 0.5 and orders[-1] > 1
    return orders[-1] if ok else None


def _check_loads(col: SpatialColumn) -> None:
    var = any(not p.permanent and p.P > 0 for p in col.loads)
    if not var and not col.has_moment:
        if any(p.permanent and p.P != 0 for p in col.loads):
            raise ModelError("loads", "there is no variable load to scale: every axial load is permanent and "
                                      "there is no moment")
        raise ModelError("loads", "no variable compression and no moment: buckling is not possible")


def spatial_buckling(column: SpatialColumn, n_modes: int = 3, tol: float = DEFAULT_TOL,
                     min_level: int = 2) -> SpatialResult:
    """Lowest elastic critical load factors of a thin-walled member, with mesh refinement.

    Parameters
    ----------
    column : the member
    n_modes : number of modes wanted (>= 1)
    tol : relative tolerance on every reported load factor (0 < tol < 0.1)
    min_level : the coarsest level accepted as converged (elements per interval ``2**min_level``)

    Raises
    ------
    ModelError
        A mechanism, no load to scale, or permanent loads above the critical load.
    SolverError
        No positive load factor.
    """
    if not isinstance(column, SpatialColumn):
        raise ModelError("column", f"expected a SpatialColumn, got {type(column).__name__}")
    if not isinstance(n_modes, int) or isinstance(n_modes, bool) or n_modes < 1:
        raise ModelError("modes", f"number of modes must be a whole number >= 1, got {n_modes!r}")
    if not isinstance(tol, (int, float)) or not (0 < tol < 0.1):
        raise ModelError("tolerance", f"must be between 0 and 0.1, got {tol!r}")
    _check_loads(column)
    hist: list[np.ndarray] = []
    orders: list[list[float]] = [[] for _ in range(n_modes)]
    est = np.full(n_modes, math.inf)
    trusted = np.full(n_modes, math.nan)
    capped = roundoff_limited = False
    floor = np.zeros(n_modes)
    level = 0
    mesh = _build_mesh(column, level)
    while True:
        sys = _assemble(column, mesh)
        lam, vec = _eigen(sys, n_modes)
        if lam.size == 0:
            raise SolverError("no positive load factor found: the variable loads do not cause buckling")
        hist.append(lam)
        floor = _roundoff(sys, vec)
        if len(hist) >= 2:
            now, before = hist[-1], hist[-2]
            earlier = hist[-3] if len(hist) >= 3 else None
            for i in range(n_modes):
                if i >= now.size or i >= before.size:
                    est[i] = math.inf
                    continue
                d = abs(now[i] - before[i])
                p = None
                if earlier is not None and i < earlier.size:
                    p = _order(abs(before[i] - earlier[i]), d, orders[i])
                if p:
                    trusted[i] = p
                est[i] = (d / (2.0**p - 1.0) if p else d) / now[i]
            if level >= min_level and np.all(est[: lam.size] <= tol):
                break
            m_now = min(lam.size, hist[-2].size)
            step = np.abs(hist[-1][:m_now] - hist[-2][:m_now]) / hist[-1][:m_now]
            if np.any((step <= 10 * floor[:m_now]) & (est[:m_now] > tol)):
                # refinement now changes the answer only at the round-off level: further doubling makes it worse
                roundoff_limited = True
                est[:m_now] = np.maximum(est[:m_now], np.where(step <= 10 * floor[:m_now], floor[:m_now], 0.0))
                break
        nxt = _build_mesh(column, level + 1)
        if level + 1 > MAX_LEVEL or 6 * nxt.x.size > MAX_DOF:
            capped = True
            break
        level += 1
        mesh = nxt
    m = lam.size
    est = est[:m]
    converged = bool(np.all(est <= tol)) and not (capped and not np.all(est <= tol))
    if converged:
        msg = (f"every reported load factor converged: largest estimated relative discretisation error "
               f"{float(np.max(est)):.1e} <= {tol:.0e}")
    elif roundoff_limited:
        msg = (f"limited by round-off at {mesh.h.size} elements: estimated relative error {float(np.max(est)):.1e} > "
               f"{tol:.0e}; the tolerance is finer than double precision resolves for this member")
    else:
        msg = (f"mesh refinement stopped at {mesh.h.size} elements (largest system allowed): estimated relative "
               f"error {float(np.max(est)):.1e} > {tol:.0e}")
    obs = trusted[:m]
    return _package(column, mesh, sys, lam, vec, est, obs, np.array([h[0] for h in hist]), tol, converged, msg)


def _package(col: SpatialColumn, mesh: _Mesh, sys: _System, lam: np.ndarray, vec: np.ndarray, est: np.ndarray,
             obs: np.ndarray, hist: np.ndarray, tol: float, converged: bool, msg: str) -> SpatialResult:
    full = _expand(sys, vec).T  # (m, n_dof)
    m = lam.size
    n_el = mesh.h.size
    dofs = 6 * np.arange(n_el)[:, None] + np.arange(12)[None, :]
    d_el = full[:, dofs]  # (m, n_el, 12)
    parts = []
    for idx in (el.U, el.V, el.PHI):
        de = d_el[:, :, idx]
        ke = sys.Kel[:, idx[:, None], idx[None, :]]
        parts.append(0.5 * np.einsum("mei,eij,mej->me", de, ke, de))
    e_part = np.stack(parts, axis=2)  # (m, n_el, 3)
    tot = e_part.sum(axis=(1, 2))
    tot = np.where(tot > 0, tot, 1.0)
    shares = e_part.sum(axis=1) / tot[:, None]
    n_seg = len(col.segments)
    seg_e = np.zeros((m, n_seg))
    for k in range(n_seg):
        seg_e[:, k] = e_part[:, mesh.seg == k, :].sum(axis=(1, 2)) / tot
    axial = bool(np.any(sys.N_var > 0))
    kinds = tuple(_kind(shares[i], axial) for i in range(m))

    u, v, phi = full[:, 0::6], full[:, 2::6], full[:, 4::6]
    i0 = np.array([s.i0 for s in col.segments])
    i0_node = np.append(i0[mesh.seg], i0[mesh.seg[-1]])
    for i in range(m):
        mags = np.concatenate([u[i], v[i], i0_node * phi[i]])
        a = np.abs(mags)
        j = int(np.argmax(a >= (1 - 1e-9) * a.max())) if a.max() > 0 else 0
        sgn = mags[j] if mags[j] != 0 else 1.0
        u[i], v[i], phi[i] = u[i] / sgn, v[i] / sgn, phi[i] / sgn

    N_cr = np.zeros((m, n_seg))
    K = np.full((m, n_seg), math.nan)
    for k, s in enumerate(col.segments):
        on = mesh.seg == k
        for i in range(m):
            N = float(np.max(sys.N_perm[on] + lam[i] * sys.N_var[on]))
            N_cr[i, k] = N
            if N <= 0 or seg_e[i, k] < SEGMENT_SHARE_MIN:
                continue
            kind = kinds[i]
            if kind == MODE_KINDS[0]:
                K[i, k] = math.pi / s.length * math.sqrt(s.E * s.I_z / N)
            elif kind == MODE_KINDS[1]:
                K[i, k] = math.pi / s.length * math.sqrt(s.E * s.I_y / N)
            elif kind == MODE_KINDS[2] and s.I_w > 0 and N * s.i0**2 > s.G * s.J:
                K[i, k] = math.pi / s.length * math.sqrt(s.E * s.I_w / (N * s.i0**2 - s.G * s.J))
    return SpatialResult(load_factors=np.asarray(lam, dtype=float), kinds=kinds, heights=mesh.x.copy(), u=u, v=v,
                         phi=phi, energy_shares=shares, segment_energy=seg_e, segment_N_cr=N_cr, segment_K=K,
                         discretisation_errors=est, orders=obs, history=hist, n_elements=n_el, tolerance=float(tol),
                         converged=converged, message=msg)


def _kind(share: np.ndarray, axial: bool) -> str:
    su, sv, sp = (float(x) for x in share)
    if su >= PURE_SHARE:
        return MODE_KINDS[0]
    if sv >= PURE_SHARE:
        return MODE_KINDS[1]
    if sp >= PURE_SHARE:
        return MODE_KINDS[2]
    if sp < 1 - PURE_SHARE:
        return MODE_KINDS[5]
    return MODE_KINDS[3] if axial else MODE_KINDS[4]


def critical_moment(column: SpatialColumn, tol: float = DEFAULT_TOL, n_modes: int = 1) -> CriticalMoment:
    """Elastic critical moment of a member under its end moments alone (its axial loads left out).

    ``M_cr = lam_1 * max |M|`` over the segments' end moments, with ``lam_1`` the lowest load factor.
    """
    if not column.has_moment:
        raise ModelError("moments", "every end moment is zero: give M1 or M2 of a segment")
    res = spatial_buckling(replace(column, loads=()), n_modes=n_modes, tol=tol)
    ref = max(max(abs(s.M1), abs(s.M2)) for s in column.segments)
    lam = float(res.load_factors[0])
    return CriticalMoment(moment=lam * ref, load_factor=lam, reference_moment=ref, result=res)
