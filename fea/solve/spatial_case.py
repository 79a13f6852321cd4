"""The thin-walled (spatial) buckling of a case: its two planar columns and sections -> a :class:`SpatialColumn`.

A case with two bending planes whose every segment has a section shape is also analysed as one thin-walled
member (:func:`fea.solve.spatial.spatial_buckling`): flexural, torsional and flexural-torsional modes together.
Axes (``docs/spatial.md``): the spatial ``u`` moves along the major axis ``y`` and bends about the *minor* axis,
so the case's minor-axis restraints act on ``u`` (and ``u'``), its major-axis restraints on ``v`` (and ``v'``).

* Segments: ``A``, ``I_major``, ``I_minor`` and ``E`` of the planar columns; ``J``, ``I_w``, the shear centre and
  the monosymmetry constant from ``shape.torsion()`` (``docs/sections.md``); ``G`` given, or
  ``E / (2 (1 + nu))`` (common practice for steel, ``nu = 0.3`` unless given).
* Restraints: the planar restraints (lateral and rotation springs, beams and nominal fixities as the planar
  analysis took them) on the shear-centre axis; a restraint with an ``offset`` holds the point at that distance
  from the centroid along the other principal axis; ``twist`` and ``warping`` as given.  Without ``twist`` a
  station is held against twist ("rigid") where the restraints without offset hold both planes rigidly
  against lateral movement (a fork support: twist held, warping free), and free elsewhere.
* Loads: the axial point loads of the case (variable and permanent) at the centroid.
* Bending: when the case's major-axis plane carries moments (eccentric loads, lateral loads, applied moments),
  the elastic critical moment of the member under that moment diagram alone, ``M_cr``
  (:func:`case_critical_moment`): the first-order major-axis moment diagram of the planar column at the case
  loads, linear between stations (a distributed lateral load's parabola is followed by :data:`CHORDS` chords
  per interval), scaled by the lowest load factor of the thin-walled member under it.

Not covered (the analysis is skipped with a note): distributed axial loads, foundations, leaning loads,
tapered segments and shear flexibility.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import TYPE_CHECKING, Any, Sequence

import numpy as np

from ..errors import ModelError, SolverError
from ..model import STATION_TOL
from ..model.case import Case
from ..model.column import merge_stations
from ..results import BucklingResult
from .spatial_model import AxialLoad, OffsetRestraint, SpatialColumn, SpatialRestraint, SpatialSegment

if TYPE_CHECKING:
    from .spatial import SpatialResult

__all__ = ["DEFAULT_NU", "RestraintTorsion", "SpatialInputs", "SpatialCase", "SegmentMoment", "CaseCriticalMoment",
           "spatial_column", "run_spatial", "case_critical_moment", "diagram_critical_moment", "DiagramMoment",
           "moment_at", "NOT_COVERED", "CHORDS"]

#: Poisson's ratio when the case gives neither G nor nu (common practice for steel): G = E / (2 (1 + nu)).
DEFAULT_NU = 0.3

#: The start of the note of a case the spatial analysis does not cover.
NOT_COVERED = "not covered"

#: Linear pieces per interval between stations that follow the parabolic moment of a distributed lateral load
#: (the chord's largest departure from the parabola is 1/CHORDS^2 = 0.4% of the interval's own sag).
CHORDS = 16


@dataclass(frozen=True)
class SegmentMoment:
    """The major-axis moment of one segment and its elastic critical moment.

    ``M_max`` [N m] the largest first-order moment in the segment at the case loads, at height ``at`` [m];
    ``M_cr`` [N m] = the member's lateral-torsional load factor x ``M_max`` (inf where the segment carries no
    moment).
    """

    index: int
    name: str
    M_max: float
    at: float
    M_cr: float


@dataclass(frozen=True)
class CaseCriticalMoment:
    """The elastic critical moment of a case's member under its own major-axis moment diagram (axial loads
    left out), per segment.

    ``load_factor``: the lowest factor on the moment diagram at which the member buckles laterally;
    ``kind``: the mode in plain words; ``senses``: "as given" for a section symmetric about its major axis,
    "the lower of the two senses" otherwise (the moment's sense is not tied to the section's orientation, so
    both are solved and the lower kept); ``chords``: pieces per interval used for a parabolic moment (0: the
    diagram is exactly linear between stations); ``converged``/``message``: the solver's own statement.
    """

    load_factor: float
    kind: str
    senses: str
    chords: int
    segments: tuple[SegmentMoment, ...]
    converged: bool
    message: str


@dataclass(frozen=True)
class RestraintTorsion:
    """The keys of one ``[[restraint]]`` read only by the spatial analysis (SI).

    ``twist``: torsional spring [N m/rad] (``inf`` rigid, 0 free) or None when not given (the default rule);
    ``warping``: True when warping is prevented; ``offset``: the distance [m] from the centroid, along the other
    principal axis, of the point the table's lateral restraint holds, or None (the shear-centre axis).
    """

    table: str
    at: float
    axes: tuple[str, ...]
    twist: float | None = None
    warping: bool = False
    offset: float | None = None


@dataclass(frozen=True)
class SpatialInputs:
    """The spatial analysis's own inputs: ``G`` [Pa] (None: from ``nu``), ``nu``, and per [[restraint]] its
    :class:`RestraintTorsion`, in file order."""

    G: float | None = None
    nu: float = DEFAULT_NU
    restraints: tuple[RestraintTorsion, ...] = ()


@dataclass(frozen=True)
class SpatialCase:
    """The spatial buckling of a case.

    ``result`` is None when the case is not covered or the analysis failed (``note`` says why);
    ``planar_load_factor`` and ``planar_axis`` are the lowest of the two planar analyses.
    """

    result: "SpatialResult | None"
    note: str
    segment_names: tuple[str, ...]
    planar_load_factor: float
    planar_axis: str
    column: SpatialColumn | None = None
    #: the elastic critical moment under the case's major-axis moments (None without such moments); a
    #: ``str`` says why it could not be computed
    critical_moment: "CaseCriticalMoment | str | None" = None

    @property
    def ran(self) -> bool:
        return self.result is not None and self.result.load_factors.size > 0

    @property
    def load_factor(self) -> float:
        """The lowest spatial load factor (NaN when the analysis did not run)."""
        return float(self.result.load_factors[0]) if self.ran and self.result is not None else math.nan

    @property
    def kind(self) -> str:
        return self.result.kinds[0] if self.ran and self.result is not None else ""

    @property
    def governs(self) -> bool:
        """Whether the lowest spatial load factor is below the lower planar one (beyond the solver tolerance)."""
        if not self.ran or self.result is None:
            return False
        tol = max(10 * self.result.tolerance, 1e-9)
        return self.load_factor < self.planar_load_factor * (1 - tol)


def _not_covered(case: Case) -> str:
    """Why the spatial analysis does not cover ``case`` ("" when it does)."""
    why = []
    for axis, col in case.planes:
        if col.distributed_loads:
            why.append("distributed axial loads")
        if col.foundations:
            why.append(f"foundations ({axis} axis)")
        if col.leaning_loads:
            why.append(f"leaning loads ({axis} axis)")
        if any(s.I_top is not None and s.tapered for s in col.segments):
            why.append("tapered segments")
        if any(s.S is not None for s in col.segments):
            why.append("shear flexibility (S)")
    seen = list(dict.fromkeys(why))
    return f"{NOT_COVERED}: {', '.join(seen)}" if seen else ""


def _segments(case: Case, inputs: SpatialInputs) -> tuple[SpatialSegment, ...]:
    major, minor = case.column("major"), case.column("minor")
    out = []
    for i, (info, sy, sz) in enumerate(zip(case.segments, major.segments, minor.segments)):
        tc = info.shape.torsion()
        G = inputs.G if inputs.G is not None else sy.E / (2.0 * (1.0 + inputs.nu))
        A = sy.A if sy.A is not None else info.A
        if A is None:  # pragma: no cover - a section always gives its area
            raise ModelError(f"segment[{i + 1}].A", "missing: the thin-walled analysis needs the area")
        out.append(SpatialSegment(length=sy.length, E=sy.E, G=G, A=A, I_y=sy.I, I_z=sz.I, J=tc.J, I_w=tc.I_w,
                                  y0=tc.y0, z0=tc.z0, beta_y=tc.beta_major, name=info.name or f"segment {i + 1}"))
    return tuple(out)


def _restraints(case: Case, inputs: SpatialInputs) -> tuple[list[SpatialRestraint], list[OffsetRestraint]]:
    tol = STATION_TOL * case.height
    by_table = {r.table: r for r in inputs.restraints}
    point: list[SpatialRestraint] = []
    offset: list[OffsetRestraint] = []
    held: dict[float, set[str]] = {}  # station -> planes held rigidly by restraints without offset
    for key in case.origins:
        if not key.startswith("restraint["):
            continue
        tors = by_table.get(key)
        for axis, r in case.model_objects(key):
            lateral = r.lateral
            if tors is not None and tors.offset is not None and lateral > 0:
                ey, ez = (0.0, tors.offset) if axis == "minor" else (tors.offset, 0.0)
                offset.append(OffsetRestraint(r.at, ey, ez, u=lateral if axis == "minor" else 0.0,
                                              v=lateral if axis == "major" else 0.0, reference="centroid"))
                lateral = 0.0
            if math.isinf(lateral):
                held.setdefault(_station(held, r.at, tol), set()).add(axis)
            if lateral > 0 or r.rotation > 0:
                point.append(SpatialRestraint(r.at, u=lateral, rotation_u=r.rotation) if axis == "minor" else
                             SpatialRestraint(r.at, v=lateral, rotation_v=r.rotation))
    given: dict[float, float] = {}
    for t in inputs.restraints:
        x = _station(given, t.at, tol)
        if t.twist is not None:
            given[x] = given.get(x, 0.0) + t.twist
        if t.twist is not None or t.warping:
            point.append(SpatialRestraint(t.at, twist=t.twist or 0.0, warping=t.warping))
    for x, planes in held.items():
        if planes >= {"major", "minor"} and not any(abs(x - g) <= tol for g in given):
            point.append(SpatialRestraint(x, twist=math.inf))  # a fork: twist held, warping free
    return point, offset


def _station(known: dict[float, Any], x: float, tol: float) -> float:
    """``x``, or the station of ``known`` within ``tol`` of it."""
    return next((k for k in known if abs(k - x) <= tol), x)


def spatial_column(case: Case, inputs: SpatialInputs) -> SpatialColumn:
    """The thin-walled member of ``case`` (two planes, every segment with a section shape, covered)."""
    point, offset = _restraints(case, inputs)
    loads = tuple(AxialLoad(p.at, p.P, p.permanent) for p in case.column("major").point_loads if p.P != 0)
    return SpatialColumn(segments=_segments(case, inputs), restraints=tuple(point), offset_restraints=tuple(offset),
                         loads=loads, title=case.title)


def run_spatial(case: Case, results: Sequence[BucklingResult], inputs: SpatialInputs) -> SpatialCase | None:
    """Spatial buckling of ``case``; None unless it has two planes and every segment has a section shape."""
    if tuple(a for a, _ in case.planes) != ("major", "minor") or any(s.shape is None for s in case.segments):
        return None
    from .spatial import spatial_buckling

    low = min(results, key=lambda r: r.load_factor)
    names = tuple(s.name for s in case.segments)
    lam, axis = float(low.load_factor), low.axis or ""
    note = _not_covered(case)
    if note:
        return SpatialCase(None, note, names, lam, axis)
    try:
        column = spatial_column(case, inputs)
        result = spatial_buckling(column, n_modes=case.n_modes, tol=case.tolerance)
    except (ModelError, SolverError) as exc:
        return SpatialCase(None, f"not run: {exc}", names, lam, axis)
    mcr: CaseCriticalMoment | str | None
    try:
        mcr = case_critical_moment(case, column)
    except (ModelError, SolverError) as exc:
        mcr = f"not computed: {exc}"
    return SpatialCase(result, "", names, lam, axis, column, mcr)


def _major_actions(case: Case):
    """The major-axis lateral actions of ``case`` (eccentricity moments, lateral loads, applied moments), as the
    imperfect-column analysis takes them (``[lateral]`` already holds the [[load]] actions)."""
    from .imperfect_case import imperfection_spec

    return imperfection_spec(case).loads.for_axis("major")


def _first_order_moment(case: Case, actions) -> tuple[np.ndarray, np.ndarray, Any]:
    """Element-end heights and first-order major-axis moments [N m] of the planar column at the case loads
    (its axial loads left out: no P-delta), and the planar result."""
    from .second_order import second_order

    col = case.column("major")
    bare = replace(col, point_loads=(), distributed_loads=(), leaning_loads=())
    r = second_order(bare, None, actions, load_factors=[1.0], tol=case.tolerance if case.tolerance < 0.01 else 1e-6,
                     axis="major")
    return np.asarray(r.end_heights), np.asarray(r.first_order_moment[0]), r


def moment_at(ends: np.ndarray, M: np.ndarray, x: float, above: bool, tol: float) -> float:
    """The moment of a diagram given at element ends (bottom, top of each element: ``ends``, ``M``) just above
    (or just below) height ``x``, linear inside an element."""
    n = ends.size // 2
    lo, hi = ends[0::2], ends[1::2]
    e = int(np.searchsorted(lo, x + tol, side="right") - 1) if above else int(np.searchsorted(hi, x - tol))
    e = min(max(e, 0), n - 1)
    a, b = lo[e], hi[e]
    t = 0.0 if b <= a else min(max((x - a) / (b - a), 0.0), 1.0)
    return float(M[2 * e] + t * (M[2 * e + 1] - M[2 * e]))


@dataclass(frozen=True)
class DiagramMoment:
    """The lateral-torsional buckling of a thin-walled member under a major-axis moment diagram alone.

    ``load_factor`` on the diagram; per segment ``(largest |M| [N m], its height [m], M_cr [N m])`` (M_cr inf
    where the segment carries no moment); ``senses`` as :class:`CaseCriticalMoment`; ``result`` the solver's.
    """

    load_factor: float
    segments: tuple[tuple[float, float, float], ...]
    senses: str
    result: Any


def diagram_critical_moment(column: SpatialColumn, ends: np.ndarray, M: np.ndarray, cuts: Sequence[float] = (),
                            curved: Sequence[tuple[float, float]] = (), chords: int = CHORDS, tol: float = 1e-6,
                            both_senses: bool = True) -> DiagramMoment:
    """The lowest lateral-torsional load factor of the thin-walled member ``column`` (its axial loads left out)
    under a major-axis moment diagram given at element ends (``ends``, ``M``): linear between the member's
    stations and the heights ``cuts`` (where the diagram jumps or kinks), and inside the ranges ``curved``
    (distributed lateral loads) followed by ``chords`` chords per interval.  With ``both_senses`` a section not
    symmetric about its major axis is also solved under the reversed diagram and the lower factor kept.
    ``M_cr`` of a segment = the load factor x its largest moment.
    """
    from .spatial import critical_moment

    H = column.length
    stol = STATION_TOL * H
    xs = {float(x) for x in column.stations()} | {float(c) for c in cuts if 0.0 <= c <= H}
    base = sorted(xs)
    for a, b in zip(base[:-1], base[1:]):
        if any(lo - stol <= a and b <= hi + stol for lo, hi in curved):
            xs |= {a + (b - a) * k / chords for k in range(1, chords)}
    stations = merge_stations(sorted(xs), H)
    pieces, owner = [], []
    for a, b in zip(stations[:-1], stations[1:]):
        k = column.segment_at(0.5 * (a + b))
        pieces.append(replace(column.segments[k], length=b - a, M1=moment_at(ends, M, a, True, stol),
                              M2=moment_at(ends, M, b, False, stol)))
        owner.append(k)
    member = replace(column, segments=tuple(pieces), loads=())
    best = critical_moment(member, tol=tol)
    senses = "as given"
    if both_senses and any(s.beta_y != 0 or s.z0 != 0 for s in column.segments):
        other = critical_moment(replace(member, segments=tuple(replace(p, M1=-p.M1, M2=-p.M2) for p in pieces)),
                                tol=tol)
        senses = "the lower of the two senses"
        if other.load_factor < best.load_factor:
            best = other
    lam = float(best.load_factor)
    segs = []
    for k in range(len(column.segments)):
        own = [(max(abs(p.M1), abs(p.M2)), a if abs(p.M1) >= abs(p.M2) else b)
               for p, o, a, b in zip(pieces, owner, stations[:-1], stations[1:]) if o == k]
        m, at = max(own) if own else (0.0, math.nan)
        segs.append((float(m), float(at), lam * m if m > 0 else math.inf))
    return DiagramMoment(lam, tuple(segs), senses, best.result)


def case_critical_moment(case: Case, column: SpatialColumn) -> CaseCriticalMoment | None:
    """The elastic critical moment of ``case``'s member under its major-axis moment diagram (None when the
    major-axis plane carries no moment).

    The first-order moment diagram of the planar column (:func:`fea.solve.second_order.second_order` with the
    axial loads left out) is given to the thin-walled member (:func:`diagram_critical_moment`), cut at every
    station and load; under a distributed lateral load each interval is cut into :data:`CHORDS` chords.
    """
    actions = _major_actions(case)
    if actions.empty:
        return None
    ends, M, _ = _first_order_moment(case, actions)
    if not np.any(np.abs(M) > 0):
        return None
    cuts = [float(a.at) for a in actions.point + actions.moments]
    curved = [(float(d.bottom), float(d.top)) for d in actions.distributed]
    cuts += [x for rng in curved for x in rng]
    d = diagram_critical_moment(column, ends, M, cuts, curved, CHORDS, case.tolerance)
    res = d.result
    segs = tuple(SegmentMoment(k, s.name, m, at, mcr) for k, (s, (m, at, mcr)) in enumerate(zip(column.segments,
                                                                                                   d.segments)))
    return CaseCriticalMoment(load_factor=d.load_factor, kind=res.kinds[0], senses=d.senses,
                              chords=CHORDS if curved else 0, segments=segs, converged=bool(res.converged),
                              message=res.message)
