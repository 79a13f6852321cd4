"""The written-out lines of each design check, standard by standard, from the standards' own steps.

Each function prints one check (its numbers from the JSON design part) through
the steps of its standard's record (:mod:`fea.design.standards`): which steps
apply, in what order, with what remarks.  Formulas and constants are the
records'; this module holds only the symbols and the wording.
"""

from __future__ import annotations

from typing import Callable

from ..design.standards import PASSES, STANDARDS, UTILISATION
from ..design.standards.record import EQUIVALENT_SLENDERNESS
from .design_steps import N_CR_SYMBOL, Check, Name, condition, printed, step_line, sym, with_unit
from .document import CalcLine, Em, Q, T

__all__ = ["COMPRESSION", "tension_lines", "SLENDERNESS_SYMBOL", "REDUCTION_SYMBOL", "SUMMARY_NOTATION",
           "summary_notation"]

LAMBDA_BAR = (Em("λ\u0304"),)
N_ED = sym("N", "Ed")
N_CR = N_CR_SYMBOL
FY = sym("f", "y")
A = sym("A")

SLENDERNESS_SYMBOL = {"lambda_bar": LAMBDA_BAR, "Lc/r": (*sym("L", "c"), "/", Em("r")),
                      "le/r": (*sym("l", "e"), "/", Em("r")), "L_E/r": (*sym("L", "E"), "/", Em("r")),
                      "L/r": (Em("L"), "/", Em("r"))}
REDUCTION_SYMBOL = {"EN 1993-1-1": (Em("χ"),), "AISC 360": (*sym("F", "cr"), "/", *sym("F", "y")),
                    "AS 4100": sym("α", "c"), "BS 5950-1": (*sym("p", "c"), "/", *sym("p", "y")),
                    "Perry-Robertson": (Em("σ"), "/", *FY), "Rankine-Gordon": (Em("σ"), "/", *sym("f", "c")),
                    "working-stress": (*sym("σ", "a"), "/", *sym("σ", "allow"))}

#: Each standard's own words and symbols for the design force and the design resistance of a compression
#: check, as the summary of the checks heads its columns: (force words, force symbol, resistance words,
#: resistance symbol).  AISC 360 by its method (LRFD, ASD).
SUMMARY_NOTATION: dict[str, tuple[str, tuple, str, tuple]] = {
    "EN 1993-1-1": ("Design force", sym("N", "Ed"), "Design resistance", sym("N", "b,Rd")),
    "AISC 360 LRFD": ("Required strength", sym("P", "u"), "Design strength", (*sym("φ", "c"), " ", *sym("P", "n"))),
    "AISC 360 ASD": ("Required strength", sym("P", "a"), "Allowable strength",
                     (*sym("P", "n"), " / ", *sym("Ω", "c"))),
    "AS 4100": ("Design axial force", (Em("N*"),), "Design member capacity", (Em("φ"), " ", *sym("N", "c"))),
    "BS 5950-1": ("Applied compression", sym("F", "c"), "Compression resistance", sym("P", "c")),
    "Perry-Robertson": ("Axial load", (Em("N"),), "Allowable load", sym("N", "R")),
    "Rankine-Gordon": ("Axial load", (Em("N"),), "Allowable load", sym("N", "R")),
    "working-stress": ("Axial load at the case loads", (Em("N"),), "Allowable load", sym("N", "R")),
}


def summary_notation(standard: str, method: str | None = None) -> tuple[str, tuple, str, tuple]:
    """The words and symbols of :data:`SUMMARY_NOTATION` for ``standard`` (and its ``method``)."""
    key = f"{standard} {method or 'LRFD'}" if standard == "AISC 360" else standard
    return SUMMARY_NOTATION.get(key, ("Design force", (Em("N"),), "Resistance", sym("N", "R")))


def _gamma(m: str) -> tuple:
    return sym("γ", T(m, f"name:{m}"))


def _force(key: str) -> Callable[[Check], Q]:
    return lambda k: k.force(key)


def _stress(key: str) -> Callable[[Check], Q]:
    return lambda k: k.stress(key)


def _factor(key: str) -> Callable[[Check], Q]:
    return lambda k: k.factor(key)


def _num(key: str, decimals: int = 3) -> Callable[[Check], Q]:
    return lambda k: k.num(key, decimals)


