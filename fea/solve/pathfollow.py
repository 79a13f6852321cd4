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

from dataclasses import dataclass, field

import numpy as np

from fea.errors import ModelError
from fea.solve.corotational import BeamModel, assemble, make_model
from fea.solve.fibre import FibreState, fibre_strain, yield_onset

__all__ = ["PathResult", "trace_path", "METHODS"]

METHODS = ("arc-length", "load", "displacement")


def _ro(a) -> np.ndarray:
    a = np.array(a)
    a.setflags(write=False)
    return a


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


@dataclass
class _Point:
    """A converged equilibrium point with everything needed to continue from it."""

    u: np.ndarray
    lam: float
    state: FibreState | None
    stress: np.ndarray | None
    asm: object
    Kf: np.ndarray
    duF: np.ndarray
    res: float
    n_neg: int
    min_eig: float
    s: float
    du_prev: np.ndarray | None = None
    h: float = 0.0
    yfrac: np.ndarray | None = field(default=None)
    n_it: int = 0


class _Counters:
    def __init__(self) -> None:
        self.n_steps = 0
        self.n_iter = 0
        self.n_bisections = 0


def _vector(v, n_dof: int, name: str) -> np.ndarray:
    if v is None:
        return np.zeros(n_dof)
    try:
        a = np.asarray(v, dtype=float)
    except (TypeError, ValueError):
        raise ModelError(name, f"got {v!r}, expected an array of {n_dof} numbers") from None
    if a.shape != (n_dof,):
        raise ModelError(name, f"has shape {a.shape}, expected ({n_dof},)")
    if not np.all(np.isfinite(a)):
        raise ModelError(name, "contains non-finite values, expected finite numbers")
    return a


def _matrix(k, n_dof: int, name: str) -> np.ndarray:
    if k is None:
        return np.zeros((n_dof, n_dof))
    try:
        a = np.asarray(k, dtype=float)
    except (TypeError, ValueError):
        raise ModelError(name, f"expected a ({n_dof}, {n_dof}) array of numbers") from None
    if a.shape != (n_dof, n_dof):
        raise ModelError(name, f"has shape {a.shape}, expected ({n_dof}, {n_dof})")
    if not np.all(np.isfinite(a)):
        raise ModelError(name, "contains non-finite values, expected finite numbers")
    scale = np.abs(a).max()
    if np.abs(a - a.T).max() > 1e-10 * scale:
        raise ModelError(name, f"is not symmetric (max |K - K^T| = {np.abs(a - a.T).max():.3g}), expected a symmetric stiffness")
    return a


def _positive(value, name: str, *, integer: bool = False, allow_none: bool = False):
    if value is None and allow_none:
        return None
    ok = isinstance(value, (int, float, np.integer, np.floating)) and not isinstance(value, bool)
    if ok:
        ok = np.isfinite(value) and value > 0 and (not integer or float(value) == int(value))
    if not ok:
        kind = "a positive integer" if integer else "a positive finite number"
        raise ModelError(name, f"is {value!r}, expected {kind}")
    return int(value) if integer else float(value)


class _System:
    """Residual, tangent and load vector of the free DOFs."""

    def __init__(self, model: BeamModel, free: np.ndarray, F_ref, F_const, Ks, Ksl) -> None:
        self.model = model
        self.free = free
        self.F_ref = F_ref
        self.F_const = F_const
        self.Ks = Ks
        self.Ksl = Ksl
        self.has_ksl = bool(np.any(Ksl))
        self.has_ks = bool(np.any(Ks))
        self.ix = np.ix_(free, free)
        # the relative residual is never measured against less than 1e-3 of the reference loads
        self.ref_floor = max(1e-3 * (np.linalg.norm(F_ref[free]) + np.linalg.norm(F_const[free])), 1e-300)

    def full(self, uf: np.ndarray) -> np.ndarray:
        u = np.zeros(self.model.n_dof)
        u[self.free] = uf
        return u

    def evaluate(self, u: np.ndarray, lam: float, mu: float, state, stage: bool):
        """Return (assembly, K_free, R_free, q_free, relative residual)."""
        a = assemble(self.model, u, state)
        K = a.K
        fint = a.f_int
        if self.has_ks:
            K = K + self.Ks
            fint = fint + self.Ks @ u
        if self.has_ksl:
            K = K + lam * self.Ksl
            fint = fint + lam * (self.Ksl @ u)
        fext = mu * self.F_const + lam * self.F_ref
        R = (fext - fint)[self.free]
        if stage:
            q = self.F_const[self.free]
        else:
            q = self.F_ref[self.free] - (self.Ksl @ u)[self.free] if self.has_ksl else self.F_ref[self.free]
        ref = max(np.linalg.norm(fext[self.free]), np.linalg.norm(fint), self.ref_floor)
        res = float(np.linalg.norm(R) / ref)
        return a, K[self.ix], R, q, res


