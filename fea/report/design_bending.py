"""The member checks with bending in the design part of the report: routes, moments, each check written out.

Every number comes from the JSON ``"design"`` part's ``"bending"`` (:mod:`fea.io.design_output`); nothing is
recomputed here.  Each kernel check is printed from its own written-out formula steps (recorded in the JSON in
the order they ran, :mod:`fea.design.bending`), as the compression checks are: the formula in symbols, with the
numbers substituted, and the result; conditions with their outcome.  The constants of each formula print as
``const:`` sources of its published formula (``Step.ref``).
"""

from __future__ import annotations

import ast
import re
from typing import Any, Callable

from ..design.standards import PASSES
from ..design.standards.record import Step
from .design_steps import Check, Name, _decimals_sig, _trim_sig, condition, printed, step_line, sym, with_unit
from .document import Calc, CalcLine, Em, Heading, Para, Q, Sub, T, Table, q, unit_label

__all__ = ["bending_blocks", "symbol", "BendPart", "moment_unit_of", "digit_names"]

#: Bases of the check's names written as Greek letters (EN 1993-1-1's relative slenderness with its bar).
GREEK = {"lambda": "λ\u0304", "chi": "χ", "alpha": "α", "Phi": "Φ", "psi": "ψ", "mu": "μ", "gamma": "γ",
         "beta": "β", "eps": "ε", "phi": "φ", "Omega": "Ω"}
#: Bases that carry their own subscript: ``Fcr`` is F_cr.
SPLIT = {"Fcr": ("F", "cr"), "Fe": ("F", "e"), "Fy": ("F", "y"), "Pn": ("P", "n"), "fy": ("f", "y")}
#: Unit suffixes of the check's names, longest first, and the kind of quantity.
SUFFIXES = (("_Nm", "moment"), ("_Pa", "stress"), ("_m2", "area"), ("_m3", "modulus"), ("_m4", "inertia"),
            ("_m6", "warping"), ("_N", "force"), ("_m", "length"))
#: Names printed with a symbol of their own.
SPECIAL: dict[str, tuple] = {
    "Fy_over_Fe": (*sym("F", "y"), "/", *sym("F", "e")),
    "Pr_over_Pc": (*sym("P", "r"), "/", *sym("P", "c")),
    "Jc_Sxho": (Em("J"), " ", Em("c"), " / (", *sym("S", "x"), " ", *sym("h", "o"), ")"),
    "N_Ed_N": sym("N", "Ed"), "M_y_Ed_Nm": sym("M", "y,Ed"), "M_z_Ed_Nm": sym("M", "z,Ed"),
    "gamma_M0": sym("γ", T("M0", "name:M0")), "gamma_M1": sym("γ", T("M1", "name:M1")),
    "A_m2": (Em("A"),), "E_Pa": (Em("E"),), "c": (Em("c"),),
    # subscripts with digits: sourced names
    "lambda_LT0": sym("λ\u0304", T("LT,0", "name:LT,0")), "lambda_0": sym("λ\u0304", T("0", "name:0")),
    "M_cr0_Nm": sym("M", T("cr,0", "name:cr,0")), "C_1": sym("C", T("1", "name:1")),
    "C_my_0": sym("C", T("my,0", "name:my,0")), "C_mz_0": sym("C", T("mz,0", "name:mz,0")),
    "M1_over_M2": (*sym("M", T("1", "name:1")), "/", *sym("M", T("2", "name:2"))),
    "B1": sym("B", T("1", "name:1")), "alpha_B1": sym("α", T("1", "name:1")),
    "P_e1_N": sym("P", T("e1", "name:e1")),
}


def moment_unit_of(u: Any) -> tuple[str, float]:
    """The unit moments are shown in: force times metre (force times foot with imperial lengths)."""
    from ..io.design_output import moment_unit

    return moment_unit(u)


#: Names that end like a unit suffix but are plain numbers.
PLAIN = {"beta_N", "C_m"}


def _split(name: str) -> tuple[str, str]:
    """(name without its unit suffix, quantity kind or "")."""
    if name in PLAIN:
        return name, ""
    for suffix, kind in SUFFIXES:
        if name.endswith(suffix):
            return name[: -len(suffix)], kind
    return name, ""


