"""Sensitivity of the lowest load factor to every spring, from the mode shape.

For the eigenproblem ``K phi = lam G phi`` with ``K`` depending on a spring
``k`` at degree of freedom ``d`` (``dK/dk = e_d e_d^T``), differentiating and
pre-multiplying by ``phi^T`` gives, for a simple eigenvalue,

    d lam / d k = phi_d^2 / (phi^T G phi)

(first-order eigenvalue perturbation; e.g. Wilkinson, *The Algebraic
Eigenvalue Problem*, 1965, ch. 2).  A foundation modulus adds ``k D`` (``D``
the Winkler matrix of a unit modulus, see :mod:`fea.study.spring_set`), so its
derivative is ``phi^T D phi / (phi^T G phi)``.  No re-solve is needed.  A rigid restraint
has eliminated its degree of freedom: it has no derivative and is reported as
rigid.  The normalised sensitivity ``(k / lam) d lam / d k`` is the percentage
change of the load factor per percent change of the stiffness; it ranks which
restraint matters most.  Each derivative can be checked against central finite
differences on the same mesh.

Pure: SI floats, no I/O.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..model import Column
from ..solve.eigen import DEFAULT_TOL
from .spring_set import SpringModel, converged_level, stiffness_of

__all__ = ["SpringSensitivity", "column_sensitivities", "REPEATED_GAP"]

#: Two lowest load factors closer than this (relative) make the derivative one-sided.
REPEATED_GAP = 1e-6


@dataclass(frozen=True)
class SpringSensitivity:
    """Sensitivity of one plane's lowest load factor to one spring.

    Attributes
    ----------
    axis : bending plane
    restraint : restraint (or foundation) index in the plane's column (0-based)
    kind : "lateral" or "rotation", or a foundation modulus ("modulus", "modulus_bottom", "modulus_top")
    at : station height (a foundation: the bottom of its range) [m]
    stiffness : the spring [N/m or N m/rad]; inf when rigid
    load_factor : the plane's lowest load factor [-]
    derivative : d lam / d k [1/(N/m) or 1/(N m/rad)]; None when rigid
    normalised : (k / lam) d lam / d k [-]; None when rigid
    fd_derivative : central finite difference on the same mesh, or None
    fd_relative_difference : |derivative - fd| / |fd|, or None
    rigid : whether the restraint is rigid (its degree of freedom eliminated)
    note : "", or why the figure needs care
    source : "restraint" or "foundation"
    """

    axis: str
    restraint: int
    kind: str
    at: float
    stiffness: float
    load_factor: float
    derivative: float | None
    normalised: float | None
    fd_derivative: float | None
    fd_relative_difference: float | None
    rigid: bool
    note: str = ""
    source: str = "restraint"


def _foundation_springs(column: Column, kinds) -> list[tuple[int, str]]:
    """(foundation index, kind) of the foundation moduli to differentiate (nonzero ones only)."""
    out = []
    for i, f in enumerate(column.foundations):
        if kinds is not None:
            ks = tuple(kinds.get(i, ()))
        else:
            ks = ("modulus",) if f.k_bottom == f.k_top_value else ("modulus_bottom", "modulus_top")
        out += [(i, k) for k in ks if stiffness_of(column, i, k) != 0.0]
    return out


def column_sensitivities(column: Column, axis: str = "", tol: float = DEFAULT_TOL, check: bool = True,
                         rel_step: float = 1e-4, foundations=None) -> tuple[SpringSensitivity, ...]:
    """Sensitivities of ``column``'s lowest load factor to each of its non-free springs and foundation moduli.

    Parameters
    ----------
    column : the column
    axis : plane label carried into the results
    tol : mesh tolerance (the mesh is the one :func:`buckling` converges on)
    check : also compute central finite differences ``(lam(k+h) - lam(k-h)) / 2h``
        on the same mesh, at steps ``h`` and ``h/2`` combined by Richardson
        extrapolation (error of order ``h^4``), with
        ``h = min(rel_step lam / (d lam/dk), k / 20)`` so that even a weak
        spring changes the load factor well above round-off; the load factors
        come from the dense LAPACK solver
    rel_step : relative change of the load factor aimed at over one step
    foundations : {foundation index: (kind, ...)} the moduli to differentiate
        (default: "modulus" for a uniform foundation, else both ends); zero
        moduli are left out
    """
    level = converged_level(column, tol)
    springs = [(i, kind) for i, r in enumerate(column.restraints) for kind in ("lateral", "rotation")
               if getattr(r, kind) != 0.0]
    finite = [(i, kind) for i, kind in springs if math.isfinite(getattr(column.restraints[i], kind))]
    soil = _foundation_springs(column, foundations)
    finite += soil
    out = []
    lam1 = math.nan
    if finite:
        model = SpringModel.build(column, finite, level)
        k0 = np.array([stiffness_of(column, i, kind) for i, kind in finite])
        lam, phi, G = model.modes(k0, n_modes=2)
        lam1 = float(lam[0])
        v = phi[:, 0]
        gnorm = float(v @ G @ v)
        repeated = lam.size > 1 and abs(lam[1] / lam[0] - 1.0) < REPEATED_GAP
    else:
        from ..solve.eigen import buckling

        lam1 = buckling(column, n_modes=1, tol=tol).load_factor
    items = [(i, kind, r.at) for i, r in enumerate(column.restraints) for kind in ("lateral", "rotation")]
    items += [(i, kind, column.foundations[i].bottom) for i, kind in soil]
    for i, kind, at in items:
        k = stiffness_of(column, i, kind)
        source = "foundation" if kind not in ("lateral", "rotation") else "restraint"
        if k == 0.0:
            continue
        if math.isinf(k):
            out.append(SpringSensitivity(axis, i, kind, at, k, lam1, None, None, None, None, True,
                                         "rigid: degree of freedom eliminated"))
            continue
        j = finite.index((i, kind))
        der = model.derivative(j, v) / gnorm
        fd = rel = None
        if check:
            h = min(rel_step * lam1 / der, 0.05 * k) if der > 0 else rel_step * k

            def central(step: float) -> float:
                kp, km = k0.copy(), k0.copy()
                kp[j] += step
                km[j] -= step
                return (model.load_factor_dense(kp) - model.load_factor_dense(km)) / (2 * step)

            fd = (4.0 * central(0.5 * h) - central(h)) / 3.0
            rel = abs(der - fd) / abs(fd) if fd != 0 else (0.0 if der == 0 else math.inf)
        note = ("two lowest load factors coincide: the derivative is one-sided (mode switch)"
                if repeated else "")
        out.append(SpringSensitivity(axis, i, kind, at, k, lam1, der, k / lam1 * der, fd, rel, False, note,
                                     source))
    return tuple(out)
