"""The column model: immutable, validated, SI units.

A column is a stack of :class:`Segment` objects listed from the base upward.
Heights ("stations") are measured from the base.  Restraints, foundations,
leaning loads and axial loads are attached at stations or over height ranges.

Conventions
-----------
* Units are SI throughout: m, N, Pa, m^4, N/m, N m/rad, N/m^2.
* Axial loads are positive in compression.
* Every axial load is carried down the column to the base: the axial force at a
  height is the sum of the point loads applied above it plus the distributed
  load above it.  The base (or the lowest lateral support) therefore takes the
  whole vertical load; no load leaves the column part-way down.
* A spring value of ``0.0`` means free and ``math.inf`` means rigid.  Rigid
  restraints are imposed by eliminating degrees of freedom.
* Loads are *variable* (multiplied by the load factor) or *permanent* (held at
  their value while the variable part is scaled).
* Member forces given per segment (a truss chord, a frame column from a global
  analysis) are held as their equivalent joint loads (:func:`member_force_loads`):
  ``N_i - N_(i+1)`` at the top of segment ``i``, marked ``member_forces=True``,
  so the axial force and everything built on it is the same as for point loads.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from ..errors import ModelError

__all__ = [
    "merge_stations",
    "FREE",
    "RIGID",
    "Segment",
    "Restraint",
    "Foundation",
    "PointLoad",
    "DistributedLoad",
    "LeaningLoad",
    "Column",
    "member_force_loads",
]

FREE = 0.0
RIGID = math.inf

#: Two heights closer than this fraction of the column height are the same station.
STATION_TOL = 1e-9


#: Magnitudes (SI) a nonzero input value may have.  Within this window every product the analysis forms
#: (``E I / L^3``, ``12 E I / (S L^2)``, ``P / (E I)``, energies of unit-normalised modes) stays finite and
#: normal in double precision, so no subnormal or infinite intermediate can occur; values outside it are
#: refused with the reason.  Springs may be stiffer (up to :data:`MAX_SPRING`), or ``inf`` for rigid.
MIN_MAGNITUDE = 1e-30
MAX_MAGNITUDE = 1e30
MAX_SPRING = 1e60

#: A segment shorter than this fraction of the column height would merge with its neighbours' stations.
MIN_SEGMENT_SHARE = 1e-7


def _in_range(field_name: str, value: float, unit: str, hi: float = MAX_MAGNITUDE) -> None:
    """Refuse a nonzero finite value whose magnitude double precision cannot compute with safely."""
    if value != 0 and not (MIN_MAGNITUDE <= abs(value) <= hi):
        raise ModelError(field_name, f"{value!r} {unit} is outside the range the analysis can compute with in "
                                     f"double precision: magnitudes from {MIN_MAGNITUDE:g} to {hi:g} {unit} (SI)")


def _positive(field_name: str, value: float | None, unit: str, allow_none: bool = False) -> None:
    if value is None and allow_none:
        return
    if not isinstance(value, (int, float)) or isinstance(value, bool):
        raise ModelError(field_name, f"expected a number in {unit}, got {value!r}")
    if not math.isfinite(value) or value <= 0.0:
        raise ModelError(field_name, f"must be a positive finite value in {unit}, got {value!r}")
    _in_range(field_name, value, unit)


def _spring(field_name: str, value: float, unit: str) -> None:
    if not isinstance(value, (int, float)) or isinstance(value, bool):
        raise ModelError(field_name, f"expected a stiffness in {unit}, 'free' or 'rigid', got {value!r}")
    if math.isnan(value) or value < 0.0:
        raise ModelError(field_name, f"must be >= 0 {unit} (0 = free, inf = rigid), got {value!r}")
    if math.isfinite(value):
        _in_range(field_name, value, unit, hi=MAX_SPRING)


def _finite(field_name: str, value: float, unit: str) -> None:
    if not isinstance(value, (int, float)) or isinstance(value, bool) or not math.isfinite(value):
        raise ModelError(field_name, f"expected a finite number in {unit}, got {value!r}")
    _in_range(field_name, value, unit)


@dataclass(frozen=True, slots=True)
class Segment:
    """One prismatic or tapered length of the column.

    Parameters
    ----------
    length : float
        Segment length [m].
    E : float
        Young's modulus [Pa].
    I : float
        Second moment of area at the bottom of the segment, or throughout when
        ``I_top`` is None [m^4].
    I_top : float or None
        Second moment of area at the top of a tapered segment [m^4].
    taper_exponent : float
        Law of variation of a tapered segment: ``I(s)**(1/n)`` varies linearly
        with height, ``n = taper_exponent``.  ``n = 1``: I linear in height;
        ``n = 2``: I of a section whose depth varies linearly at constant flange
        area; ``n = 3``: a tube of constant wall whose diameter varies linearly;
        ``n = 4``: a solid round of linearly varying diameter.
    A : float or None
        Cross-section area [m^2] (not used by the buckling analysis itself).
    S : float or None
        Shear stiffness [N] (kappa G A, or the shear stiffness of a laced or
        battened member).  None means shear-rigid (Euler-Bernoulli).
    name : str
        Optional label.
    """

    length: float
    E: float
    I: float
    I_top: float | None = None
    taper_exponent: float = 1.0
    A: float | None = None
    S: float | None = None
    name: str = ""

    def __post_init__(self) -> None:
        _positive("length", self.length, "m")
        _positive("E", self.E, "Pa")
        _positive("I", self.I, "m^4")
        _positive("I_top", self.I_top, "m^4", allow_none=True)
        _positive("taper_exponent", self.taper_exponent, "(dimensionless)")
        _positive("A", self.A, "m^2", allow_none=True)
        _positive("S", self.S, "N", allow_none=True)

    @property
    def tapered(self) -> bool:
        return self.I_top is not None and self.I_top != self.I

    def inertia_at(self, s):
        """Second moment of area at local heights ``s`` (0 at the segment bottom) [m^4]."""
        if self.I_top is None or not self.tapered:
            return self.I + 0.0 * s
        n = self.taper_exponent
        t = s / self.length
        a, b = self.I ** (1.0 / n), self.I_top ** (1.0 / n)
        return (a + (b - a) * t) ** n

    @property
    def I_ref(self) -> float:
        """Reference I for the effective-length factor: the larger end value [m^4]."""
        return self.I if self.I_top is None else max(self.I, self.I_top)


@dataclass(frozen=True, slots=True)
class Restraint:
    """Lateral and rotational restraint at one station.

    Parameters
    ----------
    at : float
        Height of the station [m].
    lateral : float
        Translational spring [N/m]; 0 free, ``inf`` rigid.
    rotation : float
        Rotational spring [N m/rad]; 0 free, ``inf`` rigid.
    """

    at: float
    lateral: float = FREE
    rotation: float = FREE

    def __post_init__(self) -> None:
        _finite("at", self.at, "m")
        _spring("lateral", self.lateral, "N/m")
        _spring("rotation", self.rotation, "N*m/rad")


@dataclass(frozen=True, slots=True)
class Foundation:
    """Lateral elastic foundation (Winkler) over a height range.

    The modulus varies linearly from ``k_bottom`` at ``bottom`` to ``k_top`` at
    ``top`` [N/m per m of height = N/m^2].
    """

    bottom: float
    top: float
    k_bottom: float
    k_top: float | None = None

    def __post_init__(self) -> None:
        _finite("bottom", self.bottom, "m")
        _finite("top", self.top, "m")
        if not self.top > self.bottom:
            raise ModelError("foundation", f"top ({self.top} m) must be above bottom ({self.bottom} m)")
        for name, v in (("k_bottom", self.k_bottom), ("k_top", self.k_top_value)):
            _finite(name, v, "N/m^2")
            if v < 0:
                raise ModelError(name, f"foundation modulus must be >= 0 N/m^2, got {v!r}")
        if self.k_bottom == 0 and self.k_top_value == 0:
            raise ModelError("foundation", "modulus is zero over the whole range")

    @property
    def k_top_value(self) -> float:
        return self.k_bottom if self.k_top is None else self.k_top

    def modulus_at(self, x):
        """Modulus at heights ``x`` inside the range [N/m^2]."""
        t = (x - self.bottom) / (self.top - self.bottom)
        return self.k_bottom + (self.k_top_value - self.k_bottom) * t


@dataclass(frozen=True, slots=True)
class PointLoad:
    """Axial point load at a station [N], compression positive.

    ``member_forces`` marks a joint load that stands for member forces given
    per segment (:func:`member_force_loads`) rather than a load applied there:
    figures and reports show those as an axial-force diagram, not as a load.
    """

    at: float
    P: float
    permanent: bool = False
    member_forces: bool = False

    def __post_init__(self) -> None:
        _finite("at", self.at, "m")
        _finite("axial", self.P, "N")


@dataclass(frozen=True, slots=True)
class DistributedLoad:
    """Uniform axial load per unit height over a range [N/m], compression positive."""

    bottom: float
    top: float
    q: float
    permanent: bool = False

    def __post_init__(self) -> None:
        _finite("bottom", self.bottom, "m")
        _finite("top", self.top, "m")
        _finite("q", self.q, "N/m")
        if not self.top > self.bottom:
            raise ModelError("distributed load", f"top ({self.top} m) must be above bottom ({self.bottom} m)")


@dataclass(frozen=True, slots=True)
class LeaningLoad:
    """Gravity load of pinned columns that lean on this one at a station.

    It acts on this column as a lateral spring of stiffness ``-P / height``
    that scales with the load factor unless permanent (the leaning-column
    concept: Yura, 1971).  It adds no axial force to this column.

    Parameters
    ----------
    at : float
        Station where the leaning columns are tied in [m].
    P : float
        Total gravity load on the leaning columns [N], >= 0.
    height : float
        Height of the leaning columns [m].
    """

    at: float
    P: float
    height: float
    permanent: bool = False

    def __post_init__(self) -> None:
        _finite("at", self.at, "m")
        _finite("load", self.P, "N")
        if self.P < 0:
            raise ModelError("leaning load", f"must be >= 0 N (gravity on the leaning columns), got {self.P!r}")
        _positive("height", self.height, "m")


def member_force_loads(joints: tuple[float, ...], forces: tuple[float, ...],
                       permanent: bool = False) -> tuple[PointLoad, ...]:
    """The joint loads equivalent to a given axial force in each segment.

    Axial load is carried down to the base, so the force in segment ``i`` is
    the sum of the point loads at and above its top.  Compressions ``N_i``
    given per segment are therefore the loads ``N_i - N_(i+1)`` at the top of
    segment ``i`` (``N_n = 0`` above the top segment): a force that drops
    towards the base gives a negative (upward) joint load.  Loads of zero are
    left out.

    Parameters
    ----------
    joints : (n + 1,) heights of the segment ends, base first [m] (:attr:`Column.joints`)
    forces : (n,) compression in each segment, base first [N]; negative is tension
    permanent : whether the forces are permanent (held) or variable (scaled by the load factor)

    Returns
    -------
    The joint loads, base upward, each marked ``member_forces=True``.
    """
    if len(joints) != len(forces) + 1:
        raise ModelError("member forces", f"expected one force per segment ({len(joints) - 1}), got {len(forces)}")
    for i, N in enumerate(forces):
        _finite(f"forces[{i}]", N, "N")
    out = []
    for i, N in enumerate(forces):
        above = forces[i + 1] if i + 1 < len(forces) else 0.0
        P = N - above
        if P != 0.0:
            out.append(PointLoad(joints[i + 1], P, permanent=permanent, member_forces=True))
    return tuple(out)


def merge_stations(xs, height: float) -> tuple[float, ...]:
    """Heights ``xs`` clipped to the member, sorted, those within ``STATION_TOL * height`` of the previous one
    merged, and the ends snapped exactly to 0 and ``height`` [m]."""
    tol = STATION_TOL * height
    ordered = sorted(min(max(float(x), 0.0), height) for x in xs)
    merged = [ordered[0]]
    for x in ordered[1:]:
        if x - merged[-1] > tol:
            merged.append(x)
    merged[0], merged[-1] = 0.0, height
    return tuple(merged)


@dataclass(frozen=True, slots=True)
class Column:
    """A column: segments from the base up, with restraints and loads.

    All heights are measured from the base and must lie on the column.
    Build variants with :func:`dataclasses.replace` or :meth:`with_restraint`.
    """

    segments: tuple[Segment, ...]
    restraints: tuple[Restraint, ...] = ()
    point_loads: tuple[PointLoad, ...] = ()
    distributed_loads: tuple[DistributedLoad, ...] = ()
    foundations: tuple[Foundation, ...] = ()
    leaning_loads: tuple[LeaningLoad, ...] = ()
    title: str = ""

    def __post_init__(self) -> None:
        for name in ("segments", "restraints", "point_loads", "distributed_loads", "foundations", "leaning_loads"):
            value = getattr(self, name)
            if not isinstance(value, tuple):
                object.__setattr__(self, name, tuple(value))
        if not self.segments:
            raise ModelError("segments", "a column needs at least one segment")
        for i, seg in enumerate(self.segments):
            if not isinstance(seg, Segment):
                raise ModelError(f"segment[{i}]", f"expected a Segment, got {type(seg).__name__}")
        H = self.height
        tol = STATION_TOL * H
        for i, seg in enumerate(self.segments):
            if seg.length < MIN_SEGMENT_SHARE * H:
                raise ModelError(f"segment[{i}]", f"length {seg.length:g} m is less than {MIN_SEGMENT_SHARE:g} of the "
                                                  f"column height ({H:g} m): too short to resolve in double precision")

        def check_at(what: str, x: float) -> None:
            if x < -tol or x > H + tol:
                raise ModelError(what, f"height {x:g} m is outside the column (0 to {H:g} m)")

        for i, r in enumerate(self.restraints):
            check_at(f"restraint[{i}].at", r.at)
        for i, p in enumerate(self.point_loads):
            check_at(f"load[{i}].at", p.at)
        for i, d in enumerate(self.distributed_loads):
            check_at(f"distributed load[{i}].bottom", d.bottom)
            check_at(f"distributed load[{i}].top", d.top)
        for i, f in enumerate(self.foundations):
            check_at(f"foundation[{i}].bottom", f.bottom)
            check_at(f"foundation[{i}].top", f.top)
        for i, lean in enumerate(self.leaning_loads):
            check_at(f"leaning load[{i}].at", lean.at)

    # -- geometry -------------------------------------------------------
    @property
    def height(self) -> float:
        """Total height [m]."""
        return math.fsum(s.length for s in self.segments)

    @property
    def joints(self) -> tuple[float, ...]:
        """Heights of the segment ends, base and top included, ascending [m]."""
        out = [0.0]
        for s in self.segments:
            out.append(out[-1] + s.length)
        return tuple(out)

    def segment_bounds(self) -> list[tuple[float, float]]:
        j = self.joints
        return [(j[i], j[i + 1]) for i in range(len(self.segments))]

    def stations(self) -> tuple[float, ...]:
        """Every height where the model changes: joints, restraints, loads, ranges [m]."""
        xs: list[float] = list(self.joints)
        xs += [r.at for r in self.restraints]
        xs += [p.at for p in self.point_loads]
        xs += [lean.at for lean in self.leaning_loads]
        for d in self.distributed_loads:
            xs += [d.bottom, d.top]
        for f in self.foundations:
            xs += [f.bottom, f.top]
        return merge_stations(xs, self.height)

    # -- loads ----------------------------------------------------------
    def axial_force(self, x, permanent: bool | None = None):
        """Axial compression at heights ``x`` just below any point load there [N].

        With member forces given per segment (:func:`member_force_loads`) this is
        the given force of the segment at ``x`` (at a joint: of the segment above; zero at the top),
        so an axial-force diagram drawn from it shows the forces as given.

        Parameters
        ----------
        x : float or ndarray
            Heights [m].
        permanent : bool or None
            Only permanent loads (True), only variable loads (False) or all (None).
        """
        import numpy as np

        x = np.asarray(x, dtype=float)
        tol = STATION_TOL * self.height
        N = np.zeros_like(x)
        loads = [p for p in self.point_loads if permanent is None or p.permanent == permanent]
        if loads:
            # a load counts at x < at - tol: sums of the loads from the top down, found by bisection (a column of
            # many segments with their forces given per segment has a load at nearly every joint)
            at = np.array([p.at for p in loads]) - tol
            order = np.argsort(at, kind="stable")
            P = np.array([p.P for p in loads])[order]
            from_top = np.append(np.cumsum(P[::-1])[::-1], 0.0)  # from_top[k]: sum of the loads k, k+1, ...
            N = N + from_top[np.searchsorted(at[order], x, side="right")]
        for d in self.distributed_loads:
            if permanent is None or d.permanent == permanent:
                above = np.clip(d.top - np.maximum(x, d.bottom), 0.0, None)
                N = N + d.q * above
        return N

    @property
    def member_forces_given(self) -> bool:
        """Whether the axial forces were given per segment (joint loads marked ``member_forces``)."""
        return any(p.member_forces for p in self.point_loads)

    @property
    def has_variable_load(self) -> bool:
        return any(not p.permanent and p.P != 0 for p in self.point_loads) or any(
            not d.permanent and d.q != 0 for d in self.distributed_loads
        ) or any(not lean.permanent and lean.P != 0 for lean in self.leaning_loads)

    # -- variants -------------------------------------------------------
    def with_restraint(self, index: int, **changes: float) -> "Column":
        """A copy with restraint ``index`` changed (e.g. ``rotation=2e6``)."""
        rs = list(self.restraints)
        rs[index] = replace(rs[index], **changes)
        return replace(self, restraints=tuple(rs))

    def reversed(self) -> "Column":
        """The column turned end for end (segments reversed, stations mirrored).

        Tapered segments swap their end values.  Only point loads at the top
        become point loads at the new top; other loads are mirrored as they are
        (which changes the axial-force distribution unless all load enters at
        the top).
        """
        H = self.height
        segs = []
        for s in reversed(self.segments):
            if s.I_top is not None and s.tapered:
                segs.append(replace(s, I=s.I_top, I_top=s.I))
            else:
                segs.append(s)
        return Column(
            segments=tuple(segs),
            restraints=tuple(replace(r, at=H - r.at) for r in self.restraints),
            point_loads=tuple(
                replace(p, at=H if abs(p.at - H) <= STATION_TOL * H else H - p.at) for p in self.point_loads
            ),
            distributed_loads=tuple(replace(d, bottom=H - d.top, top=H - d.bottom) for d in self.distributed_loads),
            foundations=tuple(
                replace(f, bottom=H - f.top, top=H - f.bottom, k_bottom=f.k_top_value, k_top=f.k_bottom)
                for f in self.foundations
            ),
            leaning_loads=tuple(replace(lean, at=H - lean.at) for lean in self.leaning_loads),
            title=self.title,
        )
