"""Idealised supports: the design-recommended K beside the theoretical one, and nominal fixities.

A support that is perfectly rigid in rotation does not exist: a base plate
bends, the foundation rotates in the soil, a connection slips.  Where a segment
is bounded by supports that the model idealises (each restraint rigid or free
in translation and in rotation, with at least one rigid in rotation), the
analysis gives the theoretical K of the ideal case, and design practice uses a
larger recommended value.  :func:`ideal_case` finds the nearest ideal case of a
segment and returns both values with their source.

The other way round, a case file may state a nominal fixity instead of a
stiffness: ``rotation = "nominally-fixed"`` or ``"nominally-pinned"`` at the
base or the top.  :func:`nominal_rotation_stiffness` turns the word into a
finite rotational stiffness by one stated rule.

Pure: SI floats in and out, no files.
"""

from __future__ import annotations

import bisect
import math
from dataclasses import dataclass
from typing import Any, Sequence

from ..errors import ModelError
from .column import STATION_TOL, Column, Restraint, Segment

__all__ = ["IdealK", "IDEAL_CASES", "IDEAL_SOURCE", "IDEAL_NOTE", "NOMINAL_FIXITIES", "NOMINAL_SOURCE",
           "ideal_case", "ideal_cases", "nominal_rotation_stiffness", "nominal_rotation_at", "is_nominal"]

#: Where the recommended design values come from.
IDEAL_SOURCE = "AISC 360 Commentary, Appendix 7, Table C-A-7.1, recommended design values (from memory)"

#: Why the recommended value is larger than the theoretical one.
IDEAL_NOTE = "perfect fixity does not exist: design practice uses the recommended value for a nominally rigid support"

# An end condition: (lateral rigid, rotation rigid); free otherwise.
_FIXED = (True, True)
_PINNED = (True, False)
_SLIDING = (False, True)   # rotation fixed, translation free
_FREE = (False, False)

#: (end condition, end condition) -> (name, theoretical K, recommended design K), after IDEAL_SOURCE.
#: Theoretical K: Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., 1961, sections 2.1-2.2 (from memory);
#: fixed-pinned from the root of tan(kL) = kL, kL = 4.4934.  The table of the Commentary rounds it to 0.7.
#: Pinned-pinned (1.0 -> 1.0) has no support rigid in rotation and is not an idealised fixity; it is left out.
IDEAL_CASES: dict[tuple[tuple[bool, bool], tuple[bool, bool]], tuple[str, float, float]] = {
    (_FIXED, _FIXED): ("fixed-fixed", 0.5, 0.65),
    (_FIXED, _PINNED): ("fixed-pinned", math.pi / 4.493409457909064, 0.80),
    (_FIXED, _SLIDING): ("fixed-sliding (rotation fixed, sway free)", 1.0, 1.2),
    (_FIXED, _FREE): ("fixed-free (cantilever)", 2.0, 2.1),
    (_PINNED, _SLIDING): ("pinned-sliding", 2.0, 2.0),
}


@dataclass(frozen=True)
class IdealK:
    """The nearest ideal case of a segment bounded by idealised supports.

    Attributes
    ----------
    name : the ideal case, e.g. "fixed-pinned"
    theoretical : K of the ideal case (prismatic segment, constant axial force) [-]
    recommended : the design value recommended for it [-]
    source : where the recommended value comes from
    note : why design practice uses the recommended value
    """

    name: str
    theoretical: float
    recommended: float
    source: str = IDEAL_SOURCE
    note: str = IDEAL_NOTE

    def as_dict(self) -> dict[str, Any]:
        """Plain data (for the JSON result): case, K_theoretical, K_recommended, source, note."""
        return {"case": self.name, "K_theoretical": self.theoretical, "K_recommended": self.recommended,
                "source": self.source, "note": self.note}


def _end(here: Sequence[Restraint], at_column_end: bool) -> tuple[bool, bool] | None:
    """The idealised end condition given by the restraints ``here`` at a segment end, or None if not idealised.

    A station with no restraint is a free end at the base or the top; elsewhere it is a joint with the next
    segment, which restrains the end by its own stiffness, so it is not a support.  At a joint inside the
    column only a support rigid in both translation and rotation cuts the segment off from its neighbour.
    """
    lateral = sum(r.lateral for r in here)
    rotation = sum(r.rotation for r in here)
    if lateral not in (0.0, math.inf) or rotation not in (0.0, math.inf):
        return None
    end = (math.isinf(lateral), math.isinf(rotation))
    if not at_column_end and end != _FIXED:
        return None
    return end


