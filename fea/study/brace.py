"""Brace stiffness: how stiff a restraint must be to act as a point of no sway.

For one or more restraints varied together (equal stiffness ``k``), the
*threshold stiffness* is the least ``k`` at which the lowest load factor
reaches ``(1 - eps)`` times its value with those restraints rigid.  Where the
braced mode has a node at the brace (a symmetric column with a brace at
mid-height) the load factor reaches the rigid value exactly at a finite ``k``:
the mode switches from a mode that moves the brace to one that does not, and
the curve has a corner there.  Elsewhere it only approaches the rigid value,
and the threshold depends on ``eps``, which is therefore stated with every
result.  The threshold is found by bisection on ``log k`` (the load factor
never decreases with ``k``; see :mod:`fea.study.bounds`), on one mesh.

Beside it: Winter's ideal stiffness for ``n`` equally spaced braces,
``beta_i = 2 [1 + cos(pi / (n + 1))] P / L_b`` (Winter, G., "Lateral bracing of
columns and beams", Trans. ASCE 125, 1960; the coefficients 2, 3, 3.414, 3.618
for n = 1..4), where ``P`` is the axial force at the braces at the rigid-brace
critical state and ``L_b`` the brace spacing; Winter's model hinges the column at
the braces, so it differs slightly from a continuous column for n >= 2.  And the
nodal (point) brace requirements for columns of AISC 360-16 Appendix 6,
Section 6.2 (from memory, source not at hand): strength ``P_br = 0.01 P_r``,
stiffness ``beta_br = 8 P_r / (phi L_br)`` with ``phi = 0.75`` (LRFD).

Pure: SI floats, no I/O.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import ModelError
from ..model import Column
from ..solve.eigen import DEFAULT_TOL
from .spring_set import SpringModel, converged_level

__all__ = ["BraceResult", "brace_stiffness", "winter_coefficient", "AISC_PHI", "AISC_STIFFNESS_COEFF",
           "AISC_STRENGTH_RATIO", "DEFAULT_EPS", "BraceForce", "brace_force"]

#: Default relative shortfall from the rigid-brace load factor that counts as reached.
DEFAULT_EPS = 1e-6
#: AISC 360-16 Appendix 6, Section 6.2, point (nodal) bracing of columns (from memory).
AISC_PHI = 0.75
AISC_STIFFNESS_COEFF = 8.0
AISC_STRENGTH_RATIO = 0.01

_BISECT = 60


def winter_coefficient(n: int) -> float:
    """Winter's ideal-stiffness coefficient for ``n`` equally spaced braces: 2 [1 + cos(pi / (n + 1))]."""
    if n < 1:
        raise ModelError("braces", f"expected at least one brace, got {n}")
    return 2.0 * (1.0 + math.cos(math.pi / (n + 1)))


@dataclass(frozen=True)
class BraceResult:
    """Threshold stiffness of one set of braces in one plane.

    Attributes
    ----------
    axis : bending plane
    restraints : restraint indices varied together (0-based, in the plane's column)
    kind : "lateral" or "rotation"
    stations : (n,) brace heights [m]
    given_stiffness : (n,) the stiffnesses the column has [SI]
    load_factor_given : load factor with the given stiffnesses [-]
    load_factor_rigid : load factor with the braces rigid [-]
    load_factor_free : load factor with the braces removed (0: mechanism) [-]
    eps : relative shortfall accepted as "reached"
    threshold : least stiffness reaching (1 - eps) load_factor_rigid [SI]; None
        when no finite stiffness reaches it; 0 when the braces are not needed
    fraction : target fraction of the rigid load factor [-]
    fraction_stiffness : stiffness at which the load factor is fraction *
        load_factor_rigid [SI] (0 when already reached without braces)
    axial_force_rigid : largest compression at the braces at the rigid-brace
        critical state [N] (Winter's P)
    axial_force_design : the same at load factor 1 (AISC P_r) [N]
    spacing : brace spacing L_b, the longest distance from a brace to the next
        lateral support [m]
    equally_spaced : braces and end supports evenly spaced, ends rigid
    winter_coefficient, winter_stiffness : 2[1 + cos(pi/(n+1))] and that times P / L_b
    aisc_stiffness : 8 P_r / (phi L_b) [N/m]; aisc_strength : 0.01 P_r [N]
    aisc_stiffness_at_rigid : the AISC stiffness with P_r = axial_force_rigid [N/m]
    curve_k, curve_load_factor : stiffness and load factor along a log range for a chart
    level : mesh level
    """

    axis: str
    restraints: tuple[int, ...]
    kind: str
    stations: tuple[float, ...]
    given_stiffness: tuple[float, ...]
    load_factor_given: float
    load_factor_rigid: float
    load_factor_free: float
    eps: float
    threshold: float | None
    fraction: float
    fraction_stiffness: float | None
    axial_force_rigid: float
    axial_force_design: float
    spacing: float
    equally_spaced: bool
    winter_coefficient: float
    winter_stiffness: float
    aisc_stiffness: float
    aisc_strength: float
    aisc_stiffness_at_rigid: float
    curve_k: np.ndarray
    curve_load_factor: np.ndarray
    level: int
    model: SpringModel


