"""The ``stanchion size`` subcommand: the lightest catalogue section that passes the case's design check.

Registered in :data:`fea.cli.COMMANDS` by :mod:`fea.io.design_input`.  Exit status
0 when a section passes, 1 when none does, 2 on bad input.
"""

from __future__ import annotations

import argparse
import json
import math
from pathlib import Path
from typing import Any

from ..errors import CaseError
from ..design.sizing import SizingResult
from ..units import DisplayUnits

__all__ = ["HELP", "add_arguments", "run", "sizing_json", "sizing_lines"]

HELP = ("choose the lightest section of a catalogue that passes the case's [design] check, "
        "solving the model again for every candidate")


def add_arguments(p: argparse.ArgumentParser) -> None:
    p.add_argument("case", help="case file (TOML) with a [design] table")
    p.add_argument("--catalogue", required=True, metavar="FILE",
                   help="section catalogue (CSV, see docs/design.md), e.g. cases/demo_catalogue.csv")
    p.add_argument("--top", type=int, default=5, metavar="N", help="how many passing candidates to list (default 5)")
    p.add_argument("--segment", action="append", default=[], metavar="SEGMENT",
                   help="segment (number from 1, or name) that takes the section; may be repeated "
                        "(default: every segment)")
    p.add_argument("--shape", action="append", default=[], metavar="SHAPE",
                   help="only candidates of this shape (e.g. i, shs, chs); may be repeated.  The [design] "
                        "parameters (buckling curves, section constants) apply to every candidate, so keep "
                        "to shapes they fit")
    p.add_argument("--target", type=float, default=1.0, metavar="U",
                   help="largest utilisation a passing section may have (default 1.0)")
    p.add_argument("--json", nargs="?", const="-", metavar="FILE",
                   help="write the JSON result to FILE, or to standard output instead of the summary")
    p.add_argument("--plot", metavar="FILE", help="draw utilisation against mass of every candidate (.png, .svg, .pdf)")


def _segment_indices(case, refs: list[str]) -> list[int]:
    names = [s.name for s in case.segments]
    out = []
    for ref in refs:
        if ref.isdigit() and 1 <= int(ref) <= len(names):
            out.append(int(ref) - 1)
        elif ref in names:
            out.append(names.index(ref))
        else:
            raise CaseError("--segment", f"{ref!r} is not a segment: expected a number from 1 to {len(names)} "
                                         f"or one of {names}")
    return out


def _num(x: float | None) -> float | None:
    return None if x is None or not math.isfinite(x) else float(x)


def sizing_json(s: SizingResult, catalogue: str = "") -> dict[str, Any]:
    """The JSON result of a sizing run (SI; documented in docs/design.md)."""
    from .design_input import DESIGN_CAUTION, design_json

    ch = s.chosen
    return {
        "units": "SI",
        "standard": s.standard,
        "catalogue": catalogue,
        "segments": [i + 1 for i in s.segments],
        "target_utilisation": s.target,
        "chosen": None if ch is None else ch.candidate.name,
        "passed": ch is not None,
        "required_I": [{"axis": r.axis, "basis": r.basis, "scale": _num(r.scale),
                        "I_required_m4": list(r.I_required), "note": r.note} for r in s.required],
        "required_note": s.required_note,
        "candidates": [
            {"name": c.candidate.name, "shape": c.candidate.shape, "mass_kg_per_m": c.candidate.mass,
             "A_m2": c.candidate.A, "I_major_m4": c.candidate.I_major, "I_minor_m4": c.candidate.I_minor,
             "load_factor": _num(c.load_factor), "max_utilisation": _num(c.max_utilisation),
             "passed": s.passes(c), "error": c.error,
             "design": None if c.design is None else design_json(c.design)}
            for c in s.candidates
        ],
        "caution": DESIGN_CAUTION,
    }


def sizing_lines(s: SizingResult, title: str, d: DisplayUnits, top: int = 5) -> list[str]:
    """Summary lines of a sizing run."""
    from .design_input import DESIGN_CAUTION
    from .summary import fmt

    metric = d.length in ("m", "cm", "mm")
    su, sf = ("mm", 1e-3) if metric else ("in", 0.0254)
    out = [f"Sizing: {title or '(untitled case)'} by {s.standard}",
           f"  segments taking the section: {', '.join(str(i + 1) for i in s.segments)}; "
           f"a section passes when every utilisation <= {s.target:g}; every candidate re-solved",
           "  the case's [design] parameters (curves, constants) are applied to every candidate"]
    out.append(f"Required second moment of area of those segments (their present A kept, I scaled together):")
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
        out.append(f"  {k.name[:20]:<20} {k.shape[:10]:<10} {k.mass:7.2f} {fmt(k.A / sf**2, 4):>10} "
                   f"{fmt(k.I_major / sf**4, 4):>13} {fmt(k.I_minor / sf**4, 4):>13} "
                   f"{fmt(c.load_factor, 4) if math.isfinite(c.load_factor) else '-':>8} "
                   f"{c.max_utilisation:6.3f}  {gov}{mark}")
    if ch is None:
        out.append("No catalogue section passes.")
    else:
        out.append(f"Lightest passing section: {ch.candidate.name} ({ch.candidate.mass:.2f} kg/m), "
                   f"utilisation {ch.max_utilisation:.3f}")
    out.append("")
    out.append(f"CAUTION: {DESIGN_CAUTION}")
    return out


def run(args: argparse.Namespace) -> int:
    from ..design.sizing import size
    from .case import load_case
    from .catalogue import load_catalogue
    from .export import write_text_atomic

    case = load_case(args.case)
    if "design" not in case.extras:
        raise CaseError("design", "missing: `stanchion size` needs a [design] table naming the standard")
    if args.top < 1:
        raise CaseError("--top", f"{args.top} must be 1 or more")
    if args.plot and Path(args.plot).suffix.lower() not in (".png", ".svg", ".pdf"):
        raise CaseError("--plot", f"{args.plot!r} has no known extension: expected .png, .svg or .pdf")
    cands = load_catalogue(args.catalogue)
    if args.shape:
        from .design_input import SHAPE_ALIASES

        def norm(x: str) -> str:
            x = x.strip().lower()
            return SHAPE_ALIASES.get(x, x)

        wanted = {norm(x) for x in args.shape}
        cands = tuple(c for c in cands if norm(c.shape) in wanted)
        if not cands:
            raise CaseError("--shape", f"no catalogue section has shape {', '.join(args.shape)}")
    result = size(case, cands, _segment_indices(case, args.segment), target=args.target)
    text = json.dumps(sizing_json(result, args.catalogue), indent=2, allow_nan=False) if args.json else None
    fig = None
    if args.plot:
        from ..plot.design import plot_candidates

        fig = plot_candidates(result, title=case.title).figure
    if args.json and args.json != "-":
        write_text_atomic(args.json, text + "\n")
    if fig is not None:
        from ..plot import save_figure

        save_figure(fig, args.plot)
    if args.json == "-":
        print(text)
    else:
        print("\n".join(sizing_lines(result, case.title, case.display, args.top)))
    return 0 if result.chosen is not None else 1
