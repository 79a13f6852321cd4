"""EN 1993-1-1:2005 members with axial compression and bending: 6.3.3 with Annex A or B, 6.3.2 and 6.2.

Pure kernel (SI floats, no I/O).  Every formula is a written-out
:class:`~fea.design.standards.record.Step`, evaluated and recorded in order in
the result (:class:`~fea.design.bending_record.BendingCheck`) so that the report
prints what was computed.  The flexural reduction factors reuse the steps of
6.3.1.2 from :mod:`fea.design.standards.en1993` (one home for Eq. 6.49),
renamed per axis; every formula is in :mod:`fea.design.bending_en_steps`.

The formulas of Annex A (Tables A.1, A.2), Annex B (Tables B.1-B.3), 6.3.2.3
and Table 6.6 are written from memory: the document was not at hand.  Check
them against it before relying on a result.
"""

from __future__ import annotations

import math

from fea.errors import ModelError

from .bending_en_steps import (
    ANNEXES,
    B3_TABLE,
    KC_SPAN,
    LT_CURVES,
    LT_IMPERFECTION,
    LTB_METHODS,
    NAME,
    STEPS,
)
from .bending_record import BeamColumnInput, BendingCheck, Calc, MomentDiagram
from .standards.en1993 import EN1993_IMPERFECTION

__all__ = ["LT_IMPERFECTION", "LTB_METHODS", "LT_CURVES", "ANNEXES", "STEPS", "en1993_cm", "en1993_lt_curve",
           "en1993_ltb", "en1993_member", "en1993_cross_section"]

# notes the checks carry
_MEMORY = ("EN 1993-1-1 Annex A, Annex B, 6.3.2.3 and Tables 6.6, B.3: formulas from memory (the document was "
           "not at hand); check them against it")
_FLEXURAL = ("chi_y and chi_z from flexural buckling (6.3.3(4)); torsional and flexural-torsional buckling in "
             "compression are the separate torsional check")
_DELTA_M = "Delta M_y,Ed = Delta M_z,Ed = 0 (classes 1 to 3; class 4 is not covered)"
_SECTION = ("the cross-section is also checked (6.2) at the largest first-order moments with N_Ed, where the "
            "interaction with C_m < 1 does not cover it")


# ---------------------------------------------------------------------------
# parts of the calculation


def _base(c: Calc, inp: BeamColumnInput) -> None:
    c.put(N_Ed_N=inp.N_Ed, M_y_Ed_Nm=inp.M_y_Ed, M_z_Ed_Nm=inp.M_z_Ed, A_m2=inp.A, fy_Pa=inp.fy,
          W_y_m3=inp.W_y, W_z_m3=inp.W_z, gamma_M0=inp.gamma_M0, gamma_M1=inp.gamma_M1)
    c.labels.update({"section_class": str(inp.section_class), "shape": inp.shape,
                     "moduli": "plastic (class 1-2)" if inp.plastic else "elastic (class 3)"})


def _chi(c: Calc, inp: BeamColumnInput, ax: str) -> None:
    """chi_y or chi_z of 6.3.1.2 (Eq. 6.49) on the given N_cr."""
    curve = getattr(inp, f"curve_{ax}")
    if curve not in EN1993_IMPERFECTION:
        raise ModelError(f"curve_{ax}", f"{curve!r} is not an EN 1993-1-1 buckling curve; expected one of "
                                        f"{', '.join(EN1993_IMPERFECTION)}")
    c.labels[f"curve_{ax}"] = curve
    c.put(**{f"alpha_{ax}": EN1993_IMPERFECTION[curve]})
    N_cr = getattr(inp, f"N_cr_{ax}")
    if math.isinf(N_cr):
        c.put(**{f"lambda_{ax}": 0.0, f"chi_{ax}": 1.0})
        c.labels[f"branch_{ax}"] = f"no flexural buckling about {ax} (N_cr infinite): chi = 1"
        return
    c.put(**{f"N_cr_{ax}_N": N_cr})
    c.run(STEPS[f"slenderness_{ax}"])
    if c.run(STEPS[f"plateau_{ax}"]):
        c.put(**{f"chi_{ax}": 1.0})
        c.labels[f"branch_{ax}"] = "plateau"
    else:
        c.run(STEPS[f"phi_{ax}"])
        c.run(STEPS[f"chi_{ax}"])
        c.labels[f"branch_{ax}"] = "curve"