def _supports(column: Column, restraints: tuple[int, ...]) -> tuple[float, bool]:
    """Brace spacing L_b and whether braces and rigid end supports are evenly spaced."""
    braces = sorted(column.restraints[i].at for i in restraints)
    others = sorted(r.at for i, r in enumerate(column.restraints) if i not in restraints and r.lateral > 0)
    pts = sorted(set(braces + others))
    lb = 0.0
    for b in braces:
        j = pts.index(b)
        if j > 0:
            lb = max(lb, b - pts[j - 1])
        if j + 1 < len(pts):
            lb = max(lb, pts[j + 1] - b)
    gaps = np.diff(pts)
    rigid_ends = [r.at for i, r in enumerate(column.restraints) if i not in restraints and math.isinf(r.lateral)]
    even = (len(pts) == len(braces) + 2 and gaps.size > 0 and np.ptp(gaps) <= 1e-9 * column.height
            and pts[0] in rigid_ends and pts[-1] in rigid_ends)
    return lb, bool(even)


def brace_stiffness(column: Column, restraints, kind: str = "lateral", fraction: float = 0.95,
                    eps: float = DEFAULT_EPS, tol: float = DEFAULT_TOL, axis: str = "") -> BraceResult:
    """Threshold stiffness of the braces ``restraints`` (varied together) of ``column``.

    Parameters
    ----------
    column : the column
    restraints : restraint indices (0-based) that share the stiffness ``k``
    kind : "lateral" (braces, girts) or "rotation"
    fraction : target fraction of the rigid-brace load factor (0 < fraction <= 1)
    eps : relative shortfall accepted as reaching the rigid value (0 < eps < 0.01)
    tol : mesh tolerance; the mesh is the one converged with the braces rigid
        or as given, whichever is finer
    """
    restraints = tuple(int(i) for i in np.atleast_1d(restraints))
    if not restraints:
        raise ModelError("restraint", "name at least one restraint")
    if not 0 < fraction <= 1:
        raise ModelError("fraction", f"expected a fraction in (0, 1], got {fraction!r}")
    if not 0 < eps < 0.01:
        raise ModelError("eps", f"expected a relative tolerance between 0 and 0.01, got {eps!r}")
    springs = tuple((i, kind) for i in restraints)
    given = tuple(getattr(column.restraints[i], kind) for i in restraints) if all(
        0 <= i < len(column.restraints) for i in restraints) else ()
    rigid_col = column
    for i in restraints:
        rigid_col = rigid_col.with_restraint(i, **{kind: math.inf})
    levels = [converged_level(rigid_col, tol)]
    try:
        levels.append(converged_level(column, tol))
    except ModelError:
        pass
    level = max(levels)
    model = SpringModel.build(column, springs, level)
    m = len(springs)

    def lam(k: float) -> float:
        return model.load_factor(np.full(m, k))

    lam_r = lam(math.inf)
    lam_0 = lam(0.0)
    lam_given = model.load_factor(np.array(given))
    seg_ei = max(s.E * s.I_ref for s in column.segments)
    H = column.height
    scale = seg_ei / H**3 if kind == "lateral" else seg_ei / H
    k_th = _least_stiffness(lam, lam_0, (1.0 - eps) * lam_r, scale)
    if fraction >= 1.0 - eps:
        k_f = k_th
    elif lam_0 >= fraction * lam_r:
        k_f = 0.0
    else:
        k_f = _fraction_stiffness(lam, fraction * lam_r, k_th if k_th else scale)

    # Winter and AISC figures
    stations = tuple(column.restraints[i].at for i in restraints)
    P_rigid, P_design = _brace_axial_forces(column, stations, lam_r)
    lb, even = _supports(column, restraints)
    c = winter_coefficient(len(restraints))
    marks = [v for v in (k_th, k_f, (2.0 * P_rigid / lb) if lb > 0 else None) if v and math.isfinite(v)]
    if not marks:
        marks = [scale]
    ks = np.logspace(math.log10(min(marks)) - 1.5, math.log10(max(marks)) + 1.0, 121)
    curve = np.array([lam(k) for k in ks])
    return BraceResult(
        axis=axis, restraints=restraints, kind=kind, stations=stations, given_stiffness=given,
        load_factor_given=lam_given, load_factor_rigid=lam_r, load_factor_free=lam_0, eps=eps, threshold=k_th,
        fraction=fraction, fraction_stiffness=k_f, axial_force_rigid=P_rigid, axial_force_design=P_design,
        spacing=lb, equally_spaced=even, winter_coefficient=c,
        winter_stiffness=c * P_rigid / lb if lb > 0 else math.nan,
        aisc_stiffness=AISC_STIFFNESS_COEFF * P_design / (AISC_PHI * lb) if lb > 0 else math.nan,
        aisc_strength=AISC_STRENGTH_RATIO * P_design,
        aisc_stiffness_at_rigid=AISC_STIFFNESS_COEFF * P_rigid / (AISC_PHI * lb) if lb > 0 else math.nan,
        curve_k=ks, curve_load_factor=curve, level=level, model=model)


