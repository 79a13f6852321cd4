"""Can the column be solved?  Mechanism test and scaled factorisation.

Two questions, each answered without a dense copy of any matrix:

* **Is the column a mechanism?**  Every element has a positive flexural (and
  shear) rigidity, so the only motions that store no elastic energy are the
  two rigid-body motions ``w = a + b x``, ``theta = b``.  The column is a
  mechanism exactly when some such motion satisfies every rigid restraint and
  engages no spring and no foundation.  That is decided from the restraints
  and foundations themselves (:func:`rigid_body_mechanism`), exactly, whatever
  the stiffness ratios: no pivot threshold can mistake a stiff-but-valid column
  for a mechanism.  A foundation stores ``integral k(x) (a + b x)^2 dx``; its
  modulus is positive on a range of positive length (it is linear and not zero
  at both ends), where ``a + b x`` vanishes only for ``a = b = 0``: one
  foundation alone resists both rigid-body motions, so a pile held by the soil
  alone is not a mechanism.  A foundation no longer than the station tolerance
  merges into one station of the mesh and stores nothing: it does not count.
* **Is a matrix positive definite?**  :func:`scaled_cholesky` factors the
  symmetrically scaled matrix ``D^-1/2 A D^-1/2`` (unit diagonal) in banded
  storage, so its pivots are measured against the matrix's own scale, and the
  cost is linear in the size.
"""

from __future__ import annotations

import math

import numpy as np

from ..model import STATION_TOL, Column

__all__ = ["rigid_body_mechanism", "positive_definite", "scaled_cholesky", "bandwidth", "banded_lower", "PIVOT_MIN"]

#: Smallest squared pivot of the unit-diagonal (scaled) matrix accepted as positive definite.
PIVOT_MIN = 64 * np.finfo(float).eps


def _distinct(xs: list[float], tol: float) -> list[float]:
    out: list[float] = []
    for x in sorted(xs):
        if not out or x - out[-1] > tol:
            out.append(x)
    return out


def rigid_body_mechanism(column: Column) -> str | None:
    """The rigid-body motion nothing resists, as a message; None when there is none (exact).

    Rigid lateral restraints at two distinct heights, a rigid rotational restraint with any lateral support, a
    lateral support with a rotational spring, lateral springs at two heights, or one foundation (of a length
    above the station tolerance) each leave no rigid-body motion free.
    """
    tol = STATION_TOL * column.height
    lat_rigid = _distinct([r.at for r in column.restraints if math.isinf(r.lateral)], tol)
    rot_rigid = any(math.isinf(r.rotation) for r in column.restraints)
    lat_springs = _distinct([r.at for r in column.restraints if 0 < r.lateral < math.inf], tol)
    rot_spring = any(0 < r.rotation < math.inf for r in column.restraints)
    # a foundation's modulus is positive on a range of length > 0: it resists translation and rotation alike
    found = any(f.top - f.bottom > tol for f in column.foundations)
    if rot_rigid:
        if lat_rigid or lat_springs or found:
            return None
        return "no lateral restraint: the column can slide sideways as a rigid body; restrain it laterally"
    if len(lat_rigid) >= 2:
        return None
    if len(lat_rigid) == 1:
        p = lat_rigid[0]
        if rot_spring or found or any(abs(x - p) > tol for x in lat_springs):
            return None
        return (f"the column can rotate as a rigid body about the lateral restraint at {p:.4g} m; "
                "add a second lateral restraint or a rotational restraint")
    if found or len(lat_springs) >= 2 or (lat_springs and rot_spring):
        return None
    if len(lat_springs) == 1:
        return (f"the column can rotate as a rigid body about the lateral restraint at {lat_springs[0]:.4g} m; "
                "add a second lateral restraint or a rotational restraint")
    if rot_spring:
        return "no lateral restraint: the column can slide sideways as a rigid body; restrain it laterally"
    return ("no lateral restraint and no foundation: the column can move as a rigid body; add lateral or "
            "rotational restraint, or a foundation")


def bandwidth(*mats) -> int:
    """Half-bandwidth of sparse or dense matrices (the largest ``|i - j|`` of a nonzero)."""
    bw = 0
    for m in mats:
        if isinstance(m, np.ndarray):
            i, j = np.nonzero(m)
        else:
            c = m.tocoo()
            i, j = c.row, c.col
        bw = max(bw, int(np.max(np.abs(i - j), initial=0)))
    return bw


def banded_lower(A, bw: int) -> np.ndarray:
    """Lower banded storage (for ``scipy.linalg.cholesky_banded``) of a symmetric sparse or dense matrix."""
    n = A.shape[0]
    ab = np.zeros((bw + 1, n))
    for d in range(bw + 1):
        ab[d, : n - d] = np.diagonal(A, -d) if isinstance(A, np.ndarray) else A.diagonal(-d)
    return ab


def positive_definite(A) -> bool:
    """Whether ``A`` passes the test of :func:`scaled_cholesky`; small dense matrices with numpy alone.

    A dense matrix is factored by numpy's Cholesky after the same unit-diagonal scaling and checked
    against the same pivot bound, so a plain check of a small case does not import scipy (start-up time).
    """
    if isinstance(A, np.ndarray):
        d = np.diagonal(A).astype(float)
        if d.size == 0 or not np.all(np.isfinite(d)) or np.any(d <= 0):
            return False
        s = 1.0 / np.sqrt(d)
        try:
            L = np.linalg.cholesky(A * s[:, None] * s[None, :])
        except np.linalg.LinAlgError:
            return False
        piv = np.diagonal(L) ** 2
        return bool(np.all(np.isfinite(L)) and piv.min() >= PIVOT_MIN)
    return scaled_cholesky(A) is not None


def scaled_cholesky(A) -> tuple[np.ndarray, np.ndarray, int] | None:
    """Banded Cholesky factor of the unit-diagonal scaling of ``A``, or None if not positive definite.

    Returns ``(cb, s, bw)``: ``S A S = L L^T`` with ``S = diag(s)``, ``s = diag(A)^-1/2``, ``L`` in lower
    banded storage ``cb`` of half-bandwidth ``bw``.  ``A`` is refused when a diagonal entry is not
    positive, when the factorisation fails, or when a squared pivot of the scaled matrix (whose
    diagonal is 1) falls below :data:`PIVOT_MIN`.
    """
    import scipy.linalg as sla

    d = np.asarray(A.diagonal(), dtype=float)
    if d.size == 0 or not np.all(np.isfinite(d)) or np.any(d <= 0):
        return None
    s = 1.0 / np.sqrt(d)
    bw = bandwidth(A)
    ab = banded_lower(A, bw)
    for k in range(bw + 1):
        ab[k, : d.size - k] *= s[: d.size - k] * s[k:]
    try:
        cb = sla.cholesky_banded(ab, lower=True, check_finite=False)
    except (sla.LinAlgError, ValueError):
        return None
    piv = cb[0] ** 2
    if not np.all(np.isfinite(cb)) or piv.min() < PIVOT_MIN:
        return None
    return cb, s, bw
