"""AISC 360-16 members with axial compression and flexure: H1.1 with E3, F2, F6, F7, and B1 of Appendix 8.

Pure kernel (SI floats, no I/O).  Axes are AISC 360's: ``x`` is the major
axis (EN's y), ``y`` the minor axis (EN's z); the check's numbers carry these
names (``Z_x_m3``, ``S_y_m3``, ``I_y_m4`` is the minor-axis second moment).
The compression strength reuses the steps of E3 from
:mod:`fea.design.standards.aisc360` (one home for E3-2 and E3-3).  The
equations of Chapters F and H and of Appendix 8 are written from memory: the
document was not at hand.  Check them against it before relying on a result.

Flexural strength about the major axis with lateral-torsional buckling uses
the elastic critical moment ``M_cr`` of the analysis (moment gradient and
restraints included) by the project's equivalent-length route: ``L_e`` is the
unbraced length whose elastic lateral-torsional buckling stress for a uniform
moment (F2-4 with C_b = 1) equals ``M_cr / S_x``; then F2-1 to F2-3 at
``L_e`` with ``C_b = 1``.  At ``L_e > L_r`` this gives ``M_n = M_cr`` (F2-3
with the analysis's ``F_cr``) exactly; in the inelastic range it interpolates
at ``L_e`` instead of multiplying by C_b (the two differ; see docs/bending.md).
"""

from __future__ import annotations

import itertools
import math
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import Mapping

from fea.errors import ModelError

from .bending_record import BeamColumnInput, BendingCheck, Calc, MomentDiagram, renamed
from .standards.aisc360 import FACTORS as COMPRESSION_FACTORS
from .standards.aisc360 import STEPS as E3_STEPS
from .standards.record import Step

__all__ = ["FLEXURE_FACTORS", "B1_ALPHA", "METHODS", "STEPS", "B1Result", "aisc360_cm", "aisc360_b1",
           "aisc360_member"]

NAME = "AISC 360"
_E = "AISC 360 E3"
_F1 = "AISC 360 F1"
_F2 = "AISC 360 F2"
_F2_LENGTH = "AISC 360 F2-4 solved for the length"
_F6 = "AISC 360 F6"
_F7 = "AISC 360 F7"
_H = "AISC 360 H1.1"
_A8 = "AISC 360 Appendix 8"

#: Resistance and safety factors for flexure, F1(1) (from memory).
FLEXURE_FACTORS: dict[str, float] = {"phi_b": 0.90, "Omega_b": 1.67}
#: alpha of B1 (A-8-3), by design method: 1.0 (LRFD), 1.6 (ASD) (from memory).
B1_ALPHA: dict[str, float] = {"LRFD": 1.0, "ASD": 1.6}
METHODS = ("LRFD", "ASD")
#: c of F2 for a doubly symmetric I section (F2-8a).
C_DOUBLY_SYMMETRIC = 1.0

_NCR = ("N_cr_x_N", "N_cr_y_N", "N_cr_TF_N")


