"""Linear (elastic) buckling: ``K phi = lam G phi``.

``K`` is the elastic stiffness with springs and foundation, less the
geometric stiffness of the permanent loads; ``G`` is the geometric stiffness
of the variable loads at load factor 1 (including the destabilising stiffness
of variable leaning loads).  The lowest positive ``lam`` are sought.

The generalised problem is solved as ``G phi = mu K phi`` with ``mu = 1/lam``,
taking the largest positive ``mu``: ``K`` must be positive definite, which is
exactly the condition that the column is stable under its permanent loads and
is not a mechanism.

Two solvers: dense LAPACK (``scipy.linalg.eigh`` with an index subset) for
small systems, and a banded Cholesky factor of ``K`` driving ARPACK
(``scipy.sparse.linalg.eigsh``) on ``L^-1 G L^-T`` for large ones.  The switch
size was measured (``benchmarks/bench_eigen.py``).
"""

from __future__ import annotations

import logging
import math
from dataclasses import replace

import numpy as np

from ..assemble import Assembled, assemble, element_bending_energies, rayleigh_quotients, residual
from ..errors import ModelError, SolverError
from ..formulas import effective_length_factor
from ..mesh import Mesh, build_mesh, segment_min_ei
from ..model import Column
from ..results import K_AXIAL_RATIO_MIN, K_ENERGY_SHARE_MIN, BucklingResult, SegmentBuckling
from .solvable import PIVOT_MIN, banded_lower, bandwidth, positive_definite, rigid_body_mechanism, scaled_cholesky

__all__ = ["buckling", "package_result", "solve_assembled", "roundoff_floor", "short_interval", "DENSE_MAX_DOF",
           "DEFAULT_TOL", "MAX_LEVEL", "MAX_ELEMENTS"]

logger = logging.getLogger(__name__)

#: Largest reduced system solved with dense LAPACK (measured crossover).
DENSE_MAX_DOF = 400
DEFAULT_TOL = 1e-6
#: Deepest refinement level tried; refinement also stops before a mesh would exceed MAX_ELEMENTS elements.
MAX_LEVEL = 11
#: Largest mesh tried (elements): a shear-flexible column converging at order 2 may need a few thousand.
MAX_ELEMENTS = 12000
#: An interval between stations shorter than this fraction of the height is named as the cause when the
#: answer is limited by round-off (its element is (H / l)^3 times stiffer than the column's elements).
SHORT_INTERVAL = 1e-4


def _diagnose_mechanism(column: Column, mesh: Mesh | None = None, asm: Assembled | None = None) -> str:
    """Which rigid-body motion no restraint resists (exact: see :mod:`.solvable`)."""
    return rigid_body_mechanism(column) or "the column is a mechanism (too little restraint)"


#: Spread of the stiffness diagonal (largest / smallest) above which the eigenproblem is solved scaled.
DIAG_SPREAD_SCALED = 1e12


def _scaled(A, s: np.ndarray):
    """``diag(s) A diag(s)`` for a dense or sparse ``A`` (``A`` itself when ``s`` is all ones)."""
    if np.all(s == 1.0):
        return A
    if isinstance(A, np.ndarray):
        return A * s[:, None] * s[None, :]
    import scipy.sparse as sp

    S = sp.diags(s)
    return (S @ A @ S).tocsr()


#: Below this size the dense solve uses numpy alone (no scipy import at start-up);
#: above it LAPACK's subset driver through scipy is faster.
NUMPY_MAX_DOF = 160


def _eig_dense(K: np.ndarray, G: np.ndarray, n_modes: int) -> tuple[np.ndarray, np.ndarray]:
    """Largest mu of G phi = mu K phi by dense LAPACK (``K`` already scaled to a unit diagonal)."""
    n = K.shape[0]
    m = min(n_modes, n)
    if n <= NUMPY_MAX_DOF:
        L = np.linalg.cholesky(K)
        X = np.linalg.solve(L, G)
        C = np.linalg.solve(L, X.T)  # L^-1 G L^-T (symmetric)
        mu, y = np.linalg.eigh(0.5 * (C + C.T))
        vec = np.linalg.solve(L.T, y[:, ::-1][:, :m])
        return mu[::-1][:m], vec
    import scipy.linalg as sla

    mu, vec = sla.eigh(G, K, subset_by_index=[n - m, n - 1], check_finite=False)
    return mu[::-1], vec[:, ::-1]


