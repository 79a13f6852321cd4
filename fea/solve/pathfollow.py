"""Path following for the co-rotational beam-column kernel.

Equilibrium of the free DOFs (fixed DOFs are eliminated)::

    R(u, lambda) = F_const + lambda F_ref - f_int(u) - K_spring u - lambda K_spring_lambda u = 0

``F_const`` is applied first in a load-controlled stage (lambda = 0), then lambda is
traced by one of three methods:

* ``"arc-length"`` -- Crisfield's cylindrical arc-length method: the constraint is
  ``||Delta u|| = Delta l`` on the free DOFs (plain Euclidean norm of the mixed
  m / rad vector); the quadratic for the load-factor correction is solved and the
  root that keeps the new increment closest in direction to the previous one is
  taken; a complex root, a non-finite value or ``max_iter`` iterations without
  convergence halves the step (bisection) and retries.  The predictor follows the
  sign of ``Delta u_prev . K^-1 q`` so the path passes limit points.
* ``"load"`` -- load control; it cannot pass a limit point.  A step that fails to
  converge, or converges onto the unstable side of a limit point (the tangent
  turns indefinite and the path turns back), is halved; when bisection is
  exhausted the trace stops with status ``"load_control_limit"``.  The last point
  is then close below the limit but no limit load is claimed
  (``limit_load_factor`` is None).
* ``"displacement"`` -- control of one free DOF ``control_dof``.

Full Newton-Raphson iterations with the consistent tangent; convergence when the
residual norm is below ``tol_residual`` times the larger of the external-load and
internal-force norms *and* the last correction is below ``tol_displacement`` times
the larger of the step increment and total displacement norms.  After a
successful step the step length is scaled by ``sqrt(desired_iter / n_iter)``
(between 0.5 and 2).

Limit point: the first time lambda falls, the trace returns to the point before
the highest one and retraces with a quarter of the step, repeatedly, until the
vertex of the parabola through the three points around the maximum (parameter:
cumulative ``||Delta u||``) exceeds the highest converged load factor by less than
``limit_tol`` (relative); that vertex is ``limit_load_factor``.  The accuracy is
that of the traced discrete path: with plasticity the path itself depends slightly
on the step history (about 1e-5 relative in the tests), so a smaller
``limit_tol`` buys little.

Stability and bifurcation: the number of negative eigenvalues of the free tangent
is counted at every converged point.  If it grows while the path still rises in
lambda (a bifurcation, typical of a perfect structure on its trivial path) the
trace stops with status ``"bifurcation"`` and an estimate of the bifurcation load
factor from linear interpolation of the smallest eigenvalue; the unstable point is
not kept.

First yield (fibre sections): in the first step in which any fibre yields, the
fibre strains are taken linear over the step and the crossing of the yield surface
is located exactly under that assumption; the load factor is interpolated linearly
between the two ends of the step (``first_yield_bracket``), so the error is at
most the step's load-factor increment and vanishes for a path linear over the step.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..util.numbers import readonly
from .path_control import Outcome, apply_constant_load, first_step, follow, start_point
from .path_newton import Counters, System
from .path_setup import METHODS, check_path_input

__all__ = ["PathResult", "trace_path", "METHODS"]


@dataclass(frozen=True)
class PathResult:
    """Equilibrium path of a beam-column model.

    Attributes
    ----------
    success : bool
        True when the trace ended on one of the requested stopping rules
        (``drop_after_peak``, ``lambda_max``, ``displacement_limit``, ``max_steps``).
    status : str
        ``"drop_after_peak"``, ``"lambda_max"``, ``"displacement_limit"``,
        ``"max_steps"``, ``"bifurcation"``, ``"step_failed"``,
        ``"load_control_limit"`` or ``"constant_load_failed"``.
    message : str
        One plain line on how the trace ended.
    load_factors : ndarray, shape (n_pts,)
        Load factor lambda at the converged points (the first is the state under
        ``F_const`` alone, lambda = 0).
    displacements : ndarray, shape (n_pts, n_dof)
        Displacements [m, m, rad].
    local_forces : ndarray, shape (n_pts, n_el, 3)
        Local element end forces (N, M_1, M_2) [N, N m, N m].
    axial_force, bending_moment : ndarray, shape (n_pts, n_el, n_ip)
        Stress resultants at the integration points [N, N m].
    ip_positions : ndarray, shape (n_ip,)
        Integration point positions on [0, 1] along every element.
    yield_fraction : ndarray, shape (n_pts, n_el)
        Share of the fibre area yielding at each point (Gauss-weighted mean of the
        integration points); zeros for elastic sections.
    residual_norms : ndarray, shape (n_pts,)
        Achieved relative residual at each point.
    negative_eigenvalues : ndarray of int, shape (n_pts,)
        Number of negative eigenvalues of the free tangent at each point.
    arc_length : ndarray, shape (n_pts,)
        Cumulative norm of the free displacement increments [mixed m, rad].
    limit_load_factor : float or None
        Refined maximum of lambda along the path; None when no peak was passed.
    limit_accuracy : float or None
        Relative gap between ``limit_load_factor`` and the highest converged point.
    limit_index : int or None
        Index of the highest converged point.
    first_yield_load_factor : float or None
        Load factor at which a fibre first reached the yield surface (0 when it
        happened under ``F_const`` alone); None when nothing yielded.
    first_yield_bracket : tuple of float or None
        Load factors at the start and end of the step in which it happened.
    first_yield_location : tuple of int or None
        (element, integration point, fibre) that yielded first.
    bifurcation_load_factor : float or None
        Estimated load factor of a bifurcation passed on the path (status
        ``"bifurcation"``), else None.
    n_steps : int
        Converged steps (constant-load stage and limit refinement included).
    n_iter : int
        Newton corrections, failed attempts included.
    n_bisections : int
        Step halvings after failed attempts.
    max_residual : float
        Largest achieved relative residual over the stored points.
    """

    success: bool
    status: str
    message: str
    load_factors: np.ndarray
    displacements: np.ndarray
    local_forces: np.ndarray
    axial_force: np.ndarray
    bending_moment: np.ndarray
    ip_positions: np.ndarray
    yield_fraction: np.ndarray
    residual_norms: np.ndarray
    negative_eigenvalues: np.ndarray
    arc_length: np.ndarray
    limit_load_factor: float | None
    limit_accuracy: float | None
    limit_index: int | None
    first_yield_load_factor: float | None
    first_yield_bracket: tuple[float, float] | None
    first_yield_location: tuple[int, int, int] | None
    bifurcation_load_factor: float | None
    n_steps: int
    n_iter: int
    n_bisections: int
    max_residual: float


# Long only by its numpydoc docstring: the body is 14 lines.
def trace_path(xy0, conn, section, F_ref, *, fixed=(), F_const=None, K_spring=None, K_spring_lambda=None,
               method: str = "arc-length", control_dof: int | None = None, n_ip: int = 3,
               initial_step: float = 0.05, max_step: float | None = None, max_steps: int = 200,
               max_iter: int = 20, desired_iter: int = 4, max_bisections: int = 12,
               tol_residual: float = 1e-8, tol_displacement: float = 1e-8,
               lambda_max: float | None = None, displacement_limit: tuple[int, float] | None = None,
               drop_fraction: float | None = 0.8, limit_tol: float = 1e-4) -> PathResult:
    """Trace the equilibrium path of a planar beam-column model.

    Parameters
    ----------
    xy0 : array_like, shape (n_nodes, 2)
        Initial node coordinates [m], imperfections included.
    conn : array_like of int, shape (n_el, 2)
        Element end nodes.
    section : ElasticSection or FibreSection
        Per-element sections (see :mod:`fea.solve.fibre`).
    F_ref : array_like, shape (n_dof,)
        Reference load scaled by lambda [N, N, N m]; n_dof = 3 n_nodes.
    fixed : array_like of int, optional
        Restrained DOFs (eliminated).
    F_const : array_like, shape (n_dof,), optional
        Load held constant, applied first [N, N, N m].
    K_spring : array_like, shape (n_dof, n_dof), optional
        Constant symmetric linear stiffness added to the structure.
    K_spring_lambda : array_like, shape (n_dof, n_dof), optional
        Symmetric stiffness multiplied by lambda (negative for a destabilising
        leaning load).
    method : {"arc-length", "load", "displacement"}
        Path-following method.
    control_dof : int, optional
        Free DOF controlled by ``method="displacement"``.
    n_ip : int, optional
        Gauss points per element, 2 or 3.
    initial_step : float, optional
        Load-factor increment of the first step; converted through the linear
        predictor into an arc length or control displacement.
    max_step : float, optional
        Largest step in the method's own unit (arc length [mixed m, rad], load
        factor, or control displacement [m or rad]).  Defaults:
        0.05 * extent * sqrt(n_nodes), ``initial_step``, 0.05 * extent, with
        extent the largest coordinate range of ``xy0``.
    max_steps : int, optional
        Largest number of converged steps on the lambda path.
    max_iter : int, optional
        Newton corrections allowed per step before bisection.
    desired_iter : int, optional
        Target corrections per step for the step adaptation.
    max_bisections : int, optional
        Consecutive halvings of a failing step before giving up.
    tol_residual, tol_displacement : float, optional
        Relative convergence tolerances (see module notes).
    lambda_max : float, optional
        Stop once lambda reaches this value.
    displacement_limit : (int, float), optional
        Stop once ``|u[dof]| >= |value|``.
    drop_fraction : float or None, optional
        After a peak, stop once lambda <= drop_fraction * peak (0 < f < 1); None
        disables the rule.
    limit_tol : float, optional
        Relative accuracy of the refined limit load factor.

    Returns
    -------
    PathResult

    Raises
    ------
    ModelError
        On invalid input, including a structure that is a mechanism at the start.

    Notes
    -----
    The steps live in :mod:`fea.solve.path_setup` (input), :mod:`fea.solve.path_newton`
    (predictor and corrector) and :mod:`fea.solve.path_control` (constant-load stage,
    step length, limit point, stopping rules); :func:`_finish` packages the result.
    """
    model, st = check_path_input(xy0, conn, section, F_ref, fixed=fixed, F_const=F_const, K_spring=K_spring,
                                 K_spring_lambda=K_spring_lambda, method=method, control_dof=control_dof, n_ip=n_ip,
                                 initial_step=initial_step, max_step=max_step, max_steps=max_steps,
                                 max_iter=max_iter, desired_iter=desired_iter, max_bisections=max_bisections,
                                 tol_residual=tol_residual, tol_displacement=tol_displacement,
                                 lambda_max=lambda_max, displacement_limit=displacement_limit,
                                 drop_fraction=drop_fraction, limit_tol=limit_tol)
    sysm = System(model, st.free, st.F_ref, st.F_const, st.K_spring, st.K_spring_lambda)
    cnt = Counters()
    start = apply_constant_load(sysm, model, st, cnt, start_point(sysm, model))
    if start.status:
        return _finish(model, start, cnt)
    h, sign_ctrl = first_step(st, start.pts[0])
    return _finish(model, follow(sysm, model, st, cnt, start, h, sign_ctrl), cnt)


def _finish(model, out: Outcome, cnt: Counters) -> PathResult:
    """The result object of a trace that ended as ``out``."""
    pts, status, msg, limit, fy = out.pts, out.status, out.message, out.limit, out.first_yield
    lam = np.array([p.lam for p in pts])
    success = status in ("drop_after_peak", "lambda_max", "displacement_limit", "max_steps")
    lim = lim_acc = lim_i = None
    if limit is not None:
        lim, lim_acc = float(limit[0]), float(limit[1])
        lim_i = int(np.argmax(lam))
        if not np.isfinite(lim_acc):
            msg += "; the limit point could not be refined (estimate is the highest converged point)"
            lim = float(lam[lim_i])
    res = np.array([p.res for p in pts])
    return PathResult(
        success=bool(success), status=status, message=msg,
        load_factors=readonly(lam),
        displacements=readonly(np.array([p.u for p in pts])),
        local_forces=readonly(np.array([p.asm.local_forces for p in pts])),
        axial_force=readonly(np.array([p.asm.N for p in pts])),
        bending_moment=readonly(np.array([p.asm.M for p in pts])),
        ip_positions=readonly(model.xi),
        yield_fraction=readonly(np.array([p.yfrac for p in pts])),
        residual_norms=readonly(res),
        negative_eigenvalues=readonly([p.n_neg for p in pts], dtype=int),
        arc_length=readonly(np.array([p.s for p in pts])),
        limit_load_factor=lim, limit_accuracy=lim_acc, limit_index=lim_i,
        first_yield_load_factor=None if fy is None else fy[0],
        first_yield_bracket=None if fy is None else fy[1],
        first_yield_location=None if fy is None else fy[2],
        bifurcation_load_factor=out.bifurcation,
        n_steps=cnt.n_steps, n_iter=cnt.n_iter, n_bisections=cnt.n_bisections,
        max_residual=float(res.max()),
    )
