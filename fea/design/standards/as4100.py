"""AS 4100 member capacity in axial compression (6.3.3) and tension (7.2), as one record.

Pure functions, SI units (Pa, m^2, N); where the standard writes a stress in
N/mm^2 (``sqrt(fy/250)``) the conversion is inside the formula.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Mapping

from fea.errors import ModelError

from .record import MemberData, Standard, Step, axis_value, finite, positive, slenderness_source

__all__ = ["AS4100_ALPHA_B", "AS4100Compression", "as4100_compression", "AS4100"]

NAME = "AS 4100"
_F = "AS 4100 6.3.3"
_T = "AS 4100 7.2"

AS4100_ALPHA_B: tuple[float, ...] = (-1.0, -0.5, 0.0, 0.5, 1.0)
"""Member section constants alpha_b of AS 4100 Table 6.3.3(1)/(2)."""

#: Correction factor for the distribution of forces in a tension member, kt (7.3), taken as 1 here.
KT = 1.0

STEPS = {
    # 6.3.3 (from memory)
    "lambda_n": Step("lambda_n", "slenderness * sqrt(kf) * sqrt(fy_Pa / (250 * MPa))", _F),
    "alpha_a": Step("alpha_a", "2100 * (lambda_n - 13.5) / (lambda_n**2 - 15.3 * lambda_n + 2050)", _F),
    "lambda": Step("lambda_", "lambda_n + alpha_a * alpha_b", _F),
    "plateau": Step("plateau", "lambda_ <= 13.5", _F),
    "eta": Step("eta", "0.00326 * (lambda_ - 13.5)", _F),
    "xi": Step("xi", "((lambda_ / 90)**2 + 1 + eta) / (2 * (lambda_ / 90)**2)", _F),
    "alpha_c": Step("reduction_factor", "min(xi * (1 - sqrt(1 - (90 / (xi * lambda_))**2)), 1)", _F),
    "Ns": Step("Ns_N", "kf * An * fy_Pa", _F),
    "Nc": Step("Nc_N", "reduction_factor * Ns_N", _F),
    "phi_Nc": Step("resistance_N", "phi * Nc_N", _F),
    # 7.2 (from memory): gross-section yield, net-section fracture
    "yield": Step("yield_N", "A_m2 * fy_Pa", _T),
    "rupture": Step("rupture_N", "0.85 * kt * A_net_m2 * fu_Pa", _T),
    "phi_Nt_yield": Step("resistance_N", "phi * yield_N", _T),
    "phi_Nt_rupture": Step("resistance_N", "phi * rupture_N", _T),
}


@dataclass(frozen=True, slots=True)
class AS4100Compression:
    """Member capacity in axial compression, AS 4100 clause 6.3.3.

    Attributes
    ----------
    clause : str
    le_r : float
        Geometric slenderness le/r [-].
    lambda_n : float
        Modified slenderness (le/r) sqrt(kf) sqrt(fy/250) [-] (fy in MPa).
    alpha_a : float
        2100 (lambda_n - 13.5) / (lambda_n^2 - 15.3 lambda_n + 2050) [-].
    alpha_b : float
        Member section constant [-].
    lambda_ : float
        lambda_n + alpha_a alpha_b [-].
    eta : float
        Imperfection parameter max(0.00326 (lambda - 13.5), 0) [-].
    xi : float
        ((lambda/90)^2 + 1 + eta) / (2 (lambda/90)^2) [-].
    alpha_c : float
        Slenderness reduction factor, <= 1 [-].
    kf : float
        Form factor [-].
    Ns : float
        Nominal section capacity kf An fy [N].
    Nc : float
        Nominal member capacity alpha_c Ns, <= Ns [N].
    phi : float
        Capacity factor 0.9 [-].
    phi_Nc : float
        Design capacity [N].
    """

    clause: str
    le_r: float
    lambda_n: float
    alpha_a: float
    alpha_b: float
    lambda_: float
    eta: float
    xi: float
    alpha_c: float
    kf: float
    Ns: float
    Nc: float
    phi: float
    phi_Nc: float

    @property
    def slenderness(self) -> float:
        """lambda_n [-]."""
        return self.lambda_n

    @property
    def reduction(self) -> float:
        """alpha_c [-]."""
        return self.alpha_c

    @property
    def force(self) -> float:
        """Nc [N]."""
        return self.Nc


def as4100_compression(
    A: float,
    fy: float,
    alpha_b: float,
    *,
    le_r: float | None = None,
    N_cr: float | None = None,
    E: float = 200e9,
    kf: float = 1.0,
    An: float | None = None,
    phi: float = 0.9,
) -> AS4100Compression:
    """Nominal member capacity Nc = alpha_c Ns, AS 4100 6.3.3.

    ``lambda_n = (le/r) sqrt(kf) sqrt(fy/250)`` with fy in MPa;
    ``alpha_a = 2100 (lambda_n - 13.5) / (lambda_n^2 - 15.3 lambda_n + 2050)``;
    ``lambda = lambda_n + alpha_a alpha_b``;
    ``eta = max(0.00326 (lambda - 13.5), 0)``;
    ``xi = ((lambda/90)^2 + 1 + eta) / (2 (lambda/90)^2)``;
    ``alpha_c = xi (1 - sqrt(1 - (90 / (xi lambda))^2))``, capped at 1;
    ``Ns = kf An fy``.  For ``lambda <= 13.5`` (eta = 0) the formula is
    exactly 1, which is returned without evaluating it (it is 0/0 at
    lambda = 0).

    Parameters
    ----------
    A : float
        Gross area [m^2] (used to convert N_cr; also An by default).
    fy : float
        Yield stress [Pa].
    alpha_b : float
        Member section constant, one of -1, -0.5, 0, 0.5, 1.
    le_r : float, optional
        Geometric slenderness le/r [-].
    N_cr : float, optional
        Elastic critical force [N]; then ``le/r = pi sqrt(E / (N_cr/A))``.
    E : float
        Elastic modulus [Pa] (200 GPa in AS 4100).
    kf : float
        Form factor, 0 < kf <= 1.
    An : float, optional
        Net area [m^2]; defaults to A.
    phi : float
        Capacity factor (0.9, AS 4100 Table 3.4).

    Returns
    -------
    AS4100Compression
    """
    A = positive("A", A, "m^2")
    fy = positive("fy", fy, "Pa")
    alpha_b = finite("alpha_b", alpha_b)
    if alpha_b not in AS4100_ALPHA_B:
        raise ModelError("alpha_b", f"{alpha_b:g} is not an AS 4100 section constant; expected -1, -0.5, 0, 0.5 or 1")
    kf = positive("kf", kf, "(-)")
    if kf > 1.0:
        raise ModelError("kf", f"{kf:g} exceeds 1; expected a form factor 0 < kf <= 1")
    An = A if An is None else positive("An", An, "m^2")
    phi = positive("phi", phi, "(-)")
    le_r = slenderness_source(A, E, le_r, N_cr, "le_r")
    lam_n = STEPS["lambda_n"](slenderness=le_r, kf=kf, fy_Pa=fy)
    alpha_a = STEPS["alpha_a"](lambda_n=lam_n)
    lam = STEPS["lambda"](lambda_n=lam_n, alpha_a=alpha_a, alpha_b=alpha_b)
    if STEPS["plateau"](lambda_=lam):
        eta, xi, alpha_c = 0.0, math.inf, 1.0
    else:
        eta = STEPS["eta"](lambda_=lam)
        xi = STEPS["xi"](lambda_=lam, eta=eta)
        alpha_c = STEPS["alpha_c"](xi=xi, lambda_=lam)
    Ns = STEPS["Ns"](kf=kf, An=An, fy_Pa=fy)
    Nc = STEPS["Nc"](reduction_factor=alpha_c, Ns_N=Ns)
    return AS4100Compression("AS 4100 6.3.3", le_r, lam_n, alpha_a, alpha_b, lam, eta, xi, alpha_c, kf, Ns, Nc, phi,
                             STEPS["phi_Nc"](phi=phi, Nc_N=Nc))


# ---------------------------------------------------------------------------
# the member check's view


def _compression(params: Mapping[str, Any], axis: str, m: MemberData, N_cr: float, N_Ed: float) -> dict:
    A, E, fy = m.A, m.E, m.fy
    alpha_b = axis_value(params, "alpha_b", axis)
    if alpha_b is None:
        raise ModelError(f"design.alpha_b_{axis}", "missing: AS 4100 needs the member section constant alpha_b")
    r = as4100_compression(A, fy, alpha_b, N_cr=N_cr, E=E, kf=params["kf"], phi=params["phi"])  # type: ignore[arg-type]
    return dict(clause=r.clause, parameter=f"alpha_b = {r.alpha_b:g}, kf = {r.kf:g}, phi = {r.phi:g}",
                slenderness=r.le_r, slenderness_name="le/r", reduction=r.alpha_c, resistance=r.phi_Nc,
                governs="buckling" if r.alpha_c < 1.0 else "material",
                details={"lambda_n": r.lambda_n, "alpha_a": r.alpha_a, "lambda": r.lambda_, "eta": r.eta,
                         "Ns_N": r.Ns, "Nc_N": r.Nc, "A_m2": A, "fy_Pa": fy, "E_Pa": E, "kf": r.kf,
                         "alpha_b": r.alpha_b, "xi": r.xi, "phi": r.phi},
                labels={"branch": "plateau" if STEPS["plateau"](lambda_=r.lambda_) else "curve"})


def _tension(params: Mapping[str, Any], m: MemberData, A_net: float | None, base: dict) -> dict:
    y = STEPS["yield"](A_m2=m.A, fy_Pa=m.fy)
    u = STEPS["rupture"](kt=KT, A_net_m2=A_net, fu_Pa=m.fu) if A_net is not None else math.inf
    phi = params["phi"]
    return dict(clause="AS 4100 7.2", formula="phi Nt = phi min(Ag fy, 0.85 kt An fu), kt = 1",
                parameter=f"phi = {phi:g}", resistance=phi * min(y, u),
                governs="gross" if y <= u else "net",
                details={**base, "fy_Pa": m.fy, "phi": phi, "yield_N": y, "rupture_N": u})


AS4100 = Standard(
    name=NAME,
    parameters={"alpha_b": None, "kf": 1.0, "phi": 0.9},
    constants={"alpha_b": AS4100_ALPHA_B, "kt": KT},
    curve=as4100_compression,
    formula="phi Nc = phi alpha_c kf A fy, le/r = pi sqrt(E A / N_cr)",
    steps=STEPS,
    compression=_compression,
    tension=_tension,
)