def _k_c(c: Calc, d: MomentDiagram) -> None:
    """k_c of Table 6.6 for the diagram between lateral-torsional restraints (from memory)."""
    if d.kind == "end moments":
        c.put(psi_LT=d.psi)
        c.run(STEPS["k_c end moments"])
    elif d.kind in KC_SPAN and math.isinf(d.span_ratio):
        c.run(STEPS[f"k_c {d.kind}"])
    else:
        c.run(STEPS["k_c other"])
        c.labels["k_c"] = f"{d.kind} with end moments: not in Table 6.6, k_c = 1.0 (conservative)"


def _chi_lt(c: Calc, inp: BeamColumnInput, ltb: str) -> None:
    """chi_LT of 6.3.2.2 or 6.3.2.3 on the given M_cr (1 when the member is not susceptible)."""
    if ltb not in LTB_METHODS:
        raise ModelError("ltb", f"{ltb!r} is not known; expected one of {', '.join(LTB_METHODS)}")
    c.labels["ltb_method"] = {"general": "6.3.2.2 general case", "rolled": "6.3.2.3 rolled or equivalent welded"}[ltb]
    if not inp.susceptible:
        c.put(chi_LT=1.0)
        c.labels["susceptible"] = "no: M_cr infinite (no lateral-torsional buckling), chi_LT = 1"
        return
    c.labels["susceptible"] = "yes: M_cr from the analysis"
    curve = inp.curve_LT
    if curve not in LT_IMPERFECTION:
        raise ModelError("curve_LT", f"{curve!r} is not a lateral-torsional buckling curve; expected one of "
                                     f"{', '.join(LT_IMPERFECTION)}")
    c.labels["curve_LT"] = curve
    c.put(M_cr_Nm=inp.M_cr, alpha_LT=LT_IMPERFECTION[curve], **LTB_METHODS[ltb])
    c.run(STEPS["lambda_LT"])
    if c.run(STEPS["plateau_LT"]) or c.run(STEPS["plateau_LT_moment"]):
        c.put(chi_LT=1.0)
        c.labels["branch_LT"] = "6.3.2.2(4): lateral-torsional buckling may be ignored, chi_LT = 1"
        return
    c.labels["branch_LT"] = "curve"
    if ltb == "general":
        c.run(STEPS["Phi_LT"])
        c.run(STEPS["chi_LT"])
        return
    c.run(STEPS["Phi_LT_rolled"])
    c.run(STEPS["chi_LT_rolled"])
    _k_c(c, inp.lt_diagram)
    c.run(STEPS["f_mod"])
    c.run(STEPS["chi_LT_mod"])


def _cm_branch(d: MomentDiagram) -> tuple[str, dict[str, float]]:
    """The Table B.3 branch of a diagram and the numbers it takes (generic names)."""
    if d.kind == "end moments":
        return "end moments", {"psi": d.psi}
    if d.kind == "sway":
        return "sway", {}
    if d.end_moments_dominate:
        a = d.span_ratio
        if a >= 0.0:
            return f"{d.kind} s+", {"alpha_s": a}
        return (f"{d.kind} s-", {"alpha_s": a}) if d.psi >= 0.0 else (f"{d.kind} s- psi-", {"alpha_s": a, "psi": d.psi})
    a = 1.0 / d.span_ratio  # 0 for an infinite ratio (no end moments)
    if a < 0.0 and d.psi < 0.0:
        return f"{d.kind} h- psi-", {"alpha_h": a, "psi": d.psi}
    return f"{d.kind} h", {"alpha_h": a}


