"""Fixity bounds: the range of the load factor and K when spring stiffnesses are uncertain.

Statement used
--------------
The lowest load factor never decreases when a spring stiffens.  Adding
``dk >= 0`` at a degree of freedom adds ``dk e_d e_d^T``, a positive
semi-definite matrix, to ``K``; by the Courant-Fischer min-max
characterisation ``lam_1 = min phi^T K phi / phi^T G phi`` (over ``phi`` with
``phi^T G phi > 0``) cannot fall (Courant & Hilbert, *Methods of Mathematical
Physics*, vol. 1, ch. 1).  A rigid restraint is the limit ``k -> inf`` and
also raises or keeps it.  A foundation modulus ``k`` adds ``k D`` with ``D``
the consistent Winkler matrix of a unit modulus, also positive semi-definite
(``phi^T D phi`` is the integral of the unit modulus times ``w^2``), so the
same holds for foundation moduli.  So over a box of spring ranges the load factor is
lowest at the corner with every spring at its low end and highest at the corner
with every spring at its high end; every corner is still evaluated and
reported, so the claim can be seen to hold.  K of a segment is a monotone
function of the load factor (``K = (pi/L) sqrt(E I / (N_perm + lam N_var))``),
so its bounds are taken at the same two corners.

Pure: SI floats, no I/O.
"""

from __future__ import annotations

import itertools
import math
from dataclasses import dataclass

import numpy as np

from ..errors import ModelError
from ..model import Column
from ..solve.eigen import DEFAULT_TOL
from .spring_set import SpringModel, converged_level, effective_length_factors, with_stiffness

__all__ = ["PlaneBounds", "plane_bounds", "MAX_SPRINGS"]

#: Most uncertain springs per plane (2**MAX_SPRINGS corners).
MAX_SPRINGS = 12


@dataclass(frozen=True)
class PlaneBounds:
    """Bounds of one plane's lowest load factor over a box of spring ranges.

    Attributes
    ----------
    axis : bending plane
    springs : ((restraint index, kind), ...)
    low, high : (m,) ends of each spring's range [SI]
    corners : (2**m, m) corner stiffnesses
    corner_load_factors : (2**m,) lowest load factor at each corner [-]
    load_factor_min, load_factor_max : bounds [-]
    K_min, K_max : (n_segments,) bounds of each segment's K (NaN where not in compression)
    level : mesh level used
    """

    axis: str
    springs: tuple[tuple[int, str], ...]
    low: np.ndarray
    high: np.ndarray
    corners: np.ndarray
    corner_load_factors: np.ndarray
    load_factor_min: float
    load_factor_max: float
    K_min: np.ndarray
    K_max: np.ndarray
    level: int
    model: SpringModel

    def load_factor(self, k) -> float:
        """Load factor at any point of the box (same mesh)."""
        return self.model.load_factor(k)


def plane_bounds(column: Column, springs, low, high, axis: str = "", tol: float = DEFAULT_TOL) -> PlaneBounds:
    """Bounds of ``column``'s lowest load factor as each spring ranges over ``[low, high]``.

    The mesh is the finer of those :func:`buckling` converges on at the all-low
    and all-high corners (an all-low corner that is a mechanism is skipped).
    """
    springs = tuple((int(r), str(k)) for r, k in springs)
    low = np.asarray(low, dtype=float).reshape(-1)
    high = np.asarray(high, dtype=float).reshape(-1)
    if not springs:
        raise ModelError("bounds", "no uncertain spring given")
    if len(springs) > MAX_SPRINGS:
        raise ModelError("bounds", f"{len(springs)} uncertain springs in one plane; at most {MAX_SPRINGS}")
    if low.size != len(springs) or high.size != len(springs):
        raise ModelError("bounds", "give a low and a high value for every spring")
    if np.any(np.isnan(low)) or np.any(low < 0) or np.any(high < low):
        raise ModelError("bounds", f"expected 0 <= low <= high for every spring, got {low.tolist()}, "
                                   f"{high.tolist()}")
    levels = []
    for ends in (low, high):
        col = column
        for (r, kind), v in zip(springs, ends):
            col = with_stiffness(col, r, kind, float(v))
        try:
            levels.append(converged_level(col, tol))
        except ModelError:
            continue
    if not levels:
        raise ModelError("bounds", "the column is a mechanism even with every spring at its high end")
    level = max(levels)
    model = SpringModel.build(column, springs, level)
    corners = np.array(list(itertools.product(*zip(low, high))), dtype=float)
    lam = np.array([model.load_factor(c) for c in corners])
    lo, hi = float(np.min(lam)), float(np.max(lam))
    K_lo = effective_length_factors(column, lo)  # largest K at the smallest load factor
    K_hi = effective_length_factors(column, hi)
    with np.errstate(invalid="ignore"):
        K_min = np.fmin(K_lo, K_hi)
        K_max = np.fmax(K_lo, K_hi)
    if lo == 0.0:
        K_max = np.full_like(K_max, math.inf)
    return PlaneBounds(axis=axis, springs=springs, low=low, high=high, corners=corners, corner_load_factors=lam,
                       load_factor_min=lo, load_factor_max=hi, K_min=K_min, K_max=K_max, level=level, model=model)
