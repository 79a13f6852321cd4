"""The working-stress rule for struts, as one record (common practice; pure functions, SI units)."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Mapping

from fea.errors import ModelError

from .record import MemberData, Standard, Step, equivalent_slenderness, need, positive

__all__ = ["WorkingStress", "working_stress", "WORKING_STRESS"]

NAME = "working-stress"
_F = "working stress"

STEPS = {
    "sigma_cr": Step("sigma_cr_Pa", "N_cr_N / A_m2", _F),
    "buckling": Step("buckling_stress_Pa", "sigma_cr_Pa / factor_of_safety", _F),
    "material_governs": Step("material", "sigma_allow_Pa <= buckling_stress_Pa", _F),
    "allowable": Step("allowable_stress_Pa", "min(sigma_allow_Pa, buckling_stress_Pa)", _F),
    "N_R": Step("resistance_N", "allowable_stress_Pa * A_m2", _F),
    # tension: the allowable stress over the section (A_net where given)
    "tension": Step("resistance_N", "sigma_allow_Pa * Ae", _F),
}


@dataclass(frozen=True, slots=True)
class WorkingStress:
    """Working-stress check of a strut.

    Attributes
    ----------
    clause : str
    sigma_cr : float
        Elastic critical stress N_cr / A [Pa].
    factor_of_safety : float
        Factor applied to sigma_cr [-].
    sigma_allow : float
        Material allowable stress [Pa].
    stress : float
        Allowable stress min(sigma_allow, sigma_cr / FoS) [Pa].
    governs : str
        "material" or "buckling".
    reduction : float
        stress / sigma_allow [-].
    force : float
        stress A [N].
    """

    clause: str
    sigma_cr: float
    factor_of_safety: float
    sigma_allow: float
    stress: float
    governs: str
    reduction: float
    force: float


def working_stress(A: float, N_cr: float, sigma_allow: float, factor_of_safety: float) -> WorkingStress:
    """Allowable axial stress by the working-stress rule.

    Rule: ``allowable = min(sigma_allow, sigma_cr / FoS)`` with
    ``sigma_cr = N_cr / A``: the elastic critical stress divided by the
    factor of safety, but never more than the material's own allowable stress
    (which governs whenever it is the smaller; ties are reported as
    "material").

    Parameters
    ----------
    A : float
        Area [m^2].
    N_cr : float
        Elastic critical force [N].
    sigma_allow : float
        Material allowable stress [Pa].
    factor_of_safety : float
        Factor of safety against elastic buckling, >= 1 [-].

    Returns
    -------
    WorkingStress
    """
    A = positive("A", A, "m^2")
    N_cr = positive("N_cr", N_cr, "N")
    sa = positive("sigma_allow", sigma_allow, "Pa")
    fos = positive("factor_of_safety", factor_of_safety, "(-)")
    if fos < 1.0:
        raise ModelError("factor_of_safety", f"{fos:g} is below 1; expected a factor of safety >= 1")
    v = {"N_cr_N": N_cr, "A_m2": A, "factor_of_safety": fos, "sigma_allow_Pa": sa}
    for name in ("sigma_cr", "buckling", "allowable", "N_R"):  # each step takes the values before it
        v[STEPS[name].key] = STEPS[name](**v)
    s = v["allowable_stress_Pa"]
    gov = "material" if STEPS["material_governs"](**v) else "buckling"
    return WorkingStress("working stress: min(sigma_allow, sigma_cr / FoS)", v["sigma_cr_Pa"], fos, sa, s, gov,
                         s / sa, v["resistance_N"])


def _compression(params: Mapping[str, Any], axis: str, m: MemberData, N_cr: float, N_Ed: float) -> dict:
    A, E = m.A, m.E
    lam = equivalent_slenderness(A, N_cr, E)
    sa = params.get("sigma_allow") or m.sigma_allow
    if sa is None:
        raise ModelError("material.sigma_allow", "missing: the working-stress check needs the material's "
                                                 "allowable stress sigma_allow")
    r = working_stress(A, N_cr, sa, need(params, "factor_of_safety", NAME))
    return dict(clause=r.clause, parameter=f"FoS = {r.factor_of_safety:g}, sigma_allow = {sa / 1e6:.4g} MPa",
                slenderness=lam, slenderness_name="L/r", reduction=r.reduction, resistance=r.force,
                governs=r.governs, details={"sigma_cr_Pa": r.sigma_cr, "allowable_stress_Pa": r.stress,
                                            "A_m2": A, "E_Pa": E, "sigma_allow_Pa": sa,
                                            "factor_of_safety": r.factor_of_safety,
                                            "buckling_stress_Pa": STEPS["buckling"](
                                                sigma_cr_Pa=r.sigma_cr, factor_of_safety=r.factor_of_safety)})


def _tension(params: Mapping[str, Any], m: MemberData, A_net: float | None, base: dict) -> dict:
    sa = params.get("sigma_allow") or m.sigma_allow
    if sa is None:
        raise ModelError("material.sigma_allow", "missing: the working-stress check needs sigma_allow")
    return dict(clause="working stress in tension", formula="N = sigma_allow A (A_net when given)",
                parameter=f"sigma_allow = {sa / 1e6:.4g} MPa",
                resistance=STEPS["tension"](sigma_allow_Pa=sa, Ae=m.A if A_net is None else A_net),
                governs="net" if A_net is not None else "gross", details={**base, "sigma_allow_Pa": sa})


WORKING_STRESS = Standard(
    name=NAME,
    parameters={"factor_of_safety": None, "sigma_allow": None},
    constants={},
    curve=working_stress,
    formula="N = A min(sigma_allow, (N_cr / A) / FoS)",
    steps=STEPS,
    compression=_compression,
    tension=_tension,
    needs_fy=False,
)
