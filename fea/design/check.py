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

from fea.design.curves import (
    aisc360_e3,
    as4100_compression,
    bs5950_compression,
    en1993_buckling,
    en1993_tension,
    equivalent_slenderness,
    perry_robertson,
    rankine_gordon,
    working_stress,
)
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
]

#: Standards a case may name, with the parameters each takes and their defaults
#: (``None``: required).  Per-axis parameters also accept ``<name>_major`` and
#: ``<name>_minor``.
PARAMETERS: dict[str, dict[str, Any]] = {
    "EN 1993-1-1": {"curve": None, "gamma_M0": 1.0, "gamma_M1": 1.0, "gamma_M2": 1.25},
    "AISC 360": {"method": "LRFD"},
    "AS 4100": {"alpha_b": None, "kf": 1.0, "phi": 0.9},
    "BS 5950-1": {"curve": None},
    "Perry-Robertson": {"coefficient": 0.003, "factor_of_safety": 1.0},
    "Rankine-Gordon": {"a": None, "crushing_stress": None, "factor_of_safety": 1.0},
    "working-stress": {"factor_of_safety": None, "sigma_allow": None},
}
STANDARDS: tuple[str, ...] = tuple(PARAMETERS)
#: Parameters that may differ between the major and minor axis.
PER_AXIS = {"curve", "alpha_b"}
#: Keys valid for every standard (per segment).
COMMON = {"A_net"}

#: Stand-in critical force for a segment the buckling mode does not compress:
#: large enough that every method returns its section (material) resistance.
_NO_BUCKLING = 1e300

_FORMULAS = {
    "EN 1993-1-1": "N_b,Rd = chi A fy / gamma_M1 <= A fy / gamma_M0, lambda_bar = sqrt(A fy / N_cr)",
    "AISC 360": "Pn = Fcr Ag, Fcr = 0.658^(Fy/Fe) Fy or 0.877 Fe, Fe = N_cr / Ag",
    "AS 4100": "phi Nc = phi alpha_c kf A fy, le/r = pi sqrt(E A / N_cr)",
    "BS 5950-1": "Pc = pc A (Perry-Robertson, Robertson constant), lambda = pi sqrt(E A / N_cr), py = fy",
    "Perry-Robertson": "N = s A / FoS, (fy - s)(sigma_e - s) = c (L/r) s sigma_e, L/r = pi sqrt(E A / N_cr)",
    "Rankine-Gordon": "N = fc A / (1 + a (L/r)^2) / FoS, L/r = pi sqrt(E A / N_cr)",
    "working-stress": "N = A min(sigma_allow, (N_cr / A) / FoS)",
}


@dataclass(frozen=True)
class DesignSpec:
    """The design method a case declares.

    Attributes
    ----------
    standard : one of :data:`STANDARDS`
    parameters : the standard's parameters for all segments (SI; defaults filled in)
    overrides : segment index (0-based) -> parameters that replace the common ones
    load_factor : multiplies every case load to give the design forces [-]
    """

    standard: str
    parameters: Mapping[str, Any]
    overrides: Mapping[int, Mapping[str, Any]] = field(default_factory=dict)
    load_factor: float = 1.0

    def __post_init__(self) -> None:
        if self.standard not in PARAMETERS:
            raise ModelError("design.standard", f"{self.standard!r} is not known; expected one of "
                                                f"{', '.join(STANDARDS)}")
        if not (math.isfinite(self.load_factor) and self.load_factor > 0):
            raise ModelError("design.load_factor", f"{self.load_factor!r} must be a positive number")
        object.__setattr__(self, "parameters", MappingProxyType(dict(self.parameters)))
        object.__setattr__(self, "overrides", MappingProxyType(
            {int(k): MappingProxyType(dict(v)) for k, v in self.overrides.items()}))

    def for_segment(self, index: int) -> dict[str, Any]:
        """Parameters of segment ``index`` (0-based): common ones updated by its override."""
        out = dict(self.parameters)
        out.update(self.overrides.get(index, {}))
        return out


