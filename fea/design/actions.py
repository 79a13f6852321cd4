"""Design actions of a column with bending: N_Ed and first- and second-order moments, plane by plane (no I/O).

For every bending plane of a case and every segment this engine gives

* ``N_Ed``: the largest design compression of the segment (:func:`fea.design.forces.segment_forces` times the
  load factor);
* ``actions``: the moment diagram of the case's lateral actions alone (eccentricity moments of the [[load]]
  tables, lateral forces and loads per height, applied moments) at the design loads, from a first-order
  analysis of the same restrained column with no axial force (P = 0);
* ``first_order``: the first-order diagram of those actions together with the chosen standard's imperfections
  as equivalent loads (sway forces or notional loads, and the bow's ``N w0`` effect), without the P-delta
  effect of the deflections;
* ``second_order``: the second-order diagram of the same at the design loads (small-deflection theory,
  :func:`fea.solve.second_order.second_order`: exact beam-column theory on refined Hermite elements, with
  its own estimate of the discretisation error);
* end moments, ``psi = M_small / M_large`` (signed), the largest ``|M|`` and its height, and the amplification
  ``max|M_II| / max|M_I|``.

Every load of the case, permanent or variable, is multiplied by the load factor (as the design check does,
:class:`fea.design.check.DesignSpec`), and the analysis runs at that single state: the critical load factor
of the analysed model is then the ``alpha_cr`` of the design loads scaled together.  The imperfections act in
the direction that gives the larger second-order moment, chosen segment by segment among the sign
combinations of sway and bow (the response is linear in the actions and the bow at a fixed axial force).

Moments carry the sign of :mod:`fea.solve.second_order` (``EI (w - w0)'' = -M``): a column bowed towards
``+w`` under compression has ``M > 0``.  ``psi`` is the ratio of the two end moments *as signed diagram
values*: ``psi = +1`` is a uniform moment (single curvature), ``psi = -1`` equal end moments bending the
segment in double curvature (the convention of EN 1993-1-1 Annex A/B; AISC's ``M1/M2`` is ``-psi``).

Imperfections (``ActionsOptions``; clauses in :data:`CLAUSES`)
-------------------------------------------------------------
EN 1993-1-1:2005
    ``bow="table-5.1"`` (default): in a plane that can sway (:func:`fea.design.forces.sways`), the sway
    imperfection ``phi = phi_0 alpha_h alpha_m`` (5.3.2(3)a), eq. (5.5)) as equivalent horizontal forces
    ``phi V`` at every height where a vertical load ``V`` enters (5.3.2(7)); leaning loads count, their
    columns leaning by ``phi`` too; and in every plane a bow ``e_0 = L / ratio`` of Table 5.1 (elastic
    analysis, by the plane's buckling curve) as a half-sine between consecutive laterally supported stations
    and the column ends, alternating in direction from one interval to the next.
    ``bow="5.3.2(11)"``: the unique imperfection in the shape of the plane's lowest buckling mode with the
    amplitude of eqs. (5.9) and (5.10); it covers sway and bow, so no sway force is added.  With this shape
    the second-order moment at the critical section is exactly ``N e_0 / (1 - N/N_cr)`` for any supports,
    so the cross-section check at the critical section reproduces ``chi N_Rk / gamma_M1`` (the identity of
    5.3.2(11); ``tests/test_design_actions.py``).
    ``bow="none"``: the sway forces only (the actions of the member check of 6.3 with amplified sway
    moments, 5.2.2(3)b)).
AISC 360-16 Chapter C, direct analysis (from memory)
    Notional loads ``N_i = 0.002 alpha Y_i`` at every height where gravity load enters, in planes that can
    sway (C2.2b); every flexural stiffness ``0.8 tau_b EI`` with ``tau_b = 1`` for ``alpha P_r / P_ns <= 0.5``,
    else ``4 (alpha P_r/P_ns)(1 - alpha P_r/P_ns)`` (C2.3), segment by segment, and every other stiffness that
    contributes to stability (springs, foundations, shear stiffness) times 0.8; or ``tau_b = 1`` with an
    additional notional load ``0.001 alpha Y_i`` (C2.3(c)).  ``alpha = 1.0`` (LRFD) or 1.6 (ASD; the analysis
    runs at 1.6 times the loads and its moments are divided by 1.6).  The axial stiffness ``0.8 EA`` does not
    enter: the column is axially rigid in this analysis.  Member out-of-straightness is left to the column
    curve with K = 1 (no bow).
``"none"``
    No imperfection and no stiffness reduction (the other standards of the tool).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from types import MappingProxyType
from typing import TYPE_CHECKING, Any, Mapping, Sequence

import numpy as np

from ..errors import ModelError
from ..model import STATION_TOL, Column, Restraint
from ..model.column import MIN_MAGNITUDE
from ..model.imperfection import (
    Imperfection,
    LateralActions,
    LateralDistributedLoad,
    LateralPointLoad,
    SegmentSection,
)
from ..solve.bowed_mesh import segment_of_elements
from ..solve.second_order import second_order
from ..util.numbers import readonly
from .forces import segment_forces, sways
from .standards.en1993 import EN1993_IMPERFECTION, en1993_chi

if TYPE_CHECKING:
    from ..model.case import Case
    from ..results import BucklingResult

__all__ = ["EN", "AISC", "NONE", "STANDARDS", "EN_BOWS", "EN_BOW_RATIO", "CLAUSES", "ActionsOptions",
           "MomentDiagram", "ImperfectionUsed", "SegmentActions", "PlaneActions", "DesignActions",
           "en_sway", "aisc_tau_b", "en_equivalent_bow", "case_sections", "plane_actions", "design_actions"]

EN, AISC, NONE = "EN 1993-1-1", "AISC 360", "none"
#: The standards whose imperfections the engine applies ("none": none, and no stiffness reduction).
STANDARDS = (EN, AISC, NONE)
#: EN 1993-1-1 member imperfection: Table 5.1 bow with the sway imperfection, the unique mode-shaped
#: imperfection of 5.3.2(11), or no bow (sway imperfection only).
EN_BOWS = ("table-5.1", "5.3.2(11)", "none")

#: EN 1993-1-1:2005 Table 5.1, elastic analysis: ``L / e_0`` of the initial bow by buckling curve (the values of
#: the table as reproduced in the ECCS design manual, Simoes da Silva, Simoes and Gervasio, *Design of Steel
#: Structures*, Table 2.20).  The analysis here is elastic, so the plastic-analysis column does not apply.
EN_BOW_RATIO: Mapping[str, float] = MappingProxyType({"a0": 350.0, "a": 300.0, "b": 250.0, "c": 200.0, "d": 150.0})
#: EN 1993-1-1 5.3.2(3)a): basic sway imperfection phi_0 (from memory).
EN_PHI_0 = 1.0 / 200.0
#: AISC 360-16 C2.2b(1): notional load ratio; C2.3(c): the additional ratio with tau_b = 1 (from memory).
AISC_NOTIONAL = 0.002
AISC_NOTIONAL_EXTRA = 0.001
#: AISC 360-16 C2.3(a): factor on every stiffness that contributes to stability (from memory).
AISC_STIFFNESS = 0.8
#: AISC 360-16 C2.3: alpha of the LRFD and ASD load combinations (from memory).
AISC_ALPHA: Mapping[str, float] = MappingProxyType({"LRFD": 1.0, "ASD": 1.6})

CLAUSES: Mapping[str, str] = MappingProxyType({
    "sway": "EN 1993-1-1 5.3.2(3)a) eq. (5.5), as equivalent horizontal forces 5.3.2(7) (from memory)",
    "bow": "EN 1993-1-1 5.3.2(3)b) Table 5.1, elastic analysis",
    "mode": "EN 1993-1-1 5.3.2(11) eqs. (5.9) and (5.10) (from memory)",
    "notional": "AISC 360-16 C2.2b notional loads N_i = 0.002 alpha Y_i (from memory)",
    "notional_extra": "AISC 360-16 C2.2b and C2.3(c): N_i = (0.002 + 0.001) alpha Y_i with tau_b = 1 (from memory)",
    "stiffness": "AISC 360-16 C2.3 reduced stiffness 0.8 tau_b EI (from memory)",
})

#: Spring [N/m] that marks a free column end as an end of the bow's half-sine (``"between-restraints"`` bows
#: run a quarter-sine to a free end otherwise).  It is the smallest magnitude the model accepts: added to a
#: stiffness term of any real column it changes nothing in double precision.
MARKER_SPRING = MIN_MAGNITUDE
#: End moments smaller than this share of the plane's largest |M| count as zero for psi: the moment recovered at
#: a pinned end is zero only to the round-off of the solve, which reaches about 1e-6 of the largest moment on
#: the finest meshes.
SNAP = 1e-5
#: Largest relative tolerance handed to the second-order solver (it requires < 0.01).
MAX_TOL = 5e-3


# ---------------------------------------------------------------------------------------------- options


@dataclass(frozen=True)
class ActionsOptions:
    """What the design actions include.

    Attributes
    ----------
    standard : one of :data:`STANDARDS`
    load_factor : multiplies every case load (axial, leaning, lateral) to give the design loads [-]
    bow : EN 1993-1-1 only, one of :data:`EN_BOWS` (default ``"table-5.1"``); ``"none"`` otherwise
    sway : apply the sway imperfection (EN) or the notional loads (AISC) in planes that can sway
    curves : buckling curve per plane (``"major"``, ``"minor"``, ``"in-plane"``): one curve for every segment
        or one per segment (None where a segment has none); EN bows only
    gamma_M1 : EN 1993-1-1 partial factor in eq. (5.10) [-]
    moment_resistance : ``M_Rk`` of eq. (5.10): ``"elastic"`` (``W_el fy``, the smaller extreme fibre) or
        ``"plastic"`` (``W_pl fy``; needs a section by shape)
    columns_in_row : ``m`` of EN 1993-1-1 5.3.2(3) (columns carrying at least half the average load) [-]
    method : AISC ``"LRFD"`` (alpha = 1.0) or ``"ASD"`` (alpha = 1.6)
    tau_b : AISC ``"computed"`` (C2.3(b)) or ``"one"`` (tau_b = 1 with the extra notional load of C2.3(c))
    """

    standard: str = EN
    load_factor: float = 1.0
    bow: str | None = None
    sway: bool = True
    curves: Mapping[str, Any] = field(default_factory=dict)
    gamma_M1: float = 1.0
    moment_resistance: str = "elastic"
    columns_in_row: int = 1
    method: str = "LRFD"
    tau_b: str = "computed"

    def __post_init__(self) -> None:
        if self.standard not in STANDARDS:
            raise ModelError("actions.standard", f"{self.standard!r} is not known; expected one of "
                                                 f"{', '.join(STANDARDS)}")
        if not (isinstance(self.load_factor, (int, float)) and math.isfinite(self.load_factor)
                and self.load_factor > 0):
            raise ModelError("design.load_factor", f"{self.load_factor!r} must be a positive number")
        bow = self.bow if self.bow is not None else ("table-5.1" if self.standard == EN else "none")
        if self.standard == EN and bow not in EN_BOWS:
            raise ModelError("actions.bow", f"{bow!r} is not an EN 1993-1-1 member imperfection; expected one of "
                                            f"{', '.join(EN_BOWS)}")
        if self.standard != EN and bow != "none":
            raise ModelError("actions.bow", f"{bow!r}: bows are applied with EN 1993-1-1 only; {self.standard} "
                                            "takes none here")
        object.__setattr__(self, "bow", bow)
        if not (math.isfinite(self.gamma_M1) and self.gamma_M1 > 0):
            raise ModelError("design.gamma_M1", f"{self.gamma_M1!r} must be a positive number")
        if self.moment_resistance not in ("elastic", "plastic"):
            raise ModelError("actions.moment_resistance", f"{self.moment_resistance!r}: expected 'elastic' or "
                                                          "'plastic'")
        if isinstance(self.columns_in_row, bool) or not isinstance(self.columns_in_row, int) \
                or self.columns_in_row < 1:
            raise ModelError("actions.columns_in_row", f"{self.columns_in_row!r}: expected a whole number >= 1")
        if self.method not in AISC_ALPHA:
            raise ModelError("actions.method", f"{self.method!r}: expected 'LRFD' or 'ASD'")
        if self.tau_b not in ("computed", "one"):
            raise ModelError("actions.tau_b", f"{self.tau_b!r}: expected 'computed' or 'one'")
        curves = {}
        for axis, v in dict(self.curves).items():
            vs = (v,) if isinstance(v, str) or v is None else tuple(v)
            for c in vs:
                if c is not None and c not in EN1993_IMPERFECTION:
                    raise ModelError(f"design.curve_{axis}", f"{c!r} is not a buckling curve; expected one of "
                                                             f"{', '.join(EN1993_IMPERFECTION)}")
            curves[axis] = v if isinstance(v, str) or v is None else tuple(v)
        object.__setattr__(self, "curves", MappingProxyType(curves))

    @property
    def alpha(self) -> float:
        """AISC alpha (1.0 LRFD, 1.6 ASD); 1 for the other standards [-]."""
        return AISC_ALPHA[self.method] if self.standard == AISC else 1.0

    @classmethod
    def for_case(cls, case: Case, spec: Any = None, **changes: Any) -> "ActionsOptions":
        """The options a case's ``[design]`` (or ``spec``, a :class:`fea.design.check.DesignSpec`) implies:
        its standard (EN 1993-1-1, AISC 360, else ``"none"``), load factor, gamma_M1 and the buckling curve of
        every segment in every plane; ``changes`` replace any of them."""
        from .standards.record import axis_value

        spec = spec if spec is not None else case.extras.get("design")
        kw: dict[str, Any] = {}
        if spec is not None:
            std = spec.standard if spec.standard in (EN, AISC) else NONE
            kw.update(standard=std, load_factor=spec.load_factor)
            if std == EN:
                kw["gamma_M1"] = float(spec.parameters.get("gamma_M1", 1.0))
                kw["curves"] = {axis: tuple(axis_value(spec.for_segment(i), "curve", axis)
                                            for i in range(len(case.segments))) for axis, _ in case.planes}
        else:
            kw["standard"] = NONE
        kw.update(changes)
        return cls(**kw)


# ---------------------------------------------------------------------------------------------- records


@dataclass(frozen=True)
class MomentDiagram:
    """A bending-moment diagram along the column or one segment (sign: module notes).

    Attributes
    ----------
    x : (n,) heights of the element ends, bottom then top of each element, so that a jump at a loaded
        station shows [m] (read-only)
    M : (n,) bending moment at those points [N m] (read-only)
    max_abs : largest |M| [N m]
    at : height of the largest |M| [m]
    bottom, top : moment at the lower and the upper end [N m]
    psi : ``M_small / M_large`` of the end moments, signed (-1 to 1); 0 when the smaller end moment is zero,
        None when both are (values below ``SNAP`` times the plane's largest |M| count as zero)
    """

    x: np.ndarray
    M: np.ndarray
    max_abs: float
    at: float
    bottom: float
    top: float
    psi: float | None


@dataclass(frozen=True)
class ImperfectionUsed:
    """The imperfections of one analysis.

    Attributes
    ----------
    kind : ``"sway and bow"``, ``"bow"``, ``"sway"``, ``"mode"`` (EN 5.3.2(11)), ``"notional loads"`` or
        ``"none"``
    sway : sway imperfection phi (EN) or notional-load ratio N_i / Y_i (AISC, alpha included) [-]; 0 without
    bow : largest bow offset [m]; 0 without
    bow_shape : how the bow runs along the column ("" without one)
    clause : the clauses applied (with their "from memory" labels)
    direction : the signs of sway and bow that gave the larger second-order moment ("+w" or "-w" each)
    details : the numbers behind them (phi_0, alpha_h, alpha_m, L/e0, lambda_bar, chi, e0, N_cr, ...)
    labels : textual choices (curve, critical segment, modulus)
    """

    kind: str
    sway: float
    bow: float
    bow_shape: str
    clause: str
    direction: str = ""
    details: Mapping[str, float] = field(default_factory=dict)
    labels: Mapping[str, str] = field(default_factory=dict)

    @property
    def amplitude(self) -> float:
        """The bow offset [m] (the sway is :attr:`sway`)."""
        return self.bow


@dataclass(frozen=True)
class SegmentActions:
    """Design actions of one segment in one plane.

    Attributes
    ----------
    segment, name, axis : which segment (0-based, from the base) and plane
    N_Ed : largest design compression in the segment [N] (>= 0)
    N_Ed_tension : largest design tension [N] (>= 0)
    actions : first-order diagram of the lateral actions alone, no axial-force effect
    first_order : first-order diagram of the actions and the imperfections as equivalent loads; None when the
        design loads reach the elastic critical load
    second_order : second-order diagram at the design loads; None likewise
    amplification : ``second_order.max_abs / first_order.max_abs`` (1 when both are zero, inf without a
        second-order answer) [-]
    imperfection : the imperfections, with the direction chosen for this segment
    alpha_cr : elastic critical load factor of the plane on the design loads [-]
    stiffness_factor : factor on the segment's EI in the analysis (AISC 0.8 tau_b; else 1) [-]
    tau_b : AISC tau_b of the segment, None for the other standards [-]
    converged, message, discretisation_error : accuracy of the analysis that gave these diagrams
    """

    segment: int
    name: str
    axis: str
    N_Ed: float
    N_Ed_tension: float
    actions: MomentDiagram
    first_order: MomentDiagram | None
    second_order: MomentDiagram | None
    amplification: float
    imperfection: ImperfectionUsed
    alpha_cr: float
    stiffness_factor: float
    tau_b: float | None
    converged: bool
    message: str
    discretisation_error: float


@dataclass(frozen=True)
class PlaneActions:
    """Design actions of one bending plane.

    Attributes
    ----------
    axis : the plane
    sways : whether the plane can sway (:func:`fea.design.forces.sways`): sway imperfections apply
    alpha_cr : elastic critical load factor on the design loads: the buckling result's over the load factor
        when given (the sway classification's value), else the analysed model's [-]
    critical_load_factor : the analysed model's, on the design loads scaled together (AISC: with the reduced
        stiffness) [-]
    imperfection : the imperfections of the analysis that gives the plane's largest second-order moment
    actions, first_order, second_order : diagrams of the whole column (the latter two from that analysis;
        None when the design loads reach the critical load)
    amplification : ratio of the largest |M| of ``second_order`` and ``first_order`` [-]
    segments : per segment, base upward
    converged : every analysis met the tolerance
    message : plain-language accuracy statement (or why there is no second-order answer)
    discretisation_error : largest estimated relative error of the analyses [-]
    n_elements : elements of the finest mesh used
    notes : remarks (imperfections left out and why, clauses that would allow less)
    """

    axis: str
    sways: bool
    alpha_cr: float
    critical_load_factor: float
    imperfection: ImperfectionUsed
    actions: MomentDiagram
    first_order: MomentDiagram | None
    second_order: MomentDiagram | None
    amplification: float
    segments: tuple[SegmentActions, ...]
    converged: bool
    message: str
    discretisation_error: float
    n_elements: int
    notes: tuple[str, ...] = ()


@dataclass(frozen=True)
class DesignActions:
    """Design actions of a case: one :class:`PlaneActions` per bending plane, in the case's order."""

    standard: str
    load_factor: float
    bow: str
    planes: tuple[PlaneActions, ...]
    notes: tuple[str, ...] = ()

    @property
    def converged(self) -> bool:
        return all(p.converged for p in self.planes)

    @property
    def message(self) -> str:
        return "; ".join(f"{p.axis}: {p.message}" for p in self.planes)

    def plane(self, axis: str) -> PlaneActions:
        for p in self.planes:
            if p.axis == axis:
                return p
        raise KeyError(axis)


# ---------------------------------------------------------------------------------------------- formulas


def en_sway(height: float, columns_in_row: int = 1) -> dict[str, float]:
    """EN 1993-1-1 5.3.2(3)a) eq. (5.5): ``phi = phi_0 alpha_h alpha_m`` (from memory).

    ``phi_0 = 1/200``; ``alpha_h = 2 / sqrt(h)``, ``2/3 <= alpha_h <= 1``, h the height of the structure [m];
    ``alpha_m = sqrt(0.5 (1 + 1/m))``, m the number of columns in a row.
    """
    alpha_h = min(max(2.0 / math.sqrt(height), 2.0 / 3.0), 1.0)
    alpha_m = math.sqrt(0.5 * (1.0 + 1.0 / columns_in_row))
    return {"phi": EN_PHI_0 * alpha_h * alpha_m, "phi_0": EN_PHI_0, "alpha_h": alpha_h, "alpha_m": alpha_m,
            "h_m": height, "m": float(columns_in_row)}


def aisc_tau_b(P_r: float, P_ns: float, alpha: float = 1.0) -> float:
    """AISC 360-16 C2.3(b) (from memory): ``tau_b = 1`` for ``alpha P_r / P_ns <= 0.5``, else
    ``4 (alpha P_r / P_ns)(1 - alpha P_r / P_ns)`` (0 or less when the section yields under the axial force)."""
    x = alpha * P_r / P_ns
    return 1.0 if x <= 0.5 else 4.0 * x * (1.0 - x)


def en_equivalent_bow(lambda_bar: float, curve: str, M_Rk: float, N_Rk: float, gamma_M1: float = 1.0
                      ) -> dict[str, float]:
    """EN 1993-1-1 5.3.2(11) eq. (5.10) (from memory):
    ``e_0 = alpha (lambda_bar - 0.2) (M_Rk / N_Rk) (1 - chi lambda_bar^2 / gamma_M1) / (1 - chi lambda_bar^2)``
    for ``lambda_bar > 0.2`` (0 otherwise), chi of 6.3.1.2 on the same curve.  Returns e0 [m] with alpha and chi.
    """
    c = en1993_chi(lambda_bar, curve)
    if lambda_bar <= 0.2:
        e0 = 0.0
    else:
        cl2 = c.chi * lambda_bar**2
        e0 = c.alpha * (lambda_bar - 0.2) * M_Rk / N_Rk * (1.0 - cl2 / gamma_M1) / (1.0 - cl2)
    return {"e0": e0, "alpha": c.alpha, "lambda_bar": lambda_bar, "chi": c.chi, "M_Rk": M_Rk, "N_Rk": N_Rk,
            "gamma_M1": gamma_M1}


# ---------------------------------------------------------------------------------------------- model variants


def _design_column(column: Column, factor: float, ei_factors: Sequence[float] | None = None,
                   other: float = 1.0) -> Column:
    """``column`` with every load times ``factor`` (all variable, so load factor 1 is the design state), segment
    EI times ``ei_factors`` and every other finite stiffness (springs, foundations, shear) times ``other``."""
    def soft(v: float) -> float:
        w = v * other
        return v if (math.isinf(v) or v == 0.0 or w < MIN_MAGNITUDE) else w

    segs = column.segments
    if ei_factors is not None:
        segs = tuple(replace(s, E=s.E * f, S=None if s.S is None else s.S * other) for s, f in zip(segs, ei_factors))
    return replace(
        column, segments=segs,
        restraints=tuple(replace(r, lateral=soft(r.lateral), rotation=soft(r.rotation)) for r in column.restraints),
        foundations=tuple(replace(f, k_bottom=f.k_bottom * other, k_top=None if f.k_top is None else f.k_top * other)
                          for f in column.foundations),
        point_loads=tuple(replace(p, P=p.P * factor, permanent=False) for p in column.point_loads),
        distributed_loads=tuple(replace(d, q=d.q * factor, permanent=False) for d in column.distributed_loads),
        leaning_loads=tuple(replace(lean, P=lean.P * factor, permanent=False) for lean in column.leaning_loads))


def _scaled(actions: LateralActions, factor: float) -> LateralActions:
    """Every lateral action times ``factor``, all variable."""
    return LateralActions(
        point=tuple(replace(p, force=p.force * factor, permanent=False) for p in actions.point),
        distributed=tuple(replace(d, q_bottom=d.q_bottom * factor,
                                  q_top=None if d.q_top is None else d.q_top * factor, permanent=False)
                          for d in actions.distributed),
        moments=tuple(replace(m, moment=m.moment * factor, permanent=False) for m in actions.moments))


def _joined(a: LateralActions, b: LateralActions) -> LateralActions:
    return LateralActions(a.point + b.point, a.distributed + b.distributed, a.moments + b.moments)


def _gravity_forces(column: Column, ratio: float) -> LateralActions:
    """Lateral forces ``ratio V`` wherever the (design) column takes vertical load V: point loads, axial loads
    per height and leaning loads (EN 5.3.2(7) equivalent sway forces; AISC C2.2b notional loads)."""
    return LateralActions(
        point=tuple(LateralPointLoad(p.at, ratio * p.P) for p in column.point_loads if p.P)
        + tuple(LateralPointLoad(lean.at, ratio * lean.P) for lean in column.leaning_loads if lean.P),
        distributed=tuple(LateralDistributedLoad(d.bottom, d.top, ratio * d.q) for d in column.distributed_loads
                          if d.q))


def _with_end_marks(column: Column) -> Column:
    """``column`` with a :data:`MARKER_SPRING` at each end that has no lateral support, so that a
    ``"between-restraints"`` bow is a half-sine up to that end (no stiffness in double precision)."""
    H = column.height
    tol = STATION_TOL * H
    extra = tuple(Restraint(x, MARKER_SPRING, 0.0) for x in (0.0, H)
                  if not any(abs(r.at - x) <= tol and r.lateral > 0 for r in column.restraints))
    return replace(column, restraints=column.restraints + extra) if extra else column


def _vertical(column: Column) -> float:
    """Total vertical load of a column, leaning loads included [N]."""
    return (math.fsum(p.P for p in column.point_loads) + math.fsum(d.q * (d.top - d.bottom)
                                                                   for d in column.distributed_loads)
            + math.fsum(lean.P for lean in column.leaning_loads))


def _horizontal(actions: LateralActions) -> float:
    """Resultant of the lateral forces and loads per height [N]."""
    return (math.fsum(p.force for p in actions.point)
            + math.fsum(0.5 * (d.q_bottom + (d.q_bottom if d.q_top is None else d.q_top)) * (d.top - d.bottom)
                        for d in actions.distributed))


# ---------------------------------------------------------------------------------------------- analyses


@dataclass(frozen=True)
class _Run:
    ends: np.ndarray    # (2 n_el,) element-end heights [m]
    M2: np.ndarray      # (2 n_el,) second-order moment [N m]
    M1: np.ndarray      # (2 n_el,) first-order moment with the imperfections as loads [N m]
    seg: np.ndarray     # (2 n_el,) segment index of every element end
    lam_cr: float
    error: float
    converged: bool
    n_el: int
    sway: int
    bow: int


def _analyse(column: Column, segments_of: Column, imperfection: Imperfection | None, actions: LateralActions,
             sway: int, bow: int, tol: float) -> _Run:
    """Second-order run at load factor 1 with the actions and the bow; ``bow = -1`` reverses the bow by
    reversing the actions and the result (the response is linear in both)."""
    acts = actions if bow > 0 else _scaled(actions, -1.0)
    r = second_order(column, imperfection, acts, load_factors=[1.0], tol=tol)
    seg = np.repeat(segment_of_elements(segments_of, r.heights), 2)
    return _Run(ends=r.end_heights, M2=bow * r.moment[0], M1=bow * r.first_order_moment[0], seg=seg,
                lam_cr=float(r.critical_load_factor), error=float(r.discretisation_error),
                converged=bool(r.converged), n_el=int(r.n_elements), sway=sway, bow=bow)


def _first_order(column: Column, segments_of: Column, actions: LateralActions, tol: float) -> _Run:
    """First-order run of the lateral actions on the column with no axial load (P = 0)."""
    bare = replace(column, point_loads=(), distributed_loads=(), leaning_loads=())
    r = second_order(bare, None, actions, load_factors=[1.0], tol=tol)
    seg = np.repeat(segment_of_elements(segments_of, r.heights), 2)
    return _Run(ends=r.end_heights, M2=r.moment[0], M1=r.first_order_moment[0], seg=seg, lam_cr=math.inf,
                error=float(r.discretisation_error), converged=bool(r.converged), n_el=int(r.n_elements),
                sway=1, bow=1)


def _diagram(x: np.ndarray, M: np.ndarray, scale: float) -> MomentDiagram:
    """A diagram of element-end values (``scale``: the plane's largest |M|, for zero end moments)."""
    k = int(np.argmax(np.abs(M))) if M.size else 0
    tiny = SNAP * scale
    b = 0.0 if abs(M[0]) <= tiny else float(M[0])
    t = 0.0 if abs(M[-1]) <= tiny else float(M[-1])
    large, small = (b, t) if abs(b) >= abs(t) else (t, b)
    psi = None if large == 0.0 else small / large + 0.0  # + 0.0: no negative zero
    return MomentDiagram(x=readonly(x), M=readonly(M), max_abs=float(np.abs(M[k])), at=float(x[k]),
                         bottom=float(M[0]), top=float(M[-1]), psi=psi)


def _segment_diagram(run: _Run, values: np.ndarray, i: int, scale: float) -> MomentDiagram:
    sel = run.seg == i
    return _diagram(run.ends[sel], values[sel], scale)


def _ratio(a: float, b: float) -> float:
    if b > 0:
        return a / b
    return 1.0 if a == 0 else math.inf


def _direction(imp_kind: str, sway: int, bow: int) -> str:
    parts = []
    if imp_kind in ("sway and bow", "sway", "notional loads"):
        parts.append(f"sway towards {'+' if sway > 0 else '-'}w")
    if imp_kind in ("sway and bow", "bow"):
        parts.append(f"bow towards {'+' if bow > 0 else '-'}w")
    if imp_kind == "mode":
        parts.append("mode as computed" if bow > 0 else "mode reversed")
    return ", ".join(parts)


def _curve_list(options: ActionsOptions, axis: str, n: int) -> tuple[str | None, ...]:
    v = options.curves.get(axis)
    if v is None and axis == "in-plane":
        v = options.curves.get("major")
    if v is None or isinstance(v, str):
        return (v,) * n
    if len(v) != n:
        raise ModelError(f"design.curve_{axis}", f"{len(v)} curves given for {n} segments")
    return tuple(v)


def _need_curve(curves: Sequence[str | None], i: int, axis: str, why: str) -> str:
    c = curves[i]
    if c is None:
        raise ModelError(f"design.curve_{axis}", f"missing: {why} needs the buckling curve of segment {i + 1} "
                                                 "(a0, a, b, c, d)")
    return c


def _need_section(sections: Sequence[SegmentSection | None] | None, i: int, why: str,
                  modulus: bool = False) -> tuple[float, float, float]:
    """(A [m^2], fy [Pa], W [m^3]; W NaN unless ``modulus``) of segment ``i``, or the error naming what is missing."""
    s = None if sections is None else sections[i]
    if s is None:
        raise ModelError(f"segment[{i + 1}].A", f"missing: {why} needs the area (A or a section)")
    if s.fy is None:
        raise ModelError(f"segment[{i + 1}].fy", f"missing: {why} needs the yield strength fy")
    if modulus and s.W is None:
        raise ModelError(f"segment[{i + 1}].section", f"missing: {why} needs the section modulus (a section by "
                                                      "shape and dimensions, or [imperfection] W)")
    return float(s.A), float(s.fy), float(s.W) if modulus and s.W is not None else math.nan


# ---------------------------------------------------------------------------------------------- one plane


def plane_actions(column: Column, lateral: LateralActions | None, options: ActionsOptions, *, axis: str = "",
                  sections: Sequence[SegmentSection | None] | None = None, alpha_cr: float | None = None,
                  names: Sequence[str] | None = None, tol: float = 1e-6) -> PlaneActions:
    """Design actions of one bending plane.

    Parameters
    ----------
    column : the plane's column at the case loads (load factor 1)
    lateral : the plane's lateral actions at the case loads (None: none)
    options : standard, load factor and imperfections
    axis : plane label ("major", "minor", "in-plane"): picks the buckling curve
    sections : per segment A, fy and the modulus W for ``M_Rk`` (None where unknown); needed by EN
        5.3.2(11) (A, fy, W) and by AISC's computed tau_b (A, fy)
    alpha_cr : the plane's critical load factor on the design loads, from its buckling result (reported; the
        analysed model's is used when None)
    names : segment names
    tol : relative tolerance of the second-order analyses (0 < tol < 0.01)

    Returns
    -------
    PlaneActions

    Raises
    ------
    ModelError
        Missing curve, area, yield strength or modulus for the chosen imperfection; a mechanism.
    """
    tol = min(float(tol), MAX_TOL)
    lateral = lateral or LateralActions()
    n = len(column.segments)
    names = tuple(names) if names is not None else tuple(s.name for s in column.segments)
    gamma, alpha = options.load_factor, options.alpha
    f = gamma * alpha  # the analysed loads over the case loads (AISC ASD: 1.6 times the design loads)
    forces = segment_forces(column)
    N_Ed = [gamma * s.compression for s in forces]
    N_t = [gamma * s.tension for s in forces]
    ctx = _Plane(column=column, names=names, axis=axis, sways=sways(column), N_Ed=N_Ed, N_t=N_t,
                 acts=_scaled(lateral, f), alpha=alpha, alpha_cr=alpha_cr, tol=tol, notes=[])
    ei, taus, other = _stiffness(options, N_Ed, sections)
    ctx.ei, ctx.taus = ei, taus
    if any(t is not None and t <= 0 for t in taus):
        i = next(k for k, t in enumerate(taus) if t is not None and t <= 0)
        ctx.design = _design_column(column, f, [AISC_STIFFNESS] * n, other)  # for the actions' own diagram
        return ctx.no_answer(ImperfectionUsed("none", 0.0, 0.0, "", CLAUSES["stiffness"]), math.nan,
                             f"alpha P_r / P_ns >= 1 in segment {i + 1}: its section yields under the axial force "
                             "alone (tau_b <= 0); there is no direct-analysis answer")
    ctx.design = _design_column(column, f, ei if options.standard == AISC else None, other)
    sway_loads, sway_value, details, clauses = _sway_imperfection(options, ctx)
    try:
        imp, imp_col, bow_value, bow_shape, bow_details, labels, bow_clauses = _bow(options, ctx, sections)
    except _Critical:
        return ctx.no_answer(ImperfectionUsed("mode", 0.0, 0.0, "", CLAUSES["mode"]), None, "")
    details.update(bow_details)
    clauses += bow_clauses
    has_sway = not sway_loads.empty
    has_bow = imp is not None and not imp.is_zero
    kind = "none"
    if options.standard == EN:
        kind = ("mode" if options.bow == "5.3.2(11)" and has_bow else
                "sway and bow" if has_sway and has_bow else "sway" if has_sway else "bow" if has_bow else "none")
    elif options.standard == AISC:
        kind = "notional loads" if has_sway else "none"
    base = ImperfectionUsed(kind=kind, sway=sway_value if has_sway else 0.0, bow=bow_value if has_bow else 0.0,
                            bow_shape=bow_shape if has_bow else "", clause="; ".join(clauses),
                            details=MappingProxyType(details), labels=MappingProxyType(labels))
    if options.standard == NONE:
        ctx.notes.append("no imperfection and no stiffness reduction applied")

    # the analyses: every sign combination of sway and bow (without lateral actions, reversing both gives the
    # mirror image, whose moments are the same in size: one sway sign is enough)
    runs: list[_Run] = []
    try:
        for s in ((1, -1) if has_sway and not ctx.acts.empty else (1,)):
            total = _joined(ctx.acts, _scaled(sway_loads, float(s))) if has_sway else ctx.acts
            for b in ((1, -1) if has_bow else (1,)):
                runs.append(_analyse(imp_col if has_bow else ctx.design, column, imp if has_bow else None, total,
                                     s, b, tol))
    except ModelError as exc:
        if exc.field != "load_factors":
            raise
        return ctx.no_answer(base, None, "")
    return ctx.answer(runs, base, kind)


@dataclass
class _Plane:
    """What the parts of :func:`plane_actions` share (mutable working state, not a result)."""

    column: Column
    names: tuple[str, ...]
    axis: str
    sways: bool
    N_Ed: list[float]
    N_t: list[float]
    acts: LateralActions
    alpha: float
    alpha_cr: float | None
    tol: float
    notes: list[str]
    design: Column | None = None
    ei: list[float] = field(default_factory=list)
    taus: list[float | None] = field(default_factory=list)

    @property
    def compressed(self) -> list[int]:
        return [i for i, N in enumerate(self.N_Ed) if N > 0]

    def answer(self, runs: Sequence[_Run], base: ImperfectionUsed, kind: str) -> PlaneActions:
        assert self.design is not None
        alpha = self.alpha
        lam_cr = runs[0].lam_cr * alpha  # on the design loads
        first = _first_order(self.design, self.column, self.acts, self.tol) if not self.acts.empty else None
        scale = max(float(np.abs(r.M2).max()) for r in runs) / alpha
        a_scale = float(np.abs(first.M2).max()) / alpha if first is not None else 0.0
        gov = max(runs, key=lambda r: float(np.abs(r.M2).max()))
        a_cr = self.alpha_cr if self.alpha_cr is not None else lam_cr
        segs = []
        for i in range(len(self.names)):
            best = max(runs, key=lambda r: float(np.abs(r.M2[r.seg == i]).max()))
            d2 = _segment_diagram(best, best.M2 / alpha, i, scale)
            d1 = _segment_diagram(best, best.M1 / alpha, i, scale)
            da = (_segment_diagram(first, first.M2 / alpha, i, a_scale) if first is not None
                  else _segment_diagram(best, 0.0 * best.M2, i, 0.0))
            segs.append(SegmentActions(
                segment=i, name=self.names[i], axis=self.axis, N_Ed=self.N_Ed[i], N_Ed_tension=self.N_t[i],
                actions=da, first_order=d1, second_order=d2, amplification=_ratio(d2.max_abs, d1.max_abs),
                imperfection=replace(base, direction=_direction(kind, best.sway, best.bow)), alpha_cr=a_cr,
                stiffness_factor=self.ei[i], tau_b=self.taus[i], converged=best.converged,
                message=_accuracy([best], self.tol), discretisation_error=best.error))
        every = list(runs) + ([first] if first is not None else [])
        whole2 = _diagram(gov.ends, gov.M2 / alpha, scale)
        whole1 = _diagram(gov.ends, gov.M1 / alpha, scale)
        whole_a = (_diagram(first.ends, first.M2 / alpha, a_scale) if first is not None
                   else _diagram(gov.ends, 0.0 * gov.M2, 0.0))
        return PlaneActions(
            axis=self.axis, sways=self.sways, alpha_cr=a_cr, critical_load_factor=lam_cr,
            imperfection=replace(base, direction=_direction(kind, gov.sway, gov.bow)), actions=whole_a,
            first_order=whole1, second_order=whole2, amplification=_ratio(whole2.max_abs, whole1.max_abs),
            segments=tuple(segs), converged=all(r.converged for r in every), message=_accuracy(every, self.tol),
            discretisation_error=max(r.error for r in every), n_elements=max(r.n_el for r in every),
            notes=tuple(self.notes))

    def no_answer(self, imperfection: ImperfectionUsed, lam_cr: float | None, why: str) -> PlaneActions:
        """The record when there is no second-order answer at the design loads (``lam_cr`` None: the analysed
        model's critical load factor is computed here)."""
        assert self.design is not None
        alpha = self.alpha
        lam = _critical(self.design, self.tol) * alpha if lam_cr is None else float(lam_cr)
        why = why or (f"the design loads reach the elastic critical load of the analysed model (critical load "
                      f"factor {lam:.4g} <= 1): no second-order equilibrium, the member fails")
        first = _first_order(self.design, self.column, self.acts, self.tol)
        a_scale = float(np.abs(first.M2).max()) / alpha
        a_cr = self.alpha_cr if self.alpha_cr is not None else lam
        segs = tuple(SegmentActions(
            segment=i, name=self.names[i], axis=self.axis, N_Ed=self.N_Ed[i], N_Ed_tension=self.N_t[i],
            actions=_segment_diagram(first, first.M2 / alpha, i, a_scale), first_order=None, second_order=None,
            amplification=math.inf, imperfection=imperfection, alpha_cr=a_cr, stiffness_factor=self.ei[i],
            tau_b=self.taus[i], converged=False, message=why, discretisation_error=math.nan)
            for i in range(len(self.names)))
        return PlaneActions(axis=self.axis, sways=self.sways, alpha_cr=a_cr, critical_load_factor=lam,
                            imperfection=imperfection, actions=_diagram(first.ends, first.M2 / alpha, a_scale),
                            first_order=None, second_order=None, amplification=math.inf, segments=segs,
                            converged=False, message=why, discretisation_error=math.nan, n_elements=first.n_el,
                            notes=tuple(self.notes))


def _stiffness(options: ActionsOptions, N_Ed: Sequence[float], sections
               ) -> tuple[list[float], list[float | None], float]:
    """Per segment the factor on EI and tau_b (AISC; else 1 and None), and the factor on the other stiffnesses."""
    n = len(N_Ed)
    if options.standard != AISC:
        return [1.0] * n, [None] * n, 1.0
    taus: list[float | None] = []
    for i in range(n):
        if options.tau_b == "one" or N_Ed[i] <= 0:
            taus.append(1.0)
        else:
            A, fy, _ = _need_section(sections, i, "the AISC stiffness reduction tau_b")
            taus.append(aisc_tau_b(N_Ed[i], A * fy, options.alpha))
    return [AISC_STIFFNESS * float(t) for t in taus if t is not None], taus, AISC_STIFFNESS


def _sway_imperfection(options: ActionsOptions, ctx: _Plane
                       ) -> tuple[LateralActions, float, dict[str, float], list[str]]:
    """The sway forces (unit sign, towards +w) with their ratio, details and clauses."""
    assert ctx.design is not None
    details: dict[str, float] = {}
    clauses: list[str] = []
    if options.standard == AISC:
        clauses.append(CLAUSES["stiffness"])
        details.update({f"tau_b[{i + 1}]": float(t) for i, t in enumerate(ctx.taus) if t is not None})
    if not options.sway or options.standard == NONE or (options.standard == EN and options.bow == "5.3.2(11)"):
        if options.sway and options.standard == EN and ctx.sways:
            ctx.notes.append("the mode-shaped imperfection of EN 1993-1-1 5.3.2(11) stands for sway and bow "
                             "together: no separate sway imperfection")
        return LateralActions(), 0.0, details, clauses
    if not ctx.sways:
        what = "sway imperfection" if options.standard == EN else "notional loads (they go into the supports)"
        ctx.notes.append(f"both column ends held against translation and no leaning load: no {what}")
        return LateralActions(), 0.0, details, clauses
    if options.standard == EN:
        sw = en_sway(ctx.column.height, options.columns_in_row)
        details.update(sw)
        clauses.insert(0, CLAUSES["sway"])
        H, V = abs(_horizontal(ctx.acts)), _vertical(ctx.design)
        if V > 0 and H >= 0.15 * V:
            ctx.notes.append(f"H_Ed = {H:.4g} N >= 0.15 V_Ed = {0.15 * V:.4g} N: EN 1993-1-1 5.3.2(4) would allow "
                             "the sway imperfection to be left out; it is included (conservative)")
        return _gravity_forces(ctx.design, sw["phi"]), sw["phi"], details, clauses
    ratio = AISC_NOTIONAL + (AISC_NOTIONAL_EXTRA if options.tau_b == "one" else 0.0)
    details.update(notional_ratio=ratio, alpha=options.alpha)
    clauses.insert(0, CLAUSES["notional_extra" if options.tau_b == "one" else "notional"])
    ctx.notes.append("notional loads applied in this load combination whatever the ratio of second- to first-order "
                     "drift (AISC 360-16 C2.2b(4) would allow them in gravity-only combinations when that ratio is "
                     "at most 1.7; from memory)")
    # the analysed loads are already alpha times the design loads: N_i = 0.002 (alpha Y_i)
    return _gravity_forces(ctx.design, ratio), ratio * options.alpha, details, clauses


def _bow(options: ActionsOptions, ctx: _Plane, sections):
    """(imperfection, column to analyse it on, largest offset [m], shape, details, labels, clauses)."""
    assert ctx.design is not None
    design = ctx.design
    if options.standard != EN or options.bow == "none":
        return None, design, 0.0, "", {}, {}, []
    n = len(ctx.names)
    curves = _curve_list(options, ctx.axis, n)
    if not ctx.compressed:
        ctx.notes.append("no segment in compression: no bow")
        return None, design, 0.0, "", {}, {}, []
    if options.bow == "table-5.1":
        worst = min((_need_curve(curves, i, ctx.axis, "the Table 5.1 bow") for i in ctx.compressed),
                    key=lambda c: EN_BOW_RATIO[c])
        ratio = EN_BOW_RATIO[worst]
        marked = _with_end_marks(design)
        e0 = max(b - a for a, b in _spans(marked)) / ratio
        shape = ("half-sine between laterally supported stations and the column ends, alternating in direction "
                 "from one interval to the next")
        return (Imperfection("between-restraints", ratio=ratio), marked, e0, shape,
                {"L_over_e0": ratio, "e0": e0}, {"curve": worst}, [CLAUSES["bow"]])
    imp, details, labels = _mode_bow(design, ctx.column, ctx.compressed, ctx.N_Ed, sections, curves, ctx.axis,
                                     options, ctx.tol)
    if imp is None:
        ctx.notes.append(f"lambda_bar = {details['lambda_bar']:.3g} <= 0.2: eq. (5.10) gives no imperfection")
    return (imp, design, float(details["amplitude"]), "the plane's lowest elastic buckling mode", details, labels,
            [CLAUSES["mode"]])


def _spans(column: Column) -> list[tuple[float, float]]:
    """Intervals between consecutive laterally supported stations (the ends included)."""
    H = column.height
    tol = STATION_TOL * H
    pts = sorted({min(max(r.at, 0.0), H) for r in column.restraints if r.lateral > 0} | {0.0, H})
    merged = [pts[0]]
    for p in pts[1:]:
        if p - merged[-1] > tol:
            merged.append(p)
    return list(zip(merged[:-1], merged[1:]))


class _Critical(Exception):
    """The design loads reach the critical load of the analysed model."""


def _mode_bow(design: Column, column: Column, compressed: Sequence[int], N_Ed: Sequence[float], sections, curves,
              axis: str, options: ActionsOptions, tol: float):
    """The mode-shaped imperfection of EN 1993-1-1 5.3.2(11) (from memory), eqs. (5.9) and (5.10):
    ``eta_init = e_0 N_cr / (EI eta''_cr,max) eta_cr``.

    ``lambda_bar = sqrt(alpha_ult,k / alpha_cr)`` with ``alpha_ult,k = min N_Rk / N_Ed`` over the compressed
    segments (the critical cross-section is in the segment where that minimum occurs), ``N_cr = alpha_cr
    N_Ed`` of that segment, and ``EI eta''_cr,max`` the largest bending moment of the mode in that segment.
    The mode's moment on the analysis mesh is taken from a run with a unit mode-shaped bow: there
    ``M = lam / (lam_cr - lam) m`` exactly, ``m`` the moment of the mode at the critical state.
    """
    try:
        unit = second_order(design, Imperfection("mode", amplitude=1.0), None, load_factors=[1.0], tol=tol)
    except ModelError as exc:
        if exc.field != "load_factors":
            raise
        raise _Critical() from None
    lam_cr = float(unit.critical_load_factor)
    m = unit.moment[0] * (lam_cr - 1.0)
    seg = np.repeat(segment_of_elements(column, unit.heights), 2)
    why = "the EN 1993-1-1 5.3.2(11) imperfection"
    ult = {}
    for i in compressed:
        A, fy, _ = _need_section(sections, i, why, modulus=True)
        ult[i] = A * fy / N_Ed[i]
    c = min(ult, key=lambda i: ult[i])
    A, fy, W = _need_section(sections, c, why, modulus=True)
    curve = _need_curve(curves, c, axis, why)
    N_Rk = A * fy
    M_Rk = W * fy
    lam_cr_design = lam_cr * options.alpha  # f = gamma for EN: the analysed loads are the design loads
    lambda_bar = math.sqrt(ult[c] / lam_cr_design)
    eb = en_equivalent_bow(lambda_bar, curve, M_Rk, N_Rk, options.gamma_M1)
    N_cr = lam_cr_design * N_Ed[c]
    m_c = float(np.abs(m[seg == c]).max())
    if m_c <= 0:
        m_c = float(np.abs(m).max())
    amp = eb["e0"] * N_cr / m_c if m_c > 0 else 0.0
    details = dict(eb, N_cr=N_cr, N_Ed=N_Ed[c], EI_eta_max=m_c, amplitude=amp, alpha_ult_k=ult[c],
                   alpha_cr=lam_cr_design)
    labels = {"curve": curve, "critical segment": str(c + 1),
              "M_Rk": "W_el fy (elastic, smaller extreme fibre)" if options.moment_resistance == "elastic"
              else "W_pl fy (plastic)"}
    imp = Imperfection("mode", amplitude=amp) if amp > 0 else None
    return imp, details, labels


def _accuracy(runs: Sequence[_Run], tol: float) -> str:
    err = max(r.error for r in runs)
    n_el = max(r.n_el for r in runs)
    k = len(runs)
    what = f"{k} analyses" if k > 1 else "the analysis"
    if all(r.converged for r in runs):
        return (f"moments converged: estimated relative discretisation error {err:.1e} <= {tol:.0e} in {what} "
                f"(up to {n_el} elements)")
    return f"moments not converged: estimated relative discretisation error {err:.1e} > {tol:.0e} ({what})"


def _critical(design: Column, tol: float) -> float:
    """Lowest critical load factor of the (all-variable) design column, inf without compression."""
    from ..solve.eigen import buckling

    try:
        return float(buckling(design, n_modes=1, tol=tol).load_factor)
    except ModelError:
        return math.inf


# ---------------------------------------------------------------------------------------------- a case


def case_sections(case: Case, axis: str, resistance: str = "elastic") -> tuple[SegmentSection | None, ...]:
    """Per segment the area, yield strength and section modulus about the plane's bending axis (``"elastic"``:
    W_el of the smaller extreme fibre; ``"plastic"``: W_pl), from the section's shape, else from the area
    and ``[imperfection] W``; None where the area is unknown."""
    from ..solve.imperfect_case import imperfection_spec

    spec = imperfection_spec(case)
    ax = "major" if axis == "in-plane" else axis
    out: list[SegmentSection | None] = []
    for info in case.segments:
        W = None
        A = info.A
        if info.shape is not None:
            props = info.shape.properties()
            W = getattr(props, f"W_{'el' if resistance == 'elastic' else 'pl'}_{ax}")
            A = A if A is not None else props.area
        elif resistance == "elastic":
            W = spec.W.get(axis)
        out.append(None if A is None else SegmentSection(A=A, W=W, fy=info.fy))
    return tuple(out)


def design_actions(case: Case, buckling_results: Sequence[BucklingResult] | None = None,
                   options: ActionsOptions | None = None, **changes: Any) -> DesignActions:
    """Design actions of every bending plane of ``case``.

    Parameters
    ----------
    case : the parsed case; its lateral actions are those of ``[lateral]``, the [[load]] tables
        (eccentricities, lateral forces) and ``[imperfection]`` (:func:`fea.solve.imperfect_case.imperfection_spec`)
    buckling_results : one BucklingResult per plane (optional): ``alpha_cr`` is then the sway
        classification's ``load_factor / load_factor of the design``
    options : the standard and the imperfections; default :meth:`ActionsOptions.for_case` (the case's
        ``[design]``), with ``changes`` applied

    Returns
    -------
    DesignActions

    Raises
    ------
    CaseError
        A missing curve, area, yield strength or modulus the chosen imperfection needs (the message names the
        case-file field).
    """
    from ..solve.imperfect_case import as_case_error, imperfection_spec

    opts = options if options is not None else ActionsOptions.for_case(case, **changes)
    loads = imperfection_spec(case).loads
    planes = []
    for axis, col in case.planes:
        known = next((b for b in (buckling_results or ()) if b.axis == axis), None)
        a_cr = known.load_factor / opts.load_factor if known is not None else None
        sections = case_sections(case, axis, opts.moment_resistance)
        planes.append(as_case_error(plane_actions, col, loads.for_axis(axis), opts, axis=axis, sections=sections,
                                    alpha_cr=a_cr, names=[s.name for s in case.segments], tol=case.tolerance))
    notes = ("design loads = case loads x {:g} (load factor), every load, permanent or variable".format(
        opts.load_factor),)
    return DesignActions(standard=opts.standard, load_factor=opts.load_factor, bow=str(opts.bow),
                         planes=tuple(planes), notes=notes)

