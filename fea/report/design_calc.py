"""The design part of the report written out as a hand calculation: one block per check.

Every number comes from the JSON ``"design"`` part of the same run (the check's
own keys and its ``details``, see docs/design.md); nothing is recomputed here.
The formulas are those of the functions in :mod:`fea.design.curves` and
:mod:`fea.design.check`; their constants are shown as ``const:`` sources (see
:mod:`fea.report.document`).  Values are shown rounded; the tool carried the
arithmetic at full precision.
"""

from __future__ import annotations

import math
from typing import Any, Callable

from .document import Bullets, Calc, CalcLine, Em, Heading, Note, Para, Q, Sub, Sup, T, Table, convert, q, unit_label

__all__ = ["design_blocks", "FORMULA_CONSTANTS"]

#: The constants each written-out formula may print, by formula (the key after ``const:``).
FORMULA_CONSTANTS: dict[str, frozenset[str]] = {
    "check": frozenset({"1"}),
    "EN 1993-1-1 6.3.1.2": frozenset({"0.5", "1", "0.2"}),
    "EN 1993-1-1 6.2.3": frozenset({"0.9"}),
    "AISC 360 E3": frozenset({"0.658", "0.877", "2.25"}),
    "AS 4100 6.3.3": frozenset({"250", "2100", "13.5", "15.3", "2050", "0.00326", "90", "1", "2"}),
    "AS 4100 7.2": frozenset({"0.85", "1"}),
    "BS 5950-1 Annex C": frozenset({"0.2", "1000", "1", "2", "0"}),
    "Perry-Robertson": frozenset({"1", "2"}),
    "Rankine-Gordon": frozenset({"1"}),
}

AXIS_WORDS = {"major": "major axis", "minor": "minor axis", "in-plane": "in-plane"}


def _k(text: str, formula: str) -> T:
    """A constant of a published formula."""
    assert text in FORMULA_CONSTANTS[formula], (text, formula)
    return T(text, f"const:{formula}")


def _trim_sig(x: float, sig: int) -> int:
    """The fewest significant figures (at most ``sig``) that show ``x`` as ``sig`` figures would."""
    if not math.isfinite(x) or x == 0:
        return sig
    full = float(f"{x:.{sig - 1}e}")
    for s in range(1, sig):
        if float(f"{x:.{s - 1}e}") == full:
            return s
    return sig


def _decimals_sig(x: float, decimals: int = 3) -> int:
    """Significant figures that show ``x`` with ``decimals`` decimals (at least two figures)."""
    if not math.isfinite(x) or x == 0:
        return 3
    return max(2, decimals + int(math.floor(math.log10(abs(x)))) + 1)


class _Check:
    """Access to one check of the JSON design part, as sourced quantities."""

    def __init__(self, c: dict, n: int, u) -> None:
        self.c, self.n, self.u = c, n, u
        self.d = c.get("details") or {}
        self.labels = c.get("labels") or {}

    def src(self, key: str) -> str:
        return f"json:design/checks/{self.n}/{key}"

    def raw(self, key: str) -> Any:
        if key in self.c:
            return self.c[key]
        return self.d.get(key)

    def has(self, key: str) -> bool:
        return self.raw(key) is not None

    def path(self, key: str) -> str:
        return self.src(key) if key in self.c else self.src(f"details/{key}")

    def force(self, key: str) -> Q:
        v = self.raw(key)
        unit = self.u.force
        sig = 4 if v is None else _trim_sig(convert(v, unit), 4)
        return q(v, self.path(key), unit, sig)

    def stress(self, key: str) -> Q:
        v = self.raw(key)
        unit = self.u.stress
        sig = 4 if v is None else _trim_sig(convert(v, unit), 4)
        return q(v, self.path(key), unit, sig)

    def area(self, key: str = "A_m2") -> Q:
        v = self.raw(key)
        return q(v, self.path(key), self.u.area, 4 if v is None else _trim_sig(convert(v, self.u.area), 4))

    def factor(self, key: str) -> Q:
        """A partial or resistance factor, an input: as given, at least two figures (1.0, 0.90, 1.25)."""
        v = self.raw(key)
        return q(v, self.path(key), "", 4 if v is None else max(2, _trim_sig(v, 4)))

    def num(self, key: str, decimals: int = 3) -> Q:
        """A dimensionless result: three decimals below ten, four figures above."""
        v = self.raw(key)
        sig = 3 if v is None else (_decimals_sig(v, decimals) if abs(v) < 10 else 4)
        return q(v, self.path(key), "", sig)

    def plain(self, key: str, sig: int = 4) -> Q:
        v = self.raw(key)
        return q(v, self.path(key), "", 4 if v is None else _trim_sig(v, sig))

    def text(self, key: str) -> T:
        if key in self.c:
            return T(str(self.c[key]), self.src(key))
        return T(str(self.labels[key]), self.src(f"labels/{key}"))


def _wu(qty: Q) -> tuple:
    """A quantity with its unit: ``2026 kN``."""
    return (qty, "\u2009" + unit_label(qty.unit)) if qty.unit else (qty,)