def _upper_from_lower(cb: np.ndarray, bw: int) -> np.ndarray:
    """Banded storage of L^T (upper) from banded storage of L (lower)."""
    n = cb.shape[1]
    ub = np.zeros_like(cb)
    for d in range(bw + 1):
        ub[bw - d, d:] = cb[d, : n - d]
    return ub


def _eig_sparse(K, G, n_modes: int) -> tuple[np.ndarray, np.ndarray]:
    """Largest mu of G phi = mu K phi: banded Cholesky K = L L^T, ARPACK on L^-1 G L^-T."""
    import scipy.linalg as sla
    from scipy.sparse.linalg import LinearOperator, eigsh

    n = K.shape[0]
    bw = bandwidth(K, G)
    cb = sla.cholesky_banded(banded_lower(K, bw), lower=True, check_finite=False)
    ub = _upper_from_lower(cb, bw)
    Gs = G.tocsr()

    def matvec(v: np.ndarray) -> np.ndarray:
        z = sla.solve_banded((0, bw), ub, v, check_finite=False)
        return sla.solve_banded((bw, 0), cb, Gs @ z, check_finite=False)

    op = LinearOperator((n, n), matvec=matvec, dtype=float)
    m = min(n_modes, n - 2)
    # a fixed start vector: the same column gives the same digits on every run (ARPACK's default is random)
    v0 = np.cos(np.arange(n) * 0.7548776662466927) + 1.5
    mu, y = eigsh(op, k=m, which="LA", tol=1e-13, ncv=min(n, max(2 * m + 1, 20)), v0=v0)
    order = np.argsort(mu)[::-1]
    mu, y = mu[order], y[:, order]
    vec = sla.solve_banded((0, bw), ub, y, check_finite=False)
    return mu, vec


def solve_assembled(asm: Assembled, n_modes: int, method: str = "auto") -> tuple[np.ndarray, np.ndarray, str]:
    """Largest ``mu`` of ``G phi = mu K phi`` (``K`` positive definite).

    Returns
    -------
    lam : (m,) ascending positive load factors
    vec : (n_red, m) eigenvectors in the reduced numbering
    solver : "dense" or "sparse"
    """
    n = asm.n
    if method == "auto":
        method = "dense" if n <= DENSE_MAX_DOF else "sparse"
    # symmetric scaling to a unit diagonal when the diagonal spans many orders of magnitude (segments and
    # springs of very different stiffness): the same load factors, pivots measured against the matrix's own
    # scale; vectors are scaled back below.  Ordinary columns are solved as assembled.
    d = np.asarray((asm.Ks if asm.is_sparse else asm.K).diagonal(), dtype=float)
    if not np.all(d > 0):
        raise SolverError("the stiffness matrix has a non-positive diagonal entry: the column cannot be solved")
    s = 1.0 / np.sqrt(d) if d.max() > DIAG_SPREAD_SCALED * d.min() else np.ones_like(d)
    with np.errstate(all="ignore"):
        try:
            if method == "dense":
                mu, vec = _eig_dense(_scaled(asm.K, s), _scaled(asm.G, s), n_modes)
            else:
                mu, vec = _eig_sparse(_scaled(asm.Ks, s), _scaled(asm.Gs, s), n_modes)
        except np.linalg.LinAlgError:
            raise SolverError("the stiffness matrix could not be factorised: stiffness ratios in the column are "
                              "beyond what double precision can resolve") from None
        vec = vec * s[:, None]
    if not (np.all(np.isfinite(mu)) and np.all(np.isfinite(vec))):
        raise SolverError("the eigensolver returned non-finite values: stiffness ratios in the column are beyond "
                          "what double precision can resolve")
    scale = np.max(np.abs(mu)) if mu.size else 0.0
    keep = mu > 1e-12 * max(scale, 1e-300)
    mu, vec = mu[keep], vec[:, keep]
    return 1.0 / mu, vec, method