def _build_steps() -> dict[str, Step]:
    s: dict[str, Step] = {}
    # Chapter E: the smallest critical force, then E3 (the compression check's own steps)
    for n in range(1, 4):
        for combo in itertools.combinations(_NCR, n):
            s["N_cr " + " ".join(combo)] = Step("N_cr_N", combo[0] if n == 1 else f"min({', '.join(combo)})", _E)
    for name in ("Fe", "ratio", "inelastic", "Fcr_inelastic", "Fcr_elastic", "Pn"):
        s[name] = E3_STEPS[name]
    s["LRFD P_c"] = renamed(E3_STEPS["LRFD"], {"resistance_N": "P_c_N"})
    s["ASD P_c"] = renamed(E3_STEPS["ASD"], {"resistance_N": "P_c_N"})
    s["Fcr no buckling"] = Step("Fcr_Pa", "Fy_Pa", _E)
    # Chapter F (from memory): F2 major axis of a compact doubly symmetric I section, F6 its minor axis,
    # F7 compact rectangular hollow sections
    s["M_px"] = Step("M_px_Nm", "Fy_Pa * Z_x_m3", _F2)
    s["M_px RHS"] = Step("M_px_Nm", "Fy_Pa * Z_x_m3", _F7)
    s["M_nx no LTB"] = Step("M_nx_Nm", "M_px_Nm", _F2)
    s["r_y"] = Step("r_y_m", "sqrt(I_y_m4 / A_m2)", _F2)
    # doubly symmetric I: C_w = I_y h_o^2 / 4 (the user note to F2-7)
    s["h_o"] = Step("h_o_m", "2 * sqrt(C_w_m6 / I_y_m4)", _F2)
    s["r_ts"] = Step("r_ts_m", "sqrt(sqrt(I_y_m4 * C_w_m6) / S_x_m3)", _F2)
    s["L_p"] = Step("L_p_m", "1.76 * r_y_m * sqrt(E_Pa / Fy_Pa)", _F2)
    s["Jc_Sxho"] = Step("Jc_Sxho", "J_m4 * c / (S_x_m3 * h_o_m)", _F2)
    s["L_r"] = Step("L_r_m", "1.95 * r_ts_m * E_Pa / (0.7 * Fy_Pa) * sqrt(Jc_Sxho + sqrt(Jc_Sxho**2 + 6.76 * "
                             "(0.7 * Fy_Pa / E_Pa)**2))", _F2)
    s["Fcr_LTB"] = Step("Fcr_LTB_Pa", "M_cr_Nm / S_x_m3", _F2)
    # (F2-4) with C_b = 1 solved for the length: (Fcr / (pi^2 E))^2 x^2 - 0.078 Jc/(Sx ho) x - 1 = 0, x = (L/r_ts)^2
    s["L_e"] = Step("L_e_m", "r_ts_m * sqrt((0.078 * Jc_Sxho + sqrt((0.078 * Jc_Sxho)**2 + 4 * (Fcr_LTB_Pa / (pi**2 * "
                             "E_Pa))**2)) / (2 * (Fcr_LTB_Pa / (pi**2 * E_Pa))**2))", _F2_LENGTH)
    s["yielding"] = Step("yielding", "L_e_m <= L_p_m", _F2)
    s["inelastic_LTB"] = Step("inelastic_LTB", "L_e_m <= L_r_m", _F2)
    s["M_nx yielding"] = Step("M_nx_Nm", "M_px_Nm", _F2)
    s["M_nx inelastic"] = Step("M_nx_Nm", "min(M_px_Nm - (M_px_Nm - 0.7 * Fy_Pa * S_x_m3) * (L_e_m - L_p_m) / "
                                          "(L_r_m - L_p_m), M_px_Nm)", _F2)
    s["M_nx elastic"] = Step("M_nx_Nm", "min(Fcr_LTB_Pa * S_x_m3, M_px_Nm)", _F2)
    s["M_ny I"] = Step("M_ny_Nm", "min(Fy_Pa * Z_y_m3, 1.6 * Fy_Pa * S_y_m3)", _F6)
    s["M_ny RHS"] = Step("M_ny_Nm", "Fy_Pa * Z_y_m3", _F7)
    for ax in ("x", "y"):
        s[f"LRFD M_c{ax}"] = Step(f"M_c{ax}_Nm", f"phi_b * M_n{ax}_Nm", _F1)
        s[f"ASD M_c{ax}"] = Step(f"M_c{ax}_Nm", f"M_n{ax}_Nm / Omega_b", _F1)
    # H1.1 (from memory)
    s["Pr_over_Pc"] = Step("Pr_over_Pc", "P_r_N / P_c_N", _H)
    s["H1_1a_applies"] = Step("H1_1a_applies", "Pr_over_Pc >= 0.2", _H)
    s["H1-1a"] = Step("u_H1_1a", "Pr_over_Pc + 8 / 9 * (M_rx_Nm / M_cx_Nm + M_ry_Nm / M_cy_Nm)", _H)
    s["H1-1b"] = Step("u_H1_1b", "P_r_N / (2 * P_c_N) + (M_rx_Nm / M_cx_Nm + M_ry_Nm / M_cy_Nm)", _H)
    # Appendix 8 (from memory): C_m (A-8-4) and B1 (A-8-3)
    s["M1_over_M2"] = Step("M1_over_M2", "-psi", _A8)
    s["C_m end moments"] = Step("C_m", "0.6 - 0.4 * M1_over_M2", _A8)
    s["C_m transverse"] = Step("C_m", "1.0", _A8)
    s["B1"] = Step("B1", "max(C_m / (1 - alpha_B1 * P_r_N / P_e1_N), 1)", _A8)
    return s


