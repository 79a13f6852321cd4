"""Checked input of the path following: the options of :func:`fea.solve.pathfollow.trace_path` in one object.

Every invalid value raises :class:`~fea.errors.ModelError` naming the argument.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import ModelError
from ..model.imperfection import PATH_METHODS
from .corotational import BeamModel, make_model

__all__ = ["METHODS", "PathSettings", "check_path_input"]

#: Path-following methods (see :mod:`fea.solve.pathfollow`).
METHODS = PATH_METHODS


@dataclass(frozen=True)
class PathSettings:
    """The checked options of one trace (see :func:`fea.solve.pathfollow.trace_path`).

    ``free`` are the free DOFs in the full numbering; ``ctrl`` is the position of
    ``control_dof`` among them (displacement control only); ``tols`` is
    ``(tol_residual, tol_displacement, max_iter)``.
    """

    method: str
    free: np.ndarray
    F_ref: np.ndarray
    F_const: np.ndarray
    K_spring: np.ndarray
    K_spring_lambda: np.ndarray
    control_dof: int | None
    ctrl: int | None
    initial_step: float
    max_step: float
    max_steps: int
    desired_iter: int
    max_bisections: int
    tols: tuple[float, float, int]
    lambda_max: float | None
    displacement_limit: tuple[int, float] | None
    drop_fraction: float | None
    limit_tol: float


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
        raise ModelError(name, f"is not symmetric (max |K - K^T| = {np.abs(a - a.T).max():.3g}), expected a "
                               "symmetric stiffness")
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


def _scalar(v, name):
    try:
        f = float(v)
    except (TypeError, ValueError):
        f = np.nan
    if not np.isfinite(f):
        raise ModelError(name, f"is {v!r}, expected a finite number")
    return f


def _free_dofs(fixed, n_dof: int) -> np.ndarray:
    try:
        fx = np.asarray(fixed if fixed is not None else [], dtype=float).ravel()
    except (TypeError, ValueError):
        raise ModelError("fixed", f"got {fixed!r}, expected an array of DOF indices") from None
    if np.any(fx != np.round(fx)) or np.any((fx < 0) | (fx >= n_dof)):
        raise ModelError("fixed", f"contains {fx[(fx != np.round(fx)) | (fx < 0) | (fx >= n_dof)][0]!r}, expected "
                                  f"integer DOF indices in 0..{n_dof - 1}")
    fx = np.unique(fx.astype(np.int64))
    free = np.setdiff1d(np.arange(n_dof), fx)
    if free.size == 0:
        raise ModelError("fixed", "restrains every DOF, expected some free DOFs")
    return free


def _control(method: str, control_dof, free: np.ndarray) -> int | None:
    if method != "displacement":
        return None
    if control_dof is None or not isinstance(control_dof, (int, np.integer)) or control_dof not in set(free.tolist()):
        raise ModelError("control_dof", f"is {control_dof!r}, expected the index of a free DOF for displacement "
                                        "control")
    return int(np.searchsorted(free, control_dof))


def _displacement_limit(displacement_limit, n_dof: int) -> tuple[int, float] | None:
    if displacement_limit is None:
        return None
    try:
        dl_dof, dl_val = displacement_limit
        ok = isinstance(dl_dof, (int, np.integer)) and 0 <= dl_dof < n_dof and np.isfinite(dl_val) and dl_val != 0
    except (TypeError, ValueError):
        ok = False
    if not ok:
        raise ModelError("displacement_limit", f"is {displacement_limit!r}, expected (dof index, non-zero limit "
                                               "value)")
    return (int(dl_dof), abs(float(dl_val)))


def check_path_input(xy0, conn, section, F_ref, *, fixed, F_const, K_spring, K_spring_lambda, method, control_dof,
                     n_ip, initial_step, max_step, max_steps, max_iter, desired_iter, max_bisections, tol_residual,
                     tol_displacement, lambda_max, displacement_limit, drop_fraction,
                     limit_tol) -> tuple[BeamModel, PathSettings]:
    """The beam model and the checked settings of a trace (arguments of :func:`~fea.solve.pathfollow.trace_path`)."""
    model = make_model(xy0, conn, section, n_ip)
    n_dof = model.n_dof
    if method not in METHODS:
        raise ModelError("method", f"is {method!r}, expected one of {', '.join(METHODS)}")
    Fr = _vector(F_ref, n_dof, "F_ref")
    Fc = _vector(F_const, n_dof, "F_const")
    Ks = _matrix(K_spring, n_dof, "K_spring")
    Ksl = _matrix(K_spring_lambda, n_dof, "K_spring_lambda")
    free = _free_dofs(fixed, n_dof)
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
    lambda_max = None if lambda_max is None else float(_scalar(lambda_max, "lambda_max"))
    if drop_fraction is not None:
        if not (isinstance(drop_fraction, (int, float, np.floating)) and 0.0 < drop_fraction < 1.0):
            raise ModelError("drop_fraction", f"is {drop_fraction!r}, expected a number between 0 and 1 or None")
    ctrl = _control(method, control_dof, free)
    displacement_limit = _displacement_limit(displacement_limit, n_dof)
    extent = float(np.ptp(model.xy0, axis=0).max())
    if max_step is None:
        max_step = {"arc-length": 0.05 * extent * np.sqrt(model.n_nodes), "load": initial_step,
                    "displacement": 0.05 * extent}[method]
    return model, PathSettings(
        method=method, free=free, F_ref=Fr, F_const=Fc, K_spring=Ks, K_spring_lambda=Ksl, control_dof=control_dof,
        ctrl=ctrl, initial_step=initial_step, max_step=max_step, max_steps=max_steps, desired_iter=desired_iter,
        max_bisections=max_bisections, tols=(tol_residual, tol_displacement, max_iter), lambda_max=lambda_max,
        displacement_limit=displacement_limit, drop_fraction=drop_fraction, limit_tol=limit_tol)
