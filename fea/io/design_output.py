"""Design results -> the JSON ``"design"`` part (SI; documented in docs/design.md) and summary lines."""

from __future__ import annotations

import math
from typing import Any

from ..cautions import CAUTION
from ..design.check import DesignResult
from ..design.sway import BRACED
from ..units import DisplayUnits

__all__ = ["DESIGN_CAUTION", "design_json", "design_summary", "verdict_line"]

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
                        "reason": w.reason, "source": w.source} for w in r.sway]
    if r.unchecked:
        out["unchecked"] = list(r.unchecked)
    return out


def verdict_line(r: DesignResult) -> str:
    """The verdict in plain words: PASSES, FAILS or NOT VERIFIED with what is missing."""
    if r.verdict == "not verified":
        missing = []
        if any(not w.axial_check_enough for w in r.sway):
            missing.append("the sway sensitivity needs more: a second-order analysis with imperfections, or the member "
                           "check with bending (not yet offered)")
        missing.extend(r.unchecked)
        return "Verdict: NOT VERIFIED - every axial check passes, but " + "; ".join(missing)
    if r.verdict == "fails" and r.passed:
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
    out.append(f"Governing: segment {g.segment + 1} ({g.name}) {where}, utilisation {g.utilisation:.3f}: {word}")
    if r.sway:
        out.append(f"Sway sensitivity, alpha_cr = lowest critical load factor on the design loads "
                   f"({r.sway[0].source}):")
        for w in r.sway:
            amp = "" if w.classification == BRACED else f", amplification {w.amplification:.3g}"
            out.append(f"  {w.axis} axis: alpha_cr {w.alpha_cr:.3g}{amp}: {w.classification}")
            if not w.axial_check_enough:
                out.append(f"    ({w.reason})")
    if r.verdict != ("passes" if r.passed else "fails"):  # not verified, or fails on alpha_cr alone
        out.append(verdict_line(r))
    out.append(f"  {DESIGN_CAUTION.split(CAUTION)[0].strip()}")
    return out
