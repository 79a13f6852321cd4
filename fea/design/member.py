"""Design check of a parsed case: gathers the segment data and the buckling figures (no I/O).

The case declares its method in a ``[design]`` table (parsed by
:mod:`fea.io.design_input` into a :class:`fea.design.check.DesignSpec`); this
module turns the case and its buckling results into the inputs of
:func:`fea.design.check.design_check`.
"""

from __future__ import annotations

from dataclasses import replace
from typing import TYPE_CHECKING, Sequence

from ..errors import CaseError, ModelError
from ..model import Column
from ..model.case import Case
from ..results import BucklingResult
from .beam_column import bending_actions, bending_of_case
from .check import (
    AxisBuckling,
    DesignCheck,
    DesignResult,
    DesignSpec,
    MemberData,
    SegmentForces,
    design_check,
    torsional_check,
)
from .forces import segment_forces, sways
from .standards import STANDARDS
from .sway import classify_sway

if TYPE_CHECKING:
    from ..solve.spatial_case import SpatialCase

__all__ = ["sways", "bending_unchecked", "single_angles", "ANGLE_ROUTE", "member_data", "segment_forces",
           "axis_buckling", "design_of_case", "NEEDS_FY"]

#: Standards whose resistance is built on the yield strength fy.
NEEDS_FY = tuple(name for name, record in STANDARDS.items() if record.needs_fy)


def member_data(case: Case, spec: DesignSpec, areas: Sequence[float | None] | None = None) -> tuple[MemberData, ...]:
    """Per-segment design data of ``case`` (``areas`` replaces the case's areas, for sizing)."""
    column = case.planes[0][1]
    out = []
    for i, (info, seg) in enumerate(zip(case.segments, column.segments)):
        A = info.A if areas is None or areas[i] is None else areas[i]
        if A is None:
            raise CaseError(f"segment[{i + 1}].A", "missing: the design check needs the area A "
                                                   "(give A, or a section by shape and dimensions)")
        needs_fy = spec.standard in NEEDS_FY or (spec.standard == "Rankine-Gordon"
                                                 and spec.for_segment(i).get("crushing_stress") is None)
        if info.fy is None and needs_fy:
            raise CaseError(f"segment[{i + 1}].fy", f"missing: {spec.standard} needs the yield strength fy; "
                                                    "give it here or in [material]")
        out.append(MemberData(name=info.name, A=A, fy=info.fy, E=seg.E, length=seg.length,
                              fu=case.material.get("fu"), sigma_allow=case.material.get("sigma_allow")))
    return tuple(out)


def axis_buckling(r: BucklingResult) -> tuple[AxisBuckling, ...]:
    """Per-segment buckling figures of one plane, as the design check takes them."""
    return tuple(AxisBuckling(N_cr=s.critical_axial_force, effective_length_factor=s.effective_length_factor,
                              meaningful=s.meaningful, note=s.note) for s in r.segments)


def design_of_case(case: Case, results: Sequence[BucklingResult], spec: DesignSpec | None = None,
                   areas: Sequence[float | None] | None = None, columns: Sequence[Column] | None = None,
                   spatial: "SpatialCase | None" = None) -> DesignResult | None:
    """Design check of ``case`` from its buckling ``results`` (one per plane, in the case's order).

    Returns None when the case declares no design (and no ``spec`` is given).
    ``areas`` and ``columns`` replace the case's segment areas and columns
    (used by sizing, where every candidate is a new model).  ``spatial``: the thin-walled analysis of the
    case; when it ran and converged, a segment of a twisting section (:data:`TWISTING_SHAPES`) gets a
    compression check on its flexural-torsional critical force where that is below the planar ones, and is
    no longer listed as unchecked.
    """
    spec = spec if spec is not None else case.extras.get("design")
    if spec is None:
        return None
    cols = list(columns) if columns is not None else [c for _, c in case.planes]
    members = member_data(case, spec, areas)
    forces = segment_forces(cols[0])
    buck = [(r.axis or a, axis_buckling(r)) for r, (a, _) in zip(results, case.planes)]
    result = design_check(spec, members, forces, buck)
    # the design forces are the case loads x spec.load_factor (design_check), so the lowest load factor on the
    # design loads is the plane's lowest load factor on the case loads divided by it
    sway = tuple(classify_sway(spec.standard, r.axis or a, r.load_factor / spec.load_factor, sways(c))
                 for r, (a, _), c in zip(results, case.planes, cols))
    covered: set[int] = set()
    checked = False
    if spatial is not None and areas is None and columns is None:
        extra, covered, notes = torsional_checks(case, spec, members, forces, buck, spatial)
        checked = spatial.result is not None and spatial.ran and spatial.result.converged
        if extra or notes:
            checks = sorted(result.checks + extra, key=lambda c: (c.segment, c.kind == "tension"))
            result = replace(result, checks=tuple(checks), notes=result.notes + notes)
    angles = [i for i, (info, f) in enumerate(zip(case.segments, forces)) if f.compression > 0
              and info.shape is not None and getattr(type(info.shape), "kind", "") == "angle"]
    if angles and spec.angle_load == "concentric":
        result = replace(result, notes=result.notes + tuple(
            f"segment {i + 1} ('{case.segments[i].name}'): a single angle loaded at its centroid "
            f"(angle_load = \"concentric\"): {ANGLE_ROUTE}" for i in angles))
    unchecked = (unchecked_modes(case, forces, covered) + ((() if checked else offset_restraints(case)))
                 + single_angles(case, spec, forces) + local_buckling(case, spec, members, forces))
    if areas is not None or columns is not None:  # sizing candidates: axial checks only
        return replace(result, sway=sway, unchecked=unchecked + bending_unchecked(case))
    bending = bending_of_case(case, spec, results, sway, members, forces, spatial)
    if bending is None:
        return replace(result, sway=sway, unchecked=unchecked)
    covered_by = COVERED_BY.get(spec.standard, "")
    sway = tuple(replace(w, covered_by=covered_by,
                         reason=w.reason.split("; missing:")[0] + f"; covered by {covered_by}")
                 if w.axis in bending.planes else w for w in sway)
    return replace(result, sway=sway, unchecked=unchecked + bending.unchecked, bending=bending)


