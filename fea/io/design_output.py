"""Design results -> the JSON ``"design"`` part (SI; documented in docs/design.md) and summary lines.

The part ``"bending"`` (present when the case needs member checks with bending: bending actions, or a
sway-sensitive plane) holds, in SI with the unit in every name (``_N``, ``_Nm``, ``_Pa``, ``_m``, ``_m2`` ...):

* ``standard``, ``covered`` and ``reason`` (what the standard's check covers, or why it checks compression
  only), ``options`` (``interaction``, ``ltb``, ``bow``, ``curve_LT``, ``section_class``, per-segment ``segments``),
  ``passed``, ``max_utilisation`` and ``governing`` (``segment``, ``name``, ``route``, ``title``, ``equation``,
  ``utilisation``; null without a route), ``covers_sway_of`` (the planes whose sway sensitivity the routes with
  second-order moments cover), ``unchecked`` and ``notes``;
* ``routes``: one per segment and route (``route`` = ``"member"`` EN 6.3.3, ``"second-order"`` EN second-order
  analysis with member imperfections and the cross-section, ``"direct-analysis"`` AISC H1.1): ``title``, ``why``
  (the rule that allows it, the moments it takes), ``utilisation``, ``equation`` (the governing equation),
  ``passed``, ``governs`` (the segment's larger route), ``N_Ed_N``, ``moments`` per axis (``order``, ``M_Nm`` the
  largest, ``at_m`` its height, ``bottom_Nm``, ``top_Nm``, ``diagram`` and ``psi`` for C_m, ``source``),
  ``section_class`` and ``classification`` (null when given), ``M_cr_Nm`` (null when infinite: ``susceptible``
  false) with ``M_cr_source``, ``notes``, and ``checks``: the kernel checks of the route, each with ``route``,
  ``clause``, ``equations`` and ``utilisations`` (by equation), ``utilisation``, ``governing``, ``values`` (every
  number, inputs and results), ``flags``, ``labels``, ``steps`` (``key``, ``expr``, ``ref``: the written-out
  formulas in the order evaluated), ``equation_of`` (the equation each utilisation among ``values`` belongs to)
  and ``notes``;
* ``actions``: per analysis (``route``), per plane: ``sways``, ``alpha_cr``, ``critical_load_factor``,
  ``amplification``, ``imperfection`` (``kind``, ``sway``, ``bow_m``, ``bow_shape``, ``clause``, ``direction``,
  ``details``), ``converged``, ``message``, and the maxima of the diagrams ``actions`` (lateral actions alone),
  ``first_order`` and ``second_order`` (``max_Nm``, ``at_m``, ``bottom_Nm``, ``top_Nm``, ``psi``; null without a
  second-order answer), for the whole column and per segment.
"""

from __future__ import annotations

import math
from typing import Any

from ..cautions import CAUTION
from ..design.bending import EQUATIONS
from ..design.bending_result import BendingResult, BendingRoute
from ..design.check import DesignResult
from ..design.sway import BRACED
from ..units import DisplayUnits

__all__ = ["DESIGN_CAUTION", "design_json", "design_summary", "verdict_line", "bending_json", "bending_summary",
           "moment_unit"]

DESIGN_CAUTION = ("Design resistances use the published formulas only; the governing standard, its national "
                  "annex and a licensed engineer decide. " + CAUTION)



def _num(x: float | None) -> float | None:
    if x is None:
        return None
    x = float(x)
    return x if math.isfinite(x) else None


def design_json(r: DesignResult) -> dict[str, Any]:
    """The JSON ``"design"`` part (SI; documented in docs/design.md)."""
    g = r.governing
    out = {
        "standard": r.standard,
        "load_factor": r.load_factor,
        "passed": r.passed,
        "max_utilisation": g.utilisation,
        "governing": {"segment": g.segment + 1, "name": g.name, "axis": g.axis, "kind": g.kind,
                      "utilisation": g.utilisation},
        "checks": [
            {
                "segment": c.segment + 1,
                "name": c.name,
                "axis": c.axis,
                "kind": c.kind,
                "standard": c.standard,
                "clause": c.clause,
                "formula": c.formula,
                "parameter": c.parameter,
                "slenderness": _num(c.slenderness),
                "slenderness_name": c.slenderness_name,
                "reduction_factor": _num(c.reduction),
                "N_cr_N": _num(c.N_cr),
                "N_Ed_N": c.N_Ed,
                "resistance_N": c.resistance,
                "utilisation": c.utilisation,
                "passed": c.passed,
                "governs": c.governs,
                "effective_length_factor": _num(c.effective_length_factor),
                "k_meaningful": c.k_meaningful,
                "note": c.note,
                "details": {k: _num(v) for k, v in c.details.items()},
                "labels": dict(c.labels),
            }
            for c in r.checks
        ],
        "notes": list(r.notes),
        "caution": DESIGN_CAUTION,
    }
    if r.sway:  # classified (every check of a case; not the axial-only candidates of sizing)
        out["verdict"] = r.verdict
        out["sway"] = [{"axis": w.axis, "alpha_cr": _num(w.alpha_cr), "amplification": _num(w.amplification),
                        "classification": w.classification, "axial_check_enough": w.axial_check_enough,
                        "reason": w.reason, "source": w.source, **({"covered_by": w.covered_by}
                                                                   if w.covered_by else {})} for w in r.sway]
    if r.unchecked:
        out["unchecked"] = list(r.unchecked)
    if r.bending is not None:
        out["bending"] = bending_json(r.bending)
    return out