def _sq(qty: Q) -> tuple:
    """A quantity squared: ``(630.4 MPa)²``, or ``0.754²`` without a unit."""
    return ("(", *_wu(qty), ")²") if qty.unit else (qty, "²")


def _neg(qty: Q) -> tuple:
    """A quantity in parentheses when negative (for a product written out)."""
    return ("(", qty, ")") if qty.value is not None and qty.value < 0 else (qty,)


# -- symbols --------------------------------------------------------------------------------------


def sym(base: str, sub: str | T | None = None) -> tuple:
    return (Em(base), Sub(sub)) if sub is not None else (Em(base),)


LAMBDA_BAR = (Em("λ\u0304"),)
N_ED = sym("N", "Ed")
N_CR = sym("N", "cr")
FY = sym("f", "y")
FU = sym("f", "u")
A = sym("A")


def _gamma(m: str) -> tuple:
    return sym("γ", T(m, f"name:{m}"))


SLENDERNESS_SYMBOL = {"lambda_bar": LAMBDA_BAR, "Lc/r": (*sym("L", "c"), "/", Em("r")),
                      "le/r": (*sym("l", "e"), "/", Em("r")), "L_E/r": (*sym("L", "E"), "/", Em("r")),
                      "L/r": (Em("L"), "/", Em("r"))}
REDUCTION_SYMBOL = {"EN 1993-1-1": (Em("χ"),), "AISC 360": (*sym("F", "cr"), "/", *sym("F", "y")),
                    "AS 4100": sym("α", "c"), "BS 5950-1": (*sym("p", "c"), "/", *sym("p", "y")),
                    "Perry-Robertson": (Em("σ"), "/", *FY), "Rankine-Gordon": (Em("σ"), "/", *sym("f", "c")),
                    "working-stress": (*sym("σ", "a"), "/", *sym("σ", "allow"))}


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


# -- lines common to every compression check -------------------------------------------------------


def _head_lines(k: _Check, axis: str) -> list[CalcLine]:
    std = k.c["standard"]
    out = [CalcLine(_design_force_symbol(std, k.c["kind"], k.labels), _wu(k.force("N_Ed_N")),
                    ("(largest design compression in this segment)",))]
    if k.has("N_cr_N"):
        plane = "the in-plane" if axis == "in-plane" else f"the {axis}-axis"
        out.append(CalcLine(N_CR, _wu(k.force("N_cr_N")),
                            (f"(finite-element model: the force in this segment at the lowest critical state of "
                             f"{plane} plane)",)))
    return out


def _equivalent_slenderness(k: _Check, lhs: tuple) -> CalcLine:
    return CalcLine(lhs, ("π √(", Em("E A"), " / ", *N_CR, ") = π √(", *_wu(k.stress("E_Pa")), " × ",
                          *_wu(k.area()), " / ", *_wu(k.force("N_cr_N")), ") = ", k.plain("slenderness", 4)),
                    ("(equivalent slenderness: the one that gives ", *N_CR, " by Euler's formula)",))


def _verdict(k: _Check, force: tuple, resistance: tuple) -> CalcLine:
    passed = bool(k.c["passed"])
    return CalcLine((*force, " / ", *resistance),
                    (*_wu(k.force("N_Ed_N")), " / ", *_wu(k.force("resistance_N")), " = ",
                     k.num("utilisation"), " ≤ " if passed else " > ", _k("1", "check"),
                     "  →  passes" if passed else "  →  FAILS"), key=True)


# -- compression, by standard ----------------------------------------------------------------------


def _en1993(k: _Check, axis: str) -> list[CalcLine]:
    F = "EN 1993-1-1 6.3.1.2"
    lines = _head_lines(k, axis)
    g0, g1 = _gamma("M0"), _gamma("M1")
    res_sym = sym("N", "b,Rd")
    if k.has("N_cr_N"):
        lines.append(CalcLine(LAMBDA_BAR, ("√(", *A, " ", *FY, " / ", *N_CR, ") = √(", *_wu(k.area()), " × ",
                                           *_wu(k.stress("fy_Pa")), " / ", *_wu(k.force("N_cr_N")), ") = √(",
                                           *_wu(k.force("N_pl_N")), " / ", *_wu(k.force("N_cr_N")), ") = ",
                                           k.num("slenderness"))))
        lines.append(CalcLine((Em("α"),), (k.num("alpha", 2),),
                              ("(imperfection factor of buckling curve ", k.text("curve"), ")")))
        lam = k.num("slenderness")
        lines.append(CalcLine((Em("Φ"),), (
            _k("0.5", F), " [", _k("1", F), " + ", Em("α"), " (", *LAMBDA_BAR, " − ", _k("0.2", F), ") + ",
            *LAMBDA_BAR, "²] = ", _k("0.5", F), " [", _k("1", F), " + ", k.num("alpha", 2), " (", lam, " − ",
            _k("0.2", F), ") + ", lam, "²] = ", k.num("phi"))))
        if k.labels.get("branch") == "plateau":
            lines.append(CalcLine((Em("χ"),), (k.num("reduction_factor"),),
                                  ("(", *LAMBDA_BAR, " ≤ ", _k("0.2", F), ": no reduction for buckling)",)))
        else:
            lines.append(CalcLine((Em("χ"),), (
                _k("1", F), " / (", Em("Φ"), " + √(", Em("Φ"), "² − ", *LAMBDA_BAR, "²)) = ", _k("1", F), " / (",
                k.num("phi"), " + √(", k.num("phi"), "² − ", lam, "²)) = ", k.num("reduction_factor")),
                ("(not more than ", _k("1", F), ")")))
        lines.append(CalcLine(res_sym, (Em("χ A"), " ", *FY, " / ", *g1, " = ", k.num("reduction_factor"), " × ",
                                        *_wu(k.area()), " × ", *_wu(k.stress("fy_Pa")), " / ", k.factor("gamma_M1"),
                                        " = ", *_wu(k.force("N_b_Rd_N")))))
    if k.c["governs"] == "material" or not k.has("N_cr_N"):
        lines.append(CalcLine(sym("N", "c,Rd"), (*A, " ", *FY, " / ", *g0, " = ", *_wu(k.area()), " × ",
                                                 *_wu(k.stress("fy_Pa")), " / ", k.factor("gamma_M0"), " = ",
                                                 *_wu(k.force("N_c_Rd_N"))),
                              ("(resistance of the cross-section: it governs)",)))
        res_sym = sym("N", "c,Rd")
    lines.append(_verdict(k, N_ED, res_sym))
    return lines