def roundoff_floor(asm: Assembled, v: np.ndarray) -> float:
    """Estimated relative round-off error of the load factor of mode ``v`` (reduced numbering).

    ``eps / rho`` with ``rho = v^T K v / v^T diag(K) v``: the share of the
    diagonal stiffness the mode actually mobilises.  A near-mechanism (a very
    soft restraint holding an otherwise rigid-body motion) has a tiny ``rho``
    and so an answer limited by round-off, whatever the mesh.
    """
    K = asm.Ks if asm.is_sparse else asm.K
    d = np.abs(K.diagonal())
    rho = float(v @ (K @ v)) / float(v @ (d * v))
    return float(np.finfo(float).eps / max(rho, 1e-300))


#: Estimated round-off of the matrix solution above which the load factors are re-evaluated as
#: element-by-element Rayleigh quotients (below it both agree to round-off; ordinary columns keep the
#: matrix values).
QUOTIENT_FROM = 1e-9


#: Most correction steps of the lowest mode (each costs one banded solve).
CORRECTION_STEPS = 12
#: The correction stops once a step changes the quotient by less than this (relative).
CORRECTION_STOP = 1e-12


def _rounded_inverse(asm: Assembled):
    """``r -> K~^-1 r`` with the factor of the rounded stiffness matrix (scaled to a unit diagonal), or None.

    Small dense systems are factorised with numpy alone (no scipy import for an everyday column); larger
    ones with the banded factor of :func:`fea.solve.solvable.scaled_cholesky`.
    """
    if not asm.is_sparse and asm.n <= NUMPY_MAX_DOF:
        d = np.asarray(asm.K.diagonal(), dtype=float)
        if d.size == 0 or not np.all(np.isfinite(d)) or np.any(d <= 0):
            return None
        sc = 1.0 / np.sqrt(d)
        try:
            L = np.linalg.cholesky(asm.K * sc[:, None] * sc[None, :])
        except np.linalg.LinAlgError:
            return None
        if not np.all(np.isfinite(L)) or float(np.min(np.diag(L) ** 2)) < PIVOT_MIN:
            return None
        return lambda r: np.linalg.solve(L.T, np.linalg.solve(L, r * sc)) * sc
    fac = scaled_cholesky(asm.Ks if asm.is_sparse else asm.K)
    if fac is None:
        return None
    import scipy.linalg as sla

    cb, s, bw = fac
    ub = _upper_from_lower(cb, bw)
    return lambda r: sla.solve_banded((0, bw), ub, sla.solve_banded((bw, 0), cb, r * s, check_finite=False),
                                      check_finite=False) * s


def _quotient_load_factors(mesh: Mesh, asm: Assembled, lam: np.ndarray, vec: np.ndarray,
                           floor: float) -> tuple[np.ndarray, np.ndarray, float]:
    """Load factors as Rayleigh quotients, the lowest mode corrected, and the estimated round-off.

    The assembled matrix carries round-off of order ``eps * EI / L_e^3 * w^2`` that cancels
    down to ``EI * curvature^2`` (up to ``(H / L_e)^4`` relative: very fine meshes, or a far stiffer
    part moving almost rigidly).  The quotient and the residual ``K v - lam G v`` are evaluated
    element by element without that cancellation (:mod:`fea.assemble`), and the lowest mode is
    corrected by ``v <- v - K~^-1 r`` with the factor ``K~`` of the rounded matrix (iterative
    refinement: it converges while the rounded matrix is within a small fraction of the lowest
    stiffness, and leaves the quotient error at the round-off of the chord rotations,
    ``eps * (H / L_e)^2``).  A mode held mainly by springs (a near-mechanism) keeps the matrix
    estimate ``floor``: there the springs, not the members, limit the accuracy.
    """
    with np.errstate(all="ignore"):
        q, share = rayleigh_quotients(mesh, asm, vec)
        if not (np.isfinite(q[0]) and q[0] > 0):
            return lam, vec, floor
        solve = _rounded_inverse(asm)
        v, q0, change = vec[:, 0].copy(), float(q[0]), 1.0
        if solve is not None:
            for _ in range(CORRECTION_STEPS):
                v_new = v - solve(residual(mesh, asm, v, q0))
                q_new = float(rayleigh_quotients(mesh, asm, v_new[:, None])[0][0])
                if not (np.isfinite(q_new) and q_new > 0):
                    break
                change = abs(q_new / q0 - 1.0)
                improved = q_new <= q0 * (1 + 1e-15)  # the quotient is a minimum: a correction lowers it
                if improved:
                    v, q0 = v_new / np.max(np.abs(v_new)), q_new
                if not improved or change < CORRECTION_STOP:
                    break
    vec = vec.copy()
    vec[:, 0] = v * (float(np.linalg.norm(vec[:, 0])) / max(float(np.linalg.norm(v)), 1e-300))
    ok = np.isfinite(q) & (q > 0)
    new = np.where(ok, q, lam)
    new[0] = q0
    order = np.argsort(new, kind="stable")
    eps = float(np.finfo(float).eps)
    span = float(mesh.x[-1] - mesh.x[0]) / float(mesh.L.min())
    est = max(change, 4 * eps * span * span + 4 * eps)
    return new[order], vec[:, order], float(floor if share[0] > 0.5 else min(floor, est))


