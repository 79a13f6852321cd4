"""The axial design forces of each segment and whether a plane can sway (no I/O).

Shared by the axial checks (:mod:`fea.design.member`) and the design actions of the checks with bending
(:mod:`fea.design.actions`).
"""

from __future__ import annotations

import math

from ..model import STATION_TOL, Column
from .check import SegmentForces

__all__ = ["segment_forces", "sways"]


def segment_forces(column: Column) -> tuple[SegmentForces, ...]:
    """Largest compression and largest tension of each segment at load factor 1 [N].

    The axial force is evaluated just above and just below both segment ends
    and every load station inside the segment, where it is extreme (it is
    piecewise linear in height).
    """
    H = column.height
    tol = 10 * STATION_TOL * H  # clear of the model's own station tolerance, so a load at a station counts below it
    inner = [p.at for p in column.point_loads] + [x for d in column.distributed_loads for x in (d.bottom, d.top)]
    out = []
    for a, b in column.segment_bounds():
        xs = [a + tol, b - tol] + [x + s * tol for x in inner if a < x < b for s in (-1.0, 1.0)]
        N = column.axial_force(xs)
        out.append(SegmentForces(compression=max(float(N.max()), 0.0), tension=max(float(-N.min()), 0.0)))
    return tuple(out)


def sways(column: Column) -> bool:
    """Whether ``column`` may sway: not held rigidly against translation at both its base and top, or it
    carries leaning loads (see :func:`fea.design.sway.classify_sway`)."""
    H = column.height
    held = {round(r.at / H, 9) for r in column.restraints if math.isinf(r.lateral)}
    return bool(column.leaning_loads) or not {0.0, 1.0} <= held