def _aisc360(k: _Check, axis: str) -> list[CalcLine]:
    F = "AISC 360 E3"
    lrfd = k.labels.get("method", "LRFD") == "LRFD"
    lines = _head_lines(k, axis)
    Fe, Fy, Fcr, Ag = sym("F", "e"), sym("F", "y"), sym("F", "cr"), sym("A", "g")
    if k.has("N_cr_N"):
        lines.append(CalcLine(Fe, (*N_CR, " / ", *Ag, " = ", *_wu(k.force("N_cr_N")), " / ", *_wu(k.area()), " = ",
                                   *_wu(k.stress("Fe_Pa"))),
                              ("(elastic buckling stress from the model, in place of π² ", Em("E"), " / (",
                               *sym("L", "c"), "/", Em("r"), ")²)")))
        lines.append(CalcLine(SLENDERNESS_SYMBOL["Lc/r"], ("π √(", Em("E"), " / ", *Fe, ") = π √(",
                                                           *_wu(k.stress("E_Pa")), " / ", *_wu(k.stress("Fe_Pa")),
                                                           ") = ", k.plain("slenderness", 4)),
                              ("(equivalent slenderness, for information)",)))
        inelastic = k.labels.get("branch") == "inelastic"
        lines.append(CalcLine((*Fy, " / ", *Fe), (
            *_wu(k.stress("Fy_Pa")), " / ", *_wu(k.stress("Fe_Pa")), " = ", k.num("Fy_over_Fe"),
            " ≤ " if inelastic else " > ", _k("2.25", F)),
            ("(", "inelastic" if inelastic else "elastic", " buckling: Eq. ", k.text("equation"), ")")))
        if inelastic:
            lines.append(CalcLine(Fcr, (_k("0.658", F), Sup((*Fy, "/", *Fe)), " ", *Fy, " = ", _k("0.658", F),
                                        Sup((k.num("Fy_over_Fe"),)), " × ", *_wu(k.stress("Fy_Pa")), " = ",
                                        *_wu(k.stress("Fcr_Pa")))))
        else:
            lines.append(CalcLine(Fcr, (_k("0.877", F), " ", *Fe, " = ", _k("0.877", F), " × ",
                                        *_wu(k.stress("Fe_Pa")), " = ", *_wu(k.stress("Fcr_Pa")))))
    else:
        lines.append(CalcLine(Fcr, (*_wu(k.stress("Fcr_Pa")),), ("(no buckling in this plane: the yield stress)",)))
    lines.append(CalcLine(sym("P", "n"), (*Fcr, " ", *Ag, " = ", *_wu(k.stress("Fcr_Pa")), " × ", *_wu(k.area()),
                                          " = ", *_wu(k.force("Pn_N")))))
    if lrfd:
        res = (*sym("φ", "c"), " ", *sym("P", "n"))
        lines.append(CalcLine(res, (k.factor("phi_c"), " × ", *_wu(k.force("Pn_N")), " = ",
                                    *_wu(k.force("resistance_N"))), ("(LRFD design strength)",)))
    else:
        res = (*sym("P", "n"), " / ", *sym("Ω", "c"))
        lines.append(CalcLine(res, (*_wu(k.force("Pn_N")), " / ", k.factor("Omega_c"), " = ",
                                    *_wu(k.force("resistance_N"))), ("(ASD allowable strength)",)))
        res = ("(", *res, ")")
    lines.append(_verdict(k, sym("P", "u" if lrfd else "a"), res))
    return lines