#: Ratio of the largest to the smallest segment EI beyond which a round-off limit is put down to the contrast.
EI_CONTRAST = 1e4


def short_interval(column: Column) -> tuple[float, float] | None:
    """The shortest interval between two stations when it is below ``SHORT_INTERVAL`` of the height."""
    st = np.asarray(column.stations(), dtype=float)
    if st.size < 2:
        return None
    gaps = np.diff(st)
    i = int(np.argmin(gaps))
    return (float(st[i]), float(st[i + 1])) if gaps[i] < SHORT_INTERVAL * column.height else None


def _short_interval_text(column: Column, ab: tuple[float, float]) -> str:
    a, b = ab
    return (f"the stations at {a:.9g} m and {b:.9g} m are only {1e3 * (b - a):.3g} mm apart "
            f"(1/{column.height / (b - a):.2g} of the height): an element this short is too stiff beside the others "
            "for double precision; if they are meant to be one station, give both the same height")


#: A round-off estimate below this is ordinary double-precision noise: when it still stops refinement, the
#: requested tolerance, not the model, is the cause.
ORDINARY_ROUNDOFF = 1e-8


def _roundoff_cause(column: Column, floor: float, tol: float | None = None) -> str:
    """The likely cause of a round-off limit: a tolerance finer than double precision gives, a very short
    interval, a stiffness contrast or very soft restraints."""
    if tol is not None and floor < ORDINARY_ROUNDOFF:
        return (f"the requested tolerance {tol:.0e} is finer than double precision resolves for this column "
                "(its round-off is ordinary); loosen [analysis] tolerance")
    ab = short_interval(column)
    if ab is not None:
        return _short_interval_text(column, ab)
    ei = segment_min_ei(column).tolist()
    if max(ei) > EI_CONTRAST * min(ei):
        return (f"the segments differ in stiffness (EI) by a factor of {max(ei) / min(ei):.1e} and the "
                "buckling mode moves the stiff ones almost as rigid bodies")
    return ("the mode is held only by restraints that are very soft compared with the member "
            "(a near-mechanism); check the restraints")


def _roundoff_warning(column: Column, floor: float, tol: float | None = None) -> str:
    """The round-off warning with its estimate and likely cause (:func:`_roundoff_cause`)."""
    return f"accuracy limited by round-off (estimated {floor:.1e} relative): {_roundoff_cause(column, floor, tol)}"


def _richardson(now: float, before: float, earlier: float | None, orders: list[float]) -> tuple[float, float | None]:
    """Estimated relative error of ``now`` from the last two or three mesh levels, and the trusted order.

    Appends the newly observed order to ``orders``.  The order is trusted once two successive observations agree
    (the asymptotic range); before that the plain difference is the estimate.
    """
    d = abs(now - before)
    if earlier is not None:
        d_prev = abs(before - earlier)
        if d_prev > 0 and d > 0:
            orders.append(math.log2(d_prev / d))
    order = orders[-1] if len(orders) >= 2 and abs(orders[-1] - orders[-2]) < 0.5 and orders[-1] > 1 else None
    return (d / (2.0**order - 1.0) if order else d) / now, order


