"""The elastic critical moment M_cr of each segment for the member checks with bending (no I/O).

``M_cr`` enters EN 1993-1-1 6.3.2 (``lambda_LT = sqrt(W_y fy / M_cr)``) and AISC 360 F2 (the equivalent-length
route of :mod:`fea.design.bending_aisc`).  It is taken, in this order:

1. infinite where lateral-torsional buckling cannot occur: a closed or round section (rectangular and circular
   hollow sections, solid rounds), or a segment that carries no moment about its major axis;
2. from the thin-walled analysis of the case (:func:`fea.solve.spatial_case.case_critical_moment`: the member
   under the case's own first-order major-axis moments, axial loads left out), where its diagram is the design
   actions' diagram of the lateral actions for that segment (the same moments, divided by the load factor);
3. otherwise from the same thin-walled member under the design's first-order major-axis diagram (the lateral
   actions with the imperfection forces), by :func:`fea.solve.spatial_case.diagram_critical_moment`: the case has
   no major-axis moment of its own in the segment (its moments come from the sway imperfection), or the two
   diagrams differ;
4. else it is not available, and the segment is "not verified" with the reason.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any, Sequence

from ..errors import ModelError, SolverError
from ..solve.spatial_case import diagram_critical_moment

if TYPE_CHECKING:
    from ..solve.spatial_case import SpatialCase
    from .actions import MomentDiagram

__all__ = ["NOT_SUSCEPTIBLE", "SegmentMcr", "segment_critical_moments"]

#: Section kinds that do not buckle laterally-torsionally (closed or round): M_cr infinite.
NOT_SUSCEPTIBLE = {"rectangular_hollow": "a rectangular hollow section", "circular_hollow": "a circular hollow section",
                   "round": "a solid round"}
#: Relative agreement at which the thin-walled analysis's diagram counts as the design actions' one (the two
#: meshes find the largest moment of a parabola at slightly different points).
SAME_DIAGRAM = 1e-3


@dataclass(frozen=True)
class SegmentMcr:
    """M_cr of one segment: the value [N m] (inf: not susceptible; nan: not available), where it comes from,
    and why it is not available ("" when it is)."""

    M_cr: float
    source: str
    missing: str = ""


def segment_critical_moments(case: Any, kinds: Sequence[str], major: Sequence[float], spatial: "SpatialCase | None",
                             lateral: "MomentDiagram | None", design: "MomentDiagram | None",
                             lateral_segments: Sequence[float], load_factor: float, cuts: Sequence[float],
                             curved: Sequence[tuple[float, float]]) -> list[SegmentMcr]:
    """M_cr of every segment by the rules of the module notes.

    Parameters
    ----------
    case : the case (tolerance)
    kinds : per segment, the section kind ("" for a section given by its properties)
    major : per segment, the largest major-axis design moment of any route [N m]
    spatial : the thin-walled analysis of the case, or None
    lateral : the design actions' diagram of the lateral actions alone (P = 0) about the major axis
    design : the design's first-order major-axis diagram (lateral actions and imperfection forces)
    lateral_segments : per segment, the largest |M| of ``lateral`` in the segment [N m]
    load_factor : the design load factor (the actions are the case's times it)
    cuts, curved : heights where the major-axis actions jump, and the ranges of distributed lateral loads
    """
    out: list[SegmentMcr | None] = [None] * len(kinds)
    need = []
    for i, (kind, m) in enumerate(zip(kinds, major)):
        if kind in NOT_SUSCEPTIBLE:
            out[i] = SegmentMcr(math.inf, f"{NOT_SUSCEPTIBLE[kind]} is not susceptible to lateral-torsional "
                                          "buckling: M_cr infinite")
        elif not m > 0:
            out[i] = SegmentMcr(math.inf, "no moment about the major axis: no lateral-torsional buckling, M_cr "
                                          "infinite")
        else:
            need.append(i)
    if not need:
        return out  # type: ignore[return-value]
    why = ""
    if spatial is None:
        why = "the thin-walled analysis did not run for this case"
    elif spatial.result is None or spatial.column is None:
        why = f"the thin-walled analysis did not run ({spatial.note})" if spatial.note else \
            "the thin-walled analysis did not run"
    elif not spatial.result.converged:
        why = f"the thin-walled analysis did not converge ({spatial.result.message})"
    if why:
        for i in need:
            out[i] = SegmentMcr(math.nan, "", f"M_cr is not available: {why}")
        return out  # type: ignore[return-value]
    assert spatial is not None and spatial.column is not None
    own = spatial.critical_moment
    rest = []
    for i in need:
        seg = own.segments[i] if own is not None and not isinstance(own, str) and own.converged else None
        same = (seg is not None and seg.M_max > 0 and math.isfinite(seg.M_cr)
                and abs(seg.M_max - lateral_segments[i] / load_factor) <= SAME_DIAGRAM * seg.M_max)
        if same:
            assert own is not None and not isinstance(own, str) and seg is not None
            out[i] = SegmentMcr(seg.M_cr, (
                f"thin-walled analysis, the member under the case's own first-order major-axis moments "
                f"({own.kind} mode, load factor {own.load_factor:.4g} on them)"))
        else:
            rest.append(i)
    if rest:
        if design is None:
            for i in rest:
                out[i] = SegmentMcr(math.nan, "", "M_cr is not available: no first-order design diagram (the design "
                                                  "loads reach the critical load)")
            return out  # type: ignore[return-value]
        try:
            d = diagram_critical_moment(spatial.column, design.x, design.M, cuts, curved, tol=case.tolerance)
            lam, res = d.load_factor, d.result
            per = [(m, mcr) for m, _, mcr in d.segments]
        except (ModelError, SolverError) as exc:
            for i in rest:
                out[i] = SegmentMcr(math.nan, "", f"M_cr is not available: the thin-walled analysis under the design "
                                                  f"moments failed ({exc})")
            return out  # type: ignore[return-value]
        reason = ("the case has no major-axis moment of its own there: the moments come from the imperfections"
                  if own is None or isinstance(own, str) or all(not (s.M_max > 0) for s in own.segments) else
                  "the thin-walled analysis's own diagram is not the design actions' one")
        for i in rest:
            if not res.converged:
                out[i] = SegmentMcr(math.nan, "", f"M_cr is not available: the thin-walled analysis under the design "
                                                  f"moments did not converge ({res.message})")
            elif not per[i][0] > 0:
                out[i] = SegmentMcr(math.inf, "no moment about the major axis in the design diagram: M_cr infinite")
            else:
                out[i] = SegmentMcr(per[i][1], (
                    f"thin-walled analysis of the member under the design's first-order major-axis moments "
                    f"(imperfection forces included; load factor {lam:.4g} on them): {reason}"))
    return out  # type: ignore[return-value]