def symbol(name: str) -> tuple:
    """The symbol of a check's number: ``N_cr_y_N`` is N_cr,y, ``chi_LT`` is χ_LT, ``lambda_y`` is λ̄_y;
    subscripts holding digits are sourced names (``name:``)."""
    if name in SPECIAL:
        return SPECIAL[name]
    base, _ = _split(name)
    parts = base.split("_")
    head, rest = parts[0], [p for p in parts[1:] if p]
    if head in SPLIT:
        head, first = SPLIT[head]
        rest = [first] + rest
    head = GREEK.get(head, head)
    if not rest:
        return (Em(head),)
    sub = ",".join(rest)
    if re.search(r"\d", sub):
        return (Em(head), Sub(T(sub, f"name:{sub}")))
    return (Em(head), Sub(sub))


def digit_names(names) -> set[str]:
    """The sourced subscripts (``name:``) the symbols of ``names`` print: for the report's test of names."""
    out = set()
    for n in names:
        for p in symbol(n):
            if isinstance(p, Sub) and isinstance(p.text, T):
                out.add(p.text.text)
    return out


class BendPart(Check):
    """One kernel check of the JSON ``bending`` part, its numbers shown as sourced quantities."""

    def __init__(self, part: dict, src: str, u: Any) -> None:
        super().__init__(part, 0, u)
        self.base = src
        self.values = part.get("values") or {}
        self.flags = part.get("flags") or {}

    def src(self, key: str) -> str:
        return f"{self.base}/{key}"

    def value(self, name: str) -> Q:
        v = self.values.get(name)
        _, kind = _split(name)
        unit = unit_for(kind, self.u)
        if not kind:
            sig = 3 if v is None else (_decimals_sig(v, 3) if abs(v) < 10 else 4)
            return q(v, self.src(f"values/{name}"), "", sig)
        x = None if v is None else float(v)
        from .document import convert

        return q(x, self.src(f"values/{name}"), unit, 4 if x is None else _trim_sig(convert(x, unit), 4))


def unit_for(kind: str, u: Any) -> str:
    """The display unit of a kind of quantity."""
    return {"moment": moment_unit_of(u)[0], "stress": u.stress, "area": u.area, "modulus": u.section_modulus,
            "inertia": u.inertia, "warping": f"{u.section}^6", "force": u.force, "length": u.length,
            "": ""}[kind]


def _shows(name: str) -> Callable[[Any], Q]:
    """How a number of the check prints (the check passed in is a :class:`BendPart`)."""
    return lambda k: k.value(name)


def _names(steps: list[Step]) -> dict[str, Name]:
    out: dict[str, Name] = {}
    for s in steps:
        for n in (s.key, *s.names):
            out.setdefault(n, Name(symbol(n), _shows(n)))
    return out


def _sides(step: Step) -> tuple[Step, Step]:
    """The two sides of a condition step, each as a step of its own (for printing)."""
    node = step.tree.body
    assert isinstance(node, ast.Compare)
    return Step(step.key, ast.unparse(node.left), step.ref), Step(step.key, ast.unparse(node.comparators[0]),
                                                                   step.ref)


#: A comparison and its negation, as printed.
_OPS = {ast.LtE: (" ≤ ", " > "), ast.Lt: (" < ", " ≥ "), ast.GtE: (" ≥ ", " < "), ast.Gt: (" > ", " ≤ ")}


def check_lines(k: BendPart, eq_src: Callable[[str], T | None]) -> list[CalcLine]:
    """The written-out steps of one kernel check, then its utilisation against one."""
    steps = [Step(s["key"], s["expr"], s["ref"]) for s in k.c.get("steps") or []]
    names = _names(steps)
    lines: list[CalcLine] = []
    for s in steps:
        if s.key in k.flags:
            holds = bool(k.flags[s.key])
            left, right = _sides(s)
            node = s.tree.body
            assert isinstance(node, ast.Compare)
            op = _OPS[type(node.ops[0])]
            lines.append(CalcLine(tuple(printed(left, names)),
                                  (*printed(left, names, k), op[0] if holds else op[1], *printed(right, names, k)),
                                  ("(", *printed(left, names), op[0], *printed(right, names), ": ",
                                   "holds)" if holds else "does not hold)")))
            continue
        eq = eq_src(s.key)
        lhs = (Em("u"), Sub(eq)) if eq is not None else None
        if not s.names:  # a constant of the formula: written once
            lines.append(CalcLine(lhs or names[s.key].symbol, tuple(printed(s, names))))
            continue
        lines.append(step_line(k, s, names, lhs))
    passed = bool(k.c.get("passed"))
    gov = k.c.get("governing", "")
    verdict = "  →  passes" if passed else "  →  FAILS"
    lines.append(CalcLine((Em("u"),), (k_util(k), *condition(PASSES, passed), verdict),
                          ("(the largest of the check's equations: ", T(gov, k.src("governing")), ")"), key=True))
    return lines