def _as4100(k: _Check, axis: str) -> list[CalcLine]:
    F = "AS 4100 6.3.3"
    lines = _head_lines(k, axis)
    le = SLENDERNESS_SYMBOL["le/r"]
    ln_, lam, aa, ab, ac, kf = sym("λ", "n"), (Em("λ"),), sym("α", "a"), sym("α", "b"), sym("α", "c"), sym("k", "f")
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, le))
        lines.append(CalcLine(ln_, (
            "(", *le, ") √", *kf, " √(", *FY, " / ", _k("250", F), " MPa) = ", k.plain("slenderness", 4), " × √",
            k.factor("kf"), " × √(", *_wu(k.stress("fy_Pa")), " / ", _k("250", F), " MPa) = ",
            k.plain("lambda_n", 4))))
        n = k.plain("lambda_n", 4)
        lines.append(CalcLine(aa, (
            _k("2100", F), " (", *ln_, " − ", _k("13.5", F), ") / (", *ln_, "² − ", _k("15.3", F), " ", *ln_,
            " + ", _k("2050", F), ") = ", _k("2100", F), " × (", n, " − ", _k("13.5", F), ") / (", n, "² − ",
            _k("15.3", F), " × ", n, " + ", _k("2050", F), ") = ", k.plain("alpha_a", 4))))
        lines.append(CalcLine(lam, (*ln_, " + ", *aa, " ", *ab, " = ", n, " + ", *_neg(k.plain("alpha_a", 4)),
                                    " × ", *_neg(k.factor("alpha_b")), " = ", k.plain("lambda", 4)),
                              ("(", *ab, " = ", k.factor("alpha_b"), ": member section constant)")))
        L = k.plain("lambda", 4)
        if k.labels.get("branch") == "plateau":
            lines.append(CalcLine(ac, (k.num("reduction_factor"),),
                                  ("(", Em("λ"), " ≤ ", _k("13.5", F), ": no reduction for buckling)",)))
        else:
            lines.append(CalcLine((Em("η"),), (_k("0.00326", F), " (", Em("λ"), " − ", _k("13.5", F), ") = ",
                                               _k("0.00326", F), " × (", L, " − ", _k("13.5", F), ") = ",
                                               k.num("eta", 4))))
            lines.append(CalcLine((Em("ξ"),), (
                "[(", Em("λ"), "/", _k("90", F), ")² + ", _k("1", F), " + ", Em("η"), "] / [", _k("2", F), " (",
                Em("λ"), "/", _k("90", F), ")²] = [(", L, "/", _k("90", F), ")² + ", _k("1", F), " + ",
                k.num("eta", 4), "] / [", _k("2", F), " × (", L, "/", _k("90", F), ")²] = ", k.num("xi"))))
            lines.append(CalcLine(ac, (
                Em("ξ"), " [", _k("1", F), " − √(", _k("1", F), " − (", _k("90", F), " / (", Em("ξ λ"), "))²)] = ",
                k.num("xi"), " × [", _k("1", F), " − √(", _k("1", F), " − (", _k("90", F), " / (", k.num("xi"),
                " × ", L, "))²)] = ", k.num("reduction_factor")), ("(not more than ", _k("1", F), ")")))
    lines.append(CalcLine(sym("N", "s"), (*kf, " ", *sym("A", "n"), " ", *FY, " = ", k.factor("kf"), " × ",
                                          *_wu(k.area()), " × ", *_wu(k.stress("fy_Pa")), " = ",
                                          *_wu(k.force("Ns_N"))), ("(", *sym("A", "n"), " = ", Em("A"), ")")))
    lines.append(CalcLine(sym("N", "c"), (*ac, " ", *sym("N", "s"), " = ", k.num("reduction_factor"), " × ",
                                          *_wu(k.force("Ns_N")), " = ", *_wu(k.force("Nc_N")))))
    res = (Em("φ"), " ", *sym("N", "c"))
    lines.append(CalcLine(res, (k.factor("phi"), " × ", *_wu(k.force("Nc_N")), " = ", *_wu(k.force("resistance_N"))),
                          ("(design member capacity)",)))
    lines.append(_verdict(k, (Em("N*"),), res))
    return lines