#: What covers the second-order effects of a sway-sensitive plane once the member checks with bending on
#: second-order moments are made (fea.design.beam_column).
COVERED_BY = {
    "EN 1993-1-1": ("the member checks with bending: 6.3.3 on second-order sway moments and the second-order "
                    "analysis with member imperfections (5.2.2(3) and (7))"),
    "AISC 360": "the member check with bending on the moments of the direct analysis (Chapter C, H1.1)",
}


#: What the check of a single angle is, and what it leaves to the engineer (docs/design.md "Single angles").
ANGLE_ROUTE = ("checked as a strut loaded at its centroid: flexural buckling about its principal axes and "
               "flexural-torsional buckling from the thin-walled analysis (conservative where AISC 360 E3 "
               "lets a compact angle neglect it, from memory); the standards' own rules for an angle connected "
               "through one leg (EN 1993-1-1 Annex BB.1.2, AISC 360 E5, from memory) are not applied")


#: Steel standards whose axial checks take the gross section: a section slender in compression is screened out.
LOCAL_BUCKLING_SCREEN = ("EN 1993-1-1", "AISC 360", "AS 4100", "BS 5950-1")


def local_buckling(case: Case, spec: DesignSpec, members: Sequence[MemberData], forces: Sequence[SegmentForces]
                   ) -> tuple[str, ...]:
    """A steel segment in compression whose plates are slender (EN 1993-1-1 class 4 by Table 5.2, or slender by
    AISC 360 Table B4.1a; AS 4100 and BS 5950-1 screened by the EN table) buckles locally below the gross-section
    resistance the axial checks use: it is "not verified", one sentence each."""
    from .classify import aisc360_class, en1993_class

    if spec.standard not in LOCAL_BUCKLING_SCREEN:
        return ()
    out = []
    for i, (info, m, f) in enumerate(zip(case.segments, members, forces)):
        kind = getattr(type(info.shape), "kind", "") if info.shape is not None else ""
        if f.compression <= 0 or m.fy is None or kind not in ("i_section", "channel", "rectangular_hollow",
                                                                "circular_hollow"):
            continue
        try:
            if spec.standard == "AISC 360":
                c = aisc360_class(info.shape, m.fy, m.E)
                slender = [(e, e.limits[2]) for e in c.elements if e.ratio > e.limits[2]]
            else:
                c = en1993_class(info.shape, m.fy)
                slender = [(e, e.limits[2]) for e in c.elements if e.section_class == 4]
        except ModelError:
            continue
        if slender:
            e, limit = slender[0]
            own = spec.standard in ("EN 1993-1-1", "AISC 360")
            screen = "" if own else f" (screened by that table, not {spec.standard}'s own limits)"
            out.append(f"segment {i + 1} ('{info.name}'): its {e.element} is slender in compression (c/t = "
                       f"{e.ratio:.3g} > {limit:.3g}, {c.source}){screen}: local buckling lowers the resistance "
                       "below the gross-section value these checks use (an effective section is not computed)")
    return tuple(out)


def single_angles(case: Case, spec: DesignSpec, forces: Sequence[SegmentForces]) -> tuple[str, ...]:
    """A single angle in compression passes only when the case says its load arrives at the centroid
    (``[design] angle_load = "concentric"``): an angle connected through one leg is loaded off its centroid, and
    the standards treat it by rules of their own that these checks do not apply."""
    if spec.angle_load == "concentric":
        return ()
    out = []
    for i, (info, f) in enumerate(zip(case.segments, forces)):
        kind = getattr(type(info.shape), "kind", "") if info.shape is not None else ""
        if kind != "angle" or f.compression <= 0:
            continue
        if spec.angle_load == "one leg":
            out.append(f"segment {i + 1} ('{info.name}'): a single angle loaded through one leg: the standard's own "
                       "rules for it (EN 1993-1-1 Annex BB.1.2, AISC 360 E5, from memory) are not offered; model "
                       "the eccentricity of the connection as a moment instead, or check it by hand")
        else:
            out.append(f"segment {i + 1} ('{info.name}'): a single angle: say how its load arrives "
                       "([design] angle_load = \"concentric\" when at its centroid, \"one leg\" when through one "
                       "leg); it is " + ANGLE_ROUTE)
    return tuple(out)


