"""Member checks with bending of a case: the routes each standard allows, on the tool's own design actions.

Pure engine (no I/O): the case, its buckling results, the sway classification and the thin-walled analysis
in; a :class:`~fea.design.bending_result.BendingResult` out, with one or two routes per segment, each
written out by the kernels of :mod:`fea.design.bending`, and a sentence for everything it could not check.
docs/design.md ("Members with bending") states the rules; in short:

EN 1993-1-1 (both routes are made and the larger utilisation governs: conservative, the standard lets either
verify the member)
    * ``member``: 6.3.3, equations (6.61) and (6.62) with the interaction factors of Annex B (or A), chi_y and
      chi_z from the finite-element N_cr of each plane, chi_LT by 6.3.2 from M_cr.  The moments about each axis
      are first-order (5.2.1(3)) in a braced plane and in a plane that sways with ``alpha_cr >= 10`` (with the
      sway imperfection as equivalent forces, 5.3.2(7)); second-order sway moments (an analysis with the sway
      imperfection and no member bow, 5.2.2(3)b), from memory) where a plane sways with ``alpha_cr < 10``.  The
      amplified first-order shortcut of 5.2.2(5)-(6) is not used: the second-order moments are at hand.
    * ``second-order``: a second-order analysis with the sway imperfection and the member bows of Table 5.1 (or
      the mode-shaped imperfection of 5.3.2(11)) in both planes (5.2.2(7) a), from memory), then the
      cross-section with the largest second-order moments (6.2.1(7), 6.2.9.1) and, where M_cr is finite,
      lateral-torsional buckling by 6.3.2 (6.54) on the second-order major moment.
AISC 360
    * ``direct-analysis``: Chapter C (notional loads, stiffness 0.8 tau_b EI) second-order moments as required
      strengths, H1.1 with P_c by E3 at K = 1 (``N_cr = pi^2 E I / L^2``, L the length between the rigid lateral
      supports of the plane that holds the segment) and M_c by Chapter F with M_cr of the thin-walled analysis.
The other standards check compression only (:data:`fea.design.bending.BENDING_COVERED`): a member with bending
is then "not verified".
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import TYPE_CHECKING, Any, Sequence

import numpy as np

from ..errors import CaseError, ModelError
from ..model import STATION_TOL, Column
from ..model.case import Case
from .actions import ActionsOptions, DesignActions, PlaneActions, SegmentActions, design_actions
from .actions import MomentDiagram as Diagram
from .bending import (
    BENDING_COVERED,
    BeamColumnInput,
    BendingCheck,
    MomentDiagram,
    aisc360_member,
    en1993_cross_section,
    en1993_lt_curve,
    en1993_ltb,
    en1993_member,
)
from .bending_result import DIRECT, MEMBER, PLAIN, SECOND_ORDER, BendingResult, BendingRoute, MomentUsed
from .check import DesignSpec, MemberData, SegmentForces
from .classify import SectionClass, aisc360_class, en1993_class
from .critical_moment import segment_critical_moments
from .standards.record import axis_value
from .sway import BUCKLES, SwayClass

if TYPE_CHECKING:
    from ..results import BucklingResult
    from ..solve.spatial_case import SpatialCase

__all__ = ["EN", "AISC", "FIRST_ORDER_LIMIT", "bending_actions", "bending_of_case", "kernel_diagram",
           "unbraced_length", "LINEAR"]

EN, AISC = "EN 1993-1-1", "AISC 360"
#: EN 1993-1-1 5.2.1(3): first-order moments are enough for alpha_cr >= 10 (elastic analysis).
FIRST_ORDER_LIMIT = 10.0
#: Largest estimated relative discretisation error of the moments a member check with bending accepts (the
#: analyses refine towards the case tolerance; an estimate above this leaves the member "not verified").
MOMENT_TOL = 1e-3
#: A diagram counts as linear between its end moments when it departs from their chord by no more than this
#: share of its largest |M|.
LINEAR = 1e-3
#: Section kinds the kernels take, by standard: the kernel's shape code.
EN_SHAPES = {"i_section": "I", "rectangular_hollow": "RHS", "circular_hollow": "other", "round": "other",
             "rectangle": "other"}
AISC_SHAPES = {"i_section": "I", "rectangular_hollow": "RHS"}
_WORDS = {"i_section": "I section", "rectangular_hollow": "rectangular hollow section",
          "circular_hollow": "circular hollow section", "round": "solid round", "rectangle": "solid rectangle",
          "channel": "channel", "tee": "tee", "angle": "angle", "cruciform": "cruciform"}


def bending_actions(case: Case) -> tuple[tuple[str, ...], str] | None:
    """The kinds of bending action the case gives and the planes they act in (None without any): eccentric
    loads, lateral loads and applied moments of ``[lateral]``, the ``[[load]]`` tables and ``[imperfection]``."""
    specs = [case.extras.get("lateral"), getattr(case.extras.get("imperfection"), "loads", None)]
    what: dict[str, None] = {}
    planes: dict[str, None] = {}
    for spec in specs:
        if spec is None:
            continue
        for label, items, nonzero in (
                ("lateral point loads", spec.point, lambda a: a.force != 0),
                ("lateral distributed loads", spec.distributed, lambda a: a.q_bottom != 0 or (a.q_top or 0) != 0),
                ("moments from eccentric loads or applied moments", spec.moments, lambda a: a.moment != 0)):
            for axis, action in items:
                if nonzero(action):
                    what.setdefault(label)
                    planes.setdefault(axis or "both")
    if not what:
        return None
    where = "both planes" if "both" in planes or len(planes) > 1 else f"the {next(iter(planes))}-axis plane"
    return tuple(what), where


def unbraced_length(column: Column, index: int) -> float:
    """The longest distance between rigid lateral supports (or the column's ends) that holds part of segment
    ``index`` [m]: the length L of AISC 360 with K = 1 (springs are not taken as braces: conservative)."""
    H = column.height
    tol = STATION_TOL * H
    pts = sorted({0.0, H} | {min(max(r.at, 0.0), H) for r in column.restraints if math.isinf(r.lateral)})
    a, b = column.segment_bounds()[index]
    spans = [(p, q) for p, q in zip(pts[:-1], pts[1:]) if q - p > tol and p < b - tol and q > a + tol]
    return max(q - p for p, q in spans)


def _interior_actions(case: Case, axis: str, a: float, b: float, tol: float) -> tuple[bool, bool]:
    """(point forces or moments strictly inside ``(a, b)``, distributed lateral loads over part of it) in
    ``axis``'s plane."""
    from ..solve.imperfect_case import imperfection_spec

    acts = imperfection_spec(case).loads.for_axis(axis)
    point = any(a + tol < p.at < b - tol for p in acts.point if p.force) or \
        any(a + tol < m.at < b - tol for m in acts.moments if m.moment)
    dist = any(d.bottom < b - tol and d.top > a + tol for d in acts.distributed
               if d.q_bottom or (d.q_top or 0.0))
    return point, dist


def kernel_diagram(d: Diagram, sway: bool, point_inside: bool, distributed: bool) -> tuple[MomentDiagram, str]:
    """The diagram kind the kernels take for C_m (EN 1993-1-1 Table B.3, k_c of Table 6.6) from a segment's
    moment diagram, and the reason in words.

    * ``sway``: the plane sways (its lowest mode is a sway mode): the note to Table B.3, C_m = 0.9;
    * a diagram linear between its end moments (within :data:`LINEAR`): "end moments" with their psi;
    * a curved diagram from lateral loads per height only: "uniform load" with ``M_h`` the larger end moment and
      ``M_s`` the moment where the diagram departs most from the chord of its end moments (its rows of Table B.3
      are never below the point-load ones: conservative where the load is not uniform);
    * anything else (point forces or applied moments inside the segment): a uniform moment, ``psi = 1``,
      ``C_m = 1``, the upper bound of Table B.3 (conservative).
    """
    if sway:
        return MomentDiagram("sway"), "the plane sways: C_m = 0.9 (note to Table B.3)"
    x, M = np.asarray(d.x), np.asarray(d.M)
    peak = d.max_abs
    if not peak > 0:
        return MomentDiagram("end moments", 1.0), "no moment"
    x0, x1 = float(x[0]), float(x[-1])
    chord = d.bottom + (d.top - d.bottom) * (x - x0) / (x1 - x0)
    dev = np.abs(M - chord)
    k = int(np.argmax(dev))
    if dev[k] <= LINEAR * peak and d.psi is not None:
        return MomentDiagram("end moments", d.psi), f"linear between the end moments, psi = {d.psi:.3g}"
    if distributed and not point_inside:
        M_h = d.bottom if abs(d.bottom) >= abs(d.top) else d.top
        M_s = float(M[k])
        ratio = M_s / M_h if M_h != 0 else math.copysign(math.inf, M_s)
        psi = 1.0 if d.psi is None else d.psi
        return (MomentDiagram("uniform load", psi, ratio),
                f"a lateral load per height: M_s / M_h = {ratio:.3g}, psi = {psi:.3g} (uniform-load rows of Table "
                "B.3)")
    return (MomentDiagram("end moments", 1.0),
            "point forces or moments inside the segment: not a shape of Table B.3 as recognised here; C_m = 1 (a "
            "uniform moment, the upper bound of Table B.3: conservative)")


@dataclass
class _Segment:
    """What the routes of one segment share."""

    index: int
    name: str
    kind: str
    N_Ed: float
    props: Any = None
    torsion: Any = None
    shape: Any = None
    section: SectionClass | None = None
    section_class: int = 1
    M_cr: float = math.inf
    M_cr_source: str = ""
    curve_LT: str | None = None
    notes: tuple[str, ...] = ()
    #: the largest moment of the case's analyses [N m]: smaller moments below ROUND_OFF of it are zero
    ref: float = 0.0


#: Moments below this share of the largest moment of the case's analyses are the round-off of the solves (a
#: pinned end, a plane without actions): they are taken as zero.
ROUND_OFF = 1e-9


def _clean(M: float, ref: float) -> float:
    """``M`` [N m], or 0 where it is round-off against ``ref``, the largest moment of the analyses."""
    return 0.0 if abs(M) <= ROUND_OFF * ref else float(M)


def _used(axis: str, order: str, d: Diagram, kind: str, psi: float | None, source: str, ref: float = 0.0
          ) -> MomentUsed:
    return MomentUsed(axis=axis, order=order, M=_clean(d.max_abs, ref), at=float(d.at), bottom=_clean(d.bottom, ref),
                      top=_clean(d.top, ref), diagram=kind, psi=psi, source=source)


def _lt_curve(seg: _Segment, ltb: str, given: str | None) -> tuple[str, str, str]:
    """(curve_LT, ltb method used, words): the given curve, else EN 1993-1-1 Table 6.4 / 6.5 by shape."""
    shape = seg.shape
    if seg.kind != "i_section":
        curve = given or en1993_lt_curve("general", "other", 1.0)
        words = f"curve {curve}" + (" (given)" if given else " (Table 6.4, other cross-sections, from memory)")
        return curve, "general", words + ("; 6.3.2.3 is for rolled or equivalent welded I sections: 6.3.2.2 used"
                                          if ltb == "rolled" else "")
    rolled = float(getattr(shape, "r", 0.0) or 0.0) > 0
    hb = float(shape.h) / float(shape.b)
    if given:
        return given, ltb, f"curve {given} (given)"
    fab = "rolled" if rolled else "welded"
    curve = en1993_lt_curve(ltb, fab, hb)
    table = "6.4" if ltb == "general" else "6.5"
    return curve, ltb, (f"curve {curve}: Table {table}, {fab} I section (taken as {fab}: "
                        f"{'root radii given' if rolled else 'no root radius'}), h/b = {hb:.3g} (from memory)")


def bending_of_case(case: Case, spec: DesignSpec, results: Sequence["BucklingResult"], sway: Sequence[SwayClass],
                    members: Sequence[MemberData], forces: Sequence[SegmentForces],
                    spatial: "SpatialCase | None" = None, always: bool = False) -> BendingResult | None:
    """The member checks with bending of ``case`` (None when the case needs none: no bending action and no
    sway-sensitive plane).

    Parameters
    ----------
    case : the parsed case
    spec : its design method (``spec.bending``: the options)
    results : the buckling results, one per plane in the case's order
    sway : the sway classification of every plane
    members, forces : per segment, the design data and the axial forces at load factor 1
    spatial : the thin-walled analysis of the case (for M_cr), or None
    always : make the routes even when the case needs none (a straight column: the routes then check the
        member with its imperfections alone)
    """
    acts_what = bending_actions(case)
    sensitive = [w for w in sway if not w.axial_check_enough and w.classification != BUCKLES]
    if acts_what is None and not sensitive and not always:
        return None
    std = spec.standard
    cover = BENDING_COVERED[std]
    base = BendingResult(std, cover.covered, cover.reason, spec.bending)
    if acts_what is not None:
        context = f"the column carries bending ({', '.join(acts_what[0])}, {acts_what[1]})"
    elif not sensitive:
        context = "the straight column (moments from its imperfections alone)"
    else:
        words = ", ".join(f"{w.axis} alpha_cr = {w.alpha_cr:.3g}" for w in sensitive)
        context = (f"the {' and '.join(w.axis for w in sensitive)} plane{'s' if len(sensitive) > 1 else ''} "
                   f"{'are' if len(sensitive) > 1 else 'is'} sway-sensitive ({words}): the second-order moments of "
                   "the sway imperfection bend the column")

    def whole(reason: str) -> BendingResult:
        return replace(base, unchecked=(f"{context}: the member check with bending (axial force and moments "
                                        f"together) is not made: {reason}",))

    if any(w.classification == BUCKLES for w in sway):
        return whole("a plane buckles elastically below the design loads")
    if not cover.covered:
        return whole(f"{std} checks {cover.reason}")
    axes = tuple(a for a, _ in case.planes)
    if axes != ("major", "minor"):
        return whole("it needs both bending planes (major and minor): a one-plane case leaves out the other axis "
                     "and lateral-torsional buckling")
    lf = spec.load_factor
    try:
        if std == EN:
            acts = {MEMBER: design_actions(case, results, ActionsOptions.for_case(case, spec, bow="none"))}
        else:
            method = str(spec.parameters.get("method", "LRFD"))
            acts = {DIRECT: design_actions(case, results, ActionsOptions.for_case(case, spec, method=method))}
    except (CaseError, ModelError) as exc:
        return whole(f"its design actions could not be computed ({exc})")
    first = acts[MEMBER if std == EN else DIRECT]
    major = first.plane("major")
    sway_of = {w.axis: w for w in sway}

    # -- what the routes of each segment share: section, class, M_cr ------------------------------------------
    segs: list[_Segment | None] = []
    unchecked: list[str] = []
    n = len(case.segments)

    def skip(i: int, reason: str) -> None:
        unchecked.append(f"segment {i + 1} ('{case.segments[i].name}'): {context}: the member check with bending "
                         f"is not made: {reason}")
        segs.append(None)

    moments_any = [max((p.segments[i].actions.max_abs for p in first.planes), default=0.0) for i in range(n)]
    for i, (info, f) in enumerate(zip(case.segments, forces)):
        N_c, N_t = lf * f.compression, lf * f.tension
        M_any = max([moments_any[i]] + [d.max_abs for p in first.planes for d in
                                        (p.segments[i].first_order, p.segments[i].second_order) if d is not None])
        if N_c <= 0 and not M_any > 0:
            segs.append(None)  # no compression and no moment: the axial checks cover it
            continue
        if N_c <= 0 and N_t > 0:
            skip(i, "tension with bending is not covered (EN 1993-1-1 6.2.9, AISC 360 H1.2)")
            continue
        kind = getattr(type(info.shape), "kind", "") if info.shape is not None else ""
        if info.shape is None:
            skip(i, "the section is given by its properties: the check needs a section by shape and dimensions "
                    "(moduli, class, torsion constants)")
            continue
        table = EN_SHAPES if std == EN else AISC_SHAPES
        if kind not in table:
            what = _WORDS.get(kind, kind)
            skip(i, f"the section ({what}) is not covered by the {std} member check with bending here (" + (
                "6.3.3 is written for doubly symmetric members; the general method of 6.3.4 is not covered"
                if std == EN else "H1.1 with F2, F6, F7 covers doubly symmetric I and rectangular hollow sections") +
                ")")
            continue
        segs.append(_Segment(i, info.name, kind, N_c, info.shape.properties(), info.shape.torsion(), info.shape))

    # -- moments of the routes, per segment and plane -----------------------------------------------------------
    tol = STATION_TOL * case.height

    def member_moment(p: PlaneActions, s: SegmentActions, i: int) -> tuple[Diagram | None, str, MomentDiagram, str,
                                                                              str]:
        """(diagram, order, kernel diagram, its words, why) of the 6.3.3 route about ``p``'s axis."""
        w = sway_of[p.axis]
        a, b = case.column(p.axis).segment_bounds()[i]
        point, dist = _interior_actions(case, p.axis, a, b, tol)
        if not p.sways:
            why = (f"{p.axis} plane braced (both ends held against translation, no leaning load): first-order "
                   "moments (5.2.1(3); the member's own imperfection and P-delta are in chi and the factors k)")
            d, order = s.first_order, "first-order"
        elif w.alpha_cr >= FIRST_ORDER_LIMIT:
            why = (f"{p.axis} plane sways, alpha_cr = {w.alpha_cr:.3g} >= 10: first-order moments with the sway "
                   "imperfection as equivalent horizontal forces (5.2.1(3), 5.3.2(7))")
            d, order = s.first_order, "first-order"
        else:
            why = (f"{p.axis} plane sways, alpha_cr = {w.alpha_cr:.3g} < 10: second-order sway moments from an "
                   "analysis with the sway imperfection and no member bow (5.2.2(3) b), from memory; the amplified "
                   "first-order moments of 5.2.2(5)-(6) are not used)")
            d, order = s.second_order, "second-order"
        if d is None:
            return None, order, MomentDiagram(), "", why
        kd, words = kernel_diagram(d, p.sways, point, dist)
        return d, order, kd, words, why

    # classification (EN: with N_Ed and the 6.3.3 route's major moment) and M_cr -------------------------------
    for sg in segs:
        if sg is None:
            continue
        i = sg.index
        curve_LT, cls_given = spec.bending.for_segment(i)
        sg.curve_LT = curve_LT
        fy = float(members[i].fy)  # type: ignore[arg-type]
        if std == EN:
            d, *_ = member_moment(major, major.segments[i], i)
            My = 0.0 if d is None else d.max_abs
            if cls_given is not None:
                sg.section_class = int(cls_given)
                sg.section = None
            else:
                try:
                    sg.section = en1993_class(sg.shape, fy, sg.N_Ed, My,
                                              sg.props.area, case.column("major").segments[i].I)
                except ModelError as exc:
                    unchecked.append(f"segment {i + 1} ('{sg.name}'): {context}: the member check with bending is "
                                     f"not made: {exc}")
                    segs[segs.index(sg)] = None
                    continue
                sg.section_class = sg.section.section_class
            if sg.section_class == 4:
                unchecked.append(f"segment {i + 1} ('{sg.name}'): {context}: the member check with bending is not "
                                 f"made: class 4 cross-section ({_class_words(sg.section)}): local buckling is not "
                                 "covered")
                segs[segs.index(sg)] = None
                continue
            if EN_SHAPES[sg.kind] == "other" and sg.section_class < 3:
                sg.notes += (f"a {_WORDS[sg.kind]} of class {sg.section_class} is checked with its elastic moduli and "
                             "the class 3 factors (Annex B gives class 1-2 k_zz for I and RHS sections only; "
                             "conservative)",)
                sg.section_class = 3
        else:
            E = members[i].E
            if cls_given is not None:
                sg.section_class = 1 if cls_given in (1, 2) else 3
                sg.section = None
            else:
                sg.section = aisc360_class(sg.shape, fy, E)
                sg.section_class = sg.section.section_class
            if sg.section_class != 1:
                word = "noncompact" if sg.section_class == 3 else "slender"
                unchecked.append(f"segment {i + 1} ('{sg.name}'): {context}: the member check with bending is not "
                                 f"made: a {word} section ({_class_words(sg.section)}): only compact sections are "
                                 "covered (local buckling, F3 and E7, not covered)")
                segs[segs.index(sg)] = None
                continue

    live = [sg for sg in segs if sg is not None]
    # the major moments of every route decide whether M_cr is needed; computed before the second EN analysis
    if std == EN and live:
        plastic = all(sg.section_class in (1, 2) for sg in live)
        try:
            acts[SECOND_ORDER] = design_actions(case, results, ActionsOptions.for_case(
                case, spec, bow=spec.bending.bow, moment_resistance="plastic" if plastic else "elastic"))
            acts[PLAIN] = design_actions(case, results, ActionsOptions.for_case(case, spec, bow="none", sway=False))
        except (CaseError, ModelError) as exc:
            for sg in live:
                unchecked.append(f"segment {sg.index + 1} ('{sg.name}'): {context}: the second-order route is not "
                                 f"made: its design actions could not be computed ({exc})")
            live = []
    ref = max((d.max_abs for a in acts.values() for p in a.planes for d in (p.actions, p.first_order, p.second_order)
               if d is not None), default=0.0)
    for sg in live:
        sg.ref = ref
    M_major = [0.0] * n
    for a in acts.values():
        p = a.plane("major")
        for i in range(n):
            for d in (p.segments[i].first_order, p.segments[i].second_order):
                if d is not None:
                    M_major[i] = max(M_major[i], _clean(d.max_abs, ref))
    if live:
        from ..solve.imperfect_case import imperfection_spec

        acts_major = imperfection_spec(case).loads.for_axis("major")
        cuts = [p.at for p in acts_major.point] + [m.at for m in acts_major.moments]
        curved = [(d.bottom, d.top) for d in acts_major.distributed]
        kinds = [sg.kind if sg is not None else "round" for sg in segs]
        lat = [major.segments[i].actions.max_abs for i in range(n)]
        mcr = segment_critical_moments(case, kinds, M_major, spatial, major.actions, major.first_order, lat, lf,
                                       cuts, curved)
        for sg in list(live):
            m = mcr[sg.index]
            if m.missing:
                unchecked.append(f"segment {sg.index + 1} ('{sg.name}'): {context}: the member check with bending is "
                                 f"not made: it may buckle laterally-torsionally and {m.missing}")
                segs[segs.index(sg)] = None
                live.remove(sg)
                continue
            sg.M_cr, sg.M_cr_source = m.M_cr, m.source

    # -- the routes ---------------------------------------------------------------------------------------------
    routes: list[BendingRoute] = []
    for sg in live:
        i = sg.index
        try:
            routes += (_en_routes if std == EN else _aisc_routes)(case, spec, results, acts, sg, members[i],
                                                                  member_moment)
        except ModelError as exc:
            unchecked.append(f"segment {i + 1} ('{sg.name}'): {context}: the member check with bending is not made: "
                             f"{exc}")
            segs[segs.index(sg)] = None
            routes = [r for r in routes if r.segment != i]
    # not converged moments: not verified
    for a in acts.values():
        for p in a.planes:
            if p.second_order is not None and not p.discretisation_error <= MOMENT_TOL:
                unchecked.append(f"{context}: the {p.axis}-axis moments of the member check with bending did not "
                                 f"converge to {MOMENT_TOL:g} ({p.message})")
    # the route that governs each segment
    marked = []
    for i in range(n):
        own = [r for r in routes if r.segment == i]
        if own:
            top = max(own, key=lambda r: r.utilisation)
            marked += [replace(r, governs=r is top) for r in own]
    checked = {r.segment for r in marked}
    compressed = [i for i, f in enumerate(forces) if f.compression > 0]
    planes = tuple(w.axis for w in sensitive if all(i in checked for i in compressed))
    notes = [first.notes[0]] if first.notes else []
    if std == EN and marked:
        notes.append("EN 1993-1-1 allows either route; both are made and the larger utilisation governs "
                     "(conservative)")
    for key, a in acts.items():
        for p in a.planes:
            notes.extend(f"{_route_word(key)}, {p.axis} plane: {t}" for t in p.notes)
            if p.second_order is not None:
                notes.append(f"{_route_word(key)}, {p.axis} plane: {p.message}")
    return replace(base, routes=tuple(marked), actions=acts, planes=planes, unchecked=tuple(unchecked),
                   notes=tuple(dict.fromkeys(notes)))


def _route_word(key: str) -> str:
    return {MEMBER: "analysis for 6.3.3 (sway imperfection, no bow)",
            SECOND_ORDER: "second-order analysis with member imperfections",
            PLAIN: "second-order analysis without imperfections",
            DIRECT: "direct analysis"}[key]


def _class_words(section: SectionClass | None) -> str:
    if section is None:
        return "as given in [design] section_class"
    g = next((e for e in section.elements if e.element == section.governing), None)
    if g is None:
        return section.word
    return (f"{section.word} by {section.source} (from memory): {g.element} c/t = {g.ratio:.3g} against "
            f"{', '.join(f'{v:.3g}' for v in g.limits)}")


def _inputs(case: Case, spec: DesignSpec, sg: _Segment, m: MemberData, N_cr: tuple[float, float],
            My: float, Mz: float, dy: MomentDiagram, dz: MomentDiagram, dlt: MomentDiagram | None,
            curve_LT: str | None) -> BeamColumnInput:
    params = spec.for_segment(sg.index)
    p = sg.props
    shape = sg.shape
    a_web = None
    if sg.kind == "i_section":
        a_web = max((p.area - 2 * float(shape.b) * float(shape.tf)) / p.area, 0.0)
    code = (EN_SHAPES if spec.standard == EN else AISC_SHAPES)[sg.kind]
    return BeamColumnInput(
        N_Ed=sg.N_Ed, M_y_Ed=My, M_z_Ed=Mz, A=m.A, W_pl_y=p.W_pl_major, W_pl_z=p.W_pl_minor,
        W_el_y=min(p.W_el_major, p.W_pl_major), W_el_z=min(p.W_el_minor, p.W_pl_minor), fy=float(m.fy),  # type: ignore[arg-type]
        E=m.E, I_y=case.column("major").segments[sg.index].I, I_z=case.column("minor").segments[sg.index].I,
        N_cr_y=N_cr[0], N_cr_z=N_cr[1], section_class=sg.section_class, shape=code, doubly_symmetric=True,
        diagram_y=dy, diagram_z=dz, diagram_LT=dlt, M_cr=sg.M_cr, I_w=float(sg.torsion.I_w), J=float(sg.torsion.J),
        a_web=a_web, gamma_M0=float(params.get("gamma_M0", 1.0)), gamma_M1=float(params.get("gamma_M1", 1.0)),
        curve_y=axis_value(params, "curve", "major"), curve_z=axis_value(params, "curve", "minor"), curve_LT=curve_LT)


def _fe_ncr(results: Sequence["BucklingResult"], case: Case, i: int) -> tuple[float, float]:
    """N_cr of segment ``i`` about the major and minor axis from the finite-element buckling (inf where the
    segment is not compressed at the critical state: the section resistance, as the axial check)."""
    out = []
    for axis in ("major", "minor"):
        r = next(b for b, (a, _) in zip(results, case.planes) if (b.axis or a) == axis)
        v = r.segments[i].critical_axial_force
        out.append(float(v) if v > 0 else math.inf)
    return out[0], out[1]


def non_sway_ncr(column: Column, tol: float) -> tuple[float, ...]:
    """Per segment, the critical force of the plane with its sway held: both column ends held rigidly against
    translation and the leaning loads left out (their columns no longer lean on it) [N] (inf where the segment is
    not compressed at the critical state).  The member's own flexural buckling with its non-sway buckling length:
    the N_cr of the 6.3.3 route when the moments are second-order sway moments (EN 1993-1-1 5.2.2(3) b) and
    5.2.2(8), from memory: the sway mode's N_cr would count the sway effects twice)."""
    from ..model import Restraint
    from ..solve.eigen import buckling

    H = column.height
    held = replace(column, restraints=column.restraints + (Restraint(0.0, math.inf, 0.0), Restraint(H, math.inf, 0.0)),
                   leaning_loads=())
    r = buckling(held, n_modes=1, tol=tol)
    return tuple(float(s.critical_axial_force) if s.critical_axial_force > 0 else math.inf for s in r.segments)


def _no_answer(sg: _Segment, std: str, key: str, title: str, why: str, moments: tuple[MomentUsed, ...],
               message: str) -> BendingRoute:
    return BendingRoute(sg.index, sg.name, std, key, title, f"{why} {message}", sg.N_Ed, moments, (), math.inf,
                        "no second-order equilibrium", sg.section, sg.M_cr, sg.M_cr_source, notes=sg.notes)


def _en_routes(case: Case, spec: DesignSpec, results, acts: dict[str, DesignActions], sg: _Segment, m: MemberData,
               member_moment) -> list[BendingRoute]:
    i = sg.index
    opts = spec.bending
    N_cr = _fe_ncr(results, case, i)
    curve_LT, ltb, lt_words = (None, opts.ltb, "") if not math.isfinite(sg.M_cr) else _lt_curve(sg, opts.ltb,
                                                                                                  sg.curve_LT)
    notes = sg.notes + ((f"lateral-torsional buckling {lt_words}",) if lt_words else ())
    out = []
    # route 1: 6.3.3
    a = acts[MEMBER]
    got: dict[str, Any] = {}
    whys, used = [], []
    for axis in ("major", "minor"):
        p = a.plane(axis)
        d, order, kd, words, why = member_moment(p, p.segments[i], i)
        got[axis] = (d, kd)
        whys.append(why)
        if d is not None:
            used.append(_used(axis, order, d, kd.kind, kd.psi if kd.kind == "end moments" else None,
                              f"{why}; C_m: {words}", sg.ref))
    second = [u.axis for u in used if u.order == "second-order"]
    title = f"6.3.3 Annex {opts.interaction}, {'second-order sway' if second else 'first-order'} moments"
    why = "; ".join(whys) + "."
    if second:
        held = [non_sway_ncr(case.column(ax), case.tolerance)[i] for ax in ("major", "minor")]
        N_cr = tuple(held[k] if ax in second else N_cr[k] for k, ax in enumerate(("major", "minor")))  # type: ignore[assignment]
        why += (f" chi about the {' and '.join(second)} axis from the critical force with the sway held (both ends "
                "held against translation, no leaning load: the non-sway buckling length; 5.2.2(3) b) and 5.2.2(8), "
                "from memory): the second-order sway moments already carry the sway, the sway mode's N_cr would count "
                "it twice.")
    if any(got[ax][0] is None for ax in got):
        out.append(_no_answer(sg, EN, MEMBER, title, why, tuple(used), "No second-order equilibrium at the design "
                                                                      "loads: the member fails."))
    else:
        (dy, ky), (dz, kz) = got["major"], got["minor"]
        klt, _ = kernel_diagram(dy, False, *_interior_actions(case, "major", *case.column("major").segment_bounds()[i],
                                                                STATION_TOL * case.height))
        inp = _inputs(case, spec, sg, m, N_cr, _clean(dy.max_abs, sg.ref), _clean(dz.max_abs, sg.ref), ky, kz, klt,
                      curve_LT)
        chk = en1993_member(inp, annex=opts.interaction, ltb=ltb)
        out.append(BendingRoute(i, sg.name, EN, MEMBER, title, why, sg.N_Ed, tuple(used), (chk,), chk.utilisation,
                                chk.governing, sg.section, sg.M_cr, sg.M_cr_source, notes=notes))
    # route 2: second-order analysis with member imperfections, the cross-section and 6.3.2; the imperfections in
    # one plane at a time, the other plane carrying its lateral actions alone (second order, no imperfection)
    a2, plain = acts[SECOND_ORDER], acts[PLAIN]
    bow = ("the member bows of Table 5.1 (elastic analysis), with the sway imperfection where the plane sways"
           if opts.bow == "table-5.1" else "the mode-shaped imperfection of 5.3.2(11) (sway and bow together)")
    for imp in ("major", "minor"):
        title2 = f"second order, imperfections in the {imp} plane, 6.2" + (
            " + 6.3.2" if math.isfinite(sg.M_cr) else "")
        other = "minor" if imp == "major" else "major"
        why2 = (f"a second-order analysis with {bow} in the {imp}-axis plane (5.2.2(3) a) and (7) a), 5.3.2, from "
                f"memory), the {other}-axis plane with its lateral actions alone (second order, no imperfection: the "
                "imperfections are taken in one direction at a time, 5.3.2, from memory), covers flexural buckling, so "
                "the cross-section is checked with the largest second-order moments and N_Ed (6.2.1(7), 6.2.9.1; at "
                "one section: conservative)")
        if math.isfinite(sg.M_cr):
            why2 += ("; the analysis has no lateral-torsional imperfection (5.3.4(3)): lateral-torsional buckling is "
                     "checked by 6.3.2 (6.54) on the second-order major moment, its interaction with N_Ed by the 6.3.3 "
                     "route")
        why2 += "."
        used2, ds = [], {}
        for axis in ("major", "minor"):
            src = a2 if axis == imp else plain
            pl = src.plane(axis)
            s = pl.segments[i]
            ds[axis] = s.second_order
            if s.second_order is not None:
                how = (f"second-order analysis with the {pl.imperfection.kind} imperfection ({pl.imperfection.clause})"
                       if axis == imp else "second-order analysis of the lateral actions alone, no imperfection")
                used2.append(_used(axis, "second-order", s.second_order, "", None, how, sg.ref))
        if any(d is None for d in ds.values()):
            out.append(_no_answer(sg, EN, SECOND_ORDER, title2, why2, tuple(used2),
                                  "No second-order equilibrium at the design loads: the member fails."))
            continue
        My, Mz = (_clean(d.max_abs, sg.ref) for d in ds.values() if d is not None)
        inp2 = _inputs(case, spec, sg, m, N_cr, My, Mz, MomentDiagram(), MomentDiagram(), None, curve_LT)
        checks: list[BendingCheck] = [en1993_cross_section(inp2)]
        if math.isfinite(sg.M_cr) and My > 0:
            checks.append(en1993_ltb(inp2, ltb=ltb))
        top = max(checks, key=lambda c: c.utilisation)
        out.append(BendingRoute(i, sg.name, EN, SECOND_ORDER, title2, why2, sg.N_Ed, tuple(used2), tuple(checks),
                                top.utilisation, top.governing, sg.section, sg.M_cr, sg.M_cr_source, notes=notes))
    return out


def _aisc_routes(case: Case, spec: DesignSpec, results, acts: dict[str, DesignActions], sg: _Segment,
                 m: MemberData, member_moment) -> list[BendingRoute]:
    i = sg.index
    a = acts[DIRECT]
    method = str(spec.parameters.get("method", "LRFD"))
    L = {ax: unbraced_length(case.column(ax), i) for ax in ("major", "minor")}
    N_cr = tuple(math.pi**2 * m.E * case.column(ax).segments[i].I / L[ax]**2 for ax in ("major", "minor"))
    used, ds = [], {}
    for axis in ("major", "minor"):
        p = a.plane(axis)
        s = p.segments[i]
        ds[axis] = s.second_order
        if s.second_order is not None:
            used.append(_used(axis, "second-order", s.second_order, "", None, ref=sg.ref, source=
                              f"direct analysis, {p.imperfection.kind} ({p.imperfection.clause}); EI x "
                              f"{s.stiffness_factor:.3g}"))
    title = f"direct analysis, H1.1 ({method})"
    why = ("AISC 360-16 Chapter C direct analysis (from memory): second-order analysis with notional loads in the "
           "planes that sway and the flexural stiffness 0.8 tau_b EI; its moments and forces are the required "
           "strengths of H1.1; P_c by E3 with K = 1, N_cr = pi^2 E I / L^2 of the segment about each axis, L the "
           f"length between the rigid lateral supports of that plane that holds it (major {L['major']:.4g} m, "
           f"minor {L['minor']:.4g} m); M_c by Chapter F" + (" with M_cr of the thin-walled analysis"
                                                              if math.isfinite(sg.M_cr) else "") + ".")
    if any(d is None for d in ds.values()):
        msg = next(p.message for p in a.planes if p.second_order is None)
        return [_no_answer(sg, AISC, DIRECT, title, why, tuple(used), msg)]
    My, Mz = (_clean(d.max_abs, sg.ref) for d in ds.values() if d is not None)
    inp = _inputs(case, spec, sg, m, (N_cr[0], N_cr[1]), My, Mz, MomentDiagram(), MomentDiagram(), None, None)
    chk = aisc360_member(inp, method=method)
    return [BendingRoute(i, sg.name, AISC, DIRECT, title, why, sg.N_Ed, tuple(used), (chk,), chk.utilisation,
                         chk.governing, sg.section, sg.M_cr, sg.M_cr_source, notes=sg.notes)]