def _stiffness_inertia(Kf: np.ndarray) -> tuple[int, float]:
    d = np.sqrt(np.abs(np.diag(Kf))).clip(min=1e-300)
    ev = np.linalg.eigvalsh(Kf / d[:, None] / d[None, :])  # congruent scaling keeps the inertia
    return int(np.sum(ev < 0.0)), float(ev[0])


def _yield_fraction(model: BeamModel, asm) -> np.ndarray:
    if asm.yielding is None:
        return np.zeros(model.n_el)
    A = model.section.area
    share = np.einsum("ekf,ef->ek", asm.yielding.astype(float), A) / A.sum(axis=1)[:, None]
    return share @ model.w


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
    """
    model = make_model(xy0, conn, section, n_ip)
    n_dof = model.n_dof
    if method not in METHODS:
        raise ModelError("method", f"is {method!r}, expected one of {', '.join(METHODS)}")
    Fr = _vector(F_ref, n_dof, "F_ref")
    Fc = _vector(F_const, n_dof, "F_const")
    Ks = _matrix(K_spring, n_dof, "K_spring")
    Ksl = _matrix(K_spring_lambda, n_dof, "K_spring_lambda")
    try:
        fx = np.asarray(fixed if fixed is not None else [], dtype=float).ravel()
    except (TypeError, ValueError):
        raise ModelError("fixed", f"got {fixed!r}, expected an array of DOF indices") from None
    if np.any(fx != np.round(fx)) or np.any((fx < 0) | (fx >= n_dof)):
        raise ModelError("fixed", f"contains {fx[(fx != np.round(fx)) | (fx < 0) | (fx >= n_dof)][0]!r}, expected integer DOF indices in 0..{n_dof - 1}")
    fx = np.unique(fx.astype(np.int64))
    free = np.setdiff1d(np.arange(n_dof), fx)
    if free.size == 0:
        raise ModelError("fixed", "restrains every DOF, expected some free DOFs")
    if not np.any(Fr[free]) and not np.any(Ksl):
        raise ModelError("F_ref", "has no component on a free DOF, expected a non-zero reference load")
    initial_step = _positive(initial_step, "initial_step")
    max_step = _positive(max_step, "max_step", allow_none=True)
    max_steps = _positive(max_steps, "max_steps", integer=True)
    max_iter = _positive(max_iter, "max_iter", integer=True)
    desired_iter = _positive(desired_iter, "desired_iter", integer=True)
    max_bisections = _positive(max_bisections, "max_bisections", integer=True)
    tol_residual = _positive(tol_residual, "tol_residual")
    tol_displacement = _positive(tol_displacement, "tol_displacement")
    limit_tol = _positive(limit_tol, "limit_tol")
    lambda_max = None if lambda_max is None else float(_vector_scalar(lambda_max, "lambda_max"))
    if drop_fraction is not None:
        if not (isinstance(drop_fraction, (int, float, np.floating)) and 0.0 < drop_fraction < 1.0):
            raise ModelError("drop_fraction", f"is {drop_fraction!r}, expected a number between 0 and 1 or None")
    ctrl = None
    if method == "displacement":
        if control_dof is None or not isinstance(control_dof, (int, np.integer)) or control_dof not in set(free.tolist()):
            raise ModelError("control_dof", f"is {control_dof!r}, expected the index of a free DOF for displacement control")
        ctrl = int(np.searchsorted(free, control_dof))
    if displacement_limit is not None:
        try:
            dl_dof, dl_val = displacement_limit
            ok = isinstance(dl_dof, (int, np.integer)) and 0 <= dl_dof < n_dof and np.isfinite(dl_val) and dl_val != 0
        except (TypeError, ValueError):
            ok = False
        if not ok:
            raise ModelError("displacement_limit", f"is {displacement_limit!r}, expected (dof index, non-zero limit value)")
        displacement_limit = (int(dl_dof), abs(float(dl_val)))

    extent = float(np.ptp(model.xy0, axis=0).max())
    if max_step is None:
        max_step = {"arc-length": 0.05 * extent * np.sqrt(model.n_nodes), "load": initial_step,
                    "displacement": 0.05 * extent}[method]

    sysm = _System(model, free, Fr, Fc, Ks, Ksl)
    cnt = _Counters()
    tols = (tol_residual, tol_displacement, max_iter)

    # ---- start point ------------------------------------------------------------------
    state0 = model.initial_state()
    u0 = np.zeros(n_dof)
    start = _make_point(sysm, model, u0, 0.0, 0.0, state0, False, 0.0)
    if start.n_neg > 0 or not np.isfinite(start.min_eig) or start.min_eig <= 1e-13:
        raise ModelError("fixed", f"the restrained structure is a mechanism or unstable at the start (smallest scaled "
                                  f"stiffness eigenvalue {start.min_eig:.3g}), expected enough restraints against rigid-body motion")
    first_yield = None  # (lambda, bracket, location)

    # ---- constant-load stage ------------------------------------------------------------
    if np.any(Fc):
        pt = start
        mu = 0.0
        h = 1.0
        nb = 0
        while mu < 1.0:
            dmu = min(h, 1.0 - mu)
            new = _newton_step(sysm, model, pt, "stage", dmu, +1.0, None, tols, cnt, mu0=mu)
            if new is None:
                h *= 0.5
                nb += 1
                cnt.n_bisections += 1
                if nb > max_bisections:
                    return _finish(model, [pt], "constant_load_failed",
                                   f"the constant load could not be applied beyond {mu:.6g} of F_const (no convergence after "
                                   f"{max_bisections} bisections); the structure cannot carry it", cnt, None, first_yield, None)
                continue
            nb = 0
            cnt.n_steps += 1
            if first_yield is None and new.asm.yielding is not None and np.any(new.asm.yielding):
                loc = np.unravel_index(int(np.argmax(new.asm.yielding)), new.asm.yielding.shape)
                first_yield = (0.0, (0.0, 0.0), tuple(int(i) for i in loc))
            if new.n_neg > pt.n_neg:
                return _finish(model, [pt], "constant_load_failed",
                               f"the tangent lost stability at {mu + dmu:.6g} of F_const; the constant load alone exceeds a "
                               f"critical load", cnt, None, first_yield, None)
            mu += dmu
            h = min(2.0 * h, 1.0)
            pt = new
        start = _Point(u=pt.u, lam=0.0, state=pt.state, stress=pt.stress, asm=pt.asm, Kf=pt.Kf,
                       duF=np.linalg.solve(pt.Kf, sysm.F_ref[free] - (Ksl @ pt.u)[free]), res=pt.res,
                       n_neg=pt.n_neg, min_eig=pt.min_eig, s=0.0, yfrac=pt.yfrac)

    # ---- lambda path ------------------------------------------------------------------
    norm_duF = float(np.linalg.norm(start.duF))
    if method == "arc-length":
        h = initial_step * norm_duF
        sign_ctrl = 1.0
    elif method == "load":
        h = initial_step
        sign_ctrl = 1.0
    else:
        if start.duF[ctrl] == 0.0:
            raise ModelError("control_dof", f"{control_dof} does not move under F_ref at the start, expected a DOF the load drives")
        h = initial_step * abs(start.duF[ctrl])
        sign_ctrl = float(np.sign(start.duF[ctrl]))
    h = min(h, max_step)
    if not np.isfinite(h) or h <= 0:
        raise ModelError("F_ref", "produces no displacement at the start, expected a load that deforms the structure")

    pts = [start]
    peak_done = False
    limit = None  # (lambda, accuracy)
    bif = None
    crossed = None
    nb = 0
    status, msg = "max_steps", f"stopped after max_steps = {max_steps} steps"
    while True:
        pt = pts[-1]
        new = _newton_step(sysm, model, pt, method, h, sign_ctrl, ctrl, tols, cnt)
        if new is not None:
            cnt.n_steps += 1
        if new is not None and method == "load" and new.n_neg > pt.n_neg and _lambda_direction("arc-length", new, 1.0, None) < 0:
            # converged onto the unstable side of a limit point: count it as a failed step and approach by halving
            crossed = new.lam
            new = None
        if new is None:
            h *= 0.5
            nb += 1
            cnt.n_bisections += 1
            if nb > max_bisections:
                if method == "load":
                    status = "load_control_limit"
                    why = ("the tangent turned indefinite with the path turning back" if crossed is not None
                           else "no equilibrium was found")
                    msg = (f"load control stopped at lambda = {pt.lam:.6g}: beyond it {why} (step halved {max_bisections} "
                           f"times down to {h:.3g}); a limit point lies there -- load control cannot pass it, use "
                           f"arc-length; no limit load is reported")
                else:
                    status = "step_failed"
                    msg = (f"no convergence after {max_bisections} bisections at lambda = {pt.lam:.6g}; the trace stops here")
                break
            continue
        nb = 0
        # bifurcation: loss of stability while the path keeps rising
        if new.n_neg > pt.n_neg and new.lam > pt.lam and _lambda_direction(method, new, sign_ctrl, ctrl) > 0:
            t = pt.min_eig / (pt.min_eig - new.min_eig) if pt.min_eig != new.min_eig else 1.0
            bif = pt.lam + float(np.clip(t, 0.0, 1.0)) * (new.lam - pt.lam)
            status = "bifurcation"
            msg = (f"the tangent stiffness became indefinite at lambda ~ {bif:.6g} (between {pt.lam:.6g} and {new.lam:.6g}) "
                   f"while the load still rose: a bifurcation of a (near) perfect structure; no limit point was found, add "
                   f"an imperfection")
            break
        if first_yield is None and new.asm.yielding is not None and np.any(new.asm.yielding):
            first_yield = _first_yield(model, pt, new)
        pts.append(new)
        # limit point
        if (not peak_done and len(pts) >= 3 and method != "load"
                and new.lam < pts[-2].lam - 1e-12 * abs(pts[-2].lam) and pts[-2].lam >= pts[-3].lam):
            pts, limit = _refine_peak(sysm, model, pts, method, sign_ctrl, ctrl, tols, cnt, limit_tol, max_bisections)
            peak_done = True
            h = min(pts[-1].h * 2.0, max_step)
            continue
        # stopping rules
        if lambda_max is not None and new.lam >= lambda_max:
            status, msg = "lambda_max", f"lambda reached lambda_max = {lambda_max:.6g}"
            break
        if displacement_limit is not None and abs(new.u[displacement_limit[0]]) >= displacement_limit[1]:
            status, msg = "displacement_limit", f"|u[{displacement_limit[0]}]| reached {displacement_limit[1]:.6g}"
            break
        if peak_done and drop_fraction is not None and new.lam <= drop_fraction * limit[0]:
            status, msg = "drop_after_peak", f"lambda fell to {drop_fraction:g} of the peak {limit[0]:.6g}"
            break
        if _lam_steps(pts) >= max_steps:
            break
        h = min(h * float(np.clip(np.sqrt(desired_iter / max(new.n_it, 1)), 0.5, 2.0)), max_step)
    if status in ("max_steps", "lambda_max", "displacement_limit") and not peak_done:
        msg += "; no limit point was passed (limit_load_factor is None)"
    return _finish(model, pts, status, msg, cnt, limit, first_yield, bif)


def _vector_scalar(v, name):
    try:
        f = float(v)
    except (TypeError, ValueError):
        raise ModelError(name, f"is {v!r}, expected a finite number") from None
    if not np.isfinite(f):
        raise ModelError(name, f"is {v!r}, expected a finite number")
    return f


def _lam_steps(pts) -> int:
    return len(pts) - 1


def _lambda_direction(method: str, p: _Point, sign_ctrl: float, ctrl) -> float:
    """Sign of d(lambda) when continuing along the path from point ``p``."""
    if method == "displacement":
        return float(np.sign(sign_ctrl / p.duF[ctrl])) if p.duF[ctrl] != 0 else 1.0
    if p.du_prev is None:
        return 1.0
    d = float(p.du_prev @ p.duF)
    return 1.0 if d >= 0 else -1.0


def _make_point(sysm: _System, model, u, lam, mu, state, stage, s, asm=None, Kf=None, res=None, du_prev=None,
                h=0.0, n_it=0):
    if asm is None:
        asm, Kf, R, q, res = sysm.evaluate(u, lam, mu, state, stage)
    n_neg, min_eig = _stiffness_inertia(Kf)
    q = sysm.F_const[sysm.free] if stage else (
        sysm.F_ref[sysm.free] - (sysm.Ksl @ u)[sysm.free] if sysm.has_ksl else sysm.F_ref[sysm.free])
    try:
        duF = np.linalg.solve(Kf, q)
    except np.linalg.LinAlgError:
        duF = np.full(q.shape, np.nan)
    return _Point(u=u, lam=lam, state=asm.state if asm.state is not None else state, stress=asm.stress, asm=asm,
                  Kf=Kf, duF=duF, res=res, n_neg=n_neg, min_eig=min_eig, s=s, du_prev=du_prev, h=h,
                  yfrac=_yield_fraction(model, asm), n_it=n_it)


def _newton_step(sysm: _System, model, pt: _Point, method: str, h: float, sign_ctrl: float, ctrl, tols, cnt,
                 mu0: float = 0.0):
    """One step from ``pt``; returns the converged point or None."""
    tol_r, tol_u, max_iter = tols
    free = sysm.free
    stage = method == "stage"
    duF0 = pt.duF
    if stage:
        try:
            duF0 = np.linalg.solve(pt.Kf, sysm.F_const[free])
        except np.linalg.LinAlgError:
            return None
    if not np.all(np.isfinite(duF0)):
        return None
    # predictor
    if method in ("load", "stage"):
        dlam = h
        du = dlam * duF0
    elif method == "displacement":
        dlam = sign_ctrl * h / duF0[ctrl]
        du = dlam * duF0
    else:
        d = _lambda_direction(method, pt, sign_ctrl, ctrl)
        dlam = d * h / np.linalg.norm(duF0)
        du = dlam * duF0
    uf0 = pt.u[free]
    last = np.inf
    for it in range(max_iter + 1):
        u = sysm.full(uf0 + du)
        if stage:
            asm, Kf, R, q, res = sysm.evaluate(u, 0.0, mu0 + dlam, pt.state, True)
        else:
            asm, Kf, R, q, res = sysm.evaluate(u, pt.lam + dlam, 1.0, pt.state, False)
        if not np.isfinite(res):
            return None
        scale = max(np.linalg.norm(du), np.linalg.norm(uf0 + du), 1e-300)
        if res <= tol_r and last <= tol_u * scale:
            lam = 0.0 if stage else pt.lam + dlam
            return _make_point(sysm, model, u, lam, mu0 + dlam if stage else 1.0, pt.state, stage,
                               pt.s + float(np.linalg.norm(du)), asm=asm, Kf=Kf, res=res, du_prev=du, h=h, n_it=it)
        if it == max_iter:
            return None
        cnt.n_iter += 1
        try:
            sol = np.linalg.solve(Kf, np.stack([R, q], axis=1))
        except np.linalg.LinAlgError:
            return None
        duR, duQ = sol[:, 0], sol[:, 1]
        if method in ("load", "stage"):
            dl = 0.0
        elif method == "displacement":
            if duQ[ctrl] == 0.0:
                return None
            dl = (sign_ctrl * h - du[ctrl] - duR[ctrl]) / duQ[ctrl]
        else:
            w = du + duR
            a1 = duQ @ duQ
            a2 = 2.0 * (duQ @ w)
            a3 = w @ w - h * h
            disc = a2 * a2 - 4.0 * a1 * a3
            if disc < 0.0:
                return None
            sq = np.sqrt(disc)
            roots = np.array([(-a2 + sq) / (2.0 * a1), (-a2 - sq) / (2.0 * a1)])
            cand = w[None, :] + roots[:, None] * duQ[None, :]
            dl = roots[int(np.argmax(cand @ du))]
        corr = duR + dl * duQ
        du = du + corr
        dlam = dlam + dl
        last = float(np.linalg.norm(corr))
    return None


def _first_yield(model, p0: _Point, p1: _Point):
    eps1 = fibre_strain(model.section, p1.asm.eps0, p1.asm.kappa)
    t = yield_onset(model.section, p0.state, p0.stress, eps1)
    t = np.where(p1.asm.yielding, t, np.inf)
    k = int(np.argmin(t))
    tk = float(t.ravel()[k])
    if not np.isfinite(tk):
        tk = 1.0
    loc = tuple(int(i) for i in np.unravel_index(k, t.shape))
    lam = p0.lam + tk * (p1.lam - p0.lam)
    return (float(lam), (float(p0.lam), float(p1.lam)), loc)


def _vertex(pts3) -> tuple[float, float]:
    s = np.array([p.s for p in pts3])
    lam = np.array([p.lam for p in pts3])
    s = s - s[1]
    A = np.vstack([s * s, s, np.ones(3)]).T
    try:
        a, b, c = np.linalg.solve(A, lam)
    except np.linalg.LinAlgError:
        return float(lam[1]), np.inf
    if a >= 0:
        return float(lam.max()), np.inf
    sv = -b / (2 * a)
    lv = c - b * b / (4 * a)
    if not (s[0] <= sv <= s[2]):
        return float(lam.max()), np.inf
    return float(lv), abs(lv - lam.max()) / max(abs(lv), 1e-300)


def _refine_peak(sysm, model, pts, method, sign_ctrl, ctrl, tols, cnt, limit_tol, max_bisections, max_levels=8):
    """Retrace the neighbourhood of the first maximum of lambda with shorter steps."""
    lam_v, acc = _vertex(pts[-3:])
    levels = 0
    while acc > limit_tol and levels < max_levels:
        levels += 1
        base_i = len(pts) - 3
        base = pts[base_i]
        h = 0.25 * min(pts[-2].h, pts[-1].h)
        seg = [base]
        nb = 0
        while len(seg) < 40:
            new = _newton_step(sysm, model, seg[-1], method, h, sign_ctrl, ctrl, tols, cnt)
            if new is None:
                h *= 0.5
                nb += 1
                cnt.n_bisections += 1
                if nb > max_bisections:
                    break
                continue
            cnt.n_steps += 1
            seg.append(new)
            if len(seg) >= 3 and new.lam < seg[-2].lam and seg[-2].lam >= seg[-3].lam:
                break
        if len(seg) < 3 or not (seg[-1].lam < seg[-2].lam):
            break  # refinement failed; keep the coarse estimate
        pts = pts[:base_i] + seg
        lam_v, acc = _vertex(pts[-3:])
    return pts, (lam_v, acc)


def _finish(model, pts, status, msg, cnt, limit, first_yield, bif) -> PathResult:
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
    fy = first_yield
    return PathResult(
        success=bool(success), status=status, message=msg,
        load_factors=_ro(lam),
        displacements=_ro(np.array([p.u for p in pts])),
        local_forces=_ro(np.array([p.asm.local_forces for p in pts])),
        axial_force=_ro(np.array([p.asm.N for p in pts])),
        bending_moment=_ro(np.array([p.asm.M for p in pts])),
        ip_positions=_ro(model.xi),
        yield_fraction=_ro(np.array([p.yfrac for p in pts])),
        residual_norms=_ro(res),
        negative_eigenvalues=_ro(np.array([p.n_neg for p in pts], dtype=int)),
        arc_length=_ro(np.array([p.s for p in pts])),
        limit_load_factor=lim, limit_accuracy=lim_acc, limit_index=lim_i,
        first_yield_load_factor=None if fy is None else fy[0],
        first_yield_bracket=None if fy is None else fy[1],
        first_yield_location=None if fy is None else fy[2],
        bifurcation_load_factor=bif,
        n_steps=cnt.n_steps, n_iter=cnt.n_iter, n_bisections=cnt.n_bisections,
        max_residual=float(res.max()),
    )