def _cm(c: Calc, d: MomentDiagram, ax: str) -> float:
    branch, numbers = _cm_branch(d)
    c.put(**{f"{k}_{ax}": v for k, v in numbers.items()})
    c.labels[f"diagram_{ax}"] = d.kind
    return float(c.run(STEPS[f"C_m{ax} {branch}"]))


def en1993_cm(diagram: MomentDiagram) -> float:
    """Equivalent uniform moment factor C_m of EN 1993-1-1 Annex B Table B.3 (from memory).

    ``end moments``: ``C_m = 0.6 + 0.4 psi >= 0.4``; ``sway``: 0.9 (the note
    of Table B.3 for a sway buckling mode); ``uniform load`` and ``point
    load``: with ``alpha_s = M_s / M_h`` when ``|M_h| >= |M_s|``, else
    ``alpha_h = M_h / M_s``, the rows of Table B.3.

    Parameters
    ----------
    diagram : MomentDiagram

    Returns
    -------
    float
        C_m [-].
    """
    branch, numbers = _cm_branch(diagram)
    return float(B3_TABLE[branch](**numbers))


def en1993_lt_curve(ltb: str, fabrication: str, h_over_b: float) -> str:
    """The lateral-torsional buckling curve of EN 1993-1-1 Table 6.4 (``ltb="general"``) or Table 6.5
    (``ltb="rolled"``), from memory.

    Parameters
    ----------
    ltb : "general" or "rolled"
    fabrication : "rolled" or "welded" I section, or "other" (Table 6.4 only: curve d)
    h_over_b : depth over flange width [-]

    Returns
    -------
    str
        "a", "b", "c" or "d".
    """
    table = LT_CURVES.get(ltb)
    if table is None:
        raise ModelError("ltb", f"{ltb!r} is not known; expected one of {', '.join(LTB_METHODS)}")
    if fabrication not in table:
        raise ModelError("fabrication", f"{fabrication!r} is not in EN 1993-1-1 Table "
                                        f"{'6.4' if ltb == 'general' else '6.5'}; expected one of {', '.join(table)}")
    hb = _positive_ratio(h_over_b)
    return table[fabrication][0 if hb <= 2.0 else 1]


def _positive_ratio(x: float) -> float:
    if not (isinstance(x, (int, float)) and math.isfinite(x) and x > 0):
        raise ModelError("h_over_b", f"{x!r} is not valid; expected a finite ratio > 0")
    return float(x)


def _section(c: Calc, inp: BeamColumnInput) -> tuple[dict[str, float], float, str]:
    """The cross-section checks of 6.2: 6.2.1(7) always; 6.2.9.1 for class 1-2 I sections with a_web.

    Returns the utilisations by equation, the cross-section's utilisation (the lower of the two criteria:
    either verifies the section, the linear sum being the conservative one) and its governing equation."""
    c.run(STEPS["N_pl_Rd"])
    c.run(STEPS["M_y_Rd"])
    c.run(STEPS["M_z_Rd"])
    u = {"6.2.1(7)": c.run(STEPS["u_6_2"])}
    if not (inp.plastic and inp.shape == "I" and inp.a_web is not None):
        c.labels["section_route"] = "6.2.1(7) linear sum" + ("" if inp.plastic else " (6.2.9.2 for class 3)")
        return u, u["6.2.1(7)"], "6.2.1(7)"
    c.put(a_web=inp.a_web, W_pl_y_m3=inp.W_pl_y, W_pl_z_m3=inp.W_pl_z)
    n = c.run(STEPS["n"])
    u["(6.9)"] = n
    if n >= 1.0:
        c.labels["section_route"] = "6.2.9.1: N_Ed >= N_pl,Rd, no moment resistance left"
        plastic = {"(6.9)": n}
    else:
        c.run(STEPS["a"])
        for ax in ("y", "z"):
            if f"M_pl_{ax}_Rd_Nm" not in c.values:  # not already written out by Annex A
                c.run(STEPS[f"M_pl_{ax}_Rd"])
        c.run(STEPS["M_N_y_Rd"])
        c.run(STEPS["M_N_z_Rd low"] if c.run(STEPS["n_below_a"]) else STEPS["M_N_z_Rd"])
        c.run(STEPS["beta_N"])
        plastic = {"(6.9)": n, "(6.31) y": c.run(STEPS["u_6_31_y"]), "(6.31) z": c.run(STEPS["u_6_31_z"]),
                   "(6.41)": c.run(STEPS["u_6_41"])}
        u.update(plastic)
        c.labels["section_route"] = "6.2.9.1 class 1-2 I section, or 6.2.1(7), the lower"
    gov = max(plastic, key=lambda k: plastic[k])
    if plastic[gov] <= u["6.2.1(7)"]:
        return u, plastic[gov], gov
    return u, u["6.2.1(7)"], "6.2.1(7)"