def _axis_value(params: Mapping[str, Any], name: str, axis: str) -> Any:
    v = params.get(f"{name}_{axis}")
    return params.get(name) if v is None else v


@dataclass(frozen=True)
class MemberData:
    """Section and material data of one segment for the design check (SI).

    Attributes
    ----------
    name : segment name
    A : gross area [m^2]
    fy : yield strength [Pa] (None where the method does not need it)
    E : elastic modulus [Pa]
    length : [m]
    fu : ultimate strength [Pa] or None
    sigma_allow : material allowable stress [Pa] or None
    """

    name: str
    A: float
    fy: float | None
    E: float
    length: float
    fu: float | None = None
    sigma_allow: float | None = None


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
        return self.utilisation <= 1.0


@dataclass(frozen=True)
class DesignResult:
    """All checks of a member by one standard.

    Attributes
    ----------
    standard : the standard used
    load_factor : factor applied to the case loads to give the design forces [-]
    checks : every check, segment by segment (compression per axis, then tension)
    notes : statements that apply to the whole check
    """

    standard: str
    load_factor: float
    checks: tuple[DesignCheck, ...]
    notes: tuple[str, ...] = ()

    @property
    def governing(self) -> DesignCheck:
        """The check with the largest utilisation."""
        return max(self.checks, key=lambda c: c.utilisation)

    @property
    def max_utilisation(self) -> float:
        return self.governing.utilisation

    @property
    def passed(self) -> bool:
        return all(c.passed for c in self.checks)


# ---------------------------------------------------------------------------
# one compression check