#: Numbers of the imperfections' details that carry a unit, with their JSON names.
_DETAIL_UNITS = {"e0": "e0_m", "N_cr": "N_cr_N", "N_Ed": "N_Ed_N", "M_Rk": "M_Rk_Nm", "N_Rk": "N_Rk_N",
                 "EI_eta_max": "EI_eta_max_Nm", "amplitude": "amplitude_m"}


def _diagram_of(d, ref: float = 0.0) -> dict[str, Any] | None:
    """The maxima of a moment diagram; moments below 1e-9 of ``ref`` (the largest of the analyses) are the
    round-off of the solves and shown as 0 (as the checks take them, fea.design.beam_column.ROUND_OFF)."""
    from ..design.beam_column import ROUND_OFF

    if d is None:
        return None

    def m(v: float) -> float | None:
        return 0.0 if abs(v) <= ROUND_OFF * ref else _num(v)

    return {"max_Nm": m(d.max_abs), "at_m": _num(d.at), "bottom_Nm": m(d.bottom), "top_Nm": m(d.top),
            "psi": _num(d.psi)}


def _classification(c) -> dict[str, Any] | None:
    if c is None:
        return None
    return {"standard": c.standard, "class": c.section_class, "word": c.word, "governing": c.governing,
            "epsilon": c.epsilon, "source": c.source, "notes": list(c.notes),
            "elements": [{"element": e.element, "stress": e.stress, "c_m": e.c, "t_m": e.t, "ratio": e.ratio,
                          "limits": [_num(v) for v in e.limits], "class": e.section_class, "rule": e.rule}
                         for e in c.elements]}


def _route_json(r: BendingRoute) -> dict[str, Any]:
    return {
        "segment": r.segment + 1, "name": r.name, "standard": r.standard, "route": r.key, "title": r.title,
        "why": r.why, "utilisation": _num(r.utilisation), "equation": r.governing, "passed": r.passed,
        "governs": r.governs, "N_Ed_N": r.N_Ed,
        "moments": [{"axis": m.axis, "order": m.order, "M_Nm": _num(m.M), "at_m": _num(m.at),
                     "bottom_Nm": _num(m.bottom), "top_Nm": _num(m.top), "diagram": m.diagram, "psi": _num(m.psi),
                     "source": m.source} for m in r.moments],
        "section_class": _section_class(r), "classification": _classification(r.section),
        "susceptible": math.isfinite(r.M_cr), "M_cr_Nm": _num(r.M_cr), "M_cr_source": r.M_cr_source,
        "notes": list(r.notes),
        "checks": [{"route": c.route, "clause": c.clause, "equations": list(c.utilisations),
                    "utilisations": {k: _num(v) for k, v in c.utilisations.items()},
                    "utilisation": _num(c.utilisation), "governing": c.governing, "passed": c.passed,
                    "values": {k: _num(v) for k, v in c.values.items()}, "flags": dict(c.flags),
                    "labels": dict(c.labels), "steps": [{"key": s.key, "expr": s.expr, "ref": s.ref} for s in c.steps],
                    "equation_of": {k: v for k, v in EQUATIONS.items() if k in c.values},
                    "notes": list(c.notes)} for c in r.checks],
    }


def _section_class(r: BendingRoute) -> int | None:
    for c in r.checks:
        v = c.labels.get("section_class")
        if v is not None:
            return int(v)
    return None if r.section is None else r.section.section_class


