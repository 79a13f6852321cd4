"""``stanchion brace CASE``: the stiffness a brace needs to act as a point of no sway, and its force."""

from __future__ import annotations

import argparse

from ..errors import FeaError
from .study_common import add_common

NAME = "brace"
HELP = "stiffness a brace needs to act as a point of no sway, beside Winter's rule"


def add_arguments(p: argparse.ArgumentParser) -> None:
    add_common(p, plot=True)
    p.add_argument("--restraint", type=int, action="append", metavar="N",
                   help="[[restraint]] number of a brace (repeat for braces varied together). "
                        "Default: the case's [study.brace]")
    p.add_argument("--foundation", type=int, action="append", metavar="N",
                   help="[[foundation]] number whose modulus to study instead of a restraint (repeat to vary "
                        "several together); 'rigid' then holds the foundation's whole range")
    p.add_argument("--kind", choices=("lateral", "rotation", "modulus", "modulus_bottom", "modulus_top"),
                   help="spring of the brace (default lateral; with --foundation: modulus)")
    p.add_argument("--axis", help="bending plane (major / minor) when the braces act in both")
    p.add_argument("--fraction", type=float, help="target fraction of the rigid-brace load factor (default 0.95)")
    p.add_argument("--eps", type=float, help="relative shortfall accepted as reaching it (default 1e-6)")
    p.add_argument("--bow", type=float, metavar="RATIO",
                   help="initial bow height/RATIO for the brace force (default 500)")


def run(args: argparse.Namespace) -> int:
    from ..io.study_output import brace_dict, brace_lines, case_notices
    from ..study.run import case_brace
    from ..version import version
    from .study_common import case_load_factors, check_plot, finish, load_study, plan_outputs

    study, spec = load_study(args)
    check_plot(args)
    plan = plan_outputs(args)
    b = spec.brace
    if args.foundation and args.restraint:
        raise FeaError("--foundation and --restraint: study one kind of support at a time")
    tables = tuple(args.foundation or args.restraint or ()) or (b.restraints if b else None)
    if not tables:
        raise FeaError("no brace named: give --restraint N, --foundation N or a [study.brace] table in the case")
    kind = args.kind or ("modulus" if args.foundation else (b.kind if b else "lateral"))
    if bool(args.foundation) != (kind in ("modulus", "modulus_bottom", "modulus_top")):
        raise FeaError(f"--kind {kind}: a restraint's spring is lateral or rotation, a foundation's is modulus, "
                       "modulus_bottom or modulus_top")
    cb = case_brace(study, tables, kind=kind, axis=args.axis or (b.axis if b else None),
                    fraction=args.fraction if args.fraction is not None else (b.fraction if b else 0.95),
                    eps=args.eps if args.eps is not None else (b.eps if b else 1e-6),
                    bow=args.bow if args.bow is not None else (b.bow if b else 500.0))
    lams = case_load_factors(study)
    data = brace_dict(study, cb, version(), lams)
    figure = None
    if args.plot:
        from ..plot.study import plot_brace

        figure = plot_brace(cb.result, title=study.case.title, display=study.case.display,
                            case_below_one=any(n.level == "warning" for n in case_notices(lams)))
    return finish(args, plan, data, lambda: brace_lines(study, cb, args.plot, lams), figure=figure)