def _need(params: Mapping[str, Any], name: str, standard: str) -> Any:
    v = params.get(name)
    if v is None:
        raise ModelError(f"design.{name}", f"missing: {standard} needs {name}")
    return v


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
    The functions of :mod:`fea.design.curves`: EN 1993-1-1 6.3.1; AISC 360 E3;
    AS 4100 6.3.3; BS 5950-1:2000 Annex C; Perry-Robertson; Rankine-Gordon.
    """
    A, E, fy = m.A, m.E, m.fy
    if standard in ("EN 1993-1-1", "AISC 360", "AS 4100", "BS 5950-1", "Perry-Robertson") and fy is None:
        raise ModelError(f"segment[{m.name}].fy", f"missing: {standard} needs the yield strength fy")
    if standard == "EN 1993-1-1":
        curve = _axis_value(params, "curve", axis)
        if curve is None:
            raise ModelError(f"design.curve_{axis}", "missing: EN 1993-1-1 needs a buckling curve (a0, a, b, c, d)")
        r = en1993_buckling(A, fy, N_cr, curve, params["gamma_M1"])
        N_c = A * fy / params["gamma_M0"]
        res = min(r.N_b_Rd, N_c)
        return dict(clause=r.clause, parameter=f"curve {curve} (alpha = {r.alpha:g}), gamma_M1 = {r.gamma_M1:g}",
                    slenderness=r.lambda_bar, slenderness_name="lambda_bar", reduction=r.chi, resistance=res,
                    governs="buckling" if r.N_b_Rd < N_c else "material",
                    details={"alpha": r.alpha, "phi": r.phi, "N_pl_N": r.N_pl, "N_c_Rd_N": N_c,
                             "A_m2": A, "fy_Pa": fy, "gamma_M0": params["gamma_M0"], "gamma_M1": r.gamma_M1,
                             "N_b_Rd_N": r.N_b_Rd},
                    labels={"curve": curve, "branch": "plateau" if r.lambda_bar <= 0.2 else "curve"})
    if standard == "AISC 360":
        r = aisc360_e3(A, fy, N_cr=N_cr, E=E)
        method = params["method"]
        res = r.phi_Pn if method == "LRFD" else r.Pn_over_omega
        label = f"LRFD phi_c = {r.phi_c:g}" if method == "LRFD" else f"ASD Omega_c = {r.omega_c:g}"
        return dict(clause=r.clause, parameter=label, slenderness=r.slenderness, slenderness_name="Lc/r",
                    reduction=r.reduction, resistance=res,
                    governs="buckling" if r.reduction < 1.0 else "material",
                    details={"Fe_Pa": r.Fe, "Fy_over_Fe": r.ratio, "Fcr_Pa": r.Fcr, "Pn_N": r.Pn,
                             "A_m2": A, "Fy_Pa": fy, "E_Pa": E, "phi_c": r.phi_c, "Omega_c": r.omega_c},
                    labels={"method": method, "equation": r.clause.rsplit("(", 1)[-1].rstrip(")"),
                            "branch": "inelastic" if r.ratio <= 2.25 else "elastic"})
    if standard == "AS 4100":
        alpha_b = _axis_value(params, "alpha_b", axis)
        if alpha_b is None:
            raise ModelError(f"design.alpha_b_{axis}", "missing: AS 4100 needs the member section constant alpha_b")
        r = as4100_compression(A, fy, alpha_b, N_cr=N_cr, E=E, kf=params["kf"], phi=params["phi"])
        return dict(clause=r.clause, parameter=f"alpha_b = {r.alpha_b:g}, kf = {r.kf:g}, phi = {r.phi:g}",
                    slenderness=r.le_r, slenderness_name="le/r", reduction=r.alpha_c, resistance=r.phi_Nc,
                    governs="buckling" if r.alpha_c < 1.0 else "material",
                    details={"lambda_n": r.lambda_n, "alpha_a": r.alpha_a, "lambda": r.lambda_, "eta": r.eta,
                             "Ns_N": r.Ns, "Nc_N": r.Nc, "A_m2": A, "fy_Pa": fy, "E_Pa": E, "kf": r.kf,
                             "alpha_b": r.alpha_b, "xi": r.xi, "phi": r.phi},
                    labels={"branch": "plateau" if r.lambda_ <= 13.5 else "curve"})
    if standard == "BS 5950-1":
        curve = _axis_value(params, "curve", axis)
        if curve is None:
            raise ModelError(f"design.curve_{axis}", "missing: BS 5950-1 needs a strut curve (a, b, c, d)")
        r = bs5950_compression(fy, curve, N_cr=N_cr, A=A, E=E)
        return dict(clause=r.clause, parameter=f"strut curve {curve} (Robertson a = {r.a:g}), py = fy",
                    slenderness=r.slenderness, slenderness_name="L_E/r", reduction=r.reduction,
                    resistance=r.force, governs="buckling" if r.reduction < 1.0 else "material",
                    details={"pc_Pa": r.pc, "pE_Pa": r.pE, "lambda0": r.lambda0, "eta": r.eta, "A_m2": A,
                             "py_Pa": fy, "E_Pa": E, "a": r.a, "phi_Pa": r.phi},
                    labels={"curve": curve})
    lam = equivalent_slenderness(A, N_cr, E)
    if standard == "Perry-Robertson":
        fos = params["factor_of_safety"]
        r = perry_robertson(fy, E, lam, params["coefficient"])
        return dict(clause=r.clause, parameter=f"eta = {r.coefficient:g} L/r, FoS = {fos:g}", slenderness=lam,
                    slenderness_name="L/r", reduction=r.reduction, resistance=r.stress * A / fos,
                    governs="buckling" if r.reduction < 1.0 else "material",
                    details={"eta": r.eta, "sigma_e_Pa": r.sigma_e, "stress_Pa": r.stress, "A_m2": A,
                             "fy_Pa": fy, "E_Pa": E, "coefficient": r.coefficient, "factor_of_safety": fos,
                             # B of the closed form s = fy sigma_e / (B + sqrt(B^2 - fy sigma_e))
                             "B_Pa": 0.5 * (fy + (1.0 + r.eta) * r.sigma_e)})
    if standard == "Rankine-Gordon":
        fos = params["factor_of_safety"]
        fc = params.get("crushing_stress") or fy
        if fc is None:
            raise ModelError("design.crushing_stress", "missing: Rankine-Gordon needs a crushing stress "
                                                       "(or the material's fy)")
        a = _need(params, "a", standard)
        r = rankine_gordon(fc, lam, a)
        return dict(clause=r.clause, parameter=f"a = 1/{1.0 / r.a:.6g}, FoS = {fos:g}", slenderness=lam,
                    slenderness_name="L/r", reduction=r.reduction, resistance=r.stress * A / fos,
                    governs="buckling" if r.reduction < 1.0 else "material",
                    details={"crushing_stress_Pa": fc, "stress_Pa": r.stress, "A_m2": A, "E_Pa": E, "a": r.a,
                             "a_inverse": 1.0 / r.a, "factor_of_safety": fos})
    if standard == "working-stress":
        sa = params.get("sigma_allow") or m.sigma_allow
        if sa is None:
            raise ModelError("material.sigma_allow", "missing: the working-stress check needs the material's "
                                                     "allowable stress sigma_allow")
        r = working_stress(A, N_cr, sa, _need(params, "factor_of_safety", standard))
        return dict(clause=r.clause, parameter=f"FoS = {r.factor_of_safety:g}, sigma_allow = {sa / 1e6:.4g} MPa",
                    slenderness=lam, slenderness_name="L/r", reduction=r.reduction, resistance=r.force,
                    governs=r.governs, details={"sigma_cr_Pa": r.sigma_cr, "allowable_stress_Pa": r.stress,
                                                "A_m2": A, "E_Pa": E, "sigma_allow_Pa": sa,
                                                "factor_of_safety": r.factor_of_safety,
                                                "buckling_stress_Pa": r.sigma_cr / r.factor_of_safety})
    raise ModelError("design.standard", f"{standard!r} is not known")  # pragma: no cover - checked by DesignSpec


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
    A, fy, fu = m.A, m.fy, m.fu
    A_net = params.get("A_net")
    if A_net is not None and not 0 < A_net <= A:
        raise ModelError(f"design.A_net ({m.name})", f"{A_net:g} m^2 must be positive and not above A = {A:g} m^2")
    if A_net is not None and fu is None and standard in ("EN 1993-1-1", "AISC 360", "AS 4100"):
        raise ModelError("material.fu", f"missing: the net-section check of {standard} needs fu")
    An = A if A_net is None else A_net
    # the numbers a written-out calculation substitutes (A_net and fu only with a net section)
    base: dict[str, float] = {"A_m2": A}
    if A_net is not None:
        base["A_net_m2"] = A_net
        if fu is not None:
            base["fu_Pa"] = fu
    if standard == "EN 1993-1-1":
        r = en1993_tension(A, fy, A_net=A_net, fu=fu if A_net is not None else None,
                           gamma_M0=params["gamma_M0"], gamma_M2=params["gamma_M2"])
        return dict(clause=r.clause, formula="N_t,Rd = min(A fy / gamma_M0, 0.9 A_net fu / gamma_M2)",
                    parameter=f"gamma_M0 = {r.gamma_M0:g}, gamma_M2 = {r.gamma_M2:g}", resistance=r.N_t_Rd,
                    governs=r.governs, details={**base, "fy_Pa": fy, "gamma_M0": r.gamma_M0,
                                                "gamma_M2": r.gamma_M2, "N_pl_Rd_N": r.N_pl_Rd,
                                                "N_u_Rd_N": r.N_u_Rd})
    if standard == "AISC 360":
        lrfd = params["method"] == "LRFD"
        y = fy * A * (0.90 if lrfd else 1 / 1.67)
        u = fu * An * (0.75 if lrfd else 1 / 2.00) if A_net is not None else math.inf
        factors = ({"phi_t_yield": 0.90, "phi_t_rupture": 0.75} if lrfd else
                   {"Omega_t_yield": 1.67, "Omega_t_rupture": 2.00})
        return dict(clause="AISC 360 D2", formula="min(Fy Ag, Fu Ae) with phi_t / Omega_t, Ae = A_net (U = 1)",
                    parameter="LRFD" if lrfd else "ASD", resistance=min(y, u), governs="gross" if y <= u else "net",
                    details={**base, "Fy_Pa": fy, **factors, "yield_N": y, "rupture_N": u},
                    labels={"method": "LRFD" if lrfd else "ASD"})
    if standard == "AS 4100":
        y = fy * A
        u = 0.85 * An * fu if A_net is not None else math.inf
        return dict(clause="AS 4100 7.2", formula="phi Nt = phi min(Ag fy, 0.85 kt An fu), kt = 1",
                    parameter=f"phi = {params['phi']:g}", resistance=params["phi"] * min(y, u),
                    governs="gross" if y <= u else "net",
                    details={**base, "fy_Pa": fy, "phi": params["phi"], "yield_N": y, "rupture_N": u})
    if standard == "BS 5950-1":
        return dict(clause="BS 5950-1 4.6.1", formula="Pt = py Ae, Ae = A_net (Ke = 1) or A",
                    parameter="py = fy", resistance=fy * An, governs="net" if A_net is not None else "gross",
                    details={**base, "py_Pa": fy})
    if standard in ("Perry-Robertson", "Rankine-Gordon"):
        f = params.get("crushing_stress") or fy
        if f is None:
            raise ModelError("material.fy", f"missing: the tension check of {standard} needs fy")
        fos = params["factor_of_safety"]
        return dict(clause="yield of the section", formula="N = f A / FoS (A_net when given)",
                    parameter=f"FoS = {fos:g}", resistance=f * An / fos,
                    governs="net" if A_net is not None else "gross",
                    details={**base, "stress_Pa": f, "factor_of_safety": fos})
    sa = params.get("sigma_allow") or m.sigma_allow
    if sa is None:
        raise ModelError("material.sigma_allow", "missing: the working-stress check needs sigma_allow")
    return dict(clause="working stress in tension", formula="N = sigma_allow A (A_net when given)",
                parameter=f"sigma_allow = {sa / 1e6:.4g} MPa", resistance=sa * An,
                governs="net" if A_net is not None else "gross", details={**base, "sigma_allow_Pa": sa})


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
                    clause=out["clause"], formula=_FORMULAS[spec.standard], parameter=out["parameter"],
                    slenderness=out["slenderness"], slenderness_name=out["slenderness_name"],
                    reduction=out["reduction"], N_cr=N_cr, N_Ed=N_c, resistance=out["resistance"],
                    utilisation=N_c / out["resistance"], governs=out["governs"],
                    effective_length_factor=b.effective_length_factor, k_meaningful=b.meaningful, note=note,
                    details=MappingProxyType(out["details"]), labels=MappingProxyType(out.get("labels", {}))))
        N_t = lf * f.tension
        if N_t > 0:
            out = tension_check(spec.standard, params, m)
            checks.append(DesignCheck(
                segment=i, name=m.name, axis="-", kind="tension", standard=spec.standard, clause=out["clause"],
                formula=out["formula"], parameter=out["parameter"], slenderness=math.nan, slenderness_name="",
                reduction=1.0, N_cr=math.nan, N_Ed=N_t, resistance=out["resistance"],
                utilisation=N_t / out["resistance"], governs=out["governs"],
                details=MappingProxyType(out.get("details", {})), labels=MappingProxyType(out.get("labels", {}))))
    if not checks:
        raise ModelError("load", "no segment carries axial force: nothing to design")
    return DesignResult(standard=spec.standard, load_factor=lf, checks=tuple(checks), notes=tuple(notes))