def _higher_modes(upper: dict[int, np.ndarray], level: int, mode_orders: list[list[float]], mode_est: np.ndarray,
                  tol: float, asm: Assembled, vec: np.ndarray, floor0: float) -> tuple[np.ndarray, bool]:
    """Estimated errors of the reported higher load factors, and whether each is within ``tol`` or at round-off.

    Compared level by level in ascending order (mesh refinement lowers every load factor, so ascending order
    follows the modes).  A mode that appears only on the finer mesh keeps an infinite estimate.
    """
    now, before, earlier = upper[level], upper.get(level - 1), upper.get(level - 2)
    est = np.full(mode_est.shape, math.inf)
    done = True
    for i in range(min(now.size, est.size)):
        if before is None or i >= before.size:
            done = False
            continue
        e = earlier[i] if earlier is not None and i < earlier.size else None
        est[i], _ = _richardson(float(now[i]), float(before[i]), None if e is None else float(e), mode_orders[i])
        if est[i] > tol:
            fl = max(floor0, roundoff_floor(asm, vec[:, i + 1])) if i + 1 < vec.shape[1] else floor0
            if abs(now[i] - before[i]) / now[i] > 10 * fl:
                done = False
    return est, done


def _slow_cause(mesh: Mesh, orders: list[float]) -> str:
    """Why refinement did not reach the tolerance: a shear-flexible element (order about 2) or an unsettled rate."""
    p = f"observed order of convergence {orders[-1]:.2g}" if orders else "no order of convergence observed"
    if float(mesh.phi.max(initial=0.0)) > 0:
        return (f"shear-flexible segments (S given) converge at order about 2, not 4 ({p}); loosen the tolerance "
                "or check S")
    return f"the error estimate had not settled ({p}); loosen the tolerance or simplify the model"


#: Shear parameter ``12 EI / (S L_e^2)`` beyond which a numerically singular matrix is put down to S.
PHI_SINGULAR = 1e10


def _singular_reason(column: Column, mesh: Mesh) -> tuple[str, str]:
    """Why a restrained (not a mechanism) column still has a numerically singular stiffness matrix."""
    phi = float(mesh.phi.max(initial=0.0))
    ab = short_interval(column)
    if ab is not None:
        return ("stations", _short_interval_text(column, ab))
    if phi > PHI_SINGULAR:
        return ("S", f"the shear stiffness is too small compared with the bending stiffness for double precision "
                     f"(12 EI / (S L^2) reaches {phi:.1e} on the mesh): check S; such a member buckles in shear at "
                     "a load of about S")
    ei = segment_min_ei(column).tolist()
    if max(ei) > EI_CONTRAST * min(ei):
        return ("segments", f"the segments differ in stiffness (EI) by a factor of {max(ei) / min(ei):.1e}: beyond "
                            "what double precision can resolve")
    return ("restraints", "the restraints are too soft compared with the member for double precision "
                          "(a near-mechanism): stiffen them or model them as free")


def _check_solvable(column: Column, mesh: Mesh, asm: Assembled) -> None:
    if asm.n == 0:
        raise ModelError("restraints", "every degree of freedom is rigidly restrained; nothing can buckle")
    why = rigid_body_mechanism(column)
    if why:
        raise ModelError("restraints", why)
    if not positive_definite(asm.K0s if asm.is_sparse else asm.K0):
        raise ModelError(*_singular_reason(column, mesh))
    has_g = bool(np.any(asm.Gs.data)) if asm.is_sparse else bool(np.any(asm.G))
    if not column.has_variable_load or not has_g:
        if np.any(mesh.N_perm > 0):
            raise ModelError("loads", "there is no variable load to scale: every load is permanent")
        raise ModelError("loads", "no compression anywhere in the column: buckling is not possible")
    if np.all(mesh.N_var <= 0) and not np.any(mesh.lean_var):
        raise ModelError("loads", "no compression anywhere in the column under the variable loads: "
                                  "buckling is not possible")
    has_perm = asm.matrices[0] is not asm.matrices[1]
    if has_perm and not positive_definite(asm.Ks if asm.is_sparse else asm.K):
        raise ModelError("loads", "the permanent loads alone exceed the elastic critical load: "
                                  "the column buckles before any variable load is applied")