def _plain(key: str, sig: int = 4) -> Callable[[Check], Q]:
    return lambda k: k.plain(key, sig)


#: Names every standard's formulas share.
COMMON = {
    "A_m2": Name(A, lambda k: k.area()),
    "A_net_m2": Name(sym("A", "net"), lambda k: k.area("A_net_m2")),
    "fy_Pa": Name(FY, _stress("fy_Pa")),
    "fu_Pa": Name(sym("f", "u"), _stress("fu_Pa")),
    "E_Pa": Name((Em("E"),), _stress("E_Pa")),
    "N_cr_N": Name(N_CR, _force("N_cr_N")),
    "N_Ed_N": Name(N_ED, _force("N_Ed_N")),
    "utilisation": Name((), _num("utilisation")),
    "resistance_N": Name(sym("N", "R"), _force("resistance_N")),
    "factor_of_safety": Name(("FoS",), _factor("factor_of_safety")),
    "eta": Name((Em("η"),), _num("eta", 4)),
    "gamma_M0": Name(_gamma("M0"), _factor("gamma_M0")),
    "gamma_M1": Name(_gamma("M1"), _factor("gamma_M1")),
    "gamma_M2": Name(_gamma("M2"), _factor("gamma_M2")),
}


def _names(**extra: Name) -> dict[str, Name]:
    return {**COMMON, **extra}


def _design_force_symbol(standard: str, kind: str, labels: dict) -> tuple:
    if standard == "EN 1993-1-1":
        return N_ED if kind == "compression" else sym("N", "t,Ed")
    if standard == "AISC 360":
        return sym("P", "u" if labels.get("method", "LRFD") == "LRFD" else "a")
    if standard == "AS 4100":
        return (Em("N*"),)
    if standard == "BS 5950-1":
        return sym("F", "c" if kind == "compression" else "t")
    return (Em("N"),)


# -- lines common to every check -------------------------------------------------------------------


def _head_lines(k: Check, axis: str) -> list[CalcLine]:
    std = k.c["standard"]
    out = [CalcLine(_design_force_symbol(std, k.c["kind"], k.labels), with_unit(k.force("N_Ed_N")),
                    ("(largest design compression in this segment)",))]
    if k.has("N_cr_N"):
        plane = "the in-plane" if axis == "in-plane" else (
            "the thin-walled (flexural-torsional)" if axis == "torsional" else f"the {axis}-axis")
        out.append(CalcLine(N_CR, with_unit(k.force("N_cr_N")),
                            (f"(finite-element model: the force in this segment at the lowest critical state of "
                             f"{plane} plane)",)))
    return out


def _equivalent_slenderness(k: Check, lhs: tuple) -> CalcLine:
    return step_line(k, EQUIVALENT_SLENDERNESS, _names(slenderness=Name(lhs, _plain("slenderness", 4))), lhs,
                     ("(equivalent slenderness: the one that gives ", *N_CR, " by Euler's formula)",))


def _verdict(k: Check, force: tuple, resistance: tuple) -> CalcLine:
    passed = bool(k.c["passed"])
    names = _names(N_Ed_N=Name(force, _force("N_Ed_N")), resistance_N=Name(resistance, _force("resistance_N")))
    formula = printed(UTILISATION, names)
    return CalcLine(tuple(formula), (*printed(UTILISATION, names, k), " = ", k.num("utilisation"),
                                     *condition(PASSES, passed), "  →  passes" if passed else "  →  FAILS"),
                    key=True)


# -- compression, by standard ----------------------------------------------------------------------


def _en1993(k: Check, axis: str) -> list[CalcLine]:
    S = STANDARDS["EN 1993-1-1"].steps
    n = _names(slenderness=Name(LAMBDA_BAR, _num("slenderness")), alpha=Name((Em("α"),), _num("alpha", 2)),
               phi=Name((Em("Φ"),), _num("phi")), reduction_factor=Name((Em("χ"),), _num("reduction_factor")),
               N_b_Rd_N=Name(sym("N", "b,Rd"), _force("N_b_Rd_N")),
               N_c_Rd_N=Name(sym("N", "c,Rd"), _force("N_c_Rd_N")))
    lines = _head_lines(k, axis)
    res_sym = n["N_b_Rd_N"].symbol
    if k.has("N_cr_N"):
        lines.append(step_line(k, S["slenderness"], n))
        lines.append(CalcLine((Em("α"),), (k.num("alpha", 2),),
                              ("(imperfection factor of buckling curve ", k.text("curve"), ")")))
        lines.append(step_line(k, S["phi"], n))
        if k.labels.get("branch") == "plateau":
            lines.append(CalcLine((Em("χ"),), (k.num("reduction_factor"),),
                                  ("(", *printed(S["plateau"], n), ": no reduction for buckling)",)))
        else:
            lines.append(step_line(k, S["chi"], n))
        lines.append(step_line(k, S["N_b_Rd"], n))
    if k.c["governs"] == "material" or not k.has("N_cr_N"):
        lines.append(step_line(k, S["N_c_Rd"], n, remark=("(resistance of the cross-section: it governs)",)))
        res_sym = n["N_c_Rd_N"].symbol
    lines.append(_verdict(k, N_ED, res_sym))
    return lines


