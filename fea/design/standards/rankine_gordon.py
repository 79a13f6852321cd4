"""The Rankine-Gordon strut formula, as one record (common practice; pure functions, SI units)."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Mapping

from fea.errors import ModelError

from .perry_robertson import STEPS as PERRY_STEPS
from .perry_robertson import material_tension
from .record import MemberData, Standard, Step, equivalent_slenderness, need, non_negative, positive

__all__ = ["RankineGordon", "rankine_gordon", "RANKINE_GORDON"]

NAME = "Rankine-Gordon"
_F = "Rankine-Gordon"

STEPS = {
    "stress": Step("stress_Pa", "crushing_stress_Pa / (1 + a * slenderness**2)", _F),
    "N_R": Step("resistance_N", "stress_Pa * A_m2 / factor_of_safety", _F),
    # tension: as the Perry-Robertson method, the crushing (or yield) stress over the section
    "tension": PERRY_STEPS["tension"],
}


@dataclass(frozen=True, slots=True)
class RankineGordon:
    """Rankine-Gordon strut stress.

    Attributes
    ----------
    clause : str
    slenderness : float
        L / r [-].
    a : float
        Rankine constant [-].
    stress : float
        fc / (1 + a (L/r)^2) [Pa].
    reduction : float
        stress / fc [-].
    """

    clause: str
    slenderness: float
    a: float
    stress: float
    reduction: float


def rankine_gordon(fc: float, slenderness: float, a: float) -> RankineGordon:
    """Rankine-Gordon formula sigma = fc / (1 + a (L/r)^2).

    Parameters
    ----------
    fc : float
        Crushing (or yield) stress [Pa].
    slenderness : float
        L / r [-], >= 0.
    a : float
        Rankine constant [-], > 0 (1/7500 for mild steel, pinned ends, is
        common practice).

    Returns
    -------
    RankineGordon
    """
    fc = positive("fc", fc, "Pa")
    lam = non_negative("slenderness", slenderness, "(L/r)")
    a = positive("a", a, "(-)")
    s = STEPS["stress"](crushing_stress_Pa=fc, a=a, slenderness=lam)
    return RankineGordon("Rankine-Gordon", lam, a, s, s / fc)


def _compression(params: Mapping[str, Any], axis: str, m: MemberData, N_cr: float, N_Ed: float) -> dict:
    A, E, fy = m.A, m.E, m.fy
    lam = equivalent_slenderness(A, N_cr, E)
    fos = params["factor_of_safety"]
    fc = params.get("crushing_stress") or fy
    if fc is None:
        raise ModelError("design.crushing_stress", "missing: Rankine-Gordon needs a crushing stress "
                                                   "(or the material's fy)")
    r = rankine_gordon(fc, lam, need(params, "a", NAME))
    return dict(clause=r.clause, parameter=f"a = 1/{1.0 / r.a:.6g}, FoS = {fos:g}", slenderness=lam,
                slenderness_name="L/r", reduction=r.reduction,
                resistance=STEPS["N_R"](stress_Pa=r.stress, A_m2=A, factor_of_safety=fos),
                governs="buckling" if r.reduction < 1.0 else "material",
                details={"crushing_stress_Pa": fc, "stress_Pa": r.stress, "A_m2": A, "E_Pa": E, "a": r.a,
                         "a_inverse": 1.0 / r.a, "factor_of_safety": fos})


RANKINE_GORDON = Standard(
    name=NAME,
    parameters={"a": None, "crushing_stress": None, "factor_of_safety": 1.0},
    constants={},
    curve=rankine_gordon,
    formula="N = fc A / (1 + a (L/r)^2) / FoS, L/r = pi sqrt(E A / N_cr)",
    steps=STEPS,
    compression=_compression,
    tension=lambda params, m, A_net, base: material_tension(NAME, params, m, A_net, base),
    needs_fy=False,
)