# Long only by its numpydoc docstring: the body is 67 lines.
def buckling(column: Column, n_modes: int = 3, tol: float = DEFAULT_TOL, method: str = "auto",
             axis: str = "", min_level: int = 1) -> BucklingResult:
    """Lowest elastic critical load factors of ``column`` with automatic meshing.

    The mesh is refined by doubling every interval until the estimated
    relative error of the lowest load factor is below ``tol``.  The estimate is
    the Richardson estimate ``|lam_h - lam_h/2| / (2**p - 1)`` with the order
    ``p`` observed from three successive meshes (about 4 for shear-rigid
    cubic elements, about 2 for shear-flexible ones), and the plain difference
    before an order is observed.  When the observed order shows that several
    more doublings are needed, the intermediate meshes are skipped.

    Parameters
    ----------
    column : the column
    n_modes : number of modes wanted (>= 1)
    tol : relative tolerance on the lowest load factor (> 0)
    method : "auto", "dense" or "sparse"
    axis : label of the bending plane, carried into the result

    Returns
    -------
    BucklingResult

    Raises
    ------
    ModelError
        Mechanism, no compression, permanent load above the critical load.
    SolverError
        No positive load factor found.
    """
    if not isinstance(n_modes, int) or n_modes < 1:
        raise ModelError("modes", f"number of modes must be a whole number >= 1, got {n_modes!r}")
    if not (isinstance(tol, float) or isinstance(tol, int)) or not (0 < tol < 0.1):
        raise ModelError("tolerance", f"must be between 0 and 0.1, got {tol!r}")
    if method not in ("auto", "dense", "sparse"):
        raise ModelError("method", f"expected 'auto', 'dense' or 'sparse', got {method!r}")

    solved: dict[int, float] = {}
    upper: dict[int, np.ndarray] = {}  # the higher reported load factors at each level
    est = math.inf
    mode_est = np.full(max(n_modes - 1, 0), math.inf)
    orders: list[float] = []  # observed convergence orders from consecutive meshes
    mode_orders: list[list[float]] = [[] for _ in range(max(n_modes - 1, 0))]
    roundoff_limited = False
    level = 0
    capped = False
    mesh = build_mesh(column, level)
    while True:
        asm = assemble(mesh)
        if level == 0:
            _check_solvable(column, mesh, asm)
        lam, vec, solver = solve_assembled(asm, n_modes, method)
        if lam.size == 0:
            raise SolverError("no positive load factor found: the variable loads do not cause buckling")
        floor = roundoff_floor(asm, vec[:, 0])
        if floor > QUOTIENT_FROM:
            lam, vec, floor = _quotient_load_factors(mesh, asm, lam, vec, floor)
        solved[level] = float(lam[0])
        upper[level] = np.asarray(lam[1:], dtype=float)
        nxt = level + 1
        if level - 1 in solved:
            est, order = _richardson(solved[level], solved[level - 1], solved.get(level - 2), orders)
            mode_est, higher_done = _higher_modes(upper, level, mode_orders, mode_est, tol, asm, vec, floor)
            if level >= min_level and est <= tol and higher_done:
                break
            d = abs(solved[level] - solved[level - 1])
            if d / solved[level] <= 10 * floor and est > tol:
                # refinement now changes the answer only at the round-off level: refining further
                # would make it worse, not better
                roundoff_limited = True
                est = max(est, floor)
                break
            worst = max(est, float(np.max(mode_est, initial=0.0)))
            if order and worst > 0 and worst > tol:
                # skip levels when the trusted rate says several doublings are still needed
                k = math.ceil(math.log2(worst / tol) / order)
                if k >= 3:
                    nxt = level + min(k, 4) - 1
        if nxt > MAX_LEVEL:
            if level < MAX_LEVEL:
                nxt = MAX_LEVEL
            else:
                break
        nxt_mesh = build_mesh(column, nxt)
        while nxt > level + 1 and nxt_mesh.n_el > MAX_ELEMENTS:
            nxt -= 1
            nxt_mesh = build_mesh(column, nxt)
        if nxt_mesh.n_el > MAX_ELEMENTS:
            capped = True
            break
        level, mesh = nxt, nxt_mesh
    history = [solved[k] for k in sorted(solved)]
    converged = est <= tol
    mode_est = mode_est[: max(lam.size - 1, 0)]
    warns: tuple[str, ...] = ()
    if roundoff_limited or floor > 0.1 * tol:
        warns = (_roundoff_warning(column, floor, tol),)
    if converged:
        msg = f"lowest load factor converged: estimated relative discretisation error {est:.1e} <= {tol:.0e}"
    elif roundoff_limited:
        msg = (f"lowest load factor limited by round-off: estimated relative error {est:.1e} > {tol:.0e}; cause: "
               + _roundoff_cause(column, floor, tol))
    else:
        why = "largest mesh allowed" if capped else "deepest level"
        msg = (f"mesh refinement stopped at {mesh.n_el} elements ({why}): estimated relative error {est:.1e} > "
               f"{tol:.0e}; cause: {_slow_cause(mesh, orders)}")
    if converged and mode_est.size and not np.all(mode_est <= tol):
        bad = [i + 2 for i in range(mode_est.size) if not mode_est[i] <= tol]
        msg += (f"; higher mode(s) {', '.join(map(str, bad))} short of the tolerance (estimated "
                f"{', '.join(f'{mode_est[i - 2]:.1e}' for i in bad)})")
    res = package_result(column, mesh, asm, lam, vec, solver, np.array(history), est, tol, converged, msg, axis)
    return replace(res, roundoff_error=floor, warnings=warns, mode_errors=np.concatenate([[est], mode_est]))


