"""``stanchion check CASE``: every analysis of the case, a summary, and optionally the JSON result and figures."""

from __future__ import annotations

import argparse
import json
import logging
import sys
import time
from pathlib import Path

from ..errors import FeaError
from .common import EXIT_FAILED_CHECK, EXIT_OK, units_argument
from .outputs import OutputPlan, add_no_clobber, check_plot, figure_writer

NAME = "check"
HELP = "analyse a case file and print a summary"
DESCRIPTION = ("Analyse a case file: elastic critical load factors, mode shapes and the effective-length factor of "
               "every segment about each axis, plus any analysis the case declares.")


def add_arguments(c: argparse.ArgumentParser) -> None:
    c.add_argument("case", help="case file (TOML), see cases/README.md")
    c.add_argument("--json", nargs="?", const="-", metavar="FILE",
                   help="write the JSON result to FILE, or to standard output instead of the summary")
    c.add_argument("--plot", metavar="FILE", action="append", default=[],
                   help="draw the mode shapes to FILE (.png, .svg or .pdf; may be repeated); the figures of an "
                        "imperfect-column analysis or a design check go beside it as FILE-<name>")
    c.add_argument("--units", type=units_argument, metavar="FORCE,LENGTH",
                   help="display units, e.g. 'kN,m' or 'N,mm' (default: the case's [units], else kN,m)")
    c.add_argument("--modes", type=int, metavar="N", help="number of modes (default: the case's, else 3)")
    c.add_argument("--only-buckling", action="store_true",
                   help="skip the optional analyses the case declares (imperfection, design)")
    add_no_clobber(c)


def run(args: argparse.Namespace) -> int:
    from ..pipeline import ANALYSES, load_case, result_json, run_case, summary

    t0 = time.perf_counter()
    case = load_case(args.case)
    if args.modes is not None and not 1 <= args.modes <= 50:
        raise FeaError(f"--modes: expected a whole number from 1 to 50, got {args.modes}")
    check_plot(args)
    plan = OutputPlan([args.case], no_clobber=args.no_clobber)
    if args.json and args.json != "-":
        plan.check(args.json, "--json")
    for f in args.plot:
        plan.check(f, "--plot")
    skip = tuple(a.name for a in ANALYSES) if args.only_buckling else ()
    res = run_case(case, n_modes=args.modes, skip=skip)
    display = args.units or case.display
    # everything is computed before anything is written
    figures = _figures(res, display) if args.plot else {}
    data = result_json(res)
    text = json.dumps(data, indent=2, allow_nan=False) if args.json else None
    if args.json and args.json != "-":
        plan.add(args.json, text + "\n", "--json")
    written = []
    for f in args.plot:
        p = Path(f)
        for name, fig in figures.items():
            target = p if name == "" else p.with_name(f"{p.stem}-{name}{p.suffix}")
            plan.add(target, figure_writer(fig), "--plot")
            written.append(str(target))
    plan.write()
    if written:  # on standard error, so that standard output stays the summary or pure JSON
        print("wrote " + ", ".join(written), file=sys.stderr)
    if args.json == "-":
        print(text)
    else:
        for line in summary(res, display):
            print(line)
        logging.getLogger(__name__).debug("check took %.3f s", time.perf_counter() - t0)
    # exit status 1 when the design fails or is not verified, and on a warning of level "warning" (a plane
    # buckles below its loads, a result did not converge): see fea/notices.py
    from ..io.run_warnings import fails_run

    status = data.get("design", {}).get("verdict", "passes") == "passes" and not fails_run(data["warnings"])
    return EXIT_OK if status else EXIT_FAILED_CHECK


def _figures(res, display) -> dict:
    """The mode-shape figure (name "") and every analysis's figures, by name."""
    from ..pipeline import ANALYSES
    from ..plot import plot_planes

    case = res.case
    planes = [(r.axis, case.column(r.axis), r) for r in res.buckling]
    out = {"": plot_planes(planes, n_modes=min(3, max(len(r.load_factors) for r in res.buckling)),
                           length_unit=(display.length, display.length_si),
                           force_unit=(display.force, display.force_si), title=case.title)}
    for analysis in ANALYSES:
        if analysis.name in res.extras and analysis.figures is not None:
            out.update(analysis.figures(res.extras[analysis.name], display, case))
    return out