def ideal_cases(column: Column) -> tuple[IdealK | None, ...]:
    """The nearest ideal case of every segment of ``column``, base upward (None where there is none).

    Given for a segment only when both its ends are idealised supports (each restraint there rigid or free in
    translation and in rotation; a column end with no restraint is free), at least one of them is rigid in
    rotation, no restraint lies inside the segment, no foundation acts over it and no leaning load is tied in
    over it (ends included).  At a joint inside the column the end must be rigid in both translation and
    rotation.  Other cases (springs, continuity with a neighbouring segment, mechanisms) give None.

    The theoretical K is that of a prismatic segment under constant axial force; the analysis K of a tapered
    or shear-flexible segment, or of one whose axial force varies along it, differs from it.

    Linear in the number of segments and restraints (up to a sort), so a column of many segments stays fast.
    """
    n = len(column.segments)
    if not any(math.isinf(r.rotation) for r in column.restraints):
        return (None,) * n
    joints = column.joints
    H = joints[-1]
    tol = STATION_TOL * H
    rs = sorted(column.restraints, key=lambda r: r.at)
    heights = [r.at for r in rs]
    leaning = sorted(lean.at for lean in column.leaning_loads)
    ends = []
    for i, x in enumerate(joints):
        here = rs[bisect.bisect_left(heights, x - tol):bisect.bisect_right(heights, x + tol)]
        ends.append(_end(here, i == 0 or i == n))
    out: list[IdealK | None] = []
    for i in range(n):
        bottom, top = joints[i], joints[i + 1]
        low, high = ends[i], ends[i + 1]
        entry = None
        if low is not None and high is not None:
            entry = IDEAL_CASES.get((low, high)) or IDEAL_CASES.get((high, low))
        if entry is None:
            out.append(None)
            continue
        inside = bisect.bisect_left(heights, top - tol) - bisect.bisect_right(heights, bottom + tol)
        leans = bisect.bisect_right(leaning, top + tol) - bisect.bisect_left(leaning, bottom - tol)
        founded = any(f.bottom < top - tol and f.top > bottom + tol for f in column.foundations)
        out.append(None if inside > 0 or leans > 0 or founded else IdealK(*entry))
    return tuple(out)


#: The last column :func:`ideal_case` was asked about and its answers (columns are immutable).
_LAST: tuple[Column | None, tuple[IdealK | None, ...]] = (None, ())


def ideal_case(column: Column, index: int) -> IdealK | None:
    """The nearest ideal case of segment ``index`` (0-based, from the base) of ``column``, or None.

    See :func:`ideal_cases` for when a segment has one.  The answers for the last column asked about are
    kept, so asking segment by segment costs no more than :func:`ideal_cases` once.
    """
    if not 0 <= index < len(column.segments):
        raise ModelError("segment", f"index {index} is not a segment of a {len(column.segments)}-segment column")
    global _LAST
    last, answers = _LAST
    if last is not column:
        answers = ideal_cases(column)
        _LAST = (column, answers)
    return answers[index]


# ---------------------------------------------------------------------------
# nominal fixities

#: Case-file words -> multiple c of the column stiffness E I / L that the base or top restraint gets.
NOMINAL_FIXITIES = {"nominally-fixed": 4.0, "nominally-pinned": 0.4}

#: The rule and where it comes from.
NOMINAL_SOURCE = ("BS 5950-1:2000 clause 5.1.3 practice for column bases (from memory): a nominally rigid base has "
                  "a rotational stiffness equal to the column stiffness 4 E I / L, a nominally pinned base 10 % of "
                  "it, 0.4 E I / L")


def is_nominal(value: object) -> bool:
    """Whether a case-file value is one of the nominal-fixity words (any case, surrounding blanks allowed)."""
    return isinstance(value, str) and value.strip().lower() in NOMINAL_FIXITIES


def nominal_rotation_stiffness(kind: str, E: float, I: float, L: float) -> float:  # noqa: E741 - I as written
    """Rotational stiffness of a nominal fixity at a column end [N m/rad].

    The rule (BS 5950-1:2000 clause 5.1.3 practice for column bases, from memory): a *nominally rigid* base
    is given a rotational stiffness equal to the stiffness of the column, ``4 E I / L``; a *nominally
    pinned* base 10 % of it, ``0.4 E I / L``.  ``E I`` is the flexural rigidity of the column at that end in
    the bending plane, ``L`` the column height.

    For the reader of an alignment chart (AISC 360 Commentary, Appendix 7, from memory): the chart compares
    relative stiffnesses, ``G = sum (E I / L)`` of the columns over ``sum (E I / L)`` of the restraining
    members, so a base as stiff as the column is ``G = 1.0`` and one of 10 % of it ``G = 10``: the values the
    Commentary's practice takes for a fixed and a pinned base.  The chart turns a relative stiffness into a
    rotational one by its own assumption on the restraining members (far ends in double curvature for a sway
    frame), so the K of this analysis with ``4 E I / L`` is close to, not equal to, the chart's K at ``G = 1``.

    Parameters
    ----------
    kind : "nominally-fixed" or "nominally-pinned"
    E : Young's modulus [Pa]
    I : second moment of area at that end, in the bending plane [m^4]
    L : column height [m]
    """
    word = kind.strip().lower()
    if word not in NOMINAL_FIXITIES:
        raise ModelError("rotation", f"expected one of {', '.join(NOMINAL_FIXITIES)}, got {kind!r}")
    for name, v in (("E", E), ("I", I), ("L", L)):
        if not (isinstance(v, (int, float)) and math.isfinite(v) and v > 0):
            raise ModelError(name, f"must be a positive finite value, got {v!r}")
    return NOMINAL_FIXITIES[word] * E * I / L


def nominal_rotation_at(kind: str, segments: Sequence[Segment], at: float) -> float:
    """:func:`nominal_rotation_stiffness` at the base (``at`` = 0) or the top of a stack of ``segments`` [N m/rad].

    Uses the E and the end value of I of the segment at that end, and the height of the column.
    """
    if not segments:
        raise ModelError("segments", "a column needs at least one segment")
    L = math.fsum(s.length for s in segments)
    tol = STATION_TOL * L
    if abs(at) <= tol:
        seg = segments[0]
        I = seg.I  # noqa: E741
    elif abs(at - L) <= tol:
        seg = segments[-1]
        I = seg.I if seg.I_top is None else seg.I_top  # noqa: E741
    else:
        raise ModelError("rotation", f"a nominal fixity is a column-end condition: only at the base or the top, "
                                     f"not at {at:g} m")
    return nominal_rotation_stiffness(kind, seg.E, I, L)