def package_result(column, mesh, asm, lam, vec, solver, history, est, tol, converged, msg, axis) -> BucklingResult:
    """The one packaging of eigenpairs into a :class:`BucklingResult`: full mode shapes with their sign fixed,
    per-segment forces, N_cr, K and energy shares (used by :func:`buckling` and by the explorer's fast path)."""
    n_modes = lam.size
    full = np.zeros((asm.n_full, n_modes))
    full[asm.free] = vec
    w = full[0::2].T.copy()
    th = full[1::2].T.copy()
    for i in range(n_modes):
        # the lowest node among those within round-off of the largest magnitude: a symmetric column's
        # antisymmetric mode has two equal extremes, and the choice must not depend on round-off
        a = np.abs(w[i])
        j = int(np.argmax(a >= (1.0 - 1e-9) * a.max())) if a.max() > 0 else 0
        s = w[i, j] if abs(w[i, j]) > 0 else th[i, int(np.argmax(np.abs(th[i])))]
        w[i] /= s
        th[i] /= s

    # bending energy per element and per segment
    e_el = element_bending_energies(mesh, asm, full)  # (n_el, n_modes), free of the matrix's cancellation
    n_seg = len(column.segments)
    e_seg = np.zeros((n_modes, n_seg))
    np.add.at(e_seg.T, mesh.seg, e_el)
    tot = e_seg.sum(axis=1, keepdims=True)
    shares = e_seg / np.where(tot > 0, tot, 1.0)

    lam1 = float(lam[0])
    bounds = column.segment_bounds()
    tolx = 1e-9 * column.height
    segs = []
    xs = np.array([a for a, _ in bounds]) + tolx
    n_all = list(zip(column.axial_force(xs, permanent=True).tolist(), column.axial_force(xs, permanent=False).tolist()))
    n_cr_all = [Np + lam1 * Nv for Np, Nv in n_all]
    n_max = max(max(n_cr_all), 0.0)
    for i, (s, (a, b)) in enumerate(zip(column.segments, bounds)):
        Np, Nv = n_all[i]
        Ncr = n_cr_all[i]
        I_ref = s.I_ref
        if Ncr > 0:
            K = float(effective_length_factor(s.length, s.E * I_ref, Ncr))
        else:
            K = None
        note = ""
        if K is None:
            note = "not in compression"
        elif shares[0, i] < K_ENERGY_SHARE_MIN:
            note = f"takes little part in the mode ({100 * shares[0, i]:.2g}% of the bending energy)"
        elif Ncr < K_AXIAL_RATIO_MIN * n_max:
            note = f"carries little axial force ({100 * Ncr / n_max:.2g}% of the largest)"
        segs.append(SegmentBuckling(index=i, bottom=a, top=b, length=s.length, axial_force=Np + Nv,
                                    critical_axial_force=Ncr, I_ref=I_ref, E=s.E, effective_length_factor=K,
                                    energy_share=float(shares[0, i]), meaningful=(K is not None and not note),
                                    note=note))
    logger.debug("buckling: levels %s, est %.2e", history, est)
    return BucklingResult(load_factors=np.asarray(lam, dtype=float), heights=mesh.x.copy(), modes=w, rotations=th,
                          segments=tuple(segs), energy_shares=shares, n_elements=mesh.n_el,
                          refinement_levels=history, discretisation_error=float(est), tolerance=float(tol),
                          converged=bool(converged), solver=solver, message=msg, axis=axis)