def _require_6_3_3(inp: BeamColumnInput) -> None:
    if not inp.doubly_symmetric:
        raise ModelError("doubly_symmetric", "EN 1993-1-1 6.3.3 is written for doubly symmetric members; this "
                                             "section is not: use the second-order route with the cross-section "
                                             "check, or the general method of 6.3.4 (not covered)")


# ---------------------------------------------------------------------------
# the routes


def en1993_cross_section(inp: BeamColumnInput) -> BendingCheck:
    """Cross-section resistance to N_Ed with M_y,Ed and M_z,Ed, EN 1993-1-1 6.2 (the second-order route).

    ``N_Ed / N_pl,Rd + M_y,Ed / M_y,Rd + M_z,Ed / M_z,Rd <= 1`` (6.2.1(7), the
    moduli of the section class; for class 3 this is the elastic criterion
    6.2.9.2) and, for class 1-2 I sections with ``a_web`` given, 6.2.9.1:
    ``n = N_Ed / N_pl,Rd``, ``a = min((A - 2 b t_f)/A, 0.5)``,
    ``M_N,y,Rd = M_pl,y,Rd (1 - n) / (1 - 0.5 a) <= M_pl,y,Rd`` (6.36),
    ``M_N,z,Rd = M_pl,z,Rd`` for ``n <= a`` (6.37), else
    ``M_pl,z,Rd [1 - ((n - a)/(1 - a))^2]`` (6.38), and
    ``(M_y,Ed / M_N,y,Rd)^2 + (M_z,Ed / M_N,z,Rd)^beta <= 1``,
    ``beta = max(5 n, 1)`` (6.41).  Either criterion verifies the section:
    the utilisation is the lower one.  The simplifications 6.2.9.1(4) (no
    reduction for small N_Ed) are not used (they need the web; (6.36) gives
    the full M_pl,y,Rd for small n anyway).  Shear is assumed low (6.2.10 not
    checked).

    Give the moments at the section: in the second-order route, the largest
    second-order moments of the analysis with the imperfections of 5.3.2
    (taking them with N_Ed at one section is conservative).

    Parameters
    ----------
    inp : BeamColumnInput

    Returns
    -------
    BendingCheck
        route "6.2 cross-section"; utilisations "6.2.1(7)" and, with 6.2.9.1,
        "(6.9)", "(6.31) y", "(6.31) z", "(6.41)".
    """
    c = Calc()
    _base(c, inp)
    u, util, gov = _section(c, inp)
    return c.check(NAME, "6.2 cross-section", "EN 1993-1-1 6.2.1(7), 6.2.9", u, utilisation=util, governing=gov,
                   notes=("6.2.9.1 (6.36)-(6.41) from memory", "shear assumed low (6.2.10 not checked)"))


