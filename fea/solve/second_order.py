"""Second-order elastic analysis of an imperfect column (small-deflection theory).

For a load factor ``lam`` the additional lateral deflection ``u`` (the total
deflection is ``w = w0 + u``, ``w0`` the stress-free initial bow) solves::

    (K - lam G) u = lam G_b w0 + G_p w0 + lam f_var + f_perm

with ``K`` the elastic, spring and foundation stiffness less the permanent-load
geometric stiffness, ``G`` the consistent geometric stiffness of the variable
axial loads at ``lam = 1`` (variable leaning loads included), ``G_b w0`` and
``G_p w0`` the same geometric terms acting on the bow (element by element, so a
bow with kinks at joints is exact), and ``f`` the consistent nodal loads of the
lateral forces, lateral loads per height and applied moments (eccentric axial
loads give ``P e`` at their station).  This is the beam-column theory of
Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed., 1961, ch. 1, on the
Hermite (or shear-deformable) cubic elements of :mod:`fea.elements`.

Bending moments ``M`` (Timoshenko's sign: ``EI (w - w0)'' = -M``, so a column
bowed towards ``+w`` under compression has ``M > 0``) are recovered at both ends
of every element from element equilibrium,
``f_e = (k_e + k_f) u_e - k_g (u_e + w0_e) - f_q,e`` (consistent end forces), which
converges at the fourth order of the element size like the nodal deflections.
The extreme-fibre stress is ``|N|/A + |M|/W`` [Pa].

The first-yield load factor is the smallest ``lam`` at which that stress reaches
``fy`` anywhere: a scan of the load factor up to the elastic critical one finds
the first change of sign of ``max stress - fy`` and Brent's method locates it to
round-off on the discrete model.  The discretisation error is estimated by
doubling the mesh (nested meshes) until the Richardson estimate of the relative
change of the first-yield load factor (or, without a yield check, of the largest
moment and deflection) is below ``tol``.
"""

from __future__ import annotations

import logging
import math
from dataclasses import dataclass, field

import numpy as np
import scipy.linalg as sla

from ..errors import ModelError
from ..model import Column
from ..model.imperfection import Imperfection, LateralActions, SegmentSection
from ..util.numbers import readonly
from .bowed_mesh import Discrete, discretise, segment_of_elements
from .eigen import _diagnose_mechanism, solve_assembled

__all__ = ["SecondOrderResult", "second_order", "DEFAULT_TOL", "Discrete", "discretise"]

logger = logging.getLogger(__name__)

DEFAULT_TOL = 1e-6
MAX_LEVEL = 7
#: Observed convergence order of deflections and recovered moments.
ORDER = 4
#: Points of the load-factor scan for the first yield.
N_SCAN = 48