def _bs5950(k: _Check, axis: str) -> list[CalcLine]:
    F = "BS 5950-1 Annex C"
    lines = _head_lines(k, axis)
    F0 = _k("0", F)
    lam, pE, py, pc, l0 = (Em("λ"),), sym("p", "E"), sym("p", "y"), sym("p", "c"), sym("λ", F0)
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, (Em("λ"), " = ", *SLENDERNESS_SYMBOL["L_E/r"])))
        L = k.plain("slenderness", 4)
        lines.append(CalcLine(pE, ("π² ", Em("E"), " / ", Em("λ"), "² = π² × ", *_wu(k.stress("E_Pa")), " / ", L,
                                   "² = ", *_wu(k.stress("pE_Pa")))))
        lines.append(CalcLine(l0, (_k("0.2", F), " √(π² ", Em("E"), " / ", *py, ") = ", _k("0.2", F), " × √(π² × ",
                                   *_wu(k.stress("E_Pa")), " / ", *_wu(k.stress("py_Pa")), ") = ",
                                   k.plain("lambda0", 4)), ("(", *py, " = ", *FY, ")")))
        lines.append(CalcLine((Em("η"),), (Em("a"), " (", Em("λ"), " − ", *l0, ") / ", _k("1000", F), " = ",
                                           k.plain("a"), " × (", L, " − ", k.plain("lambda0", 4), ") / ",
                                           _k("1000", F), " = ", k.num("eta", 4)),
                              ("(Robertson constant ", Em("a"), " of strut curve ", k.text("curve"),
                               "; η not less than ", F0, ")")))
        lines.append(CalcLine((Em("φ"),), (
            "[", *py, " + (", Em("η"), " + ", _k("1", F), ") ", *pE, "] / ", _k("2", F), " = [",
            *_wu(k.stress("py_Pa")), " + (", k.num("eta", 4), " + ", _k("1", F), ") × ", *_wu(k.stress("pE_Pa")),
            "] / ", _k("2", F), " = ", *_wu(k.stress("phi_Pa")))))
        lines.append(CalcLine(pc, (
            *pE, " ", *py, " / (", Em("φ"), " + √(", Em("φ"), "² − ", *pE, " ", *py, ")) = ",
            *_wu(k.stress("pE_Pa")), " × ", *_wu(k.stress("py_Pa")), " / (", *_wu(k.stress("phi_Pa")), " + √(",
            *_sq(k.stress("phi_Pa")), " − ", *_wu(k.stress("pE_Pa")), " × ", *_wu(k.stress("py_Pa")), ")) = ",
            *_wu(k.stress("pc_Pa"))), ("(not more than ", *py, ")")))
    else:
        lines.append(CalcLine(pc, (*_wu(k.stress("pc_Pa")),), ("(no buckling in this plane: ", *py, ")")))
    res = sym("P", "c")
    lines.append(CalcLine(res, (*pc, " ", Em("A"), " = ", *_wu(k.stress("pc_Pa")), " × ", *_wu(k.area()), " = ",
                                *_wu(k.force("resistance_N")))))
    lines.append(_verdict(k, sym("F", "c"), res))
    return lines


def _stress_resistance(k: _Check, limit: tuple) -> list[CalcLine]:
    """The closing lines of a method that gives a failure stress: N_R = σ A / FoS and the verdict
    (``limit``: the symbol of the material stress that applies where nothing buckles)."""
    lines = [] if k.has("N_cr_N") else [CalcLine((Em("σ"),), (*_wu(k.stress("stress_Pa")),),
                                                 ("(no buckling in this plane: ", *limit, ")"))]
    res = sym("N", "R")
    lines.append(CalcLine(res, (Em("σ A"), " / FoS = ", *_wu(k.stress("stress_Pa")), " × ", *_wu(k.area()), " / ",
                                k.factor("factor_of_safety"), " = ", *_wu(k.force("resistance_N"))),
                          ("(FoS: factor of safety)",)))
    lines.append(_verdict(k, (Em("N"),), res))
    return lines


def _perry(k: _Check, axis: str) -> list[CalcLine]:
    F = "Perry-Robertson"
    lines = _head_lines(k, axis)
    se = sym("σ", "e")
    lr = SLENDERNESS_SYMBOL["L/r"]
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, lr))
        L = k.plain("slenderness", 4)
        lines.append(CalcLine(se, ("π² ", Em("E"), " / (", *lr, ")² = π² × ", *_wu(k.stress("E_Pa")), " / ", L,
                                   "² = ", *_wu(k.stress("sigma_e_Pa")))))
        lines.append(CalcLine((Em("η"),), (Em("c"), " ", *lr, " = ", k.plain("coefficient"), " × ", L, " = ",
                                           k.num("eta", 4)), ("(Robertson's imperfection factor)",)))
        lines.append(CalcLine((Em("B"),), (
            "[", *FY, " + (", _k("1", F), " + ", Em("η"), ") ", *se, "] / ", _k("2", F), " = [",
            *_wu(k.stress("fy_Pa")), " + (", _k("1", F), " + ", k.num("eta", 4), ") × ",
            *_wu(k.stress("sigma_e_Pa")), "] / ", _k("2", F), " = ", *_wu(k.stress("B_Pa")))))
        lines.append(CalcLine((Em("σ"),), (
            *FY, " ", *se, " / (", Em("B"), " + √(", Em("B"), "² − ", *FY, " ", *se, ")) = ",
            *_wu(k.stress("fy_Pa")), " × ", *_wu(k.stress("sigma_e_Pa")), " / (", *_wu(k.stress("B_Pa")), " + √(",
            *_sq(k.stress("B_Pa")), " − ", *_wu(k.stress("fy_Pa")), " × ", *_wu(k.stress("sigma_e_Pa")), ")) = ",
            *_wu(k.stress("stress_Pa"))),
            ("(the smaller root of (", *FY, " − σ)(", *se, " − σ) = η σ ", *se, "; first yield of the bowed strut)",)))
    return lines + _stress_resistance(k, FY)


def _rankine(k: _Check, axis: str) -> list[CalcLine]:
    F = "Rankine-Gordon"
    lines = _head_lines(k, axis)
    lr = SLENDERNESS_SYMBOL["L/r"]
    fc = sym("f", "c")
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, lr))
        lines.append(CalcLine((Em("σ"),), (
            *fc, " / [", _k("1", F), " + ", Em("a"), " (", *lr, ")²] = ", *_wu(k.stress("crushing_stress_Pa")),
            " / [", _k("1", F), " + ", k.plain("slenderness", 4), "² / ", k.plain("a_inverse", 6), "] = ",
            *_wu(k.stress("stress_Pa"))),
            ("(Rankine constant ", Em("a"), " = ", _k("1", F), "/", k.plain("a_inverse", 6), ")")))
    return lines + _stress_resistance(k, fc)


