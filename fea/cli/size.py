"""``stanchion size CASE --catalogue FILE``: the lightest catalogue section that passes the case's design check.

Exit status 0 when a section passes, 1 when none does or when the chosen one buckles under the case loads
(lowest load factor below 1), 2 on bad input.
"""

from __future__ import annotations

import argparse
import json
from pathlib import Path

from ..errors import CaseError
from .outputs import OutputPlan, add_no_clobber, figure_writer

NAME = "size"
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
    add_no_clobber(p)


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


def run(args: argparse.Namespace) -> int:
    from ..design.sizing import size
    from ..io.catalogue import load_catalogue
    from ..io.sizing_output import sizing_json, sizing_lines, sizing_notices
    from ..pipeline import load_case

    case = load_case(args.case)
    if "design" not in case.extras:
        raise CaseError("design", "missing: `stanchion size` needs a [design] table naming the standard")
    if args.top < 1:
        raise CaseError("--top", f"{args.top} must be 1 or more")
    if args.plot and Path(args.plot).suffix.lower() not in (".png", ".svg", ".pdf"):
        raise CaseError("--plot", f"{args.plot!r} has no known extension: expected .png, .svg or .pdf")
    plan = OutputPlan([args.case, args.catalogue], no_clobber=args.no_clobber)
    if args.json and args.json != "-":
        plan.check(args.json, "--json")
    if args.plot:
        plan.check(args.plot, "--plot")
    cands = load_catalogue(args.catalogue)
    if args.shape:
        from ..io.section_input import SHAPE_ALIASES

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
        plan.add(args.json, f"{text}\n", "--json")
    if fig is not None:
        plan.add(args.plot, figure_writer(fig), "--plot")
    plan.write()
    if args.json == "-":
        print(text)
    else:
        print("\n".join(sizing_lines(result, case.title, case.display, args.top)))
    return 0 if result.chosen is not None and not sizing_notices(result) else 1
