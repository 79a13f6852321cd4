"""Design check of a member: every segment about every axis by one published method.

Pure kernel (SI floats, no I/O).  The slenderness of each segment and axis
comes from its finite-element critical axial force ``N_cr`` (the axial force
in the segment at the lowest critical state): the relative slenderness
``sqrt(A fy / N_cr)`` for EN 1993-1-1, ``Fe = N_cr / A`` for AISC 360 E3, and
the equivalent geometric slenderness ``L/r = pi sqrt(E A / N_cr)`` for the
methods written in ``L/r`` (AS 4100, BS 5950-1, Perry-Robertson,
Rankine-Gordon, working stress).  No effective-length factor enters the
check, so a segment whose K is flagged as not meaningful still gets a
resistance from its ``N_cr``, which is meaningful: it is the force in that
segment when the member as a whole buckles.

Design forces are the case loads multiplied by one ``load_factor`` (1.0 when
the case states none: the case loads are then taken as design loads).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import Any, Mapping, Sequence

from fea.design.bending_result import BendingOptions, BendingResult
from fea.design.standards import PASSES, UTILISATION, MemberData
from fea.design.standards import STANDARDS as RECORDS
from fea.design.sway import BUCKLES, SwayClass
from fea.errors import ModelError

__all__ = [
    "STANDARDS",
    "PARAMETERS",
    "DesignSpec",
    "MemberData",
    "SegmentForces",
    "AxisBuckling",
    "DesignCheck",
    "DesignResult",
    "compression_check",
    "tension_check",
    "design_check",
    "torsional_check",
    "TORSIONAL_AXIS",
]

#: Standards a case may name, with the parameters each takes and their defaults
#: (``None``: required).  Per-axis parameters also accept ``<name>_major`` and
#: ``<name>_minor``.  Each standard's record is in :mod:`fea.design.standards`.
PARAMETERS: dict[str, dict[str, Any]] = {name: dict(r.parameters) for name, r in RECORDS.items()}
STANDARDS: tuple[str, ...] = tuple(PARAMETERS)
#: Parameters that may differ between the major and minor axis.
PER_AXIS = {"curve", "alpha_b"}
#: Keys valid for every standard (per segment).
COMMON = {"A_net"}

#: Stand-in critical force for a segment the buckling mode does not compress:
#: large enough that every method returns its section (material) resistance.
_NO_BUCKLING = 1e300


#: How the load may reach a single angle (``[design] angle_load``).
ANGLE_LOADS = ("concentric", "one leg")


@dataclass(frozen=True)
class DesignSpec:
    """The design method a case declares.

    Attributes
    ----------
    standard : one of :data:`STANDARDS`
    parameters : the standard's parameters for all segments (SI; defaults filled in)
    overrides : segment index (0-based) -> parameters that replace the common ones
    load_factor : multiplies every case load to give the design forces [-]
    angle_load : how the load reaches a single angle: "concentric" (at its centroid, e.g. through both legs or
        a cap plate), "one leg" (through one leg), or "" when not said (see :data:`ANGLE_LOADS`)
    bending : the options of the member checks with bending (interaction factors, chi_LT, bow, curve_LT,
        section class; :class:`fea.design.bending_result.BendingOptions`)
    """

    standard: str
    parameters: Mapping[str, Any]
    overrides: Mapping[int, Mapping[str, Any]] = field(default_factory=dict)
    load_factor: float = 1.0
    angle_load: str = ""
    bending: BendingOptions = field(default_factory=BendingOptions)

    def __post_init__(self) -> None:
        if self.standard not in PARAMETERS:
            raise ModelError("design.standard", f"{self.standard!r} is not known; expected one of "
                                                f"{', '.join(STANDARDS)}")
        if not (math.isfinite(self.load_factor) and self.load_factor > 0):
            raise ModelError("design.load_factor", f"{self.load_factor!r} must be a positive number")
        if self.angle_load not in ("",) + ANGLE_LOADS:
            raise ModelError("design.angle_load", f"{self.angle_load!r}: expected one of "
                                                  f"{', '.join(repr(a) for a in ANGLE_LOADS)}")
        object.__setattr__(self, "parameters", MappingProxyType(dict(self.parameters)))
        object.__setattr__(self, "overrides", MappingProxyType(
            {int(k): MappingProxyType(dict(v)) for k, v in self.overrides.items()}))

    def for_segment(self, index: int) -> dict[str, Any]:
        """Parameters of segment ``index`` (0-based): common ones updated by its override."""
        out = dict(self.parameters)
        out.update(self.overrides.get(index, {}))
        return out


@dataclass(frozen=True)
class SegmentForces:
    """Axial forces of a segment at load factor 1 [N]: the largest compression
    (>= 0) and the largest tension (>= 0) anywhere along it."""

    compression: float
    tension: float


@dataclass(frozen=True)
class AxisBuckling:
    """Finite-element buckling figures of one segment about one axis.

    Attributes
    ----------
    N_cr : force in the segment at the lowest critical state [N] (<= 0: not in compression)
    effective_length_factor : K or None
    meaningful : whether K is meaningful (see :class:`fea.results.SegmentBuckling`)
    note : why K is not meaningful, or ""
    """

    N_cr: float
    effective_length_factor: float | None
    meaningful: bool
    note: str = ""


@dataclass(frozen=True)
class DesignCheck:
    """One check: a segment in compression about one axis, or in tension.

    Attributes
    ----------
    segment : index from the base (0-based)
    name : segment name
    axis : "major", "minor", "in-plane", or "-" for tension
    kind : "compression" or "tension"
    standard, clause, formula : what was used
    parameter : the curve or constant, e.g. "curve b", "a = 1/7500"
    slenderness : the slenderness the method uses [-] (NaN for tension)
    slenderness_name : "lambda_bar", "Lc/r", "le/r", "L_E/r" or "L/r"
    reduction : reduction factor (chi, Fcr/Fy, alpha_c, pc/py, ...) [-]
    N_cr : critical axial force [N] (NaN for tension)
    N_Ed : design axial force (compression or tension, >= 0) [N]
    resistance : design resistance [N]
    utilisation : N_Ed / resistance [-]
    governs : what limits the resistance ("buckling", "material", "gross", "net", ...)
    effective_length_factor, k_meaningful : from the buckling analysis
    note : remarks
    details : further intermediate values and the inputs substituted (name -> float)
    labels : textual choices of the method (name -> str): the curve, the design method, the branch
        of a formula that applied
    """

    segment: int
    name: str
    axis: str
    kind: str
    standard: str
    clause: str
    formula: str
    parameter: str
    slenderness: float
    slenderness_name: str
    reduction: float
    N_cr: float
    N_Ed: float
    resistance: float
    utilisation: float
    governs: str
    effective_length_factor: float | None = None
    k_meaningful: bool = True
    note: str = ""
    details: Mapping[str, float] = field(default_factory=dict)
    labels: Mapping[str, str] = field(default_factory=dict)

    @property
    def passed(self) -> bool:
        return PASSES(utilisation=self.utilisation)


@dataclass(frozen=True)
class DesignResult:
    """All checks of a member by one standard.

    Attributes
    ----------
    standard : the standard used
    load_factor : factor applied to the case loads to give the design forces [-]
    checks : every check, segment by segment (compression per axis, then tension)
    notes : statements that apply to the whole check
    sway : per plane, the sway sensitivity (:func:`fea.design.sway.classify_sway`); empty when not classified
    unchecked : ways the member may fail that these checks do not cover (plain sentences, each naming the
        segment and the missing check); any makes a passing member "not verified"
    bending : the member checks with bending (None when the case needs none: no bending action and no
        sway-sensitive plane; also for the axial-only candidates of sizing)
    """

    standard: str
    load_factor: float
    checks: tuple[DesignCheck, ...]
    notes: tuple[str, ...] = ()
    sway: tuple[SwayClass, ...] = ()
    unchecked: tuple[str, ...] = ()
    bending: BendingResult | None = None

    @property
    def governing(self) -> DesignCheck:
        """The check with the largest utilisation."""
        return max(self.checks, key=lambda c: c.utilisation)

    @property
    def max_utilisation(self) -> float:
        return self.governing.utilisation

    @property
    def passed(self) -> bool:
        """Whether every check passes (the axial checks only; see :attr:`verdict`)."""
        return all(c.passed for c in self.checks)

    @property
    def bending_passed(self) -> bool:
        """Whether every member check with bending that was made passes (True when none was made)."""
        return self.bending is None or self.bending.passed

    @property
    def overall(self) -> tuple[str, float]:
        """The largest utilisation of every check, axial and with bending, and what gives it in words."""
        g = self.governing
        where = ("in tension" if g.kind == "tension" else "in flexural-torsional buckling" if g.axis == TORSIONAL_AXIS
                 else f"about the {g.axis} axis")
        best = (f"segment {g.segment + 1} ({g.name}) {where}", g.utilisation)
        b = self.bending.governing if self.bending is not None else None
        if b is not None and b.utilisation > best[1]:
            best = (f"segment {b.segment + 1} ({b.name}) with bending, {b.title}: {b.governing}", b.utilisation)
        return best

    @property
    def verdict(self) -> str:
        """"passes", "fails" (a check fails, a member check with bending fails, or a plane buckles below the
        design loads) or "not verified" (every check passes but a plane's sway sensitivity says the axial check
        alone is not enough and no member check with its second-order moments covers it, or the member may fail
        in a way the checks do not cover: :attr:`unchecked`)."""
        # a plane buckling below the design loads, or below the case loads (alpha_cr x load factor < 1), fails
        if not self.passed or not self.bending_passed or any(
                s.classification == BUCKLES or s.alpha_cr * self.load_factor < 1.0 for s in self.sway):
            return "fails"
        if any(not s.axial_check_enough and not s.covered_by for s in self.sway) or self.unchecked:
            return "not verified"
        return "passes"


# ---------------------------------------------------------------------------
# one compression check


def compression_check(standard: str, params: Mapping[str, Any], axis: str, m: MemberData,
                      N_cr: float, N_Ed: float) -> dict[str, Any]:
    """Resistance of a segment in compression about one axis.

    Parameters
    ----------
    standard : one of :data:`STANDARDS`
    params : the standard's parameters for this segment
    axis : "major", "minor" or "in-plane" (selects per-axis curves)
    m : section and material data
    N_cr : critical axial force of the segment about this axis [N], > 0
    N_Ed : design compression [N], >= 0

    Returns
    -------
    dict with clause, parameter, slenderness, slenderness_name, reduction,
    resistance, governs, details and labels (the fields of :class:`DesignCheck`).
    ``details`` carries every number a written-out calculation substitutes
    (the inputs A, fy, E and factors as well as the intermediate values).

    References
    ----------
    The records of :mod:`fea.design.standards`: EN 1993-1-1 6.3.1; AISC 360 E3;
    AS 4100 6.3.3; BS 5950-1:2000 Annex C; Perry-Robertson; Rankine-Gordon.
    """
    record = RECORDS[standard]
    if record.needs_fy and m.fy is None:
        raise ModelError(f"segment[{m.name}].fy", f"missing: {standard} needs the yield strength fy")
    return record.compression(params, axis, m, N_cr, N_Ed)


def tension_check(standard: str, params: Mapping[str, Any], m: MemberData) -> dict[str, Any]:
    """Tension resistance of a segment: gross section, and net section when ``A_net`` is given.

    References
    ----------
    * EN 1993-1-1 6.2.3(2): ``min(A fy / gamma_M0, 0.9 A_net fu / gamma_M2)``.
    * AISC 360 D2 (from memory): yielding ``Fy Ag`` (phi 0.90, Omega 1.67),
      rupture ``Fu Ae`` (phi 0.75, Omega 2.00); here ``Ae = A_net`` (shear lag
      factor U = 1 assumed).
    * AS 4100 7.2 (from memory): ``phi min(Ag fy, 0.85 kt An fu)``, phi = 0.9, kt = 1 assumed.
    * BS 5950-1 4.6.1 (from memory): ``py Ae``; here ``Ae = A_net`` (factor Ke
      taken as 1, conservative) or A.
    * Perry-Robertson, Rankine-Gordon: yield (or crushing) stress times the
      area, divided by the factor of safety; working stress: the allowable
      stress times the area (tension allowable taken equal to the compressive one).
    """
    A, fu = m.A, m.fu
    A_net = params.get("A_net")
    if A_net is not None and not 0 < A_net <= A:
        raise ModelError(f"design.A_net ({m.name})", f"{A_net:g} m^2 must be positive and not above A = {A:g} m^2")
    if A_net is not None and fu is None and standard in ("EN 1993-1-1", "AISC 360", "AS 4100"):
        raise ModelError("material.fu", f"missing: the net-section check of {standard} needs fu")
    # the numbers a written-out calculation substitutes (A_net and fu only with a net section)
    base: dict[str, float] = {"A_m2": A}
    if A_net is not None:
        base["A_net_m2"] = A_net
        if fu is not None:
            base["fu_Pa"] = fu
    return RECORDS[standard].tension(params, m, A_net, base)


# ---------------------------------------------------------------------------


def design_check(spec: DesignSpec, members: Sequence[MemberData], forces: Sequence[SegmentForces],
                 buckling: Sequence[tuple[str, Sequence[AxisBuckling]]]) -> DesignResult:
    """Check every segment about every axis, and in tension where it is pulled.

    Parameters
    ----------
    spec : the design method
    members : per segment, base upward
    forces : per segment, axial forces at load factor 1 (multiplied by ``spec.load_factor``)
    buckling : per axis, (axis name, per segment :class:`AxisBuckling`)

    Returns
    -------
    DesignResult
    """
    lf = spec.load_factor
    checks: list[DesignCheck] = []
    notes = [f"design forces = case loads x {lf:g} (load factor)" if lf != 1.0 else
             "design forces = the case loads at load factor 1 (the case loads are taken as design loads)",
             "slenderness from the finite-element critical axial force N_cr of each segment and axis, "
             "not from a tabulated effective length"]
    for i, (m, f) in enumerate(zip(members, forces)):
        params = spec.for_segment(i)
        N_c = lf * f.compression
        if N_c > 0:
            for axis, segs in buckling:
                b = segs[i]
                note = ""
                if not b.meaningful and b.effective_length_factor is not None:
                    note = (f"K not meaningful ({b.note}); resistance from this segment's N_cr, "
                            "which is meaningful")
                if b.N_cr <= 0:
                    # compressed at the design loads but not at the critical state: the
                    # buckling mode does not load it; only the section limit applies
                    out = compression_check(spec.standard, params, axis, m, _NO_BUCKLING, N_c)
                    note = "not in compression at the critical state: section resistance only"
                    N_cr = math.nan
                else:
                    out = compression_check(spec.standard, params, axis, m, b.N_cr, N_c)
                    N_cr = b.N_cr
                checks.append(DesignCheck(
                    segment=i, name=m.name, axis=axis, kind="compression", standard=spec.standard,
                    clause=out["clause"], formula=RECORDS[spec.standard].formula, parameter=out["parameter"],
                    slenderness=out["slenderness"], slenderness_name=out["slenderness_name"],
                    reduction=out["reduction"], N_cr=N_cr, N_Ed=N_c, resistance=out["resistance"],
                    utilisation=UTILISATION(N_Ed_N=N_c, resistance_N=out["resistance"]), governs=out["governs"],
                    effective_length_factor=b.effective_length_factor, k_meaningful=b.meaningful, note=note,
                    details=MappingProxyType(out["details"]), labels=MappingProxyType(out.get("labels", {}))))
        N_t = lf * f.tension
        if N_t > 0:
            out = tension_check(spec.standard, params, m)
            checks.append(DesignCheck(
                segment=i, name=m.name, axis="-", kind="tension", standard=spec.standard, clause=out["clause"],
                formula=out["formula"], parameter=out["parameter"], slenderness=math.nan, slenderness_name="",
                reduction=1.0, N_cr=math.nan, N_Ed=N_t, resistance=out["resistance"],
                utilisation=UTILISATION(N_Ed_N=N_t, resistance_N=out["resistance"]), governs=out["governs"],
                details=MappingProxyType(out.get("details", {})), labels=MappingProxyType(out.get("labels", {}))))
    if not checks:
        raise ModelError("load", "no segment carries axial force: nothing to design")
    return DesignResult(standard=spec.standard, load_factor=lf, checks=tuple(checks), notes=tuple(notes))


#: The axis label of the compression check on the flexural-torsional critical force of the thin-walled analysis.
TORSIONAL_AXIS = "torsional"

#: What each standard does with a flexural-torsional (or torsional) critical force, as the check states it.
TORSIONAL_METHOD = {
    "EN 1993-1-1": ("EN 1993-1-1 6.3.1.4: lambda_T = sqrt(A fy / N_cr,TF) with N_cr,TF from the thin-walled "
                    "analysis, then 6.3.1.2 with the buckling curve of the z-z (minor) axis (from memory)"),
    "AISC 360": ("AISC 360 E4: Fe = N_cr,TF / A with N_cr,TF from the thin-walled analysis, then the Fcr formula "
                 "of E3 (from memory)"),
}


def torsional_check(spec: DesignSpec, index: int, m: MemberData, N_cr: float, N_Ed: float, kind: str) -> DesignCheck:
    """The compression check of segment ``index`` on its flexural-torsional critical force ``N_cr`` [N] (the axial
    force in it at the lowest mode of the thin-walled analysis, of kind ``kind``), about the axis label
    :data:`TORSIONAL_AXIS`: the standard's own compression formula with its minor-axis curve (EN 1993-1-1
    6.3.1.4, AISC 360 E4; the other standards by their minor-axis curve, from memory)."""
    params = spec.for_segment(index)
    out = compression_check(spec.standard, params, "minor", m, N_cr, N_Ed)
    method = TORSIONAL_METHOD.get(spec.standard, f"{spec.standard}: the critical force from the thin-walled "
                                                 "analysis with the minor-axis curve (from memory)")
    clause = method.split(":")[0] + f"; {out['clause']}"
    return DesignCheck(
        segment=index, name=m.name, axis=TORSIONAL_AXIS, kind="compression", standard=spec.standard, clause=clause,
        formula=RECORDS[spec.standard].formula, parameter=out["parameter"], slenderness=out["slenderness"],
        slenderness_name=out["slenderness_name"], reduction=out["reduction"], N_cr=N_cr, N_Ed=N_Ed,
        resistance=out["resistance"], utilisation=UTILISATION(N_Ed_N=N_Ed, resistance_N=out["resistance"]),
        governs=out["governs"], effective_length_factor=None, k_meaningful=False,
        note=f"N_cr of the {kind} mode of the thin-walled analysis, below the planar ones; {method}",
        details=MappingProxyType(out["details"]), labels=MappingProxyType(out.get("labels", {})))