@dataclass(frozen=True)
class SecondOrderResult:
    """Second-order elastic response of one bending plane over a sequence of load factors.

    Attributes
    ----------
    load_factors : (n_lam,) load factors [-]
    heights : (n_nodes,) node heights [m]
    bow : (n_nodes,) initial bow w0 at the nodes [m]
    deflection : (n_lam, n_nodes) total lateral deflection w0 + u [m]
    end_heights : (2 n_el,) heights of the element ends, bottom then top of each
        element, so a diagram can show jumps at loaded stations [m]
    moment : (n_lam, 2 n_el) bending moment at the element ends [N m]
    axial_force : (n_lam, 2 n_el) axial compression at the element ends [N]
    stress : (n_lam, 2 n_el) extreme-fibre stress |N|/A + |M|/W [Pa]; NaN without
        section data
    first_order_moment : (n_lam, 2 n_el) moment of the first-order analysis (no
        P-delta: K0 u1 = same loads, bow terms included as loads) [N m]
    deflection_amplification : (n_lam,) max|w| / max|w_first-order| [-]; the
        first-order deflection is the bow plus the linear deflection under the
        lateral actions (for a bow alone the ratio is w_max / w0_max)
    moment_amplification : (n_lam,) max|M| / max|M_first-order| [-]
    critical_load_factor : elastic critical load factor of the same mesh [-] (inf
        when the variable loads cause no compression)
    first_yield_load_factor : smallest load factor at which the stress reaches fy
        [-]; None without fy / W or when nothing yields below the critical load
    first_yield_height : height of the first yield [m] or None
    first_yield_segment : segment index of the first yield or None
    n_elements : elements of the final mesh
    refinement_history : (levels,) the first monitored quantity at each mesh level
        (the first-yield load factor when computed, else the largest moment)
    discretisation_error : estimated relative error of the monitored quantities:
        the first-yield load factor (when computed) and the largest moment and
        deflection at the largest requested load factor (default: at 1.0 or
        half the critical load factor, whichever is smaller)
    tolerance : requested relative tolerance
    converged : whether the estimate met the tolerance
    message : plain-language status
    axis : bending-plane label
    """

    load_factors: np.ndarray
    heights: np.ndarray
    bow: np.ndarray
    deflection: np.ndarray
    end_heights: np.ndarray
    moment: np.ndarray
    axial_force: np.ndarray
    stress: np.ndarray
    first_order_moment: np.ndarray
    deflection_amplification: np.ndarray
    moment_amplification: np.ndarray
    critical_load_factor: float
    first_yield_load_factor: float | None
    first_yield_height: float | None
    first_yield_segment: int | None
    n_elements: int
    refinement_history: np.ndarray
    discretisation_error: float
    tolerance: float
    converged: bool
    message: str
    axis: str = ""
    warnings: tuple[str, ...] = field(default_factory=tuple)

    @property
    def success(self) -> bool:
        return self.converged

    def at(self, load_factor: float) -> int:
        """Index of the stored load factor closest to ``load_factor``."""
        return int(np.argmin(np.abs(self.load_factors - load_factor)))


def _banded(A: np.ndarray, bw: int = 3) -> np.ndarray:
    n = A.shape[0]
    ab = np.zeros((2 * bw + 1, n))
    for k in range(-bw, bw + 1):
        d = np.diagonal(A, k)
        if k >= 0:
            ab[bw - k, k:] = d
        else:
            ab[bw - k, : n + k] = d
    return ab


class _Solver:
    """Fast repeated solutions of (K - lam G) u = f0 + lam f1 on one mesh (banded LU)."""

    def __init__(self, d: Discrete) -> None:
        self.d = d
        self.abK = _banded(d.K)
        self.abG = _banded(d.G)
        self.abK0 = _banded(d.K0)

    def additional(self, lam: float, first_order: bool = False, bow: bool = True) -> np.ndarray:
        """Additional deflection u (full numbering); ``first_order``: K0 u = f; ``bow=False``: lateral actions only."""
        d = self.d
        f = (d.f0 + lam * d.f1)[d.free] if bow else (d.f0_lat + lam * d.f1_lat)[d.free]
        ab = self.abK0 if first_order else self.abK - lam * self.abG
        u = np.zeros(d.mesh.n_dof)
        if f.size and np.any(f):
            u[d.free] = sla.solve_banded((3, 3), ab, f, check_finite=False)
        return u

    def moments(self, u: np.ndarray, lam: float, first_order: bool = False) -> np.ndarray:
        """Bending moment at the element ends, (n_el, 2) [N m], Timoshenko sign."""
        d = self.d
        ue = u[d.idx]
        kg = lam * d.kg_var + d.kg_perm
        geo = kg @ d.w0e[..., None] if first_order else kg @ (ue + d.w0e)[..., None]
        fe = (d.k_el @ ue[..., None])[..., 0] - geo[..., 0] - (lam * d.fq_var + d.fq_perm)
        # f_psi1 = -EI u''(0) = M(0); f_psi2 = EI u''(L) = -M(L)
        return np.stack([fe[:, 1], -fe[:, 3]], axis=1)

    def axial(self, lam: float) -> np.ndarray:
        return self.d.N_end_perm + lam * self.d.N_end_var