def en1993_ltb(inp: BeamColumnInput, ltb: str = "general") -> BendingCheck:
    """Lateral-torsional buckling resistance M_b,Rd = chi_LT W_y fy / gamma_M1, EN 1993-1-1 6.3.2.

    ``lambda_LT = sqrt(W_y fy / M_cr)`` with M_cr from the analysis;
    6.3.2.2 (general case, default): ``Phi_LT = 0.5 [1 + alpha_LT
    (lambda_LT - 0.2) + lambda_LT^2]``, ``chi_LT = 1 / (Phi_LT +
    sqrt(Phi_LT^2 - lambda_LT^2)) <= 1``; 6.3.2.3 (``ltb="rolled"``, from
    memory): ``Phi_LT = 0.5 [1 + alpha_LT (lambda_LT - 0.4) + 0.75
    lambda_LT^2]``, ``chi_LT <= min(1, 1/lambda_LT^2)``, modified by
    ``f = 1 - 0.5 (1 - k_c) [1 - 2 (lambda_LT - 0.8)^2] <= 1`` with k_c of
    Table 6.6.  6.3.2.2(4): chi_LT = 1 when ``lambda_LT <= lambda_LT,0`` or
    ``M_Ed / M_cr <= lambda_LT,0^2``.  alpha_LT by Table 6.3 from the
    curve ``curve_LT`` (Table 6.4 or 6.5).

    Parameters
    ----------
    inp : BeamColumnInput
    ltb : "general" (6.3.2.2) or "rolled" (6.3.2.3)

    Returns
    -------
    BendingCheck
        route "6.3.2 lateral-torsional buckling"; utilisation "(6.54)"
        M_y,Ed / M_b,Rd.
    """
    c = Calc()
    _base(c, inp)
    _chi_lt(c, inp, ltb)
    c.run(STEPS["M_b_Rd"])
    u = {"(6.54)": c.run(STEPS["u_6_54"])}
    notes = (_MEMORY,) if ltb == "rolled" else ()
    return c.check(NAME, "6.3.2 lateral-torsional buckling", "EN 1993-1-1 6.3.2", u, notes=notes)


def en1993_member(inp: BeamColumnInput, annex: str = "B", ltb: str = "general") -> BendingCheck:
    """Member with compression and bending, EN 1993-1-1 6.3.3, equations (6.61) and (6.62).

    ``N_Ed / (chi_y N_Rk / gamma_M1) + k_yy M_y,Ed / (chi_LT M_y,Rk /
    gamma_M1) + k_yz M_z,Ed / (M_z,Rk / gamma_M1) <= 1`` (6.61) and the same
    with chi_z, k_zy, k_zz (6.62); ``N_Rk = A fy``, ``M_i,Rk = W_i fy``
    (Table 6.7: plastic moduli for classes 1-2, elastic for class 3; class 4
    is not covered), Delta M = 0.  chi_y, chi_z by 6.3.1.2 from the given
    N_cr; chi_LT by 6.3.2 (:func:`en1993_ltb`) from the given M_cr, 1 when
    M_cr is infinite (the member is then not susceptible to torsional
    deformations).  The cross-section is also checked (6.2,
    :func:`en1993_cross_section`) with the same, first-order, moments.

    Interaction factors (from memory):

    * Annex B (default): Table B.1 (not susceptible) or B.2 (susceptible),
      with C_m from Table B.3 (:func:`en1993_cm`).  Class 1-2 needs an I or
      RHS section (k_zz of Table B.1); class 3 any doubly symmetric one.
      The optional k_zy = 0 of the note to Table B.1 is not used.
    * Annex A (Method 1): Tables A.1 and A.2 with C_my,0 and C_mz,0 for end
      moments, or a uniform load or a point load at mid-span on a simply
      supported span (no end moments).  Not covered: a transverse load with
      end moments (Table A.2 needs the member's deflection), a sway mode.
      Needs finite N_cr,y and N_cr,z, and J when M_cr is finite
      (``a_LT = 1 - I_T / I_y``).  ``lambda_0`` is the slenderness for a
      uniform moment: from M_cr0, or M_cr / C_1 with ``C_1 = k_c^-2``
      (Table 6.6).  N_Ed at or above an elastic critical force the factors
      take gives an infinite utilisation (the member buckles elastically).

    Parameters
    ----------
    inp : BeamColumnInput
        ``curve_y``, ``curve_z`` (and ``curve_LT`` when M_cr is finite) are needed.
    annex : "B" (default) or "A"
    ltb : "general" (6.3.2.2, default) or "rolled" (6.3.2.3)

    Returns
    -------
    BendingCheck
        route "6.3.3 Annex B" or "6.3.3 Annex A"; utilisations "(6.61)",
        "(6.62)" and "6.2 cross-section"; values include chi_y, chi_z,
        chi_LT, lambda_y, lambda_z, lambda_LT, C_my, C_mz, C_mLT, k_yy, k_yz,
        k_zy, k_zz, N_Rk_N, M_y_Rk_Nm, M_z_Rk_Nm.
    """
    if annex not in ANNEXES:
        raise ModelError("annex", f"{annex!r} is not known; expected one of {', '.join(ANNEXES)}")
    _require_6_3_3(inp)
    c = Calc()
    _base(c, inp)
    c.labels["annex"] = annex
    c.run(STEPS["N_Rk"])
    c.run(STEPS["M_y_Rk"])
    c.run(STEPS["M_z_Rk"])
    _chi(c, inp, "y")
    _chi(c, inp, "z")
    _chi_lt(c, inp, ltb)
    notes = [_MEMORY, _FLEXURAL, _DELTA_M, _SECTION]
    if annex == "B":
        u = _annex_b(c, inp)
    else:
        u = _annex_a(c, inp, notes)
    s, s_util, s_gov = _section(c, inp)
    c.labels["section_governing"] = s_gov
    u["6.2 cross-section"] = s_util
    return c.check(NAME, f"6.3.3 Annex {annex}", f"EN 1993-1-1 6.3.3 (6.61), (6.62), Annex {annex}; 6.2", u,
                   notes=tuple(notes))


