"""The design part of the report written out as a hand calculation: one block per check.

Every number comes from the JSON ``"design"`` part of the same run (the check's
own keys and its ``details``, see docs/design.md); nothing is recomputed here.
The formulas are the written-out steps of each standard's record
(:mod:`fea.design.standards`), printed by :mod:`fea.report.design_lines`; their
constants are shown as ``const:`` sources (see :mod:`fea.report.document`).
Values are shown rounded; the tool carried the arithmetic at full precision.
"""

from __future__ import annotations

from .design_lines import COMPRESSION, REDUCTION_SYMBOL, SLENDERNESS_SYMBOL, summary_notation, tension_lines
from .design_steps import FORMULA_CONSTANTS, N_CR_SYMBOL, Check
from .document import Bullets, Calc, Heading, Note, Para, Q, T, Table, q, unit_label

__all__ = ["design_blocks", "FORMULA_CONSTANTS"]

AXIS_WORDS = {"major": "major axis", "minor": "minor axis", "in-plane": "in-plane",
              "torsional": "flexural-torsional buckling"}


# -- the part ---------------------------------------------------------------------------------------


#: Methods that are not a code clause: named by the method (with this word after it) instead of the clause.
CLASSICAL = {"Perry-Robertson": " formula", "Rankine-Gordon": " formula", "working-stress": " rule"}


def _clause(k: Check) -> tuple:
    """The clause of a check, or the name of a classical method (compression only)."""
    std = k.c["standard"]
    if std in CLASSICAL and k.c["kind"] == "compression":
        return (T(std, k.src("standard")), CLASSICAL[std])
    return (T(k.c["clause"], k.src("clause")),)


def _title(k: Check) -> tuple:
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
    rows = []
    for n, c in enumerate(checks):
        k = Check(c, n, u)
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
    method = next((c.get("labels", {}).get("method") for c in checks if (c.get("labels") or {}).get("method")), None)
    force_words, force, res_words, res = summary_notation(part.get("standard", ""), method)
    tension = any(c["kind"] == "tension" for c in checks)
    return Table((("Segment",), ("Axis",), ("Clause",), ("Slenderness",), ("Reduction",),
                  (force_words, " ", *force, " [", f, "]"), (res_words, " ", *res, " [", f, "]"), ("Utilisation",),
                  ("Result",), ("Governing",)),
                 tuple(rows), numeric=(5, 6, 7), strong=() if gov is None else (gov,),
                 caption=(*force, ": the largest force in the segment at the case loads × the load factor ",
                          q(part.get("load_factor"), "json:design/load_factor", "", 4), "; ", *res,
                          ": the resistance of the clause",
                          " (in tension, the tension resistance of its clause)" if tension else "",
                          "; utilisation: their ratio. The governing check is set in bold and marked in the last "
                          "column; each check is written out below.",))


def design_blocks(part: dict, u) -> list:
    """Blocks of the design part from its JSON: verdict, summary table, method, one block per check, notes."""
    checks = part.get("checks") or []
    gov = _governing_index(part)
    g = part.get("governing") or {}
    blocks: list = []
    bending = part.get("bending")
    bent = (bending or {}).get("max_utilisation")
    if bent is not None and bent > (part.get("max_utilisation") or 0.0):
        gov = None  # a member check with bending governs: it is marked in its own section
    made = "every axial check" if not (bending and bending.get("routes")) else \
        "every check made (axial and with bending)"
    verdict = "every check passes" if part.get("passed") else "at least one check FAILS"
    if part.get("verdict") == "not verified":
        verdict = f"{made} passes, but the member is NOT VERIFIED (see the sway sensitivity below)"
        if part.get("unchecked"):
            verdict = f"{made} passes, but the member is NOT VERIFIED (see the failure modes not covered)"
    elif part.get("verdict") == "fails" and part.get("passed"):
        verdict = ("a member check with bending FAILS" if bending and not bending.get("passed") else
                   "the column buckles elastically below its loads: the design FAILS")
    elif part.get("verdict") == "passes" and bending and bending.get("routes"):
        verdict = "every check passes, axial and with bending"
    where: tuple = ()
    if g:
        axis = "in tension" if g.get("kind") == "tension" else AXIS_WORDS.get(str(g.get("axis")), g.get("axis", ""))
        where = (" (segment ", Q(g["segment"], "json:design/governing/segment", "", 6), ", ",
                 T(g["name"], "json:design/governing/name"), ", ", axis, ")")
    std = part.get("standard", "")
    blocks.append(Para(("Checked by ", *(("the ",) if std in CLASSICAL else ()), T(std, "json:design/standard"),
                        CLASSICAL.get(std, ""), ": ", verdict,
                        "; the largest utilisation of the axial checks is " if bending else
                        "; the largest utilisation is ",
                        q(part.get("max_utilisation"), "json:design/max_utilisation", "", 3), *where, ".")))
    if part.get("unchecked"):
        blocks.append(Para(("Failure modes not covered by these checks:",)))
        blocks.append(Bullets(tuple((T(u, f"json:design/unchecked/{i}"),) for i, u in enumerate(part["unchecked"]))))
    blocks.extend(_sway_blocks(part))
    if not checks:
        return blocks
    blocks.append(Heading(3, "Summary of the checks"))
    blocks.append(_summary_table(part, u, gov))

    blocks.append(Heading(3, "Method"))
    blocks.append(Para((
        "Each segment is checked about each bending plane in which it is compressed, and in tension where it is "
        "pulled. The slenderness comes from the critical force ", *N_CR_SYMBOL, " of the finite-element model "
        "(the force "
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
        k = Check(c, n, u)
        if c.get("kind") == "tension":
            lines = tension_lines(k)
        else:
            lines = COMPRESSION[c["standard"]](k, c["axis"])
        notes = []
        if c.get("note"):
            notes.append(("Note: ", T(c["note"], k.src("note")), "."))
        blocks.append(Calc(_title(k), tuple(lines), tuple(notes), highlight=n == gov))

    if bending:
        from .design_bending import bending_blocks

        blocks.extend(bending_blocks(bending, u))

    notes = part.get("notes") or []
    if notes:
        blocks.append(Heading(3, "Notes"))
        blocks.append(Bullets(tuple((T(t, f"json:design/notes/{i}"),) for i, t in enumerate(notes))))
    if part.get("caution"):
        blocks.append(Note((T(part["caution"], "json:design/caution"),)))
    return blocks


def _sway_blocks(part: dict) -> list:
    """The sway sensitivity of every plane: alpha_cr on the design loads, its classification and what is missing."""
    sway = part.get("sway") or []
    if not sway:
        return []
    rows = tuple(((T(w["axis"], f"json:design/sway/{i}/axis"),),
                  (q(w["alpha_cr"], f"json:design/sway/{i}/alpha_cr", "", 3),),
                  (T(w["classification"], f"json:design/sway/{i}/classification"),),
                  (T(w["reason"], f"json:design/sway/{i}/reason"),))
                 for i, w in enumerate(sway))
    return [Heading(3, "Sway sensitivity"),
            Table((("Plane",), ("α_cr",), ("Classification",), ("Why",)), rows, numeric=(1,),
                  caption=("α_cr is the lowest elastic critical load factor on the design loads (the lowest load "
                           "factor divided by the design load factor); rule: ",
                           T(sway[0]["source"], "json:design/sway/0/source"), "."))]