STEPS: dict[str, Step] = _build_steps()
"""Every written-out formula of the AISC 360 checks with flexure, by name."""

_MEMORY = ("AISC 360-16 Chapters F and H and Appendix 8: equations from memory (the document was not at hand); "
           "check them against it")
_ROUTE = ("M_n about the major axis from the analysis's M_cr: F2 at the equivalent unbraced length L_e whose "
          "uniform-moment elastic buckling stress (F2-4, C_b = 1) equals M_cr / S_x (the project's route: the moment "
          "gradient and restraints enter through M_cr, C_b = 1)")
_COMPACT = "compact web and flanges assumed (classes 1-2 given); noncompact and slender elements are not covered"


def _method(method: str) -> str:
    if method not in METHODS:
        raise ModelError("method", f"{method!r} is not known; expected LRFD or ASD")
    return method


# ---------------------------------------------------------------------------


@dataclass(frozen=True)
class B1Result:
    """The amplification factor B1 of AISC 360 Appendix 8 (P-delta of a member without sway).

    Attributes
    ----------
    C_m : equivalent uniform moment factor [-]
    B1 : amplification factor, >= 1 [-] (inf when alpha P_r reaches P_e1)
    values, flags, labels, steps : as :class:`~fea.design.bending_record.BendingCheck`
    """

    C_m: float
    B1: float
    values: Mapping[str, float]
    flags: Mapping[str, bool] = field(default_factory=dict)
    labels: Mapping[str, str] = field(default_factory=dict)
    steps: tuple[Step, ...] = ()

    def __post_init__(self) -> None:
        for name in ("values", "flags", "labels"):
            object.__setattr__(self, name, MappingProxyType(dict(getattr(self, name))))


def _c_m(c: Calc, d: MomentDiagram) -> float:
    if d.kind == "end moments":
        c.put(psi=d.psi)
        c.run(STEPS["M1_over_M2"])
        c.labels["C_m"] = "(A-8-4), no transverse load: M1/M2 = -psi, positive in reverse curvature"
        return float(c.run(STEPS["C_m end moments"]))
    c.labels["C_m"] = f"{d.kind}: C_m = 1.0 (conservative, permitted by Appendix 8 for transverse loading)"
    return float(c.run(STEPS["C_m transverse"]))


def aisc360_cm(diagram: MomentDiagram) -> float:
    """C_m of AISC 360 Appendix 8 (A-8-4) (from memory): ``0.6 - 0.4 M1/M2`` for end moments without
    transverse load, ``M1/M2 = -psi`` (positive in reverse curvature); 1.0 otherwise (conservative)."""
    return _c_m(Calc(), diagram)


def aisc360_b1(diagram: MomentDiagram, P_r: float, P_e1: float, method: str = "LRFD") -> B1Result:
    """Amplification factor B1 = C_m / (1 - alpha P_r / P_e1) >= 1, AISC 360 Appendix 8 (A-8-3) (from memory).

    For the amplified first-order route: M_r = B1 M_nt (the member's moments
    without sway).  alpha = 1.0 (LRFD) or 1.6 (ASD).  P_e1 is the elastic
    critical force of the member in the plane of bending with its ends held
    against sway (K1 = 1); with the direct analysis method its stiffness is
    the reduced one, EI* = 0.8 tau_b EI (from memory).

    Parameters
    ----------
    diagram : the moment diagram in the plane of bending (for C_m)
    P_r : required axial strength [N], >= 0
    P_e1 : elastic critical force in the plane of bending [N], > 0
    method : "LRFD" or "ASD"

    Returns
    -------
    B1Result
    """
    method = _method(method)
    if not (math.isfinite(P_r) and P_r >= 0.0):
        raise ModelError("P_r", f"{P_r!r} N is not valid; expected a finite value >= 0")
    if not P_e1 > 0.0:
        raise ModelError("P_e1", f"{P_e1!r} N is not valid; expected a value > 0")
    c = Calc()
    C_m = _c_m(c, diagram)
    c.put(P_r_N=P_r, alpha_B1=B1_ALPHA[method])
    c.labels["method"] = method
    if B1_ALPHA[method] * P_r >= P_e1:
        c.labels["B1"] = "alpha P_r >= P_e1: the member buckles, B1 infinite"
        B1 = math.inf
    elif math.isinf(P_e1):
        c.put(B1=max(C_m, 1.0))
        B1 = max(C_m, 1.0)
    else:
        c.put(P_e1_N=P_e1)
        B1 = float(c.run(STEPS["B1"]))
    return B1Result(C_m, B1, c.values, c.flags, c.labels, tuple(c.steps))


