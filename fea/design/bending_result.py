"""The records of the member checks with bending of a case: the options a case gives, and the result.

Pure records (no I/O).  :mod:`fea.design.beam_column` fills them from the design actions
(:mod:`fea.design.actions`) and the kernels (:mod:`fea.design.bending`); :class:`fea.design.check.DesignResult`
carries one :class:`BendingResult`.  docs/design.md ("Members with bending") describes the routes.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import TYPE_CHECKING, Any, Mapping

from ..errors import ModelError
from .bending_record import BendingCheck

if TYPE_CHECKING:
    from .classify import SectionClass

__all__ = ["INTERACTIONS", "LTB_ROUTES", "BOWS", "LT_CURVES", "BendingOptions", "MomentUsed", "BendingRoute",
           "BendingResult", "MEMBER", "SECOND_ORDER", "DIRECT", "PLAIN"]

#: ``[design] interaction``: EN 1993-1-1 Annex B (Method 2, default) or Annex A (Method 1).
INTERACTIONS = ("B", "A")
#: ``[design] ltb``: EN 1993-1-1 6.3.2.2 (general case, default) or 6.3.2.3 (rolled or equivalent welded).
LTB_ROUTES = ("general", "rolled")
#: ``[design] bow``: the member imperfection of the EN 1993-1-1 second-order route.
BOWS = ("table-5.1", "5.3.2(11)")
#: ``[design] curve_LT``: EN 1993-1-1 Table 6.3 lateral-torsional buckling curves.
LT_CURVES = ("a", "b", "c", "d")

#: Route keys: EN 1993-1-1 6.3.3 with first-order (or second-order sway) moments; EN 1993-1-1 second-order
#: analysis with member imperfections and the cross-section; AISC 360 direct analysis with H1.1.
MEMBER, SECOND_ORDER, DIRECT = "member", "second-order", "direct-analysis"
#: The analysis of the lateral actions alone at second order (no imperfection): the plane without imperfections
#: of the EN 1993-1-1 second-order route (imperfections one plane at a time).
PLAIN = "no-imperfection"


@dataclass(frozen=True)
class BendingOptions:
    """The ``[design]`` keys of the member checks with bending (docs/design.md).

    Attributes
    ----------
    interaction : EN 1993-1-1 interaction factors, "B" (Annex B, default) or "A" (Annex A)
    ltb : EN 1993-1-1 chi_LT, "general" (6.3.2.2, default) or "rolled" (6.3.2.3)
    bow : EN 1993-1-1 second-order route, "table-5.1" (default) or "5.3.2(11)"
    curve_LT : lateral-torsional buckling curve for every segment, or None (Tables 6.4 / 6.5 by shape)
    section_class : class 1, 2 or 3 for every segment, or None (classified from the dimensions)
    segments : segment index (0-based) -> {"curve_LT": ..., "section_class": ...} replacing the common ones
    """

    interaction: str = "B"
    ltb: str = "general"
    bow: str = "table-5.1"
    curve_LT: str | None = None
    section_class: int | None = None
    segments: Mapping[int, Mapping[str, Any]] = field(default_factory=dict)

    def __post_init__(self) -> None:
        for name, allowed in (("interaction", INTERACTIONS), ("ltb", LTB_ROUTES), ("bow", BOWS)):
            if getattr(self, name) not in allowed:
                raise ModelError(f"design.{name}", f"{getattr(self, name)!r}: expected one of "
                                                   f"{', '.join(repr(a) for a in allowed)}")
        for where, values in [("", {"curve_LT": self.curve_LT, "section_class": self.section_class})] + [
                (f"segment[{i + 1}].", dict(v)) for i, v in dict(self.segments).items()]:
            c, k = values.get("curve_LT"), values.get("section_class")
            if c is not None and c not in LT_CURVES:
                raise ModelError(f"design.{where}curve_LT", f"{c!r}: expected one of {', '.join(LT_CURVES)}")
            if k is not None and k not in (1, 2, 3):
                raise ModelError(f"design.{where}section_class", f"{k!r}: expected 1, 2 or 3 (class 4 is not "
                                                                 "covered)")
        object.__setattr__(self, "segments", MappingProxyType(
            {int(i): MappingProxyType(dict(v)) for i, v in dict(self.segments).items()}))

    def for_segment(self, index: int) -> tuple[str | None, int | None]:
        """``(curve_LT, section_class)`` of segment ``index`` (None: derived)."""
        own = self.segments.get(index, {})
        return own.get("curve_LT", self.curve_LT), own.get("section_class", self.section_class)


@dataclass(frozen=True)
class MomentUsed:
    """The moment a route takes about one axis of a segment.

    Attributes
    ----------
    axis : "major" or "minor"
    order : "first-order" or "second-order"
    M : largest |M| along the segment [N m]
    at : its height [m]
    bottom, top : the moments at the segment's ends [N m]
    diagram : the kernel's diagram kind for C_m ("end moments", "uniform load", "sway", ...)
    psi : its end-moment ratio [-] (None without end moments)
    source : how it was obtained, in words
    """

    axis: str
    order: str
    M: float
    at: float
    bottom: float
    top: float
    diagram: str
    psi: float | None
    source: str


@dataclass(frozen=True)
class BendingRoute:
    """One route of the member check with bending for one segment.

    Attributes
    ----------
    segment, name : the segment (0-based from the base) and its name
    standard : "EN 1993-1-1" or "AISC 360"
    key : :data:`MEMBER`, :data:`SECOND_ORDER` or :data:`DIRECT`
    title : what the route is, in a few words
    why : why the route is allowed and which moments it takes, in plain words
    N_Ed : design compression [N]
    moments : the moments taken, per axis
    checks : the kernel checks of the route (6.3.3; or 6.2 and 6.3.2; or H1.1), in order
    utilisation : the route's utilisation (the largest of its checks) [-]
    governing : the equation that gives it, e.g. "(6.61)"
    section : the classification used
    M_cr : elastic critical moment [N m] (inf: not susceptible)
    M_cr_source : where M_cr comes from, in words
    governs : whether this route gives the segment's largest utilisation
    notes : remarks (assumptions, labels "from memory")
    """

    segment: int
    name: str
    standard: str
    key: str
    title: str
    why: str
    N_Ed: float
    moments: tuple[MomentUsed, ...]
    checks: tuple[BendingCheck, ...]
    utilisation: float
    governing: str
    section: "SectionClass | None"
    M_cr: float
    M_cr_source: str
    governs: bool = False
    notes: tuple[str, ...] = ()

    @property
    def passed(self) -> bool:
        return bool(self.utilisation <= 1.0)


@dataclass(frozen=True)
class BendingResult:
    """The member checks with bending of a case by one standard.

    Attributes
    ----------
    standard : the standard
    covered : whether the standard's check with bending is implemented (:data:`fea.design.bending.BENDING_COVERED`)
    reason : what it covers, or why it is not
    options : the options used
    routes : every route of every segment checked
    actions : the analyses behind the moments, by route key
    planes : the planes whose sway sensitivity the routes with second-order moments cover
    unchecked : sentences for what could not be checked (each makes a passing member "not verified")
    notes : statements that apply to every route
    """

    standard: str
    covered: bool
    reason: str
    options: BendingOptions
    routes: tuple[BendingRoute, ...] = ()
    actions: Mapping[str, Any] = field(default_factory=dict)  # route key -> fea.design.actions.DesignActions
    planes: tuple[str, ...] = ()
    unchecked: tuple[str, ...] = ()
    notes: tuple[str, ...] = ()

    def __post_init__(self) -> None:
        object.__setattr__(self, "actions", MappingProxyType(dict(self.actions)))

    @property
    def governing(self) -> BendingRoute | None:
        """The route with the largest utilisation (None without routes)."""
        return max(self.routes, key=lambda r: r.utilisation) if self.routes else None

    @property
    def max_utilisation(self) -> float:
        g = self.governing
        return math.nan if g is None else g.utilisation

    @property
    def passed(self) -> bool:
        """Every route of every segment passes."""
        return all(r.passed for r in self.routes)