def _aisc360(k: Check, axis: str) -> list[CalcLine]:
    S = STANDARDS["AISC 360"].steps
    lrfd = k.labels.get("method", "LRFD") == "LRFD"
    Fe, Fy, Fcr, Ag = sym("F", "e"), sym("F", "y"), sym("F", "cr"), sym("A", "g")
    n = _names(A_m2=Name(Ag, lambda k: k.area()), Fe_Pa=Name(Fe, _stress("Fe_Pa")), Fy_Pa=Name(Fy, _stress("Fy_Pa")),
               Fcr_Pa=Name(Fcr, _stress("Fcr_Pa")), Fy_over_Fe=Name((*Fy, "/", *Fe), _num("Fy_over_Fe")),
               slenderness=Name(SLENDERNESS_SYMBOL["Lc/r"], _plain("slenderness", 4)),
               Pn_N=Name(sym("P", "n"), _force("Pn_N")), phi_c=Name(sym("φ", "c"), _factor("phi_c")),
               Omega_c=Name(sym("Ω", "c"), _factor("Omega_c")))
    lines = _head_lines(k, axis)
    if k.has("N_cr_N"):
        lines.append(step_line(k, S["Fe"], n, remark=("(elastic buckling stress from the model, in place of π² ",
                                                      Em("E"), " / (", *sym("L", "c"), "/", Em("r"), ")²)")))
        lines.append(step_line(k, S["slenderness"], n, remark=("(equivalent slenderness, for information)",)))
        inelastic = k.labels.get("branch") == "inelastic"
        ratio = S["ratio"]
        lines.append(CalcLine(n["Fy_over_Fe"].symbol, (
            *printed(ratio, n, k), " = ", k.num("Fy_over_Fe"), *condition(S["inelastic"], inelastic)),
            ("(", "inelastic" if inelastic else "elastic", " buckling: Eq. ", k.text("equation"), ")")))
        lines.append(step_line(k, S["Fcr_inelastic" if inelastic else "Fcr_elastic"], n))
    else:
        lines.append(CalcLine(Fcr, with_unit(k.stress("Fcr_Pa")), ("(no buckling in this plane: the yield stress)",)))
    lines.append(step_line(k, S["Pn"], n))
    res = printed(S["LRFD" if lrfd else "ASD"], n)
    res_line = step_line(k, S["LRFD" if lrfd else "ASD"], n, tuple(res),
                         ("(LRFD design strength)",) if lrfd else ("(ASD allowable strength)",),
                         result=k.force("resistance_N"))
    lines.append(res_line)
    lines.append(_verdict(k, sym("P", "u" if lrfd else "a"), tuple(res)))
    return lines


