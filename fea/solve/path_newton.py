"""One step of the path following: equilibrium points, the predictor and the Newton corrector.

The equations, the three methods and the convergence test are described in
:mod:`fea.solve.pathfollow`.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from .corotational import Assembly, BeamModel, assemble
from .fibre import FibreSection, FibreState, fibre_strain, yield_onset

__all__ = ["Point", "Counters", "System", "make_point", "newton_step", "lambda_direction", "first_yield_in_step"]


@dataclass
class Point:
    """A converged equilibrium point with everything needed to continue from it."""

    u: np.ndarray
    lam: float
    state: FibreState | None
    stress: np.ndarray | None
    asm: Assembly
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


class Counters:
    """Work counters of a trace: converged steps, Newton corrections, step halvings."""

    def __init__(self) -> None:
        self.n_steps = 0
        self.n_iter = 0
        self.n_bisections = 0


class System:
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
        self.ref_floor = max(1e-3 * float(np.linalg.norm(F_ref[free]) + np.linalg.norm(F_const[free])), 1e-300)

    def full(self, uf: np.ndarray) -> np.ndarray:
        u = np.zeros(self.model.n_dof)
        u[self.free] = uf
        return u

    def load_vector(self, u: np.ndarray, stage: bool) -> np.ndarray:
        """The free part of the load the path parameter scales: F_const in the stage, else F_ref - K_lambda u."""
        if stage:
            return self.F_const[self.free]
        return self.F_ref[self.free] - (self.Ksl @ u)[self.free] if self.has_ksl else self.F_ref[self.free]

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
        q = self.load_vector(u, stage)
        ref = max(float(np.linalg.norm(fext[self.free])), float(np.linalg.norm(fint)), self.ref_floor)
        res = float(np.linalg.norm(R) / ref)
        return a, K[self.ix], R, q, res


def _stiffness_inertia(Kf: np.ndarray) -> tuple[int, float]:
    d = np.sqrt(np.abs(np.diag(Kf))).clip(min=1e-300)
    ev = np.linalg.eigvalsh(Kf / d[:, None] / d[None, :])  # congruent scaling keeps the inertia
    return int(np.sum(ev < 0.0)), float(ev[0])


def _yield_fraction(model: BeamModel, asm) -> np.ndarray:
    if asm.yielding is None or not isinstance(model.section, FibreSection):
        return np.zeros(model.n_el)
    A = model.section.area
    share = np.einsum("ekf,ef->ek", asm.yielding.astype(float), A) / A.sum(axis=1)[:, None]
    return share @ model.w


def lambda_direction(method: str, p: Point, sign_ctrl: float, ctrl) -> float:
    """Sign of d(lambda) when continuing along the path from point ``p``."""
    if method == "displacement":
        return float(np.sign(sign_ctrl / p.duF[ctrl])) if p.duF[ctrl] != 0 else 1.0
    if p.du_prev is None:
        return 1.0
    d = float(p.du_prev @ p.duF)
    return 1.0 if d >= 0 else -1.0


def make_point(sysm: System, model, u, lam, mu, state, stage, s, asm=None, Kf=None, res=None, du_prev=None,
               h=0.0, n_it=0) -> Point:
    """The equilibrium point at ``u``: inertia of the tangent, the tangent displacement under the load vector."""
    if asm is None:
        asm, Kf, R, q, res = sysm.evaluate(u, lam, mu, state, stage)
    n_neg, min_eig = _stiffness_inertia(Kf)
    q = sysm.load_vector(u, stage)
    try:
        duF = np.linalg.solve(Kf, q)
    except np.linalg.LinAlgError:
        duF = np.full(q.shape, np.nan)
    return Point(u=u, lam=lam, state=asm.state if asm.state is not None else state, stress=asm.stress, asm=asm,
                 Kf=Kf, duF=duF, res=res, n_neg=n_neg, min_eig=min_eig, s=s, du_prev=du_prev, h=h,
                 yfrac=_yield_fraction(model, asm), n_it=n_it)


def _predictor(method: str, pt: Point, h: float, sign_ctrl: float, ctrl, duF0: np.ndarray):
    """Load-factor and displacement increments of the tangent predictor."""
    if method in ("load", "stage"):
        dlam = h
    elif method == "displacement":
        dlam = float(sign_ctrl * h / duF0[ctrl])
    else:
        d = lambda_direction(method, pt, sign_ctrl, ctrl)
        dlam = float(d * h / np.linalg.norm(duF0))
    return dlam, dlam * duF0


def _load_correction(method: str, du, duR, duQ, h: float, sign_ctrl: float, ctrl):
    """Correction of the load factor that keeps the step on its constraint; None when there is none."""
    if method in ("load", "stage"):
        return 0.0
    if method == "displacement":
        if duQ[ctrl] == 0.0:
            return None
        return (sign_ctrl * h - du[ctrl] - duR[ctrl]) / duQ[ctrl]
    # arc length: ||du + duR + dl duQ|| = h; of the two roots the one closest in direction to du
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
    return roots[int(np.argmax(cand @ du))]


def newton_step(sysm: System, model, pt: Point, method: str, h: float, sign_ctrl: float, ctrl, tols, cnt: Counters,
                mu0: float = 0.0) -> Point | None:
    """One step of size ``h`` from ``pt`` (``method="stage"``: the constant load); the converged point or None."""
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
    dlam, du = _predictor(method, pt, h, sign_ctrl, ctrl, duF0)
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
            return make_point(sysm, model, u, lam, mu0 + dlam if stage else 1.0, pt.state, stage,
                              pt.s + float(np.linalg.norm(du)), asm=asm, Kf=Kf, res=res, du_prev=du, h=h, n_it=it)
        if it == max_iter:
            return None
        cnt.n_iter += 1
        try:
            sol = np.linalg.solve(Kf, np.stack([R, q], axis=1))
        except np.linalg.LinAlgError:
            return None
        duR, duQ = sol[:, 0], sol[:, 1]
        dl = _load_correction(method, du, duR, duQ, h, sign_ctrl, ctrl)
        if dl is None:
            return None
        corr = duR + dl * duQ
        du = du + corr
        dlam = dlam + dl
        last = float(np.linalg.norm(corr))
    return None


def first_yield_in_step(model, p0: Point, p1: Point) -> tuple[float, tuple[float, float], tuple[int, ...]]:
    """(load factor, bracket, (element, point, fibre)) of the first yield within the step from p0 to p1."""
    assert p0.state is not None and p0.stress is not None and p1.asm.yielding is not None, "only fibres yield"
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