def _working(k: _Check, axis: str) -> list[CalcLine]:
    lines = _head_lines(k, axis)
    lines[0] = CalcLine((Em("N"),), _wu(k.force("N_Ed_N")), ("(largest compression in this segment at the case "
                                                             "loads)",))
    scr, sa, sal = sym("σ", "cr"), sym("σ", "a"), sym("σ", "allow")
    if k.has("N_cr_N"):
        lines.append(_equivalent_slenderness(k, SLENDERNESS_SYMBOL["L/r"]))
        lines.append(CalcLine(scr, (*N_CR, " / ", Em("A"), " = ", *_wu(k.force("N_cr_N")), " / ", *_wu(k.area()),
                                    " = ", *_wu(k.stress("sigma_cr_Pa"))), ("(elastic critical stress)",)))
        lines.append(CalcLine((*scr, " / FoS"), (*_wu(k.stress("sigma_cr_Pa")), " / ", k.factor("factor_of_safety"),
                                                 " = ", *_wu(k.stress("buckling_stress_Pa"))),
                              ("(allowable against buckling; FoS: factor of safety)",)))
        lines.append(CalcLine(sa, ("min(", *sal, ", ", *scr, " / FoS) = min(", *_wu(k.stress("sigma_allow_Pa")),
                                   ", ", *_wu(k.stress("buckling_stress_Pa")), ") = ",
                                   *_wu(k.stress("allowable_stress_Pa"))),
                              ("(the material's allowable stress governs)" if k.c["governs"] == "material"
                               else "(buckling governs)",)))
    else:
        lines.append(CalcLine(sa, (*_wu(k.stress("allowable_stress_Pa")),),
                              ("(no buckling in this plane: the material's allowable stress)",)))
    res = sym("N", "R")
    lines.append(CalcLine(res, (*sa, " ", Em("A"), " = ", *_wu(k.stress("allowable_stress_Pa")), " × ",
                                *_wu(k.area()), " = ", *_wu(k.force("resistance_N")))))
    lines.append(_verdict(k, (Em("N"),), res))
    return lines


COMPRESSION: dict[str, Callable[[_Check, str], list[CalcLine]]] = {
    "EN 1993-1-1": _en1993, "AISC 360": _aisc360, "AS 4100": _as4100, "BS 5950-1": _bs5950,
    "Perry-Robertson": _perry, "Rankine-Gordon": _rankine, "working-stress": _working}


# -- tension ---------------------------------------------------------------------------------------


