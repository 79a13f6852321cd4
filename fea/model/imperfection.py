"""Imperfections, lateral actions and section data of an imperfect column (SI, frozen).

These objects sit beside :class:`~fea.model.Column`: the column carries the
stiffness, restraints and axial loads; an :class:`Imperfection` describes its
initial (stress-free) lateral bow in one bending plane, :class:`LateralActions`
the lateral loads and applied moments in that plane, and one
:class:`SegmentSection` per segment what a stress or fibre analysis needs.

Sign conventions (one bending plane)
------------------------------------
* ``w`` is the lateral displacement [m], positive towards the plane's ``+``
  side; heights ``x`` [m] are measured from the base.
* An applied moment [N m] is positive when it tends to turn the column axis
  towards ``+w`` going up (it is work-conjugate to the slope ``dw/dx``).  A
  compressive load ``P`` applied with an eccentricity ``e`` towards ``+w``
  gives ``+P e`` at its station; the reaction of an eccentric bearing at the
  base gives ``-P e``.
* Lateral forces [N] and lateral loads per length [N/m] are positive towards
  ``+w``.
* Bow amplitudes are >= 0 and point towards ``+w``; an ``"offsets"`` bow may
  take either sign.

Bow shapes
----------
``"half-sine"``
    ``a sin(pi x / H)`` over the whole height ``H``.
``"half-sine-per-segment"``
    a half-sine over each segment, all towards ``+w`` (kinks at the joints).
``"between-restraints"``
    a half-sine between consecutive laterally restrained stations, alternating
    in direction from one interval to the next (the lowest interval towards
    ``+w``), as the first mode of a column over rigid intermediate supports;
    from the last restraint to a free column end a quarter-sine
    ``a (1 - cos(pi s / 2 l))`` that is largest at the free end (a cantilever's
    sway-bow).
``"mode"``
    the first elastic buckling mode of the plane, scaled so that its largest
    lateral value is ``a`` (computed on the analysis mesh).
``"offsets"``
    measured offsets at heights, joined by a monotone piecewise cubic (PCHIP);
    outside the measured range the end offsets are held.

A ratio ``"L/1000"`` sets ``a = length / 1000`` with ``length`` the whole
column (``"half-sine"``, ``"mode"``), each segment (``"half-sine-per-segment"``)
or each restrained interval (``"between-restraints"``).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import cast

import numpy as np

from ..errors import ModelError
from .column import STATION_TOL, Column

__all__ = [
    "IMPERFECT_ANALYSIS_KINDS",
    "PATH_METHODS",
    "BOW_SHAPES",
    "Imperfection",
    "LateralPointLoad",
    "LateralDistributedLoad",
    "AppliedMoment",
    "LateralActions",
    "SegmentSection",
    "bow_pieces",
    "LateralSpec",
    "ImperfectionSpec",
]

BOW_SHAPES = ("half-sine", "half-sine-per-segment", "between-restraints", "mode", "offsets")
#: The kinds of imperfect-column analysis: second-order elastic, nonlinear (fibre path), or both.
IMPERFECT_ANALYSIS_KINDS = ("second-order", "nonlinear", "both")
#: Path-following methods of the nonlinear analysis.
PATH_METHODS = ("arc-length", "load", "displacement")
#: Defaults of ``[imperfection]``: arc-length steps, path tolerance, fibres across a section, least elements.
DEFAULT_STEPS = 200
DEFAULT_PATH_TOL = 1e-8
DEFAULT_FIBRES = 40
DEFAULT_ELEMENTS = 16


def _finite(field: str, value, unit: str) -> float:
    if isinstance(value, bool) or not isinstance(value, (int, float, np.floating, np.integer)) \
            or not math.isfinite(value):
        raise ModelError(field, f"expected a finite number in {unit}, got {value!r}")
    return float(value)


@dataclass(frozen=True, slots=True)
class Imperfection:
    """Initial lateral bow of one bending plane.

    Parameters
    ----------
    shape : str
        One of :data:`BOW_SHAPES`.
    amplitude : float or None
        Largest bow [m], >= 0 (``"half-sine-per-segment"`` and
        ``"between-restraints"``: the amplitude of every piece).  Give either
        ``amplitude`` or ``ratio`` (not for ``"offsets"``).
    ratio : float or None
        Length-to-bow ratio (1000 for ``"L/1000"``), > 0; the length depends on
        the shape (module notes).
    offsets : tuple of (height [m], offset [m])
        Measured offsets, only for ``shape="offsets"`` (at least two heights).
    """

    shape: str = "half-sine"
    amplitude: float | None = None
    ratio: float | None = None
    offsets: tuple[tuple[float, float], ...] = ()

    def __post_init__(self) -> None:
        if self.shape not in BOW_SHAPES:
            raise ModelError("imperfection.shape", f"{self.shape!r} is not a bow shape; expected one of "
                                                   f"{', '.join(BOW_SHAPES)}")
        object.__setattr__(self, "offsets", tuple((float(h), float(o)) for h, o in self.offsets))
        if self.shape == "offsets":
            if self.amplitude is not None or self.ratio is not None:
                raise ModelError("imperfection.bow", "is not used with shape 'offsets'; give the offsets only")
            if len(self.offsets) < 2:
                raise ModelError("imperfection.offsets", f"{len(self.offsets)} point(s) given; expected at least "
                                                         "two (height, offset) pairs")
            hs = [h for h, _ in self.offsets]
            for i, (h, o) in enumerate(self.offsets):
                _finite(f"imperfection.offsets[{i}]", h, "m")
                _finite(f"imperfection.offsets[{i}]", o, "m")
            if any(b <= a for a, b in zip(hs[:-1], hs[1:])):
                raise ModelError("imperfection.offsets", f"heights {hs} must rise strictly from the base upward")
            return
        if self.offsets:
            raise ModelError("imperfection.offsets", f"are only used with shape 'offsets', not {self.shape!r}")
        if (self.amplitude is None) == (self.ratio is None):
            raise ModelError("imperfection.bow", "give exactly one of an amplitude (e.g. '5 mm') or a ratio "
                                                 "(e.g. 'L/1000')")
        if self.amplitude is not None:
            a = _finite("imperfection.bow", self.amplitude, "m")
            if a < 0:
                raise ModelError("imperfection.bow", f"{a!r} m is negative; expected a bow >= 0 (it points "
                                                     "towards +w; use shape 'offsets' for other directions)")
        if self.ratio is not None:
            r = _finite("imperfection.bow", self.ratio, "(ratio)")
            if r <= 0:
                raise ModelError("imperfection.bow", f"ratio L/{r!r} is not positive; expected e.g. L/1000")

    def piece_amplitude(self, length: float) -> float:
        """Amplitude of a piece of the given reference length [m] -> [m]."""
        if self.shape == "offsets":
            return max(abs(o) for _, o in self.offsets)
        return float(self.amplitude) if self.amplitude is not None else length / float(cast(float, self.ratio))

    @property
    def is_zero(self) -> bool:
        """True when the bow is zero everywhere."""
        if self.shape == "offsets":
            return all(o == 0 for _, o in self.offsets)
        return self.amplitude == 0


@dataclass(frozen=True, slots=True)
class LateralPointLoad:
    """Lateral force at a station [N], positive towards ``+w``; variable unless permanent."""

    at: float
    force: float
    permanent: bool = False

    def __post_init__(self) -> None:
        _finite("lateral_load.at", self.at, "m")
        _finite("lateral_load.force", self.force, "N")


@dataclass(frozen=True, slots=True)
class LateralDistributedLoad:
    """Lateral load per height, linear from ``q_bottom`` to ``q_top`` [N/m], positive towards ``+w``."""

    bottom: float
    top: float
    q_bottom: float
    q_top: float | None = None
    permanent: bool = False

    def __post_init__(self) -> None:
        _finite("lateral_load.from", self.bottom, "m")
        _finite("lateral_load.to", self.top, "m")
        _finite("lateral_load.per_length", self.q_bottom, "N/m")
        if self.q_top is not None:
            _finite("lateral_load.per_length_top", self.q_top, "N/m")
        if not self.top > self.bottom:
            raise ModelError("lateral_load.to", f"{self.top:g} m must be above `from` ({self.bottom:g} m)")

    def q_at(self, x):
        """Load per height at heights ``x`` inside the range [N/m]."""
        qt = self.q_bottom if self.q_top is None else self.q_top
        return self.q_bottom + (qt - self.q_bottom) * (np.asarray(x) - self.bottom) / (self.top - self.bottom)


@dataclass(frozen=True, slots=True)
class AppliedMoment:
    """Moment applied at a station [N m] (sign: module notes); variable unless permanent."""

    at: float
    moment: float
    permanent: bool = False

    def __post_init__(self) -> None:
        _finite("moment.at", self.at, "m")
        _finite("moment", self.moment, "N m")


@dataclass(frozen=True, slots=True)
class LateralActions:
    """Lateral loads and applied moments of one bending plane.

    Variable actions are multiplied by the load factor together with the
    variable axial loads; permanent ones are held.
    """

    point: tuple[LateralPointLoad, ...] = ()
    distributed: tuple[LateralDistributedLoad, ...] = ()
    moments: tuple[AppliedMoment, ...] = ()

    def __post_init__(self) -> None:
        for name in ("point", "distributed", "moments"):
            object.__setattr__(self, name, tuple(getattr(self, name)))

    @property
    def empty(self) -> bool:
        return not (any(p.force for p in self.point) or any(d.q_bottom or d.q_top for d in self.distributed)
                    or any(m.moment for m in self.moments))

    def stations(self) -> tuple[float, ...]:
        """Heights where the actions start, stop or act [m]."""
        xs = [p.at for p in self.point] + [m.at for m in self.moments]
        for d in self.distributed:
            xs += [d.bottom, d.top]
        return tuple(xs)

    def check(self, column: Column) -> None:
        """Raise :class:`ModelError` if an action lies outside ``column``."""
        H = column.height
        tol = STATION_TOL * H
        for x in self.stations():
            if x < -tol or x > H + tol:
                raise ModelError("lateral_load", f"height {x:g} m is outside the column (0 to {H:g} m)")


@dataclass(frozen=True)
class SegmentSection:
    """What the stress and fibre analyses need of one segment in one plane (SI).

    Attributes
    ----------
    A : float
        Area [m^2].
    W : float or None
        Elastic section modulus about the plane's bending axis, the smaller of
        the two extreme fibres [m^3]; None: no stresses.
    fy : float or None
        Yield strength [Pa]; None: no yield analysis.
    fibre_y : ndarray, shape (n_fib,) or None
        Fibre distances from the bending axis, positive towards ``+w`` [m].
    fibre_area : ndarray, shape (n_fib,) or None
        Fibre areas [m^2].
    residual : ndarray, shape (n_fib,) or None
        Residual stress ratio sigma_r / fy per fibre, compression positive [-].
    hardening : float
        Tangent (hardening) modulus over E [-], 0 for elastic-perfectly-plastic.
    label : str
        Shape description for messages.
    """

    A: float
    W: float | None = None
    fy: float | None = None
    fibre_y: np.ndarray | None = None
    fibre_area: np.ndarray | None = None
    residual: np.ndarray | None = None
    hardening: float = 0.0
    label: str = ""

    def __post_init__(self) -> None:
        for name, unit in (("A", "m^2"), ("W", "m^3"), ("fy", "Pa")):
            v = getattr(self, name)
            if v is None and name != "A":
                continue
            v = _finite(f"section.{name}", v, unit)
            if v <= 0:
                raise ModelError(f"section.{name}", f"{v!r} {unit} must be positive")
        h = _finite("imperfection.hardening", self.hardening, "(ratio E_t/E)")
        if not 0 <= h < 1:
            raise ModelError("imperfection.hardening", f"{h!r} is outside [0, 1); expected E_t/E such as 0.01")
        if (self.fibre_y is None) != (self.fibre_area is None):
            raise ModelError("section.fibres", "give both fibre positions and areas, or neither")

    @property
    def has_fibres(self) -> bool:
        return self.fibre_y is not None

    @classmethod
    def from_shape(cls, shape, axis: str, fy: float | None, *, n_fibres: int = 40,
                   residual_stress: float = 0.0, hardening: float = 0.0) -> "SegmentSection":
        """Section data from a shape of :mod:`fea.sections` bent about ``axis``.

        Parameters
        ----------
        shape : a shape object with ``properties()`` and ``fibres(axis, n)``
        axis : "major" or "minor" (the plane's bending axis; "in-plane" = "major")
        fy : yield strength [Pa] or None
        n_fibres : strips across the depth [-]
        residual_stress : peak compressive residual stress at the flange tips
            over fy (I sections only; linear flange pattern of
            :meth:`fea.sections.FibreSet.residual_ratio`) [-]
        hardening : E_t / E [-]
        """
        ax = "major" if axis == "in-plane" else axis
        props = shape.properties()
        fs = shape.fibres(ax, int(n_fibres))
        W = props.W_el_major if ax == "major" else props.W_el_minor
        res = None
        if residual_stress:
            if np.all(np.isnan(fs.flange_s)):
                raise ModelError("imperfection.residual_stress",
                                 f"{residual_stress!r} given, but a {type(shape).__name__} has no flanges; the "
                                 "linear flange pattern applies to I sections only (set 0 for this case)")
            res = np.asarray(fs.residual_ratio(float(residual_stress)), dtype=float)
        return cls(A=props.area, W=W, fy=fy, fibre_y=np.asarray(fs.y, dtype=float),
                   fibre_area=np.asarray(fs.area, dtype=float), residual=res, hardening=float(hardening),
                   label=type(shape).__name__)


# ---------------------------------------------------------------------------
# bow shapes


def _pieces_between(column: Column, imp: Imperfection) -> list[tuple[float, float, str, float]]:
    H = column.height
    tol = STATION_TOL * H
    sup = sorted({min(max(r.at, 0.0), H) for r in column.restraints if r.lateral > 0})
    pts = sorted(set(sup) | {0.0, H})
    merged = [pts[0]]
    for p in pts[1:]:
        if p - merged[-1] > tol:
            merged.append(p)
    restrained = [any(abs(p - s) <= tol for s in sup) for p in merged]
    out = []
    for k, ((a, ra), (b, rb)) in enumerate(zip(zip(merged[:-1], restrained[:-1]), zip(merged[1:], restrained[1:]))):
        amp = imp.piece_amplitude(b - a) * (-1.0) ** k
        if ra and rb:
            out.append((a, b, "sine", amp))
        elif ra:
            out.append((a, b, "rise", amp))      # largest at the free top
        elif rb:
            out.append((a, b, "fall", amp))      # largest at the free bottom
        else:
            out.append((a, b, "sine", amp))
    return out


def bow_pieces(column: Column, imp: Imperfection) -> list[tuple[float, float, str, float]]:
    """The bow as pieces ``(bottom, top, kind, amplitude)`` for the analytic shapes.

    ``kind`` is ``"sine"`` (half-sine), ``"rise"`` (quarter-sine, zero at the
    bottom, largest at the top), ``"fall"`` (the mirror).  Not used for
    ``"mode"`` and ``"offsets"``.
    """
    H = column.height
    if imp.shape == "half-sine":
        return [(0.0, H, "sine", imp.piece_amplitude(H))]
    if imp.shape == "half-sine-per-segment":
        return [(a, b, "sine", imp.piece_amplitude(b - a)) for a, b in column.segment_bounds()]
    if imp.shape == "between-restraints":
        return _pieces_between(column, imp)
    raise ModelError("imperfection.shape", f"{imp.shape!r} has no analytic pieces")


def piece_value(kind: str, a: float, b: float, amp: float, x: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Bow and slope of one analytic piece at heights ``x`` (inside [a, b]) [m], [-]."""
    ell = b - a
    s = np.asarray(x, dtype=float) - a
    if kind == "sine":
        k = math.pi / ell
        return amp * np.sin(k * s), amp * k * np.cos(k * s)
    k = 0.5 * math.pi / ell
    if kind == "rise":
        return amp * (1.0 - np.cos(k * s)), amp * k * np.sin(k * s)
    t = ell - s  # "fall"
    return amp * (1.0 - np.cos(k * t)), -amp * k * np.sin(k * t)


def offsets_interpolant(imp: Imperfection):
    """Callable ``f(x) -> (w0, slope)`` through the measured offsets (PCHIP, ends held)."""
    from scipy.interpolate import PchipInterpolator

    h = np.array([p[0] for p in imp.offsets])
    o = np.array([p[1] for p in imp.offsets])
    f = PchipInterpolator(h, o, extrapolate=False)
    d = f.derivative()

    def at(x):
        x = np.asarray(x, dtype=float)
        xc = np.clip(x, h[0], h[-1])
        w = f(xc)
        s = np.where((x < h[0]) | (x > h[-1]), 0.0, d(xc))
        return w, s

    return at


# ---------------------------------------------------------------------------
# what a case file declares (parsed by fea.io.imperfect_input)


@dataclass(frozen=True)
class LateralSpec:
    """Lateral actions of a case per plane label ("major", "minor" or "" for every plane)."""

    point: tuple[tuple[str, LateralPointLoad], ...] = ()
    distributed: tuple[tuple[str, LateralDistributedLoad], ...] = ()
    moments: tuple[tuple[str, AppliedMoment], ...] = ()

    def for_axis(self, axis: str) -> LateralActions:
        def pick(items):
            return tuple(a for ax, a in items if ax in ("", axis))

        return LateralActions(point=pick(self.point), distributed=pick(self.distributed), moments=pick(self.moments))

    def merged(self, other: "LateralSpec") -> "LateralSpec":
        return LateralSpec(self.point + other.point, self.distributed + other.distributed,
                           self.moments + other.moments)

    @property
    def empty(self) -> bool:
        return not (self.point or self.distributed or self.moments)


@dataclass(frozen=True)
class ImperfectionSpec:
    """What ``[imperfection]`` says, in SI (``analysis`` one of :data:`IMPERFECT_ANALYSIS_KINDS`)."""

    imperfection: Imperfection
    axis: str = "both"
    residual_stress: float = 0.0
    hardening: float = 0.0
    analysis: str = "both"
    analysis_given: bool = False
    steps: int = DEFAULT_STEPS
    tolerance: float = DEFAULT_PATH_TOL
    fibres: int = DEFAULT_FIBRES
    elements: int = DEFAULT_ELEMENTS
    method: str = "arc-length"
    W: dict = field(default_factory=dict)
    loads: LateralSpec = field(default_factory=LateralSpec)