def bending_unchecked(case: Case) -> tuple[str, ...]:
    """A column that carries bending moments (eccentric loads, lateral loads, applied moments) is not checked by
    its axial force alone: the sentence saying so for the axial-only checks of sizing candidates, or nothing
    when the case has no such actions (the check of a case makes the member checks with bending instead:
    :func:`fea.design.beam_column.bending_of_case`)."""
    got = bending_actions(case)
    if got is None:
        return ()
    what, where = got
    return (f"the column carries bending ({', '.join(what)}, {where}): its axial checks alone do not cover "
            "the member with bending (axial force and moment together)",)


def offset_restraints(case: Case) -> tuple[str, ...]:
    """A restraint that holds the section away from its centroid (``offset``, e.g. girts on one flange) lets the
    member twist about that line (restrained-axis buckling): only the thin-walled analysis checks it."""
    tables = case.document.get("restraint", [])
    tables = [tables] if isinstance(tables, dict) else list(tables)
    return tuple(f"restraint[{i + 1}] holds the section at an offset from its centroid: the member may buckle by "
                 "twisting about that line (restrained-axis buckling), which these checks do not cover without "
                 "the thin-walled analysis" for i, t in enumerate(tables) if isinstance(t, dict) and "offset" in t)


#: A thin-walled critical force counts as below the planar ones only beyond this relative margin (the two
#: analyses agree to about 1e-8 on a flexural mode).
PLANAR_MARGIN = 1e-6


def torsional_checks(case: Case, spec: DesignSpec, members: Sequence[MemberData], forces: Sequence[SegmentForces],
                     buck: Sequence[tuple[str, Sequence[AxisBuckling]]], spatial: "SpatialCase"
                     ) -> tuple[tuple[DesignCheck, ...], set[int], tuple[str, ...]]:
    """The checks on the flexural-torsional critical force of the segments, the indices of the twisting-section
    segments the thin-walled analysis covers, and the notes on those it finds not governed by it.

    Any segment gets the check when the lowest mode of the thin-walled analysis twists and gives it a critical
    force below the planar ones: a doubly symmetric I column held by girts on one flange buckles about the
    girt line (restrained-axis buckling) far below its planar minor-axis load.
    """
    r = spatial.result
    if r is None or not spatial.ran or not r.converged:
        return (), set(), ()
    checks, covered, notes = [], set(), []
    twists = not str(r.kinds[0]).startswith("flexural (")
    for i, (info, m, f) in enumerate(zip(case.segments, members, forces)):
        kind = getattr(type(info.shape), "kind", "") if info.shape is not None else ""
        N_c = spec.load_factor * f.compression
        if N_c <= 0:
            continue
        N_sp = float(r.segment_N_cr[0][i])
        planar = [segs[i].N_cr for _, segs in buck if segs[i].N_cr > 0]
        below = N_sp > 0 and (not planar or N_sp < (1.0 - PLANAR_MARGIN) * min(planar))
        if kind not in TWISTING_SHAPES:
            if twists and below:
                checks.append(torsional_check(spec, i, m, N_sp, N_c, r.kinds[0]))
            continue
        covered.add(i)
        if below:
            checks.append(torsional_check(spec, i, m, N_sp, N_c, r.kinds[0]))
        else:
            notes.append(f"segment {i + 1} ('{info.name}'): the thin-walled analysis finds no mode below the planar "
                         "ones: the planar checks cover its flexural-torsional buckling")
    return tuple(checks), covered, tuple(notes)


#: Section shapes that may buckle by twisting in compression: those whose shear centre lies off the centroid
#: (bending and twisting together) and the cruciform (pure torsional buckling, its warping stiffness being
#: small): EN 1993-1-1 6.3.1.4, AISC 360 E4.  The planar analysis and the checks built on it do not cover it.
TWISTING_SHAPES = {"tee": "tee", "angle": "angle", "channel": "channel", "cruciform": "cruciform"}


def unchecked_modes(case: Case, forces: Sequence[SegmentForces], covered: set[int] | frozenset[int] = frozenset()
                    ) -> tuple[str, ...]:
    """Ways a segment in compression may fail that the axial checks do not cover, one plain sentence each
    (``covered``: indices of segments the thin-walled analysis has checked)."""
    out = []
    for i, (info, f) in enumerate(zip(case.segments, forces)):
        if i in covered:
            continue
        kind = getattr(type(info.shape), "kind", "") if info.shape is not None else ""
        if kind in TWISTING_SHAPES and f.compression > 0:
            out.append(f"segment {i + 1} ('{info.name}'): a {TWISTING_SHAPES[kind]} section in compression may "
                       f"buckle by {'twisting' if kind == 'cruciform' else 'bending and twisting together'} "
                       f"({'torsional' if kind == 'cruciform' else 'flexural-torsional'} buckling, EN 1993-1-1 "
                       "6.3.1.4, AISC 360 E4), which these checks do not cover")
    return tuple(out)