def _annex_b(c: Calc, inp: BeamColumnInput) -> dict[str, float]:
    if inp.plastic and inp.shape not in ("I", "RHS"):
        raise ModelError("shape", f"{inp.shape!r}: EN 1993-1-1 Table B.1 gives k_zz of class 1-2 sections for I "
                                  "and RHS sections only")
    c.run(STEPS["n_y"])
    c.run(STEPS["n_z"])
    _cm(c, inp.diagram_y, "y")
    _cm(c, inp.diagram_z, "z")
    kind = "plastic" if inp.plastic else "elastic"
    c.run(STEPS[f"k_yy {kind}"])
    c.run(STEPS["k_zz plastic " + inp.shape] if inp.plastic else STEPS["k_zz elastic"])
    c.run(STEPS[f"k_yz {kind}"])
    if inp.susceptible:
        c.labels["table"] = "B.2 (susceptible to torsional deformations)"
        _cm(c, inp.lt_diagram, "LT")
        if inp.plastic and c.run(STEPS["stocky_z"]):
            c.run(STEPS["k_zy plastic LT stocky"])
        else:
            c.run(STEPS[f"k_zy {kind} LT"])
    else:
        c.labels["table"] = "B.1 (not susceptible to torsional deformations)"
        c.run(STEPS[f"k_zy {kind}"])
    return {"(6.61)": c.run(STEPS["u_6_61"]), "(6.62)": c.run(STEPS["u_6_62"])}


def _c_m0(c: Calc, d: MomentDiagram, ax: str) -> None:
    if d.kind == "end moments":
        c.put(**{f"psi_{ax}": d.psi})
    elif not (d.transverse and math.isinf(d.span_ratio)):
        raise ModelError(f"diagram_{ax}", f"{d.kind!r} with end moments: EN 1993-1-1 Table A.2 needs the member's "
                                          "deflection for it (not covered); use Annex B")
    c.labels[f"diagram_{ax}"] = d.kind
    c.run(STEPS[f"C_m{ax}_0 {d.kind}"])