class _Stress:
    def __init__(self, d: Discrete, column: Column, sections) -> None:
        seg = segment_of_elements(column, d.mesh.x)
        self.seg = seg
        self.A = np.array([sections[s].A for s in seg])[:, None]
        self.W = np.array([sections[s].W for s in seg], dtype=float)[:, None]
        fy = [sections[s].fy for s in seg]
        self.fy = None if any(v is None for v in fy) else np.array(fy, dtype=float)[:, None]

    def stress(self, N: np.ndarray, M: np.ndarray) -> np.ndarray:
        return np.abs(N) / self.A + np.abs(M) / self.W


def _critical(d: Discrete) -> float:
    if not np.any(d.G):
        return math.inf
    try:
        lam, _, _ = solve_assembled(d.asm, 1, method="sparse" if d.asm.n > 80 else "dense")
    except (np.linalg.LinAlgError, sla.LinAlgError):
        return math.inf
    return float(lam[0]) if lam.size else math.inf


def _first_yield(sol: _Solver, st: _Stress, lam_cr: float):
    """(lam, element, end) of the first yield, or None; 0 when yielding at lam = 0."""
    from scipy.optimize import brentq  # imported here: keeps start-up of the command light

    def excess(lam: float) -> tuple[float, int, int]:
        u = sol.additional(lam)
        r = st.stress(sol.axial(lam), sol.moments(u, lam)) / st.fy - 1.0
        k = int(np.argmax(r))
        return float(r.flat[k]), k // 2, k % 2

    g0 = excess(0.0)
    if g0[0] >= 0.0:
        return 0.0, g0[1], g0[2]
    if math.isfinite(lam_cr):
        top = lam_cr * (1.0 - 1e-12)
        grid = np.r_[np.linspace(0.0, 0.9, N_SCAN // 2, endpoint=False),
                     1.0 - 0.1 * 0.5 ** np.arange(N_SCAN // 2)] * top
        grid = np.r_[grid, top]
    else:
        grid = np.r_[0.0, np.geomspace(1e-3, 1e6, N_SCAN)]
    prev = 0.0
    for lam in grid[1:]:
        g = excess(lam)
        if g[0] >= 0.0:
            root = brentq(lambda t: excess(t)[0], prev, lam, xtol=1e-15 * max(lam, 1e-300), rtol=1e-15,
                          maxiter=200)
            g = excess(root * (1 + 1e-14))
            return float(root), g[1], g[2]
        prev = lam
    return None


def _analyse(column, imperfection, actions, sections, level, lam_check):
    d = discretise(column, imperfection, actions, level)
    sol = _Solver(d)
    lam_cr = _critical(d)
    st = _Stress(d, column, sections) if sections is not None and all(s.W is not None for s in sections) else None
    fy = _first_yield(sol, st, lam_cr) if st is not None and st.fy is not None else None
    lc = lam_check if lam_check is not None else (min(1.0, 0.5 * lam_cr) if math.isfinite(lam_cr) else 1.0)
    u = sol.additional(lc)
    M = sol.moments(u, lc)
    q = np.array([np.abs(M).max(), np.abs(u[0::2] + d.w0n).max()])
    if fy is not None:
        q = np.r_[fy[0], q]
    return d, sol, st, lam_cr, fy, q, lc


def second_order(column: Column, imperfection: Imperfection | None = None, actions: LateralActions | None = None,
                 sections=None, *, load_factors=None, n_load_factors: int = 11, tol: float = DEFAULT_TOL,
                 min_level: int = 1, axis: str = "") -> SecondOrderResult:
    """Second-order elastic deflections, moments, stresses and first yield of one plane.

    Parameters
    ----------
    column : the column (stiffness, restraints, axial loads)
    imperfection : initial bow (None: straight)
    actions : lateral loads and applied moments (None: none)
    sections : one :class:`~fea.model.imperfection.SegmentSection` per segment (A, W,
        fy), or None for deflections and moments only
    load_factors : (n_lam,) load factors to report [-]; default ``n_load_factors``
        values from 0 up to the first yield (or 0.9 of the critical load factor),
        with 1.0 added when it lies below the critical load factor
    n_load_factors : number of default load factors
    tol : relative tolerance of the mesh refinement (0 < tol < 0.01)
    min_level : first refinement level tried (level 1: at least 8 elements)
    axis : bending-plane label carried into the result

    Returns
    -------
    SecondOrderResult

    Raises
    ------
    ModelError
        Mechanism, permanent loads above the critical load, bad sections or
        options.
    """
    if not (isinstance(tol, (int, float)) and 0 < tol < 0.01):
        raise ModelError("tolerance", f"must be between 0 and 0.01, got {tol!r}")
    actions = actions or LateralActions()
    if sections is not None:
        sections = tuple(sections)
        if len(sections) != len(column.segments) or not all(isinstance(s, SegmentSection) for s in sections):
            raise ModelError("sections", f"expected one SegmentSection per segment ({len(column.segments)}), "
                                         f"got {len(sections)}")
    _check_stable(column, imperfection, actions, min_level)
    d, sol, st, lam_cr, fy, history, est = _refine(column, imperfection, actions, sections, load_factors,
                                                   min_level, tol)
    converged = est <= tol
    what = ("first-yield load factor, largest moment and deflection" if fy is not None
            else "largest moment and deflection")
    msg = (f"{what} converged: estimated relative discretisation error {est:.1e} <= {tol:.0e} "
           f"({d.mesh.n_el} elements)" if converged else
           f"mesh refinement stopped at level {MAX_LEVEL}: estimated relative error of the {what} {est:.1e} > "
           f"{tol:.0e}")
    warn = []
    if (imperfection is None or imperfection.is_zero) and actions.empty:
        warn.append("no bow, no lateral load and no eccentricity: a straight column stays straight up to the "
                    "critical load in this theory")
    if st is not None and st.fy is None:
        warn.append("no yield strength given: first yield not computed")
    lams = _reported_load_factors(load_factors, n_load_factors, fy, lam_cr)
    resp = _responses(d, sol, st, lams)
    ends = np.stack([d.mesh.x[:-1], d.mesh.x[1:]], axis=1).ravel()
    fy_h = fy_seg = None
    if fy is not None:
        fy_h = float(ends[2 * fy[1] + fy[2]])
        fy_seg = int(st.seg[fy[1]])
    return SecondOrderResult(
        load_factors=readonly(lams), heights=readonly(d.mesh.x), bow=readonly(d.w0n), end_heights=readonly(ends),
        **{k: readonly(v) for k, v in resp.items()}, critical_load_factor=float(lam_cr),
        first_yield_load_factor=None if fy is None else float(fy[0]), first_yield_height=fy_h,
        first_yield_segment=fy_seg, n_elements=d.mesh.n_el, refinement_history=readonly([h[0] for h in history]),
        discretisation_error=float(est), tolerance=float(tol), converged=bool(converged), message=msg, axis=axis,
        warnings=tuple(warn))


def _refine(column, imperfection, actions, sections, load_factors, min_level: int, tol: float):
    """Solve on nested meshes until the Richardson estimate of the monitored quantities is below ``tol``.

    Returns (discrete model, solver, stresses, critical load factor, first yield, history, error estimate) of the
    finest mesh solved.
    """
    history: list[np.ndarray] = []
    diffs: list[float] = []
    est = math.inf
    lam_check = None
    if load_factors is not None:
        lam_req = np.atleast_1d(np.asarray(load_factors, dtype=float))
        if lam_req.size and np.all(np.isfinite(lam_req)):
            lam_check = float(np.max(np.abs(lam_req)))
    for level in range(min_level, MAX_LEVEL + 1):
        d, sol, st, lam_cr, fy, q, lam_check = _analyse(column, imperfection, actions, sections, level, lam_check)
        history.append(q)
        if len(history) >= 2:
            scale = np.abs(history[-1])
            rel = np.where(scale > 0, np.abs(history[-1] - history[-2]) / np.where(scale > 0, scale, 1.0), 0.0)
            dq = float(np.max(rel))
            diffs.append(dq)
            rate_ok = len(diffs) >= 2 and diffs[-2] > 0 and diffs[-2] / max(dq, 1e-300) > 2 ** (ORDER - 1)
            est = dq / (2**ORDER - 1) if rate_ok else dq
            if np.all(history[-1] == 0):
                est = 0.0
            if est <= tol:
                break
    return d, sol, st, lam_cr, fy, history, est


def _reported_load_factors(load_factors, n_load_factors: int, fy, lam_cr: float) -> np.ndarray:
    """The requested load factors (checked), or ``n_load_factors`` from 0 to the first yield or 0.9 lam_cr."""
    if load_factors is None:
        if fy is not None and fy[0] > 0:
            end = fy[0]
        elif math.isfinite(lam_cr):
            end = 0.9 * lam_cr
        else:
            end = 1.0
        lams = np.linspace(0.0, end, int(n_load_factors))
        if 1.0 < lam_cr and 1.0 not in lams:
            lams = np.sort(np.r_[lams, 1.0])
        return lams
    lams = np.atleast_1d(np.asarray(load_factors, dtype=float))
    if lams.ndim != 1 or not np.all(np.isfinite(lams)):
        raise ModelError("load_factors", "expected a 1-D array of finite load factors")
    if np.any(lams >= lam_cr):
        raise ModelError("load_factors", f"{lams.max():.6g} is at or above the critical load factor "
                                         f"{lam_cr:.6g}: the small-deflection theory has no answer there")
    return lams


def _responses(d: Discrete, sol: _Solver, st: _Stress | None, lams: np.ndarray) -> dict[str, list]:
    """Deflections, moments, axial forces, stresses and amplifications at every load factor (result fields)."""
    n_el = d.mesh.n_el
    defl, mom, ax, strs, mom1, ad, am = [], [], [], [], [], [], []
    for lam in lams:
        u = sol.additional(lam)
        u1 = sol.additional(lam, first_order=True)
        M = sol.moments(u, lam)
        M1 = sol.moments(u1, lam, first_order=True)
        N = sol.axial(lam)
        w = u[0::2] + d.w0n
        w1 = sol.additional(lam, first_order=True, bow=False)[0::2] + d.w0n
        defl.append(w)
        mom.append(M.ravel())
        mom1.append(M1.ravel())
        ax.append(N.ravel())
        strs.append(st.stress(N, M).ravel() if st is not None else np.full(2 * n_el, np.nan))
        ad.append(_ratio(np.abs(w).max(), np.abs(w1).max()))
        am.append(_ratio(np.abs(M).max(), np.abs(M1).max()))
    return dict(deflection=defl, moment=mom, axial_force=ax, stress=strs, first_order_moment=mom1,
                deflection_amplification=ad, moment_amplification=am)


def _ratio(a: float, b: float) -> float:
    if b > 0:
        return float(a / b)
    return 1.0 if a == 0 else math.inf


def _check_stable(column: Column, imperfection, actions, level: int) -> None:
    d = discretise(column, imperfection, actions, max(level, 0))
    if d.K0.shape[0] == 0:
        raise ModelError("restraints", "every degree of freedom is rigidly restrained; nothing can deflect")
    try:
        sla.cholesky(d.K0, lower=True, check_finite=False)
    except sla.LinAlgError:
        raise ModelError("restraints", _diagnose_mechanism(d.column, d.mesh, d.asm)) from None
    try:
        sla.cholesky(d.K, lower=True, check_finite=False)
    except sla.LinAlgError:
        raise ModelError("loads", "the permanent loads alone exceed the elastic critical load: the column "
                                  "buckles before any variable load is applied") from None
