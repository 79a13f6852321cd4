"""Input model of the thin-walled (Vlasov) beam-column buckling kernel: immutable, validated, SI.

Axes (see ``docs/spatial.md``): ``x`` along the member from its first end (the base of a column);
``y`` and ``z`` the principal axes of the cross-section through its centroid, ``y`` the *major*
axis (``I_y = int z^2 dA``, the larger) and ``z`` the *minor* axis (``I_z = int y^2 dA``).
``u`` is the displacement of the shear centre along ``y`` (bending about the minor axis, ``E I_z``),
``v`` along ``z`` (bending about the major axis, ``E I_y``), ``phi`` the twist about the shear-centre
axis, positive turning ``+y`` towards ``+z``.  The shear centre lies at ``(y0, z0)`` from the centroid.
A major-axis moment ``M`` is positive when it compresses the fibres at ``z > 0``.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..errors import ModelError
from ..model.column import FREE, STATION_TOL, _finite, _positive, _spring, merge_stations

__all__ = ["SpatialSegment", "SpatialRestraint", "OffsetRestraint", "AxialLoad", "SpatialColumn", "REFERENCES"]

#: Where the offset of an :class:`OffsetRestraint` is measured from.
REFERENCES = ("shear_centre", "centroid")


def _non_negative(name: str, value: float, unit: str) -> None:
    _finite(name, value, unit)
    if value < 0:
        raise ModelError(name, f"must be >= 0 {unit}, got {value!r}")


@dataclass(frozen=True, slots=True)
class SpatialSegment:
    """One prismatic length of a thin-walled member.

    Parameters
    ----------
    length : segment length [m]
    E, G : Young's and shear moduli [Pa]
    A : area [m^2]
    I_y : second moment of area about the major principal axis y [m^4]
    I_z : second moment of area about the minor principal axis z [m^4]
    J : St Venant torsion constant [m^4] (>= 0)
    I_w : warping constant [m^6] (>= 0)
    y0, z0 : shear-centre coordinates from the centroid in the principal axes [m]
    beta_y : monosymmetry constant ``(1/I_y) int z (y^2 + z^2) dA - 2 z0`` [m]; 0 for a section
        symmetric about the y axis
    M1, M2 : major-axis moment at the segment's first and second end [N m] (variable: scaled by the
        load factor; positive compresses the fibres at z > 0), varying linearly between them
    name : optional label
    """

    length: float
    E: float
    G: float
    A: float
    I_y: float
    I_z: float
    J: float
    I_w: float
    y0: float = 0.0
    z0: float = 0.0
    beta_y: float = 0.0
    M1: float = 0.0
    M2: float = 0.0
    name: str = ""

    def __post_init__(self) -> None:
        for name, unit in (("length", "m"), ("E", "Pa"), ("G", "Pa"), ("A", "m^2"), ("I_y", "m^4"),
                           ("I_z", "m^4")):
            _positive(name, getattr(self, name), unit)
        _non_negative("J", self.J, "m^4")
        _non_negative("I_w", self.I_w, "m^6")
        if self.J == 0 and self.I_w == 0:
            raise ModelError("J", "J and I_w are both zero: the section has no torsional stiffness")
        for name, unit in (("y0", "m"), ("z0", "m"), ("beta_y", "m"), ("M1", "N*m"), ("M2", "N*m")):
            _finite(name, getattr(self, name), unit)

    @property
    def i0(self) -> float:
        """Polar radius of gyration about the shear centre, ``sqrt((I_y + I_z)/A + y0^2 + z0^2)`` [m]."""
        return math.sqrt((self.I_y + self.I_z) / self.A + self.y0**2 + self.z0**2)


@dataclass(frozen=True, slots=True)
class SpatialRestraint:
    """Restraints of the shear-centre axis at one station (springs: 0 free, ``inf`` rigid).

    Parameters
    ----------
    at : station [m]
    u : spring on the displacement u along y (minor-axis buckling direction) [N/m]
    v : spring on the displacement v along z (major-axis buckling direction) [N/m]
    twist : spring on the twist phi [N m/rad]
    warping : True: warping prevented there (phi' = 0); False: free
    rotation_u, rotation_v : springs on the slopes u' and v' [N m/rad]
    """

    at: float
    u: float = FREE
    v: float = FREE
    twist: float = FREE
    warping: bool = False
    rotation_u: float = FREE
    rotation_v: float = FREE

    def __post_init__(self) -> None:
        _finite("at", self.at, "m")
        for name, unit in (("u", "N/m"), ("v", "N/m"), ("twist", "N*m/rad"), ("rotation_u", "N*m/rad"),
                           ("rotation_v", "N*m/rad")):
            _spring(name, getattr(self, name), unit)
        if not isinstance(self.warping, bool):
            raise ModelError("warping", f"expected True (prevented) or False (free), got {self.warping!r}")


@dataclass(frozen=True, slots=True)
class OffsetRestraint:
    """A lateral restraint of a point off the shear centre (a girt or sheeting on one flange).

    The point ``(ey, ez)`` is measured from the shear centre or from the centroid (``reference``).
    Its displacements are ``u - ez_s phi`` along y and ``v + ey_s phi`` along z, with ``(ey_s, ez_s)``
    the offset from the shear centre.  At one station (``to`` None) the springs are in N/m; over a
    range ``[at, to]`` (a continuous restraint) they are per unit length, N/m^2.  ``inf`` is rigid.

    Parameters
    ----------
    at : station, or the start of the range [m]
    ey, ez : offset of the restrained point [m]
    u, v : springs on the point's displacement along y and along z
    reference : "shear_centre" or "centroid"
    to : end of a continuous range [m], or None
    """

    at: float
    ey: float
    ez: float
    u: float = FREE
    v: float = FREE
    reference: str = "shear_centre"
    to: float | None = None

    def __post_init__(self) -> None:
        _finite("at", self.at, "m")
        _finite("ey", self.ey, "m")
        _finite("ez", self.ez, "m")
        unit = "N/m" if self.to is None else "N/m^2"
        _spring("u", self.u, unit)
        _spring("v", self.v, unit)
        if self.u == 0 and self.v == 0:
            raise ModelError("offset restraint", "u and v are both free: the restraint holds nothing")
        if self.reference not in REFERENCES:
            raise ModelError("reference", f"expected one of {', '.join(REFERENCES)}, got {self.reference!r}")
        if self.to is not None:
            _finite("to", self.to, "m")
            if not self.to > self.at:
                raise ModelError("to", f"the range must end ({self.to!r} m) above its start ({self.at!r} m)")


@dataclass(frozen=True, slots=True)
class AxialLoad:
    """Axial point load at a station, acting at the centroid [N], compression positive; carried down to x = 0."""

    at: float
    P: float
    permanent: bool = False

    def __post_init__(self) -> None:
        _finite("at", self.at, "m")
        _finite("P", self.P, "N")


@dataclass(frozen=True, slots=True)
class SpatialColumn:
    """A thin-walled member: segments from ``x = 0`` upward, restraints and loads at stations."""

    segments: tuple[SpatialSegment, ...]
    restraints: tuple[SpatialRestraint, ...] = ()
    offset_restraints: tuple[OffsetRestraint, ...] = ()
    loads: tuple[AxialLoad, ...] = ()
    title: str = ""

    def __post_init__(self) -> None:
        for name, kind in (("segments", SpatialSegment), ("restraints", SpatialRestraint),
                           ("offset_restraints", OffsetRestraint), ("loads", AxialLoad)):
            value = getattr(self, name)
            if not isinstance(value, tuple):
                value = tuple(value)
                object.__setattr__(self, name, value)
            for i, item in enumerate(value):
                if not isinstance(item, kind):
                    raise ModelError(f"{name}[{i}]", f"expected a {kind.__name__}, got {type(item).__name__}")
        if not self.segments:
            raise ModelError("segments", "a member needs at least one segment")
        H = self.length
        tol = STATION_TOL * H

        def check(field: str, x: float) -> None:
            if x < -tol or x > H + tol:
                raise ModelError(field, f"station {x:g} m is outside the member (0 to {H:g} m)")

        for i, r in enumerate(self.restraints):
            check(f"restraints[{i}].at", r.at)
        for i, o in enumerate(self.offset_restraints):
            check(f"offset_restraints[{i}].at", o.at)
            if o.to is not None:
                check(f"offset_restraints[{i}].to", o.to)
        for i, p in enumerate(self.loads):
            check(f"loads[{i}].at", p.at)

    @property
    def length(self) -> float:
        """Total length [m]."""
        return math.fsum(s.length for s in self.segments)

    @property
    def joints(self) -> tuple[float, ...]:
        """Stations of the segment ends, both ends included [m]."""
        out = [0.0]
        for s in self.segments:
            out.append(out[-1] + s.length)
        return tuple(out)

    def stations(self) -> tuple[float, ...]:
        """Every station where the model changes (joints, restraints, loads, range ends), merged [m]."""
        xs = list(self.joints) + [r.at for r in self.restraints] + [p.at for p in self.loads]
        for o in self.offset_restraints:
            xs += [o.at] + ([o.to] if o.to is not None else [])
        return merge_stations(xs, self.length)

    def segment_at(self, x: float) -> int:
        """Index of the segment holding station ``x`` (at a joint: the one after it, the last at the end)."""
        j = self.joints
        tol = STATION_TOL * self.length
        for i in range(len(self.segments)):
            if x < j[i + 1] - tol:
                return i
        return len(self.segments) - 1

    @property
    def has_moment(self) -> bool:
        return any(s.M1 != 0 or s.M2 != 0 for s in self.segments)