def _compression(c: Calc, inp: BeamColumnInput, method: str) -> None:
    """P_c by Chapter E (E3) on the smallest of the given critical forces (E4 through N_cr,TF)."""
    given = {"N_cr_x_N": inp.N_cr_y, "N_cr_y_N": inp.N_cr_z, "N_cr_TF_N": inp.N_cr_TF}
    finite = tuple(k for k in _NCR if math.isfinite(given[k]))  # type: ignore[arg-type]
    if not finite:
        c.labels["branch_E"] = "no buckling (every N_cr infinite): Fcr = Fy, the limit of (E3-2)"
        c.run(STEPS["Fcr no buckling"])
    else:
        c.put(**{k: given[k] for k in finite})  # type: ignore[arg-type]
        c.run(STEPS["N_cr " + " ".join(finite)])
        c.run(STEPS["Fe"])
        c.run(STEPS["ratio"])
        if c.run(STEPS["inelastic"]):
            c.labels["branch_E"] = "(E3-2) inelastic"
            c.run(STEPS["Fcr_inelastic"])
        else:
            c.labels["branch_E"] = "(E3-3) elastic"
            c.run(STEPS["Fcr_elastic"])
    c.run(STEPS["Pn"])
    if method == "LRFD":
        c.put(phi_c=COMPRESSION_FACTORS["phi_c"])
    else:
        c.put(Omega_c=COMPRESSION_FACTORS["Omega_c"])
    c.run(STEPS[f"{method} P_c"])


def _flexure_major(c: Calc, inp: BeamColumnInput) -> None:
    if inp.shape == "RHS":
        c.run(STEPS["M_px RHS"])
        if inp.susceptible:
            raise ModelError("M_cr", f"{inp.M_cr:g} N m: lateral-torsional buckling of a rectangular hollow section "
                                     "(AISC 360 F7.4) is not covered; give M_cr infinite when it cannot occur")
        c.labels["branch_F"] = "(F7-1) yielding, no lateral-torsional buckling"
        c.run(STEPS["M_nx no LTB"])
        return
    c.run(STEPS["M_px"])
    if not inp.susceptible:
        c.labels["branch_F"] = "(F2-1) yielding, no lateral-torsional buckling (M_cr infinite)"
        c.run(STEPS["M_nx no LTB"])
        return
    if not inp.I_w or inp.J is None:
        raise ModelError("I_w", "missing: AISC 360 F2 with lateral-torsional buckling needs the warping constant "
                                "I_w (> 0) and the torsion constant J")
    c.put(I_y_m4=inp.I_z, C_w_m6=inp.I_w, J_m4=inp.J, E_Pa=inp.E, M_cr_Nm=inp.M_cr, c=C_DOUBLY_SYMMETRIC)
    for name in ("r_y", "h_o", "r_ts", "L_p", "Jc_Sxho", "L_r", "Fcr_LTB", "L_e"):
        c.run(STEPS[name])
    if c.run(STEPS["yielding"]):
        c.labels["branch_F"] = "(F2-1) yielding: L_e <= L_p"
        c.run(STEPS["M_nx yielding"])
    elif c.run(STEPS["inelastic_LTB"]):
        c.labels["branch_F"] = "(F2-2) inelastic lateral-torsional buckling, C_b = 1 at L_e"
        c.run(STEPS["M_nx inelastic"])
    else:
        c.labels["branch_F"] = "(F2-3) elastic lateral-torsional buckling: Fcr = M_cr / S_x"
        c.run(STEPS["M_nx elastic"])