def bending_json(b: BendingResult) -> dict[str, Any]:
    """The ``"bending"`` part of the JSON ``"design"`` part (module notes)."""
    g = b.governing
    o = b.options
    ref = max((d.max_abs for a in b.actions.values() for p in a.planes for d in (p.actions, p.first_order,
                                                                                 p.second_order) if d is not None),
              default=0.0)

    def _diagram(d) -> dict[str, Any] | None:  # the maxima, with this result's reference
        return _diagram_of(d, ref)

    return {
        "standard": b.standard, "covered": b.covered, "reason": b.reason,
        "options": {"interaction": o.interaction, "ltb": o.ltb, "bow": o.bow, "curve_LT": o.curve_LT,
                    "section_class": o.section_class,
                    "segments": [{"segment": i + 1, **dict(v)} for i, v in sorted(o.segments.items())]},
        "passed": b.passed, "max_utilisation": _num(b.max_utilisation),
        "governing": None if g is None else {"segment": g.segment + 1, "name": g.name, "route": g.key,
                                             "title": g.title, "equation": g.governing,
                                             "utilisation": _num(g.utilisation)},
        "covers_sway_of": list(b.planes),
        "routes": [_route_json(r) for r in b.routes],
        "actions": [{"route": key, "standard": a.standard, "bow": a.bow, "load_factor": a.load_factor,
                     "planes": [{"axis": p.axis, "sways": p.sways, "alpha_cr": _num(p.alpha_cr),
                                 "critical_load_factor": _num(p.critical_load_factor),
                                 "amplification": _num(p.amplification), "converged": p.converged,
                                 "message": p.message,
                                 "imperfection": {"kind": p.imperfection.kind, "sway": p.imperfection.sway,
                                                  "bow_m": p.imperfection.bow, "bow_shape": p.imperfection.bow_shape,
                                                  "clause": p.imperfection.clause,
                                                  "direction": p.imperfection.direction,
                                                  "details": {_DETAIL_UNITS.get(k, k): _num(v)
                                                              for k, v in p.imperfection.details.items()},
                                                  "labels": dict(p.imperfection.labels)},
                                 "actions": _diagram(p.actions), "first_order": _diagram(p.first_order),
                                 "second_order": _diagram(p.second_order),
                                 "segments": [{"segment": s.segment + 1, "name": s.name, "N_Ed_N": s.N_Ed,
                                               "actions": _diagram(s.actions), "first_order": _diagram(s.first_order),
                                               "second_order": _diagram(s.second_order),
                                               "amplification": _num(s.amplification),
                                               "stiffness_factor": s.stiffness_factor, "tau_b": _num(s.tau_b)}
                                              for s in p.segments]}
                                for p in a.planes]}
                    for key, a in b.actions.items()],
        "unchecked": list(b.unchecked), "notes": list(b.notes),
    }


def verdict_line(r: DesignResult) -> str:
    """The verdict in plain words: PASSES, FAILS or NOT VERIFIED with what is missing."""
    if r.verdict == "not verified":
        missing = []
        if any(not w.axial_check_enough and not w.covered_by for w in r.sway):
            missing.append("the sway sensitivity needs more: a second-order analysis with imperfections and the member "
                           "check with its bending moments, which could not be made here")
        missing.extend(r.unchecked)
        made = "every axial check passes" if r.bending is None or not r.bending.routes else \
            "every check made (axial and with bending) passes"
        return f"Verdict: NOT VERIFIED - {made}, but " + "; ".join(missing)
    if r.verdict == "fails" and r.passed:
        if not r.bending_passed and r.bending is not None and r.bending.governing is not None:
            g = r.bending.governing
            return (f"Verdict: FAILS - the member check with bending of segment {g.segment + 1} ({g.name}) exceeds 1: "
                    f"{g.title}, {g.governing}, utilisation {g.utilisation:.3f}")
        return "Verdict: FAILS - the column buckles elastically below the design loads (alpha_cr < 1)"
    return f"Verdict: {r.verdict.upper()}"