def _tension(k: _Check) -> list[CalcLine]:
    std = k.c["standard"]
    force = _design_force_symbol(std, "tension", k.labels)
    lines = [CalcLine(force, _wu(k.force("N_Ed_N")), ("(largest design tension in this segment)",))]
    net = k.has("A_net_m2")
    An = sym("A", "net")
    if std == "EN 1993-1-1":
        F = "EN 1993-1-1 6.2.3"
        lines.append(CalcLine(sym("N", "pl,Rd"), (*A, " ", *FY, " / ", *_gamma("M0"), " = ", *_wu(k.area()), " × ",
                                                  *_wu(k.stress("fy_Pa")), " / ", k.factor("gamma_M0"), " = ",
                                                  *_wu(k.force("N_pl_Rd_N"))), ("(gross section)",)))
        if net:
            lines.append(CalcLine(sym("N", "u,Rd"), (
                _k("0.9", F), " ", *An, " ", *FU, " / ", *_gamma("M2"), " = ", _k("0.9", F), " × ",
                *_wu(k.area("A_net_m2")), " × ", *_wu(k.stress("fu_Pa")), " / ", k.factor("gamma_M2"), " = ",
                *_wu(k.force("N_u_Rd_N"))), ("(net section at the holes)",)))
        res = sym("N", "t,Rd")
    elif std == "AISC 360":
        lrfd = k.labels.get("method", "LRFD") == "LRFD"
        Ag, Fy, Fu = sym("A", "g"), sym("F", "y"), sym("F", "u")
        if lrfd:
            lines.append(CalcLine((*sym("φ", "t"), " ", *Fy, " ", *Ag), (
                k.factor("phi_t_yield"), " × ", *_wu(k.stress("Fy_Pa")), " × ", *_wu(k.area()), " = ",
                *_wu(k.force("yield_N"))), ("(yielding of the gross section)",)))
            if net:
                lines.append(CalcLine((*sym("φ", "t"), " ", *Fu, " ", *sym("A", "e")), (
                    k.factor("phi_t_rupture"), " × ", *_wu(k.stress("fu_Pa")), " × ", *_wu(k.area("A_net_m2")),
                    " = ", *_wu(k.force("rupture_N"))), ("(rupture of the net section, ", *sym("A", "e"), " = ",
                                                         *An, ")")))
            res = (*sym("φ", "t"), " ", *sym("P", "n"))
        else:
            lines.append(CalcLine((*Fy, " ", *Ag, " / ", *sym("Ω", "t")), (
                *_wu(k.stress("Fy_Pa")), " × ", *_wu(k.area()), " / ", k.factor("Omega_t_yield"), " = ",
                *_wu(k.force("yield_N"))), ("(yielding of the gross section)",)))
            if net:
                lines.append(CalcLine((*Fu, " ", *sym("A", "e"), " / ", *sym("Ω", "t")), (
                    *_wu(k.stress("fu_Pa")), " × ", *_wu(k.area("A_net_m2")), " / ", k.factor("Omega_t_rupture"),
                    " = ", *_wu(k.force("rupture_N"))), ("(rupture of the net section, ", *sym("A", "e"), " = ",
                                                         *An, ")")))
            res = ("(", *sym("P", "n"), " / ", *sym("Ω", "t"), ")")
    elif std == "AS 4100":
        F = "AS 4100 7.2"
        lines.append(CalcLine((*sym("A", "g"), " ", *FY), (*_wu(k.area()), " × ", *_wu(k.stress("fy_Pa")), " = ",
                                                           *_wu(k.force("yield_N"))), ("(gross section)",)))
        if net:
            lines.append(CalcLine((_k("0.85", F), " ", *sym("k", "t"), " ", *sym("A", "n"), " ", *FU), (
                _k("0.85", F), " × ", _k("1", F), " × ", *_wu(k.area("A_net_m2")), " × ", *_wu(k.stress("fu_Pa")),
                " = ", *_wu(k.force("rupture_N"))), ("(net section, ", *sym("k", "t"), " = ", _k("1", F), ")")))
        res = (Em("φ"), " ", *sym("N", "t"))
        lines.append(CalcLine(res, (k.factor("phi"), " × ", *_wu(k.force("yield_N" if k.c["governs"] == "gross"
                                                                         else "rupture_N")), " = ",
                                    *_wu(k.force("resistance_N"))), ("(the smaller of the two)",) if net else ()))
    elif std == "BS 5950-1":
        res = sym("P", "t")
        lines.append(CalcLine(res, (*sym("p", "y"), " ", *sym("A", "e"), " = ", *_wu(k.stress("py_Pa")), " × ",
                                    *_wu(k.area("A_net_m2" if net else "A_m2")), " = ",
                                    *_wu(k.force("resistance_N"))),
                              ("(", *sym("A", "e"), " = ", *(An if net else A), ")")))
    elif std == "working-stress":
        res = sym("N", "R")
        lines[0] = CalcLine((Em("N"),), _wu(k.force("N_Ed_N")), ("(largest tension at the case loads)",))
        lines.append(CalcLine(res, (*sym("σ", "allow"), " ", *(An if net else A), " = ",
                                    *_wu(k.stress("sigma_allow_Pa")), " × ",
                                    *_wu(k.area("A_net_m2" if net else "A_m2")), " = ",
                                    *_wu(k.force("resistance_N")))))
    else:  # Perry-Robertson, Rankine-Gordon
        res = sym("N", "R")
        lines.append(CalcLine(res, (Em("f"), " ", *(An if net else A), " / FoS = ", *_wu(k.stress("stress_Pa")),
                                    " × ", *_wu(k.area("A_net_m2" if net else "A_m2")), " / ",
                                    k.factor("factor_of_safety"), " = ", *_wu(k.force("resistance_N"))),
                              ("(yield, or crushing, stress over the section; FoS: factor of safety)",)))
    if std in ("EN 1993-1-1", "AISC 360") and net:
        lines.append(CalcLine(res, (*_wu(k.force("resistance_N")),),
                              ("(the smaller: the ", T(k.c["governs"], k.src("governs")), " section governs)")))
    elif std in ("EN 1993-1-1", "AISC 360"):
        lines.append(CalcLine(res, (*_wu(k.force("resistance_N")),), ("(no holes given: the gross section)",)))
    lines.append(_verdict(k, force, res))
    return lines


# -- the part ---------------------------------------------------------------------------------------


#: Methods that are not a code clause: named by the method (with this word after it) instead of the clause.
CLASSICAL = {"Perry-Robertson": " formula", "Rankine-Gordon": " formula", "working-stress": " rule"}


def _clause(k: _Check) -> tuple:
    """The clause of a check, or the name of a classical method (compression only)."""
    std = k.c["standard"]
    if std in CLASSICAL and k.c["kind"] == "compression":
        return (T(std, k.src("standard")), CLASSICAL[std])
    return (T(k.c["clause"], k.src("clause")),)


def _title(k: _Check) -> tuple:
    c = k.c
    where = "in tension" if c["kind"] == "tension" else AXIS_WORDS.get(c["axis"], c["axis"])
    title: tuple = ("Segment ", Q(c["segment"], k.src("segment"), "", 6), " (", T(c["name"], k.src("name")), "), ",
                    where, " — ", *_clause(k))
    if "curve" in k.labels:
        title += (", ", "strut curve " if c["standard"] == "BS 5950-1" else "curve ", k.text("curve"))
    if c["standard"] == "AISC 360" and "method" in k.labels:
        title += (", ", k.text("method"))
    return title