def k_util(k: BendPart) -> Q:
    v = k.c.get("utilisation")
    return q(v, k.src("utilisation"), "", 3 if v is None else _decimals_sig(v, 3))


def _route_head(r: dict, src: str, u: Any) -> list[CalcLine]:
    mu, ms = moment_unit_of(u)
    out = [CalcLine(sym("N", "Ed"), with_unit(q(r["N_Ed_N"], f"{src}/N_Ed_N", u.force,
                                                 _trim_sig(r["N_Ed_N"] / u.force_si, 4))),
                    ("(largest design compression in this segment)",))]
    for j, m in enumerate(r.get("moments") or []):
        axis = "y" if m["axis"] == "major" else "z"
        M = m.get("M_Nm")
        out.append(CalcLine(sym("M", f"{axis},Ed"),
                            with_unit(q(M, f"{src}/moments/{j}/M_Nm", mu, 4 if M is None else _trim_sig(M / ms, 4))),
                            ("(", T(m["order"], f"{src}/moments/{j}/order"), ", its largest value along the segment, "
                             "at ", *with_unit(q(m["at_m"], f"{src}/moments/{j}/at_m", u.length,
                                                 _trim_sig(m["at_m"] / u.length_si, 4))),
                             "; ", T(m["source"], f"{src}/moments/{j}/source"), ")")))
    cls = r.get("section_class")
    if cls is not None:
        c = r.get("classification")
        rem: tuple = ("(given in the case file)",) if c is None else (
            "(", T(c["word"], f"{src}/classification/word"), ", governed by the ",
            T(c["governing"] or "section", f"{src}/classification/governing"), ", ",
            T(c["source"], f"{src}/classification/source"), ", from memory)")
        out.append(CalcLine(("class",), (Q(cls, f"{src}/section_class", "", 1),), rem))
    if r.get("susceptible"):
        M = r["M_cr_Nm"]
        out.append(CalcLine(sym("M", "cr"), with_unit(q(M, f"{src}/M_cr_Nm", mu, _trim_sig(M / ms, 4))),
                            ("(", T(r["M_cr_source"], f"{src}/M_cr_source"), ")")))
    else:
        out.append(CalcLine(sym("M", "cr"), ("∞",), ("(", T(r["M_cr_source"], f"{src}/M_cr_source"), ")")))
    return out


def _summary_table(part: dict, u: Any) -> Table:
    mu, ms = moment_unit_of(u)
    rows = []
    strong = []
    gov = part.get("governing") or {}
    for n, r in enumerate(part["routes"]):
        src = f"json:design/bending/routes/{n}"
        M = {m["axis"]: (j, m) for j, m in enumerate(r.get("moments") or [])}
        cells: list[tuple] = []
        for ax in ("major", "minor"):
            if ax not in M:
                cells.append(("—",))
                continue
            j, m = M[ax]
            v = m.get("M_Nm")
            cells.append((q(v, f"{src}/moments/{j}/M_Nm", mu, 4 if v is None else _trim_sig(v / ms, 4)),))
        util = r.get("utilisation")
        is_gov = (r["segment"], r["route"]) == (gov.get("segment"), gov.get("route"))
        if is_gov:
            strong.append(n)
        rows.append(((Q(r["segment"], f"{src}/segment", "", 6), " ", T(r["name"], f"{src}/name")),
                     (T(r["title"], f"{src}/title"),),
                     (q(r["N_Ed_N"], f"{src}/N_Ed_N", u.force, _trim_sig(r["N_Ed_N"] / u.force_si, 4)),),
                     *cells,
                     (q(util, f"{src}/utilisation", "", 3 if util is None else _decimals_sig(util, 3)),),
                     (T(r["equation"], f"{src}/equation"),),
                     ("passes" if r["passed"] else "FAILS",),
                     ("governs" if is_gov else ("larger route" if r.get("governs") else ""),)))
    f = unit_label(u.force)
    m = unit_label(mu)
    return Table((("Segment",), ("Route",), ("N", Sub("Ed"), " [", f, "]"), ("M", Sub("y,Ed"), " [", m, "]"),
                  ("M", Sub("z,Ed"), " [", m, "]"), ("Utilisation",), ("Equation",), ("Result",), ("Governing",)),
                 tuple(rows), numeric=(2, 3, 4, 5), strong=tuple(strong),
                 caption=("Each route of each segment; the moments are the largest along the segment of the "
                          "diagram the route takes (first- or second-order, see each check). The governing route is "
                          "set in bold; each is written out below.",))


