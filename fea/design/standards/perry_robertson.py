"""The classical Perry-Robertson strut formula (Robertson's eta = c L/r), as one record.

Perry, J., "On struts", The Engineer 62, 1886; Robertson, A., "The strength of
struts", ICE Selected Engineering Papers 28, 1925.  Pure functions, SI units.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Mapping

from fea.errors import ModelError
from fea.formulas import euler_stress, perry_root

from .record import MemberData, Standard, Step, equivalent_slenderness, non_negative, positive

__all__ = ["PerryRobertson", "perry_robertson", "PERRY_ROBERTSON", "material_tension"]

NAME = "Perry-Robertson"
_F = "Perry-Robertson"

#: Robertson's value of c in eta = c L/r.
ROBERTSON_C = 0.003

STEPS = {
    "sigma_e": Step("sigma_e_Pa", "pi**2 * E_Pa / slenderness**2", _F,
                    kernel=lambda E_Pa, slenderness, **_: euler_stress(E_Pa, slenderness)),
    "eta": Step("eta", "coefficient * slenderness", _F),
    "B": Step("B_Pa", "(fy_Pa + (1 + eta) * sigma_e_Pa) / 2", _F),
    # Perry's root, computed by fea.formulas.perry_root (which also takes eta)
    "stress": Step("stress_Pa", "min(fy_Pa * sigma_e_Pa / (B_Pa + sqrt(B_Pa**2 - fy_Pa * sigma_e_Pa)), fy_Pa)", _F,
                   kernel=lambda fy_Pa, sigma_e_Pa, eta, **_: min(perry_root(fy_Pa, sigma_e_Pa, eta), fy_Pa)),
    "N_R": Step("resistance_N", "stress_Pa * A_m2 / factor_of_safety", _F),
    # tension: yield (or crushing) stress over the section, A_net where given
    "tension": Step("resistance_N", "stress_Pa * Ae / factor_of_safety", _F),
}


@dataclass(frozen=True, slots=True)
class PerryRobertson:
    """Classical Perry-Robertson strut stress.

    Attributes
    ----------
    clause : str
    slenderness : float
        L / r [-].
    coefficient : float
        c in eta = c L/r [-].
    eta : float
        Perry imperfection factor [-].
    sigma_e : float
        Euler stress pi^2 E / (L/r)^2 [Pa].
    stress : float
        Failure stress: smaller root of (fy - s)(sigma_e - s) = eta s sigma_e [Pa].
    reduction : float
        stress / fy [-].
    """

    clause: str
    slenderness: float
    coefficient: float
    eta: float
    sigma_e: float
    stress: float
    reduction: float


def perry_robertson(fy: float, E: float, slenderness: float, coefficient: float = ROBERTSON_C) -> PerryRobertson:
    """Perry-Robertson strut formula with Robertson's eta = c L/r.

    The mean stress ``s`` at first yield of a pin-ended strut with an initial
    half-sine bow satisfies ``(fy - s)(sigma_e - s) = eta s sigma_e``; its
    smaller root (:func:`fea.formulas.perry_root`) is ``s = B - sqrt(B^2 - fy sigma_e)``,
    ``B = (fy + (1 + eta) sigma_e) / 2``, evaluated as
    ``fy sigma_e / (B + sqrt(B^2 - fy sigma_e))``.  ``c = 0.003`` is
    Robertson's value.

    Parameters
    ----------
    fy : float
        Yield stress [Pa].
    E : float
        Elastic modulus [Pa].
    slenderness : float
        L / r [-], >= 0.
    coefficient : float
        c in eta = c L/r [-], >= 0.

    Returns
    -------
    PerryRobertson
    """
    fy = positive("fy", fy, "Pa")
    E = positive("E", E, "Pa")
    lam = non_negative("slenderness", slenderness, "(L/r)")
    c = non_negative("coefficient", coefficient, "(-)")
    v = {"fy_Pa": fy, "E_Pa": E, "slenderness": lam, "coefficient": c}
    for name in ("sigma_e", "eta", "stress"):  # each step takes the values before it
        v[STEPS[name].key] = STEPS[name](**v)
    s = v["stress_Pa"]
    return PerryRobertson("Perry-Robertson (eta = c L/r)", lam, c, v["eta"], v["sigma_e_Pa"], s, s / fy)


# ---------------------------------------------------------------------------
# the member check's view


def _compression(params: Mapping[str, Any], axis: str, m: MemberData, N_cr: float, N_Ed: float) -> dict:
    A, E, fy = m.A, m.E, m.fy
    lam = equivalent_slenderness(A, N_cr, E)
    fos = params["factor_of_safety"]
    r = perry_robertson(fy, E, lam, params["coefficient"])  # type: ignore[arg-type]
    return dict(clause=r.clause, parameter=f"eta = {r.coefficient:g} L/r, FoS = {fos:g}", slenderness=lam,
                slenderness_name="L/r", reduction=r.reduction,
                resistance=STEPS["N_R"](stress_Pa=r.stress, A_m2=A, factor_of_safety=fos),
                governs="buckling" if r.reduction < 1.0 else "material",
                details={"eta": r.eta, "sigma_e_Pa": r.sigma_e, "stress_Pa": r.stress, "A_m2": A,
                         "fy_Pa": fy, "E_Pa": E, "coefficient": r.coefficient, "factor_of_safety": fos,
                         "B_Pa": STEPS["B"](fy_Pa=fy, eta=r.eta, sigma_e_Pa=r.sigma_e)})


def material_tension(name: str, params: Mapping[str, Any], m: MemberData, A_net: float | None, base: dict) -> dict:
    """Tension by the yield (or crushing) stress over the section and the factor of safety (classical methods)."""
    f = params.get("crushing_stress") or m.fy
    if f is None:
        raise ModelError("material.fy", f"missing: the tension check of {name} needs fy")
    fos = params["factor_of_safety"]
    return dict(clause="yield of the section", formula="N = f A / FoS (A_net when given)",
                parameter=f"FoS = {fos:g}",
                resistance=STEPS["tension"](stress_Pa=f, Ae=m.A if A_net is None else A_net, factor_of_safety=fos),
                governs="net" if A_net is not None else "gross",
                details={**base, "stress_Pa": f, "factor_of_safety": fos})


PERRY_ROBERTSON = Standard(
    name=NAME,
    parameters={"coefficient": ROBERTSON_C, "factor_of_safety": 1.0},
    constants={"coefficient": ROBERTSON_C},
    curve=perry_robertson,
    formula="N = s A / FoS, (fy - s)(sigma_e - s) = c (L/r) s sigma_e, L/r = pi sqrt(E A / N_cr)",
    steps=STEPS,
    compression=_compression,
    tension=lambda params, m, A_net, base: material_tension(NAME, params, m, A_net, base),
)