def design_summary(r: DesignResult, d: DisplayUnits) -> list[str]:
    """Summary lines of a design check, in display units."""
    from .summary import fmt

    out = [f"Design check: {r.standard}"]
    out += [f"  {n}" for n in r.notes]
    out.append(f"  {'segment':<18} {'axis':<8} {'slender.':>14} {'reduct.':>7} {'N_Ed [' + d.force + ']':>11} "
               f"{'N_cr [' + d.force + ']':>12} {'N_Rd [' + d.force + ']':>12} {'util.':>6}  clause / parameter")
    for c in r.checks:
        name = f"{c.segment + 1} {c.name}"[:18]
        sl = "-" if c.kind == "tension" else f"{c.slenderness_name} {c.slenderness:.3g}"
        Ncr = "-" if not math.isfinite(c.N_cr) else fmt(d.F(c.N_cr))
        axis = "tension" if c.kind == "tension" else c.axis
        flag = "" if c.passed else "  FAILS"
        out.append(f"  {name:<18} {axis:<8} {sl:>14} {c.reduction:7.3f} {fmt(d.F(c.N_Ed)):>11} {Ncr:>12} "
                   f"{fmt(d.F(c.resistance)):>12} {c.utilisation:6.3f}  {c.clause}; {c.parameter}"
                   f"{'; ' + c.governs + ' governs' if c.governs in ('material', 'net') else ''}{flag}")
        if c.note:
            out.append(f"  {'':<18} ({c.note})")
    g = r.governing
    where = "in tension" if g.kind == "tension" else \
        "in flexural-torsional buckling" if g.axis == "torsional" else f"about the {g.axis} axis"
    word = {"passes": "PASSES", "fails": "FAILS", "not verified": "axial checks pass, NOT VERIFIED"}[r.verdict]
    if r.bending is not None:
        word = "passes" if g.passed else "FAILS"
        out.append(f"Governing axial check: segment {g.segment + 1} ({g.name}) {where}, utilisation "
                   f"{g.utilisation:.3f}: {word}")
        out += bending_summary(r, d)
    else:
        out.append(f"Governing: segment {g.segment + 1} ({g.name}) {where}, utilisation {g.utilisation:.3f}: {word}")
    if r.sway:
        out.append(f"Sway sensitivity, alpha_cr = lowest critical load factor on the design loads "
                   f"({r.sway[0].source}):")
        for w in r.sway:
            amp = "" if w.classification == BRACED else f", amplification {w.amplification:.3g}"
            out.append(f"  {w.axis} axis: alpha_cr {w.alpha_cr:.3g}{amp}: {w.classification}")
            if not w.axial_check_enough:
                out.append(f"    ({w.reason})")
    if r.bending is not None or r.verdict != ("passes" if r.passed else "fails"):
        out.append(verdict_line(r))  # not verified, fails on alpha_cr alone, or with bending
    out.append(f"  {DESIGN_CAUTION.split(CAUTION)[0].strip()}")
    return out


def moment_unit(d: DisplayUnits) -> tuple[str, float]:
    """The unit moments are shown in (force times metre, or times foot with imperial lengths) and its SI value."""
    if d.length in ("in", "ft"):
        return f"{d.force}*ft", d.force_si * 0.3048
    return f"{d.force}*m", d.force_si


def bending_summary(r: DesignResult, d: DisplayUnits) -> list[str]:
    """Summary lines of the member checks with bending: one row per segment and route, with its reason."""
    from .summary import fmt

    b = r.bending
    if b is None:
        return []
    o = b.options
    if b.standard == "EN 1993-1-1":
        how = (f"; interaction factors Annex {o.interaction}, chi_LT by "
               f"{'6.3.2.2' if o.ltb == 'general' else '6.3.2.3'}, second-order route with the "
               f"{'Table 5.1 bows' if o.bow == 'table-5.1' else '5.3.2(11) imperfection'}")
    else:
        how = ""
    out = [f"Member checks with bending ({b.standard}{how}):"]
    if not b.covered:
        out.append(f"  not covered: {b.standard} checks {b.reason}")
    moment, per = moment_unit(d)
    w = max([len(rt.title) for rt in b.routes] + [5])
    if b.routes:
        out.append(f"  {'segment':<18} {'route':<{w}} {'N_Ed [' + d.force + ']':>11} "
                   f"{'M_y [' + moment + ']':>14} {'M_z [' + moment + ']':>14} {'util.':>6}  equation")
    for rt in b.routes:
        name = f"{rt.segment + 1} {rt.name}"[:18]
        M = {m.axis: m for m in rt.moments}
        cells = []
        for ax in ("major", "minor"):
            m = M.get(ax)
            order = "1st" if m is not None and m.order == "first-order" else "2nd"
            cells.append("-" if m is None else f"{fmt(m.M / per)} ({order})")
        flag = "" if rt.passed else "  FAILS"
        gov = "  governs" if rt.governs and len([x for x in b.routes if x.segment == rt.segment]) > 1 else ""
        util = f"{rt.utilisation:6.3f}" if math.isfinite(rt.utilisation) else f"{'inf':>6}"
        out.append(f"  {name:<18} {rt.title:<{w}} {fmt(d.F(rt.N_Ed)):>11} {cells[0]:>14} {cells[1]:>14} "
                   f"{util}  {rt.governing}{gov}{flag}")
        out.append(f"      why: {rt.why}")
        if math.isfinite(rt.M_cr):
            out.append(f"      M_cr = {fmt(rt.M_cr / per)} {moment}: {rt.M_cr_source}")
    g = b.governing
    if g is not None:
        word = "PASSES" if b.passed else "FAILS"
        out.append(f"Governing with bending: segment {g.segment + 1} ({g.name}), {g.title}: {g.governing}, "
                   f"utilisation {g.utilisation:.3f}: {word}")
    for u in b.unchecked:
        out.append(f"  not checked: {u}")
    return out
