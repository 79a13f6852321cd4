"""Depth of fixity of a column held by a foundation (a pile in soil), from its elastic critical load.

A pile stands a free length ``L_u`` above the ground line (the top of its highest foundation) and is held below
it by the soil.  Its **equivalent fixed-base column** is the column of the same ``EI``, fixed at its base, with
the same head restraint, that buckles at the same axial force ``N_cr`` as the pile:

* head free (no lateral and no rotational restraint): a cantilever, ``N_cr = pi^2 EI / (4 L_e^2)``,
  ``L_e = (pi / 2) sqrt(EI / N_cr)``;
* head held against rotation, free to sway: ``L_e = pi sqrt(EI / N_cr)``;
* head held laterally, free to rotate: ``N_cr = beta^2 EI / L_e^2``, ``beta = 4.4934`` (the least root of
  ``tan beta = beta``), ``L_e = beta sqrt(EI / N_cr)``;
* head held laterally and against rotation: ``L_e = 2 pi sqrt(EI / N_cr)``.

(Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., sections 2.1 to 2.4, from memory.)  The **depth of
fixity** is ``d_f = L_e - L_u``: how far below the ground line the pile acts as if fixed.

It is compared with the rule of thumb ``d_f = 1.8 T``, ``T = (EI / n_h)^(1/5)`` (common practice for long
free-headed piles in soil whose modulus grows linearly with depth, ``k = n_h z``; Davisson and Robinson, 1965,
from memory), only when the foundation modulus of the plane grows linearly from zero at the ground line.  The
rule is for long piles: an embedded length of about 4 T or more (common practice).

The depth is defined only where the equivalence holds: an ideal head (each of its springs free or rigid), no
restraint or leaning load between the ground line and the head, a uniform ``EI`` over the free length and
compression in it; otherwise the entry says why it is not given.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..model import STATION_TOL, Column
from ..results import BucklingResult

__all__ = ["Fixity", "depth_of_fixity", "case_fixity", "HEAD_CASES", "RULE_FACTOR", "LONG_PILE_T"]

#: Least positive root of tan(beta) = beta: a column fixed at its base and pinned at its head buckles at
#: beta^2 EI / L^2 (Timoshenko & Gere, 2nd ed., section 2.4, from memory).
BETA_PROPPED = 4.493409457909064
#: Ideal head (lateral held, rotation held) -> (its name, c in L_e = c sqrt(EI / N_cr)).
HEAD_CASES: dict[tuple[bool, bool], tuple[str, float]] = {
    (False, False): ("free head (equivalent cantilever)", math.pi / 2),
    (False, True): ("head fixed against rotation, free to sway", math.pi),
    (True, False): ("head held laterally, free to rotate", BETA_PROPPED),
    (True, True): ("head held laterally and against rotation", 2 * math.pi),
}
#: Depth of fixity of the rule of thumb, in units of T = (EI / n_h)^(1/5) (common practice).
RULE_FACTOR = 1.8
#: Embedded length, in units of T, from which a pile counts as long for the rule of thumb (common practice).
LONG_PILE_T = 4.0
#: Relative tolerance of "the modulus grows linearly from zero at the ground line" and of a uniform EI.
_RTOL = 1e-9

DEFINITION = ("L_e = c sqrt(EI / N_cr), the length of the fixed-base column of the same EI and head restraint "
              "that buckles at the same axial force N_cr (c = pi/2 free head, pi head fixed in rotation and free "
              "to sway, 4.493 head held laterally, 2 pi held laterally and in rotation); depth of fixity "
              "d_f = L_e - L_u, L_u the free length above the ground line (the top of the highest foundation)")


@dataclass(frozen=True)
class Fixity:
    """Depth of fixity of one bending plane (SI).

    Attributes
    ----------
    axis : the bending plane
    ground_line : height of the ground line: the top of the highest foundation [m]
    free_length : ``L_u``, from the ground line to the top of the column [m]
    embedded_length : from the lowest foundation's bottom to the ground line [m]
    head : the ideal head restraint, or "" when the head is not ideal
    EI : bending stiffness of the free length [N m^2] (None: not uniform)
    critical_force : ``N_cr``, the largest compression in the free length at the lowest critical state [N]
    equivalent_length : ``L_e`` [m] (None: not defined)
    depth : ``d_f = L_e - L_u`` [m] (None: not defined)
    n_h : rate of growth of the foundation modulus with depth [N/m^3] (None: it does not grow linearly from
        zero at the ground line)
    T : ``(EI_embedded / n_h)^(1/5)`` [m], EI just below the ground line
    rule_depth : ``1.8 T`` [m]
    depth_in_T : ``d_f / T`` [-]
    long_pile : embedded length at least ``4 T``
    definition : the definition of ``L_e`` and ``d_f``
    notes : why a value is not given, and the assumptions
    """

    axis: str
    ground_line: float
    free_length: float
    embedded_length: float
    head: str
    EI: float | None
    critical_force: float | None
    equivalent_length: float | None
    depth: float | None
    n_h: float | None
    T: float | None
    rule_depth: float | None
    depth_in_T: float | None
    long_pile: bool | None
    definition: str = DEFINITION
    notes: tuple[str, ...] = ()


def _head(column: Column, ground: float, tol: float) -> tuple[tuple[bool, bool] | None, str]:
    """The ideal head (lateral held, rotation held), or None with the reason."""
    H = column.height
    for r in column.restraints:
        if ground + tol < r.at < H - tol:
            return None, (f"a restraint at {r.at:.4g} m lies between the ground line and the head: the free length "
                          "is not an equivalent fixed-base column")
    for lean in column.leaning_loads:
        if lean.at > ground + tol:
            return None, (f"a leaning load at {lean.at:.4g} m acts on the free length: no ideal equivalent "
                          "fixed-base column")
    if H - ground <= tol:
        return (False, False), ""
    lateral = sum(r.lateral for r in column.restraints if abs(r.at - H) <= tol)
    rotation = sum(r.rotation for r in column.restraints if abs(r.at - H) <= tol)
    if 0 < lateral < math.inf or 0 < rotation < math.inf:
        return None, ("the head restraint is an elastic spring: the depth of fixity is defined for an ideal head "
                      "(each restraint free or rigid) only")
    return (math.isinf(lateral), math.isinf(rotation)), ""


def _uniform_EI(column: Column, a: float, b: float, tol: float) -> float | None:
    """E I over the heights ``a`` to ``b`` when it is the same everywhere there, else None."""
    values = []
    for (lo, hi), s in zip(column.segment_bounds(), column.segments):
        if hi > a + tol and lo < b - tol:
            values += [s.E * float(s.inertia_at(max(a, lo) - lo)), s.E * float(s.inertia_at(min(b, hi) - lo))]
    if not values or max(values) - min(values) > _RTOL * max(values):
        return None
    return max(values)


def _EI_at(column: Column, x: float) -> float:
    """E I just below the height ``x``."""
    for (lo, hi), s in zip(column.segment_bounds(), column.segments):
        if lo < x <= hi or x <= lo:
            return s.E * float(s.inertia_at(min(x, hi) - lo))
    s = column.segments[-1]
    return s.E * float(s.inertia_at(s.length))


def _largest_compression(column: Column, ground: float, load_factor: float, tol: float) -> float:
    """The largest compression in the free length at the critical state [N] (exact for the piecewise-linear
    axial force: evaluated on both sides of every station)."""
    xs = [x for x in column.stations() if x >= ground - tol]

    def force(x: float) -> float:
        return float(column.axial_force(x, permanent=True) + load_factor * column.axial_force(x, permanent=False))

    def point(x: float) -> float:
        return sum(p.P * (1.0 if p.permanent else load_factor) for p in column.point_loads if abs(p.at - x) <= tol)

    values = [force(x) for x in xs[:-1]]  # just above each station
    values += [force(x) + point(x) for x in xs[1:]]  # just below each station
    return max(values, default=0.0)


def _linear_rate(column: Column, ground: float, tol: float) -> tuple[float | None, str]:
    """``n_h`` when the total foundation modulus is ``n_h (ground - x)`` from the lowest foundation to the ground
    line, else None with the reason."""
    found = column.foundations
    low = min(f.bottom for f in found)
    ends = sorted({f.bottom for f in found} | {f.top for f in found})
    checks: list[tuple[float, float]] = []  # (height, total modulus there from inside an interval)
    for a, b in zip(ends[:-1], ends[1:]):
        if b - a <= tol:
            continue
        cover = [f for f in found if f.bottom <= a + tol and f.top >= b - tol]
        if not cover:
            return None, f"the foundations leave a gap from {a:.4g} m to {b:.4g} m"
        checks += [(a, sum(float(f.modulus_at(a)) for f in cover)), (b, sum(float(f.modulus_at(b)) for f in cover))]
    n_h = checks[0][1] / (ground - low) if checks and ground > low else 0.0
    if not n_h > 0:
        return None, "the foundation modulus does not grow from zero at the ground line"
    scale = n_h * (ground - low)
    if any(abs(k - n_h * (ground - x)) > _RTOL * scale for x, k in checks):
        return None, "the foundation modulus does not grow linearly from zero at the ground line"
    return n_h, ""


def depth_of_fixity(column: Column, result: BucklingResult) -> Fixity | None:
    """The depth of fixity of one plane from its lowest critical state; None when the plane has no foundation.

    Parameters
    ----------
    column : the plane's column, with at least one foundation for a result
    result : its buckling result (the lowest load factor sets ``N_cr``)
    """
    if not column.foundations:
        return None
    H = column.height
    tol = STATION_TOL * H
    ground = max(f.top for f in column.foundations)
    low = min(f.bottom for f in column.foundations)
    free = max(H - ground, 0.0)
    notes: list[str] = []
    head, why = _head(column, ground, tol)
    EI = _uniform_EI(column, ground, H, tol) if free > tol else _EI_at(column, ground)
    if EI is None:
        notes.append("the bending stiffness EI varies along the free length: no uniform equivalent column")
    if any(s.S is not None for s in column.segments):
        notes.append("shear flexibility (S) is not part of the equivalent column's formula")
    N = _largest_compression(column, ground, result.load_factor, tol)
    if not N > 0:
        notes.append("the free length carries no compression at the critical state")
    if why:
        notes.append(why)
    name, c = HEAD_CASES[head] if head is not None else ("", 0.0)
    L_e = depth = None
    if head is not None and EI is not None and N > 0:
        L_e = c * math.sqrt(EI / N)
        depth = L_e - free
        if free <= tol:
            notes.append("no free length: the whole column is embedded, so the depth of fixity is L_e")
    n_h, why_rule = _linear_rate(column, ground, tol)
    T = rule = in_T = long = None
    if n_h is None:
        notes.append(f"1.8 T rule of thumb not compared: {why_rule} (the rule assumes k = n_h z, z the depth)")
    else:
        T = (_EI_at(column, ground) / n_h) ** 0.2
        rule = RULE_FACTOR * T
        in_T = None if depth is None else depth / T
        long = (ground - low) >= LONG_PILE_T * T
        if not long:
            notes.append(f"the embedded length is {(ground - low) / T:.3g} T: the 1.8 T rule of thumb is for long "
                         f"piles (about {LONG_PILE_T:g} T or more, common practice)")
        if head is not None and head != (False, False):
            notes.append("the 1.8 T rule of thumb is for free-headed piles (common practice)")
    return Fixity(axis=result.axis, ground_line=ground, free_length=free, embedded_length=ground - low, head=name,
                  EI=EI, critical_force=N if N > 0 else None, equivalent_length=L_e, depth=depth, n_h=n_h, T=T,
                  rule_depth=rule, depth_in_T=in_T, long_pile=long,
                  notes=tuple(n[:1].upper() + n[1:] for n in notes))


def case_fixity(planes: tuple[tuple[str, Column], ...], results: tuple[BucklingResult, ...]) -> tuple[Fixity, ...]:
    """The depth of fixity of every plane that has a foundation, in the plane order (empty: none has one)."""
    out = []
    for (axis, column), r in zip(planes, results):
        f = depth_of_fixity(column, r)
        if f is not None:
            out.append(f)
    return tuple(out)