def aisc360_member(inp: BeamColumnInput, method: str = "LRFD") -> BendingCheck:
    """Member with compression and flexure, AISC 360-16 H1.1 (from memory).

    ``P_r / P_c >= 0.2``: ``P_r / P_c + 8/9 (M_rx / M_cx + M_ry / M_cy) <= 1``
    (H1-1a); otherwise ``P_r / (2 P_c) + (M_rx / M_cx + M_ry / M_cy) <= 1``
    (H1-1b).  The axial check ``P_r / P_c <= 1`` (Chapter E) is reported
    beside it, so that without moments the check is the compression check.

    * ``P_c = phi_c P_n`` (LRFD, 0.90) or ``P_n / Omega_c`` (ASD, 1.67):
      E3 with ``F_e = N_cr / A_g`` on the smallest of N_cr,x, N_cr,y and
      N_cr,TF (E4 through the analysis's flexural-torsional force), K = 1:
      the critical forces come from the analysis.
    * ``M_c = phi_b M_n`` (0.90) or ``M_n / Omega_b`` (1.67).  Major axis
      (x): F2 for a compact doubly symmetric I section, ``M_p = F_y Z_x``;
      with a finite M_cr by the equivalent-length route of the module notes
      (``L_p`` F2-5, ``L_r`` F2-6, ``r_ts`` F2-7 with ``r_ts^2 = sqrt(I_y
      C_w) / S_x``, ``h_o = 2 sqrt(C_w / I_y)``, c = 1); F7-1 for a compact
      RHS without lateral-torsional buckling.  Minor axis (y): F6-1
      ``M_n = min(F_y Z_y, 1.6 F_y S_y)`` for I sections, F7-1 ``F_y Z_y``
      for RHS.
    * Required strengths: ``P_r = N_Ed``, ``M_rx = M_y_Ed``, ``M_ry =
      M_z_Ed`` as given: from the direct analysis (second order, with its
      stiffness reduction and notional loads), or first-order moments times
      B1 (:func:`aisc360_b1`).

    Not covered: noncompact or slender sections (classes 3 given), shapes
    other than I and RHS, lateral-torsional buckling of RHS (F7.4), tension
    with flexure (H1.2), H1.3.

    Parameters
    ----------
    inp : BeamColumnInput
        EN axes: y major (AISC x), z minor (AISC y).
    method : "LRFD" (default) or "ASD"

    Returns
    -------
    BendingCheck
        route "H1.1"; utilisations "Chapter E" (P_r / P_c) and "(H1-1a)" or
        "(H1-1b)"; values include P_c_N, M_px_Nm, M_nx_Nm, M_ny_Nm, M_cx_Nm,
        M_cy_Nm, L_p_m, L_r_m, L_e_m.
    """
    method = _method(method)
    if not inp.plastic:
        raise ModelError("section_class", f"{inp.section_class}: {_COMPACT}")
    if inp.shape not in ("I", "RHS") or not inp.doubly_symmetric:
        raise ModelError("shape", f"{inp.shape!r}: AISC 360 flexure is covered here for doubly symmetric I (F2, F6) "
                                  "and rectangular hollow sections (F7) only")
    c = Calc()
    c.labels.update({"method": method, "shape": inp.shape})
    c.put(P_r_N=inp.N_Ed, M_rx_Nm=inp.M_y_Ed, M_ry_Nm=inp.M_z_Ed, A_m2=inp.A, Fy_Pa=inp.fy, E_Pa=inp.E,
          Z_x_m3=inp.W_pl_y, S_x_m3=inp.W_el_y, Z_y_m3=inp.W_pl_z, S_y_m3=inp.W_el_z)
    _compression(c, inp, method)
    _flexure_major(c, inp)
    c.run(STEPS["M_ny I" if inp.shape == "I" else "M_ny RHS"])
    if method == "LRFD":
        c.put(phi_b=FLEXURE_FACTORS["phi_b"])
    else:
        c.put(Omega_b=FLEXURE_FACTORS["Omega_b"])
    c.run(STEPS[f"{method} M_cx"])
    c.run(STEPS[f"{method} M_cy"])
    u = {"Chapter E": c.run(STEPS["Pr_over_Pc"])}
    if c.run(STEPS["H1_1a_applies"]):
        u["(H1-1a)"] = c.run(STEPS["H1-1a"])
    else:
        u["(H1-1b)"] = c.run(STEPS["H1-1b"])
    notes = [_MEMORY, _COMPACT]
    if inp.susceptible and inp.shape == "I":
        notes.append(_ROUTE)
    return c.check(NAME, "H1.1", "AISC 360 H1.1 (H1-1a, H1-1b); E3; F2, F6, F7", u, notes=tuple(notes))
