"""Sizing results -> the JSON result of ``stanchion size`` (SI) and its summary lines."""

from __future__ import annotations

import math
from typing import Any

from ..design.sizing import CandidateResult, SizingResult
from ..notices import Notice
from ..units import DisplayUnits
from ..util.checks import one_line
from ..util.numbers import finite_or_none

__all__ = ["sizing_json", "sizing_lines", "sizing_notices", "below_one"]

#: Trailing mark of a candidate whose lowest load factor of the case loads is below 1.
BELOW_ONE_MARK = "  < 1"


def below_one(c: CandidateResult) -> bool:
    """Whether the candidate buckles under the case loads (lowest load factor below 1)."""
    return bool(c.load_factor < 1.0)


def sizing_notices(s: SizingResult) -> list[Notice]:
    """A warning when the chosen section buckles under the case loads (``stanchion size`` then exits 1)."""
    ch = s.chosen
    if ch is None or not below_one(ch):
        return []
    return [Notice("buckles-under-case-loads",
                   f"with {ch.candidate.name} the lowest load factor {ch.load_factor:.4g} is below 1: the column "
                   "buckles elastically under its case loads")]


def sizing_json(s: SizingResult, catalogue: str = "") -> dict[str, Any]:
    """The JSON result of a sizing run (SI; documented in docs/design.md)."""
    from .design_output import DESIGN_CAUTION, design_json

    ch = s.chosen
    return {
        "units": "SI",
        "standard": s.standard,
        "catalogue": catalogue,
        "segments": [i + 1 for i in s.segments],
        "target_utilisation": s.target,
        "chosen": None if ch is None else ch.candidate.name,
        "passed": ch is not None,
        "warnings": [n.as_dict() for n in sizing_notices(s)],
        "required_I": [{"axis": r.axis, "basis": r.basis, "scale": finite_or_none(r.scale),
                        "I_required_m4": list(r.I_required), "note": r.note} for r in s.required],
        "required_note": s.required_note,
        "candidates": [
            {"name": c.candidate.name, "shape": c.candidate.shape, "mass_kg_per_m": c.candidate.mass,
             "A_m2": c.candidate.A, "I_major_m4": c.candidate.I_major, "I_minor_m4": c.candidate.I_minor,
             "load_factor": finite_or_none(c.load_factor), "below_one": below_one(c),
             "max_utilisation": finite_or_none(c.max_utilisation),
             "passed": s.passes(c), "error": c.error,
             "design": None if c.design is None else design_json(c.design)}
            for c in s.candidates
        ],
        "caution": DESIGN_CAUTION,
    }


def sizing_lines(s: SizingResult, title: str, d: DisplayUnits, top: int = 5) -> list[str]:
    """Summary lines of a sizing run."""
    from .design_output import DESIGN_CAUTION
    from .summary import fmt

    metric = d.length in ("m", "cm", "mm")
    su, sf = ("mm", 1e-3) if metric else ("in", 0.0254)
    out = [f"Sizing: {one_line(title) or '(untitled case)'} by {s.standard}",
           *(f"WARNING: {n.text}" for n in sizing_notices(s)),
           f"  segments taking the section: {', '.join(str(i + 1) for i in s.segments)}; "
           f"a section passes when every axial utilisation <= {s.target:g}; every candidate re-solved, and its "
           "sway sensitivity classified as by `stanchion check`",
           "  the case's [design] parameters (curves, constants) are applied to every candidate"]
    out.append("Required second moment of area of those segments (their present A kept, I scaled together):")
    if not s.required:
        out.append(f"  {s.required_note}")
    for r in s.required:
        what = (f"utilisation = {s.target:g}" if r.basis == "design"
                else f"elastic critical load factor of the design loads = {1 / s.target:g}")
        if r.scale is None:
            out.append(f"  {r.axis:<8} {what}: {r.note}")
        else:
            Is = ", ".join(f"{fmt(I / sf**4, 3)}" for I in r.I_required)
            out.append(f"  {r.axis:<8} {what}: {r.scale:.3g} x present I -> {Is} {su}^4"
                       f"{'  (' + r.note + ')' if r.note else ''}")
    ch = s.chosen
    passing = [c for c in s.candidates if s.passes(c)]
    out.append(f"Candidates: {len(s.candidates)}, passing: {len(passing)}")
    out.append(f"  {'name':<20} {'shape':<10} {'kg/m':>7} {'A [' + su + '^2]':>10} {'I_maj [' + su + '^4]':>13} "
               f"{'I_min [' + su + '^4]':>13} {'load f.':>8} {'util.':>6}  governing")
    shown = passing[:max(top, 0)]
    if ch is not None and s.next_lighter is not None:
        shown = [s.next_lighter] + shown
    for c in shown:
        k = c.candidate
        g = c.governing
        gov = c.error if g is None else (f"segment {g.segment + 1} {'tension' if g.kind == 'tension' else g.axis}"
                                         f" ({g.clause})")
        mark = "  <- lightest passing" if c is ch else ("  (next lighter: fails)" if c is s.next_lighter else "")
        mark += BELOW_ONE_MARK if below_one(c) else ""
        out.append(f"  {k.name[:20]:<20} {k.shape[:10]:<10} {k.mass:7.2f} {fmt(k.A / sf**2, 4):>10} "
                   f"{fmt(k.I_major / sf**4, 4):>13} {fmt(k.I_minor / sf**4, 4):>13} "
                   f"{fmt(c.load_factor, 4) if math.isfinite(c.load_factor) else '-':>8} "
                   f"{c.max_utilisation:6.3f}  {gov}{mark}")
    if any(below_one(c) for c in shown):
        out.append("  < 1: lowest load factor of the case loads below 1: the column buckles under the case loads "
                   "with that section")
    if ch is None:
        out.append("No catalogue section passes.")
    else:
        out.append(f"Lightest passing section: {ch.candidate.name} ({ch.candidate.mass:.2f} kg/m), "
                   f"utilisation {ch.max_utilisation:.3f}")
        if below_one(ch):
            out.append(f"  FAILS with it: the lowest load factor {ch.load_factor:.4g} is below 1 (see the warning)")
        elif ch.design is not None and ch.design.verdict != "passes":
            # the axial checks pass, but the sway sensitivity asks for more than they check
            low = min(ch.design.sway, key=lambda w: w.alpha_cr)
            out.append(f"  NOT VERIFIED with it: alpha_cr {low.alpha_cr:.3g} about the {low.axis} axis "
                       f"({low.classification}); the axial checks alone do not verify the member: run `stanchion "
                       "check` with this section, which makes the member check with bending on second-order "
                       "moments where the standard covers it")
    out.append("")
    out.append(f"CAUTION: {DESIGN_CAUTION}")
    return out
