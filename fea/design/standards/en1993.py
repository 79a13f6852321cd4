"""EN 1993-1-1:2005 flexural buckling (6.3.1) and tension (6.2.3), as one record.

Pure functions, SI units (Pa, m^2, N).  The reduction factor is capped at 1.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Mapping

from fea.errors import ModelError

from .record import MemberData, Standard, Step, axis_value, non_negative, positive

__all__ = ["EN1993_IMPERFECTION", "EN1993Chi", "EN1993Buckling", "EN1993Tension", "en1993_chi",
           "en1993_buckling", "en1993_tension", "EN1993"]

NAME = "EN 1993-1-1"
_F = "EN 1993-1-1 6.3.1.2"
_T = "EN 1993-1-1 6.2.3"

EN1993_IMPERFECTION: dict[str, float] = {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}
"""Imperfection factors alpha of EN 1993-1-1 Table 6.1, by buckling curve."""

def _n_b_rd(reduction_factor: float, A_m2: float, fy_Pa: float, gamma_M1: float, **_: float) -> float:
    """chi A fy / gamma_M1 evaluated as (chi fy / gamma_M1) A, the order the results were always computed in
    (sizing solves for a utilisation of 1, and keeps its last figures only when every operand does)."""
    return reduction_factor * fy_Pa / gamma_M1 * A_m2


STEPS = {
    # 6.3.1.2(1): relative slenderness (Class 1-3 sections)
    "slenderness": Step("slenderness", "sqrt(A_m2 * fy_Pa / N_cr_N)", _F),
    # 6.3.1.2(4): no reduction for buckling on the plateau
    "plateau": Step("plateau", "slenderness <= 0.2", _F),
    # 6.3.1.2(1), Eq. (6.49)
    "phi": Step("phi", "0.5 * (1 + alpha * (slenderness - 0.2) + slenderness**2)", _F),
    "chi": Step("reduction_factor", "min(1 / (phi + sqrt(phi**2 - slenderness**2)), 1)", _F),
    # 6.3.1.1 Eq. (6.47), and the resistance of the cross-section 6.2.4 Eq. (6.10)
    "N_b_Rd": Step("N_b_Rd_N", "reduction_factor * A_m2 * fy_Pa / gamma_M1", _F, kernel=_n_b_rd),
    "N_c_Rd": Step("N_c_Rd_N", "A_m2 * fy_Pa / gamma_M0", _F),
    # 6.2.3(2) Eqs. (6.6) and (6.7)
    "N_pl_Rd": Step("N_pl_Rd_N", "A_m2 * fy_Pa / gamma_M0", _T),
    "N_u_Rd": Step("N_u_Rd_N", "0.9 * A_net_m2 * fu_Pa / gamma_M2", _T),
}


@dataclass(frozen=True, slots=True)
class EN1993Chi:
    """Reduction factor of EN 1993-1-1 6.3.1.2 (Eq. 6.49).

    Attributes
    ----------
    clause : str
    curve : str
        Buckling curve, one of a0, a, b, c, d.
    alpha : float
        Imperfection factor (Table 6.1) [-].
    lambda_bar : float
        Non-dimensional slenderness [-].
    phi : float
        Phi = 0.5 [1 + alpha (lambda_bar - 0.2) + lambda_bar^2] [-].
    chi : float
        Reduction factor, <= 1 [-].
    """

    clause: str
    curve: str
    alpha: float
    lambda_bar: float
    phi: float
    chi: float

    @property
    def slenderness(self) -> float:
        """The slenderness used (lambda_bar) [-]."""
        return self.lambda_bar

    @property
    def reduction(self) -> float:
        """The reduction factor (chi) [-]."""
        return self.chi


def en1993_chi(lambda_bar: float, curve: str) -> EN1993Chi:
    """Flexural buckling reduction factor, EN 1993-1-1 6.3.1.2(1).

    ``Phi = 0.5 [1 + alpha (lambda_bar - 0.2) + lambda_bar^2]``,
    ``chi = 1 / (Phi + sqrt(Phi^2 - lambda_bar^2))``, ``chi <= 1``.  On the
    plateau ``lambda_bar <= 0.2`` chi is 1 (the formula gives exactly 1 at
    0.2 and would exceed 1 below it).

    Parameters
    ----------
    lambda_bar : float
        Non-dimensional slenderness sqrt(A fy / N_cr) [-], >= 0.
    curve : str
        Buckling curve "a0", "a", "b", "c" or "d" (Table 6.2).

    Returns
    -------
    EN1993Chi
    """
    lam = non_negative("lambda_bar", lambda_bar, "(-)")
    if curve not in EN1993_IMPERFECTION:
        raise ModelError("curve", f"{curve!r} is not an EN 1993-1-1 buckling curve; expected one of a0, a, b, c, d")
    alpha = EN1993_IMPERFECTION[curve]
    phi = STEPS["phi"](alpha=alpha, slenderness=lam)
    chi = 1.0 if STEPS["plateau"](slenderness=lam) else STEPS["chi"](phi=phi, slenderness=lam)
    return EN1993Chi("EN 1993-1-1 6.3.1.2 (6.49)", curve, alpha, lam, phi, chi)


@dataclass(frozen=True, slots=True)
class EN1993Buckling(EN1993Chi):
    """Design buckling resistance of EN 1993-1-1 6.3.1.1 (Eq. 6.47): the reduction factor's
    record (:class:`EN1993Chi`) and the resistance.

    Attributes
    ----------
    N_pl : float
        A fy [N].
    N_cr : float
        Elastic critical force [N].
    gamma_M1 : float
        Partial factor [-].
    stress : float
        chi fy / gamma_M1 [Pa].
    N_b_Rd : float
        chi A fy / gamma_M1 [N].
    """

    N_pl: float
    N_cr: float
    gamma_M1: float
    stress: float
    N_b_Rd: float

    @property
    def force(self) -> float:
        """N_b,Rd [N]."""
        return self.N_b_Rd


def en1993_buckling(A: float, fy: float, N_cr: float, curve: str, gamma_M1: float = 1.0) -> EN1993Buckling:
    """Flexural buckling resistance N_b,Rd = chi A fy / gamma_M1 (EN 1993-1-1 6.3.1.1).

    ``lambda_bar = sqrt(A fy / N_cr)`` (6.3.1.2(1), Class 1-3 sections; for
    Class 4 pass A_eff as ``A``).

    Parameters
    ----------
    A : float
        Area [m^2].
    fy : float
        Yield strength [Pa].
    N_cr : float
        Elastic critical force for the relevant buckling mode [N].
    curve : str
        Buckling curve "a0", "a", "b", "c" or "d".
    gamma_M1 : float
        Partial factor (1.0 recommended in EN 1993-1-1 6.1 NOTE 2B) [-].

    Returns
    -------
    EN1993Buckling
    """
    A = positive("A", A, "m^2")
    fy = positive("fy", fy, "Pa")
    N_cr = positive("N_cr", N_cr, "N")
    gamma_M1 = positive("gamma_M1", gamma_M1, "(-)")
    c = en1993_chi(STEPS["slenderness"](A_m2=A, fy_Pa=fy, N_cr_N=N_cr), curve)
    N_b_Rd = STEPS["N_b_Rd"](reduction_factor=c.chi, A_m2=A, fy_Pa=fy, gamma_M1=gamma_M1)
    return EN1993Buckling(
        "EN 1993-1-1 6.3.1.1 (6.47)", c.curve, c.alpha, c.lambda_bar, c.phi, c.chi,
        A * fy, N_cr, gamma_M1, c.chi * fy / gamma_M1, N_b_Rd,
    )  # fmt: skip


@dataclass(frozen=True, slots=True)
class EN1993Tension:
    """Tension resistance of EN 1993-1-1 6.2.3(2).

    Attributes
    ----------
    clause : str
    N_pl_Rd : float
        Gross section A fy / gamma_M0 [N].
    N_u_Rd : float
        Net section 0.9 A_net fu / gamma_M2 [N]; inf when no net section was
        given.
    N_t_Rd : float
        min(N_pl_Rd, N_u_Rd) [N].
    governs : str
        "gross" or "net".
    gamma_M0, gamma_M2 : float
        Partial factors [-].
    """

    clause: str
    N_pl_Rd: float
    N_u_Rd: float
    N_t_Rd: float
    governs: str
    gamma_M0: float
    gamma_M2: float

    @property
    def force(self) -> float:
        """N_t,Rd [N]."""
        return self.N_t_Rd


def en1993_tension(
    A: float,
    fy: float,
    *,
    A_net: float | None = None,
    fu: float | None = None,
    gamma_M0: float = 1.0,
    gamma_M2: float = 1.25,
) -> EN1993Tension:
    """Design tension resistance N_t,Rd, EN 1993-1-1 6.2.3(2) a) and b).

    ``N_pl,Rd = A fy / gamma_M0`` (6.6) and, for a section with holes,
    ``N_u,Rd = 0.9 A_net fu / gamma_M2`` (6.7); ``N_t,Rd`` is the smaller.
    Other checks of 6.2.3 (category C connections, angles connected by one
    leg) are not covered.

    Parameters
    ----------
    A : float
        Gross area [m^2].
    fy : float
        Yield strength [Pa].
    A_net : float, optional
        Net area at holes [m^2], 0 < A_net <= A; needs ``fu``.
    fu : float, optional
        Ultimate tensile strength [Pa].
    gamma_M0, gamma_M2 : float
        Partial factors (recommended 1.00 and 1.25, EN 1993-1-1 6.1) [-].

    Returns
    -------
    EN1993Tension
    """
    A = positive("A", A, "m^2")
    fy = positive("fy", fy, "Pa")
    g0 = positive("gamma_M0", gamma_M0, "(-)")
    g2 = positive("gamma_M2", gamma_M2, "(-)")
    Npl = STEPS["N_pl_Rd"](A_m2=A, fy_Pa=fy, gamma_M0=g0)
    if (A_net is None) != (fu is None):
        raise ModelError("A_net", "give both A_net and fu for the net-section check, or neither")
    if A_net is not None:
        An = positive("A_net", A_net, "m^2")
        if An > A:
            raise ModelError("A_net", f"{An:g} m^2 exceeds the gross area {A:g} m^2")
        Nu = STEPS["N_u_Rd"](A_net_m2=An, fu_Pa=positive("fu", fu, "Pa"), gamma_M2=g2)  # type: ignore[arg-type]
    else:
        Nu = math.inf
    return EN1993Tension(
        "EN 1993-1-1 6.2.3", Npl, Nu, min(Npl, Nu), "gross" if Npl <= Nu else "net", g0, g2
    )


# ---------------------------------------------------------------------------
# the member check's view


def _compression(params: Mapping[str, Any], axis: str, m: MemberData, N_cr: float, N_Ed: float) -> dict:
    A, fy = m.A, m.fy
    curve = axis_value(params, "curve", axis)
    if curve is None:
        raise ModelError(f"design.curve_{axis}", "missing: EN 1993-1-1 needs a buckling curve (a0, a, b, c, d)")
    r = en1993_buckling(A, fy, N_cr, curve, params["gamma_M1"])  # type: ignore[arg-type]
    N_c = STEPS["N_c_Rd"](A_m2=A, fy_Pa=fy, gamma_M0=params["gamma_M0"])
    res = min(r.N_b_Rd, N_c)
    return dict(clause=r.clause, parameter=f"curve {curve} (alpha = {r.alpha:g}), gamma_M1 = {r.gamma_M1:g}",
                slenderness=r.lambda_bar, slenderness_name="lambda_bar", reduction=r.chi, resistance=res,
                governs="buckling" if r.N_b_Rd < N_c else "material",
                details={"alpha": r.alpha, "phi": r.phi, "N_pl_N": r.N_pl, "N_c_Rd_N": N_c,
                         "A_m2": A, "fy_Pa": fy, "gamma_M0": params["gamma_M0"], "gamma_M1": r.gamma_M1,
                         "N_b_Rd_N": r.N_b_Rd},
                labels={"curve": curve, "branch": "plateau" if STEPS["plateau"](slenderness=r.lambda_bar)
                        else "curve"})


def _tension(params: Mapping[str, Any], m: MemberData, A_net: float | None, base: dict) -> dict:
    r = en1993_tension(m.A, m.fy, A_net=A_net, fu=m.fu if A_net is not None else None,  # type: ignore[arg-type]
                       gamma_M0=params["gamma_M0"], gamma_M2=params["gamma_M2"])
    return dict(clause=r.clause, formula="N_t,Rd = min(A fy / gamma_M0, 0.9 A_net fu / gamma_M2)",
                parameter=f"gamma_M0 = {r.gamma_M0:g}, gamma_M2 = {r.gamma_M2:g}", resistance=r.N_t_Rd,
                governs=r.governs, details={**base, "fy_Pa": m.fy, "gamma_M0": r.gamma_M0,
                                            "gamma_M2": r.gamma_M2, "N_pl_Rd_N": r.N_pl_Rd,
                                            "N_u_Rd_N": r.N_u_Rd})


EN1993 = Standard(
    name=NAME,
    parameters={"curve": None, "gamma_M0": 1.0, "gamma_M1": 1.0, "gamma_M2": 1.25},
    constants={"imperfection": EN1993_IMPERFECTION},
    curve=en1993_buckling,
    formula="N_b,Rd = chi A fy / gamma_M1 <= A fy / gamma_M0, lambda_bar = sqrt(A fy / N_cr)",
    steps=STEPS,
    compression=_compression,
    tension=_tension,
)