def _governing_index(part: dict) -> int | None:
    g = part.get("governing") or {}
    for n, c in enumerate(part.get("checks") or []):
        if (c.get("segment"), c.get("axis"), c.get("kind")) == (g.get("segment"), g.get("axis"), g.get("kind")):
            return n
    return None


def _summary_table(part: dict, u, gov: int | None) -> Table:
    checks = part["checks"]
    std = part.get("standard", "")
    rows = []
    for n, c in enumerate(checks):
        k = _Check(c, n, u)
        tension = c["kind"] == "tension"
        slender: tuple = ("—",) if tension or c.get("slenderness") is None else \
            (*SLENDERNESS_SYMBOL.get(c.get("slenderness_name"), ()), " = ",
             k.num("slenderness") if c.get("slenderness_name") == "lambda_bar" else k.plain("slenderness", 4))
        reduction: tuple = ("—",) if tension or c.get("reduction_factor") is None else \
            (*REDUCTION_SYMBOL.get(c["standard"], ()), " = ", k.num("reduction_factor"))
        rows.append(((Q(c["segment"], k.src("segment"), "", 6), " ", T(c["name"], k.src("name"))),
                     ("tension" if tension else AXIS_WORDS.get(c["axis"], c["axis"]),),
                     _clause(k), slender, reduction,
                     (k.force("N_Ed_N"),), (k.force("resistance_N"),), (k.num("utilisation"),),
                     ("passes" if c["passed"] else "FAILS",), ("governs" if n == gov else "",)))
    f = unit_label(u.force)
    return Table((("Segment",), ("Axis",), ("Clause",), ("Slenderness",), ("Reduction",),
                  ("Design force [", f, "]"), ("Resistance [", f, "]"), ("Utilisation",), ("Result",), ("",)),
                 tuple(rows), numeric=(5, 6, 7), strong=() if gov is None else (gov,),
                 caption=("Design force: the largest in the segment at the case loads × the load factor ",
                          q(part.get("load_factor"), "json:design/load_factor", "", 4),
                          "; resistance: the design resistance of the clause; utilisation: their ratio. "
                          "The governing check is set in bold; each check is written out below.",))


def design_blocks(part: dict, u) -> list:
    """Blocks of the design part from its JSON: verdict, summary table, method, one block per check, notes."""
    checks = part.get("checks") or []
    gov = _governing_index(part)
    g = part.get("governing") or {}
    blocks: list = []
    verdict = "every check passes" if part.get("passed") else "at least one check FAILS"
    where: tuple = ()
    if g:
        axis = "in tension" if g.get("kind") == "tension" else AXIS_WORDS.get(g.get("axis"), g.get("axis", ""))
        where = (" (segment ", Q(g["segment"], "json:design/governing/segment", "", 6), ", ",
                 T(g["name"], "json:design/governing/name"), ", ", axis, ")")
    std = part.get("standard", "")
    blocks.append(Para(("Checked by ", *(("the ",) if std in CLASSICAL else ()), T(std, "json:design/standard"),
                        CLASSICAL.get(std, ""), ": ", verdict,
                        "; the largest utilisation is ",
                        q(part.get("max_utilisation"), "json:design/max_utilisation", "", 3), *where, ".")))
    if not checks:
        return blocks
    blocks.append(Heading(3, "Summary of the checks"))
    blocks.append(_summary_table(part, u, gov))

    blocks.append(Heading(3, "Method"))
    blocks.append(Para((
        "Each segment is checked about each bending plane in which it is compressed, and in tension where it is "
        "pulled. The slenderness comes from the critical force ", *N_CR, " of the finite-element model (the force "
        "in the segment at the lowest critical state of that plane), not from a tabulated effective length. "
        "The checks below write out the formulas with the numbers substituted, in the display units of the case; "
        "the numbers are shown rounded while the tool carried full precision, so re-working a line by hand can "
        "differ in the last figure shown.",)))
    seen: list[tuple] = []
    items = []
    for n, c in enumerate(checks):
        key = (c.get("clause"), c.get("formula"))
        if key in seen:
            continue
        seen.append(key)
        items.append((T(c.get("clause", ""), f"json:design/checks/{n}/clause"), ": ",
                      T(c.get("formula", ""), f"json:design/checks/{n}/formula")))
    blocks.append(Para(("Formulas as recorded in the result:",)))
    blocks.append(Bullets(tuple(items)))

    for n, c in enumerate(checks):
        k = _Check(c, n, u)
        if c.get("kind") == "tension":
            lines = _tension(k)
        else:
            lines = COMPRESSION[c["standard"]](k, c["axis"])
        notes = []
        if c.get("note"):
            notes.append(("Note: ", T(c["note"], k.src("note")), "."))
        blocks.append(Calc(_title(k), tuple(lines), tuple(notes), highlight=n == gov))

    notes = part.get("notes") or []
    if notes:
        blocks.append(Heading(3, "Notes"))
        blocks.append(Bullets(tuple((T(t, f"json:design/notes/{i}"),) for i, t in enumerate(notes))))
    if part.get("caution"):
        blocks.append(Note((T(part["caution"], "json:design/caution"),)))
    return blocks