def _annex_a(c: Calc, inp: BeamColumnInput, notes: list[str]) -> dict[str, float]:
    for ax in ("y", "z"):
        if math.isinf(getattr(inp, f"N_cr_{ax}")):
            raise ModelError(f"N_cr_{ax}", "infinite: EN 1993-1-1 Annex A needs a finite elastic critical force "
                                           "about each axis; use Annex B")
    c.put(W_el_y_m3=inp.W_el_y, W_el_z_m3=inp.W_el_z, W_pl_y_m3=inp.W_pl_y, W_pl_z_m3=inp.W_pl_z, I_y_m4=inp.I_y)
    limits = {"N_cr_y": inp.N_cr_y, "N_cr_z": inp.N_cr_z}
    if inp.susceptible:
        limits.update(N_cr_T=inp.N_cr_T, N_cr_TF=inp.N_cr_TF)  # type: ignore[arg-type]
    reached = [k for k, v in limits.items() if inp.N_Ed >= v]
    if reached:
        notes.append(f"N_Ed >= {', '.join(reached)}: the member buckles elastically; Annex A undefined, "
                     "utilisation infinite")
        c.labels["branch_A"] = "N_Ed at or above an elastic critical force"
        return {"(6.61)": math.inf, "(6.62)": math.inf}
    for ax in ("y", "z"):
        c.run(STEPS[f"mu_{ax}"])
    _c_m0(c, inp.diagram_y, "y")
    _c_m0(c, inp.diagram_z, "z")
    if inp.susceptible:
        if inp.J is None:
            raise ModelError("J", "missing: EN 1993-1-1 Annex A needs the torsion constant (a_LT = 1 - I_T / I_y)")
        c.put(J_m4=inp.J, M_cr_Nm=inp.M_cr, N_cr_z_N=inp.N_cr_z)
        c.run(STEPS["a_LT"])
        if inp.M_cr0 is not None:
            c.put(M_cr0_Nm=inp.M_cr0)
            c.run(STEPS["C_1 M_cr0"])
        else:
            _k_c(c, inp.lt_diagram)
            c.run(STEPS["C_1 k_c"])
            c.run(STEPS["M_cr0"])
        c.run(STEPS["lambda_0"])
        tf = math.isfinite(inp.N_cr_TF)  # type: ignore[arg-type]
        if tf:
            c.put(N_cr_TF_N=inp.N_cr_TF)  # type: ignore[arg-type]
        small = c.run(STEPS["lambda_0 small" if tf else "lambda_0 small, no TF"])
    else:
        c.put(a_LT=0.0, lambda_0=0.0)
        c.labels["lambda_0"] = "not susceptible (M_cr infinite): lambda_0 = 0, a_LT terms vanish"
        small = True
    if small:
        c.labels["branch_A"] = "lambda_0 small: C_my = C_my,0, C_mz = C_mz,0, C_mLT = 1"
        c.run(STEPS["C_my A"])
        c.put(C_mLT=1.0)
    else:
        c.labels["branch_A"] = "lambda_0 large: lateral-torsional buckling enters C_my and C_mLT"
        if inp.N_Ed > 0.0:
            c.run(STEPS["eps_y"])
            c.run(STEPS["C_my LT"])
        else:  # eps_y infinite: the limit of the formula
            c.put(C_my=1.0 if c.values["a_LT"] > 0.0 else c.values["C_my_0"])
            c.labels["C_my"] = "N_Ed = 0: eps_y infinite, C_my = 1 (its limit; C_my,0 when a_LT = 0)"
        if math.isfinite(inp.N_cr_T):
            c.put(N_cr_T_N=inp.N_cr_T)
            c.run(STEPS["C_mLT"])
        else:
            c.run(STEPS["C_mLT no T"])
    c.run(STEPS["C_mz A"])
    if inp.plastic:
        for name in ("w_y", "w_z", "n_pl", "lambda_max", "M_pl_y_Rd", "M_pl_z_Rd"):
            c.run(STEPS[name])
        for name in ("b_LT", "c_LT", "d_LT", "e_LT", "C_yy", "C_yz", "C_zy", "C_zz"):
            c.run(STEPS[name])
    kind = "plastic" if inp.plastic else "elastic"
    for k in ("k_yy", "k_yz", "k_zy", "k_zz"):
        c.run(STEPS[f"{k} A {kind}"])
    return {"(6.61)": c.run(STEPS["u_6_61"]), "(6.62)": c.run(STEPS["u_6_62"])}
