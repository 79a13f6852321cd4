"""Brace stiffness: how stiff a restraint must be to act as a point of no sway.

For one or more restraints varied together (equal stiffness ``k``), the result
is the *fraction stiffness*: the ``k`` at which the lowest load factor is a
stated fraction (default 0.95) of its value with those restraints rigid.

The *threshold stiffness* is the least ``k`` at which the load factor reaches
``(1 - eps)`` times the rigid value.  It is a result only where the braced
mode has a node at the brace (a symmetric column with a brace at mid-height,
equally spaced braces): the load factor reaches the rigid value exactly at a
finite ``k``, where the mode switches from one that moves the brace to one
that does not (a corner of the curve), and the threshold does not depend on
``eps``.  Elsewhere the load factor only approaches the rigid value as ``k``
grows without bound, and the least ``k`` within ``eps`` of it grows like
``1 / eps``: a number set by the tolerance alone.  The two are told apart by
finding the threshold also at ``10 eps``: at a corner the two agree (to
``THRESHOLD_AGREEMENT``), on an asymptote they differ by a factor of about 10;
only a corner's threshold is reported (:attr:`BraceResult.threshold_reached`).
Both are found by bisection on ``log k`` (the load factor never decreases
with ``k``; see :mod:`fea.study.bounds`), on one mesh.

The varied stiffness may also be a foundation modulus (``kind`` one of
:data:`fea.study.spring_set.FOUNDATION_KINDS`; "rigid" then holds the
foundation's whole range); Winter's and AISC's figures are for lateral braces
only.

Beside it: Winter's ideal stiffness for ``n`` equally spaced braces,
``beta_i = 2 [1 + cos(pi / (n + 1))] P / L_b`` (Winter, G., "Lateral bracing of
columns and beams", Trans. ASCE 125, 1960; the coefficients 2, 3, 3.414, 3.618
for n = 1..4), where ``P`` is the axial force at the braces at the rigid-brace
critical state and ``L_b`` the brace spacing; Winter's model hinges the column at
the braces, so it differs slightly from a continuous column for n >= 2.  And the
nodal (point) brace requirements for columns of AISC 360-16, *Specification for
Structural Steel Buildings*, Appendix 6, Section 6.2 (point bracing; from
memory): strength ``P_br = 0.01 P_r``, stiffness ``beta_br = 8 P_r / (phi L_br)``
with ``phi = 0.75`` (LRFD).  ``P_r`` is taken as the largest compression in the
braced lengths next to the brace (from the next lateral support below it to
the next above), so a brace between a lightly and a heavily loaded length is
sized for the heavier.

Pure: SI floats, no I/O.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import ModelError
from ..model import Column
from ..solve.eigen import DEFAULT_TOL
from .spring_set import SpringModel, converged_level, is_foundation_kind, stiffness_of, with_stiffness

__all__ = ["BraceResult", "brace_stiffness", "winter_coefficient", "AISC_PHI", "AISC_STIFFNESS_COEFF",
           "AISC_STRENGTH_RATIO", "DEFAULT_EPS", "BraceForce", "brace_force"]

#: Default relative shortfall from the rigid-brace load factor that counts as reached.
DEFAULT_EPS = 1e-6
#: Thresholds at eps and 10 eps within this ratio: the curve has a corner (mode switch) there.
THRESHOLD_AGREEMENT = 1.5
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
    threshold_kind : "corner" (the load factor reaches the rigid value at a
        finite stiffness, a mode switch: a result), "tolerance" (it only
        approaches it: the threshold is set by ``eps`` alone, not a result),
        "not needed" (0) or "not reached" (None)
    fraction : target fraction of the rigid load factor [-]
    fraction_stiffness : stiffness at which the load factor is fraction *
        load_factor_rigid [SI] (0 when already reached without braces)
    axial_force_rigid : largest compression in the braced lengths next to the
        braces at the rigid-brace critical state [N] (Winter's P)
    axial_force_design : the same at load factor 1 (AISC P_r) [N]
    braced_lengths : ((bottom, top), ...) the lengths next to the braces over
        which those forces are the largest [m]
    axial_force_height : height of the largest compression at load factor 1 [m]
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
    threshold_kind: str
    fraction: float
    fraction_stiffness: float | None
    axial_force_rigid: float
    axial_force_design: float
    braced_lengths: tuple[tuple[float, float], ...]
    axial_force_height: float
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

    @property
    def threshold_reached(self) -> float | None:
        """The threshold stiffness when it is a result (a corner of the curve, or 0), else None."""
        return self.threshold if self.threshold_kind in ("corner", "not needed") else None


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
    soil = is_foundation_kind(kind)
    items = column.foundations if soil else column.restraints
    given = tuple(stiffness_of(column, i, kind) for i in restraints) if all(
        0 <= i < len(items) for i in restraints) else ()
    rigid_col = column
    for i in restraints:  # a rigid foundation is not a column: a thousand times its modulus sets the mesh
        rigid_col = with_stiffness(rigid_col, i, kind, 1e3 * max(given[0] if given else 0.0, 1.0) if soil
                                   else math.inf)
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
    scale = seg_ei / H**3 if kind == "lateral" else seg_ei / H**4 if soil else seg_ei / H
    k_th = _least_stiffness(lam, lam_0, (1.0 - eps) * lam_r, scale)
    if k_th is None:
        th_kind = "not reached"
    elif k_th == 0.0:
        th_kind = "not needed"
    else:
        k_10 = _least_stiffness(lam, lam_0, (1.0 - 10.0 * eps) * lam_r, scale)
        th_kind = "corner" if k_10 and k_th / k_10 < THRESHOLD_AGREEMENT else "tolerance"
    if fraction >= 1.0 - eps:
        k_f = k_th
    elif lam_0 >= fraction * lam_r:
        k_f = 0.0
    else:
        k_f = _fraction_stiffness(lam, fraction * lam_r, k_th if k_th else scale)

    # Winter and AISC figures
    if soil:
        stations = tuple(0.5 * (column.foundations[i].bottom + column.foundations[i].top) for i in restraints)
        lb, even = 0.0, False
        lengths: tuple[tuple[float, float], ...] = tuple((column.foundations[i].bottom, column.foundations[i].top)
                                                         for i in restraints)
    else:
        stations = tuple(column.restraints[i].at for i in restraints)
        lb, even = _supports(column, restraints)
        lengths = _braced_lengths(column, restraints)
    P_rigid, P_design, at_max = _brace_axial_forces(column, lengths, lam_r)
    c = winter_coefficient(len(restraints))
    marks = [v for v in (k_th, k_f, (2.0 * P_rigid / lb) if lb > 0 and not soil else None)
             if v and math.isfinite(v)]
    if not marks:
        marks = [scale]
    lo_k, hi_k = math.log10(min(marks)) - 1.5, math.log10(max(marks)) + 1.0
    own = [math.log10(v) for v in given if v > 0 and math.isfinite(v)]  # the case's own stiffness on the chart
    if own and (min(own) < lo_k or max(own) > hi_k):
        lo_k, hi_k = min([lo_k, min(own) - 0.5]), max([hi_k, max(own) + 0.5])
    ks = np.logspace(lo_k, hi_k, 121)
    curve = np.array([lam(k) for k in ks])
    return BraceResult(
        axis=axis, restraints=restraints, kind=kind, stations=stations, given_stiffness=given,
        load_factor_given=lam_given, load_factor_rigid=lam_r, load_factor_free=lam_0, eps=eps, threshold=k_th,
        threshold_kind=th_kind, fraction=fraction, fraction_stiffness=k_f, axial_force_rigid=P_rigid,
        axial_force_design=P_design, braced_lengths=lengths, axial_force_height=at_max, spacing=lb,
        equally_spaced=even, winter_coefficient=c,
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


def _braced_lengths(column: Column, restraints: tuple[int, ...]) -> tuple[tuple[float, float], ...]:
    """The lengths next to each brace: from the next lateral support (or end) below it to the next above."""
    others = sorted(r.at for i, r in enumerate(column.restraints) if i not in restraints and r.lateral > 0)
    pts = sorted(set([0.0, column.height] + others + [column.restraints[i].at for i in restraints]))
    out = []
    for i in restraints:
        s = column.restraints[i].at
        j = pts.index(s)
        out.append((pts[max(j - 1, 0)], pts[min(j + 1, len(pts) - 1)]))
    return tuple(out)


def _brace_axial_forces(column: Column, lengths, lam_r: float) -> tuple[float, float, float]:
    """Largest compression in the braced lengths at the rigid-brace critical state (Winter's P), at load
    factor 1 (AISC P_r), and the height of the latter [N, N, m].

    The axial force is piecewise linear between the column's stations, so its
    largest value over a length is at a station just above or just below.
    """
    tolx = 1e-9 * column.height
    st = np.array(column.stations())
    xs = []
    for a, b in lengths:
        inner = st[(st >= a) & (st <= b)]
        xs += [min(max(x + d, a), b) for x in np.concatenate([[a, b], inner]) for d in (-tolx, tolx)]
    x = np.array(sorted(set(xs)))
    Np = column.axial_force(x, permanent=True)
    Nv = column.axial_force(x, permanent=False)
    design = Np + Nv
    j = int(np.argmax(design))
    return float(np.max(Np + lam_r * Nv)), float(design[j]), float(x[j])


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
    twice the threshold where the curve has one, else twice the fraction
    stiffness (Winter's advice to provide about twice the ideal stiffness for an
    imperfect column, from memory).
    """
    from ..model.imperfection import Imperfection
    from ..solve.second_order import second_order

    if stiffness is not None:
        k, basis = float(stiffness), "as requested"
    elif all(math.isfinite(v) and v > 0 for v in result.given_stiffness):
        k, basis = float(min(result.given_stiffness)), "as given in the case"
    elif result.threshold_reached:
        k, basis = 2.0 * float(result.threshold_reached), "twice the threshold stiffness"
    elif result.fraction_stiffness:
        k, basis = 2.0 * result.fraction_stiffness, (f"twice the stiffness for {100 * result.fraction:g}% of the "
                                                     "rigid-brace load factor")
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