def _as4100(k: Check, axis: str) -> list[CalcLine]:
    S = STANDARDS["AS 4100"].steps
    n = _names(slenderness=Name(SLENDERNESS_SYMBOL["le/r"], _plain("slenderness", 4)),
               kf=Name(sym("k", "f"), _factor("kf")), lambda_n=Name(sym("λ", "n"), _plain("lambda_n", 4)),
               alpha_a=Name(sym("α", "a"), _plain("alpha_a", 4)), alpha_b=Name(sym("α", "b"), _factor("alpha_b")),
               lambda_=Name((Em("λ"),), _plain("lambda", 4)), xi=Name((Em("ξ"),), _num("xi")),
               reduction_factor=Name(sym("α", "c"), _num("reduction_factor")),
               An=Name(sym("A", "n"), lambda k: k.area()), Ns_N=Name(sym("N", "s"), _force("Ns_N")),
               Nc_N=Name(sym("N", "c"), _force("Nc_N")), phi=Name((Em("φ"),), _factor("phi")))
    lines = _head_lines(k, axis)
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, n["slenderness"].symbol))
        lines.append(step_line(k, S["lambda_n"], n))
        lines.append(step_line(k, S["alpha_a"], n))
        lines.append(step_line(k, S["lambda"], n, remark=("(", *n["alpha_b"].symbol, " = ", k.factor("alpha_b"),
                                                          ": member section constant)")))
        if k.labels.get("branch") == "plateau":
            lines.append(CalcLine(n["reduction_factor"].symbol, (k.num("reduction_factor"),),
                                  ("(", *printed(S["plateau"], n), ": no reduction for buckling)",)))
        else:
            for name in ("eta", "xi", "alpha_c"):
                lines.append(step_line(k, S[name], n))
    lines.append(step_line(k, S["Ns"], n, remark=("(", *n["An"].symbol, " = ", Em("A"), ")")))
    lines.append(step_line(k, S["Nc"], n))
    res = tuple(printed(S["phi_Nc"], n))
    lines.append(step_line(k, S["phi_Nc"], n, res, ("(design member capacity)",)))
    lines.append(_verdict(k, (Em("N*"),), res))
    return lines


def _bs5950(k: Check, axis: str) -> list[CalcLine]:
    S = STANDARDS["BS 5950-1"].steps
    ref = S["lambda0"].ref
    lam0 = sym("λ", T("0", f"const:{ref}"))
    py = sym("p", "y")
    n = _names(slenderness=Name((Em("λ"),), _plain("slenderness", 4)), pE_Pa=Name(sym("p", "E"), _stress("pE_Pa")),
               py_Pa=Name(py, _stress("py_Pa")), lambda0=Name(lam0, _plain("lambda0", 4)),
               a=Name((Em("a"),), _plain("a")), phi_Pa=Name((Em("φ"),), _stress("phi_Pa")),
               pc_Pa=Name(sym("p", "c"), _stress("pc_Pa")), resistance_N=Name(sym("P", "c"), _force("resistance_N")))
    lines = _head_lines(k, axis)
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, (Em("λ"), " = ", *SLENDERNESS_SYMBOL["L_E/r"])))
        lines.append(step_line(k, S["pE"], n))
        lines.append(step_line(k, S["lambda0"], n, remark=("(", *py, " = ", *FY, ")")))
        lines.append(step_line(k, S["eta"], n, remark=("(Robertson constant ", Em("a"), " of strut curve ",
                                                       k.text("curve"), ")")))
        lines.append(step_line(k, S["phi"], n))
        lines.append(step_line(k, S["pc"], n))
    else:
        lines.append(CalcLine(n["pc_Pa"].symbol, with_unit(k.stress("pc_Pa")),
                              ("(no buckling in this plane: ", *py, ")")))
    lines.append(step_line(k, S["Pc"], n))
    lines.append(_verdict(k, sym("F", "c"), n["resistance_N"].symbol))
    return lines


def _stress_resistance(k: Check, step, n: dict[str, Name], limit: tuple) -> list[CalcLine]:
    """The closing lines of a method that gives a failure stress: N_R = σ A / FoS and the verdict
    (``limit``: the symbol of the material stress that applies where nothing buckles)."""
    lines = [] if k.has("N_cr_N") else [CalcLine((Em("σ"),), with_unit(k.stress("stress_Pa")),
                                                 ("(no buckling in this plane: ", *limit, ")"))]
    lines.append(step_line(k, step, n, remark=("(FoS: factor of safety)",)))
    lines.append(_verdict(k, (Em("N"),), n["resistance_N"].symbol))
    return lines


