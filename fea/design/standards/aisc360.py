"""AISC 360-16/-22 flexural buckling (E3) and tension (D2), as one record.

Pure functions, SI units (Pa, m^2, N).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Mapping

from fea.errors import ModelError
from fea.formulas import euler_stress

from .record import MemberData, Standard, Step, positive

__all__ = ["AISC360Compression", "aisc360_e3", "AISC360"]

NAME = "AISC 360"
_F = "AISC 360 E3"
_D = "AISC 360 D2"

#: Resistance (LRFD) and safety (ASD) factors: compression E1, tension D2 (yielding, rupture).
FACTORS = {"phi_c": 0.90, "Omega_c": 1.67, "phi_t_yield": 0.90, "phi_t_rupture": 0.75,
           "Omega_t_yield": 1.67, "Omega_t_rupture": 2.00}

STEPS = {
    # elastic buckling stress from the model's critical force, in place of (E3-4)
    "Fe": Step("Fe_Pa", "N_cr_N / A_m2", _F),
    # the equivalent slenderness, for information
    "slenderness": Step("slenderness", "pi * sqrt(E_Pa / Fe_Pa)", _F),
    "ratio": Step("Fy_over_Fe", "Fy_Pa / Fe_Pa", _F),
    "inelastic": Step("inelastic", "Fy_over_Fe <= 2.25", _F),
    "Fcr_inelastic": Step("Fcr_Pa", "0.658**Fy_over_Fe * Fy_Pa", _F),  # (E3-2)
    "Fcr_elastic": Step("Fcr_Pa", "0.877 * Fe_Pa", _F),  # (E3-3)
    "Pn": Step("Pn_N", "Fcr_Pa * A_m2", _F),  # (E3-1)
    "LRFD": Step("resistance_N", "phi_c * Pn_N", _F),
    "ASD": Step("resistance_N", "Pn_N / Omega_c", _F),
    # D2 (from memory): yielding of the gross section, rupture of the net section (Ae = A_net, U = 1)
    "yield_LRFD": Step("yield_N", "Fy_Pa * A_m2 * phi_t_yield", _D),
    "rupture_LRFD": Step("rupture_N", "fu_Pa * A_net_m2 * phi_t_rupture", _D),
    # (the ASD ones computed as F A (1 / Omega), the order the results were always computed in)
    "yield_ASD": Step("yield_N", "Fy_Pa * A_m2 / Omega_t_yield", _D,
                      kernel=lambda Fy_Pa, A_m2, Omega_t_yield, **_: Fy_Pa * A_m2 * (1.0 / Omega_t_yield)),
    "rupture_ASD": Step("rupture_N", "fu_Pa * A_net_m2 / Omega_t_rupture", _D,
                        kernel=lambda fu_Pa, A_net_m2, Omega_t_rupture, **_:
                        fu_Pa * A_net_m2 * (1.0 / Omega_t_rupture)),
}


@dataclass(frozen=True, slots=True)
class AISC360Compression:
    """Flexural buckling strength of AISC 360 (2016/2022) section E3.

    Attributes
    ----------
    clause : str
        "(E3-2)" inelastic or "(E3-3)" elastic branch.
    Fy : float
        Yield stress [Pa].
    Fe : float
        Elastic buckling stress [Pa].
    ratio : float
        Fy / Fe [-]; the inelastic branch applies when <= 2.25.
    slenderness : float
        Equivalent Lc/r = pi sqrt(E / Fe) when E is known, else NaN [-].
    reduction : float
        Fcr / Fy [-].
    Fcr : float
        Critical stress [Pa].
    Pn : float
        Nominal strength Fcr Ag [N].
    phi_c : float
        LRFD resistance factor 0.90 [-].
    phi_Pn : float
        LRFD design strength [N].
    omega_c : float
        ASD safety factor 1.67 [-].
    Pn_over_omega : float
        ASD allowable strength [N].
    """

    clause: str
    Fy: float
    Fe: float
    ratio: float
    slenderness: float
    reduction: float
    Fcr: float
    Pn: float
    phi_c: float
    phi_Pn: float
    omega_c: float
    Pn_over_omega: float

    @property
    def stress(self) -> float:
        """Fcr [Pa]."""
        return self.Fcr

    @property
    def force(self) -> float:
        """Pn [N]."""
        return self.Pn


def aisc360_e3(
    Ag: float,
    Fy: float,
    *,
    Fe: float | None = None,
    N_cr: float | None = None,
    E: float | None = None,
    Lc_r: float | None = None,
) -> AISC360Compression:
    """Nominal compressive strength Pn = Fcr Ag, AISC 360-16/-22 E3.

    ``Fy/Fe <= 2.25``: ``Fcr = 0.658^(Fy/Fe) Fy`` (E3-2); otherwise
    ``Fcr = 0.877 Fe`` (E3-3).  The two branches meet only approximately at
    ``Fy/Fe = 2.25`` (0.658^2.25 = 0.38995 vs 0.877/2.25 = 0.38978): the
    elastic branch starts about 0.04 % lower, a small downward step.

    Give the elastic buckling stress by exactly one route: ``Fe`` directly,
    ``N_cr`` (``Fe = N_cr / Ag``) or ``E`` with ``Lc_r`` (``Fe = pi^2 E /
    (Lc/r)^2``, E3-4, :func:`fea.formulas.euler_stress`).

    Parameters
    ----------
    Ag : float
        Gross area [m^2].
    Fy : float
        Specified minimum yield stress [Pa].
    Fe, N_cr, E, Lc_r : float, optional
        Elastic buckling stress [Pa], critical force [N], modulus [Pa],
        effective slenderness Lc/r [-].

    Returns
    -------
    AISC360Compression
    """
    Ag = positive("Ag", Ag, "m^2")
    Fy = positive("Fy", Fy, "Pa")
    routes = (Fe is not None) + (N_cr is not None) + (Lc_r is not None)
    if routes != 1:
        raise ModelError("Fe", "give exactly one of Fe, N_cr or Lc_r (with E)")
    if Fe is not None:
        Fe = positive("Fe", Fe, "Pa")
    elif N_cr is not None:
        Fe = STEPS["Fe"](N_cr_N=positive("N_cr", N_cr, "N"), A_m2=Ag)
    else:
        if E is None:
            raise ModelError("E", "the elastic modulus E is needed with Lc_r")
        Fe = euler_stress(positive("E", E, "Pa"), positive("Lc_r", Lc_r, "(-)"))  # type: ignore[arg-type]
    slender = STEPS["slenderness"](E_Pa=positive("E", E, "Pa"), Fe_Pa=Fe) if E is not None else math.nan
    ratio = STEPS["ratio"](Fy_Pa=Fy, Fe_Pa=Fe)
    if STEPS["inelastic"](Fy_over_Fe=ratio):
        Fcr, clause = STEPS["Fcr_inelastic"](Fy_over_Fe=ratio, Fy_Pa=Fy), "AISC 360 E3 (E3-2)"
    else:
        Fcr, clause = STEPS["Fcr_elastic"](Fe_Pa=Fe), "AISC 360 E3 (E3-3)"
    Fcr = min(Fcr, Fy)
    Pn = STEPS["Pn"](Fcr_Pa=Fcr, A_m2=Ag)
    phi, omega = FACTORS["phi_c"], FACTORS["Omega_c"]
    return AISC360Compression(clause, Fy, Fe, ratio, slender, Fcr / Fy, Fcr, Pn, phi,
                              STEPS["LRFD"](phi_c=phi, Pn_N=Pn), omega, STEPS["ASD"](Pn_N=Pn, Omega_c=omega))


# ---------------------------------------------------------------------------
# the member check's view


def _compression(params: Mapping[str, Any], axis: str, m: MemberData, N_cr: float, N_Ed: float) -> dict:
    A, E, fy = m.A, m.E, m.fy
    r = aisc360_e3(A, fy, N_cr=N_cr, E=E)  # type: ignore[arg-type]
    method = params["method"]
    res = r.phi_Pn if method == "LRFD" else r.Pn_over_omega
    label = f"LRFD phi_c = {r.phi_c:g}" if method == "LRFD" else f"ASD Omega_c = {r.omega_c:g}"
    return dict(clause=r.clause, parameter=label, slenderness=r.slenderness, slenderness_name="Lc/r",
                reduction=r.reduction, resistance=res,
                governs="buckling" if r.reduction < 1.0 else "material",
                details={"Fe_Pa": r.Fe, "Fy_over_Fe": r.ratio, "Fcr_Pa": r.Fcr, "Pn_N": r.Pn,
                         "A_m2": A, "Fy_Pa": fy, "E_Pa": E, "phi_c": r.phi_c, "Omega_c": r.omega_c},
                labels={"method": method, "equation": r.clause.rsplit("(", 1)[-1].rstrip(")"),
                        "branch": "inelastic" if STEPS["inelastic"](Fy_over_Fe=r.ratio) else "elastic"})


def _tension(params: Mapping[str, Any], m: MemberData, A_net: float | None, base: dict) -> dict:
    method = "LRFD" if params["method"] == "LRFD" else "ASD"
    names = ("phi_t_yield", "phi_t_rupture") if method == "LRFD" else ("Omega_t_yield", "Omega_t_rupture")
    factors = {k: FACTORS[k] for k in names}
    values = {**base, "Fy_Pa": m.fy, "fu_Pa": m.fu, **factors}
    y = STEPS[f"yield_{method}"](**values)
    u = STEPS[f"rupture_{method}"](**values) if A_net is not None else math.inf
    return dict(clause="AISC 360 D2", formula="min(Fy Ag, Fu Ae) with phi_t / Omega_t, Ae = A_net (U = 1)",
                parameter=method, resistance=min(y, u), governs="gross" if y <= u else "net",
                details={**base, "Fy_Pa": m.fy, **factors, "yield_N": y, "rupture_N": u},
                labels={"method": method})


AISC360 = Standard(
    name=NAME,
    parameters={"method": "LRFD"},
    constants=FACTORS,
    curve=aisc360_e3,
    formula="Pn = Fcr Ag, Fcr = 0.658^(Fy/Fe) Fy or 0.877 Fe, Fe = N_cr / Ag",
    steps=STEPS,
    compression=_compression,
    tension=_tension,
)