def bending_blocks(part: dict, u: Any) -> list:
    """Blocks of the member checks with bending from the JSON ``bending`` part."""
    base = "json:design/bending"
    blocks: list = [Heading(3, "Members with bending")]
    std = part.get("standard", "")
    opts = part.get("options") or {}
    if not part.get("covered"):
        blocks.append(Para(("The member check with bending is not covered for ", T(std, f"{base}/standard"), ": ",
                            T(part["reason"], f"{base}/reason"), ". The member is not verified.")))
        return blocks
    intro: tuple = ("Checked by ", T(std, f"{base}/standard"), ": ", T(part["reason"], f"{base}/reason"), ".")
    if std == "EN 1993-1-1":
        intro += (" Interaction factors of Annex ", T(opts["interaction"], f"{base}/options/interaction"),
                  "; lateral-torsional buckling by the ", T(opts["ltb"], f"{base}/options/ltb"),
                  " case; member imperfection of the second-order route: ", T(opts["bow"], f"{base}/options/bow"),
                  ". Both routes the standard allows are made for every segment and the larger utilisation governs "
                  "(conservative: either route would verify the member).")
    blocks.append(Para(intro))
    routes = part.get("routes") or []
    if not routes:
        blocks.append(Para(("No segment could be checked with bending: see the failure modes not covered above.",)))
        return blocks
    blocks.append(_summary_table(part, u))
    g = part.get("governing") or {}
    if g:
        blocks.append(Para(("Governing: segment ", Q(g["segment"], f"{base}/governing/segment", "", 6), " (",
                            T(g["name"], f"{base}/governing/name"), "), ", T(g["title"], f"{base}/governing/title"),
                            ", ", T(g["equation"], f"{base}/governing/equation"), ", utilisation ",
                            q(g["utilisation"], f"{base}/governing/utilisation", "", 3), ".")))
    for n, r in enumerate(routes):
        src = f"{base}/routes/{n}"
        checks = r.get("checks") or []
        head = _route_head(r, src, u)
        why = (("Why this route and these moments: ", T(r["why"], f"{src}/why")),)
        notes = why + tuple(("Note: ", T(t, f"{src}/notes/{i}"), ".") for i, t in enumerate(r.get("notes") or []))
        title: tuple = ("Segment ", Q(r["segment"], f"{src}/segment", "", 6), " (", T(r["name"], f"{src}/name"),
                        ") — ", T(r["title"], f"{src}/title"))
        if not checks:
            head.append(CalcLine((Em("u"),), ("∞  →  FAILS",), ("(", T(r["equation"], f"{src}/equation"), ")"),
                                 key=True))
            blocks.append(Calc(title, tuple(head), notes, highlight=bool(r.get("governs"))))
            continue
        for j, c in enumerate(checks):
            k = BendPart(c, f"{src}/checks/{j}", u)
            eq_of = c.get("equation_of") or {}

            def eq_src(key: str, c_src: str = f"{src}/checks/{j}", eq_of: dict = eq_of) -> T | None:
                return T(eq_of[key], f"{c_src}/equation_of/{key}") if key in eq_of else None

            lines = (head if j == 0 else []) + check_lines(k, eq_src)
            if j == len(checks) - 1 and len(checks) > 1:
                util = r.get("utilisation")
                lines.append(CalcLine(("route",), (q(util, f"{src}/utilisation", "", 3),
                                                   *condition(PASSES, bool(r["passed"])),
                                                   "  →  passes" if r["passed"] else "  →  FAILS"),
                                      ("(the larger of the route's checks)",), key=True))
            ctitle = title + (": ", T(c["clause"], f"{src}/checks/{j}/clause")) if len(checks) > 1 else title
            cnotes = (notes if j == 0 else ()) + tuple(("Note: ", T(t, f"{src}/checks/{j}/notes/{i}"), ".")
                                                       for i, t in enumerate(c.get("notes") or []))
            blocks.append(Calc(ctitle, tuple(lines), cnotes, highlight=bool(r.get("governs")) and
                               (r["segment"], r["route"]) == (g.get("segment"), g.get("route"))))
    if part.get("notes"):
        blocks.append(Para(("Notes on the member checks with bending:",)))
        from .document import Bullets

        blocks.append(Bullets(tuple((T(t, f"{base}/notes/{i}"),) for i, t in enumerate(part["notes"]))))
    return blocks