def _least_stiffness(lam, lam_0: float, goal: float, scale: float) -> float | None:
    """Least ``k`` with ``lam(k) >= goal``: bracketed from ``scale``, then bisection on log k.

    0 when the braces are not needed, None when no finite stiffness reaches ``goal``.
    """
    if lam_0 >= goal:
        return 0.0
    lo, hi = scale * 1e-6, scale
    while lam(lo) >= goal:
        lo /= 1e3
        if lo < scale * 1e-30:
            return 0.0
    steps = 0
    while lam(hi) < goal:
        lo, hi = hi, hi * 10.0
        steps += 1
        if steps > 24:
            return None
    a, b = math.log(lo), math.log(hi)
    for _ in range(_BISECT):
        mid = 0.5 * (a + b)
        if lam(math.exp(mid)) >= goal:
            b = mid
        else:
            a = mid
    return math.exp(b)


def _fraction_stiffness(lam, goal: float, hi: float) -> float:
    """The ``k`` where ``lam(k) = goal`` (Brent's method on log k), bracketed from ``hi`` by decades."""
    while lam(hi) < goal:
        hi *= 10
    lo = hi
    while lam(lo) >= goal:
        lo /= 10
    from scipy.optimize import brentq  # imported here: keeps start-up fast

    return math.exp(brentq(lambda t: lam(math.exp(t)) - goal, math.log(lo), math.log(hi), xtol=1e-13, rtol=1e-13))


def _brace_axial_forces(column: Column, stations: tuple[float, ...], lam_r: float) -> tuple[float, float]:
    """Largest compression at the braces at the rigid-brace critical state (Winter's P) and at load factor 1."""
    tolx = 1e-9 * column.height
    Nv = max(float(column.axial_force(np.array([max(s - tolx, 0.0)]), permanent=False)[0]) for s in stations)
    Np = max(float(column.axial_force(np.array([max(s - tolx, 0.0)]), permanent=True)[0]) for s in stations)
    return Np + lam_r * Nv, Np + Nv


@dataclass(frozen=True)
class BraceForce:
    """Brace forces at load factor 1 of an initially bowed column.

    Attributes
    ----------
    stiffness : brace stiffness used [N/m]
    basis : why that stiffness ("as given", "twice the threshold")
    bow_ratio : L / bow of the half-sine initial bow over the whole height
    forces : (n,) brace forces k * (additional lateral deflection at the brace) [N]
    ratios : (n,) forces / axial_force_design [-]
    critical_load_factor : of the braced column with that stiffness [-]
    """

    stiffness: float
    basis: str
    bow_ratio: float
    forces: tuple[float, ...]
    ratios: tuple[float, ...]
    critical_load_factor: float


def brace_force(column: Column, result: BraceResult, bow_ratio: float = 500.0, stiffness: float | None = None,
                tol: float = DEFAULT_TOL) -> BraceForce:
    """Brace forces under the loads at load factor 1 with a half-sine bow of height / ``bow_ratio``.

    Uses the second-order elastic analysis of :mod:`fea.solve.second_order`.
    The brace force is ``k u`` with ``u`` the lateral deflection at the brace
    added by the loads (the brace is unstressed on the bowed column).  The
    stiffness is ``stiffness`` if given, else the braces' own when finite, else
    twice the threshold (Winter's advice to provide about twice the ideal
    stiffness for an imperfect column, from memory).
    """
    from ..model.imperfection import Imperfection
    from ..solve.second_order import second_order

    if stiffness is not None:
        k, basis = float(stiffness), "as requested"
    elif all(math.isfinite(v) and v > 0 for v in result.given_stiffness):
        k, basis = float(min(result.given_stiffness)), "as given in the case"
    elif result.threshold:
        k, basis = 2.0 * result.threshold, "twice the threshold stiffness"
    else:
        raise ModelError("brace", "no finite brace stiffness to evaluate the brace force with")
    if not (k > 0 and math.isfinite(k)):
        raise ModelError("brace", f"the brace stiffness must be positive and finite, got {k!r}")
    col = column
    for i in result.restraints:
        col = col.with_restraint(i, **{result.kind: k})
    res = second_order(col, Imperfection(shape="half-sine", ratio=bow_ratio), load_factors=[1.0], tol=tol,
                       axis=result.axis)
    if not res.critical_load_factor > 1.0:
        raise ModelError("brace", f"the braced column buckles below the design load (critical load factor "
                                  f"{res.critical_load_factor:.3g}): no brace force at load factor 1")
    u = res.deflection[0] - res.bow
    forces = []
    for s in result.stations:
        j = int(np.argmin(np.abs(res.heights - s)))
        forces.append(abs(k * float(u[j])) if result.kind == "lateral" else math.nan)
    P = result.axial_force_design
    return BraceForce(stiffness=k, basis=basis, bow_ratio=bow_ratio, forces=tuple(forces),
                      ratios=tuple(f / P if P > 0 else math.nan for f in forces),
                      critical_load_factor=float(res.critical_load_factor))