def _perry(k: Check, axis: str) -> list[CalcLine]:
    S = STANDARDS["Perry-Robertson"].steps
    lr = SLENDERNESS_SYMBOL["L/r"]
    n = _names(slenderness=Name(lr, _plain("slenderness", 4)), sigma_e_Pa=Name(sym("σ", "e"), _stress("sigma_e_Pa")),
               coefficient=Name((Em("c"),), _plain("coefficient")), B_Pa=Name((Em("B"),), _stress("B_Pa")),
               stress_Pa=Name((Em("σ"),), _stress("stress_Pa")), resistance_N=Name(sym("N", "R"),
                                                                                 _force("resistance_N")))
    lines = _head_lines(k, axis)
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, lr))
        lines.append(step_line(k, S["sigma_e"], n))
        lines.append(step_line(k, S["eta"], n, remark=("(Robertson's imperfection factor)",)))
        lines.append(step_line(k, S["B"], n))
        lines.append(step_line(k, S["stress"], n, remark=(
            "(the smaller root of (", *FY, " − σ)(", *n["sigma_e_Pa"].symbol, " − σ) = η σ ",
            *n["sigma_e_Pa"].symbol, ", not more than ", *FY, "; first yield of the bowed strut)",)))
    return lines + _stress_resistance(k, S["N_R"], n, FY)


def _rankine(k: Check, axis: str) -> list[CalcLine]:
    S = STANDARDS["Rankine-Gordon"].steps
    lr = SLENDERNESS_SYMBOL["L/r"]
    one = T("1", f"const:{S['stress'].ref}")
    fc = sym("f", "c")
    n = _names(slenderness=Name(lr, _plain("slenderness", 4)),
               crushing_stress_Pa=Name(fc, _stress("crushing_stress_Pa")),
               a=Name((Em("a"),), lambda k: (one, "/", k.plain("a_inverse", 6))),
               stress_Pa=Name((Em("σ"),), _stress("stress_Pa")),
               resistance_N=Name(sym("N", "R"), _force("resistance_N")))
    lines = _head_lines(k, axis)
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, lr))
        lines.append(step_line(k, S["stress"], n, remark=("(Rankine constant ", Em("a"), " = ", one, "/",
                                                          k.plain("a_inverse", 6), ")")))
    return lines + _stress_resistance(k, S["N_R"], n, fc)


def _working(k: Check, axis: str) -> list[CalcLine]:
    S = STANDARDS["working-stress"].steps
    scr, sa, sal = sym("σ", "cr"), sym("σ", "a"), sym("σ", "allow")
    n = _names(sigma_cr_Pa=Name(scr, _stress("sigma_cr_Pa")),
               buckling_stress_Pa=Name((*scr, " / FoS"), _stress("buckling_stress_Pa")),
               sigma_allow_Pa=Name(sal, _stress("sigma_allow_Pa")),
               allowable_stress_Pa=Name(sa, _stress("allowable_stress_Pa")),
               resistance_N=Name(sym("N", "R"), _force("resistance_N")))
    lines = _head_lines(k, axis)
    lines[0] = CalcLine((Em("N"),), with_unit(k.force("N_Ed_N")), ("(largest compression in this segment at the "
                                                                  "case loads)",))
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, SLENDERNESS_SYMBOL["L/r"]))
        lines.append(step_line(k, S["sigma_cr"], n, remark=("(elastic critical stress)",)))
        lines.append(step_line(k, S["buckling"], n, remark=("(allowable against buckling; FoS: factor of safety)",)))
        lines.append(step_line(k, S["allowable"], n, remark=(
            "(the material's allowable stress governs)" if k.c["governs"] == "material" else "(buckling governs)",)))
    else:
        lines.append(CalcLine(sa, with_unit(k.stress("allowable_stress_Pa")),
                              ("(no buckling in this plane: the material's allowable stress)",)))
    lines.append(step_line(k, S["N_R"], n))
    lines.append(_verdict(k, (Em("N"),), n["resistance_N"].symbol))
    return lines


COMPRESSION: dict[str, Callable[[Check, str], list[CalcLine]]] = {
    "EN 1993-1-1": _en1993, "AISC 360": _aisc360, "AS 4100": _as4100, "BS 5950-1": _bs5950,
    "Perry-Robertson": _perry, "Rankine-Gordon": _rankine, "working-stress": _working}


# -- tension ---------------------------------------------------------------------------------------


#: Area symbols of the tension formulas that differ from A and A_net.
_TENSION_AREAS = {"AISC 360": (sym("A", "g"), sym("A", "e")), "AS 4100": (sym("A", "g"), sym("A", "n"))}


