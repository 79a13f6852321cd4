"""Step control of the path following: the constant-load stage, the step length, limit points and stopping rules.

The rules are described in :mod:`fea.solve.pathfollow`; one step is taken by
:func:`fea.solve.path_newton.newton_step`.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from ..errors import ModelError
from .path_newton import Counters, Point, System, first_yield_in_step, lambda_direction, make_point, newton_step
from .path_setup import PathSettings

__all__ = ["Outcome", "start_point", "apply_constant_load", "first_step", "follow"]


@dataclass
class Outcome:
    """How a stage of the trace ended: the converged points, status and message, and what was found on the way.

    ``limit`` is (refined peak load factor, relative accuracy); ``first_yield`` is
    (load factor, bracket, location); ``bifurcation`` an estimated load factor.
    """

    pts: list[Point]
    status: str = "max_steps"
    message: str = ""
    limit: tuple[float, float] | None = None
    first_yield: tuple | None = None
    bifurcation: float | None = None
    # step control of the lambda path
    h: float = 0.0
    n_bisect: int = 0
    peak_done: bool = False
    crossed: float | None = field(default=None)


def start_point(sysm: System, model) -> Point:
    """The unloaded state; a mechanism (no positive definite tangent) is refused."""
    start = make_point(sysm, model, np.zeros(model.n_dof), 0.0, 0.0, model.initial_state(), False, 0.0)
    if start.n_neg > 0 or not np.isfinite(start.min_eig) or start.min_eig <= 1e-13:
        raise ModelError("fixed", f"the restrained structure is a mechanism or unstable at the start (smallest scaled "
                                  f"stiffness eigenvalue {start.min_eig:.3g}), expected enough restraints against "
                                  "rigid-body motion")
    return start


def _yield_at_stage(new: Point):
    if new.asm.yielding is not None and np.any(new.asm.yielding):
        loc = np.unravel_index(int(np.argmax(new.asm.yielding)), new.asm.yielding.shape)
        return (0.0, (0.0, 0.0), tuple(int(i) for i in loc))
    return None


def apply_constant_load(sysm: System, model, st: PathSettings, cnt: Counters, start: Point) -> Outcome:
    """Apply ``F_const`` at lambda = 0 in load-controlled steps; ``status`` is "" when it was carried.

    On success ``pts`` holds the start point of the lambda path.
    """
    first_yield = None
    if not np.any(st.F_const):
        return Outcome([start], status="")
    pt = start
    mu = 0.0
    h = 1.0
    nb = 0
    while mu < 1.0:
        dmu = min(h, 1.0 - mu)
        new = newton_step(sysm, model, pt, "stage", dmu, +1.0, None, st.tols, cnt, mu0=mu)
        if new is None:
            h *= 0.5
            nb += 1
            cnt.n_bisections += 1
            if nb > st.max_bisections:
                return Outcome([pt], "constant_load_failed",
                               f"the constant load could not be applied beyond {mu:.6g} of F_const (no convergence "
                               f"after {st.max_bisections} bisections); the structure cannot carry it",
                               first_yield=first_yield)
            continue
        nb = 0
        cnt.n_steps += 1
        if first_yield is None:
            first_yield = _yield_at_stage(new)
        if new.n_neg > pt.n_neg:
            return Outcome([pt], "constant_load_failed",
                           f"the tangent lost stability at {mu + dmu:.6g} of F_const; the constant load alone "
                           f"exceeds a critical load", first_yield=first_yield)
        mu += dmu
        h = min(2.0 * h, 1.0)
        pt = new
    free = st.free
    start = Point(u=pt.u, lam=0.0, state=pt.state, stress=pt.stress, asm=pt.asm, Kf=pt.Kf,
                  duF=np.linalg.solve(pt.Kf, sysm.F_ref[free] - (st.K_spring_lambda @ pt.u)[free]), res=pt.res,
                  n_neg=pt.n_neg, min_eig=pt.min_eig, s=0.0, yfrac=pt.yfrac)
    return Outcome([start], status="", first_yield=first_yield)


def first_step(st: PathSettings, start: Point) -> tuple[float, float]:
    """(step length in the method's unit, sign of the controlled displacement) of the first lambda step."""
    norm_duF = float(np.linalg.norm(start.duF))
    ctrl = st.ctrl
    if st.method == "arc-length":
        h = st.initial_step * norm_duF
        sign_ctrl = 1.0
    elif st.method == "load":
        h = st.initial_step
        sign_ctrl = 1.0
    else:
        if start.duF[ctrl] == 0.0:
            raise ModelError("control_dof", f"{st.control_dof} does not move under F_ref at the start, expected a "
                                            "DOF the load drives")
        h = float(st.initial_step * abs(start.duF[ctrl]))
        sign_ctrl = float(np.sign(start.duF[ctrl]))
    h = min(h, st.max_step)
    if not np.isfinite(h) or h <= 0:
        raise ModelError("F_ref", "produces no displacement at the start, expected a load that deforms the structure")
    return h, sign_ctrl


def _halve(tr: Outcome, st: PathSettings, cnt: Counters, pt: Point) -> bool:
    """Halve the step after a failed one; True (with the status set) when bisection is exhausted."""
    tr.h *= 0.5
    tr.n_bisect += 1
    cnt.n_bisections += 1
    if tr.n_bisect <= st.max_bisections:
        return False
    if st.method == "load":
        tr.status = "load_control_limit"
        why = ("the tangent turned indefinite with the path turning back" if tr.crossed is not None
               else "no equilibrium was found")
        tr.message = (f"load control stopped at lambda = {pt.lam:.6g}: beyond it {why} (step halved "
                      f"{st.max_bisections} times down to {tr.h:.3g}); a limit point lies there -- load control "
                      f"cannot pass it, use arc-length; no limit load is reported")
    else:
        tr.status = "step_failed"
        tr.message = (f"no convergence after {st.max_bisections} bisections at lambda = {pt.lam:.6g}; the trace "
                      f"stops here")
    return True


def _bifurcation(tr: Outcome, st: PathSettings, pt: Point, new: Point, sign_ctrl: float) -> bool:
    """Loss of stability while the path keeps rising: True (status "bifurcation") with an estimate of its lambda."""
    if not (new.n_neg > pt.n_neg and new.lam > pt.lam and lambda_direction(st.method, new, sign_ctrl, st.ctrl) > 0):
        return False
    t = pt.min_eig / (pt.min_eig - new.min_eig) if pt.min_eig != new.min_eig else 1.0
    bif = pt.lam + float(np.clip(t, 0.0, 1.0)) * (new.lam - pt.lam)
    tr.bifurcation = bif
    tr.status = "bifurcation"
    tr.message = (f"the tangent stiffness became indefinite at lambda ~ {bif:.6g} (between {pt.lam:.6g} and "
                  f"{new.lam:.6g}) while the load still rose: a bifurcation of a (near) perfect structure; no limit "
                  f"point was found, add an imperfection")
    return True


def _passed_peak(tr: Outcome, st: PathSettings, new: Point) -> bool:
    """True the first time lambda falls after rising (not under load control)."""
    pts = tr.pts
    return (not tr.peak_done and len(pts) >= 3 and st.method != "load"
            and new.lam < pts[-2].lam - 1e-12 * abs(pts[-2].lam) and pts[-2].lam >= pts[-3].lam)


def _stop_rule(tr: Outcome, st: PathSettings, new: Point) -> bool:
    """The requested stopping rules; True (with status and message) when one applies."""
    if st.lambda_max is not None and new.lam >= st.lambda_max:
        tr.status, tr.message = "lambda_max", f"lambda reached lambda_max = {st.lambda_max:.6g}"
        return True
    dl = st.displacement_limit
    if dl is not None and abs(new.u[dl[0]]) >= dl[1]:
        tr.status, tr.message = "displacement_limit", f"|u[{dl[0]}]| reached {dl[1]:.6g}"
        return True
    peak = tr.limit[0] if tr.peak_done and tr.limit is not None else None
    if peak is not None and st.drop_fraction is not None and new.lam <= st.drop_fraction * peak:
        tr.status, tr.message = "drop_after_peak", f"lambda fell to {st.drop_fraction:g} of the peak {peak:.6g}"
        return True
    return len(tr.pts) - 1 >= st.max_steps


def follow(sysm: System, model, st: PathSettings, cnt: Counters, start: Outcome, h: float,
           sign_ctrl: float) -> Outcome:
    """Trace lambda from the start point until a stopping rule, a bifurcation or a failed step."""
    tr = Outcome(list(start.pts), status="max_steps", message=f"stopped after max_steps = {st.max_steps} steps",
                 first_yield=start.first_yield, h=h)
    while True:
        pt = tr.pts[-1]
        new = newton_step(sysm, model, pt, st.method, tr.h, sign_ctrl, st.ctrl, st.tols, cnt)
        if new is not None:
            cnt.n_steps += 1
        if (new is not None and st.method == "load" and new.n_neg > pt.n_neg
                and lambda_direction("arc-length", new, 1.0, None) < 0):
            # converged onto the unstable side of a limit point: count it as a failed step and approach by halving
            tr.crossed = new.lam
            new = None
        if new is None:
            if _halve(tr, st, cnt, pt):
                break
            continue
        tr.n_bisect = 0
        if _bifurcation(tr, st, pt, new, sign_ctrl):
            break
        if tr.first_yield is None and new.asm.yielding is not None and np.any(new.asm.yielding):
            tr.first_yield = first_yield_in_step(model, pt, new)
        tr.pts.append(new)
        if _passed_peak(tr, st, new):
            tr.pts, tr.limit = _refine_peak(sysm, model, tr.pts, st, sign_ctrl, cnt)
            tr.peak_done = True
            tr.h = min(tr.pts[-1].h * 2.0, st.max_step)
            continue
        if _stop_rule(tr, st, new):
            break
        tr.h = min(tr.h * float(np.clip(np.sqrt(st.desired_iter / max(new.n_it, 1)), 0.5, 2.0)), st.max_step)
    if tr.status in ("max_steps", "lambda_max", "displacement_limit") and not tr.peak_done:
        tr.message += "; no limit point was passed (limit_load_factor is None)"
    return tr


# ---------------------------------------------------------------------------
# the limit point


def _vertex(pts3) -> tuple[float, float]:
    """Vertex of the parabola of lambda over arc length through three points, and its gap to the highest."""
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


def _retrace(sysm: System, model, base: Point, h: float, st: PathSettings, sign_ctrl: float,
             cnt: Counters) -> list[Point]:
    """From ``base`` with steps of ``h`` (halved on failure) until lambda falls again (40 points at most)."""
    seg = [base]
    nb = 0
    while len(seg) < 40:
        new = newton_step(sysm, model, seg[-1], st.method, h, sign_ctrl, st.ctrl, st.tols, cnt)
        if new is None:
            h *= 0.5
            nb += 1
            cnt.n_bisections += 1
            if nb > st.max_bisections:
                break
            continue
        cnt.n_steps += 1
        seg.append(new)
        if len(seg) >= 3 and new.lam < seg[-2].lam and seg[-2].lam >= seg[-3].lam:
            break
    return seg


def _refine_peak(sysm: System, model, pts, st: PathSettings, sign_ctrl: float, cnt: Counters, max_levels: int = 8):
    """Retrace the neighbourhood of the first maximum of lambda with shorter steps."""
    lam_v, acc = _vertex(pts[-3:])
    levels = 0
    while acc > st.limit_tol and levels < max_levels:
        levels += 1
        base_i = len(pts) - 3
        seg = _retrace(sysm, model, pts[base_i], 0.25 * min(pts[-2].h, pts[-1].h), st, sign_ctrl, cnt)
        if len(seg) < 3 or not (seg[-1].lam < seg[-2].lam):
            break  # refinement failed; keep the coarse estimate
        pts = pts[:base_i] + seg
        lam_v, acc = _vertex(pts[-3:])
    return pts, (lam_v, acc)