def _tension_names(k: Check, net: bool) -> dict[str, Name]:
    area = "A_net_m2" if net else "A_m2"
    gross, holes = _TENSION_AREAS.get(k.c["standard"], (A, sym("A", "net")))
    return _names(A_m2=Name(gross, lambda k: k.area()), A_net_m2=Name(holes, lambda k: k.area("A_net_m2")),
                  fu_Pa=Name(sym("F" if k.c["standard"] == "AISC 360" else "f", "u"), _stress("fu_Pa")),
                  Ae=Name(sym("A", "net") if net else A, lambda k: k.area(area)),
                  Fy_Pa=Name(sym("F", "y"), _stress("Fy_Pa")), py_Pa=Name(sym("p", "y"), _stress("py_Pa")),
                  stress_Pa=Name((Em("f"),), _stress("stress_Pa")), phi=Name((Em("φ"),), _factor("phi")),
                  sigma_allow_Pa=Name(sym("σ", "allow"), _stress("sigma_allow_Pa")),
                  yield_N=Name(sym("N", "y"), _force("yield_N")), rupture_N=Name(sym("N", "u"), _force("rupture_N")),
                  resistance_N=Name(sym("N", "R"), _force("resistance_N")),
                  N_pl_Rd_N=Name(sym("N", "pl,Rd"), _force("N_pl_Rd_N")),
                  N_u_Rd_N=Name(sym("N", "u,Rd"), _force("N_u_Rd_N")),
                  kt=Name(sym("k", "t"), lambda k: (T(f"{STANDARDS['AS 4100'].constants['kt']:g}",
                                                      f"const:{STANDARDS['AS 4100'].steps['rupture'].ref}"),)),
                  **{f: Name(sym("φ" if f.startswith("phi") else "Ω", "t"), _factor(f))
                     for f in ("phi_t_yield", "phi_t_rupture", "Omega_t_yield", "Omega_t_rupture")})


def tension_lines(k: Check) -> list[CalcLine]:
    """The written-out tension check of ``k``."""
    std = k.c["standard"]
    force = _design_force_symbol(std, "tension", k.labels)
    lines = [CalcLine(force, with_unit(k.force("N_Ed_N")), ("(largest design tension in this segment)",))]
    net = k.has("A_net_m2")
    n = _tension_names(k, net)
    S = STANDARDS[std].steps
    gross_net = ("(gross section)",), ("(net section at the holes)",)
    if std == "EN 1993-1-1":
        lines.append(step_line(k, S["N_pl_Rd"], n, remark=gross_net[0]))
        if net:
            lines.append(step_line(k, S["N_u_Rd"], n, remark=gross_net[1]))
        res = sym("N", "t,Rd")
    elif std == "AISC 360":
        method = "LRFD" if k.labels.get("method", "LRFD") == "LRFD" else "ASD"
        for part, remark in (("yield", ("(yielding of the gross section)",)),
                             ("rupture", ("(rupture of the net section, ", *sym("A", "e"), " = ", *sym("A", "net"),
                                          ")"))):
            if part == "yield" or net:
                step = S[f"{part}_{method}"]
                lines.append(step_line(k, step, n, tuple(printed(step, n)), remark))
        res = (*sym("φ", "t"), " ", *sym("P", "n")) if method == "LRFD" else (*sym("P", "n"), " / ", *sym("Ω", "t"))
    elif std == "AS 4100":
        lines.append(step_line(k, S["yield"], n, remark=gross_net[0]))
        if net:
            lines.append(step_line(k, S["rupture"], n, remark=gross_net[1]))
        res = (Em("φ"), " ", *sym("N", "t"))
        step = S["phi_Nt_yield" if k.c["governs"] == "gross" else "phi_Nt_rupture"]
        lines.append(step_line(k, step, n, res, ("(the smaller of the two)",) if net else ()))
    else:
        step = S["Pt"] if std == "BS 5950-1" else S["tension"]
        res = sym("P", "t") if std == "BS 5950-1" else sym("N", "R")
        if std == "working-stress":
            lines[0] = CalcLine((Em("N"),), with_unit(k.force("N_Ed_N")), ("(largest tension at the case loads)",))
        remark = ("(yield, or crushing, stress over the section; FoS: factor of safety)",) \
            if "factor_of_safety" in step.names else ()
        lines.append(step_line(k, step, n, res, remark))
    if std in ("EN 1993-1-1", "AISC 360"):
        why = ("(the smaller: the ", T(k.c["governs"], k.src("governs")), " section governs)") if net else \
            ("(no holes given: the gross section)",)
        lines.append(CalcLine(res, with_unit(k.force("resistance_N")), why))
    lines.append(_verdict(k, force, res))
    return lines
